// Package surveypage writes the survey report: one self-contained HTML
// file (inline CSS and figures, no scripts, nothing fetched from a network)
// that says what was computed from which columns, what was rejected and
// why, where the rows sit in the flow regimes, the per-group summaries and
// scaling fits, the flagged rows, the methods with their sources and the
// cautions. Every text is escaped by html/template.
package surveypage

import (
	"bytes"
	_ "embed"
	"encoding/base64"
	"html/template"
	"io"
	"strconv"
	"strings"
)

// Page is everything the report shows.
type Page struct {
	Title   string
	Input   string // the survey as named on the command line
	Command string // the command line that produced the page
	Version string

	Counts   Counts
	Columns  []Column  // what was read from each input column
	Assumed  []Assumed // constants and defaults for quantities without a column
	Rejects  []Reject  // the first MaxListed rejected rows
	Regimes  []Share   // regime shares per group
	GroupBy  string    // the grouping columns, "" for one group
	Groups   Table     // per-group summaries
	Fits     Table     // scaling fits
	Figures  []Figure  // regime map, scaling fits
	Suspect  []Flagged // the first MaxListed rows whose inputs look wrong
	Limits   []Flagged // the first MaxListed rows with only method-limit flags
	Ident    []string  // the columns that identify a flagged row
	FlagKeys []FlagKey // each flag met, its meaning and count
	Methods  []Method  // methods used, with sources
	Cautions []string
}

// MaxListed bounds the rejected and the flagged rows listed in the page;
// the counts are always complete and the page says how many are left out.
const MaxListed = 500

// Counts are the run's totals.
type Counts struct {
	Read, Computed, Rejected, Blank int
	Suspect, Limits                 int // rows flagged: inputs that look wrong; only method limits
}

// Flagged is the number of rows with any flag.
func (c Counts) Flagged() int { return c.Suspect + c.Limits }

// RejectsLeftOut counts the rejected rows not listed.
func (p Page) RejectsLeftOut() int { return p.Counts.Rejected - len(p.Rejects) }

// SuspectLeftOut and LimitsLeftOut count the flagged rows not listed.
func (p Page) SuspectLeftOut() int { return p.Counts.Suspect - len(p.Suspect) }

// LimitsLeftOut counts the rows at a method's limit not listed.
func (p Page) LimitsLeftOut() int { return p.Counts.Limits - len(p.Limits) }

// Column is one input column and what was read from it.
type Column struct {
	Name        string
	Quantity    string // "" when carried through unread
	Unit        string // "" when each cell gives its own
	Uncertainty bool
	Word        bool // a quantity written as a word (medium, shape), without a unit
}

// UnitInCells reports whether any column read takes its unit from each
// cell.
func (p Page) UnitInCells() bool {
	for _, c := range p.Columns {
		if c.Quantity != "" && !c.Word && c.Unit == "" {
			return true
		}
	}
	return false
}

// Assumed is a value in force for a quantity that has no column.
type Assumed struct {
	Quantity, Value, Origin string
}

// Reject is a row that could not be computed.
type Reject struct {
	Line, Row      int
	Column, Reason string
}

// Share is one group's share of rows in each regime, in per cent.
type Share struct {
	Group                           string
	N                               int
	Viscous, Intermediate, Inertial float64
}

// Table is a header and rows of text.
type Table struct {
	Head []string
	Rows [][]string
}

// Figure is an SVG figure with its caption.
type Figure struct {
	ID      string // anchor in the page
	Title   string
	Caption string
	SVG     []byte
}

// Src is the figure as a data URI, so that the page needs no other file.
// An SVG shown through an image cannot run scripts or fetch anything.
func (f Figure) Src() template.URL {
	return template.URL("data:image/svg+xml;base64," + base64.StdEncoding.EncodeToString(f.SVG))
}

// Flagged is a row with flags.
type Flagged struct {
	Row   int      // data row of the input, 1-based
	Ident []string // identifying cells (the columns in Page.Ident)
	Re    string
	St    string
	Flags []string
}

// FlagKey is one flag, what it means and how many rows carry it.
type FlagKey struct {
	Code, Meaning string
	Count         int
}

// Method is a method used and its source.
type Method struct {
	What, Method string
	Rows         int // rows it served, 0 when not counted per row
}

// flagTable is one table of flagged rows.
type flagTable struct {
	ID             string
	Ident          []string
	Rows           []Flagged
	Total, LeftOut int
}

//go:embed page.html.tmpl
var pageTemplate string

var tmpl = template.Must(template.New("page").Funcs(template.FuncMap{
	"join": strings.Join,
	"add":  func(a, b float64) float64 { return a + b },
	// parts splits a summary cell "median [low–high]" where it may wrap.
	"parts": func(cell string) []string {
		if a, b, ok := strings.Cut(cell, " ["); ok {
			return []string{a, "[" + b}
		}
		return []string{cell}
	},
	"flagTable": func(id string, ident []string, rows []Flagged, total, leftOut int) flagTable {
		return flagTable{ID: id, Ident: ident, Rows: rows, Total: total, LeftOut: leftOut}
	},
	"pct": func(v float64) string { return strconv.FormatFloat(v, 'f', 1, 64) },
}).Parse(pageTemplate))

// Write writes the page as HTML. Control characters from the survey
// (other than tab and line breaks) are shown as their Unicode control
// pictures (U+0001 as ␁) and bytes that are not UTF-8 as U+FFFD, so that
// the page stays well-formed (XML 1.0 admits neither) and shows them.
func Write(w io.Writer, p Page) error {
	var b bytes.Buffer
	if err := tmpl.Execute(&b, p); err != nil {
		return err
	}
	_, err := io.WriteString(w, Shown(b.String()))
	return err
}

// Shown is s as the page shows it: control characters as their control
// pictures, bytes that are not UTF-8 as U+FFFD. Text drawn into a figure
// goes through it too, since an SVG with a control character is not
// drawn at all.
func Shown(s string) string { return strings.Map(controlPicture, strings.ToValidUTF8(s, "\uFFFD")) }

// controlPicture maps a C0 control character other than tab, line feed
// and carriage return, and DEL, to its symbol in the Control Pictures block.
func controlPicture(r rune) rune {
	switch {
	case r == '\t' || r == '\n' || r == '\r':
		return r
	case r < 0x20:
		return 0x2400 + r
	case r == 0x7f:
		return 0x2421
	}
	return r
}
