package cli

import (
	"context"
	"encoding/csv"
	"errors"
	"fmt"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"io"
	"maps"
	"math"
	"path/filepath"
	"runtime/debug"
	"slices"
	"strconv"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/figure"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/surveypage"
	"github.com/flowregime/flowregime/cmd/internal/tabulate"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
)

type reportOptions struct {
	tabulateOptions
	output, title string
	args          []string // the command line, for the page
}

func newReportCmd(s Streams) *cobra.Command {
	o := &reportOptions{}
	cmd := &cobra.Command{
		Use:   "report {FILE | -} -o report.html [flags]",
		Short: "Write a survey's results as one self-contained web page (HTML)",
		Long: `Run a survey table through batch and tabulate and write one HTML page
that holds everything a colleague needs to read the results: which column
was read as which quantity in which unit and the values assumed for the
others, the rows read, computed, rejected (line, column, reason) and
flagged (with what each flag means), the share of each group in each flow
regime, per-group summaries, scaling fits, the methods with their sources,
the cautions, and the version and command that made the page.

The page is a single file with its style and figures inside: no scripts,
nothing fetched from a network. It reads on a laptop or a phone and
prints. It lists at most ` + fmt.Sprint(surveypage.MaxListed) + ` rejected and ` + fmt.Sprint(surveypage.MaxListed) + ` flagged rows (the counts
are always complete; batch --rejects and --flagged-only give every row).
The input must be a survey table, not batch output. The exit status is 3
when rows were rejected (the page is written and lists them).

Flags for reading the table are those of batch; --by and --fit are those
of tabulate.`,
		Example: `  flowregime report survey.csv -o report.html --by taxon
  flowregime report survey.csv -o report.html --by species,site --fit power_W=mass`,
		Args: oneTable("report", "a file"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.input = args[0]
			o.args = append([]string{"report"}, args...)
			cmd.Flags().Visit(func(f *pflag.Flag) {
				for _, v := range flagValues(f) {
					if f.Shorthand != "" {
						o.args = append(o.args, "-"+f.Shorthand, v)
					} else {
						o.args = append(o.args, "--"+f.Name+"="+v)
					}
				}
			})
			return runReport(cmd.Context(), o, s)
		},
	}
	fs := cmd.Flags()
	fs.StringVarP(&o.output, "output", "o", "", "the HTML file to write (atomically); default stdout")
	fs.StringVar(&o.title, "title", "", "the page's title (default: from the file's name)")
	fs.StringVar(&o.by, "by", "", "comma-separated columns to group by (default: one group)")
	fs.StringArrayVar(&o.fits, "fit", nil, "y=x: scaling fit of y against x in log–log space (default reynolds=length, and power_W=mass with a mass column)")
	o.bindInputs(cmd)
	return cmd
}

// reportRun is what one run of batch and tabulate gives the page.
type reportRun struct {
	header  []string // the input's columns
	sum     batch.Summary
	rejects []batch.Reject // the first MaxListed
	rejRows []int          // every rejected data row
	groups  []tabulate.Group
	coll    *surveypage.Collector
	columns []batch.ColumnUse
	fits    []fitPairs
}

// fitPairs are the values of one --fit pair over the whole survey, in SI
// units as tabulate fits them, for its figure.
type fitPairs struct {
	pair   tabulate.Pair
	x, y   scalingColumn
	xs, ys []float64
}

// scalingColumn is where one side of a fit is read: a computed column (a
// plain number) or an input quantity (converted to SI from its column's
// unit or the cell's).
type scalingColumn struct {
	col   int
	kind  quantity.Kind
	unit  string
	si    bool
	label string
}

// newScalingColumn finds name as tabulate does: a column of that name, else
// the column batch reads that quantity from.
func newScalingColumn(header []string, cols []batch.ColumnUse, name string) (scalingColumn, bool) {
	if i := slices.Index(header, name); i >= 0 {
		return scalingColumn{col: i, label: columnLabel(name)}, true
	}
	f := inputs.Index(name)
	for i, c := range cols {
		if f >= 0 && c.Quantity == name && !c.Uncertainty && !inputs.Fields[f].Text {
			k := inputs.Fields[f].Kind
			return scalingColumn{col: i, kind: k, unit: c.Unit, si: true, label: name + " (" + quantity.SIUnit(k) + ")"}, true
		}
	}
	return scalingColumn{}, false
}

// value reads the column from a row; a cell that cannot be read is NaN,
// which the figure leaves out and counts.
func (c scalingColumn) value(row []string) float64 {
	if c.col >= len(row) {
		return math.NaN()
	}
	cell := strings.TrimSpace(row[c.col])
	if c.si {
		if v, err := quantity.ParseDefault(c.kind, cell, c.unit); err == nil {
			return v.SI
		}
		return math.NaN()
	}
	if v, err := strconv.ParseFloat(cell, 64); err == nil {
		return v
	}
	return math.NaN()
}

func (f *fitPairs) add(row []string) {
	f.xs = append(f.xs, f.x.value(row))
	f.ys = append(f.ys, f.y.value(row))
}

func runReport(ctx context.Context, o *reportOptions, s Streams) error {
	if ctx == nil {
		ctx = context.Background()
	}
	cfg, err := o.config()
	if err != nil {
		return err
	}
	out := namedFile{what: "the standard output", file: stdFile(s.Out)}
	if o.output != "" {
		out = namedFile{what: "-o " + o.output, path: o.output}
	}
	if err := checkOutputs(o.inputFiles(s), []namedFile{out}); err != nil {
		return err
	}
	in, _, err := o.open(s)
	if err != nil {
		return err
	}
	defer in.Close()
	run, err := o.collect(ctx, in, cfg)
	if err != nil {
		return err
	}
	page := o.page(run, cfg)
	if err := writePage(s, o.output, page); err != nil {
		return err
	}
	if run.sum.Rejected > 0 {
		return exitError{code: ExitRejected, msg: fmt.Sprintf("report: %d %s could not be computed; the page lists them", run.sum.Rejected, plural(run.sum.Rejected, "row", "rows"))}
	}
	return nil
}

// collect runs the table through batch into tabulate, watching each output
// row for the page.
func (o *reportOptions) collect(ctx context.Context, in io.Reader, cfg batch.Config) (reportRun, error) {
	var run reportRun
	cfg.OutFormat, cfg.FlaggedOnly = batch.CSV, false
	pr, pw := io.Pipe()
	done := make(chan error, 1)
	go func() {
		sum, err := batch.Run(ctx, in, pw, func(r batch.Reject) error {
			run.rejRows = append(run.rejRows, r.Row)
			if len(run.rejects) < surveypage.MaxListed {
				run.rejects = append(run.rejects, r)
			}
			return nil
		}, cfg)
		run.sum = sum
		pw.CloseWithError(err)
		done <- err
	}()
	err := o.summarise(pr, cfg, &run)
	pr.CloseWithError(errReportStopped) // stops batch if summarising ended early
	berr := <-done
	var ue usageError
	if errors.As(err, &ue) {
		return run, err
	}
	if berr != nil && !errors.Is(berr, errReportStopped) {
		return run, batchFailure("report", berr)
	}
	return run, err
}

var errReportStopped = errors.New("report: stopped")

// summarise reads batch's CSV output: the header, then every row through
// the collector into tabulate.
func (o *reportOptions) summarise(r io.Reader, cfg batch.Config, run *reportRun) error {
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = false
	header, err := cr.Read()
	if err != nil {
		if err == io.EOF {
			return nil // batch failed before its header; its error is reported
		}
		return err
	}
	run.header = inputColumns(header)
	if slices.Contains(run.header, "reynolds") && slices.Contains(run.header, "regime") {
		return usagef("report: the input is batch output; give the survey table itself, so that its rejects can be listed")
	}
	if run.columns, err = batch.DescribeColumns(run.header, cfg.Columns, cfg.Units); err != nil {
		return batchFailure("report", err)
	}
	sp, err := o.spec(header)
	if err != nil {
		return err
	}
	lengthCol, lengthUnit := quantityColumn(run.columns, "length")
	mediumCol, _ := quantityColumn(run.columns, "medium")
	run.coll = surveypage.NewCollector(header, surveypage.Setup{Ident: identColumns(run.columns, sp.By), By: sp.By,
		MediumColumn: mediumCol, DefaultMedium: cfg.DefaultMedium, LengthColumn: lengthCol, LengthUnit: lengthUnit})
	for _, p := range sp.Fits {
		x, okx := newScalingColumn(header, run.columns, p.X)
		y, oky := newScalingColumn(header, run.columns, p.Y)
		if okx && oky { // else tabulate names the missing column
			run.fits = append(run.fits, fitPairs{pair: p, x: x, y: y})
		}
	}
	next := func() ([]string, error) {
		row, err := cr.Read()
		if err == nil {
			run.coll.Observe(row)
			for i := range run.fits {
				run.fits[i].add(row)
			}
		}
		return row, err
	}
	run.groups, err = tabulate.Tabulate(header, next, sp)
	if err != nil {
		var tm tabulate.TooManyGroups
		if errors.As(err, &tm) || strings.HasPrefix(err.Error(), "--") {
			return usageError{fmt.Errorf("report: %v", err)}
		}
		return fmt.Errorf("report: %v", err)
	}
	return nil
}

// inputColumns returns the input's columns of a batch output header: all
// before the computed columns, found from the end.
func inputColumns(header []string) []string {
	for i := len(header) - len(batch.Computed); i >= 0; i-- {
		if slices.Equal(header[i:i+len(batch.Computed)], batch.Computed) {
			return header[:i]
		}
	}
	return header
}

// identColumns are the columns that identify a flagged row: the grouping
// columns, then up to three carried-through columns (site, date, …).
func identColumns(cols []batch.ColumnUse, by []string) []string {
	ident := slices.Clone(by)
	for _, c := range cols {
		if len(ident) >= len(by)+3 {
			break
		}
		if c.Quantity == "" && !slices.Contains(ident, c.Column) {
			ident = append(ident, c.Column)
		}
	}
	return ident
}

// quantityColumn returns the column holding a quantity and its unit.
func quantityColumn(cols []batch.ColumnUse, quantity string) (column, unit string) {
	for _, c := range cols {
		if c.Quantity == quantity && !c.Uncertainty {
			return c.Column, c.Unit
		}
	}
	return "", ""
}

// page puts a run into the page's terms.
func (o *reportOptions) page(run reportRun, cfg batch.Config) surveypage.Page {
	p := surveypage.Page{Title: o.title, Input: o.input, Command: commandLine(o.args), Version: buildVersion(),
		Cautions: []string{strings.Join(strings.Fields(estimateNotice), " "),
			"Drag and power of live animals differ from those of the rigid idealised bodies used here (swimming can raise drag several-fold)."}}
	if p.Title == "" {
		p.Title = "Flow regimes of the survey " + filepath.Base(o.input)
		if o.input == "-" {
			p.Title = "Flow regimes of a survey"
		}
	}
	if o.input == "-" {
		p.Input = "(standard input)"
	}
	p.Counts = surveypage.Counts{Read: run.sum.Read, Computed: run.sum.Written, Rejected: run.sum.Rejected, Blank: run.sum.Blank}
	for _, c := range run.columns {
		p.Columns = append(p.Columns, surveypage.Column{Name: c.Column, Quantity: c.Quantity, Unit: c.Unit, Uncertainty: c.Uncertainty,
			Word: c.Quantity != "" && inputs.Fields[inputs.Index(c.Quantity)].Text})
	}
	p.Assumed = assumedValues(run.columns, cfg)
	for _, r := range run.rejects {
		p.Rejects = append(p.Rejects, surveypage.Reject{Line: r.Line, Row: r.Row, Column: r.Column, Reason: r.Reason})
	}
	if run.coll != nil {
		p.Counts.Suspect, p.Counts.Limits = run.coll.FlaggedCounts()
		p.Suspect, p.Limits = run.coll.Flagged(run.rejRows)
		p.FlagKeys = run.coll.FlagKeys()
		p.Methods = run.coll.Methods()
	}
	if o.by != "" {
		p.GroupBy = o.by
	}
	p.Ident = identColumns(run.columns, splitBy(o.by))
	for _, g := range run.groups {
		p.Regimes = append(p.Regimes, surveypage.Share{Group: groupName(g), N: g.N,
			Viscous: 100 * g.Regimes["viscous"], Intermediate: 100 * g.Regimes["intermediate"], Inertial: 100 * g.Regimes["inertial"]})
	}
	p.Groups.Head, p.Groups.Rows = withoutShares(groupRows(run.groups, true))
	p.Fits.Head, p.Fits.Rows = pageFitRows(run.groups)
	if run.coll != nil {
		p.Figures = append(p.Figures, regimeMapFigure(run.coll.Points(), run.sum.Written))
	}
	for i, f := range run.fits {
		p.Figures = append(p.Figures, scalingFigure(fmt.Sprintf("fit-%d", i+1), f, o.by != ""))
	}
	return p
}

// regimeMapFigure draws the computed rows (or the sample of them the
// collector kept) on the regime map; a map that cannot be drawn becomes a
// figure without a picture whose caption says why.
func regimeMapFigure(pts []surveypage.Point, computed int) surveypage.Figure {
	fig := surveypage.Figure{ID: "regime-map", Title: "Regime map",
		Caption: "Each computed row at its Reynolds number (on the body length) and body length, over the viscous, intermediate and inertial ranges of Re."}
	if computed == 0 {
		fig.Caption = "No row was computed: there is nothing to draw."
		return fig
	}
	if len(pts) < computed {
		fig.Caption += fmt.Sprintf(" A random sample of %d of the %d computed rows is drawn (the same sample every time).", len(pts), computed)
	}
	rp := make([]figure.RegimePoint, len(pts))
	for i, pt := range pts {
		rp[i] = figure.RegimePoint{Group: surveypage.Shown(pt.Group), Reynolds: pt.Re, Y: pt.LengthMM}
	}
	f, err := figure.RegimeMapFigure(rp, figure.RegimeOptions{YLabel: "body length (mm)"})
	if err == nil {
		fig.SVG, err = f.SVG()
	}
	if err != nil {
		fig.Caption = "No regime map could be drawn: " + strings.TrimPrefix(err.Error(), "regime map: ") + "."
		return fig
	}
	for _, n := range f.Notes {
		fig.Caption += " " + strings.ToUpper(n[:1]) + n[1:] + "."
	}
	return fig
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// withoutShares drops the regime shares from the group summaries: the page
// shows them in the regime table.
func withoutShares(head []string, rows [][]string) ([]string, [][]string) {
	n := len(regime.Regimes())
	for i := range rows {
		rows[i] = rows[i][:len(rows[i])-n]
	}
	return head[:len(head)-n], rows
}

// scalingFigure draws one fit over the whole survey: at most
// surveypage.MaxPoints pairs (every k-th, when there are more), the lines
// of the fit of all pairs.
func scalingFigure(id string, f fitPairs, grouped bool) surveypage.Figure {
	fig := surveypage.Figure{ID: id, Title: f.y.label + " against " + f.x.label,
		Caption: "The computed rows, log–log, with the ordinary least squares (OLS) and standardised major axis (SMA) lines fitted over the whole survey and the bands of their exponents' 95 % intervals."}
	if grouped {
		fig.Caption += " Per-group fits are in the table above."
	}
	if len(f.xs) == 0 {
		fig.Caption = "No row was computed: there is nothing to draw."
		return fig
	}
	sc := figure.Scaling{X: f.xs, Y: f.ys, XLabel: f.x.label, YLabel: f.y.label, Fit: tabulate.ScalingFit(f.xs, f.ys)}
	if n := len(f.xs); n > surveypage.MaxPoints {
		k := (n + surveypage.MaxPoints - 1) / surveypage.MaxPoints
		sc.X, sc.Y = nil, nil
		for i := 0; i < n; i += k {
			sc.X, sc.Y = append(sc.X, f.xs[i]), append(sc.Y, f.ys[i])
		}
		fig.Caption += fmt.Sprintf(" Every %d-th of the %d rows is drawn (%d points); the lines are fitted to all.", k, n, len(sc.X))
	}
	fg, err := figure.ScalingFigure(sc)
	if err == nil {
		fig.SVG, err = fg.SVG()
	}
	if err != nil {
		fig.Caption = "No figure could be drawn for " + f.pair.Y + " against " + f.pair.X + ": " + strings.TrimPrefix(err.Error(), "scaling figure: ") + "."
		return fig
	}
	for _, n := range fg.Notes {
		fig.Caption += " " + strings.ToUpper(n[:1]) + n[1:] + "."
	}
	return fig
}

func splitBy(by string) []string {
	if by == "" {
		return nil
	}
	parts := strings.Split(by, ",")
	for i := range parts {
		parts[i] = strings.TrimSpace(parts[i])
	}
	return parts
}

// conditionDefaults are the medium conditions media takes when none is
// given (media.Conditions documents them).
var conditionDefaults = []struct{ quantity, value string }{
	{"temperature", "water 20 °C; air the standard atmosphere's at its altitude"},
	{"salinity", "sea water 35 g/kg (reference-composition salinity)"},
	{"altitude", "0 m (sea level)"},
	{"humidity", "0 % (dry air)"},
	{"depth", "0 m (at the surface)"},
}

// assumedValues lists the values in force for quantities without a column:
// the command's constants, the medium, and the media's default conditions.
func assumedValues(cols []batch.ColumnUse, cfg batch.Config) []surveypage.Assumed {
	has := map[string]bool{}
	for _, c := range cols {
		if c.Quantity != "" && !c.Uncertainty {
			has[c.Quantity] = true
		}
	}
	var out []surveypage.Assumed
	medium := surveypage.Assumed{Quantity: "medium", Value: cfg.DefaultMedium, Origin: "--medium (every row)"}
	if has["medium"] {
		medium.Origin = "--medium (rows whose medium cell is empty)"
	}
	out = append(out, medium)
	for _, k := range slices.Sorted(maps.Keys(cfg.Constants)) {
		origin := "--" + k + " (every row)"
		if has[k] {
			origin = "--" + k + ": not used, a column gives this quantity"
		}
		out = append(out, surveypage.Assumed{Quantity: k, Value: cfg.Constants[k], Origin: origin})
	}
	for _, d := range conditionDefaults {
		if !has[d.quantity] && cfg.Constants[d.quantity] == "" {
			out = append(out, surveypage.Assumed{Quantity: d.quantity, Value: d.value, Origin: "default of the medium's methods"})
		}
	}
	return out
}

// writePage writes the page to name (atomically) or to the standard output.
func writePage(s Streams, name string, p surveypage.Page) error {
	if name == "" {
		return surveypage.Write(s.Out, p)
	}
	f, err := s.outs.create(name)
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", name, err)
	}
	defer f.abort()
	if err := surveypage.Write(f, p); err != nil {
		return fmt.Errorf("cannot write %s: %v", name, withoutPath(err))
	}
	if err := f.commit(); err != nil {
		return fmt.Errorf("cannot write %s: %v", name, withoutPath(err))
	}
	return nil
}

// flagValues returns the values a flag was given, one per use.
func flagValues(f *pflag.Flag) []string {
	if sv, ok := f.Value.(pflag.SliceValue); ok {
		return sv.GetSlice()
	}
	return []string{f.Value.String()}
}

// commandLine is the command as run, each argument quoted where a shell
// would need it.
func commandLine(args []string) string {
	parts := []string{"flowregime"}
	for _, a := range args {
		if a == "" || strings.ContainsAny(a, " \t\n'\"\\$`*?[]{}()<>|&;#~!") {
			a = "'" + strings.ReplaceAll(a, "'", `'\''`) + "'"
		}
		parts = append(parts, a)
	}
	return strings.Join(parts, " ")
}

// buildVersion is the module version and, for a build from a checkout,
// its commit.
func buildVersion() string {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return "(version unknown)"
	}
	v := bi.Main.Version
	for _, s := range bi.Settings {
		if s.Key == "vcs.revision" && len(s.Value) >= 12 {
			v += " (commit " + s.Value[:12] + ")"
		}
	}
	return v
}

// pageFitRows states each scaling fit as a law, y ∝ x^b, with b's 95 %
// interval by standardised major axis and by least squares, the
// intercept's, and how b compares with isometry where the quantities have
// one (the same comparison as tabulate's, without --expect).
func pageFitRows(groups []tabulate.Group) ([]string, [][]string) {
	head := []string{"group", "scaling law", "b, 95 % (SMA)", "b, 95 % (least squares)", "log10 a, 95 % (SMA)", "rows", "r²", "against isometry"}
	num := func(v float64) string { return report.Num(v, 3) }
	interval := func(v, lo, hi float64) string { return fmt.Sprintf("%s [%s, %s]", num(v), num(lo), num(hi)) }
	var rows [][]string
	for _, g := range groups {
		for _, f := range g.Fits {
			if f.SMASlope != f.SMASlope { // too few rows or no spread
				continue
			}
			against := "none for these quantities"
			if ref, ok := referenceFor(nil, f.Pair); ok {
				against = "inside the interval"
				if tabulate.Compare(f.Fit, ref).OutsideSMA {
					against = "outside the interval"
				}
				against = fmt.Sprintf("b = %s: %s", num(ref.Exponent), against)
			}
			rows = append(rows, []string{groupName(g), fmt.Sprintf("%s ∝ %s^%s", f.Y, f.X, num(f.SMASlope)),
				interval(f.SMASlope, f.SMALow, f.SMAHigh), interval(f.OLSSlope, f.OLSLow, f.OLSHigh),
				interval(f.SMAIntercept, f.SMAInterceptLow, f.SMAInterceptHigh), fmt.Sprint(f.N), num(f.R2), against})
		}
	}
	return head, rows
}
