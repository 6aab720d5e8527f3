package regime

import (
	"fmt"
	"math"
	"strings"

	"github.com/flowregime/flowregime/media"
)

// Warning is a typed note on a result; see the Warn codes.
type Warning = media.Warning

// Warning codes used by this package.
const (
	WarnLawOutOfRange = "correlation-out-of-range"
	WarnDragCrisis    = "drag-crisis"
	WarnGeometry      = "geometry"
	WarnStrouhal      = "strouhal-outside-animals"
	WarnInconsistent  = "inconsistent-inputs"
	// WarnStrokeIncomplete notes a stroke frequency without an amplitude or
	// the reverse: no Strouhal number, common in field data and not a sign
	// of a wrong measurement.
	WarnStrokeIncomplete = "stroke-incomplete"
	WarnModel            = "model-limit"
)

func warnf(code, format string, args ...any) Warning {
	return Warning{Code: code, Message: fmt.Sprintf(format, args...)}
}

// noter adds warnings with messages, or with codes only (brief) where the
// messages would not be read, as in batch work; msg is called only when
// its text is wanted, so brief work formats nothing.
type noter bool

func (full noter) add(ws *[]Warning, code string, msg func() string) {
	full.detail(ws, code, media.Detail{}, msg)
}

// detail adds a warning with its short reason d (see [media.Detail]).
func (full noter) detail(ws *[]Warning, code string, d media.Detail, msg func() string) {
	w := Warning{Code: code, Detail: d}
	if full {
		w.Message = msg()
	}
	*ws = append(*ws, w)
}

// Shape is the idealised body shape used to pick drag laws.
type Shape string

// Shapes.
const (
	Sphere   Shape = "sphere"   // length is the diameter
	Spheroid Shape = "spheroid" // prolate spheroid moving along its axis: length and maximum diameter
	Rod      Shape = "rod"      // straight slender rod moving along its axis: length and diameter
	Cylinder Shape = "cylinder" // circular cylinder moving broadside: length (span) and diameter
	Measured Shape = "measured" // a measured drag coefficient on a stated reference area
)

// shapes lists the accepted shapes.
var shapes = []Shape{Sphere, Spheroid, Rod, Cylinder, Measured}

// ParseShape returns the shape named by s.
func ParseShape(s string) (Shape, error) {
	for _, sh := range shapes {
		if strings.EqualFold(s, string(sh)) {
			return sh, nil
		}
	}
	names := make([]string, len(shapes))
	for i, sh := range shapes {
		names[i] = string(sh)
	}
	return "", errorf("unknown shape %q; accepted: %s", s, strings.Join(names, ", "))
}

// Body is an organism's size and shape.
type Body struct {
	Shape    Shape
	Length   float64 // m; the diameter for a sphere; the span for a cylinder
	Diameter float64 // m; maximum diameter (spheroid, rod, cylinder); ignored for a sphere
	// For Measured: the drag coefficient and the area it refers to (m²).
	DragCoefficient float64
	ReferenceArea   float64
}

// minRodAspect is the least length/diameter of a rod: Cox's (1970) axial
// drag 2πμlU/(ln(l/a) − 0.807) changes sign at l/a = 2.24 (l/d = 1.12)
// and is poor below l/a = 10; below l/d = 2 the body is refused.
const minRodAspect = 2

// Validate checks the body's dimensions.
func (b Body) Validate() error {
	if !(b.Length > 0) || math.IsInf(b.Length, 0) {
		return positiveError("length", b.Length, "m", size)
	}
	switch b.Shape {
	case Sphere:
	case Spheroid, Rod, Cylinder:
		if !(b.Diameter > 0) || math.IsInf(b.Diameter, 0) {
			return errorf("a %s needs a positive diameter as well as its length", b.Shape)
		}
		if b.Shape != Cylinder && b.Diameter > b.Length {
			return errorf("a %s's diameter (%g m) must not exceed its length (%g m); for a flattened body give the longest axis as length", b.Shape, b.Diameter, b.Length)
		}
		if b.Shape == Rod && b.Length < minRodAspect*b.Diameter {
			return errorf("a rod %g m long and %g m wide is too stout for slender-body theory (Cox 1970 fails below length = 2 × diameter, where its drag turns negative); give it as a spheroid", b.Length, b.Diameter)
		}
	case Measured:
		if !(b.DragCoefficient > 0) || !(b.ReferenceArea > 0) || math.IsInf(b.DragCoefficient, 0) || math.IsInf(b.ReferenceArea, 0) {
			return errorf("a measured body needs a positive drag coefficient and reference area")
		}
	default:
		_, err := ParseShape(string(b.Shape))
		return err
	}
	return nil
}

// Flow is the relative motion of body and fluid.
type Flow struct {
	Speed     float64 // m/s
	Density   float64 // kg/m³
	Viscosity float64 // dynamic viscosity, Pa·s (apparent, for a non-Newtonian fluid)
	// For a power-law fluid, its consistency (Pa·sⁿ) and flow index; zero
	// for other fluids.
	PowerLawK, PowerLawN float64
}

// Estimate is one drag law's answer.
type Estimate struct {
	Law           string
	Source        string
	Force         float64 // N
	Coefficient   float64 // drag coefficient on ReferenceArea
	ReferenceArea float64 // m²
	AreaName      string  // which area the coefficient refers to
	Reynolds      float64 // on the law's own length
	Basis         string  // that length, in words
	ReMin, ReMax  float64 // published range of Reynolds on Basis
	InRange       bool
	// The bracket for the drag (N), Low ≤ High: for a join (see
	// [Law.Join]) its two validated ends' forces at this speed, for a rigid
	// animal body the laminar and turbulent boundary layers; NaN otherwise.
	Low, High float64
	// BracketFrom says in words where Low and High come from; empty when
	// there is no bracket.
	BracketFrom string
}

// Law is a drag law: its name, source, published range and the range in
// which this package chooses it.
type Law struct {
	Name     string
	Shape    Shape
	Source   string
	Basis    string  // the length its Reynolds number is on
	AreaName string  // the area its coefficient is on
	ReMin    float64 // published range (Re on Basis)
	ReMax    float64
	ChooseLo float64 // chosen when ChooseLo < Re ≤ ChooseHi, Re on the shape's ChoiceLength
	ChooseHi float64
	eval     func(b Body, f Flow, re float64) (cd, area float64)
	basisLen func(b Body) float64
	powerLaw bool // only for power-law fluids
	// Join is set for a smooth join across a gap between two laws'
	// published ranges; eval then blends the two ends.
	Join *Join
	// altCf, where set, is the skin friction of the other credible
	// boundary-layer state for a friction law (same area and form factor);
	// its force and the chosen one's bracket the drag.
	altCf   func(re float64) float64
	altName string
}

// Join is a documented smooth join between two validated laws, used where
// no published law covers the gap between their ranges: the drag is
// F = F_lo^(1−w) F_hi^w, with w rising smoothly (w = 3x² − 2x³,
// x = ln(Re/From)/ln(To/From)) from 0 at Re = From, the upper end of the
// lower law's published range, to 1 at Re = To, the lower end of the upper
// law's; both forces are reported as a bracket. The interpolation is this
// package's choice (common practice for joining asymptotes, no source);
// it keeps the drag continuous with a continuous slope.
//
// Published data behind the joins: none could be read for aligned bodies.
// Drag of prolate spheroids at zero incidence at intermediate Re has been
// computed (Ouchene et al. 2015, Computers & Fluids 113, 53, Re 0.1–290;
// Sanjeevi & Padding 2017, J. Fluid Mech. 820, R1, to Re 2000; a fitted
// correlation by Sanjeevi, Kuipers & Padding 2018, Int. J. Multiphase Flow
// 106, 325, reference not read; Masliyah & Epstein 1970, recalled), and of
// aligned finite cylinders from creeping flow to Re 400 on the
// diameter (Kharrouba, Pierson & Magnaudet 2021, Phys. Rev. Fluids 6,
// 044308), but only their abstracts could be read, not their numbers or
// coefficients; Ouchene et al. report that the best published correlations
// deviate from their simulations by about 20 % in the drag. The one outside
// check made is the sphere limit (a spheroid of fineness 1 against
// published sphere tables, TestSpheroidNearSphereLimit): the Re 1–10 join is
// within 12 % of it; the join from Re 100 uses Hoerner's form factor and is
// warned about outside fineness 2–10. The cylinder join (Re 0.5–1) and the
// power-law sphere join (Re 0.1–100) have no published data checked.
type Join struct {
	Lo, Hi   lawEnd
	From, To float64 // Re on the join's Basis
}

// lawEnd is one validated end of a join.
type lawEnd struct {
	name     string
	eval     func(b Body, f Flow, re float64) (cd, area float64)
	basisLen func(b Body) float64
}

// force returns the end law's drag (N) at the flow.
func (e lawEnd) force(b Body, f Flow) float64 {
	re := f.Density * f.Speed * e.basisLen(b) / f.Viscosity
	cd, area := e.eval(b, f, re)
	return 0.5 * f.Density * f.Speed * f.Speed * cd * area
}

// weight returns the blend weight w of the upper end at re.
func (j *Join) weight(re float64) float64 {
	x := math.Log(re/j.From) / math.Log(j.To/j.From)
	x = math.Max(0, math.Min(1, x))
	return x * x * (3 - 2*x)
}

// eval returns the joined drag coefficient on the lower end's area.
func (j *Join) eval(b Body, f Flow, re float64) (float64, float64) {
	lo, hi := j.Lo.force(b, f), j.Hi.force(b, f)
	w := j.weight(re)
	fj := math.Exp((1-w)*math.Log(lo) + w*math.Log(hi))
	loRe := f.Density * f.Speed * j.Lo.basisLen(b) / f.Viscosity
	_, area := j.Lo.eval(b, f, loRe)
	return fj / (0.5 * f.Density * f.Speed * f.Speed * area), area
}

// joined returns a Law that joins lo and hi between from and to.
func joined(l Law, lo, hi lawEnd, from, to float64) Law {
	j := &Join{Lo: lo, Hi: hi, From: from, To: to}
	l.Join, l.eval = j, j.eval
	l.ReMin, l.ReMax, l.ChooseLo, l.ChooseHi = from, to, from, to
	l.Source = fmt.Sprintf("smooth join in log Re of %s (to Re %g) and %s (from Re %g); %s", lo.name, from, hi.name, to, l.Source)
	return l
}

func frontalSphere(d float64) float64 { return math.Pi * d * d / 4 }

func equalVolumeDiameter(b Body) float64 {
	switch b.Shape {
	case Rod:
		return math.Cbrt(1.5 * b.Diameter * b.Diameter * b.Length)
	case Spheroid:
		return math.Cbrt(b.Length * b.Diameter * b.Diameter)
	}
	return b.Length
}

func rodSphericity(l, d float64) float64 {
	deq := math.Cbrt(1.5 * d * d * l)
	return deq * deq / (d*l + d*d/2)
}

func length(b Body) float64   { return b.Length }
func diameter(b Body) float64 { return b.Diameter }

// linear wraps a creeping-flow force law as a coefficient on area.
func linear(force func(b Body, f Flow) float64, area func(b Body) float64) func(Body, Flow, float64) (float64, float64) {
	return func(b Body, f Flow, _ float64) (float64, float64) {
		a := area(b)
		return force(b, f) / (0.5 * f.Density * f.Speed * f.Speed * a), a
	}
}

func sphereCD(fn func(re float64) float64) func(Body, Flow, float64) (float64, float64) {
	return func(b Body, _ Flow, re float64) (float64, float64) { return fn(re), frontalSphere(b.Length) }
}

func frictionLaw(cf func(re float64) float64) func(Body, Flow, float64) (float64, float64) {
	return func(b Body, _ Flow, re float64) (float64, float64) {
		return cf(re) * HoernerFormFactor(b.Length, b.Diameter), ProlateSpheroidArea(b.Length, b.Diameter)
	}
}

const (
	srcStokes   = "Stokes 1851, Trans. Camb. Phil. Soc. 9"
	srcHB       = "Oberbeck 1876; Happel & Brenner 1965, Low Reynolds Number Hydrodynamics, ch. 4"
	srcCGW      = "Clift, Grace & Weber 1978, Bubbles, Drops, and Particles, Table 5.2"
	srcHL       = "Haider & Levenspiel 1989, Powder Technol. 58, 63 (freely moving non-spherical particles)"
	srcHS       = "Hölzer & Sommerfeld 2008, Powder Technol. 184, 361 (any orientation, here along the axis; the upper end of its fitted range, Re 1e5 here, not checked against the paper)"
	srcBrenner  = "Brenner 1961, J. Fluid Mech. 11, 604 (Oseen correction for any shape)"
	srcHoerner  = "Hoerner 1965, Fluid-Dynamic Drag, ch. 6 (form factor on wetted area)"
	wettedArea  = "wetted area of the prolate spheroid, with Hoerner's form factor"
	frontalArea = "frontal area πd²/4"
	eqSphere    = "frontal area of the equal-volume sphere"
	projected   = "projected area d × length"
	inf         = math.MaxFloat64
)

// The validated ends that the joins below connect.
var (
	endOseenBrennerSpheroid = lawEnd{name: "Oseen–Brenner (Brenner 1961)", basisLen: length,
		eval: linear(func(b Body, f Flow) float64 {
			return OseenCorrection(ProlateAxialStokesDrag(f.Viscosity, f.Speed, b.Length, b.Diameter), f.Density, f.Viscosity)
		}, diameterFrontal)}
	endHolzerSpheroid  = lawEnd{name: "Hölzer–Sommerfeld along the axis", basisLen: equalVolumeDiameter, eval: holzerSpheroid}
	endHolzerRod       = lawEnd{name: "Hölzer–Sommerfeld along the axis", basisLen: equalVolumeDiameter, eval: holzerRod}
	endAnimalBody      = lawEnd{name: "skin friction of an animal body with Hoerner's form factor", basisLen: length, eval: frictionLaw(AnimalBodyCf)}
	endOseenBrennerRod = lawEnd{name: "Oseen–Brenner rod (Cox 1970; Brenner 1961)", basisLen: length,
		eval: linear(func(b Body, f Flow) float64 {
			return OseenCorrection(SlenderRodAxialDrag(f.Viscosity, f.Speed, b.Length, b.Diameter/2), f.Density, f.Viscosity)
		}, diameterFrontal)}
	endLaminarRod = lawEnd{name: "laminar skin friction on the rod's side", basisLen: length, eval: rodFriction}
	endLamb       = lawEnd{name: "Lamb 1911", basisLen: diameter,
		eval: func(b Body, _ Flow, re float64) (float64, float64) { return LambCylinderCD(re), b.Diameter * b.Length }}
	endWhite = lawEnd{name: "White's cylinder fit", basisLen: diameter,
		eval: func(b Body, _ Flow, re float64) (float64, float64) { return WhiteCylinderCD(re), b.Diameter * b.Length }}
	endPowerLawCreeping = lawEnd{name: "creeping flow in a power-law fluid (Renaud et al. 2004)", basisLen: length,
		eval: linear(func(b Body, f Flow) float64 { return PowerLawCreepingDrag(f.PowerLawK, f.PowerLawN, f.Speed, b.Length) }, func(b Body) float64 { return frontalSphere(b.Length) })}
	endSphereCurve = lawEnd{name: "the Newtonian sphere laws at the apparent viscosity", basisLen: length, eval: sphereCD(SphereCD)}
)

// holzerSpheroid is Hölzer–Sommerfeld for a prolate spheroid moving along
// its axis: frontal area πd²/4, longitudinal section πld/4.
func holzerSpheroid(b Body, _ Flow, re float64) (float64, float64) {
	deq := equalVolumeDiameter(b)
	phi, perp, par := alignedSphericities(deq, ProlateSpheroidArea(b.Length, b.Diameter), frontalSphere(b.Diameter), math.Pi*b.Length*b.Diameter/4)
	return HolzerSommerfeldCD(re, phi, perp, par), frontalSphere(deq)
}

// holzerRod is Hölzer–Sommerfeld for a flat-ended rod moving along its
// axis: surface πdl + πd²/2, frontal area πd²/4, longitudinal section ld.
func holzerRod(b Body, _ Flow, re float64) (float64, float64) {
	deq := equalVolumeDiameter(b)
	area := math.Pi*b.Diameter*b.Length + math.Pi*b.Diameter*b.Diameter/2
	phi, perp, par := alignedSphericities(deq, area, frontalSphere(b.Diameter), b.Length*b.Diameter)
	return HolzerSommerfeldCD(re, phi, perp, par), frontalSphere(deq)
}

// rodFriction is the laminar (Blasius) skin friction of a rod's side,
// πdl, with no form factor: the rod's ends add pressure drag that no
// published law gives for an aligned rod at these Re, so this is a lower
// estimate.
func rodFriction(b Body, _ Flow, re float64) (float64, float64) {
	return BlasiusCf(re), math.Pi * b.Diameter * b.Length
}

// laws lists every drag law, grouped by shape, in the order they are tried.
// Choice ranges lie inside published ranges; where two laws' ranges leave a
// gap, a [Join] bridges it. A new drag law is one entry here.
var laws = []Law{
	{Name: "creeping flow in a power-law fluid", Shape: Sphere, Source: "Renaud, Mauret & Chhabra 2004, Can. J. Chem. Eng. 82, 1066 (X(n) correction)", Basis: "diameter, on η(U/d)", AreaName: frontalArea,
		ReMin: 0, ReMax: 0.1, ChooseLo: 0, ChooseHi: 0.1, basisLen: length, powerLaw: true, eval: endPowerLawCreeping.eval},
	joined(Law{Name: "power-law creeping flow joined to the sphere laws", Shape: Sphere, Source: "the sphere laws at η(U/d) beyond creeping flow; the ends differ by X(n) ≤ 1.46 while measured corrections scatter over 1–1.8 (Coulson & Richardson, Chemical Engineering vol. 2, ch. 3)", Basis: "diameter, on η(U/d)", AreaName: frontalArea,
		basisLen: length, powerLaw: true}, endPowerLawCreeping, endSphereCurve, 0.1, 100),
	{Name: "Stokes", Shape: Sphere, Source: srcStokes, Basis: "diameter", AreaName: frontalArea,
		ReMin: 0, ReMax: 0.1, ChooseLo: 0, ChooseHi: sphereStokesHi, eval: sphereCD(StokesCD), basisLen: length},
	{Name: "Proudman–Pearson", Shape: Sphere, Source: "Proudman & Pearson 1957, J. Fluid Mech. 2, 237", Basis: "diameter", AreaName: frontalArea,
		ReMin: 0, ReMax: 1, ChooseLo: sphereStokesHi, ChooseHi: sphereExpansionHi, eval: sphereCD(ProudmanPearsonCD), basisLen: length},
	{Name: "Oseen", Shape: Sphere, Source: "Oseen 1910, Ark. Mat. Astr. Fys. 6", Basis: "diameter", AreaName: frontalArea,
		ReMin: 0, ReMax: 1, ChooseLo: -1, ChooseHi: -1, eval: sphereCD(OseenCD), basisLen: length},
	{Name: "standard drag curve", Shape: Sphere, Source: srcCGW, Basis: "diameter", AreaName: frontalArea,
		ReMin: 0, ReMax: 1e6, ChooseLo: sphereExpansionHi, ChooseHi: inf, eval: sphereCD(StandardCurveCD), basisLen: length},
	{Name: "Schiller–Naumann", Shape: Sphere, Source: "Schiller & Naumann 1933, Z. Ver. Dtsch. Ing. 77, 318", Basis: "diameter", AreaName: frontalArea,
		ReMin: 0, ReMax: 800, ChooseLo: -1, ChooseHi: -1, eval: sphereCD(SchillerNaumannCD), basisLen: length},
	{Name: "Clift–Gauvin", Shape: Sphere, Source: "Clift & Gauvin 1970, Proc. Chemeca '70; in Clift, Grace & Weber 1978", Basis: "diameter", AreaName: frontalArea,
		ReMin: 0, ReMax: 3e5, ChooseLo: -1, ChooseHi: -1, eval: sphereCD(CliftGauvinCD), basisLen: length},
	{Name: "Newton quadratic", Shape: Sphere, Source: "constant C_D = 0.44 (common practice, e.g. Perry's Chemical Engineers' Handbook)", Basis: "diameter", AreaName: frontalArea,
		ReMin: 1e3, ReMax: 2e5, ChooseLo: -1, ChooseHi: -1, eval: sphereCD(func(float64) float64 { return NewtonCD }), basisLen: length},

	{Name: "Stokes prolate spheroid", Shape: Spheroid, Source: srcHB, Basis: "length", AreaName: frontalArea,
		ReMin: 0, ReMax: 0.1, ChooseLo: 0, ChooseHi: sphereStokesHi, basisLen: length,
		eval: linear(func(b Body, f Flow) float64 {
			return ProlateAxialStokesDrag(f.Viscosity, f.Speed, b.Length, b.Diameter)
		}, diameterFrontal)},
	{Name: "Oseen–Brenner spheroid", Shape: Spheroid, Source: srcBrenner, Basis: "length", AreaName: frontalArea,
		ReMin: 0, ReMax: 1, ChooseLo: sphereStokesHi, ChooseHi: 1, basisLen: length, eval: endOseenBrennerSpheroid.eval},
	joined(Law{Name: "Oseen–Brenner joined to Hölzer–Sommerfeld", Shape: Spheroid, Source: srcBrenner + "; " + srcHS, Basis: "length", AreaName: frontalArea,
		basisLen: length}, endOseenBrennerSpheroid, endHolzerSpheroid, 1, 10),
	{Name: "Hölzer–Sommerfeld, aligned", Shape: Spheroid, Source: srcHS, Basis: "equal-volume sphere diameter", AreaName: eqSphere,
		ReMin: 0, ReMax: 1e5, ChooseLo: 10, ChooseHi: 100, basisLen: equalVolumeDiameter, eval: holzerSpheroid},
	joined(Law{Name: "Hölzer–Sommerfeld joined to the boundary layer", Shape: Spheroid, Source: srcHS + "; " + srcHoerner, Basis: "length", AreaName: eqSphere,
		basisLen: length}, endHolzerSpheroid, endAnimalBody, bodyFormFrom, bodyTurbulentFrom),
	{Name: "skin friction, laminar (Blasius)", Shape: Spheroid, Source: "Blasius 1908; " + srcHoerner, Basis: "length", AreaName: wettedArea,
		ReMin: 1e3, ReMax: 5e5, ChooseLo: -1, ChooseHi: -1, eval: frictionLaw(BlasiusCf), basisLen: length},
	{Name: "skin friction, turbulent on animal bodies", Shape: Spheroid, Source: "Prandtl–Schlichting line (Schlichting 1979, ch. 21; published from Re 5e5, extrapolated down to where it meets the laminar line); turbulent boundary layers measured on trout at Re 4e5 (Yanase & Saarenrinne 2015, J. Exp. Biol. 218, 1373); " + srcHoerner, Basis: "length", AreaName: wettedArea,
		ReMin: bodyTurbulentFrom, ReMax: 1e9, ChooseLo: bodyTurbulentFrom, ChooseHi: inf, eval: frictionLaw(AnimalBodyCf), basisLen: length,
		altCf: transition5e5, altName: "a laminar boundary layer with transition at Re 5e5"},
	{Name: "skin friction, transition at Re 5e5", Shape: Spheroid, Source: "Prandtl 1927; Schlichting 1979, Boundary-Layer Theory, ch. 21; " + srcHoerner, Basis: "length", AreaName: wettedArea,
		ReMin: 5e5, ReMax: 1e9, ChooseLo: -1, ChooseHi: -1, eval: frictionLaw(transition5e5), basisLen: length},
	{Name: "skin friction, turbulent (Prandtl–Schlichting)", Shape: Spheroid, Source: "Schlichting 1979, Boundary-Layer Theory, ch. 21; " + srcHoerner, Basis: "length", AreaName: wettedArea,
		ReMin: 5e5, ReMax: 1e9, ChooseLo: -1, ChooseHi: -1, eval: frictionLaw(PrandtlSchlichtingCf), basisLen: length},
	{Name: "skin friction, ITTC-1957 line", Shape: Spheroid, Source: "ITTC 1957, 8th ITTC, Madrid; " + srcHoerner, Basis: "length", AreaName: wettedArea,
		ReMin: 1e5, ReMax: 1e10, ChooseLo: -1, ChooseHi: -1, eval: frictionLaw(ITTC1957Cf), basisLen: length},
	{Name: "Haider–Levenspiel", Shape: Spheroid, Source: srcHL, Basis: "equal-volume sphere diameter", AreaName: eqSphere,
		ReMin: 0, ReMax: 2.6e5, ChooseLo: -1, ChooseHi: -1, basisLen: equalVolumeDiameter,
		eval: func(b Body, _ Flow, re float64) (float64, float64) {
			deq := equalVolumeDiameter(b)
			return HaiderLevenspielCD(re, Sphericity(b.Length, b.Diameter)), frontalSphere(deq)
		}},

	{Name: "slender rod (Cox)", Shape: Rod, Source: "Cox 1970, J. Fluid Mech. 44, 791", Basis: "length", AreaName: frontalArea,
		ReMin: 0, ReMax: 0.1, ChooseLo: 0, ChooseHi: sphereStokesHi, basisLen: length,
		eval: linear(func(b Body, f Flow) float64 {
			return SlenderRodAxialDrag(f.Viscosity, f.Speed, b.Length, b.Diameter/2)
		}, diameterFrontal)},
	{Name: "Stokes prolate spheroid of the same length and diameter", Shape: Rod, Source: srcHB, Basis: "length", AreaName: frontalArea,
		ReMin: 0, ReMax: 0.1, ChooseLo: -1, ChooseHi: -1, basisLen: length,
		eval: linear(func(b Body, f Flow) float64 {
			return ProlateAxialStokesDrag(f.Viscosity, f.Speed, b.Length, b.Diameter)
		}, diameterFrontal)},
	{Name: "Oseen–Brenner rod", Shape: Rod, Source: "Cox 1970; " + srcBrenner, Basis: "length", AreaName: frontalArea,
		ReMin: 0, ReMax: 1, ChooseLo: sphereStokesHi, ChooseHi: 1, basisLen: length, eval: endOseenBrennerRod.eval},
	joined(Law{Name: "Oseen–Brenner rod joined to Hölzer–Sommerfeld", Shape: Rod, Source: "Cox 1970; " + srcBrenner + "; " + srcHS, Basis: "length", AreaName: frontalArea,
		basisLen: length}, endOseenBrennerRod, endHolzerRod, 1, 10),
	{Name: "Hölzer–Sommerfeld, aligned", Shape: Rod, Source: srcHS, Basis: "equal-volume sphere diameter", AreaName: eqSphere,
		ReMin: 0, ReMax: 1e5, ChooseLo: 10, ChooseHi: 100, basisLen: equalVolumeDiameter, eval: holzerRod},
	joined(Law{Name: "Hölzer–Sommerfeld joined to the boundary layer", Shape: Rod, Source: srcHS + "; Blasius 1908", Basis: "length", AreaName: eqSphere,
		basisLen: length}, endHolzerRod, endLaminarRod, 100, 1e4),
	{Name: "skin friction of the side, laminar (Blasius)", Shape: Rod, Source: "Blasius 1908; Schlichting 1979, ch. 7 (side area πdl, ends not counted: a lower estimate)", Basis: "length", AreaName: "side area π d × length",
		ReMin: 1e3, ReMax: 5e5, ChooseLo: 1e4, ChooseHi: inf, basisLen: length, eval: rodFriction},
	{Name: "Haider–Levenspiel", Shape: Rod, Source: srcHL, Basis: "equal-volume sphere diameter", AreaName: eqSphere,
		ReMin: 0, ReMax: 2.6e5, ChooseLo: -1, ChooseHi: -1, basisLen: equalVolumeDiameter,
		eval: func(b Body, _ Flow, re float64) (float64, float64) {
			return HaiderLevenspielCD(re, rodSphericity(b.Length, b.Diameter)), frontalSphere(equalVolumeDiameter(b))
		}},

	{Name: "Lamb (Oseen cylinder)", Shape: Cylinder, Source: "Lamb 1911, Phil. Mag. 21, 112", Basis: "diameter", AreaName: projected,
		ReMin: 0, ReMax: 0.5, ChooseLo: 0, ChooseHi: 0.5, basisLen: diameter, eval: endLamb.eval},
	joined(Law{Name: "Lamb joined to White's fit", Shape: Cylinder, Source: "Lamb 1911; White 2006", Basis: "diameter", AreaName: projected,
		basisLen: diameter}, endLamb, endWhite, 0.5, 1),
	{Name: "cylinder fit (White)", Shape: Cylinder, Source: "White 2006, Viscous Fluid Flow, 3rd ed.", Basis: "diameter", AreaName: projected,
		ReMin: 1, ReMax: 2e5, ChooseLo: 1, ChooseHi: inf, basisLen: diameter, eval: endWhite.eval},

	{Name: "measured drag coefficient", Shape: Measured, Source: "user-supplied C_D and reference area", Basis: "length", AreaName: "the stated reference area",
		ReMin: 0, ReMax: inf, ChooseLo: 0, ChooseHi: inf, basisLen: length,
		eval: func(b Body, _ Flow, _ float64) (float64, float64) { return b.DragCoefficient, b.ReferenceArea }},
}

// bodyFormFrom is the Re on the length above which Hoerner's form factor
// enters a spheroid's drag (the join to the boundary layer starts there),
// so a body outside its fineness range 2–10 is warned about from there on:
// at fineness 1 the join gives 1.3–2 times a sphere's published drag at
// Re 300–3000 (TestSpheroidNearSphereLimit).
const bodyFormFrom = 100

// Where the sphere laws hand over (Re on the diameter): Stokes to
// Proudman–Pearson at 0.01, where they differ by 0.19 %; Proudman–Pearson
// to the standard curve at 0.5, where they differ by 0.05 % (Proudman &
// Pearson 1957 against Clift, Grace & Weber 1978, Table 5.2).
const (
	sphereStokesHi    = 0.01
	sphereExpansionHi = 0.5
)

// SphereCD returns the drag coefficient of a rigid sphere at Re (on the
// diameter) by the law chosen there: Stokes, Proudman–Pearson, or the
// standard curve of Clift, Grace & Weber (1978). Drag and settling both use
// it.
func SphereCD(re float64) float64 {
	switch {
	case re <= sphereStokesHi:
		return StokesCD(re)
	case re <= sphereExpansionHi:
		return ProudmanPearsonCD(re)
	}
	return StandardCurveCD(re)
}

// sphereLawName names the law [SphereCD] uses at re.
func sphereLawName(re float64) string {
	switch {
	case re <= sphereStokesHi:
		return "Stokes"
	case re <= sphereExpansionHi:
		return "Proudman–Pearson"
	}
	return "standard drag curve"
}

// Laws returns a copy of the drag-law table, grouped by shape in the order
// the laws are tried: each law's name, source, published range and the
// range in which [Drag] chooses it. Changing the copy changes nothing here.
func Laws() []Law {
	out := append([]Law(nil), laws...)
	for i := range out {
		if j := out[i].Join; j != nil {
			c := *j
			out[i].Join = &c
		}
	}
	return out
}

// lawsByShape indexes laws by shape, in order.
var lawsByShape = func() map[Shape][]*Law {
	m := map[Shape][]*Law{}
	for i := range laws {
		m[laws[i].Shape] = append(m[laws[i].Shape], &laws[i])
	}
	return m
}()

// lawsOf returns the laws for a shape, in the order they are tried.
func lawsOf(s Shape) []*Law {
	switch s { // the common shapes without a map lookup
	case Sphere:
		return sphereLaws
	case Spheroid:
		return spheroidLaws
	}
	return lawsByShape[s]
}

var sphereLaws, spheroidLaws = lawsByShape[Sphere], lawsByShape[Spheroid]

// ChoiceLength is the length whose Reynolds number picks the law: the
// diameter of a sphere or cylinder, the length of other shapes.
func ChoiceLength(b Body) float64 {
	if b.Shape == Cylinder {
		return b.Diameter
	}
	return b.Length
}

func diameterFrontal(b Body) float64 { return frontalSphere(b.Diameter) }

// Range returns the law's published range as text.
func (l Law) Range() string {
	switch {
	case l.ReMax >= inf:
		return fmt.Sprintf("Re ≥ %g", l.ReMin)
	case l.ReMin <= 0:
		return fmt.Sprintf("Re ≤ %g", l.ReMax)
	}
	return fmt.Sprintf("%g ≤ Re ≤ %g", l.ReMin, l.ReMax)
}

// DragResult is the chosen estimate, every law's estimate for the shape, and
// warnings.
type DragResult struct {
	Chosen    Estimate
	Estimates []Estimate
	Warnings  []Warning
}

// Drag evaluates the laws for the body's shape and chooses the one whose
// choice range holds the case (see each Law's ChooseLo–ChooseHi). Estimates
// holds the chosen law's and every other law within a decade of Re of its
// published range, each flagged in or out of range.
func Drag(b Body, f Flow) (DragResult, error) { return drag(b, f, true) }

// dragChosen is [Drag] without the other laws' estimates, and with
// warnings that carry their codes only, for batch work.
func dragChosen(b Body, f Flow) (DragResult, error) { return drag(b, f, false) }

func (l *Law) estimate(b Body, f Flow) Estimate {
	re := f.Density * f.Speed * l.basisLen(b) / f.Viscosity
	cd, area := l.eval(b, f, re)
	e := Estimate{
		Law: l.Name, Source: l.Source, Coefficient: cd, ReferenceArea: area, AreaName: l.AreaName,
		Force: 0.5 * f.Density * f.Speed * f.Speed * cd * area, Reynolds: re, Basis: l.Basis,
		ReMin: l.ReMin, ReMax: l.ReMax, InRange: re >= l.ReMin && re <= l.ReMax,
		Low: math.NaN(), High: math.NaN(),
	}
	switch {
	case l.Join != nil:
		lo, hi := l.Join.Lo.force(b, f), l.Join.Hi.force(b, f)
		e.Low, e.High = math.Min(lo, hi), math.Max(lo, hi)
		e.BracketFrom = "the two neighbouring laws (see the warning)"
	case l.altCf != nil: // same area and form factor: scale by the friction
		a := e.Force * l.altCf(re) * HoernerFormFactor(b.Length, b.Diameter) / cd
		e.Low, e.High = math.Min(a, e.Force), math.Max(a, e.Force)
		e.BracketFrom = "turbulent and laminar boundary layers"
	}
	return e
}

func drag(b Body, f Flow, all bool) (DragResult, error) {
	var res DragResult
	if err := b.Validate(); err != nil {
		return res, err
	}
	err := dragInto(&res, b, f, all)
	return res, err
}

// dragInto is drag for a body already validated, writing into res, whose
// Warnings slice it reuses.
func dragInto(res *DragResult, b Body, f Flow, all bool) error {
	if err := f.validate(); err != nil {
		return err
	}
	*res = DragResult{Warnings: res.Warnings[:0]}
	note := noter(all)
	reChoice := f.Density * f.Speed * ChoiceLength(b) / f.Viscosity
	var chosen *Law
	for _, l := range lawsOf(b.Shape) {
		if (!l.powerLaw || f.PowerLawN > 0) && reChoice > l.ChooseLo && reChoice <= l.ChooseHi {
			chosen = l
			break
		}
	}
	if chosen == nil {
		return errorf("no drag law covers a %s at this Reynolds number", b.Shape)
	}
	res.Chosen = chosen.estimate(b, f)
	if all {
		res.Estimates = append(res.Estimates, res.Chosen)
		for i := range laws {
			l := &laws[i]
			if l.Shape != b.Shape || l == chosen || l.powerLaw && f.PowerLawN == 0 {
				continue
			}
			if e := l.estimate(b, f); applicable(e) {
				res.Estimates = append(res.Estimates, e)
			}
		}
	}
	c := &res.Chosen
	if !c.InRange {
		note.detail(&res.Warnings, WarnLawOutOfRange, media.Detail{Quantity: "reynolds", Value: c.Reynolds, Relation: "outside the range of " + c.Law}, func() string {
			return fmt.Sprintf("drag: %s used at Re = %.3g on the %s, outside its published range %s", c.Law, c.Reynolds, c.Basis, lawRange(*c))
		})
	}
	if chosen.altCf != nil && c.High > 1.1*c.Low {
		note.detail(&res.Warnings, WarnModel, media.Detail{Quantity: "laminar drag", Value: c.Low, Unit: "N", Relation: "is the bracket's other end (turbulent boundary layer taken)"}, func() string {
			return fmt.Sprintf("drag: the boundary layer of a rigid animal body at Re = %.3g is taken as turbulent (%.3g N; below Re 5e5 the turbulent line is extrapolated); with %s the drag would be %.3g N: take the two as a bracket", c.Reynolds, c.High, chosen.altName, c.Low)
		})
	}
	if b.Shape == Sphere && c.Reynolds > 2e5 {
		note.detail(&res.Warnings, WarnDragCrisis, media.Detail{Quantity: "reynolds", Value: c.Reynolds, Relation: "> 2e5 for a sphere (drag crisis)"}, func() string {
			return fmt.Sprintf("drag: Re = %.3g is in or past the drag crisis of a sphere (about 2e5–5e5 for a smooth sphere), where C_D falls to about 0.1 depending on roughness and free-stream turbulence", c.Reynolds)
		})
	}
	if b.Shape == Rod && b.Length/(b.Diameter/2) < 10 {
		note.detail(&res.Warnings, WarnGeometry, media.Detail{Quantity: "length/radius", Value: b.Length / (b.Diameter / 2), Relation: "< 10 for slender-body theory"}, func() string {
			return fmt.Sprintf("drag: slender-body theory is poor for length/radius below 10 (here %.3g); compare the spheroid estimate", b.Length/(b.Diameter/2))
		})
	}
	if j := chosen.Join; j != nil {
		note.detail(&res.Warnings, WarnModel, media.Detail{Quantity: "reynolds", Value: c.Reynolds, Relation: "between published drag laws: joined, a bracket"}, func() string {
			return fmt.Sprintf("drag: at Re = %.3g on the %s the drag joins %s (used up to Re %g), %.3g N here, and %s (used from Re %g), %.3g N here, smoothly in log Re, as no published law covers the gap between them: take the two as a bracket",
				c.Reynolds, c.Basis, j.Lo.name, j.From, j.Lo.force(b, f), j.Hi.name, j.To, j.Hi.force(b, f))
		})
	}
	if b.Shape == Spheroid && c.Reynolds > bodyFormFrom && c.Basis == "length" {
		// A little slack so that a body given as exactly 10:1 in rounded
		// millimetres is not flagged for floating-point noise.
		if r := b.Length / b.Diameter; r < 2*(1-1e-9) || r > 10*(1+1e-9) {
			note.detail(&res.Warnings, WarnGeometry, media.Detail{Quantity: "fineness ratio", Value: r, Relation: "outside 2–10 for Hoerner's form factor"}, func() string {
				return fmt.Sprintf("drag: Hoerner's form factor is for streamlined bodies of fineness ratio about 2–10; this body's is %.3g", r)
			})
		}
	}
	return nil
}

// applicable reports whether an estimate is worth showing beside the chosen
// one: finite, and within a decade of Re of its law's published range
// (those outside the range carry InRange false and are shown as such).
// Laws far beyond their range (an Oseen expansion at Re 1000) differ by
// orders of magnitude and are left out rather than listed as comparable.
func applicable(e Estimate) bool {
	if math.IsNaN(e.Force) || math.IsInf(e.Force, 0) || e.Force <= 0 {
		return false
	}
	return e.Reynolds >= e.ReMin/10 && e.Reynolds <= e.ReMax*10
}

func lawRange(e Estimate) string {
	return Law{ReMin: e.ReMin, ReMax: e.ReMax}.Range()
}

func (f Flow) validate() error {
	switch {
	case !(f.Speed > 0) || math.IsInf(f.Speed, 0):
		return positiveError("speed", f.Speed, "m/s", withUnit)
	case !(f.Density > 0) || math.IsInf(f.Density, 0):
		return positiveError("fluid density", f.Density, "kg/m³", withUnit)
	case !(f.Viscosity > 0) || math.IsInf(f.Viscosity, 0):
		return positiveError("fluid viscosity", f.Viscosity, "Pa·s", withUnit)
	}
	return nil
}
