package report

import (
	"bytes"
	"fmt"
	"io"
	"slices"
	"strings"

	"github.com/mattn/go-runewidth"
)

// Sized is a writer that knows how many columns its reader sees: a
// terminal's width, or a width asked for with --width or COLUMNS. Table
// fits its output to it; 0 means no limit (a file, a pipe).
type Sized interface {
	Columns() int
}

// columnsOf returns the width w asks for, 0 when it asks for none.
func columnsOf(w io.Writer) int {
	if s, ok := w.(Sized); ok {
		return s.Columns()
	}
	return 0
}

// MinColumns is the narrowest width a table is fitted to; a smaller
// --width is refused by the commands (common practice, no source: below
// it not even a label and a number share a line).
const MinColumns = 20

// fitTable renders the table in the first layout that is at most width
// columns wide: as it is; with headers broken over lines at their spaces
// (no narrower than their column's cells); then with the widest column's
// cells broken at their spaces, by as much as the table is too wide but
// not inside a word, one column after another; else
// vertically, one block of "header  value" lines per row. width ≤ 0 means
// no limit.
func fitTable(w io.Writer, width int, headers []string, rows [][]string) error {
	var buf bytes.Buffer
	if err := render(&buf, headers, rows); err != nil {
		return err
	}
	if width <= 0 || widest(buf.String()) <= width {
		_, err := w.Write(buf.Bytes())
		return err
	}
	cells, limits := rows, map[int]int{}
	for {
		wrapped := make([]string, len(headers))
		for i, h := range headers {
			wrapped[i] = wrapWords(h, max(longestWord(h), columnWidth(cells, i)))
		}
		buf.Reset()
		if err := render(&buf, wrapped, cells); err != nil {
			return err
		}
		excess := widest(buf.String()) - width
		if excess <= 0 {
			_, err := w.Write(buf.Bytes())
			return err
		}
		i := widestBreakable(cells)
		if i < 0 {
			break
		}
		limits[i] = max(columnWord(cells, i), columnWidth(cells, i)-excess)
		cells = wrapColumns(rows, limits)
	}
	_, err := io.WriteString(w, vertical(width, headers, rows))
	return err
}

// columnWidth is the display width of column i's widest cell line.
func columnWidth(rows [][]string, i int) int {
	most := 0
	for _, r := range rows {
		if i < len(r) {
			most = max(most, widest(r[i]))
		}
	}
	return most
}

// columnWord is the display width of column i's longest word.
func columnWord(rows [][]string, i int) int {
	most := 0
	for _, r := range rows {
		if i < len(r) {
			most = max(most, longestWord(r[i]))
		}
	}
	return most
}

// widestBreakable is the widest column whose cells can still break at a
// space, or −1.
func widestBreakable(rows [][]string) int {
	best, bestWidth := -1, 0
	n := 0
	for _, r := range rows {
		n = max(n, len(r))
	}
	for i := range n {
		cw := columnWidth(rows, i)
		if cw > columnWord(rows, i) && cw > bestWidth {
			best, bestWidth = i, cw
		}
	}
	return best
}

// wrapColumns breaks the cells of each column in limits at their spaces
// to its limit; other columns stay as they are.
func wrapColumns(rows [][]string, limits map[int]int) [][]string {
	out := make([][]string, len(rows))
	for j, r := range rows {
		out[j] = slices.Clone(r)
		for i, limit := range limits {
			if i < len(r) {
				out[j][i] = wrapWords(r[i], limit)
			}
		}
	}
	return out
}

// widest is the display width of the longest line of s.
func widest(s string) int {
	most := 0
	for line := range strings.SplitSeq(s, "\n") {
		most = max(most, runewidth.StringWidth(line))
	}
	return most
}

// longestWord is the display width of the longest space-separated word
// of s.
func longestWord(s string) int {
	most := 0
	for _, f := range strings.Fields(s) {
		most = max(most, runewidth.StringWidth(f))
	}
	return most
}

// wrapWords breaks s at spaces into lines of at most limit columns, but
// never inside a word; existing line breaks stay.
func wrapWords(s string, limit int) string {
	var out []string
	for para := range strings.SplitSeq(s, "\n") {
		line := ""
		for _, word := range strings.Fields(para) {
			switch {
			case line == "":
				line = word
			case runewidth.StringWidth(line)+1+runewidth.StringWidth(word) <= limit:
				line += " " + word
			default:
				out = append(out, line)
				line = word
			}
		}
		out = append(out, line)
	}
	return strings.Join(out, "\n")
}

// vertical lays each row out as lines of "header  value", the headers
// aligned, rows separated by a rule; a value too long for its line
// continues, broken at spaces, under itself.
func vertical(width int, headers []string, rows [][]string) string {
	labels := make([]string, len(headers))
	labelWidth := 0
	for i, h := range headers {
		labels[i] = strings.Join(strings.Fields(h), " ")
		labelWidth = max(labelWidth, runewidth.StringWidth(labels[i]))
	}
	labelWidth = min(labelWidth, width/2)
	room := max(width-labelWidth-2, 1)
	rule := strings.Repeat("─", width)
	var b strings.Builder
	for j, r := range rows {
		if j > 0 {
			b.WriteString(rule + "\n")
		}
		for i, c := range r {
			label := ""
			if i < len(labels) {
				label = labels[i]
			}
			lines := cutLines(wrapWords(strings.Join(strings.Fields(c), " "), room), room)
			for k, line := range lines {
				if k > 0 {
					label = ""
				}
				for _, l := range strings.Split(wrapWords(label, labelWidth), "\n") {
					pad := labelWidth - runewidth.StringWidth(l)
					b.WriteString(strings.TrimRight(l+strings.Repeat(" ", max(pad, 0))+"  "+line, " ") + "\n")
					line = ""
				}
			}
		}
	}
	return b.String()
}

// cutLines splits text into its lines, cutting any line wider than limit
// into pieces (a word longer than the whole width has to break somewhere).
func cutLines(text string, limit int) []string {
	var out []string
	for line := range strings.SplitSeq(text, "\n") {
		for runewidth.StringWidth(line) > limit {
			head := runewidth.Truncate(line, limit, "")
			if head == "" { // a character wider than the limit
				break
			}
			out = append(out, head)
			line = line[len(head):]
		}
		out = append(out, line)
	}
	return out
}

// Paragraph writes text as one line, or, when w is [Sized] and the line
// is too long, broken at spaces to its width: continuation lines keep the
// text's own leading spaces and add indent.
func Paragraph(w io.Writer, indent, text string) {
	text = Printable(text)
	width := columnsOf(w)
	if width <= 0 || runewidth.StringWidth(text) <= width {
		fmt.Fprintln(w, text)
		return
	}
	body := strings.TrimLeft(text, " ")
	lead := strings.Repeat(" ", len(text)-len(body))
	room := max(width-len(lead), 1)
	lines := cutLines(wrapWords(body, room), room)
	fmt.Fprintln(w, lead+lines[0])
	rest := strings.Join(lines[1:], " ")
	if rest == "" {
		return
	}
	room = max(room-runewidth.StringWidth(indent), 1)
	for _, l := range cutLines(wrapWords(rest, room), room) {
		fmt.Fprintln(w, lead+indent+l)
	}
}
