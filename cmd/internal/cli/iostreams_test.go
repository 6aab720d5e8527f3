package cli

import (
	"strings"
	"testing"
)

// TestTerminalWidthFromStreams: a standard output declared a terminal of 80
// columns gets the table --width 80 gives, a pipe the whole table
// --width 0 gives, without a real terminal and with COLUMNS unset.
func TestTerminalWidthFromStreams(t *testing.T) {
	t.Setenv("COLUMNS", "")
	output := func(tty bool, args ...string) string {
		s, _, out, errb := Test()
		s.SetStdoutTTY(tty, 80)
		if code := Main(args, s); code != ExitOK {
			t.Fatalf("%v: exit %d, %s", args, code, errb)
		}
		return out.String()
	}
	narrow, whole := output(false, "laws", "--width", "80"), output(false, "laws", "--width", "0")
	if narrow == whole {
		t.Fatal("laws is no wider than 80 columns; the test needs a wider table")
	}
	if got := output(true, "laws"); got != narrow {
		t.Errorf("terminal of 80 columns: output differs from --width 80")
	}
	if got := output(false, "laws"); got != whole {
		t.Errorf("pipe: output differs from --width 0")
	}
	// COLUMNS still comes before the terminal's width.
	t.Setenv("COLUMNS", "200")
	if got := output(true, "laws"); got != output(false, "laws", "--width", "200") {
		t.Errorf("COLUMNS=200 on a terminal of 80: output differs from --width 200")
	}
}

// TestProgressBarOnlyOnATerminal: batch draws its progress bar on a
// standard error that is a terminal, and never on a pipe or with -q.
func TestProgressBarOnlyOnATerminal(t *testing.T) {
	stderr := func(tty bool, args ...string) string {
		s, in, _, errb := Test()
		in.WriteString("length,speed\n12mm,0.1m/s\n")
		s.SetStderrTTY(tty)
		if code := Main(append([]string{"batch", "-"}, args...), s); code != ExitOK {
			t.Fatalf("exit %d, %s", code, errb)
		}
		return errb.String()
	}
	if got := stderr(true); !strings.Contains(got, "\r") {
		t.Errorf("terminal: no progress bar drawn (no carriage return) in %q", got)
	}
	if got := stderr(false); strings.Contains(got, "\r") {
		t.Errorf("pipe: progress bar drawn: %q", got)
	}
	if got := stderr(true, "-q"); got != "" {
		t.Errorf("terminal with -q: stderr %q, want nothing", got)
	}
}

// TestSystemStreamsAskTheSystem: streams that are not files are never
// terminals, and a literal's answer does not change once declared.
func TestSystemStreamsAskTheSystem(t *testing.T) {
	var b strings.Builder
	s := Streams{Out: &b, Err: &b}
	if s.IsStdoutTTY() || s.IsStderrTTY() || s.TerminalWidth() != 0 {
		t.Errorf("a strings.Builder is taken for a terminal")
	}
	s.SetStdoutTTY(true, 132)
	if !s.IsStdoutTTY() || s.TerminalWidth() != 132 || s.IsStderrTTY() {
		t.Errorf("declared stdout terminal of 132: got tty %v width %d, stderr tty %v", s.IsStdoutTTY(), s.TerminalWidth(), s.IsStderrTTY())
	}
}
