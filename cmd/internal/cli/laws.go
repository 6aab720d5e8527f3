package cli

import (
	"fmt"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
)

func newLawsCmd(s Streams) *cobra.Command {
	var format string
	cmd := &cobra.Command{
		Use:   "laws",
		Short: "List every drag law with its shape, source, Reynolds basis, reference area and published range",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := report.CheckFormat(format); err != nil {
				return usageError{err}
			}
			headers := []string{"shape", "law", "Re on", "published range", "chosen when", "C_D on", "source"}
			var rows [][]string
			type lawJSON struct {
				Shape, Law, Basis, Range, Chosen, Area, Source string
			}
			var js []lawJSON
			for _, l := range regime.Laws() {
				chosen := "listed only"
				if l.ChooseHi > 0 {
					chosen = fmt.Sprintf("%g < Re ≤ %s", l.ChooseLo, hi(l.ChooseHi))
				}
				rows = append(rows, []string{string(l.Shape), l.Name, l.Basis, l.Range(), chosen, l.AreaName, l.Source})
				js = append(js, lawJSON{string(l.Shape), l.Name, l.Basis, l.Range(), chosen, l.AreaName, l.Source})
			}
			switch format {
			case report.FormatJSON:
				return report.JSON(s.Out, js)
			case report.FormatCSV:
				return report.CSV(s.Out, headers, rows)
			}
			if err := report.Table(s.Out, headers, rows); err != nil {
				return err
			}
			report.Paragraph(s.Out, "", `"chosen when" is in Re on the diameter for spheres and cylinders, on the length otherwise.`)
			return nil
		},
	}
	cmd.Flags().StringVar(&format, "format", report.FormatTable, "output: table, json or csv")
	return cmd
}

func hi(v float64) string {
	if v >= 1e300 {
		return "∞"
	}
	return fmt.Sprintf("%g", v)
}
