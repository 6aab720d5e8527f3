package cli

import (
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// Extreme inputs through every command: a value beyond the range of
// binary64 numbers (IEEE 754-2019) is exit 1 with the input named; a
// non-positive size, speed, mass or frequency given as a flag is a usage
// error (exit 2) naming the flag; conditions beyond a medium method's
// physical range are exit 1 naming the condition and the accepted range.
// Every error is one line, and nothing is printed on stdout.
func TestExtremeInputsExitCodes(t *testing.T) {
	cases := []struct {
		args []string
		want string
		code int
	}{
		{[]string{"calc", "--length", "1e308m", "--speed", "1m/s"}, "length 1e+308 m is too large: the Reynolds number overflows", ExitFailure},
		{[]string{"calc", "--length", "1e-300m", "--speed", "1m/s", "--format", "json"}, "length 1e-300 m is too small: the drag underflows to zero", ExitFailure},
		{[]string{"calc", "--length", "1cm", "--speed", "1e300m/s", "--format", "csv"}, "speed 1e+300 m/s is too large", ExitFailure},
		{[]string{"calc", "--length", "1cm", "--speed", "0.1m/s", "--freq", "1e308Hz", "--amplitude", "1m"}, "frequency 1e+308 Hz is too large: the Strouhal number overflows", ExitFailure},
		{[]string{"calc", "--length", "1e308m", "--speed", "10BL/s"}, "length 1e+308 m is too large: the speed overflows", ExitFailure},
		{[]string{"calc", "--length", "1cm", "--speed", "0m/s"}, "--speed: speed must be above 0 m/s, got 0 m/s", ExitUsage},
		{[]string{"calc", "--length", "0m", "--speed", "1m/s"}, "--length: length must be above 0 m", ExitUsage},
		{[]string{"calc", "--length", "1cm", "--diameter", "-1mm", "--speed", "1m/s"}, "--diameter: diameter must be above 0 m", ExitUsage},
		{[]string{"calc", "--length", "1cm", "--speed", "1m/s", "--mass", "0g"}, "--mass: mass must be above 0 kg", ExitUsage},
		{[]string{"calc", "--length", "1cm", "--speed", "1m/s", "--freq", "0Hz"}, "--freq: frequency must be above 0 Hz", ExitUsage},
		{[]string{"calc", "--length", "1cm", "--speed", "1m/s", "--efficiency", "1.5"}, "--efficiency: efficiency must be in (0, 1]", ExitUsage},
		{[]string{"calc", "--length", "1cm", "--speed", "1m/s", "--temp", "120C"}, "above its boiling point", ExitFailure},
		{[]string{"calc", "--length", "1cm", "--speed", "1m/s", "--pressure", "700MPa"}, "pressure 700 MPa is above 200 MPa", ExitFailure},
		{[]string{"settle", "--diameter", "0m", "--density", "2g/cm3"}, "--diameter: must be above 0 m", ExitUsage},
		{[]string{"settle", "--diameter", "1mm", "--density", "-2g/cm3"}, "--density: must be above 0 kg/m³", ExitUsage},
		{[]string{"settle", "--diameter", "1e308m", "--density", "2g/cm3"}, "outside 1e-14 < Re < 1e8", ExitFailure},
		{[]string{"settle", "--diameter", "1mm", "--density", "2g/cm3", "--depth", "50km", "--medium", "seawater"}, "depth 50000 m is beyond the deepest accepted, 12000 m", ExitFailure},
		{[]string{"sweep", "--vary", "speed=0m/s:1m/s", "--length", "1cm"}, "--vary speed: speed must be above 0 m/s", ExitUsage},
		{[]string{"sweep", "--vary", "length=1cm:2cm", "--speed", "0m/s"}, "--speed: speed must be above 0 m/s", ExitUsage},
		{[]string{"sweep", "--vary", "mass=-1g:2g", "--length", "1cm", "--speed", "1m/s"}, "--vary mass: mass must be above 0 kg", ExitUsage},
		{[]string{"powercurve", "--length", "10cm", "--mass", "40g", "--span", "30cm", "--from", "0m/s", "--to", "20m/s"}, "0 m/s < from < to", ExitUsage},
		{[]string{"powercurve", "--length", "10cm", "--mass", "0g", "--span", "30cm"}, "--mass: mass must be above 0 kg", ExitUsage},
		{[]string{"powercurve", "--length", "10cm", "--mass", "1e308kg", "--span", "30cm", "--from", "1m/s", "--to", "20m/s"}, "mass 1e+308 kg is too large", ExitFailure},
		{[]string{"medium", "freshwater", "--pressure", "7e8Pa"}, "fresh-water pressure 700 MPa is above 200 MPa", ExitFailure},
		{[]string{"medium", "freshwater", "--depth", "1000km", "--format", "json"}, "depth 1e+06 m is beyond the deepest accepted, 12000 m", ExitFailure},
		{[]string{"medium", "seawater", "--depth", "50km", "--format", "csv"}, "depth 50000 m is beyond the deepest accepted, 12000 m", ExitFailure},
		{[]string{"medium", "air", "--temp", "1e5C"}, "not physical", ExitFailure},
		{[]string{"calc", "--length", "2cm", "--speed", "400mm/s±1g"}, `--speed: speed "400mm/s±1g": the uncertainty's unit "g" is not a unit of speed`, ExitUsage},
		{[]string{"calc", "--length", "2cm", "--speed", "0.4m/s", "--temp", "290±0.5K"}, "--temp: temperature \"290±0.5K\": the value has no unit but its uncertainty is in K", ExitUsage},
	}
	for _, c := range cases {
		out, errs, code := run(t, c.args...)
		if code != c.code || !strings.Contains(errs, c.want) || strings.Count(errs, "\n") != 1 || out != "" {
			t.Errorf("%v: exit %d, stdout %q, stderr %q; want exit %d and one line containing %q", c.args, code, out, errs, c.code, c.want)
		}
	}
}

// An uncertainty flag in a unit of its own is converted, not used to reread
// the value: --speed 400mm/s±1cm/s and --speed 0.4m/s±10mm/s give the same
// linear propagation (1 cm = 10 mm, SI Brochure, 9th ed.).
func TestUncertaintyFlagUnits(t *testing.T) {
	a, errA, codeA := run(t, "calc", "--length", "2cm", "--speed", "400mm/s±1cm/s", "--uncertainty", "linear", "--format", "json")
	b, errB, codeB := run(t, "calc", "--length", "2cm", "--speed", "0.4m/s±10mm/s", "--uncertainty", "linear", "--format", "json")
	// The echoed inputs keep the text as given; all else must agree, and
	// the speed's SD resolve to the same 0.01 m/s.
	ja, jb := decode(t, a), decode(t, b)
	sa, sb := ja["inputs"].(map[string]any)["speed"].(map[string]any), jb["inputs"].(map[string]any)["speed"].(map[string]any)
	delete(ja, "inputs")
	delete(jb, "inputs")
	if codeA != 0 || codeB != 0 || !reflect.DeepEqual(ja, jb) || math.Abs(sa["sd"].(float64)-0.01) > 1e-12 || math.Abs(sb["sd"].(float64)-0.01) > 1e-12 {
		t.Fatalf("exit %d %q / %d %q; outputs differ:\n%s\n%s", codeA, errA, codeB, errB, a, b)
	}
	if re := num(t, decode(t, a), "reynolds"); math.Abs(re/(0.4*0.02/1.0034e-6)-1) > 1e-3 {
		t.Errorf("Re %g, want about 7973 for 0.4 m/s on 2 cm in 20 °C water", re)
	}
}

// A batch row whose result would leave the range of numbers is a reject
// with its reason, not a row of empty cells; the other rows are written.
func TestBatchNonFiniteRowsRejected(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "in.csv")
	data := "id,length (m),speed (m/s),frequency (Hz),amplitude (m)\n" +
		"ok,0.3,0.6,4,0.06\n" +
		"huge,1e308,1,,\n" +
		"tiny,1e-300,1,,\n" +
		"fast,0.01,1e300,,\n" +
		"stroke,0.01,0.1,1e308,1\n" +
		"still,0.3,0,,\n"
	if err := os.WriteFile(in, []byte(data), 0o644); err != nil {
		t.Fatal(err)
	}
	out, rej := filepath.Join(dir, "out.csv"), filepath.Join(dir, "rej.csv")
	_, errs, code := run(t, "batch", in, "-o", out, "--rejects", rej)
	if code != ExitRejected || !strings.Contains(errs, "6 rows read, 1 written, 5 rejected") {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	got, err := os.ReadFile(rej)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{
		"length 1e+308 m is too large: the Reynolds number overflows",
		"length 1e-300 m is too small: the drag underflows to zero",
		"speed 1e+300 m/s is too large",
		"frequency 1e+308 Hz is too large: the Strouhal number overflows",
		`column ""speed (m/s)"": speed must be above 0 m/s, got 0 m/s`,
	} {
		if !strings.Contains(string(got), want) {
			t.Errorf("rejects lack %q:\n%s", want, got)
		}
	}
}
