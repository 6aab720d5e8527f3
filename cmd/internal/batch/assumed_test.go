package batch

import (
	"encoding/csv"
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// TestAssumedColumn: each default that changes a row's result is named in
// the row's assumed column and counted in the summary; a row that gives
// everything assumes nothing.
func TestAssumedColumn(t *testing.T) {
	in := "name,medium,temp_C,salinity_psu,length (mm),diameter (mm),speed (cm/s),mass (g),span (mm),chord (mm),frequency (Hz),efficiency,humidity (%),altitude (m)\n" +
		"bare fish,freshwater,,,300,,60,,,,,,,\n" +
		"full fish,freshwater,12,,300,50,60,,,,,0.2,,\n" +
		"sea fish,seawater,12,,300,50,60,,,,,0.2,,\n" +
		"bird,air,15,,160,35,1000,40,420,,,,50,200\n"
	out, rejects, sum := runBatch(t, []byte(in), Config{InFormat: CSV, OutFormat: CSV})
	if len(rejects) > 0 {
		t.Fatalf("rejects: %v", rejects)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := slices.Index(recs[0], "assumed")
	want := []string{
		"temperature=20C;shape=sphere;efficiency=1",
		"",
		"salinity=35g/kg",
		"flapping;induced-factor=1.15;profile-power=1.2Pam",
	}
	for i, w := range want {
		if got := recs[i+1][col]; got != w {
			t.Errorf("%s: assumed %q, want %q", recs[i+1][0], got, w)
		}
	}
	if sum.Assumed[AssumedWaterTemperature] != 1 || sum.Assumed[AssumedFlapping] != 1 || sum.Assumed[AssumedSalinity] != 1 {
		t.Errorf("summary counts %v", sum.Assumed)
	}
	// The assumption is what was used: pure water at 20 °C and 0.1 MPa has
	// a density of 998.207 kg/m³ (IAPWS-95; recalled from memory), within
	// the IF97 agreement of 1e-5 relative.
	rho, err := strconv.ParseFloat(recs[1][slices.Index(recs[0], "density_kg_m3")], 64)
	if err != nil || math.Abs(rho/998.207-1) > 1e-5 {
		t.Errorf("density at the assumed 20 °C: %g (%v), want 998.207", rho, err)
	}
}

// TestFlagReasons: each flag comes with its reason and value.
func TestFlagReasons(t *testing.T) {
	// St = f A / U = 4 Hz × 0.26 m / 0.5 m/s = 2.08.
	in := "name,medium,temp_C,length (mm),diameter (mm),speed (m/s),frequency (Hz),amplitude (mm),efficiency\n" +
		"trout,freshwater,12,500,80,0.5,4,260,0.2\n" +
		"calm,freshwater,12,500,80,0.5,1,100,0.2\n"
	recs := batchRecords(t, in, Config{})
	reasons := slices.Index(recs[0], "flag_reasons")
	if got := recs[1][reasons]; !strings.Contains(got, "strouhal 2.08 > 1 for a swimmer") {
		t.Errorf("reasons %q lack the Strouhal number", got)
	}
	if got, fl := recs[2][reasons], recs[2][slices.Index(recs[0], "flags")]; (got == "") != (fl == "") || strings.Contains(got, "strouhal") {
		t.Errorf("St 0.2 row: flags %q, reasons %q", fl, got)
	}
}

// A measured medium's file fixes its properties, whatever the file calls
// the fluid: one named "air" or "seawater" gets no air or sea-water default
// codes, while the built-in air (a gas) does.
func TestMediumAssumptionsReadNoName(t *testing.T) {
	file := media.Unset("fluids/thin.json")
	for _, name := range []string{media.KindAir, media.KindSeawater} {
		m := media.Properties{Medium: name}
		if got := MediumAssumptions(nil, &file, &m); len(got) != 0 {
			t.Errorf("a medium file named %q: %v", name, got)
		}
	}
	air := media.Unset(media.KindAir)
	m := media.Properties{Medium: media.KindAir, Gas: true}
	if got := MediumAssumptions(nil, &air, &m); len(got) != 3 {
		t.Errorf("built-in air with nothing given: %v, want temperature, altitude and humidity", got)
	}
}
