package batch

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/media"
)

// sampleSize bounds the first rows read ahead to see the units of
// unitless columns and to show how rows are read (--explain).
const (
	sampleRowsMax  = 200
	sampleBytesMax = 64 << 10
)

// sampleRows returns up to sampleRowsMax whole, well-formed, non-blank
// records from first (records already read) and what br holds or can
// read into its buffer, without consuming them.
func sampleRows(br *bufio.Reader, first []byte, header []string, delim byte, jsonl bool) [][]string {
	data, _ := br.Peek(min(sampleBytesMax, br.Size()))
	if i := bytes.LastIndexByte(data, '\n'); i >= 0 && len(data) == br.Size() {
		data = data[:i+1] // the last record may be cut
	}
	data = append(append([]byte(nil), first...), data...)
	var rows [][]string
	if jsonl {
		for _, line := range bytes.Split(data, []byte{'\n'}) {
			if len(rows) == sampleRowsMax || blank(string(line)) {
				continue
			}
			keys, _, texts, err := parseObject(bytes.TrimSpace(line))
			if err != nil {
				continue
			}
			row := make([]string, len(header))
			for i, k := range keys {
				if j := indexOf(header, k); j >= 0 {
					row[j] = texts[i]
				}
			}
			rows = append(rows, row)
		}
		return rows
	}
	eachCSVRecord(string(data), recordRule{quotes: true, delim: delim, fields: len(header)}, nil, func(rec string, fields []string, err error, _ int) {
		if err == nil && len(rows) < sampleRowsMax && !blank(rec) && len(fields) == len(header) {
			rows = append(rows, append([]string(nil), fields...))
		}
	})
	return rows
}

// readMapping maps the header by a run's rules: every column is used,
// left out by --ignore, or refused at the header.
func readMapping(header []string, cfg Config, sample [][]string) (*mapping, error) {
	m, err := mapHeader(header, headerRules{columns: cfg.Columns, units: cfg.Units, ignore: cfg.Ignore,
		missing: cfg.Missing, sample: sample, strict: true})
	if err != nil {
		return nil, HeaderError{err}
	}
	for f, fd := range inputs.Fields {
		if v, ok := cfg.Constants[fd.Name]; ok && m.col[f] >= 0 {
			h := strings.TrimSpace(m.header[m.col[f]])
			return nil, HeaderError{fmt.Errorf("--%s %s and column %q both give %s; drop the flag, or leave the column out with --ignore %q", fd.Flag, v, h, fd.Name, h)}
		}
	}
	if _, _, _, ok := cfg.Constants.Lookup(inputs.Length); m.col[inputs.Length] < 0 && !ok {
		return nil, HeaderError{fmt.Errorf("no column holds the length and --length is not given; name a column length (e.g. \"length (mm)\") or use --column length=<header>")}
	}
	if _, _, _, ok := cfg.Constants.Lookup(inputs.Speed); m.col[inputs.Speed] < 0 && !ok {
		return nil, HeaderError{fmt.Errorf("no column holds the speed and --speed is not given; name a column speed (e.g. \"speed (cm/s)\") or use --column speed=<header>")}
	}
	return m, nil
}

// describe is the mapping report: each column and what it became, the
// constants from flags, the defaults in force for quantities that have
// neither, and the cell texts read as missing.
func (m *mapping) describe(cfg Config) []string {
	lines := []string{"columns:"}
	for i, h := range m.header {
		lines = append(lines, fmt.Sprintf("  %q → %s", strings.TrimSpace(strings.TrimPrefix(h, "\ufeff")), m.columnUse(i)))
	}
	var consts []string
	for f, fd := range inputs.Fields {
		if v, ok := cfg.Constants[fd.Name]; ok && m.col[f] < 0 {
			consts = append(consts, fmt.Sprintf("--%s %s", fd.Flag, v))
		}
	}
	if len(consts) > 0 {
		lines = append(lines, "constants for every row: "+strings.Join(consts, ", "))
	}
	if d := m.defaults(cfg); len(d) > 0 {
		lines = append(lines, "defaults where a row gives no value: "+strings.Join(d, "; "))
	}
	tokens := "a blank cell"
	if len(cfg.Missing) > 0 {
		tokens += " or " + strings.Join(quoteAll(cfg.Missing), ", ")
	}
	return append(lines, "missing values: "+tokens+" (absent in an optional column; a row missing its length or speed is rejected)")
}

func quoteAll(ss []string) []string {
	out := make([]string, len(ss))
	for i, s := range ss {
		out[i] = fmt.Sprintf("%q", s)
	}
	return out
}

// columnUse says what the header's column i became.
func (m *mapping) columnUse(i int) string {
	for f, c := range m.col {
		if c == i {
			return m.fieldUse(f)
		}
	}
	for f, c := range m.sdCol {
		if c == i {
			u := m.sdUnit[f]
			if u == "" {
				u = "the unit of " + inputs.Fields[f].Name
			}
			return fmt.Sprintf("standard uncertainty of %s, in %s", inputs.Fields[f].Name, u)
		}
	}
	switch m.use[i] {
	case useIgnored:
		return "not used (--ignore)"
	case useComputed:
		return "not used (a column batch computes; it is computed anew)"
	}
	return "not used (no quantity by this name)"
}

// fieldUse names the quantity a column holds and its unit.
func (m *mapping) fieldUse(f int) string {
	fd := inputs.Fields[f]
	s := fd.Name
	switch {
	case fd.Text:
		s += " (a word)"
	case m.unitFrom[f] == "the cells":
		s += ", in the unit each cell gives"
	case m.unit[f] == "" && fd.Kind == quantity.Angle:
		s += ", in degrees (bare numbers)"
	case m.unit[f] == "":
		if u := quantity.SIUnit(fd.Kind); u != "" {
			s += ", in " + u + " (bare numbers)"
		} else {
			s += " (bare numbers)"
		}
	default:
		s += ", in " + m.unit[f]
		if m.unitFrom[f] == "--unit" {
			s += " (--unit)"
		}
	}
	if f == inputs.Amplitude && inputs.Match(headerName(m.header[m.col[f]])) == inputs.StrokeAngle {
		s += "; a stroke amplitude in a length unit is the tail or fin amplitude"
	}
	if m.use[m.col[f]] == "--column" {
		s += " (--column)"
	}
	return s
}

// headerName is a header without its bracketed unit.
func headerName(h string) string {
	n, _ := headerParts(h)
	return n
}

// defaults lists the values assumed for medium conditions and body shape
// that no column or flag gives (media.Lookup's documented defaults).
func (m *mapping) defaults(cfg Config) []string {
	constant := func(f int) bool { _, ok := cfg.Constants[inputs.Fields[f].Name]; return ok }
	has := func(f int) bool { return m.col[f] >= 0 || constant(f) }
	// where says when a default applies to a quantity that has a column.
	where := func(fs ...int) string {
		for _, f := range fs {
			if m.col[f] >= 0 {
				return fmt.Sprintf(" where %q is blank or missing", strings.TrimSpace(m.header[m.col[f]]))
			}
		}
		return ""
	}
	medium := cfg.DefaultMedium
	if v, ok := cfg.Constants["medium"]; ok {
		medium = v
	}
	anyMedium := m.col[inputs.Medium] >= 0
	water := anyMedium || !strings.EqualFold(medium, media.KindAir)
	air := anyMedium || strings.EqualFold(medium, media.KindAir)
	sea := anyMedium || strings.EqualFold(medium, media.KindSeawater)
	var out []string
	if !constant(inputs.Medium) {
		out = append(out, "medium "+medium+" (--medium)"+where(inputs.Medium))
	}
	if !constant(inputs.Temperature) && !has(inputs.TempOffset) {
		if water {
			out = append(out, fmt.Sprintf("water temperature %g °C", media.DefaultWaterTemperatureC)+where(inputs.Temperature))
		}
		if air {
			out = append(out, "air temperature of the standard atmosphere at the altitude"+where(inputs.Temperature))
		}
	}
	if sea && !constant(inputs.Salinity) {
		out = append(out, fmt.Sprintf("salinity %g g/kg in sea water", media.DefaultSalinityGkg)+where(inputs.Salinity))
	}
	if water && !constant(inputs.Depth) && !constant(inputs.Pressure) {
		out = append(out, fmt.Sprintf("water at its surface (%g kPa at altitude 0)", media.StandardPressurePa/1e3)+where(inputs.Depth, inputs.Pressure))
	}
	if sea && has(inputs.Depth) && !constant(inputs.Latitude) {
		out = append(out, fmt.Sprintf("latitude %g° for a depth in sea water", media.DefaultLatitudeDeg)+where(inputs.Latitude))
	}
	if !constant(inputs.Altitude) && !constant(inputs.Pressure) {
		out = append(out, "altitude 0 m"+where(inputs.Altitude))
	}
	if air && !constant(inputs.Humidity) {
		out = append(out, "dry air (humidity 0 %)"+where(inputs.Humidity))
	}
	if !has(inputs.Diameter) && !has(inputs.Shape) && !has(inputs.DragCoefficient) {
		out = append(out, "body a sphere whose diameter is the length (no diameter or shape)")
	} else if !has(inputs.Shape) && !has(inputs.DragCoefficient) {
		out = append(out, "body a spheroid of the length and diameter where both are given, else a sphere")
	}
	return out
}

// Explain reads the header and a few rows of in and returns the mapping
// report and how the first rows' cells are read, computing nothing. A
// header that would be refused is the same error as in Run.
func Explain(in io.Reader, cfg Config, rows int) ([]string, error) {
	br := bufio.NewReaderSize(in, 64<<10)
	if b, err := br.Peek(3); err == nil && bytes.Equal(b, []byte("\ufeff")) {
		br.Discard(3)
	}
	delim := byte(',')
	if cfg.InFormat == TSV {
		delim = '\t'
	}
	if cfg.Missing == nil {
		cfg.Missing = inputs.DefaultMissing
	}
	hl, err := readHeader(br, cfg, delim)
	if err != nil {
		return nil, err
	}
	sample := sampleRows(br, hl.first, hl.names, delim, cfg.InFormat == JSONL)
	m, err := readMapping(hl.names, cfg, sample)
	if err != nil {
		return nil, err
	}
	lines := m.describe(cfg)
	rc := newRowCells(m, cfg.Constants, cfg.DefaultMedium, false, cfg.Missing)
	for i, row := range sample[:min(rows, len(sample))] {
		lines = append(lines, fmt.Sprintf("data row %d read as: %s", i+1, m.readAs(rc.fill(row))))
	}
	return lines, nil
}

// headerLine is a table's header as read.
type headerLine struct {
	names []string
	raw   []byte // the CSV or TSV header record as written
	lines int    // lines the header record spans (0 with --names or JSON Lines)
	first []byte // input read past the header: JSON Lines' first line (a data row as well as the keys), or CSV or TSV bytes after the header record
}

// readHeader reads the header: --names, the first JSON object's keys, or
// the first CSV or TSV record.
func readHeader(br *bufio.Reader, cfg Config, delim byte) (headerLine, error) {
	switch {
	case len(cfg.Names) > 0:
		return headerLine{names: cfg.Names}, nil
	case cfg.InFormat == JSONL:
		first, err := firstLine(br)
		if err != nil {
			return headerLine{}, err
		}
		keys, _, _, err := parseObject(bytes.TrimSpace(first))
		if err != nil && len(bytes.TrimSpace(first)) > 0 {
			return headerLine{}, HeaderError{fmt.Errorf("line 1: %v", err)}
		}
		return headerLine{names: keys, first: first}, nil
	}
	names, raw, lines, rest, err := readCSVHeader(br, delim)
	if err != nil {
		return headerLine{}, err
	}
	return headerLine{names: names, raw: raw, lines: lines, first: rest}, nil
}

// readAs shows the values of one row's cells in SI units, or why a cell
// cannot be read.
func (m *mapping) readAs(c *inputs.Cells) string {
	var parts []string
	for f, col := range m.col {
		if col < 0 {
			continue
		}
		name := inputs.Fields[f].Name
		switch {
		case c.Err[f] != nil:
			parts = append(parts, fmt.Sprintf("%s: %v", name, c.Err[f]))
		case !c.Given[f]:
			parts = append(parts, name+" absent")
		case inputs.Fields[f].Text:
			parts = append(parts, fmt.Sprintf("%s %q", name, c.Text[f]))
		default:
			parts = append(parts, name+" "+siText(inputs.Fields[f].Kind, c.Value[f]))
		}
	}
	return strings.Join(parts, ", ")
}

// siText writes a value in the library's unit.
func siText(k quantity.Kind, v quantity.Value) string {
	u := quantity.SIUnit(k)
	if v.PerBodyLength {
		u = "BL/s"
	}
	s := fmt.Sprintf("%.4g", v.SI)
	if v.SD > 0 {
		s += fmt.Sprintf(" ± %.2g", v.SD)
	}
	if u != "" {
		s += " " + u
	}
	return s
}
