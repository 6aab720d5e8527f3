package batch

import (
	"fmt"
	"maps"
	"slices"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/regime"
)

// computedColumn is a column batch appends to every output row. A new
// computed column is a row of computedColumns: its name and how its cell
// is written; CSV, TSV, JSON Lines, the table output and the header all
// follow it.
type computedColumn struct {
	name string
	// num gives a number column's value, written with 6 significant digits;
	// NaN (the quantity does not apply) is an empty cell, null in JSON.
	num func(*regime.Result) float64
	// text appends a text column's cell, a JSON string.
	text   func(b []byte, o *outcome, s *scratch) []byte
	quoted bool // the text may hold a delimiter or a quote: CSV quotes it as needed
}

// computedColumns are the columns appended to every output row, in order.
var computedColumns = []computedColumn{
	{name: "density_kg_m3", num: func(r *regime.Result) float64 { return r.Medium.Density }},
	{name: "kinematic_viscosity_m2_s", num: func(r *regime.Result) float64 { return r.Viscosity / r.Medium.Density }},
	{name: "reynolds", num: func(r *regime.Result) float64 { return r.Reynolds }},
	{name: "regime", quoted: true, text: func(b []byte, o *outcome, _ *scratch) []byte { return append(b, o.r.Regime...) }},
	{name: "strouhal", num: func(r *regime.Result) float64 { return r.Strouhal }},
	{name: "drag_law", quoted: true, text: func(b []byte, o *outcome, _ *scratch) []byte { return append(b, o.r.Drag.Chosen.Law...) }},
	{name: "drag_N", num: func(r *regime.Result) float64 { return r.Drag.Chosen.Force }},
	{name: "power_kind", quoted: true, text: func(b []byte, o *outcome, _ *scratch) []byte { return append(b, o.r.Power.Kind...) }},
	{name: "power_W", num: func(r *regime.Result) float64 { return r.Power.Total }},
	{name: "flags", text: func(b []byte, o *outcome, _ *scratch) []byte { return appendJoined(b, o.flags) }},
	{name: "flag_reasons", quoted: true, text: func(b []byte, o *outcome, s *scratch) []byte { return append(b, o.reasons(s)...) }},
	{name: "assumed", text: func(b []byte, o *outcome, _ *scratch) []byte { return appendJoined(b, o.assumed) }},
}

// Computed are the names of the columns appended to every output row, in
// order.
var Computed = func() []string {
	names := make([]string, len(computedColumns))
	for i, c := range computedColumns {
		names[i] = c.name
	}
	return names
}()

// appendJoined appends codes separated by ";" (codes hold no delimiter).
func appendJoined(b []byte, codes []string) []byte {
	for i, c := range codes {
		if i > 0 {
			b = append(b, ';')
		}
		b = append(b, c...)
	}
	return b
}

// mapping ties input columns to the quantities they hold.
type mapping struct {
	header []string
	col    [inputs.NumFields]int    // column index of each field, −1 if none
	unit   [inputs.NumFields]string // unit from the header or --unit
	label  [inputs.NumFields]string // `column "length (mm)"`
	sdCol  [inputs.NumFields]int    // column of the field's standard uncertainty, −1 if none
	sdUnit [inputs.NumFields]string // its own unit, if its header gives one
	conv   [inputs.NumFields]quantity.Conv
	convOK [inputs.NumFields]bool // conv holds the column's unit (plain numbers convert directly)
	// unitFrom says where each column's unit comes from: "the header",
	// "--unit", "the cells" or "bare numbers".
	unitFrom [inputs.NumFields]string
	use      []string // per header column: useIgnored, useNone, "--column" or ""
}

func (m *mapping) hasSD() bool {
	for _, c := range m.sdCol {
		if c >= 0 {
			return true
		}
	}
	return false
}

// sdHeader recognises an uncertainty column: "length sd", "length_sd",
// "length (mm) sd", "sd length", "length sd (mm)". It returns the field and
// the column's own unit, if any.
func sdHeader(h string) (field int, unit string) {
	h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
	for _, p := range [][2]string{{"(", ")"}, {"[", "]"}} {
		if strings.HasSuffix(h, p[1]) {
			if i := strings.LastIndex(h, p[0]); i > 0 {
				unit = strings.TrimSpace(h[i+1 : len(h)-1])
				h = strings.TrimSpace(h[:i])
			}
		}
	}
	n := normName(h)
	var base string
	switch {
	case strings.HasSuffix(n, " sd"):
		base = strings.TrimSuffix(n, " sd")
	case strings.HasPrefix(n, "sd "):
		base = strings.TrimPrefix(n, "sd ")
	default:
		return -1, ""
	}
	if f, u := splitHeader(base); f >= 0 {
		if unit == "" {
			unit = u
		}
		return f, unit
	}
	return -1, ""
}

// normName lowers a header name and turns _ - . into spaces.
func normName(s string) string {
	s = strings.ToLower(strings.TrimSpace(s))
	s = strings.NewReplacer("_", " ", "-", " ", ".", " ").Replace(s)
	return strings.Join(strings.Fields(s), " ")
}

// headerParts splits "length (mm)" or "speed [cm/s]" into the name and the
// unit in brackets ("" when there is none).
func headerParts(h string) (name, unit string) {
	h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
	for _, p := range [][2]string{{"(", ")"}, {"[", "]"}} {
		if strings.HasSuffix(h, p[1]) {
			if i := strings.LastIndex(h, p[0]); i > 0 {
				return strings.TrimSpace(h[:i]), strings.TrimSpace(h[i+1 : len(h)-1])
			}
		}
	}
	return h, ""
}

// splitHeader splits "length (mm)", "speed [cm/s]", "temp_C" or "Temp
// degC" into a field and a unit. Names are compared by inputs.Compact
// (case, spacing and punctuation ignored). A trailing token counts as a
// unit only if it is one for the quantity the rest of the name matches. A
// header that is itself a salinity unit ("PSU", "ppt", "‰") is a
// salinity in that unit. The unit decides between a stroke amplitude that
// is a length and one that is an angle (inputs.ByUnit).
func splitHeader(h string) (field int, unit string) {
	name, unit := headerParts(h)
	if unit != "" {
		return byUnit(inputs.Match(name), unit), unit
	}
	if f := inputs.Match(name); f >= 0 {
		return f, ""
	}
	if quantity.KnownUnit(quantity.Salinity, name) {
		return inputs.Salinity, name
	}
	if i := strings.LastIndexAny(name, "_ "); i > 0 {
		base, u := name[:i], strings.TrimSpace(name[i+1:])
		if f := inputs.Match(base); f >= 0 && !inputs.Fields[f].Text {
			if g := byUnit(f, u); quantity.KnownUnit(inputs.Fields[g].Kind, u) {
				return g, u
			}
		}
	}
	return -1, ""
}

// byUnit is inputs.ByUnit for a unit's text.
func byUnit(field int, unit string) int {
	if field < 0 {
		return field
	}
	return inputs.ByUnit(field, quantity.KnownUnit(quantity.Length, unit), quantity.KnownUnit(quantity.Angle, unit))
}

// knownUnitOfAnyField reports whether u is a unit of some numeric input.
func knownUnitOfAnyField(u string) bool {
	for _, f := range inputs.Fields {
		if !f.Text && u != "" && quantity.KnownUnit(f.Kind, u) {
			return true
		}
	}
	return false
}

// headerRules say how strictly a header is read. Zero rules (tests of the
// row path) only match names; a run reads with strict rules.
type headerRules struct {
	columns map[string]string // field name → exact header (--column)
	units   map[string]string // field name → unit of its column (--unit)
	ignore  []string          // headers left out on purpose (--ignore)
	missing []string          // cell texts meaning "not measured"
	sample  [][]string        // the first data rows, to see the units of unitless columns
	strict  bool              // refuse quantity-like columns that match nothing and dimensional columns without a unit
}

// newMapping matches header names to fields. columns maps a field name to
// the exact header that holds it (--column); units maps a field name to the
// unit of its column (--unit).
func newMapping(header []string, columns, units map[string]string) (*mapping, error) {
	return mapHeader(header, headerRules{columns: columns, units: units})
}

// mapHeader matches header names to fields by the rules.
func mapHeader(header []string, r headerRules) (*mapping, error) {
	m := &mapping{header: header, use: make([]string, len(header))}
	for i := range m.col {
		m.col[i], m.sdCol[i] = -1, -1
	}
	forced := map[int]bool{}
	if err := m.markIgnored(r.ignore, forced); err != nil {
		return nil, err
	}
	for _, name := range slices.Sorted(maps.Keys(r.columns)) { // the same error for the same flags
		h := r.columns[name]
		f := inputs.Index(name)
		if f < 0 {
			return nil, fmt.Errorf("--column %s=…: unknown quantity %q; accepted: %s", name, name, fieldNames())
		}
		idx := -1
		for i, hh := range header {
			if strings.TrimSpace(strings.TrimPrefix(hh, "\ufeff")) == h {
				idx = i
			}
		}
		if idx < 0 {
			return nil, fmt.Errorf("--column %s=%q: no such column in the header; columns are: %s", name, h, strings.Join(header, ", "))
		}
		if m.use[idx] == useIgnored {
			return nil, fmt.Errorf("column %q is named by both --column and --ignore; keep one", h)
		}
		m.col[f] = idx
		_, m.unit[f] = headerParts(h)
		if _, u := splitHeader(h); u != "" {
			m.unit[f] = u
		}
		m.unitFrom[f] = "the header"
		m.use[idx] = "--column"
		forced[idx] = true
	}
	for i, h := range header {
		if f, u := sdHeader(h); f >= 0 && !forced[i] {
			m.sdCol[f], m.sdUnit[f] = i, u
			forced[i] = true
		}
	}
	var taken []string // columns that hold a quantity another column already gives
	for i, h := range header {
		if forced[i] {
			continue
		}
		f, unit := splitHeader(h)
		if f < 0 {
			continue
		}
		if m.col[f] >= 0 && forced[m.col[f]] {
			if r.strict {
				h := strings.TrimSpace(h)
				taken = append(taken, fmt.Sprintf("column %q also holds %s, which --column takes from %q; leave it out with --ignore %q", h, inputs.Fields[f].Name, strings.TrimSpace(header[m.col[f]]), h))
			}
			continue
		}
		if m.col[f] >= 0 {
			first, second := strings.TrimSpace(header[m.col[f]]), strings.TrimSpace(h)
			return nil, fmt.Errorf("columns %q and %q both hold %s; choose one with --column %s=%q, or leave one out with --ignore %q", first, second, inputs.Fields[f].Name, inputs.Fields[f].Name, first, second)
		}
		m.col[f], m.unit[f] = i, unit
		if unit != "" {
			m.unitFrom[f] = "the header"
		}
	}
	if len(taken) > 0 {
		return nil, fmt.Errorf("%s", strings.Join(taken, "; "))
	}
	for _, name := range slices.Sorted(maps.Keys(r.units)) {
		u := r.units[name]
		f := inputs.Index(name)
		if f < 0 {
			return nil, fmt.Errorf("--unit %s=%s: unknown quantity %q; accepted: %s", name, u, name, fieldNames())
		}
		if inputs.Fields[f].Text || !quantity.KnownUnit(inputs.Fields[f].Kind, u) {
			return nil, fmt.Errorf("--unit %s=%s: %q is not a unit of %s; accepted: %s", name, u, u, name, strings.Join(quantity.Units(inputs.Fields[f].Kind), ", "))
		}
		m.unit[f], m.unitFrom[f] = u, "--unit"
	}
	if r.strict {
		if err := m.unitsFromCells(r.sample, r.missing); err != nil {
			return nil, err
		}
		if err := m.refuseUnmatched(); err != nil {
			return nil, err
		}
	}
	for f, c := range m.sdCol {
		if c < 0 {
			continue
		}
		if inputs.Fields[f].Text {
			return nil, fmt.Errorf("column %q: %s is a word and has no uncertainty", header[c], inputs.Fields[f].Name)
		}
		if u := m.sdUnit[f]; u != "" && u != "%" && !quantity.KnownUnit(inputs.Fields[f].Kind, u) {
			return nil, fmt.Errorf("column %q: %q is not a unit of %s; accepted: %s, or %%", header[c], u, inputs.Fields[f].Name, strings.Join(quantity.Units(inputs.Fields[f].Kind), ", "))
		}
	}
	for f := range m.col {
		if m.col[f] >= 0 && !inputs.Fields[f].Text {
			m.conv[f], m.convOK[f] = quantity.Resolve(inputs.Fields[f].Kind, m.unit[f])
		}
		if m.col[f] >= 0 {
			m.label[f] = fmt.Sprintf("column %q", strings.TrimSpace(header[m.col[f]]))
			if u := m.unit[f]; u != "" && !inputs.Fields[f].Text && !quantity.KnownUnit(inputs.Fields[f].Kind, u) {
				return nil, fmt.Errorf("column %q: unknown unit %q for %s; accepted: %s", header[m.col[f]], u, inputs.Fields[f].Name, strings.Join(quantity.Units(inputs.Fields[f].Kind), ", "))
			}
		}
	}
	return m, nil
}

// useIgnored marks a column left out by --ignore in mapping.use.
const useIgnored = "--ignore"

// markIgnored marks the columns named by --ignore (exact header text, or
// the same name by inputs.Compact); a name that is no column is refused.
func (m *mapping) markIgnored(ignore []string, forced map[int]bool) error {
	for _, name := range ignore {
		name = strings.TrimSpace(name)
		if name == "" {
			continue
		}
		found := false
		for i, h := range m.header {
			h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
			if h == name || inputs.Compact(h) != "" && inputs.Compact(h) == inputs.Compact(name) {
				m.use[i], forced[i], found = useIgnored, true, true
			}
		}
		if !found {
			return fmt.Errorf("--ignore %q: no such column in the header; columns are: %s", name, strings.Join(m.header, ", "))
		}
	}
	return nil
}

// unitsFromCells settles the columns whose header gives no unit: a
// dimensional quantity (a length, speed, mass, frequency, …) needs one,
// from the header, --unit or every cell of the first rows ("12 mm"); a
// stroke amplitude whose first cells are lengths is the tail or fin
// amplitude. Anything else is one error at the header.
func (m *mapping) unitsFromCells(sample [][]string, missing []string) error {
	if f := inputs.StrokeAngle; m.col[f] >= 0 && m.unit[f] == "" && m.col[inputs.Amplitude] < 0 &&
		cellsHaveUnit(sample, m.col[f], quantity.Length, missing) {
		m.col[inputs.Amplitude], m.col[f] = m.col[f], -1
		m.unitFrom[inputs.Amplitude] = "the cells"
		m.sdCol[inputs.Amplitude], m.sdCol[f] = m.sdCol[f], -1
		m.sdUnit[inputs.Amplitude], m.sdUnit[f] = m.sdUnit[f], ""
	}
	for f, c := range m.col {
		fd := inputs.Fields[f]
		if c < 0 || fd.Text || m.unit[f] != "" {
			continue
		}
		if _, bare := quantity.Resolve(fd.Kind, ""); bare {
			m.unitFrom[f] = "bare numbers"
			continue
		}
		if cellsHaveUnit(sample, c, fd.Kind, missing) {
			m.unitFrom[f] = "the cells"
			continue
		}
		h := strings.TrimSpace(m.header[c])
		return fmt.Errorf("column %q (%s) has no unit; write it in the header, e.g. %q, or give --unit %s=%s",
			h, fd.Name, h+" ("+exampleUnit(fd.Kind)+")", fd.Name, exampleUnit(fd.Kind))
	}
	return nil
}

// exampleUnit is a common unit of a kind, for messages.
func exampleUnit(k quantity.Kind) string {
	for _, u := range []string{"mm", "m", "cm/s", "g", "Hz", "mm2", "kPa", "s", "1/s", "m2/s"} {
		if quantity.KnownUnit(k, u) {
			return u
		}
	}
	return quantity.Units(k)[0]
}

// cellsHaveUnit reports whether the column's cells in the sample rows
// that are not blank or missing are all values of kind written with a
// unit, and at least one is.
func cellsHaveUnit(sample [][]string, col int, kind quantity.Kind, missing []string) bool {
	seen := false
	for _, row := range sample {
		if col >= len(row) {
			continue
		}
		t := strings.TrimSpace(row[col])
		if t == "" || inputs.Missing(t, missing) {
			continue
		}
		v, err := quantity.ParseDefault(kind, t, "")
		if err != nil || v.Unit == "" {
			return false
		}
		seen = true
	}
	return seen
}

// refuseUnmatched refuses, in one line, the columns that match no
// quantity but read like one (a quantity word or a unit in the header),
// and marks the others unused. A girth is named as such: it is a
// circumference, not a diameter.
func (m *mapping) refuseUnmatched() error {
	used := make([]bool, len(m.header))
	for f := range m.col {
		if m.col[f] >= 0 {
			used[m.col[f]] = true
		}
		if m.sdCol[f] >= 0 {
			used[m.sdCol[f]] = true
		}
	}
	var bad []string
	for i, h := range m.header {
		if used[i] || m.use[i] == useIgnored {
			continue
		}
		name, unit := headerParts(h)
		h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
		c := inputs.Compact(name)
		switch {
		case strings.Contains(c, "girth") || strings.Contains(c, "circumf"):
			return fmt.Errorf("column %q is a girth (a circumference), not a diameter: add a diameter column (girth/π) or leave it out with --ignore %q", h, h)
		case slices.Contains(Computed, h) || slices.Contains(UncertaintyColumns, h):
			m.use[i] = useComputed
		case inputs.LooksLikeQuantity(name) || knownUnitOfAnyField(unit):
			bad = append(bad, fmt.Sprintf("%q", h))
		default:
			m.use[i] = useNone
		}
	}
	switch len(bad) {
	case 0:
		return nil
	case 1:
		return fmt.Errorf("column %s looks like a measurement but matches no quantity; map it with --column QUANTITY=%s or leave it out with --ignore %s ('flowregime columns' lists the spellings)", bad[0], bad[0], bad[0])
	}
	return fmt.Errorf("columns %s and %s look like measurements but match no quantity; map each with --column QUANTITY=HEADER or leave it out with --ignore HEADER ('flowregime columns' lists the spellings)", strings.Join(bad[:len(bad)-1], ", "), bad[len(bad)-1])
}

// useNone marks a column that holds no quantity in mapping.use, and
// useComputed one that batch writes (a table that is batch output).
const (
	useNone     = "not used"
	useComputed = "computed"
)

func fieldNames() string {
	names := make([]string, len(inputs.Fields))
	for i, f := range inputs.Fields {
		names[i] = f.Name
	}
	return strings.Join(names, ", ")
}

// MatchHeader returns the quantity a header names ("" if none) and the unit
// it states, by the rules batch uses.
func MatchHeader(h string) (field, unit string) {
	f, u := splitHeader(h)
	if f < 0 {
		return "", ""
	}
	return inputs.Fields[f].Name, u
}
