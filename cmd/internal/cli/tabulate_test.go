package cli

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/survey"
)

const lakesideCSV = "../../../testdata/batch/lakeside.csv"

// CSV output is one table: Go's encoding/csv, which refuses records of
// differing lengths by default, reads every stream whole.
func TestTabulateCSVOneTable(t *testing.T) {
	cases := []struct {
		args   []string
		first  string
		stderr string
	}{
		{[]string{"--format", "csv"}, "group,rows,reynolds_median", ""},
		{[]string{"--fit", "power_W=mass", "--format", "csv", "--only", "summaries"}, "group,rows,reynolds_median", ""},
		{[]string{"--fit", "power_W=mass", "--format", "csv", "--only", "fits"}, "group,y,x,rows,exponent_sma", ""},
	}
	for _, c := range cases {
		out, errs, code := run(t, append([]string{"tabulate", lakesideCSV, "--by", "taxon"}, c.args...)...)
		if code != 0 || !strings.Contains(errs, c.stderr) {
			t.Fatalf("%v: exit %d, %s", c.args, code, errs)
		}
		recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
		if err != nil || len(recs) != 10 || !strings.HasPrefix(out, c.first) {
			t.Errorf("%v: %v, %d records:\n%s", c.args, err, len(recs), out)
		}
	}
}

// Asking for fits in CSV without saying which table, a bad --only or
// --expect, and an --expect without its fit are usage errors, exit 2.
func TestTabulateUsage(t *testing.T) {
	cases := [][]string{
		{"--fit", "power_W=mass", "--format", "csv"},
		{"--only", "everything"},
		{"--fit", "power_W=mass", "--expect", "power_W=mass"},
		{"--fit", "power_W=mass", "--expect", "power_W=mass:three"},
		{"--fit", "power_W=mass", "--expect", "drag_N=mass:1"},
		{"--memory-budget", "0"},
		{"--memory-budget", "2000000"}, // past 1 TiB
	}
	for _, args := range cases {
		out, errs, code := run(t, append([]string{"tabulate", lakesideCSV}, args...)...)
		if code != ExitUsage || out != "" || strings.Count(errs, "\n") != 1 {
			t.Errorf("%v: exit %d, stdout %q, stderr %q", args, code, out, errs)
		}
	}
}

// JSON fits carry both intercepts with intervals around them, and the
// comparison with the expected exponent: the bumblebee's power–mass
// exponent (about 1.12) is far from 0.75, so its interval excludes it.
func TestTabulateJSONFits(t *testing.T) {
	out, errs, code := run(t, "tabulate", lakesideCSV, "--by", "taxon", "--fit", "power_W=mass", "--expect", "power_W=mass:3/4", "--format", "json", "--only", "fits")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var fits []map[string]any
	if err := json.Unmarshal([]byte(out), &fits); err != nil || len(fits) != 9 {
		t.Fatalf("%v, %d fits", err, len(fits))
	}
	withRef := 0
	for _, f := range fits {
		if f["sma_slope"] == nil {
			continue
		}
		for _, m := range []string{"ols", "sma"} {
			lo, mid, hi := f[m+"_intercept_low95"].(float64), f[m+"_intercept"].(float64), f[m+"_intercept_high95"].(float64)
			if !(lo < mid && mid < hi) {
				t.Errorf("%v %s intercept %g outside [%g, %g]", f["group"], m, mid, lo, hi)
			}
		}
		ref := f["reference"].(map[string]any)
		slo, shi := f["sma_low95"].(float64), f["sma_high95"].(float64)
		if ref["exponent"].(float64) != 0.75 || ref["outside_sma_interval"].(bool) != (slo > 0.75 || shi < 0.75) {
			t.Errorf("%v: reference %v for [%g, %g]", f["group"], ref, slo, shi)
		}
		withRef++
	}
	if withRef != 3 {
		t.Errorf("%d fits with a reference, want the 3 flying taxa", withRef)
	}
}

// Grouping by date leaves 97 dates with fewer than 3 rows (counted with
// cut | sort | uniq on the file, less the header line): they share one line, and the table holds
// only the 48 larger groups.
func TestTabulateSmallGroupsOneLine(t *testing.T) {
	out, errs, code := run(t, "tabulate", lakesideCSV, "--by", "date", "--only", "summaries")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "97 groups of fewer than 3 rows") || !strings.Contains(out, "and 77 more") {
		t.Errorf("no one-line summary of the small groups:\n%s", out)
	}
	if n := len(regexp.MustCompile(`(?m)^│ 2026-`).FindAllString(out, -1)); n != 48 {
		t.Errorf("%d table rows, want 48", n)
	}
}

// Scaling laws in plain words: mass against length is compared with
// isometry (b = 3) without being asked.
func TestTabulateScalingLawWords(t *testing.T) {
	out, _, code := run(t, "tabulate", lakesideCSV, "--by", "site", "--fit", "mass=length", "--only", "fits")
	if code != 0 || !strings.Contains(out, "meadow: mass ∝ length^1.91") || !strings.Contains(out, "against isometry (b = 3): outside the 95 % interval of b: b is smaller") {
		t.Errorf("exit %d:\n%s", code, out)
	}
}

// A table with a header and no rows says so (exit 0), rather than printing
// an empty summary or a heading over nothing.
func TestTabulateNoRows(t *testing.T) {
	dir := t.TempDir()
	path := dir + "/empty.csv"
	if err := os.WriteFile(path, []byte("length (mm),speed (mm/s)\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := run(t, "tabulate", path)
	if code != 0 || !strings.Contains(out, "No rows to summarise") || strings.Contains(out, "Scaling laws") {
		t.Errorf("exit %d: %q %q", code, out, errs)
	}
}

// Past --memory-budget the values go to a temporary file in $TMPDIR and
// the output is the same as in memory; the file is gone afterwards. With
// $TMPDIR missing, the run fails in one line saying so (which shows that
// 1 MiB, 131072 values, is passed on 30000 survey rows).
func TestTabulateMemoryBudget(t *testing.T) {
	var survey30k bytes.Buffer
	if err := survey.Generate(&survey30k, 30000, 3); err != nil {
		t.Fatal(err)
	}
	in := filepath.Join(t.TempDir(), "survey.csv")
	if err := os.WriteFile(in, survey30k.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"tabulate", in, "--by", "taxon", "--format", "json"}
	want, errs, code := run(t, args...)
	if code != 0 {
		t.Fatalf("in memory: exit %d, %s", code, errs)
	}
	tmp := t.TempDir()
	t.Setenv("TMPDIR", tmp)
	got, errs, code := run(t, append(args, "--memory-budget", "1")...)
	if code != 0 || got != want {
		t.Errorf("spilled: exit %d, %s; same output: %v", code, errs, got == want)
	}
	if left, _ := os.ReadDir(tmp); len(left) != 0 {
		t.Errorf("%d files left in $TMPDIR", len(left))
	}
	t.Setenv("TMPDIR", filepath.Join(tmp, "missing"))
	out, errs, code := run(t, append(args, "--memory-budget", "1")...)
	if code != ExitFailure || out != "" || strings.Count(errs, "\n") != 1 || !strings.Contains(errs, "temporary file") {
		t.Errorf("no $TMPDIR: exit %d, stdout %q, stderr %q", code, out, errs)
	}
}
