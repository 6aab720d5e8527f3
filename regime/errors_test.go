package regime

import (
	"errors"
	"math"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// Every error names its input and range in fields, and its message is the
// one this package has always printed (the strings below are those
// messages, which the command-line golden files also pin).
func TestTypedErrors(t *testing.T) {
	w := water20(t)
	fish := Body{Shape: Spheroid, Length: 0.3, Diameter: 0.05}
	for _, c := range []struct {
		err              error
		field, unit, msg string
		value, max       float64
	}{
		{calcErr(Calc(Organism{Body: fish, Speed: -1}, w)), "speed", "m/s", "regime: speed must be positive, got -1 m/s", -1, math.MaxFloat64},
		{calcErr(Calc(Organism{Body: fish, Speed: 1, Amplitude: -0.02}, w)), "amplitude", "m", "regime: amplitude must be positive, got -0.02", -0.02, math.MaxFloat64},
		{calcErr(Calc(Organism{Body: fish, Speed: 1, Efficiency: 1.5}, w)), "efficiency", "", "regime: efficiency must be in (0, 1], got 1.5", 1.5, 1},
		{calcErr(Calc(Organism{Body: Body{Shape: Sphere, Length: -2}, Speed: 1}, w)), "length", "m", "regime: length must be a positive size, got -2 m", -2, math.MaxFloat64},
		{settleErr(Settle(Particle{Shape: Sphere, Diameter: 1e-4, Density: -3}, w)), "particle density", "kg/m³", "regime: particle density must be positive, got -3 kg/m³", -3, math.MaxFloat64},
	} {
		var ie *InputError
		if !errors.As(c.err, &ie) {
			t.Errorf("%v: not an *InputError", c.err)
			continue
		}
		if ie.Field != c.field || ie.Unit != c.unit || ie.Value != c.value || ie.Min != 0 || ie.Max != c.max || c.err.Error() != c.msg {
			t.Errorf("got %+v %q, want %s %g %s (0, %g] %q", *ie, c.err, c.field, c.value, c.unit, c.max, c.msg)
		}
		if ie.Reason() != c.msg[len("regime: "):] {
			t.Errorf("Reason %q", ie.Reason())
		}
	}
	_, err := Calc(Organism{Body: fish, Speed: 1, Gliding: true}, w)
	var e *Error
	if !errors.As(err, &e) || e.Reason() != "gliding needs a flyer in air with a mass and a wingspan" {
		t.Errorf("gliding fish: %v", err)
	}
	_, err = Calc(Organism{Body: Body{Shape: Sphere, Length: 1e300}, Speed: 1e300}, w)
	var re *RangeError
	if !errors.As(err, &re) || re.Input != "length" || err.Error() != "regime: "+re.Reason() {
		t.Errorf("huge sphere: %v", err)
	}
}

func calcErr(_ Result, err error) error     { return err }
func settleErr(_ Settling, err error) error { return err }

// Laws hands out a copy: changing it, its joins included, leaves the drag
// of every later caller as it was.
func TestLawsIsACopy(t *testing.T) {
	body := Body{Shape: Spheroid, Length: 7e-3, Diameter: 0.7e-3}
	flow := Flow{Speed: 0.04, Density: 998.2, Viscosity: 1.0016e-3}
	before, err := Drag(body, flow)
	if err != nil {
		t.Fatal(err)
	}
	ls := Laws()
	joins := 0
	for i := range ls {
		ls[i].ChooseLo, ls[i].ChooseHi, ls[i].Name = 0, 0, "changed"
		if ls[i].Join != nil {
			ls[i].Join.From, ls[i].Join.To = 12345, 23456
			joins++
		}
	}
	if joins == 0 {
		t.Fatal("no join in the table to change")
	}
	after, err := Drag(body, flow)
	if err != nil || after.Chosen.Force != before.Chosen.Force || after.Chosen.Law != before.Chosen.Law {
		t.Errorf("drag changed with the copy: %+v, %v", after.Chosen, err)
	}
	for _, l := range Laws() {
		if l.Name == "changed" || l.Join != nil && l.Join.From == 12345 {
			t.Fatalf("the table changed: %+v", l)
		}
	}
}

// OrganismPowerCurve leaves the caller's warnings alone even where their
// slice has room to grow into (3–5 m/s puts the minimum-power speed at the
// range's edge, which adds a warning of the curve's own).
func TestPowerCurveCopiesWarnings(t *testing.T) {
	air, err := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	if err != nil {
		t.Fatal(err)
	}
	spare := make([]Warning, 1, 8)
	spare[0] = Warning{Code: "mine"}
	air.Warnings = spare
	bird := Organism{Body: Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}, Mass: 0.04, Span: 0.42}
	pc, err := OrganismPowerCurve(bird, air, 3, 5, 5)
	if err != nil {
		t.Fatal(err)
	}
	if len(pc.Warnings) < 2 || pc.Warnings[0].Code != "mine" || spare[:2][1].Code != "" {
		t.Errorf("curve warnings %+v; the caller's spare slot %+v", pc.Warnings, spare[:2][1])
	}
}

// The rule for a new drag law (DEVELOPERS.md): a shape's choice ranges, of
// the laws for any fluid, tile (0, ∞) in the order tried (∞ being the
// largest float). Laws with the range (−1, −1] are never chosen, only
// compared.
func TestLawTable(t *testing.T) {
	for _, sh := range shapes {
		next := 0.0
		for _, l := range lawsOf(sh) {
			if l.powerLaw || l.ChooseHi < 0 {
				continue
			}
			if l.ChooseLo != next || !(l.ChooseHi > l.ChooseLo) {
				t.Errorf("%s: %s chosen over (%g, %g], want it to start at %g", sh, l.Name, l.ChooseLo, l.ChooseHi, next)
			}
			next = l.ChooseHi
		}
		if next != math.MaxFloat64 {
			t.Errorf("%s: choice ranges end at Re %g, not ∞", sh, next)
		}
	}
}
