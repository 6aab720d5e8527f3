package cli

import (
	"math"
	"runtime"
	"strings"
	"testing"
)

// TestVersion: --version names the module and the Go version it was built
// with (runtime.Version is the reference) and exits 0.
func TestVersion(t *testing.T) {
	out, errs, code := run(t, "--version")
	if code != ExitOK || errs != "" {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	if !strings.Contains(out, "go:       "+runtime.Version()) || !strings.Contains(out, "module:") || !strings.Contains(out, "revision:") {
		t.Errorf("--version:\n%s", out)
	}
}

// TestCalcJSONResolvedInputs: calc's JSON echoes what each input became in
// SI units and names the defaults used.
func TestCalcJSONResolvedInputs(t *testing.T) {
	out, errs, code := run(t, "calc", "--length", "30cm", "--speed", "3BL/s", "--medium", "seawater", "--format", "json")
	if code != ExitOK {
		t.Fatalf("exit %d, %s", code, errs)
	}
	j := decode(t, out)
	speed := j["inputs"].(map[string]any)["speed"].(map[string]any)
	// 3 body lengths per second of a 0.30 m body is 0.90 m/s (definition).
	if v := speed["value"].(float64); math.Abs(v-0.9) > 1e-12 || speed["unit"] != "m/s" || speed["given"] != "3BL/s" {
		t.Errorf("speed resolved as %v", speed)
	}
	var codes []string
	for _, a := range j["assumed"].([]any) {
		codes = append(codes, a.(map[string]any)["code"].(string))
	}
	if got, want := strings.Join(codes, ";"), "temperature=20C;salinity=35g/kg;shape=sphere;efficiency=1"; got != want {
		t.Errorf("assumed %q, want %q", got, want)
	}
	out, _, _ = run(t, "calc", "--length", "30cm", "--diameter", "5cm", "--speed", "1m/s", "--medium", "seawater", "--temp", "12C", "--salinity", "35", "--efficiency", "0.2", "--format", "json")
	if a := decode(t, out)["assumed"].([]any); len(a) != 0 {
		t.Errorf("everything given, yet assumed %v", a)
	}
}

// TestSettleJSONResolvedInputs: settle's JSON echoes its inputs in SI and
// the medium defaults used.
func TestSettleJSONResolvedInputs(t *testing.T) {
	out, errs, code := run(t, "settle", "--diameter", "150um", "--density", "1.06g/cm3", "--medium", "freshwater", "--format", "json")
	if code != ExitOK {
		t.Fatalf("exit %d, %s", code, errs)
	}
	j := decode(t, out)
	d := j["inputs"].(map[string]any)["diameter"].(map[string]any)
	if math.Abs(d["value"].(float64)-150e-6) > 1e-18 || d["unit"] != "m" {
		t.Errorf("diameter resolved as %v", d)
	}
	if a := j["assumed"].([]any); len(a) != 1 || a[0].(map[string]any)["code"] != "temperature=20C" {
		t.Errorf("assumed %v", a)
	}
}
