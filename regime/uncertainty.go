package regime

import (
	"math"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/stat/distuv"
)

// UncertainInput is a measured input with its standard uncertainty.
// Positive quantities (sizes, speeds, frequencies, masses) are drawn from a
// log-normal distribution with median Value and σ_ln = √ln(1 + (SD/Value)²),
// so they never go negative; others (temperature, salinity, altitude) from a
// normal distribution with mean Value and standard deviation SD.
type UncertainInput struct {
	Name     string
	Value    float64
	SD       float64
	Positive bool
}

func (u UncertainInput) sigma() float64 {
	if u.Positive {
		r := u.SD / u.Value
		return math.Sqrt(math.Log1p(r * r))
	}
	return u.SD
}

// Band is a median with a central 95 % interval.
type Band struct{ Median, Low95, High95 float64 }

// Uncertainty summarises how input uncertainty carries into the results.
type Uncertainty struct {
	Method            string // "monte-carlo" or "linear"
	Draws             int
	Seed              uint64
	Failed            int // draws for which the computation failed (e.g. water below freezing)
	Reynolds          Band
	Strouhal          Band
	Drag              Band
	Power             Band
	RegimeProbability map[string]float64
	LawProbability    map[string]float64
}

// Methods of propagation.
const (
	MethodMonteCarlo = "monte-carlo"
	MethodLinear     = "linear"
)

// Evaluator computes the result for input values in the order of the
// inputs into r, which the caller reuses from one evaluation to the next.
type Evaluator func(x []float64, r *Result) error

// MonteCarlo propagates the inputs' uncertainty by drawing them (see
// UncertainInput) with a PCG generator seeded by seed, evaluating each draw,
// and summarising the draws by their median and 2.5th–97.5th percentiles
// (gonum stat.Quantile, empirical) and the share of draws in each regime and
// drag law. The same seed gives the same result.
func MonteCarlo(inputs []UncertainInput, eval Evaluator, draws int, seed uint64) (Uncertainty, error) {
	if draws < 10 {
		return Uncertainty{}, errorf("at least 10 draws are needed, got %d", draws)
	}
	src := rand.NewPCG(seed, 0x666c6f77) // "flow"
	samplers := make([]func() float64, len(inputs))
	for i, in := range inputs {
		if in.Positive {
			d := distuv.LogNormal{Mu: math.Log(in.Value), Sigma: in.sigma(), Src: src}
			samplers[i] = d.Rand
		} else {
			d := distuv.Normal{Mu: in.Value, Sigma: in.SD, Src: src}
			samplers[i] = d.Rand
		}
	}
	u := Uncertainty{Method: MethodMonteCarlo, Draws: draws, Seed: seed, RegimeProbability: map[string]float64{}, LawProbability: map[string]float64{}}
	re, dr, pw := make([]float64, 0, draws), make([]float64, 0, draws), make([]float64, 0, draws)
	var st []float64
	x := make([]float64, len(inputs))
	var r Result
	for range draws {
		for i, s := range samplers {
			x[i] = s()
		}
		if err := eval(x, &r); err != nil {
			u.Failed++
			continue
		}
		re = append(re, r.Reynolds)
		if !math.IsNaN(r.Strouhal) {
			st = append(st, r.Strouhal)
		}
		dr = append(dr, r.Drag.Chosen.Force)
		pw = append(pw, r.Power.Total)
		u.RegimeProbability[r.Regime]++
		u.LawProbability[r.Drag.Chosen.Law]++
	}
	ok := draws - u.Failed
	if ok == 0 {
		return u, errorf("every draw failed; the uncertainty reaches impossible conditions")
	}
	for k := range u.RegimeProbability {
		u.RegimeProbability[k] /= float64(ok)
	}
	for k := range u.LawProbability {
		u.LawProbability[k] /= float64(ok)
	}
	u.Reynolds, u.Strouhal, u.Drag, u.Power = band(re), band(st), band(dr), band(pw)
	return u, nil
}

// band returns the median and the 2.5th and 97.5th percentiles of v as the
// empirical quantiles of gonum's stat.Quantile (the smallest value whose
// empirical CDF reaches p), found by selection rather than a full sort; v
// is reordered.
func band(v []float64) Band {
	if len(v) == 0 {
		return Band{math.NaN(), math.NaN(), math.NaN()}
	}
	lo, mid, hi := empiricalRank(0.025, len(v)), empiricalRank(0.5, len(v)), empiricalRank(0.975, len(v))
	selectRank(v, mid)
	selectRank(v[:mid], lo) // after the first selection, the smaller ranks lie left of mid
	selectRank(v[mid:], hi-mid)
	return Band{Median: v[mid], Low95: v[lo], High95: v[hi]}
}

// empiricalRank is the 0-based rank of stat.Quantile's empirical p-quantile
// of n unweighted values: the first i with i+1 ≥ p·n.
func empiricalRank(p float64, n int) int {
	return max(int(math.Ceil(p*float64(n)))-1, 0)
}

// selectRank reorders v so that v[k] is the value of rank k, smaller values
// before it and larger after (Hoare's selection, Hoare 1961, Algorithm 65:
// FIND, Commun. ACM 4, 321, with a median-of-three pivot); after 64 rounds
// without an end it sorts, so the worst case stays O(n log n). It does
// nothing when k is out of range. The values must not be NaN.
func selectRank(v []float64, k int) {
	if k < 0 || k >= len(v) {
		return
	}
	lo, hi := 0, len(v)-1
	for round := 0; lo < hi; round++ {
		if round == 64 {
			sort.Float64s(v[lo : hi+1])
			return
		}
		m := lo + (hi-lo)/2
		if v[m] < v[lo] {
			v[m], v[lo] = v[lo], v[m]
		}
		if v[hi] < v[lo] {
			v[hi], v[lo] = v[lo], v[hi]
		}
		if v[hi] < v[m] {
			v[hi], v[m] = v[m], v[hi]
		}
		pivot := v[m]
		i, j := lo, hi
		for i <= j {
			for v[i] < pivot {
				i++
			}
			for pivot < v[j] {
				j--
			}
			if i <= j {
				v[i], v[j] = v[j], v[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default: // j < k < i: v[k] equals the pivot and is in place
			return
		}
	}
}

// Linear propagates the uncertainty to first order in log space: with
// z_i = ln x_i for positive inputs (x_i for the others),
// σ²(ln q) = Σ (∂ln q/∂z_i σ_i)², derivatives by central differences, and
// each result q taken as log-normal with median q(x) and interval
// q exp(±1.96 σ). Regime probabilities follow from that distribution of Re
// on the boundaries 1 and 1000; drag-law probabilities are not given. For a
// product of powers of log-normal inputs, such as Re = UL/ν, it is exact.
func Linear(inputs []UncertainInput, eval Evaluator) (Uncertainty, error) {
	x0 := make([]float64, len(inputs))
	for i, in := range inputs {
		x0[i] = in.Value
	}
	var r Result
	if err := eval(x0, &r); err != nil {
		return Uncertainty{}, err
	}
	quantities := func(r *Result) [4]float64 {
		return [4]float64{r.Reynolds, r.Strouhal, r.Drag.Chosen.Force, r.Power.Total}
	}
	q0, regime0 := quantities(&r), r.Regime
	var variance [4]float64
	x := make([]float64, len(inputs))
	for i, in := range inputs {
		s := in.sigma()
		if s == 0 {
			continue
		}
		h := 0.01 * s
		step := func(sign float64) ([4]float64, error) {
			copy(x, x0)
			if in.Positive {
				x[i] = in.Value * math.Exp(sign*h)
			} else {
				x[i] = in.Value + sign*h
			}
			err := eval(x, &r)
			return quantities(&r), err
		}
		up, err1 := step(1)
		dn, err2 := step(-1)
		if err1 != nil || err2 != nil {
			return Uncertainty{}, errorf("linear propagation failed near the measured %s; use Monte Carlo", in.Name)
		}
		for k := range variance {
			d := (math.Log(up[k]) - math.Log(dn[k])) / (2 * h)
			variance[k] += d * d * s * s
		}
	}
	bands := [4]Band{}
	for k, q := range q0 {
		sd := math.Sqrt(variance[k])
		bands[k] = Band{q, q * math.Exp(-1.96*sd), q * math.Exp(1.96*sd)}
		if math.IsNaN(q) {
			bands[k] = Band{math.NaN(), math.NaN(), math.NaN()}
		}
	}
	u := Uncertainty{Method: MethodLinear, Reynolds: bands[0], Strouhal: bands[1], Drag: bands[2], Power: bands[3], RegimeProbability: map[string]float64{}}
	sd := math.Sqrt(variance[0])
	pv := 0.0
	if sd > 0 {
		nrm := distuv.UnitNormal
		pv = nrm.CDF((math.Log(1) - math.Log(q0[0])) / sd)
		pi := nrm.CDF((math.Log(1000)-math.Log(q0[0]))/sd) - pv
		u.RegimeProbability = map[string]float64{RegimeViscous: pv, RegimeIntermediate: pi, RegimeInertial: 1 - pv - pi}
	} else {
		u.RegimeProbability[regime0] = 1
	}
	return u, nil
}
