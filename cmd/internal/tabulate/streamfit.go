package tabulate

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// laneSum adds n values given one at a time in the order gonum's
// floats.Sum (v0.17.0, internal/asm/f64) adds a 16-byte-aligned slice of
// them, so that the total is the same bit for bit: on amd64 in eight lanes
// (value i in lane i mod 8) over the first n − n mod 8, lanes 6, 7 then
// folded into 0, 1 and 4, 5 into 2, 3, four more values in lanes 0–3, lanes
// 2, 3 folded into 0, 1, two more in lanes 0, 1, those two folded, the
// last value added; elsewhere one after the other.
type laneSum struct {
	n, i, stage int
	s           [8]float64
}

// stageEnds are the indices where stages 0, 1 and 2 of a sum of n end.
func (l *laneSum) stageEnd(stage int) int {
	end := l.n &^ 7
	if stage >= 1 {
		end += l.n & 4
	}
	if stage >= 2 {
		end += l.n & 2
	}
	return end
}

// fold moves the sum on to the given stage.
func (l *laneSum) fold(stage int) {
	for ; l.stage < stage; l.stage++ {
		switch l.stage {
		case 0:
			l.s[0] += l.s[6]
			l.s[1] += l.s[7]
			l.s[2] += l.s[4]
			l.s[3] += l.s[5]
		case 1:
			l.s[0] += l.s[2]
			l.s[1] += l.s[3]
		case 2:
			l.s[0] += l.s[1]
		}
	}
}

func (l *laneSum) add(v float64) {
	if !gonumLanes {
		l.s[0] += v
		return
	}
	stage := 0
	for stage < 3 && l.i >= l.stageEnd(stage) {
		stage++
	}
	l.fold(stage)
	switch stage {
	case 0:
		l.s[l.i&7] += v
	case 3:
		l.s[0] += v
	default:
		l.s[l.i-l.stageEnd(stage-1)] += v
	}
	l.i++
}

func (l *laneSum) sum() float64 {
	if gonumLanes {
		l.fold(3)
	}
	return l.s[0]
}

// pairPass calls fn on each pair (log10 x, log10 y) a scaling fit uses,
// in order; it may fail reading a spilled series.
type pairPass func(fn func(lx, ly float64)) error

// logPairs is the pass over the pairs of x and y that are both positive
// and finite, as logarithms, the filter of ScalingFit.
func logPairs(each func(fn func(x, y []float64)) error) pairPass {
	return func(fn func(lx, ly float64)) error {
		return each(func(x, y []float64) {
			for i := range x {
				if x[i] > 0 && y[i] > 0 && !math.IsInf(x[i], 0) && !math.IsInf(y[i], 0) {
					fn(math.Log10(x[i]), math.Log10(y[i]))
				}
			}
		})
	}
}

// streamFit is ScalingFit in three passes over pairs never all held at
// once, the same bit for bit: gonum's stat.Mean, StdDev, Correlation and
// LinearRegression (v0.17.0, unweighted) written out as running sums in
// their order, the sums of the means by laneSum.
func streamFit(pass pairPass) (Fit, error) {
	nan := math.NaN()
	f := Fit{OLSSlope: nan, OLSLow: nan, OLSHigh: nan, OLSIntercept: nan, OLSInterceptLow: nan, OLSInterceptHigh: nan,
		SMASlope: nan, SMALow: nan, SMAHigh: nan, SMAIntercept: nan, SMAInterceptLow: nan, SMAInterceptHigh: nan, R2: nan}
	if err := pass(func(_, _ float64) { f.N++ }); err != nil {
		return f, err
	}
	if f.N < 3 {
		return f, nil
	}
	n := float64(f.N)
	sumX, sumY := laneSum{n: f.N}, laneSum{n: f.N}
	if err := pass(func(lx, ly float64) { sumX.add(lx); sumY.add(ly) }); err != nil {
		return f, err
	}
	mx, my := sumX.sum()/n, sumY.sum()/n // stat.Mean

	// deviations from the means: stat.MeanVariance, Correlation and
	// covarianceMeans each sum these the same way
	var ssx, cx, ssy, cy, sxy float64
	err := pass(func(lx, ly float64) {
		dx, dy := lx-mx, ly-my
		ssx += dx * dx
		cx += dx
		ssy += dy * dy
		cy += dy
		sxy += dx * dy
	})
	if err != nil {
		return f, err
	}
	varX, varY := (ssx-cx*cx/n)/(n-1), (ssy-cy*cy/n)/(n-1)
	sx, sy := math.Sqrt(varX), math.Sqrt(varY)
	if !(sx > 0) || !(sy > 0) {
		return f, nil
	}
	sxx, syy := ssx-cx*cx/n, ssy-cy*cy/n
	r := (sxy - cx*cy/n) / math.Sqrt(sxx*syy)
	f.R2 = r * r
	t := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: n - 2}.Quantile(0.975)

	cov := (sxy - cx*cy/n) / (n - 1)
	f.OLSSlope = cov / varX
	f.OLSIntercept = my - f.OLSSlope*mx
	f.slopeIntervals(r, sx, sy, n, t)
	f.SMAIntercept = my - f.SMASlope*mx

	var olsRes, smaRes float64 // residualVariance of each line
	err = pass(func(lx, ly float64) {
		e := ly - f.OLSIntercept - f.OLSSlope*lx
		olsRes += e * e
		e = ly - f.SMAIntercept - f.SMASlope*lx
		smaRes += e * e
	})
	if err != nil {
		return f, err
	}
	sxx2 := sx * sx * (n - 1)
	olsSE := math.Sqrt(olsRes / (n - 2) * (1/n + mx*mx/sxx2))
	f.OLSInterceptLow, f.OLSInterceptHigh = f.OLSIntercept-t*olsSE, f.OLSIntercept+t*olsSE
	varB := f.SMASlope * f.SMASlope * (1 - r*r) / (n - 2)
	smaSE := math.Sqrt(smaRes/(n-2)/n + mx*mx*varB)
	f.SMAInterceptLow, f.SMAInterceptHigh = f.SMAIntercept-t*smaSE, f.SMAIntercept+t*smaSE
	return f, nil
}
