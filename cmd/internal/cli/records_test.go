package cli

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/survey"
)

// runIn runs the command line with stdin.
func runIn(t *testing.T, stdin string, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errb bytes.Buffer
	code = Main(args, Streams{In: strings.NewReader(stdin), Out: &out, Err: &errb})
	return out.String(), errb.String(), code
}

// writeTemp writes a file in a fresh folder and returns its path.
func writeTemp(t *testing.T, name, text string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// strictRows counts the data rows of CSV output with Go's encoding/csv in
// its strict mode (LazyQuotes=false), a reader the tool does not use.
func strictRows(t *testing.T, out string) int {
	t.Helper()
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("output is not strict CSV: %v", err)
	}
	return len(recs) - 1
}

// The million-row survey with a stray quote, scaled down to
// 20,000 rows, through the CLI from a file and from stdin: every row is
// written (the stray quote is text), exit 0; with a quote left open in
// row 5 instead, that row alone is rejected with its line, exit 3.
func TestBatchCLIStrayAndUnclosedQuotes(t *testing.T) {
	const n = 20000
	cases := []struct {
		note     string
		rejected int
		code     int
	}{{`fish 5" long`, 0, ExitOK}, {`"fish 5 long`, 1, ExitRejected}}
	for _, c := range cases {
		in := notesText(n, map[int]string{5: c.note}, true)
		file := writeTemp(t, "survey.csv", in)
		for _, src := range []string{file, "-"} {
			out, errs, code := runIn(t, in, "batch", src)
			written := strictRows(t, out)
			if code != c.code || written+c.rejected != n || !strings.Contains(errs, fmt.Sprintf("%d rows read, %d written, %d rejected", n, n-c.rejected, c.rejected)) {
				t.Errorf("note %q from %s: exit %d, %d rows written of %d, stderr %q", c.note, src, code, written, n, errs)
			}
			if c.rejected > 0 && !strings.Contains(errs, "rejected line 6 (row 5): a quoted field opened on this line is not closed") {
				t.Errorf("note %q: the reject does not name line 6 and the open quote: %q", c.note, errs)
			}
		}
	}
}

// A last record over the size limit without a final newline is rejected
// with its line, from a file and from stdin, in CSV and JSON Lines.
func TestBatchCLIOverlongLastRecord(t *testing.T) {
	long := strings.Repeat("y", 9<<20)
	for _, c := range []struct{ format, in, line string }{
		{"csv", "species,length (mm),speed (cm/s),notes\nfish,12,5,a\nfish,12,5," + long, "rejected line 3 (row 2)"},
		{"jsonl", `{"length (mm)":12,"speed (cm/s)":5,"notes":"a"}` + "\n" + `{"length (mm)":12,"speed (cm/s)":5,"notes":"` + long + `"}`, "rejected line 2 (row 2)"},
	} {
		file := writeTemp(t, "survey."+c.format, c.in)
		for _, src := range []string{file, "-"} {
			_, errs, code := runIn(t, c.in, "batch", src, "--input-format", c.format, "--format", "csv")
			if code != ExitRejected || !strings.Contains(errs, c.line) || !strings.Contains(errs, "1 rejected") {
				t.Errorf("%s from %s: exit %d, stderr %.300q", c.format, src, code, errs)
			}
		}
	}
}

// tabulate counts every row of the stray-quote survey; with a quote left
// open, the row is reported with its line and reason, left out, and the
// exit status is 3, whether tabulate runs batch itself or reads batch
// output with the bad row in it.
func TestTabulateCLIRows(t *testing.T) {
	const n = 20000
	rows := func(out string) int {
		var g []struct {
			Rows int `json:"rows"`
		}
		if err := json.Unmarshal([]byte(out), &g); err != nil || len(g) != 1 {
			t.Fatalf("tabulate output %v: %.200s", err, out)
		}
		return g[0].Rows
	}
	out, errs, code := runIn(t, notesText(n, map[int]string{5: `fish 5" long`}, true), "tabulate", "-", "--format", "json")
	if code != ExitOK || rows(out) != n {
		t.Errorf("stray quote: exit %d, stderr %q", code, errs)
	}
	out, errs, code = runIn(t, notesText(n, map[int]string{5: `"fish 5 long`}, true), "tabulate", "-", "--format", "json")
	if code != ExitRejected || rows(out) != n-1 || !strings.Contains(errs, "rejected line 6") || !strings.Contains(errs, "1 rows rejected") {
		t.Errorf("open quote, through batch: exit %d, stderr %q", code, errs)
	}
	// Batch output with a row broken afterwards, and a ragged one.
	good, _, _ := runIn(t, notesText(100, nil, true), "batch", "-")
	lines := strings.SplitAfter(good, "\n")
	lines[4] = `"broken,` + lines[4]
	lines[7] = "ragged,1\n"
	out, errs, code = runIn(t, strings.Join(lines, ""), "tabulate", "-", "--format", "json")
	if code != ExitRejected || rows(out) != 98 || !strings.Contains(errs, "rejected line 5: a quoted field") || !strings.Contains(errs, "rejected line 8: has 2 fields") {
		t.Errorf("batch output with bad rows: exit %d, stderr %q", code, errs)
	}
}

// fit never panics on a bad table: an unterminated quote stops it with the
// line and exit 1; a header problem is a usage error (exit 2).
func TestFitBadTables(t *testing.T) {
	for _, c := range []struct {
		in   string
		code int
		want string
	}{
		{"shear rate (1/s),shear stress (Pa)\n1,2\n\"3,4\n5,6\n", ExitFailure, "line 3: a quoted field"},
		{"shear rate (1/s),shear stress (Pa)\n1,2\n\"3,4", ExitFailure, "line 3: a quoted field"},
		{"shear rate (1/s),shear stress (Pa)\n1,2,3\n", ExitFailure, "line 2: has 3 fields, the header has 2"},
		{"\"shear rate (1/s),shear stress (Pa)\n1,2\n", ExitUsage, "line 1 (header)"},
		{"", ExitUsage, "empty"},
		{"rate,temperature\n1,20\n", ExitUsage, "no shear-stress or viscosity column"},
	} {
		_, errs, code := runIn(t, c.in, "fit", "-")
		if code != c.code || !strings.Contains(errs, c.want) || strings.Count(errs, "\n") != 1 {
			t.Errorf("fit %q: exit %d, stderr %q; want exit %d and %q", c.in, code, errs, c.code, c.want)
		}
	}
}

// FuzzReadRheometer: no table panics the fit reader; every failure is one
// line, and one that is not about the header names the row's line.
func FuzzReadRheometer(f *testing.F) {
	f.Add([]byte("shear rate (1/s),shear stress (Pa)\n1,2\n\"3,4\n"))
	f.Add([]byte("shear rate (1/s),viscosity (Pa s)\n1,\"2\"\"\"\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		_, err := readRheometer(bytes.NewReader(data), false, nil)
		var ue usageError
		if err != nil && (strings.Contains(err.Error(), "\n") || !errors.As(err, &ue) && !strings.HasPrefix(err.Error(), "line ")) {
			t.Fatalf("%q: %v", data, err)
		}
	})
}

// notesText is survey.WithNotes as text.
func notesText(n int, notes map[int]string, finalNewline bool) string {
	return string(survey.WithNotes(n, notes, finalNewline))
}
