package inputs

import (
	"fmt"
	"unsafe"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// Field is one input quantity: everything the flags, the table columns,
// Build, Direct, the positivity checks and uncertainty propagation need to
// know about it. A new quantity is a constant below and a row of Fields;
// nothing else names it unless it needs reading of its own (the length,
// speed and shape do).
type Field struct {
	Name    string        // canonical name, also the batch column name
	Flag    string        // the flag's name
	Kind    quantity.Kind // how numbers are read; Text fields are not numbers
	Text    bool          // a word, not a number (shape, medium)
	Aliases []string      // other header names; compared by Compact (case, spacing and punctuation ignored)

	Group   Group  // which commands bind the flag from Help and Default
	Help    string // the flag's help text
	Default string // the flag's default text

	// Where a numeric field is kept: in the organism or in the medium
	// conditions (exactly one of them).
	organism  func(*regime.Organism) *float64
	condition func(*media.Conditions) *float64

	Check  Check // what a given value must satisfy
	Normal bool  // its uncertainty is drawn normally (the value may be zero or negative); otherwise log-normally
	Kept   bool  // kept in Input.Values by Build, so that its uncertainty is propagated
}

// Group says which commands bind a field's flag from the table.
type Group int

// Flag groups.
const (
	OwnFlag      Group = iota // each command binds the flag itself (the medium's name)
	OrganismFlag              // the organism's flags (calc, batch, sweep, …)
	MediumFlag                // the medium conditions' flags (every command with a medium)
)

// Check is what a given value of a field must satisfy.
type Check int

// Checks.
const (
	AnyValue  Check = iota
	AboveZero       // sizes, speeds and rates
	Fraction        // in (0, 1]: an efficiency
)

// Field indices, in the order of Fields.
const (
	Length = iota
	Diameter
	Shape
	Speed
	Frequency
	Amplitude
	Mass
	Span
	WingLength
	Chord
	WingArea
	StrokeAngle
	Efficiency
	DragCoefficient
	Area
	InducedFactor
	ProfileDrag
	Disc
	Diffusivity
	Medium
	Temperature
	TempOffset
	Salinity
	Depth
	Pressure
	Altitude
	Humidity
	Latitude
	ShearRate
	RelaxationTime
	NumFields
)

// Fields lists every input, indexed by the constants above.
var Fields = []Field{
	Length: {Name: "length", Flag: "length", Kind: quantity.Length, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "characteristic length: body length, or the diameter of a sphere, e.g. 12mm",
		organism: func(o *regime.Organism) *float64 { return &o.Body.Length },
		Aliases:  []string{"body length", "bl", "size", "body size", "total length", "tl", "standard length", "sl", "fork length", "fl", "l", "len", "snout vent length", "svl", "carapace length", "cl", "mantle length"}},
	Diameter: {Name: "diameter", Flag: "diameter", Kind: quantity.Length, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "maximum body diameter (spheroid, rod, cylinder), e.g. 2.5mm",
		organism: func(o *regime.Organism) *float64 { return &o.Body.Diameter },
		Aliases:  []string{"width", "body width", "max width", "maximum width", "max diameter", "body diameter", "diam", "dia", "body depth", "max body depth", "maximum body depth", "bd"}},
	Shape: {Name: "shape", Flag: "shape", Text: true, Group: OrganismFlag,
		Help:    "sphere, spheroid, rod, cylinder or measured (default: spheroid with --diameter, else sphere)",
		Aliases: []string{"body shape"}},
	Speed: {Name: "speed", Flag: "speed", Kind: quantity.Speed, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "swimming or flight speed, e.g. 0.4m/s, 30um/s, 3BL/s",
		organism: func(o *regime.Organism) *float64 { return &o.Speed },
		Aliases:  []string{"velocity", "swimming speed", "swim speed", "swimming velocity", "swim velocity", "flight speed", "flight velocity", "airspeed", "air speed", "cruising speed", "u"}},
	Frequency: {Name: "frequency", Flag: "freq", Kind: quantity.Frequency, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "tail-beat or wingbeat frequency, e.g. 8Hz, 120/min (0 for a flyer: gliding)",
		organism: func(o *regime.Organism) *float64 { return &o.Frequency },
		Aliases:  []string{"freq", "beat frequency", "beat freq", "tailbeat frequency", "tailbeat freq", "wingbeat frequency", "wingbeat freq", "tail wingbeat frequency", "tail wingbeat freq", "finbeat frequency", "finbeat freq", "flukebeat frequency", "tailbeat", "wingbeat", "finbeat", "flukebeat", "tailbeat rate", "wingbeat rate", "stroke frequency", "stroke freq", "flapping frequency", "tbf", "wbf", "fbf", "f"}},
	Amplitude: {Name: "amplitude", Flag: "amplitude", Kind: quantity.Length, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "peak-to-peak tail-tip or wing-tip excursion, e.g. 4cm",
		organism: func(o *regime.Organism) *float64 { return &o.Amplitude },
		Aliases:  []string{"amp", "tail amplitude", "tail amp", "tailbeat amplitude", "tailbeat amp", "fluke amplitude", "fluke amp", "fin amplitude", "fin amp", "heave amplitude", "a"}},
	Mass: {Name: "mass", Flag: "mass", Kind: quantity.Mass, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "body mass, e.g. 20g",
		organism: func(o *regime.Organism) *float64 { return &o.Mass },
		Aliases:  []string{"body mass", "weight", "body weight", "wt", "bm", "m"}},
	Span: {Name: "span", Flag: "span", Kind: quantity.Length, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "wingspan tip to tip (flyers), e.g. 35cm",
		organism: func(o *regime.Organism) *float64 { return &o.Span },
		Aliases:  []string{"wingspan", "b"}},
	WingLength: {Name: "wing_length", Flag: "wing-length", Kind: quantity.Length, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "one wing, root to tip (default: half the span), e.g. 2.5mm",
		organism: func(o *regime.Organism) *float64 { return &o.WingLength },
		Aliases:  []string{"wing length"}},
	Chord: {Name: "chord", Flag: "chord", Kind: quantity.Length, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "mean wing chord, e.g. 8cm",
		organism: func(o *regime.Organism) *float64 { return &o.Chord },
		Aliases:  []string{"mean chord", "wing chord"}},
	WingArea: {Name: "wing_area", Flag: "wing-area", Kind: quantity.Area, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "area of both wings, e.g. 200cm2 (or give --chord)",
		organism: func(o *regime.Organism) *float64 { return &o.WingArea },
		Aliases:  []string{"wing area"}},
	StrokeAngle: {Name: "stroke_angle", Flag: "stroke-angle", Kind: quantity.Angle, Group: OrganismFlag, Check: AboveZero, Kept: true,
		Help:     "peak-to-peak wing stroke amplitude, e.g. 120deg (default: from --amplitude and wing length)",
		organism: func(o *regime.Organism) *float64 { return &o.StrokeAngle },
		Aliases:  []string{"stroke amplitude"}},
	Efficiency: {Name: "efficiency", Flag: "efficiency", Kind: quantity.Fraction, Group: OrganismFlag, Check: Fraction, Kept: true,
		Help:     "propulsive efficiency of a swimmer, 0–1 or % (default 1: towing power)",
		organism: func(o *regime.Organism) *float64 { return &o.Efficiency },
		Aliases:  []string{"propulsive efficiency", "eta"}},
	DragCoefficient: {Name: "drag_coefficient", Flag: "drag-coefficient", Kind: quantity.Number, Group: OrganismFlag,
		Help:     "measured drag coefficient (with --area; sets --shape measured)",
		organism: func(o *regime.Organism) *float64 { return &o.Body.DragCoefficient },
		Aliases:  []string{"drag coefficient", "cd"}},
	Area: {Name: "area", Flag: "area", Kind: quantity.Area, Group: OrganismFlag,
		Help:     "reference area of the measured drag coefficient, e.g. 3cm2",
		organism: func(o *regime.Organism) *float64 { return &o.Body.ReferenceArea },
		Aliases:  []string{"reference area"}},
	InducedFactor: {Name: "induced_factor", Flag: "induced-factor", Kind: quantity.Number, Group: OrganismFlag, Check: AboveZero,
		Help:     fmt.Sprintf("induced-power factor k of flight (default %g, common practice)", regime.DefaultInducedFactor),
		organism: func(o *regime.Organism) *float64 { return &o.InducedFactor },
		Aliases:  []string{"induced factor"}},
	ProfileDrag: {Name: "profile_drag", Flag: "profile-drag", Kind: quantity.Number, Group: OrganismFlag, Check: AboveZero,
		Help:     "profile-drag coefficient of the wings (default: Pennycuick's profile power ratio 8.4/aspect ratio; given, the blade-element method)",
		organism: func(o *regime.Organism) *float64 { return &o.ProfileCD },
		Aliases:  []string{"profile drag", "profile drag coefficient"}},
	Disc: {Name: "disc", Flag: "disc", Text: true, Group: OrganismFlag, Default: regime.DiscSpan,
		Help: "actuator disc of flight: span (circle of the wingspan) or stroke (area swept by the wings)"},
	Diffusivity: {Name: "diffusivity", Flag: "diffusivity", Kind: quantity.Diffusivity, Group: OrganismFlag, Check: AboveZero,
		Help:     "solute diffusivity for the Péclet number, e.g. 2e-9m2/s (default: dissolved O2 in water)",
		organism: func(o *regime.Organism) *float64 { return &o.Diffusivity }},
	Medium: {Name: "medium", Flag: "medium", Text: true, Aliases: []string{"fluid", "medium file"}},
	Temperature: {Name: "temperature", Flag: "temp", Kind: quantity.Temperature, Group: MediumFlag, Normal: true, Kept: true,
		Help:      "temperature, e.g. 12C, 285K, 54F (bare number: °C)",
		condition: func(c *media.Conditions) *float64 { return &c.TemperatureC },
		Aliases:   []string{"temp", "t", "water temperature", "water temp", "air temperature", "air temp", "sea surface temperature", "sst"}},
	TempOffset: {Name: "temp_offset", Flag: "temp-offset", Kind: quantity.Temperature, Group: MediumFlag, Normal: true,
		Help:      "air only: offset from the standard-atmosphere temperature, e.g. 5K",
		condition: func(c *media.Conditions) *float64 { return &c.TemperatureOffset },
		Aliases:   []string{"temperature offset"}},
	Salinity: {Name: "salinity", Flag: "salinity", Kind: quantity.Salinity, Group: MediumFlag, Normal: true, Kept: true,
		Help:      "sea water: 35psu (practical) or 35g/kg (reference composition); bare number is practical",
		condition: func(c *media.Conditions) *float64 { return &c.SalinityPractical },
		Aliases:   []string{"sal", "practical salinity", "sea surface salinity", "sss"}},
	Depth: {Name: "depth", Flag: "depth", Kind: quantity.Height, Group: MediumFlag, Normal: true, Kept: true,
		Help:      "water: depth below the surface, e.g. 30m, 100ft",
		condition: func(c *media.Conditions) *float64 { return &c.DepthM },
		Aliases:   []string{"water depth", "dive depth", "swimming depth"}},
	Pressure: {Name: "pressure", Flag: "pressure", Kind: quantity.Pressure, Group: MediumFlag, Kept: true,
		Help:      "absolute pressure, e.g. 101.325kPa, 2bar, 1atm",
		condition: func(c *media.Conditions) *float64 { return &c.PressurePa },
		Aliases:   []string{"absolute pressure"}},
	Altitude: {Name: "altitude", Flag: "altitude", Kind: quantity.Height, Group: MediumFlag, Normal: true, Kept: true,
		Help:      "geometric altitude above mean sea level, e.g. 1500m, 5000ft",
		condition: func(c *media.Conditions) *float64 { return &c.AltitudeM },
		Aliases:   []string{"elevation", "elev", "alt", "flight altitude"}},
	Humidity: {Name: "humidity", Flag: "humidity", Kind: quantity.Humidity, Group: MediumFlag, Normal: true, Kept: true,
		Help:      "air only: relative humidity, e.g. 60% (bare number: %)",
		condition: func(c *media.Conditions) *float64 { return &c.HumidityPercent },
		Aliases:   []string{"rh", "relative humidity"}},
	Latitude: {Name: "latitude", Flag: "latitude", Kind: quantity.Number, Group: MediumFlag, Normal: true,
		Help:      "sea water with --depth: latitude in degrees for gravity (default 45)",
		condition: func(c *media.Conditions) *float64 { return &c.LatitudeDeg },
		Aliases:   []string{"lat"}},
	ShearRate: {Name: "shear_rate", Flag: "shear-rate", Kind: quantity.ShearRate, Group: OrganismFlag, Check: AboveZero,
		Help:     "measured medium: characteristic shear rate (default: speed/length), e.g. 5/s",
		organism: func(o *regime.Organism) *float64 { return &o.ShearRate },
		Aliases:  []string{"shear rate"}},
	RelaxationTime: {Name: "relaxation_time", Flag: "relaxation-time", Kind: quantity.Time, Group: OrganismFlag, Check: AboveZero,
		Help:     "viscoelastic medium: relaxation time for the Deborah and Weissenberg numbers, e.g. 0.3s",
		organism: func(o *regime.Organism) *float64 { return &o.RelaxationTime },
		Aliases:  []string{"relaxation time"}},
}

// Lists derived from Fields, each in the order of Fields (the order in
// which a row's first error is named).
var (
	// organismOptional are the organism's optional numbers: all but the
	// length, diameter and speed, read before the shape, and the measured
	// body's coefficient and area, read only for a measured body.
	organismOptional = fieldsWhere(func(i int, f Field) bool {
		return f.organism != nil && i != Length && i != Diameter && i != Speed && i != DragCoefficient && i != Area
	})
	// conditionFields are the medium's numeric conditions but the
	// temperature offset, whose unit matters.
	conditionFields = fieldsWhere(func(i int, f Field) bool { return f.condition != nil && i != TempOffset })
	// aboveZero and fractions are the organism's fields checked by
	// checkOrganism, all above-zero ones first.
	aboveZero = fieldsWhere(func(_ int, f Field) bool { return f.Check == AboveZero })
	fractions = fieldsWhere(func(_ int, f Field) bool { return f.Check == Fraction })
)

func fieldsWhere(keep func(int, Field) bool) []int {
	var out []int
	for i, f := range Fields {
		if keep(i, f) {
			out = append(out, i)
		}
	}
	return out
}

// organismField returns where a numeric field of the organism is kept, or
// nil.
func organismField(o *regime.Organism, f int) *float64 {
	if off := places[f].organism; off >= 0 {
		return (*float64)(unsafe.Add(unsafe.Pointer(o), off))
	}
	return nil
}

// conditionField returns where a numeric condition of the medium is kept,
// or nil.
func conditionField(c *media.Conditions, f int) *float64 {
	if off := places[f].condition; off >= 0 {
		return (*float64)(unsafe.Add(unsafe.Pointer(c), off))
	}
	return nil
}

// place is where a field is kept, as byte offsets into regime.Organism and
// media.Conditions (−1: not there).
type place struct{ organism, condition int }

// places are measured once from the table's accessors, so that reading a
// row calls no function through a pointer: such a call would move the
// row's organism and conditions to the heap, an allocation per row.
var places = func() (out [NumFields]place) {
	var o regime.Organism
	var c media.Conditions
	for i, f := range Fields {
		out[i] = place{-1, -1}
		if f.organism != nil {
			out[i].organism = int(uintptr(unsafe.Pointer(f.organism(&o))) - uintptr(unsafe.Pointer(&o)))
		}
		if f.condition != nil {
			out[i].condition = int(uintptr(unsafe.Pointer(f.condition(&c))) - uintptr(unsafe.Pointer(&c)))
		}
	}
	return out
}()

// field returns where a numeric field is kept in the Input.
func (in *Input) field(f int) *float64 {
	if p := conditionField(&in.Conditions, f); p != nil {
		return p
	}
	return organismField(&in.Organism, f)
}

// Positive reports whether a field's values must stay positive, so that its
// uncertainty is drawn log-normally; temperatures, salinities, depths,
// altitudes, humidity and latitude are drawn normally.
func Positive(field int) bool { return !Fields[field].Normal }

// MustBePositive reports whether a field's values must be above zero.
func MustBePositive(field int) bool { return Fields[field].Check != AnyValue }
