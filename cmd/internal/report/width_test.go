package report

import (
	"bytes"
	"regexp"
	"strings"
	"testing"

	"github.com/mattn/go-runewidth"
)

// wide is a table far wider than a terminal: 9 columns of headers with
// units and cells of a value with its interval.
func wide() ([]string, [][]string) {
	h := []string{"group", "rows", "Reynolds number", "Strouhal number", "drag (N)", "power (W)", "viscous (%)", "intermediate (%)", "inertial (%)"}
	r := []string{"common tern", "35", "1.91e+05 [1.06e+05–3.61e+05]", "0.244 [0.167–0.315]", "0.0109 [0.00389–0.035]", "0.562 [0.259–1.23]", "0", "0", "100"}
	return h, [][]string{r, r}
}

// Every table fits the width it is given (the bound itself is the check)
// and keeps every word of every header and cell.
func TestTableFitsWidth(t *testing.T) {
	h, rows := wide()
	for _, width := range []int{20, 40, 80, 120, 200} {
		var b bytes.Buffer
		if err := TableWidth(&b, width, h, rows); err != nil {
			t.Fatal(err)
		}
		out := b.String()
		for line := range strings.SplitSeq(out, "\n") {
			if w := runewidth.StringWidth(line); w > width {
				t.Errorf("width %d: line of %d columns: %q", width, w, line)
			}
		}
		if width < 40 {
			continue // words longer than half the width are cut
		}
		for _, s := range append(append([]string{}, h...), rows[0]...) {
			for _, word := range strings.Fields(s) {
				if !strings.Contains(out, word) {
					t.Errorf("width %d: %q is missing", width, word)
				}
			}
		}
	}
}

// Without a width the table is the single aligned table it always was.
func TestTableNoLimitUnchanged(t *testing.T) {
	h, rows := wide()
	var fitted, plain bytes.Buffer
	if err := TableWidth(&fitted, 0, h, rows); err != nil {
		t.Fatal(err)
	}
	if err := render(&plain, h, rows); err != nil {
		t.Fatal(err)
	}
	if fitted.String() != plain.String() || widest(plain.String()) < 150 {
		t.Errorf("no-limit output changed or is not the wide table (%d columns)", widest(plain.String()))
	}
}

// At 120 columns the headers break at their spaces before the table turns
// vertical; at 24 the layout is vertical, one "header  value" line each.
func TestTableLayouts(t *testing.T) {
	h := []string{"speed (m/s)", "sink speed (m/s)", "glide ratio"}
	rows := [][]string{{"8", "0.71", "11.3"}}
	var b bytes.Buffer
	if err := TableWidth(&b, 30, h, rows); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "sink") || strings.Contains(b.String(), "sink speed (m/s)") {
		t.Errorf("at 30 columns the header should break:\n%s", b.String())
	}
	b.Reset()
	if err := TableWidth(&b, 24, h, rows); err != nil {
		t.Fatal(err)
	}
	if !regexp.MustCompile(`(?m)^glide ratio +11\.3$`).MatchString(b.String()) {
		t.Errorf("at 24 columns the layout should be vertical:\n%s", b.String())
	}
}
