package media

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// LocalSlopes returns, at each point, the slope d ln y / d ln x and its
// standard error, from a quadratic in ln x fitted by least squares to the
// window points nearest in ln x (a local polynomial smoother, the idea of
// Savitzky & Golay 1964, Anal. Chem. 36:1627, here on unevenly spaced
// points). Steffe (1996, Rheological Methods in Food Process Engineering,
// §3.2) asks for slopes from a smooth fit, not neighbour differences,
// which amplify noise. The standard error is NaN when the window leaves no
// degree of freedom. With fewer than three distinct x in a window a
// straight line is fitted instead.
//
// x and y must be positive and finite; at least two distinct x are needed.
func LocalSlopes(x, y []float64, window int) (slope, se []float64, err error) {
	if len(x) != len(y) {
		return nil, nil, errorf("%d x values but %d y values", len(x), len(y))
	}
	lx, ly := make([]float64, len(x)), make([]float64, len(y))
	for i := range x {
		if !(x[i] > 0) || !(y[i] > 0) || math.IsInf(x[i], 0) || math.IsInf(y[i], 0) {
			return nil, nil, errorf("point %d (%g, %g) is not positive and finite", i+1, x[i], y[i])
		}
		lx[i], ly[i] = math.Log(x[i]), math.Log(y[i])
	}
	if distinct(lx) < 2 {
		return nil, nil, errorf("a slope needs readings at two different settings or more")
	}
	window = max(window, 3)
	slope, se = make([]float64, len(x)), make([]float64, len(x))
	for i := range x {
		idx := nearest(lx, i, window)
		slope[i], se[i] = polySlope(lx, ly, idx, lx[i])
	}
	return slope, se, nil
}

// nearest returns the indices of the window points nearest to point i in
// lx (all points when there are fewer), widened until they hold three
// distinct values where the data allow.
func nearest(lx []float64, i, window int) []int {
	idx := make([]int, len(lx))
	for j := range idx {
		idx[j] = j
	}
	sort.SliceStable(idx, func(a, b int) bool { return math.Abs(lx[idx[a]]-lx[i]) < math.Abs(lx[idx[b]]-lx[i]) })
	k := min(window, len(idx))
	for k < len(idx) && distinct(pick(lx, idx[:k])) < 3 {
		k++
	}
	return idx[:k]
}

func pick(v []float64, idx []int) []float64 {
	out := make([]float64, len(idx))
	for j, i := range idx {
		out[j] = v[i]
	}
	return out
}

func distinct(v []float64) int {
	seen := map[float64]bool{}
	for _, x := range v {
		seen[x] = true
	}
	return len(seen)
}

// polySlope fits y = a + b t + c t² (t = x − x0) to the chosen points by
// least squares, or a line when they hold fewer than three distinct x, and
// returns b with its standard error.
func polySlope(x, y []float64, idx []int, x0 float64) (b, se float64) {
	p := 3
	if distinct(pick(x, idx)) < 3 {
		p = 2
	}
	n := len(idx)
	X := mat.NewDense(n, p, nil)
	Y := mat.NewVecDense(n, nil)
	for r, i := range idx {
		t := x[i] - x0
		X.Set(r, 0, 1)
		X.Set(r, 1, t)
		if p == 3 {
			X.Set(r, 2, t*t)
		}
		Y.SetVec(r, y[i])
	}
	var qr mat.QR
	qr.Factorize(X)
	var beta mat.VecDense
	if err := qr.SolveVecTo(&beta, false, Y); err != nil {
		return math.NaN(), math.NaN()
	}
	b = beta.AtVec(1)
	if n <= p {
		return b, math.NaN()
	}
	var fit mat.VecDense
	fit.MulVec(X, &beta)
	ssr := 0.0
	for r := 0; r < n; r++ {
		d := Y.AtVec(r) - fit.AtVec(r)
		ssr += d * d
	}
	var xtx, inv mat.Dense
	xtx.Mul(X.T(), X)
	if err := inv.Inverse(&xtx); err != nil {
		return b, math.NaN()
	}
	return b, math.Sqrt(ssr / float64(n-p) * inv.At(1, 1))
}
