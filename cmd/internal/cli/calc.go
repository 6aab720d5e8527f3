package cli

import (
	"fmt"
	"github.com/flowregime/flowregime/cmd/internal/batch"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
)

// organismFlags are the organism's measurements as typed, bound from
// the inputs table (inputs.OrganismFlag).
type organismFlags struct{ fieldFlags }

func (f *organismFlags) bind(cmd *cobra.Command) { f.fieldFlags.bind(cmd.Flags(), inputs.OrganismFlag) }

// source returns the organism flags as an inputs.Source.
func (f *organismFlags) source() inputs.Flags { return f.fieldFlags.source(inputs.OrganismFlag) }

// fieldFlags are flag texts by input field (inputs.Fields).
type fieldFlags [inputs.NumFields]string

// bind adds a flag for every field of the group, with the table's help.
func (v *fieldFlags) bind(fs *pflag.FlagSet, g inputs.Group) {
	for i, f := range inputs.Fields {
		if f.Group == g {
			fs.StringVar(&v[i], f.Flag, f.Default, f.Help)
		}
	}
}

// source returns the group's flag texts keyed by field name, every field
// of the group present (an empty text is a flag not given).
func (v *fieldFlags) source(g inputs.Group) inputs.Flags {
	out := inputs.Flags{}
	for i, f := range inputs.Fields {
		if f.Group == g {
			out[f.Name] = v[i]
		}
	}
	return out
}

// bindGliding adds the flag that marks a flyer as gliding.
func bindGliding(cmd *cobra.Command, v *bool) {
	cmd.Flags().BoolVar(v, "gliding", false, "the flyer glides with its wings still: sink speed and glide ratio instead of flapping power")
}

// merge returns one source of organism and medium flags.
func merge(a, b inputs.Flags) inputs.Flags {
	out := inputs.Flags{}
	for k, v := range a {
		out[k] = v
	}
	for k, v := range b {
		out[k] = v
	}
	return out
}

type calcOptions struct {
	organism organismFlags
	gliding  bool
	medium   string
	flags    mediumFlags
	format   string
	unc      uncertaintyFlags
}

// uncertaintyFlags choose how input uncertainty ("12±1mm") is propagated.
type uncertaintyFlags struct {
	method string
	draws  int
	seed   uint64
}

func (u *uncertaintyFlags) bind(cmd *cobra.Command) {
	cmd.Flags().StringVar(&u.method, "uncertainty", regime.MethodMonteCarlo, "how to propagate input uncertainty (12±1mm, 12mm±8%): monte-carlo or linear")
	cmd.Flags().IntVar(&u.draws, "draws", 10000, "Monte Carlo draws")
	cmd.Flags().Uint64Var(&u.seed, "seed", 1, "seed of the Monte Carlo generator (same seed, same result)")
}

func (u *uncertaintyFlags) check() error {
	if u.method != regime.MethodMonteCarlo && u.method != regime.MethodLinear {
		return usagef("--uncertainty %q: accepted: monte-carlo, linear", u.method)
	}
	if u.method == regime.MethodMonteCarlo && (u.draws < 10 || u.draws > 10000000) {
		return usagef("--draws %d: give 10 to 10000000", u.draws)
	}
	return nil
}

// propagate returns the uncertainty of the results, or nil when no input
// carries an uncertainty.
func (u *uncertaintyFlags) propagate(in inputs.Input) (*regime.Uncertainty, error) {
	us, idx := in.Uncertain()
	if len(us) == 0 {
		return nil, nil
	}
	eval := in.Evaluator(idx, func(c media.Conditions) (*media.Properties, error) {
		p, err := inputs.LookupMedium(c, true)
		return &p, err
	})
	var res regime.Uncertainty
	var err error
	if u.method == regime.MethodLinear {
		res, err = regime.Linear(us, eval)
	} else {
		res, err = regime.MonteCarlo(us, eval, u.draws, u.seed)
	}
	if err != nil {
		return nil, fmt.Errorf("%s", trimPkg(err))
	}
	return &res, nil
}

const calcConventions = `
Conventions:
  Reynolds number Re = U L / ν on the --length (for a sphere its diameter;
  for a cylinder moving broadside, on its --diameter);
  each drag law also reports Re on its own length (diameter, length, or the
  diameter of the sphere of equal volume). Drag coefficients state their
  reference area: frontal πd²/4 for spheres, the wetted area of the prolate
  spheroid for skin-friction laws, d × length for cylinders, the given
  --area for a measured coefficient. The Strouhal number St = f A / U uses
  the peak-to-peak amplitude A; the efficient cruising band is 0.2–0.4
  (Taylor, Nudds & Thomas 2003). The reduced frequency k = π f c / U uses the
  forward speed U. Regimes: viscous Re < 1, intermediate 1–1000, inertial
  ≥ 1000 (common practice); streamlined bodies also get a laminar or
  turbulent boundary layer (transition at Re 5e5).
  Power: swimmers get drag × speed ÷ efficiency (towing power at efficiency
  1). In air, with --mass and --span, flight power is induced (momentum
  theory, Rankine–Froude in hover, Glauert in forward flight, factor
  --induced-factor) + parasite (the body's drag × speed, with a bird body's
  drag coefficient 0.1 on frontal area as the least, Pennycuick 2008) +
  profile (Pennycuick's profile power ratio 8.4/aspect ratio × absolute
  minimum power, or blade element over both wings with --profile-drag).
  With --gliding there is no flapping power: the same drags give the sink
  speed and glide ratio.
  'flowregime laws' lists every drag law with its source and range.
  Where no published law covers the case and two neighbouring laws are
  joined, or a rigid body's boundary layer may be laminar or turbulent, the
  drag of both is shown as a bracket (drag_low_N and drag_high_N in CSV and
  JSON).
  Uncertainty: any value may carry one, 12±1mm, 12+-1mm or 12mm±8%. It is
  propagated by Monte Carlo (--draws, --seed; sizes, speeds and other
  positive quantities drawn log-normally with the given median and relative
  spread, temperatures, salinities and altitudes normally) or to first
  order in log space (--uncertainty linear). Output gives the median and
  95 % interval of Re, St, drag and power and the probability of each
  regime and drag law.`

// newCalcCmd builds calc; a test passes runF to receive the checked
// options instead of running.
func newCalcCmd(s Streams, runF func(*calcOptions) error) *cobra.Command {
	o := &calcOptions{}
	cmd := &cobra.Command{
		Use:   "calc --length <L> --speed <U> [flags]",
		Short: "Reynolds and Strouhal numbers, regime, drag and power of one organism",
		Long: `Compute, for one organism in its medium, the Reynolds number, the flow regime,
the Strouhal number of its stroke, the drag from the law whose range fits
(with every other law's estimate beside it) and the power it needs.
` + calcConventions + "\n" + mediumFlagHelp + "\n\n" + estimateNotice,
		Example: `  # a bacterium
  flowregime calc --length 2um --diameter 1um --speed 30um/s --medium freshwater --temp 25C
  # a trout cruising
  flowregime calc --length 30cm --diameter 5cm --speed 2BL/s --freq 4Hz --amplitude 6cm --medium freshwater --temp 12C
  # a swift in level flight
  flowregime calc --length 16cm --diameter 3.5cm --speed 10m/s --mass 40g --span 42cm --chord 4cm --freq 8Hz --amplitude 20cm --medium air --altitude 500m`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(); err != nil {
				return err
			}
			if runF != nil {
				return runF(o)
			}
			return runCalc(o, s)
		},
	}
	o.organism.bind(cmd)
	bindGliding(cmd, &o.gliding)
	cmd.Flags().StringVar(&o.medium, "medium", media.KindFreshWater, "air, freshwater, seawater, or a medium file from 'flowregime fit --save'")
	o.flags.bind(cmd.Flags())
	cmd.Flags().StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	o.unc.bind(cmd)
	return cmd
}

// inputs returns the organism and medium the flags describe; fill gives
// values for fields the command sets itself when no flag does.
func (o *calcOptions) inputs(keep bool, fill map[string]string) (inputs.Input, media.Properties, error) {
	src := merge(o.organism.source(), o.flags.source())
	src["medium"] = o.medium
	for k, v := range fill {
		if src[k] == "" {
			src[k] = v
		}
	}
	in, err := inputs.Build(src, o.medium, keep)
	if err != nil {
		return in, media.Properties{}, usageError{err}
	}
	in.Organism.Gliding = o.gliding
	m, err := inputs.LookupMedium(in.Conditions, false)
	if err != nil {
		return in, m, lookupError(err)
	}
	if og := in.Organism; o.gliding && (!m.Gas || math.IsNaN(og.Mass) || math.IsNaN(og.Span)) {
		return in, media.Properties{}, usagef("--gliding needs a flyer in air with --mass and --span")
	}
	return in, m, nil
}

// validate checks the flags that need no input.
func (o *calcOptions) validate() error {
	if err := report.CheckFormat(o.format); err != nil {
		return usageError{err}
	}
	return o.unc.check()
}

func runCalc(o *calcOptions, s Streams) error {
	in, m, err := o.inputs(true, nil)
	if err != nil {
		return err
	}
	r, err := regime.Calc(in.Organism, m)
	if err != nil {
		return fmt.Errorf("%s", trimPkg(err))
	}
	unc, err := o.unc.propagate(in)
	if err != nil {
		return err
	}
	if unc != nil && unc.Failed > 0 {
		r.Warnings = append(r.Warnings, media.Warning{Code: regime.WarnModel, Message: fmt.Sprintf("uncertainty: %d of %d draws reached impossible conditions and were left out", unc.Failed, unc.Draws)})
	}
	if w, ok := batch.SphereForStroker(&in, merge(o.organism.source(), o.flags.source())["shape"] != ""); ok {
		r.Warnings = append(r.Warnings, w)
	}
	switch o.format {
	case report.FormatJSON:
		j := newCalcJSON(r)
		j.Uncertainty = newUncertaintyJSON(unc)
		src := merge(o.organism.source(), o.flags.source())
		j.Inputs = resolvedInputs(src, in)
		j.Assumed = assumedList(&in, &r, src["shape"] != "")
		return report.JSON(s.Out, j)
	case report.FormatCSV:
		return report.Fields(s.Out, o.format, append(append(calcFields(r, false), uncertaintyFields(unc)...), report.Field{Key: "warnings", Value: strings.Join(warningTexts(r.Warnings), "; ")}))
	}
	if err := report.Fields(s.Out, o.format, append(calcFields(r, true), uncertaintyFields(unc)...)); err != nil {
		return err
	}
	fmt.Fprintln(s.Out, "\nDrag by every law for this shape (chosen law first):")
	if err := report.Table(s.Out, []string{"law", "Re", "Re on", "C_D", "reference area (m²)", "drag (N)", "in range"}, estimateRows(r.Drag)); err != nil {
		return err
	}
	report.Paragraph(s.Out, "", fmt.Sprintf("C_D of %s is on the %s.", r.Drag.Chosen.Law, r.Drag.Chosen.AreaName))
	report.List(s.Out, "Medium", []string{mediumLine(m)})
	src := merge(o.organism.source(), o.flags.source())
	report.List(s.Out, "Assumed (defaults that changed the result)", assumedTexts(assumedList(&in, &r, src["shape"] != "")))
	report.List(s.Out, "Warnings", warningTexts(r.Warnings))
	return nil
}

// bracketFields shows the drag's bracket (see [regime.Estimate]), if any:
// for a table one line "low – high, from …" naming where the ends come from, for
// CSV the ends as drag_low_N and drag_high_N.
func bracketFields(e regime.Estimate, table bool) []report.Field {
	if math.IsNaN(e.Low) || math.IsNaN(e.High) {
		return nil
	}
	if table {
		return []report.Field{{Key: "drag_bracket_N", Label: "  drag bracket (N)",
			Value: report.Num(e.Low, 4) + " – " + report.Num(e.High, 4) + ", from " + e.BracketFrom}}
	}
	return []report.Field{report.F("drag_low_N", "drag, low end of the bracket (N)", e.Low, 4),
		report.F("drag_high_N", "drag, high end of the bracket (N)", e.High, 4)}
}

func estimateRows(d regime.DragResult) [][]string {
	var rows [][]string
	add := func(e regime.Estimate) {
		in := "yes"
		if !e.InRange {
			in = "no (" + regime.Law{ReMin: e.ReMin, ReMax: e.ReMax}.Range() + ")"
		}
		rows = append(rows, []string{e.Law, report.Num(e.Reynolds, 4), e.Basis, report.Num(e.Coefficient, 4), report.Num(e.ReferenceArea, 4), report.Num(e.Force, 4), in})
	}
	add(d.Chosen)
	for _, e := range d.Estimates {
		if e.Law != d.Chosen.Law {
			add(e)
		}
	}
	return rows
}

// calcFields lists the result for a table (table true: the drag's bracket
// on one line with its origin) or CSV (its two ends as numbers).
func calcFields(r regime.Result, table bool) []report.Field {
	fs := []report.Field{
		report.F("reynolds", "Reynolds number (on the "+reynoldsLength(r)+")", r.Reynolds, 4),
		{Key: "regime", Label: "flow regime", Value: r.Regime},
	}
	if r.BoundaryLayer != "" {
		fs = append(fs, report.Field{Key: "boundary_layer", Label: "boundary layer", Value: r.BoundaryLayer})
	}
	fs = append(fs, report.Maybe("strouhal", "Strouhal number (peak-to-peak)", r.Strouhal, 3))
	if r.StrouhalBand != "" {
		fs = append(fs, report.Field{Key: "strouhal_band", Label: "St vs cruising band 0.2–0.4", Value: r.StrouhalBand})
	}
	fs = append(fs,
		report.Maybe("advance_ratio", "advance ratio J", r.AdvanceRatio, 3),
		report.Maybe("reduced_frequency", "reduced frequency k (on forward speed)", r.ReducedFrequency, 3),
		report.Field{Key: "drag_law", Label: "drag law", Value: r.Drag.Chosen.Law},
		report.F("drag_coefficient", "drag coefficient", r.Drag.Chosen.Coefficient, 4),
		report.F("drag_N", "drag (N)", r.Drag.Chosen.Force, 4),
	)
	fs = append(fs, bracketFields(r.Drag.Chosen, table)...)
	fs = append(fs, powerFields(r.Power)...)
	if !r.Medium.Newtonian() {
		fs = append(fs, report.F("shear_rate_1_s", "characteristic shear rate (1/s)", r.ShearRate, 4),
			report.F("apparent_viscosity_Pa_s", "apparent viscosity there (Pa·s)", r.Viscosity, 4))
	}
	return append(fs,
		report.Maybe("generalized_reynolds", "generalised Reynolds number", r.GeneralizedRe, 4),
		report.Maybe("bingham_number", "Bingham number", r.BinghamNumber, 4),
		report.Maybe("deborah", "Deborah number", r.Deborah, 3),
		report.Maybe("weissenberg", "Weissenberg number", r.Weissenberg, 3),
		report.Maybe("coasting_time_s", coastTimeLabel(r.CoastStops), r.CoastTime, 3),
		report.Maybe("coasting_distance_m", "coasting distance (m)", r.CoastDistance, 3),
		report.Maybe("peclet", "Péclet number (on --length)", r.Peclet, 3),
		report.Maybe("diffusivity_m2_s", "solute diffusivity (m²/s)", r.Diffusivity, 3),
	)
}

// coastTimeLabel says whether the coasting time is a time to stop or the
// time constant of a speed that decays without stopping.
func coastTimeLabel(stops bool) string {
	if stops {
		return "coasting: time to stop (s)"
	}
	return "coasting time after stopping (s)"
}

// powerFields are the power lines: a glide shows its sink speed and glide
// ratio and no flapping power.
func powerFields(p regime.Power) []report.Field {
	fs := []report.Field{{Key: "power_kind", Label: "power", Value: p.Kind}}
	f := p.Flight
	if p.Kind == regime.PowerGliding {
		fs[0].Value = "gliding: no flapping power"
		return append(fs,
			report.F("power_W", "height energy spent, m g × sink speed (W)", p.Total, 4),
			report.F("sink_speed_m_s", "  sink speed (m/s)", f.SinkSpeed, 4),
			report.F("glide_ratio", "  glide ratio (lift/drag)", f.GlideRatio, 3),
			report.F("body_drag_coefficient", "  body drag coefficient (on frontal area)", f.BodyDragCoefficient, 3),
			report.Maybe("profile_drag_coefficient", "  profile-drag coefficient", f.ProfileCD, 3),
		)
	}
	fs = append(fs, report.F("power_W", "power needed (W)", p.Total, 4))
	if f == nil {
		return fs
	}
	return append(fs,
		report.F("induced_power_W", "  induced power (W)", f.Induced, 4),
		report.F("parasite_power_W", "  parasite power (W)", f.Parasite, 4),
		report.F("profile_power_W", "  profile power (W)", f.Profile, 4),
		report.Field{Key: "profile_method", Label: "  profile power method", Value: f.ProfileMethod},
		report.F("hover_induced_power_W", "  induced power in hover (W)", f.HoverInduced, 4),
		report.F("body_drag_coefficient", "  body drag coefficient (on frontal area)", f.BodyDragCoefficient, 3),
		report.Maybe("profile_ratio", "  profile power ratio X1", f.ProfileRatio, 3),
		report.Maybe("profile_drag_coefficient", "  profile-drag coefficient", f.ProfileCD, 3),
	)
}

// parseFlagValue checks one flag's text against its field's kind.
func parseFlagValue(f inputs.Field, text string) (float64, error) {
	v, err := quantity.Parse(f.Kind, text)
	if err != nil {
		return 0, usagef("--%s: %v", f.Flag, err)
	}
	return v.SI, nil
}
