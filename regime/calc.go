package regime

import (
	"fmt"
	"math"

	"github.com/flowregime/flowregime/media"
)

// Organism is one organism's measurements. Optional values are NaN when not
// measured.
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

	Efficiency    float64 // propulsive efficiency of a swimmer, 0–1; NaN means 1 (towing power)
	InducedFactor float64 // NaN means DefaultInducedFactor
	ProfileCD     float64 // NaN means the attached-flow default
	Disc          string  // DiscSpan (default) or DiscStroke
	Gliding       bool    // a flyer with its wings held still: a glide, no flapping power
	Diffusivity   float64 // solute diffusivity, m²/s; NaN means dissolved O₂ in water

	// For non-Newtonian media: the characteristic shear rate (NaN means
	// U/L) and a relaxation time (NaN means the medium's own, if any).
	ShearRate      float64 // 1/s
	RelaxationTime float64 // s
}

// NewOrganism returns an Organism with every optional value unset.
func NewOrganism(b Body, speed float64) Organism {
	n := math.NaN()
	return Organism{Body: b, Speed: speed, Frequency: n, Amplitude: n, Mass: n, Span: n, WingLength: n,
		Chord: n, WingArea: n, StrokeAngle: n, Efficiency: n, InducedFactor: n, ProfileCD: n, Diffusivity: n,
		ShearRate: n, RelaxationTime: n}
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
}

// Calc computes Reynolds and Strouhal numbers, regime, drag and power for
// one organism in a medium, with every applicable drag law's estimate.
func Calc(o Organism, m media.Properties) (Result, error) {
	var r Result
	err := calc(&r, &o, &m, true)
	return r, err
}

// CalcChosen is [Calc] with only the chosen drag law evaluated and with
// warnings that carry their codes only (flight warnings keep their text),
// for batch work where neither is reported.
func CalcChosen(o Organism, m media.Properties) (Result, error) {
	var r Result
	err := calc(&r, &o, &m, false)
	return r, err
}

// CalcChosenInto is [CalcChosen] writing into r, whose Warnings slice it
// reuses, for loops over many organisms.
func CalcChosenInto(r *Result, o *Organism, m *media.Properties) error { return calc(r, o, m, false) }

func calc(r *Result, o *Organism, m *media.Properties, all bool) error {
	n := math.NaN()
	note := noter(all)
	*r = Result{Warnings: r.Warnings[:0], Drag: DragResult{Warnings: r.Drag.Warnings[:0]}, Shape: o.Body.Shape, Medium: *m, Strouhal: n, AdvanceRatio: n, ReducedFrequency: n, CoastTime: n, CoastDistance: n, Peclet: n, Diffusivity: n,
		GeneralizedRe: n, BinghamNumber: n, Deborah: n, Weissenberg: n}
	if err := o.Body.Validate(); err != nil {
		return err
	}
	if math.IsInf(o.Speed, 1) { // a speed in body lengths per second times a huge length
		return rangeError("the speed overflows", flowInputs(o)...)
	}
	if !(o.Speed > 0) {
		return fmt.Errorf("regime: speed must be positive, got %g m/s", o.Speed)
	}
	zeroBeat := o.Frequency == 0 && isFlyer(o, m)
	if zeroBeat { // a flyer with a wingbeat frequency of 0 glides (said in the warnings below)
		g := *o
		g.Frequency, g.Gliding = math.NaN(), true
		o = &g
	}
	for i, v := range [...]float64{o.Frequency, o.Amplitude, o.Mass, o.Span, o.WingLength, o.Chord, o.WingArea,
		o.StrokeAngle, o.Diffusivity, o.ShearRate, o.RelaxationTime} {
		if v == v && !(v > 0 && v <= math.MaxFloat64) { // given (not NaN) and not positive and finite
			return fmt.Errorf("regime: %s must be positive, got %g", optionalNames[i], v)
		}
	}
	r.Warnings = append(r.Warnings, m.Warnings...)
	if zeroBeat {
		note.detail(&r.Warnings, WarnModel, media.Detail{Quantity: "wingbeat frequency", Value: 0, Unit: "Hz", Relation: "taken as gliding"}, func() string {
			return "flight: a wingbeat frequency of 0 is taken as gliding: no flapping power"
		})
	}
	l := ChoiceLength(o.Body) // the diameter of a sphere or cylinder, the length of other bodies
	r.ShearRate = o.Speed / l
	if !math.IsNaN(o.ShearRate) {
		r.ShearRate = o.ShearRate
	}
	r.Viscosity = m.ApparentViscosity(r.ShearRate)
	if !(r.Viscosity > 0) || math.IsInf(r.Viscosity, 0) {
		return fmt.Errorf("regime: the medium's apparent viscosity at %.3g 1/s is not a positive number", r.ShearRate)
	}
	var flowPL [2]float64
	if !m.Newtonian() {
		if w := m.ExtrapolationWarning(r.ShearRate); w != nil {
			r.Warnings = append(r.Warnings, *w)
		}
		r.GeneralizedRe = GeneralizedReynolds(m.Rheology, m.Density, o.Speed, l)
		r.BinghamNumber = BinghamNumber(m.Rheology, o.Speed, l)
		if pl, ok := model(m.Rheology).(media.PowerLaw); ok {
			flowPL = [2]float64{pl.K, pl.N}
		}
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
	nu := r.Viscosity / m.Density
	r.Reynolds = Reynolds(o.Speed, l, nu)
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

	// Stroke kinematics.
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
	var wings Wings
	if !math.IsNaN(o.Span) || !math.IsNaN(o.WingLength) {
		wings = o.wings()
	}
	if !math.IsNaN(o.Frequency) && wings.Length > 0 {
		phi := wings.StrokeAngle
		if phi > 0 {
			r.AdvanceRatio = AdvanceRatio(o.Speed, phi, o.Frequency, wings.Length)
		}
		if c := wings.MeanChord(); c > 0 {
			r.ReducedFrequency = ReducedFrequency(o.Frequency, c, o.Speed)
		}
	}

	// Drag.
	flow := Flow{Speed: o.Speed, Density: m.Density, Viscosity: r.Viscosity, PowerLawK: flowPL[0], PowerLawN: flowPL[1]}
	if err := dragInto(&r.Drag, o.Body, flow, all); err != nil {
		return err
	}
	dr := &r.Drag
	r.Warnings = append(r.Warnings, dr.Warnings...)

	// Power.
	switch {
	case isFlyer(o, m):
		in := o.flightInput(*m, r.Viscosity, wings, note)
		in.Drag = dr.Chosen.Force // at this speed, already computed
		fp, err := Flight(in)
		if err != nil {
			return err
		}
		r.Power = Power{Kind: PowerFlight, Total: fp.Total, Flight: &fp}
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
				return "flight: no wingbeat frequency given, so the power is that of continuous flapping; a gliding animal does no flapping work (calc and powercurve take --gliding, a table a wingbeat frequency of 0)"
			})
		}
		r.Warnings = append(r.Warnings, fp.Warnings...)
	case o.Gliding:
		return fmt.Errorf("regime: gliding needs a flyer in air with a mass and a wingspan")
	default:
		if !math.IsNaN(o.Span) && math.IsNaN(o.Mass) {
			note.detail(&r.Warnings, WarnInconsistent, media.Detail{Quantity: "wingspan", Value: o.Span, Unit: "m", Relation: "without a mass: towing power"}, func() string {
				return "inputs: a wingspan without a mass gives no flight power; give the mass (towing power shown instead)"
			})
		}
		eff := o.Efficiency
		r.Power = Power{Kind: PowerSwimming, Efficiency: eff}
		if math.IsNaN(eff) {
			eff = 1
			r.Power = Power{Kind: PowerTowing, Efficiency: 1}
		}
		if !(eff > 0 && eff <= 1) {
			return fmt.Errorf("regime: efficiency must be in (0, 1], got %g", eff)
		}
		r.Power.Total = SwimmingPower(dr.Chosen.Force, o.Speed, eff)
	}

	// Low-Re extras.
	if r.Reynolds < 1 {
		vol := BodyVolume(o.Body)
		mass := o.Mass
		if math.IsNaN(mass) {
			mass = m.Density * vol // neutrally buoyant when no mass is given
		}
		if !math.IsNaN(mass) && !math.IsNaN(vol) {
			c := coast(m, r.ShearRate, mass+0.5*m.Density*vol, o.Speed, dr.Chosen.Force)
			r.CoastTime, r.CoastDistance, r.CoastStops = c.Time, c.Distance, c.Stops
			if math.IsInf(c.Distance, 0) {
				r.CoastDistance = math.NaN()
				note.detail(&r.Warnings, WarnModel, media.Detail{Quantity: "coasting distance", Value: math.NaN(), Relation: "unbounded in this shear-thickening fluid"}, func() string {
					return "coasting: in this shear-thickening fluid creeping-flow drag falls off so fast at low speed that the coasting distance has no bound; none is given"
				})
			}
		}
	}
	switch {
	case !math.IsNaN(o.Diffusivity):
		r.Diffusivity = o.Diffusivity
	case m.Medium == media.KindFreshWater:
		r.Diffusivity = OxygenDiffusivityWater(m.TemperatureC)
	case m.Medium == media.KindSeawater:
		// Sea water's viscosity is pure water's at the same temperature and
		// pressure times the Sharqawy et al. factor, so that factor alone is
		// the viscosity ratio.
		r.Diffusivity = StokesEinsteinScale(OxygenDiffusivityWater(m.TemperatureC), 1, media.SeawaterViscosity(1, m.TemperatureC, m.SalinityAbsolute))
	}
	if !math.IsNaN(r.Diffusivity) {
		r.Peclet = Peclet(o.Speed, l, r.Diffusivity)
	}
	return checkResult(r, o)
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

// optionalNames name the optional values in the order calc checks them.
var optionalNames = [...]string{"frequency", "amplitude", "mass", "span", "wing length", "chord", "wing area",
	"stroke angle", "diffusivity", "shear rate", "relaxation time"}

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
// from lo to hi m/s in steps.
func OrganismPowerCurve(o Organism, m media.Properties, lo, hi float64, steps int) (PowerCurve, error) {
	if !m.Gas || math.IsNaN(o.Mass) || math.IsNaN(o.Span) {
		return PowerCurve{}, fmt.Errorf("regime: a flight power curve needs a flyer in air with a mass and a wingspan")
	}
	if err := o.Body.Validate(); err != nil {
		return PowerCurve{}, err
	}
	var zeroBeat []Warning
	if o.Frequency == 0 {
		o.Frequency, o.Gliding = math.NaN(), true
		zeroBeat = append(zeroBeat, warnf(WarnModel, "flight: a wingbeat frequency of 0 is taken as gliding: no flapping power"))
	}
	in := o.flightInput(m, m.DynamicViscosity, o.wings(), true)
	in.BodyDrag = func(u float64) float64 { // from the drag laws at each speed
		d, err := DragChosen(o.Body, Flow{Speed: u, Density: m.Density, Viscosity: m.DynamicViscosity})
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
	pc.Warnings = append(append(append([]Warning{}, m.Warnings...), zeroBeat...), pc.Warnings...)
	return pc, nil
}
