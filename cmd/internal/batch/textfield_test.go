package batch

import (
	"encoding/csv"
	"slices"
	"strings"
	"testing"
)

// A computed text cell written in place comes out as appendField writes a
// cell (quoted only when needed), and Go's encoding/csv Reader (the
// reference for CSV reading here) reads the original text back from it,
// with a comma or a tab as the delimiter.
func TestAppendTextFieldReadsBackWithEncodingCSV(t *testing.T) {
	for _, text := range []string{"laminar", "a, b", `say "hi"`, "two\nlines", " lead", "trail ", "tab\there", `"`} {
		col := computedColumn{name: "test", quoted: true, text: func(b []byte, _ *outcome, _ *scratch) []byte { return append(b, text...) }}
		for _, delim := range []byte{',', '\t'} {
			prefix := "x" + string(delim)
			var s scratch
			got := string(appendTextField([]byte(prefix), &col, delim, &s))
			if want := string(appendField([]byte(prefix), text, delim)); got != want {
				t.Errorf("text %q, delimiter %q: got %q, appendField writes %q", text, delim, got, want)
			}
			r := csv.NewReader(strings.NewReader(got + "\n"))
			r.Comma = rune(delim)
			rec, err := r.Read()
			if err != nil || !slices.Equal(rec, []string{"x", text}) {
				t.Errorf("text %q, delimiter %q: encoding/csv reads %q back as %q (%v)", text, delim, got, rec, err)
			}
		}
	}
}
