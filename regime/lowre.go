package regime

import "math"

// OxygenDiffusivity25C is the diffusivity of dissolved oxygen in water at
// 25 °C, 2.10e-9 m²/s (Cussler, E. L. (2009), Diffusion: Mass Transfer in
// Fluid Systems, 3rd ed., Cambridge, Table 5.2-1; recalled from memory;
// other compilations give 2.0–2.4e-9).
const OxygenDiffusivity25C = 2.10e-9

// water25Viscosity is pure water at 25 °C and 101325 Pa by IAPWS R12-08,
// Pa·s, the reference for Stokes–Einstein scaling.
const water25Viscosity = 0.00089002

// StokesEinsteinScale returns a diffusivity d25 known at 25 °C in pure water
// scaled to temperature tC and viscosity mu by the Stokes–Einstein relation
// D ∝ T/μ (Einstein 1905, Ann. Phys. 17, 549).
func StokesEinsteinScale(d25, tC, mu float64) float64 {
	return d25 * (tC + 273.15) / 298.15 * water25Viscosity / mu
}

// Peclet returns Pe = U L / D.
func Peclet(u, l, d float64) float64 { return u * l / d }

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
