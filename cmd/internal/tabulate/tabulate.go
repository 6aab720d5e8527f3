// Package tabulate summarises batch results per group: counts, medians and
// 5th–95th percentiles, the share of rows in each flow regime, and scaling
// fits in log–log space.
package tabulate

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"runtime"
	"slices"
	"strings"
	"sync"
	"unsafe"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/decimal"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/regime"
)

// Metrics are the summarised computed columns.
var Metrics = []string{"reynolds", "strouhal", "drag_N", "power_W"}

// Pair names a fit of Y against X: each a computed column or an input
// quantity (length, mass, …) read in SI from its column.
type Pair struct{ Y, X string }

// Spec says how to group and what to fit.
type Spec struct {
	By   []string
	Fits []Pair
}

// Stat is a distribution summary.
type Stat struct {
	N               int
	Median, P5, P95 float64
}

// FitResult is one scaling fit within a group.
type FitResult struct {
	Pair
	Fit
}

// Group is the summary of one group.
type Group struct {
	Key     []string
	N       int
	Stats   map[string]Stat
	Regimes map[string]float64 // share of rows, 0–1
	Fits    []FitResult
}

// acc gathers one group's values: per metric (in the order of Metrics),
// per regime (in the order of regimeNames) and per fit, in slices
// rather than maps, so that a group costs a few hundred bytes besides its
// values. line is the line of the group's first row in the input.
// regimeNames is regime.Regimes, asked once.
var regimeNames = regime.Regimes()

type acc struct {
	id      string // key joined by NUL
	key     []string
	n       int
	line    int
	metric  []series
	regimes []int
	fx, fy  []series
}

// MaxGroups bounds the number of groups. A summary is for groups of many
// rows; a grouping that makes more groups than this (such as one by a row
// id) is refused with a message instead of holding them all in memory.
const MaxGroups = 100000

// TooManyGroups is the error of a grouping that makes more than MaxGroups
// groups.
type TooManyGroups struct{ By []string }

func (e TooManyGroups) Error() string {
	return fmt.Sprintf("--by %s makes more than %d groups; a summary is for groups of many rows (group by fewer or coarser columns, or read the batch output row by row)", strings.Join(e.By, ","), MaxGroups)
}

// column reads one named value from a row.
type column struct {
	idx  int
	kind quantity.Kind
	unit string
	si   bool // parse with units to SI
}

// layout says where the values a summary reads are in a row.
type layout struct {
	spec   Spec
	by     []int
	metric []column // in the order of Metrics
	regime int
	fits   [][2]column // y, x
}

// newLayout finds the columns of spec, the metrics and the regime in
// header.
func newLayout(header []string, spec Spec) (*layout, error) {
	find := func(name string) (column, error) {
		for i, h := range header {
			if strings.TrimSpace(h) == name {
				return column{idx: i}, nil
			}
		}
		if f := inputs.Index(name); f >= 0 && !inputs.Fields[f].Text {
			for i, h := range header {
				if field, unit := batch.MatchHeader(h); field == name {
					return column{idx: i, kind: inputs.Fields[f].Kind, unit: unit, si: true}, nil
				}
			}
		}
		return column{}, fmt.Errorf("no column %q; columns are: %s", name, strings.Join(header, ", "))
	}
	l := &layout{spec: spec}
	for _, b := range spec.By {
		c, err := find(b)
		if err != nil {
			return nil, fmt.Errorf("--by: %v", err)
		}
		l.by = append(l.by, c.idx)
	}
	for _, m := range Metrics {
		c, err := find(m)
		if err != nil {
			return nil, fmt.Errorf("the input has no %q column; give batch output or a survey table", m)
		}
		l.metric = append(l.metric, column{idx: c.idx}) // read as a plain number
	}
	regimeCol, err := find("regime")
	if err != nil {
		return nil, fmt.Errorf("the input has no \"regime\" column; give batch output or a survey table")
	}
	l.regime = regimeCol.idx
	for _, p := range spec.Fits {
		y, err := find(p.Y)
		if err != nil {
			return nil, fmt.Errorf("--fit %s=%s: %v", p.Y, p.X, err)
		}
		x, err := find(p.X)
		if err != nil {
			return nil, fmt.Errorf("--fit %s=%s: %v", p.Y, p.X, err)
		}
		l.fits = append(l.fits, [2]column{y, x})
	}
	return l, nil
}

// groupSet holds accumulators by key, in the order their groups first
// appear. With a budget, values past it go to a spill file.
type groupSet struct {
	byKey map[string]*acc
	order []*acc
	limit int    // most groups allowed; 0 for no limit
	buf   []byte // the key being looked up

	budget   int // most values held in memory; 0 for no limit
	held     int // values held in memory
	spill    *spillFile
	tempFile func() (*os.File, error)
}

func newGroupSet(limit int) *groupSet {
	return &groupSet{byKey: map[string]*acc{}, limit: limit}
}

// withBudget sets the budget of values held in memory (DefaultBudget for
// 0) and how the spill file is made.
func (s *groupSet) withBudget(budget int, tempFile func() (*os.File, error)) *groupSet {
	if budget <= 0 {
		budget = DefaultBudget
	}
	s.budget, s.tempFile = budget, tempFile
	return s
}

// hold counts room for n more values in memory and spills them all past
// the budget.
func (s *groupSet) hold(n int) error {
	s.held += n
	if s.budget == 0 || s.held <= s.budget {
		return nil
	}
	if s.spill == nil {
		sp, err := openSpill(s.tempFile)
		if err != nil {
			return err
		}
		s.spill = sp
	}
	for _, a := range s.order {
		for _, ss := range [][]series{a.metric, a.fx, a.fy} {
			for i := range ss {
				if err := s.spill.spill(&ss[i]); err != nil {
					return err
				}
			}
		}
	}
	s.held = 0
	return s.spill.flush()
}

// close removes the spill file, if any.
func (s *groupSet) close() { s.spill.close() }

// lookupKey is row's group key: its by fields joined by NUL, pointing
// into row or into s.buf (valid until the next call).
func (s *groupSet) lookupKey(l *layout, row []string) string {
	field := func(c int) string {
		if c < len(row) {
			return row[c]
		}
		return ""
	}
	if len(l.by) == 1 {
		return field(l.by[0])
	}
	s.buf = s.buf[:0]
	for i, c := range l.by {
		if i > 0 {
			s.buf = append(s.buf, 0)
		}
		s.buf = append(s.buf, field(c)...)
	}
	return unsafe.String(unsafe.SliceData(s.buf), len(s.buf))
}

// group returns the accumulator of row's group, made if it is new (the
// row is then on line); TooManyGroups past the limit.
func (s *groupSet) group(l *layout, row []string, line int) (*acc, error) {
	k := s.lookupKey(l, row)
	if a, ok := s.byKey[k]; ok {
		return a, nil
	}
	key := make([]string, len(l.by))
	for i, c := range l.by {
		if c < len(row) {
			key[i] = strings.Clone(row[c])
		}
	}
	return s.insert(l, strings.Clone(k), key, line)
}

// insert makes the accumulator of a new group.
func (s *groupSet) insert(l *layout, k string, key []string, line int) (*acc, error) {
	if s.limit > 0 && len(s.order) == s.limit {
		return nil, TooManyGroups{By: l.spec.By}
	}
	a := &acc{id: k, key: key, line: line, metric: make([]series, len(Metrics)), regimes: make([]int, len(regimeNames)),
		fx: make([]series, len(l.fits)), fy: make([]series, len(l.fits))}
	s.byKey[k] = a
	s.order = append(s.order, a)
	return a, nil
}

// add adds row to a.
func (l *layout) add(a *acc, row []string) {
	a.n++
	for i, c := range l.metric {
		if v, ok := number(row, c); ok {
			a.metric[i].mem = append(a.metric[i].mem, v)
		}
	}
	if l.regime < len(row) {
		if i := slices.Index(regimeNames, row[l.regime]); i >= 0 {
			a.regimes[i]++
		}
	}
	for i, fc := range l.fits {
		y, oky := number(row, fc[0])
		x, okx := number(row, fc[1])
		if oky && okx {
			a.fy[i].mem = append(a.fy[i].mem, y)
			a.fx[i].mem = append(a.fx[i].mem, x)
		}
	}
}

// held is the room a's values take in memory, in values (the capacity
// of its slices, which may be up to twice their length).
func (a *acc) held() int {
	n := 0
	for _, ss := range [][]series{a.metric, a.fx, a.fy} {
		for i := range ss {
			n += cap(ss[i].mem)
		}
	}
	return n
}

// merge adds the rows of partial p (which holds every value in memory),
// which come after those of s, to s. On TooManyGroups it returns the line
// of the first row past the limit.
func (s *groupSet) merge(l *layout, p *groupSet) (int, error) {
	added := 0
	for _, pa := range p.order {
		a, ok := s.byKey[pa.id]
		if !ok {
			if s.limit > 0 && len(s.order) == s.limit {
				return pa.line, TooManyGroups{By: l.spec.By}
			}
			s.byKey[pa.id] = pa
			s.order = append(s.order, pa)
			added += pa.held()
			continue
		}
		before := a.held()
		a.n += pa.n
		for i := range a.metric {
			a.metric[i].mem = append(a.metric[i].mem, pa.metric[i].mem...)
		}
		for i := range a.regimes {
			a.regimes[i] += pa.regimes[i]
		}
		for i := range a.fx {
			a.fx[i].mem = append(a.fx[i].mem, pa.fx[i].mem...)
			a.fy[i].mem = append(a.fy[i].mem, pa.fy[i].mem...)
		}
		added += a.held() - before
	}
	return 0, s.hold(added)
}

// Tabulate reads rows (header first) of a batch output and summarises them.
// next returns io.EOF after the last row.
func Tabulate(header []string, next func() ([]string, error), spec Spec) ([]Group, error) {
	l, err := newLayout(header, spec)
	if err != nil {
		return nil, err
	}
	groups := newGroupSet(MaxGroups).withBudget(0, nil)
	defer groups.close()
	for {
		row, err := next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		a, err := groups.group(l, row, 0)
		if err != nil {
			return nil, err
		}
		before := a.held()
		l.add(a, row)
		if err := groups.hold(a.held() - before); err != nil {
			return nil, err
		}
	}
	return l.summarise(groups)
}

// summarise turns the accumulators into groups sorted by key, the groups
// shared out among GOMAXPROCS goroutines. Each loads at most a share of
// the budget of spilled values at once.
func (l *layout) summarise(s *groupSet) ([]Group, error) {
	accs := slices.Clone(s.order)
	slices.SortFunc(accs, func(a, b *acc) int { return strings.Compare(a.id, b.id) })
	out := make([]Group, len(accs))
	errs := make([]error, len(accs))
	workers := min(runtime.GOMAXPROCS(0), len(accs))
	limit := s.budget / max(workers, 1)
	work := make(chan int)
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			for i := range work {
				out[i], errs[i] = l.summariseGroup(accs[i], s.spill, limit)
			}
		})
	}
	for i := range accs {
		work <- i
	}
	close(work)
	wg.Wait()
	if err := errors.Join(errs...); err != nil {
		return nil, err
	}
	return out, nil
}

// summariseGroup is one group's summary. It reorders a's values in
// memory. Spilled series of at most limit values (pairs: limit/2) are
// loaded whole; longer ones are summarised in passes over the file.
func (l *layout) summariseGroup(a *acc, sp *spillFile, limit int) (Group, error) {
	g := Group{Key: a.key, N: a.n, Stats: map[string]Stat{}, Regimes: map[string]float64{}}
	for i, m := range Metrics {
		st, err := sp.stat(&a.metric[i], limit)
		if err != nil {
			return g, err
		}
		g.Stats[m] = st
	}
	for i, r := range regimeNames {
		g.Regimes[r] = float64(a.regimes[i]) / float64(a.n)
	}
	for i, p := range l.spec.Fits {
		f, err := sp.fit(&a.fx[i], &a.fy[i], limit/2)
		if err != nil {
			return g, err
		}
		g.Fits = append(g.Fits, FitResult{Pair: p, Fit: f})
	}
	return g, nil
}

// stat is summarise of s's values.
func (sp *spillFile) stat(s *series, limit int) (Stat, error) {
	if s.spilled == 0 || s.len() <= limit {
		v, err := sp.load(s)
		return summarise(v), err
	}
	st := Stat{N: s.len()}
	for _, q := range []struct {
		p   float64
		out *float64
	}{{0.95, &st.P95}, {0.5, &st.Median}, {0.05, &st.P5}} {
		v, err := sp.selectSpilled(s, empiricalIndex(q.p, st.N), limit)
		if err != nil {
			return st, err
		}
		*q.out = v
	}
	return st, nil
}

// fit is ScalingFit of the pairs of xs and ys.
func (sp *spillFile) fit(xs, ys *series, limit int) (Fit, error) {
	if xs.spilled == 0 || xs.len() <= limit {
		x, err := sp.load(xs)
		if err != nil {
			return Fit{}, err
		}
		y, err := sp.load(ys)
		return ScalingFit(x, y), err
	}
	return streamFit(logPairs(func(fn func(x, y []float64)) error { return sp.each(xs, ys, fn) }))
}

// number reads column c of row: a plain decimal number at once (as
// strconv.ParseFloat reads it, by decimal.Parse), anything else through
// quantity.ParseDefault, in SI units for a quantity column. Empty, NaN and
// unreadable cells give false.
func number(row []string, c column) (float64, bool) {
	if c.idx >= len(row) {
		return 0, false
	}
	s := row[c.idx]
	if s == "" {
		return 0, false
	}
	if !c.si {
		if f, ok := decimal.Parse(s); ok && !math.IsInf(f, 0) {
			return f + 0, true // + 0 as ParseDefault's conversion adds it: −0 reads as 0
		}
	}
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, false
	}
	k := quantity.Number
	if c.si {
		k = c.kind
	}
	v, err := quantity.ParseDefault(k, s, c.unit)
	if err != nil || math.IsNaN(v.SI) {
		return 0, false
	}
	return v.SI, true
}

// summarise returns the median and the 5th and 95th percentiles by the
// empirical quantile (as gonum stat.Quantile with stat.Empirical gives it:
// the smallest sample at or above the fraction p), found by selection
// rather than by sorting all of v, which it reorders.
func summarise(v []float64) Stat {
	s := Stat{N: len(v), Median: math.NaN(), P5: math.NaN(), P95: math.NaN()}
	if len(v) == 0 {
		return s
	}
	i95, i50, i5 := empiricalIndex(0.95, len(v)), empiricalIndex(0.5, len(v)), empiricalIndex(0.05, len(v))
	s.P95 = selectNth(v, i95)
	s.Median = selectNth(v[:i95+1], i50)
	s.P5 = selectNth(v[:i50+1], i5)
	return s
}

// empiricalIndex is the index in n sorted values of the empirical
// p-quantile: the first i with i + 1 ≥ p n, as gonum's empiricalQuantile
// counts.
func empiricalIndex(p float64, n int) int {
	return max(0, int(math.Ceil(p*float64(n)))-1)
}
