package cli

import (
	"errors"
	"fmt"

	"github.com/flowregime/flowregime/cmd/internal/figure"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
)

type powerCurveOptions struct {
	calcOptions
	from, to string
	steps    int
}

type powerCurveCmdOptions struct {
	powerCurveOptions
	figureOutput
}

// newPowerCurveCmd builds powercurve; a test passes runF to receive the
// checked options instead of running.
func newPowerCurveCmd(s Streams, runF func(*powerCurveCmdOptions) error) *cobra.Command {
	o := &powerCurveCmdOptions{}
	cmd := &cobra.Command{
		Use:   "powercurve --length <L> --diameter <d> --mass <m> --span <b> [-o curve.svg] [flags]",
		Short: "Flight power against speed: a figure, and the cheapest speeds per second and per metre",
		Long: `Compute the mechanical power of level flight (induced + parasite + profile,
as in calc) from --from to --to. -o FILE.svg (or .png, .pdf) draws it:
power and its parts against speed, and the cost of transport below. The
standard output states two speeds, each found by Brent's 1-D minimiser:
the one that costs least energy per second (minimum power, the longest
time aloft) and the one that costs least energy per metre (maximum range),
with the power per kilogram of body mass and the cost of transport, in
J/m and per unit weight (P/(m g V), dimensionless). --format csv or json
gives every speed with its components. With --gliding the animal does no
flapping work: the speeds are those of minimum sink and best glide.` + "\n\n" + estimateNotice,
		Example: `  flowregime powercurve --length 16cm --diameter 3.5cm --mass 40g --span 42cm --chord 4cm --freq 8Hz --amplitude 20cm -o swallow.svg
  flowregime powercurve --length 16cm --diameter 3.5cm --mass 40g --span 42cm --format csv`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(); err != nil {
				return err
			}
			if runF != nil {
				return runF(o)
			}
			return runPowerCurve(o, s)
		},
	}
	bindPowerCurveFlags(cmd, &o.powerCurveOptions)
	cmd.Flags().StringVarP(&o.out, "output", "o", "", "draw the curve to this file: .svg, .png or .pdf")
	return cmd
}

// validate checks the output format and the figure's file name.
func (o *powerCurveCmdOptions) validate() error {
	if err := report.CheckFormat(o.format); err != nil {
		return usageError{err}
	}
	if o.out != "" {
		if _, err := o.figureOutput.figureFormat(); err != nil {
			return err
		}
	}
	return nil
}

func runPowerCurve(o *powerCurveCmdOptions, s Streams) error {
	pc, err := computePowerCurve(&o.powerCurveOptions)
	if err != nil {
		return err
	}
	if o.out != "" {
		fig, err := figure.PowerFigure(pc)
		if err != nil {
			return err
		}
		format, _ := o.figureOutput.figureFormat() // checked by validate
		if err := writeFigure(s, fig, o.figureOutput, format, nil); err != nil {
			return err
		}
	}
	return writePowerCurve(pc, o.format, o.out != "", s)
}

// bindPowerCurveFlags binds the flags powercurve and plot power share.
func bindPowerCurveFlags(cmd *cobra.Command, o *powerCurveOptions) {
	cmd.Flags().StringVar(&o.from, "from", "0.5m/s", "lowest speed")
	cmd.Flags().StringVar(&o.to, "to", "30m/s", "highest speed")
	cmd.Flags().IntVar(&o.steps, "steps", 60, "number of speeds computed")
	o.organism.bind(cmd)
	bindGliding(cmd, &o.gliding)
	cmd.Flags().StringVar(&o.medium, "medium", media.KindAir, "air (flight)")
	o.flags.bind(cmd.Flags())
	cmd.Flags().StringVar(&o.format, "format", report.FormatTable, "output: table (the summary), json or csv (every speed)")
}

// computePowerCurve reads the options and computes the curve.
func computePowerCurve(o *powerCurveOptions) (regime.PowerCurve, error) {
	lo, err := quantity.Parse(quantity.Speed, o.from)
	if err != nil {
		return regime.PowerCurve{}, usagef("--from: %v", err)
	}
	hi, err := quantity.Parse(quantity.Speed, o.to)
	if err != nil {
		return regime.PowerCurve{}, usagef("--to: %v", err)
	}
	if !(lo.SI > 0) || !(hi.SI > lo.SI) {
		return regime.PowerCurve{}, usagef("--from %s --to %s: give speeds with 0 m/s < from < to", o.from, o.to)
	}
	if o.steps < 3 || o.steps > 10000 {
		return regime.PowerCurve{}, usagef("--steps %d: give 3 to 10000", o.steps)
	}
	for _, r := range []struct {
		flag, text string
		v          quantity.Value
	}{{"from", o.from, lo}, {"to", o.to, hi}} {
		if err := refuseUncertainValue("powercurve", r.flag, r.text, r.v); err != nil {
			return regime.PowerCurve{}, err
		}
	}
	if err := refuseUncertain("powercurve", merge(o.organism.source(), o.flags.source())); err != nil {
		return regime.PowerCurve{}, err
	}
	in, m, err := o.inputs(false, map[string]string{"speed": o.from}) // the curve sets the speed itself
	if err != nil {
		return regime.PowerCurve{}, err
	}
	pc, err := regime.OrganismPowerCurve(in.Organism, m, lo.SI, hi.SI, o.steps)
	var re *regime.RangeError
	switch {
	case errors.As(err, &re):
		return pc, fmt.Errorf("%s", trimPkg(err)) // inputs beyond any organism: cannot be computed
	case err != nil:
		return pc, usageError{fmt.Errorf("%s", trimPkg(err))}
	}
	return pc, nil
}

// powerPoint is one speed of the curve, framed as costs: per second
// (power, and per kilogram), per metre, and per unit weight and distance;
// the components follow.
type powerPoint struct {
	Speed        float64 `json:"speed_m_s"`
	Power        float64 `json:"power_W"`
	PowerPerMass float64 `json:"power_W_per_kg"`
	CostPerMetre float64 `json:"cost_J_per_m"`
	CostOfTr     float64 `json:"cost_of_transport"`
	Induced      float64 `json:"induced_W"`
	Parasite     float64 `json:"parasite_W"`
	Profile      float64 `json:"profile_W"`
}

// powerPoints frames the curve's points; mass is W/g.
func powerPoints(pc regime.PowerCurve) []powerPoint {
	mass := pc.Weight / media.StandardGravity
	ps := make([]powerPoint, len(pc.Points))
	for i, p := range pc.Points {
		ps[i] = powerPoint{p.Speed, p.Total, p.Total / mass, p.Total / p.Speed, p.Total / (pc.Weight * p.Speed), p.Induced, p.Parasite, p.Profile}
	}
	return ps
}

// writePowerCurve writes the summary (table format) or every speed (csv,
// json). drawn says a figure was written.
func writePowerCurve(pc regime.PowerCurve, format string, drawn bool, s Streams) error {
	if pc.Gliding {
		return writeGlidePolar(pc, format, s)
	}
	mass := pc.Weight / media.StandardGravity
	ps := powerPoints(pc)
	switch format {
	case report.FormatJSON:
		return report.JSON(s.Out, struct {
			Hover            float64      `json:"hover_W"`
			MinPowerSpeed    float64      `json:"min_power_speed_m_s"`
			MinPower         float64      `json:"min_power_W"`
			MinPowerPerMass  float64      `json:"min_power_W_per_kg"`
			MaxRangeSpeed    float64      `json:"max_range_speed_m_s"`
			CostOfTr         float64      `json:"min_cost_of_transport_J_m"`
			CostOfTrPerWeigh float64      `json:"min_cost_of_transport"`
			ProfileMethod    string       `json:"profile_method"`
			Points           []powerPoint `json:"points"`
			Warnings         []string     `json:"warnings"`
		}{pc.Hover, pc.MinPowerSpeed, pc.MinPower, pc.MinPower / mass, pc.MaxRangeSpeed, pc.MinCostOfTr, pc.MinCostOfTr / pc.Weight, pc.ProfileMethod, ps, nonNil(warningTexts(pc.Warnings))})
	case report.FormatCSV:
		var rows [][]string
		for _, p := range ps {
			rows = append(rows, []string{report.Num(p.Speed, 4), report.Num(p.Power, 4), report.Num(p.PowerPerMass, 4), report.Num(p.CostPerMetre, 4),
				report.Num(p.CostOfTr, 4), report.Num(p.Induced, 4), report.Num(p.Parasite, 4), report.Num(p.Profile, 4)})
		}
		return report.CSV(s.Out, []string{"speed_m_s", "power_W", "power_W_per_kg", "cost_J_per_m", "cost_of_transport", "induced_W", "parasite_W", "profile_W"}, rows)
	}
	report.List(s.Out, "Cheapest speeds", []string{
		fmt.Sprintf("per second (longest time aloft): %s m/s, %s W = %s W/kg of body mass", report.Num(pc.MinPowerSpeed, 3), report.Num(pc.MinPower, 3), report.Num(pc.MinPower/mass, 3)),
		fmt.Sprintf("per metre (farthest on a given energy): %s m/s, %s J/m; cost of transport %s (energy per unit weight and distance)", report.Num(pc.MaxRangeSpeed, 3), report.Num(pc.MinCostOfTr, 3), report.Num(pc.MinCostOfTr/pc.Weight, 3)),
		fmt.Sprintf("holding still in the air: %s W = %s W/kg, %s times the cheapest per second", report.Num(pc.Hover, 3), report.Num(pc.Hover/mass, 3), report.Num(pc.Hover/pc.MinPower, 3)),
		"profile power: " + pc.ProfileMethod,
	})
	if !drawn {
		fmt.Fprintln(s.Out)
		report.Paragraph(s.Out, "", "Draw the curve with -o curve.svg (or .png, .pdf); --format csv gives every speed with its parts.")
	}
	report.List(s.Out, "Warnings", warningTexts(pc.Warnings))
	return nil
}

// writeGlidePolar writes a glide's sink speed and glide ratio against
// speed (csv, json) or its two speeds, minimum sink and best glide; a
// glide has no flapping power and no hover.
func writeGlidePolar(pc regime.PowerCurve, format string, s Streams) error {
	minSink, bestRatio := pc.MinPower/pc.Weight, pc.Weight/pc.MinCostOfTr
	switch format {
	case report.FormatJSON:
		type pt struct {
			Speed      float64 `json:"speed_m_s"`
			Sink       float64 `json:"sink_speed_m_s"`
			GlideRatio float64 `json:"glide_ratio"`
		}
		var ps []pt
		for _, p := range pc.Points {
			ps = append(ps, pt{p.Speed, p.Total / pc.Weight, p.Speed * pc.Weight / p.Total})
		}
		return report.JSON(s.Out, struct {
			Kind           string   `json:"kind"`
			MinSinkSpeed   float64  `json:"min_sink_speed_m_s"`
			MinSink        float64  `json:"min_sink_m_s"`
			BestGlideSpeed float64  `json:"best_glide_speed_m_s"`
			BestGlideRatio float64  `json:"best_glide_ratio"`
			Points         []pt     `json:"points"`
			Warnings       []string `json:"warnings"`
		}{regime.PowerGliding, pc.MinPowerSpeed, minSink, pc.MaxRangeSpeed, bestRatio, ps, nonNil(warningTexts(pc.Warnings))})
	case report.FormatCSV:
		var rows [][]string
		for _, p := range pc.Points {
			rows = append(rows, []string{report.Num(p.Speed, 4), report.Num(p.Total/pc.Weight, 4), report.Num(p.Speed*pc.Weight/p.Total, 4)})
		}
		return report.CSV(s.Out, []string{"speed_m_s", "sink_speed_m_s", "glide_ratio"}, rows)
	}
	report.List(s.Out, "Gliding, no flapping power", []string{
		fmt.Sprintf("slowest descent: %s m/s down at %s m/s", report.Num(minSink, 3), report.Num(pc.MinPowerSpeed, 3)),
		fmt.Sprintf("farthest glide: %s m forward per metre of height at %s m/s", report.Num(bestRatio, 3), report.Num(pc.MaxRangeSpeed, 3)),
		"profile drag: " + pc.ProfileMethod,
	})
	report.List(s.Out, "Warnings", warningTexts(pc.Warnings))
	return nil
}
