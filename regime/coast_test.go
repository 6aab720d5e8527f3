package regime

import (
	"fmt"
	"math"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// coastODE integrates M dU/dt = −F(U), dx/dt = U by classical Runge–Kutta
// with steps of 0.5 % of the current speed's time scale U/|dU/dt|, until
// the speed is below 1e-15 U₀ or crosses zero; it returns the time and
// distance (an independent check of the closed forms and the quadrature).
func coastODE(mEff, u0 float64, f func(u float64) float64) (t, x float64) {
	u := u0
	acc := func(u float64) float64 { return -f(math.Max(u, 0)) / mEff }
	for u > 1e-15*u0 {
		h := 0.005 * u / math.Abs(acc(u))
		k1u, k1x := acc(u), u
		k2u, k2x := acc(u+h/2*k1u), u+h/2*k1u
		k3u, k3x := acc(u+h/2*k2u), u+h/2*k2u
		k4u, k4x := acc(u+h*k3u), u+h*k3u
		du := h / 6 * (k1u + 2*k2u + 2*k3u + k4u)
		dx := h / 6 * (k1x + 2*k2x + 2*k3x + k4x)
		if u+du <= 0 { // the last part of a stop: constant deceleration
			h = -u / k1u
			du, dx = -u, u*h/2
		}
		t, x, u = t+h, x+dx, u+du
	}
	return t, x
}

// Coasting against power-law drag F = F₀(U/U₀)^m, checked against the ODE:
// m = 0.6 (shear-thinning, stops in finite time), 1 (Newtonian, must equal
// Purcell's linear formula, which the ODE reaches only as t → ∞, so only
// the distance), 1.6 (shear-thickening, finite distance, no stop).
// Tolerance 1e-4 (the ODE stops at 1e-15 U₀: a tail under 1e-6 for m = 0.6,
// about 1e-6 of the distance for m = 1.6).
func TestCoastingPowerLawAgainstODE(t *testing.T) {
	const mEff, u0, f0 = 2e-9, 3e-4, 5e-9
	tau, d := Coasting(mEff, u0, f0)
	c1 := CoastingPowerLaw(mEff, u0, f0, 1)
	checkRel(t, "m=1 time equals Purcell's", c1.Time, tau, 1e-15)
	checkRel(t, "m=1 distance equals Purcell's", c1.Distance, d, 1e-15)
	for _, m := range []float64{0.6, 1, 1.6} {
		c := CoastingPowerLaw(mEff, u0, f0, m)
		tt, x := coastODE(mEff, u0, func(u float64) float64 { return f0 * math.Pow(u/u0, m) })
		checkRel(t, fmt.Sprintf("m=%g distance", m), c.Distance, x, 1e-4)
		if m < 1 {
			checkRel(t, fmt.Sprintf("m=%g stopping time", m), c.Time, tt, 1e-4)
		}
		if c.Stops != (m < 1) {
			t.Errorf("m=%g: stops %v", m, c.Stops)
		}
	}
	if c := CoastingPowerLaw(mEff, u0, f0, 2); !math.IsInf(c.Distance, 1) {
		t.Errorf("m = 2: distance %g, want unbounded", c.Distance)
	}
}

// A Bingham fluid, F = F_y + cU: M dU/dt = −(F_y + cU) integrates to
// t = (M/c) ln(1 + cU₀/F_y) and x = (M/c)[U₀ − (F_y/c) ln(1 + cU₀/F_y)]
// (derived here; standard first-order linear ODE); a Herschel–Bulkley fluid
// (n = 0.5) against the ODE. Tolerance 1e-5 and 1e-4 (64-node quadrature).
func TestCoastingYieldStress(t *testing.T) {
	const mEff, u0, fy, c = 1e-6, 2e-3, 3e-6, 4e-3
	f0 := fy + c*u0
	cb := CoastingDrag(mEff, u0, f0, func(s float64) float64 { return (fy + c*u0*s) / f0 }, true)
	checkRel(t, "Bingham time", cb.Time, mEff/c*math.Log(1+c*u0/fy), 1e-5)
	checkRel(t, "Bingham distance", cb.Distance, mEff/c*(u0-fy/c*math.Log(1+c*u0/fy)), 1e-5)
	hb := func(u float64) float64 { return fy + c*math.Sqrt(u*u0) }
	ch := CoastingDrag(mEff, u0, hb(u0), func(s float64) float64 { return hb(s*u0) / hb(u0) }, true)
	tt, x := coastODE(mEff, u0, hb)
	checkRel(t, "HB time", ch.Time, tt, 1e-4)
	checkRel(t, "HB distance", ch.Distance, x, 1e-4)
}

// Calc in a power-law fluid coasts by the power-law closed form with the
// fluid's n, on the drag and added mass it reports: a 1 mm sphere at
// 0.1 mm/s in K = 0.5 Pa·sⁿ fluids.
func TestCalcCoastsByFlowIndex(t *testing.T) {
	for _, n := range []float64{0.6, 1.6} {
		m := measured(media.PowerLaw{K: 0.5, N: n}, 1000, 1e-3, 1e3)
		o := NewOrganism(Body{Shape: Sphere, Length: 1e-3}, 1e-4)
		r, err := Calc(o, m)
		if err != nil {
			t.Fatal(err)
		}
		vol := math.Pi * 1e-9 / 6
		mEff := 1.5 * 1000 * vol // neutrally buoyant plus half the displaced mass
		checkRel(t, fmt.Sprintf("n=%g distance", n), r.CoastDistance, mEff*1e-8/((2-n)*r.Drag.Chosen.Force), 1e-12)
		if r.CoastStops != (n < 1) {
			t.Errorf("n=%g: stops %v", n, r.CoastStops)
		}
	}
}
