package cli

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A dimensional column without a unit is one header error (exit 2, one
// stderr line, nothing on stdout), not one reject per row.
func TestUnitlessColumnIsOneHeaderError(t *testing.T) {
	var b strings.Builder
	b.WriteString("id,length (mm),Swim Speed\n")
	for i := range 1000 {
		fmt.Fprintf(&b, "%d,120,45\n", i)
	}
	path := filepath.Join(t.TempDir(), "tags.csv")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := run(t, "batch", path)
	if code != ExitUsage || out != "" || strings.Count(errs, "\n") != 1 ||
		!strings.Contains(errs, `column "Swim Speed" (speed) has no unit`) {
		t.Errorf("exit %d, stdout %d bytes, stderr %q", code, len(out), errs)
	}
	out, errs, code = run(t, "batch", path, "--unit", "speed=cm/s", "-q")
	if code != ExitOK || strings.Count(out, "\n") != 1001 || errs != "" {
		t.Errorf("with --unit: exit %d, %d lines, stderr %q", code, strings.Count(out, "\n"), errs)
	}
}

// Every batch run without -q reports the mapping on stderr before its
// summary; --explain prints it in full on stdout and computes nothing.
func TestMappingReport(t *testing.T) {
	table := "../../../testdata/headers/fishery_sheet.csv"
	_, errs, code := run(t, "batch", table, "--medium", "seawater")
	if code != ExitRejected {
		t.Errorf("exit %d; want %d (two rows miss their length or speed)", code, ExitRejected)
	}
	for _, want := range []string{
		`flowregime: batch:   "Water Temp (°C)" → temperature, in °C`,
		`flowregime: batch:   "Body Depth (mm)" → diameter, in mm`,
		`flowregime: batch:   "Notes" → not used (no quantity by this name)`,
		`water temperature 20 °C where "Water Temp (°C)" is blank or missing`,
		`salinity 35 g/kg in sea water where "Sal (ppt)" is blank or missing`,
		`water at its surface (101.325 kPa at altitude 0) where "Depth (m)" is blank or missing; latitude 45° for a depth in sea water`,
		`"NA" marks a missing value, and length is required`,
	} {
		if !strings.Contains(errs, want) {
			t.Errorf("stderr lacks %q:\n%s", want, errs)
		}
	}
	out, errs, code := run(t, "batch", table, "--medium", "seawater", "--explain")
	if code != ExitOK || errs != "" || strings.Contains(out, "reynolds") || !strings.Contains(out, `"Tail Amp (cm)" → amplitude, in cm`) ||
		!strings.Contains(out, "data row 1 read as: length 0.25 m, diameter 0.04 m, speed 0.8 m/s") {
		t.Errorf("--explain: exit %d, stderr %q, stdout:\n%s", code, errs, out)
	}
}

// tabulate reads tables by the same mapping: the same refusals, and
// --explain.
func TestTabulateSharesTheMapping(t *testing.T) {
	out, errs, code := run(t, "tabulate", "../../../testdata/headers/refuse_girth.csv")
	if code != ExitUsage || out != "" || strings.Count(errs, "\n") != 1 || !strings.Contains(errs, `column "Girth (cm)" is a girth`) {
		t.Errorf("exit %d, stdout %q, stderr %q", code, out, errs)
	}
	out, _, code = run(t, "tabulate", "../../../testdata/headers/tag_export.csv", "--medium", "seawater", "--explain")
	if code != ExitOK || !strings.Contains(out, `"PSU" → salinity, in PSU`) {
		t.Errorf("tabulate --explain: exit %d:\n%s", code, out)
	}
}

// The columns command lists every quantity with its spellings and units.
func TestColumnsCommand(t *testing.T) {
	out, _, code := run(t, "columns")
	for _, want := range []string{"temperature (flag --temp)", "water temp", "sst", "tbf", "wbf", "fork length",
		"body depth", "units: nm, µm, um, mm, cm, m, km", "ppt", "missing values (--missing)"} {
		if code != ExitOK || !strings.Contains(out, want) {
			t.Errorf("exit %d; columns lacks %q", code, want)
		}
	}
}
