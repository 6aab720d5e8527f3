// Package batch runs flowregime over survey tables: CSV, TSV or JSON Lines
// in, the same rows out with computed columns appended, in input order,
// computed in parallel with bounded memory. Every input row ends up either
// in the output or in the rejects, with its line and reason.
package batch

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"runtime"
	"sync"
	"time"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
)

// Formats.
const (
	CSV   = "csv"
	TSV   = "tsv"
	JSONL = "jsonl"
	Table = "table"
)

// Config says how to read, compute and write.
type Config struct {
	InFormat  string            // CSV, TSV or JSONL
	OutFormat string            // CSV, TSV, JSONL or Table
	Columns   map[string]string // quantity → exact header (--column)
	Units     map[string]string // quantity → unit of its column (--unit)
	Ignore    []string          // headers left out on purpose (--ignore)
	Missing   []string          // cell texts meaning "not measured"; nil: inputs.DefaultMissing
	// Mapped, if set, receives the mapping report (which column became
	// which quantity in which unit, constants, defaults, unused columns)
	// once the header is read, before any row is computed.
	Mapped        func(lines []string)
	Constants     inputs.Flags // values for quantities with no column
	DefaultMedium string
	Names         []string // column names of a headerless input; the output then has no header either
	Workers       int      // 0 means GOMAXPROCS
	FlaggedOnly   bool
	Progress      func(bytesRead int64)

	// MediaDir is the folder that medium files named in cells are taken
	// relative to (the table's folder; "" or "." for the working
	// directory). They must lie inside it unless MediaAnywhere is set.
	// DefaultMedium, named on the command line, is not held to it.
	MediaDir      string
	MediaAnywhere bool

	// Uncertainty propagates each row's uncertainty (companion columns such
	// as "length sd" or "length (mm) sd", or cells like "12±1") by Method
	// with Draws draws. Each row's generator is seeded from Seed and the
	// row's own text, so results do not depend on workers or sharding.
	Uncertainty bool
	Method      string
	Draws       int
	Seed        uint64
}

// Reject is an input row that could not be computed.
type Reject struct {
	Line   int    // line where the record starts
	Row    int    // data row number, 1-based
	Column string // the column at fault, when there is one
	Reason string
	Record string // the record as read
}

// HeaderError is a problem with the table's header or with the column
// options (--column, --unit, --names): no row can be read, so the whole run
// is refused as a usage mistake.
type HeaderError struct{ Err error }

func (e HeaderError) Error() string { return e.Err.Error() }
func (e HeaderError) Unwrap() error { return e.Err }

// Summary counts what happened.
type Summary struct {
	Read, Written, Rejected, Blank, Filtered int
	Flags                                    map[string]int
	Assumed                                  map[string]int // codes of the "assumed" column → rows
	Mapping                                  []MappedColumn // which column holds which quantity
	Uncertainty                              string         // the propagation method, "" when none
	Draws                                    int            // Monte Carlo draws per row
	Elapsed                                  time.Duration
}

type result struct {
	seq                            int
	out                            []byte
	table                          [][]string
	rejects                        []Reject
	rows                           int // records in the chunk, for numbering rows
	read, written, blank, filtered int
	flags, assumed                 map[string]int
}

// Run reads in, writes rows to out and rejected rows to reject, in input
// order. It returns an error only for a failure of the whole run (unreadable
// header, output error, cancellation); row problems are rejects.
//
// A reader goroutine cuts the input into chunks of whole records, one
// worker per core computes them, and this goroutine puts their results
// back in input order, writes them and adds up the summary.
func Run(ctx context.Context, in io.Reader, out io.Writer, reject func(Reject) error, cfg Config) (Summary, error) {
	start := time.Now()
	sum := Summary{Flags: map[string]int{}, Assumed: map[string]int{}}
	e, err := open(in, cfg, &sum)
	if err != nil {
		return sum, err
	}
	ctx, e.cancel = context.WithCancel(ctx)
	defer e.cancel()
	e.inFlight = make(chan struct{}, maxInFlight*e.workers())
	wr := &writer{e: e, w: bufio.NewWriterSize(out, 256<<10), out: out, reject: reject, sum: &sum}
	wr.header()
	wr.collect(e.compute(ctx, e.read(ctx)))
	err = wr.finish(ctx)
	sum.Elapsed = time.Since(start)
	return sum, err
}

// maxInFlight bounds the chunks read and not yet written, per worker:
// without it a worker held up (on a busy machine) lets the others' results
// pile up behind it, waiting to be written in order.
const maxInFlight = 4

// engine is one run: the configuration completed by the header, the
// input past the header and how the run's goroutines stop.
type engine struct {
	cfg             Config
	m               *mapping
	header          []string
	headerRaw       []byte // the CSV header's text, copied when it has no quotes
	body            io.Reader
	line            int // the line the body starts at
	delim, outDelim byte
	cancel          func()
	crash           crashNote
	inFlight        chan struct{} // a token per chunk read and not yet written
	readErr         error         // set by the reader before it closes its channel
}

// open reads the header, maps the columns and completes the configuration.
func open(in io.Reader, cfg Config, sum *Summary) (*engine, error) {
	if cfg.Progress != nil {
		in = &countingReader{r: in, f: cfg.Progress}
	}
	br := bufio.NewReaderSize(in, 64<<10)
	skipBOM(br)
	e := &engine{delim: ',', outDelim: ','}
	if cfg.InFormat == TSV {
		e.delim = '\t'
	}
	if cfg.OutFormat == TSV {
		e.outDelim = '\t'
	}
	hl, err := readHeader(br, cfg, e.delim)
	if err != nil {
		return nil, err
	}
	e.header, e.headerRaw, e.line, e.body = hl.names, hl.raw, 1+hl.lines, br
	if hl.first != nil {
		e.body = io.MultiReader(bytes.NewReader(hl.first), br)
	}
	if cfg.Missing == nil {
		cfg.Missing = inputs.DefaultMissing
	}
	if e.m, err = readMapping(e.header, cfg, sampleRows(br, hl.first, e.header, e.delim, cfg.InFormat == JSONL)); err != nil {
		return nil, err
	}
	sum.Mapping = e.m.mapped()
	e.cfg = uncertaintyDefaults(cfg, e.m)
	if e.cfg.Mapped != nil {
		e.cfg.Mapped(e.m.describe(e.cfg))
	}
	if e.cfg.Uncertainty {
		sum.Uncertainty = e.cfg.Method
		if e.cfg.Method != "linear" {
			sum.Draws = e.cfg.Draws
		}
	}
	return e, nil
}

// uncertaintyDefaults turns propagation on when the table has uncertainty
// columns and fills in the method (Monte Carlo) and its draws (10,000).
func uncertaintyDefaults(cfg Config, m *mapping) Config {
	if m.hasSD() {
		cfg.Uncertainty = true
	}
	if cfg.Uncertainty && cfg.Method == "" {
		cfg.Method = "monte-carlo"
	}
	if cfg.Uncertainty && cfg.Method != "linear" && cfg.Draws < 10 {
		cfg.Draws = 10000
	}
	return cfg
}

func (e *engine) workers() int {
	if e.cfg.Workers > 0 {
		return e.cfg.Workers
	}
	return runtime.GOMAXPROCS(0)
}

// read cuts the body into chunks in a goroutine; the channel closes at the
// end of the input, on a read error (e.readErr) or on cancellation.
func (e *engine) read(ctx context.Context) <-chan *chunk {
	jobs := make(chan *chunk, e.workers())
	go func() {
		defer close(jobs)
		defer e.crash.recover(e.cancel)
		size := chunkSize
		if e.cfg.Uncertainty {
			size = uncertainChunk
		}
		ck := newChunker(e.body, recordRule{quotes: e.cfg.InFormat != JSONL, delim: e.delim, fields: len(e.header)}, e.line, size)
		for {
			c, err := ck.next()
			if err == io.EOF {
				return
			}
			if err != nil {
				e.readErr = err
				e.cancel()
				return
			}
			select {
			case e.inFlight <- struct{}{}:
			case <-ctx.Done():
				return
			}
			select {
			case jobs <- c:
			case <-ctx.Done():
				return
			}
		}
	}()
	return jobs
}

// compute starts the workers, each with its own table of media in front of
// a shared cache; the channel closes when they are all done.
func (e *engine) compute(ctx context.Context, jobs <-chan *chunk) <-chan result {
	n := e.workers()
	results := make(chan result, n)
	var wg sync.WaitGroup
	cache := newMediumCache(newMediumFiles(&e.cfg))
	for range n {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer e.crash.recover(e.cancel)
			p := &processor{cfg: e.cfg, m: e.m, delim: e.delim, outDelim: e.outDelim, cache: newLocalMedia(cache, localSlots/n), growth: 8}
			for c := range jobs {
				r := p.process(c)
				select {
				case results <- r:
				case <-ctx.Done():
					return
				}
			}
		}()
	}
	go func() { wg.Wait(); close(results) }()
	return results
}

// writer puts the chunks' results back in input order and writes them:
// rows to the output, rejects to reject, counts to the summary.
type writer struct {
	e             *engine
	w             *bufio.Writer
	out           io.Writer
	reject        func(Reject) error
	sum           *Summary
	table         [][]string // table output: the header and the rows of the page being filled
	pages         int        // table pages written
	next, rowBase int        // the next chunk to write; data rows before it
	err           error      // the first failure; what follows is drained, not written
}

// header writes the output's header line, or starts the table.
func (wr *writer) header() {
	cfg := &wr.e.cfg
	if cfg.OutFormat == Table {
		wr.table = append(wr.table, append(append([]string{}, wr.e.header...), cfg.columns()...))
		return
	}
	if len(cfg.Names) > 0 || cfg.OutFormat != CSV && cfg.OutFormat != TSV {
		return
	}
	var b []byte
	if cfg.InFormat == CSV && cfg.OutFormat == CSV && wr.e.headerRaw != nil && bytes.IndexByte(wr.e.headerRaw, '"') < 0 {
		b = append(b, wr.e.headerRaw...)
	} else {
		for i, h := range wr.e.header {
			if i > 0 {
				b = append(b, wr.e.outDelim)
			}
			b = appendField(b, h, wr.e.outDelim)
		}
	}
	for _, c := range cfg.columns() {
		b = append(b, wr.e.outDelim)
		b = append(b, c...)
	}
	wr.w.Write(append(b, '\n'))
}

// collect writes the results in input order as they come.
func (wr *writer) collect(results <-chan result) {
	pending := map[int]result{}
	for r := range results {
		pending[r.seq] = r
		for {
			pr, ok := pending[wr.next]
			if !ok {
				break
			}
			delete(pending, wr.next)
			wr.next++
			if wr.err == nil {
				wr.write(pr)
			}
			<-wr.e.inFlight
		}
	}
}

// fail notes the run's first failure and stops the other goroutines.
func (wr *writer) fail(err error) {
	if err != nil && wr.err == nil {
		wr.err = err
		wr.e.cancel()
	}
}

// write writes one chunk's result.
func (wr *writer) write(pr result) {
	if _, err := wr.w.Write(pr.out); err != nil {
		wr.fail(err)
	}
	putBuffer(pr.out)
	wr.table = append(wr.table, pr.table...)
	for wr.err == nil && len(wr.table) > TablePage {
		wr.fail(renderPage(sized(wr.w, wr.out), &wr.table, TablePage))
		wr.pages++
	}
	for _, rj := range pr.rejects {
		rj.Row += wr.rowBase
		wr.fail(wr.reject(rj))
	}
	wr.rowBase += pr.rows
	wr.sum.add(&pr)
}

// add counts a chunk's result.
func (s *Summary) add(r *result) {
	s.Read += r.read
	s.Written += r.written
	s.Rejected += len(r.rejects)
	s.Blank += r.blank
	s.Filtered += r.filtered
	for k, v := range r.flags {
		s.Flags[k] += v
	}
	for k, v := range r.assumed {
		s.Assumed[k] += v
	}
}

// finish gives the run's error, if any (the writer's first, then a
// crash, the reader's, a cancellation), writes the last table page and
// flushes.
func (wr *writer) finish(ctx context.Context) error {
	err := wr.err
	if err == nil {
		err = wr.e.crash.err()
	}
	if err == nil {
		err = wr.e.readErr
	}
	if err == nil {
		err = ctx.Err()
	}
	if err == nil && wr.table != nil && (len(wr.table) > 1 || wr.pages == 0) {
		err = renderPage(sized(wr.w, wr.out), &wr.table, len(wr.table)-1)
	}
	if ferr := wr.w.Flush(); ferr != nil && err == nil {
		err = ferr
	}
	return err
}

// crashNote turns a panic in one of Run's goroutines (a bug, never an
// input's fault) into the run's error: the run stops, no output is
// committed, and the user reads one line instead of a crash.
type crashNote struct {
	mu    sync.Mutex
	first error
}

// recover, deferred in a goroutine, notes a panic and cancels the run.
func (c *crashNote) recover(cancel func()) {
	r := recover()
	if r == nil {
		return
	}
	c.mu.Lock()
	if c.first == nil {
		c.first = fmt.Errorf("internal error (%v); the run was stopped and nothing was written: please report it with the input that caused it", r)
	}
	c.mu.Unlock()
	cancel()
}

func (c *crashNote) err() error {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.first
}

// TablePage is the number of rows in each table of table output: rows are
// written a page at a time, each page its own aligned table under the
// header, so that memory does not grow with the input.
const TablePage = 1000

// renderPage writes the first n rows after the header as one table and
// keeps the header and the rows after them.
func renderPage(w io.Writer, table *[][]string, n int) error {
	t := *table
	if err := renderTable(w, t[:n+1]); err != nil {
		return err
	}
	rest := copy(t[1:], t[n+1:])
	clear(t[1+rest:])
	*table = t[:1+rest]
	return nil
}

// localSlots bounds the workers' medium tables together: 1<<18 slots of
// 64 bytes, 16 MiB.
const localSlots = 1 << 18

type countingReader struct {
	r io.Reader
	n int64
	f func(int64)
}

func (c *countingReader) Read(p []byte) (int, error) {
	n, err := c.r.Read(p)
	c.n += int64(n)
	c.f(c.n)
	return n, err
}

// readCSVHeader reads the header record of a CSV or TSV table (recordRule
// with any number of fields) and splits it; raw is its text without the
// line ending, lines the lines it spans, rest the input read past it.
func readCSVHeader(br *bufio.Reader, delim byte) (fields []string, raw []byte, lines int, rest []byte, err error) {
	var buf []byte
	rule := recordRule{quotes: true, delim: delim}
	checked := 0 // length of buf when the record was last looked for
	for {
		s, err := br.ReadSlice('\n')
		buf = append(buf, s...)
		final := errors.Is(err, io.EOF)
		if err != nil && !final && !errors.Is(err, bufio.ErrBufferFull) {
			return nil, nil, 0, nil, err
		}
		if final && len(buf) == 0 {
			return nil, nil, 0, nil, HeaderError{errors.New("the input is empty: a header line is needed")}
		}
		// Look after each line, but past 64 KiB only every 64 KiB, so that a
		// long quoted header is not scanned once per line.
		if final || err == nil && (len(buf) <= 64<<10 || len(buf)-checked >= 64<<10) {
			checked = len(buf)
			if end, next, ok := rule.recordEnd(string(buf), 0, final); ok {
				raw, lines, rest = []byte(trimCR(string(buf[:end]))), bytes.Count(buf[:next], []byte{'\n'}), buf[next:]
				break
			}
		}
		if len(buf) > maxRecord {
			return nil, nil, 0, nil, HeaderError{fmt.Errorf("line 1: the header is longer than %d bytes", maxRecord)}
		}
	}
	if blank(string(raw)) {
		return nil, nil, 0, nil, HeaderError{errors.New("the input is empty or starts with a blank line; its first line must be the header")}
	}
	if fields, err = splitFields(nil, string(raw), delim); err != nil {
		return nil, nil, 0, nil, HeaderError{fmt.Errorf("line 1 (header): %v", err)}
	}
	return fields, raw, lines, rest, nil
}

func firstLine(br *bufio.Reader) ([]byte, error) {
	var b []byte
	for {
		s, err := br.ReadSlice('\n')
		b = append(b, s...)
		if err == nil || err == io.EOF {
			return b, nil
		}
		if !errors.Is(err, bufio.ErrBufferFull) {
			return nil, err
		}
		if len(b) > maxRecord {
			return nil, HeaderError{fmt.Errorf("line 1 is longer than %d bytes", maxRecord)}
		}
	}
}

// parseObject reads one JSON object, returning its keys in order, their raw
// values and their text (strings unquoted, null empty).
func parseObject(line []byte) (keys []string, raws []json.RawMessage, texts []string, err error) {
	dec := json.NewDecoder(bytes.NewReader(line))
	dec.UseNumber()
	t, err := dec.Token()
	if err != nil || t != json.Delim('{') {
		return nil, nil, nil, fmt.Errorf("not a JSON object")
	}
	for dec.More() {
		t, err := dec.Token()
		if err != nil {
			return nil, nil, nil, fmt.Errorf("malformed JSON: %v", err)
		}
		k, _ := t.(string)
		var raw json.RawMessage
		if err := dec.Decode(&raw); err != nil {
			return nil, nil, nil, fmt.Errorf("malformed JSON value for %q: %v", k, err)
		}
		text := string(raw)
		switch {
		case len(raw) > 0 && raw[0] == '"':
			var s string
			json.Unmarshal(raw, &s)
			text = s
		case text == "null":
			text = ""
		}
		keys, raws, texts = append(keys, k), append(raws, raw), append(texts, text)
	}
	if _, err := dec.Token(); err != nil {
		if errors.Is(err, io.EOF) {
			return nil, nil, nil, fmt.Errorf("malformed JSON: the object is not closed with }")
		}
		return nil, nil, nil, fmt.Errorf("malformed JSON: %v", err)
	}
	if dec.More() {
		return nil, nil, nil, fmt.Errorf("text after the JSON object")
	}
	return keys, raws, texts, nil
}

// appendJSONString appends s as a JSON string.
func appendJSONString(b []byte, s string) []byte {
	const hex = "0123456789abcdef"
	b = append(b, '"')
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '"' || c == '\\':
			b = append(b, '\\', c)
		case c == '\n':
			b = append(b, '\\', 'n')
		case c == '\r':
			b = append(b, '\\', 'r')
		case c == '\t':
			b = append(b, '\\', 't')
		case c < 0x20:
			b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&15])
		default:
			b = append(b, c)
		}
	}
	return append(b, '"')
}
