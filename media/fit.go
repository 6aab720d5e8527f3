package media

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat"
)

// RheometerPoint is one steady-shear measurement.
type RheometerPoint struct {
	ShearRate float64 // 1/s
	Stress    float64 // Pa
}

// ModelFit is one model fitted to rheometer data.
type ModelFit struct {
	Model     Model
	Params    []Param
	StdErrors []float64 // aligned with Params; NaN where not identified
	R2        float64   // on ln τ
	RMSRel    float64   // root-mean-square of τ_model/τ − 1
	AICc      float64
	Warnings  []string
	Err       error // set when the model could not be fitted
}

// FitReport is the fit of every model, the best by AICc and the class of
// the fluid with the evidence for it.
type FitReport struct {
	Fits     []ModelFit
	Best     string
	Class    string // "newtonian", "shear-thinning", "shear-thickening" or "yield-stress"
	Rule     string // the rule the class follows ([ClassRule])
	Evidence []string
	Warnings []string
	N        int
	MinRate  float64
	MaxRate  float64
}

// Fluid classes.
const (
	ClassNewtonian  = "newtonian"
	ClassThinning   = "shear-thinning"
	ClassThickening = "shear-thickening"
	ClassYield      = "yield-stress"
)

// FitRheology fits every model of [ModelNames] to the points by least
// squares on log residuals, r = ln τ_model − ln τ (the same as log
// residuals of apparent viscosity), which weights every decade of shear
// rate alike. Parameters are kept physical by transforms (positive
// parameters as exp θ; flow indices in 0.05–2). The minimum is found by
// Levenberg–Marquardt from several starts (levenbergMarquardt); standard
// errors come from the Jacobian of the residuals in the natural parameters
// at the optimum, s²(JᵀJ)⁻¹ with s² = SSR/(n − p). AICc = n ln(SSR/n) + 2k +
// 2k(k+1)/(n − k − 1) with k = p + 1 counting the error variance (Burnham &
// Anderson 2002, Model Selection and Multimodel Inference, eq. 2.14).
func FitRheology(points []RheometerPoint) (FitReport, error) {
	var rep FitReport
	var pts []RheometerPoint
	for i, p := range points {
		if !(p.ShearRate > 0) || !(p.Stress > 0) || math.IsInf(p.ShearRate, 0) || math.IsInf(p.Stress, 0) {
			rep.Warnings = append(rep.Warnings, fmt.Sprintf("point %d (shear rate %g 1/s, stress %g Pa) is not positive and finite; left out", i+1, p.ShearRate, p.Stress))
			continue
		}
		pts = append(pts, p)
	}
	sort.Slice(pts, func(i, j int) bool { return pts[i].ShearRate < pts[j].ShearRate })
	rep.N = len(pts)
	if rep.N < 3 {
		return rep, errorf("%d usable points; a fit needs at least 3 (5 or more to compare models)", rep.N)
	}
	rep.MinRate, rep.MaxRate = pts[0].ShearRate, pts[rep.N-1].ShearRate
	decades := math.Log10(rep.MaxRate / rep.MinRate)
	if rep.N < 8 {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf("only %d points: models with 4–5 parameters are barely constrained", rep.N))
	}
	if decades < 1 {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf("shear rate spans only %.2g decades (%.3g–%.3g 1/s): the flow index and time constants cannot be identified; measure over 2 decades or more", decades, rep.MinRate, rep.MaxRate))
	}
	// A fall of more than 5 % between neighbouring points is more than
	// rheometer noise (common practice, no single source).
	for i := 1; i < rep.N; i++ {
		if pts[i].Stress < pts[i-1].Stress*0.95 {
			rep.Warnings = append(rep.Warnings, fmt.Sprintf("stress falls from %.4g to %.4g Pa as shear rate rises from %.4g to %.4g 1/s: the flow curve is not monotonic (wall slip, shear banding, thixotropy or edge fracture?); no model here describes that", pts[i-1].Stress, pts[i].Stress, pts[i-1].ShearRate, pts[i].ShearRate))
			break
		}
	}
	for _, name := range ModelNames {
		rep.Fits = append(rep.Fits, fitOne(name, pts, decades, searchPoints))
	}
	best := -1
	for i, f := range rep.Fits {
		if f.Err == nil && !math.IsNaN(f.AICc) && (best < 0 || f.AICc < rep.Fits[best].AICc) {
			best = i
		}
	}
	if best < 0 {
		return rep, errorf("no model could be fitted to the data")
	}
	rep.Best = rep.Fits[best].Model.Name()
	minStress := pts[0].Stress
	for _, p := range pts {
		minStress = math.Min(minStress, p.Stress)
	}
	rep.classify(best, minStress)
	return rep, nil
}

// The yield-stress rule. A yield stress fitted to flow-curve data is an
// extrapolation below the lowest measured rate (Barnes, H. A. (1999), The
// yield stress—a review or 'παντα ρει'—everything flows?, J. Non-Newtonian
// Fluid Mech. 81, 133–178), so a fluid is classed yield-stress only when
// the fitted yield stress is (1) significantly above zero (95 % interval),
// (2) a material share of the stress actually measured, at least
// YieldShareMin of the lowest measured stress (10 %: common practice, no
// source), which a stress levelling off at low rates gives and a pure power
// law does not, and (3) the best yield model beats the best model without a
// yield stress by more than YieldAICcMargin in AICc (2: Burnham & Anderson
// 2002, §2.6, below which both models have substantial support).
const (
	YieldShareMin   = 0.10
	YieldAICcMargin = 2.0
)

// ClassRule states the rule [FitReport].Class follows.
const ClassRule = "yield-stress when the fitted yield stress is above zero at 95 %, at least 10 % of the lowest measured stress, " +
	"and its model beats every model without a yield stress by ΔAICc > 2; otherwise shear-thinning or shear-thickening when the " +
	"power-law flow index's 95 % interval lies below or above 1 and the best model is not Newtonian; otherwise newtonian"

// classify names the fluid's class by [ClassRule], with the evidence;
// minStress is the lowest measured stress (Pa).
func (rep *FitReport) classify(best int, minStress float64) {
	bf := rep.Fits[best]
	rep.Rule = ClassRule
	rep.Evidence = append(rep.Evidence, fmt.Sprintf("best model by AICc: %s (AICc %.4g)", rep.Best, bf.AICc))
	if ty := YieldStress(bf.Model); ty > 0 && rep.yieldEvident(bf, ty, minStress) {
		rep.Class = ClassYield
		if hb, ok := bf.Model.(HerschelBulkley); ok {
			nse := bf.StdErrors[indexParam(bf.Params, PFlowIndex)]
			switch {
			case hb.N+1.96*nse < 1:
				rep.Evidence = append(rep.Evidence, fmt.Sprintf("shear-thinning above yield: Herschel–Bulkley flow index %.3g ± %.2g", hb.N, nse))
			case hb.N-1.96*nse > 1:
				rep.Evidence = append(rep.Evidence, fmt.Sprintf("shear-thickening above yield: Herschel–Bulkley flow index %.3g ± %.2g", hb.N, nse))
			default:
				rep.Evidence = append(rep.Evidence, fmt.Sprintf("no thinning above yield beyond error: flow index %.3g ± %.2g", hb.N, nse))
			}
		}
		return
	}
	pl := rep.Fits[1] // power law
	if pl.Err != nil {
		rep.Class = ClassNewtonian
		return
	}
	n, se := pl.Params[1].Value, pl.StdErrors[1]
	lo, hi := n-1.96*se, n+1.96*se
	switch {
	case rep.Best != ModelNewtonian && hi < 1:
		rep.Class = ClassThinning
	case rep.Best != ModelNewtonian && lo > 1:
		rep.Class = ClassThickening
	default:
		rep.Class = ClassNewtonian
	}
	rep.Evidence = append(rep.Evidence, fmt.Sprintf("power-law flow index n = %.4g ± %.2g (95 %% interval %.4g–%.4g; n = 1 is Newtonian)", n, se, lo, hi))
	if rep.Class == ClassNewtonian {
		rep.Evidence = append(rep.Evidence, fmt.Sprintf("viscosity %.4g ± %.2g Pa·s", rep.Fits[0].Params[0].Value, rep.Fits[0].StdErrors[0]))
	}
}

// yieldEvident applies the three tests of the yield-stress rule to the best
// fit's yield stress ty and records each result as evidence.
func (rep *FitReport) yieldEvident(bf ModelFit, ty, minStress float64) bool {
	se := bf.StdErrors[indexParam(bf.Params, PYield)]
	significant := !math.IsNaN(se) && ty-1.96*se > 0
	share := ty / minStress
	margin := math.Inf(1) // no model without a yield stress could be fitted
	for _, f := range rep.Fits {
		if f.Err == nil && !math.IsNaN(f.AICc) && YieldStress(f.Model) == 0 {
			margin = math.Min(margin, f.AICc-bf.AICc)
		}
	}
	ok := significant && share >= YieldShareMin && margin > YieldAICcMargin
	verdict := "is not evidence of a yield stress"
	if ok {
		verdict = "is evidence of a yield stress"
	}
	rep.Evidence = append(rep.Evidence, fmt.Sprintf("yield stress %.4g ± %.2g Pa (95 %% interval %.4g–%.4g Pa), %.3g %% of the lowest measured stress %.4g Pa, ΔAICc %.3g against the best model without one: %s",
		ty, se, ty-1.96*se, ty+1.96*se, 100*share, minStress, margin, verdict))
	return ok
}

func indexParam(ps []Param, name string) int {
	for i, p := range ps {
		if p.Name == name {
			return i
		}
	}
	return -1
}

// paramSpec says how an unconstrained θ maps to a natural parameter.
type paramSpec struct {
	name   string
	lo, hi float64 // hi > lo: bounded by a logistic map; else positive by exp
	log    bool    // bounds are on ln of the value
}

func (s paramSpec) natural(t float64) float64 {
	if s.hi > s.lo {
		v := s.lo + (s.hi-s.lo)/(1+math.Exp(-t))
		if s.log {
			return math.Exp(v)
		}
		return v
	}
	return math.Exp(t)
}

func (s paramSpec) theta(v float64) float64 {
	if s.hi > s.lo {
		if s.log {
			v = math.Log(math.Max(v, 1e-300))
		}
		f := (v - s.lo) / (s.hi - s.lo)
		f = math.Min(math.Max(f, 1e-6), 1-1e-6)
		return math.Log(f / (1 - f))
	}
	return math.Log(math.Max(v, 1e-300))
}

// atBound reports whether v sits at the edge of its search range.
func (s paramSpec) atBound(v float64) bool {
	if !(s.hi > s.lo) {
		return false
	}
	x := v
	if s.log {
		x = math.Log(v)
	}
	f := (x - s.lo) / (s.hi - s.lo)
	return f < 1e-4 || f > 1-1e-4
}

var nSpec = paramSpec{name: PFlowIndex, lo: 0.05, hi: 2}

type modelSpec struct {
	params  []paramSpec
	build   func(p []float64) Model
	starts  func(pts []RheometerPoint) [][]float64
	plateau bool // the first parameter is fitted as η₀ − η∞
}

// searchRanges are the search ranges of the plateau models' parameters.
type searchRanges struct{ eta0, etaInf, lambda paramSpec }

// pos is a positive parameter searched without bounds.
func pos(n string) paramSpec { return paramSpec{name: n} }

// spec returns the named model of the model table with search ranges. Time
// constants are kept within 1e-3/γ̇_max to 1e3/γ̇_min and plateau
// viscosities within 1e3 times the largest measured viscosity, so that a
// plateau model fitted to data without a plateau stops at a stated bound
// instead of drifting to meaningless numbers.
func spec(name string, pts []RheometerPoint) modelSpec {
	d, _ := modelDefOf(name)
	lo, hi := etaRange(pts)
	r := searchRanges{
		eta0:   paramSpec{name: PZero, lo: math.Log(lo * 1e-6), hi: math.Log(hi * 1e3), log: true},
		etaInf: paramSpec{name: PInfinite, lo: math.Log(lo * 1e-9), hi: math.Log(hi * 1e3), log: true},
		lambda: paramSpec{name: PTime, lo: math.Log(1e-3 / pts[len(pts)-1].ShearRate), hi: math.Log(1e3 / pts[0].ShearRate), log: true},
	}
	sp := modelSpec{params: d.search(r), starts: d.starts, plateau: d.plateau()}
	sp.build = func(p []float64) Model {
		var q params
		copy(q[:], p)
		if sp.plateau {
			q[0] += q[1]
		}
		return d.make(q)
	}
	return sp
}

// For Cross and Carreau models the fitted parameters are η₀ − η∞ and η∞, so
// that η₀ ≥ η∞ always; they are reported as η₀ and η∞.

func clampN(n float64) float64 { return math.Min(math.Max(n, 0.1), 1.9) }

func geoMeanViscosity(pts []RheometerPoint) float64 {
	s := 0.0
	for _, p := range pts {
		s += math.Log(p.Stress / p.ShearRate)
	}
	return math.Exp(s / float64(len(pts)))
}

// logLogLine fits ln τ = ln K + n ln γ̇ by ordinary least squares.
func logLogLine(pts []RheometerPoint) (k, n float64) {
	x, y := make([]float64, len(pts)), make([]float64, len(pts))
	for i, p := range pts {
		x[i], y[i] = math.Log(p.ShearRate), math.Log(p.Stress)
	}
	a, b := stat.LinearRegression(x, y, nil, false)
	return math.Exp(a), b
}

func etaRange(pts []RheometerPoint) (lo, hi float64) {
	lo, hi = math.Inf(1), 0
	for _, p := range pts {
		e := p.Stress / p.ShearRate
		lo, hi = math.Min(lo, e), math.Max(hi, e)
	}
	return lo, hi
}

func plateauStarts(carreau bool) func([]RheometerPoint) [][]float64 {
	return func(pts []RheometerPoint) [][]float64 {
		lo, hi := etaRange(pts)
		_, n := logLogLine(pts)
		var out [][]float64
		for _, f := range []float64{0.01, 0.1, 1, 10, 100} {
			lam := f / math.Sqrt(pts[0].ShearRate*pts[len(pts)-1].ShearRate)
			if carreau {
				out = append(out, []float64{hi * 1.2, lo * 0.1, lam, clampN(n)})
			} else {
				out = append(out, []float64{hi * 1.2, lo * 0.1, lam, math.Min(math.Max(1-n, 0.3), 2.5)})
			}
		}
		return out
	}
}

func plateauStartsA(pts []RheometerPoint) [][]float64 {
	var out [][]float64
	for _, s := range plateauStarts(true)(pts) {
		out = append(out, append(append([]float64{}, s...), 2), append(append([]float64{}, s...), 0.7))
	}
	return out
}

func binghamStarts(pts []RheometerPoint) [][]float64 {
	x, y := make([]float64, len(pts)), make([]float64, len(pts))
	for i, p := range pts {
		x[i], y[i] = p.ShearRate, p.Stress
	}
	a, b := stat.LinearRegression(x, y, nil, false)
	return [][]float64{{math.Max(a, pts[0].Stress*0.1), math.Max(b, 1e-6)}, {pts[0].Stress * 0.5, math.Max(b, 1e-6)}}
}

func hbStarts(pts []RheometerPoint) [][]float64 {
	var out [][]float64
	for _, f := range []float64{0.01, 0.3, 0.7} {
		ty := pts[0].Stress * f
		q := make([]RheometerPoint, 0, len(pts))
		for _, p := range pts {
			if p.Stress > ty {
				q = append(q, RheometerPoint{p.ShearRate, p.Stress - ty})
			}
		}
		if len(q) < 2 {
			continue
		}
		k, n := logLogLine(q)
		out = append(out, []float64{ty, k, clampN(n)})
	}
	return out
}

func cassonStarts(pts []RheometerPoint) [][]float64 {
	x, y := make([]float64, len(pts)), make([]float64, len(pts))
	for i, p := range pts {
		x[i], y[i] = math.Sqrt(p.ShearRate), math.Sqrt(p.Stress)
	}
	a, b := stat.LinearRegression(x, y, nil, false)
	return [][]float64{{math.Max(a*a, pts[0].Stress*0.01), math.Max(b*b, 1e-9)}, {pts[0].Stress * 0.5, math.Max(b*b, 1e-9)}}
}

// localSearch finds the least-squares optimum near theta of the n
// residuals res writes, in at most maxIter iterations, returning it and
// its sum of squares (never worse than theta's).
type localSearch func(res func(theta, r []float64), n int, theta []float64, maxIter int) ([]float64, float64)

// The search goes startIterations from each start, then on from the best
// of those to searchIterations in all. A parameter the data do not
// identify creeps along a flat valley towards the edge of its range for
// as long as it is let; only the best start is let go that far, except on
// a thinned search, whose every optimum refine takes on to all points.
const (
	startIterations  = 30
	searchIterations = 200
)

// fitOne fits one model, searching on at most searchN of the points by
// Levenberg–Marquardt from each start, which needs a few dozen
// evaluations of the residuals where Nelder–Mead then BFGS on their sum of
// squares needed thousands for the same optimum.
func fitOne(name string, pts []RheometerPoint, decades float64, searchN int) ModelFit {
	return fitWith(name, pts, decades, searchN, func(res func(theta, r []float64), n int, theta []float64, maxIter int) ([]float64, float64) {
		return levenbergMarquardt(res, theta, n, maxIter)
	})
}

// fitWith is fitOne with the search from each start made by local.
func fitWith(name string, pts []RheometerPoint, decades float64, searchN int, local localSearch) ModelFit {
	sp := spec(name, pts)
	k := len(sp.params)
	n := len(pts)
	var mf ModelFit
	if n < k+2 {
		mf.Err = fmt.Errorf("%d points are too few for %d parameters", n, k)
		mf.Model = sp.build(make([]float64, k))
		mf.AICc = math.NaN()
		return mf
	}
	natural := func(theta []float64) []float64 {
		p := make([]float64, k)
		for i, s := range sp.params {
			p[i] = s.natural(theta[i])
		}
		return p
	}
	// The search works on at most searchPoints of the points; a thinned
	// fit is then refined on all of them.
	search := thin(pts, searchN)
	res := logResiduals(sp, natural, search)
	bestF, bestTheta, best := math.Inf(1), []float64(nil), 0
	iterations := startIterations
	if len(search) < n {
		iterations = searchIterations // refine takes every start on from where it stops
	}
	var found [][]float64 // each start's optimum on the search points
	for _, st := range sp.starts(search) {
		theta := make([]float64, k)
		for i, s := range sp.params {
			v := st[i]
			if sp.plateau && i == 0 {
				v = math.Max(st[0]-st[1], st[0]*1e-3) // η₀ − η∞
			}
			theta[i] = s.theta(v)
		}
		th, f := local(res, len(search), theta, iterations)
		if f < bestF {
			bestF, bestTheta, best = f, th, len(found)
		}
		found = append(found, th)
	}
	if bestTheta != nil && iterations < searchIterations {
		bestTheta, bestF = local(res, len(search), bestTheta, searchIterations-iterations)
		found[best] = bestTheta
	}
	if bestTheta != nil && len(search) < n {
		bestTheta, bestF = refine(sp, natural, pts, found)
	}
	if bestTheta == nil || math.IsInf(bestF, 0) || bestF >= math.MaxFloat64 {
		mf.Err = fmt.Errorf("the optimiser found no finite fit")
		mf.Model = sp.build(make([]float64, k))
		mf.AICc = math.NaN()
		return mf
	}
	p := natural(bestTheta)
	mf.Model = sp.build(p)
	mf.Params = mf.Model.Params()
	mf.StdErrors = standardErrors(sp, p, pts, bestF, name)
	// Quality.
	var sst, rel float64
	lnMean := 0.0
	for _, q := range pts {
		lnMean += math.Log(q.Stress)
	}
	lnMean /= float64(n)
	for _, q := range pts {
		d := math.Log(q.Stress) - lnMean
		sst += d * d
		e := mf.Model.Stress(q.ShearRate)/q.Stress - 1
		rel += e * e
	}
	mf.R2 = 1 - bestF/sst
	if sst == 0 {
		mf.R2 = math.NaN()
	}
	mf.RMSRel = math.Sqrt(rel / float64(n))
	kk := float64(k + 1)
	nn := float64(n)
	sse := math.Max(bestF, 1e-300)
	if nn-kk-1 > 0 {
		mf.AICc = nn*math.Log(sse/nn) + 2*kk + 2*kk*(kk+1)/(nn-kk-1)
	} else {
		mf.AICc = math.NaN()
		mf.Warnings = append(mf.Warnings, "too few points for AICc")
	}
	for i, s := range sp.params {
		if s.atBound(p[i]) {
			mf.Warnings = append(mf.Warnings, fmt.Sprintf("%s stopped at the edge of its search range (%.3g): the data do not constrain it", s.name, p[i]))
		}
	}
	for i, pr := range mf.Params {
		if se := mf.StdErrors[i]; math.IsNaN(se) || se > math.Abs(pr.Value) && pr.Name != PYield && pr.Name != PInfinite {
			if math.IsNaN(se) { // the curvature matrix is singular in this parameter
				mf.Warnings = append(mf.Warnings, fmt.Sprintf("%s is not identified by these data (no standard error can be computed; value %.4g)", pr.Name, pr.Value))
				continue
			}
			mf.Warnings = append(mf.Warnings, fmt.Sprintf("%s is not identified by these data (standard error %.2g against %.4g)", pr.Name, se, pr.Value))
		}
	}
	if lam := timeConstant(mf.Model); lam > 0 && (1/lam < pts[0].ShearRate || 1/lam > pts[n-1].ShearRate) {
		mf.Warnings = append(mf.Warnings, fmt.Sprintf("the transition 1/λ = %.3g 1/s lies outside the measured %.3g–%.3g 1/s: a plateau is extrapolated, not seen", 1/lam, pts[0].ShearRate, pts[n-1].ShearRate))
	}
	if decades < 2 && (name == ModelCross || name == ModelCarreau || name == ModelCarreauYasuda) {
		mf.Warnings = append(mf.Warnings, fmt.Sprintf("%.2g decades of shear rate are too few to identify a plateau model's four or five parameters", decades))
	}
	return mf
}

// refine takes the search's optima to all the points: each is refined on
// an even selection of refinePoints of them, and the best of those on
// every point, all by Levenberg–Marquardt (at most 100 and 20 iterations:
// a parameter the data do not identify creeps along a flat valley towards
// the edge of its range, where it is reported as such, at any number).
func refine(sp modelSpec, natural func([]float64) []float64, pts []RheometerPoint, found [][]float64) ([]float64, float64) {
	mid := thin(pts, refinePoints)
	bestF, bestTheta := math.Inf(1), []float64(nil)
	for _, th := range found {
		if t, f := levenbergMarquardt(logResiduals(sp, natural, mid), th, len(mid), 100); f < bestF {
			bestF, bestTheta = f, t
		}
	}
	if len(mid) < len(pts) {
		bestTheta, bestF = levenbergMarquardt(logResiduals(sp, natural, pts), bestTheta, len(pts), 20)
	}
	return bestTheta, bestF
}

// logResiduals returns the function that writes ln τ_model − ln τ at
// every point for θ.
func logResiduals(sp modelSpec, natural func([]float64) []float64, pts []RheometerPoint) func(theta, r []float64) {
	logStress := make([]float64, len(pts))
	for i, q := range pts {
		logStress[i] = math.Log(q.Stress)
	}
	return func(theta, r []float64) {
		m := sp.build(natural(theta))
		for i, q := range pts {
			r[i] = math.Log(m.Stress(q.ShearRate)) - logStress[i]
		}
	}
}

// refinePoints is the size of the selection each search optimum is
// refined on before the best goes to every point.
const refinePoints = 2000

// searchPoints bounds the points the multi-start search evaluates: it
// takes thousands of evaluations per start, so larger data sets are
// searched on an even selection of searchPoints of them (by rank of shear
// rate, the first and last included) and the best fit is refined on every
// point by Levenberg–Marquardt, which takes a few dozen evaluations. The
// time then grows linearly with the number of points. Data sets of up to
// searchPoints points are fitted as before, on every point throughout.
const searchPoints = 64

// thin returns at most m of the sorted points, evenly by rank, the first
// and last included; pts itself when it has no more than m.
func thin(pts []RheometerPoint, m int) []RheometerPoint {
	n := len(pts)
	if n <= m {
		return pts
	}
	out := make([]RheometerPoint, m)
	for i := range out {
		out[i] = pts[int(math.Round(float64(i)*float64(n-1)/float64(m-1)))]
	}
	return out
}

// levenbergMarquardt minimises the sum of squares of the n residuals that
// res writes for θ, starting at theta (Levenberg 1944, A method for the
// solution of certain non-linear problems in least squares, Q. Appl. Math.
// 2, 164; Marquardt 1963, An algorithm for least-squares estimation of
// nonlinear parameters, J. SIAM 11, 431, with the damping scaled by
// diag(JᵀJ)). The Jacobian is taken by forward differences. It stops after
// maxIter iterations or when an iteration lowers the sum of squares by less
// than 1e-10 of it, and returns the best θ found and its sum of squares,
// which is never worse than theta's.
func levenbergMarquardt(res func(theta, r []float64), theta []float64, n, maxIter int) ([]float64, float64) {
	k := len(theta)
	r, trial := make([]float64, n), make([]float64, n)
	sumSq := sumSquares
	x := append([]float64{}, theta...)
	res(x, r)
	f := sumSq(r)
	cols := make([][]float64, k)
	for c := range cols {
		cols[c] = make([]float64, n)
	}
	lambda := 1e-3
	for iter := 0; iter < maxIter && f < math.MaxFloat64; iter++ {
		// Jacobian columns by forward differences.
		xx := append([]float64{}, x...)
		for c := range k {
			h := 1e-7 * math.Max(math.Abs(x[c]), 1)
			xx[c] = x[c] + h
			res(xx, cols[c])
			xx[c] = x[c]
			for i := range cols[c] {
				cols[c][i] = (cols[c][i] - r[i]) / h
			}
		}
		jtj := mat.NewSymDense(k, nil)
		jtr := make([]float64, k)
		for a := range k {
			for b := a; b < k; b++ {
				jtj.SetSym(a, b, floats.Dot(cols[a], cols[b]))
			}
			jtr[a] = floats.Dot(cols[a], r)
		}
		maxDiag := 0.0
		for a := range k {
			maxDiag = math.Max(maxDiag, jtj.At(a, a))
		}
		improved := false
		for range 12 {
			damped := mat.NewSymDense(k, nil)
			damped.CopySym(jtj)
			for a := range k {
				// Marquardt's scaling, floored so that a parameter the data
				// hardly move (at the edge of its range) is still damped.
				damped.SetSym(a, a, jtj.At(a, a)+lambda*math.Max(jtj.At(a, a), 1e-9*maxDiag))
			}
			var chol mat.Cholesky
			var step mat.VecDense
			if !chol.Factorize(damped) || chol.SolveVecTo(&step, mat.NewVecDense(k, jtr)) != nil {
				lambda *= 10
				continue
			}
			next := make([]float64, k)
			for a := range k {
				next[a] = x[a] - step.AtVec(a)
			}
			res(next, trial)
			if ft := sumSq(trial); ft < f {
				converged := f-ft <= 1e-10*f
				x, f = next, ft
				r, trial = trial, r
				lambda = math.Max(lambda/10, 1e-12)
				improved = !converged
				break
			}
			lambda *= 10
		}
		if !improved {
			break
		}
	}
	return x, f
}

// standardErrors returns √diag(s²(JᵀJ)⁻¹) in the natural parameters, with the
// Jacobian of the log residuals by central differences.
func standardErrors(sp modelSpec, p []float64, pts []RheometerPoint, ssr float64, name string) []float64 {
	k, n := len(p), len(pts)
	// Differentiate with respect to the reported parameters: for plateau
	// models η₀ rather than η₀ − η∞.
	rep := append([]float64{}, p...)
	plateau := sp.plateau
	if plateau {
		rep[0] = p[0] + p[1]
	}
	build := func(q []float64) Model {
		c := append([]float64{}, q...)
		if plateau {
			c[0] = q[0] - q[1]
		}
		return sp.build(c)
	}
	out := make([]float64, k)
	for i := range out {
		out[i] = math.NaN()
	}
	if n <= k {
		return out
	}
	j := mat.NewDense(n, k, nil)
	for c := 0; c < k; c++ {
		h := math.Max(math.Abs(rep[c])*1e-6, 1e-12)
		up, dn := append([]float64{}, rep...), append([]float64{}, rep...)
		up[c] += h
		dn[c] = math.Max(dn[c]-h, 0)
		if plateau && c == 1 && dn[c] > dn[0] || plateau && c == 0 && up[0] < up[1] {
			continue
		}
		mu, md := build(up), build(dn)
		for r, q := range pts {
			j.Set(r, c, (math.Log(mu.Stress(q.ShearRate))-math.Log(md.Stress(q.ShearRate)))/(up[c]-dn[c]))
		}
	}
	var jtj mat.SymDense
	jtj.SymOuterK(1, j.T())
	var chol mat.Cholesky
	if !chol.Factorize(&jtj) {
		return out
	}
	var inv mat.SymDense
	if err := chol.InverseTo(&inv); err != nil {
		return out
	}
	s2 := ssr / float64(n-k)
	for i := range out {
		if v := inv.At(i, i) * s2; v >= 0 && !math.IsInf(v, 0) {
			out[i] = math.Sqrt(v)
		}
	}
	return out
}

// sumSquares is the sum of squared residuals, or the largest float64 when
// it is not finite, so that a search step into a region where the model
// breaks down is never taken.
func sumSquares(r []float64) float64 {
	s := 0.0
	for _, v := range r {
		s += v * v
	}
	if math.IsNaN(s) || math.IsInf(s, 0) {
		return math.MaxFloat64
	}
	return s
}
