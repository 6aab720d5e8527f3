package cli

import (
	"context"
	"encoding/csv"
	"errors"
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
	by      string
	fits    []string
	expects []string
	only    string
	format  string
	fitSet  bool // --fit was given
	budget  int  // MiB of values held in memory (hidden --memory-budget)
}

// maxBudgetMiB is the largest --memory-budget: 1 TiB, far above any
// memory, and small enough that its bytes fit an int.
const maxBudgetMiB = 1 << 20

// newTabulateCmd builds tabulate; a test passes runF to receive the
// checked options instead of running.
func newTabulateCmd(s Streams, runF func(*tabulateOptions) error) *cobra.Command {
	o := &tabulateOptions{}
	cmd := &cobra.Command{
		Use:   "tabulate {FILE | -} [flags]",
		Short: "Per-group medians, percentiles, regime shares and log–log scaling fits",
		Long: `Summarise a survey per group (--by species,site): the count, the median and
5th–95th percentiles (empirical quantiles) of the Reynolds number, Strouhal
number, drag (N) and power (W), the share of rows in each flow regime, and
scaling laws y = a·x^b (--fit y=x, repeatable), fitted on log10 y against
log10 x by standardised major axis and by ordinary least squares (Warton et
al. 2006, Biol. Rev. 81), the exponent b and log10 a each with its 95 %
confidence interval. x and y are computed columns (reynolds, strouhal,
drag_N, power_W) or input quantities (length, mass, …), read in SI units
from their columns.

Each exponent is compared with a reference: --expect power_W=mass:0.75
(repeatable; fractions such as 2/3 are fine), else isometry where both are
geometric (length 1, area 2, mass 3 powers of length), and the output says
whether the 95 % interval excludes it. A fit needs 3 rows with both values;
groups with fewer are named together on one line, as are groups of fewer
than 3 rows in the summary table (CSV and JSON keep every group).

CSV holds one table: --only summaries (the default without --fit) or
--only fits; with --fit and --format csv, --only is required. JSON holds
both unless --only says otherwise.

The input is either batch output or a survey table, which is then run
through batch first with the same flags. Groups are held in memory, at
most 100000 of them (more, as with --by on a row id, is refused: a
summary is for groups of many rows). The values behind the medians,
percentiles and fits are held in memory up to 64 MiB; past that they are
written to an unnamed temporary file in the system's temporary folder
($TMPDIR) and read back a group at a time, so memory stays bounded
however many rows there are, with the same results.`,
		Example: `  flowregime tabulate survey.csv --by taxon --fit power_W=mass --fit reynolds=length
  flowregime tabulate survey.csv --by taxon --fit power_W=mass --expect power_W=mass:0.75
  flowregime tabulate survey.csv --by taxon --format csv --only fits > fits.csv
  flowregime batch survey.csv -q | flowregime tabulate - --by site --format json`,
		Args: oneTable("tabulate", "a file"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.input, o.fitSet = args[0], cmd.Flags().Changed("fit")
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			if err := o.checkOnly(o.fitSet); err != nil {
				return err
			}
			if o.budget < 1 || o.budget > maxBudgetMiB {
				return usagef("--memory-budget %d: give 1 to %d MiB", o.budget, maxBudgetMiB)
			}
			if runF != nil {
				return runF(o)
			}
			return runTabulate(cmd.Context(), o, s)
		},
	}
	cmd.Flags().StringVar(&o.by, "by", "", "comma-separated columns to group by (default: one group)")
	cmd.Flags().StringArrayVar(&o.fits, "fit", nil, "y=x: scaling fit of y against x in log–log space (default reynolds=length, and power_W=mass with a mass column)")
	cmd.Flags().StringArrayVar(&o.expects, "expect", nil, "y=x:b: compare the fitted exponent of y against x with b (repeatable; default: isometry where y and x are lengths, areas or mass)")
	cmd.Flags().StringVar(&o.only, "only", "", "write only the group summaries or only the scaling fits: summaries or fits (CSV holds one of them)")
	cmd.Flags().StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	cmd.Flags().IntVar(&o.budget, "memory-budget", tabulate.DefaultBudget*8>>20, "MiB of values held in memory before the rest go to a temporary file (for tests and measuring; results do not change)")
	_ = cmd.Flags().MarkHidden("memory-budget")
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
	refs, err := o.references()
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
	groups, rejected, err := tabulateStream(ctx, in, cfg, o.spec, o.budget<<20/8, reject)
	if err != nil {
		return err
	}
	if err := checkExpects(refs, groups); err != nil {
		return err
	}
	if o.format == report.FormatCSV && o.only == "" {
		o.only = onlySummaries // no --fit was given: the default fits stay out of CSV
	}
	if err := writeGroups(s.Out, o.format, o.only, groups, refs); err != nil {
		return err
	}
	if rejected > 0 {
		return exitError{code: ExitRejected, msg: fmt.Sprintf("tabulate: %d rows rejected (listed above) and left out of the summary", rejected)}
	}
	return nil
}

// tabulateStream summarises in, running it through batch first unless it
// already holds batch output. Rows that cannot be read or computed go to
// reject, are counted and left out. Past budget values (0 for
// tabulate.DefaultBudget) they go to a temporary file.
func tabulateStream(ctx context.Context, in io.Reader, cfg batch.Config, spec func([]string) (tabulate.Spec, error), budget int, reject func(batch.Reject)) ([]tabulate.Group, int, error) {
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
	next := func() (batch.Chunk, error) {
		c, err := tr.NextChunk()
		if err != nil && err != io.EOF {
			return c, readFailure{err}
		}
		return c, err
	}
	onReject := func(rec batch.Record) {
		rejected.Add(1)
		reject(batch.Reject{Line: rec.Line, Reason: rec.Err.Error(), Record: rec.Text})
	}
	groups, err := tabulate.Chunks(header, next, sp, tabulate.Options{Workers: cfg.Workers, Budget: budget}, onReject)
	if rf := (readFailure{}); errors.As(err, &rf) {
		return nil, 0, fmt.Errorf("tabulate: cannot read the table: %v", rf.err)
	}
	if se := (tabulate.SpillError{}); errors.As(err, &se) {
		if pr != nil {
			pr.CloseWithError(err)
		}
		return nil, 0, fmt.Errorf("tabulate: %v", se.Err)
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

// readFailure is a failure to read the table, told apart from a
// summary's own errors.
type readFailure struct{ err error }

func (r readFailure) Error() string { return r.err.Error() }

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
