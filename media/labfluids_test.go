package media

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func within(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if math.IsNaN(got) || math.Abs(got-want) > rel*math.Abs(want) {
		t.Errorf("%s = %.6g, want %.6g ±%.2g %%", what, got, want, 100*rel)
	}
}

// Segur, J. B. & Oberstar, H. E. (1951), Ind. Eng. Chem. 43, 2117 (as
// copied in METHODS-LAB.md §2.2, a public data set): viscosity of
// glycerol–water in mPa·s. Cheng (2008) claims agreement with these data;
// ±3 % is the tolerance METHODS-LAB gives for Cheng against them.
func TestGlycerolViscosityAgainstSegurOberstar(t *testing.T) {
	for _, c := range []struct{ w, t, mPas float64 }{
		{0.1, 20, 1.31}, {0.3, 20, 2.50}, {0.5, 20, 6.00}, {0.7, 20, 22.5}, {0.8, 20, 60.1},
		{0.9, 20, 219}, {0.95, 20, 523}, {1.0, 20, 1410},
		{0.5, 30, 4.21}, {0.8, 30, 33.9}, {0.9, 30, 109}, {1.0, 30, 612},
	} {
		within(t, "μ(glycerol)", GlycerolViscosity(c.w, c.t)*1e3, c.mPas, 0.03)
	}
}

// GLY-1, GLY-2 (METHODS-LAB §6): Cheng's formula evaluated by
// methods-calc/glycerol.py (an independent Python implementation): 6.002 and
// 112.047 mPa·s, to the script's printed digits.
func TestGlycerolViscosityVectors(t *testing.T) {
	within(t, "GLY-1 μ(0.5, 20 °C)", GlycerolViscosity(0.5, 20)*1e3, 6.002, 1e-3)
	within(t, "GLY-2 μ(0.9, 30 °C)", GlycerolViscosity(0.9, 30)*1e3, 112.047, 1e-5)
	// Water limit at 20 °C: 1.0049 mPa·s (glycerol.py); IAPWS 2008 gives
	// 1.0016 mPa·s, so Cheng's water term is within 0.4 % of it.
	within(t, "μ(0, 20 °C) vs IAPWS", GlycerolViscosity(0, 20)*1e3, 1.0016, 0.004)
}

// CRC Handbook 102nd ed. (2021), concentrative properties of aqueous
// solutions, glycerol at 20 °C (METHODS-LAB §2.2): ±4.5 % for Cheng, as
// METHODS-LAB sets, largest at 92–100 %.
func TestGlycerolViscosityAgainstCRC(t *testing.T) {
	for _, c := range []struct{ w, mPas float64 }{
		{0.1, 1.31}, {0.2, 1.766}, {0.4, 3.73}, {0.6, 10.9}, {0.8, 60.6}, {0.88, 170}, {0.92, 319}, {0.96, 648}, {1.0, 1460},
	} {
		within(t, "μ(glycerol, 20 °C)", GlycerolViscosity(c.w, 20)*1e3, c.mPas, 0.045)
	}
}

// Bosart, L. W. & Snoddy, A. O. (1927), Ind. Eng. Chem. 19, 506 (as
// copied in METHODS-LAB §2.2): density at 20 °C, within ±0.6 kg/m³
// (METHODS-LAB's tolerance for the Volk & Kähler model against these data).
// GLY-3: 0.6 at 20 °C gives 1153.54 kg/m³ (glycerol.py).
func TestGlycerolDensityAgainstBosartSnoddy(t *testing.T) {
	for _, c := range []struct{ w, rho float64 }{
		{1.0, 1261.08}, {0.9, 1235.10}, {0.8, 1208.50}, {0.7, 1181.25}, {0.6, 1153.80},
		{0.5, 1126.30}, {0.4, 1099.30}, {0.3, 1072.70}, {0.2, 1046.90}, {0.1, 1022.10}, {0.0, 998.23},
	} {
		if got := GlycerolDensity(c.w, 20); math.Abs(got-c.rho) > 0.6 {
			t.Errorf("ρ(%.1f, 20 °C) = %.2f kg/m³, want %.2f ± 0.6", c.w, got, c.rho)
		}
	}
	// The 25 °C column of the same table (public copy in the
	// SPIV-PLIF fluid-property script, fluidprop.m).
	for i, rho := range []float64{1258.02, 1232.00, 1205.45, 1178.40, 1151.05, 1123.75, 1097.10, 1070.70, 1045.25, 1020.70, 997.08} {
		w := 1 - 0.1*float64(i)
		if got := GlycerolDensity(w, 25); math.Abs(got-rho) > 0.6 {
			t.Errorf("ρ(%.1f, 25 °C) = %.2f kg/m³, want %.2f ± 0.6", w, got, rho)
		}
	}
	within(t, "GLY-3 ρ(0.6, 20 °C)", GlycerolDensity(0.6, 20), 1153.54, 1e-5)
}

// GLY-4 and worked example 2 of METHODS-LAB §2.1 (similarity2.py): ν =
// 5.2693e-4 m²/s at 20 °C needs glycerol mass fraction 0.9632 (μ 659.7
// mPa·s, ρ 1251.9 kg/m³); ±2 °C changes ν by +18.7 % / −15.4 %.
func TestGlycerolFractionFor(t *testing.T) {
	w, err := GlycerolFractionFor(5.2693e-4, 20)
	if err != nil {
		t.Fatal(err)
	}
	within(t, "GLY-4 mass fraction", w, 0.9632, 1e-4)
	within(t, "μ", GlycerolViscosity(w, 20)*1e3, 659.7, 2e-4)
	within(t, "ρ", GlycerolDensity(w, 20), 1251.9, 1e-4)
	nu := GlycerolKinematicViscosity(w, 20)
	within(t, "ν at 18 °C / 20 °C", GlycerolKinematicViscosity(w, 18)/nu, 1.187, 1e-3)
	within(t, "ν at 22 °C / 20 °C", GlycerolKinematicViscosity(w, 22)/nu, 0.846, 1e-3)

	var reach *OutOfReachError
	if _, err := GlycerolFractionFor(2e-3, 20); !errors.As(err, &reach) || reach.High > 1.2e-3 {
		t.Errorf("ν 2e-3 m²/s (above pure glycerol's ≈1.12e-3 at 20 °C, CRC 1460 mPa·s / 1261 kg/m³): got %v", err)
	}
	if _, err := GlycerolFractionFor(5e-7, 20); !errors.As(err, &reach) {
		t.Errorf("ν below water's: got %v, want out of reach", err)
	}
}

// The inverse in temperature must return a temperature whose forward value
// is the target (round trip, no outside source needed for the identity);
// pure glycerol at 20 °C has 1410 mPa·s (Segur & Oberstar), so asking
// for Cheng's 20 °C value must give 20 °C back.
func TestGlycerolTemperatureFor(t *testing.T) {
	nu := GlycerolKinematicViscosity(1, 20)
	got, err := GlycerolTemperatureFor(1, nu)
	if err != nil || math.Abs(got-20) > 1e-6 {
		t.Errorf("temperature for pure glycerol's 20 °C ν = %v, %v; want 20 °C", got, err)
	}
	if _, err := GlycerolTemperatureFor(0.5, 1); err == nil {
		t.Error("1 m²/s from 50 % glycerol: want an out-of-reach error")
	}
}

// CRC Handbook 102nd ed. (2021), sucrose at 20 °C: the rows in the table
// come back exactly, and the held-out 22 % (1.0899 g/cm³, 2.124 mPa·s) and
// 26 % (1.1082 g/cm³, 2.573 mPa·s) rows, left out of the interpolation
// table, are matched within 0.5 % (viscosity) and 0.05 % (density).
func TestSucroseAgainstCRC(t *testing.T) {
	for _, c := range []struct{ w, rho, mPas float64 }{
		{0.10, 1038.1, 1.336}, {0.40, 1176.5, 6.162}, {0.60, 1286.4, 58.487}, {0.70, 1347.2, 481.561},
	} {
		rho, mu := SucroseProperties(c.w)
		within(t, "sucrose ρ", rho, c.rho, 1e-9)
		within(t, "sucrose μ", mu*1e3, c.mPas, 1e-9)
	}
	for _, c := range []struct{ w, rho, mPas float64 }{{0.22, 1089.9, 2.124}, {0.26, 1108.2, 2.573}} {
		rho, mu := SucroseProperties(c.w)
		within(t, "held-out sucrose ρ", rho, c.rho, 5e-4)
		within(t, "held-out sucrose μ", mu*1e3, c.mPas, 5e-3)
	}
	w, err := SucroseFractionFor(6.162e-3 / 1176.5)
	if err != nil || math.Abs(w-0.40) > 1e-9 {
		t.Errorf("fraction for the 40 %% row's ν = %v, %v; want 0.40", w, err)
	}
	if _, err := Sucrose(0.4, 25); err == nil {
		t.Error("sucrose at 25 °C: want a refusal (table is for 20 °C)")
	}
	if _, err := Sucrose(0.8, 20); err == nil {
		t.Error("sucrose 80 %: want a refusal (no viscosity in the table)")
	}
}

// T-ARR-1 (METHODS-LAB §1.6, glycerol.py): Andrade's law through IAPWS 2008
// water at 20 °C (1.0016 mPa·s) and 37 °C (0.6913 mPa·s) has E_a =
// 16.49 kJ/mol and predicts 0.8942 mPa·s at 25 °C.
func TestOilAndradeVector(t *testing.T) {
	o, err := FitOil("water as an oil", 998, []ViscosityPoint{{37, 0.6913e-3}, {20, 1.0016e-3}})
	if err != nil {
		t.Fatal(err)
	}
	within(t, "E_a (J/mol)", o.ActivationEnergy(), 16490, 5e-4)
	within(t, "μ(25 °C)", o.Viscosity(25)*1e3, 0.8942, 1e-4)
	// Inverting at the 25 °C prediction must give 25 °C back; 0.5 mPa·s
	// would need about 57 °C, beyond the points' reach.
	if tc, err := o.TemperatureFor(0.8942e-3 / 998); err != nil || math.Abs(tc-25) > 0.01 {
		t.Errorf("temperature for 0.8942 mPa·s = %v, %v; want 25 °C", tc, err)
	}
	if _, err := o.TemperatureFor(0.5e-3 / 998); err == nil {
		t.Error("0.5 mPa·s: want out of reach")
	}
	p, err := o.Properties(45)
	if err != nil || len(p.Warnings) != 1 {
		t.Errorf("45 °C (8 °C beyond the points): want a value with one warning, got %v %v", p.Warnings, err)
	}
	if _, err := o.Properties(60); err == nil {
		t.Error("60 °C (23 °C beyond the points): want a refusal")
	}
	for name, pts := range map[string][]ViscosityPoint{
		"one point":       {{20, 1e-3}},
		"same T":          {{20, 1e-3}, {20, 2e-3}},
		"rising":          {{20, 1e-3}, {40, 2e-3}},
		"zero viscosity":  {{20, 0}, {40, 1e-3}},
		"NaN temperature": {{math.NaN(), 1e-3}, {40, 1e-3}},
	} {
		if _, err := FitOil("x", 900, pts); err == nil {
			t.Errorf("%s: want an error", name)
		}
	}
}

func TestLookupLabFluids(t *testing.T) {
	c := Unset("glycerol:50%")
	c.TemperatureC = 20
	p, err := Lookup(c)
	if err != nil {
		t.Fatal(err)
	}
	within(t, "Lookup glycerol:50% μ (S&O 6.00 mPa·s)", p.DynamicViscosity*1e3, 6.00, 0.03)
	c = Unset("sucrose:0.4")
	p, err = Lookup(c) // default 20 °C
	if err != nil {
		t.Fatal(err)
	}
	within(t, "Lookup sucrose:0.4 μ (CRC 6.162 mPa·s)", p.DynamicViscosity*1e3, 6.162, 1e-9)

	for name, want := range map[string]string{
		"glycerol":       "needs its mass fraction",
		"glycerol:1.2":   "outside 0 to 1",
		"glycerol:abc":   "not a number",
		"glycerol:-5%":   "outside 0 to 1",
		"sucrose:0.75":   "tabulated for mass fractions",
		"Glycerol : 0.5": "",
	} {
		_, err := Lookup(Unset(name))
		switch {
		case want == "" && err != nil:
			t.Errorf("%s: %v", name, err)
		case want != "" && (err == nil || !strings.Contains(err.Error(), want)):
			t.Errorf("%s: got %v, want %q", name, err, want)
		}
	}
	deep := Unset("glycerol:0.5")
	deep.DepthM = 3
	if p, err := Lookup(deep); err != nil || len(p.Warnings) == 0 || p.Warnings[len(p.Warnings)-1].Code != WarnIgnored {
		t.Errorf("glycerol with a depth: want the depth ignored out loud, got %v, %v", p.Warnings, err)
	}
	humid := Unset("sucrose:0.2")
	humid.HumidityPercent = 50
	if _, err := Lookup(humid); err == nil {
		t.Error("sucrose with a humidity: want a refusal")
	}
	hot := Unset("glycerol:0.9")
	hot.TemperatureC = 120
	if _, err := Lookup(hot); err == nil {
		t.Error("glycerol at 120 °C: want a refusal")
	}
	conc := Unset("glycerol:0.96")
	p, _ = Lookup(conc)
	var cautions int
	for _, w := range p.Warnings {
		if w.Code == WarnLabCaution {
			cautions++
		}
	}
	if cautions != 2 {
		t.Errorf("96 %% glycerol at 20 °C: want the steepness and water-uptake cautions, got %v", p.Warnings)
	}
}
