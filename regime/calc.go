package regime

import (
	"fmt"
	"math"
	"unsafe"

	"github.com/flowregime/flowregime/media"
)

// Organism is one organism's measurements, in SI units. Body and Speed are
// required; every other number is optional and positive when given: leave
// it zero (or NaN) when it was not measured, and [Calc] uses the default
// named beside the field; the [Result] shows what it used (Power.Kind
// towing for want of an efficiency, for example), with a warning where the
// default changes the answer much. A negative value is an [*InputError].
type Organism struct {
	Body      Body
	Speed     float64 // m/s
	Frequency float64 // stroke (tail beat or wingbeat) frequency, Hz
	Amplitude float64 // peak-to-peak tail-tip or wing-tip excursion, m
	Mass      float64 // kg

	Span        float64 // wingspan, m
	WingLength  float64 // one wing, m
	Chord       float64 // mean wing chord, m
	WingArea    float64 // both wings, m²
	StrokeAngle float64 // peak-to-peak stroke amplitude, rad

	Efficiency    float64 // propulsive efficiency of a swimmer, 0–1; not given means 1 (towing power)
	InducedFactor float64 // not given means DefaultInducedFactor
	ProfileCD     float64 // not given means the attached-flow default
	Disc          string  // DiscSpan (default) or DiscStroke
	Gliding       bool    // a flyer with its wings held still: a glide, no flapping power
	Diffusivity   float64 // solute diffusivity, m²/s; not given means dissolved O₂ in water

	// For non-Newtonian media: the characteristic shear rate (not given
	// means U/L) and a relaxation time (not given means the medium's own,
	// if any).
	ShearRate      float64 // 1/s
	RelaxationTime float64 // s
}

// NewOrganism returns an Organism with every optional value NaN, for
// callers that test fields with math.IsNaN; a struct literal that leaves
// them zero means the same to this package.
func NewOrganism(b Body, speed float64) Organism {
	n := math.NaN()
	return Organism{Body: b, Speed: speed, Frequency: n, Amplitude: n, Mass: n, Span: n, WingLength: n,
		Chord: n, WingArea: n, StrokeAngle: n, Efficiency: n, InducedFactor: n, ProfileCD: n, Diffusivity: n,
		ShearRate: n, RelaxationTime: n}
}

// optionalInput is one of the Organism's optional quantities: positive and
// at most max when given; zero and NaN both mean not given.
type optionalInput struct {
	name   string // as messages name it
	unit   string // SI
	max    float64
	offset uintptr // of its float64 field in Organism
}

// value points at the input's field in o.
func (in *optionalInput) value(o *Organism) *float64 {
	return (*float64)(unsafe.Add(unsafe.Pointer(o), in.offset))
}

// optionalInputs are the Organism's optional quantities in the order they
// are checked. A new optional quantity is a field of Organism and a line
// here. (Field offsets rather than accessor functions: batch work calls
// normalize for every row, and a function value would make o escape to
// the heap, an allocation per row.)
var optionalInputs = [...]optionalInput{
	{"frequency", "Hz", none, unsafe.Offsetof(Organism{}.Frequency)},
	{"amplitude", "m", none, unsafe.Offsetof(Organism{}.Amplitude)},
	{"mass", "kg", none, unsafe.Offsetof(Organism{}.Mass)},
	{"span", "m", none, unsafe.Offsetof(Organism{}.Span)},
	{"wing length", "m", none, unsafe.Offsetof(Organism{}.WingLength)},
	{"chord", "m", none, unsafe.Offsetof(Organism{}.Chord)},
	{"wing area", "m²", none, unsafe.Offsetof(Organism{}.WingArea)},
	{"stroke angle", "rad", none, unsafe.Offsetof(Organism{}.StrokeAngle)},
	{"diffusivity", "m²/s", none, unsafe.Offsetof(Organism{}.Diffusivity)},
	{"shear rate", "1/s", none, unsafe.Offsetof(Organism{}.ShearRate)},
	{"relaxation time", "s", none, unsafe.Offsetof(Organism{}.RelaxationTime)},
	{"induced-power factor", "", none, unsafe.Offsetof(Organism{}.InducedFactor)},
	{"profile-drag coefficient", "", none, unsafe.Offsetof(Organism{}.ProfileCD)},
	{"efficiency", "", 1, unsafe.Offsetof(Organism{}.Efficiency)},
}

// none is the upper bound of an input that has none.
const none = math.MaxFloat64

// normalize marks every optional value left zero as not given (NaN), the
// form the rest of this package reads, and refuses a given one that is not
// positive or is above its maximum.
func (o *Organism) normalize() error {
	for i := range optionalInputs {
		in := &optionalInputs[i]
		switch p := in.value(o); {
		case *p == 0:
			*p = math.NaN()
		case *p == *p && !(*p > 0 && *p <= in.max):
			return optionalError(in, *p)
		}
	}
	return nil
}

// optionalError refuses the value v of an optional input.
func optionalError(in *optionalInput, v float64) error {
	if in.max < none {
		return &InputError{Field: in.name, Value: v, Min: 0, Max: in.max, Unit: in.unit}
	}
	return positiveError(in.name, v, in.unit, bare)
}

// Power kinds.
const (
	PowerTowing   = "towing"   // drag × speed, efficiency 1
	PowerSwimming = "swimming" // drag × speed ÷ efficiency
	PowerFlight   = "flight"   // induced + parasite + profile
	PowerGliding  = "gliding"  // no flapping work: m g × sink speed, the rate height energy is spent
)

// Power is the power needed to move at the given speed.
type Power struct {
	Kind       string
	Total      float64 // W
	Efficiency float64 // swimmers
	Flight     *FlightPower
}

// Result is everything computed for one organism.
type Result struct {
	Shape            Shape // the body's shape
	Medium           media.Properties
	ShearRate        float64 // characteristic shear rate, 1/s (U/L unless given)
	Viscosity        float64 // viscosity used, Pa·s: the apparent viscosity at ShearRate
	GeneralizedRe    float64 // power-law and Herschel–Bulkley fluids: ρU^(2−n)Lⁿ/K
	BinghamNumber    float64 // yield-stress fluids
	Deborah          float64 // relaxation time × stroke frequency (or × U/L without a stroke)
	Weissenberg      float64 // relaxation time × shear rate
	Reynolds         float64 // on ChoiceLength: the diameter of a sphere or cylinder, else the length
	Regime           string
	BoundaryLayer    string // streamlined bodies at Re ≥ 1000
	Strouhal         float64
	StrouhalBand     string
	AdvanceRatio     float64
	ReducedFrequency float64
	Drag             DragResult
	Power            Power
	CoastTime        float64 // s; only in the viscous regime: the time to stop if CoastStops, else the time constant M U/F
	CoastDistance    float64 // m
	CoastStops       bool    // the body stops in finite time (shear-thinning power law, yield stress)
	Peclet           float64
	Diffusivity      float64 // m²/s
	Warnings         []Warning

	// flightStore is where Power.Flight points: made once and reused by
	// CalcInto, so that a flyer's row allocates nothing.
	flightStore *FlightPower
}

// Calc computes Reynolds and Strouhal numbers, regime, drag and power for
// one organism in a medium, with every applicable drag law's estimate.
func Calc(o Organism, m media.Properties) (Result, error) {
	var r Result
	err := calc(&r, &o, &m, true)
	return r, err
}

// Options choose what [CalcInto] computes beyond [Calc]'s core, for
// callers that compute many rows and report little of each.
type Options struct {
	// Brief evaluates only the chosen drag law (Result.Drag.Estimates stays
	// empty) and gives warnings their Code and Detail without Message text.
	// The numbers are Calc's.
	Brief bool
	// Screen adds warnings for measurements that look implausible: a speed
	// in body lengths per second beyond what organisms of that size reach.
	Screen bool
}

// CalcInto is [Calc] with options, writing into r. It reuses the storage of
// r's warning slices and of its flight power (Power.Flight points into
// storage r keeps), so a loop over millions of organisms allocates nothing
// once they have grown; r, and any copy of it, is valid until the next call
// with it.
func CalcInto(r *Result, o Organism, m *media.Properties, opt Options) error {
	if err := calc(r, &o, m, !opt.Brief); err != nil {
		return err
	}
	if opt.Screen {
		screen(&o, r, noter(!opt.Brief), &r.Warnings)
	}
	return nil
}

// calc is Calc in named steps; all reports with full-text warnings and
// every law's estimate. o is the caller's copy: it is normalised in place.
func calc(r *Result, o *Organism, m *media.Properties, all bool) error {
	note := noter(all)
	resetResult(r, o, m)
	if err := checkOrganism(o); err != nil {
		return err
	}
	r.Warnings = append(r.Warnings, m.Warnings...)
	l := ChoiceLength(o.Body) // the diameter of a sphere or cylinder, the length of other bodies
	if err := flowNumbers(r, o, m, l, note); err != nil {
		return err
	}
	strouhal(r, o, m, note)
	wings := wingNumbers(r, o)
	flow := Flow{Speed: o.Speed, Density: m.Density, Viscosity: r.Viscosity}
	flow.PowerLawK, flow.PowerLawN = powerLawParams(m)
	if err := dragInto(&r.Drag, o.Body, flow, all); err != nil {
		return err
	}
	r.Warnings = append(r.Warnings, r.Drag.Warnings...)
	if err := powerNeeded(r, o, m, wings, note); err != nil {
		return err
	}
	coasting(r, o, m, note)
	diffusion(r, o, m, l)
	return checkResult(r, o)
}

// resetResult clears r for a new organism, keeping its warning slices'
// storage, with every quantity that may not apply set to NaN.
func resetResult(r *Result, o *Organism, m *media.Properties) {
	n := math.NaN()
	*r = Result{Warnings: r.Warnings[:0], Drag: DragResult{Warnings: r.Drag.Warnings[:0]}, flightStore: r.flightStore, Shape: o.Body.Shape, Medium: *m, Strouhal: n, AdvanceRatio: n, ReducedFrequency: n, CoastTime: n, CoastDistance: n, Peclet: n, Diffusivity: n,
		GeneralizedRe: n, BinghamNumber: n, Deborah: n, Weissenberg: n}
}

// checkOrganism normalises o's optional values and refuses a body, speed
// or optional value outside its range.
func checkOrganism(o *Organism) error {
	if err := o.Body.Validate(); err != nil {
		return err
	}
	if math.IsInf(o.Speed, 1) { // a speed in body lengths per second times a huge length
		return rangeError("the speed overflows", flowInputs(o)...)
	}
	if !(o.Speed > 0) {
		return positiveError("speed", o.Speed, "m/s", withUnit)
	}
	return o.normalize()
}

// flowNumbers sets the shear rate, the viscosity there, the non-Newtonian
// numbers, the Reynolds number on l and the regime, with a warning above
// Mach 0.3 in air.
func flowNumbers(r *Result, o *Organism, m *media.Properties, l float64, note noter) error {
	r.ShearRate = o.Speed / l
	if !math.IsNaN(o.ShearRate) {
		r.ShearRate = o.ShearRate
	}
	r.Viscosity = m.ApparentViscosity(r.ShearRate)
	if !(r.Viscosity > 0) || math.IsInf(r.Viscosity, 0) {
		return errorf("the medium's apparent viscosity at %.3g 1/s is not a positive number", r.ShearRate)
	}
	if !m.Newtonian() {
		nonNewtonianNumbers(r, o, m, l)
	}
	r.Reynolds = Reynolds(o.Speed, l, r.Viscosity/m.Density)
	if err := checkReynolds(r.Reynolds, o); err != nil {
		return err
	}
	r.Regime = Classify(r.Reynolds)
	if m.Gas && !math.IsNaN(m.TemperatureC) {
		if ma := o.Speed / SpeedOfSoundAir(m.TemperatureC); ma > MachIncompressible {
			note.detail(&r.Warnings, WarnModel, media.Detail{Quantity: "Mach number", Value: ma, Relation: "> 0.3: air is compressible there"}, func() string {
				return fmt.Sprintf("flow: Mach %.2g: above Mach 0.3 air is compressible and the drag laws here, made for incompressible flow, no longer hold", ma)
			})
		}
	}
	if o.Body.Shape == Spheroid {
		r.BoundaryLayer = BoundaryLayer(r.Reynolds)
	}
	return nil
}

// nonNewtonianNumbers sets the generalised Reynolds, Bingham, Deborah and
// Weissenberg numbers, with a warning where the shear rate is beyond the
// medium's measured range.
func nonNewtonianNumbers(r *Result, o *Organism, m *media.Properties, l float64) {
	if w := m.ExtrapolationWarning(r.ShearRate); w != nil {
		r.Warnings = append(r.Warnings, *w)
	}
	r.GeneralizedRe = GeneralizedReynolds(m.Rheology, m.Density, o.Speed, l)
	r.BinghamNumber = BinghamNumber(m.Rheology, o.Speed, l)
	lambda := o.RelaxationTime
	if mr, ok := m.Rheology.(media.MeasuredRheology); ok && math.IsNaN(lambda) {
		lambda = mr.RelaxationTime
	}
	if !math.IsNaN(lambda) {
		r.Weissenberg = lambda * r.ShearRate
		r.Deborah = lambda * o.Speed / l
		if !math.IsNaN(o.Frequency) {
			r.Deborah = lambda * o.Frequency
		}
	}
}

// powerLawParams returns the consistency and flow index of a power-law
// medium, zeros for any other.
func powerLawParams(m *media.Properties) (k, n float64) {
	if m.Newtonian() {
		return 0, 0
	}
	if pl, ok := model(m.Rheology).(media.PowerLaw); ok {
		return pl.K, pl.N
	}
	return 0, 0
}

// strouhal sets the Strouhal number and its band, warning of an incomplete
// or unusual stroke.
func strouhal(r *Result, o *Organism, m *media.Properties, note noter) {
	switch {
	case !math.IsNaN(o.Frequency) && !math.IsNaN(o.Amplitude):
		r.Strouhal = Strouhal(o.Frequency, o.Amplitude, o.Speed)
		r.StrouhalBand = StrouhalBand(r.Strouhal)
		if ref := refLength(*o); o.Amplitude > ref {
			note.detail(&r.Warnings, WarnInconsistent, media.Detail{Quantity: "amplitude", Value: o.Amplitude, Unit: "m", Relation: "> " + refName(*o)}, func() string {
				return fmt.Sprintf("inputs: amplitude %.3g m is larger than the %s (%.3g m)", o.Amplitude, refName(*o), ref)
			})
		}
		// Screening bound 0.05–1: common practice, no single source; cruising
		// animals keep to 0.2–0.4 (Taylor, Nudds & Thomas 2003) and
		// manoeuvres and slow hovering flight go beyond it.
		if StrouhalUnusual(r.Strouhal, m.Gas) {
			note.detail(&r.Warnings, WarnStrouhal, strouhalDetail(r.Strouhal), func() string {
				return fmt.Sprintf("strouhal: St = %.3g is outside 0.05–1, beyond what swimming and flying animals show (cruisers keep to 0.2–0.4, Taylor, Nudds & Thomas 2003); check frequency, amplitude and speed", r.Strouhal)
			})
		}
	case !math.IsNaN(o.Frequency):
		note.detail(&r.Warnings, WarnStrokeIncomplete, media.Detail{Quantity: "frequency", Value: o.Frequency, Unit: "Hz", Relation: "without an amplitude: no Strouhal number"}, func() string {
			return "inputs: a frequency without an amplitude gives no Strouhal number; give the peak-to-peak amplitude"
		})
	case !math.IsNaN(o.Amplitude):
		note.detail(&r.Warnings, WarnStrokeIncomplete, media.Detail{Quantity: "amplitude", Value: o.Amplitude, Unit: "m", Relation: "without a frequency: no Strouhal number"}, func() string {
			return "inputs: an amplitude without a frequency gives no Strouhal number; give the stroke frequency"
		})
	}
}

// wingNumbers sets the advance ratio and reduced frequency of a flapping
// wing, and returns the wings (zero without a span or wing length).
func wingNumbers(r *Result, o *Organism) Wings {
	var wings Wings
	if !math.IsNaN(o.Span) || !math.IsNaN(o.WingLength) {
		wings = o.wings()
	}
	if !math.IsNaN(o.Frequency) && wings.Length > 0 {
		if phi := wings.StrokeAngle; phi > 0 {
			r.AdvanceRatio = AdvanceRatio(o.Speed, phi, o.Frequency, wings.Length)
		}
		if c := wings.MeanChord(); c > 0 {
			r.ReducedFrequency = ReducedFrequency(o.Frequency, c, o.Speed)
		}
	}
	return wings
}

// powerNeeded sets the power: flight power for a flyer in air, else
// drag × speed ÷ efficiency.
func powerNeeded(r *Result, o *Organism, m *media.Properties, wings Wings, note noter) error {
	switch {
	case isFlyer(o, m):
		return flightPower(r, o, m, wings, note)
	case o.Gliding:
		return errorf("gliding needs a flyer in air with a mass and a wingspan")
	}
	if !math.IsNaN(o.Span) && math.IsNaN(o.Mass) {
		note.detail(&r.Warnings, WarnInconsistent, media.Detail{Quantity: "wingspan", Value: o.Span, Unit: "m", Relation: "without a mass: towing power"}, func() string {
			return "inputs: a wingspan without a mass gives no flight power; give the mass (towing power shown instead)"
		})
	}
	r.Power = Power{Kind: PowerSwimming, Efficiency: o.Efficiency}
	if math.IsNaN(o.Efficiency) {
		r.Power = Power{Kind: PowerTowing, Efficiency: 1}
	}
	r.Power.Total = SwimmingPower(r.Drag.Chosen.Force, o.Speed, r.Power.Efficiency)
	return nil
}

// flightPower sets a flyer's flapping or gliding power from the flight
// model, with the body's drag already computed.
func flightPower(r *Result, o *Organism, m *media.Properties, wings Wings, note noter) error {
	in := o.flightInput(*m, r.Viscosity, wings, note)
	in.Drag = r.Drag.Chosen.Force // at this speed, already computed
	if r.flightStore != nil {
		in.warnings = r.flightStore.Warnings // reused: r is CalcInto's
	}
	fp, err := Flight(in)
	if err != nil {
		return err
	}
	if r.flightStore == nil {
		r.flightStore = new(FlightPower)
	}
	*r.flightStore = fp
	r.Power = Power{Kind: PowerFlight, Total: fp.Total, Flight: r.flightStore}
	switch {
	case o.Gliding && !math.IsNaN(o.Frequency):
		r.Power.Kind = PowerGliding
		note.detail(&r.Warnings, WarnInconsistent, media.Detail{Quantity: "wingbeat frequency", Value: o.Frequency, Unit: "Hz", Relation: "given for a glide: not used"}, func() string {
			return "inputs: a gliding flyer with a wingbeat frequency: the frequency is not used for power"
		})
	case o.Gliding:
		r.Power.Kind = PowerGliding
	case math.IsNaN(o.Frequency):
		note.detail(&r.Warnings, WarnModel, media.Detail{Quantity: "wingbeat frequency", Value: math.NaN(), Relation: "not given: continuous flapping assumed"}, func() string {
			return "flight: no wingbeat frequency given, so the power is that of continuous flapping; a gliding animal does no flapping work: give it as gliding (calc and powercurve take --gliding)"
		})
	}
	r.Warnings = append(r.Warnings, fp.Warnings...)
	return nil
}

// coasting sets, in the viscous regime (Re < 1), how long and how far the
// body coasts once it stops swimming; a body without a mass is taken as
// neutrally buoyant.
func coasting(r *Result, o *Organism, m *media.Properties, note noter) {
	if !(r.Reynolds < 1) {
		return
	}
	vol := BodyVolume(o.Body)
	mass := o.Mass
	if math.IsNaN(mass) {
		mass = m.Density * vol // neutrally buoyant when no mass is given
	}
	if math.IsNaN(mass) || math.IsNaN(vol) {
		return
	}
	c := coast(m, r.ShearRate, mass+0.5*m.Density*vol, o.Speed, r.Drag.Chosen.Force)
	r.CoastTime, r.CoastDistance, r.CoastStops = c.Time, c.Distance, c.Stops
	if math.IsInf(c.Distance, 0) {
		r.CoastDistance = math.NaN()
		note.detail(&r.Warnings, WarnModel, media.Detail{Quantity: "coasting distance", Value: math.NaN(), Relation: "unbounded in this shear-thickening fluid"}, func() string {
			return "coasting: in this shear-thickening fluid creeping-flow drag falls off so fast at low speed that the coasting distance has no bound; none is given"
		})
	}
}

// diffusion sets the solute diffusivity (given, else dissolved O₂ in fresh
// or sea water) and the Péclet number on l.
func diffusion(r *Result, o *Organism, m *media.Properties, l float64) {
	switch {
	case !math.IsNaN(o.Diffusivity):
		r.Diffusivity = o.Diffusivity
	case m.Water && m.SalinityAbsolute > 0:
		// Sea water's viscosity is pure water's at the same temperature and
		// pressure times the Sharqawy et al. factor, so that factor alone is
		// the viscosity ratio.
		r.Diffusivity = StokesEinsteinScale(OxygenDiffusivityWater(m.TemperatureC), 1, media.SeawaterViscosity(1, m.TemperatureC, m.SalinityAbsolute))
	case m.Water:
		r.Diffusivity = OxygenDiffusivityWater(m.TemperatureC)
	}
	if !math.IsNaN(r.Diffusivity) {
		r.Peclet = Peclet(o.Speed, l, r.Diffusivity)
	}
}

// isFlyer reports whether the organism gets flight power: in a gas (air), with a
// mass and a wingspan.
func isFlyer(o *Organism, m *media.Properties) bool {
	return m.Gas && !math.IsNaN(o.Mass) && !math.IsNaN(o.Span)
}

// coast coasts a body of effective mass mEff from speed u against the
// creeping-flow drag force at u, taking the drag to scale with speed as the
// medium's stress at a shear rate proportional to speed (drag = geometry ×
// apparent viscosity × speed): linear in a Newtonian fluid, U^n in a power
// law, a yield force plus a rate term in a yield-stress fluid.
func coast(m *media.Properties, shearRate, mEff, u, force float64) Coast {
	if m.Newtonian() {
		tau, d := Coasting(mEff, u, force)
		return Coast{Time: tau, Distance: d}
	}
	if pl, ok := model(m.Rheology).(media.PowerLaw); ok {
		return CoastingPowerLaw(mEff, u, force, pl.N)
	}
	stress := func(s float64) float64 { return m.ApparentViscosity(shearRate*s) * s }
	s1 := stress(1)
	return CoastingDrag(mEff, u, force, func(s float64) float64 { return stress(s) / s1 }, yieldStress(m.Rheology) > 0)
}

func (o Organism) wings() Wings {
	w := Wings{Span: o.Span, Length: o.WingLength, Frequency: o.Frequency, StrokeAngle: o.StrokeAngle, ProfileCD: o.ProfileCD}
	if math.IsNaN(w.Length) && !math.IsNaN(o.Span) {
		w.Length = o.Span / 2
	}
	switch {
	case !math.IsNaN(o.WingArea):
		w.Area = o.WingArea
	case !math.IsNaN(o.Chord) && w.Length > 0:
		w.Area = 2 * w.Length * o.Chord
	}
	if math.IsNaN(w.StrokeAngle) && !math.IsNaN(o.Amplitude) && w.Length > 0 && o.Amplitude <= 2*w.Length {
		// Tip excursion A = 2R sin(Φ/2) (Nudds, Taylor & Thomas 2004, Proc. R. Soc. B 271, 2071, with b = 2R).
		w.StrokeAngle = 2 * math.Asin(o.Amplitude/(2*w.Length))
	}
	if math.IsNaN(w.StrokeAngle) {
		w.StrokeAngle = 0
	}
	if math.IsNaN(w.Frequency) {
		w.Frequency = 0
	}
	if math.IsNaN(w.Length) {
		w.Length = 0
	}
	return w
}

func refLength(o Organism) float64 {
	if !math.IsNaN(o.Span) {
		return o.Span
	}
	return o.Body.Length
}

func refName(o Organism) string {
	if !math.IsNaN(o.Span) {
		return "wingspan"
	}
	return "body length"
}

// flightInput builds the flight model's input for the organism, without
// the body's drag.
func (o Organism) flightInput(m media.Properties, viscosity float64, wings Wings, note noter) FlightInput {
	k := o.InducedFactor
	if math.IsNaN(k) {
		k = DefaultInducedFactor
	}
	area, cd := bodyFrontal(o.Body)
	return FlightInput{
		Mass: o.Mass, Speed: o.Speed, Density: m.Density, Viscosity: viscosity, InducedFactor: k,
		Disc: o.Disc, Wings: wings, BodyArea: area, BodyCD: cd, Gliding: o.Gliding, brief: !note,
	}
}

// bodyFrontal returns the frontal area (m²) of a flyer's body seen from
// ahead, with the measured drag coefficient of a measured body on its own
// area (0 otherwise: the bird body default applies).
func bodyFrontal(b Body) (area, cd float64) {
	switch b.Shape {
	case Sphere:
		return math.Pi * b.Length * b.Length / 4, 0
	case Spheroid, Rod:
		return math.Pi * b.Diameter * b.Diameter / 4, 0
	case Cylinder: // broadside
		return b.Length * b.Diameter, 0
	case Measured:
		return b.ReferenceArea, b.DragCoefficient
	}
	return 0, 0
}

// OrganismPowerCurve is [FlightPowerCurve] for a flying organism in air,
// from lo to hi m/s in steps. The curve's warnings are a new slice: the
// medium's are copied into it, never appended to.
func OrganismPowerCurve(o Organism, m media.Properties, lo, hi float64, steps int) (PowerCurve, error) {
	if err := o.normalize(); err != nil {
		return PowerCurve{}, err
	}
	if !m.Gas || math.IsNaN(o.Mass) || math.IsNaN(o.Span) {
		return PowerCurve{}, errorf("a flight power curve needs a flyer in air with a mass and a wingspan")
	}
	if err := o.Body.Validate(); err != nil {
		return PowerCurve{}, err
	}
	in := o.flightInput(m, m.DynamicViscosity, o.wings(), true)
	in.BodyDrag = func(u float64) float64 { // from the drag laws at each speed
		d, err := dragChosen(o.Body, Flow{Speed: u, Density: m.Density, Viscosity: m.DynamicViscosity})
		if err != nil {
			return math.NaN()
		}
		return d.Chosen.Force
	}
	pc, err := FlightPowerCurve(in, lo, hi, steps)
	if err != nil {
		return pc, err
	}
	if err := checkCurve(&pc, &o, lo, hi); err != nil {
		return PowerCurve{}, err
	}
	pc.Warnings = append(append([]Warning{}, m.Warnings...), pc.Warnings...)
	return pc, nil
}
