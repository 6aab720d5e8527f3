package regime

import (
	"math"

	"gonum.org/v1/gonum/integrate/quad"
)

// OxygenDiffusivityWater returns the diffusivity (m²/s) of dissolved oxygen
// in pure water at tC °C from the interpolation formula of Han, P. &
// Bartels, D. M. (1996), Temperature dependence of oxygen diffusion in H2O
// and D2O, J. Phys. Chem. 100, 5597–5602 (Taylor dispersion, −0.5 to
// 95 °C): log10(D / cm² s⁻¹) = −4.410 + 773.8/T − (506.4/T)², T in K. It
// gives 2.00e-9 m²/s at 25 °C; the Wilke & Chang (1955) correlation, good to
// about ±10 %, gives 1.97e-9 at 20 °C with association parameter 2.26
// (this formula: 1.76e-9) and 2.42e-9 at 25 °C with 2.6.
func OxygenDiffusivityWater(tC float64) float64 {
	t := tC + 273.15
	x := 506.4 / t
	return 1e-4 * math.Exp(math.Ln10*(-4.410+773.8/t-x*x))
}

// StokesEinsteinScale returns a diffusivity d known in a solvent of
// viscosity mu0 scaled to viscosity mu at the same temperature, D ∝ 1/μ
// (Einstein 1905, Ann. Phys. 17, 549), as for oxygen in sea water from its
// value in pure water.
func StokesEinsteinScale(d, mu0, mu float64) float64 { return d * mu0 / mu }

// Peclet returns Pe = U L / D.
func Peclet(u, l, d float64) float64 { return u * l / d }

// Coast is how a body coasts after its propulsion stops, in creeping flow.
type Coast struct {
	Time     float64 // s: the time to stop when Stops, else the initial time constant M U₀/F₀
	Distance float64 // m; +Inf when the drag falls off too fast at low speed to stop the body
	Stops    bool    // whether the body comes to rest in finite time
}

// Coasting returns the time constant τ (s) and the distance (m) a body
// coasts after propulsion stops in creeping flow, where drag is linear in
// speed: τ = m_eff U / F, distance = U τ. m_eff includes the added mass.
//
// Reference: Purcell, E. M. (1977), Life at low Reynolds number, Am. J.
// Phys. 45, 3–11; Berg, H. C. (1993), Random Walks in Biology, Princeton.
func Coasting(mEff, u, force float64) (tau, distance float64) {
	tau = mEff * u / force
	return tau, u * tau
}

// CoastingPowerLaw coasts a body of effective mass M from speed U₀ against
// a drag F = F₀ (U/U₀)^m, as in creeping flow through a power-law fluid of
// flow index n = m. Integrating M dU/dt = −F (Newton's second law; the
// distance from M U dU/dx = −F):
//
//	m < 1: the body stops at t = M U₀ / ((1 − m) F₀)
//	m ≥ 1: it never stops; the speed falls as e^{−t/τ} (m = 1) or as
//	       (1 + (m − 1) t/τ)^{−1/(m−1)}, τ = M U₀/F₀
//	m < 2: distance M U₀² / ((2 − m) F₀); m ≥ 2: unbounded
//
// m = 1 is [Coasting].
func CoastingPowerLaw(mEff, u, force, m float64) Coast {
	c := Coast{Time: mEff * u / force, Distance: math.Inf(1), Stops: m < 1}
	if c.Stops {
		c.Time /= 1 - m
	}
	if m < 2 {
		c.Distance = mEff * u * u / ((2 - m) * force)
	}
	return c
}

// CoastingDrag coasts a body of effective mass M from speed U₀ against a
// drag F(U) = F₀ g(U/U₀) with g(1) = 1, by quadrature of
//
//	t = (M U₀/F₀) ∫₀¹ ds/g(s),   x = (M U₀²/F₀) ∫₀¹ s ds/g(s)
//
// (Newton's second law integrated over speed), with s = t² so that a drag
// that tends to a yield force, or like a power of the speed, leaves a smooth
// integrand; Gauss–Legendre, 64 nodes. stops says g(0) > 0 (a yield
// stress): then the time is finite; otherwise Time is M U₀/F₀.
func CoastingDrag(mEff, u, force float64, g func(s float64) float64, stops bool) Coast {
	c := Coast{Time: mEff * u / force, Stops: stops}
	c.Distance = c.Time * u * quad.Fixed(func(t float64) float64 { return 2 * t * t * t / g(t*t) }, 0, 1, 64, quad.Legendre{}, 0)
	if stops {
		c.Time *= quad.Fixed(func(t float64) float64 { return 2 * t / g(t*t) }, 0, 1, 64, quad.Legendre{}, 0)
	}
	return c
}

// BodyVolume returns the volume (m³) of the idealised body, NaN for a
// measured body whose shape is unknown.
func BodyVolume(b Body) float64 {
	switch b.Shape {
	case Sphere:
		return math.Pi * b.Length * b.Length * b.Length / 6
	case Spheroid:
		return ProlateSpheroidVolume(b.Length, b.Diameter)
	case Rod, Cylinder:
		return math.Pi * b.Diameter * b.Diameter * b.Length / 4
	}
	return math.NaN()
}
