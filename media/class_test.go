package media

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// synthetic returns 25 points log-spaced over lo–hi 1/s from a published
// model's stress function, each times (1 + noise·N(0,1)) with a fixed seed:
// invented data with known parameters.
func synthetic(stress func(float64) float64, lo, hi, noise float64, seed uint64) []RheometerPoint {
	r := rand.New(rand.NewPCG(seed, 7))
	var pts []RheometerPoint
	for i := range 25 {
		g := lo * math.Pow(hi/lo, float64(i)/24)
		pts = append(pts, RheometerPoint{ShearRate: g, Stress: stress(g) * (1 + noise*r.NormFloat64())})
	}
	return pts
}

// The class rule on invented data from known models (power law: Ostwald–de
// Waele; Herschel & Bulkley 1926; Newton), 2 % noise, 0.05–500 1/s, three
// seeds each. A pure power law with n = 1.6 must be shear-thickening: with
// seed 36 a Herschel–Bulkley fit finds a yield stress of 4.5e-6 Pa, above
// zero at 95 % but 5 % of the lowest stress (8.3e-5 Pa), which the former
// rule (significance alone) classed yield-stress and this rule refuses.
// The rule is stated with the class.
func TestClassRuleOnSyntheticFluids(t *testing.T) {
	cases := []struct {
		name   string
		stress func(float64) float64
		class  string
	}{
		{"power law n=1.6", PowerLaw{K: 0.01, N: 1.6}.Stress, ClassThickening},
		{"power law n=0.6", PowerLaw{K: 2, N: 0.6}.Stress, ClassThinning},
		{"Herschel–Bulkley 5 Pa", HerschelBulkley{TauY: 5, K: 2, N: 0.5}.Stress, ClassYield},
		{"Newtonian 1 mPa·s", Newtonian{Mu: 1e-3}.Stress, ClassNewtonian},
	}
	for _, c := range cases {
		for _, seed := range []uint64{1, 2, 36} {
			rep, err := FitRheology(synthetic(c.stress, 0.05, 500, 0.02, seed))
			if err != nil {
				t.Fatalf("%s: %v", c.name, err)
			}
			if rep.Class != c.class {
				t.Errorf("%s seed %d: class %s, want %s (%s)", c.name, seed, rep.Class, c.class, strings.Join(rep.Evidence, "; "))
			}
			if rep.Rule != ClassRule || !strings.Contains(rep.Rule, "10 %") {
				t.Errorf("%s: rule not stated: %q", c.name, rep.Rule)
			}
		}
	}
}
