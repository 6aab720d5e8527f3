// Package report writes results for people (aligned tables) and for scripts
// (JSON, CSV) with fixed number formats and column order, so that piped
// output is deterministic.
package report

import (
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/tw"
)

// Formats accepted by --format.
const (
	FormatTable = "table"
	FormatJSON  = "json"
	FormatCSV   = "csv"
)

// CheckFormat returns an error unless f is one of the accepted formats.
func CheckFormat(f string) error {
	switch f {
	case FormatTable, FormatJSON, FormatCSV:
		return nil
	}
	return fmt.Errorf("--format %q is not known; accepted: table, json, csv", f)
}

// nonFinite is what Num gives for an infinite number and F for a number
// that is not finite. No writer prints it: Table, CSV and Fields refuse the
// whole output instead, the last guard against an overflow that slipped
// past the library's checks reaching a reader as a blank or "+Inf".
const nonFinite = "\x00non-finite"

// checkFinite returns an error naming the first column that holds a
// non-finite number.
func checkFinite(headers []string, rows [][]string) error {
	for _, r := range rows {
		for i, c := range r {
			if strings.Contains(c, nonFinite) {
				name := "a value"
				if i < len(headers) {
					name = headers[i]
				}
				return fmt.Errorf("%s is not a finite number; nothing was printed (check the inputs' units)", name)
			}
		}
	}
	return nil
}

// Table writes an aligned table with the given headers, which should carry
// units, e.g. "density (kg/m³)". Headers and cells are printed as given,
// but for control characters other than line breaks, which are escaped
// (see [Printable]). When w is [Sized], the table is fitted to its width
// (see fitTable).
func Table(w io.Writer, headers []string, rows [][]string) error {
	return TableWidth(w, columnsOf(w), headers, rows)
}

// TableWidth is [Table] fitted to width columns (0: no limit).
func TableWidth(w io.Writer, width int, headers []string, rows [][]string) error {
	if err := checkFinite(headers, rows); err != nil {
		return err
	}
	h := make([]string, len(headers))
	for i, s := range headers {
		h[i] = printableCell(s)
	}
	clean := make([][]string, len(rows))
	for j, r := range rows {
		clean[j] = make([]string, len(r))
		for i, c := range r {
			clean[j][i] = printableCell(c)
		}
	}
	return fitTable(w, width, h, clean)
}

// render writes one aligned table of already printable cells.
func render(w io.Writer, headers []string, rows [][]string) error {
	t := tablewriter.NewTable(w,
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithHeaderAlignment(tw.AlignLeft),
		tablewriter.WithRowAlignment(tw.AlignLeft),
	)
	h := make([]any, len(headers))
	for i, s := range headers {
		h[i] = s
	}
	t.Header(h...)
	for _, r := range rows {
		if err := t.Append(r); err != nil {
			return err
		}
	}
	return t.Render()
}

// CSV writes headers and rows as RFC 4180 CSV.
func CSV(w io.Writer, headers []string, rows [][]string) error {
	if err := checkFinite(headers, rows); err != nil {
		return err
	}
	c := csv.NewWriter(w)
	if err := c.Write(headers); err != nil {
		return err
	}
	if err := c.WriteAll(rows); err != nil {
		return err
	}
	c.Flush()
	return c.Error()
}

// JSON writes v as indented JSON followed by a newline. A NaN or infinite
// number in v (one not left out through Opt) is an error and nothing is
// written: the encoder refuses it before writing.
func JSON(w io.Writer, v any) error {
	e := json.NewEncoder(w)
	e.SetIndent("", "  ")
	e.SetEscapeHTML(false)
	err := e.Encode(v)
	var uv *json.UnsupportedValueError
	if errors.As(err, &uv) {
		return fmt.Errorf("a result is %s, not a finite number; nothing was printed (check the inputs' units)", uv.Str)
	}
	return err
}

// Num formats v with sig significant digits, switching to exponent notation
// for very large or small magnitudes. NaN, a quantity that does not apply,
// prints as ""; ±Inf gives a text every writer refuses.
func Num(v float64, sig int) string {
	if math.IsInf(v, 0) {
		return nonFinite
	}
	if math.IsNaN(v) {
		return ""
	}
	if v == 0 {
		return "0"
	}
	a := math.Abs(v)
	if a >= 1e-3 && a < 1e6 {
		return strconv.FormatFloat(v, 'g', sig, 64)
	}
	return strconv.FormatFloat(v, 'e', sig-1, 64)
}

// Opt returns a pointer to v, or nil when v is NaN, so that JSON omits or
// nulls quantities that do not apply. An infinite v stays, for JSON to
// refuse.
func Opt(v float64) *float64 {
	if math.IsNaN(v) {
		return nil
	}
	return &v
}

// List writes a titled list ("Methods:", "Warnings:") under a table.
func List(w io.Writer, title string, items []string) {
	if len(items) == 0 {
		return
	}
	fmt.Fprintf(w, "%s:\n", title)
	for _, s := range items {
		Paragraph(w, "  ", "  - "+s)
	}
}

// Field is one named value of a single result: Key is the machine name used
// in CSV headers (it carries the unit, like the JSON names), Label the
// human name with its unit for tables.
type Field struct {
	Key, Label, Value string
	optional          bool // left out when Value is empty
}

// F builds a Field from a number, formatted with sig significant digits in
// tables; CSV gets the same text. The number must be finite: NaN or ±Inf
// makes Fields refuse the output (Maybe is for quantities that may not
// apply).
func F(key, label string, v float64, sig int) Field {
	if math.IsNaN(v) {
		return Field{Key: key, Label: label, Value: nonFinite}
	}
	return Field{Key: key, Label: label, Value: Num(v, sig)}
}

// Maybe builds a Field that is left out of the output when v is NaN: a
// quantity that does not apply to this result.
func Maybe(key, label string, v float64, sig int) Field {
	return Field{Key: key, Label: label, Value: Num(v, sig), optional: true}
}

// present drops optional fields without a value.
func present(fs []Field) []Field {
	out := make([]Field, 0, len(fs))
	for _, f := range fs {
		if !(f.optional && f.Value == "") {
			out = append(out, f)
		}
	}
	return out
}

// Fields writes a single result as a two-column table (quantity with unit,
// value) or as a one-row CSV with keys as headers.
func Fields(w io.Writer, format string, fs []Field) error {
	fs = present(fs)
	for _, f := range fs {
		if strings.Contains(f.Value, nonFinite) {
			return fmt.Errorf("%s is not a finite number; nothing was printed (check the inputs' units)", f.Label)
		}
	}
	if format == FormatCSV {
		h := make([]string, len(fs))
		r := make([]string, len(fs))
		for i, f := range fs {
			h[i], r[i] = f.Key, f.Value
		}
		return CSV(w, h, [][]string{r})
	}
	rows := make([][]string, len(fs))
	for i, f := range fs {
		rows[i] = []string{f.Label, f.Value}
	}
	return Table(w, []string{"quantity (unit)", "value"}, rows)
}
