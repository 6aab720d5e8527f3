package cli

import (
	"context"
	"encoding/csv"
	"fmt"
	"io"
	"strings"
	"sync"
	"sync/atomic"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/cmd/internal/tabulate"
	"github.com/spf13/cobra"
)

type tabulateOptions struct {
	batchOptions
	by     string
	fits   []string
	format string
}

func newTabulateCmd(s Streams) *cobra.Command {
	o := &tabulateOptions{}
	cmd := &cobra.Command{
		Use:   "tabulate {FILE | -} [flags]",
		Short: "Per-group medians, percentiles, regime shares and log–log scaling fits",
		Long: `Summarise a survey per group (--by species,site): the count, the median and
5th–95th percentiles (empirical quantiles) of the Reynolds number, Strouhal
number, drag (N) and power (W), the share of rows in each flow regime, and
scaling fits of log10 y on log10 x (--fit y=x, repeatable) by ordinary least
squares and standardised major axis (Warton et al. 2006, Biol. Rev. 81), each
slope with its 95 % confidence interval. x and y are computed columns
(reynolds, strouhal, drag_N, power_W) or input quantities (length, mass, …),
read in SI units from their columns.

The input is either batch output or a survey table, which is then run
through batch first with the same flags. Groups are held in memory, at
most 100000 of them (more, as with --by on a row id, is refused: a
summary is for groups of many rows).`,
		Example: `  flowregime tabulate survey.csv --by taxon --fit power_W=mass --fit reynolds=length
  flowregime batch survey.csv -q | flowregime tabulate - --by site --format json`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) != 1 {
				return usagef("tabulate needs one argument: a file, or - for standard input")
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.input = args[0]
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			return runTabulate(cmd.Context(), o, s)
		},
	}
	cmd.Flags().StringVar(&o.by, "by", "", "comma-separated columns to group by (default: one group)")
	cmd.Flags().StringArrayVar(&o.fits, "fit", nil, "y=x: scaling fit of y against x in log–log space (default reynolds=length, and power_W=mass with a mass column)")
	cmd.Flags().StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	o.bindInputs(cmd)
	return cmd
}

func (o *tabulateOptions) spec(header []string) (tabulate.Spec, error) {
	var sp tabulate.Spec
	if o.by != "" {
		r := csv.NewReader(strings.NewReader(o.by))
		by, err := r.Read()
		if err != nil {
			return sp, usagef("--by: %v", err)
		}
		for i := range by {
			by[i] = strings.TrimSpace(by[i])
		}
		sp.By = by
	}
	for _, f := range o.fits {
		y, x, ok := strings.Cut(f, "=")
		if !ok || strings.TrimSpace(x) == "" || strings.TrimSpace(y) == "" {
			return sp, usagef("--fit %q: write y=x, e.g. --fit power_W=mass", f)
		}
		sp.Fits = append(sp.Fits, tabulate.Pair{Y: strings.TrimSpace(y), X: strings.TrimSpace(x)})
	}
	if len(o.fits) == 0 {
		sp.Fits = []tabulate.Pair{{Y: "reynolds", X: "length"}}
		for _, h := range header {
			if f, _ := batch.MatchHeader(h); f == "mass" {
				sp.Fits = append(sp.Fits, tabulate.Pair{Y: "power_W", X: "mass"})
				break
			}
		}
	}
	return sp, nil
}

func runTabulate(ctx context.Context, o *tabulateOptions, s Streams) error {
	if ctx == nil {
		ctx = context.Background()
	}
	cfg, err := o.config()
	if err != nil {
		return err
	}
	if err := checkOutputs(o.inputFiles(s), []namedFile{{what: "the standard output", file: stdFile(s.Out)}}); err != nil {
		return err
	}
	in, _, err := o.open(s)
	if err != nil {
		return err
	}
	defer in.Close()
	if o.explain {
		return explainBatch(in, cfg, s, "tabulate")
	}
	var mu sync.Mutex
	reject := func(r batch.Reject) {
		mu.Lock()
		defer mu.Unlock()
		fmt.Fprintf(s.Err, "flowregime: tabulate: rejected %s\n", rejectText(r))
	}
	groups, rejected, err := tabulateStream(ctx, in, cfg, o.spec, reject)
	if err != nil {
		return err
	}
	if err := writeGroups(s.Out, o.format, groups); err != nil {
		return err
	}
	if rejected > 0 {
		return exitError{code: ExitRejected, msg: fmt.Sprintf("tabulate: %d rows rejected (listed above) and left out of the summary", rejected)}
	}
	return nil
}

// tabulateStream summarises in, running it through batch first unless it
// already holds batch output. Rows that cannot be read or computed go to
// reject, are counted and left out.
func tabulateStream(ctx context.Context, in io.Reader, cfg batch.Config, spec func([]string) (tabulate.Spec, error), reject func(batch.Reject)) ([]tabulate.Group, int, error) {
	sep := byte(',')
	if cfg.InFormat == batch.TSV {
		sep = '\t'
	}
	var r io.Reader = in
	var pr *io.PipeReader
	var rejected atomic.Int64
	errc := make(chan error, 1)
	peek := &peekReader{r: in}
	head, _ := peek.peekLine()
	if cfg.InFormat == batch.JSONL || !strings.Contains(head, "reynolds") || !strings.Contains(head, "regime") {
		var pw *io.PipeWriter
		pr, pw = io.Pipe()
		cfg.OutFormat = batch.CSV
		sep = ','
		go func() {
			_, err := batch.Run(ctx, peek, pw, func(r batch.Reject) error { rejected.Add(1); reject(r); return nil }, cfg)
			pw.CloseWithError(err)
			errc <- err
		}()
		r = pr
	} else {
		r = peek
		errc <- nil
	}
	tr, err := batch.NewReader(r, sep)
	if err != nil {
		if e := <-errc; e != nil {
			return nil, 0, batchFailure("tabulate", e)
		}
		return nil, 0, batchFailure("tabulate", err)
	}
	header := tr.Header()
	sp, err := spec(header)
	if err != nil {
		return nil, 0, err
	}
	var readErr error
	next := func() ([]string, error) {
		for {
			rec, err := tr.Next()
			if err != nil {
				if err != io.EOF {
					readErr = err
				}
				return nil, err
			}
			if rec.Err == nil {
				return rec.Fields, nil
			}
			rejected.Add(1)
			reject(batch.Reject{Line: rec.Line, Reason: rec.Err.Error(), Record: rec.Text})
		}
	}
	groups, err := tabulate.Tabulate(header, next, sp)
	if readErr != nil {
		return nil, 0, fmt.Errorf("tabulate: cannot read the table: %v", readErr)
	}
	if err != nil {
		if pr != nil {
			pr.CloseWithError(err) // stops the batch run that feeds it
		}
		return nil, 0, usageError{fmt.Errorf("tabulate: %v", err)}
	}
	if e := <-errc; e != nil {
		return nil, 0, batchFailure("tabulate", e)
	}
	return groups, int(rejected.Load()), nil
}

// rejectText says where a rejected row is and why, for stderr, with
// control characters escaped.
func rejectText(r batch.Reject) string {
	where := fmt.Sprintf("line %d", r.Line)
	if r.Row > 0 {
		where += fmt.Sprintf(" (row %d)", r.Row)
	}
	if r.Column != "" {
		where += fmt.Sprintf(", column %q", r.Column)
	}
	return report.Printable(where) + ": " + report.Printable(r.Reason)
}

// peekReader lets the first line be inspected without consuming it.
type peekReader struct {
	r   io.Reader
	buf []byte
}

func (p *peekReader) peekLine() (string, error) {
	b := make([]byte, 64<<10)
	n, err := io.ReadAtLeast(p.r, b, 1)
	p.buf = b[:n]
	line, _, _ := strings.Cut(string(p.buf), "\n")
	return line, err
}

func (p *peekReader) Read(b []byte) (int, error) {
	if len(p.buf) > 0 {
		n := copy(b, p.buf)
		p.buf = p.buf[n:]
		return n, nil
	}
	return p.r.Read(b)
}

func writeGroups(w io.Writer, format string, groups []tabulate.Group) error {
	switch format {
	case report.FormatJSON:
		return report.JSON(w, groupsJSON(groups))
	case report.FormatCSV:
		h, rows := groupRows(groups, false)
		if err := report.CSV(w, h, rows); err != nil {
			return err
		}
		fh, frows := fitRows(groups, false)
		if len(frows) == 0 {
			return nil
		}
		fmt.Fprintln(w)
		return report.CSV(w, fh, frows)
	}
	h, rows := groupRows(groups, true)
	if err := report.Table(w, h, rows); err != nil {
		return err
	}
	fmt.Fprintln(w, "Cells: median [5th–95th percentile].")
	fh, frows := fitRows(groups, true)
	if len(frows) > 0 {
		fmt.Fprintln(w, "\nScaling fits, log10 y = a + b log10 x (x and y in SI units); 95 % intervals:")
		if err := report.Table(w, fh, frows); err != nil {
			return err
		}
	}
	return nil
}

func groupName(g tabulate.Group) string {
	if len(g.Key) == 0 {
		return "all"
	}
	return strings.Join(g.Key, " / ")
}

var metricLabels = map[string]string{"reynolds": "Re", "strouhal": "St", "drag_N": "drag (N)", "power_W": "power (W)"}

func groupRows(groups []tabulate.Group, human bool) ([]string, [][]string) {
	var h []string
	if human {
		h = []string{"group", "rows"}
		for _, m := range tabulate.Metrics {
			h = append(h, metricLabels[m])
		}
		h = append(h, "viscous (%)", "intermediate (%)", "inertial (%)")
	} else {
		h = []string{"group", "rows"}
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
			if human {
				cell := ""
				if st.N > 0 {
					cell = fmt.Sprintf("%s [%s–%s]", report.Num(st.Median, 3), report.Num(st.P5, 3), report.Num(st.P95, 3))
				}
				r = append(r, cell)
			} else {
				r = append(r, report.Num(st.Median, 6), report.Num(st.P5, 6), report.Num(st.P95, 6))
			}
		}
		for _, name := range []string{"viscous", "intermediate", "inertial"} {
			if human {
				r = append(r, report.Num(100*g.Regimes[name], 3))
			} else {
				r = append(r, report.Num(g.Regimes[name], 4))
			}
		}
		rows = append(rows, r)
	}
	return h, rows
}

func fitRows(groups []tabulate.Group, human bool) ([]string, [][]string) {
	h := []string{"group", "y", "x", "n", "ols_slope", "ols_low95", "ols_high95", "sma_slope", "sma_low95", "sma_high95", "r_squared"}
	if human {
		h = []string{"group", "y against x", "n", "OLS slope [95 %]", "SMA slope [95 %]", "r²"}
	}
	var rows [][]string
	for _, g := range groups {
		for _, f := range g.Fits {
			if human {
				ols, sma := "too few points", ""
				if f.OLSSlope == f.OLSSlope {
					ols = fmt.Sprintf("%s [%s, %s]", report.Num(f.OLSSlope, 3), report.Num(f.OLSLow, 3), report.Num(f.OLSHigh, 3))
					sma = fmt.Sprintf("%s [%s, %s]", report.Num(f.SMASlope, 3), report.Num(f.SMALow, 3), report.Num(f.SMAHigh, 3))
				}
				rows = append(rows, []string{groupName(g), f.Y + " against " + f.X, fmt.Sprint(f.N), ols, sma, report.Num(f.R2, 3)})
				continue
			}
			rows = append(rows, []string{groupName(g), f.Y, f.X, fmt.Sprint(f.N), report.Num(f.OLSSlope, 6), report.Num(f.OLSLow, 6),
				report.Num(f.OLSHigh, 6), report.Num(f.SMASlope, 6), report.Num(f.SMALow, 6), report.Num(f.SMAHigh, 6), report.Num(f.R2, 6)})
		}
	}
	return h, rows
}

type statJSON struct {
	N      int      `json:"n"`
	Median *float64 `json:"median"`
	P5     *float64 `json:"p5"`
	P95    *float64 `json:"p95"`
}

type scalingJSON struct {
	Y            string   `json:"y"`
	X            string   `json:"x"`
	N            int      `json:"n"`
	OLSSlope     *float64 `json:"ols_slope"`
	OLSLow       *float64 `json:"ols_low95"`
	OLSHigh      *float64 `json:"ols_high95"`
	OLSIntercept *float64 `json:"ols_intercept"`
	SMASlope     *float64 `json:"sma_slope"`
	SMALow       *float64 `json:"sma_low95"`
	SMAHigh      *float64 `json:"sma_high95"`
	SMAIntercept *float64 `json:"sma_intercept"`
	R2           *float64 `json:"r_squared"`
}

type groupJSON struct {
	Group   []string            `json:"group"`
	Rows    int                 `json:"rows"`
	Stats   map[string]statJSON `json:"statistics"`
	Regimes map[string]float64  `json:"regime_share"`
	Fits    []scalingJSON       `json:"fits"`
}

func groupsJSON(groups []tabulate.Group) []groupJSON {
	out := []groupJSON{}
	for _, g := range groups {
		gj := groupJSON{Group: g.Key, Rows: g.N, Stats: map[string]statJSON{}, Regimes: g.Regimes, Fits: []scalingJSON{}}
		if gj.Group == nil {
			gj.Group = []string{}
		}
		for m, st := range g.Stats {
			gj.Stats[m] = statJSON{N: st.N, Median: report.Opt(st.Median), P5: report.Opt(st.P5), P95: report.Opt(st.P95)}
		}
		for _, f := range g.Fits {
			gj.Fits = append(gj.Fits, scalingJSON{Y: f.Y, X: f.X, N: f.N, OLSSlope: report.Opt(f.OLSSlope), OLSLow: report.Opt(f.OLSLow),
				OLSHigh: report.Opt(f.OLSHigh), OLSIntercept: report.Opt(f.OLSIntercept), SMASlope: report.Opt(f.SMASlope),
				SMALow: report.Opt(f.SMALow), SMAHigh: report.Opt(f.SMAHigh), SMAIntercept: report.Opt(f.SMAIntercept), R2: report.Opt(f.R2)})
		}
		out = append(out, gj)
	}
	return out
}
