package cli

import (
	"cmp"
	"context"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
)

type batchOptions struct {
	input, inFormat, outFormat, output, rejects, names string
	record                                             string
	columns, units, ignore, missing                    []string
	flaggedOnly, quiet, mediaAnywhere, explain         bool
	workers                                            int
	firstLine                                          int // line of the original file the input's first line is (shards)
	organism                                           organismFlags
	medium                                             string
	flags                                              mediumFlags
	unc                                                uncertaintyFlags
	uncOn                                              bool
}

var batchHelp = `Read a survey table (CSV, TSV or JSON Lines; FILE or - for stdin) and
write every row back with computed columns appended:
  ` + strings.Join(batch.Computed, ", ") + `
Input columns are carried through unchanged and in order.

Columns are matched to quantities by header, with units taken from the
header as data sheets write them: "length (mm)", "speed [cm/s]", "temp_C",
"length_mm". A cell may also carry its own unit ("12 mm"). Names are
compared ignoring case, spacing and punctuation, with the spellings of
field sheets ("FL (mm)", "Water Temp (°C)", "TBF", "Sal (ppt)"; see
'flowregime columns'). Override with --column length="Body length" and
--unit length=mm. A column that reads like a measurement but matches no
quantity, or a length, speed, mass or frequency column without a unit in
its header, --unit or its first cells, is refused at the header (exit 2):
map it with --column, or leave it out with --ignore "Notes". Without -q,
the mapping (each column's quantity and unit, constants, defaults,
columns not used) is printed on stderr first; --explain prints it with
the first rows as read, and computes nothing. A cell reading NA, N/A,
NaN, -, –, — or ? (--missing) is absent; in the length or speed column
the row is rejected. Quantities:
  length diameter shape speed frequency amplitude mass span wing_length
  chord wing_area stroke_angle efficiency drag_coefficient area
  induced_factor profile_drag disc diffusivity medium temperature
  temp_offset salinity depth pressure altitude humidity latitude
A flag of calc (--temp 12C, --medium seawater, --shape spheroid, …) gives a
constant for a quantity that has no column.

A medium column may name a medium file (.json, made by 'flowregime fit
--save'). Such a path is taken relative to the table's folder (for
standard input, the working directory) and must stay inside it: no
absolute path, no "..", no link leading out; --media-anywhere lifts this.
A file that cannot be used is rejected with a short reason that does not
quote the file. --medium, given on the command line, is read as given.

Table output (--format table, or -o FILE.txt) comes in pages of 1000 rows,
each an aligned table under the repeated header, so that memory does not
grow with the input; control characters in cells are shown escaped.
--workers accepts 1 to 256.

Rows that cannot be computed go to --rejects FILE (CSV: line, row, column,
reason, record) or, without it, one line each to stderr; the exit status is
3 when any row was rejected. Blank lines are skipped and counted.

The flags column names in plain words what looks wrong: a Strouhal number
outside 0.05–1 for a swimmer or below 0.05 for a flyer (above 1 is slow or
hovering flight) (strouhal-outside-animals), a speed in body lengths per
second beyond known organisms (speed-beyond-known), a correlation used
outside its range (correlation-out-of-range), a medium condition outside a
method's range (medium-out-of-range), inconsistent inputs such as an
amplitude larger than the body or a wingspan without a mass
(inconsistent-inputs), a stroke frequency without an amplitude or the
reverse, so no Strouhal number (stroke-incomplete), and model limits
(model-limit, drag-crisis, geometry). --flagged-only keeps only flagged rows. flag_reasons gives each
flag's reason with its value ("strouhal 2.08 > 1 for a swimmer"), separated
by " | ". The assumed column lists, joined by ";", the defaults that changed
the row's result (temperature=20C, salinity=35g/kg, shape=sphere,
efficiency=1, flapping, induced-factor=1.15, profile-power=1.2Pam, …); the
end summary counts each.

Uncertainty: a column named after another with "sd" — "length sd",
"length_sd", "length (mm) sd" — holds that quantity's standard
uncertainty, in its unit unless its own header gives one ("length sd (cm)")
or the cell does ("1cm", converted, never rescaling the value; "5%" is
relative). Cells may also read "12±1" or "12±1cm", where a bare value is
in its column's unit. With any such column, or
with --uncertainty, each row's uncertainty is propagated (Monte Carlo with
--draws and --seed, or --uncertainty linear) and these columns follow:
  reynolds_low95 reynolds_high95 strouhal_low95 strouhal_high95 drag_N_low95
  drag_N_high95 power_W_low95 power_W_high95 regime_probability
(the last: the probability of the row's regime). Each row's generator is
seeded from --seed and the row's text, so the output does not depend on the
number of workers or on sharding. A "±" in a row without propagation is
flagged uncertainty-ignored.

For parallel engines: with --names "a,b,c" the input has no header line and
the output has none either, so shards of a file processed separately and
concatenated equal the whole file's output. JSON Lines output never has a
header. --first-line N tells a shard that its first line is line N of the
original file, so that rejects name the original file's lines (their row
numbers stay counted within the shard). A shard cut by lines must not cut
a quoted cell that spans lines.`

// newBatchCmd builds batch; a test passes runF to receive the options
// instead of running.
func newBatchCmd(s Streams, runF func(*batchOptions) error) *cobra.Command {
	o := &batchOptions{}
	cmd := &cobra.Command{
		Use:   "batch {FILE | -} [flags]",
		Short: "Compute every row of a survey table (CSV, TSV, JSON Lines), in parallel, in order",
		Long:  batchHelp + "\n\n" + estimateNotice,
		Example: `  flowregime batch survey.csv -o results.csv --rejects rejects.csv
  flowregime batch tags.tsv --medium seawater --temp 8C --format jsonl
  export NAMES="$(head -1 survey.csv)"
  tail -n +2 survey.csv | parallel --pipe -N 100000 -k 'flowregime batch - --names "$NAMES" --first-line $(( ({#}-1)*100000 + 2 )) -q'`,
		Args: oneTable("batch", "a file"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.input = args[0]
			o.uncOn = cmd.Flags().Changed("uncertainty") || cmd.Flags().Changed("draws")
			if runF != nil {
				return runF(o)
			}
			return runBatch(cmd.Context(), o, s)
		},
	}
	fs := cmd.Flags()
	fs.StringVar(&o.outFormat, "format", "", "output: csv, tsv, jsonl or table (default: from -o's extension, else csv)")
	fs.StringVarP(&o.output, "output", "o", "", "output file (written atomically); default stdout")
	fs.StringVar(&o.rejects, "rejects", "", "file for rows that could not be computed (CSV)")
	fs.StringVar(&o.record, "record", "", "write a run record (JSON: version, command line, column mapping, constants, counts, flags, assumptions) to this file, atomically")
	fs.StringVar(&o.names, "names", "", "comma-separated column names of a headerless input (output gets no header)")
	fs.IntVar(&o.firstLine, "first-line", 1, "number rejects' lines from N: the input is a shard whose first line is line N of the original file")
	fs.BoolVar(&o.flaggedOnly, "flagged-only", false, "write only rows with flags")
	fs.BoolVarP(&o.quiet, "quiet", "q", false, "no progress bar, no column report and no summary")
	o.bindInputs(cmd)
	o.unc.bind(cmd)
	return cmd
}

// bindInputs binds the flags that say how to read a table and what to
// assume for quantities it lacks; batch and tabulate share them.
func (o *batchOptions) bindInputs(cmd *cobra.Command) {
	fs := cmd.Flags()
	fs.StringVar(&o.inFormat, "input-format", "", "csv, tsv or jsonl (default: from the file's extension, else csv)")
	fs.StringArrayVar(&o.columns, "column", nil, "quantity=header: take a quantity from this column (repeatable)")
	fs.StringArrayVar(&o.units, "unit", nil, "quantity=unit: unit of that quantity's column (repeatable)")
	fs.StringArrayVar(&o.ignore, "ignore", nil, "header of a column to leave out (repeatable), e.g. --ignore \"Notes\"")
	fs.StringSliceVar(&o.missing, "missing", inputs.DefaultMissing, "comma-separated cell texts that mean not measured (a blank cell always does)")
	fs.BoolVar(&o.explain, "explain", false, "print how the header and the first rows are read (columns, units, constants, defaults), compute nothing")
	fs.IntVar(&o.workers, "workers", 0, fmt.Sprintf("parallel workers, 1 to %d (default: number of CPUs)", maxWorkers))
	fs.BoolVar(&o.mediaAnywhere, "media-anywhere", false, "let medium files named in the table lie outside the table's folder")
	o.organism.bind(cmd)
	fs.StringVar(&o.medium, "medium", media.KindFreshWater, "medium for rows without a medium column: air, freshwater or seawater")
	o.flags.bind(fs)
}

// open returns the input named by o.input and its size (−1 if unknown).
func (o *batchOptions) open(s Streams) (io.ReadCloser, int64, error) {
	if o.input == "-" {
		return io.NopCloser(s.In), -1, nil
	}
	f, err := os.Open(o.input)
	if err != nil {
		return nil, 0, fmt.Errorf("cannot read %s: %v", o.input, err)
	}
	size := int64(-1)
	if st, err := f.Stat(); err == nil {
		size = st.Size()
	}
	return f, size, nil
}

// inputFiles are the files batch and tabulate read: the table and a
// medium file given by --medium.
func (o *batchOptions) inputFiles(s Streams) []namedFile {
	ins := []namedFile{{what: "the input " + o.input, path: o.input}}
	if o.input == "-" {
		ins[0] = namedFile{what: "the standard input", file: stdFile(s.In)}
	}
	if inputs.IsMediumFile(o.medium) {
		ins = append(ins, namedFile{what: "the medium file " + o.medium, path: o.medium})
	}
	return ins
}

// outputFiles are the files batch writes: -o (else the standard output)
// and --rejects.
func (o *batchOptions) outputFiles(s Streams) []namedFile {
	outs := []namedFile{{what: "the standard output", file: stdFile(s.Out)}}
	if o.output != "" {
		outs[0] = namedFile{what: "-o " + o.output, path: o.output}
	}
	if o.rejects != "" {
		outs = append(outs, namedFile{what: "--rejects " + o.rejects, path: o.rejects})
	}
	if o.record != "" {
		outs = append(outs, namedFile{what: "--record " + o.record, path: o.record})
	}
	return outs
}

// readsTSV reports whether a table is read as TSV: by --format, else by
// its file name's extension.
func readsTSV(format, name string) bool {
	return format == "tsv" || format == "" && formatFromName(name) == "tsv"
}

func formatFromName(name string) string {
	switch strings.ToLower(filepath.Ext(name)) {
	case ".tsv", ".tab":
		return batch.TSV
	case ".jsonl", ".ndjson":
		return batch.JSONL
	case ".txt":
		return batch.Table
	}
	return batch.CSV
}

func keyValues(flag string, items []string) (map[string]string, error) {
	out := map[string]string{}
	for _, it := range items {
		k, v, ok := strings.Cut(it, "=")
		if !ok || strings.TrimSpace(k) == "" {
			return nil, usagef("--%s %q: write quantity=value, e.g. --%s length=mm", flag, it, flag)
		}
		out[strings.TrimSpace(k)] = strings.Trim(strings.TrimSpace(v), `"`)
	}
	return out, nil
}

// config turns the flags into a batch configuration.
func (o *batchOptions) config() (batch.Config, error) {
	var err error
	if o.unc.method == "" { // commands that do not bind the uncertainty flags
		o.unc = uncertaintyFlags{method: regime.MethodMonteCarlo, draws: 10000, seed: 1}
	}
	if err := o.unc.check(); err != nil {
		return batch.Config{}, err
	}
	if o.workers < 0 || o.workers > maxWorkers {
		return batch.Config{}, usagef("--workers %d: give 1 to %d, or leave it out for one per CPU", o.workers, maxWorkers)
	}
	medium, err := checkMediumFlag(o.medium)
	if err != nil {
		return batch.Config{}, err
	}
	cfg := batch.Config{Workers: o.workers, FlaggedOnly: o.flaggedOnly, DefaultMedium: medium,
		Uncertainty: o.uncOn, Method: o.unc.method, Draws: o.unc.draws, Seed: o.unc.seed,
		MediaDir: ".", MediaAnywhere: o.mediaAnywhere}
	if o.input != "-" {
		cfg.MediaDir = filepath.Dir(o.input)
	}
	cfg.InFormat = o.inFormat
	if cfg.InFormat == "" {
		cfg.InFormat = batch.CSV
		if o.input != "-" {
			cfg.InFormat = formatFromName(o.input)
		}
	}
	cfg.OutFormat = o.outFormat
	if cfg.OutFormat == "" {
		cfg.OutFormat = batch.CSV
		if o.output != "" {
			cfg.OutFormat = formatFromName(o.output)
		}
	}
	switch cfg.InFormat {
	case batch.CSV, batch.TSV, batch.JSONL:
	default:
		return cfg, usagef("--input-format %q is not known; accepted: csv, tsv, jsonl", cfg.InFormat)
	}
	switch cfg.OutFormat {
	case batch.CSV, batch.TSV, batch.JSONL, batch.Table:
	default:
		return cfg, usagef("--format %q is not known; accepted: csv, tsv, jsonl, table", cfg.OutFormat)
	}
	if cfg.Columns, err = keyValues("column", o.columns); err != nil {
		return cfg, err
	}
	if cfg.Units, err = keyValues("unit", o.units); err != nil {
		return cfg, err
	}
	cfg.Ignore = o.ignore
	cfg.Missing = missingTokens(o.missing)
	if o.names != "" {
		r := csv.NewReader(strings.NewReader(o.names))
		if cfg.Names, err = r.Read(); err != nil {
			return cfg, usagef("--names: %v", err)
		}
	}
	cfg.Constants = merge(o.organism.source(), o.flags.source())
	if cfg.Constants["disc"] == "span" {
		delete(cfg.Constants, "disc")
	}
	for k, v := range cfg.Constants {
		if v == "" {
			delete(cfg.Constants, k)
		}
	}
	// Check the constants once, so a bad flag is a usage error, not a reject per row.
	for k, v := range cfg.Constants {
		f := inputs.Fields[inputs.Index(k)]
		if err := checkConstant(f, v); err != nil {
			return cfg, err
		}
	}

	return cfg, nil
}

// missingTokens trims the --missing list and drops empty entries; an
// empty list (--missing "") leaves only blank cells meaning missing.
func missingTokens(list []string) []string {
	out := []string{}
	for _, t := range list {
		if t = strings.TrimSpace(t); t != "" {
			out = append(out, t)
		}
	}
	return out
}

// mappingReport prints the mapping report on stderr, each line prefixed.
func mappingReport(w io.Writer, command string) func([]string) {
	return func(lines []string) {
		for _, l := range lines {
			fmt.Fprintln(w, report.Printable("flowregime: "+command+": "+l))
		}
	}
}

// maxWorkers bounds --workers. Each worker holds chunks of input and output
// in flight (a few MiB); beyond a few per core, more workers add memory and
// no speed (a stated limit, common practice, no source).
const maxWorkers = 256

// checkConstant checks one flag constant of batch or tabulate: a number
// with its unit, or a shape or disc name.
func checkConstant(f inputs.Field, v string) error {
	switch f.Name {
	case "shape":
		if _, err := regime.ParseShape(v); err != nil {
			return usagef("--shape: %s", trimPkg(err))
		}
	case "disc":
		if v != regime.DiscSpan && v != regime.DiscStroke {
			return usagef("--disc %q is not known; accepted: %s, %s", v, regime.DiscSpan, regime.DiscStroke)
		}
	default:
		if !f.Text {
			_, err := parseFlagValue(f, v)
			return err
		}
	}
	return nil
}

// checkMediumFlag checks --medium of batch and tabulate before any row is
// read: a built-in medium, or a medium file that reads and checks (a file
// that cannot be read is an I/O failure; one that reads but is not a
// medium file, a usage error). A file
// named on the command line is taken relative to the working directory
// and returned as an absolute path, so that the table's rows cannot mean
// another file by the same name.
func checkMediumFlag(medium string) (string, error) {
	if inputs.IsMediumFile(medium) {
		if _, err := os.Stat(medium); err != nil { // an I/O failure, exit 1
			return "", fmt.Errorf("--medium: cannot read %s: %v", medium, errors.Unwrap(err))
		}
		if _, err := inputs.LoadMediumFile(medium); err != nil {
			msg := inputs.Reason(err)
			if fe := (*inputs.MediumFileError)(nil); errors.As(err, &fe) {
				msg = fe.Path + ": " + inputs.Reason(fe.Err)
			}
			return "", usagef("--medium: %s", msg)
		}
		abs, err := filepath.Abs(medium)
		if err != nil {
			return "", usagef("--medium: %v", err)
		}
		return abs, nil
	}
	for _, k := range media.Kinds {
		if strings.EqualFold(medium, k) {
			return medium, nil
		}
	}
	return "", usagef("--medium %q is not known; accepted: %s, or a medium file (.json)", medium, strings.Join(media.Kinds, ", "))
}

func runBatch(ctx context.Context, o *batchOptions, s Streams) error {
	if ctx == nil {
		ctx = context.Background()
	}
	cfg, err := o.config()
	if err != nil {
		return err
	}
	if o.firstLine < 1 {
		return usagef("--first-line %d: give the line number (1 or more) of the original file where this input starts", o.firstLine)
	}
	if err := checkOutputs(o.inputFiles(s), o.outputFiles(s)); err != nil {
		return err
	}
	in, size, err := o.open(s)
	if err != nil {
		return err
	}
	defer in.Close()
	if o.explain {
		return explainBatch(in, cfg, s, "batch")
	}
	if !o.quiet {
		cfg.Mapped = mappingReport(s.Err, "batch")
	}
	var out io.Writer = s.Out
	var outFile, rejFile *atomicFile
	if o.output != "" {
		if outFile, err = s.outs.create(o.output); err != nil {
			return fmt.Errorf("cannot write %s: %v", o.output, err)
		}
		defer outFile.abort()
		out = outFile
	}
	var rejW *csv.Writer
	if o.rejects != "" {
		if rejFile, err = s.outs.create(o.rejects); err != nil {
			return fmt.Errorf("cannot write %s: %v", o.rejects, err)
		}
		defer rejFile.abort()
		rejW = csv.NewWriter(rejFile)
		rejW.Write([]string{"line", "row", "column", "reason", "record"})
	}
	reject := func(r batch.Reject) error {
		r.Line += o.firstLine - 1
		if rejW != nil {
			return rejW.Write([]string{strconv.Itoa(r.Line), strconv.Itoa(r.Row), r.Column, r.Reason, r.Record})
		}
		_, err := fmt.Fprintf(s.Err, "flowregime: rejected %s\n", rejectText(r))
		return err
	}
	if !o.quiet && s.IsStderrTTY() {
		bar := progressbar.NewOptions64(size, progressbar.OptionSetWriter(s.Err), progressbar.OptionShowBytes(true),
			progressbar.OptionSetDescription("batch"), progressbar.OptionClearOnFinish(), progressbar.OptionThrottle(200e6))
		cfg.Progress = func(n int64) { bar.Set64(n) }
		defer bar.Finish()
	}
	sum, err := batch.Run(ctx, in, out, reject, cfg)
	if err != nil {
		if werr := cmp.Or(writeFailure(o.output, outFile), writeFailure(o.rejects, rejFile)); werr != nil {
			return werr
		}
		return batchFailure("batch", err)
	}
	if rejW != nil {
		rejW.Flush()
		if err := rejW.Error(); err != nil {
			return fmt.Errorf("cannot write %s: %v", o.rejects, withoutPath(err))
		}
		if err := rejFile.commit(); err != nil {
			return fmt.Errorf("cannot write %s: %v", o.rejects, withoutPath(err))
		}
	}
	if outFile != nil {
		if err := outFile.commit(); err != nil {
			return fmt.Errorf("cannot write %s: %v", o.output, withoutPath(err))
		}
	}
	if o.record != "" {
		if err := writeRecord(o.record, s, newRunRecord(o, s, cfg, sum)); err != nil {
			return err
		}
	}
	if !o.quiet {
		fmt.Fprintln(s.Err, report.Printable(summaryLine(sum, o.rejects)))
		for _, l := range assumedLines(sum.Assumed) {
			fmt.Fprintln(s.Err, l)
		}
	}
	if sum.Rejected > 0 {
		return exitError{code: ExitRejected}
	}
	return nil
}

// explainRows is how many data rows --explain shows as read.
const explainRows = 3

// explainBatch prints the mapping report and the first rows as read, on
// the standard output, and computes nothing.
func explainBatch(in io.Reader, cfg batch.Config, s Streams, command string) error {
	lines, err := batch.Explain(in, cfg, explainRows)
	if err != nil {
		return batchFailure(command, err)
	}
	for _, l := range lines {
		if _, err := fmt.Fprintln(s.Out, report.Printable(l)); err != nil {
			return err
		}
	}
	return nil
}

// batchFailure reports a failed batch run; a problem with the table's
// header is a usage mistake (exit 2).
func batchFailure(command string, err error) error {
	var he batch.HeaderError
	if errors.As(err, &he) {
		return usagef("%s: %v", command, err)
	}
	return fmt.Errorf("%s: %v", command, err)
}

func summaryLine(sum batch.Summary, rejects string) string {
	secs := sum.Elapsed.Seconds()
	var b strings.Builder
	fmt.Fprintf(&b, "flowregime: batch: %d rows read, %d written, %d rejected", sum.Read, sum.Written, sum.Rejected)
	if sum.Rejected > 0 && rejects != "" {
		fmt.Fprintf(&b, " (in %s)", rejects)
	}
	if sum.Filtered > 0 {
		fmt.Fprintf(&b, ", %d unflagged left out", sum.Filtered)
	}
	if sum.Blank > 0 {
		fmt.Fprintf(&b, ", %d blank lines skipped", sum.Blank)
	}
	fmt.Fprintf(&b, ", %.3g s", secs)
	if secs > 0 && sum.Read > 0 {
		fmt.Fprintf(&b, " (%.3g rows/s)", float64(sum.Read)/secs)
	}
	if len(sum.Flags) > 0 {
		keys := make([]string, 0, len(sum.Flags))
		for k := range sum.Flags {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		b.WriteString("; flags:")
		for i, k := range keys {
			if i > 0 {
				b.WriteString(",")
			}
			fmt.Fprintf(&b, " %s %d", k, sum.Flags[k])
		}
	}
	return b.String()
}

// assumedLines name, one line each, the defaults and assumptions that
// changed results, with the number of rows each changed; the "assumed"
// column marks the rows.
func assumedLines(counts map[string]int) []string {
	codes := make([]string, 0, len(counts))
	for c := range counts {
		codes = append(codes, c)
	}
	sort.Strings(codes)
	lines := make([]string, 0, len(codes))
	for _, c := range codes {
		rows := "rows"
		if counts[c] == 1 {
			rows = "row"
		}
		lines = append(lines, fmt.Sprintf("flowregime: batch: assumed %s in %d %s: %s", c, counts[c], rows, batch.AssumedMeaning[c]))
	}
	return lines
}
