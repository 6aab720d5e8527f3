package cli

import (
	"fmt"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
)

type settleOptions struct {
	diameter, length, density, shape, shearRate string
	coreyShape, roundness                       string
	medium                                      string
	flags                                       mediumFlags
	format                                      string
}

// newSettleCmd builds settle; a test passes runF to receive the checked
// options instead of running.
func newSettleCmd(s Streams, runF func(*settleOptions) error) *cobra.Command {
	o := &settleOptions{}
	cmd := &cobra.Command{
		Use:   "settle --diameter <d> --density <ρ> [flags]",
		Short: "Terminal sinking or rising speed of a particle, egg, seed or spore",
		Long: `Solve the balance of drag and buoyant weight for the terminal speed of a
rigid particle, across regimes, with the same sphere laws as calc (Stokes,
Proudman–Pearson, then the standard curve of Clift, Grace & Weber 1978) for
a sphere, and Haider–Levenspiel (1989), a fit to freely falling
non-spherical particles, for a prolate spheroid (give --length too). Re is
on the diameter (of the equal-volume sphere for a spheroid). In air the
Cunningham slip correction (Davies 1945 constants) is applied; it matters
below about 10 µm (spores, pollen, bacteria).
In a measured non-Newtonian medium (--medium FILE.json) the viscosity is
the apparent viscosity at the shear rate U/d (Chhabra 2007; some authors use
2U/d), solved together with U by bisection unless --shear-rate fixes it; a
sphere in a power-law fluid takes the X(n) creeping-flow law of Renaud,
Mauret & Chhabra (2004), joined smoothly to the sphere laws between Re 0.1
and 100; in a yield-stress fluid a sphere with Y_g = 3τ_y/(d Δρ g) ≥ 0.143
is held (Beris et al. 1985).
A natural grain (--corey-shape and --roundness, --diameter its nominal
diameter) settles as the sphere times Dietrich's (1982) shape and roundness
factors; natural sand (about 0.7 and 3.5) settles 10–40 % slower than a
sphere of the same volume.
` + mediumFlagHelp + "\n\n" + estimateNotice,
		Example: `  flowregime settle --diameter 150um --density 1.06g/cm3 --medium seawater --temp 10C
  flowregime settle --diameter 25um --density 1100kg/m3 --medium air --humidity 70%`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			if runF != nil {
				return runF(o)
			}
			return runSettle(o, s)
		},
	}
	fs := cmd.Flags()
	fs.StringVar(&o.diameter, "diameter", "", "particle diameter (maximum diameter of a spheroid), e.g. 150um")
	fs.StringVar(&o.length, "length", "", "spheroid only: length along the axis, e.g. 400um")
	fs.StringVar(&o.density, "density", "", "particle density, e.g. 1.06g/cm3 or 1060kg/m3")
	fs.StringVar(&o.shape, "shape", "", "sphere or spheroid (default: spheroid with --length, else sphere)")
	fs.StringVar(&o.coreyShape, "corey-shape", "", "natural grain: Corey shape factor c/√(ab), 0.2–1 (with --roundness; --diameter is then the nominal diameter)")
	fs.StringVar(&o.roundness, "roundness", "", "natural grain: Powers roundness, up to 6 for perfectly round (natural sand about 3.5)")
	fs.StringVar(&o.shearRate, "shear-rate", "", "measured medium: fix the characteristic shear rate (default U/d at terminal speed), e.g. 2/s")
	fs.StringVar(&o.medium, "medium", media.KindFreshWater, "air, freshwater, seawater, or a medium file from 'flowregime fit --save'")
	o.flags.bind(fs)
	fs.StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	return cmd
}

func (o *settleOptions) particle() (regime.Particle, error) {
	if o.diameter == "" || o.density == "" {
		return regime.Particle{}, usagef("settle needs --diameter and --density, e.g. --diameter 150um --density 1.06g/cm3")
	}
	p := regime.Particle{Shape: regime.Sphere, Length: math.NaN()}
	for _, f := range o.particleFields(&p) {
		if f.text == "" {
			continue
		}
		v, err := quantity.Parse(f.kind, f.text)
		if err != nil {
			return p, usagef("--%s: %v", f.flag, err)
		}
		if err := refuseUncertainValue("settle", f.flag, f.text, v); err != nil {
			return p, err
		}
		if !(v.SI > 0) {
			u := quantity.SIUnit(f.kind)
			return p, usagef("--%s: must be above 0 %s, got %g %s", f.flag, u, v.SI, u)
		}
		*f.dst = v.SI
	}
	if o.length != "" {
		p.Shape = regime.Spheroid
	}
	if o.shape != "" {
		s, err := regime.ParseShape(o.shape)
		if err != nil || (s != regime.Sphere && s != regime.Spheroid) {
			return p, usagef("--shape %q: settle accepts sphere or spheroid", o.shape)
		}
		p.Shape = s
	}
	if (o.coreyShape == "") != (o.roundness == "") {
		return p, usagef("a natural grain needs both --corey-shape and --roundness (natural sand: about 0.7 and 3.5)")
	}
	if o.coreyShape != "" && !(p.CoreyShape > 0 && p.Roundness > 0) { // zero would read as "no grain"
		return p, fmt.Errorf("a natural grain needs a Corey shape factor in 0.2–1 and a Powers roundness above 0 and at most 6, got %g and %g", p.CoreyShape, p.Roundness)
	}
	if p.Shape == regime.Spheroid && o.length == "" {
		return p, usagef("a spheroid needs --length as well as --diameter")
	}
	return p, nil
}

func runSettle(o *settleOptions, s Streams) error {
	p, err := o.particle()
	if err != nil {
		return err
	}
	m, err := o.flags.lookup("settle", o.medium)
	if err != nil {
		return err
	}
	r, err := regime.Settle(p, m)
	if err != nil {
		return fmt.Errorf("%s", trimPkg(err))
	}
	ws := append(append([]media.Warning{}, m.Warnings...), r.Warnings...)
	switch o.format {
	case report.FormatJSON:
		ins, assumed := o.settleInputs(p, m)
		return report.JSON(s.Out, settleJSON{
			Inputs: ins, Assumed: assumed,
			Speed: r.Speed, Direction: r.Direction, Reynolds: r.Reynolds, ReynoldsBasis: r.Basis,
			Drag:        settleDragJSON{Law: r.Law, Source: r.Source, Coefficient: report.Opt(r.Coefficient), Force: r.Force},
			StokesSpeed: r.StokesSpeed, Archimedes: r.Archimedes, Cunningham: r.Cunningham, Knudsen: report.Opt(r.Knudsen),
			Medium: settleMediumJSON(m, r), Warnings: nonNil(warningTexts(ws)),
			GeneralizedRe: report.Opt(r.GeneralizedRe), BinghamNumber: report.Opt(r.BinghamNumber), YieldParameter: report.Opt(r.YieldParameter),
		})
	case report.FormatCSV:
		return report.Fields(s.Out, o.format, append(settleFields(r), report.Field{Key: "warnings", Value: strings.Join(warningTexts(ws), "; ")}))
	}
	if err := report.Fields(s.Out, o.format, settleFields(r)); err != nil {
		return err
	}
	report.List(s.Out, "Medium", []string{mediumLine(m)})
	_, assumed := o.settleInputs(p, m)
	report.List(s.Out, "Assumed (defaults that changed the result)", assumedTexts(assumed))
	report.List(s.Out, "Warnings", warningTexts(ws))
	return nil
}

func settleFields(r regime.Settling) []report.Field {
	fs := []report.Field{
		report.F("terminal_speed_m_s", "terminal speed (m/s)", r.Speed, 4),
		{Key: "direction", Label: "direction", Value: r.Direction},
		report.F("reynolds", "Reynolds number (on the "+r.Basis+")", r.Reynolds, 4),
		{Key: "drag_law", Label: "drag law", Value: r.Law},
		report.Maybe("drag_coefficient", "drag coefficient (frontal area of the "+r.Basis+")", r.Coefficient, 4), // NaN when held
		report.F("drag_N", "drag = buoyant weight (N)", r.Force, 4),
		report.F("stokes_speed_m_s", "Stokes' law speed, for comparison (m/s)", r.StokesSpeed, 4),
		report.F("archimedes", "Archimedes number", r.Archimedes, 4),
		report.Maybe("shear_rate_1_s", "shear rate U/d (1/s)", r.ShearRate, 4),
		report.Maybe("apparent_viscosity_Pa_s", "apparent viscosity there (Pa·s)", r.Viscosity, 4),
		report.Maybe("generalized_reynolds", "generalised Reynolds number", r.GeneralizedRe, 4),
		report.Maybe("bingham_number", "Bingham number", r.BinghamNumber, 4),
		report.Maybe("yield_parameter", "yield parameter Y_g = 3τ_y/(d Δρ g); held at ≥ 0.143", r.YieldParameter, 4),
		report.Maybe("knudsen", "Knudsen number 2λ/d", r.Knudsen, 3),
	}
	if !math.IsNaN(r.Knudsen) {
		fs = append(fs, report.F("cunningham", "Cunningham slip factor", r.Cunningham, 4))
	}
	return fs
}

type settleJSON struct {
	Speed          float64                 `json:"terminal_speed_m_s"`
	Direction      string                  `json:"direction"`
	Reynolds       float64                 `json:"reynolds"`
	ReynoldsBasis  string                  `json:"reynolds_on"`
	Drag           settleDragJSON          `json:"drag"`
	StokesSpeed    float64                 `json:"stokes_speed_m_s"`
	Archimedes     float64                 `json:"archimedes"`
	Cunningham     float64                 `json:"cunningham"`
	Knudsen        *float64                `json:"knudsen,omitempty"`
	GeneralizedRe  *float64                `json:"generalized_reynolds,omitempty"`
	BinghamNumber  *float64                `json:"bingham_number,omitempty"`
	YieldParameter *float64                `json:"yield_parameter,omitempty"`
	Medium         mediumJSON              `json:"medium"`
	Warnings       []string                `json:"warnings"`
	Inputs         map[string]resolvedJSON `json:"inputs"`  // as used, in SI
	Assumed        []assumedJSON           `json:"assumed"` // defaults that changed the result
}

type settleDragJSON struct {
	Law         string   `json:"law"`
	Source      string   `json:"source"`
	Coefficient *float64 `json:"coefficient"`
	Force       float64  `json:"force_N"`
}

func settleMediumJSON(m media.Properties, r regime.Settling) mediumJSON {
	j := newMediumJSON(m)
	if !m.Newtonian() {
		j.ShearRate, j.ApparentViscosity = report.Opt(r.ShearRate), report.Opt(r.Viscosity)
	}
	return j
}

// particleFlag is one numeric flag of settle and where its value goes.
type particleFlag struct {
	flag, text string
	kind       quantity.Kind
	dst        *float64
}

// particleFields lists settle's numeric flags, writing into p.
func (o *settleOptions) particleFields(p *regime.Particle) []particleFlag {
	return []particleFlag{
		{"diameter", o.diameter, quantity.Length, &p.Diameter},
		{"length", o.length, quantity.Length, &p.Length},
		{"density", o.density, quantity.Density, &p.Density},
		{"shear-rate", o.shearRate, quantity.ShearRate, &p.ShearRate},
		{"corey-shape", o.coreyShape, quantity.Number, &p.CoreyShape},
		{"roundness", o.roundness, quantity.Number, &p.Roundness},
	}
}

// settleInputs returns settle's numeric inputs as used, in SI units, and
// the defaults that changed the result.
func (o *settleOptions) settleInputs(p regime.Particle, m media.Properties) (map[string]resolvedJSON, []assumedJSON) {
	in := map[string]resolvedJSON{}
	for _, f := range o.particleFields(&p) {
		if f.text != "" {
			in[f.flag] = resolvedJSON{Value: *f.dst, Unit: quantity.SIUnit(f.kind), Given: f.text}
		}
	}
	c, err := inputs.Conditions(o.flags.source(), o.medium)
	if err != nil { // already read without error by lookup
		return in, nil
	}
	assumed := batch.MediumAssumptions(nil, &c, &m)
	list := []assumedJSON{}
	for _, a := range assumed {
		list = append(list, assumedJSON{Code: a, Meaning: batch.AssumedMeaning[a]})
	}
	return in, list
}
