package cli

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/cmd/internal/tabulate"

	"github.com/flowregime/flowregime/regime"
)

// run executes the command line in-process on a fresh command tree.
func run(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errb bytes.Buffer
	code = Main(args, Streams{In: strings.NewReader(""), Out: &out, Err: &errb})
	return out.String(), errb.String(), code
}

func decode(t *testing.T, s string) map[string]any {
	t.Helper()
	var m map[string]any
	if err := json.Unmarshal([]byte(s), &m); err != nil {
		t.Fatalf("bad JSON: %v\n%s", err, s)
	}
	return m
}

func num(t *testing.T, m map[string]any, path ...string) float64 {
	t.Helper()
	var v any = m
	for _, p := range path {
		mm, ok := v.(map[string]any)
		if !ok {
			t.Fatalf("%v: not an object at %q", path, p)
		}
		v = mm[p]
	}
	f, ok := v.(float64)
	if !ok {
		t.Fatalf("%v = %v, not a number", path, v)
	}
	return f
}

// The medium command's JSON names are read by scripts. Values: water at
// 20 °C is 998.2067 kg/m³ (Tanaka et al. 2001) and 1.0016 mPa·s (ISO/TR
// 3666:1998).
func TestMediumJSON(t *testing.T) {
	out, errs, code := run(t, "medium", "freshwater", "--temp", "20C", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := decode(t, out)
	for _, k := range []string{"medium", "temperature_C", "pressure_Pa", "density_kg_m3", "dynamic_viscosity_Pa_s", "kinematic_viscosity_m2_s", "methods", "warnings"} {
		if _, ok := m[k]; !ok {
			t.Errorf("JSON lacks %q", k)
		}
	}
	if d := num(t, m, "density_kg_m3"); math.Abs(d-998.2067) > 0.02 {
		t.Errorf("density %g", d)
	}
	if mu := num(t, m, "dynamic_viscosity_Pa_s"); math.Abs(mu/1.0016e-3-1) > 1e-4 {
		t.Errorf("viscosity %g", mu)
	}
}

func TestMediumTableAndCSV(t *testing.T) {
	out, _, code := run(t, "medium", "seawater", "--temp", "12C", "--depth", "40m")
	if code != 0 || !strings.Contains(out, "density (kg/m³)") || !strings.Contains(out, "Methods:") || !strings.Contains(out, "EOS-80") {
		t.Errorf("table output (exit %d):\n%s", code, out)
	}
	out, _, _ = run(t, "medium", "air", "--altitude", "1500m", "--format", "csv")
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if len(lines) != 2 || !strings.HasPrefix(lines[0], "medium,temperature_C,pressure_Pa") {
		t.Errorf("csv output:\n%s", out)
	}
}

func TestBadInputIsOneLine(t *testing.T) {
	cases := []struct {
		args []string
		want string
		code int
	}{
		{[]string{"medium", "oil"}, "unknown medium \"oil\"", ExitUsage}, // a misspelled medium is a usage mistake
		{[]string{"medium"}, "needs one argument", ExitUsage},
		{[]string{"medium", "freshwater", "--temp", "-5C"}, "below its freezing point", ExitFailure},
		{[]string{"medium", "freshwater", "--depth", "30"}, "--depth: depth or altitude \"30\" has no unit", ExitUsage},
		{[]string{"medium", "air", "--format", "xml"}, "--format \"xml\"", ExitUsage},
		{[]string{"medium", "air", "--bogus"}, "unknown flag", ExitUsage},
		{[]string{"calc", "--length", "12", "--speed", "1m/s"}, "--length: length \"12\" has no unit; write it with one, for example 12mm", ExitUsage},
		{[]string{"calc", "--length", "-12mm", "--speed", "1m/s"}, "--length: length must be above 0 m, got -0.012 m", ExitUsage},
		{[]string{"calc", "--length", "12mm", "--speed", "0m/s"}, "--speed: speed must be above 0 m/s, got 0 m/s", ExitUsage},
		{[]string{"calc", "--length", "12mm", "--speed", "1m/s", "--shape", "blob"}, "unknown shape \"blob\"", ExitUsage},
		{[]string{"calc", "--length", "12mm"}, "--speed is required", ExitUsage},
		{[]string{"settle", "--diameter", "1mm", "--density", "998.206kg/m3", "--temp", "20C"}, "neither sinks nor rises", ExitFailure},
		{[]string{"settle", "--diameter", "1mm"}, "needs --diameter and --density", ExitUsage},
		{[]string{"medium", "air", "--temp", "20C", "--temp-offset", "5K"}, "either a temperature or an offset", ExitUsage},
		{[]string{"medium", "seawater", "--depth", "10m", "--pressure", "2bar"}, "either a depth or a pressure", ExitUsage},
		{[]string{"medium", "air", "--temp-offset", "5F"}, "give the offset in K or °C", ExitUsage},
		{[]string{"calc", "--length", "1mm", "--speed", "1mm/s", "--uncertainty", "bayes"}, "--uncertainty \"bayes\"", ExitUsage},
		{[]string{"sweep", "--length", "1mm", "--speed", "1mm/s"}, "sweep needs --vary", ExitUsage},
		{[]string{"sweep", "--vary", "shape=1:2", "--length", "1mm", "--speed", "1mm/s"}, "not a numeric input", ExitUsage},
		{[]string{"sweep", "--vary", "speed=1mm/s:0.1cm/s", "--length", "1mm", "--speed", "1mm/s"}, "from and to are the same", ExitUsage},
		{[]string{"tabulate", "../../../testdata/batch/lakeside.csv", "--by", "nonesuch"}, "--by: no column \"nonesuch\"", ExitUsage},
	}
	for _, c := range cases {
		_, errs, code := run(t, c.args...)
		if code != c.code || !strings.Contains(errs, c.want) || strings.Count(errs, "\n") != 1 || strings.Contains(errs, "goroutine") {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and one line containing %q", c.args, code, errs, c.code, c.want)
		}
	}
}

// A trout in 12 °C fresh water: JSON carries the documented names and
// values that follow from the inputs (St = fA/U = 4 × 0.06 / 0.6 = 0.4).
func TestCalcJSONFish(t *testing.T) {
	out, errs, code := run(t, "calc", "--length", "30cm", "--diameter", "5cm", "--speed", "2BL/s", "--freq", "4Hz",
		"--amplitude", "6cm", "--medium", "freshwater", "--temp", "12C", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := decode(t, out)
	if st := num(t, m, "strouhal"); math.Abs(st-0.4) > 1e-12 {
		t.Errorf("strouhal %g, want 0.4", st)
	}
	nu := num(t, m, "medium", "kinematic_viscosity_m2_s")
	if re := num(t, m, "reynolds"); math.Abs(re/(0.6*0.3/nu)-1) > 1e-12 {
		t.Errorf("reynolds %g", re)
	}
	drag := m["drag"].(map[string]any)
	if drag["law"] != "skin friction, turbulent on animal bodies" || len(drag["estimates"].([]any)) < 2 {
		t.Errorf("drag %v", drag)
	}
	if p := num(t, m, "power", "total_W"); math.Abs(p/(num(t, m, "drag", "force_N")*0.6)-1) > 1e-12 {
		t.Errorf("towing power %g", p)
	}
}

func TestCalcFlyerAndMicrobe(t *testing.T) {
	out, errs, code := run(t, "calc", "--length", "16cm", "--diameter", "3.5cm", "--speed", "10m/s", "--mass", "40g",
		"--span", "42cm", "--chord", "4cm", "--freq", "8Hz", "--amplitude", "20cm", "--medium", "air", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := decode(t, out)
	p := m["power"].(map[string]any)
	sum := p["induced_W"].(float64) + p["parasite_W"].(float64) + p["profile_W"].(float64)
	if p["kind"] != "flight" || math.Abs(sum/p["total_W"].(float64)-1) > 1e-12 {
		t.Errorf("flight power %v", p)
	}
	out, _, code = run(t, "calc", "--length", "2um", "--diameter", "1um", "--speed", "30um/s", "--temp", "25C", "--format", "json")
	m = decode(t, out)
	if code != 0 || m["regime"] != "viscous" || m["coasting_distance_m"] == nil || m["peclet"] == nil {
		t.Errorf("microbe: %s", out)
	}
	out, _, code = run(t, "calc", "--length", "2um", "--speed", "30um/s")
	if code != 0 || !strings.Contains(out, "Stokes") {
		t.Errorf("table: %s", out)
	}
	if strings.Contains(out, "NaN") {
		t.Errorf("NaN in output:\n%s", out)
	}
}

// A 20 µm quartz grain in water at 20 °C sinks at Stokes' speed
// (ρp − ρ) g d²/(18μ) (Stokes 1851) with ρ = 998.2067 kg/m³ (Tanaka et al.
// 2001) and μ = 1.0016 mPa·s (ISO/TR 3666:1998): 3.594e-4 m/s at Re ≈ 0.007,
// where the finite-Re correction is about 0.5 %; 1 % allowed.
func TestSettleJSON(t *testing.T) {
	out, errs, code := run(t, "settle", "--diameter", "20um", "--density", "2650kg/m3", "--temp", "20C", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := decode(t, out)
	stokes := (2650 - 998.2067) * 9.80665 * 20e-6 * 20e-6 / (18 * 1.0016e-3)
	if v := num(t, m, "terminal_speed_m_s"); m["direction"] != "sinking" || math.Abs(v/stokes-1) > 0.01 {
		t.Errorf("settle: %g m/s, Stokes %g m/s\n%s", v, stokes, out)
	}
	out, _, _ = run(t, "settle", "--diameter", "2mm", "--density", "0.9g/cm3", "--format", "json")
	if decode(t, out)["direction"] != "rising" {
		t.Errorf("oil drop: %s", out)
	}
}

func TestLawsListing(t *testing.T) {
	out, _, code := run(t, "laws")
	for _, w := range []string{"Stokes", "Proudman–Pearson", "standard drag curve", "Clift–Gauvin", "Lamb", "Cox", "ITTC-1957", "Hoerner"} {
		if code != 0 || !strings.Contains(out, w) {
			t.Errorf("laws lacks %q", w)
		}
	}
}

// batch writes its output atomically and rejects to a CSV file, and says
// with exit status 3 that rows were rejected.
func TestBatchFilesAndExitStatus(t *testing.T) {
	dir := t.TempDir()
	out, rej := dir+"/out.csv", dir+"/rej.csv"
	_, errs, code := run(t, "batch", "../../../testdata/batch/corrupt.csv", "-o", out, "--rejects", rej)
	if code != ExitRejected || !strings.Contains(errs, "10 rows read, 3 written, 7 rejected (in "+rej+")") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
	got, err := os.ReadFile(rej)
	if err != nil || !strings.HasPrefix(string(got), "line,row,column,reason,record\n3,2,length (mm),") {
		t.Errorf("rejects file: %v\n%s", err, got)
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 2 {
		t.Errorf("temporary files left behind: %v", entries)
	}
	// A failing run leaves no output file behind; a --column naming no
	// header is a header problem, exit 2 by the agreed exit-code table.
	bad := dir + "/never.csv"
	_, _, code = run(t, "batch", "../../../testdata/batch/corrupt.csv", "-o", bad, "--column", "length=nope")
	if _, err := os.Stat(bad); code != ExitUsage || err == nil {
		t.Errorf("failed run: exit %d, output exists: %v", code, err == nil)
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 2 {
		t.Errorf("temporary files left behind after failure: %v", entries)
	}
}

func TestBatchUsageErrors(t *testing.T) {
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"batch"}, "needs one argument"},
		{[]string{"batch", "../../../testdata/batch/corrupt.csv", "--unit", "length=parsec"}, "not a unit of length"},
		{[]string{"batch", "../../../testdata/batch/corrupt.csv", "--format", "xlsx"}, "--format \"xlsx\""},
		{[]string{"batch", "../../../testdata/batch/corrupt.csv", "--speed", "3"}, "--speed: speed \"3\" has no unit"},
		{[]string{"batch", "no-such-file.csv"}, "cannot read no-such-file.csv"},
		{[]string{"batch", "../../../testdata/batch/corrupt.csv", "-o", filepath.Join(t.TempDir(), "gone", "out.csv")}, "gone does not exist"},
	}
	for _, c := range cases {
		_, errs, code := run(t, c.args...)
		if code == 0 || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d, stderr %q, want %q", c.args, code, errs, c.want)
		}
	}
}

// fit → medium file → every command: the JSON names scripts read, and the
// values that follow from the saved model (Herschel–Bulkley mud: a 1 mm
// sand grain is held by the yield stress, Beris et al. 1985).
func TestFitSaveAndUseMedium(t *testing.T) {
	dir := t.TempDir()
	file := dir + "/mud.json"
	out, errs, code := run(t, "fit", "../../../testdata/rheology/mud_herschel_bulkley.csv", "--density", "1300kg/m3", "--name", "mud", "--save", file, "--format", "json")
	if code != 0 {
		t.Fatalf("fit: exit %d: %s", code, errs)
	}
	m := decode(t, out)
	if m["class"] != "yield-stress" || m["best"] != "herschel-bulkley" {
		t.Errorf("class %v, best %v", m["class"], m["best"])
	}
	models := m["models"].([]any)
	if len(models) != 8 {
		t.Fatalf("%d models", len(models))
	}
	for _, mm := range models {
		o := mm.(map[string]any)
		for _, k := range []string{"model", "parameters", "standard_errors", "r_squared", "rms_relative_error", "aicc"} {
			if _, ok := o[k]; !ok {
				t.Errorf("model %v lacks %q", o["model"], k)
			}
		}
	}
	out, errs, code = run(t, "medium", file, "--format", "json")
	if code != 0 || !strings.Contains(out, `"model": "herschel-bulkley"`) {
		t.Errorf("medium FILE: exit %d %s %s", code, errs, out)
	}
	out, _, code = run(t, "settle", "--diameter", "1mm", "--density", "2650kg/m3", "--medium", file, "--format", "json")
	s := decode(t, out)
	if code != 0 || s["direction"] != "held" || num(t, s, "terminal_speed_m_s") != 0 {
		t.Errorf("settle in mud: %s", out)
	}
	out, _, code = run(t, "calc", "--length", "2cm", "--diameter", "4mm", "--speed", "1mm/s", "--medium", file, "--format", "json")
	c := decode(t, out)
	if code != 0 || c["bingham_number"] == nil || c["generalized_reynolds"] == nil {
		t.Fatalf("calc in mud: %s", out)
	}
	if g := num(t, c, "medium", "shear_rate_1_s"); math.Abs(g-0.05) > 1e-12 {
		t.Errorf("shear rate %g, want U/L = 0.05 1/s", g)
	}
	if !strings.Contains(out, "extrapolated") {
		t.Errorf("no extrapolation warning at 0.05 1/s below the measured 0.1 1/s")
	}
}

func TestBadMediumFilesAndTables(t *testing.T) {
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"medium", "../../../testdata/media/truncated.json"}, "medium file"},
		{[]string{"medium", "../../../testdata/media/wrongformat.json"}, "not a medium file"},
		{[]string{"medium", "../../../testdata/media/newer.json"}, "newer than this flowregime reads"},
		{[]string{"medium", "../../../testdata/media/unknownfield.json"}, "unknown field \"colour\""},
		{[]string{"medium", "../../../testdata/media/badparam.json"}, "\"flow_index\" must be positive"},
		{[]string{"medium", "../../../testdata/media/badmodel.json"}, "unknown rheology model \"maxwell\""},
		{[]string{"medium", "../../../testdata/media/missing.json"}, "cannot read medium file"},
		{[]string{"calc", "--length", "1mm", "--speed", "1mm/s", "--medium", "../../../testdata/media/wrongformat.json"}, "not a medium file"},
		{[]string{"fit", "../../../testdata/rheology/bad_nostress.csv"}, "no shear-stress or viscosity column"},
		{[]string{"fit", "../../../testdata/rheology/bad_value.csv"}, "line 3, column \"shear rate (1/s)\""},
		{[]string{"fit", "../../../testdata/rheology/honey.csv", "--save", "x.json"}, "--save needs the fluid's --density"},
	}
	for _, c := range cases {
		_, errs, code := run(t, c.args...)
		if code == 0 || !strings.Contains(errs, c.want) || strings.Count(errs, "\n") != 1 {
			t.Errorf("%v: exit %d, stderr %q; want one line containing %q", c.args, code, errs, c.want)
		}
	}
}

// A sweep's changes of law and regime sit where the laws' published ranges
// and the regime boundaries put them: Stokes ends at Re = 0.1 (its range),
// the viscous regime at Re = 1.
func TestSweepBoundaries(t *testing.T) {
	out, errs, code := run(t, "sweep", "--vary", "speed=10um/s:1m/s", "--log", "--steps", "60", "--length", "1mm", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var res struct {
		Points []struct {
			Reynolds float64 `json:"reynolds"`
			Regime   string  `json:"regime"`
			Law      string  `json:"drag_law"`
			Change   string  `json:"change"`
		} `json:"points"`
	}
	if err := json.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	var stokesMax float64
	for _, l := range regime.Laws() {
		if l.Name == "Stokes" {
			stokesMax = l.ChooseHi // where the sweep must mark the hand-over
		}
	}
	seenLaw, seenRegime := false, false
	for i, p := range res.Points[1:] {
		prev := res.Points[i]
		if strings.Contains(p.Change, "law Stokes →") {
			seenLaw = true
			if !(prev.Reynolds <= stokesMax && p.Reynolds > stokesMax) {
				t.Errorf("Stokes ends between Re %g and %g, not at %g", prev.Reynolds, p.Reynolds, stokesMax)
			}
		}
		if strings.Contains(p.Change, "regime viscous → intermediate") {
			seenRegime = true
			if !(prev.Reynolds < 1 && p.Reynolds >= 1) {
				t.Errorf("viscous regime ends between Re %g and %g, not at 1", prev.Reynolds, p.Reynolds)
			}
		}
	}
	if !seenLaw || !seenRegime {
		t.Errorf("changes not marked: law %v, regime %v\n%s", seenLaw, seenRegime, out)
	}
}

// On a U-shaped flight power curve the maximum-range speed lies above the
// minimum-power speed, and hovering costs more than flying at the
// minimum-power speed (Pennycuick 2008, Modelling the Flying Bird, recalled
// from memory); a swimmer is refused.
func TestPowerCurveCommand(t *testing.T) {
	out, errs, code := run(t, "powercurve", "--length", "16cm", "--diameter", "3.5cm", "--mass", "40g", "--span", "42cm", "--chord", "4cm", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := decode(t, out)
	vmp, vmr := num(t, m, "min_power_speed_m_s"), num(t, m, "max_range_speed_m_s")
	if !(vmp > 0.5 && vmr > vmp && num(t, m, "hover_W") > num(t, m, "min_power_W")) {
		t.Errorf("V_mp %g, V_mr %g: %s", vmp, vmr, out)
	}
	_, errs, code = run(t, "powercurve", "--length", "16cm", "--medium", "freshwater")
	if code != ExitUsage || !strings.Contains(errs, "needs a flyer in air") {
		t.Errorf("swimmer power curve: exit %d, %s", code, errs)
	}
}

func TestCalcUncertaintyJSON(t *testing.T) {
	out, errs, code := run(t, "calc", "--length", "1mm±10%", "--speed", "1±0.1mm/s", "--draws", "2000", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := decode(t, out)
	u, ok := m["uncertainty"].(map[string]any)
	if !ok {
		t.Fatalf("no uncertainty object: %s", out)
	}
	for _, k := range []string{"method", "draws", "seed", "reynolds", "strouhal", "drag_N", "power_W", "regime_probability", "drag_law_probability"} {
		if _, ok := u[k]; !ok {
			t.Errorf("uncertainty lacks %q", k)
		}
	}
	lo, hi := num(t, m, "uncertainty", "reynolds", "low95"), num(t, m, "uncertainty", "reynolds", "high95")
	if re := num(t, m, "reynolds"); !(lo < re && re < hi) {
		t.Errorf("Re %g outside [%g, %g]", re, lo, hi)
	}
	again, _, _ := run(t, "calc", "--length", "1mm±10%", "--speed", "1±0.1mm/s", "--draws", "2000", "--format", "json")
	if again != out {
		t.Error("same seed gave different output")
	}
}

// The standard-atmosphere temperature plus an offset: USSA-76 gives
// 15 °C at sea level, so --temp-offset 5K makes 20 °C.
func TestTemperatureOffset(t *testing.T) {
	out, _, code := run(t, "medium", "air", "--temp-offset", "5K", "--format", "json")
	if code != 0 || math.Abs(num(t, decode(t, out), "temperature_C")-20) > 1e-9 {
		t.Errorf("offset: %s", out)
	}
}

func TestTabulateJSON(t *testing.T) {
	out, errs, code := run(t, "tabulate", "../../../testdata/batch/lakeside.csv", "--by", "taxon", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var groups []map[string]any
	if err := json.Unmarshal([]byte(out), &groups); err != nil || len(groups) != 9 {
		t.Fatalf("%v, %d groups", err, len(groups))
	}
	for _, k := range []string{"group", "rows", "statistics", "regime_share", "fits"} {
		if _, ok := groups[0][k]; !ok {
			t.Errorf("group lacks %q", k)
		}
	}
}

// A grain held by a yield stress is reported as held with exit 0, not as a
// non-finite drag coefficient. The estuary-mud fixture's Herschel–Bulkley
// fit gives τ_y ≈ 12 Pa; a 1 mm quartz grain (2650 kg/m³) then has
// Y_g = 3τ_y/(d Δρ g) ≈ 2.7, above Beris et al.'s (1985) critical 0.143.
func TestSettleHeldByYieldStress(t *testing.T) {
	dir := t.TempDir()
	mud := filepath.Join(dir, "mud.json")
	if _, errs, code := run(t, "fit", "../../../testdata/rheology/mud_herschel_bulkley.csv", "--density", "1300kg/m3", "--save", mud); code != ExitOK {
		t.Fatalf("fit: exit %d: %s", code, errs)
	}
	out, errs, code := run(t, "settle", "--medium", mud, "--diameter", "1mm", "--density", "2.65g/cm3", "--format", "json")
	if code != ExitOK {
		t.Fatalf("settle: exit %d: %s", code, errs)
	}
	var r struct {
		Speed     float64 `json:"terminal_speed_m_s"`
		Direction string  `json:"direction"`
		Y         float64 `json:"yield_parameter"`
	}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatal(err)
	}
	if r.Direction != "held" || r.Speed != 0 || !(r.Y > 0.143) {
		t.Errorf("got %+v, want held with Y_g above 0.143", r)
	}
}

// fit never prints NaN or Inf, in any format, on any shipped flow curve:
// a parameter without a standard error is said so in words (the README's
// guarantee; a warning once printed "standard error NaN").
func TestFitPrintsNoNaN(t *testing.T) {
	files, _ := filepath.Glob("../../../testdata/rheology/*.csv")
	if len(files) == 0 {
		t.Fatal("no rheology fixtures")
	}
	for _, f := range files {
		if strings.HasPrefix(filepath.Base(f), "bad_") { // the refused fixtures
			continue
		}
		for _, format := range []string{"table", "json", "csv"} {
			out, errs, code := run(t, "fit", f, "--format", format)
			if code != ExitOK {
				t.Errorf("%s %s: exit %d: %s", f, format, code, errs)
				continue
			}
			for _, bad := range []string{"NaN", "Inf"} {
				if strings.Contains(out+errs, bad) {
					t.Errorf("%s --format %s prints %q", filepath.Base(f), format, bad)
				}
			}
		}
	}
}

// A misspelled medium is a usage mistake (exit 2) in every single-case
// command, as the README's exit-status table says (a new user's `--medium
// sea` exited 1).
func TestUnknownMediumIsUsage(t *testing.T) {
	for _, args := range [][]string{
		{"calc", "--length", "1cm", "--speed", "1cm/s", "--medium", "sea"},
		{"medium", "sea"},
		{"settle", "--diameter", "1mm", "--density", "2g/cm3", "--medium", "sea"},
		{"sweep", "--vary", "temperature=0C:30C", "--steps", "3", "--length", "2mm", "--speed", "5mm/s", "--medium", "sea"},
	} {
		if _, errs, code := run(t, args...); code != ExitUsage || !strings.Contains(errs, `unknown medium "sea"`) {
			t.Errorf("%v: exit %d, %q", args, code, errs)
		}
	}
}

// A sweep in which no step can be computed is one error with exit 1, not a
// table of failures with exit 0.
func TestSweepNothingComputed(t *testing.T) {
	out, errs, code := run(t, "sweep", "--vary", "length=1e300m:1e305m", "--steps", "3", "--speed", "5mm/s")
	if code != ExitFailure || out != "" || !strings.Contains(errs, "no step could be computed") {
		t.Errorf("exit %d, stdout %q, stderr %q", code, out, errs)
	}
}

// settle's table names the defaults that changed its result, as calc's
// does (a new user found sea water's 35 g/kg used without a word).
func TestSettleTableListsAssumptions(t *testing.T) {
	out, errs, code := run(t, "settle", "--diameter", "150um", "--density", "1.06g/cm3", "--medium", "seawater", "--temp", "10C")
	if code != ExitOK || !strings.Contains(out, "Assumed (defaults that changed the result)") || !strings.Contains(out, "salinity=35g/kg") {
		t.Errorf("exit %d, stderr %q, stdout:\n%s", code, errs, out)
	}
}

// A body with a stroke but no diameter or shape is taken as a sphere as wide
// as it is long, and that is a flag (geometry), not only an assumption: a
// new user's 32 cm trout at 2.1 BL/s got 8.98 N as a sphere against 0.077 N
// with its 6 cm body depth. A body without a stroke (a copepod's body here)
// keeps the plain assumption.
func TestSphereForStrokerIsFlagged(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "sheet.csv")
	sheet := "Species,TL (cm),BD (cm),Swim speed (BL/s),TBF (Hz)\ntrout,32,,2.1,3\ntrout,32,6,2.1,3\ncopepod,0.1,,3,\n"
	if err := os.WriteFile(in, []byte(sheet), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := run(t, "batch", in, "-q")
	if code != ExitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(recs) != 4 {
		t.Fatalf("%v: %q", err, out)
	}
	col := map[string]int{}
	for i, h := range recs[0] {
		col[h] = i
	}
	for i, want := range []bool{true, false, false} {
		got := strings.Contains(recs[i+1][col["flags"]], "geometry")
		if got != want {
			t.Errorf("row %d (%s): geometry flag %v, want %v (flags %q)", i+1, recs[i+1][0], got, want, recs[i+1][col["flags"]])
		}
	}
	if !strings.Contains(recs[1][col["flag_reasons"]], "taken as a sphere's diameter") {
		t.Errorf("reason %q", recs[1][col["flag_reasons"]])
	}
}

// A weak scaling fit carries a caution, and its ratio is the identity
// b_SMA = b_OLS/|r| (the SMA slope is sign(r) s_y/s_x, the least-squares one r s_y/s_x: Warton et al. 2006, Biol. Rev. 81, 259),
// checked on weakly related points; a strong fit says nothing.
func TestWeakScalingFitCaution(t *testing.T) {
	xs := []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10}
	ys := []float64{3, 1, 4, 1, 5, 9, 2, 6, 5, 3}
	fit := tabulate.ScalingFit(xs, ys)
	law := strings.Join(scalingLaw("g", tabulate.FitResult{Pair: tabulate.Pair{Y: "y", X: "x"}, Fit: fit}, nil), "\n")
	if fit.R2 < weakFit {
		want := report.Num(1/math.Sqrt(fit.R2), 3) + " times"
		if !strings.Contains(law, "weak relation") || !strings.Contains(law, want) {
			t.Errorf("r² %.3g: %q lacks the caution with %q", fit.R2, law, want)
		}
		if got := fit.SMASlope / fit.OLSSlope; math.Abs(math.Abs(got)-1/math.Sqrt(fit.R2)) > 1e-9 {
			t.Errorf("SMA/OLS = %g, want 1/|r| = %g", got, 1/math.Sqrt(fit.R2))
		}
	} else {
		t.Fatalf("test points are not weak: r² %g", fit.R2)
	}
	strong := tabulate.ScalingFit(xs, []float64{1, 2.1, 2.9, 4.2, 5, 5.8, 7.1, 8, 9.2, 9.9})
	if law := strings.Join(scalingLaw("g", tabulate.FitResult{Fit: strong}, nil), "\n"); strings.Contains(law, "weak") {
		t.Errorf("strong fit (r² %g) cautioned: %q", strong.R2, law)
	}
}

// panicReader stands in for a bug met while reading.
type panicReader struct{}

func (panicReader) Read([]byte) (int, error) { panic("boom") }

// A panic in a command is a bug, never the input's fault: Main reports it
// in one line with exit 1 instead of crashing, and replaces no file.
func TestPanicIsOneLine(t *testing.T) {
	var out, errb bytes.Buffer
	code := Main([]string{"fit", "-"}, Streams{In: panicReader{}, Out: &out, Err: &errb})
	msg := errb.String()
	if code != ExitFailure || strings.Count(msg, "\n") != 1 || !strings.Contains(msg, "internal error (boom)") || !strings.Contains(msg, "no output file was replaced") {
		t.Errorf("exit %d, stderr %q", code, msg)
	}
}
