// Package inputs names the measurements a user can give for an organism and
// its medium, and turns them, from flags or from a table's cells, into the
// library's regime.Organism and media.Conditions. calc and batch share it,
// so a column means exactly what the flag of the same name means.
package inputs

import (
	"fmt"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// Field is one input quantity.
type Field struct {
	Name    string        // canonical name, also the batch column name
	Flag    string        // the calc flag
	Kind    quantity.Kind // how numbers are read; Text fields are not numbers
	Text    bool          // a word, not a number (shape, medium)
	Aliases []string      // other header names; compared by Compact (case, spacing and punctuation ignored)
}

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

// Fields lists every input in a fixed order.
var Fields = []Field{
	{Name: "length", Flag: "length", Kind: quantity.Length, Aliases: []string{"body length", "bl", "size", "body size", "total length", "tl", "standard length", "sl", "fork length", "fl", "l", "len", "snout vent length", "svl", "carapace length", "cl", "mantle length"}},
	{Name: "diameter", Flag: "diameter", Kind: quantity.Length, Aliases: []string{"width", "body width", "max width", "maximum width", "max diameter", "body diameter", "diam", "dia", "body depth", "max body depth", "maximum body depth", "bd"}},
	{Name: "shape", Flag: "shape", Text: true, Aliases: []string{"body shape"}},
	{Name: "speed", Flag: "speed", Kind: quantity.Speed, Aliases: []string{"velocity", "swimming speed", "swim speed", "swimming velocity", "swim velocity", "flight speed", "flight velocity", "airspeed", "air speed", "cruising speed", "u"}},
	{Name: "frequency", Flag: "freq", Kind: quantity.Frequency, Aliases: []string{"freq", "beat frequency", "beat freq", "tailbeat frequency", "tailbeat freq", "wingbeat frequency", "wingbeat freq", "tail wingbeat frequency", "tail wingbeat freq", "finbeat frequency", "finbeat freq", "flukebeat frequency", "tailbeat", "wingbeat", "finbeat", "flukebeat", "tailbeat rate", "wingbeat rate", "stroke frequency", "stroke freq", "flapping frequency", "tbf", "wbf", "fbf", "f"}},
	{Name: "amplitude", Flag: "amplitude", Kind: quantity.Length, Aliases: []string{"amp", "tail amplitude", "tail amp", "tailbeat amplitude", "tailbeat amp", "fluke amplitude", "fluke amp", "fin amplitude", "fin amp", "heave amplitude", "a"}},
	{Name: "mass", Flag: "mass", Kind: quantity.Mass, Aliases: []string{"body mass", "weight", "body weight", "wt", "bm", "m"}},
	{Name: "span", Flag: "span", Kind: quantity.Length, Aliases: []string{"wingspan", "b"}},
	{Name: "wing_length", Flag: "wing-length", Kind: quantity.Length, Aliases: []string{"wing length"}},
	{Name: "chord", Flag: "chord", Kind: quantity.Length, Aliases: []string{"mean chord", "wing chord"}},
	{Name: "wing_area", Flag: "wing-area", Kind: quantity.Area, Aliases: []string{"wing area"}},
	{Name: "stroke_angle", Flag: "stroke-angle", Kind: quantity.Angle, Aliases: []string{"stroke amplitude"}},
	{Name: "efficiency", Flag: "efficiency", Kind: quantity.Fraction, Aliases: []string{"propulsive efficiency", "eta"}},
	{Name: "drag_coefficient", Flag: "drag-coefficient", Kind: quantity.Number, Aliases: []string{"drag coefficient", "cd"}},
	{Name: "area", Flag: "area", Kind: quantity.Area, Aliases: []string{"reference area"}},
	{Name: "induced_factor", Flag: "induced-factor", Kind: quantity.Number, Aliases: []string{"induced factor"}},
	{Name: "profile_drag", Flag: "profile-drag", Kind: quantity.Number, Aliases: []string{"profile drag", "profile drag coefficient"}},
	{Name: "disc", Flag: "disc", Text: true},
	{Name: "diffusivity", Flag: "diffusivity", Kind: quantity.Diffusivity},
	{Name: "medium", Flag: "medium", Text: true, Aliases: []string{"fluid", "medium file"}},
	{Name: "temperature", Flag: "temp", Kind: quantity.Temperature, Aliases: []string{"temp", "t", "water temperature", "water temp", "air temperature", "air temp", "sea surface temperature", "sst"}},
	{Name: "temp_offset", Flag: "temp-offset", Kind: quantity.Temperature, Aliases: []string{"temperature offset"}},
	{Name: "salinity", Flag: "salinity", Kind: quantity.Salinity, Aliases: []string{"sal", "practical salinity", "sea surface salinity", "sss"}},
	{Name: "depth", Flag: "depth", Kind: quantity.Height, Aliases: []string{"water depth", "dive depth", "swimming depth"}},
	{Name: "pressure", Flag: "pressure", Kind: quantity.Pressure, Aliases: []string{"absolute pressure"}},
	{Name: "altitude", Flag: "altitude", Kind: quantity.Height, Aliases: []string{"elevation", "elev", "alt", "flight altitude"}},
	{Name: "humidity", Flag: "humidity", Kind: quantity.Humidity, Aliases: []string{"rh", "relative humidity"}},
	{Name: "latitude", Flag: "latitude", Kind: quantity.Number, Aliases: []string{"lat"}},
	{Name: "shear_rate", Flag: "shear-rate", Kind: quantity.ShearRate, Aliases: []string{"shear rate"}},
	{Name: "relaxation_time", Flag: "relaxation-time", Kind: quantity.Time, Aliases: []string{"relaxation time"}},
}

// Index returns the index of the field with the canonical name, or −1.
func Index(name string) int {
	for i, f := range Fields {
		if f.Name == name {
			return i
		}
	}
	return -1
}

// FieldError is an input that could not be read.
type FieldError struct {
	Field int    // index into Fields
	Label string // "--length" or `column "length (mm)"`
	Err   error
}

func (e *FieldError) Error() string { return e.Label + ": " + e.Err.Error() }
func (e *FieldError) Unwrap() error { return e.Err }

// Source gives the text of a field for one organism: from a flag, or from a
// table cell with the column's unit as default. Label names the origin in
// errors ("--length", `column "length (mm)"`). ok is false when the field is
// not given at all.
type Source interface {
	Lookup(field int) (text, defUnit, label string, ok bool)
}

// Cells is one organism's inputs already read, the form a table row takes
// once its cells are parsed; Build reads it without a call per field. Read
// fills one from any Source.
type Cells struct {
	Given [NumFields]bool           // the field has a value or a text
	Value [NumFields]quantity.Value // numeric fields
	Text  [NumFields]string         // text fields' texts, trimmed
	Err   [NumFields]error          // why a given cell could not be read
	Label [NumFields]string         // where each field comes from, for errors
}

// Read parses every field of src into c.
func (c *Cells) Read(src Source) {
	for f := range c.Given {
		text, unit, label, ok := src.Lookup(f)
		text = strings.TrimSpace(text)
		c.Label[f] = label
		c.Given[f] = ok && text != ""
		c.Value[f], c.Err[f], c.Text[f] = quantity.Value{SI: math.NaN()}, nil, ""
		switch {
		case !c.Given[f]:
		case Fields[f].Text:
			c.Text[f] = text
		default:
			c.Value[f], c.Err[f] = quantity.ParseDefault(Fields[f].Kind, text, unit)
		}
	}
}

// reader takes fields from Cells in Build's order and keeps the first
// error, so that a row's error names the first field that is wrong.
type reader struct {
	c   *Cells
	err error
}

func newReader(src Source) *reader {
	c := new(Cells)
	c.Read(src)
	return &reader{c: c}
}

func (r *reader) value(field int) quantity.Value {
	if !r.c.Given[field] {
		return quantity.Value{SI: math.NaN()}
	}
	return r.given(field)
}

// given reads a field that is given. It is kept out of line so that value
// and num, called for every field of every row, inline to a test for the
// common absent field.
//
//go:noinline
func (r *reader) given(field int) quantity.Value {
	if r.err != nil {
		return quantity.Value{SI: math.NaN()}
	}
	if err := r.c.Err[field]; err != nil {
		r.err = &FieldError{Field: field, Label: r.c.Label[field], Err: err}
		return quantity.Value{SI: math.NaN()}
	}
	return r.c.Value[field]
}

func (r *reader) num(field int) float64 {
	if !r.c.Given[field] {
		return math.NaN()
	}
	return r.given(field).SI
}

// text returns a text field, or "" when it is absent; given reports
// whether any field is, for the required ones.
func (r *reader) text(field int) (string, string) { return r.c.Text[field], r.c.Label[field] }

func (r *reader) has(field int) (bool, string) { return r.c.Given[field], r.c.Label[field] }

// Input is everything needed to compute one organism.
type Input struct {
	Organism   regime.Organism
	Conditions media.Conditions
	Values     []quantity.Value // parsed numeric fields by index (SI NaN when not given); nil unless asked for
}

// Build reads an organism and its medium conditions from src. defaultMedium
// applies when no medium is given. With keep, Values holds every parsed
// field, for uncertainty propagation.
func Build(src Source, defaultMedium string, keep bool) (Input, error) {
	return newReader(src).build(defaultMedium, keep)
}

// BuildCells is [Build] from cells already read.
func BuildCells(c *Cells, defaultMedium string, keep bool) (Input, error) {
	rd := reader{c: c}
	return rd.build(defaultMedium, keep)
}

func (rd *reader) build(defaultMedium string, keep bool) (Input, error) {
	var in Input
	if ok, lengthLabel := rd.has(Length); !ok {
		return in, fmt.Errorf("%s is required, e.g. 12mm (a sphere's diameter, or the body length)", orName(lengthLabel, "length"))
	}
	if ok, speedLabel := rd.has(Speed); !ok {
		return in, fmt.Errorf("%s is required, e.g. 0.4m/s or 3BL/s", orName(speedLabel, "speed"))
	}
	if keep {
		in.Values = make([]quantity.Value, NumFields)
		for i := range in.Values {
			in.Values[i].SI = math.NaN()
		}
	}
	val := func(field int) float64 {
		if !keep {
			return rd.num(field)
		}
		v := rd.value(field)
		in.Values[field] = v
		return v.SI
	}
	length := val(Length)
	dia := val(Diameter)
	sp := rd.value(Speed)
	if rd.err != nil {
		return in, rd.err
	}
	speed := sp.SI
	if sp.PerBodyLength {
		speed *= length
		sp = quantity.Value{SI: speed, SD: sp.SD * length, Unit: "m/s"}
	}
	if keep {
		in.Values[Speed] = sp
	}

	hasCD, _ := rd.has(DragCoefficient)
	hasArea, _ := rd.has(Area)
	shapeText, shapeLabel := rd.text(Shape)
	shape, err := bodyShape(!math.IsNaN(dia), hasCD, hasArea, shapeText, shapeLabel)
	if err != nil {
		return in, err
	}
	b := regime.Body{Shape: shape, Length: length, Diameter: dia}
	if shape == regime.Measured {
		b.DragCoefficient = rd.num(DragCoefficient)
		b.ReferenceArea = rd.num(Area)
	}
	o := regime.NewOrganism(b, speed)
	for _, f := range organismOptional {
		if f.kept {
			*organismField(&o, f.field) = val(f.field)
		} else {
			*organismField(&o, f.field) = rd.num(f.field)
		}
	}
	o.Disc, _ = rd.text(Disc)
	if rd.err != nil {
		return in, rd.err
	}
	if err := checkOrganism(&o, &rd.c.Label); err != nil {
		return in, err
	}
	if err := validBody(b); err != nil {
		return in, err
	}
	in.Organism = o

	medium, _ := rd.text(Medium)
	if medium == "" {
		medium = defaultMedium
	}
	c, err := rd.conditions(medium, in.Values)
	if err != nil {
		return in, err
	}
	in.Conditions = c
	return in, nil
}

// bodyShape is the shape of a body: the named one, else a measured body
// when a drag coefficient or area is given, a spheroid when a diameter is,
// a sphere otherwise. label names the shape's origin in errors.
func bodyShape(hasDia, hasCD, hasArea bool, name, label string) (regime.Shape, error) {
	shape := regime.Sphere
	if hasDia {
		shape = regime.Spheroid
	}
	if hasCD || hasArea {
		shape = regime.Measured
	}
	if name != "" {
		sh, err := regime.ParseShape(name)
		if err != nil {
			return shape, fmt.Errorf("%s: %s", label, strings.TrimPrefix(err.Error(), "regime: "))
		}
		shape = sh
	}
	if shape == regime.Measured && (!hasCD || !hasArea) {
		return shape, fmt.Errorf("a measured body needs both a drag coefficient and its reference area")
	}
	return shape, nil
}

// validBody is regime's check of a body, worded for a user.
func validBody(b regime.Body) error {
	if err := b.Validate(); err != nil {
		return fmt.Errorf("%s", strings.TrimPrefix(err.Error(), "regime: "))
	}
	return nil
}

// checkConditions rejects medium conditions that contradict each other.
func checkConditions(c media.Conditions) error {
	if !math.IsNaN(c.TemperatureC) && !math.IsNaN(c.TemperatureOffset) {
		return fmt.Errorf("a temperature offset applies to the standard-atmosphere temperature; give either a temperature or an offset, not both")
	}
	if !math.IsNaN(c.DepthM) && !math.IsNaN(c.PressurePa) {
		return fmt.Errorf("give either a depth or a pressure, not both")
	}
	return nil
}

// read lists numeric fields in the order they are read, which is the order
// in which a row's first error is named; kept fields go into Input.Values
// for uncertainty propagation.
type read struct {
	field int
	kept  bool
}

// organismOptional are the organism's optional numeric fields.
var organismOptional = [...]read{{Frequency, true}, {Amplitude, true}, {Mass, true}, {Span, true},
	{WingLength, true}, {Chord, true}, {WingArea, true}, {StrokeAngle, true}, {Efficiency, true},
	{InducedFactor, false}, {ProfileDrag, false}, {Diffusivity, false}, {ShearRate, false}, {RelaxationTime, false}}

// conditionFields are the medium's numeric conditions but the temperature
// offset, whose unit matters.
var conditionFields = [...]read{{Temperature, true}, {Salinity, true}, {Depth, true}, {Pressure, true},
	{Altitude, true}, {Humidity, true}, {Latitude, false}}

func orName(label, name string) string {
	if label == "" {
		return name
	}
	return label
}

// Conditions reads the medium fields of src for the named medium.
func Conditions(src Source, medium string) (media.Conditions, error) {
	return newReader(src).conditions(medium, nil)
}

func (rd *reader) conditions(medium string, values []quantity.Value) (media.Conditions, error) {
	c := media.Unset(medium)
	for _, f := range conditionFields {
		if f.kept && values != nil {
			values[f.field] = rd.value(f.field)
			*conditionField(&c, f.field) = values[f.field].SI
		} else {
			*conditionField(&c, f.field) = rd.num(f.field)
		}
	}
	if off := rd.value(TempOffset); !math.IsNaN(off.SI) {
		switch off.Unit {
		case "", "C", "°C", "degC":
			c.TemperatureOffset = off.SI
		case "K":
			c.TemperatureOffset = off.SI + media.ZeroCelsiusK
		default:
			return c, fmt.Errorf("%s: give the offset in K or °C, e.g. 5K", rd.c.Label[TempOffset])
		}
	}
	if rd.err != nil {
		return c, rd.err
	}
	return c, checkConditions(c)
}

// Flags is a Source over flag values keyed by field name.
type Flags map[string]string

var flagLabels = func() []string {
	out := make([]string, len(Fields))
	for i, f := range Fields {
		out[i] = "--" + f.Flag
	}
	return out
}()

// Lookup implements Source.
func (f Flags) Lookup(field int) (string, string, string, bool) {
	if len(f) == 0 {
		return "", "", flagLabels[field], false
	}
	t, ok := f[Fields[field].Name]
	t = strings.TrimSpace(t)
	return t, "", flagLabels[field], ok && t != ""
}

// Positive reports whether a field's values must stay positive, so that its
// uncertainty is drawn log-normally; temperatures, salinities, depths,
// altitudes, humidity and latitude are drawn normally.
func Positive(field int) bool {
	switch field {
	case Temperature, TempOffset, Salinity, Depth, Altitude, Humidity, Latitude:
		return false
	}
	return true
}

// With returns the input with one numeric field set to v (SI units).
func (in Input) With(field int, v float64) Input {
	in.set(field, v)
	return in
}

func (in *Input) set(field int, v float64) {
	if p := in.field(field); p != nil {
		*p = v
	}
}

// Uncertain lists the fields given with an uncertainty, as inputs for
// regime.MonteCarlo or regime.Linear, and their field indices.
func (in Input) Uncertain() ([]regime.UncertainInput, []int) {
	var us []regime.UncertainInput
	var idx []int
	for f, v := range in.Values {
		if v.SD > 0 && !math.IsNaN(v.SI) {
			us = append(us, regime.UncertainInput{Name: Fields[f].Name, Value: v.SI, SD: v.SD, Positive: Positive(f)})
			idx = append(idx, f)
		}
	}
	return us, idx
}

// Evaluator returns a function computing, with regime.CalcChosenInto, the
// result for values of the uncertain fields idx, with the medium from
// lookup (LookupMedium brief, or a cache in front of it) for each. Every call
// sets all of idx, so one copy of the input serves all draws.
func (in Input) Evaluator(idx []int, lookup func(media.Conditions) (*media.Properties, error)) regime.Evaluator {
	d := in
	return func(x []float64, r *regime.Result) error {
		for i, f := range idx {
			d.set(f, x[i])
		}
		m, err := lookup(d.Conditions)
		if err != nil {
			return err
		}
		return regime.CalcChosenInto(r, &d.Organism, m)
	}
}
