package batch

import (
	"encoding/csv"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/regime"
)

// computed returns the appended columns of each output row.
func computed(t *testing.T, out string) [][]string {
	t.Helper()
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("output is not CSV: %v", err)
	}
	var rows [][]string
	for _, r := range recs[1:] {
		rows = append(rows, r[len(r)-len(Computed)-len(UncertaintyColumns):])
	}
	return rows
}

func num(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("%q is not a number", s)
	}
	return v
}

// An uncertainty with a unit of its own is converted from that unit and
// never rescales the value: 400 mm/s with 1 cm/s is 400 mm/s with 10 mm/s
// (1 cm = 10 mm, SI Brochure, 9th ed.) however it is written. The linear
// method is deterministic, so each way must give the same numbers, and a
// 1 mm/s uncertainty a narrower interval.
func TestSDColumnUnitsConvert(t *testing.T) {
	cfg := Config{InFormat: CSV, OutFormat: CSV, Uncertainty: true, Method: regime.MethodLinear, Draws: 100, Seed: 1}
	ways := map[string]string{
		"sd cell with its own unit": "length (mm),speed (mm/s),speed sd\n20,400,1cm/s\n",
		"sd column in cm/s":         "length (mm),speed (mm/s),speed sd (cm/s)\n20,400,1\n",
		"sd in the speed column's":  "length (mm),speed (mm/s),speed sd\n20,400,10\n",
		"± in the cell":             "length (mm),speed (mm/s)\n20,400±1cm/s\n",
		"value and sd in units":     "length (mm),speed\n20,400mm/s±1cm/s\n",
	}
	var want []string
	for name, in := range ways {
		out, rejects, _ := runBatch(t, []byte(in), cfg)
		if len(rejects) > 0 {
			t.Fatalf("%s: rejected %+v", name, rejects)
		}
		got := computed(t, out)[0]
		if want == nil {
			want = got
		} else if strings.Join(got, ",") != strings.Join(want, ",") {
			t.Errorf("%s: %v, want %v", name, got, want)
		}
	}
	// Re = ρUd/μ at 20 °C fresh water, 0.4 m/s on 20 mm: 0.4·0.02/1.0034e-6
	// ≈ 7973 (IAPWS R12-08 and IF97, see the media tests); 400 cm/s would
	// give ten times that.
	if re := num(t, want[2]); math.Abs(re/(0.4*0.02/1.0034e-6)-1) > 1e-3 {
		t.Errorf("Re %g, want about 7973 (0.4 m/s)", re)
	}
	narrow, _, _ := runBatch(t, []byte("length (mm),speed (mm/s),speed sd\n20,400,1\n"), cfg)
	n := computed(t, narrow)[0]
	if num(t, n[len(Computed)]) <= num(t, want[len(Computed)]) { // reynolds_low95 rises as the uncertainty shrinks
		t.Errorf("1 mm/s gives Re low %s, 10 mm/s %s: the sd unit is not applied", n[len(Computed)], want[len(Computed)])
	}
}

// An uncertainty of the wrong kind of unit, or two for one value, is a
// reject naming the column, not a silent reading.
func TestSDColumnWrongUnitRejected(t *testing.T) {
	cfg := Config{InFormat: CSV, OutFormat: CSV, Uncertainty: true, Method: regime.MethodLinear, Draws: 100, Seed: 1}
	in := "length (mm),speed (mm/s),speed sd\n20,400,1g\n20,400±1,2\n20,400,1BL/s\n"
	_, rejects, sum := runBatch(t, []byte(in), cfg)
	if sum.Read != 3 || len(rejects) != 3 {
		t.Fatalf("read %d, rejects %+v", sum.Read, rejects)
	}
	for i, want := range []string{`uncertainty in column "speed sd"`, `column "speed sd" gives another`, "same kind of unit"} {
		if !strings.Contains(rejects[i].Reason, want) {
			t.Errorf("reject %d: %q, want %q", i, rejects[i].Reason, want)
		}
	}
	if !strings.Contains(rejects[0].Reason, `"g" is not a unit of speed`) {
		t.Errorf("reject 0: %q does not name the wrong unit", rejects[0].Reason)
	}
}

// An uncertainty column whose header names a unit of another kind is a
// header problem, refused before any row is read; "%" is relative and
// accepted.
func TestSDHeaderUnitChecked(t *testing.T) {
	if _, err := newMapping([]string{"length (mm)", "speed (mm/s)", "speed sd (g)"}, nil, nil); err == nil ||
		!strings.Contains(err.Error(), `column "speed sd (g)": "g" is not a unit of speed`) {
		t.Errorf("error %v", err)
	}
	if _, err := newMapping([]string{"length (mm)", "speed (mm/s)", "speed sd (%)", "length sd (cm)"}, nil, nil); err != nil {
		t.Errorf("relative and length sd columns refused: %v", err)
	}
}
