package regime

import (
	"math"

	"github.com/flowregime/flowregime/media"
)

// minimize1D returns the x in [a, b] that minimises f, by Brent's method:
// golden-section search with parabolic interpolation, to a relative
// tolerance tol in x (Brent, R. P. (1973), Algorithms for Minimization
// without Derivatives, Prentice-Hall, ch. 5, procedure localmin).
func minimize1D(f func(float64) float64, a, b, tol float64) (x, fx float64) {
	const cgold = 0.3819660112501051 // (3 − √5)/2
	const eps = 1e-12
	v := a + cgold*(b-a)
	w, x := v, v
	fv := f(v)
	fw, fx := fv, fv
	var d, e float64
	for range 200 {
		m := 0.5 * (a + b)
		tol1 := tol*math.Abs(x) + eps
		tol2 := 2 * tol1
		if math.Abs(x-m) <= tol2-0.5*(b-a) {
			break
		}
		parabolic := false
		if math.Abs(e) > tol1 {
			r := (x - w) * (fx - fv)
			q := (x - v) * (fx - fw)
			p := (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			}
			q = math.Abs(q)
			if math.Abs(p) < math.Abs(0.5*q*e) && p > q*(a-x) && p < q*(b-x) {
				e, d = d, p/q
				parabolic = true
				if u := x + d; u-a < tol2 || b-u < tol2 {
					d = math.Copysign(tol1, m-x)
				}
			}
		}
		if !parabolic {
			if x < m {
				e = b - x
			} else {
				e = a - x
			}
			d = cgold * e
		}
		u := x + d
		if math.Abs(d) < tol1 {
			u = x + math.Copysign(tol1, d)
		}
		fu := f(u)
		if fu <= fx {
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv, w, fw, x, fx = w, fw, x, fx, u, fu
		} else {
			if u < x {
				a = u
			} else {
				b = u
			}
			if fu <= fw || w == x {
				v, fv, w, fw = w, fw, u, fu
			} else if fu <= fv || v == x || v == w {
				v, fv = u, fu
			}
		}
	}
	return x, fx
}

// CurvePoint is flight power at one speed.
type CurvePoint struct {
	Speed                             float64 // m/s
	Induced, Parasite, Profile, Total float64 // W
}

// PowerCurve is the power needed for level flight against speed, with the
// speeds of minimum power and of maximum range.
type PowerCurve struct {
	Points                     []CurvePoint
	Hover                      float64 // W, total power at zero speed; NaN for a glide
	Gliding                    bool
	ProfileMethod              string  // how profile power was found ([FlightPower].ProfileMethod)
	Weight                     float64 // N, m g: P/W is the sink speed of a glide
	MinPowerSpeed, MinPower    float64 // m/s, W
	MaxRangeSpeed, MinCostOfTr float64 // m/s, J/m: the minimum of P/V
	Warnings                   []Warning
}

// FlightPowerCurve evaluates [Flight] from lo to hi in steps and finds the
// speeds of minimum power (minimum of P) and maximum range (minimum of
// P/V) with [minimize1D] inside the bracket of the best grid point. A
// minimum at either end of the range is reported with a warning. For a
// glide, P = m g × sink speed: the two speeds are those of minimum sink and
// best glide, and there is no hover (NaN).
func FlightPowerCurve(in FlightInput, lo, hi float64, steps int) (PowerCurve, error) {
	var pc PowerCurve
	if !(lo > 0) || !(hi > lo) || steps < 3 {
		return pc, errorf("a power curve needs 0 < from < to and at least 3 steps")
	}
	total := func(v float64) float64 {
		c := in
		c.Speed = v
		fp, err := Flight(c)
		if err != nil {
			return math.NaN()
		}
		return fp.Total
	}
	pc.Gliding, pc.Weight = in.Gliding, in.Mass*media.StandardGravity
	pc.Hover = math.NaN() // a glider cannot hover
	if !in.Gliding {
		h := in
		h.Speed = 0
		hp, err := Flight(h)
		if err != nil {
			return pc, err
		}
		pc.Hover = hp.Total
	}
	for i := 0; i < steps; i++ {
		v := lo + (hi-lo)*float64(i)/float64(steps-1)
		c := in
		c.Speed = v
		fp, err := Flight(c)
		if err != nil {
			return pc, err
		}
		pc.Points = append(pc.Points, CurvePoint{v, fp.Induced, fp.Parasite, fp.Profile, fp.Total})
		pc.ProfileMethod = fp.ProfileMethod
	}
	find := func(g func(float64) float64, name string) (float64, float64) {
		best := 0
		for i, p := range pc.Points {
			if g(p.Speed) < g(pc.Points[best].Speed) {
				best = i
			}
		}
		a := pc.Points[max(best-1, 0)].Speed
		b := pc.Points[min(best+1, len(pc.Points)-1)].Speed
		if best == 0 || best == len(pc.Points)-1 {
			pc.Warnings = append(pc.Warnings, warnf(WarnModel, "power curve: the %s lies at the edge of %.3g–%.3g m/s; widen the range", name, lo, hi))
		}
		return minimize1D(g, a, b, 1e-8)
	}
	pc.MinPowerSpeed, pc.MinPower = find(total, "minimum-power speed")
	pc.MaxRangeSpeed, pc.MinCostOfTr = find(func(v float64) float64 { return total(v) / v }, "maximum-range speed")
	return pc, nil
}
