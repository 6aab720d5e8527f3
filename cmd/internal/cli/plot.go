package cli

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"os"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/demo"
	"github.com/flowregime/flowregime/cmd/internal/figure"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/media"
	"github.com/spf13/cobra"
)

// figureOutput is the -o flag every plot kind shares.
type figureOutput struct {
	out string
}

func (f *figureOutput) bind(cmd *cobra.Command) {
	cmd.Flags().StringVarP(&f.out, "output", "o", "", "figure file: .svg, .png or .pdf (required)")
}

// format checks the output name and returns the figure format.
func (f *figureOutput) figureFormat() (string, error) {
	if f.out == "" {
		return "", usagef("-o: name the figure file (.svg, .png or .pdf)")
	}
	format, err := figure.FormatFor(f.out)
	if err != nil {
		return "", usageError{err}
	}
	return format, nil
}

func newPlotCmd(s Streams) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "plot KIND ... -o FILE.svg|png|pdf",
		Short: "Draw a figure: regime map, drag curves, power curve, flow curve, sweep or scaling fit",
		Long: `Draw a figure at a journal's column width (8.5 cm), in colours that
readers with colour blindness tell apart. The file's extension (.svg, .png,
.pdf) sets the format. Data that cannot be drawn (a value at or below zero
on a logarithmic axis, an empty cell) is left out, and a note on the
standard error says how many and why.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return usagef("plot: name a kind (%s)", "regime, drag, power, flow, sweep, scaling")
		},
	}
	cmd.AddCommand(newPlotRegimeCmd(s))
	cmd.AddCommand(plotKinds(s)...)
	return cmd
}

// writeFigure checks that the output damages no input, writes the figure
// atomically and prints its notes on the standard error.
func writeFigure(s Streams, fig *figure.Figure, o figureOutput, format string, ins []namedFile) error {
	if err := checkOutputs(ins, []namedFile{{what: "-o " + o.out, path: o.out}}); err != nil {
		return usageError{err}
	}
	af, err := s.outs.create(o.out)
	if err != nil {
		return usagef("cannot write %s: %v", o.out, withoutPath(err))
	}
	defer af.abort()
	if err := fig.Encode(af, format); err != nil {
		return fmt.Errorf("cannot write %s: %v", o.out, withoutPath(err))
	}
	if err := af.commit(); err != nil {
		return fmt.Errorf("cannot write %s: %v", o.out, withoutPath(err))
	}
	for _, n := range fig.Notes {
		fmt.Fprintf(s.Err, "note: %s\n", n)
	}
	return nil
}

type plotRegimeOptions struct {
	figureOutput
	y, by   string
	linearY bool
}

func newPlotRegimeCmd(s Streams) *cobra.Command {
	o := &plotRegimeOptions{}
	cmd := &cobra.Command{
		Use:   "regime [RESULTS.csv] -o FILE.svg",
		Short: "Regime map: each row of a batch output at its Reynolds number",
		Long: `Draw each row of a table written by batch (or, without a table, the demo
survey) at its Reynolds number on a logarithmic axis against a second
quantity (--y: a column name such as length, speed or strouhal), one colour
and marker shape per group (--by, a column). The viscous (Re < 1),
intermediate and inertial (Re ≥ 1000) ranges are shaded and named; with
--y strouhal, so is the efficient cruising band St 0.2–0.4.`,
		Example: `  flowregime batch survey.csv -o results.csv
  flowregime plot regime results.csv --y strouhal --by taxon -o regime.svg
  flowregime plot regime --y length -o demo-regime.png`,
		Args: cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			format, err := o.figureFormat()
			if err != nil {
				return err
			}
			return runPlotRegime(o, args, format, cmd.Flags().Changed("by"), s)
		},
	}
	cmd.Flags().StringVar(&o.y, "y", "length", "column on the second axis (length, speed, strouhal or any numeric column)")
	cmd.Flags().StringVar(&o.by, "by", "taxon", "column whose values are told apart by colour and marker (\"\" for none)")
	cmd.Flags().BoolVar(&o.linearY, "linear-y", false, "a linear second axis (default logarithmic)")
	o.bind(cmd)
	return cmd
}

func runPlotRegime(o *plotRegimeOptions, args []string, format string, byGiven bool, s Streams) error {
	var ins []namedFile
	var table *figure.Table
	var err error
	if len(args) == 1 {
		table, ins, err = readFigureTable(args[0], s)
	} else {
		table, err = demoResults()
	}
	if err != nil {
		return err
	}
	var byNote string
	if _, err := table.Column(o.by); err != nil && !byGiven && o.by != "" {
		byNote, o.by = fmt.Sprintf("no %s column: all rows drawn alike (--by names a column)", o.by), ""
	}
	pts, ro, err := figure.RegimeRows(table, o.y, o.by)
	if err != nil {
		return usageError{err}
	}
	ro.LinearY = o.linearY
	fig, err := figure.RegimeMapFigure(pts, ro)
	if err != nil {
		return err
	}
	if byNote != "" {
		fig.Notes = append([]string{byNote}, fig.Notes...)
	}
	if len(args) == 0 {
		fig.Notes = append([]string{"no table given: drawing the demo survey (" + demo.Name + ")"}, fig.Notes...)
	}
	return writeFigure(s, fig, o.figureOutput, format, ins)
}

// readFigureTable reads a table named on the command line ("-" for the
// standard input) and returns it with the input to protect.
func readFigureTable(name string, s Streams) (*figure.Table, []namedFile, error) {
	if name == "-" {
		t, err := figure.ReadTable(s.In)
		if err != nil {
			return nil, nil, usagef("standard input: %v", err)
		}
		return t, []namedFile{{what: "the standard input", file: stdFile(s.In)}}, nil
	}
	f, err := os.Open(name)
	if err != nil {
		return nil, nil, fmt.Errorf("cannot read %s: %v", name, withoutPath(err))
	}
	defer f.Close()
	t, err := figure.ReadTable(f)
	if err != nil {
		return nil, nil, usagef("%s: %v", name, err)
	}
	return t, []namedFile{{what: "the input " + name, path: name}}, nil
}

// demoResults runs batch on the embedded demo survey, as demo does.
func demoResults() (*figure.Table, error) {
	cfg := batch.Config{InFormat: batch.CSV, OutFormat: batch.CSV, DefaultMedium: media.KindFreshWater, Constants: inputs.Flags{}}
	var out bytes.Buffer
	if _, err := batch.Run(context.Background(), bytes.NewReader(demo.Survey), &out, func(batch.Reject) error { return nil }, cfg); err != nil {
		return nil, fmt.Errorf("demo: %v", err)
	}
	return figure.ReadTable(io.Reader(&out))
}
