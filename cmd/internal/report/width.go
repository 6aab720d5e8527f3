package report

import (
	"bytes"
	"io"
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
// columns wide: as it is; with headers broken over lines at their spaces;
// with cells broken at their spaces too; else vertically, one block of
// "header  value" lines per row. width ≤ 0 means no limit.
func fitTable(w io.Writer, width int, headers []string, rows [][]string) error {
	var buf bytes.Buffer
	if err := render(&buf, headers, rows); err != nil {
		return err
	}
	if width <= 0 || widest(buf.String()) <= width {
		_, err := w.Write(buf.Bytes())
		return err
	}
	wrappedHeaders := make([]string, len(headers))
	for i, h := range headers {
		wrappedHeaders[i] = wrapWords(h, longestWord(h))
	}
	attempts := [][][]string{rows, wrapColumns(rows)}
	for _, rs := range attempts {
		buf.Reset()
		if err := render(&buf, wrappedHeaders, rs); err != nil {
			return err
		}
		if widest(buf.String()) <= width {
			_, err := w.Write(buf.Bytes())
			return err
		}
	}
	_, err := io.WriteString(w, vertical(width, headers, rows))
	return err
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

// wrapColumns breaks every cell at its spaces to the longest word of its
// column, the narrowest a column can be without cutting words.
func wrapColumns(rows [][]string) [][]string {
	limits := map[int]int{}
	for _, r := range rows {
		for i, c := range r {
			limits[i] = max(limits[i], longestWord(c))
		}
	}
	out := make([][]string, len(rows))
	for j, r := range rows {
		out[j] = make([]string, len(r))
		for i, c := range r {
			out[j][i] = wrapWords(c, limits[i])
		}
	}
	return out
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
