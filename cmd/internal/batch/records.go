package batch

import (
	"bytes"
	"errors"
	"io"
	"strings"
)

// maxRecord bounds one record; a longer one is rejected, not held in memory.
const maxRecord = 8 << 20

// chunkSize is the amount of input handed to a worker at a time;
// uncertainChunk when each row takes thousands of evaluations, so that even
// a short table spreads over the workers.
const (
	chunkSize      = 256 << 10
	uncertainChunk = 4 << 10
)

// chunk is a run of whole records.
type chunk struct {
	seq       int
	data      string // immutable, so that records and fields are substrings of it
	firstLine int    // line number of the first byte of data (1-based)
	overlong  []int  // lines of records skipped for length just before data
	eof       bool
}

// chunker cuts a stream into chunks at record boundaries: newlines outside
// double quotes (quotes are honoured for CSV and TSV; JSON Lines has none
// that matter, since JSON strings cannot hold raw newlines).
type chunker struct {
	r        io.Reader
	buf      []byte
	quotes   bool
	line     int
	seq      int
	eof      bool
	overlong []int
	size     int // bytes per chunk, about
}

func newChunker(r io.Reader, quotes bool, line, size int) *chunker {
	return &chunker{r: r, quotes: quotes, line: line, size: size}
}

// next returns the next chunk, or io.EOF.
func (c *chunker) next() (*chunk, error) {
	for {
		cut := 0
		if len(c.buf) >= c.size || c.eof {
			if cut = c.boundary(c.size); cut == 0 && len(c.buf) > c.size {
				cut = c.boundary(len(c.buf)) // a record longer than a chunk
			}
		}
		if cut > 0 {
			return c.emit(cut), nil
		}
		if c.eof {
			if len(c.buf) > 0 {
				return c.emit(len(c.buf)), nil
			}
			return nil, io.EOF
		}
		if len(c.buf) >= maxRecord {
			if err := c.skipOverlong(); err != nil {
				return nil, err
			}
			continue
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

// boundary returns the index just past the last record end in the first
// limit bytes of buf, 0 if none.
func (c *chunker) boundary(limit int) int {
	b := c.buf[:min(limit, len(c.buf))]
	if !c.quotes || bytes.IndexByte(b, '"') < 0 {
		return bytes.LastIndexByte(b, '\n') + 1
	}
	last, in := 0, false
	for i := 0; i < len(b); {
		j := bytes.IndexAny(b[i:], "\"\n")
		if j < 0 {
			break
		}
		i += j
		if b[i] == '"' {
			in = !in
		} else if !in {
			last = i + 1
		}
		i++
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

// skipOverlong discards a record longer than maxRecord and notes its line.
func (c *chunker) skipOverlong() error {
	c.overlong = append(c.overlong, c.line)
	in := false
	for {
		for i, ch := range c.buf {
			switch {
			case ch == '"' && c.quotes:
				in = !in
			case ch == '\n':
				c.line++
				if !in {
					rest := copy(c.buf, c.buf[i+1:])
					c.buf = c.buf[:rest]
					return nil
				}
			}
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

// eachRecord calls fn for each record of data with its line offset from
// the chunk's first line; rec excludes the line ending (\n or \r\n).
func eachRecord(data string, quotes bool, fn func(rec string, lineOff int)) {
	line, start, in := 0, 0, false
	recLine := 0
	for i := 0; i < len(data); i++ {
		switch data[i] {
		case '"':
			if quotes {
				in = !in
			}
		case '\n':
			if !in {
				end := i
				if end > start && data[end-1] == '\r' {
					end--
				}
				fn(data[start:end], recLine)
				start = i + 1
				recLine = line + 1
			}
			line++
		}
	}
	if start < len(data) {
		end := len(data)
		if data[end-1] == '\r' {
			end--
		}
		fn(data[start:end], recLine)
	}
}

// eachCSVRecord is eachRecord for CSV and TSV with each record also split
// into fields, as splitFields does: a record without quotes is split in the
// same pass that finds its end; one with quotes is found and split as
// eachRecord and splitFields do. fields is valid until fn returns; the
// returned slice is for reuse.
func eachCSVRecord(data string, delim byte, dst []string, fn func(rec string, fields []string, err error, lineOff int)) []string {
	line := 0
	for pos := 0; pos < len(data); {
		fields := dst[:0]
		start, fstart, i := pos, pos, pos
		for ; i < len(data); i++ {
			if c := data[i]; c == delim {
				fields = append(fields, data[fstart:i])
				fstart = i + 1
			} else if c == '\n' || c == '"' {
				break
			}
		}
		if i < len(data) && data[i] == '"' {
			end, lines := quotedRecordEnd(data, start)
			rec := trimCR(data[start:end])
			var err error
			fields, err = splitFields(dst[:0], rec, delim)
			fn(rec, fields, err, line)
			dst, line, pos = fields, line+lines+1, end+1
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

// quotedRecordEnd returns the index of the newline that ends the record at
// start (newlines between double quotes do not), or len(data), and how many
// newlines lie inside it.
func quotedRecordEnd(data string, start int) (end, lines int) {
	in := false
	for j := start; j < len(data); j++ {
		switch data[j] {
		case '"':
			in = !in
		case '\n':
			if !in {
				return j, lines
			}
			lines++
		}
	}
	return len(data), lines
}

func trimCR(rec string) string {
	if len(rec) > 0 && rec[len(rec)-1] == '\r' {
		return rec[:len(rec)-1]
	}
	return rec
}

var errQuote = errors.New(`a quoted field is not closed, or has text after its closing quote; write "" for a quote inside a quoted field`)

// splitFields splits one CSV or TSV record into fields (RFC 4180 quoting),
// appending to dst. Unquoted fields are substrings of the record, so a row
// without doubled quotes costs no allocation.
func splitFields(dst []string, srec string, delim byte) ([]string, error) {
	for i := 0; ; {
		if i < len(srec) && srec[i] == '"' {
			j := i + 1
			var b []byte // only for fields with doubled quotes
			start := j
			for {
				k := strings.IndexByte(srec[j:], '"')
				if k < 0 {
					return dst, errQuote
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
				return dst, errQuote
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
