package cli

import (
	"errors"
	"fmt"

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

func newPowerCurveCmd(s Streams) *cobra.Command {
	o := &powerCurveOptions{}
	cmd := &cobra.Command{
		Use:   "powercurve --length <L> --diameter <d> --mass <m> --span <b> [flags]",
		Short: "Flight power against speed, with the speeds of minimum power and maximum range",
		Long: `Compute the mechanical power of level flight (induced + parasite + profile,
as in calc) from --from to --to, the power in hover, the speed of minimum
power and the speed of maximum range (minimum power per unit speed, the
cost of transport), both found by Brent's 1-D minimiser. With --gliding the
animal does no flapping work: the table gives the sink speed and glide
ratio, and the summary the speeds of minimum sink and best glide.` + "\n\n" + estimateNotice,
		Example: `  flowregime powercurve --length 16cm --diameter 3.5cm --mass 40g --span 42cm --chord 4cm --freq 8Hz --amplitude 20cm --medium air`,
		Args:    cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			return runPowerCurve(o, s)
		},
	}
	cmd.Flags().StringVar(&o.from, "from", "0.5m/s", "lowest speed")
	cmd.Flags().StringVar(&o.to, "to", "30m/s", "highest speed")
	cmd.Flags().IntVar(&o.steps, "steps", 60, "number of speeds in the table")
	o.organism.bind(cmd)
	bindGliding(cmd, &o.gliding)
	cmd.Flags().StringVar(&o.medium, "medium", media.KindAir, "air (flight)")
	o.flags.bind(cmd.Flags())
	cmd.Flags().StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	return cmd
}

func runPowerCurve(o *powerCurveOptions, s Streams) error {
	lo, err := quantity.Parse(quantity.Speed, o.from)
	if err != nil {
		return usagef("--from: %v", err)
	}
	hi, err := quantity.Parse(quantity.Speed, o.to)
	if err != nil {
		return usagef("--to: %v", err)
	}
	if !(lo.SI > 0) || !(hi.SI > lo.SI) {
		return usagef("--from %s --to %s: give speeds with 0 m/s < from < to", o.from, o.to)
	}
	if o.steps < 3 || o.steps > 10000 {
		return usagef("--steps %d: give 3 to 10000", o.steps)
	}
	for _, r := range []struct {
		flag, text string
		v          quantity.Value
	}{{"from", o.from, lo}, {"to", o.to, hi}} {
		if err := refuseUncertainValue("powercurve", r.flag, r.text, r.v); err != nil {
			return err
		}
	}
	if err := refuseUncertain("powercurve", merge(o.organism.source(), o.flags.source())); err != nil {
		return err
	}
	in, m, err := o.inputs(false, map[string]string{"speed": o.from}) // the curve sets the speed itself
	if err != nil {
		return err
	}
	pc, err := regime.OrganismPowerCurve(in.Organism, m, lo.SI, hi.SI, o.steps)
	var re *regime.RangeError
	switch {
	case errors.As(err, &re):
		return fmt.Errorf("%s", trimPkg(err)) // inputs beyond any organism: cannot be computed
	case err != nil:
		return usageError{fmt.Errorf("%s", trimPkg(err))}
	}
	if pc.Gliding {
		return writeGlidePolar(pc, o.format, s)
	}
	switch o.format {
	case report.FormatJSON:
		type pt struct {
			Speed    float64 `json:"speed_m_s"`
			Induced  float64 `json:"induced_W"`
			Parasite float64 `json:"parasite_W"`
			Profile  float64 `json:"profile_W"`
			Total    float64 `json:"total_W"`
		}
		var ps []pt
		for _, p := range pc.Points {
			ps = append(ps, pt{p.Speed, p.Induced, p.Parasite, p.Profile, p.Total})
		}
		return report.JSON(s.Out, struct {
			Hover         float64  `json:"hover_W"`
			MinPowerSpeed float64  `json:"min_power_speed_m_s"`
			MinPower      float64  `json:"min_power_W"`
			MaxRangeSpeed float64  `json:"max_range_speed_m_s"`
			CostOfTr      float64  `json:"min_cost_of_transport_J_m"`
			ProfileMethod string   `json:"profile_method"`
			Points        []pt     `json:"points"`
			Warnings      []string `json:"warnings"`
		}{pc.Hover, pc.MinPowerSpeed, pc.MinPower, pc.MaxRangeSpeed, pc.MinCostOfTr, pc.ProfileMethod, ps, nonNil(warningTexts(pc.Warnings))})
	}
	var rows [][]string
	for _, p := range pc.Points {
		rows = append(rows, []string{report.Num(p.Speed, 4), report.Num(p.Induced, 4), report.Num(p.Parasite, 4), report.Num(p.Profile, 4), report.Num(p.Total, 4), report.Num(p.Total/p.Speed, 4)})
	}
	h := []string{"speed (m/s)", "induced (W)", "parasite (W)", "profile (W)", "total (W)", "power/speed (J/m)"}
	if o.format == report.FormatCSV {
		return report.CSV(s.Out, []string{"speed_m_s", "induced_W", "parasite_W", "profile_W", "total_W", "cost_of_transport_J_m"}, rows)
	}
	if err := report.Table(s.Out, h, rows); err != nil {
		return err
	}
	report.List(s.Out, "Summary", []string{
		fmt.Sprintf("hover: %s W", report.Num(pc.Hover, 4)),
		fmt.Sprintf("minimum power: %s W at %s m/s", report.Num(pc.MinPower, 4), report.Num(pc.MinPowerSpeed, 4)),
		fmt.Sprintf("maximum range: %s J/m at %s m/s", report.Num(pc.MinCostOfTr, 4), report.Num(pc.MaxRangeSpeed, 4)),
		"profile power: " + pc.ProfileMethod,
	})
	report.List(s.Out, "Warnings", warningTexts(pc.Warnings))
	return nil
}

// writeGlidePolar prints a glide's sink speed and glide ratio against
// speed, with the speeds of minimum sink and best glide; a glide has no
// flapping power and no hover.
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
	}
	var rows [][]string
	for _, p := range pc.Points {
		rows = append(rows, []string{report.Num(p.Speed, 4), report.Num(p.Total/pc.Weight, 4), report.Num(p.Speed*pc.Weight/p.Total, 4)})
	}
	if format == report.FormatCSV {
		return report.CSV(s.Out, []string{"speed_m_s", "sink_speed_m_s", "glide_ratio"}, rows)
	}
	if err := report.Table(s.Out, []string{"speed (m/s)", "sink speed (m/s)", "glide ratio"}, rows); err != nil {
		return err
	}
	report.List(s.Out, "Summary", []string{
		"gliding: no flapping power",
		fmt.Sprintf("minimum sink: %s m/s at %s m/s", report.Num(minSink, 4), report.Num(pc.MinPowerSpeed, 4)),
		fmt.Sprintf("best glide: ratio %s at %s m/s", report.Num(bestRatio, 4), report.Num(pc.MaxRangeSpeed, 4)),
		"profile drag: " + pc.ProfileMethod,
	})
	report.List(s.Out, "Warnings", warningTexts(pc.Warnings))
	return nil
}
