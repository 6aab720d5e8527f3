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
	// ShearRate fixes the characteristic shear rate (1/s) in a
	// non-Newtonian medium; 0 or NaN means U/d at terminal speed.
	ShearRate float64
	// A natural grain (Sphere shape, Diameter its nominal diameter): its
	// Corey shape factor (0.2–1) and Powers roundness (0–6), for
	// Dietrich's (1982) factors; 0 or NaN means a smooth sphere.
	CoreyShape, Roundness float64
}

// natural reports whether the particle is a natural grain.
func (p Particle) natural() bool { return p.CoreyShape > 0 || p.Roundness > 0 }

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
	// Non-Newtonian media (NaN otherwise).
	ShearRate      float64 // U/d, 1/s
	Viscosity      float64 // apparent viscosity there, Pa·s
	GeneralizedRe  float64
	BinghamNumber  float64
	YieldParameter float64 // Y_g = 3τ_y/(d Δρ g)
	Warnings       []Warning
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
// law continuous in Re: [SphereCD], the sphere laws [Drag] chooses, for a
// sphere; Haider–Levenspiel (1989) for a spheroid (on the equal-volume
// sphere). In a gas the drag is divided by the Cunningham slip factor.
//
// In a non-Newtonian medium the viscosity is the apparent viscosity at the
// particle's shear rate U/d (the convention of Chhabra 2007; some authors
// use 2U/d), and U is found by bisection in ln U on drag − weight; a
// sphere in a power-law fluid takes the same laws as [Drag] (the X(n)
// creeping-flow law, [RenaudX], joined to the sphere laws). In a
// yield-stress fluid a sphere with Y_g = 3τ_y/(d Δρ g) ≥ 0.143 is held
// (Beris et al. 1985): Direction is Held and Speed 0.
func Settle(p Particle, m media.Properties) (Settling, error) {
	sp, err := newSettleProblem(p, m)
	if err != nil {
		return Settling{}, err
	}
	var s Settling
	switch {
	case p.natural() && !m.Newtonian():
		return s, errorf("Dietrich's natural-grain factors are for Newtonian water and air; give a sphere in a non-Newtonian medium")
	case m.Newtonian():
		s, err = sp.solve(m.DynamicViscosity)
		if err == nil && p.natural() {
			s = sp.naturalGrain(s)
		}
	default:
		s, err = sp.nonNewtonian()
	}
	if err == nil && (math.IsInf(s.Speed, 0) || math.IsNaN(s.Speed) || math.IsInf(s.Force, 0)) {
		return s, errorf("the settling speed is not a finite number; check the units of size and density")
	}
	return s, err
}

type settleProblem struct {
	p      Particle
	m      media.Properties
	d, phi float64 // equal-volume diameter, sphericity
	drho   float64
	law    string
	source string
	basis  string
	cd     func(re float64) float64
	reMax  float64
}

func newSettleProblem(p Particle, m media.Properties) (*settleProblem, error) {
	if !(p.Diameter > 0) || math.IsInf(p.Diameter, 0) {
		return nil, positiveError("particle diameter", p.Diameter, "m", withUnit)
	}
	if !(p.Density > 0) || math.IsInf(p.Density, 0) {
		return nil, positiveError("particle density", p.Density, "kg/m³", withUnit)
	}
	sp := &settleProblem{p: p, m: m, d: p.Diameter, phi: 1, drho: p.Density - m.Density,
		law: "sphere laws", source: "Stokes 1851; Proudman & Pearson 1957; " + srcCGW, basis: "diameter", cd: SphereCD, reMax: 1e6}
	if math.Abs(sp.drho) <= 1e-5*m.Density { // equal within the medium density's own accuracy
		return nil, errorf("particle density %.7g kg/m³ equals the medium's (%.7g kg/m³) within 1e-5: it neither sinks nor rises", p.Density, m.Density)
	}
	switch p.Shape {
	case Sphere, "":
		if p.natural() {
			if err := checkGrain(p.CoreyShape, p.Roundness); err != nil {
				return nil, err
			}
		}
	case Spheroid:
		if p.natural() {
			return nil, errorf("a particle is either a spheroid (length and diameter) or a natural grain (Corey shape factor and roundness), not both")
		}
		if !(p.Length >= p.Diameter) || math.IsInf(p.Length, 0) {
			return nil, errorf("a spheroid's length must be at least its diameter")
		}
		sp.d = math.Cbrt(p.Length * p.Diameter * p.Diameter)
		sp.phi = Sphericity(p.Length, p.Diameter)
		phi := sp.phi
		sp.law, sp.source, sp.basis = "Haider–Levenspiel", srcHL, "equal-volume sphere diameter"
		sp.cd = func(re float64) float64 { return HaiderLevenspielCD(re, phi) }
		sp.reMax = 2.6e5
	default:
		return nil, errorf("settling is computed for a sphere or spheroid, not %q", p.Shape)
	}
	return sp, nil
}

func (sp *settleProblem) base() Settling {
	s := Settling{Law: sp.law, Source: sp.source, Basis: sp.basis, Direction: Sinking, Cunningham: 1, Knudsen: math.NaN(),
		ShearRate: math.NaN(), Viscosity: math.NaN(), GeneralizedRe: math.NaN(), BinghamNumber: math.NaN(), YieldParameter: math.NaN()}
	if sp.drho < 0 {
		s.Direction = Rising
	}
	s.Force = math.Abs(sp.drho) * media.StandardGravity * math.Pi * sp.d * sp.d * sp.d / 6
	return s
}

// solve finds the terminal speed in a Newtonian fluid of viscosity mu.
func (sp *settleProblem) solve(mu float64) (Settling, error) {
	s := sp.base()
	m, d := sp.m, sp.d
	rhoF := m.Density
	if m.Gas && !math.IsNaN(m.TemperatureC) && !math.IsNaN(m.PressurePa) {
		s.Knudsen = 2 * MeanFreePath(mu, m.TemperatureC+media.ZeroCelsiusK, m.PressurePa) / d
		s.Cunningham = Cunningham(s.Knudsen)
	}
	const g = media.StandardGravity
	s.Archimedes = rhoF * math.Abs(sp.drho) * g * d * d * d / (mu * mu)
	target := 4.0 / 3 * s.Archimedes
	f := func(lnRe float64) float64 {
		re := math.Exp(lnRe)
		return sp.cd(re)/s.Cunningham*re*re - target
	}
	lo, hi := math.Log(1e-14), math.Log(1e8)
	if f(lo) > 0 || f(hi) < 0 {
		return s, errorf("terminal speed is outside 1e-14 < Re < 1e8; check the particle's size and density")
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
	s.Coefficient = sp.cd(s.Reynolds) / s.Cunningham
	if sp.phi == 1 {
		s.Law = sphereLawName(s.Reynolds)
	}
	s.StokesSpeed = s.Cunningham * math.Abs(sp.drho) * g * d * d / (18 * mu)
	if s.Reynolds > sp.reMax {
		s.Warnings = append(s.Warnings, warnf(WarnLawOutOfRange, "settling: %s used at Re = %.3g, above its published range Re ≤ %g", s.Law, s.Reynolds, sp.reMax))
	}
	return s, nil
}

// nonNewtonian handles measured and model fluids.
func (sp *settleProblem) nonNewtonian() (Settling, error) {
	m, d := sp.m, sp.d
	rh := m.Rheology
	if ty := yieldStress(rh); ty > 0 {
		yg := YieldParameter(ty, d, sp.drho)
		if yg >= BerisCritical {
			s := sp.base()
			s.Direction, s.Speed, s.YieldParameter = Held, 0, yg
			s.Law, s.Source = "yield criterion", "Beris et al. 1985, J. Fluid Mech. 158, 219 (Y_g = 3τ_y/(d Δρ g) ≥ 0.143)"
			s.Reynolds, s.Coefficient, s.StokesSpeed = 0, math.NaN(), 0
			if yg < 3*BerisCritical {
				s.Warnings = append(s.Warnings, warnf(WarnModel, "settling: Y_g = %.3g is near the critical 0.143; experiments put the threshold between about 0.12 and 0.6 in this definition, so the particle may creep", yg))
			}
			return s, nil
		}
	}
	if g := sp.p.ShearRate; g > 0 {
		s, err := sp.solve(rh.ApparentViscosity(g))
		if err != nil {
			return s, err
		}
		s = sp.finishNN(s)
		s.ShearRate, s.Viscosity = g, rh.ApparentViscosity(g)
		return s, nil
	}
	return sp.bracketed()
}

// bracketed finds the terminal speed in a non-Newtonian medium, with the
// viscosity the apparent viscosity at U/d, by bisection in ln U between
// 1e-18 and 1e4 m/s on drag(U) − buoyant weight; the drag rises with U,
// so a root between the ends is found whenever one exists.
func (sp *settleProblem) bracketed() (Settling, error) {
	weight := sp.base().Force
	excess := func(lnU float64) (float64, Estimate, error) {
		e, err := sp.dragAt(math.Exp(lnU))
		return e.Force - weight, e, err
	}
	lo, hi := math.Log(1e-18), math.Log(1e4)
	fLo, _, err := excess(lo)
	if err != nil {
		return Settling{}, err
	}
	if fLo >= 0 {
		s := sp.base()
		s.Direction, s.Speed, s.Reynolds, s.Coefficient, s.StokesSpeed = Held, 0, 0, math.NaN(), 0
		s.Law, s.Source = "held by the yield stress", "apparent-viscosity drag at vanishing speed exceeds the buoyant weight"
		s = sp.finishNN(s)
		s.Warnings = append(s.Warnings, warnf(WarnModel, "settling: Y_g = %.3g is below Beris et al.'s (1985) critical 0.143, yet the drag at the apparent viscosity already exceeds the buoyant weight at vanishing speed: the particle is held or creeps too slowly to compute", s.YieldParameter))
		return s, nil
	}
	if fHi, _, err := excess(hi); err != nil || fHi < 0 {
		return Settling{}, errorf("the terminal speed in this medium is above 1e4 m/s; check the units of size and density")
	}
	for range 200 {
		mid := (lo + hi) / 2
		f, _, err := excess(mid)
		if err != nil {
			return Settling{}, err
		}
		if f > 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	u := math.Exp((lo + hi) / 2)
	e, _ := sp.dragAt(u)
	s := sp.base()
	s.Speed, s.Reynolds, s.Law, s.Source, s.Basis = u, e.Reynolds, e.Law, e.Source, e.Basis
	s.Coefficient = e.Force / (0.5 * sp.m.Density * u * u * frontalSphere(sp.d))
	mu := sp.m.ApparentViscosity(u / sp.d)
	s.Archimedes = sp.m.Density * math.Abs(sp.drho) * media.StandardGravity * sp.d * sp.d * sp.d / (mu * mu)
	s.StokesSpeed = math.Abs(sp.drho) * media.StandardGravity * sp.d * sp.d / (18 * mu)
	return sp.finishNN(s), nil
}

// dragAt returns the drag on the particle at speed u in a non-Newtonian
// medium, with the apparent viscosity at u/d: by the sphere laws of [Drag]
// (a pure power-law fluid takes its creeping-flow law and the join beyond)
// for a sphere, by Haider–Levenspiel on the equal-volume sphere for a
// spheroid.
func (sp *settleProblem) dragAt(u float64) (Estimate, error) {
	rh := sp.m.Rheology
	mu := rh.ApparentViscosity(u / sp.d)
	if !(mu > 0) || math.IsInf(mu, 0) {
		return Estimate{}, errorf("apparent viscosity at %.3g 1/s is not a positive number", u/sp.d)
	}
	f := Flow{Speed: u, Density: sp.m.Density, Viscosity: mu}
	if pl, ok := model(rh).(media.PowerLaw); ok {
		f.PowerLawK, f.PowerLawN = pl.K, pl.N
	}
	if sp.phi == 1 {
		var res DragResult
		err := dragInto(&res, Body{Shape: Sphere, Length: sp.d}, f, false)
		return res.Chosen, err
	}
	re := f.Density * u * sp.d / mu
	cd := sp.cd(re)
	return Estimate{Law: sp.law, Source: sp.source, Basis: sp.basis, Reynolds: re, Coefficient: cd,
		Force: 0.5 * f.Density * u * u * cd * frontalSphere(sp.d)}, nil
}

func (sp *settleProblem) finishNN(s Settling) Settling {
	m, d := sp.m, sp.d
	s.ShearRate = s.Speed / d
	s.Viscosity = m.ApparentViscosity(s.ShearRate)
	s.GeneralizedRe = GeneralizedReynolds(m.Rheology, m.Density, s.Speed, d)
	s.BinghamNumber = BinghamNumber(m.Rheology, s.Speed, d)
	if ty := yieldStress(m.Rheology); ty > 0 {
		s.YieldParameter = YieldParameter(ty, d, sp.drho)
	}
	if w := m.ExtrapolationWarning(s.ShearRate); w != nil {
		s.Warnings = append(s.Warnings, *w)
	}
	return s
}

// naturalGrain applies Dietrich's (1982) shape and roundness factors to the
// sphere's terminal motion s (see [DietrichShapeFactor]).
func (sp *settleProblem) naturalGrain(s Settling) Settling {
	m, d, p := sp.m, sp.d, sp.p
	nu := m.DynamicViscosity / m.Density
	dStar := math.Abs(sp.drho) * media.StandardGravity * d * d * d / (m.Density * nu * nu)
	s.Speed *= math.Cbrt(DietrichShapeFactor(dStar, p.CoreyShape, p.Roundness))
	s.Reynolds = s.Speed * d / nu
	s.Coefficient = s.Force / (0.5 * m.Density * s.Speed * s.Speed * frontalSphere(d))
	s.Law = fmt.Sprintf("%s with Dietrich's shape and roundness factors (CSF %.3g, P %.3g)", s.Law, p.CoreyShape, p.Roundness)
	s.Source += "; Dietrich 1982, Water Resour. Res. 18, 1615"
	s.Basis = "nominal diameter"
	if dStar < dietrichDStarMin || dStar > dietrichDStarMax {
		s.Warnings = append(s.Warnings, warnf(WarnLawOutOfRange, "settling: D* = %.3g is outside 0.05–5e9, the range of Dietrich's (1982) data; his shape and roundness factors are held at the nearest end", dStar))
	}
	return s
}
