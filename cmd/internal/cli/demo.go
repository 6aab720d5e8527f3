package cli

import (
	"bytes"
	"context"
	"encoding/csv"
	"fmt"
	"io"
	"sort"
	"strconv"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/demo"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/cmd/internal/tabulate"
	"github.com/flowregime/flowregime/media"
	"github.com/spf13/cobra"
)

func newDemoCmd(s Streams) *cobra.Command {
	var data bool
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run batch and tabulate on the built-in demo survey (invented data)",
		Long: `Run the main job on the embedded demo survey: ` + demo.Name + `.
--data prints the survey itself, to try batch and tabulate on.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if data {
				_, err := s.Out.Write(demo.Survey)
				return err
			}
			return runDemo(s)
		},
	}
	cmd.Flags().BoolVar(&data, "data", false, "print the demo survey as CSV and stop")
	return cmd
}

func runDemo(s Streams) error {
	ctx := context.Background()
	cfg := batch.Config{InFormat: batch.CSV, OutFormat: batch.CSV, DefaultMedium: media.KindFreshWater, Constants: inputs.Flags{}}
	var out bytes.Buffer
	rejected := 0
	sum, err := batch.Run(ctx, bytes.NewReader(demo.Survey), &out, func(batch.Reject) error { rejected++; return nil }, cfg)
	if err != nil {
		return fmt.Errorf("demo: %v", err)
	}
	w := s.Out
	report.Paragraph(w, "", fmt.Sprintf("Demo survey: %s.", demo.Name))
	fmt.Fprintf(w, "%d rows read, %d computed, %d rejected.\n\n", sum.Read, sum.Written, rejected)

	recs, err := csv.NewReader(bytes.NewReader(out.Bytes())).ReadAll()
	if err != nil {
		return fmt.Errorf("demo: %v", err)
	}
	rowsIter := func(rs [][]string) func() ([]string, error) {
		i := 0
		return func() ([]string, error) {
			if i >= len(rs) {
				return nil, io.EOF
			}
			i++
			return rs[i-1], nil
		}
	}
	byTaxon, err := tabulate.Tabulate(recs[0], rowsIter(recs[1:]), tabulate.Spec{By: []string{"taxon"}})
	if err != nil {
		return fmt.Errorf("demo: %v", err)
	}
	report.Paragraph(w, "", "Per taxon (flowregime tabulate --by taxon):")
	if err := writeSummaryTable(w, byTaxon); err != nil {
		return err
	}

	all, err := tabulate.Tabulate(recs[0], rowsIter(recs[1:]), tabulate.Spec{Fits: []tabulate.Pair{{Y: "reynolds", X: "length"}, {Y: "power_W", X: "mass"}}})
	if err != nil {
		return fmt.Errorf("demo: %v", err)
	}
	fmt.Fprintln(w, "\nAcross the whole survey:")
	writeScalingLaws(w, all, nil)

	col := map[string]int{}
	for i, h := range recs[0] {
		col[h] = i
	}
	var flagged [][]string
	for _, r := range recs[1:] {
		f := r[col["flags"]]
		if strings.Contains(f, "inconsistent-inputs") || strings.Contains(f, "strouhal-outside-animals") || strings.Contains(f, "speed-beyond-known") {
			flagged = append(flagged, []string{r[col["date"]], r[col["site"]], r[col["taxon"]], threeDigits(r[col["reynolds"]]), threeDigits(r[col["strouhal"]]), f})
		}
	}
	fmt.Fprintln(w)
	report.Paragraph(w, "", "Rows whose measurements look wrong (flowregime batch --flagged-only shows all flags):")
	if err := report.Table(w, []string{"date", "site", "taxon", "Re", "St", "flags"}, flagged); err != nil {
		return err
	}
	keys := make([]string, 0, len(sum.Flags))
	for k := range sum.Flags {
		keys = append(keys, fmt.Sprintf("%s %d", k, sum.Flags[k]))
	}
	sort.Strings(keys)
	report.Paragraph(w, "", fmt.Sprintf("Flags over the survey: %s.", strings.Join(keys, ", ")))
	if len(sum.Assumed) > 0 {
		fmt.Fprintln(w, "Defaults used (the assumed column marks each row):")
		for _, l := range assumedLines(sum.Assumed) {
			report.Paragraph(w, "    ", "  "+strings.TrimPrefix(l, "flowregime: batch: assumed "))
		}
	}
	fmt.Fprintln(w, `
Next:
  flowregime demo --data > survey.csv
  flowregime batch survey.csv -o results.csv --rejects rejects.csv
  flowregime tabulate survey.csv --by taxon,site --fit power_W=mass
  flowregime calc --help`)
	return nil
}

// threeDigits shows a batch output number at the 3 significant digits of
// the summaries above it.
func threeDigits(cell string) string {
	v, err := strconv.ParseFloat(cell, 64)
	if err != nil {
		return cell
	}
	return report.Num(v, 3)
}
