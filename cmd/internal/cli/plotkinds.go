package cli

import (
	"fmt"
	"math"
	"os"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/figure"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/tabulate"
	"github.com/flowregime/flowregime/media"
	"github.com/spf13/cobra"
)

// plotKinds are the plot subcommands besides regime.
func plotKinds(s Streams) []*cobra.Command {
	return []*cobra.Command{newPlotDragCmd(s), newPlotPowerCmd(s), newPlotFlowCmd(s), newPlotSweepCmd(s), newPlotScalingCmd(s)}
}

type plotDragOptions struct {
	calcOptions
	figureOutput
}

func newPlotDragCmd(s Streams) *cobra.Command {
	o := &plotDragOptions{}
	cmd := &cobra.Command{
		Use:   "drag [calc flags] -o FILE.svg",
		Short: "Drag coefficient of a body against Re, each law over its published range",
		Long: `Draw the drag coefficient of the body (calc's --shape, --length,
--diameter) against the Reynolds number from 10⁻³ to 10⁷: every drag law of
the shape only inside its published range, the law flowregime chooses as a
thick line with its smooth joins dashed, and, with --speed, the case itself.
All coefficients are put on one area so that the laws compare.`,
		Example: `  flowregime plot drag --length 2mm --diameter 0.5mm --speed 5mm/s --medium seawater -o copepod-drag.svg`,
		Args:    cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			format, err := o.figureFormat()
			if err != nil {
				return err
			}
			in, m, err := o.inputs(false, map[string]string{"speed": "1m/s"}) // the figure sweeps the speed
			if err != nil {
				return err
			}
			c := figure.DragCase{Body: in.Organism.Body, Density: m.Density, Viscosity: m.DynamicViscosity}
			if o.organism.fieldFlags[inputs.Speed] != "" {
				c.Speed = in.Organism.Speed
			}
			fig, err := figure.DragFigure(c)
			if err != nil {
				return fmt.Errorf("%s", trimPkg(err))
			}
			return writeFigure(s, fig, o.figureOutput, format, nil)
		},
	}
	o.organism.bind(cmd)
	cmd.Flags().StringVar(&o.medium, "medium", media.KindFreshWater, "air, freshwater, seawater, or a medium file")
	o.flags.bind(cmd.Flags())
	o.figureOutput.bind(cmd)
	return cmd
}

type plotPowerOptions struct {
	powerCurveOptions
	figureOutput
}

func newPlotPowerCmd(s Streams) *cobra.Command {
	o := &plotPowerOptions{}
	cmd := &cobra.Command{
		Use:   "power [powercurve flags] -o FILE.svg",
		Short: "Flight power against speed with its parts, and the cost of transport below",
		Long: `Draw the flight power curve of powercurve: total power and its induced,
parasite and profile parts against speed with the speeds of minimum power
and maximum range marked, and below it the cost of transport P/V. The same
figure as 'powercurve -o FILE.svg'.`,
		Example: `  flowregime plot power --length 16cm --diameter 3.5cm --mass 40g --span 42cm --chord 4cm --freq 8Hz --amplitude 20cm -o swallow-power.svg`,
		Args:    cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			format, err := o.figureFormat()
			if err != nil {
				return err
			}
			pc, err := computePowerCurve(&o.powerCurveOptions)
			if err != nil {
				return err
			}
			fig, err := figure.PowerFigure(pc)
			if err != nil {
				return err
			}
			return writeFigure(s, fig, o.figureOutput, format, nil)
		},
	}
	bindPowerCurveFlags(cmd, &o.powerCurveOptions)
	o.figureOutput.bind(cmd)
	return cmd
}

type plotFlowOptions struct {
	figureOutput
	inFormat  string
	units     []string
	models    []string
	shearRate string
}

func newPlotFlowCmd(s Streams) *cobra.Command {
	o := &plotFlowOptions{}
	cmd := &cobra.Command{
		Use:   "flow RHEOMETER.csv -o FILE.svg",
		Short: "Measured flow curve with every fitted model on log–log axes",
		Long: `Fit the rheometer table as fit does and draw its points with every fitted
model (or those named by --models) on log–log axes of shear stress against
shear rate, the best model by AICc drawn thick; --shear-rate marks an
organism's shear rate.`,
		Example: `  flowregime plot flow mucus.csv --shear-rate 12/s -o mucus-flow.svg`,
		Args:    cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			format, err := o.figureFormat()
			if err != nil {
				return err
			}
			return runPlotFlow(o, args[0], format, s)
		},
	}
	cmd.Flags().StringVar(&o.inFormat, "input-format", "", "csv or tsv (default: from the extension)")
	cmd.Flags().StringArrayVar(&o.units, "unit", nil, "rate=…, stress=… or viscosity=…: unit of that column")
	cmd.Flags().StringSliceVar(&o.models, "models", nil, "draw only these models, e.g. power-law,carreau")
	cmd.Flags().StringVar(&o.shearRate, "shear-rate", "", "an organism's shear rate to mark, e.g. 12/s")
	o.figureOutput.bind(cmd)
	return cmd
}

func runPlotFlow(o *plotFlowOptions, name, format string, s Streams) error {
	units, err := keyValues("unit", o.units)
	if err != nil {
		return err
	}
	rate := 0.0
	if o.shearRate != "" {
		v, err := quantity.Parse(quantity.ShearRate, o.shearRate)
		if err != nil || !(v.SI > 0) {
			return usagef("--shear-rate %q: give a rate above zero, e.g. 12/s", o.shearRate)
		}
		rate = v.SI
	}
	f, err := os.Open(name)
	if err != nil {
		return fmt.Errorf("cannot read %s: %v", name, withoutPath(err))
	}
	defer f.Close()
	tsv := readsTSV(o.inFormat, name)
	pts, err := readRheometer(f, tsv, units)
	if err != nil {
		return err
	}
	rep, err := media.FitRheology(pts)
	if err != nil {
		return fmt.Errorf("%s", trimPkg(err))
	}
	if len(o.models) > 0 {
		var keep []media.ModelFit
		for _, want := range o.models {
			found := false
			for _, mf := range rep.Fits {
				if mf.Model != nil && strings.EqualFold(mf.Model.Name(), strings.TrimSpace(want)) {
					keep, found = append(keep, mf), true
				}
			}
			if !found {
				return usagef("--models: %q is not a fitted model (%s)", want, strings.Join(media.ModelNames, ", "))
			}
		}
		rep.Fits = keep
	}
	fig, err := figure.FlowFigure(pts, rep, rate)
	if err != nil {
		return err
	}
	return writeFigure(s, fig, o.figureOutput, format, []namedFile{{what: "the input " + name, path: name}})
}

type plotTableOptions struct {
	figureOutput
	x, y       string
	logX, logY bool
}

func newPlotSweepCmd(s Streams) *cobra.Command {
	o := &plotTableOptions{}
	cmd := &cobra.Command{
		Use:   "sweep SWEEP.csv --x COLUMN --y COLUMN -o FILE.svg",
		Short: "A sweep (sweep --format csv) as a line, with law and regime changes marked",
		Long: `Draw two columns of a sweep written by 'sweep --format csv' (or "-" for the
standard input) as a line, and mark each step where the regime or the drag
law changes (the change column) as a dashed vertical line. --x defaults to
the first column (the varied input); --log-x and --log-y choose logarithmic
axes.`,
		Example: `  flowregime sweep --vary speed=10um/s:1m/s --log --steps 60 --length 1mm --format csv > sweep.csv
  flowregime plot sweep sweep.csv --y drag_N --log-x --log-y -o sweep.svg`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			format, err := o.figureFormat()
			if err != nil {
				return err
			}
			t, ins, err := readFigureTable(args[0], s)
			if err != nil {
				return err
			}
			sw, err := sweepFromTable(t, o)
			if err != nil {
				return err
			}
			fig, err := figure.SweepFigure(sw)
			if err != nil {
				return err
			}
			return writeFigure(s, fig, o.figureOutput, format, ins)
		},
	}
	cmd.Flags().StringVar(&o.x, "x", "", "column on the x axis (default: the first, the varied input)")
	cmd.Flags().StringVar(&o.y, "y", "reynolds", "column on the y axis, e.g. reynolds, drag_N, power_W")
	cmd.Flags().BoolVar(&o.logX, "log-x", false, "logarithmic x axis")
	cmd.Flags().BoolVar(&o.logY, "log-y", false, "logarithmic y axis")
	o.figureOutput.bind(cmd)
	return cmd
}

// sweepFromTable takes the chosen columns and the changes of a sweep table.
func sweepFromTable(t *figure.Table, o *plotTableOptions) (figure.Sweep, error) {
	xName := o.x
	if xName == "" && len(t.Header) > 0 {
		xName = t.Header[0]
	}
	xc, err := t.Column(xName)
	if err != nil {
		return figure.Sweep{}, usageError{err}
	}
	yc, err := t.Column(o.y)
	if err != nil {
		return figure.Sweep{}, usageError{err}
	}
	sw := figure.Sweep{XLabel: columnLabel(t.Header[xc]), YLabel: columnLabel(t.Header[yc]), LogX: o.logX, LogY: o.logY}
	cc, _ := t.Column("change")
	for i := range t.Records {
		x, okx := t.Number(i, xc)
		y, oky := t.Number(i, yc)
		if !okx {
			x = math.NaN()
		}
		if !oky {
			y = math.NaN()
		}
		sw.X, sw.Y = append(sw.X, x), append(sw.Y, y)
		if ch := t.Cell(i, cc); ch != "" && cc >= 0 && i > 0 {
			if px, ok := t.Number(i-1, xc); ok && okx {
				sw.Changes = append(sw.Changes, figure.Change{X: (px + x) / 2, Label: ch})
			}
		}
	}
	return sw, nil
}

// columnLabel turns a machine column name (drag_N, speed_m_s) into an axis
// label with its unit (drag (N), speed (m/s)); other names stay as they are.
func columnLabel(h string) string {
	units := []struct{ suffix, unit string }{
		{"_m_s", "m/s"}, {"_m2_s", "m²/s"}, {"_kg_m3", "kg/m³"}, {"_J_m", "J/m"}, {"_Pa_s", "Pa·s"},
		{"_N", "N"}, {"_W", "W"}, {"_m", "m"}, {"_kg", "kg"}, {"_C", "°C"}, {"_Pa", "Pa"}, {"_Hz", "Hz"}, {"_s", "s"},
	}
	for _, u := range units {
		if base, ok := strings.CutSuffix(h, u.suffix); ok && base != "" {
			return strings.ReplaceAll(base, "_", " ") + " (" + u.unit + ")"
		}
	}
	switch h {
	case "reynolds":
		return "Reynolds number, Re"
	case "strouhal":
		return "Strouhal number, St"
	}
	return h
}

type plotScalingOptions struct {
	figureOutput
	fit string
}

func newPlotScalingCmd(s Streams) *cobra.Command {
	o := &plotScalingOptions{}
	cmd := &cobra.Command{
		Use:   "scaling RESULTS.csv --fit Y=X -o FILE.svg",
		Short: "A scaling fit (as tabulate --fit) as log–log points with OLS and SMA lines and bands",
		Long: `Fit log y against log x over a table's rows as tabulate --fit does, and draw
the pairs on log–log axes with the ordinary least squares and standardised
major axis lines, each with the band of its exponent's 95 % interval.`,
		Example: `  flowregime plot scaling results.csv --fit power_W=mass -o power-mass.svg`,
		Args:    cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			format, err := o.figureFormat()
			if err != nil {
				return err
			}
			y, x, ok := strings.Cut(o.fit, "=")
			if !ok || strings.TrimSpace(y) == "" || strings.TrimSpace(x) == "" {
				return usagef("--fit %q: write Y=X, e.g. --fit power_W=mass", o.fit)
			}
			t, ins, err := readFigureTable(args[0], s)
			if err != nil {
				return err
			}
			sc, err := scalingFromTable(t, strings.TrimSpace(x), strings.TrimSpace(y))
			if err != nil {
				return err
			}
			fig, err := figure.ScalingFigure(sc)
			if err != nil {
				return err
			}
			return writeFigure(s, fig, o.figureOutput, format, ins)
		},
	}
	cmd.Flags().StringVar(&o.fit, "fit", "", "the fit, Y=X: columns of the table (required)")
	o.figureOutput.bind(cmd)
	return cmd
}

// scalingFromTable reads the two columns and fits them with tabulate's
// ScalingFit, in the table's own units.
func scalingFromTable(t *figure.Table, x, y string) (figure.Scaling, error) {
	xc, err := t.Column(x)
	if err != nil {
		return figure.Scaling{}, usageError{err}
	}
	yc, err := t.Column(y)
	if err != nil {
		return figure.Scaling{}, usageError{err}
	}
	sc := figure.Scaling{XLabel: columnLabel(t.Header[xc]), YLabel: columnLabel(t.Header[yc])}
	for i := range t.Records {
		xv, okx := t.Number(i, xc)
		yv, oky := t.Number(i, yc)
		if !okx || !oky {
			xv, yv = math.NaN(), math.NaN()
		}
		sc.X, sc.Y = append(sc.X, xv), append(sc.Y, yv)
	}
	sc.Fit = tabulate.ScalingFit(sc.X, sc.Y)
	return sc, nil
}
