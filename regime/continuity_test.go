package regime

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// The continuity sweep: drag against speed and settling speed against
// diameter, in 1 % steps, must never fall as the driver rises (except in the
// drag crisis of a sphere) and never rise by more than the steepest law
// allows.
//
// The bound on a 1 % step, stated: drag F = ½ρU²A·C_D(Re) with C_D
// non-increasing in Re rises at most as U², so a step of 1.01 in speed
// raises drag by at most 1.01² = 1.0201 (2.01 %); in a power-law fluid of
// index n ≤ 1 no faster. A settling speed rises at most as in Stokes' law,
// U ∝ d², so a 1 % step in diameter raises it by at most 2.01 %; in
// creeping flow of a power-law fluid U ∝ d^((1+n)/n) (Chhabra 2007, ch. 5),
// which is the bound there. On top of each bound a slack of joinSlack is
// allowed for the published piecewise tables themselves (the branches of
// Clift, Grace & Weber 1978, Table 5.2, meet within 0.2 % except at the
// crisis); a hand-over between two laws must do no worse.

const (
	speedStep = 1.01
	joinSlack = 0.003
)

// sweepMedium is a medium of the sweep.
type sweepMedium struct {
	name string
	p    media.Properties
	n    float64 // power-law index, 1 for a Newtonian fluid
}

func sweepMedia(t testing.TB) []sweepMedium {
	fresh, err := media.FreshWater(20, media.StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	sea, err := media.Seawater(10, 35, media.StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	air, err := media.Lookup(media.Unset(media.KindAir))
	if err != nil {
		t.Fatal(err)
	}
	// A shear-thinning power-law fluid (K = 0.1 Pa·s^n, n = 0.6, 1000
	// kg/m³, like a dilute polymer solution), measured over a wide range so
	// that no extrapolation warning hides the point.
	pl := measured(media.PowerLaw{K: 0.1, N: 0.6}, 1000, 1e-6, 1e9)
	return []sweepMedium{{"fresh water 20 °C", fresh, 1}, {"sea water 10 °C", sea, 1}, {"air", air, 1}, {"power-law n=0.6", pl, 0.6}}
}

type sweepBody struct {
	name string
	b    Body
}

func sweepBodies() []sweepBody {
	const d = 1e-3
	bs := []sweepBody{{"sphere", Body{Shape: Sphere, Length: d}}}
	for _, r := range []float64{2, 3, 5, 7, 10} {
		bs = append(bs, sweepBody{fmt.Sprintf("spheroid %g:1", r), Body{Shape: Spheroid, Length: r * d, Diameter: d}})
	}
	bs = append(bs, sweepBody{"rod 20:1", Body{Shape: Rod, Length: 20 * d, Diameter: d}},
		sweepBody{"cylinder", Body{Shape: Cylinder, Length: 10 * d, Diameter: d}})
	return bs
}

// step is the worst step found in a sweep.
type step struct {
	ratio     float64 // output(i+1)/output(i)
	re        float64 // Re at the step
	from, to  string  // laws on either side
	upper, lo bool
}

type sweepResult struct {
	up, down       step // largest rise and largest fall (smallest ratio)
	joinUp, joinDn step // the same over the steps where the law changes
	bad            []string
}

// note records a step in the result.
func (r *sweepResult) note(s step, exempt bool) {
	if exempt {
		return
	}
	if s.ratio > r.up.ratio {
		r.up = s
	}
	if s.ratio < r.down.ratio {
		r.down = s
	}
	if s.from != s.to {
		if s.ratio > r.joinUp.ratio {
			r.joinUp = s
		}
		if r.joinDn.ratio == 0 || s.ratio < r.joinDn.ratio {
			r.joinDn = s
		}
	}
}

// hand-overs describes the worst steps at law changes.
func (r *sweepResult) handOvers() string {
	if r.joinUp.ratio == 0 {
		return "no hand-over"
	}
	return fmt.Sprintf("hand-overs: up ×%.4f at Re %.3g (%s → %s), down ×%.4f at Re %.3g (%s → %s)",
		r.joinUp.ratio, r.joinUp.re, r.joinUp.from, r.joinUp.to, r.joinDn.ratio, r.joinDn.re, r.joinDn.from, r.joinDn.to)
}

// dragSweep sweeps speed from Re 1e-3 to 1e6 on the choice length.
func dragSweep(t testing.TB, b Body, m sweepMedium) sweepResult {
	res := sweepResult{up: step{ratio: 0}, down: step{ratio: math.Inf(1)}}
	l := ChoiceLength(b)
	u := 1e-3 * m.p.DynamicViscosity / (m.p.Density * l)
	if m.n != 1 { // Re = ρU^(2−n)Lⁿ/K = 1e-3
		pl := model(m.p.Rheology).(media.PowerLaw)
		u = math.Pow(1e-3*pl.K/(m.p.Density*math.Pow(l, pl.N)), 1/(2-pl.N))
	}
	bound := speedStep * speedStep * (1 + joinSlack)
	var prevF float64
	var prevLaw string
	for i := 0; ; i++ {
		o := NewOrganism(b, u)
		var r Result
		err := CalcInto(&r, o, &m.p, Options{Brief: true})
		if err != nil {
			t.Fatalf("%s at U = %g m/s: %v", b.Shape, u, err)
		}
		if r.Reynolds > 1e6 {
			break
		}
		f := r.Drag.Chosen.Force
		if i > 0 {
			ratio := f / prevF
			crisis := (b.Shape == Sphere) && r.Reynolds > 2e5
			res.note(step{ratio: ratio, re: r.Reynolds, from: prevLaw, to: r.Drag.Chosen.Law}, crisis)
			if !crisis && (ratio > bound || ratio < 1) {
				res.bad = append(res.bad, fmt.Sprintf("Re %.4g: drag ×%.4f (%s → %s)", r.Reynolds, ratio, prevLaw, r.Drag.Chosen.Law))
			}
		}
		prevF, prevLaw = f, r.Drag.Chosen.Law
		u *= speedStep
	}
	return res
}

func TestDragContinuitySweep(t *testing.T) {
	for _, m := range sweepMedia(t) {
		for _, b := range sweepBodies() {
			r := dragSweep(t, b.b, m)
			t.Logf("%-18s %-14s max step ×%.4f at Re %.3g, min ×%.4f at Re %.3g; %s",
				m.name, b.name, r.up.ratio, r.up.re, r.down.ratio, r.down.re, r.handOvers())
			if len(r.bad) > 0 {
				t.Errorf("%s, %s: %d steps outside [1, %.4f], first: %s", m.name, b.name, len(r.bad), speedStep*speedStep*(1+joinSlack), r.bad[0])
			}
		}
	}
}

// settleSweep sweeps the diameter from 1 µm to 10 cm.
func settleSweep(t testing.TB, p Particle, m sweepMedium, aspect float64) sweepResult {
	res := sweepResult{up: step{ratio: 0}, down: step{ratio: math.Inf(1)}}
	bound := math.Pow(speedStep, (1+m.n)/m.n) * (1 + joinSlack)
	var prevU float64
	var prevLaw string
	for d := 1e-6; d < 0.1; d *= speedStep {
		p.Diameter, p.Length = d, aspect*d
		s, err := Settle(p, m.p)
		if err != nil {
			t.Fatalf("settle d = %g m: %v", d, err)
		}
		if prevU > 0 {
			ratio := s.Speed / prevU
			crisis := s.Reynolds > 2e5
			res.note(step{ratio: ratio, re: s.Reynolds, from: prevLaw, to: s.Law}, crisis)
			if !crisis && (ratio > bound || ratio < 1) {
				res.bad = append(res.bad, fmt.Sprintf("d %.4g m, Re %.4g: speed ×%.4f (%s → %s)", d, s.Reynolds, ratio, prevLaw, s.Law))
			}
		}
		prevU, prevLaw = s.Speed, s.Law
	}
	return res
}

func TestSettleContinuitySweep(t *testing.T) {
	for _, m := range sweepMedia(t) {
		for _, c := range []struct {
			name   string
			shape  Shape
			aspect float64
			csf    float64
		}{{"sphere", Sphere, 1, 0}, {"spheroid 3:1", Spheroid, 3, 0}, {"natural grain", Sphere, 1, 0.7}} {
			if c.csf > 0 && !m.p.Newtonian() {
				continue
			}
			p := Particle{Shape: c.shape, Density: 2650, CoreyShape: c.csf}
			if c.csf > 0 {
				p.Roundness = 3.5
			}
			r := settleSweep(t, p, m, c.aspect)
			t.Logf("%-18s %-12s max step ×%.4f at Re %.3g, min ×%.4f at Re %.3g; %s",
				m.name, c.name, r.up.ratio, r.up.re, r.down.ratio, r.down.re, r.handOvers())
			if len(r.bad) > 0 {
				t.Errorf("%s, %s: %d steps outside the bound, first: %s", m.name, c.name, len(r.bad), r.bad[0])
			}
		}
	}
}

// Over random bodies and flows (sizes 1e-7–10 m, speeds 1e-7–1e3 m/s, any
// medium density and viscosity of living media and beyond), every shape's
// chosen drag and its bracket are finite and positive or the call fails
// with an error; nothing panics or returns NaN (a join's logarithms, the
// power-law laws and the friction bracket included).
func TestDragFiniteEverywhere(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	logU := func(lo, hi float64) float64 {
		return math.Exp(math.Log(lo) + rng.Float64()*(math.Log(hi)-math.Log(lo)))
	}
	for range 20000 {
		l := logU(1e-7, 10)
		d := l * logU(1e-3, 1)
		f := Flow{Speed: logU(1e-7, 1e3), Density: logU(0.05, 2000), Viscosity: logU(1e-6, 1e3)}
		if rng.IntN(3) == 0 {
			f.PowerLawK, f.PowerLawN = logU(1e-3, 10), logU(0.1, 1)
		}
		for _, s := range []Shape{Sphere, Spheroid, Rod, Cylinder} {
			r, err := Drag(Body{Shape: s, Length: l, Diameter: d}, f)
			if err != nil {
				continue
			}
			c := r.Chosen
			if !(c.Force > 0) || math.IsInf(c.Force, 0) || (c.Low == c.Low && !(c.Low > 0 && c.High >= c.Low)) {
				t.Fatalf("%s l %g d %g %+v: %s force %g bracket %g–%g", s, l, d, f, c.Law, c.Force, c.Low, c.High)
			}
		}
	}
}

// Settling over random particles and media (Newtonian water and air, and
// power-law, Bingham, Herschel–Bulkley and Carreau fluids): a finite speed
// (zero only when held) or an error, never a panic, NaN or "did not
// converge".
func TestSettleFiniteEverywhere(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	logU := func(lo, hi float64) float64 {
		return math.Exp(math.Log(lo) + rng.Float64()*(math.Log(hi)-math.Log(lo)))
	}
	ms := sweepMedia(t)
	media4 := []media.Properties{ms[0].p, ms[2].p, ms[3].p,
		measured(media.Bingham{TauY: 0.5, MuP: 0.05}, 1000, 1e-3, 1e3),
		measured(media.HerschelBulkley{TauY: 0.2, K: 0.3, N: 0.6}, 1000, 1e-3, 1e3),
		measured(media.Carreau{Eta0: 0.056, EtaInf: 0.00345, Lambda: 3.313, N: 0.3568}, 1050, 1e-3, 1e3)}
	for range 3000 {
		p := Particle{Shape: Sphere, Diameter: logU(1e-7, 0.1), Density: logU(10, 2e4)}
		if rng.IntN(3) == 0 {
			p.Shape, p.Length = Spheroid, p.Diameter*logU(1, 10)
		}
		m := media4[rng.IntN(len(media4))]
		s, err := Settle(p, m)
		if err != nil {
			if strings.Contains(err.Error(), "converge") {
				t.Fatalf("%+v in %s: %v", p, m.Medium, err)
			}
			continue
		}
		if !(s.Speed >= 0) || math.IsInf(s.Speed, 0) || (s.Speed == 0) != (s.Direction == Held) {
			t.Fatalf("%+v in %s: %s at %g m/s (%s)", p, m.Medium, s.Direction, s.Speed, s.Law)
		}
	}
}
