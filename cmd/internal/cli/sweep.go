package cli

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
)

type sweepOptions struct {
	calcOptions
	vary  string
	steps int
	log   bool
}

// newSweepCmd builds sweep; a test passes runF to receive the checked
// options instead of running.
func newSweepCmd(s Streams, runF func(*sweepOptions) error) *cobra.Command {
	o := &sweepOptions{}
	cmd := &cobra.Command{
		Use:   "sweep --vary <quantity>=<from>:<to> [calc flags]",
		Short: "Vary one input over a range and show where the regime or drag law changes",
		Long: `Vary one input of calc over a range, in linear or (--log) logarithmic
steps, and print the Reynolds number, regime, drag law, drag and power at
each step, marking the steps where the regime or the drag law changes.
Any numeric input can vary: length, diameter, speed, frequency, amplitude,
mass, span, temperature, salinity, depth, pressure, altitude, humidity, ….
The other inputs are the calc flags.` + "\n\n" + estimateNotice,
		Example: `  flowregime sweep --vary temperature=0C:30C --steps 31 --length 2mm --speed 5mm/s
  flowregime sweep --vary speed=10um/s:1m/s --log --steps 40 --length 1mm
  flowregime sweep --vary altitude=0m:5000m --length 12cm --diameter 3cm --speed 10m/s --mass 30g --span 30cm --medium air`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			if runF != nil {
				return runF(o)
			}
			return runSweep(o, s)
		},
	}
	cmd.Flags().StringVar(&o.vary, "vary", "", "the input to vary and its range, e.g. temperature=0C:30C or speed=1mm/s:1m/s")
	cmd.Flags().IntVar(&o.steps, "steps", 21, "number of points, ends included")
	cmd.Flags().BoolVar(&o.log, "log", false, "logarithmic steps (positive ranges only)")
	o.organism.bind(cmd)
	cmd.Flags().StringVar(&o.medium, "medium", media.KindFreshWater, "air, freshwater, seawater, or a medium file")
	o.flags.bind(cmd.Flags())
	cmd.Flags().StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	return cmd
}

// parseVary reads "field=from:to" into a field index and SI bounds.
func parseVary(v string) (int, float64, float64, error) {
	name, rng, ok := strings.Cut(v, "=")
	from, to, ok2 := strings.Cut(rng, ":")
	if !ok || !ok2 {
		return 0, 0, 0, usagef("--vary %q: write quantity=from:to, e.g. --vary temperature=0C:30C", v)
	}
	name = strings.TrimSpace(name)
	f := inputs.Index(name)
	if f < 0 {
		for i, fl := range inputs.Fields {
			if fl.Flag == name {
				f = i
			}
		}
	}
	if f < 0 || inputs.Fields[f].Text {
		return 0, 0, 0, usagef("--vary: %q is not a numeric input; accepted: length, speed, temperature, salinity, altitude, …", name)
	}
	k := inputs.Fields[f].Kind
	a, err := quantity.Parse(k, from)
	if err != nil {
		return 0, 0, 0, usagef("--vary %s: from: %v", name, err)
	}
	b, err := quantity.Parse(k, to)
	if err != nil {
		return 0, 0, 0, usagef("--vary %s: to: %v", name, err)
	}
	if a.SD > 0 || b.SD > 0 {
		return 0, 0, 0, usagef("--vary %s=%s:%s: a sweep's ends carry no uncertainty (±); give the values alone", name, from, to)
	}
	if a.PerBodyLength || b.PerBodyLength {
		return 0, 0, 0, usagef("--vary speed: give speeds in m/s, mm/s, … (BL/s is not swept)")
	}
	if a.SI == b.SI {
		return 0, 0, 0, usagef("--vary %s: from and to are the same; give two different ends", name)
	}
	return f, a.SI, b.SI, nil
}

// sweepPoint is one step of a sweep.
type sweepPoint struct {
	Value    float64 `json:"value"`
	Reynolds float64 `json:"reynolds"`
	Regime   string  `json:"regime"`
	Law      string  `json:"drag_law"`
	Drag     float64 `json:"drag_N"`
	Power    float64 `json:"power_W"`
	Change   string  `json:"change,omitempty"`
	Error    string  `json:"error,omitempty"`
}

func runSweep(o *sweepOptions, s Streams) error {
	if o.vary == "" {
		return usagef("sweep needs --vary, e.g. --vary temperature=0C:30C")
	}
	f, from, to, err := parseVary(o.vary)
	if err != nil {
		return err
	}
	if o.steps < 2 || o.steps > 100000 {
		return usagef("--steps %d: give 2 to 100000", o.steps)
	}
	for _, v := range []float64{from, to} {
		if err := inputs.CheckPositive(f, v, "--vary "+inputs.Fields[f].Name); err != nil {
			return usageError{err}
		}
	}
	if o.log && !(from > 0 && to > 0) {
		return usagef("--log needs a positive range")
	}
	src := merge(o.organism.source(), o.flags.source())
	src["medium"] = o.medium
	// The varied quantity needs no flag of its own; put a placeholder so
	// that required inputs are present.
	if src[inputs.Fields[f].Name] == "" {
		src[inputs.Fields[f].Name] = fmt.Sprintf("%g%s", from, map[bool]string{true: "", false: firstUnit(inputs.Fields[f].Kind)}[firstUnit(inputs.Fields[f].Kind) == ""])
	}
	if err := refuseUncertain("sweep", src); err != nil {
		return err
	}
	base, err := inputs.Build(src, o.medium, false)
	if err != nil {
		return usageError{err}
	}
	var pts []sweepPoint
	var prev *sweepPoint
	var firstErr error
	computed := 0
	for i := 0; i < o.steps; i++ {
		t := float64(i) / float64(o.steps-1)
		v := from + t*(to-from)
		if o.log {
			v = from * math.Pow(to/from, t)
		}
		in := base.With(f, v)
		p := sweepPoint{Value: v, Reynolds: math.NaN(), Drag: math.NaN(), Power: math.NaN()}
		m, err := inputs.LookupMedium(in.Conditions, false)
		var r regime.Result
		if err == nil {
			err = regime.CalcInto(&r, in.Organism, &m, regime.Options{Brief: true})
		}
		if err != nil {
			p.Error = trimPkg(err)
			if firstErr == nil {
				firstErr = err
			}
		} else {
			computed++
			p.Reynolds, p.Regime, p.Law, p.Drag, p.Power = r.Reynolds, r.Regime, r.Drag.Chosen.Law, r.Drag.Chosen.Force, r.Power.Total
			if prev != nil && prev.Error == "" {
				var ch []string
				if prev.Regime != p.Regime {
					ch = append(ch, "regime "+prev.Regime+" → "+p.Regime)
				}
				if prev.Law != p.Law {
					ch = append(ch, "law "+prev.Law+" → "+p.Law)
				}
				p.Change = strings.Join(ch, "; ")
			}
		}
		pts = append(pts, p)
		prev = &pts[len(pts)-1]
	}
	if computed == 0 { // nothing to show: one error, not a table of failures
		err := fmt.Errorf("no step could be computed: %s", trimPkg(firstErr))
		if errors.Is(firstErr, media.ErrUnknownMedium) {
			return usageError{err}
		}
		return err
	}
	name := inputs.Fields[f].Name
	unit := quantity.SIUnit(inputs.Fields[f].Kind)
	switch o.format {
	case report.FormatJSON:
		return report.JSON(s.Out, struct {
			Quantity string       `json:"quantity"`
			Unit     string       `json:"unit"`
			Points   []sweepPoint `json:"points"`
		}{name, unit, nullNaN(pts)})
	}
	var rows [][]string
	for _, p := range pts {
		if p.Error != "" {
			rows = append(rows, []string{report.Num(p.Value, 5), "", "", "", "", "", "not computed: " + p.Error})
			continue
		}
		rows = append(rows, []string{report.Num(p.Value, 5), report.Num(p.Reynolds, 4), p.Regime, p.Law, report.Num(p.Drag, 4), report.Num(p.Power, 4), p.Change})
	}
	if o.format == report.FormatCSV {
		return report.CSV(s.Out, []string{name + "_" + strings.NewReplacer("/", "_", "²", "2", "°", "", " ", "_").Replace(unit), "reynolds", "regime", "drag_law", "drag_N", "power_W", "change"}, rows)
	}
	return report.Table(s.Out, []string{fmt.Sprintf("%s (%s)", name, unit), "Re", "regime", "drag law", "drag (N)", "power (W)", "change from the previous step"}, rows)
}

func firstUnit(k quantity.Kind) string {
	if u := quantity.Units(k); len(u) > 0 {
		return u[0]
	}
	return ""
}

// nullNaN replaces NaN, which JSON cannot carry, by zero values in failed steps.
func nullNaN(pts []sweepPoint) []sweepPoint {
	out := append([]sweepPoint(nil), pts...)
	for i := range out {
		for _, v := range []*float64{&out[i].Reynolds, &out[i].Drag, &out[i].Power} {
			if math.IsNaN(*v) {
				*v = 0
			}
		}
	}
	return out
}
