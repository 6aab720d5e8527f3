package regime

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// rangeSpeedWithConstantProfile solves d(P/V)/dV = 0 for
// P = A/V + BV³ + C, i.e. 2BV⁴ − CV − 2A = 0, by bisection.
func rangeSpeedWithConstantProfile(a, b, c float64) float64 {
	lo, hi := 0.1, 200.0
	for range 200 {
		m := (lo + hi) / 2
		if 2*b*m*m*m*m-c*m-2*a > 0 {
			hi = m
		} else {
			lo = m
		}
	}
	return lo
}

// Pennycuick's method: with a constant profile power the minimum-power
// speed is that of induced + parasite power alone,
// V_mp = 0.807 k^¼ (mg)^½/(ρ^½ b^½ (S_bC_Db)^¼) (Pennycuick 2008, Modelling
// the Flying Bird, Box 3.3; the constant is (4/(3π))^¼, derived here), the
// minimum power is P_am(1 + X1) with P_am = 1.05 k^¾ (mg)^{3/2} (S_bC_Db)^¼ /
// (ρ^½ b^{3/2}) (same box; 1.05 rounded), and the maximum-range speed solves
// 2BV⁴ − CV − 2A = 0. The model uses Glauert's induced velocity, which
// differs from the far-field form by (v_h/V)⁴, under 0.2 % here: tolerance
// 0.5 % on speeds, 1.5 % on the power (the printed 1.05 is rounded).
func TestPennycuickSpeedsClosedForm(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	const m, b, area, k = 0.043, 0.42, 0.0130, 1.2
	sb := BirdBodyFrontalArea(m)
	in := FlightInput{Mass: m, Density: air.Density, Viscosity: air.DynamicViscosity, InducedFactor: k,
		Wings: Wings{Span: b, Area: area, ProfileCD: math.NaN()}, BodyArea: sb}
	pc, err := FlightPowerCurve(in, 1, 30, 59)
	if err != nil {
		t.Fatal(err)
	}
	w := m * media.StandardGravity
	vmp := 0.807 * math.Pow(k, 0.25) * math.Sqrt(w) / (math.Sqrt(air.Density*b) * math.Pow(sb*0.1, 0.25))
	checkRel(t, "V_mp against Pennycuick's 0.807 formula", pc.MinPowerSpeed, vmp, 0.005)
	x1 := 8.4 / (b * b / area)
	pam := 1.05 * math.Pow(k, 0.75) * math.Pow(w, 1.5) * math.Pow(sb*0.1, 0.25) / (math.Sqrt(air.Density) * math.Pow(b, 1.5))
	checkRel(t, "P_mp = (1 + X1) P_am", pc.MinPower, (1+x1)*pam, 0.015)
	A := k * w * w / (2 * air.Density * math.Pi * b * b / 4)
	B := 0.5 * air.Density * sb * 0.1
	checkRel(t, "V_mr", pc.MaxRangeSpeed, rangeSpeedWithConstantProfile(A, B, x1*AbsoluteMinimumPower(m, b, air.Density, k, sb*0.1)), 0.005)
}

// BirdBodyFrontalArea against Pennycuick, Obrecht & Fuller (1988):
// S_b = 0.00813 m^0.666, so 1 kg gives 0.00813 m² and 0.215 kg gives
// 0.002920751 m² (the value printed in the afpt R package's documentation
// of the same relation, Klein Heerenbrink 2023).
func TestBirdBodyFrontalArea(t *testing.T) {
	checkRel(t, "1 kg", BirdBodyFrontalArea(1), 0.00813, 1e-12)
	checkRel(t, "0.215 kg", BirdBodyFrontalArea(0.215), 0.002920751, 1e-6)
}

// A common swift: 43 g, span 42 cm, wing area 130 cm² (Videler, J. J.
// (2005), Avian Flight, Oxford, as quoted in a fact sheet), body 16 cm long
// and 3.5 cm across (common practice, no source). Swifts cruise in a wind
// tunnel at 8.0–9.2 m/s (Henningsson, Spedding & Hedenström 2008, J. Exp.
// Biol. 211, 717), and continuously flapping birds fly at 0.82–1.27 V_mp on
// average (Pennycuick 2001, J. Exp. Biol. 204, 3283, 11 species): the
// middle of the observed range, 8.6 m/s, must lie within 0.82–1.27 V_mp, so
// V_mp lies in [8.6/1.27, 8.6/0.82] = [6.77, 10.49] m/s, and the cruising
// speeds must not exceed V_mr. The former blade-element profile with
// skin-friction C_D put V_mp at 5.55 m/s and fails this. (With the body's
// turbulent boundary layer, C_D ≈ 0.13 on the frontal area, V_mp is 7.2 m/s;
// with Pennycuick's C_Db = 0.1 it was 7.6 m/s.)
func TestSwiftSpeedsAgainstObservations(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	o := NewOrganism(Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}, 1)
	o.Mass, o.Span, o.WingArea = 0.043, 0.42, 0.0130
	pc, err := OrganismPowerCurve(o, air, 1, 30, 59)
	if err != nil {
		t.Fatal(err)
	}
	if pc.MinPowerSpeed < 8.6/1.27 || pc.MinPowerSpeed > 8.6/0.82 {
		t.Errorf("swift V_mp %.3g m/s outside [6.77, 10.49] m/s", pc.MinPowerSpeed)
	}
	if pc.MaxRangeSpeed < 9.2 {
		t.Errorf("swift V_mr %.3g m/s below the observed cruising speed 9.2 m/s", pc.MaxRangeSpeed)
	}
}

// A glide does no flapping work: the power kind says so, the sink speed is
// the drag power over the weight, the glide ratio is V over the sink speed,
// the profile drag of still wings is ½ρC_D S V³ with Tucker & Heine's
// (1990) 0.026, and a glide has no hover.
func TestGlidingHasNoFlappingPower(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	o := NewOrganism(Body{Shape: Spheroid, Length: 1.2, Diameter: 0.2}, 15)
	o.Mass, o.Span, o.WingArea, o.Gliding = 8.5, 3, 0.6, true
	r, err := Calc(o, air)
	if err != nil {
		t.Fatal(err)
	}
	f := r.Power.Flight
	if r.Power.Kind != PowerGliding || !f.Gliding {
		t.Fatalf("power kind %q, want gliding", r.Power.Kind)
	}
	checkRel(t, "profile", f.Profile, 0.5*air.Density*0.026*0.6*15*15*15, 1e-12)
	checkRel(t, "sink", f.SinkSpeed, (f.Induced+f.Parasite+f.Profile)/(8.5*media.StandardGravity), 1e-12)
	checkRel(t, "glide ratio", f.GlideRatio, 15/f.SinkSpeed, 1e-12)
	pc, err := OrganismPowerCurve(o, air, 5, 30, 26)
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(pc.Hover) {
		t.Errorf("a glide has a hover power %g W", pc.Hover)
	}
}

// Profile power is never silently zero: without a wing area it is
// Pennycuick's 1.2 × P_am with a warning naming the assumption; without a
// wingbeat frequency the flapping assumption is stated.
func TestProfileAssumptionsStated(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	o := NewOrganism(Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}, 9)
	o.Mass, o.Span = 0.043, 0.42
	r, err := Calc(o, air)
	if err != nil {
		t.Fatal(err)
	}
	f := r.Power.Flight
	if f.ProfileMethod != ProfileRatioFlat || !(f.Profile > 0) {
		t.Errorf("profile %g W by %q", f.Profile, f.ProfileMethod)
	}
	var sawProfile, sawFlapping bool
	for _, w := range r.Warnings {
		sawProfile = sawProfile || containsAll(w.Message, "1.2", "Pennycuick")
		sawFlapping = sawFlapping || containsAll(w.Message, "continuous flapping")
	}
	if !sawProfile || !sawFlapping {
		t.Errorf("assumptions not stated: %v", r.Warnings)
	}
}

func containsAll(s string, parts ...string) bool {
	for _, p := range parts {
		if !strings.Contains(s, p) {
			return false
		}
	}
	return true
}

// A gliding swift (morphology as above) in a tilting wind tunnel reached a
// lift-to-drag ratio of 12.5 at 9.5 m/s (Henningsson, P. & Hedenström, A.
// (2011), Aerodynamics of gliding flight in common swifts, J. Exp. Biol.
// 214, 382–393). The model, with a body drag coefficient of 0.1 where the
// swift's measured parasite drag coefficient was 0.22–0.30 and with the span
// held fixed where the bird flexed its wings, gives a higher ratio:
// tolerance 25 %.
func TestSwiftGlideRatio(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	o := NewOrganism(Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}, 9.5)
	o.Mass, o.Span, o.WingArea, o.Gliding = 0.043, 0.42, 0.0130, true
	r, err := Calc(o, air)
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "swift L/D at 9.5 m/s", r.Power.Flight.GlideRatio, 12.5, 0.25)
}

// Gliding is refused, not ignored, for what is not a flyer in air.
func TestGlidingNeedsAFlyer(t *testing.T) {
	o := NewOrganism(Body{Shape: Spheroid, Length: 0.3, Diameter: 0.05}, 1)
	o.Gliding = true
	if _, err := Calc(o, water20(t)); err == nil || !strings.Contains(err.Error(), "gliding needs a flyer") {
		t.Errorf("a gliding fish: %v", err)
	}
}

// Zero means not given: a struct literal that leaves the optional values
// zero gets exactly the result of one that sets them NaN, for a bird in air
// (flapping assumed, with the warning saying so) and a fish in water; a
// negative value is still refused, naming the field.
func TestZeroMeansNotGiven(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	bird := Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}
	lit := Organism{Body: bird, Speed: 10, Mass: 0.04, Span: 0.42, WingArea: 0.0168}
	nan := NewOrganism(bird, 10)
	nan.Mass, nan.Span, nan.WingArea = 0.04, 0.42, 0.0168
	fish := Body{Shape: Spheroid, Length: 0.3, Diameter: 0.05}
	for _, c := range []struct {
		name     string
		lit, nan Organism
		m        media.Properties
	}{{"bird", lit, nan, air}, {"fish", Organism{Body: fish, Speed: 1}, NewOrganism(fish, 1), water20(t)}} {
		a, err := Calc(c.lit, c.m)
		if err != nil {
			t.Fatalf("%s literal: %v", c.name, err)
		}
		b, err := Calc(c.nan, c.m)
		if err != nil {
			t.Fatal(err)
		}
		if sa, sb := resultText(a), resultText(b); sa != sb {
			t.Errorf("%s: literal %s\nNaN %s", c.name, sa, sb)
		}
	}
	r, _ := Calc(lit, air)
	said := false
	for _, w := range r.Warnings {
		said = said || strings.Contains(w.Message, "no wingbeat frequency given")
	}
	if r.Power.Kind != PowerFlight || !said {
		t.Errorf("a bird without a frequency: kind %q, warnings %v", r.Power.Kind, r.Warnings)
	}
	neg := Organism{Body: fish, Speed: 1, Frequency: -2}
	var ie *InputError
	if _, err := Calc(neg, water20(t)); !errors.As(err, &ie) || ie.Field != "frequency" || ie.Value != -2 || err.Error() != "regime: frequency must be positive, got -2" {
		t.Errorf("a negative frequency: %v", err)
	}
}

// resultText prints every number and warning of r (NaN as "NaN", the
// flight model's parts through the pointer).
func resultText(r Result) string {
	fp := r.Power.Flight
	r.Power.Flight, r.flightStore = nil, nil // compared by value below, not by address
	if fp != nil {
		return fmt.Sprintf("%+v %+v", r, *fp)
	}
	return fmt.Sprintf("%+v", r)
}

// A FlightInput literal without an induced-power factor gets
// DefaultInducedFactor (1.15), not an error; below 1 is still refused.
func TestFlightZeroInducedFactorIsDefault(t *testing.T) {
	in := FlightInput{Mass: 0.04, Speed: 10, Density: 1.225, Viscosity: 1.79e-5, Wings: Wings{Span: 0.42, Area: 0.0168}}
	got, err := Flight(in)
	if err != nil {
		t.Fatal(err)
	}
	in.InducedFactor = DefaultInducedFactor
	want, _ := Flight(in)
	if got.Induced != want.Induced || got.Profile != want.Profile || got.Total != want.Total {
		t.Errorf("k not given: %+v, want k = 1.15: %+v", got, want)
	}
	in.InducedFactor = 0.5
	if _, err := Flight(in); err == nil {
		t.Error("k = 0.5 accepted")
	}
}

// CalcInto reuses r's storage for a flyer's power, so a loop over many
// flyers allocates nothing per organism once r has grown (common practice
// for batch hot paths, no source); Calc still hands each result its own.
func TestCalcIntoFlyerAllocatesNothing(t *testing.T) {
	air, err := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	if err != nil {
		t.Fatal(err)
	}
	bird := Organism{Body: Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}, Speed: 10, Mass: 0.04, Span: 0.42, WingArea: 0.0168, Frequency: 8}
	var r Result
	if err := CalcInto(&r, bird, &air, Options{Brief: true, Screen: true}); err != nil || r.Power.Flight == nil {
		t.Fatalf("%v, flight %v", err, r.Power.Flight)
	}
	if n := testing.AllocsPerRun(100, func() { _ = CalcInto(&r, bird, &air, Options{Brief: true, Screen: true}) }); n != 0 {
		t.Errorf("CalcInto for a flyer: %v allocations per call, want 0", n)
	}
	// Without a wing area the flight model warns: its warnings reuse r's storage too.
	noArea := bird
	noArea.WingArea = 0
	if n := testing.AllocsPerRun(100, func() { _ = CalcInto(&r, noArea, &air, Options{Brief: true, Screen: true}) }); n != 0 || len(r.Power.Flight.Warnings) == 0 {
		t.Errorf("CalcInto for a flyer with a flight warning: %v allocations per call (want 0), %d flight warnings", n, len(r.Power.Flight.Warnings))
	}
	a, _ := Calc(bird, air)
	b, _ := Calc(bird, air)
	if a.Power.Flight == b.Power.Flight {
		t.Error("two Calc results share one flight power")
	}
}
