package regime

import (
	"math"
	"testing"
)

func near(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if math.IsNaN(got) || math.Abs(got-want) > rel*math.Abs(want) {
		t.Errorf("%s = %.6g, want %.6g ±%.2g %%", what, got, want, 100*rel)
	}
}

// fish is worked example 1 / SIM-1 of METHODS-LAB §2.1, computed by
// methods-calc/similarity.py and similarity2.py: L 0.10 m, U 0.50 m/s,
// f 5.0 Hz, A 0.02 m in sea water (ν 1.05386e-6 m²/s, ρ 1024.8 kg/m³),
// chord L/5 for k.
var fish = Prototype{Length: 0.10, Speed: 0.50, Frequency: 5.0, Amplitude: 0.02, Chord: 0.02, Nu: 1.08e-3 / 1024.8, Rho: 1024.8}

// Model λ = 2 in fresh water at 20 °C (ν 1.0016e-3/998.21 m²/s, ρ 998.21):
// U_m 0.2380 m/s, f_m 1.1901 Hz, Re 47 444 on both sides, St 0.200,
// k 0.628, F_m/F_p 0.8830, P_m/P_p 0.4204, T_m/T_p 4.201, Fr 0.505 vs
// 0.170 (the scripts' printed digits).
func TestSimilarFishExample(t *testing.T) {
	m, err := Similar(fish, 0.20, 1.0016e-3/998.21, 998.21, MatchReynolds)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "U_m", m.Speed, 0.2380, 2e-4)
	near(t, "f_m", m.Frequency, 1.1901, 1e-4)
	near(t, "Re organism", m.Organism.Reynolds, 47444, 1e-4)
	near(t, "Re model", m.Model.Reynolds, 47444, 1e-4)
	near(t, "St model", m.Model.Strouhal, 0.200, 1e-9)
	near(t, "k model", m.Model.ReducedFrequency, 0.628, 1e-3)
	near(t, "F_m/F_p", m.ForceRatio, 0.8830, 1e-4)
	near(t, "P_m/P_p", m.PowerRatio, 0.4204, 2e-4)
	near(t, "T_m/T_p", m.TimeRatio, 4.201, 2e-4)
	near(t, "Fr organism", m.Organism.Froude, 0.505, 1e-3)
	near(t, "Fr model", m.Model.Froude, 0.170, 2e-3)
}

// Worked example 2 of METHODS-LAB §2.1 (similarity2.py): a 1 mm copepod
// limb at 1 cm/s in the same sea water has Re 9.489; a 0.10 m model at
// 0.05 m/s needs ν 5.2693e-4 m²/s and runs at f_m/f_p = 0.05.
func TestCopepodExampleNeedsViscosity(t *testing.T) {
	limb := Prototype{Length: 1e-3, Speed: 0.01, Frequency: 20, Amplitude: 5e-4, Chord: math.NaN(), Nu: fish.Nu, Rho: fish.Rho}
	nu := NuForSpeed(limb, 0.10, 0.05)
	near(t, "ν needed", nu, 5.2693e-4, 1e-4)
	m, err := Similar(limb, 0.10, nu, 1251.9, MatchReynolds)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "Re", m.Organism.Reynolds, 9.489, 1e-4)
	near(t, "U_m", m.Speed, 0.05, 1e-12)
	near(t, "f_m/f_p", m.FrequencyRatio, 0.05, 1e-12)
	near(t, "ν from the frequency", NuForFrequency(limb, 0.10, m.Frequency), nu, 1e-12)
	if !math.IsNaN(m.Model.ReducedFrequency) {
		t.Errorf("no chord given: k = %v, want NaN", m.Model.ReducedFrequency)
	}
}

// Re and Fr together need ν_m/ν_p = λ^1.5: 0.354, 2.83, 11.2, 31.6 for
// λ = 0.5, 2, 5, 10 (METHODS-LAB §2.1, similarity.py).
func TestFroudeAndReynoldsTogether(t *testing.T) {
	for _, c := range []struct{ lambda, ratio float64 }{{0.5, 0.354}, {2, 2.83}, {5, 11.2}, {10, 31.6}} {
		near(t, "ν_m/ν_p", NuForFroude(fish, c.lambda*fish.Length)/fish.Nu, c.ratio, 2e-3)
	}
	nu := NuForFroude(fish, 0.05)
	m, err := Similar(fish, 0.05, nu, 1000, MatchFroude)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "Fr matched", m.Model.Froude, m.Organism.Froude, 1e-12)
	near(t, "Re matched at ν = ν_p λ^1.5", m.Model.Reynolds, m.Organism.Reynolds, 1e-12)
	near(t, "St matched", m.Model.Strouhal, m.Organism.Strouhal, 1e-12)
}

func TestSimilarRefusesBadInput(t *testing.T) {
	bad := fish
	bad.Speed = 0
	for name, f := range map[string]func() error{
		"zero speed":    func() error { _, err := Similar(bad, 0.2, 1e-6, 1000, MatchReynolds); return err },
		"NaN length":    func() error { _, err := Similar(fish, math.NaN(), 1e-6, 1000, MatchReynolds); return err },
		"inf viscosity": func() error { _, err := Similar(fish, 0.2, math.Inf(1), 1000, MatchReynolds); return err },
		"unknown mode":  func() error { _, err := Similar(fish, 0.2, 1e-6, 1000, "weber"); return err },
	} {
		if f() == nil {
			t.Errorf("%s: want an error", name)
		}
	}
}

// A scale of 1e-300 overflows the model speed (1e298 m/s in water): refused,
// not printed as infinity.
func TestSimilarRefusesOverflow(t *testing.T) {
	if _, err := Similar(fish, 1e-301, fish.Nu, fish.Rho, MatchReynolds); err == nil {
		t.Error("want an error for a model 1e-300 times the organism")
	}
}

// A prototype literal that leaves the chord zero has no reduced frequency
// (NaN, as with a NaN chord) and the example's other numbers unchanged.
func TestSimilarZeroChordNotGiven(t *testing.T) {
	p := fish
	p.Chord = 0
	m, err := Similar(p, 0.20, 1.0016e-3/998.21, 998.21, MatchReynolds)
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(m.Model.ReducedFrequency) || !math.IsNaN(m.Organism.ReducedFrequency) || !math.IsNaN(m.Chord) {
		t.Errorf("k %g / %g, chord %g: want NaN (not given)", m.Model.ReducedFrequency, m.Organism.ReducedFrequency, m.Chord)
	}
	near(t, "f_m", m.Frequency, 1.1901, 1e-4)
	near(t, "St model", m.Model.Strouhal, 0.200, 1e-9)
}
