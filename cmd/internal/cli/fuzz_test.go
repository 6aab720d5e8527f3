package cli

import (
	"bytes"
	"strings"
	"testing"
)

// FuzzCommandLine runs calc, settle and medium with arbitrary flag values:
// no input may panic, and a failure is one line on stderr.
func FuzzCommandLine(f *testing.F) {
	f.Add("calc", "12mm", "0.4m/s", "12C", "sphere")
	f.Add("calc", "1e300m", "1e300m/s", "-273C", "rod")
	f.Add("settle", "1mm±1mm", "2g/cm3", "4C", "spheroid")
	f.Add("medium", "±", "+-", "1e-320K", "")
	f.Fuzz(func(t *testing.T, cmd, a, b, temp, shape string) {
		var args []string
		switch cmd {
		case "settle":
			args = []string{"settle", "--diameter", a, "--density", b, "--temp", temp, "--shape", shape}
		case "medium":
			args = []string{"medium", "seawater", "--temp", temp, "--salinity", a, "--depth", b}
		default:
			args = []string{"calc", "--length", a, "--speed", b, "--temp", temp, "--shape", shape, "--format", "json"}
		}
		var out, errb bytes.Buffer
		code := Main(args, Streams{In: strings.NewReader(""), Out: &out, Err: &errb})
		if code != 0 && strings.Count(errb.String(), "\n") != 1 {
			t.Fatalf("%v: exit %d with stderr %q", args, code, errb.String())
		}
		if code == 0 && strings.Contains(out.String(), "NaN") {
			t.Fatalf("%v: NaN in output", args)
		}
	})
}
