package media

import (
	"math"
	"strings"
	"testing"
)

// lookupAt returns the properties of a medium with some conditions set.
func lookupAt(medium string, edit func(*Conditions)) (Properties, error) {
	c := Unset(medium)
	edit(&c)
	return Lookup(c)
}

// hasWarning reports whether any warning's text contains part.
func hasWarning(p Properties, part string) bool {
	for _, w := range p.Warnings {
		if strings.Contains(w.Message, part) {
			return true
		}
	}
	return false
}

// Each bound of limits.go at both sides: inside it the result is physical
// (and warned about where a published range is left), beyond it the input is
// refused with a message naming it. The bounds' sources are in limits.go:
// IAPWS-IF97 region 1 (R7-97(2012): 623.15 K, 100 MPa), EOS-80 (−2–40 °C,
// 1000 bar; Fofonoff & Millard 1983), the 200 MPa and 100 °C bounds
// measured against IAPWS-95, the 12 km depth beyond the deepest ocean.
func TestMediumBoundsBothSides(t *testing.T) {
	cases := []struct {
		name     string
		medium   string
		edit     func(*Conditions)
		refuse   string // part of the error; "" when accepted
		warnPart string // part of a warning expected when accepted
	}{
		{"fresh 100 MPa, IF97's limit", "freshwater", func(c *Conditions) { c.PressurePa = 100e6 }, "", ""},
		{"fresh 150 MPa, extrapolated", "freshwater", func(c *Conditions) { c.PressurePa = 150e6 }, "", "above the 100 MPa limit"},
		{"fresh 200 MPa, the bound", "freshwater", func(c *Conditions) { c.PressurePa = 200e6 }, "", "within 0.05 %"},
		{"fresh 201 MPa", "freshwater", func(c *Conditions) { c.PressurePa = 201e6 }, "fresh-water pressure 201 MPa is above 200 MPa", ""},
		{"fresh 700 MPa (negative IF97 density)", "freshwater", func(c *Conditions) { c.PressurePa = 700e6 }, "pressure 700 MPa", ""},
		{"sea 200 MPa", "seawater", func(c *Conditions) { c.PressurePa = 200e6 }, "", "above the EOS-80 limit"},
		{"sea 201 MPa", "seawater", func(c *Conditions) { c.PressurePa = 201e6 }, "sea-water pressure 201 MPa", ""},
		{"fresh 350 °C at 30 MPa", "freshwater", func(c *Conditions) { c.TemperatureC = 350; c.PressurePa = 30e6 }, "", ""},
		{"fresh 351 °C at 30 MPa", "freshwater", func(c *Conditions) { c.TemperatureC = 351; c.PressurePa = 30e6 }, "351 °C is above 350 °C", ""},
		{"sea 100 °C at 2 bar", "seawater", func(c *Conditions) { c.TemperatureC = 100; c.PressurePa = 2e5 }, "", "1.1 % at 100 °C"},
		{"sea 101 °C at 2 bar", "seawater", func(c *Conditions) { c.TemperatureC = 101; c.PressurePa = 2e5 }, "101 °C is above 100 °C", ""},
		{"sea 12 km deep", "seawater", func(c *Conditions) { c.DepthM = 12000 }, "", "above the EOS-80 limit of 10000 dbar"},
		{"sea 12.001 km deep", "seawater", func(c *Conditions) { c.DepthM = 12001 }, "depth 12001 m is beyond the deepest accepted, 12000 m", ""},
		{"sea 50 km deep", "seawater", func(c *Conditions) { c.DepthM = 50000 }, "depth 50000 m", ""},
		{"fresh 12 km deep", "freshwater", func(c *Conditions) { c.DepthM = 12000 }, "", "above the 100 MPa limit"},
		{"fresh 1000 km deep", "freshwater", func(c *Conditions) { c.DepthM = 1e6 }, "depth 1e+06 m", ""},
		// IAPWS-IF97 region 4 (R7-97(2012), eq. 31): water boils at
		// 99.974 °C at 101325 Pa; IAPWS R14-08: ice melts at 0 °C at one
		// atmosphere and about −0.74 °C at 10 MPa.
		{"fresh 99.9 °C at 1 atm", "freshwater", func(c *Conditions) { c.TemperatureC = 99.9 }, "", ""},
		{"fresh 100 °C at 1 atm", "freshwater", func(c *Conditions) { c.TemperatureC = 100 }, "above its boiling point (99.97 °C)", ""},
		{"fresh −0.5 °C at 10 MPa", "freshwater", func(c *Conditions) { c.TemperatureC = -0.5; c.PressurePa = 10e6 }, "", "below 0 °C"},
		{"fresh −0.5 °C at 1 atm", "freshwater", func(c *Conditions) { c.TemperatureC = -0.5 }, "below its freezing point", ""},
		{"salinity 990 g/kg", "seawater", func(c *Conditions) { c.SalinityPractical = PracticalFromAbsolute(990) }, "", "150 g/kg"},
		{"salinity 1000 g/kg", "seawater", func(c *Conditions) { c.SalinityPractical = PracticalFromAbsolute(1000) }, "impossible", ""},
		{"air at 32 km", "air", func(c *Conditions) { c.AltitudeM = 32100 }, "", ""},
		{"air at 33 km with pressure and temperature", "air", func(c *Conditions) { c.AltitudeM = 33000; c.PressurePa = 800; c.TemperatureC = -40 }, "altitude 33000 m", ""},
		{"air below the Earth's centre", "air", func(c *Conditions) { c.AltitudeM = -7e6; c.PressurePa = 1e5; c.TemperatureC = 20 }, "altitude -7e+06 m", ""},
		{"air at 10 MPa", "air", func(c *Conditions) { c.PressurePa = 10e6; c.TemperatureC = 20 }, "", "600–1100 hPa"},
		{"air at 10.1 MPa", "air", func(c *Conditions) { c.PressurePa = 10.1e6; c.TemperatureC = 20 }, "air pressure 10.1 MPa is above 10 MPa", ""},
		{"air at 1 GPa", "air", func(c *Conditions) { c.PressurePa = 1e9; c.TemperatureC = 20 }, "air pressure 1000 MPa", ""},
		{"air humidity 100 %", "air", func(c *Conditions) { c.HumidityPercent = 100; c.TemperatureC = 20 }, "", ""},
		{"air humidity 100.1 %", "air", func(c *Conditions) { c.HumidityPercent = 100.1 }, "outside 0–100", ""},
		{"air humidity −0.1 %", "air", func(c *Conditions) { c.HumidityPercent = -0.1 }, "outside 0–100", ""},
		{"air offset to absolute zero", "air", func(c *Conditions) { c.TemperatureOffset = -288.15 }, "below absolute zero", ""},
		{"air at 1e5 °C (vapour pressure overflows)", "air", func(c *Conditions) { c.TemperatureC = 1e5 }, "not physical", ""},
	}
	for _, tc := range cases {
		p, err := lookupAt(tc.medium, tc.edit)
		if tc.refuse != "" {
			if err == nil || !strings.Contains(err.Error(), tc.refuse) {
				t.Errorf("%s: error %v, want one containing %q", tc.name, err, tc.refuse)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: refused: %v", tc.name, err)
			continue
		}
		for _, v := range []float64{p.Density, p.DynamicViscosity, p.KinematicViscosity} {
			if !(v > 0) || math.IsInf(v, 0) {
				t.Errorf("%s: unphysical property %g", tc.name, v)
			}
		}
		if tc.warnPart != "" && !hasWarning(p, tc.warnPart) {
			t.Errorf("%s: warnings %v, want one containing %q", tc.name, p.Warnings, tc.warnPart)
		}
	}
}

// The reference equation for air of Lemmon et al. (2000), computed with
// the python3-iapws package (Debian 1.5.3) for this project, gives dry air
// at 20 °C a density of 11.924981 kg/m³ at 1 MPa and 120.26349 at 10 MPa;
// the CIPM-2007 density Air reports up to its 10 MPa bound must stay within
// 0.5 % of them, the figure limits.go states.
func TestAirHighPressureAgainstLemmon2000(t *testing.T) {
	for _, r := range []struct{ pPa, rho float64 }{{1e6, 11.924981}, {10e6, 120.26349}} {
		p, err := Air(AirConditions{TemperatureC: 20, PressurePa: r.pPa})
		if err != nil {
			t.Fatal(err)
		}
		checkRel(t, "CIPM-2007 ρ", p.Density, r.rho, 5e-3)
	}
}

// IAPWS-95 densities at 20 °C (293.15 K) computed with the python3-iapws
// package (Debian 1.5.3) for this project: 1047.0049 kg/m³ at 120 MPa and
// 1074.0476 at 200 MPa. The extrapolated IF97 region 1 density that
// FreshWater reports beyond 100 MPa must stay within 0.05 % of them, the
// accuracy the warning states.
func TestExtrapolatedPressureAgainstIAPWS95(t *testing.T) {
	for _, r := range []struct{ pPa, rho float64 }{{120e6, 1047.0049}, {200e6, 1074.0476}} {
		p, err := FreshWater(20, r.pPa)
		if err != nil {
			t.Fatal(err)
		}
		checkRel(t, "extrapolated IF97 ρ", p.Density, r.rho, 5e-4)
	}
}

// Above practical salinity 42 EOS-80 is extrapolated; TEOS-10 (computed
// with GSW-Python 3.6.16, Debian python3-gsw, for this project: SA =
// SP·35.16504/35, surface) gives 1058.8841 kg/m³ at SP 80 and 20 °C and
// 1072.2960 at SP 100. The warning states 0.07 % and 0.3 %; hold it to
// that.
func TestHighSalinityAgainstTEOS10(t *testing.T) {
	for _, r := range []struct{ sp, rho, tol float64 }{{80, 1058.8841, 1e-3}, {100, 1072.2960, 3.5e-3}} {
		p, err := Seawater(20, r.sp, StandardPressurePa)
		if err != nil {
			t.Fatal(err)
		}
		checkRel(t, "EOS-80 ρ", p.Density, r.rho, r.tol)
		if !hasWarning(p, "above the EOS-80 range 0–42") {
			t.Errorf("SP %g: no extrapolation warning in %v", r.sp, p.Warnings)
		}
	}
}
