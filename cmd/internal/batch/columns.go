package batch

import (
	"fmt"
	"maps"
	"slices"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
)

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

// splitHeader splits "length (mm)", "speed [cm/s]" or "temp_C" into a name
// and a unit. A trailing token counts as a unit only if it is one for the
// quantity the rest of the name matches.
func splitHeader(h string) (field int, unit string) {
	h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
	for _, p := range [][2]string{{"(", ")"}, {"[", "]"}} {
		if strings.HasSuffix(h, p[1]) {
			if i := strings.LastIndex(h, p[0]); i > 0 {
				return matchName(h[:i]), strings.TrimSpace(h[i+1 : len(h)-1])
			}
		}
	}
	if f := matchName(h); f >= 0 {
		return f, ""
	}
	if i := strings.LastIndexAny(h, "_ "); i > 0 {
		if f := matchName(h[:i]); f >= 0 && !inputs.Fields[f].Text && quantity.KnownUnit(inputs.Fields[f].Kind, h[i+1:]) {
			return f, h[i+1:]
		}
	}
	return -1, ""
}

// matchName returns the field whose name or alias is the header name, or −1.
func matchName(name string) int {
	n := normName(name)
	for i, f := range inputs.Fields {
		if n == normName(f.Name) {
			return i
		}
		for _, a := range f.Aliases {
			if n == a {
				return i
			}
		}
	}
	return -1
}

// newMapping matches header names to fields. columns maps a field name to
// the exact header that holds it (--column); units maps a field name to the
// unit of its column (--unit).
func newMapping(header []string, columns, units map[string]string) (*mapping, error) {
	m := &mapping{header: header}
	for i := range m.col {
		m.col[i], m.sdCol[i] = -1, -1
	}
	forced := map[int]bool{}
	for _, name := range slices.Sorted(maps.Keys(columns)) { // the same error for the same flags
		h := columns[name]
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
		m.col[f] = idx
		_, m.unit[f] = splitHeader(h)
		forced[idx] = true
	}
	for i, h := range header {
		if f, u := sdHeader(h); f >= 0 && !forced[i] {
			m.sdCol[f], m.sdUnit[f] = i, u
			forced[i] = true
		}
	}
	for i, h := range header {
		if forced[i] {
			continue
		}
		f, unit := splitHeader(h)
		if f < 0 || m.col[f] >= 0 && forced[m.col[f]] {
			continue
		}
		if m.col[f] >= 0 {
			return nil, fmt.Errorf("columns %q and %q both hold %s; choose one with --column %s=<header>", header[m.col[f]], h, inputs.Fields[f].Name, inputs.Fields[f].Name)
		}
		m.col[f], m.unit[f] = i, unit
	}
	for name, u := range units {
		f := inputs.Index(name)
		if f < 0 {
			return nil, fmt.Errorf("--unit %s=%s: unknown quantity %q; accepted: %s", name, u, name, fieldNames())
		}
		if inputs.Fields[f].Text || !quantity.KnownUnit(inputs.Fields[f].Kind, u) {
			return nil, fmt.Errorf("--unit %s=%s: %q is not a unit of %s; accepted: %s", name, u, u, name, strings.Join(quantity.Units(inputs.Fields[f].Kind), ", "))
		}
		m.unit[f] = u
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
