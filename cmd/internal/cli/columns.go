package cli

import (
	"fmt"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"io"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/spf13/cobra"
)

const columnsHelp = `List the quantities batch and tabulate read from a table's columns, with
the header spellings each accepts and its units.

A header is matched ignoring case, spacing and punctuation
("Tail/wingbeat freq", "tail_wingbeat_freq" and "TailWingbeatFreq" are one
name), with its unit in brackets or after the name: "length (mm)",
"length [mm]", "length_mm", "length mm", "temp (°C)", "temp degC". A
header that is itself a salinity unit ("PSU", "ppt", "‰") is a salinity.
A stroke amplitude in a length unit is the tail or fin amplitude; in an
angle unit, the stroke angle. A column that reads like a measurement but
matches nothing is refused at the header: map it with --column or leave
it out with --ignore.`

func newColumnsCmd(s Streams) *cobra.Command {
	return &cobra.Command{
		Use:   "columns",
		Short: "List the quantities a table's columns can hold, their header spellings and units",
		Long:  columnsHelp,
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return writeColumns(s.Out)
		},
	}
}

// writeColumns lists every input field: its name, flag, units and
// spellings, and the missing-value texts.
func writeColumns(w io.Writer) error {
	line := func(indent, text string) { report.Paragraph(w, indent, text) }
	for _, f := range inputs.Fields {
		line("", fmt.Sprintf("%s (flag --%s)", f.Name, f.Flag))
		switch {
		case f.Text:
			line("    ", "  a word")
		default:
			units := quantity.Units(f.Kind)
			if _, bare := quantity.Resolve(f.Kind, ""); bare {
				units = append([]string{"a bare number"}, units...)
			}
			if len(units) > 0 {
				line("    ", "  units: "+strings.Join(units, ", "))
			}
		}
		if len(f.Aliases) > 0 {
			line("    ", "  also written: "+strings.Join(f.Aliases, ", "))
		}
	}
	line("", "salinity is also read from a header that is its unit: psu, ppt, ‰")
	line("", `uncertainty: a column named after a quantity with "sd" ("length sd", "length (mm) sd")`)
	line("", "missing values (--missing): a blank cell, "+strings.Join(inputs.DefaultMissing, " "))
	return nil
}
