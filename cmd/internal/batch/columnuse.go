package batch

import "github.com/flowregime/flowregime/cmd/internal/inputs"

// ColumnUse says what batch reads from one input column.
type ColumnUse struct {
	Column      string // the header as written
	Quantity    string // the quantity read from it; "" for a column carried through unread
	Unit        string // the unit from the header or --unit; "" when each cell gives its own
	Uncertainty bool   // the column holds the quantity's standard uncertainty
}

// DescribeColumns returns, in header order, what batch reads from each
// column of a table with this header under --column (columns) and --unit
// (units): the same matching a run uses, so the description cannot differ
// from what was computed. An error is the run's header error.
func DescribeColumns(header []string, columns, units map[string]string) ([]ColumnUse, error) {
	m, err := newMapping(header, columns, units)
	if err != nil {
		return nil, HeaderError{err}
	}
	uses := make([]ColumnUse, len(header))
	for i, h := range header {
		uses[i].Column = h
	}
	for f := range inputs.Fields {
		if c := m.col[f]; c >= 0 {
			uses[c].Quantity, uses[c].Unit = inputs.Fields[f].Name, m.unit[f]
		}
		if c := m.sdCol[f]; c >= 0 {
			uses[c] = ColumnUse{Column: header[c], Quantity: inputs.Fields[f].Name, Unit: m.sdUnit[f], Uncertainty: true}
		}
	}
	return uses, nil
}
