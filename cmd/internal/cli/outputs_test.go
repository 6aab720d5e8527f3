package cli

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"unicode/utf8"
)

// writingRuns are command lines that print to the standard output, one per
// command and format; the write-error tests run each of them.
func writingRuns(t *testing.T) [][]string {
	const corrupt, lakeside = "../../../testdata/batch/corrupt.csv", "../../../testdata/batch/lakeside.csv"
	const mud = "../../../testdata/rheology/mud_herschel_bulkley.csv"
	base := [][]string{
		{"calc", "--length", "30cm", "--diameter", "5cm", "--speed", "60cm/s", "--freq", "4Hz", "--amplitude", "6cm"},
		{"settle", "--diameter", "20um", "--density", "2650kg/m3"},
		{"medium", "seawater", "--temp", "10C"},
		{"laws"},
		{"fit", mud},
		{"sweep", "--vary", "speed=10um/s:1m/s", "--log", "--steps", "20", "--length", "1mm"},
		{"powercurve", "--length", "16cm", "--diameter", "3.5cm", "--mass", "40g", "--span", "42cm", "--chord", "4cm"},
		{"tabulate", lakeside, "--by", "taxon"},
	}
	var runs [][]string
	for _, b := range base {
		for _, f := range []string{"table", "json", "csv"} {
			runs = append(runs, append(append([]string{}, b...), "--format", f))
		}
	}
	for _, f := range []string{"csv", "tsv", "jsonl", "table"} {
		runs = append(runs, []string{"batch", corrupt, "--format", f, "--quiet", "--rejects", filepath.Join(t.TempDir(), "rej.csv")})
	}
	return append(runs, []string{"demo"}, []string{"demo", "--data"}, []string{"--help"})
}

// failingWriter accepts limit bytes, then fails every write the way a full
// disk does (ENOSPC, Linux write(2)).
type failingWriter struct {
	limit, n int
}

func (f *failingWriter) Write(p []byte) (int, error) {
	if f.n+len(p) > f.limit {
		k := max(f.limit-f.n, 0)
		f.n += k
		return k, syscall.ENOSPC
	}
	f.n += len(p)
	return len(p), nil
}

// Every command and format fails with exit 1 and one line on stderr when
// its output cannot be written, at the first byte or part-way; before,
// calc, tabulate, medium, laws, fit, sweep and settle exited 0 with an
// empty output. (Exit 1 for an I/O failure: the project's exit-code
// table.)
func TestWriteErrorsFailEveryCommand(t *testing.T) {
	for _, args := range writingRuns(t) {
		for _, limit := range []int{0, 100} {
			var errb bytes.Buffer
			code := Main(args, Streams{In: strings.NewReader(""), Out: &failingWriter{limit: limit}, Err: &errb})
			if code != ExitFailure || strings.Count(errb.String(), "\n") != 1 || !strings.Contains(errb.String(), "cannot write the output: no space left on device") {
				t.Errorf("%v after %d bytes: exit %d, stderr %q", args, limit, code, errb.String())
			}
		}
	}
}

// The same runs succeed (exit 0, or 3 for the batch of a corrupt table)
// when the output takes everything, so the failures above come from the
// writer alone.
func TestWritingRunsSucceedOtherwise(t *testing.T) {
	for _, args := range writingRuns(t) {
		var out, errb bytes.Buffer
		code := Main(args, Streams{In: strings.NewReader(""), Out: &out, Err: &errb})
		want := ExitOK
		if args[0] == "batch" {
			want = ExitRejected // corrupt.csv has 7 bad rows of 10
		}
		if code != want || out.Len() == 0 {
			t.Errorf("%v: exit %d (want %d), %d bytes out, stderr %q", args, code, want, out.Len(), errb.String())
		}
	}
}

// One check per exit code of the agreed table (0, 1, 2, 3), with 2 for a
// header problem in batch, tabulate and fit tables; the signal
// codes are checked in process_unix_test.go with a real process.
func TestExitCodes(t *testing.T) {
	cases := []struct {
		args []string
		code int
		why  string
	}{
		{[]string{"calc", "--length", "12mm", "--speed", "0.4m/s"}, ExitOK, "a computable case"},
		// Fresh water freezes at 0 °C at 101325 Pa (IAPWS-95 melting curve).
		{[]string{"calc", "--length", "12mm", "--speed", "0.4m/s", "--temp", "-5C"}, ExitFailure, "an impossible condition"},
		{[]string{"calc", "--length", "12mm", "--no-such-flag"}, ExitUsage, "a bad flag"},
		{[]string{"batch", "../../../testdata/batch/corrupt.csv", "--column", "length=nope"}, ExitUsage, "a header problem"},
		{[]string{"tabulate", "../../../testdata/batch/corrupt.csv", "--column", "speed=nope"}, ExitUsage, "a header problem"},
		{[]string{"fit", "../../../testdata/rheology/bad_nostress.csv"}, ExitUsage, "a header problem"},
		{[]string{"batch", "../../../testdata/batch/corrupt.csv", "-q"}, ExitRejected, "rows rejected"},
		{[]string{"tabulate", "../../../testdata/batch/corrupt.csv"}, ExitRejected, "rows rejected"},
	}
	for _, c := range cases {
		_, errs, code := run(t, c.args...)
		if code != c.code {
			t.Errorf("%s %v: exit %d, want %d (stderr %q)", c.why, c.args, code, c.code, errs)
		}
	}
	if ExitHangup != 129 || ExitInterrupt != 130 || ExitTerminate != 143 {
		t.Errorf("signal codes %d %d %d, want 128+1, 128+2, 128+15 (POSIX shell convention)", ExitHangup, ExitInterrupt, ExitTerminate)
	}
}

// copyFile writes a copy of the fixture src into dir and returns its path.
func copyFile(t *testing.T, src, dir, name string) string {
	t.Helper()
	b, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, b, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// An output that is an input, by any name, or another output is refused
// (exit 2) before anything is read or written, and the input stays as it
// was; a folder is refused the same way. Before, each of these destroyed
// the input or ran the whole job and then failed.
func TestOutputThatIsAnInputIsRefused(t *testing.T) {
	dir := t.TempDir()
	in := copyFile(t, "../../../testdata/batch/corrupt.csv", dir, "in.csv")
	mud := copyFile(t, "../../../testdata/rheology/mud_herschel_bulkley.csv", dir, "mud.csv")
	want, _ := os.ReadFile(in)
	wantMud, _ := os.ReadFile(mud)
	if err := os.Symlink("in.csv", filepath.Join(dir, "link.csv")); err != nil {
		t.Fatal(err)
	}
	if err := os.Link(in, filepath.Join(dir, "hard.csv")); err != nil {
		t.Fatal(err)
	}
	if err := os.Mkdir(filepath.Join(dir, "folder"), 0o755); err != nil {
		t.Fatal(err)
	}
	other := filepath.Join(dir, "x.csv")
	cases := [][]string{
		{"batch", in, "-o", in},
		{"batch", in, "--rejects", in},
		{"batch", in, "-o", other, "--rejects", other},
		{"batch", in, "-o", filepath.Join(dir, "link.csv")},
		{"batch", in, "-o", filepath.Join(dir, "hard.csv")},
		{"batch", in, "-o", filepath.Join(dir, ".", "..", filepath.Base(dir), "in.csv")},
		{"batch", in, "-o", filepath.Join(dir, "folder")},
		{"batch", in, "-o", filepath.Join(dir, "y.csv"), "--rejects", filepath.Join(dir, "folder")},
		{"fit", mud, "--density", "1300kg/m3", "--save", mud},
	}
	for _, args := range cases {
		_, errs, code := run(t, args...)
		if code != ExitUsage || strings.Count(errs, "\n") != 1 {
			t.Errorf("%v: exit %d, stderr %q", args, code, errs)
		}
	}
	if got, _ := os.ReadFile(in); !bytes.Equal(got, want) {
		t.Errorf("the input changed")
	}
	if got, _ := os.ReadFile(mud); !bytes.Equal(got, wantMud) {
		t.Errorf("the fit input changed")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 5 { // in, mud, link, hard, folder
		t.Errorf("files made by refused runs: %v", entries)
	}
	if sub, _ := os.ReadDir(filepath.Join(dir, "folder")); len(sub) != 0 {
		t.Errorf("files left in the folder: %v", sub)
	}

	// Standard output appending to the input (flowregime batch in.csv >> in.csv).
	f, err := os.OpenFile(in, os.O_WRONLY|os.O_APPEND, 0)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var errb bytes.Buffer
	if code := Main([]string{"batch", in, "-q"}, Streams{In: strings.NewReader(""), Out: f, Err: &errb}); code != ExitUsage || !strings.Contains(errb.String(), "standard output is the same file as the input") {
		t.Errorf("stdout onto the input: exit %d, stderr %q", code, errb.String())
	}
	if got, _ := os.ReadFile(in); !bytes.Equal(got, want) {
		t.Errorf("the input changed through standard output")
	}
}

// A replaced file keeps its mode, a link is followed (the link stays, its
// target is replaced or, if missing, made), a device is written in place and stays a device,
// and an output name of 255 bytes, the Linux NAME_MAX, works although
// the temporary name beside it would be longer.
func TestOutputsKeepWhatTheyReplace(t *testing.T) {
	dir := t.TempDir()
	in := copyFile(t, "../../../testdata/batch/corrupt.csv", dir, "in.csv")
	private := filepath.Join(dir, "private.csv")
	if err := os.WriteFile(private, []byte("previous\n"), 0o600); err != nil {
		t.Fatal(err)
	}
	os.Chmod(private, 0o600)
	if _, errs, code := run(t, "batch", in, "-q", "-o", private); code != ExitRejected {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if st, _ := os.Stat(private); st.Mode().Perm() != 0o600 {
		t.Errorf("mode %v after replacing a 0600 file", st.Mode().Perm())
	}

	target := filepath.Join(dir, "target.csv")
	os.WriteFile(target, []byte("previous\n"), 0o644)
	link := filepath.Join(dir, "out-link.csv")
	os.Symlink("target.csv", link)
	if _, errs, code := run(t, "batch", in, "-q", "-o", link); code != ExitRejected {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if st, _ := os.Lstat(link); st.Mode()&os.ModeSymlink == 0 {
		t.Errorf("the link was replaced by a file")
	}
	if got, _ := os.ReadFile(target); !strings.HasPrefix(string(got), "species,") {
		t.Errorf("the link's target was not written: %q", got)
	}

	dangling := filepath.Join(dir, "new-link.csv")
	os.Symlink("new.csv", dangling)
	if _, errs, code := run(t, "batch", in, "-q", "-o", dangling); code != ExitRejected {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if got, _ := os.ReadFile(filepath.Join(dir, "new.csv")); !strings.HasPrefix(string(got), "species,") {
		t.Errorf("the dangling link's target was not made: %q", got)
	}

	if _, errs, code := run(t, "batch", in, "-q", "-o", os.DevNull, "--rejects", os.DevNull); code != ExitRejected {
		t.Errorf("-o %s: exit %d: %s", os.DevNull, code, errs)
	}
	if st, err := os.Stat(os.DevNull); err != nil || st.Mode()&os.ModeDevice == 0 {
		t.Errorf("%s is no longer a device: %v", os.DevNull, st.Mode())
	}

	long := filepath.Join(dir, strings.Repeat("é", 125)+".csv") // 250 + 4 bytes
	if _, errs, code := run(t, "batch", in, "-q", "-o", long); code != ExitRejected {
		t.Errorf("a %d-byte name: exit %d: %s", len(filepath.Base(long)), code, errs)
	}
	entries, _ := os.ReadDir(dir)
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	if len(entries) != 7 || !strings.Contains(strings.Join(names, "/"), filepath.Base(long)) {
		t.Errorf("files after the runs: %q", names)
	}
}

// Temporary names stay within 255 bytes and valid UTF-8 whatever the base.
func TestTempNameLength(t *testing.T) {
	for _, base := range []string{"out.csv", strings.Repeat("a", 255), strings.Repeat("é", 127) + "x", strings.Repeat("日", 85)} {
		name := tempName(base, 0xffffffff)
		if len(name) > maxNameBytes || !utf8.ValidString(name) || !strings.HasSuffix(name, ".ffffffff.tmp") || !strings.HasPrefix(name, ".") {
			t.Errorf("%d-byte base: %d-byte name %q", len(base), len(name), name)
		}
	}
	if got := tempName("out.csv", 1); got != ".out.csv.00000001.tmp" {
		t.Errorf("short base shortened: %q", got)
	}
}

// A failed write to -o or --rejects names that file, not its temporary
// file, and leaves no temporary file behind.
func TestBatchFileWriteErrorNamesTheFile(t *testing.T) {
	a := &atomicFile{writeErr: &os.PathError{Op: "write", Path: ".out.csv.1234.tmp", Err: syscall.ENOSPC}}
	err := writeFailure("out.csv", a)
	if err == nil || err.Error() != "cannot write out.csv: no space left on device" {
		t.Errorf("got %v", err)
	}
	if writeFailure("out.csv", nil) != nil || writeFailure("out.csv", &atomicFile{}) != nil {
		t.Errorf("a failure without a failed write")
	}
	if !errors.Is(withoutPath(a.writeErr), syscall.ENOSPC) {
		t.Errorf("withoutPath lost the cause")
	}
}

// Stopping a run (a signal, a panic) removes its temporary files, and a
// commit after that renames nothing, so the previous output stays.
func TestStoppedRunRenamesNothing(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "out.csv")
	os.WriteFile(target, []byte("previous\n"), 0o644)
	set := newOutputSet()
	a, err := set.create(target)
	if err != nil {
		t.Fatal(err)
	}
	a.Write([]byte("new\n"))
	if renamed := set.stop(); len(renamed) != 0 {
		t.Errorf("renamed before the stop: %v", renamed)
	}
	if err := a.commit(); !errors.Is(err, errStopped) {
		t.Errorf("commit after stop: %v", err)
	}
	a.abort()
	if _, err := set.create(filepath.Join(dir, "later.csv")); !errors.Is(err, errStopped) {
		t.Errorf("create after stop: %v", err)
	}
	entries, _ := os.ReadDir(dir)
	if got, _ := os.ReadFile(target); string(got) != "previous\n" || len(entries) != 1 {
		t.Errorf("after the stop: %q, files %v", got, entries)
	}
}
