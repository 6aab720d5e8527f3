package cli

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
)

// Similarity targets of the scale-model command.
const (
	matchReynolds = regime.MatchReynolds
	matchFroude   = regime.MatchFroude
	matchBoth     = "both"
	fluidOil      = "oil"
)

// unscaledFlags are calc's organism flags that a scale model does not use;
// they are refused rather than ignored.
var unscaledFlags = []string{"diameter", "shape", "mass", "span", "wing-length", "wing-area", "stroke-angle", "efficiency", "drag-coefficient",
	"area", "induced-factor", "profile-drag", "disc", "diffusivity", "shear-rate", "relaxation-time"}

// defaultFluids are the candidates tried when no --fluid is given.
var defaultFluids = []string{media.KindFreshWater, media.KindGlycerol, media.KindSucrose}

type scaleOptions struct {
	calc                  calcOptions
	modelLength, scale    string
	fluids                []string
	tankTemp              string
	modelSpeed, modelFreq string
	match                 string
	oilPoints             []string
	oilDensity            string
}

const scaleHelp = `
A geometrically similar model of length --model-length (or --scale times
the organism) matches the organism's Strouhal number St = f A / U and, with
--match reynolds (default), its Reynolds number Re = U L / ν: the model
speed is U (ν_model/ν_organism) / scale and the stroke frequency f
(ν_model/ν_organism) / scale². --match froude matches Fr = U/√(gL) instead
(a body at a free surface; Re then differs), and --match both asks for the
fluid with ν_organism × scale^1.5, which matches Re and Fr together.

Fluids (--fluid, repeatable; default freshwater, glycerol, sucrose) are
taken at --tank-temp (default 20 °C): any medium name (freshwater, seawater,
air, a medium file), a lab fluid with its mass fraction (glycerol:0.85,
sucrose:40%), bare glycerol or sucrose (the command finds the mass
fraction that gives the viscosity the target needs), or oil (a measured oil:
--oil-point 20C=65mPas twice or more and --oil-density).

A target fixes the model fluid's kinematic viscosity: --model-speed (the
speed your rig runs at), --model-freq (its stroke frequency), or
--match both. Without one, every fluid gives its own model speed and
frequency. Each fluid's row shows how far ν moves for ±1 °C in the tank.
Force and power ratios carry model measurements back: organism force =
model force ÷ (F model/F organism). Glycerol–water: Cheng 2008 (viscosity),
Volk & Kähler 2018 (density); sucrose: CRC Handbook 102nd ed., 20 °C only.`

// newScaleModelCmd builds scalemodel; a test passes runF to receive the
// checked options instead of running.
func newScaleModelCmd(s Streams, runF func(*scaleOptions) error) *cobra.Command {
	o := &scaleOptions{}
	cmd := &cobra.Command{
		Use:   "scalemodel --length <L> --speed <U> (--model-length <L> | --scale <x>) [flags]",
		Short: "Speed, stroke frequency and lab fluid for a dynamically similar scale model",
		Long: `Plan a scale model of an organism or appendage: the model speed and stroke
frequency that keep its Reynolds and Strouhal numbers, the force and power
ratios back to the organism, and the lab fluid (glycerol–water mass
fraction, sucrose, oil) that makes the match possible.
` + scaleHelp + "\n" + mediumFlagHelp + "\n\n" + estimateNotice,
		Example: `  # a 1 mm copepod limb beating at 20 Hz, as a 10 cm paddle driven at 5 cm/s
  flowregime scalemodel --length 1mm --speed 1cm/s --freq 20Hz --amplitude 0.5mm --medium seawater --model-length 10cm --model-speed 5cm/s
  # a trout at twice its size in fresh water, near the surface
  flowregime scalemodel --length 30cm --speed 0.6m/s --freq 4Hz --amplitude 6cm --scale 2 --fluid freshwater --match froude`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := report.CheckFormat(o.calc.format); err != nil {
				return usageError{err}
			}
			for _, name := range unscaledFlags {
				if cmd.Flags().Changed(name) {
					return usagef("--%s does not enter a scale model; scalemodel scales the whole shape and takes Re on --length (give there the length Re should be on), St on --amplitude, k on --chord", name)
				}
			}
			if runF != nil {
				return runF(o)
			}
			return runScaleModel(o, s)
		},
	}
	o.calc.organism.bind(cmd)
	for _, name := range unscaledFlags {
		_ = cmd.Flags().MarkHidden(name)
	}
	fs := cmd.Flags()
	fs.StringVar(&o.calc.medium, "medium", media.KindFreshWater, "the organism's medium: air, freshwater, seawater, a lab fluid or a medium file")
	o.calc.flags.bind(fs)
	fs.StringVar(&o.calc.format, "format", report.FormatTable, "output: table, json or csv")
	fs.StringVar(&o.modelLength, "model-length", "", "length of the model (same measure as --length), e.g. 10cm")
	fs.StringVar(&o.scale, "scale", "", "model length over organism length, e.g. 100")
	fs.StringArrayVar(&o.fluids, "fluid", nil, "candidate model fluid (repeatable): freshwater, glycerol, glycerol:0.8, sucrose, sucrose:40%, oil, a medium file")
	fs.StringVar(&o.tankTemp, "tank-temp", "20C", "temperature of the model's tank")
	fs.StringVar(&o.modelSpeed, "model-speed", "", "target: the model speed the rig runs at, e.g. 5cm/s")
	fs.StringVar(&o.modelFreq, "model-freq", "", "target: the model stroke frequency the rig runs at, e.g. 0.5Hz")
	fs.StringVar(&o.match, "match", matchReynolds, "groups matched with St: reynolds, froude or both")
	fs.StringArrayVar(&o.oilPoints, "oil-point", nil, "a measured oil's viscosity at a temperature, e.g. 20C=65mPas (repeat: two or more)")
	fs.StringVar(&o.oilDensity, "oil-density", "", "the measured oil's density, e.g. 870kg/m3")
	return cmd
}

// scalePlan is everything the command parsed: the organism, the model
// length, the tank and the target viscosity (NaN without a target).
type scalePlan struct {
	proto      regime.Prototype
	medium     media.Properties
	lm, tankC  float64
	mode       string
	target     float64
	targetWhy  string
	oil        *media.Oil
	fluidNames []string
}

func runScaleModel(o *scaleOptions, s Streams) error {
	plan, err := o.plan()
	if err != nil {
		return err
	}
	var rows []scaleRow
	for _, name := range plan.fluidNames {
		rows = append(rows, plan.evaluate(name))
	}
	res := newScaleResult(plan, rows)
	if err := writeScaleResult(s, o.calc.format, res); err != nil {
		return err
	}
	if !res.anyUsable() {
		return exitError{code: ExitFailure, msg: "no candidate fluid could be used; see the status column"}
	}
	if !math.IsNaN(plan.target) && !res.anyMatch() {
		return exitError{code: ExitFailure, msg: fmt.Sprintf("no candidate fluid has the kinematic viscosity %s m²/s the match needs; see the notes", report.Num(plan.target, 4))}
	}
	return nil
}

func (o *scaleOptions) plan() (scalePlan, error) {
	var p scalePlan
	switch o.match {
	case matchReynolds, matchBoth:
		p.mode = regime.MatchReynolds
	case matchFroude:
		p.mode = regime.MatchFroude
	default:
		return p, usagef("--match %q: accepted: reynolds, froude, both", o.match)
	}
	in, m, err := o.calc.inputs(true, nil)
	if err != nil {
		return p, err
	}
	if us, _ := in.Uncertain(); len(us) > 0 {
		return p, usagef("--%s carries an uncertainty; scalemodel does not propagate it, give plain values", strings.ReplaceAll(us[0].Name, "_", "-"))
	}
	if !m.Newtonian() {
		return p, fmt.Errorf("--medium %s is non-Newtonian; a scale model in a Newtonian lab fluid cannot match its shear-rate dependence", o.calc.medium)
	}
	org := in.Organism
	p.medium = m
	p.proto = regime.Prototype{Length: org.Body.Length, Speed: org.Speed, Frequency: org.Frequency,
		Amplitude: org.Amplitude, Chord: org.Chord, Nu: m.KinematicViscosity, Rho: m.Density}
	if err := p.proto.Check(); err != nil {
		return p, fmt.Errorf("%s", trimPkg(err))
	}
	if p.lm, err = o.modelLengthSI(p.proto.Length); err != nil {
		return p, err
	}
	if p.tankC, err = parseOne("tank-temp", quantity.Temperature, o.tankTemp); err != nil {
		return p, err
	}
	if err := o.setTarget(&p); err != nil {
		return p, err
	}
	if err := o.setOil(&p); err != nil {
		return p, err
	}
	p.fluidNames = o.fluids
	if len(p.fluidNames) == 0 {
		p.fluidNames = append([]string(nil), defaultFluids...)
		if p.oil != nil {
			p.fluidNames = append(p.fluidNames, fluidOil)
		}
	}
	return p, nil
}

// parseOne reads one flag's quantity; an empty text is NaN.
func parseOne(flag string, k quantity.Kind, text string) (float64, error) {
	if strings.TrimSpace(text) == "" {
		return math.NaN(), nil
	}
	v, err := quantity.Parse(k, text)
	if err != nil {
		return 0, usagef("--%s: %v", flag, err)
	}
	if v.SD != 0 {
		return 0, usagef("--%s: give a plain value; uncertainty is not propagated by scalemodel", flag)
	}
	return v.SI, nil
}

func (o *scaleOptions) modelLengthSI(lp float64) (float64, error) {
	lm, err := parseOne("model-length", quantity.Length, o.modelLength)
	if err != nil {
		return 0, err
	}
	x, err := parseOne("scale", quantity.Number, o.scale)
	if err != nil {
		return 0, err
	}
	switch {
	case math.IsNaN(lm) == math.IsNaN(x):
		return 0, usagef("give the model's size as one of --model-length or --scale")
	case !math.IsNaN(x):
		lm = x * lp
	}
	if !(lm > 0) || math.IsInf(lm, 0) {
		return 0, usagef("the model length must be positive")
	}
	return lm, nil
}

// setTarget fixes the model fluid's kinematic viscosity from the one target
// given, if any.
func (o *scaleOptions) setTarget(p *scalePlan) error {
	p.target = math.NaN()
	um, err := parseOne("model-speed", quantity.Speed, o.modelSpeed)
	if err != nil {
		return err
	}
	fm, err := parseOne("model-freq", quantity.Frequency, o.modelFreq)
	if err != nil {
		return err
	}
	given := 0
	for _, v := range []float64{um, fm} {
		if !math.IsNaN(v) {
			given++
			if !(v > 0) || math.IsInf(v, 0) {
				return usagef("--model-speed and --model-freq must be positive")
			}
		}
	}
	if o.match == matchBoth {
		given++
	}
	if given > 1 {
		return usagef("give at most one target: --model-speed, --model-freq or --match both")
	}
	if given == 1 && o.match == matchFroude {
		return usagef("--match froude sets the model speed itself (U √scale); drop --model-speed and --model-freq, or use --match both")
	}
	lp := p.proto.Length
	switch {
	case !math.IsNaN(um):
		p.target = regime.NuForSpeed(p.proto, p.lm, um)
		p.targetWhy = fmt.Sprintf("model speed %s m/s", report.Num(um, 4))
	case !math.IsNaN(fm):
		if math.IsNaN(p.proto.Frequency) {
			return usagef("--model-freq needs the organism's --freq")
		}
		p.target = regime.NuForFrequency(p.proto, p.lm, fm)
		p.targetWhy = fmt.Sprintf("model stroke frequency %s Hz", report.Num(fm, 4))
	case o.match == matchBoth:
		p.target = regime.NuForFroude(p.proto, p.lm)
		p.targetWhy = fmt.Sprintf("Re and Fr together (ν_organism × scale^1.5, scale %s)", report.Num(p.lm/lp, 4))
	}
	return nil
}

// setOil fits the measured oil when its points are given.
func (o *scaleOptions) setOil(p *scalePlan) error {
	if len(o.oilPoints) == 0 {
		if o.oilDensity != "" {
			return usagef("--oil-density needs the oil's --oil-point values")
		}
		return nil
	}
	rho, err := parseOne("oil-density", quantity.Density, o.oilDensity)
	if err != nil {
		return err
	}
	if math.IsNaN(rho) {
		return usagef("a measured oil needs --oil-density, e.g. 870kg/m3")
	}
	var pts []media.ViscosityPoint
	for _, text := range o.oilPoints {
		t, mu, ok := strings.Cut(text, "=")
		if !ok {
			return usagef("--oil-point %q: write temperature=viscosity, e.g. 20C=65mPas", text)
		}
		tc, err := parseOne("oil-point", quantity.Temperature, t)
		if err != nil {
			return err
		}
		v, err := parseOne("oil-point", quantity.Viscosity, mu)
		if err != nil {
			return err
		}
		if math.IsNaN(tc) || math.IsNaN(v) {
			return usagef("--oil-point %q: write temperature=viscosity, e.g. 20C=65mPas", text)
		}
		pts = append(pts, media.ViscosityPoint{TemperatureC: tc, Viscosity: v})
	}
	oil, err := media.FitOil("measured oil", rho, pts)
	if err != nil {
		return usageError{errors.New(trimPkg(err))}
	}
	p.oil = &oil
	return nil
}
