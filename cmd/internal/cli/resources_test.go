package cli

import (
	"bytes"
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// A bad constant (flag) of batch or tabulate is one usage error, exit 2,
// before any row is read: nothing on stdout, one line on stderr.
func TestBatchBadConstantsAreUsageErrors(t *testing.T) {
	table := "../../../testdata/batch/corrupt.csv"
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"batch", table, "--medium", "lava"}, `--medium "lava" is not known`},
		{[]string{"tabulate", table, "--medium", "lava"}, `--medium "lava" is not known`},
		{[]string{"batch", table, "--medium", "../../../testdata/rheology/scipy_reference.json"}, "--medium: ../../../testdata/rheology/scipy_reference.json: medium file: json: unknown field"},
		{[]string{"batch", table, "--shape", "blob"}, `--shape: unknown shape "blob"`},
		{[]string{"tabulate", table, "--disc", "wing"}, `--disc "wing" is not known`},
		{[]string{"batch", table, "--workers", "1000000000"}, "--workers 1000000000: give 1 to 256"},
		{[]string{"batch", table, "--workers", "-1"}, "--workers -1: give 1 to 256"},
		{[]string{"tabulate", table, "--workers", "257"}, "--workers 257: give 1 to 256"},
	}
	for _, c := range cases {
		out, errs, code := run(t, c.args...)
		if code != ExitUsage || out != "" || strings.Count(errs, "\n") != 1 || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d, stdout %q, stderr %q; want exit 2, no output, one line naming %q", c.args, code, out, errs, c.want)
		}
	}
	// A medium file that cannot be read is an I/O failure (exit 1), still
	// before any row.
	if out, errs, code := run(t, "batch", table, "--medium", "no-such.json"); code != ExitFailure || out != "" || !strings.Contains(errs, "--medium: cannot read no-such.json: no such file or directory") {
		t.Errorf("--medium no-such.json: exit %d, stdout %q, stderr %q", code, out, errs)
	}
	// Within the limit and in any case, the built-in names are accepted.
	if _, errs, code := run(t, "batch", table, "--medium", "SeaWater", "--workers", "256", "-q"); code == ExitUsage {
		t.Errorf("--medium SeaWater --workers 256: %s", errs)
	}
}

// Control characters in a table's cells reach neither the terminal table
// nor the reject messages raw; CSV and JSON Lines output keep the data as
// read (CSV: encoding/csv reads the cell back unchanged; JSON: \u001b is
// the escape RFC 8259 section 7 prescribes).
func TestControlCharactersEscaped(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "t.csv")
	text := "taxon,length (mm),speed (mm/s)\n\"red\x1b[31m\u202e\",2,5\nbad\x1b]0;owned\x07,2,five\x1b[2J\n"
	if err := os.WriteFile(in, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := run(t, "batch", in, "--format", "table")
	if code != ExitRejected {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, raw := range []string{"\x1b", "\x07", "\u202e"} {
		if strings.Contains(out, raw) || strings.Contains(errs, raw) {
			t.Errorf("%q raw in the output or messages:\n%s\n%s", raw, out, errs)
		}
	}
	if !strings.Contains(out, `red\x1b[31m\u202e`) || !strings.Contains(errs, `\x1b[2J`) {
		t.Errorf("escapes missing:\n%s\n%s", out, errs)
	}

	csvOut, _, _ := run(t, "batch", in, "-q")
	recs, err := csv.NewReader(strings.NewReader(csvOut)).ReadAll()
	if err != nil || len(recs) != 2 || recs[1][0] != "red\x1b[31m\u202e" {
		t.Errorf("CSV output: %v %q", err, recs)
	}
	jsonOut, _, _ := run(t, "batch", in, "-q", "--format", "jsonl")
	if !strings.Contains(jsonOut, `"red\u001b[31m`+"\u202e"+`"`) {
		t.Errorf("JSON Lines output: %s", jsonOut)
	}
}

// A medium file named in a table is found beside the table, not in the
// working directory, and --media-anywhere lets a path leave the folder.
func TestBatchMediumBesideTable(t *testing.T) {
	dir := t.TempDir()
	b, err := os.ReadFile("../../../testdata/media/mucus.json")
	if err != nil {
		t.Fatal(err)
	}
	os.Mkdir(filepath.Join(dir, "survey"), 0o755)
	os.WriteFile(filepath.Join(dir, "survey", "mucus.json"), b, 0o644)
	os.WriteFile(filepath.Join(dir, "up.json"), b, 0o644)
	table := filepath.Join(dir, "survey", "t.csv")
	os.WriteFile(table, []byte("taxon,length (um),speed (um/s),medium\nciliate,200,50,mucus.json\nciliate,200,50,../up.json\n"), 0o644)
	out, errs, code := run(t, "batch", table, "-q")
	if code != ExitRejected || strings.Count(out, "\n") != 2 || !strings.Contains(errs, "leads outside the table's folder (--media-anywhere allows it)") {
		t.Errorf("exit %d\n%s\n%s", code, out, errs)
	}
	out, errs, code = run(t, "batch", table, "-q", "--media-anywhere")
	if code != ExitOK || strings.Count(out, "\n") != 3 {
		t.Errorf("--media-anywhere: exit %d\n%s\n%s", code, out, errs)
	}
}

// Table output comes a page at a time: the header is repeated every
// TablePage rows and every row is there once, in order.
func TestBatchTablePages(t *testing.T) {
	var b bytes.Buffer
	b.WriteString("id,length (mm),speed (mm/s)\n")
	const rows = 2500
	for i := range rows {
		b.WriteString("r" + strconv.Itoa(i) + ",2,5\n")
	}
	in := filepath.Join(t.TempDir(), "t.csv")
	os.WriteFile(in, b.Bytes(), 0o644)
	out, errs, code := run(t, "batch", in, "-q", "--format", "table")
	if code != ExitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if n := strings.Count(out, "│ id "); n != 3 {
		t.Errorf("%d headers for %d rows, want 3", n, rows)
	}
	last := -1
	for _, line := range strings.Split(out, "\n") {
		if f := strings.Fields(line); len(f) > 1 && strings.HasPrefix(f[1], "r") {
			if f[1] != "r"+strconv.Itoa(last+1) {
				t.Fatalf("row %s after r%d", f[1], last)
			}
			last++
		}
	}
	if last != rows-1 {
		t.Errorf("last row r%d, want r%d", last, rows-1)
	}
}

// tabulate --by on a row id of a survey table with more than 100,000 rows
// is one usage error (exit 2) with nothing on stdout, and the batch run
// feeding it is stopped rather than left writing to a closed pipe.
func TestTabulateTooManyGroups(t *testing.T) {
	if testing.Short() {
		t.Skip("100,001 rows")
	}
	var b bytes.Buffer
	b.WriteString("id,length (mm),speed (mm/s)\n")
	for i := range 100001 {
		b.WriteString(strconv.Itoa(i) + ",2,5\n")
	}
	in := filepath.Join(t.TempDir(), "t.csv")
	os.WriteFile(in, b.Bytes(), 0o644)
	out, errs, code := run(t, "tabulate", in, "--by", "id")
	if code != ExitUsage || out != "" || !strings.Contains(errs, "--by id makes more than 100000 groups") || strings.Count(errs, "\n") != 1 {
		t.Errorf("exit %d, stdout %d bytes, stderr %q", code, len(out), errs)
	}
}
