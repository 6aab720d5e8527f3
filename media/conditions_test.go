package media

import (
	"errors"
	"math"
	"testing"
)

// assumed returns the defaults of p by field.
func assumed(p Properties) map[Field]float64 {
	m := map[Field]float64{}
	for _, d := range p.Assumed {
		m[d.Field] = d.Value
	}
	return m
}

// A struct literal with only the known fields works: sea water at 25 °C and
// practical salinity 35 at the surface is the UNESCO (1981) Tech. Pap. Mar.
// Sci. 38 check value ρ(35, 25 °C, 0) = 1023.34306 kg/m³. That value is on
// IPTS-68; 25 °C on ITS-90 is 25.006 °C on IPTS-68, about 0.002 kg/m³ less,
// so the tolerance is 0.005 kg/m³.
func TestZeroValueConditionsSeawater(t *testing.T) {
	p, err := Lookup(Conditions{Medium: KindSeawater, TemperatureC: 25, SalinityPractical: 35})
	if err != nil {
		t.Fatal(err)
	}
	checkAbs(t, "ρ(35, 25 °C, surface)", p.Density, 1023.34306, 5e-3)
	a := assumed(p)
	for f, want := range map[Field]float64{FieldDepth: 0, FieldAltitude: 0, FieldPressure: StandardPressurePa} {
		if got, ok := a[f]; !ok || got != want {
			t.Errorf("default %s: got %v (listed %v), want %v", f, got, ok, want)
		}
	}
	if _, ok := a[FieldTemperature]; ok {
		t.Errorf("temperature was given but is listed as a default: %v", p.Assumed)
	}
}

// The literal of the issue, sea water at 12 °C, answers with the default
// salinity (35 g/kg of reference-composition salinity) listed as assumed,
// and equals the same conditions given the NaN way.
func TestZeroValueConditionsEqualUnset(t *testing.T) {
	lit, err := Lookup(Conditions{Medium: KindSeawater, TemperatureC: 12})
	if err != nil {
		t.Fatal(err)
	}
	c := Unset(KindSeawater)
	c.TemperatureC = 12
	nan, err := Lookup(c)
	if err != nil {
		t.Fatal(err)
	}
	if lit.Density != nan.Density || lit.DynamicViscosity != nan.DynamicViscosity {
		t.Errorf("literal %v %v, NaN form %v %v", lit.Density, lit.DynamicViscosity, nan.Density, nan.DynamicViscosity)
	}
	if got := assumed(lit)[FieldSalinity]; math.Abs(got-PracticalFromAbsolute(DefaultSalinityGkg)) > 1e-12 {
		t.Errorf("assumed salinity %v, want SP of 35 g/kg", got)
	}
}

// A zero temperature is the default (20 °C, listed) unless stated; stated,
// it is 0 °C. Fresh water at 20 °C and 1 atm: 998.2067 kg/m³ (Tanaka et al.
// 2001, Metrologia 38, 301, Table 1, air-free, printed to 1e-4 kg/m³; IF97
// agrees to 2e-5).
func TestStatedZeroTemperature(t *testing.T) {
	omitted, err := Lookup(Conditions{Medium: KindFreshWater})
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "ρ(20 °C default)", omitted.Density, 998.2067, 2e-5)
	if got, ok := assumed(omitted)[FieldTemperature]; !ok || got != DefaultWaterTemperatureC {
		t.Errorf("default temperature not listed: %v", omitted.Assumed)
	}
	stated, err := Lookup(Conditions{Medium: KindFreshWater, StatedZero: FieldTemperature})
	if err != nil {
		t.Fatal(err)
	}
	if stated.TemperatureC != 0 {
		t.Errorf("stated 0 °C read as %v °C", stated.TemperatureC)
	}
	if _, ok := assumed(stated)[FieldTemperature]; ok {
		t.Errorf("a stated 0 °C is listed as a default: %v", stated.Assumed)
	}
	// Tanaka et al. 2001, eq. 1 at 0 °C: 999.8428 kg/m³.
	checkRel(t, "ρ(0 °C stated)", stated.Density, 999.8428, 2e-5)
}

// A stated zero latitude is the equator, where a depth gives less pressure
// than at the default 45°; both use Saunders & Fofonoff (1976).
func TestStatedZeroLatitude(t *testing.T) {
	base := Conditions{Medium: KindSeawater, TemperatureC: 5, DepthM: 1000}
	def, err := Lookup(base)
	if err != nil {
		t.Fatal(err)
	}
	if got, ok := assumed(def)[FieldLatitude]; !ok || got != DefaultLatitudeDeg {
		t.Errorf("default latitude not listed: %v", def.Assumed)
	}
	base.StatedZero = FieldLatitude
	eq, err := Lookup(base)
	if err != nil {
		t.Fatal(err)
	}
	want := StandardPressurePa + SeaPressureAtDepth(1000, 0)*1e4
	if eq.PressurePa != want || !(eq.PressurePa < def.PressurePa) {
		t.Errorf("equator pressure %v, want %v (below %v at 45°)", eq.PressurePa, want, def.PressurePa)
	}
}

// A zero humidity or temperature offset in water is "not given", not a
// mistake; a non-zero one is still refused.
func TestZeroAirFieldsInWater(t *testing.T) {
	if _, err := Lookup(Conditions{Medium: KindSeawater, TemperatureC: 12}); err != nil {
		t.Errorf("zero humidity refused in water: %v", err)
	}
	if _, err := Lookup(Conditions{Medium: KindSeawater, TemperatureC: 12, HumidityPercent: 50}); err == nil {
		t.Error("humidity 50 % accepted in water")
	}
}

// Air is a gas by its properties; a medium file is not, whatever its name,
// unless it says "gas": true.
func TestGasIsAProperty(t *testing.T) {
	a, err := Lookup(Conditions{Medium: KindAir})
	if err != nil || !a.Gas {
		t.Errorf("air: Gas %v, err %v", a.Gas, err)
	}
	w, err := Lookup(Conditions{Medium: KindFreshWater})
	if err != nil || w.Gas {
		t.Errorf("fresh water: Gas %v, err %v", w.Gas, err)
	}
	f := MediumFile{Format: MediumFileFormat, Version: 1, Name: "air", Density: 1.2, Model: ModelNewtonian,
		Parameters: map[string]float64{PViscosity: 1.8e-5}, ShearRateRange: [2]float64{1, 10}}
	p, err := f.At(Conditions{})
	if err != nil || p.Gas || p.Medium != "air" {
		t.Errorf("file named air: Gas %v, name %q, err %v", p.Gas, p.Medium, err)
	}
	f.Gas = true
	if p, err := f.At(Conditions{}); err != nil || !p.Gas {
		t.Errorf("file with gas true: Gas %v, err %v", p.Gas, err)
	}
}

// Zero conditions in a literal are not given, so a measured medium warns of
// nothing ignored.
func TestMediumFileZeroConditions(t *testing.T) {
	f := MediumFile{Format: MediumFileFormat, Version: 1, Name: "mucus", Density: 1010, Model: ModelNewtonian,
		Parameters: map[string]float64{PViscosity: 0.1}, ShearRateRange: [2]float64{1, 10}}
	p, err := f.At(Conditions{})
	if err != nil || len(p.Warnings) != 0 {
		t.Errorf("warnings %v, err %v", p.Warnings, err)
	}
}

// A condition out of range is a *RangeError naming the field, its value and
// the accepted range, with the message unchanged. The deepest accepted
// depth is MaxWaterDepthM; latitude is bounded by definition.
func TestRangeErrors(t *testing.T) {
	for _, c := range []struct {
		c        Conditions
		field    Field
		min, max float64
		text     string
	}{
		{Conditions{Medium: KindSeawater, DepthM: -3}, FieldDepth, 0, MaxWaterDepthM,
			"media: depth -3 m is negative; give a depth of 0 m or more below the surface"},
		{Conditions{Medium: KindSeawater, DepthM: 100, LatitudeDeg: 91}, FieldLatitude, -90, 90,
			"media: latitude 91° is outside −90° to 90°"},
		{Conditions{Medium: KindAir, HumidityPercent: 120}, FieldHumidity, 0, 100,
			"media: relative humidity 120 % is outside 0–100 %"},
	} {
		_, err := Lookup(c.c)
		var re *RangeError
		if !errors.As(err, &re) {
			t.Errorf("%+v: %v is not a RangeError", c.c, err)
			continue
		}
		if re.Field != c.field || re.Min != c.min || re.Max != c.max || err.Error() != c.text {
			t.Errorf("got %s %v [%v, %v] %q, want %s [%v, %v] %q", re.Field, re.Value, re.Min, re.Max, err, c.field, c.min, c.max, c.text)
		}
		if re.Reason() != c.text[len("media: "):] {
			t.Errorf("Reason %q", re.Reason())
		}
	}
	_, err := Lookup(Conditions{Medium: "mercury"})
	if !errors.Is(err, ErrUnknownMedium) {
		t.Errorf("unknown medium: %v", err)
	}
	var r interface{ Reason() string }
	if !errors.As(err, &r) || r.Reason() != err.Error()[len("media: "):] {
		t.Errorf("unknown medium has no Reason: %v", err)
	}
}

// A brief lookup gives the same numbers and warning codes with no text:
// no methods, no assumed list, no warning messages. Air at 50 °C is
// outside where CIPM-2007 was checked, so it carries a warning.
func TestBriefLookup(t *testing.T) {
	c := Conditions{Medium: KindAir, TemperatureC: 50}
	full, err := Lookup(c)
	if err != nil {
		t.Fatal(err)
	}
	brief, err := Options{Brief: true}.Lookup(c)
	if err != nil {
		t.Fatal(err)
	}
	if full.Density != brief.Density || full.DynamicViscosity != brief.DynamicViscosity || !brief.Gas {
		t.Errorf("brief %v %v, full %v %v", brief.Density, brief.DynamicViscosity, full.Density, full.DynamicViscosity)
	}
	if len(full.Methods) == 0 || len(full.Assumed) == 0 || len(full.Warnings) == 0 {
		t.Fatalf("full lookup lacks methods, defaults or warnings: %+v", full)
	}
	if brief.Methods != nil || brief.Assumed != nil || len(brief.Warnings) != len(full.Warnings) {
		t.Errorf("brief lookup has methods %v, assumed %v, warnings %v", brief.Methods, brief.Assumed, brief.Warnings)
	}
	for i, w := range brief.Warnings {
		if w.Message != "" || w.Code != full.Warnings[i].Code {
			t.Errorf("brief warning %d: %+v, full %+v", i, w, full.Warnings[i])
		}
	}
}
