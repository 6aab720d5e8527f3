package regime

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"github.com/flowregime/flowregime/media"
	"gonum.org/v1/gonum/stat"
)

// Re = UL/ν is a product of powers of its inputs, so with log-normal U and L
// it is exactly log-normal: median U₀L₀/ν and 95 % interval
// median · exp(±1.96 √(σ_U² + σ_L²)), σ = √ln(1 + (SD/value)²)
// (closed form; e.g. Aitchison & Brown 1957, The Lognormal Distribution).
func TestReynoldsLogNormalClosedForm(t *testing.T) {
	w := water20(t)
	const l0, u0, sdl, sdu = 0.01, 0.05, 0.001, 0.01
	eval := func(x []float64, r *Result) error {
		o := NewOrganism(Body{Shape: Sphere, Length: x[0]}, x[1])
		return CalcInto(r, o, &w, Options{Brief: true})
	}
	in := []UncertainInput{{"length", l0, sdl, true}, {"speed", u0, sdu, true}}
	s := math.Sqrt(math.Log1p(0.01) + math.Log1p(0.04))
	med := u0 * l0 / w.KinematicViscosity
	lo, hi := med*math.Exp(-1.96*s), med*math.Exp(1.96*s)

	lin, err := Linear(in, eval)
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "linear median", lin.Reynolds.Median, med, 1e-12)
	checkRel(t, "linear low95", lin.Reynolds.Low95, lo, 1e-6)
	checkRel(t, "linear high95", lin.Reynolds.High95, hi, 1e-6)

	const n = 10000
	mc, err := MonteCarlo(in, eval, n, 1)
	if err != nil {
		t.Fatal(err)
	}
	// Sampling error of a quantile of a log-normal sample, in ln space:
	// √(p(1−p)/n)/φ(z_p) σ (standard asymptotics); 4 such errors allowed.
	seMed := math.Sqrt(0.25/n) / 0.3989 * s
	seTail := math.Sqrt(0.025*0.975/n) / 0.05845 * s
	for _, c := range []struct {
		name      string
		got, want float64
		se        float64
	}{{"MC median", mc.Reynolds.Median, med, seMed}, {"MC low95", mc.Reynolds.Low95, lo, seTail}, {"MC high95", mc.Reynolds.High95, hi, seTail}} {
		if d := math.Abs(math.Log(c.got / c.want)); d > 4*c.se {
			t.Errorf("%s = %.6g, closed form %.6g (|Δln| %.3g > 4 × %.3g)", c.name, c.got, c.want, d, c.se)
		}
	}
	// Same seed, same answer; another seed agrees within sampling error.
	again, _ := MonteCarlo(in, eval, n, 1)
	if again.Reynolds != mc.Reynolds {
		t.Errorf("seed 1 twice: %+v vs %+v", again.Reynolds, mc.Reynolds)
	}
	other, _ := MonteCarlo(in, eval, n, 2)
	if other.Reynolds == mc.Reynolds || math.Abs(math.Log(other.Reynolds.Median/mc.Reynolds.Median)) > 6*seMed {
		t.Errorf("seed 2: %+v vs seed 1 %+v", other.Reynolds, mc.Reynolds)
	}
}

// Near a regime boundary the regime is uncertain: a sphere at Re = 1 with
// 10 % errors is viscous or intermediate about half the time each.
func TestRegimeProbabilityAtBoundary(t *testing.T) {
	w := water20(t)
	d := 1e-3
	u := 1 * w.KinematicViscosity / d
	eval := func(x []float64, r *Result) error {
		o := NewOrganism(Body{Shape: Sphere, Length: x[0]}, x[1])
		return CalcInto(r, o, &w, Options{Brief: true})
	}
	in := []UncertainInput{{"length", d, 0.1 * d, true}, {"speed", u, 0.1 * u, true}}
	mc, _ := MonteCarlo(in, eval, 4000, 7)
	if p := mc.RegimeProbability[RegimeViscous]; math.Abs(p-0.5) > 0.05 {
		t.Errorf("P(viscous) = %.3f, want about 0.5", p)
	}
	lin, _ := Linear(in, eval)
	if p := lin.RegimeProbability[RegimeViscous]; math.Abs(p-0.5) > 0.01 {
		t.Errorf("linear P(viscous) = %.3f, want 0.5", p)
	}
	// The sphere laws hand over at Re = 0.5 (Proudman–Pearson to the
	// standard curve): there both laws must be drawn.
	in[1].Value = 0.5 * u
	atJoin, _ := MonteCarlo(in, eval, 4000, 7)
	if len(atJoin.LawProbability) < 2 {
		t.Errorf("law probabilities %v: both Proudman–Pearson and the standard curve expected", atJoin.LawProbability)
	}
}

// Brent's minimiser on the simplified power model P = A/U + BU³ (induced
// power falling as 1/U, parasite rising as U³), whose minima are known in
// closed form: U_mp = (A/(3B))^(1/4) and U_mr = (A/B)^(1/4) = 3^(1/4) U_mp
// (by calculus: dP/dU = 0 and d(P/U)/dU = 0).
func TestMinimumPowerClosedForm(t *testing.T) {
	const a, b = 40.0, 0.003
	p := func(u float64) float64 { return a/u + b*u*u*u }
	ump, _ := minimize1D(p, 0.5, 50, 1e-10)
	checkRel(t, "U_mp", ump, math.Pow(a/(3*b), 0.25), 1e-7)
	umr, _ := minimize1D(func(u float64) float64 { return p(u) / u }, 0.5, 50, 1e-10)
	checkRel(t, "U_mr", umr, math.Pow(a/b, 0.25), 1e-7)
}

// The full flight model at speeds well above the hover induced velocity,
// with a body of constant drag coefficient and no profile power, is
// P = kT²/(2ρAV) + ½ρC_DSV³ + C to within (v_h/V)⁴, C the constant profile
// power: its minimum-power speed matches the closed form above within 0.5 %.
func TestFlightPowerCurveMinimum(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	const m, span, cd, area = 0.5, 3.0, 0.2, 0.02
	body := Body{Shape: Measured, Length: 0.3, DragCoefficient: cd, ReferenceArea: area}
	in := FlightInput{Mass: m, Density: air.Density, Viscosity: air.DynamicViscosity, InducedFactor: 1.15, Wings: Wings{Span: span},
		BodyDrag: func(u float64) float64 {
			d, _ := dragChosen(body, Flow{Speed: u, Density: air.Density, Viscosity: air.DynamicViscosity})
			return d.Chosen.Force
		}}
	pc, err := FlightPowerCurve(in, 1, 30, 59)
	if err != nil {
		t.Fatal(err)
	}
	thrust := m * media.StandardGravity
	A := 1.15 * thrust * thrust / (2 * air.Density * math.Pi * span * span / 4)
	B := 0.5 * air.Density * cd * area
	checkRel(t, "U_mp", pc.MinPowerSpeed, math.Pow(A/(3*B), 0.25), 0.005)
	// No wing area: a constant profile power C = 1.2 P_am (Pennycuick 1975),
	// which leaves U_mp alone and moves U_mr to the root of 2BU⁴ − CU − 2A.
	fp, _ := Flight(in)
	checkRel(t, "U_mr", pc.MaxRangeSpeed, rangeSpeedWithConstantProfile(A, B, fp.Profile), 0.005)
	if !(pc.Hover > pc.MinPower) {
		t.Errorf("hover %g W not above the minimum %g W", pc.Hover, pc.MinPower)
	}
}

// Deborah and Weissenberg numbers by hand: λ = 0.5 s, 4 Hz stroke: De = 2;
// Wi = λ U/L.
func TestDeborahWeissenberg(t *testing.T) {
	m := measured(media.PowerLaw{K: 0.01, N: 0.8}, 1000, 0.01, 100)
	o := NewOrganism(Body{Shape: Sphere, Length: 1e-3}, 1e-3)
	o.RelaxationTime, o.Frequency, o.Amplitude = 0.5, 4, 0.5e-3
	r, err := Calc(o, m)
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "De", r.Deborah, 2, 1e-12)
	checkRel(t, "Wi", r.Weissenberg, 0.5*1, 1e-12)
}

// The linear method against Monte Carlo where the model is not a power law:
// drag of a 1 mm sphere at Re ≈ 50 (standard drag curve) with 3 % errors.
// First order should match the Monte Carlo interval within 2 %.
func TestLinearAgainstMonteCarlo(t *testing.T) {
	w := water20(t)
	u := 50 * w.KinematicViscosity / 1e-3
	eval := func(x []float64, r *Result) error {
		o := NewOrganism(Body{Shape: Sphere, Length: x[0]}, x[1])
		return CalcInto(r, o, &w, Options{Brief: true})
	}
	in := []UncertainInput{{"length", 1e-3, 3e-5, true}, {"speed", u, 0.03 * u, true}}
	lin, _ := Linear(in, eval)
	mc, _ := MonteCarlo(in, eval, 20000, 11)
	checkRel(t, "drag median", lin.Drag.Median, mc.Drag.Median, 0.02)
	checkRel(t, "drag low95", lin.Drag.Low95, mc.Drag.Low95, 0.02)
	checkRel(t, "drag high95", lin.Drag.High95, mc.Drag.High95, 0.02)
}

// band's selection gives exactly gonum's stat.Quantile (empirical) of the
// sorted values, for samples of many sizes, with ties and without.
func TestBandMatchesGonumQuantile(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for _, n := range []int{1, 2, 3, 7, 39, 40, 41, 100, 1000, 9999, 10000} {
		for _, ties := range []bool{false, true} {
			v := make([]float64, n)
			for i := range v {
				v[i] = rng.NormFloat64()
				if ties {
					v[i] = math.Round(v[i] * 3)
				}
			}
			sorted := append([]float64(nil), v...)
			sort.Float64s(sorted)
			want := Band{stat.Quantile(0.5, stat.Empirical, sorted, nil), stat.Quantile(0.025, stat.Empirical, sorted, nil),
				stat.Quantile(0.975, stat.Empirical, sorted, nil)}
			if got := band(v); got != want {
				t.Errorf("n = %d, ties %v: band %+v, gonum %+v", n, ties, got, want)
			}
		}
	}
}
