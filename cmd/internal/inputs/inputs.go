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
	in := blankInput()
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
	o := &in.Organism
	rd.readInto(&in, Length)
	rd.readInto(&in, Diameter)
	sp := rd.value(Speed)
	if rd.err != nil {
		return in, rd.err
	}
	if sp.PerBodyLength {
		sp = quantity.Value{SI: sp.SI * o.Body.Length, SD: sp.SD * o.Body.Length, Unit: "m/s"}
	}
	o.Speed = sp.SI
	if keep {
		in.Values[Speed] = sp
	}

	// The shape is checked here, from the cells given, so that its error
	// comes before those of the fields read after it; it also says whether
	// the drag coefficient and area are read at all.
	hasCD, _ := rd.has(DragCoefficient)
	hasArea, _ := rd.has(Area)
	shapeText, shapeLabel := rd.text(Shape)
	shape, err := bodyShape(!math.IsNaN(o.Body.Diameter), hasCD, hasArea, shapeText, shapeLabel)
	if err != nil {
		return in, err
	}
	if shape == regime.Measured {
		rd.readInto(&in, DragCoefficient)
		rd.readInto(&in, Area)
	}
	for _, f := range organismOptional {
		rd.readInto(&in, f)
	}
	o.Disc, _ = rd.text(Disc)
	if rd.err != nil {
		return in, rd.err
	}
	if err := finishOrganism(o, shapeText, shapeLabel, &rd.c.Label); err != nil {
		return in, err
	}
	in.Conditions.Medium, _ = rd.text(Medium)
	if err := rd.conditions(&in); err != nil {
		return in, err
	}
	return in, finishConditions(&in.Conditions, defaultMedium)
}

// readInto reads a numeric field into its place in the input and, when
// in.Values is kept and the field is propagated (Field.Kept), into Values.
func (rd *reader) readInto(in *Input, f int) {
	if in.Values != nil && Fields[f].Kept {
		v := rd.value(f)
		in.Values[f] = v
		*in.field(f) = v.SI
		return
	}
	*in.field(f) = rd.num(f)
}

// blankInput is an input with every numeric field not given (NaN): both
// row readers start from it.
func blankInput() Input {
	n := math.NaN()
	return Input{
		Organism:   regime.NewOrganism(regime.Body{Length: n, Diameter: n, DragCoefficient: n, ReferenceArea: n}, n),
		Conditions: media.Unset(""),
	}
}

// finishOrganism completes an organism whose numbers are in place (NaN
// where not given) and checks it: its shape (named by shapeText, else
// from the fields given), the measured body's coefficient and area kept
// only for a measured body, the positivity checks and regime's check of
// the body. Both row readers end with it (Build through BuildCells, and
// Direct), so they agree by construction on every row they both read.
func finishOrganism(o *regime.Organism, shapeText, shapeLabel string, labels *[NumFields]string) error {
	b := &o.Body
	shape, err := bodyShape(!math.IsNaN(b.Diameter), !math.IsNaN(b.DragCoefficient), !math.IsNaN(b.ReferenceArea), shapeText, shapeLabel)
	if err != nil {
		return err
	}
	b.Shape = shape
	if shape != regime.Measured {
		b.DragCoefficient, b.ReferenceArea = 0, 0
	}
	if err := checkOrganism(o, labels); err != nil {
		return err
	}
	return validBody(*b)
}

// finishConditions gives conditions without a medium the default one and
// checks them; both row readers end with it.
func finishConditions(c *media.Conditions, defaultMedium string) error {
	if c.Medium == "" {
		c.Medium = defaultMedium
	}
	return checkConditions(*c)
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
			return shape, fmt.Errorf("%s: %s", label, Reason(err))
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
		return fmt.Errorf("%s", Reason(err))
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

func orName(label, name string) string {
	if label == "" {
		return name
	}
	return label
}

// Conditions reads the medium fields of src for the named medium.
func Conditions(src Source, medium string) (media.Conditions, error) {
	in := blankInput()
	in.Conditions.Medium = medium
	if err := newReader(src).conditions(&in); err != nil {
		return in.Conditions, err
	}
	return in.Conditions, finishConditions(&in.Conditions, medium)
}

// conditions reads the medium's numeric conditions into in.
func (rd *reader) conditions(in *Input) error {
	c := &in.Conditions
	for _, f := range conditionFields {
		rd.readInto(in, f)
	}
	if off := rd.value(TempOffset); !math.IsNaN(off.SI) {
		switch off.Unit {
		case "", "C", "°C", "degC":
			c.TemperatureOffset = off.SI
		case "K":
			c.TemperatureOffset = off.SI + media.ZeroCelsiusK
		default:
			return fmt.Errorf("%s: give the offset in K or °C, e.g. 5K", rd.c.Label[TempOffset])
		}
	}
	return rd.err
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

// Evaluator returns a function computing, with regime.CalcInto (brief), the
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
		return regime.CalcInto(r, d.Organism, m, regime.Options{Brief: true})
	}
}
