package cli

import (
	"encoding/json"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/regime"
)

// The drag's bracket is printed where a join or a boundary-layer choice is
// used: in JSON as drag_low_N ≤ force_N ≤ drag_high_N equal to the library's
// two ends (regime.Estimate Low and High, which TestJoinEnds checks against
// the ends' laws), in CSV as two columns, in the table on one line; a case
// without a bracket gets none of them.
func TestCalcShowsDragBracket(t *testing.T) {
	larva := []string{"calc", "--length", "7mm", "--diameter", "0.7mm", "--speed", "40mm/s", "--medium", "freshwater", "--temp", "16C"}
	out, errOut, code := run(t, append(larva, "--format", "json")...)
	if code != ExitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var j struct {
		Drag struct {
			Force       float64  `json:"force_N"`
			Low         *float64 `json:"drag_low_N"`
			High        *float64 `json:"drag_high_N"`
			BracketFrom string   `json:"bracket_from"`
		} `json:"drag"`
	}
	if err := json.Unmarshal([]byte(out), &j); err != nil {
		t.Fatal(err)
	}
	d := j.Drag
	if d.Low == nil || d.High == nil || !(*d.Low <= d.Force && d.Force <= *d.High) || d.BracketFrom == "" {
		t.Fatalf("bracket in JSON: %+v", d)
	}
	res, err := regime.Drag(regime.Body{Shape: regime.Spheroid, Length: 7e-3, Diameter: 0.7e-3}, regime.Flow{Speed: 0.04, Density: 998.945, Viscosity: 0.0011081})
	if err != nil {
		t.Fatal(err)
	}
	// Same case through the library at the medium printed in the golden file (6 digits).
	if rel := *d.Low/res.Chosen.Low - 1; rel > 1e-4 || rel < -1e-4 {
		t.Errorf("low end %g N, library %g N", *d.Low, res.Chosen.Low)
	}
	if rel := *d.High/res.Chosen.High - 1; rel > 1e-4 || rel < -1e-4 {
		t.Errorf("high end %g N, library %g N", *d.High, res.Chosen.High)
	}
	csv, _, _ := run(t, append(larva, "--format", "csv")...)
	if header := strings.SplitN(csv, "\n", 2)[0]; !strings.Contains(header, "drag_N,drag_low_N,drag_high_N") {
		t.Errorf("CSV header %q", header)
	}
	table, _, _ := run(t, larva...)
	if !strings.Contains(table, "drag bracket (N)") {
		t.Errorf("no bracket line in the table:\n%s", table)
	}
	sphere, _, _ := run(t, "calc", "--length", "3mm", "--speed", "1mm/s", "--medium", "freshwater", "--format", "json")
	if strings.Contains(sphere, "drag_low_N") {
		t.Errorf("a sphere on the standard curve has no bracket, got one:\n%s", sphere)
	}
}
