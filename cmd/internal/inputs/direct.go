package inputs

import (
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
)

// Column is a table column that holds one field, with the conversion of
// its unit (quantity.Resolve).
type Column struct {
	Field, Col int
	Conv       quantity.Conv
}

// Direct reads table rows whose cells are plain numbers straight into an
// Input, without Cells: the fast path of a batch. A row it gives is the
// Input BuildCells would give for the same cells, error included; a row
// with anything else in a numeric cell (a unit, an uncertainty, a word) or
// without a length or speed is left to the caller's Cells and BuildCells,
// which also name the cell at fault.
type Direct struct {
	in, base      Input
	shape         string // the row's shape text, resolved by Row
	baseShape     string // the shape constant, if any
	nums          []directNum
	texts         []directText
	speedPerBL    bool // the speed column is in body lengths per second
	shapeLabel    string
	labels        [NumFields]string // where each field comes from, for errors
	defaultMedium string
	missing       []string // cell texts that mean "not measured" (SetMissing)
	missLen       int      // the longest of them, in bytes
}

// SetMissing sets the cell texts that mean "not measured": a text field
// holding one is absent, as the batch's cells reading takes it. Numeric
// cells holding one are not plain numbers and go the general way.
func (d *Direct) SetMissing(tokens []string) {
	d.missing, d.missLen = tokens, 0
	for _, t := range tokens {
		d.missLen = max(d.missLen, len(t))
	}
}

type directText struct{ field, col int }

type directNum struct {
	col  int
	dst  *float64
	conv quantity.Conv
}

// NewDirect prepares direct reading for the columns, with the constants
// already read into cells for the fields that have no column. ok is false
// when the columns or constants need the general path for every row: a
// column whose unit is not known in advance, a temperature offset, or a
// constant with an uncertainty or an error.
func NewDirect(constants *Cells, cols []Column, labels [NumFields]string, defaultMedium string) (*Direct, bool) {
	d := &Direct{defaultMedium: defaultMedium}
	d.base = blankInput()
	hasCol := [NumFields]bool{}
	for _, c := range cols {
		hasCol[c.Field] = true
		switch {
		case c.Field == TempOffset:
			return nil, false
		case Fields[c.Field].Text:
			d.texts = append(d.texts, directText{c.Field, c.Col})
		case c.Conv.PerBodyLength() && c.Field != Speed:
			return nil, false
		default:
			d.speedPerBL = d.speedPerBL || c.Conv.PerBodyLength()
			d.nums = append(d.nums, directNum{col: c.Col, dst: d.in.field(c.Field), conv: c.Conv})
		}
	}
	for f := range Fields {
		if hasCol[f] || !constants.Given[f] {
			continue
		}
		v := constants.Value[f]
		switch {
		case constants.Err[f] != nil || f == TempOffset:
			return nil, false
		case Fields[f].Text:
		case v.SD > 0 || v.PerBodyLength || math.IsNaN(v.SI):
			return nil, false
		default:
			*d.base.field(f) = v.SI
		}
	}
	for f := range d.labels {
		d.labels[f] = labels[f]
		if !hasCol[f] {
			d.labels[f] = constants.Label[f]
		}
	}
	d.shapeLabel = d.labels[Shape]
	d.base.Organism.Disc = constants.Text[Disc]
	d.base.Conditions.Medium = constants.Text[Medium]
	d.baseShape = constants.Text[Shape]
	return d, true
}

// Row reads one row's fields. ok is false when the row needs the general
// path; otherwise the Input (valid until the next call) or the error is
// BuildCells'.
func (d *Direct) Row(fields []string) (in *Input, ok bool, err error) {
	d.in, d.shape = d.base, d.baseShape
	for i := range d.nums {
		n := &d.nums[i]
		if n.col >= len(fields) {
			continue
		}
		t := fields[n.col]
		if t == "" {
			continue
		}
		if t[0] <= ' ' || t[len(t)-1] <= ' ' {
			if t = strings.TrimSpace(t); t == "" {
				continue
			}
		}
		v, ok := quantity.PlainNumber(t)
		if !ok {
			return nil, false, nil
		}
		*n.dst = n.conv.SI(v)
	}
	o := &d.in.Organism
	if math.IsNaN(o.Body.Length) || math.IsNaN(o.Speed) {
		return nil, false, nil
	}
	for _, t := range d.texts {
		text := ""
		if t.col < len(fields) {
			text = strings.TrimSpace(fields[t.col])
		}
		if text != "" && len(text) <= d.missLen && Missing(text, d.missing) {
			text = ""
		}
		d.setText(t.field, text)
	}
	if d.speedPerBL {
		o.Speed *= o.Body.Length
	}
	if err := finishOrganism(o, d.shape, d.shapeLabel, &d.labels); err != nil {
		return nil, true, err
	}
	if err := finishConditions(&d.in.Conditions, d.defaultMedium); err != nil {
		return nil, true, err
	}
	return &d.in, true, nil
}

// setText stores a text field; the shape is kept as text until Row
// resolves it.
func (d *Direct) setText(f int, t string) {
	switch f {
	case Shape:
		d.shape = t
	case Medium:
		d.in.Conditions.Medium = t
	case Disc:
		d.in.Organism.Disc = t
	}
}
