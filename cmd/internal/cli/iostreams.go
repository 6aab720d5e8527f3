package cli

import (
	"bytes"
	"io"
	"os"

	"golang.org/x/term"
)

// Streams are the command's input and outputs, and what is known of the
// terminal behind them. System gives the process's own; Test gives buffers
// that a test may declare terminals. A Streams literal asks the operating
// system about the streams that are files.
type Streams struct {
	In  io.Reader
	Out io.Writer
	Err io.Writer

	tty  *ttyState  // set by SetStdoutTTY and SetStderrTTY; nil: ask the operating system
	outs *outputSet // the run's temporary files; set by Main
	args []string   // the command line after the program's name; set by Main
}

// ttyState is what a test declared of the terminal.
type ttyState struct {
	stdout, stderr bool
	width          int // columns of the standard output's terminal
}

// System returns the process's standard input, output and error.
func System() Streams { return Streams{In: os.Stdin, Out: os.Stdout, Err: os.Stderr} }

// Test returns streams over fresh buffers, which are not terminals until
// SetStdoutTTY or SetStderrTTY says so, and the buffers.
func Test() (s Streams, in, out, errOut *bytes.Buffer) {
	in, out, errOut = &bytes.Buffer{}, &bytes.Buffer{}, &bytes.Buffer{}
	return Streams{In: in, Out: out, Err: errOut, tty: &ttyState{}}, in, out, errOut
}

// SetStdoutTTY declares the standard output a terminal of width columns
// (tty true) or a pipe or file (tty false).
func (s *Streams) SetStdoutTTY(tty bool, width int) {
	s.declared().stdout, s.tty.width = tty, width
}

// SetStderrTTY declares the standard error a terminal or not.
func (s *Streams) SetStderrTTY(tty bool) { s.declared().stderr = tty }

func (s *Streams) declared() *ttyState {
	if s.tty == nil {
		t := ttyState{stdout: s.IsStdoutTTY(), stderr: s.IsStderrTTY(), width: s.TerminalWidth()}
		s.tty = &t
	}
	return s.tty
}

// IsStdoutTTY reports whether the standard output is a terminal.
func (s Streams) IsStdoutTTY() bool {
	if s.tty != nil {
		return s.tty.stdout
	}
	return isTerminal(s.Out)
}

// IsStderrTTY reports whether the standard error is a terminal.
func (s Streams) IsStderrTTY() bool {
	if s.tty != nil {
		return s.tty.stderr
	}
	return isTerminal(s.Err)
}

// TerminalWidth is the width in columns of the standard output's terminal,
// or 0 when it is not a terminal or its width is unknown.
func (s Streams) TerminalWidth() int {
	if s.tty != nil {
		if !s.tty.stdout {
			return 0
		}
		return s.tty.width
	}
	if f := stdFile(s.Out); f != nil && term.IsTerminal(int(f.Fd())) {
		if c, _, err := term.GetSize(int(f.Fd())); err == nil {
			return c
		}
	}
	return 0
}

// isTerminal reports whether a stream is a file that is a terminal.
func isTerminal(w any) bool {
	f := stdFile(w)
	return f != nil && term.IsTerminal(int(f.Fd()))
}
