package regime

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/integrate/quad"
)

// SwimmingPower returns drag × speed ÷ efficiency (W). With efficiency 1
// this is the towing power, the rate of work against the rigid body's drag.
//
// Reference: Webb, P. W. (1975), Hydrodynamics and energetics of fish
// propulsion, Bull. Fish. Res. Board Can. 190; Lighthill, M. J. (1960),
// J. Fluid Mech. 9, 305.
func SwimmingPower(drag, speed, efficiency float64) float64 { return drag * speed / efficiency }

// HoverInducedVelocity returns the induced velocity (m/s) of an ideal
// actuator disc of area a (m²) carrying thrust t (N) in fluid of density rho
// at rest: v_h = √(T/(2ρA)).
//
// Reference: Rankine, W. J. M. (1865), Trans. Inst. Naval Arch. 6, 13;
// Froude, R. E. (1889), Trans. Inst. Naval Arch. 30, 390; applied to animals
// by Weis-Fogh, T. (1972), J. Exp. Biol. 56, 79 and Ellington, C. P. (1984),
// Phil. Trans. R. Soc. Lond. B 305, part VI.
func HoverInducedVelocity(t, rho, a float64) float64 { return math.Sqrt(t / (2 * rho * a)) }

// InducedVelocity returns the induced velocity (m/s) of a disc in level
// forward flight at speed v, from Glauert's momentum relation
// T = 2ρA v_i √(V² + v_i²), whose root is
// v_i² = (−V² + √(V⁴ + 4 v_h⁴))/2; it equals v_h in hover and tends to
// T/(2ρAV) at speed.
//
// Reference: Glauert, H. (1935), Airplane propellers, in Durand, W. F.
// (ed.), Aerodynamic Theory, vol. IV, Springer, division L.
func InducedVelocity(t, rho, a, v float64) float64 {
	vh := HoverInducedVelocity(t, rho, a)
	v2 := v * v
	// −V² + √(V⁴ + 4v_h⁴) loses digits at high V; use the conjugate form.
	return math.Sqrt(2 * vh * vh * vh * vh / (v2 + math.Sqrt(v2*v2+4*vh*vh*vh*vh)))
}

// Wings describes a flapping or gliding animal's wings.
type Wings struct {
	Span        float64 // tip to tip, m
	Length      float64 // one wing, root to tip, m; default Span/2
	Area        float64 // both wings, m²
	Frequency   float64 // wingbeat frequency, Hz; 0 when gliding
	StrokeAngle float64 // peak-to-peak stroke amplitude Φ, rad
	ProfileCD   float64 // profile-drag coefficient; NaN for the attached-flow default
}

// MeanChord returns the mean chord S/(2R) of the pair of wings.
func (w Wings) MeanChord() float64 { return w.Area / (2 * w.Length) }

// Disc kinds for momentum theory.
const (
	DiscSpan   = "span"   // a circle with the wingspan as diameter, πb²/4
	DiscStroke = "stroke" // the area swept by both wings, Φ R² (Ellington 1984, horizontal stroke plane)
)

// FlightInput is what the flight power model needs.
type FlightInput struct {
	Mass          float64 // kg
	Speed         float64 // m/s, level flight
	Density       float64 // air, kg/m³
	Viscosity     float64 // air, Pa·s
	InducedFactor float64 // k ≥ 1
	Disc          string  // DiscSpan or DiscStroke
	Wings         Wings
	BodyDrag      func(speed float64) float64 // parasite drag of the body, N
	Drag          float64                     // the body's drag at Speed, N, used when BodyDrag is nil

	brief noter // warnings with codes only (batch work)
}

// DefaultInducedFactor is the induced-power factor k used when none is
// given: 1.15, the value typical of rotor wakes in momentum theory (common
// practice in rotorcraft analysis, e.g. Leishman, J. G. (2006), Principles
// of Helicopter Aerodynamics, 2nd ed., Cambridge, ch. 3; recalled). Animal
// estimates span about 1.1–1.2 (Ellington 1984, part VI).
const DefaultInducedFactor = 1.15

// FlightPower is the mechanical power of level flight split into its parts.
type FlightPower struct {
	Induced, Parasite, Profile, Total float64 // W
	HoverInduced                      float64 // W, induced power at zero speed
	InducedVelocity, HoverVelocity    float64 // m/s
	DiscArea                          float64 // m²
	ProfileCD                         float64 // coefficient used
	ProfileCDDefault                  bool    // true when taken from skin friction
	ChordReynolds                     float64 // on mean chord and mean relative wing speed
	Warnings                          []Warning
}

// Flight returns induced, parasite and profile power in level flight.
//
// Induced power is k T v_i with T = m g and v_i from Glauert's relation
// ([InducedVelocity]), Rankine–Froude in hover. Parasite power is the body's
// drag times speed. Profile power integrates, over the wingbeat and along
// both (rectangular) wings, the section profile drag times the section's
// speed relative to the air, ½ρC_D,pro c |w|³ with |w|² = V² + (φ̇r)² and
// a simple-harmonic stroke φ = (Φ/2) cos 2πft (blade-element theory;
// Weis-Fogh 1973, J. Exp. Biol. 59, 169; Ellington 1984, part VI). Without a
// profile-drag coefficient the wing is taken as a flat plate with attached
// flow: twice the Blasius (or transitional) skin friction at the chord
// Reynolds number, a lower bound.
func Flight(in FlightInput) (FlightPower, error) {
	w := in.Wings
	switch {
	case !(in.Mass > 0):
		return FlightPower{}, fmt.Errorf("regime: flight power needs a positive mass")
	case !(w.Span > 0):
		return FlightPower{}, fmt.Errorf("regime: flight power needs a positive wingspan")
	case !(in.Speed >= 0):
		return FlightPower{}, fmt.Errorf("regime: flight speed must not be negative")
	case !(in.InducedFactor >= 1):
		return FlightPower{}, fmt.Errorf("regime: induced-power factor must be at least 1 (the ideal disc), got %g", in.InducedFactor)
	}
	if !(w.Length > 0) {
		w.Length = w.Span / 2
	}
	var fp FlightPower
	note := !in.brief
	thrust := in.Mass * 9.80665
	switch in.Disc {
	case "", DiscSpan:
		fp.DiscArea = math.Pi * w.Span * w.Span / 4
	case DiscStroke:
		if !(w.StrokeAngle > 0) {
			return FlightPower{}, fmt.Errorf("regime: a stroke-swept disc needs the stroke angle")
		}
		fp.DiscArea = w.StrokeAngle * w.Length * w.Length
	default:
		return FlightPower{}, fmt.Errorf("regime: unknown disc %q; accepted: span, stroke", in.Disc)
	}
	k := in.InducedFactor
	fp.HoverVelocity = HoverInducedVelocity(thrust, in.Density, fp.DiscArea)
	fp.HoverInduced = k * thrust * fp.HoverVelocity
	fp.InducedVelocity = InducedVelocity(thrust, in.Density, fp.DiscArea, in.Speed)
	fp.Induced = k * thrust * fp.InducedVelocity
	switch {
	case in.Speed == 0:
	case in.BodyDrag != nil:
		fp.Parasite = in.BodyDrag(in.Speed) * in.Speed
	case in.Drag > 0:
		fp.Parasite = in.Drag * in.Speed
	}
	if w.Area > 0 {
		flap := 0.0
		if w.Frequency > 0 && w.StrokeAngle > 0 {
			flap = 2 * w.StrokeAngle * w.Frequency * w.Length / math.Sqrt(3) // mean |φ̇| r₂
		}
		wingSpeed := math.Hypot(in.Speed, flap)
		fp.ChordReynolds = in.Density * wingSpeed * w.MeanChord() / in.Viscosity
		fp.ProfileCD = w.ProfileCD
		if math.IsNaN(fp.ProfileCD) || fp.ProfileCD <= 0 {
			fp.ProfileCDDefault = true
			fp.ProfileCD = 0 // no relative wing speed (hover without stroke kinematics): no profile power
			if fp.ChordReynolds > 0 {
				fp.ProfileCD = 2 * TransitionCf(fp.ChordReynolds, TransitionReynolds)
			}
			if fp.ChordReynolds > 0 && fp.ChordReynolds < 1e4 {
				note.add(&fp.Warnings, WarnModel, func() string {
					return fmt.Sprintf("flight: profile drag taken as flat-plate skin friction at chord Re = %.3g; below about 1e4 real wings' profile drag is several times higher (Ellington 1984, part VI): set the profile-drag coefficient from measurements", fp.ChordReynolds)
				})
			}
		}
		if w.Frequency > 0 && !(w.StrokeAngle > 0) {
			note.add(&fp.Warnings, WarnModel, func() string {
				return "flight: no stroke angle or amplitude, so profile power is that of gliding wings (a lower bound for flapping)"
			})
		}
		fp.Profile = ProfilePower(in.Density, fp.ProfileCD, w.MeanChord(), w.Length, in.Speed, w.StrokeAngle, w.Frequency)
	} else {
		note.add(&fp.Warnings, WarnModel, func() string { return "flight: no wing area or chord given, so profile power is left out" })
	}
	fp.Total = fp.Induced + fp.Parasite + fp.Profile
	return fp, nil
}

// ProfilePower returns the cycle-mean profile power (W) of two rectangular
// wings of chord c and length r with profile-drag coefficient cd, in forward
// speed v, flapping with a simple-harmonic stroke of peak-to-peak amplitude
// phi (rad) at frequency f (Hz):
//
//	P = 2 · ⟨∫₀ᴿ ½ ρ C_D c (V² + (φ̇ r)²)^{3/2} dr⟩,  φ̇ = −πΦf sin 2πft
//
// with the span integral in closed form ([spanIntegral]) and the phase
// average by Gauss–Legendre quadrature. In hover it reduces to
// ρC_D c (πΦf)³ (4/(3π)) R⁴/4 (Ellington 1984, part VI); with no flapping, to
// the gliding ½ρC_D S V³.
func ProfilePower(rho, cd, c, r, v, phi, f float64) float64 {
	amp := math.Pi * phi * f // peak angular speed of the wing, rad/s
	if amp == 0 {
		return 0.5 * rho * cd * (2 * c * r) * v * v * v
	}
	mean := 0.0
	for i, s := range phaseSines {
		mean += phaseWeights[i] * spanIntegral(v, amp*s, r)
	}
	return 2 * 0.5 * rho * cd * c * mean / (math.Pi / 2)
}

// phaseSines and phaseWeights are sin φ at the Gauss–Legendre nodes of a
// quarter wingbeat, 24 on each half of it (|sin| is symmetric, and the split
// at π/4 keeps the quadrature accurate near hover), with their weights.
var phaseSines, phaseWeights = func() (s, w []float64) {
	const n = 24
	x := make([]float64, n)
	wt := make([]float64, n)
	for _, half := range [][2]float64{{0, math.Pi / 4}, {math.Pi / 4, math.Pi / 2}} {
		quad.Legendre{}.FixedLocations(x, wt, half[0], half[1])
		for i := range x {
			s = append(s, math.Sin(x[i]))
			w = append(w, wt[i])
		}
	}
	return s, w
}()

// spanIntegral returns ∫₀ᴿ (V² + ω²x²)^{3/2} dx for ω ≥ 0, from the
// antiderivative of (V² + u²)^{3/2} in u = ωx,
//
//	F(u) = (u/8)(2u² + 5V²)√(u² + V²) + (3V⁴/8) asinh(u/V)
//
// (the standard antiderivative, as tabulated in integral tables; its
// derivative is (u² + V²)^{3/2} exactly, and the tests check it against
// Gauss–Legendre quadrature). Both terms are positive, so no digits cancel.
func spanIntegral(v, omega, r float64) float64 {
	v = math.Abs(v)
	switch {
	case omega == 0:
		return v * v * v * r
	case v == 0:
		return omega * omega * omega * r * r * r * r / 4
	}
	u := omega * r
	return (u/8*(2*u*u+5*v*v)*math.Hypot(u, v) + 3*v*v*v*v/8*math.Asinh(u/v)) / omega
}
