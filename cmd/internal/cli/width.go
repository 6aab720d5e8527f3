package cli

import (
	"os"
	"strconv"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/spf13/cobra"
)

// bindWidth adds --width to every command and, before a command runs,
// tells the standard output how wide its tables may be: --width, else
// the COLUMNS environment variable, else the terminal's width when the
// standard output is a terminal, else no limit (a file or a pipe gets the
// full table). CSV and JSON are never affected.
func bindWidth(root *cobra.Command, s Streams) {
	var width int
	root.PersistentFlags().IntVar(&width, "width", 0, "fit tables to this many columns (default: COLUMNS, else the terminal's width; 0 with neither: no limit)")
	root.PersistentPreRunE = func(cmd *cobra.Command, args []string) error {
		out, ok := s.Out.(*checkedWriter)
		if !ok {
			return nil
		}
		if cmd.Flags().Changed("width") {
			if width != 0 && width < report.MinColumns {
				return usagef("--width %d: give at least %d columns, or 0 for no limit", width, report.MinColumns)
			}
			out.columns = width
			return nil
		}
		out.columns = terminalColumns(s)
		return nil
	}
}

// terminalColumns is COLUMNS when it holds a usable width, else the width
// of the standard output's terminal, else 0.
func terminalColumns(s Streams) int {
	if c, err := strconv.Atoi(strings.TrimSpace(os.Getenv("COLUMNS"))); err == nil && c >= report.MinColumns {
		return c
	}
	if c := s.TerminalWidth(); c >= report.MinColumns {
		return c
	}
	return 0
}

// Columns is the width tables written to the standard output are fitted
// to (report.Sized); 0 means no limit.
func (c *checkedWriter) Columns() int { return c.columns }
