package cli

import (
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/cmd/internal/tabulate"
)

// What --only selects.
const (
	onlySummaries = "summaries"
	onlyFits      = "fits"
)

// smallGroup is the fewest rows a group needs for a line of its own in the
// summary table, and the fewest pairs a scaling fit needs (two points
// leave no degree of freedom for an interval).
const smallGroup = 3

// checkOnly checks --only; CSV with asked-for fits must say which table.
func (o *tabulateOptions) checkOnly(fitsAsked bool) error {
	switch o.only {
	case "", onlySummaries, onlyFits:
	default:
		return usagef("--only %q is not known; accepted: %s, %s", o.only, onlySummaries, onlyFits)
	}
	if o.format == report.FormatCSV && o.only == "" && fitsAsked {
		return usagef("CSV holds one table: add --only summaries or --only fits (run twice for both)")
	}
	return nil
}

// references reads --expect into reference exponents per fit.
func (o *tabulateOptions) references() (map[tabulate.Pair]tabulate.Reference, error) {
	refs := map[tabulate.Pair]tabulate.Reference{}
	for _, e := range o.expects {
		p, b, err := tabulate.ParseExpect(e)
		if err != nil {
			return nil, usagef("--expect %q: %v", e, err)
		}
		refs[p] = tabulate.Reference{Exponent: b, Source: "expected"}
	}
	return refs, nil
}

// checkExpects refuses an --expect that names no fit.
func checkExpects(refs map[tabulate.Pair]tabulate.Reference, groups []tabulate.Group) error {
	if len(groups) == 0 {
		return nil
	}
	for p := range refs {
		found := false
		for _, f := range groups[0].Fits {
			found = found || f.Pair == p
		}
		if !found {
			return usagef("--expect %s=%s: no such fit; add --fit %s=%s", p.Y, p.X, p.Y, p.X)
		}
	}
	return nil
}

// referenceFor is the exponent a fit is compared with: the expected one,
// else isometry, else none.
func referenceFor(refs map[tabulate.Pair]tabulate.Reference, p tabulate.Pair) (tabulate.Reference, bool) {
	if r, ok := refs[p]; ok {
		return r, true
	}
	return tabulate.Isometry(p)
}

func writeGroups(w io.Writer, format, only string, groups []tabulate.Group, refs map[tabulate.Pair]tabulate.Reference) error {
	summaries, fits := only != onlyFits, only != onlySummaries
	switch format {
	case report.FormatJSON:
		if !summaries {
			return report.JSON(w, fitsJSON(groups, refs))
		}
		return report.JSON(w, groupsJSON(groups, refs, fits))
	case report.FormatCSV:
		if fits {
			h, rows := fitRows(groups, refs)
			return report.CSV(w, h, rows)
		}
		h, rows := groupRows(groups, false)
		return report.CSV(w, h, rows)
	}
	if len(groups) == 0 {
		fmt.Fprintln(w, "No rows to summarise: the table has a header and no rows.")
		return nil
	}
	if summaries {
		if err := writeSummaryTable(w, groups); err != nil {
			return err
		}
	}
	if fits {
		if summaries {
			fmt.Fprintln(w)
		}
		writeScalingLaws(w, groups, refs)
	}
	return nil
}

// writeSummaryTable writes the groups of at least smallGroup rows as a
// table and the smaller ones on one line.
func writeSummaryTable(w io.Writer, groups []tabulate.Group) error {
	var big, small []tabulate.Group
	for _, g := range groups {
		if g.N < smallGroup {
			small = append(small, g)
		} else {
			big = append(big, g)
		}
	}
	if len(big) > 0 {
		h, rows := groupRows(big, true)
		if err := report.Table(w, h, rows); err != nil {
			return err
		}
		report.Paragraph(w, "", "Cells: median [5th–95th percentile]; regime shares: viscous / intermediate / inertial, in % of the group's rows.")
	}
	if len(small) > 0 {
		names := make([]string, len(small))
		rows := 0
		for i, g := range small {
			names[i] = fmt.Sprintf("%s (%d)", groupName(g), g.N)
			rows += g.N
		}
		report.Paragraph(w, "", fmt.Sprintf("%d groups of fewer than %d rows (%d rows in all), too small for percentiles: %s.",
			len(small), smallGroup, rows, listNames(names)))
	}
	return nil
}

// listNames joins names, the first 20 of them, saying how many more.
func listNames(names []string) string {
	const shown = 20
	if len(names) <= shown {
		return strings.Join(names, ", ")
	}
	return fmt.Sprintf("%s and %d more (--format csv lists them all)", strings.Join(names[:shown], ", "), len(names)-shown)
}

func groupName(g tabulate.Group) string {
	if len(g.Key) == 0 {
		return "all"
	}
	return strings.Join(g.Key, " / ")
}

var metricLabels = map[string]string{"reynolds": "Re", "strouhal": "St", "drag_N": "drag (N)", "power_W": "power (W)"}

func groupRows(groups []tabulate.Group, human bool) ([]string, [][]string) {
	h := []string{"group", "rows"}
	if human {
		for _, m := range tabulate.Metrics {
			h = append(h, metricLabels[m])
		}
		h = append(h, "regime shares (%)")
	} else {
		for _, m := range tabulate.Metrics {
			h = append(h, m+"_median", m+"_p5", m+"_p95")
		}
		h = append(h, "share_viscous", "share_intermediate", "share_inertial")
	}
	var rows [][]string
	for _, g := range groups {
		r := []string{groupName(g), fmt.Sprint(g.N)}
		for _, m := range tabulate.Metrics {
			st := g.Stats[m]
			if !human {
				r = append(r, report.Num(st.Median, 6), report.Num(st.P5, 6), report.Num(st.P95, 6))
				continue
			}
			cell := "none computed" // e.g. St of a group without stroke data: never a blank
			if st.N > 0 {
				cell = fmt.Sprintf("%s [%s–%s]", report.Num(st.Median, 3), report.Num(st.P5, 3), report.Num(st.P95, 3))
			}
			r = append(r, cell)
		}
		var shares []string
		for _, name := range []string{"viscous", "intermediate", "inertial"} {
			if human {
				shares = append(shares, report.Num(100*g.Regimes[name], 3))
			} else {
				r = append(r, report.Num(g.Regimes[name], 4))
			}
		}
		if human {
			r = append(r, strings.Join(shares, " / "))
		}
		rows = append(rows, r)
	}
	return h, rows
}

// fitRows is the CSV table of scaling laws, one row per group and fit.
func fitRows(groups []tabulate.Group, refs map[tabulate.Pair]tabulate.Reference) ([]string, [][]string) {
	h := []string{"group", "y", "x", "rows",
		"exponent_sma", "exponent_sma_low95", "exponent_sma_high95", "log10_a_sma", "log10_a_sma_low95", "log10_a_sma_high95",
		"exponent_ols", "exponent_ols_low95", "exponent_ols_high95", "log10_a_ols", "log10_a_ols_low95", "log10_a_ols_high95",
		"r_squared", "reference_exponent", "reference_kind", "reference_outside_sma95", "reference_outside_ols95"}
	var rows [][]string
	for _, g := range groups {
		for _, f := range g.Fits {
			n := func(v float64) string { return report.Num(v, 6) }
			r := []string{groupName(g), f.Y, f.X, fmt.Sprint(f.N),
				n(f.SMASlope), n(f.SMALow), n(f.SMAHigh), n(f.SMAIntercept), n(f.SMAInterceptLow), n(f.SMAInterceptHigh),
				n(f.OLSSlope), n(f.OLSLow), n(f.OLSHigh), n(f.OLSIntercept), n(f.OLSInterceptLow), n(f.OLSInterceptHigh),
				n(f.R2), "", "", "", ""}
			if ref, ok := referenceFor(refs, f.Pair); ok && f.N >= smallGroup && f.SMASlope == f.SMASlope {
				v := tabulate.Compare(f.Fit, ref)
				copy(r[len(r)-4:], []string{n(ref.Exponent), ref.Source, fmt.Sprint(v.OutsideSMA), fmt.Sprint(v.OutsideOLS)})
			}
			rows = append(rows, r)
		}
	}
	return h, rows
}

// writeScalingLaws states each group's fits as scaling laws in plain
// words; the groups too small for a fit share one line per fit.
func writeScalingLaws(w io.Writer, groups []tabulate.Group, refs map[tabulate.Pair]tabulate.Reference) {
	report.Paragraph(w, "", "Scaling laws y = a·x^b, fitted on log10 y against log10 x (x and y in SI units), with 95 % intervals; "+
		"b by standardised major axis, least squares in brackets (Warton et al. 2006, Biol. Rev. 81).")
	type tooFew struct {
		pair  tabulate.Pair
		names []string
	}
	var few []*tooFew
	fewOf := func(p tabulate.Pair) *tooFew {
		for _, t := range few {
			if t.pair == p {
				return t
			}
		}
		t := &tooFew{pair: p}
		few = append(few, t)
		return t
	}
	for _, g := range groups {
		for _, f := range g.Fits {
			if f.N < smallGroup || f.SMASlope != f.SMASlope {
				t := fewOf(f.Pair)
				t.names = append(t.names, fmt.Sprintf("%s (%d)", groupName(g), f.N))
				continue
			}
			fmt.Fprintln(w)
			for _, line := range scalingLaw(groupName(g), f, refs) {
				report.Paragraph(w, "    ", line)
			}
		}
	}
	for _, t := range few {
		fmt.Fprintln(w)
		report.Paragraph(w, "    ", fmt.Sprintf("No fit of %s against %s (fewer than %d rows with both values, or no spread) in %d groups: %s.",
			t.pair.Y, t.pair.X, smallGroup, len(t.names), listNames(t.names)))
	}
}

// weakFit is the r² below which a fit is called weak (common practice, no
// source: the SMA and least-squares exponents then differ by more than
// 1/√0.5 ≈ 1.41).
const weakFit = 0.5

// scalingLaw is one fit in plain words: the law, its exponent, its factor,
// and the comparison with the reference exponent.
func scalingLaw(group string, f tabulate.FitResult, refs map[tabulate.Pair]tabulate.Reference) []string {
	num := func(v float64) string { return report.Num(v, 3) }
	lines := []string{
		fmt.Sprintf("%s: %s ∝ %s^%s (%d rows, r² %s)", group, f.Y, f.X, num(f.SMASlope), f.N, num(f.R2)),
		fmt.Sprintf("  b = %s, 95 %% from %s to %s (least squares %s, from %s to %s)",
			num(f.SMASlope), num(f.SMALow), num(f.SMAHigh), num(f.OLSSlope), num(f.OLSLow), num(f.OLSHigh)),
		fmt.Sprintf("  log10 a = %s, 95 %% from %s to %s (least squares %s, from %s to %s)",
			num(f.SMAIntercept), num(f.SMAInterceptLow), num(f.SMAInterceptHigh), num(f.OLSIntercept), num(f.OLSInterceptLow), num(f.OLSInterceptHigh)),
	}
	if f.R2 < weakFit {
		// The SMA slope is sign(r) s_y/s_x and the least-squares one
		// r s_y/s_x (Warton et al. 2006, Biol. Rev. 81, 259), so the SMA
		// slope is the least-squares one over |r|: the two part as r falls.
		lines = append(lines, fmt.Sprintf("  weak relation (r² %s): the SMA exponent is the least-squares one over |r|, %s times it here; read either with care", num(f.R2), num(1/math.Sqrt(f.R2))))
	}
	ref, ok := referenceFor(refs, f.Pair)
	if !ok {
		return append(lines, fmt.Sprintf("  no reference exponent (give --expect %s=%s:b to compare)", f.Y, f.X))
	}
	v := tabulate.Compare(f.Fit, ref)
	what := "the expected exponent " + num(ref.Exponent)
	if ref.Source == "isometry" {
		what = "isometry (b = " + num(ref.Exponent) + ")"
	}
	verdict := "inside the 95 % interval of b: the data agree with it"
	if v.OutsideSMA {
		side := "larger"
		if f.SMAHigh < ref.Exponent {
			side = "smaller"
		}
		verdict = "outside the 95 % interval of b: b is " + side
	}
	if v.OutsideSMA != v.OutsideOLS {
		verdict += " (by least squares it is not)"
		if v.OutsideOLS {
			verdict = "inside the 95 % interval of b, but outside the least-squares interval"
		}
	}
	return append(lines, fmt.Sprintf("  against %s: %s", what, verdict))
}

type statJSON struct {
	N      int      `json:"n"`
	Median *float64 `json:"median"`
	P5     *float64 `json:"p5"`
	P95    *float64 `json:"p95"`
}

type referenceJSON struct {
	Exponent   float64 `json:"exponent"`
	Kind       string  `json:"kind"`
	OutsideSMA bool    `json:"outside_sma_interval"`
	OutsideOLS bool    `json:"outside_ols_interval"`
}

type scalingJSON struct {
	Group            []string       `json:"group,omitempty"`
	Y                string         `json:"y"`
	X                string         `json:"x"`
	N                int            `json:"n"`
	OLSSlope         *float64       `json:"ols_slope"`
	OLSLow           *float64       `json:"ols_low95"`
	OLSHigh          *float64       `json:"ols_high95"`
	OLSIntercept     *float64       `json:"ols_intercept"`
	OLSInterceptLow  *float64       `json:"ols_intercept_low95"`
	OLSInterceptHigh *float64       `json:"ols_intercept_high95"`
	SMASlope         *float64       `json:"sma_slope"`
	SMALow           *float64       `json:"sma_low95"`
	SMAHigh          *float64       `json:"sma_high95"`
	SMAIntercept     *float64       `json:"sma_intercept"`
	SMAInterceptLow  *float64       `json:"sma_intercept_low95"`
	SMAInterceptHigh *float64       `json:"sma_intercept_high95"`
	R2               *float64       `json:"r_squared"`
	Reference        *referenceJSON `json:"reference,omitempty"`
}

type groupJSON struct {
	Group   []string            `json:"group"`
	Rows    int                 `json:"rows"`
	Stats   map[string]statJSON `json:"statistics"`
	Regimes map[string]float64  `json:"regime_share"`
	Fits    []scalingJSON       `json:"fits,omitempty"`
}

func scalingFitJSON(f tabulate.FitResult, refs map[tabulate.Pair]tabulate.Reference) scalingJSON {
	o := report.Opt
	s := scalingJSON{Y: f.Y, X: f.X, N: f.N, OLSSlope: o(f.OLSSlope), OLSLow: o(f.OLSLow), OLSHigh: o(f.OLSHigh),
		OLSIntercept: o(f.OLSIntercept), OLSInterceptLow: o(f.OLSInterceptLow), OLSInterceptHigh: o(f.OLSInterceptHigh),
		SMASlope: o(f.SMASlope), SMALow: o(f.SMALow), SMAHigh: o(f.SMAHigh),
		SMAIntercept: o(f.SMAIntercept), SMAInterceptLow: o(f.SMAInterceptLow), SMAInterceptHigh: o(f.SMAInterceptHigh), R2: o(f.R2)}
	if ref, ok := referenceFor(refs, f.Pair); ok && f.SMASlope == f.SMASlope {
		v := tabulate.Compare(f.Fit, ref)
		s.Reference = &referenceJSON{Exponent: ref.Exponent, Kind: ref.Source, OutsideSMA: v.OutsideSMA, OutsideOLS: v.OutsideOLS}
	}
	return s
}

func groupsJSON(groups []tabulate.Group, refs map[tabulate.Pair]tabulate.Reference, withFits bool) []groupJSON {
	out := []groupJSON{}
	for _, g := range groups {
		gj := groupJSON{Group: g.Key, Rows: g.N, Stats: map[string]statJSON{}, Regimes: g.Regimes}
		if gj.Group == nil {
			gj.Group = []string{}
		}
		for m, st := range g.Stats {
			gj.Stats[m] = statJSON{N: st.N, Median: report.Opt(st.Median), P5: report.Opt(st.P5), P95: report.Opt(st.P95)}
		}
		if withFits {
			for _, f := range g.Fits {
				gj.Fits = append(gj.Fits, scalingFitJSON(f, refs))
			}
		}
		out = append(out, gj)
	}
	return out
}

// fitsJSON is --only fits in JSON: one list of fits, each naming its group.
func fitsJSON(groups []tabulate.Group, refs map[tabulate.Pair]tabulate.Reference) []scalingJSON {
	out := []scalingJSON{}
	for _, g := range groups {
		for _, f := range g.Fits {
			s := scalingFitJSON(f, refs)
			s.Group = g.Key
			if s.Group == nil {
				s.Group = []string{}
			}
			out = append(out, s)
		}
	}
	return out
}
