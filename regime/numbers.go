package regime

import "math"

// Reynolds returns Re = U L / ν for speed u (m/s), length l (m) and
// kinematic viscosity nu (m²/s).
func Reynolds(u, l, nu float64) float64 { return u * l / nu }

// Strouhal returns St = f A / U for stroke frequency f (Hz), peak-to-peak
// amplitude a (m) of the tail or wing tip, and forward speed u (m/s).
//
// Reference: Taylor, G. K., Nudds, R. L. & Thomas, A. L. R. (2003), Flying
// and swimming animals cruise at a Strouhal number tuned for high power
// efficiency, Nature 425, 707–711.
func Strouhal(f, a, u float64) float64 { return f * a / u }

// Efficient cruising band of the Strouhal number, 0.2 < St < 0.4 (Taylor,
// Nudds & Thomas 2003, Nature 425, 707).
const (
	StrouhalLow  = 0.2
	StrouhalHigh = 0.4
)

// Screening bounds of the Strouhal number in survey data: values outside
// are flagged (common practice, no single source).
const (
	StrouhalScreenLow  = 0.05
	StrouhalScreenHigh = 1.0
)

// StrouhalBand says where st lies against the efficient cruising band:
// "below", "within" or "above".
func StrouhalBand(st float64) string {
	switch {
	case st < StrouhalLow:
		return "below"
	case st > StrouhalHigh:
		return "above"
	}
	return "within"
}

// AdvanceRatio returns J = V/(2ΦnR), forward speed over mean wing-tip
// flapping speed, for speed v (m/s), stroke amplitude phi (rad,
// peak-to-peak), wingbeat frequency n (Hz) and wing length r (m); 0 in
// hover.
//
// Reference: Ellington, C. P. (1984), The aerodynamics of hovering insect
// flight. III. Kinematics, Phil. Trans. R. Soc. Lond. B 305, 41–78.
func AdvanceRatio(v, phi, n, r float64) float64 { return v / (2 * phi * n * r) }

// ReducedFrequency returns k = ωc/(2U) = πfc/U for frequency f (Hz), mean
// chord c (m) and reference speed u (m/s); this package takes the forward
// speed as the reference.
func ReducedFrequency(f, c, u float64) float64 { return math.Pi * f * c / u }

// Regime names, by the Reynolds number on the body's characteristic length.
// The boundaries Re = 1 and Re = 1000 are common practice (see Vogel, S.
// (1994), Life in Moving Fluids, 2nd ed., Princeton, ch. 5), not sharp
// physical limits.
const (
	RegimeViscous      = "viscous"      // Re < 1: creeping flow, drag ∝ speed, no coasting
	RegimeIntermediate = "intermediate" // 1 ≤ Re < 1000: viscous and inertial forces both matter
	RegimeInertial     = "inertial"     // Re ≥ 1000: inertia dominates, drag ∝ speed², wakes
)

// Regimes returns the regime names in order of Reynolds number, as a new
// slice the caller may keep or change.
func Regimes() []string { return []string{RegimeViscous, RegimeIntermediate, RegimeInertial} }

// Classify returns the flow regime for a Reynolds number.
func Classify(re float64) string {
	switch {
	case re < 1:
		return RegimeViscous
	case re < 1000:
		return RegimeIntermediate
	}
	return RegimeInertial
}

// Boundary-layer states of a streamlined body.
const (
	LayerLaminar   = "laminar"
	LayerTurbulent = "turbulent"
)

// BoundaryLayer returns "laminar" or "turbulent" for a rigid animal body
// (a streamlined spheroid) at length Reynolds number re ≥ 1000, and ""
// below, where a thin boundary layer does not form. It follows the drag
// law chosen for such bodies: turbulent from Re 1.2e4, where the laminar
// and turbulent skin-friction lines meet (see AnimalBodyCf: turbulent
// layers measured on trout at Re 4e5, Yanase & Saarenrinne 2015), not from
// the flat-plate 5e5 of low free-stream turbulence (Schlichting 1979,
// ch. 16). Between the two the drag output carries the laminar value as
// the other end of a bracket.
func BoundaryLayer(re float64) string {
	switch {
	case re < 1000:
		return ""
	case re < bodyTurbulentFrom:
		return LayerLaminar
	}
	return LayerTurbulent
}

// pow returns x^y for finite x > 0 as e^(y ln x). Its relative error is
// about |y ln x| ulp (below 1e-14 for the correlations here), far inside
// any correlation's own accuracy, and it costs half of math.Pow.
func pow(x, y float64) float64 { return math.Exp(y * math.Log(x)) }

// exp10 returns 10^y as e^(y ln 10), with the accuracy of [pow].
func exp10(y float64) float64 { return math.Exp(y * math.Ln10) }

// SpeedOfSoundAir returns the speed of sound in dry air at temperature tC
// (°C), a = √(γ R T) with γ = 1.40 and R = 287.05287 J/(kg·K), the
// relation and constants of the U.S. Standard Atmosphere 1976 (its table
// gives 340.294 m/s at sea level, 15 °C).
func SpeedOfSoundAir(tC float64) float64 { return math.Sqrt(1.40 * 287.05287 * (tC + 273.15)) }

// MachIncompressible is the Mach number below which air is treated as
// incompressible: density changes stay under about 5 % (common practice,
// no source; e.g. aerodynamics textbooks quote M < 0.3).
const MachIncompressible = 0.3
