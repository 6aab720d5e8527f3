package cli

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// matchTolerance is how close a fluid's ν must be to the target to count
// as matching it: 1 % in ν is 1 % in Re (common practice, no source).
const matchTolerance = 0.01

// scaleRow is one candidate fluid: its properties in the tank, the model it
// gives, and why it cannot be used when it cannot.
type scaleRow struct {
	Fluid    string // as asked
	Fraction float64
	Props    media.Properties
	Sim      regime.Similarity
	Colder   float64 // relative change of ν at tank temperature − 1 °C
	Warmer   float64 // and at + 1 °C
	Matches  bool
	Status   string
	Failed   bool
}

// fluidAt gives a fluid's properties at a tank temperature (°C).
type fluidAt func(tC float64) (media.Properties, error)

// evaluate resolves one candidate fluid and the model it gives.
func (p *scalePlan) evaluate(name string) scaleRow {
	row := scaleRow{Fluid: name, Fraction: math.NaN(), Colder: math.NaN(), Warmer: math.NaN()}
	at, fraction, err := p.resolve(name)
	if err != nil {
		row.Failed, row.Status = true, trimPkg(err)
		return row
	}
	row.Fraction = fraction
	props, err := at(p.tankC)
	if err != nil {
		row.Failed, row.Status = true, trimPkg(err)
		return row
	}
	if !props.Newtonian() {
		row.Failed, row.Status = true, "non-Newtonian: its viscosity depends on the model's shear rate"
		return row
	}
	row.Props = props
	row.Colder, row.Warmer = sensitivity(at, p.tankC, props.KinematicViscosity)
	row.Sim, err = regime.Similar(p.proto, p.lm, props.KinematicViscosity, props.Density, p.mode)
	if err != nil {
		row.Failed, row.Status = true, trimPkg(err)
		return row
	}
	row.Matches, row.Status = p.status(props.KinematicViscosity)
	if !row.Matches && !math.IsNaN(p.target) {
		if t, ok := p.targetTemperature(name, fraction); ok {
			row.Status += fmt.Sprintf("; this fluid reaches the target at %s °C", report.Num(t, 3))
		}
	}
	return row
}

// targetTemperature returns the tank temperature at which a fixed glycerol
// mixture or the measured oil has the target viscosity, if within its data.
func (p *scalePlan) targetTemperature(name string, fraction float64) (float64, bool) {
	var t float64
	var err error
	switch {
	case isGlycerol(name):
		t, err = media.GlycerolTemperatureFor(fraction, p.target)
	case strings.EqualFold(strings.TrimSpace(name), fluidOil) && p.oil != nil:
		t, err = p.oil.TemperatureFor(p.target)
	default:
		return 0, false
	}
	return t, err == nil
}

func isGlycerol(name string) bool {
	kind, _, ok, err := media.ParseLabFluid(name)
	return ok && err == nil && kind == media.KindGlycerol
}

// sensitivity returns the relative change of ν at one degree colder and
// warmer; NaN where the fluid is not defined there.
func sensitivity(at fluidAt, tC, nu float64) (colder, warmer float64) {
	rel := func(t float64) float64 {
		q, err := at(t)
		if err != nil {
			return math.NaN()
		}
		return q.KinematicViscosity/nu - 1
	}
	return rel(tC - 1), rel(tC + 1)
}

func (p *scalePlan) status(nu float64) (bool, string) {
	if math.IsNaN(p.target) {
		return false, "own speed"
	}
	off := nu/p.target - 1
	if math.Abs(off) <= matchTolerance {
		return true, "matches the target"
	}
	return false, fmt.Sprintf("ν %+.3g %% from the target", 100*off)
}

// resolve turns a fluid name into its properties as a function of the tank
// temperature, solving a bare glycerol or sucrose for the target.
func (p *scalePlan) resolve(name string) (fluidAt, float64, error) {
	lookup := func(medium string) fluidAt {
		return func(tC float64) (media.Properties, error) {
			c := media.Unset(medium)
			c.TemperatureC = tC
			return inputs.LookupMedium(c, false)
		}
	}
	switch strings.ToLower(strings.TrimSpace(name)) {
	case fluidOil:
		if p.oil == nil {
			return nil, 0, fmt.Errorf("oil needs --oil-point (twice or more) and --oil-density")
		}
		return p.oil.Properties, math.NaN(), nil
	case media.KindGlycerol:
		w, err := p.glycerolFraction()
		if err != nil {
			return nil, 0, err
		}
		return func(tC float64) (media.Properties, error) { return media.Glycerol(w, tC) }, w, nil
	case media.KindSucrose:
		w, err := p.sucroseFraction()
		if err != nil {
			return nil, 0, err
		}
		return func(tC float64) (media.Properties, error) { return media.Sucrose(w, tC) }, w, nil
	}
	if _, w, ok, err := media.ParseLabFluid(name); ok {
		return lookup(name), w, err
	}
	return lookup(name), math.NaN(), nil
}

func errNoTarget(kind string) error {
	return fmt.Errorf("give a target (--model-speed, --model-freq or --match both) to choose its mass fraction, or name one, e.g. %s:0.5", kind)
}

func (p *scalePlan) glycerolFraction() (float64, error) {
	if math.IsNaN(p.target) {
		return 0, errNoTarget(media.KindGlycerol)
	}
	w, err := media.GlycerolFractionFor(p.target, p.tankC)
	var reach *media.OutOfReachError
	if !errors.As(err, &reach) {
		return w, err
	}
	msg := fmt.Sprintf("glycerol–water at %s °C spans ν %s to %s m²/s", report.Num(p.tankC, 4), report.Num(reach.Low, 3), report.Num(reach.High, 3))
	end, word := 1.0, "pure glycerol"
	if p.target < reach.Low {
		end, word = 0, "water"
	}
	if t, terr := media.GlycerolTemperatureFor(end, p.target); terr == nil {
		msg += fmt.Sprintf("; %s reaches %s m²/s at %s °C", word, report.Num(p.target, 4), report.Num(t, 3))
	}
	return 0, errors.New(msg)
}

func (p *scalePlan) sucroseFraction() (float64, error) {
	if math.IsNaN(p.target) {
		return 0, errNoTarget(media.KindSucrose)
	}
	if _, err := media.Sucrose(0, p.tankC); err != nil {
		return 0, err
	}
	w, err := media.SucroseFractionFor(p.target)
	var reach *media.OutOfReachError
	if errors.As(err, &reach) {
		return 0, fmt.Errorf("sucrose at 20 °C spans ν %s to %s m²/s (0 to %.0f %%)", report.Num(reach.Low, 3), report.Num(reach.High, 3), 100*media.SucroseMaxFraction())
	}
	return w, err
}
