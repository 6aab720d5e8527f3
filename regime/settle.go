package regime

import (
	"fmt"
	"math"

	"github.com/flowregime/flowregime/media"
)

// Particle is a sinking or rising particle, egg, seed or spore.
type Particle struct {
	Shape    Shape   // Sphere or Spheroid
	Diameter float64 // m; the maximum diameter of a spheroid
	Length   float64 // m; spheroid only
	Density  float64 // kg/m³
}

// Directions of terminal motion.
const (
	Sinking = "sinking"
	Rising  = "rising"
	Held    = "held"
)

// Settling is a particle's terminal motion.
type Settling struct {
	Speed       float64 // terminal speed, m/s (magnitude)
	Direction   string  // Sinking, Rising or Held
	Reynolds    float64 // on Basis at terminal speed
	Basis       string
	Law         string
	Source      string
	Coefficient float64 // drag coefficient at terminal speed, on the frontal area of Basis
	Force       float64 // drag = buoyant weight, N
	StokesSpeed float64 // Stokes' law speed (with slip correction), m/s
	Archimedes  float64 // Ar = ρ_f |ρ_p − ρ_f| g d³/μ²
	Cunningham  float64 // slip correction factor applied (1 in liquids)
	Knudsen     float64 // 2λ/d in a gas; NaN in liquids
	Warnings    []Warning
}

// MeanFreePath returns the mean free path of air molecules (m) at tK and pPa
// from kinetic theory, λ = (μ/p)√(πRT/(2M)) (Hinds, W. C. (1999), Aerosol
// Technology, 2nd ed., Wiley, eq. 2.25); 0.066 µm at 23 °C and 1 atm.
func MeanFreePath(mu, tK, pPa float64) float64 {
	const r, m = 8.314462618, 28.9644e-3
	return mu / pPa * math.Sqrt(math.Pi*r*tK/(2*m))
}

// Cunningham returns the slip correction factor at Knudsen number kn = 2λ/d,
// Cc = 1 + Kn (1.257 + 0.400 exp(−1.10/Kn)), negligible above about 10 µm
// in air at ambient conditions.
//
// Reference: Cunningham, E. (1910), Proc. R. Soc. Lond. A 83, 357;
// constants of Davies, C. N. (1945), Proc. Phys. Soc. 57, 259.
func Cunningham(kn float64) float64 {
	return 1 + kn*(1.257+0.400*math.Exp(-1.10/kn))
}

// Settle returns the terminal speed of a particle in the fluid. It solves
// the force balance C_D(Re)·Re² = (4/3)·Ar by bisection in ln Re with a drag
// law continuous in Re: Clift–Gauvin (1970) for a sphere, Haider–Levenspiel
// (1989) for a spheroid (on the equal-volume sphere). In a gas the drag is
// divided by the Cunningham slip factor.
func Settle(p Particle, m media.Properties) (Settling, error) {
	var s Settling
	if !(p.Diameter > 0) || math.IsInf(p.Diameter, 0) {
		return s, fmt.Errorf("regime: particle diameter must be positive, got %g m", p.Diameter)
	}
	if !(p.Density > 0) || math.IsInf(p.Density, 0) {
		return s, fmt.Errorf("regime: particle density must be positive, got %g kg/m³", p.Density)
	}
	rhoF, mu := m.Density, m.DynamicViscosity
	drho := p.Density - rhoF
	if math.Abs(drho) <= 1e-5*rhoF { // equal within the medium density's own accuracy
		return s, fmt.Errorf("regime: particle density %.7g kg/m³ equals the medium's (%.7g kg/m³) within 1e-5: it neither sinks nor rises", p.Density, rhoF)
	}
	d, phi := p.Diameter, 1.0
	s.Law, s.Source, s.Basis = "Clift–Gauvin", "Clift & Gauvin 1970; in Clift, Grace & Weber 1978", "diameter"
	cd := CliftGauvinCD
	reMax := 3e5
	switch p.Shape {
	case Sphere, "":
	case Spheroid:
		if !(p.Length >= p.Diameter) || math.IsInf(p.Length, 0) {
			return s, fmt.Errorf("regime: a spheroid's length must be at least its diameter")
		}
		d = math.Cbrt(p.Length * p.Diameter * p.Diameter)
		phi = Sphericity(p.Length, p.Diameter)
		s.Law, s.Source, s.Basis = "Haider–Levenspiel", srcHL, "equal-volume sphere diameter"
		cd = func(re float64) float64 { return HaiderLevenspielCD(re, phi) }
		reMax = 2.6e5
	default:
		return s, fmt.Errorf("regime: settling is computed for a sphere or spheroid, not %q", p.Shape)
	}
	s.Direction = Sinking
	if drho < 0 {
		s.Direction = Rising
	}
	s.Cunningham, s.Knudsen = 1, math.NaN()
	if m.Medium == media.KindAir {
		s.Knudsen = 2 * MeanFreePath(mu, m.TemperatureC+media.ZeroCelsiusK, m.PressurePa) / d
		s.Cunningham = Cunningham(s.Knudsen)
	}
	const g = media.StandardGravity
	s.Archimedes = rhoF * math.Abs(drho) * g * d * d * d / (mu * mu)
	target := 4.0 / 3 * s.Archimedes
	f := func(lnRe float64) float64 {
		re := math.Exp(lnRe)
		return cd(re)/s.Cunningham*re*re - target
	}
	lo, hi := math.Log(1e-14), math.Log(1e8)
	if f(lo) > 0 || f(hi) < 0 {
		return s, fmt.Errorf("regime: terminal speed is outside 1e-14 < Re < 1e8; check the particle's size and density")
	}
	for range 200 {
		mid := (lo + hi) / 2
		if f(mid) > 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	s.Reynolds = math.Exp((lo + hi) / 2)
	s.Speed = s.Reynolds * mu / (rhoF * d)
	s.Coefficient = cd(s.Reynolds) / s.Cunningham
	s.Force = math.Abs(drho) * g * math.Pi * d * d * d / 6
	s.StokesSpeed = s.Cunningham * math.Abs(drho) * g * d * d / (18 * mu)
	if s.Reynolds > reMax {
		s.Warnings = append(s.Warnings, warnf(WarnLawOutOfRange, "settling: %s used at Re = %.3g, above its published range Re ≤ %g", s.Law, s.Reynolds, reMax))
	}
	return s, nil
}
