package media

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// Round trip: a synthetic power-law and a Herschel–Bulkley sample are
// turned into raw readings for each geometry by the forward (textbook)
// relations, with 2 % multiplicative noise (fixed seed), reduced, and
// fitted by FitRheology. The fitted parameters must lie within two
// standard errors of the true ones (about a 95 % interval).
//
// Forward relations: Couette Ω = ½∫_{σ_b/α²}^{σ_b} γ̇(σ)/σ dσ (Krieger &
// Maron 1952; Steffe 1996 §3.2); parallel plates Steffe Eq. 3.62; cone and
// plate σ = 3M/(2πR³), γ̇ = Ω/tan θ; capillary Q = (πR³/τ_w³)∫_0^{τ_w}
// σ²γ̇(σ) dσ (Rabinowitsch 1929, Mooney 1931).

type sample struct {
	name  string
	model Model
	rate  func(sigma float64) float64 // γ̇(σ), 0 below the yield stress
}

func samples() []sample {
	pl := PowerLaw{K: 2, N: 0.5}
	hb := HerschelBulkley{TauY: 5, K: 2, N: 0.5}
	return []sample{
		{ModelPowerLaw, pl, func(s float64) float64 { return math.Pow(s/pl.K, 1/pl.N) }},
		{ModelHerschelBulkley, hb, func(s float64) float64 {
			if s <= hb.TauY {
				return 0
			}
			return math.Pow((s-hb.TauY)/hb.K, 1/hb.N)
		}},
	}
}

// targetRates are 15 shear rates from 1 to 300 1/s, evenly spaced in log.
func targetRates() []float64 {
	var g []float64
	for i := 0; i < 15; i++ {
		g = append(g, math.Pow(300, float64(i)/14))
	}
	return g
}

func integrate(f func(float64) float64, a, b float64) float64 {
	return quad.Fixed(f, a, b, 200, nil, 0)
}

func readingsFor(geometry Geometry, s sample, rng *rand.Rand) []Reading {
	noise := func() float64 { return math.Exp(0.02 * rng.NormFloat64()) }
	var rs []Reading
	for i, gt := range targetRates() {
		sig := s.model.Stress(gt)
		r := Reading{Line: i + 2, TubeLength: math.NaN()}
		switch g := geometry.(type) {
		case Couette:
			a2 := math.Pow(g.CupRadius/g.BobRadius, 2)
			r.AngularSpeed = 0.5 * integrate(func(x float64) float64 { return s.rate(x) / x }, sig/a2, sig)
			r.Torque = sig * 2 * math.Pi * g.BobLength * g.BobRadius * g.BobRadius * noise()
		case ConePlate:
			r.AngularSpeed = gt * math.Tan(g.Angle)
			r.Torque = sig * 2 * math.Pi * math.Pow(g.Radius, 3) / 3 * noise()
		case ParallelPlate:
			r.AngularSpeed = gt * g.Gap / g.Radius
			in := integrate(func(x float64) float64 { return x * x * s.model.Stress(x) }, 0, gt)
			r.Torque = 2 * math.Pi * math.Pow(g.Radius, 3) * in / (gt * gt * gt) * noise()
		case Capillary:
			rad := g.Diameter / 2
			r.FlowRate = math.Pi * rad * rad * rad / (sig * sig * sig) * integrate(func(x float64) float64 { return x * x * s.rate(x) }, 0, sig)
			r.PressureDrop = sig * 4 * g.Length / g.Diameter * noise()
		}
		rs = append(rs, r)
	}
	return rs
}

func TestRoundTrip(t *testing.T) {
	geometries := []Geometry{
		Couette{BobRadius: 0.010, CupRadius: 0.011, BobLength: 0.040},
		ConePlate{Radius: 0.020, Angle: math.Pi / 180},
		ParallelPlate{Radius: 0.020, Gap: 0.001},
		Capillary{Diameter: 1e-3, Length: 0.1},
	}
	for _, g := range geometries {
		for k, s := range samples() {
			rng := rand.New(rand.NewPCG(17, uint64(k)))
			c, err := g.Reduce(readingsFor(g, s, rng), DefaultSlopeWindow)
			if err != nil {
				t.Fatalf("%s %s: %v", g.Name(), s.name, err)
			}
			if len(c.Points) != 15 {
				t.Fatalf("%s %s: %d points, rejected %v", g.Name(), s.name, len(c.Points), c.Rejected)
			}
			var pts []RheometerPoint
			for _, p := range c.Points {
				pts = append(pts, RheometerPoint{ShearRate: p.ShearRate, Stress: p.Stress})
			}
			rep, err := FitRheology(pts)
			if err != nil {
				t.Fatal(err)
			}
			for _, f := range rep.Fits {
				if f.Model.Name() != s.name {
					continue
				}
				for i, p := range f.Params {
					want := paramValue(s.model, p.Name)
					if se := f.StdErrors[i]; !(math.Abs(p.Value-want) <= 2*se) {
						t.Errorf("%s %s: %s = %.4g ± %.2g, true %.4g", g.Name(), s.name, p.Name, p.Value, se, want)
					} else {
						t.Logf("%s %s: %s = %.4g ± %.2g, true %.4g", g.Name(), s.name, p.Name, p.Value, se, want)
					}
				}
			}
		}
	}
}

// A Newtonian fluid in the falling-ball viscometer: speeds from the
// Haberman & Sayre drag with 2 % noise give back μ within two standard
// errors of the mean.
func TestRoundTripFallingBall(t *testing.T) {
	g := FallingBall{BallDiameter: 0.002, TubeDiameter: 0.020, BallDensity: 7800, FluidDensity: 1261, Wall: WallHabermanSayre}
	const mu = 1.41
	rng := rand.New(rand.NewPCG(17, 99))
	var rs []Reading
	for i := 0; i < 8; i++ {
		v := (7800 - 1261) * StandardGravity * 0.002 * 0.002 / (18 * mu * HabermanSayreK(0.1))
		rs = append(rs, Reading{Line: i + 2, FallSpeed: v * math.Exp(0.02*rng.NormFloat64())})
	}
	c, err := g.Reduce(rs, 0)
	if err != nil {
		t.Fatal(err)
	}
	var sum, sum2 float64
	for _, p := range c.Points {
		sum += p.Viscosity()
		sum2 += p.Viscosity() * p.Viscosity()
	}
	n := float64(len(c.Points))
	mean := sum / n
	se := math.Sqrt((sum2/n - mean*mean) * n / (n - 1) / n)
	if math.Abs(mean-mu) > 2*se {
		t.Errorf("μ = %.4g ± %.2g Pa·s, true %.4g", mean, se, mu)
	}
}

func paramValue(m Model, name string) float64 {
	for _, p := range m.Params() {
		if p.Name == name {
			return p.Value
		}
	}
	return math.NaN()
}
