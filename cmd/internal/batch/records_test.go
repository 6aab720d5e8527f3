package batch

import (
	"context"
	"encoding/csv"
	"errors"
	"io"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/survey"
)

// eachCSVRecord must find and split records exactly as eachRecord followed
// by splitFields, the two-pass reference kept for JSON Lines and quotes.
func checkCSVRecords(t *testing.T, data string, rule recordRule) {
	t.Helper()
	type rec struct {
		rec    string
		fields []string
		err    bool
		line   int
	}
	var want, got []rec
	eachRecord(data, rule, func(r string, off int) {
		f, err := splitFields(nil, r, rule.delim)
		want = append(want, rec{r, f, err != nil, off})
	})
	eachCSVRecord(data, rule, nil, func(r string, fields []string, err error, off int) {
		got = append(got, rec{r, append([]string(nil), fields...), err != nil, off})
	})
	for i := range want {
		if want[i].err { // fields after a quoting error are not compared
			want[i].fields = nil
		}
	}
	for i := range got {
		if got[i].err {
			got[i].fields = nil
		}
	}
	if !reflect.DeepEqual(got, want) {
		t.Fatalf("data %q:\n got %+v\nwant %+v", data, got, want)
	}
}

// rules are the record rules tried on random input: comma and tab, with
// and without a header's field count.
var rules = []recordRule{{true, ',', 0}, {true, '\t', 0}, {true, ',', 2}, {true, '\t', 3}}

func TestEachCSVRecordMatchesTwoPasses(t *testing.T) {
	for _, d := range []string{"", "\n", "a,b\n", "a,b", "a,b\r\n", "a,\r\n,\n", "\r\n\r\n", "\"a,b\",c\nd,e\n",
		"x,\"multi\nline\",y\nz\n", "5\" fish,3\n", "\"unclosed,1\n2,3\n", "a,\"\"\"\",b\r\n", "\"a\"x,b\n", ",,,\n"} {
		for _, r := range rules {
			checkCSVRecords(t, d, r)
		}
	}
	rng := rand.New(rand.NewPCG(5, 6))
	const alphabet = "ab,\t\"\r\n 1"
	b := make([]byte, 0, 64)
	for range 100000 {
		b = b[:0]
		for range rng.IntN(40) {
			b = append(b, alphabet[rng.IntN(len(alphabet))])
		}
		for _, r := range rules {
			checkCSVRecords(t, string(b), r)
		}
	}
}

func FuzzEachCSVRecord(f *testing.F) {
	f.Add("a,\"b\nc\",d\r\ne,f\n")
	f.Fuzz(func(t *testing.T, data string) {
		for _, r := range rules {
			checkCSVRecords(t, data, r)
		}
	})
}

// Chunks of any size put back together are the input, and cut only where a
// record ends: the records of the chunks are the records of the whole.
func TestChunkerSizes(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	const alphabet = "ab,\"\r\n\n 1"
	for range 800 {
		b := make([]byte, rng.IntN(3000))
		for i := range b {
			b[i] = alphabet[rng.IntN(len(alphabet))]
		}
		for _, rule := range rules[:3] {
			var whole []string
			eachRecord(string(b), rule, func(r string, _ int) { whole = append(whole, r) })
			for _, size := range []int{1, 7, 64, 4096} {
				ck := newChunker(strings.NewReader(string(b)), rule, 1, size)
				var joined strings.Builder
				var parts []string
				for {
					c, err := ck.next()
					if err == io.EOF {
						break
					}
					if err != nil {
						t.Fatal(err)
					}
					joined.WriteString(c.data)
					eachRecord(c.data, rule, func(r string, _ int) { parts = append(parts, r) })
				}
				if joined.String() != string(b) {
					t.Fatalf("size %d: chunks do not join to the input %q", size, b)
				}
				if !reflect.DeepEqual(parts, whole) {
					t.Fatalf("size %d, rule %+v: records %q, want %q", size, rule, parts, whole)
				}
			}
		}
	}
}

// A field written by appendField reads back unchanged: RFC 4180 quoting
// (Shafranovich 2005, RFC 4180 §2, rules 5–7), checked against Go's
// encoding/csv reader for CSV and by splitFields for TSV.
func TestAppendFieldRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	const alphabet = "ab1 ,\t\"\r\n–"
	for range 20000 {
		var s []byte
		for range rng.IntN(12) {
			s = append(s, alphabet[rng.IntN(len(alphabet))])
		}
		field := strings.TrimRight(string(s), "\r") // a lone CR before the end of a record is not kept by readers
		rec := string(appendField([]byte("x,"), field, ',')) + ",y"
		got, err := csv.NewReader(strings.NewReader(rec + "\n")).Read()
		if err != nil || len(got) != 3 || got[1] != strings.ReplaceAll(field, "\r\n", "\n") {
			t.Fatalf("CSV %q: read back %q, %v", field, got, err)
		}
		tsv := string(appendField([]byte("x\t"), field, '\t')) + "\ty"
		if f, err := splitFields(nil, tsv, '\t'); err != nil || len(f) != 3 || f[1] != field {
			t.Fatalf("TSV %q: read back %q, %v", field, f, err)
		}
	}
}

// readRec is one record with the line it starts on.
type readRec struct {
	line   int
	fields []string
}

// toolRecords reads data as batch does (chunker with chunks of size bytes,
// then eachCSVRecord), skipping empty records, up to the first record with
// an error; failed says whether there was one.
func toolRecords(t *testing.T, data string, delim byte, size int) (recs []readRec, failed bool) {
	rule := recordRule{quotes: true, delim: delim}
	ck := newChunker(strings.NewReader(data), rule, 1, size)
	for !failed {
		c, err := ck.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatal(err)
		}
		eachCSVRecord(c.data, rule, nil, func(rec string, fields []string, err error, off int) {
			switch {
			case failed || rec == "":
			case err != nil:
				failed = true
			default:
				recs = append(recs, readRec{c.firstLine + off, append([]string(nil), fields...)})
			}
		})
	}
	return recs, failed
}

// csvRecords reads data with Go's encoding/csv, up to its first error.
func csvRecords(data string, delim byte, lazy bool) (recs []readRec, err error) {
	r := csv.NewReader(strings.NewReader(data))
	r.Comma, r.LazyQuotes, r.FieldsPerRecord = rune(delim), lazy, -1
	for {
		f, err := r.Read()
		if err == io.EOF {
			return recs, nil
		}
		if err != nil {
			return recs, err
		}
		line, _ := r.FieldPos(0)
		recs = append(recs, readRec{line, f})
	}
}

// checkAgainstEncodingCSV holds the tool's reading to Go's encoding/csv.
// With LazyQuotes, encoding/csv takes a quote inside an unquoted field as
// text, the rule here; it also takes a quote after a closing quote as text
// and goes on, where the tool rejects the record, so records are compared
// up to the tool's first rejected one. Where the strict reader
// (LazyQuotes=false) accepts the whole input, the tool must too. encoding/csv
// turns \r\n inside a quoted field into \n; the tool keeps the text as it is,
// so fields are compared with that one change.
func checkAgainstEncodingCSV(t *testing.T, data string, delim byte, size int) {
	t.Helper()
	got, failed := toolRecords(t, data, delim, size)
	for i := range got {
		for j, f := range got[i].fields {
			got[i].fields[j] = strings.ReplaceAll(f, "\r\n", "\n")
		}
	}
	lazy, _ := csvRecords(data, delim, true)
	if len(lazy) < len(got) || len(got) > 0 && !reflect.DeepEqual(got, lazy[:len(got)]) {
		t.Fatalf("data %q (delimiter %q):\n tool %+v\n encoding/csv (lazy) %+v", data, delim, got, lazy)
	}
	if !failed && len(got) != len(lazy) {
		t.Fatalf("data %q: tool read %d records without error, encoding/csv (lazy) %d", data, len(got), len(lazy))
	}
	if strict, err := csvRecords(data, delim, false); err == nil && (failed || len(strict) != len(got)) {
		t.Fatalf("data %q: encoding/csv (strict) reads %d records, the tool %d and failed=%v", data, len(strict), len(got), failed)
	}
}

// randomTable writes a table of well-formed and ill-formed fields: plain,
// quoted (with delimiters, line ends and doubled quotes inside), with a
// stray quote inside, and now and then a quote left open or text after a
// closing quote.
func randomTable(rng *rand.Rand, delim byte) string {
	const text = "ab1 .,\t\"\r\n"
	piece := func(quoted bool) string {
		var b []byte
		for range rng.IntN(6) {
			c := text[rng.IntN(len(text))]
			if !quoted && (c == delim || c == '\n' || c == '\r') {
				c = 'x'
			}
			b = append(b, c)
		}
		return string(b)
	}
	var b strings.Builder
	for range rng.IntN(8) {
		for f := range 1 + rng.IntN(4) {
			if f > 0 {
				b.WriteByte(delim)
			}
			switch rng.IntN(10) {
			case 0, 1, 2, 3:
				s := piece(false)
				if strings.HasPrefix(s, `"`) {
					s = "y" + s
				}
				b.WriteString(s)
			case 4, 5, 6:
				b.WriteString(`"` + strings.ReplaceAll(piece(true), `"`, `""`) + `"`)
			case 7:
				b.WriteString("5" + `"` + " long")
			case 8:
				b.WriteString(`"open ` + piece(false))
			default:
				b.WriteString(`"x"` + piece(false))
			}
		}
		if rng.IntN(4) == 0 {
			b.WriteString("\r\n")
		} else if rng.IntN(20) > 0 {
			b.WriteByte('\n')
		}
	}
	return b.String()
}

func TestRecordsMatchEncodingCSV(t *testing.T) {
	for _, d := range []string{"fish 5\" long,3\n", "a,\"b\"\"c\",d\n", "\"multi\r\nline\",1\n", "\"a\"\r", "a,\"\"\n\n,\n"} {
		checkAgainstEncodingCSV(t, d, ',', 4096)
	}
	rng := rand.New(rand.NewPCG(21, 22))
	for i := range 5000 {
		for _, delim := range []byte{',', '\t'} {
			checkAgainstEncodingCSV(t, randomTable(rng, delim), delim, []int{1, 16, 4096}[i%3])
		}
	}
	const soup = "ab,\t\"\r\n 1"
	b := make([]byte, 0, 64)
	for i := range 10000 {
		b = b[:0]
		for range rng.IntN(40) {
			b = append(b, soup[rng.IntN(len(soup))])
		}
		checkAgainstEncodingCSV(t, string(b), ',', []int{1, 16, 4096}[i%3])
	}
}

func FuzzRecordsMatchEncodingCSV(f *testing.F) {
	f.Add("a,\"b\nc\",d\r\ne,5\" long\n", 7)
	f.Fuzz(func(t *testing.T, data string, size int) {
		size = 1 + size&4095
		checkAgainstEncodingCSV(t, data, ',', size)
		checkAgainstEncodingCSV(t, data, '\t', size)
	})
}

// A stray quote inside an unquoted cell is text: a 20,000-row survey with
// `fish 5" long` in row 5 comes out whole (the issue's million-row survey,
// scaled down, read as 9 rows). The output is valid RFC 4180, checked with
// Go's strict encoding/csv: the cell is quoted on the way out.
func TestStrayQuoteLosesNoRow(t *testing.T) {
	const n = 20000
	in := survey.WithNotes(n, map[int]string{5: `fish 5" long`, n: `last 2" fin`}, true)
	out, rejects, sum := runBatch(t, in, Config{InFormat: CSV, OutFormat: CSV})
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("output is not strict CSV: %v", err)
	}
	if sum.Read != n || sum.Written != n || len(rejects) != 0 || len(recs)-1 != n {
		t.Fatalf("%d rows in: read %d, written %d (%d in the output), rejected %d", n, sum.Read, sum.Written, len(recs)-1, len(rejects))
	}
	if recs[5][3] != `fish 5" long` || recs[n][3] != `last 2" fin` {
		t.Errorf("notes carried as %q and %q", recs[5][3], recs[n][3])
	}
}

// A quote that opens a cell and is never closed costs its own row only,
// wherever it is, whether or not a later cell ends in an inch mark that
// would close it, and whatever the chunk size; each reject has its line.
func TestUnclosedQuoteCostsItsRowOnly(t *testing.T) {
	const n = 20000
	cases := []struct {
		name  string
		notes map[int]string
		bad   []int // rows rejected
	}{
		{"open in row 5", map[int]string{5: `"fish 5 long`}, []int{5}},
		{"closed by an inch mark 30 rows on", map[int]string{5: `"approx`, 35: `fin 2"`}, []int{5}},
		{"closed by a cell on the next line, too many fields", map[int]string{5: `"approx`, 6: `x",1,2,3`}, []int{5, 6}},
		{"text after the closing quote", map[int]string{7: `"a"b`}, []int{7}},
		{"open in the last row", map[int]string{n: `"open`}, []int{n}},
		{"several", map[int]string{3: `"a`, 4: `"b`, 9000: `"c`, 9001: `d"`}, []int{3, 4, 9000}},
	}
	for _, c := range cases {
		for _, final := range []bool{true, false} {
			in := survey.WithNotes(n, c.notes, final)
			for _, cfg := range []Config{{InFormat: CSV, OutFormat: CSV}, {InFormat: CSV, OutFormat: CSV, Uncertainty: true, Method: "linear", Workers: 3}} {
				out, rejects, sum := runBatch(t, in, cfg)
				written := strings.Count(out, "\n") - 1
				if sum.Read != n || written+len(rejects) != n || sum.Written != written {
					t.Errorf("%s: %d rows in: read %d, written %d (%d lines out), rejected %d", c.name, n, sum.Read, sum.Written, written, len(rejects))
				}
				var lines []int
				for _, r := range rejects {
					lines = append(lines, r.Line)
				}
				var want []int
				for _, row := range c.bad {
					want = append(want, row+1) // the header is line 1
				}
				if !reflect.DeepEqual(lines, want) {
					t.Errorf("%s: rejected lines %v, want %v (%+v)", c.name, lines, want, rejects)
				}
			}
		}
	}
}

// A line over the size limit is rejected with its line number wherever it
// is, the last one too, with or without a final newline, in CSV, TSV and
// JSON Lines; the rows around it are read. The counts come from the test's own
// input, not from a reader.
func TestOverlongLineRejected(t *testing.T) {
	long := strings.Repeat("x", maxRecord+10)
	csvRow := func(note string) string { return "fish,12,5," + note }
	tsvRow := func(note string) string { return "fish\t12\t5\t" + note }
	jsonRow := func(note string) string {
		return `{"species":"fish","length (mm)":12,"speed (cm/s)":5,"notes":"` + note + `"}`
	}
	for _, f := range []struct {
		format, header string
		row            func(string) string
		rows           int // the first JSON object is a row as well as the keys
	}{{CSV, "species,length (mm),speed (cm/s),notes", csvRow, 4}, {TSV, "species\tlength (mm)\tspeed (cm/s)\tnotes", tsvRow, 4}, {JSONL, jsonRow("h"), jsonRow, 5}} {
		for _, at := range []int{1, 3, 4} { // the overlong row among 4
			for _, final := range []bool{true, false} {
				rows := []string{f.header}
				for i := 1; i <= 4; i++ {
					note := "short"
					if i == at {
						note = long
					}
					rows = append(rows, f.row(note))
				}
				in := strings.Join(rows, "\n")
				if final {
					in += "\n"
				}
				out, rejects, sum := runBatch(t, []byte(in), Config{InFormat: f.format, OutFormat: CSV})
				written := strings.Count(out, "\n") - 1
				if sum.Read != f.rows || written != f.rows-1 || len(rejects) != 1 || rejects[0].Line != at+1 || !strings.Contains(rejects[0].Reason, "longer than 8 MiB") {
					t.Errorf("%s, long row %d, final newline %v: read %d, written %d, rejects %+v", f.format, at, final, sum.Read, written, rejects)
				}
			}
		}
	}
}

// The header follows the same rule: a quoted name may run over lines, a
// stray quote is text (and quoted on the way out), an open quote is a
// header problem.
func TestHeaderRecord(t *testing.T) {
	out, rejects, sum := runBatch(t, []byte("\"two\nlines\",length (mm),speed (cm/s)\n\"x\ny\",12,5\n"), Config{InFormat: CSV, OutFormat: CSV})
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rejects) != 0 || sum.Written != 1 || recs[0][0] != "two\nlines" || recs[1][0] != "x\ny" {
		t.Errorf("multi-line names: %v, rejects %v, output %q", err, rejects, out)
	}
	out, _, _ = runBatch(t, []byte("species 5\",length (mm),speed (cm/s)\nfish,12,5\n"), Config{InFormat: CSV, OutFormat: CSV})
	if !strings.HasPrefix(out, `"species 5""",length (mm)`) {
		t.Errorf("stray quote in the header written as %q", strings.SplitN(out, "\n", 2)[0])
	}
	_, err = Run(context.Background(), strings.NewReader("\"species,length (mm),speed (cm/s)\nfish,12,5\n"), io.Discard, func(Reject) error { return nil },
		Config{InFormat: CSV, OutFormat: CSV, DefaultMedium: "freshwater", Constants: inputs.Flags{}})
	var he HeaderError
	if !errors.As(err, &he) || !strings.Contains(err.Error(), "line 1 (header): a quoted field") {
		t.Errorf("open quote in the header: %v", err)
	}
}

// Reader hands fit and tabulate each record with its line: good rows with
// their fields, bad ones (open quote, wrong field count, over the size
// limit) with a reason; blank lines are skipped. The expected lines are
// counted by hand from the input below.
func TestReader(t *testing.T) {
	in := "a,b\n1,2\n\n\"open,3\n4,5\n6\n" + strings.Repeat("z", maxRecord+1) + "\n\"x\ny\",7\n8,9"
	r, err := NewReader(strings.NewReader(in), ',')
	if err != nil || !reflect.DeepEqual(r.Header(), []string{"a", "b"}) {
		t.Fatalf("header %q, %v", r.Header(), err)
	}
	type got struct {
		line   int
		fields string
		err    string
	}
	want := []got{{2, "1|2", ""}, {4, "", "not closed"}, {5, "4|5", ""}, {6, "", "has 1 fields"}, {7, "", "longer than 8 MiB"}, {8, "x\ny|7", ""}, {10, "8|9", ""}}
	var all []got
	for {
		rec, err := r.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatal(err)
		}
		g := got{rec.Line, strings.Join(rec.Fields, "|"), ""}
		if rec.Err != nil {
			g.err = rec.Err.Error()
		}
		all = append(all, g)
	}
	if len(all) != len(want) {
		t.Fatalf("records %+v, want %+v", all, want)
	}
	for i, w := range want {
		if all[i].line != w.line || all[i].fields != w.fields || !strings.Contains(all[i].err, w.err) || (w.err == "") != (all[i].err == "") {
			t.Errorf("record %d: %+v, want %+v", i, all[i], w)
		}
	}
}
