//go:build unix

package cli

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestMain lets the tests run the command line as a real process: the test
// binary, started again with FLOWREGIME_AS_MAIN=1, is flowregime.
func TestMain(m *testing.M) {
	if os.Getenv("FLOWREGIME_AS_MAIN") == "1" {
		if os.Getenv("FLOWREGIME_READY_FD") == "3" {
			signalsReady = func() {
				ready := os.NewFile(3, "ready")
				ready.Write([]byte{1})
				ready.Close()
			}
		}
		os.Exit(Main(os.Args[1:], Streams{In: os.Stdin, Out: os.Stdout, Err: os.Stderr}))
	}
	os.Exit(m.Run())
}

// command returns flowregime as a process with the given arguments.
func command(args ...string) *exec.Cmd {
	c := exec.Command(os.Args[0], args...)
	c.Env = append(os.Environ(), "FLOWREGIME_AS_MAIN=1")
	return c
}

// startReady starts c and returns once it handles the stop signals.
func startReady(t *testing.T, c *exec.Cmd) {
	t.Helper()
	r, w, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	defer r.Close()
	c.ExtraFiles = []*os.File{w}
	c.Env = append(c.Env, "FLOWREGIME_READY_FD=3")
	err = c.Start()
	w.Close()
	if err != nil {
		t.Fatal(err)
	}
	r.SetReadDeadline(time.Now().Add(10 * time.Second))
	if _, err := r.Read(make([]byte, 1)); err != nil {
		c.Process.Kill()
		t.Fatalf("the process did not get ready: %v", err)
	}
}

// exitCode waits for c and returns its exit code, failing if it was killed
// by a signal instead of exiting.
func exitCode(t *testing.T, c *exec.Cmd) int {
	t.Helper()
	err := c.Wait()
	var ee *exec.ExitError
	if err != nil && !errors.As(err, &ee) {
		t.Fatal(err)
	}
	if st, ok := c.ProcessState.Sys().(syscall.WaitStatus); ok && st.Signaled() {
		t.Fatalf("killed by %v instead of exiting", st.Signal())
	}
	return c.ProcessState.ExitCode()
}

// waitFor polls until ok holds, for at most 10 s (a loaded 2-core machine).
func waitFor(t *testing.T, what string, ok func() bool) {
	t.Helper()
	for end := time.Now().Add(10 * time.Second); time.Now().Before(end); time.Sleep(10 * time.Millisecond) {
		if ok() {
			return
		}
	}
	t.Fatalf("timed out waiting for %s", what)
}

func temps(dir string) []string {
	m, _ := filepath.Glob(filepath.Join(dir, ".*.tmp"))
	return m
}

// SIGINT, SIGTERM and SIGHUP stop batch while its input pipe sends
// nothing: exit 128 + the signal's number (the POSIX shell convention;
// SIGHUP 1, SIGINT 2, SIGTERM 15 on Linux, signal(7)), within 2 s, with no
// temporary file left and the previous output as it was. Before, SIGINT and
// SIGTERM were swallowed until the input sent something, and SIGHUP left
// the temporary files.
func TestSignalsStopAnIdleBatch(t *testing.T) {
	for _, c := range []struct {
		sig  syscall.Signal
		code int
	}{{syscall.SIGINT, ExitInterrupt}, {syscall.SIGTERM, ExitTerminate}, {syscall.SIGHUP, ExitHangup}} {
		t.Run(c.sig.String(), func(t *testing.T) {
			dir := t.TempDir()
			out, rej := filepath.Join(dir, "out.csv"), filepath.Join(dir, "rej.csv")
			os.WriteFile(out, []byte("previous output\n"), 0o644)
			pr, pw, err := os.Pipe()
			if err != nil {
				t.Fatal(err)
			}
			defer pw.Close()
			var errb bytes.Buffer
			p := command("batch", "-", "-o", out, "--rejects", rej, "--quiet")
			p.Stdin, p.Stderr = pr, &errb
			startReady(t, p)
			pr.Close()
			pw.Write([]byte("length (mm),speed (cm/s)\n12,")) // a header and half a row, then nothing
			waitFor(t, "the temporary files", func() bool { return len(temps(dir)) == 2 })
			sent := time.Now()
			p.Process.Signal(c.sig)
			code := exitCode(t, p)
			if took := time.Since(sent); took > 2*time.Second {
				t.Errorf("took %v to stop", took)
			}
			if code != c.code {
				t.Errorf("exit %d, want %d; stderr %q", code, c.code, errb.String())
			}
			if left := temps(dir); len(left) != 0 {
				t.Errorf("temporary files left: %v", left)
			}
			if got, _ := os.ReadFile(out); string(got) != "previous output\n" {
				t.Errorf("previous output changed to %q", got)
			}
			if _, err := os.Stat(rej); err == nil {
				t.Errorf("a rejects file was made")
			}
			if want := fmt.Sprintf("flowregime: stopped by %s (signal %d); no output file was replaced\n", signalNames[int(c.sig)], c.sig); errb.String() != want {
				t.Errorf("stderr %q, want %q", errb.String(), want)
			}
		})
	}
}

// SIGINT stops tabulate and fit on an idle pipe, and batch while it waits
// for a named pipe to open: every command runs under the same Main.
func TestSignalStopsOtherReaders(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "in.csv")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip(err)
	}
	for _, args := range [][]string{{"tabulate", "-"}, {"fit", "-"}, {"batch", fifo, "-o", filepath.Join(dir, "out.csv")}} {
		pr, pw, err := os.Pipe()
		if err != nil {
			t.Fatal(err)
		}
		var errb bytes.Buffer
		p := command(args...)
		p.Stdin, p.Stderr = pr, &errb
		startReady(t, p)
		pr.Close()
		// Nothing shows that the command waits in its read or open; a
		// signal sent before that is handled all the same.
		time.Sleep(200 * time.Millisecond)
		sent := time.Now()
		p.Process.Signal(syscall.SIGINT)
		code := exitCode(t, p)
		pw.Close()
		if code != ExitInterrupt || time.Since(sent) > 2*time.Second {
			t.Errorf("%v: exit %d after %v; stderr %q", args, code, time.Since(sent), errb.String())
		}
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 1 {
		t.Errorf("files left: %v", entries)
	}
}

// A medium file that is a FIFO is refused at once (exit 1) instead of
// waiting forever for a writer.
func TestMediumFIFOIsRefused(t *testing.T) {
	fifo := filepath.Join(t.TempDir(), "m.json")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip(err)
	}
	var errb bytes.Buffer
	p := command("calc", "--length", "1cm", "--speed", "1cm/s", "--medium", fifo)
	p.Stderr = &errb
	start := time.Now()
	if err := p.Start(); err != nil {
		t.Fatal(err)
	}
	done := make(chan struct{})
	go func() { p.Wait(); close(done) }()
	select {
	case <-done:
		if code := p.ProcessState.ExitCode(); code != ExitFailure || !strings.Contains(errb.String(), "is a named pipe (FIFO), not a regular file") {
			t.Errorf("exit %d, stderr %q", code, errb.String())
		}
	case <-time.After(10 * time.Second):
		p.Process.Kill()
		t.Fatalf("still waiting on the FIFO after %v", time.Since(start))
	}
}

// Writing to /dev/full fails with ENOSPC (Linux full(4)); every command and
// format, run as a real process with its standard output there, exits 1
// with one line on stderr.
func TestDevFullEveryCommand(t *testing.T) {
	full, err := os.OpenFile("/dev/full", os.O_WRONLY, 0)
	if err != nil {
		t.Skip("no /dev/full:", err)
	}
	defer full.Close()
	for _, args := range writingRuns(t) {
		var errb bytes.Buffer
		p := command(args...)
		p.Stdout, p.Stderr = full, &errb
		if err := p.Start(); err != nil {
			t.Fatal(err)
		}
		if code := exitCode(t, p); code != ExitFailure || !strings.HasSuffix(errb.String(), "cannot write the output: no space left on device\n") {
			t.Errorf("%v > /dev/full: exit %d, stderr %q", args, code, errb.String())
		}
	}
	// -o, --rejects and --save on /dev/full are written in place and fail.
	dir := t.TempDir()
	for _, args := range [][]string{
		{"batch", "../../../testdata/batch/corrupt.csv", "-q", "-o", "/dev/full"},
		{"batch", "../../../testdata/batch/corrupt.csv", "-q", "-o", filepath.Join(dir, "o.csv"), "--rejects", "/dev/full"},
		{"fit", "../../../testdata/rheology/mud_herschel_bulkley.csv", "--density", "1300kg/m3", "--save", "/dev/full"},
	} {
		out, errs, code := run(t, args...)
		if code != ExitFailure || !strings.Contains(errs, "cannot write /dev/full: no space left on device") {
			t.Errorf("%v: exit %d, stderr %q, stdout %q", args, code, errs, out)
		}
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 0 {
		t.Errorf("files left: %v", entries)
	}
}

// A closed standard output (flowregime batch … | head -1) is a write error,
// exit 1, and removes the temporary rejects file; before, SIGPIPE killed
// the process and left it behind.
func TestClosedStdoutLeavesNoTemporaryFile(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "in.csv")
	var b strings.Builder
	b.WriteString("length (mm),speed (cm/s)\nbad,1\n")
	for range 50000 {
		b.WriteString("12,30\n")
	}
	os.WriteFile(in, []byte(b.String()), 0o644)
	pr, pw, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	pr.Close() // the reader is gone before the first write
	var errb bytes.Buffer
	p := command("batch", in, "--rejects", filepath.Join(dir, "rej.csv"), "--quiet")
	p.Stdout, p.Stderr = pw, &errb
	if err := p.Start(); err != nil {
		t.Fatal(err)
	}
	pw.Close()
	if code := exitCode(t, p); code != ExitFailure || !strings.Contains(errb.String(), "broken pipe") {
		t.Errorf("exit %d, stderr %q", code, errb.String())
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 1 {
		t.Errorf("files left beside the input: %v", entries)
	}
}

// A new output gets 0666 less the umask (open(2) applies the umask to the
// mode of a file it creates); before, it was always 0644.
func TestNewOutputHonoursUmask(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "out.csv")
	p := command("batch", "../../../testdata/batch/corrupt.csv", "-q", "-o", out)
	old := syscall.Umask(0o027) // inherited by the process started next
	err := p.Start()
	syscall.Umask(old)
	if err != nil {
		t.Fatal(err)
	}
	if code := exitCode(t, p); code != ExitRejected {
		t.Fatalf("exit %d", code)
	}
	if st, err := os.Stat(out); err != nil || st.Mode().Perm() != 0o640 {
		t.Errorf("mode %v under umask 027, want 0640 (%v)", st.Mode().Perm(), err)
	}
}

// Run as root, replacing another user's file keeps its owner and group
// (before, the file became root's).
func TestReplacedFileKeepsOwner(t *testing.T) {
	if os.Getuid() != 0 {
		t.Skip("needs root to give a file to another user")
	}
	dir := t.TempDir()
	out := filepath.Join(dir, "out.csv")
	os.WriteFile(out, []byte("previous\n"), 0o640)
	if err := os.Chown(out, 4321, 8765); err != nil {
		t.Skip(err)
	}
	if _, errs, code := run(t, "batch", "../../../testdata/batch/corrupt.csv", "-q", "-o", out); code != ExitRejected {
		t.Fatalf("exit %d: %s", code, errs)
	}
	st, err := os.Stat(out)
	if err != nil {
		t.Fatal(err)
	}
	if s := st.Sys().(*syscall.Stat_t); s.Uid != 4321 || s.Gid != 8765 || st.Mode().Perm() != 0o640 {
		t.Errorf("owner %d:%d mode %v, want 4321:8765 0640", s.Uid, s.Gid, st.Mode().Perm())
	}
}

// -o /dev/stdout writes to the standard output in place, through the links
// /dev/stdout → /proc/self/fd/1 → pipe:[…] (Linux proc(5)); before, the
// link itself was replaced by a file.
func TestOutputToDevStdout(t *testing.T) {
	if _, err := os.Stat("/dev/stdout"); err != nil {
		t.Skip(err)
	}
	var out, errb bytes.Buffer
	p := command("batch", "../../../testdata/batch/corrupt.csv", "-q", "-o", "/dev/stdout")
	p.Stdout, p.Stderr = &out, &errb
	if err := p.Start(); err != nil {
		t.Fatal(err)
	}
	if code := exitCode(t, p); code != ExitRejected || !strings.HasPrefix(out.String(), "species,") {
		t.Errorf("exit %d, stdout %q, stderr %q", code, out.String(), errb.String())
	}
	if st, err := os.Lstat("/dev/stdout"); err != nil || st.Mode()&os.ModeSymlink == 0 {
		t.Errorf("/dev/stdout is no longer a link: %v %v", st.Mode(), err)
	}
}
