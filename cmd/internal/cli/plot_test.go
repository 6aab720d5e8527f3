package cli

import (
	"bytes"
	"encoding/xml"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// The demo regime map is the README's figure and the golden file that
// guards the SVG's structure: it must come out byte for byte the same
// (fonts, ticks and layout are all drawn from data embedded in the
// program). -update rewrites it; look at the picture before committing.
func TestPlotRegimeGolden(t *testing.T) {
	root, _ := filepath.Abs("../../..")
	golden := filepath.Join(root, "testdata/figures/regime-demo.svg")
	out := filepath.Join(t.TempDir(), "regime.svg")
	_, errs, code := run(t, "plot", "regime", "--y", "strouhal", "-o", out)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(errs, "rows left out") || !strings.Contains(errs, "demo survey") {
		t.Errorf("notes on stderr: %q", errs)
	}
	got, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if err := xml.Unmarshal(got, new(struct{})); err != nil {
		t.Fatalf("not XML: %v", err)
	}
	if *update {
		if err := os.WriteFile(golden, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("the demo regime map differs from %s (%d bytes, want %d); rerun with -update and review", golden, len(got), len(want))
	}
}

// Every plot kind runs from the command line and writes a PNG that
// decodes at 8.5 cm and 300 dpi (1004 px wide).
func TestPlotKindsFromCommandLine(t *testing.T) {
	dir := t.TempDir()
	root, _ := filepath.Abs("../../..")
	results := filepath.Join(dir, "results.csv")
	if _, errs, code := run(t, "batch", filepath.Join(root, "cmd/internal/demo/lakeside.csv"), "-o", results, "-q"); code != 0 && code != ExitRejected {
		t.Fatalf("batch: exit %d: %s", code, errs)
	}
	sweep := filepath.Join(dir, "sweep.csv")
	out, errs, code := run(t, "sweep", "--vary", "speed=10um/s:1m/s", "--log", "--steps", "30", "--length", "1mm", "--format", "csv")
	if code != 0 {
		t.Fatalf("sweep: exit %d: %s", code, errs)
	}
	if err := os.WriteFile(sweep, []byte(out), 0o644); err != nil {
		t.Fatal(err)
	}
	flyer := []string{"--length", "16cm", "--diameter", "3.5cm", "--mass", "40g", "--span", "42cm", "--chord", "4cm"}
	cases := map[string][]string{
		"regime":  {"plot", "regime", results, "--y", "length", "--by", "taxon"},
		"drag":    {"plot", "drag", "--length", "2mm", "--diameter", "0.5mm", "--speed", "5mm/s", "--medium", "seawater"},
		"power":   append([]string{"plot", "power"}, flyer...),
		"curve":   append([]string{"powercurve"}, flyer...),
		"flow":    {"plot", "flow", filepath.Join(root, "testdata/rheology/mucus_powerlaw.csv"), "--shear-rate", "12/s"},
		"sweep":   {"plot", "sweep", sweep, "--y", "drag_N", "--log-x", "--log-y"},
		"scaling": {"plot", "scaling", results, "--fit", "power_W=mass"},
	}
	for name, args := range cases {
		png1 := filepath.Join(dir, name+".png")
		_, errs, code := run(t, append(args, "-o", png1)...)
		if code != 0 {
			t.Errorf("%s: exit %d: %s", name, code, errs)
			continue
		}
		f, err := os.Open(png1)
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(f)
		f.Close()
		if err != nil || img.Bounds().Dx() != 1004 {
			t.Errorf("%s: PNG %v, %v", name, err, img)
		}
	}
}

// Bad inputs get one line on stderr and the agreed exit code, and no
// figure replaces an input.
func TestPlotRefusals(t *testing.T) {
	dir := t.TempDir()
	table := filepath.Join(dir, "t.csv")
	if err := os.WriteFile(table, []byte("a,b\n1,2\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	empty := filepath.Join(dir, "empty.csv")
	if err := os.WriteFile(empty, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	onlyBad := filepath.Join(dir, "bad.csv")
	if err := os.WriteFile(onlyBad, []byte("reynolds,length (mm),taxon\n0,1,a\n-3,2,b\nx,3,c\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	svg := filepath.Join(dir, "f.svg")
	// Without --by, a table lacking the taxon column is drawn ungrouped,
	// and said so; a --by column that is missing is refused.
	if _, errs, code := run(t, "plot", "regime", onlyBad, "--by", "site", "-o", svg); code != ExitUsage || !strings.Contains(errs, `column "site"`) {
		t.Errorf("--by site: exit %d, %q", code, errs)
	}
	noTaxon := filepath.Join(dir, "notaxon.csv")
	if err := os.WriteFile(noTaxon, []byte("reynolds,length (mm)\n10,1\n1000,20\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errs, code := run(t, "plot", "regime", noTaxon, "-o", svg); code != 0 || !strings.Contains(errs, "no taxon column") {
		t.Errorf("no taxon column: exit %d, %q", code, errs)
	}
	for _, c := range []struct {
		args []string
		msg  string
		code int
	}{
		{[]string{"plot"}, "name a kind", ExitUsage},
		{[]string{"plot", "regime"}, "-o: name the figure file", ExitUsage},
		{[]string{"plot", "regime", "-o", filepath.Join(dir, "f.gif")}, "written as .svg, .png or .pdf", ExitUsage},
		{[]string{"plot", "regime", table, "-o", svg}, `column "reynolds": not in the table`, ExitUsage},
		{[]string{"plot", "regime", empty, "-o", svg}, "empty, no header", ExitUsage},
		{[]string{"plot", "regime", onlyBad, "-o", svg}, "no row has a Reynolds number", ExitFailure},
		{[]string{"plot", "regime", filepath.Join(dir, "missing.csv"), "-o", svg}, "cannot read", ExitFailure},
		{[]string{"plot", "regime", "-o", dir + "/"}, "", ExitUsage},
		{[]string{"plot", "regime", "--y", "zz", "-o", svg}, `column "zz"`, ExitUsage},
		{[]string{"plot", "scaling", table, "--fit", "b", "-o", svg}, "write Y=X", ExitUsage},
		{[]string{"plot", "scaling", onlyBad, "--fit", "reynolds=length", "-o", svg}, "no pair of Reynolds number, Re and length (mm) above zero", ExitFailure},
		{[]string{"plot", "sweep", table, "--y", "zz", "-o", svg}, `column "zz"`, ExitUsage},
		{[]string{"plot", "drag", "--length", "0mm", "-o", svg}, "--length", ExitUsage},
		{[]string{"plot", "flow", table, "-o", svg}, "", ExitUsage},
		{[]string{"plot", "flow", filepath.Join(dir, "missing.csv"), "--shear-rate", "-1/s", "-o", svg}, "--shear-rate", ExitUsage},
		{[]string{"powercurve", "--length", "16cm", "--mass", "40g", "--span", "42cm", "-o", filepath.Join(dir, "c.txt")}, "written as .svg", ExitUsage},
	} {
		_, errs, code := run(t, c.args...)
		if code != c.code || !strings.Contains(errs, c.msg) || strings.Count(errs, "\n") != 1 {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, errs, c.code, c.msg)
		}
	}
	// The figure may not replace its own table.
	_, errs, code := run(t, "plot", "scaling", table, "--fit", "b=a", "-o", table)
	if code != ExitUsage {
		t.Errorf("output = input: exit %d, %q", code, errs)
	}
	if b, _ := os.ReadFile(table); string(b) != "a,b\n1,2\n" {
		t.Errorf("the input was changed: %q", b)
	}
}

// powercurve's summary states the two speeds as costs per second and per
// metre with W/kg and the cost of transport; csv gives every speed with
// the parts. Consistency checks: power_W_per_kg × 0.040 kg = power_W and
// cost_of_transport × m g = cost_J_per_m (definitions).
func TestPowerCurveFraming(t *testing.T) {
	flyer := []string{"powercurve", "--length", "16cm", "--diameter", "3.5cm", "--mass", "40g", "--span", "42cm", "--chord", "4cm"}
	out, errs, code := run(t, flyer...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{"per second (longest time aloft)", "per metre (farthest on a given energy)", "W/kg", "cost of transport", "-o curve.svg"} {
		if !strings.Contains(out, want) {
			t.Errorf("summary lacks %q:\n%s", want, out)
		}
	}
	if strings.Count(out, "\n") > 15 {
		t.Errorf("summary is %d lines; the table of every speed belongs to csv/json", strings.Count(out, "\n"))
	}
	out, errs, code = run(t, append(flyer, "--format", "csv")...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if lines[0] != "speed_m_s,power_W,power_W_per_kg,cost_J_per_m,cost_of_transport,induced_W,parasite_W,profile_W" || len(lines) != 61 {
		t.Fatalf("csv header %q, %d lines", lines[0], len(lines))
	}
	var v [8]float64
	for i, f := range strings.Split(lines[10], ",") {
		v[i] = parseF(t, f)
	}
	if rel(v[2]*0.040, v[1]) > 1e-3 || rel(v[4]*0.040*9.80665, v[3]) > 1e-3 || rel(v[1]/v[0], v[3]) > 1e-3 || rel(v[5]+v[6]+v[7], v[1]) > 1e-3 {
		t.Errorf("row %v is not self-consistent", v)
	}
}

func parseF(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("%q: %v", s, err)
	}
	return v
}

// rel is the relative difference of a from b.
func rel(a, b float64) float64 { return math.Abs(a-b) / math.Abs(b) }
