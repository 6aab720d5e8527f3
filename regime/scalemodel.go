package regime

import (
	"math"

	"github.com/flowregime/flowregime/media"
)

// Dynamic similarity of a geometrically similar scale model.
//
// With the length scale λ = L_model/L_organism, matching the Reynolds
// number Re = UL/ν gives the model speed U_m = U_p (ν_m/ν_p)/λ; matching
// the Strouhal number St = fA/U with the amplitude scaled by λ then gives
// f_m = f_p (U_m/U_p)/λ, and the reduced frequency k = πfc/U follows with
// the chord scaled by λ. Forces scale as ρU²L², so with Re matched
// F_m/F_p = (ρ_m/ρ_p)(ν_m/ν_p)², power as F·U, P_m/P_p =
// (ρ_m/ρ_p)(ν_m/ν_p)³/λ, and time as L/U. Matching the Froude number
// Fr = U/√(gL) instead gives U_m = U_p √λ; both Re and Fr together need
// ν_m/ν_p = λ^(3/2).
//
// These ratios follow from dimensional analysis alone (equal groups on both
// sides); the tests check them against two worked examples computed
// independently (a fish model in water, a copepod limb in glycerol).

// Similarity modes: which groups the model matches besides St.
const (
	MatchReynolds = "reynolds" // Re and St; Fr left free (deep water, air)
	MatchFroude   = "froude"   // Fr and St; Re left free (near a free surface)
)

// Prototype is the organism side of a scale model, in SI; Frequency,
// Amplitude and Chord are zero (or NaN) when not given.
type Prototype struct {
	Length    float64 // m
	Speed     float64 // m/s
	Frequency float64 // Hz
	Amplitude float64 // peak-to-peak, m
	Chord     float64 // m
	Nu        float64 // kinematic viscosity of its medium, m²/s
	Rho       float64 // density of its medium, kg/m³
}

// Groups are the dimensionless numbers of one side of a similarity; NaN
// where an input is missing.
type Groups struct {
	Reynolds, Strouhal, ReducedFrequency, Froude float64
}

// Similarity is a model that matches a prototype, with the ratios that
// carry its measurements back: multiply a model force by 1/ForceRatio to get
// the organism's.
type Similarity struct {
	Mode                     string
	Scale                    float64 // λ = L_m/L_p
	Length, Speed, Frequency float64 // model, SI
	Amplitude, Chord         float64 // model, m
	Nu, Rho                  float64 // model fluid
	Organism, Model          Groups
	ForceRatio, PowerRatio   float64 // model over organism
	TimeRatio, SpeedRatio    float64 // model over organism
	FrequencyRatio           float64 // f_m/f_p
}

func groups(l, u, f, a, c, nu float64) Groups {
	return Groups{
		Reynolds:         Reynolds(u, l, nu),
		Strouhal:         Strouhal(f, a, u),
		ReducedFrequency: ReducedFrequency(f, c, u),
		Froude:           Froude(u, l),
	}
}

// Froude returns Fr = U/√(gL) for speed u (m/s) and length l (m), with
// standard gravity.
func Froude(u, l float64) float64 { return u / math.Sqrt(media.StandardGravity*l) }

func positive(vs ...float64) bool {
	for _, v := range vs {
		if !(v > 0) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// Check reports whether the prototype can be scaled.
func (p Prototype) Check() error {
	if !positive(p.Length, p.Speed, p.Nu, p.Rho) {
		return errorf("the organism's length, speed and medium must be positive numbers")
	}
	for _, v := range []float64{p.Frequency, p.Amplitude, p.Chord} {
		if v != 0 && !math.IsNaN(v) && !positive(v) {
			return errorf("frequency, amplitude and chord must be positive when given")
		}
	}
	return nil
}

// Similar returns the model of length lm (m) in a fluid of kinematic
// viscosity nu (m²/s) and density rho (kg/m³) that matches the prototype's
// Strouhal number and, by mode, its Reynolds or Froude number.
func Similar(p Prototype, lm, nu, rho float64, mode string) (Similarity, error) {
	for _, v := range []*float64{&p.Frequency, &p.Amplitude, &p.Chord} {
		if *v == 0 {
			*v = math.NaN() // not given
		}
	}
	if err := p.Check(); err != nil {
		return Similarity{}, err
	}
	if !positive(lm, nu, rho) {
		return Similarity{}, errorf("the model's length and fluid must be positive numbers")
	}
	lambda := lm / p.Length
	var s float64 // U_m/U_p
	switch mode {
	case MatchReynolds:
		s = (nu / p.Nu) / lambda
	case MatchFroude:
		s = math.Sqrt(lambda)
	default:
		return Similarity{}, errorf("similarity mode %q; accepted: %s, %s", mode, MatchReynolds, MatchFroude)
	}
	m := Similarity{Mode: mode, Scale: lambda, Length: lm, Nu: nu, Rho: rho,
		Speed: p.Speed * s, SpeedRatio: s, Frequency: p.Frequency * s / lambda, FrequencyRatio: s / lambda,
		Amplitude: p.Amplitude * lambda, Chord: p.Chord * lambda, TimeRatio: lambda / s}
	m.ForceRatio = (rho / p.Rho) * s * s * lambda * lambda
	m.PowerRatio = m.ForceRatio * s
	m.Organism = groups(p.Length, p.Speed, p.Frequency, p.Amplitude, p.Chord, p.Nu)
	m.Model = groups(lm, m.Speed, m.Frequency, m.Amplitude, m.Chord, nu)
	if !positive(m.Speed, m.ForceRatio, m.PowerRatio, m.TimeRatio, m.Model.Reynolds, m.Model.Froude) {
		return Similarity{}, errorf("a model %.4g times the organism's size in this fluid gives speeds or forces beyond floating-point range", lambda)
	}
	return m, nil
}

// NuForSpeed returns the model fluid's kinematic viscosity (m²/s) that
// matches the prototype's Reynolds number at model length lm and speed um.
func NuForSpeed(p Prototype, lm, um float64) float64 {
	return um * lm / Reynolds(p.Speed, p.Length, p.Nu)
}

// NuForFrequency returns the kinematic viscosity (m²/s) that matches Re and
// St at model length lm and stroke frequency fm: ν_m = ν_p (f_m/f_p) λ².
func NuForFrequency(p Prototype, lm, fm float64) float64 {
	lambda := lm / p.Length
	return p.Nu * fm / p.Frequency * lambda * lambda
}

// NuForFroude returns the kinematic viscosity (m²/s) that matches Re and Fr
// together at model length lm: ν_m = ν_p λ^(3/2).
func NuForFroude(p Prototype, lm float64) float64 {
	return p.Nu * math.Pow(lm/p.Length, 1.5)
}
