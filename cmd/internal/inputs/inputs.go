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
	Aliases []string      // other header names, lower case
}

// Fields lists every input in a fixed order.
var Fields = []Field{
	{Name: "length", Flag: "length", Kind: quantity.Length, Aliases: []string{"body length", "bl", "size", "total length", "tl", "standard length", "sl", "fork length", "l"}},
	{Name: "diameter", Flag: "diameter", Kind: quantity.Length, Aliases: []string{"width", "body width", "max diameter", "body diameter"}},
	{Name: "shape", Flag: "shape", Text: true, Aliases: []string{"body shape"}},
	{Name: "speed", Flag: "speed", Kind: quantity.Speed, Aliases: []string{"velocity", "swimming speed", "swim speed", "flight speed", "u"}},
	{Name: "frequency", Flag: "freq", Kind: quantity.Frequency, Aliases: []string{"freq", "beat frequency", "tailbeat frequency", "tail beat frequency", "wingbeat frequency", "tbf", "wbf", "f"}},
	{Name: "amplitude", Flag: "amplitude", Kind: quantity.Length, Aliases: []string{"amp", "tail amplitude", "tail beat amplitude", "a"}},
	{Name: "mass", Flag: "mass", Kind: quantity.Mass, Aliases: []string{"body mass", "weight", "m"}},
	{Name: "span", Flag: "span", Kind: quantity.Length, Aliases: []string{"wingspan", "wing span", "b"}},
	{Name: "wing_length", Flag: "wing-length", Kind: quantity.Length, Aliases: []string{"wing length"}},
	{Name: "chord", Flag: "chord", Kind: quantity.Length, Aliases: []string{"mean chord", "wing chord"}},
	{Name: "wing_area", Flag: "wing-area", Kind: quantity.Area, Aliases: []string{"wing area"}},
	{Name: "stroke_angle", Flag: "stroke-angle", Kind: quantity.Angle, Aliases: []string{"stroke angle", "stroke amplitude"}},
	{Name: "efficiency", Flag: "efficiency", Kind: quantity.Fraction, Aliases: []string{"propulsive efficiency", "eta"}},
	{Name: "drag_coefficient", Flag: "drag-coefficient", Kind: quantity.Number, Aliases: []string{"drag coefficient", "cd"}},
	{Name: "area", Flag: "area", Kind: quantity.Area, Aliases: []string{"reference area"}},
	{Name: "induced_factor", Flag: "induced-factor", Kind: quantity.Number, Aliases: []string{"induced factor"}},
	{Name: "profile_drag", Flag: "profile-drag", Kind: quantity.Number, Aliases: []string{"profile drag", "profile drag coefficient"}},
	{Name: "disc", Flag: "disc", Text: true},
	{Name: "diffusivity", Flag: "diffusivity", Kind: quantity.Diffusivity},
	{Name: "medium", Flag: "medium", Text: true, Aliases: []string{"fluid"}},
	{Name: "temperature", Flag: "temp", Kind: quantity.Temperature, Aliases: []string{"temp", "t", "water temperature", "air temperature", "sst"}},
	{Name: "temp_offset", Flag: "temp-offset", Kind: quantity.Temperature, Aliases: []string{"temperature offset"}},
	{Name: "salinity", Flag: "salinity", Kind: quantity.Salinity, Aliases: []string{"sal"}},
	{Name: "depth", Flag: "depth", Kind: quantity.Height, Aliases: []string{"water depth"}},
	{Name: "pressure", Flag: "pressure", Kind: quantity.Pressure, Aliases: []string{"absolute pressure"}},
	{Name: "altitude", Flag: "altitude", Kind: quantity.Height, Aliases: []string{"elevation", "alt"}},
	{Name: "humidity", Flag: "humidity", Kind: quantity.Humidity, Aliases: []string{"rh", "relative humidity"}},
	{Name: "latitude", Flag: "latitude", Kind: quantity.Number, Aliases: []string{"lat"}},
}

// ByName returns the field with the canonical name.
func ByName(name string) (Field, bool) {
	for _, f := range Fields {
		if f.Name == name {
			return f, true
		}
	}
	return Field{}, false
}

// Source gives the text of a field for one organism: from a flag, or from a
// table cell with the column's unit as default. Label names the origin in
// errors ("--length", `column "length (mm)"`). ok is false when the field is
// not given at all.
type Source interface {
	Lookup(field string) (text, defUnit, label string, ok bool)
}

// reader parses fields from a Source and keeps the first error.
type reader struct {
	src Source
	err error
}

func (r *reader) value(name string) quantity.Value {
	nan := quantity.Value{SI: math.NaN()}
	if r.err != nil {
		return nan
	}
	text, unit, label, ok := r.src.Lookup(name)
	if !ok || strings.TrimSpace(text) == "" {
		return nan
	}
	f, _ := ByName(name)
	v, err := quantity.ParseDefault(f.Kind, text, unit)
	if err != nil {
		r.err = fmt.Errorf("%s: %v", label, err)
		return nan
	}
	return v
}

func (r *reader) num(name string) float64 { return r.value(name).SI }

func (r *reader) text(name string) (string, string) {
	text, _, label, ok := r.src.Lookup(name)
	if !ok {
		return "", label
	}
	return strings.TrimSpace(text), label
}

// Input is everything needed to compute one organism.
type Input struct {
	Organism   regime.Organism
	Conditions media.Conditions
	Values     map[string]quantity.Value // parsed numeric fields that were given, for uncertainty
}

// Build reads an organism and its medium conditions from src. defaultMedium
// applies when no medium is given.
func Build(src Source, defaultMedium string) (Input, error) {
	rd := &reader{src: src}
	var in Input
	lengthText, lengthLabel := rd.text("length")
	if lengthText == "" {
		return in, fmt.Errorf("%s is required, e.g. 12mm (a sphere's diameter, or the body length)", orName(lengthLabel, "length"))
	}
	speedText, speedLabel := rd.text("speed")
	if speedText == "" {
		return in, fmt.Errorf("%s is required, e.g. 0.4m/s or 3BL/s", orName(speedLabel, "speed"))
	}
	in.Values = map[string]quantity.Value{}
	val := func(name string) float64 {
		v := rd.value(name)
		if !math.IsNaN(v.SI) {
			in.Values[name] = v
		}
		return v.SI
	}
	length := val("length")
	dia := val("diameter")
	sp := rd.value("speed")
	if rd.err != nil {
		return in, rd.err
	}
	speed := sp.SI
	if sp.PerBodyLength {
		speed *= length
		sp = quantity.Value{SI: speed, SD: sp.SD * length, Unit: "m/s"}
	}
	in.Values["speed"] = sp

	shape := regime.Sphere
	if !math.IsNaN(dia) {
		shape = regime.Spheroid
	}
	cdText, _ := rd.text("drag_coefficient")
	areaText, _ := rd.text("area")
	if cdText != "" || areaText != "" {
		shape = regime.Measured
	}
	if s, label := rd.text("shape"); s != "" {
		sh, err := regime.ParseShape(s)
		if err != nil {
			return in, fmt.Errorf("%s: %s", label, strings.TrimPrefix(err.Error(), "regime: "))
		}
		shape = sh
	}
	b := regime.Body{Shape: shape, Length: length, Diameter: dia}
	if shape == regime.Measured {
		if cdText == "" || areaText == "" {
			return in, fmt.Errorf("a measured body needs both a drag coefficient and its reference area")
		}
		b.DragCoefficient = rd.num("drag_coefficient")
		b.ReferenceArea = rd.num("area")
	}
	o := regime.NewOrganism(b, speed)
	o.Frequency = val("frequency")
	o.Amplitude = val("amplitude")
	o.Mass = val("mass")
	o.Span = val("span")
	o.WingLength = val("wing_length")
	o.Chord = val("chord")
	o.WingArea = val("wing_area")
	o.StrokeAngle = val("stroke_angle")
	o.Efficiency = val("efficiency")
	o.InducedFactor = rd.num("induced_factor")
	o.ProfileCD = rd.num("profile_drag")
	o.Diffusivity = rd.num("diffusivity")
	o.Disc, _ = rd.text("disc")
	if rd.err != nil {
		return in, rd.err
	}
	if err := b.Validate(); err != nil {
		return in, fmt.Errorf("%s", strings.TrimPrefix(err.Error(), "regime: "))
	}
	in.Organism = o

	medium, _ := rd.text("medium")
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

func orName(label, name string) string {
	if label == "" {
		return name
	}
	return label
}

// Conditions reads the medium fields of src for the named medium.
func Conditions(src Source, medium string) (media.Conditions, error) {
	return (&reader{src: src}).conditions(medium, nil)
}

func (rd *reader) conditions(medium string, values map[string]quantity.Value) (media.Conditions, error) {
	c := media.Unset(strings.ToLower(medium))
	get := func(name string) float64 {
		v := rd.value(name)
		if values != nil && !math.IsNaN(v.SI) {
			values[name] = v
		}
		return v.SI
	}
	c.TemperatureC = get("temperature")
	c.SalinityPractical = get("salinity")
	c.DepthM = get("depth")
	c.PressurePa = get("pressure")
	c.AltitudeM = get("altitude")
	c.HumidityPercent = get("humidity")
	c.LatitudeDeg = rd.num("latitude")
	if off := rd.value("temp_offset"); !math.IsNaN(off.SI) {
		switch off.Unit {
		case "", "C", "°C", "degC":
			c.TemperatureOffset = off.SI
		case "K":
			c.TemperatureOffset = off.SI + media.ZeroCelsiusK
		default:
			_, _, label, _ := rd.src.Lookup("temp_offset")
			return c, fmt.Errorf("%s: give the offset in K or °C, e.g. 5K", label)
		}
	}
	if rd.err != nil {
		return c, rd.err
	}
	if !math.IsNaN(c.TemperatureC) && !math.IsNaN(c.TemperatureOffset) {
		return c, fmt.Errorf("a temperature offset applies to the standard-atmosphere temperature; give either a temperature or an offset, not both")
	}
	if !math.IsNaN(c.DepthM) && !math.IsNaN(c.PressurePa) {
		return c, fmt.Errorf("give either a depth or a pressure, not both")
	}
	return c, nil
}

// Flags is a Source over flag values keyed by field name.
type Flags map[string]string

// Lookup implements Source.
func (f Flags) Lookup(field string) (string, string, string, bool) {
	fl, _ := ByName(field)
	t, ok := f[field]
	return t, "", "--" + fl.Flag, ok && t != ""
}
