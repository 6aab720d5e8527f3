// Package report writes results for people (aligned tables) and for scripts
// (JSON, CSV) with fixed number formats and column order, so that piped
// output is deterministic.
package report

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"

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

// Table writes an aligned table with the given headers, which should carry
// units, e.g. "density (kg/m³)". Headers and cells are printed as given,
// but for control characters other than line breaks, which are escaped
// (see [Printable]).
func Table(w io.Writer, headers []string, rows [][]string) error {
	t := tablewriter.NewTable(w,
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithHeaderAlignment(tw.AlignLeft),
		tablewriter.WithRowAlignment(tw.AlignLeft),
	)
	h := make([]any, len(headers))
	for i, s := range headers {
		h[i] = printableCell(s)
	}
	t.Header(h...)
	for _, r := range rows {
		clean := make([]string, len(r)) // the table keeps the rows until Render
		for i, c := range r {
			clean[i] = printableCell(c)
		}
		if err := t.Append(clean); err != nil {
			return err
		}
	}
	return t.Render()
}

// CSV writes headers and rows as RFC 4180 CSV.
func CSV(w io.Writer, headers []string, rows [][]string) error {
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

// JSON writes v as indented JSON followed by a newline.
func JSON(w io.Writer, v any) error {
	e := json.NewEncoder(w)
	e.SetIndent("", "  ")
	e.SetEscapeHTML(false)
	return e.Encode(v)
}

// Num formats v with sig significant digits, switching to exponent notation
// for very large or small magnitudes. NaN and ±Inf print as "".
func Num(v float64, sig int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
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

// Opt returns a pointer to v, or nil when v is NaN or infinite, so that JSON
// omits or nulls quantities that do not apply.
func Opt(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
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
		fmt.Fprintf(w, "  - %s\n", Printable(s))
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
// tables; CSV gets the same text.
func F(key, label string, v float64, sig int) Field {
	return Field{Key: key, Label: label, Value: Num(v, sig)}
}

// Maybe builds a Field that is left out of the output when v is NaN: a
// quantity that does not apply to this result.
func Maybe(key, label string, v float64, sig int) Field {
	f := F(key, label, v, sig)
	f.optional = true
	return f
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
