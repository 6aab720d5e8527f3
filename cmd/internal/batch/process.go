package batch

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"sync"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/report"
)

// processor computes the rows of chunks; one per worker.
type processor struct {
	cfg             Config
	m               *mapping
	delim, outDelim byte
	cache           *localMedia
	fields          []string
	vals            []string
	cells           *rowCells
	scratch         scratch
	growth          int  // expected output bytes per input byte, in quarters
	shapeConst      bool // --shape names every row's shape
}

// buffers recycles chunks' output buffers: the writer returns each one
// after writing it.
var buffers sync.Pool

func getBuffer(size int) []byte {
	if b, ok := buffers.Get().(*[]byte); ok && cap(*b) >= size {
		return (*b)[:0]
	}
	return make([]byte, 0, size)
}

func putBuffer(b []byte) {
	if cap(b) > 0 {
		buffers.Put(&b)
	}
}

// chunkRun is what processing one chunk gathers: the result, the flag and
// assumption counts and the number of the current record within the chunk.
type chunkRun struct {
	c               *chunk
	rec             record // the record being handled
	res             result
	counts, assumed flagCounts
	row             int // within the chunk; the writer adds the rows before it
}

// record is one record of a chunk: its text, its offset in lines from the
// chunk's first line, its fields and, for JSON Lines, its keys and raw
// values.
type record struct {
	text   string
	off    int
	fields []string
	keys   []string
	raws   []json.RawMessage
}

// process computes the records of a chunk.
func (p *processor) process(c *chunk) result {
	cr := &chunkRun{c: c, res: result{seq: c.seq, flags: map[string]int{}, assumed: map[string]int{}}}
	for _, l := range c.overlong {
		cr.row++
		cr.res.rejects = append(cr.res.rejects, Reject{Line: l, Row: cr.row, Reason: errOverlong.Error()})
		cr.res.read++
	}
	cr.res.out = getBuffer(len(c.data) * p.growth / 4)
	p.eachRecord(cr)
	return p.finish(cr)
}

// eachRecord handles each record of the chunk that is not blank, with its
// fields read (or the reason they could not be), in cr.rec.
func (p *processor) eachRecord(cr *chunkRun) {
	if p.cfg.InFormat == JSONL {
		eachRecord(cr.c.data, recordRule{}, func(rec string, off int) {
			if blank(rec) {
				cr.res.blank++
				return
			}
			keys, raws, fields, err := p.alignJSON([]byte(rec))
			cr.rec = record{text: rec, off: off, fields: fields, keys: keys, raws: raws}
			p.handle(cr, err)
		})
		return
	}
	p.fields = eachCSVRecord(cr.c.data, recordRule{quotes: true, delim: p.delim, fields: len(p.m.header)}, p.fields, func(rec string, fields []string, err error, off int) {
		if blank(rec) {
			cr.res.blank++
			return
		}
		if err == nil && len(fields) != len(p.m.header) {
			err = fieldCountError(len(fields), len(p.m.header))
		}
		cr.rec = record{text: rec, off: off, fields: fields}
		p.handle(cr, err)
	})
}

// handle computes cr.rec and writes it, or rejects it.
func (p *processor) handle(cr *chunkRun, err error) {
	r := &cr.rec
	cr.row++
	cr.res.read++
	if err != nil {
		cr.reject(Reject{Line: cr.c.firstLine + r.off, Row: cr.row, Reason: err.Error(), Record: strings.Clone(r.text)})
		return
	}
	o, err := p.compute(r)
	if err != nil {
		cr.reject(p.rejectFor(err, Reject{Line: cr.c.firstLine + r.off, Row: cr.row, Record: strings.Clone(r.text)}))
		return
	}
	for _, f := range o.flags {
		cr.counts.add(f)
	}
	for _, a := range o.assumed {
		cr.assumed.add(a)
	}
	if p.cfg.FlaggedOnly && len(o.flags) == 0 {
		cr.res.filtered++
		return
	}
	cr.res.written++
	p.write(cr, r, &o)
}

func (cr *chunkRun) reject(rj Reject) { cr.res.rejects = append(cr.res.rejects, rj) }

// compute computes a record's row: directly when its cells are plain
// numbers, else through cells.
func (p *processor) compute(r *record) (outcome, error) {
	if p.cells == nil {
		p.cells = newRowCells(p.m, p.cfg.Constants, p.cfg.DefaultMedium, p.cfg.Uncertainty, p.cfg.Missing)
		_, _, _, p.shapeConst = p.cfg.Constants.Lookup(inputs.Shape)
	}
	p.scratch.shapeGiven = p.shapeGiven(r.fields)
	o, direct, err := p.computeDirect(r.fields)
	if direct {
		return o, err
	}
	var seed uint64
	if p.cfg.Uncertainty {
		seed = p.cfg.Seed ^ fnv64(r.text)
	}
	o, err = compute(p.cells.fill(r.fields), &p.cfg, p.cache, seed, &p.scratch)
	if err == nil && !p.cfg.Uncertainty && p.cells.uncertain {
		o.flags = append(o.flags, WarnUncertaintyIgnored)
		o.ignored = true
	}
	return o, err
}

// rejectFor completes a reject for a row that could not be computed: the
// reason without the packages' prefixes, and the column at fault.
func (p *processor) rejectFor(err error, rj Reject) Reject {
	rj.Reason = inputs.Reason(err)
	var fe *inputs.FieldError
	if errors.As(err, &fe) {
		rj.Reason = fe.Err.Error()
		rj.Column = fe.Label
		if c := p.m.col[fe.Field]; c >= 0 {
			rj.Column = strings.TrimSpace(p.m.header[c])
		}
	}
	return rj
}

// write appends a computed row to the chunk's output in the output format.
func (p *processor) write(cr *chunkRun, r *record, o *outcome) {
	out := cr.res.out
	switch p.cfg.OutFormat {
	case CSV, TSV:
		if p.cfg.InFormat == CSV && p.cfg.OutFormat == CSV && strings.IndexByte(r.text, '"') < 0 {
			out = append(out, r.text...) // a record with quotes is written anew: a stray quote gets quoted
		} else {
			for i, f := range r.fields {
				if i > 0 {
					out = append(out, p.outDelim)
				}
				out = appendField(out, f, p.outDelim)
			}
		}
		out = o.appendCSV(out, p.outDelim, p.cfg.Uncertainty, &p.scratch)
		out = append(out, '\n')
	case JSONL:
		p.vals = o.values(p.vals[:0], p.cfg.Uncertainty, &p.scratch)
		out = p.appendJSON(out, r.fields, r.keys, r.raws)
		out = append(out, '\n')
	case Table:
		p.vals = o.values(p.vals[:0], p.cfg.Uncertainty, &p.scratch)
		cr.res.table = append(cr.res.table, append(append([]string{}, r.fields...), p.vals...))
	}
	cr.res.out = out
}

// finish totals the chunk's counts and learns its output size.
func (p *processor) finish(cr *chunkRun) result {
	for _, fc := range cr.counts {
		cr.res.flags[fc.code] += fc.n
	}
	for _, fc := range cr.assumed {
		cr.res.assumed[fc.code] += fc.n
	}
	if n := len(cr.c.data); n > 0 {
		// Output size per input byte for the next chunk, in quarters, with
		// room to spare, so that the buffer is not regrown row by row.
		p.growth = max(p.growth, 4*len(cr.res.out)/n+2)
	}
	cr.res.rows = cr.row
	return cr.res
}

// computeDirect computes a row of plain numbers without reading it into
// cells; direct is false when the row needs the general path.
func (p *processor) computeDirect(fields []string) (o outcome, direct bool, err error) {
	if p.cells.direct == nil {
		return o, false, nil
	}
	in, ok, err := p.cells.direct.Row(fields)
	if !ok || err != nil {
		return o, ok, err
	}
	o, err = computeInput(in, &p.cfg, p.cache, 0, &p.scratch)
	return o, true, err
}

// alignJSON parses a JSON object and lines its values up with the header
// (the first object's keys).
func (p *processor) alignJSON(rec []byte) ([]string, []json.RawMessage, []string, error) {
	keys, raws, texts, err := parseObject(rec)
	if err != nil {
		return nil, nil, nil, err
	}
	fields := make([]string, len(p.m.header))
	for i, k := range keys {
		j := indexOf(p.m.header, k)
		if j < 0 {
			return nil, nil, nil, fmt.Errorf("key %q is not among the first object's keys; every line must have the same keys", k)
		}
		fields[j] = texts[i]
	}
	return keys, raws, fields, nil
}

func indexOf(ss []string, s string) int {
	for i, x := range ss {
		if x == s {
			return i
		}
	}
	return -1
}

// appendJSON writes the row as one JSON object: the input's own members
// unchanged, then the computed ones (numbers as numbers, absent as null).
func (p *processor) appendJSON(b []byte, fields, keys []string, raws []json.RawMessage) []byte {
	b = append(b, '{')
	n := 0
	if p.cfg.InFormat == JSONL {
		for i, k := range keys {
			if n > 0 {
				b = append(b, ',')
			}
			b = appendJSONString(b, k)
			b = append(b, ':')
			b = append(b, raws[i]...)
			n++
		}
	} else {
		for i, h := range p.m.header {
			if n > 0 {
				b = append(b, ',')
			}
			b = appendJSONString(b, h)
			b = append(b, ':')
			b = appendJSONString(b, fields[i])
			n++
		}
	}
	for i, c := range p.cfg.columns() {
		if n > 0 {
			b = append(b, ',')
		}
		n++
		b = appendJSONString(b, c)
		b = append(b, ':')
		v := p.vals[i]
		switch {
		case i < len(computedColumns) && computedColumns[i].text != nil:
			b = appendJSONString(b, v)
		case v == "":
			b = append(b, "null"...)
		default:
			b = append(b, v...)
		}
	}
	return append(b, '}')
}

// shapeGiven reports whether a row names its shape: in its shape column,
// else by a constant (--shape).
func (p *processor) shapeGiven(fields []string) bool {
	if c := p.m.col[inputs.Shape]; c >= 0 {
		return c < len(fields) && strings.TrimSpace(fields[c]) != ""
	}
	return p.shapeConst
}

func renderTable(w io.Writer, rows [][]string) error {
	if len(rows) == 0 {
		return nil
	}
	return report.Table(w, rows[0], rows[1:])
}

// flagCounts counts flag codes, a handful of distinct ones, without a map
// access per row.
type flagCounts []struct {
	code string
	n    int
}

func (fc *flagCounts) add(code string) {
	for i := range *fc {
		if (*fc)[i].code == code {
			(*fc)[i].n++
			return
		}
	}
	*fc = append(*fc, struct {
		code string
		n    int
	}{code, 1})
}

// fnv64 is the FNV-1a hash of b (Fowler, Noll & Vo), used to seed each row.
func fnv64(b string) uint64 {
	h := uint64(14695981039346656037)
	for _, c := range b {
		h ^= uint64(c)
		h *= 1099511628211
	}
	return h
}
