// Package quantity reads values with units as people type them on the
// command line and in data sheets ("12 mm", "0.4 m/s", "18 °C", "3.2±0.4 cm",
// "35 psu") and converts them to the SI values the library works in.
//
// A bare number for a dimensional quantity is an error, so a 12 mm fish is
// never read as 12 m. Temperature without a unit is °C, salinity without a
// unit is practical salinity, relative humidity and efficiency without a unit
// are percent and fraction respectively.
package quantity

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/flowregime/flowregime/cmd/internal/decimal"
)

// Kind is the physical quantity a text is read as.
type Kind int

// Quantities that can be parsed.
const (
	Length      Kind = iota // m
	Height                  // m; a depth or altitude, also in feet
	Speed                   // m/s, or body lengths per second
	Temperature             // °C
	Pressure                // Pa
	Salinity                // practical salinity (unitless)
	Humidity                // % relative humidity
	Mass                    // kg
	Frequency               // Hz
	Density                 // kg/m³
	Area                    // m²
	Fraction                // 0–1 (efficiency); also in %
	Number                  // plain number (drag coefficient, factors)
	Time                    // s
	ShearRate               // 1/s
	Angle                   // rad; bare numbers are degrees
	Diffusivity             // m²/s
	Stress                  // Pa (shear stress)
	Viscosity               // Pa·s
	Torque                  // N·m
	Rotation                // angular speed, rad/s; also rpm
	VolumeFlow              // m³/s
)

// Value is a parsed quantity in the library's units (see each Kind).
type Value struct {
	SI            float64 // value in the kind's library unit
	SD            float64 // standard uncertainty, same unit; 0 when none was given
	Unit          string  // the unit as recognised ("mm", "°C", …); "" for a bare number
	PerBodyLength bool    // Speed given in BL/s: SI and SD are body lengths per second
	Absolute      bool    // Salinity given in g/kg (reference composition), already converted to SP
}

type conv struct {
	factor, offset float64 // SI = v*factor + offset
	note           string  // marks special handling
}

var units = map[Kind]map[string]conv{
	Length: {"nm": {1e-9, 0, ""}, "µm": {1e-6, 0, ""}, "um": {1e-6, 0, ""}, "mm": {1e-3, 0, ""}, "cm": {1e-2, 0, ""}, "m": {1, 0, ""}, "km": {1e3, 0, ""}},
	Height: {"mm": {1e-3, 0, ""}, "cm": {1e-2, 0, ""}, "m": {1, 0, ""}, "km": {1e3, 0, ""}, "ft": {0.3048, 0, ""}},
	Speed: {"µm/s": {1e-6, 0, ""}, "um/s": {1e-6, 0, ""}, "mm/s": {1e-3, 0, ""}, "cm/s": {1e-2, 0, ""}, "m/s": {1, 0, ""},
		"km/h": {1 / 3.6, 0, ""}, "kn": {1852.0 / 3600, 0, ""}, "kt": {1852.0 / 3600, 0, ""}, "BL/s": {1, 0, "bl"}},
	Temperature: {"C": {1, 0, ""}, "°C": {1, 0, ""}, "degC": {1, 0, ""}, "K": {1, -273.15, ""}, "F": {5.0 / 9, -32 * 5.0 / 9, ""}, "°F": {5.0 / 9, -32 * 5.0 / 9, ""}},
	Pressure: {"Pa": {1, 0, ""}, "kPa": {1e3, 0, ""}, "hPa": {1e2, 0, ""}, "MPa": {1e6, 0, ""}, "bar": {1e5, 0, ""},
		"mbar": {1e2, 0, ""}, "dbar": {1e4, 0, ""}, "atm": {101325, 0, ""}},
	Salinity:  {"psu": {1, 0, ""}, "PSU": {1, 0, ""}, "g/kg": {35.0 / 35.16504, 0, "abs"}, "‰": {35.0 / 35.16504, 0, "abs"}, "ppt": {35.0 / 35.16504, 0, "abs"}},
	Humidity:  {"%": {1, 0, ""}},
	Mass:      {"µg": {1e-9, 0, ""}, "ug": {1e-9, 0, ""}, "mg": {1e-6, 0, ""}, "g": {1e-3, 0, ""}, "kg": {1, 0, ""}},
	Frequency: {"Hz": {1, 0, ""}, "kHz": {1e3, 0, ""}, "/s": {1, 0, ""}, "1/s": {1, 0, ""}, "/min": {1.0 / 60, 0, ""}, "1/min": {1.0 / 60, 0, ""}},
	Density:   {"kg/m3": {1, 0, ""}, "kg/m³": {1, 0, ""}, "g/cm3": {1e3, 0, ""}, "g/cm³": {1e3, 0, ""}, "g/mL": {1e3, 0, ""}, "g/ml": {1e3, 0, ""}},
	Area:      {"µm2": {1e-12, 0, ""}, "um2": {1e-12, 0, ""}, "mm2": {1e-6, 0, ""}, "cm2": {1e-4, 0, ""}, "m2": {1, 0, ""}, "µm²": {1e-12, 0, ""}, "mm²": {1e-6, 0, ""}, "cm²": {1e-4, 0, ""}, "m²": {1, 0, ""}},
	Fraction:  {"%": {0.01, 0, ""}},
	Number:    {},
	Time:      {"µs": {1e-6, 0, ""}, "us": {1e-6, 0, ""}, "ms": {1e-3, 0, ""}, "s": {1, 0, ""}, "min": {60, 0, ""}, "h": {3600, 0, ""}},
	ShearRate: {"1/s": {1, 0, ""}, "/s": {1, 0, ""}, "s-1": {1, 0, ""}, "s⁻¹": {1, 0, ""}},
	Angle:     {"deg": {math.Pi / 180, 0, ""}, "°": {math.Pi / 180, 0, ""}, "rad": {1, 0, ""}},
	Diffusivity: {"m2/s": {1, 0, ""}, "m²/s": {1, 0, ""}, "cm2/s": {1e-4, 0, ""}, "cm²/s": {1e-4, 0, ""},
		"mm2/s": {1e-6, 0, ""}, "mm²/s": {1e-6, 0, ""}, "µm2/s": {1e-12, 0, ""}, "µm²/s": {1e-12, 0, ""}},
	Stress:    {"mPa": {1e-3, 0, ""}, "Pa": {1, 0, ""}, "kPa": {1e3, 0, ""}, "dyn/cm2": {0.1, 0, ""}},
	Viscosity: {"Pas": {1, 0, ""}, "Pa s": {1, 0, ""}, "Pa·s": {1, 0, ""}, "mPas": {1e-3, 0, ""}, "mPa s": {1e-3, 0, ""}, "mPa·s": {1e-3, 0, ""}, "cP": {1e-3, 0, ""}, "P": {0.1, 0, ""}},
}

// Viscometer quantities, kept apart so that the tables above stay as they
// are; init adds them.
var benchUnits = map[Kind]map[string]conv{
	Torque: {"N·m": {1, 0, ""}, "Nm": {1, 0, ""}, "mN·m": {1e-3, 0, ""}, "mNm": {1e-3, 0, ""}, "µN·m": {1e-6, 0, ""}, "µNm": {1e-6, 0, ""},
		"uN·m": {1e-6, 0, ""}, "uNm": {1e-6, 0, ""}, "nN·m": {1e-9, 0, ""}, "nNm": {1e-9, 0, ""}},
	Rotation: {"rad/s": {1, 0, ""}, "rpm": {2 * math.Pi / 60, 0, ""}, "rev/min": {2 * math.Pi / 60, 0, ""}, "rev/s": {2 * math.Pi, 0, ""}},
	VolumeFlow: {"m3/s": {1, 0, ""}, "m³/s": {1, 0, ""}, "cm3/s": {1e-6, 0, ""}, "cm³/s": {1e-6, 0, ""}, "mm3/s": {1e-9, 0, ""}, "mm³/s": {1e-9, 0, ""},
		"L/s": {1e-3, 0, ""}, "L/min": {1e-3 / 60, 0, ""}, "mL/s": {1e-6, 0, ""}, "ml/s": {1e-6, 0, ""}, "mL/min": {1e-6 / 60, 0, ""}, "ml/min": {1e-6 / 60, 0, ""},
		"µL/s": {1e-9, 0, ""}, "uL/s": {1e-9, 0, ""}, "µL/min": {1e-9 / 60, 0, ""}, "uL/min": {1e-9 / 60, 0, ""}},
}

var benchNames = map[Kind][2]string{ // name, example
	Stress: {"shear stress", "2.5Pa"}, Viscosity: {"viscosity", "1.2mPa·s"},
	Torque: {"torque", "0.35mN·m"}, Rotation: {"angular speed", "60rpm"}, VolumeFlow: {"flow rate", "0.5mL/min"},
}

func init() {
	for k, t := range benchUnits {
		units[k] = t
	}
	for k, ne := range benchNames {
		names[k], examples[k] = ne[0], ne[1]
	}
}

// bareOK lists kinds whose bare numbers have a stated meaning.
var bareOK = map[Kind]bool{Temperature: true, Salinity: true, Humidity: true, Fraction: true, Number: true, Angle: true}

var examples = map[Kind]string{
	Length: "12mm", Height: "250m", Speed: "0.4m/s", Temperature: "18C", Pressure: "101.325kPa",
	Salinity: "35psu", Humidity: "60%", Mass: "2.5g", Frequency: "8Hz", Density: "1050kg/m3",
	Area: "2cm2", Fraction: "0.2", Number: "0.47", Time: "0.5s", ShearRate: "10/s", Angle: "120deg",
	Diffusivity: "2.1e-9m2/s",
}

var names = map[Kind]string{
	Length: "length", Height: "depth or altitude", Speed: "speed", Temperature: "temperature", Pressure: "pressure",
	Salinity: "salinity", Humidity: "relative humidity", Mass: "mass", Frequency: "frequency", Density: "density",
	Area: "area", Fraction: "fraction", Number: "number", Time: "time", ShearRate: "shear rate",
	Angle: "angle", Diffusivity: "diffusivity", Stress: "shear stress", Viscosity: "viscosity",
}

var siUnits = map[Kind]string{
	Length: "m", Height: "m", Speed: "m/s", Temperature: "°C", Pressure: "Pa", Salinity: "practical salinity",
	Humidity: "%", Mass: "kg", Frequency: "Hz", Density: "kg/m³", Area: "m²", Time: "s", ShearRate: "1/s",
	Angle: "rad", Diffusivity: "m²/s", Stress: "Pa", Viscosity: "Pa·s",
}

// SIUnit returns the unit of the library's values of kind k ("" for plain
// numbers and fractions).
func SIUnit(k Kind) string { return siUnits[k] }

// Example returns an accepted way to write a value of kind k.
func Example(k Kind) string { return examples[k] }

// Units lists the units accepted for kind k, in a stable order.
func Units(k Kind) []string {
	order := []string{"nm", "µm", "um", "mm", "cm", "m", "km", "ft", "µm/s", "um/s", "mm/s", "cm/s", "m/s", "km/h", "kn", "kt", "BL/s",
		"C", "°C", "degC", "K", "F", "°F", "Pa", "kPa", "hPa", "MPa", "bar", "mbar", "dbar", "atm", "psu", "PSU", "g/kg", "‰", "ppt", "%",
		"µg", "ug", "mg", "g", "kg", "Hz", "kHz", "/s", "1/s", "/min", "1/min", "kg/m3", "kg/m³", "g/cm3", "g/cm³", "g/mL", "g/ml",
		"µm2", "um2", "mm2", "cm2", "m2", "µm²", "mm²", "cm²", "m²", "µs", "us", "ms", "s", "min", "h", "s-1", "s⁻¹", "deg", "°", "rad",
		"m2/s", "m²/s", "cm2/s", "cm²/s", "mm2/s", "mm²/s", "µm2/s", "µm²/s", "mPa", "dyn/cm2", "Pa·s", "Pa s", "Pas", "mPa·s", "mPa s", "mPas", "cP", "P",
		"N·m", "Nm", "mN·m", "mNm", "µN·m", "µNm", "uN·m", "uNm", "nN·m", "nNm", "rad/s", "rpm", "rev/min", "rev/s",
		"m3/s", "m³/s", "cm3/s", "cm³/s", "mm3/s", "mm³/s", "L/s", "L/min", "mL/s", "ml/s", "mL/min", "ml/min", "µL/s", "uL/s", "µL/min", "uL/min"}
	var out []string
	for _, u := range order {
		if _, ok := units[k][u]; ok {
			out = append(out, u)
		}
	}
	return out
}

// Parse reads text as a value of kind k. Uncertainty may follow the value as
// "±" or "+-" and a second number, in the same unit, in its own unit, or in
// percent of the value: "12±1mm", "12mm+-1mm", "12mm±8%".
func Parse(k Kind, text string) (Value, error) { return ParseDefault(k, text, "") }

// ParseDefault is [Parse] with a default unit for text that carries none,
// as when a data sheet's header says "length (mm)" and its cells hold
// bare numbers. A unit in the text wins over the default. A bare value
// takes the default unit even when its uncertainty has a unit of its own:
// under "speed (mm/s)", "400±1cm/s" is 400 mm/s with 10 mm/s. Only without
// a default does a bare value borrow its uncertainty's unit ("12±1mm"), and
// only for a kind whose bare numbers have no meaning of their own.
func ParseDefault(k Kind, text, defUnit string) (Value, error) {
	table, ok := units[k]
	if !ok {
		return Value{}, fmt.Errorf("unknown quantity kind %d", int(k))
	}
	if f, ok := plainNumber(text); ok && defUnit != "" {
		// Fast path for data sheets: a bare number in the column's unit.
		if c, ok := table[defUnit]; ok {
			return Value{SI: f*c.factor + c.offset, Unit: defUnit, PerBodyLength: c.note == "bl", Absolute: c.note == "abs"}, nil
		}
	}
	s := strings.TrimSpace(strings.ReplaceAll(text, "−", "-"))
	if s == "" {
		return Value{}, fmt.Errorf("empty %s; write a value such as %s", names[k], examples[k])
	}
	if !utf8.ValidString(s) {
		return Value{}, fmt.Errorf("%q is not valid UTF-8 text", text)
	}
	main, unc, hasUnc := splitUncertainty(s)
	num, unit, err := splitNumber(main)
	if err != nil {
		return Value{}, fmt.Errorf("%s %q: %v; write a value such as %s", names[k], text, err, examples[k])
	}
	var sdNum float64
	var sdUnit string
	if hasUnc {
		if sdNum, sdUnit, err = splitUncertaintyNumber(k, unc, text); err != nil {
			return Value{}, err
		}
	}
	switch {
	case unit != "":
	case defUnit != "":
		unit = defUnit
	case hasUnc && sdUnit != "" && sdUnit != "%":
		if bareOK[k] && !sameAsBare(k, sdUnit) {
			return Value{}, fmt.Errorf("%s %q: the value has no unit but its uncertainty is in %s; write the unit on both, for example %s%s±%s", names[k], strings.TrimSpace(text), sdUnit, main, sdUnit, unc)
		}
		unit = sdUnit // "12±1mm": both numbers in mm
	}
	c, err := lookupUnit(k, unit, text)
	if err != nil {
		return Value{}, err
	}
	v := Value{Unit: unit, SI: num*c.factor + c.offset, PerBodyLength: c.note == "bl", Absolute: c.note == "abs"}
	if hasUnc {
		if v.SD, err = uncertaintySI(k, c, unit, num, sdNum, sdUnit, text); err != nil {
			return Value{}, err
		}
	}
	if math.IsNaN(v.SI) || math.IsInf(v.SI, 0) || math.IsNaN(v.SD) || math.IsInf(v.SD, 0) {
		return Value{}, fmt.Errorf("%s %q is not a finite number", names[k], text)
	}
	return v, nil
}

// WithUncertainty returns v with the standard uncertainty read from text,
// as a data sheet gives it in a column of its own: a bare number in
// defUnit (the uncertainty column's unit, else the value's column's), or
// else in v's unit; a number with a unit converted from that unit; a
// percentage relative to v. A unit of another kind of quantity is an
// error.
func WithUncertainty(k Kind, v Value, text, defUnit string) (Value, error) {
	s := strings.TrimSpace(strings.ReplaceAll(text, "−", "-"))
	if !utf8.ValidString(s) {
		return Value{}, fmt.Errorf("%q is not valid UTF-8 text", text)
	}
	sdNum, sdUnit, err := splitUncertaintyNumber(k, s, text)
	if err != nil {
		return Value{}, err
	}
	if sdUnit == "" {
		sdUnit = defUnit
	}
	c, err := lookupUnit(k, v.Unit, v.Unit)
	if err != nil {
		return Value{}, err
	}
	num := (v.SI - c.offset) / c.factor
	if v.SD, err = uncertaintySI(k, c, v.Unit, num, sdNum, sdUnit, text); err != nil {
		return Value{}, err
	}
	if math.IsNaN(v.SD) || math.IsInf(v.SD, 0) {
		return Value{}, fmt.Errorf("%s uncertainty %q is not a finite number", names[k], text)
	}
	return v, nil
}

// sameAsBare reports whether unit means what a bare number of kind k means
// ("°C" for a temperature), so that "18±0.5°C" is not ambiguous.
func sameAsBare(k Kind, unit string) bool {
	bare, err := lookupUnit(k, "", "")
	if err != nil {
		return false
	}
	c, ok := units[k][unit]
	if !ok {
		c, ok = units[k][normalise(unit)]
	}
	return ok && c == bare
}

// splitUncertaintyNumber reads the number and unit of an uncertainty.
func splitUncertaintyNumber(k Kind, unc, text string) (float64, string, error) {
	sdNum, sdUnit, err := splitNumber(unc)
	if err != nil {
		return 0, "", fmt.Errorf("%s %q: uncertainty: %v; write it as 12±1mm or 12mm±8%%", names[k], text, err)
	}
	if sdNum < 0 {
		return 0, "", fmt.Errorf("%s %q: uncertainty must not be negative", names[k], text)
	}
	return sdNum, sdUnit, nil
}

// uncertaintySI converts an uncertainty sdNum in sdUnit to the library's
// unit, for a value num in unit with conversion c: a percentage is relative
// to the value (but for relative humidity and a fraction in %, where % is
// the value's own unit), a bare number is in the value's unit, and another
// unit converts as a difference (no offset). A unit of another kind of
// quantity, or body lengths against an absolute speed, is an error.
func uncertaintySI(k Kind, c conv, unit string, num, sdNum float64, sdUnit, text string) (float64, error) {
	switch {
	case sdUnit == "%" && k != Humidity && !(k == Fraction && unit == "%"):
		return math.Abs(num*c.factor) * sdNum / 100, nil
	case sdUnit == "" || sdUnit == unit:
		return sdNum * c.factor, nil
	}
	sc, ok := units[k][sdUnit]
	if !ok {
		sc, ok = units[k][normalise(sdUnit)]
	}
	if !ok {
		return 0, fmt.Errorf("%s %q: the uncertainty's unit %q is not a unit of %s; accepted: %s, or %%", names[k], strings.TrimSpace(text), sdUnit, names[k], strings.Join(Units(k), ", "))
	}
	if sc.note != c.note {
		return 0, fmt.Errorf("%s %q: value and uncertainty must be of the same kind of unit", names[k], text)
	}
	return sdNum * sc.factor, nil // a difference: no offset
}

func lookupUnit(k Kind, unit, text string) (conv, error) {
	if unit == "" {
		if k == Angle {
			return units[Angle]["deg"], nil
		}
		if bareOK[k] {
			return conv{factor: 1}, nil
		}
		return conv{}, fmt.Errorf("%s %q has no unit; write it with one, for example %s (accepted: %s)", names[k], strings.TrimSpace(text), examples[k], strings.Join(Units(k), ", "))
	}
	c, ok := units[k][unit]
	if !ok {
		c, ok = units[k][normalise(unit)]
	}
	if !ok {
		accepted := strings.Join(Units(k), ", ")
		if bareOK[k] && k != Number {
			accepted += ", or a bare number"
		}
		if k == Number {
			return conv{}, fmt.Errorf("%s %q must be a plain number without a unit, for example %s", names[k], strings.TrimSpace(text), examples[k])
		}
		return conv{}, fmt.Errorf("%s %q: unknown unit %q; accepted: %s", names[k], strings.TrimSpace(text), unit, accepted)
	}
	return c, nil
}

var spellings = strings.NewReplacer("μ", "µ", "·", "", " ", "", "^", "", "**", "")

// normalise maps common spellings onto the table's keys.
func normalise(u string) string {
	u = spellings.Replace(u)
	switch strings.ToLower(u) {
	case "bl/s", "bls-1", "bl s-1", "l/s", "bodylengths/s":
		return "BL/s"
	case "ms-1":
		return "m/s"
	case "kmh", "kph", "km/hr":
		return "km/h"
	case "knot", "knots", "kts":
		return "kn"
	case "kgm-3":
		return "kg/m3"
	case "gcm-3":
		return "g/cm3"
	case "hz":
		return "Hz"
	case "deg c", "degc", "celsius":
		return "C"
	case "kelvin":
		return "K"
	case "pa":
		return "Pa"
	case "kpa":
		return "kPa"
	case "hpa":
		return "hPa"
	case "percent":
		return "%"
	case "per min", "perminute":
		return "/min"
	case "s^-1":
		return "1/s"
	}
	return u
}

// splitUncertainty splits "12±1mm" into "12", "1mm"; "12mm±8%" into "12mm", "8%".
func splitUncertainty(s string) (main, unc string, ok bool) {
	for _, sep := range []string{"±", "+-", "+/-"} {
		if i := strings.Index(s, sep); i > 0 {
			return strings.TrimSpace(s[:i]), strings.TrimSpace(s[i+len(sep):]), true
		}
	}
	return s, "", false
}

// splitNumber splits "12.5mm" or "12.5 mm" or "-3e-2 K" into its number and unit.
func splitNumber(s string) (float64, string, error) {
	s = strings.TrimSpace(s)
	end := 0
	for end < len(s) {
		c := s[end]
		if c >= '0' && c <= '9' || c == '.' || c == '+' || c == '-' {
			end++
			continue
		}
		if (c == 'e' || c == 'E') && end > 0 && end+1 < len(s) {
			n := s[end+1]
			if n >= '0' && n <= '9' || ((n == '-' || n == '+') && end+2 < len(s) && s[end+2] >= '0' && s[end+2] <= '9') {
				end += 2
				continue
			}
		}
		break
	}
	if end == 0 {
		return 0, "", fmt.Errorf("no number")
	}
	num := s[:end]
	unit := strings.TrimSpace(s[end:])
	f, err := strconv.ParseFloat(num, 64)
	if errors.Is(err, strconv.ErrRange) {
		return 0, "", fmt.Errorf("%q is too large a number (beyond about 1.8e308)", num)
	}
	if err != nil {
		return 0, "", fmt.Errorf("%q is not a number", num)
	}
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return 0, "", fmt.Errorf("not a finite number")
	}
	for _, r := range unit {
		if unicode.IsControl(r) {
			return 0, "", fmt.Errorf("control character in unit")
		}
	}
	return f, unit, nil
}

// KnownUnit reports whether u is an accepted unit of kind k.
func KnownUnit(k Kind, u string) bool {
	if _, ok := units[k][u]; ok {
		return true
	}
	_, ok := units[k][normalise(u)]
	return ok
}

// Conv converts numbers in one unit of one kind to the library's unit.
type Conv struct {
	c    conv
	tmpl Value // Unit and flags of every converted value
}

// Resolve returns the conversion for unit (or the kind's bare-number
// meaning when unit is empty), so that a column of plain numbers can be
// converted without a lookup per cell.
func Resolve(k Kind, unit string) (Conv, bool) {
	if unit == "" {
		if k == Angle {
			return Conv{c: units[Angle]["deg"]}, true
		}
		if bareOK[k] {
			return Conv{c: conv{factor: 1}}, true
		}
		return Conv{}, false
	}
	c, ok := units[k][unit]
	if !ok {
		c, ok = units[k][normalise(unit)]
	}
	return Conv{c: c, tmpl: Value{Unit: unit, PerBodyLength: c.note == "bl", Absolute: c.note == "abs"}}, ok
}

// Apply converts a plain number.
func (c *Conv) Apply(v float64) Value {
	out := c.tmpl
	out.SI = c.SI(v)
	return out
}

// PerBodyLength reports whether the unit is body lengths (per second).
func (c *Conv) PerBodyLength() bool { return c.tmpl.PerBodyLength }

// SI converts a plain number to the library's unit; Apply's Value has the
// unit and flags as well.
func (c *Conv) SI(v float64) float64 { return v*c.c.factor + c.c.offset }

// PlainNumber parses text made only of an ASCII decimal number, the fast
// path for data sheets; anything else (units, uncertainty, NaN) is false.
func PlainNumber(text string) (float64, bool) { return plainNumber(text) }

// plainNumber parses text made only of an ASCII decimal number.
func plainNumber(text string) (float64, bool) {
	if text == "" || len(text) > 32 {
		return 0, false
	}
	f, ok := decimal.Parse(text)
	if !ok || math.IsInf(f, 0) {
		return 0, false
	}
	return f, true
}
