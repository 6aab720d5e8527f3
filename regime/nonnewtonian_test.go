package regime

import (
	"math"
	"testing"

	"github.com/flowregime/flowregime/media"
)

func measured(m media.Model, rho, lo, hi float64) media.Properties {
	p, _ := media.FreshWater(20, media.StandardPressurePa)
	p.Medium = "test fluid"
	p.Density = rho
	p.Rheology = media.MeasuredRheology{Model: m, MinRate: lo, MaxRate: hi, RelaxationTime: math.NaN()}
	p.DynamicViscosity = m.ApparentViscosity(math.Sqrt(lo * hi))
	p.Warnings = nil
	return p
}

// X(n) of Renaud, Mauret & Chhabra (2004): exactly 1 for a Newtonian fluid;
// its largest value is the published bound "the drag on a sphere in a
// power-law fluid may be up to 46 per cent higher than that in a Newtonian
// fluid at the same particle Reynolds number" (Coulson & Richardson's
// Chemical Engineering, vol. 2, ch. 3, power-law fluids, with Chhabra's
// Y(n) in Table 3.9): max X = 1.46 ± 0.01 over 0.1 ≤ n ≤ 1. Against the
// numerical results tabulated by Chhabra (2007) (recalled from memory,
// approximate): about 1.24 at n = 0.8, 1.38 at 0.6, 1.42–1.46 at 0.4–0.5.
func TestRenaudX(t *testing.T) {
	if RenaudX(1) != 1 {
		t.Errorf("X(1) = %v, want exactly 1", RenaudX(1))
	}
	maxX := 0.0
	for n := 0.1; n <= 1; n += 0.001 {
		maxX = math.Max(maxX, RenaudX(n))
	}
	if math.Abs(maxX-1.46) > 0.01 {
		t.Errorf("max X(n) = %.4f, want 1.46 (up to 46 %% above Newtonian)", maxX)
	}
	for _, c := range []struct{ n, x, tol float64 }{{0.8, 1.24, 0.03}, {0.6, 1.38, 0.03}, {0.4, 1.44, 0.03}} {
		checkRel(t, "X(n)", RenaudX(c.n), c.x, c.tol)
	}
}

// A power-law fluid with n = 1 is Newtonian: settling in creeping flow must
// give Stokes' law (Stokes 1851), and the generalised Reynolds number the
// ordinary one.
func TestPowerLawNewtonianLimit(t *testing.T) {
	const mu = 0.5
	m := measured(media.PowerLaw{K: mu, N: 1}, 1000, 1e-3, 1e3)
	s, err := Settle(Particle{Shape: Sphere, Diameter: 1e-3, Density: 2000}, m)
	if err != nil {
		t.Fatal(err)
	}
	stokes := 1000 * media.StandardGravity * 1e-6 / (18 * mu)
	checkRel(t, "power-law n=1 settling", s.Speed, stokes, 1e-9)
	checkRel(t, "Re_gen", GeneralizedReynolds(m.Rheology, 1000, 0.01, 0.002), 1000*0.01*0.002/mu, 1e-12)
}

// Creeping settling in a shear-thinning power-law fluid by hand:
// U = (Δρ g d^(1+n)/(18 K X(n)))^(1/n), and Re_gen = ρU^(2−n)dⁿ/K equals
// ρUd/η(U/d) (Chhabra 2007, the particle form of the Metzner–Reed number).
func TestPowerLawCreepingSettling(t *testing.T) {
	const k, n, d, drho = 2.0, 0.5, 2e-3, 500.0
	m := measured(media.PowerLaw{K: k, N: n}, 1000, 1e-3, 1e3)
	s, err := Settle(Particle{Shape: Sphere, Diameter: d, Density: 1000 + drho}, m)
	if err != nil {
		t.Fatal(err)
	}
	want := math.Pow(drho*media.StandardGravity*math.Pow(d, 1+n)/(18*k*RenaudX(n)), 1/n)
	checkRel(t, "U", s.Speed, want, 1e-12)
	checkRel(t, "Re_gen identity", s.GeneralizedRe, 1000*s.Speed*d/m.ApparentViscosity(s.Speed/d), 1e-12)
	if s.Law != "creeping flow in a power-law fluid" {
		t.Errorf("law %q", s.Law)
	}
}

// Beris et al. (1985): a sphere stays put when Y_g = 3τ_y/(d Δρ g) ≥ 0.143.
// 1 mm, Δρ = 1000 kg/m³, τ_y = 10 Pa: Y_g = 3.06, held; τ_y = 0.01 Pa:
// Y_g = 0.0031, it sinks.
func TestBerisYieldCriterion(t *testing.T) {
	held := measured(media.Bingham{TauY: 10, MuP: 0.1}, 1000, 0.1, 100)
	s, err := Settle(Particle{Shape: Sphere, Diameter: 1e-3, Density: 2000}, held)
	if err != nil {
		t.Fatal(err)
	}
	if s.Direction != Held || s.Speed != 0 {
		t.Errorf("held sphere: %s at %g m/s", s.Direction, s.Speed)
	}
	checkRel(t, "Y_g", s.YieldParameter, 3*10/(1e-3*1000*media.StandardGravity), 1e-12)
	moving := measured(media.Bingham{TauY: 0.01, MuP: 0.1}, 1000, 0.1, 100)
	s, err = Settle(Particle{Shape: Sphere, Diameter: 1e-3, Density: 2000}, moving)
	if err != nil {
		t.Fatal(err)
	}
	if s.Direction != Sinking || !(s.Speed > 0) {
		t.Errorf("weak gel: %s at %g m/s", s.Direction, s.Speed)
	}
	// Fixed point: the speed is the Newtonian speed at the apparent viscosity it implies.
	mu := moving.ApparentViscosity(s.Speed / 1e-3)
	checkRel(t, "self-consistent viscosity", s.Viscosity, mu, 1e-9)
	// Bingham number by hand: τ_y d/(μ_p U).
	checkRel(t, "Bingham number", s.BinghamNumber, 0.01*1e-3/(0.1*s.Speed), 1e-9)
}

// In calc, a sphere in a power-law fluid in creeping flow meets
// 3πK Uⁿ d^(2−n) X(n), and the shear rate outside the measured range is
// flagged.
func TestCalcPowerLawSphere(t *testing.T) {
	const k, n, d, u = 5.0, 0.6, 1e-4, 1e-4
	m := measured(media.PowerLaw{K: k, N: n}, 1000, 0.01, 0.5)
	r, err := Calc(NewOrganism(Body{Shape: Sphere, Length: d}, u), m)
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "drag", r.Drag.Chosen.Force, 3*math.Pi*k*math.Pow(u, n)*math.Pow(d, 2-n)*RenaudX(n), 1e-12)
	checkRel(t, "shear rate U/L", r.ShearRate, u/d, 1e-15)
	if !hasWarning(r.Warnings, media.WarnExtrapolate) {
		t.Errorf("shear rate %g outside 0.01–0.5 not flagged: %v", r.ShearRate, r.Warnings)
	}
	if math.IsNaN(r.GeneralizedRe) || !math.IsNaN(r.BinghamNumber) {
		t.Errorf("Re_gen %g, Bn %g", r.GeneralizedRe, r.BinghamNumber)
	}
}
