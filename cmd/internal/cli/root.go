// Package cli holds the flowregime commands. Each command parses and checks
// its flags into options, calls the regime and media packages, and hands
// the results to the report package; no formulas live here.
package cli

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/signal"
	"strings"
	"syscall"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/spf13/cobra"
)

// Exit codes.
const (
	ExitOK       = 0
	ExitFailure  = 1 // the computation could not be done (impossible condition, …), or reading or writing failed
	ExitUsage    = 2 // bad flags or arguments, a table's header, an output that is an input or a folder
	ExitRejected = 3 // a batch or tabulate finished but rejected some rows

	// A run stopped by a signal exits with 128 + the signal's number.
	ExitHangup    = 128 + 1  // SIGHUP
	ExitInterrupt = 128 + 2  // SIGINT (Ctrl-C)
	ExitTerminate = 128 + 15 // SIGTERM
)

// signalNames name the stop signals in messages.
var signalNames = map[int]string{ExitHangup - 128: "SIGHUP", ExitInterrupt - 128: "SIGINT", ExitTerminate - 128: "SIGTERM"}

// signalsReady is called once Main handles the stop signals; the tests
// that send signals to a real process wait for it.
var signalsReady = func() {}

// stopSignals stop every command.
var stopSignals = []os.Signal{syscall.SIGINT, syscall.SIGTERM, syscall.SIGHUP}

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
		Version:       BuildInfo().String(),
	}
	root.SetVersionTemplate("{{.Version}}")
	root.SetIn(s.In)
	root.SetOut(s.Out)
	root.SetErr(s.Err)
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return usageError{fmt.Errorf("%v (see 'flowregime %s --help')", err, c.Name())}
	})
	bindWidth(root, s)
	root.AddCommand(newMediumCmd(s, nil), newCalcCmd(s, nil), newScaleModelCmd(s, nil), newSettleCmd(s, nil), newLawsCmd(s), newBatchCmd(s, nil), newTabulateCmd(s, nil), newDemoCmd(s), newFitCmd(s, nil), newSweepCmd(s, nil), newPowerCurveCmd(s, nil), newReduceCmd(s))
	root.AddCommand(newPlotCmd(s))
	root.AddCommand(newColumnsCmd(s))
	root.AddCommand(newReportCmd(s))
	return root
}

// Main runs the command line and returns the process exit code. Errors are
// one line on stderr, prefixed with "flowregime: ", control characters escaped. A write error on the
// standard output fails the run (exit 1) whatever the command. SIGINT,
// SIGTERM and SIGHUP stop it at once, even while it waits for input: its
// temporary files are removed, no output is renamed into place, and the
// code is 128 + the signal's number.
func Main(args []string, s Streams) int {
	stop := make(chan os.Signal, 1)
	signal.Notify(stop, stopSignals...)
	defer signal.Stop(stop)
	signalsReady()
	// With SIGPIPE notified, a write to a closed pipe fails with EPIPE, which
	// is reported like any write error, instead of killing the process
	// before the temporary files are removed.
	pipe := make(chan os.Signal, 1)
	signal.Notify(pipe, syscall.SIGPIPE)
	defer signal.Stop(pipe)

	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	out := &checkedWriter{w: s.Out}
	s.Out, s.outs, s.args = out, newOutputSet(), args
	done := make(chan int, 1)
	go func() {
		defer func() {
			// A panic is a bug, never the input's fault: remove the
			// temporary files and say so in one line instead of crashing.
			if r := recover(); r != nil {
				fmt.Fprintf(s.Err, "flowregime: internal error (%s); %s; please report it with the command and input that caused it\n", report.Printable(fmt.Sprint(r)), stoppedOutputs(s.outs.stop(), "error"))
				done <- ExitFailure
			}
		}()
		done <- execute(ctx, args, s, out)
	}()
	select {
	case code := <-done:
		return code
	case sig := <-stop:
		cancel()
		n := int(sig.(syscall.Signal))
		fmt.Fprintf(s.Err, "flowregime: stopped by %s (signal %d); %s\n", signalNames[n], n, stoppedOutputs(s.outs.stop(), "signal"))
		return 128 + n
	}
}

// execute runs the command tree and turns its error into a message and an
// exit code.
func execute(ctx context.Context, args []string, s Streams, out *checkedWriter) int {
	return executeRoot(ctx, NewRoot(s), args, s, out)
}

// executeRoot is [execute] with a command tree already built (tests swap a
// command for one that only captures its options).
func executeRoot(ctx context.Context, root *cobra.Command, args []string, s Streams, out *checkedWriter) int {
	root.SetArgs(args)
	err := root.ExecuteContext(ctx)
	if werr := out.failed(); werr != nil {
		fmt.Fprintf(s.Err, "flowregime: cannot write the output: %v\n", werr)
		return ExitFailure
	}
	if err == nil {
		return ExitOK
	}
	var ee exitError
	if errors.As(err, &ee) {
		if ee.msg != "" {
			fmt.Fprintf(s.Err, "flowregime: %s\n", report.Printable(ee.msg))
		}
		return ee.code
	}
	msg := strings.ReplaceAll(err.Error(), "\n", " ")
	fmt.Fprintf(s.Err, "flowregime: %s\n", report.Printable(msg))
	var ue usageError
	if errors.As(err, &ue) || strings.HasPrefix(msg, "unknown command") || strings.HasPrefix(msg, "unknown flag") {
		return ExitUsage
	}
	return ExitFailure
}

// stoppedOutputs says what a stopped run left of its output files.
func stoppedOutputs(renamed []string, cause string) string {
	if len(renamed) == 0 {
		return "no output file was replaced"
	}
	return "already written before the " + cause + ": " + strings.Join(renamed, ", ")
}
