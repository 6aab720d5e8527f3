package quantity

import (
	"math"
	"strings"
	"testing"
)

// Conversion factors: SI definitions (BIPM SI Brochure, 9th ed.); the knot
// is 1852 m/h and the foot 0.3048 m exactly (international definitions);
// one standard atmosphere is 101325 Pa exactly.
func TestParse(t *testing.T) {
	cases := []struct {
		k      Kind
		in     string
		si, sd float64
	}{
		{Length, "12mm", 0.012, 0},
		{Length, "12 mm", 0.012, 0},
		{Length, "2.5µm", 2.5e-6, 0},
		{Length, "2.5μm", 2.5e-6, 0}, // Greek mu
		{Length, "2.5um", 2.5e-6, 0},
		{Length, "1.2e-3 m", 1.2e-3, 0},
		{Length, "12±1mm", 0.012, 0.001},
		{Length, "12+-1mm", 0.012, 0.001},
		{Length, "12mm±8%", 0.012, 0.00096},
		{Length, "12mm ± 0.1cm", 0.012, 0.001},
		{Height, "1000ft", 304.8, 0},
		{Speed, "36km/h", 10, 0},
		{Speed, "1kn", 1852.0 / 3600, 0},
		{Speed, "3 BL/s", 3, 0},
		{Speed, "30 µm/s", 30e-6, 0},
		{Temperature, "18", 18, 0},
		{Temperature, "18C", 18, 0},
		{Temperature, "18 °C", 18, 0},
		{Temperature, "291.15K", 18, 0},
		{Temperature, "212F", 100, 0},
		{Temperature, "20±0.5C", 20, 0.5},
		{Temperature, "68F±1F", 20, 5.0 / 9},
		{Temperature, "−1.5C", -1.5, 0},
		{Pressure, "1atm", 101325, 0},
		{Pressure, "1013.25hPa", 101325, 0},
		{Pressure, "100dbar", 1e6, 0},
		{Salinity, "35", 35, 0},
		{Salinity, "35psu", 35, 0},
		{Salinity, "35.16504g/kg", 35, 0},
		{Humidity, "60", 60, 0},
		{Humidity, "60%", 60, 0},
		{Humidity, "60±5%", 60, 5},
		{Mass, "2.5g", 2.5e-3, 0},
		{Mass, "40µg", 40e-9, 0},
		{Frequency, "120/min", 2, 0},
		{Frequency, "8Hz", 8, 0},
		{Density, "1.05g/cm3", 1050, 0},
		{Density, "1050 kg/m³", 1050, 0},
		{Area, "2cm2", 2e-4, 0},
		{Fraction, "0.2", 0.2, 0},
		{Fraction, "20%", 0.2, 0},
		{Number, "0.47", 0.47, 0},
		{Angle, "90", math.Pi / 2, 0},
		{Angle, "90deg", math.Pi / 2, 0},
		{Angle, "1.5rad", 1.5, 0},
		{Diffusivity, "2.1e-5cm2/s", 2.1e-9, 0},
		{Stress, "350mPa", 0.35, 0},
		{Viscosity, "1.2 mPa·s", 1.2e-3, 0},
		{Viscosity, "5cP", 5e-3, 0},
	}
	for _, c := range cases {
		v, err := Parse(c.k, c.in)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.in, err)
			continue
		}
		if math.Abs(v.SI-c.si) > 1e-12*math.Max(1, math.Abs(c.si)) || math.Abs(v.SD-c.sd) > 1e-12*math.Max(1, math.Abs(c.sd)) {
			t.Errorf("Parse(%q) = %g ± %g, want %g ± %g", c.in, v.SI, v.SD, c.si, c.sd)
		}
	}
	if v, _ := Parse(Speed, "3BL/s"); !v.PerBodyLength {
		t.Errorf("BL/s not marked as per body length")
	}
	if v, _ := Parse(Salinity, "35g/kg"); !v.Absolute {
		t.Errorf("g/kg not marked as absolute salinity")
	}
}

func TestParseErrors(t *testing.T) {
	cases := []struct {
		k    Kind
		in   string
		want string
	}{
		{Length, "12", "has no unit; write it with one, for example 12mm"},
		{Speed, "0.4", "has no unit"},
		{Length, "12 furlongs", "unknown unit \"furlongs\"; accepted: nm, µm"},
		{Length, "", "empty length"},
		{Length, "mm", "no number"},
		{Length, "NaN mm", "no number"},
		{Length, "Inf m", "no number"},
		{Length, "1e999 m", "too large a number"},
		{Length, "1.2.3 m", "is not a number"},
		{Length, "12±-1mm", "must not be negative"},
		{Speed, "3BL/s±0.1m/s", "same kind of unit"},
		{Number, "3 mm", "plain number"},
		{Temperature, "20 X", "unknown unit"},
	}
	for _, c := range cases {
		_, err := Parse(c.k, c.in)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Parse(%q) error = %v, want it to contain %q", c.in, err, c.want)
		}
	}
}

// FuzzParse checks that no input makes the parser panic or return a
// non-finite value without an error.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"12mm", "12±1mm", "12mm±8%", "3 BL/s", "20C", "1e-3 m", "±", "+-", "1e", "-", "µ", "35‰"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		for k := Length; k <= Viscosity; k++ {
			v, err := Parse(k, s)
			if err == nil && (math.IsNaN(v.SI) || math.IsInf(v.SI, 0) || math.IsNaN(v.SD) || v.SD < 0) {
				t.Fatalf("Parse(%d, %q) = %+v without error", k, s, v)
			}
		}
	})
}

func TestParseDefault(t *testing.T) {
	cases := []struct {
		in, def string
		si, sd  float64
	}{
		{"12", "mm", 0.012, 0},
		{"12cm", "mm", 0.12, 0},
		{"12±1", "mm", 0.012, 0.001},
		{"12±8%", "mm", 0.012, 0.00096},
	}
	for _, c := range cases {
		v, err := ParseDefault(Length, c.in, c.def)
		if err != nil || math.Abs(v.SI-c.si) > 1e-15 || math.Abs(v.SD-c.sd) > 1e-15 {
			t.Errorf("ParseDefault(%q, %q) = %+v, %v", c.in, c.def, v, err)
		}
	}
	if v, _ := ParseDefault(Temperature, "300", "K"); math.Abs(v.SI-26.85) > 1e-12 {
		t.Errorf("header unit K not applied: %g", v.SI)
	}
}

// An uncertainty with its own unit is converted from that unit, never used
// to reinterpret the value. Expected values are the SI definitions of the
// units (BIPM SI Brochure, 9th ed.: 1 cm = 1e-2 m, 1 mm = 1e-3 m; the
// kelvin and degree Celsius have equal intervals).
func TestUncertaintyKeepsItsOwnUnit(t *testing.T) {
	cases := []struct {
		k        Kind
		in, def  string
		si, sd   float64
		relative bool
	}{
		{Speed, "400±1cm/s", "mm/s", 0.400, 0.010, false},     // value in the column's unit, uncertainty in its own
		{Speed, "400mm/s±1cm/s", "", 0.400, 0.010, false},     // both written
		{Speed, "400±1cm/s", "", 4.00, 0.010, false},          // no column unit: "12±1mm" reads both in cm/s
		{Length, "12mm±8%", "cm", 0.012, 0.00096, true},       // a percentage stays relative
		{Length, "12±8%", "cm", 0.12, 0.0096, true},           // of the value in the column's unit
		{Temperature, "291.15K±0.5C", "", 18, 0.5, false},     // an interval in °C on a value in K
		{Temperature, "18±0.5", "K", 18 - 273.15, 0.5, false}, // the column's unit for both
	}
	for _, c := range cases {
		v, err := ParseDefault(c.k, c.in, c.def)
		if err != nil {
			t.Errorf("ParseDefault(%q, %q): %v", c.in, c.def, err)
			continue
		}
		if math.Abs(v.SI-c.si) > 1e-12*math.Max(1, math.Abs(c.si)) || math.Abs(v.SD-c.sd) > 1e-15 {
			t.Errorf("ParseDefault(%q, %q) = %g ± %g, want %g ± %g", c.in, c.def, v.SI, v.SD, c.si, c.sd)
		}
	}
}

// Uncertainties whose unit is of another kind, or ambiguous beside a bare
// value that has a meaning of its own, are refused with the quantity named.
func TestUncertaintyWrongUnitRefused(t *testing.T) {
	cases := []struct {
		k       Kind
		in, def string
		want    string
	}{
		{Speed, "400±1g", "mm/s", `the uncertainty's unit "g" is not a unit of speed`},
		{Length, "12mm±1s", "", `the uncertainty's unit "s" is not a unit of length`},
		{Temperature, "290±0.5K", "", "the value has no unit but its uncertainty is in K; write the unit on both, for example 290K±0.5K"},
		{Salinity, "35±1g/kg", "", "the value has no unit but its uncertainty is in g/kg"},
		{Speed, "3BL/s±0.1m/s", "", "same kind of unit"},
	}
	for _, c := range cases {
		_, err := ParseDefault(c.k, c.in, c.def)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("ParseDefault(%q, %q) error = %v, want it to contain %q", c.in, c.def, err, c.want)
		}
	}
}

// A separate uncertainty, as an sd column holds it, is converted from its
// own unit, from the sd column's unit, or else taken in the value's unit;
// a percentage is relative. SI unit definitions as above.
func TestWithUncertainty(t *testing.T) {
	mmps, _ := ParseDefault(Speed, "400", "mm/s")
	cases := []struct {
		sd, def string
		want    float64
		err     string
	}{
		{"1cm/s", "", 0.010, ""},
		{"1", "cm/s", 0.010, ""},
		{"1", "", 0.001, ""},
		{"5%", "", 0.020, ""},
		{"1g", "", 0, `the uncertainty's unit "g" is not a unit of speed`},
		{"1", "g", 0, `the uncertainty's unit "g" is not a unit of speed`},
		{"-1", "", 0, "must not be negative"},
		{"0.1BL/s", "", 0, "same kind of unit"},
	}
	for _, c := range cases {
		v, err := WithUncertainty(Speed, mmps, c.sd, c.def)
		if c.err != "" {
			if err == nil || !strings.Contains(err.Error(), c.err) {
				t.Errorf("WithUncertainty(%q, %q) error = %v, want %q", c.sd, c.def, err, c.err)
			}
			continue
		}
		if err != nil || math.Abs(v.SD-c.want) > 1e-15 || v.SI != mmps.SI {
			t.Errorf("WithUncertainty(%q, %q) = %+v, %v; want SD %g", c.sd, c.def, v, err, c.want)
		}
	}
}

// Viscometer units by SI definition (BIPM SI Brochure, 9th ed.): one
// revolution is 2π rad, 1 mL = 1e-6 m³, 1 µL = 1e-9 m³; a bare number is
// refused for each.
func TestViscometerUnits(t *testing.T) {
	cases := []struct {
		k  Kind
		in string
		si float64
	}{
		{Torque, "0.35mN·m", 0.35e-3},
		{Torque, "0.35 mN m", 0.35e-3},
		{Torque, "12µNm", 12e-6},
		{Torque, "2 nN·m", 2e-9},
		{Rotation, "60rpm", 2 * math.Pi},
		{Rotation, "3 rad/s", 3},
		{Rotation, "1rev/s", 2 * math.Pi},
		{VolumeFlow, "0.6mL/min", 1e-8},
		{VolumeFlow, "1 µL/s", 1e-9},
		{VolumeFlow, "2cm³/s", 2e-6},
		{Stress, "2.5Pa", 2.5},
	}
	for _, c := range cases {
		v, err := Parse(c.k, c.in)
		if err != nil || math.Abs(v.SI-c.si) > 1e-12*c.si {
			t.Errorf("%q: %v, %v; want %g", c.in, v.SI, err, c.si)
		}
	}
	for _, k := range []Kind{Torque, Rotation, VolumeFlow} {
		if _, err := Parse(k, "12"); err == nil || !strings.Contains(err.Error(), "for example") {
			t.Errorf("kind %d: a bare number gave %v", k, err)
		}
	}
}
