// Package cli holds the flowregime commands. Each command parses and checks
// its flags into options, calls the regime and media packages, and hands
// the results to the report package; no formulas live here.
package cli

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"
)

// Streams are the command's input and outputs.
type Streams struct {
	In  io.Reader
	Out io.Writer
	Err io.Writer
}

// Exit codes.
const (
	ExitOK       = 0
	ExitFailure  = 1 // the computation could not be done (impossible condition, …)
	ExitUsage    = 2 // bad flags or arguments
	ExitRejected = 3 // a batch finished but rejected some rows
)

// usageError marks a mistake in flags or arguments.
type usageError struct{ err error }

func (u usageError) Error() string { return u.err.Error() }
func (u usageError) Unwrap() error { return u.err }

func usagef(format string, args ...any) error { return usageError{fmt.Errorf(format, args...)} }

// exitError carries a chosen exit code with an optional message.
type exitError struct {
	code int
	msg  string
}

func (e exitError) Error() string { return e.msg }

const estimateNotice = `All figures are estimates from published laws and correlations, for
research and screening. They are not a design basis for structures that
animals must pass (fish passes, culverts, screens, turbines): defer to local
regulations and licensed engineering practice for those.`

// NewRoot builds a fresh command tree.
func NewRoot(s Streams) *cobra.Command {
	root := &cobra.Command{
		Use:   "flowregime",
		Short: "Reynolds and Strouhal numbers, flow regime, drag and power of organisms in air and water",
		Long: `flowregime tells you which flow regime an organism lives in, in the fluid it
really lives in, and what drag and power follow from the law that fits.

` + estimateNotice,
		SilenceErrors: true,
		SilenceUsage:  true,
	}
	root.SetIn(s.In)
	root.SetOut(s.Out)
	root.SetErr(s.Err)
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return usageError{fmt.Errorf("%v (see 'flowregime %s --help')", err, c.Name())}
	})
	root.AddCommand(newMediumCmd(s), newCalcCmd(s), newSettleCmd(s), newLawsCmd(s), newBatchCmd(s), newTabulateCmd(s), newDemoCmd(s), newFitCmd(s), newSweepCmd(s), newPowerCurveCmd(s), newReduceCmd(s))
	return root
}

// Main runs the command line and returns the process exit code. Errors are
// one line on stderr, prefixed with "flowregime: ".
func Main(args []string, s Streams) int {
	root := NewRoot(s)
	root.SetArgs(args)
	err := root.Execute()
	if err == nil {
		return ExitOK
	}
	var ee exitError
	if errors.As(err, &ee) {
		if ee.msg != "" {
			fmt.Fprintf(s.Err, "flowregime: %s\n", ee.msg)
		}
		return ee.code
	}
	msg := strings.ReplaceAll(err.Error(), "\n", " ")
	fmt.Fprintf(s.Err, "flowregime: %s\n", msg)
	var ue usageError
	if errors.As(err, &ue) || strings.HasPrefix(msg, "unknown command") || strings.HasPrefix(msg, "unknown flag") {
		return ExitUsage
	}
	return ExitFailure
}
