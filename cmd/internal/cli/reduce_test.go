package cli

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var snailCouette = []string{"reduce", "../../../testdata/rheometry/snail_couette.csv", "--geometry", "couette",
	"--bob-radius", "12.5mm", "--cup-radius", "13.6mm", "--bob-length", "37.5mm"}

// The invented snail-mucus readings were made by make_bench.py from a
// Herschel–Bulkley sample (τ_y 8 Pa, K 3 Pa·sⁿ, n 0.45) with the forward
// Couette relation and 1.5 % noise: reduced and fitted, every parameter
// comes back within 3 standard errors.
func TestReduceCouetteFits(t *testing.T) {
	out, stderr, code := run(t, append(snailCouette, "--fit", "--format", "json")...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	m := decode(t, out)
	if n := len(m["points"].([]any)); n != 14 {
		t.Errorf("%d points, want 14", n)
	}
	fit := m["fit"].(map[string]any)
	if fit["best"] != "herschel-bulkley" {
		t.Fatalf("best model %v", fit["best"])
	}
	for _, mod := range fit["models"].([]any) {
		mm := mod.(map[string]any)
		if mm["model"] != "herschel-bulkley" {
			continue
		}
		for name, want := range map[string]float64{"yield_stress_Pa": 8, "consistency_Pa_sn": 3, "flow_index": 0.45} {
			got, se := num(t, mm, "parameters", name), num(t, mm, "standard_errors", name)
			if math.Abs(got-want) > 3*se {
				t.Errorf("%s = %.4g ± %.2g, made with %g", name, got, se, want)
			}
		}
	}
}

// Every bad input is refused out loud with the agreed exit code: 2 for
// flags, arguments and headers, 1 for data that cannot be computed, 3 for
// rows rejected while the rest are reduced.
func TestReduceBadInputs(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	good := "speed (rpm),torque (mN·m)\n1,0.40\n2,0.47\n5,0.58\n10,0.69\n20,0.82\n"
	goodFile := write("good.csv", good)
	cup := func(file string, extra ...string) []string {
		return append([]string{"reduce", file, "--geometry", "couette", "--bob-radius", "10mm", "--cup-radius", "11mm", "--bob-length", "40mm"}, extra...)
	}
	cases := []struct {
		name string
		args []string
		code int
		want string
	}{
		{"unknown geometry", []string{"reduce", goodFile, "--geometry", "bucket"}, 2, "accepted: couette"},
		{"missing dimension", []string{"reduce", goodFile, "--geometry", "couette", "--bob-radius", "10mm", "--bob-length", "40mm"}, 2, "needs --cup-radius"},
		{"flag of another geometry", cup(goodFile, "--gap", "1mm"), 2, "--gap does not apply"},
		{"dimension without unit", []string{"reduce", goodFile, "--geometry", "couette", "--bob-radius", "10", "--cup-radius", "11mm", "--bob-length", "40mm"}, 2, "has no unit"},
		{"cup inside bob", []string{"reduce", goodFile, "--geometry", "couette", "--bob-radius", "12mm", "--cup-radius", "11mm", "--bob-length", "40mm"}, 2, "cup wider than the bob"},
		{"no torque column", cup(write("nt.csv", "speed (rpm),force (N)\n1,2\n")), 2, "no torque column"},
		{"empty input", cup(write("empty.csv", "")), 2, "input is empty"},
		{"window too small", cup(goodFile, "--window", "2"), 2, "--window 2"},
		{"unit flag for no column", cup(goodFile, "--unit", "flow=mL/min"), 2, "columns are speed, torque"},
		{"wrong unit for torque", cup(goodFile, "--unit", "torque=Pa"), 2, "not a unit of torque"},
		{"save without density", cup(goodFile, "--save", filepath.Join(dir, "m.json")), 2, "needs the fluid's --density"},
		{"output is the input", cup(goodFile, "-o", goodFile), 2, "is the same file as the input"},
		{"output is a folder", cup(goodFile, "-o", dir), 2, "is a folder"},
		{"too few readings", cup(write("two.csv", "speed (rpm),torque (mN·m)\n1,0.4\n2,0.5\n")), 1, "3 usable readings"},
		{"falling ball with --fit", []string{"reduce", goodFile, "--geometry", "falling-ball", "--ball-diameter", "2mm", "--tube-diameter", "30mm", "--ball-density", "7800kg/m3", "--density", "1300kg/m3", "--fit"}, 2, "--fit does not apply"},
		{"ball lighter than fluid", []string{"reduce", goodFile, "--geometry", "falling-ball", "--ball-diameter", "2mm", "--tube-diameter", "30mm", "--ball-density", "900kg/m3", "--density", "1300kg/m3"}, 2, "denser than the fluid"},
		{"ball wider than tube", []string{"reduce", goodFile, "--geometry", "falling-ball", "--ball-diameter", "40mm", "--tube-diameter", "30mm", "--ball-density", "7800kg/m3", "--density", "1300kg/m3"}, 2, "narrower than the tube"},
		{"unknown wall correction", []string{"reduce", goodFile, "--geometry", "falling-ball", "--ball-diameter", "2mm", "--tube-diameter", "30mm", "--ball-density", "7800kg/m3", "--density", "1300kg/m3", "--wall", "none"}, 2, "unknown wall correction"},
		{"no such file", cup(filepath.Join(dir, "missing.csv")), 1, "cannot read"},
		{"columns without units", cup(write("nu.csv", "\ufeffspeed,torque\n1,0.4\n2,0.5\n")), 2, `column "speed" has no unit: name it "speed (rpm)"`},
	}
	for _, c := range cases {
		_, stderr, code := run(t, c.args...)
		if code != c.code || !strings.Contains(stderr, c.want) || strings.Count(stderr, "\n") != 1 {
			t.Errorf("%s: exit %d, stderr %q; want exit %d and one line with %q", c.name, code, stderr, c.code, c.want)
		}
	}
}

// Rows that cannot be read or reduced are named by line (and column) on
// standard error, the rest are reduced, and the exit code is 3: no row is
// lost.
func TestReduceRejectsRows(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "bad.csv")
	text := "speed (rpm),torque (mN·m)\n1,0.40\n2,abc\n5,0.58\n10,-0.69\n20,0.82\n40,\n50,0.95\n"
	if err := os.WriteFile(in, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "curve.csv")
	stdout, stderr, code := run(t, "reduce", in, "--geometry", "couette", "--bob-radius", "10mm", "--cup-radius", "11mm", "--bob-length", "40mm", "-o", out, "--format", "csv")
	if code != ExitRejected {
		t.Fatalf("exit %d, want 3; stderr %s", code, stderr)
	}
	for _, want := range []string{`line 3 rejected: column "torque (mN·m)"`, "line 5 rejected: speed", `line 7 rejected: column "torque (mN·m)": no value`, "3 row(s) rejected; 4 point(s) reduced"} {
		if !strings.Contains(stderr, want) {
			t.Errorf("stderr lacks %q:\n%s", want, stderr)
		}
	}
	if got := strings.Count(stdout, "\n"); got != 5 {
		t.Errorf("stdout has %d lines, want header + 4 points:\n%s", got, stdout)
	}
	b, err := os.ReadFile(out)
	if err != nil || string(b) != stdout {
		t.Errorf("-o file differs from standard output (%v)", err)
	}
}

// From raw readings to a medium file to an organism: the flow curve
// written by reduce is read by fit, and the medium saved by reduce is used
// by calc.
func TestReduceToMediumToCalc(t *testing.T) {
	dir := t.TempDir()
	curve, med := filepath.Join(dir, "curve.csv"), filepath.Join(dir, "mucus.json")
	if _, stderr, code := run(t, append(snailCouette, "-o", curve, "--density", "1020kg/m3", "--save", med, "--temp", "20C")...); code != 0 {
		t.Fatalf("reduce: exit %d: %s", code, stderr)
	}
	if _, stderr, code := run(t, "fit", curve); code != 0 {
		t.Errorf("fit of the reduced curve: exit %d: %s", code, stderr)
	}
	out, stderr, code := run(t, "calc", "--medium", med, "--length", "25mm", "--speed", "1.5mm/s", "--format", "json")
	if code != 0 {
		t.Fatalf("calc: exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "herschel-bulkley") {
		t.Errorf("calc output does not name the saved model:\n%s", out)
	}
}

// The falling ball saves its mean viscosity as a Newtonian medium. The
// readings were made by make_bench.py for 0.85 Pa·s with the Haberman &
// Sayre wall factor and 1.5 % noise.
func TestReduceFallingBallSaves(t *testing.T) {
	dir := t.TempDir()
	med := filepath.Join(dir, "syrup.json")
	_, stderr, code := run(t, "reduce", "../../../testdata/rheometry/syrup_ball.csv", "--geometry", "falling-ball", "--ball-diameter", "2mm", "--tube-diameter", "30mm",
		"--ball-density", "7850kg/m3", "--density", "1330kg/m3", "--fall-distance", "100mm", "--save", med)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	out, _, code := run(t, "medium", med, "--format", "json")
	if code != 0 {
		t.Fatal(out)
	}
	m := decode(t, out)
	if mu := num(t, m, "dynamic_viscosity_Pa_s"); math.Abs(mu/0.85-1) > 0.03 {
		t.Errorf("viscosity %.4g Pa·s, made with 0.85", mu)
	}
}

// A table with a broken quote is refused with its line by fit (which
// panicked on it before: csv.Reader.FieldPos has no record after a parse
// error) and rejected by line in reduce.
func TestBrokenQuote(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "q.csv")
	if err := os.WriteFile(p, []byte("shear rate (1/s),shear stress (Pa)\n1,2\n\"3\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, stderr, code := run(t, "fit", p); code != 1 || !strings.Contains(stderr, "line 3") {
		t.Errorf("fit: exit %d, stderr %q", code, stderr)
	}
	q := filepath.Join(dir, "r.csv")
	if err := os.WriteFile(q, []byte("speed (rpm),torque (mN·m)\n1,0.40\n2,0.47\n5,0.58\n\"10,0.69\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, stderr, code := run(t, "reduce", q, "--geometry", "cone-plate", "--radius", "20mm", "--cone-angle", "1deg")
	if code != ExitRejected || !strings.Contains(stderr, "line 5 rejected: not a valid table row") {
		t.Errorf("reduce: exit %d, stderr %q", code, stderr)
	}
}
