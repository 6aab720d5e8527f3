package cli

import (
	"strings"
	"testing"
)

// TestUncertaintyNeverDropped: commands that do not propagate an
// uncertainty refuse it out loud (exit 2, one line naming the flag) instead
// of computing as if it were not there; without the ± they run.
func TestUncertaintyNeverDropped(t *testing.T) {
	for _, c := range []struct {
		args []string
		flag string
	}{
		{[]string{"medium", "freshwater", "--temp", "12±1"}, "--temp"},
		{[]string{"settle", "--diameter", "1±0.1mm", "--density", "2650kg/m3", "--medium", "freshwater"}, "--diameter"},
		{[]string{"settle", "--diameter", "1mm", "--density", "2650kg/m3", "--medium", "freshwater", "--temp", "12±1"}, "--temp"},
		{[]string{"sweep", "--length", "30cm", "--speed", "1m/s", "--vary", "temperature=5C:25C", "--medium", "freshwater", "--diameter", "5±1cm"}, "--diameter"},
		{[]string{"sweep", "--length", "30cm", "--speed", "1m/s", "--vary", "temperature=5±1C:25C", "--medium", "freshwater"}, "--vary"},
		{[]string{"powercurve", "--mass", "40g", "--span", "42±1cm", "--length", "16cm", "--diameter", "3.5cm"}, "--span"},
		{[]string{"powercurve", "--mass", "40g", "--span", "42cm", "--length", "16cm", "--diameter", "3.5cm", "--from", "2±1m/s", "--to", "10m/s"}, "--from"},
	} {
		_, stderr, code := run(t, c.args...)
		if code != ExitUsage || !strings.Contains(stderr, c.flag) || !strings.Contains(stderr, "uncertainty (±)") || strings.Count(stderr, "\n") != 1 {
			t.Errorf("%v: exit %d, stderr %q; want exit 2 naming %s", c.args, code, stderr, c.flag)
		}
		plain := make([]string, len(c.args))
		for i, a := range c.args {
			plain[i] = strings.NewReplacer("±0.1mm", "mm", "±1cm", "cm", "±1m/s", "m/s", "±1C", "C", "±1", "").Replace(a)
		}
		if _, stderr, code := run(t, plain...); code != ExitOK {
			t.Errorf("%v: exit %d, %s", plain, code, stderr)
		}
	}
}
