package tabulate

import (
	"math"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"
)

// Fit is a straight-line fit of log10 y on log10 x, the scaling law
// y = a x^b: the exponent b (slope) and log10 a (intercept) by ordinary
// least squares and by standardised major axis, each with its 95 %
// confidence interval.
type Fit struct {
	N                                               int
	OLSSlope, OLSLow, OLSHigh                       float64
	OLSIntercept, OLSInterceptLow, OLSInterceptHigh float64
	SMASlope, SMALow, SMAHigh                       float64
	SMAIntercept, SMAInterceptLow, SMAInterceptHigh float64
	R2                                              float64
}

// ScalingFit fits log10(y) against log10(x) over the pairs where both are
// positive and finite. With fewer than 3 pairs or no spread it returns a Fit
// with NaN slopes.
//
// OLS: slope b = r s_y/s_x with standard error b √((1 − r²)/(r²(n − 2))),
// interval b ± t₀.₉₇₅,ₙ₋₂ SE (gonum stat.LinearRegression for the line).
// SMA: slope sign(r) s_y/s_x with the interval
// b (√(B + 1) ∓ √B), B = (1 − r²) t²₀.₉₇₅,ₙ₋₂/(n − 2) (Pitman 1939), as given
// by Warton, D. I., Wright, I. J., Falster, D. S. & Westoby, M. (2006),
// Bivariate line-fitting methods for allometry, Biol. Rev. 81, 259–291,
// Table 4.
func ScalingFit(x, y []float64) Fit {
	var lx, ly []float64
	for i := range x {
		if x[i] > 0 && y[i] > 0 && !math.IsInf(x[i], 0) && !math.IsInf(y[i], 0) {
			lx = append(lx, math.Log10(x[i]))
			ly = append(ly, math.Log10(y[i]))
		}
	}
	nan := math.NaN()
	f := Fit{N: len(lx), OLSSlope: nan, OLSLow: nan, OLSHigh: nan, OLSIntercept: nan, OLSInterceptLow: nan, OLSInterceptHigh: nan,
		SMASlope: nan, SMALow: nan, SMAHigh: nan, SMAIntercept: nan, SMAInterceptLow: nan, SMAInterceptHigh: nan, R2: nan}
	if f.N < 3 {
		return f
	}
	sx, sy := stat.StdDev(lx, nil), stat.StdDev(ly, nil)
	if !(sx > 0) || !(sy > 0) {
		return f
	}
	r := stat.Correlation(lx, ly, nil)
	f.R2 = r * r
	n := float64(f.N)
	t := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: n - 2}.Quantile(0.975)

	f.OLSIntercept, f.OLSSlope = stat.LinearRegression(lx, ly, nil, false)
	f.slopeIntervals(r, sx, sy, n, t)
	f.SMAIntercept = stat.Mean(ly, nil) - f.SMASlope*stat.Mean(lx, nil)

	mx := stat.Mean(lx, nil)
	sxx := sx * sx * (n - 1)
	olsSE := math.Sqrt(residualVariance(lx, ly, f.OLSIntercept, f.OLSSlope) * (1/n + mx*mx/sxx))
	f.OLSInterceptLow, f.OLSInterceptHigh = f.OLSIntercept-t*olsSE, f.OLSIntercept+t*olsSE
	varB := f.SMASlope * f.SMASlope * (1 - r*r) / (n - 2)
	smaSE := math.Sqrt(residualVariance(lx, ly, f.SMAIntercept, f.SMASlope)/n + mx*mx*varB)
	f.SMAInterceptLow, f.SMAInterceptHigh = f.SMAIntercept-t*smaSE, f.SMAIntercept+t*smaSE
	return f
}

// slopeIntervals sets the OLS slope's 95 % interval, the SMA slope and its
// interval from the correlation r, the standard deviations of the logs, n
// and Student's t (the formulas in ScalingFit's comment), once f.OLSSlope
// is set.
func (f *Fit) slopeIntervals(r, sx, sy, n, t float64) {
	se := sy / sx * math.Sqrt((1-r*r)/(n-2))
	f.OLSLow, f.OLSHigh = f.OLSSlope-t*se, f.OLSSlope+t*se

	sign := 1.0
	if r < 0 {
		sign = -1
	}
	f.SMASlope = sign * sy / sx
	b := (1 - r*r) * t * t / (n - 2)
	lo, hi := f.SMASlope*(math.Sqrt(b+1)-math.Sqrt(b)), f.SMASlope*(math.Sqrt(b+1)+math.Sqrt(b))
	f.SMALow, f.SMAHigh = math.Min(lo, hi), math.Max(lo, hi)
}

// residualVariance is Σ(y − a − b x)²/(n − 2).
func residualVariance(x, y []float64, a, b float64) float64 {
	ss := 0.0
	for i := range x {
		e := y[i] - a - b*x[i]
		ss += e * e
	}
	return ss / float64(len(x)-2)
}
