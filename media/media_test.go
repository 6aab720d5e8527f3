package media

import (
	"math"
	"strings"
	"testing"
)

// relErr returns |got/want − 1|.
func relErr(got, want float64) float64 { return math.Abs(got/want - 1) }

func checkRel(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if e := relErr(got, want); !(e <= tol) {
		t.Errorf("%s = %.10g, want %.10g (relative error %.3g > %.3g)", what, got, want, e, tol)
	}
}

func checkAbs(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if e := math.Abs(got - want); !(e <= tol) {
		t.Errorf("%s = %.10g, want %.10g (error %.3g > %.3g)", what, got, want, e, tol)
	}
}

// IAPWS R12-08 (2008), Table 4: viscosity check values with μ̄₂ = 1, given
// to 1e-6 µPa·s.
func TestWaterViscosityR1208Table4(t *testing.T) {
	rows := []struct{ tK, rho, muMicro float64 }{
		{298.15, 998, 889.735100},
		{298.15, 1200, 1437.649467},
		{373.15, 1000, 307.883622},
		{433.15, 1, 14.538324},
		{433.15, 1000, 217.685358},
		{873.15, 1, 32.619287},
		{873.15, 100, 35.802262},
		{873.15, 600, 77.430195},
		{1173.15, 1, 44.217245},
		{1173.15, 100, 47.640433},
		{1173.15, 400, 64.154608},
	}
	for _, r := range rows {
		checkAbs(t, "R12-08 μ(µPa·s)", WaterViscosity(r.tK, r.rho)*1e6, r.muMicro, 2e-6)
	}
}

// IAPWS R7-97(2012), Table 5: region 1 specific volume check values.
func TestWaterDensityIF97Table5(t *testing.T) {
	rows := []struct{ tK, pMPa, v float64 }{
		{300, 3, 0.100215168e-2},
		{300, 80, 0.971180894e-3},
		{500, 3, 0.120241800e-2},
	}
	for _, r := range rows {
		checkRel(t, "IF97 v", 1/WaterDensityIF97(r.tK, r.pMPa*1e6), r.v, 5e-9) // printed to 9 digits
	}
}

// IAPWS-95 (Wagner & Pruss 2002), release Table 7 at 300 K: the reference
// equation's density at the pressure it gives. IF97 region 1 is specified to
// agree with IAPWS-95 within its own tolerance; 2e-5 relative is what this
// tool promises for liquid water.
func TestWaterDensityAgainstIAPWS95(t *testing.T) {
	rows := []struct{ pMPa, rho float64 }{
		{0.0992418352, 996.5560},
		{20.0022515, 1005.308},
	}
	for _, r := range rows {
		checkRel(t, "IF97 ρ vs IAPWS-95", WaterDensityIF97(300, r.pMPa*1e6), r.rho, 2e-5)
	}
}

// Tanaka, M. et al. (2001), Metrologia 38, 301: SMOW, air-free, 101325 Pa,
// 0–40 °C. Their table gives 998.2067 kg/m³ at 20 °C and 997.0470 at 25 °C;
// between, the recommended formula (their eq. 1) is checked every 1 °C. The
// issue's bound is 0.05 %; IF97 does far better.
func TestWaterDensityAgainstTanaka2001(t *testing.T) {
	checkRel(t, "ρ(20 °C)", WaterDensityIF97(293.15, StandardPressurePa), 998.2067, 2e-5)
	checkRel(t, "ρ(25 °C)", WaterDensityIF97(298.15, StandardPressurePa), 997.0470, 2e-5)
	const a1, a2, a3, a4, a5 = -3.983035, 301.797, 522528.9, 69.34881, 999.974950
	worst := 0.0
	for tc := 0.0; tc <= 40; tc++ {
		tanaka := a5 * (1 - (tc+a1)*(tc+a1)*(tc+a2)/(a3*(tc+a4)))
		worst = math.Max(worst, relErr(WaterDensityIF97(tc+ZeroCelsiusK, StandardPressurePa), tanaka))
	}
	if worst > 2e-5 {
		t.Errorf("IF97 vs Tanaka 2001 over 0–40 °C: worst relative error %.3g > 2e-5", worst)
	}
	t.Logf("IF97 vs Tanaka 2001, 0–40 °C: worst relative error %.2g", worst)
}

// Viscosity of water at 20 °C, 101325 Pa: ISO/TR 3666:1998 recommends
// 1.0016 mPa·s. Across 0–40 °C the Kestin, Sokolov & Wakeham (1978) fit (same
// form as ISO/TR 3666) agrees with R12-08 within 0.1 %.
func TestWaterViscosityAgainstISO3666(t *testing.T) {
	w, err := FreshWater(20, StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "μ(20 °C)", w.DynamicViscosity, 1.0016e-3, 1e-4)
	worst := 0.0
	for tc := 0.0; tc <= 40; tc += 2 {
		d := 20 - tc
		mu := 1.0016e-3 * math.Pow(10, d*(1.2378-1.303e-3*d+3.06e-6*d*d+2.55e-8*d*d*d)/(tc+96))
		w, err := FreshWater(tc, StandardPressurePa)
		if err != nil {
			t.Fatal(err)
		}
		worst = math.Max(worst, relErr(w.DynamicViscosity, mu))
	}
	if worst > 1e-3 {
		t.Errorf("R12-08 vs Kestin/ISO 3666 over 0–40 °C: worst %.3g > 1e-3", worst)
	}
	t.Logf("R12-08 vs ISO/TR 3666 fit, 0–40 °C: worst relative error %.2g", worst)
}

// IAPWS R7-97(2012), Table 35: saturation temperature check values.
func TestWaterBoilingIF97Table35(t *testing.T) {
	rows := []struct{ pMPa, tK float64 }{{0.1, 372.755919}, {1, 453.035632}, {10, 584.149488}}
	for _, r := range rows {
		checkAbs(t, "T_sat(K)", waterBoilingC(r.pMPa*1e6)+ZeroCelsiusK, r.tK, 1e-6)
	}
}

// UNESCO (1981) Tech. Pap. Mar. Sci. 38, check values of EOS-80 (t on
// IPTS-68, p in bar of sea pressure), printed to 1e-5 kg/m³.
func TestSeawaterEOS80UNESCO1981(t *testing.T) {
	rows := []struct{ s, t68, pBar, rho float64 }{
		{0, 5, 0, 999.96675}, {0, 5, 1000, 1044.12802},
		{0, 25, 0, 997.04796}, {0, 25, 1000, 1037.90204},
		{35, 5, 0, 1027.67547}, {35, 5, 1000, 1069.48914},
		{35, 25, 0, 1023.34306}, {35, 25, 1000, 1062.53817},
	}
	for _, r := range rows {
		checkAbs(t, "EOS-80 ρ", SeawaterDensityEOS80(r.s, r.t68, r.pBar), r.rho, 1e-5)
	}
	// Fofonoff & Millard (1983) p. 19: S = 40, T = 40 °C, p = 10000 dbar, σ = 59.82037.
	checkAbs(t, "EOS-80 σ", SeawaterDensityEOS80(40, 40, 1000)-1000, 59.82037, 2e-5)
}

// TEOS-10 (IOC et al. 2010) official check values v3.0, surface rows of two
// open-ocean casts: full-Gibbs in-situ density. EOS-80 is known to lie within
// about 0.005 kg/m³ of TEOS-10 at the surface; 0.01 kg/m³ is the bound here.
func TestSeawaterAgainstTEOS10CheckCast(t *testing.T) {
	rows := []struct{ sp, tC, rho float64 }{
		{34.30628739, 27.962, 1021.88661104},
		{34.39458089, 27.294, 1022.16934573},
	}
	for _, r := range rows {
		p, err := Seawater(r.tC, r.sp, StandardPressurePa)
		if err != nil {
			t.Fatal(err)
		}
		checkAbs(t, "ρ vs TEOS-10", p.Density, r.rho, 0.01)
	}
}

// Fofonoff & Millard (1983) check values (recalled from memory of the
// report, pp. 28–29): depth 9712.653 m at 10000 dbar and 30° latitude;
// freezing point −2.588567 °C at S = 40, 500 dbar.
func TestSeawaterFofonoffMillardChecks(t *testing.T) {
	checkAbs(t, "depth(m)", DepthAtSeaPressure(10000, 30), 9712.653, 1e-3)
	checkAbs(t, "inverse: dbar", SeaPressureAtDepth(9712.653, 30), 10000, 1e-3)
	checkAbs(t, "freezing(°C)", SeawaterFreezingC(40, 500), -2.588567, 1e-6)
}

// ITTC (2011) Recommended Procedure 7.5-02-01-03, sea water at 15 °C,
// SA = 35.16504 g/kg: ν = 1.1892e-6 m²/s (recalled from memory of the printed
// table, unverified; the table counts the atmosphere in its pressure, which
// moves ν by 2e-4 relative). Bound 1e-3: the viscosity correlation's own
// accuracy is ±1.5 %.
func TestSeawaterAgainstITTC2011(t *testing.T) {
	p, err := Seawater(15, 35, StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "ν(15 °C, SP 35)", p.KinematicViscosity, 1.1892e-6, 1e-3)
}

// ISO 2533:1975 = US Standard Atmosphere 1976, rows by geopotential height.
// Temperature and pressure follow the standard; density here is CIPM-2007
// (dry, 400 ppm CO₂), which differs from the standard's ideal gas with
// R = 287.053 J/(kg K) by about 0.04 %.
func TestStandardAtmosphereRows(t *testing.T) {
	rows := []struct{ h, tK, p, rho float64 }{
		{0, 288.150, 101325.0, 1.2250},
		{1000, 281.650, 89874.6, 1.111642},
		{5000, 255.650, 54019.9, 0.736115},
		{10000, 223.150, 26436.3, 0.412706},
		{20000, 216.650, 5474.89, 0.0880349}, // USSA-76 layer base values
		{32000, 228.650, 868.019, 0.0132250},
	}
	for _, r := range rows {
		tK, p := StandardAtmosphere(r.h)
		checkAbs(t, "T(K)", tK, r.tK, 1e-3)
		checkRel(t, "p(Pa)", p, r.p, 2e-6)
		z := r.h * ussaR0 / (ussaR0 - r.h) // geometric altitude for this geopotential height
		a, err := Air(AirConditions{TemperatureC: math.NaN(), PressurePa: math.NaN(), AltitudeM: z})
		if err != nil {
			t.Fatal(err)
		}
		checkRel(t, "ρ(kg/m³)", a.Density, r.rho, 1e-3)
	}
	// USSA-76 sea level: μ = 1.7894e-5 Pa·s, ν = 1.4607e-5 m²/s.
	a, _ := Air(AirConditions{TemperatureC: math.NaN(), PressurePa: math.NaN()})
	checkRel(t, "μ sea level", a.DynamicViscosity, 1.7894e-5, 5e-5)
	checkRel(t, "ν sea level", a.KinematicViscosity, 1.4607e-5, 1e-3)
}

// The mistake USSA-76 warns of: at 10 km geometric altitude the pressure is
// that of 9984 m', not of 10000 m' (26499.9 Pa, USSA-76 Table I by geometric
// altitude, rounded to 26500).
func TestAltitudeIsGeometric(t *testing.T) {
	a, err := Air(AirConditions{TemperatureC: math.NaN(), PressurePa: math.NaN(), AltitudeM: 10000})
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "p(10 km geometric)", a.PressurePa, 26499.9, 1e-5)
}

// CIPM-2007 worked example: 10 °C, 97325.3 Pa (730 mmHg), 40 % relative
// humidity gives 1.19569e-3 g/cm³, as cited from Gupta, S. V. (2012), Mass
// Metrology, Springer, appendix (p. 205). Checked: of Picard et al. (2008),
// Metrologia 45, 149, only the abstract and introduction could be read (no
// example there), and Gupta's appendix could not be read, so the figure
// stays unverified against its source; it equals the CIPM-2007 equations
// recomputed by hand, which is what this test holds.
func TestMoistAirCIPM2007Example(t *testing.T) {
	checkRel(t, "ρ moist", MoistAirDensity(283.15, 97325.3, 0.4, 0.0004), 1.19569, 5e-6)
}

// Common practice, no single source: water ≈ 1.0 mPa·s and air ≈ 18 µPa·s at
// 20 °C; viscosity of water nearly doubles from 25 °C to 0 °C.
func TestCommonPracticeMagnitudes(t *testing.T) {
	w, _ := Lookup(Conditions{Medium: "freshwater", TemperatureC: 20, TemperatureOffset: math.NaN(), SalinityPractical: math.NaN(), PressurePa: math.NaN(), DepthM: math.NaN(), AltitudeM: math.NaN(), HumidityPercent: math.NaN(), LatitudeDeg: math.NaN()})
	checkRel(t, "water μ", w.DynamicViscosity, 1.0e-3, 0.01)
	c := Unset("air")
	c.TemperatureC = 20
	a, _ := Lookup(c)
	checkRel(t, "air μ", a.DynamicViscosity, 18e-6, 0.02)
	w0, _ := FreshWater(0, StandardPressurePa)
	w25, _ := FreshWater(25, StandardPressurePa)
	if r := w0.DynamicViscosity / w25.DynamicViscosity; r < 1.9 || r > 2.1 {
		t.Errorf("μ(0 °C)/μ(25 °C) = %.3f, want about 2", r)
	}
}

func TestLookupErrors(t *testing.T) {
	cases := []struct {
		name string
		edit func(*Conditions)
		want string
	}{
		{"unknown medium", func(c *Conditions) { c.Medium = "oil" }, "unknown medium"},
		{"frozen fresh", func(c *Conditions) { c.Medium = "freshwater"; c.TemperatureC = -1 }, "below its freezing point"},
		{"frozen sea", func(c *Conditions) { c.Medium = "seawater"; c.TemperatureC = -2.5 }, "below its freezing point"},
		{"boiling", func(c *Conditions) { c.Medium = "freshwater"; c.TemperatureC = 120 }, "above its boiling point"},
		{"salty fresh", func(c *Conditions) { c.Medium = "freshwater"; c.SalinityPractical = 5 }, "no salinity"},
		{"negative depth", func(c *Conditions) { c.Medium = "seawater"; c.DepthM = -3 }, "negative"},
		{"humid water", func(c *Conditions) { c.Medium = "seawater"; c.HumidityPercent = 50 }, "apply to air"},
		{"deep air", func(c *Conditions) { c.Medium = "air"; c.DepthM = 3 }, "apply to water"},
		{"too high", func(c *Conditions) { c.Medium = "air"; c.AltitudeM = 50000 }, "outside the standard atmosphere"},
		{"humidity", func(c *Conditions) { c.Medium = "air"; c.HumidityPercent = 120 }, "outside 0–100"},
		{"boiling humid air", func(c *Conditions) { c.Medium = "air"; c.TemperatureC = 105; c.HumidityPercent = 50 }, "saturation vapour pressure"},
		{"nan", func(c *Conditions) { c.Medium = "air"; c.PressurePa = math.Inf(1) }, "finite"},
	}
	for _, tc := range cases {
		c := Unset("")
		tc.edit(&c)
		_, err := Lookup(c)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want one containing %q", tc.name, err, tc.want)
		}
	}
}

func TestWarningsOutsideRange(t *testing.T) {
	c := Unset("seawater")
	c.TemperatureC = -1.5
	p, err := Lookup(c)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Warnings) == 0 || !strings.Contains(p.Warnings[0].Message, "Sharqawy") {
		t.Errorf("sea water at −1.5 °C: warnings %v, want the Sharqawy range warning", p.Warnings)
	}
	a := Unset("air")
	a.TemperatureC = 20
	p, _ = Lookup(a)
	if len(p.Warnings) != 0 {
		t.Errorf("air at 20 °C sea level: unexpected warnings %v", p.Warnings)
	}
}

func TestDepthRaisesPressure(t *testing.T) {
	c := Unset("freshwater")
	c.DepthM = 100
	p, err := Lookup(c)
	if err != nil {
		t.Fatal(err)
	}
	// Hydrostatics: 100 m of water at ≈998.2 kg/m³ adds ρ g h ≈ 0.9789 MPa.
	checkRel(t, "p at 100 m", p.PressurePa, StandardPressurePa+998.2*StandardGravity*100, 1e-3)
}
