package batch

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
)

// The direct reading of plain-number rows must give exactly what the
// general path (cells, then inputs.BuildCells) gives: the same organism and
// conditions to the last bit, or the same error. The reference here is the
// project's own general path, which the golden files and the calc tests pin
// to published values; this test only guards the equivalence.
func TestDirectEqualsCells(t *testing.T) {
	headers := [][]string{
		{"length (mm)", "diameter (mm)", "shape", "speed (mm/s)", "frequency (Hz)", "amplitude (mm)", "mass (g)", "span (mm)",
			"medium", "temp_C", "salinity", "depth (m)", "pressure (kPa)", "altitude (m)", "humidity", "lat", "efficiency", "disc"},
		{"length (cm)", "speed (BL/s)", "drag coefficient", "area (mm2)", "medium", "temperature (F)", "notes"},
		{"l (m)", "u (m/s)", "f (Hz)", "m (kg)"},
	}
	constants := []inputs.Flags{
		{},
		{"medium": "air", "temperature": "15"},
		{"shape": "rod", "diameter": "0.2mm", "salinity": "30"},
		{"depth": "10m", "efficiency": "0.2"},
	}
	// Mostly plain numbers, so that many rows go the direct way; now and
	// then a cell that sends its row to the general path.
	number := func(rng *rand.Rand) string {
		if rng.IntN(40) == 0 {
			return []string{"1e400", "12mm", "3±1", "NaN", "\u00a05", "abc", "0x10", "1_0", "NA", "?", "-"}[rng.IntN(11)]
		}
		switch rng.IntN(9) {
		case 0:
			return ""
		case 1:
			return " 12.5 "
		case 2:
			return "-3"
		case 3:
			return "0"
		case 4:
			return fmt.Sprintf("%.3e", rng.Float64()*1e3)
		default:
			return fmt.Sprintf("%.4f", 0.01+rng.Float64()*200)
		}
	}
	texts := map[string][]string{
		"shape":  {"", "", "sphere", "SPHEROID", "rod", "blob", " cylinder ", "NA", "?"},
		"medium": {"", "air", "seawater", "freshwater", " air", "mud", "sea water", "n/a", "-"},
		"disc":   {"", "span", "stroke", "wing", "–"},
		"notes":  {"", "anything", "±2"},
	}
	rng := rand.New(rand.NewPCG(7, 8))
	directRows, directErrs := 0, 0
	for hi, header := range headers {
		m, err := newMapping(header, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		for ci, consts := range constants {
			rc := newRowCells(m, consts, "freshwater", false, inputs.DefaultMissing)
			if rc.direct == nil {
				t.Fatalf("header %d, constants %d: no direct reading", hi, ci)
			}
			for range 20000 {
				fields := make([]string, len(header))
				for i, h := range header {
					if opts, ok := texts[h]; ok {
						fields[i] = opts[rng.IntN(len(opts))]
					} else {
						fields[i] = number(rng)
					}
				}
				got, ok, gotErr := rc.direct.Row(fields)
				if !ok {
					continue
				}
				directRows++
				want, wantErr := inputs.BuildCells(rc.fill(fields), "freshwater", false)
				if fmt.Sprint(gotErr) != fmt.Sprint(wantErr) {
					t.Fatalf("header %d, constants %v, row %q: direct error %v, cells error %v", hi, consts, fields, gotErr, wantErr)
				}
				if gotErr != nil {
					directErrs++
					continue
				}
				if g, w := fmt.Sprintf("%#v %#v", got.Organism, got.Conditions), fmt.Sprintf("%#v %#v", want.Organism, want.Conditions); g != w {
					t.Fatalf("header %d, constants %v, row %q:\ndirect %s\ncells  %s", hi, consts, fields, g, w)
				}
			}
		}
	}
	if directRows < 20000 || directErrs < 1000 {
		t.Errorf("only %d rows went the direct way, %d of them with an error; the test exercises too little", directRows, directErrs)
	}
}

// Columns or constants that the direct reading cannot take leave every row
// to the general path.
func TestDirectDeclines(t *testing.T) {
	for _, tc := range []struct {
		header []string
		consts inputs.Flags
	}{
		{[]string{"length (mm)", "speed (mm/s)", "temp_offset (K)"}, inputs.Flags{}},
		{[]string{"length (mm)", "speed (mm/s)"}, inputs.Flags{"temperature": "15±1"}},
		{[]string{"length (mm)", "speed (mm/s)", "length sd"}, inputs.Flags{}},
		{[]string{"length", "speed (mm/s)"}, inputs.Flags{"medium": "air"}}, // a bare length has no unit
	} {
		m, err := newMapping(tc.header, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		if rc := newRowCells(m, tc.consts, "freshwater", false, inputs.DefaultMissing); rc.direct != nil {
			t.Errorf("%q with %v: direct reading accepted", tc.header, tc.consts)
		}
	}
}

// FuzzDirectEqualsCells feeds arbitrary cells to both paths:
// go test -fuzz FuzzDirectEqualsCells ./cmd/internal/batch
func FuzzDirectEqualsCells(f *testing.F) {
	header := []string{"length (mm)", "diameter (mm)", "shape", "speed (BL/s)", "mass (g)", "span (mm)", "medium", "temp_C", "depth (m)", "pressure (kPa)"}
	m, err := newMapping(header, nil, nil)
	if err != nil {
		f.Fatal(err)
	}
	rc := newRowCells(m, inputs.Flags{"salinity": "30"}, "freshwater", false, inputs.DefaultMissing)
	f.Add("12.5", "", "", "3", "", "", "", "15", "", "")
	f.Add("12.5", "2", "rod", "3", "1.2", "30", "air", "15", "", "")
	f.Add(" 1e3", "0", "SPHERE", "-1", "", "", "seawater", "40", "10", "101")
	f.Add("12.5", "NA", "?", "3", "-", "n/a", "–", "NaN", "", "")
	f.Fuzz(func(t *testing.T, a, b, c, d, e, g, h, i, j, k string) {
		fields := []string{a, b, c, d, e, g, h, i, j, k}
		got, ok, gotErr := rc.direct.Row(fields)
		if !ok {
			return
		}
		want, wantErr := inputs.BuildCells(rc.fill(fields), "freshwater", false)
		if fmt.Sprint(gotErr) != fmt.Sprint(wantErr) {
			t.Fatalf("%q: direct error %v, cells error %v", fields, gotErr, wantErr)
		}
		if gotErr == nil {
			if g, w := fmt.Sprintf("%#v %#v", got.Organism, got.Conditions), fmt.Sprintf("%#v %#v", want.Organism, want.Conditions); g != w {
				t.Fatalf("%q:\ndirect %s\ncells  %s", fields, g, w)
			}
		}
	})
}
