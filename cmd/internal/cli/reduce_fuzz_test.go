package cli

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
)

// FuzzReduce feeds arbitrary tables to reduce for each geometry: nothing
// may panic; the exit code is one of the agreed ones; a result names every
// line at most once (as a point or a rejection) and every point has a
// positive shear rate and stress (JSON cannot hold NaN or infinity).
func FuzzReduce(f *testing.F) {
	f.Add(0, "speed (rpm),torque (mN·m)\n1,0.40\n2,0.47\n5,0.58\n10,0.69\n")
	f.Add(1, "speed (rad/s),torque (µN·m)\n0,1\n1e308,1e308\n-1,2\nx,y\n")
	f.Add(3, "flow rate (mL/min),pressure drop (kPa),tube length (mm)\n1,2,10\n1,4,40\n2,3,10\n2,6,40\n4,5,10\n4,9,40\n")
	f.Add(4, "fall speed (mm/s)\n1\n2\n\"3\n")
	f.Add(2, "speed (rpm),torque (mN·m),speed (rpm)\n1,2,3\n")
	f.Fuzz(func(t *testing.T, g int, table string) {
		geoms := [][]string{
			{"--geometry", "couette", "--bob-radius", "10mm", "--cup-radius", "11mm", "--bob-length", "40mm"},
			{"--geometry", "cone-plate", "--radius", "20mm", "--cone-angle", "1deg"},
			{"--geometry", "parallel-plate", "--radius", "20mm", "--gap", "1mm"},
			{"--geometry", "capillary", "--diameter", "1mm", "--length", "40mm", "--density", "1000kg/m3"},
			{"--geometry", "falling-ball", "--ball-diameter", "2mm", "--tube-diameter", "30mm", "--ball-density", "7800kg/m3", "--density", "1300kg/m3"},
		}
		if g < 0 {
			g = -g
		}
		args := append(append([]string{"reduce", "-"}, geoms[g%len(geoms)]...), "--format", "json", "--fit")
		if g%len(geoms) == 4 {
			args = args[:len(args)-1]
		}
		var out, errb bytes.Buffer
		code := Main(args, Streams{In: strings.NewReader(table), Out: &out, Err: &errb})
		switch code {
		case ExitOK, ExitRejected:
		case ExitFailure, ExitUsage:
			if strings.Count(errb.String(), "\n") < 1 {
				t.Fatalf("exit %d with no message", code)
			}
			return
		default:
			t.Fatalf("exit %d", code)
		}
		var res struct {
			Points []struct {
				Lines     []int
				ShearRate float64 `json:"shear_rate_1_s"`
				Stress    float64 `json:"shear_stress_Pa"`
			} `json:"points"`
			Rejected []struct{ Line int } `json:"rejected"`
		}
		if err := json.Unmarshal(out.Bytes(), &res); err != nil {
			t.Fatalf("bad JSON: %v\n%s", err, out.String())
		}
		seen := map[int]bool{}
		for _, p := range res.Points {
			if !(p.ShearRate > 0) || !(p.Stress > 0) {
				t.Fatalf("point %v: shear rate %g, stress %g", p.Lines, p.ShearRate, p.Stress)
			}
			for _, l := range p.Lines {
				if seen[l] {
					t.Fatalf("line %d twice", l)
				}
				seen[l] = true
			}
		}
		for _, r := range res.Rejected {
			if seen[r.Line] {
				t.Fatalf("line %d both reduced and rejected", r.Line)
			}
			seen[r.Line] = true
		}
	})
}
