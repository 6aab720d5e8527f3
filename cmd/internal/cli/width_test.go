package cli

import (
	"strings"
	"testing"

	"github.com/mattn/go-runewidth"
)

// widthCases are the commands whose human output was checked at 80 and
// 120 columns: every one with a table, and the demo.
var widthCases = [][]string{
	{"medium", "air", "--altitude", "2500m", "--humidity", "60%"},
	{"medium", "freshwater", "--temp", "4C", "--depth", "30m"},
	{"calc", "--length", "16cm", "--diameter", "3.5cm", "--speed", "10m/s", "--mass", "40g", "--span", "42cm", "--chord", "4cm", "--freq", "8Hz", "--amplitude", "20cm", "--medium", "air", "--altitude", "500m"},
	{"calc", "--length", "1.2mm±0.1mm", "--speed", "3mm/s±20%", "--temp", "12±1C", "--medium", "seawater", "--draws", "500"},
	{"settle", "--diameter", "150um", "--density", "1.06g/cm3", "--medium", "seawater", "--temp", "10C"},
	{"laws"},
	{"sweep", "--vary", "temperature=0C:30C", "--steps", "31", "--length", "2mm", "--speed", "5mm/s"},
	{"powercurve", "--length", "16cm", "--diameter", "3.5cm", "--mass", "40g", "--span", "42cm", "--chord", "4cm", "--freq", "8Hz", "--amplitude", "20cm"},
	{"fit", "../../../testdata/rheology/mucus_powerlaw.csv"},
	{"scalemodel", "--length", "1mm", "--speed", "1cm/s", "--freq", "20Hz", "--amplitude", "0.5mm", "--medium", "seawater", "--model-length", "10cm", "--model-speed", "5cm/s"},
	{"demo"},
	{"batch", lakesideCSV, "--format", "table", "-q"},
	{"tabulate", lakesideCSV, "--by", "taxon", "--fit", "power_W=mass", "--fit", "mass=length"},
	{"columns"},
	{"reduce", "../../../testdata/rheometry/snail_couette.csv", "--geometry", "couette", "--bob-radius", "12.5mm", "--cup-radius", "13.6mm", "--bob-length", "37.5mm", "--fit"},
}

// At 80 and 120 columns no line of any command's output is wider than the
// terminal (display width as go-runewidth counts it); without a width the
// same outputs have lines of up to 599 columns (laws), so the check can
// fail.
func TestEveryTableFitsTheWidth(t *testing.T) {
	widest := 0
	for _, args := range widthCases {
		for _, width := range []string{"80", "120", "0"} {
			out, errs, code := run(t, append(append([]string{}, args...), "--width", width)...)
			if code != 0 {
				t.Errorf("%v --width %s: exit %d: %s", args, width, code, errs)
				continue
			}
			for line := range strings.SplitSeq(out, "\n") {
				w := runewidth.StringWidth(line)
				if width == "0" {
					widest = max(widest, w)
					continue
				}
				if limit := map[string]int{"80": 80, "120": 120}[width]; w > limit {
					t.Errorf("%v at %s columns: a line of %d: %q", args, width, w, line)
					break
				}
			}
		}
	}
	if widest <= 120 {
		t.Errorf("unfitted outputs are at most %d columns wide: the check proves nothing", widest)
	}
}

// COLUMNS sets the width when --width is not given; --width below 20 is a
// usage error.
func TestWidthFromColumns(t *testing.T) {
	t.Setenv("COLUMNS", "80")
	out, _, code := run(t, "laws")
	for line := range strings.SplitSeq(out, "\n") {
		if runewidth.StringWidth(line) > 80 {
			t.Fatalf("exit %d; COLUMNS=80 ignored: %q", code, line)
		}
	}
	if _, errs, code := run(t, "laws", "--width", "10"); code != ExitUsage || !strings.Contains(errs, "--width 10") {
		t.Errorf("--width 10: exit %d, %s", code, errs)
	}
}
