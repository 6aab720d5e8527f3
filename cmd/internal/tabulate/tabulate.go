// Package tabulate summarises batch results per group: counts, medians and
// 5th–95th percentiles, the share of rows in each flow regime, and scaling
// fits in log–log space.
package tabulate

import (
	"fmt"
	"io"
	"math"
	"slices"
	"sort"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/regime"
	"gonum.org/v1/gonum/stat"
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
// per regime (in the order of regime.Regimes) and per fit, in slices
// rather than maps, so that a group costs a few hundred bytes besides its
// values.
type acc struct {
	key     []string
	n       int
	metric  [][]float64
	regimes []int
	fx, fy  [][]float64
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

// Tabulate reads rows (header first) of a batch output and summarises them.
// next returns io.EOF after the last row.
func Tabulate(header []string, next func() ([]string, error), spec Spec) ([]Group, error) {
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
	var by []int
	for _, b := range spec.By {
		c, err := find(b)
		if err != nil {
			return nil, fmt.Errorf("--by: %v", err)
		}
		by = append(by, c.idx)
	}
	metric := make([]int, len(Metrics))
	for i, m := range Metrics {
		c, err := find(m)
		if err != nil {
			return nil, fmt.Errorf("the input has no %q column; give batch output or a survey table", m)
		}
		metric[i] = c.idx
	}
	regimeCol, err := find("regime")
	if err != nil {
		return nil, fmt.Errorf("the input has no \"regime\" column; give batch output or a survey table")
	}
	var fitCols [][2]column
	for _, p := range spec.Fits {
		y, err := find(p.Y)
		if err != nil {
			return nil, fmt.Errorf("--fit %s=%s: %v", p.Y, p.X, err)
		}
		x, err := find(p.X)
		if err != nil {
			return nil, fmt.Errorf("--fit %s=%s: %v", p.Y, p.X, err)
		}
		fitCols = append(fitCols, [2]column{y, x})
	}
	groups := map[string]*acc{}
	var order []string
	for {
		row, err := next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		key := make([]string, len(by))
		for i, c := range by {
			if c < len(row) {
				key[i] = row[c]
			}
		}
		k := strings.Join(key, "\x00")
		g, ok := groups[k]
		if !ok {
			if len(groups) == MaxGroups {
				return nil, TooManyGroups{By: spec.By}
			}
			g = &acc{key: key, metric: make([][]float64, len(Metrics)), regimes: make([]int, len(regime.Regimes)),
				fx: make([][]float64, len(fitCols)), fy: make([][]float64, len(fitCols))}
			groups[k] = g
			order = append(order, k)
		}
		g.n++
		for i, c := range metric {
			if v, ok := number(row, column{idx: c}); ok {
				g.metric[i] = append(g.metric[i], v)
			}
		}
		if regimeCol.idx < len(row) {
			if i := slices.Index(regime.Regimes, row[regimeCol.idx]); i >= 0 {
				g.regimes[i]++
			}
		}
		for i, fc := range fitCols {
			y, oky := number(row, fc[0])
			x, okx := number(row, fc[1])
			if oky && okx {
				g.fy[i] = append(g.fy[i], y)
				g.fx[i] = append(g.fx[i], x)
			}
		}
	}
	sort.Strings(order)
	out := make([]Group, 0, len(order))
	for _, k := range order {
		a := groups[k]
		g := Group{Key: a.key, N: a.n, Stats: map[string]Stat{}, Regimes: map[string]float64{}}
		for i, m := range Metrics {
			g.Stats[m] = summarise(a.metric[i])
		}
		for i, r := range regime.Regimes {
			g.Regimes[r] = float64(a.regimes[i]) / float64(a.n)
		}
		for i, p := range spec.Fits {
			g.Fits = append(g.Fits, FitResult{Pair: p, Fit: ScalingFit(a.fx[i], a.fy[i])})
		}
		out = append(out, g)
	}
	return out, nil
}

func number(row []string, c column) (float64, bool) {
	if c.idx >= len(row) {
		return 0, false
	}
	s := strings.TrimSpace(row[c.idx])
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
// empirical quantile (gonum stat.Quantile, stat.Empirical: the smallest
// sample at or above the fraction p).
func summarise(v []float64) Stat {
	s := Stat{N: len(v), Median: math.NaN(), P5: math.NaN(), P95: math.NaN()}
	if len(v) == 0 {
		return s
	}
	sorted := append([]float64(nil), v...)
	sort.Float64s(sorted)
	s.Median = stat.Quantile(0.5, stat.Empirical, sorted, nil)
	s.P5 = stat.Quantile(0.05, stat.Empirical, sorted, nil)
	s.P95 = stat.Quantile(0.95, stat.Empirical, sorted, nil)
	return s
}
