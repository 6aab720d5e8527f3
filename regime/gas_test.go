package regime

import (
	"math"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// The physics of flight and of slip reads media.Properties.Gas, never the
// medium's name: a fluid named "air" that is not a gas gets neither, a gas
// under another name gets both.
func TestGasNotNameSwitchesPhysics(t *testing.T) {
	air, err := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	if err != nil {
		t.Fatal(err)
	}
	notGas := air
	notGas.Gas = false
	renamed := air
	renamed.Medium = "lab gas"

	// A swift (mass and span as in TestSwiftSpeedsAgainstObservations).
	o := NewOrganism(Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}, 9)
	o.Mass, o.Span, o.WingArea = 0.043, 0.42, 0.0130
	for _, c := range []struct {
		m      media.Properties
		flight bool
	}{{air, true}, {renamed, true}, {notGas, false}} {
		r, err := Calc(o, c.m)
		if err != nil {
			t.Fatalf("%s (gas %v): %v", c.m.Medium, c.m.Gas, err)
		}
		if got := r.Power.Kind == PowerFlight; got != c.flight {
			t.Errorf("%s (gas %v): flight power %v, want %v", c.m.Medium, c.m.Gas, got, c.flight)
		}
		_, err = OrganismPowerCurve(o, c.m, 1, 30, 59)
		if got := err == nil; got != c.flight {
			t.Errorf("%s (gas %v): power curve %v, want %v (%v)", c.m.Medium, c.m.Gas, got, c.flight, err)
		}
	}

	// A 1 µm water droplet slips in a gas (Cunningham factor above 1;
	// Hinds 1999, Aerosol Technology, Table 3.2: about 1.17 at 1 atm and
	// 20 °C, recalled from memory) and not in a
	// liquid.
	p := Particle{Shape: Sphere, Diameter: 1e-6, Density: 1000}
	for _, c := range []struct {
		m    media.Properties
		slip bool
	}{{air, true}, {renamed, true}, {notGas, false}} {
		s, err := Settle(p, c.m)
		if err != nil {
			t.Fatal(err)
		}
		if got := s.Cunningham > 1.1 && s.Cunningham < 1.2; got != c.slip {
			t.Errorf("%s (gas %v): Cunningham %v, slip wanted %v", c.m.Medium, c.m.Gas, s.Cunningham, c.slip)
		}
	}
}

// The dissolved-oxygen default of the Péclet number follows
// Properties.Water, not the medium's name: fresh and sea water have it
// (Han & Bartels 1996 at 25 °C, 2.00e-9 m²/s by their formula, as in
// TestOxygenDiffusivity; sea water lower by Sharqawy et al.'s viscosity
// factor, Stokes–Einstein), a copy of fresh water with Water unset has no
// diffusivity, and a renamed one keeps it.
func TestWaterNotNameGivesOxygenDiffusivity(t *testing.T) {
	fresh, err := media.FreshWater(25, media.StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	sea, err := media.Seawater(25, 35, media.StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	notWater, renamed := fresh, fresh
	notWater.Water = false
	renamed.Medium = "tank water"
	o := Organism{Body: Body{Shape: Sphere, Length: 1e-4}, Speed: 1e-3}
	want := OxygenDiffusivityWater(25)
	ratio := media.SeawaterViscosity(1, 25, sea.SalinityAbsolute)
	for _, c := range []struct {
		name string
		m    media.Properties
		d    float64 // NaN: none
	}{{"fresh", fresh, want}, {"renamed", renamed, want}, {"not water", notWater, math.NaN()}, {"sea", sea, want / ratio}} {
		r, err := Calc(o, c.m)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if math.IsNaN(c.d) != math.IsNaN(r.Diffusivity) || (!math.IsNaN(c.d) && math.Abs(r.Diffusivity/c.d-1) > 1e-12) {
			t.Errorf("%s: diffusivity %g, want %g", c.name, r.Diffusivity, c.d)
		}
	}
	checkRel(t, "fresh water at 25 °C", OxygenDiffusivityWater(25), 2.00e-9, 0.005)
	// Sharqawy et al. (2010) eq. 22 by hand at 25 °C and S = 0.035165 kg/kg:
	// A = 1.981, B = 6.379, 1 + A S + B S² = 1.0775.
	checkRel(t, "sea/fresh viscosity ratio, 25 °C", ratio, 1.0775, 0.001)
}
