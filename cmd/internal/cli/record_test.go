package cli

import (
	"encoding/json"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// TestBatchRecord: --record writes the run's version, command line,
// mapping and counts beside the output, also when rows were rejected, and
// is refused when it names the input.
func TestBatchRecord(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "in.csv")
	data := "id,length (mm),speed (cm/s),temp_C\n" +
		"a,300,60,12\n" +
		"b,-3,60,12\n" // a negative length: rejected
	if err := os.WriteFile(in, []byte(data), 0o644); err != nil {
		t.Fatal(err)
	}
	out, rec := filepath.Join(dir, "out.csv"), filepath.Join(dir, "run.json")
	if _, errs, code := run(t, "batch", in, "-o", out, "--record", rec, "--medium", "freshwater", "-q"); code != ExitRejected {
		t.Fatalf("exit %d, %s", code, errs)
	}
	b, err := os.ReadFile(rec)
	if err != nil {
		t.Fatal(err)
	}
	var r runRecord
	if err := json.Unmarshal(b, &r); err != nil {
		t.Fatalf("%v\n%s", err, b)
	}
	if r.Counts.Read != 2 || r.Counts.Written != 1 || r.Counts.Rejected != 1 {
		t.Errorf("counts %+v", r.Counts)
	}
	if r.Program.GoVersion != runtime.Version() || len(r.CommandLine) < 3 || r.CommandLine[1] != "batch" || r.Input != in {
		t.Errorf("program %+v, command line %q, input %q", r.Program, r.CommandLine, r.Input)
	}
	want := map[string]string{"length": "mm", "speed": "cm/s", "temperature": "C"}
	for _, m := range r.Mapping {
		if u, ok := want[m.Quantity]; ok && u != m.Unit && !(m.Quantity == "temperature" && m.Unit != "") {
			t.Errorf("%s mapped with unit %q, want %q", m.Quantity, m.Unit, u)
		}
		delete(want, m.Quantity)
	}
	if len(want) > 0 {
		t.Errorf("not in the mapping: %v (mapping %+v)", want, r.Mapping)
	}
	if r.Assumed["shape=sphere"] != 1 || r.Assumed["efficiency=1"] != 1 {
		t.Errorf("assumed %v", r.Assumed)
	}
	if _, _, code := run(t, "batch", in, "-o", out, "--record", in); code != ExitUsage {
		t.Errorf("--record naming the input: exit %d, want 2", code)
	}
	if got, _ := os.ReadFile(in); string(got) != data {
		t.Errorf("the input was changed")
	}
}

// TestBatchSummaryNamesAssumptions: the end summary names each default that
// changed results, with its row count, one line each.
func TestBatchSummaryNamesAssumptions(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "in.csv")
	data := "id,medium,length (mm),speed (cm/s),temp_C\n" +
		"a,freshwater,300,60,\n" +
		"b,freshwater,300,60,12\n"
	if err := os.WriteFile(in, []byte(data), 0o644); err != nil {
		t.Fatal(err)
	}
	_, errs, code := run(t, "batch", in, "-o", filepath.Join(dir, "out.csv"))
	if code != ExitOK {
		t.Fatalf("exit %d, %s", code, errs)
	}
	for _, want := range []string{
		"assumed temperature=20C in 1 row: no temperature: water at 20 °C\n",
		"assumed shape=sphere in 2 rows: no diameter or shape: a sphere as wide as the length\n",
		"assumed efficiency=1 in 2 rows:",
	} {
		if !strings.Contains(errs, want) {
			t.Errorf("summary lacks %q:\n%s", want, errs)
		}
	}
}
