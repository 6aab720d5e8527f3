package figure

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/batch"
)

// Columns of batch output that the regime map reads.
const (
	ReynoldsColumn = "reynolds"
	StrouhalColumn = "strouhal"
)

// Table is a CSV table held in memory: its header and records.
type Table struct {
	Header  []string
	Records [][]string
}

// ReadTable reads a CSV (or, when the header has tabs and no commas, a
// tab-separated) table such as batch writes.
func ReadTable(r io.Reader) (*Table, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	cr := csv.NewReader(strings.NewReader(string(data)))
	first, _, _ := strings.Cut(string(data), "\n")
	if strings.Contains(first, "\t") && !strings.Contains(first, ",") {
		cr.Comma = '\t'
	}
	cr.FieldsPerRecord = -1
	recs, err := cr.ReadAll()
	if err != nil {
		return nil, fmt.Errorf("table: %v", err)
	}
	if len(recs) == 0 {
		return nil, errors.New("table: empty, no header")
	}
	return &Table{Header: recs[0], Records: recs[1:]}, nil
}

// Column returns the index of the column named name: a header equal to it
// (case aside), or else the one header that batch reads as that quantity
// (so "length" finds "length (mm)"). It fails, listing the headers, when
// none or several match.
func (t *Table) Column(name string) (int, error) {
	for i, h := range t.Header {
		if strings.EqualFold(strings.TrimSpace(h), name) {
			return i, nil
		}
	}
	found := -1
	for i, h := range t.Header {
		if f, _ := batch.MatchHeader(h); f != "" && strings.EqualFold(f, name) {
			if found >= 0 {
				return -1, fmt.Errorf("column %q: both %q and %q match; name one", name, t.Header[found], h)
			}
			found = i
		}
	}
	if found < 0 {
		return -1, fmt.Errorf("column %q: not in the table (columns: %s)", name, strings.Join(t.Header, ", "))
	}
	return found, nil
}

// Number reads a cell as a number; ok is false for an empty or non-numeric
// cell, or a row too short to have it.
func (t *Table) Number(row, col int) (v float64, ok bool) {
	rec := t.Records[row]
	if col >= len(rec) {
		return 0, false
	}
	v, err := strconv.ParseFloat(strings.TrimSpace(rec[col]), 64)
	return v, err == nil
}

// Cell returns a cell's text, "" where the row is too short.
func (t *Table) Cell(row, col int) string {
	if col < 0 || col >= len(t.Records[row]) {
		return ""
	}
	return t.Records[row][col]
}

// RegimeRows reads the regime map's points from a batch output table: Re
// from the reynolds column, y from the column named y (see [Table.Column]),
// the group from the column named group ("" for none). The options carry
// the y column's header as the axis label. Cells that are not numbers
// become NaN, which the map leaves out and counts.
func RegimeRows(t *Table, y, group string) ([]RegimePoint, RegimeOptions, error) {
	reCol, err := t.Column(ReynoldsColumn)
	if err != nil {
		return nil, RegimeOptions{}, fmt.Errorf("%v: give a table written by batch", err)
	}
	yCol, err := t.Column(y)
	if err != nil {
		return nil, RegimeOptions{}, err
	}
	gCol := -1
	if group != "" {
		if gCol, err = t.Column(group); err != nil {
			return nil, RegimeOptions{}, err
		}
	}
	o := RegimeOptions{YLabel: t.Header[yCol], Strouhal: strings.EqualFold(t.Header[yCol], StrouhalColumn)}
	if o.Strouhal {
		o.YLabel = "Strouhal number, St"
	}
	pts := make([]RegimePoint, len(t.Records))
	for i := range t.Records {
		pts[i] = RegimePoint{Group: t.Cell(i, gCol), Reynolds: numberOrNaN(t, i, reCol), Y: numberOrNaN(t, i, yCol)}
	}
	return pts, o, nil
}

// numberOrNaN reads a cell as a number, NaN if it is not one.
func numberOrNaN(t *Table, row, col int) float64 {
	if v, ok := t.Number(row, col); ok {
		return v
	}
	return nan
}
