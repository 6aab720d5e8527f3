package report

import (
	"bytes"
	"math"
	"strings"
	"testing"
)

// The last guard: a number that is not finite is never printed, as a blank
// or as "+Inf", in any format. encoding/json itself refuses NaN and ±Inf
// (its UnsupportedValueError, Go standard library documentation of
// json.Marshal); tables and CSV refuse them here. A quantity that does not
// apply (NaN through Maybe or Opt) is left out, as before.
func TestNonFiniteNeverPrinted(t *testing.T) {
	inf := math.Inf(1)
	cases := []struct {
		name  string
		write func(*bytes.Buffer) error
		want  string
	}{
		{"table cell +Inf", func(b *bytes.Buffer) error {
			return Table(b, []string{"law", "drag (N)"}, [][]string{{"Stokes", Num(inf, 4)}})
		}, "drag (N) is not a finite number"},
		{"csv cell −Inf", func(b *bytes.Buffer) error {
			return CSV(b, []string{"law", "drag_N"}, [][]string{{"Stokes", Num(math.Inf(-1), 4)}})
		}, "drag_N is not a finite number"},
		{"cell with Inf inside a text", func(b *bytes.Buffer) error {
			return Table(b, []string{"slope [95 %]"}, [][]string{{Num(1, 3) + " [" + Num(inf, 3) + "]"}})
		}, "slope [95 %] is not a finite number"},
		{"field NaN", func(b *bytes.Buffer) error {
			return Fields(b, FormatTable, []Field{F("reynolds", "Reynolds number", math.NaN(), 4)})
		}, "Reynolds number is not a finite number"},
		{"field Inf as CSV", func(b *bytes.Buffer) error {
			return Fields(b, FormatCSV, []Field{F("drag_N", "drag (N)", inf, 4)})
		}, "drag (N) is not a finite number"},
		{"optional field Inf", func(b *bytes.Buffer) error {
			return Fields(b, FormatCSV, []Field{Maybe("strouhal", "Strouhal number", inf, 4)})
		}, "Strouhal number is not a finite number"},
		{"JSON Inf through Opt", func(b *bytes.Buffer) error {
			return JSON(b, struct {
				Drag *float64 `json:"drag_N"`
			}{Opt(inf)})
		}, "a result is +Inf, not a finite number"},
		{"JSON NaN", func(b *bytes.Buffer) error {
			return JSON(b, struct {
				Re float64 `json:"reynolds"`
			}{math.NaN()})
		}, "a result is NaN, not a finite number"},
	}
	for _, c := range cases {
		var b bytes.Buffer
		err := c.write(&b)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.name, err, c.want)
		}
		if b.Len() != 0 {
			t.Errorf("%s: printed %q before refusing", c.name, b.String())
		}
	}
}

// Quantities that do not apply stay absent: Maybe(NaN) is left out, Opt(NaN)
// is JSON null, Num(NaN) an empty cell.
func TestNotApplicableStaysAbsent(t *testing.T) {
	var b bytes.Buffer
	if err := Fields(&b, FormatCSV, []Field{F("reynolds", "Re", 12, 4), Maybe("strouhal", "St", math.NaN(), 4)}); err != nil {
		t.Fatal(err)
	}
	if b.String() != "reynolds\n12\n" {
		t.Errorf("CSV %q, want the Strouhal number left out", b.String())
	}
	b.Reset()
	if err := JSON(&b, struct {
		St *float64 `json:"strouhal"`
	}{Opt(math.NaN())}); err != nil || strings.TrimSpace(b.String()) != "{\n  \"strouhal\": null\n}" {
		t.Errorf("JSON %q, %v", b.String(), err)
	}
	if Num(math.NaN(), 4) != "" {
		t.Errorf("Num(NaN) = %q", Num(math.NaN(), 4))
	}
}
