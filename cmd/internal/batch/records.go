package batch

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"strings"
	"unsafe"
)

// maxRecord bounds one record; a longer line is rejected, not held in
// memory, and a quoted field running past it is not followed further.
const maxRecord = 8 << 20

// maxRecordLines bounds the lines one record may span through quoted
// fields; a quoted field still open after it is not followed further.
const maxRecordLines = 1000

// chunkSize is the amount of input handed to a worker at a time;
// uncertainChunk when each row takes thousands of evaluations, so that even
// a short table spreads over the workers.
const (
	chunkSize      = 256 << 10
	uncertainChunk = 4 << 10
)

// recordRule says where records end. It follows RFC 4180 (Shafranovich
// 2005, §2) as people's files need it:
//   - a double quote opens a quoted field only as the first byte of a field;
//     anywhere else (5" long) it is text;
//   - in a quoted field "" is a quote, and a quote followed by the
//     delimiter, a line end or the end of input closes the field;
//   - a record ends at the first newline outside a quoted field.
//
// A record that runs over several lines is kept whole only if it is well
// formed: every quoted field closed as above, at most maxRecordLines lines
// and maxRecord bytes, and, when fields > 0 (the header's), exactly that
// many fields and no line beginning inside a quoted field with fields-1 or
// more delimiters (such a line is a row swallowed by a quote left open).
// Otherwise (a quote never closed, text after a closing quote, a quoted
// field running on too far or swallowing rows) the record is its first line
// alone, which is then rejected, and reading goes on at the next line.
type recordRule struct {
	quotes bool // CSV and TSV; false for JSON Lines, whose strings hold no raw newline
	delim  byte
	fields int // fields a record spanning lines must have; 0 for any number
}

// recordEnd finds the record starting at data[start]: end is the index of
// its line ending (the \n, or len(data)), next the start of the record after
// it. final says that data ends the input; without it, ok is false when the
// record cannot be decided without more input.
func (r recordRule) recordEnd(data string, start int, final bool) (end, next int, ok bool) {
	nl := strings.IndexByte(data[start:], '\n')
	if nl >= 0 && (!r.quotes || strings.IndexByte(data[start:start+nl], '"') < 0) {
		return start + nl, start + nl + 1, true
	}
	if !r.quotes || nl < 0 && strings.IndexByte(data[start:], '"') < 0 {
		return r.firstLine(data, start, final)
	}
	end, state := r.quotedEnd(data, start, final)
	switch state {
	case recordWhole:
		if end == len(data) {
			return end, end, true
		}
		return end, end + 1, true
	case recordUndecided:
		return 0, 0, false
	}
	return r.firstLine(data, start, final)
}

// firstLine is the record that is the line at start alone.
func (recordRule) firstLine(data string, start int, final bool) (end, next int, ok bool) {
	if k := strings.IndexByte(data[start:], '\n'); k >= 0 {
		return start + k, start + k + 1, true
	}
	if final {
		return len(data), len(data), true
	}
	return 0, 0, false
}

type recordState int

const (
	recordWhole     recordState = iota // a well-formed record, ending at end
	recordFirstLine                    // ill-formed: the record is its first line
	recordUndecided                    // more input is needed
)

// quotedEnd scans a record that holds a double quote, field by field.
func (r recordRule) quotedEnd(data string, start int, final bool) (end int, state recordState) {
	fields, lines := 1, 0
	// done checks a record ending at i.
	done := func(i int) (int, recordState) {
		if lines > 0 && (r.fields > 0 && fields != r.fields || i-start > maxRecord) {
			return 0, recordFirstLine
		}
		return i, recordWhole
	}
	for i := start; ; {
		if i == len(data) {
			if !final && (lines == 0 || i-start <= maxRecord) {
				return 0, recordUndecided
			}
			return done(i)
		}
		if data[i] == '"' {
			j, st := r.quotedField(data, i+1, final, start, &lines)
			if st != recordWhole {
				return 0, st
			}
			i = j // just past the closing quote, at a delimiter, line end or the end
			if i < len(data) && data[i] == '\r' {
				i++ // quotedField checked that \n follows
			}
		}
		for ; i < len(data) && data[i] != r.delim && data[i] != '\n'; i++ {
		}
		switch {
		case i == len(data):
			continue
		case data[i] == '\n':
			return done(i)
		}
		fields++
		i++
	}
}

// quotedField reads the quoted field whose text starts at data[i] and
// returns the index just past its closing quote. lines counts the newlines
// in the record's quoted fields.
func (r recordRule) quotedField(data string, i int, final bool, start int, lines *int) (int, recordState) {
	f := fieldLines{rule: r}
	for {
		k := strings.IndexByte(data[i:], '"')
		if k < 0 {
			if !f.text(data[i:], lines) || final || r.tooFar(len(data)-start, *lines) {
				return 0, recordFirstLine
			}
			return 0, recordUndecided
		}
		q := i + k // the quote
		if !f.text(data[i:q], lines) || r.tooFar(q-start, *lines) {
			return 0, recordFirstLine
		}
		if q+1 == len(data) {
			if !final {
				return 0, recordUndecided
			}
			return q + 1, f.closed()
		}
		switch c := data[q+1]; {
		case c == '"':
			i = q + 2
			continue
		case c == r.delim || c == '\n':
			return q + 1, f.closed()
		case c == '\r' && q+2 < len(data) && data[q+2] == '\n':
			return q + 1, f.closed()
		case c == '\r' && q+2 == len(data) && !final:
			return 0, recordUndecided
		case c == '\r' && q+2 == len(data):
			return q + 1, f.closed() // a final \r is dropped as a line ending
		}
		return 0, recordFirstLine // text after the closing quote
	}
}

// fieldLines watches the lines inside one quoted field: a line that begins
// inside it and holds as many delimiters as a row (rule.fields - 1 or more)
// is taken for a row swallowed by a quote left open, not for text.
type fieldLines struct {
	rule    recordRule
	afterNL bool // the current line began inside the field
	delims  int  // delimiters in the current line so far
}

// text takes the next run of the field's text (without quotes) and reports
// whether every line it ends is plain text.
func (f *fieldLines) text(s string, lines *int) bool {
	for {
		k := strings.IndexByte(s, '\n')
		if k < 0 {
			if f.afterNL {
				f.delims += strings.Count(s, string(f.rule.delim))
			}
			return true
		}
		if f.afterNL {
			f.delims += strings.Count(s[:k], string(f.rule.delim))
			if f.rowLike() {
				return false
			}
		}
		*lines++
		f.afterNL, f.delims = true, 0
		s = s[k+1:]
	}
}

func (f *fieldLines) rowLike() bool {
	return f.afterNL && f.rule.fields > 0 && f.delims >= f.rule.fields-1
}

// closed is the state of the record when the field closes: its last line
// is checked as the others.
func (f *fieldLines) closed() recordState {
	if f.rowLike() {
		return recordFirstLine
	}
	return recordWhole
}

// tooFar reports whether a record has run past the bounds.
func (recordRule) tooFar(size, lines int) bool {
	return size > maxRecord || lines >= maxRecordLines
}

// chunk is a run of whole records.
type chunk struct {
	seq       int
	data      string // immutable, so that records and fields are substrings of it
	firstLine int    // line number of the first byte of data (1-based)
	overlong  []int  // lines of records skipped for length just before data
	eof       bool
}

// chunker cuts a stream into chunks at record ends, as rule finds them.
type chunker struct {
	r        io.Reader
	buf      []byte
	rule     recordRule
	line     int
	seq      int
	eof      bool
	overlong []int
	size     int // bytes per chunk, about
}

func newChunker(r io.Reader, rule recordRule, line, size int) *chunker {
	return &chunker{r: r, rule: rule, line: line, size: size}
}

// next returns the next chunk, or io.EOF. A line longer than maxRecord is
// skipped and its line number handed on with the next chunk, an empty one
// at the end of the input if need be.
func (c *chunker) next() (*chunk, error) {
	for {
		if c.firstLineOverlong() {
			if err := c.skipOverlong(); err != nil {
				return nil, err
			}
			continue
		}
		if len(c.buf) >= c.size || c.eof {
			if cut := c.boundary(c.size); cut > 0 {
				return c.emit(cut), nil
			}
		}
		if c.eof {
			if len(c.overlong) > 0 {
				return c.emit(0), nil
			}
			return nil, io.EOF
		}
		if err := c.fill(); err != nil {
			return nil, err
		}
	}
}

func (c *chunker) fill() error {
	if cap(c.buf)-len(c.buf) < chunkSize/2 {
		nb := make([]byte, len(c.buf), 2*cap(c.buf)+chunkSize)
		copy(nb, c.buf)
		c.buf = nb
	}
	n, err := c.r.Read(c.buf[len(c.buf):cap(c.buf)])
	c.buf = c.buf[:len(c.buf)+n]
	if errors.Is(err, io.EOF) {
		c.eof = true
		return nil
	}
	return err
}

// boundary returns the index just past the last record that ends within
// the first limit bytes of buf, or just past the first record if that one
// is longer; 0 if not even the first record can be decided yet.
func (c *chunker) boundary(limit int) int {
	b := c.buf[:min(limit, len(c.buf))]
	if !c.rule.quotes || bytes.IndexByte(b, '"') < 0 {
		if last := bytes.LastIndexByte(b, '\n') + 1; last > 0 {
			return last
		}
	}
	if len(c.buf) == 0 {
		return 0
	}
	// The buffer is only read while data is in use.
	data := unsafe.String(&c.buf[0], len(c.buf))
	last := 0
	for last < len(data) {
		_, next, ok := c.rule.recordEnd(data, last, c.eof)
		if !ok || next > limit && last > 0 {
			break
		}
		last = next
	}
	return last
}

func (c *chunker) emit(cut int) *chunk {
	data := string(c.buf[:cut])
	rest := copy(c.buf, c.buf[cut:])
	c.buf = c.buf[:rest]
	ch := &chunk{seq: c.seq, data: data, firstLine: c.line, overlong: c.overlong, eof: c.eof && rest == 0}
	c.overlong = nil
	c.seq++
	c.line += strings.Count(data, "\n")
	return ch
}

// firstLineOverlong reports whether the line at the start of buf is longer
// than maxRecord.
func (c *chunker) firstLineOverlong() bool {
	return len(c.buf) > maxRecord && bytes.IndexByte(c.buf[:maxRecord+1], '\n') < 0
}

// skipOverlong discards the line at the start of buf, longer than
// maxRecord, and notes its number; reading goes on at the next line.
func (c *chunker) skipOverlong() error {
	c.overlong = append(c.overlong, c.line)
	for {
		if i := bytes.IndexByte(c.buf, '\n'); i >= 0 {
			c.line++
			c.buf = c.buf[:copy(c.buf, c.buf[i+1:])]
			return nil
		}
		c.buf = c.buf[:0]
		if c.eof {
			return nil
		}
		if err := c.fill(); err != nil {
			return err
		}
	}
}

func blank(rec string) bool { return len(strings.TrimSpace(rec)) == 0 }

// eachRecord calls fn for each record of data (the whole input, or a
// chunk) with its line offset from data's first line; rec excludes the line
// ending (\n or \r\n).
func eachRecord(data string, rule recordRule, fn func(rec string, lineOff int)) {
	line := 0
	for pos := 0; pos < len(data); {
		end, next, _ := rule.recordEnd(data, pos, true)
		fn(trimCR(data[pos:end]), line)
		line += strings.Count(data[pos:next], "\n")
		pos = next
	}
}

// eachCSVRecord is eachRecord for CSV and TSV with each record also split
// into fields, as splitFields does: a record without a quote at the start
// of a field is split in the same pass that finds its end; one with such a
// quote is found and split as eachRecord and splitFields do. fields is
// valid until fn returns; the returned slice is for reuse.
func eachCSVRecord(data string, rule recordRule, dst []string, fn func(rec string, fields []string, err error, lineOff int)) []string {
	delim := rule.delim
	line := 0
	for pos := 0; pos < len(data); {
		start := pos
		fields, fstart, i := splitPlain(data, start, delim, dst[:0])
		if i < len(data) && data[i] == '"' {
			var lines int
			dst, lines, pos = rule.quotedRecord(data, start, dst, line, fn)
			line += lines
			continue
		}
		end := i
		if end > start && data[end-1] == '\r' {
			end--
		}
		fields = append(fields, data[fstart:max(fstart, end)])
		fn(data[start:end], fields, nil, line)
		dst, line, pos = fields, line+1, i+1
	}
	return dst
}

// splitPlain appends the fields of the record at start to fields up to its
// newline, or up to a quote at the start of a field (a quote elsewhere is
// text), and returns them with the start of the last field and the index
// where it stopped. Kept apart and not inlined, so that its loop keeps its
// values in registers (inlined into eachCSVRecord, they spilled to the
// stack and reading a plain survey took about 20 % more CPU).
//
//go:noinline
func splitPlain(data string, start int, delim byte, fields []string) ([]string, int, int) {
	fstart, i := start, start
	for {
		for ; i < len(data); i++ {
			if c := data[i]; c == delim {
				fields = append(fields, data[fstart:i])
				fstart = i + 1
			} else if c == '\n' || c == '"' {
				break
			}
		}
		if i == len(data) || data[i] == '\n' || i == fstart {
			return fields, fstart, i
		}
		i++ // a quote inside a field
	}
}

// quotedRecord finds and splits the record at start, which holds a quote
// at the start of a field, and hands it to fn; it returns the fields for
// reuse, the lines the record spans and where the next one starts.
func (r recordRule) quotedRecord(data string, start int, dst []string, line int, fn func(rec string, fields []string, err error, lineOff int)) ([]string, int, int) {
	end, next, _ := r.recordEnd(data, start, true)
	rec := trimCR(data[start:end])
	fields, err := splitFields(dst[:0], rec, r.delim)
	fn(rec, fields, err, line)
	return fields, strings.Count(data[start:next], "\n"), next
}

func trimCR(rec string) string {
	if len(rec) > 0 && rec[len(rec)-1] == '\r' {
		return rec[:len(rec)-1]
	}
	return rec
}

var (
	errUnclosed   = fmt.Errorf(`a quoted field opened on this line is not closed so as to make a whole row within %d lines; the line is read alone (write "" for a quote inside a quoted field)`, maxRecordLines)
	errAfterQuote = errors.New(`text after the closing quote of a quoted field; write "" for a quote inside a quoted field`)
)

// splitFields splits one CSV or TSV record into fields by recordRule's
// quoting, appending to dst. Unquoted fields are substrings of the record,
// so a row without doubled quotes costs no allocation.
func splitFields(dst []string, srec string, delim byte) ([]string, error) {
	for i := 0; ; {
		if i < len(srec) && srec[i] == '"' {
			j := i + 1
			var b []byte // only for fields with doubled quotes
			start := j
			for {
				k := strings.IndexByte(srec[j:], '"')
				if k < 0 {
					return dst, errUnclosed
				}
				if j+k+1 < len(srec) && srec[j+k+1] == '"' {
					b = append(b, srec[start:j+k+1]...)
					j += k + 2
					start = j
					continue
				}
				if b != nil {
					b = append(b, srec[start:j+k]...)
					dst = append(dst, string(b))
				} else {
					dst = append(dst, srec[start:j+k])
				}
				j += k + 1
				break
			}
			if j == len(srec) {
				return dst, nil
			}
			if srec[j] != delim {
				return dst, errAfterQuote
			}
			i = j + 1
			continue
		}
		k := strings.IndexByte(srec[i:], delim)
		if k < 0 {
			dst = append(dst, srec[i:])
			return dst, nil
		}
		dst = append(dst, srec[i:i+k])
		i += k + 1
	}
}

// special marks the bytes that make a CSV or TSV field need quotes.
var special = func() (t [2][256]bool) {
	for i, d := range []byte{',', '\t'} {
		for _, c := range []byte{d, '"', '\n', '\r'} {
			t[i][c] = true
		}
	}
	return t
}()

// appendField appends s to b as a CSV/TSV field, quoting when needed.
func appendField(b []byte, s string, delim byte) []byte {
	if !needsQuote(s, delim) {
		return append(b, s...)
	}
	return appendQuoted(b, s)
}

// needsQuote reports whether s must be quoted as a CSV/TSV field.
func needsQuote(s string, delim byte) bool {
	sp := &special[0]
	if delim != ',' {
		sp = &special[1]
	}
	for i := 0; i < len(s); i++ {
		if sp[s[i]] || s[i] == delim {
			return true
		}
	}
	return len(s) > 0 && (s[0] == ' ' || s[len(s)-1] == ' ')
}

// appendQuoted appends s in double quotes, doubling the quotes inside.
func appendQuoted(b []byte, s string) []byte {
	b = append(b, '"')
	for {
		i := strings.IndexByte(s, '"')
		if i < 0 {
			break
		}
		b = append(append(b, s[:i+1]...), '"')
		s = s[i+1:]
	}
	return append(append(b, s...), '"')
}

var errOverlong = fmt.Errorf("record longer than %d MiB; not read", maxRecord>>20)

// fieldCountError is the reason for a record whose field count is not the
// header's.
func fieldCountError(n, header int) error {
	return fmt.Errorf("has %d fields, the header has %d", n, header)
}

// skipBOM drops a UTF-8 byte order mark at the start of the input.
func skipBOM(br *bufio.Reader) {
	if b, err := br.Peek(3); err == nil && bytes.Equal(b, []byte("\ufeff")) {
		br.Discard(3)
	}
}

// Record is one record of a table read by Reader.
type Record struct {
	Line   int      // line where the record starts
	Fields []string // as many as the header's; nil when Err is set
	Text   string   // the record as read; empty for one too long to hold
	Err    error    // why the record cannot be read (quoting, length, field count)
}

// Reader reads a CSV or TSV table by the rule batch uses (recordRule): the
// header, then each record with its line. A record that cannot be read is
// returned with its reason, and reading goes on; blank lines are skipped.
type Reader struct {
	header []string
	ck     *chunker
	recs   []Record
	fields []string
}

// NewReader reads the header of a CSV (delim ',') or TSV ('\t') table; an
// error is a header problem or a read failure.
func NewReader(r io.Reader, delim byte) (*Reader, error) {
	br := bufio.NewReaderSize(r, 64<<10)
	skipBOM(br)
	header, _, n, rest, err := readCSVHeader(br, delim)
	if err != nil {
		return nil, err
	}
	body := io.MultiReader(bytes.NewReader(rest), br)
	rule := recordRule{quotes: true, delim: delim, fields: len(header)}
	return &Reader{header: header, ck: newChunker(body, rule, 1+n, chunkSize)}, nil
}

// Header returns the header's fields.
func (r *Reader) Header() []string { return r.header }

// Next returns the next record, io.EOF after the last, or a read failure.
func (r *Reader) Next() (Record, error) {
	for len(r.recs) == 0 {
		c, err := r.NextChunk()
		if err != nil {
			return Record{}, err
		}
		r.recs = r.recs[:0]
		r.fields = c.Each(r.fields, func(rec Record) {
			if rec.Err == nil {
				rec.Fields = append([]string(nil), rec.Fields...)
			}
			r.recs = append(r.recs, rec)
		})
	}
	rec := r.recs[0]
	r.recs = r.recs[1:]
	return rec, nil
}

// Chunk is a run of whole records of a table, about 256 KiB, from
// Reader.NextChunk; Each splits it, in any goroutine, so that the records
// of one table can be split and used by several at once.
type Chunk struct {
	c      *chunk
	rule   recordRule
	header int
}

// NextChunk returns the next run of records, io.EOF after the last, or a
// read failure. Next and NextChunk are not to be mixed on one Reader.
func (r *Reader) NextChunk() (Chunk, error) {
	c, err := r.ck.next()
	if err != nil {
		return Chunk{}, err
	}
	return Chunk{c: c, rule: r.ck.rule, header: len(r.header)}, nil
}

// Each calls fn with each record of the chunk in order, as Next returns
// them, except that Fields and Text are substrings of the chunk and Fields
// is valid only until fn returns. fields is a slice to reuse; the returned
// one is for the next call.
func (c Chunk) Each(fields []string, fn func(Record)) []string {
	for _, l := range c.c.overlong {
		fn(Record{Line: l, Err: errOverlong})
	}
	return eachCSVRecord(c.c.data, c.rule, fields, func(rec string, fields []string, err error, off int) {
		if blank(rec) {
			return
		}
		if err == nil && len(fields) != c.header {
			err = fieldCountError(len(fields), c.header)
		}
		out := Record{Line: c.c.firstLine + off, Text: rec, Err: err}
		if err == nil {
			out.Fields = fields
		}
		fn(out)
	})
}
