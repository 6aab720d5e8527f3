package batch

import (
	"bytes"
	"context"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/survey"
	"github.com/flowregime/flowregime/regime"
)

func runBatch(t testing.TB, input []byte, cfg Config) (string, []Reject, Summary) {
	t.Helper()
	var out bytes.Buffer
	var rejects []Reject
	if cfg.Constants == nil {
		cfg.Constants = inputs.Flags{}
	}
	if cfg.DefaultMedium == "" {
		cfg.DefaultMedium = "freshwater"
	}
	sum, err := Run(context.Background(), bytes.NewReader(input), &out, func(r Reject) error {
		rejects = append(rejects, r)
		return nil
	}, cfg)
	if err != nil {
		t.Fatalf("Run: %v", err)
	}
	return out.String(), rejects, sum
}

// batchRecords runs a CSV table through batch to CSV and returns the
// output's records, read by Go's strict encoding/csv; a rejected row or
// output that is not CSV fails the test.
func batchRecords(t testing.TB, in string, cfg Config) [][]string {
	t.Helper()
	cfg.InFormat, cfg.OutFormat = CSV, CSV
	out, rejects, _ := runBatch(t, []byte(in), cfg)
	if len(rejects) > 0 {
		t.Fatalf("rejects: %v", rejects)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("output is not CSV: %v", err)
	}
	return recs
}

// Every record of a deliberately corrupted file is in the output or in the
// rejects, with its line number; nothing is lost and nothing panics.
func TestCorruptFileLosesNoRow(t *testing.T) {
	data, err := os.ReadFile("../../../testdata/batch/corrupt.csv")
	if err != nil {
		t.Fatal(err)
	}
	out, rejects, sum := runBatch(t, data, Config{InFormat: CSV, OutFormat: CSV})
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("output is not valid CSV: %v\n%s", err, out)
	}
	written := len(recs) - 1
	// 10 data records: the blank line is not a record; the unclosed quote
	// swallows the rest of the file into one record.
	if sum.Read != 10 || written+len(rejects) != sum.Read || sum.Written != written || sum.Blank != 1 {
		t.Errorf("read %d, written %d (summary %d), rejected %d, blank %d", sum.Read, written, sum.Written, len(rejects), sum.Blank)
	}
	wantRejected := map[int]string{3: "no number", 4: "marks a missing value, and length is required", 5: "no number", 6: "has 2 fields", 11: "unknown unit", 12: "freezing point", 13: "quoted field"}
	for _, r := range rejects {
		want, ok := wantRejected[r.Line]
		if !ok || !strings.Contains(r.Reason, want) {
			t.Errorf("reject at line %d: %q (column %q), want one containing %q", r.Line, r.Reason, r.Column, want)
		}
		delete(wantRejected, r.Line)
	}
	for l, w := range wantRejected {
		t.Errorf("line %d not rejected (want %q)", l, w)
	}
	for _, r := range rejects {
		if r.Line == 3 && r.Column != "length (mm)" {
			t.Errorf("line 3 reject names column %q, want \"length (mm)\"", r.Column)
		}
	}
	if recs[2][0] != "quoted, with comma" || recs[2][5] != `a "quoted" note` || recs[3][0] != "multi\nline name" {
		t.Errorf("quoted fields not carried through: %q", recs[2:4])
	}
}

func TestCRLFAndBOM(t *testing.T) {
	data, _ := os.ReadFile("../../../testdata/batch/crlf.csv")
	out, rejects, sum := runBatch(t, data, Config{InFormat: CSV, OutFormat: CSV})
	if !strings.HasPrefix(out, "species,length (mm),speed (cm/s),density_kg_m3") || strings.Contains(out, "\r") || sum.Read != 2 || len(rejects) != 1 {
		t.Errorf("crlf: read %d, rejects %v, output:\n%q", sum.Read, rejects, out)
	}
	data, _ = os.ReadFile("../../../testdata/batch/bom.csv")
	out, rejects, _ = runBatch(t, data, Config{InFormat: CSV, OutFormat: CSV})
	if !strings.HasPrefix(out, "species,") || len(rejects) != 0 {
		t.Errorf("bom: rejects %v, output:\n%q", rejects, out)
	}
}

// Output for a file split into shards and concatenated is byte-identical to
// the output for the whole file, with a headerless input (--names) and with
// JSON Lines output.
func TestShardsEqualWhole(t *testing.T) {
	var buf bytes.Buffer
	survey.Generate(&buf, 3000, 7)
	lines := strings.SplitAfter(buf.String(), "\n")
	header := strings.TrimSpace(lines[0])
	body := lines[1 : len(lines)-1] // the last element is the empty string after the final newline
	names, _ := csv.NewReader(strings.NewReader(header)).Read()
	cfg := Config{InFormat: CSV, OutFormat: CSV, Names: names}
	whole, _, _ := runBatch(t, []byte(strings.Join(body, "")), cfg)
	var sharded strings.Builder
	for _, cut := range [][2]int{{0, 1000}, {1000, 1001}, {1001, 2500}, {2500, len(body)}} {
		out, _, _ := runBatch(t, []byte(strings.Join(body[cut[0]:cut[1]], "")), cfg)
		sharded.WriteString(out)
	}
	if whole != sharded.String() {
		t.Error("sharded CSV output differs from whole-file output")
	}
	// JSON Lines: each shard keeps its header line, as GNU parallel --header does.
	jcfg := Config{InFormat: CSV, OutFormat: JSONL}
	wholeJ, _, _ := runBatch(t, buf.Bytes(), jcfg)
	var shardJ strings.Builder
	for _, cut := range [][2]int{{0, 1234}, {1234, len(body)}} {
		out, _, _ := runBatch(t, []byte(lines[0]+strings.Join(body[cut[0]:cut[1]], "")), jcfg)
		shardJ.WriteString(out)
	}
	if wholeJ != shardJ.String() {
		t.Error("sharded JSONL output differs from whole-file output")
	}
	if strings.Count(whole, "\n") != len(body) {
		t.Errorf("whole output has %d lines for %d rows", strings.Count(whole, "\n"), len(body))
	}
}

// Rows come out in input order with many workers and small chunks.
func TestOrderKept(t *testing.T) {
	var buf bytes.Buffer
	survey.Generate(&buf, 20000, 3)
	out, _, _ := runBatch(t, buf.Bytes(), Config{InFormat: CSV, OutFormat: CSV, Workers: 7})
	recs, _ := csv.NewReader(strings.NewReader(out)).ReadAll()
	for i, r := range recs[1:] {
		if r[0] != itoa(i+1) {
			t.Fatalf("row %d has id %s", i+1, r[0])
		}
	}
}

func itoa(i int) string { return strconv.Itoa(i) }

// headerCase is a header, the field it must map to ("" for none) and the
// unit read from it.
type headerCase struct{ h, field, unit string }

// checkSplitHeader checks splitHeader on every case.
func checkSplitHeader(t *testing.T, cases []headerCase) {
	t.Helper()
	for _, c := range cases {
		f, u := splitHeader(c.h)
		name := ""
		if f >= 0 {
			name = inputs.Fields[f].Name
		}
		if name != c.field || u != c.unit {
			t.Errorf("splitHeader(%q) = %q, %q; want %q, %q", c.h, name, u, c.field, c.unit)
		}
	}
}

func TestHeaderMatching(t *testing.T) {
	checkSplitHeader(t, []headerCase{
		{"length (mm)", "length", "mm"},
		{"speed [cm/s]", "speed", "cm/s"},
		{"temp_C", "temperature", "C"},
		{"Body Length", "length", ""},
		{"length_mm", "length", "mm"},
		{"Wing-span (cm)", "span", "cm"},
		{"species", "", ""},
	})
	if _, err := newMapping([]string{"length (mm)", "size (cm)"}, nil, nil); err == nil || !strings.Contains(err.Error(), "both hold length") {
		t.Errorf("duplicate length columns: %v", err)
	}
	m, err := newMapping([]string{"Body length", "speed"}, map[string]string{"length": "Body length"}, map[string]string{"length": "mm", "speed": "cm/s"})
	if err != nil || m.col[inputs.Length] != 0 || m.unit[inputs.Length] != "mm" || m.unit[inputs.Speed] != "cm/s" {
		t.Errorf("overrides: %v %+v", err, m)
	}
	// A --column naming no header says which headers there are, and the
	// first wrong flag in name order is the one reported.
	_, err = newMapping([]string{"Body length", "speed"}, map[string]string{"speed": "U", "length": "BL"}, nil)
	if err == nil || !strings.HasPrefix(err.Error(), `--column length="BL"`) || !strings.Contains(err.Error(), "columns are: Body length, speed") {
		t.Errorf("unknown --column header: %v", err)
	}
}

// FuzzRecords feeds arbitrary bytes as a CSV body: no panic, and every
// non-blank record is read or rejected.
func FuzzRecords(f *testing.F) {
	f.Add([]byte("fish,300,60\n"))
	f.Add([]byte("\"a,b\",1,2\r\n\n\"unclosed,3\n"))
	f.Add([]byte("x,\"\"\"\",1e400\n"))
	f.Fuzz(func(t *testing.T, body []byte) {
		in := append([]byte("species,length (mm),speed (cm/s)\n"), body...)
		var out bytes.Buffer
		n := 0
		sum, err := Run(context.Background(), bytes.NewReader(in), &out, func(Reject) error { n++; return nil },
			Config{InFormat: CSV, OutFormat: CSV, DefaultMedium: "freshwater", Constants: inputs.Flags{}})
		if err != nil {
			return // a failure of the whole run (e.g. unreadable header) is reported, not a loss
		}
		if sum.Written+n != sum.Read {
			t.Fatalf("read %d, written %d, rejected %d", sum.Read, sum.Written, n)
		}
	})
}

// A measured medium named in the medium column: the row's Reynolds number is
// the one regime.Calc gives with that medium (the file's power law at the
// organism's shear rate U/L = 0.25 1/s, below the measured range), and the extrapolation is flagged.
func TestMeasuredMediumColumn(t *testing.T) {
	// The cell names the file relative to the table's folder.
	dir := "../../../testdata/media"
	file := filepath.Join(dir, "mucus.json")
	in := "taxon,length (um),speed (um/s),medium\nciliate,200,50,mucus.json\n"
	recs := batchRecords(t, in, Config{MediaDir: dir})
	re, _ := strconv.ParseFloat(recs[1][4+2], 64)
	mf, err := inputs.LoadMediumFile(file)
	if err != nil {
		t.Fatal(err)
	}
	p, _ := mf.Properties()
	r, err := regime.Calc(regime.NewOrganism(regime.Body{Shape: regime.Sphere, Length: 200e-6}, 50e-6), p)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(re/r.Reynolds-1) > 1e-5 { // 6 significant digits printed
		t.Errorf("batch Re %g, calc Re %g", re, r.Reynolds)
	}
	if fl := recs[1][slices.Index(recs[0], "flags")]; !strings.Contains(fl, "shear-rate-extrapolated") {
		t.Errorf("flags %q lack the extrapolation at 0.25 1/s (measured 0.5–500)", fl)
	}
}

// Uncertainty columns: companion "… sd" columns switch propagation on; the
// result is the same with one worker or many, and row by row whatever the
// sharding, since each row is seeded from its own text.
func TestUncertaintyColumnsDeterministic(t *testing.T) {
	var b strings.Builder
	b.WriteString("taxon,length (mm),length (mm) sd,speed (mm/s),speed_sd,temp_C\n")
	for i := 0; i < 200; i++ {
		fmt.Fprintf(&b, "t%d,%d,%g,%d,%g,%d\n", i, 1+i%7, 0.1*float64(1+i%7), 1+i%5, 0.2, 5+i%20)
	}
	in := []byte(b.String())
	one, _, _ := runBatch(t, in, Config{InFormat: CSV, OutFormat: CSV, Workers: 1, Draws: 500, Seed: 3})
	many, _, _ := runBatch(t, in, Config{InFormat: CSV, OutFormat: CSV, Workers: 4, Draws: 500, Seed: 3})
	if one != many {
		t.Fatal("uncertainty columns differ between 1 and 4 workers")
	}
	recs, _ := csv.NewReader(strings.NewReader(one)).ReadAll()
	h := recs[0]
	if h[len(h)-1] != "regime_probability" || h[len(h)-9] != "reynolds_low95" {
		t.Fatalf("header %v", h)
	}
	// Row 2 alone gives the same numbers as within the file.
	alone, _, _ := runBatch(t, []byte(strings.Join(strings.SplitAfter(string(in), "\n")[:1], "")+strings.SplitAfter(string(in), "\n")[2]), Config{InFormat: CSV, OutFormat: CSV, Draws: 500, Seed: 3})
	ra, _ := csv.NewReader(strings.NewReader(alone)).ReadAll()
	if strings.Join(ra[1], ",") != strings.Join(recs[2], ",") {
		t.Errorf("row alone %v, in file %v", ra[1], recs[2])
	}
	for _, r := range recs[1:] {
		lo, _ := strconv.ParseFloat(r[len(h)-9], 64)
		hi, _ := strconv.ParseFloat(r[len(h)-8], 64)
		re, _ := strconv.ParseFloat(r[8], 64)
		if !(lo < re && re < hi) {
			t.Errorf("row %s: Re %g outside its interval %g–%g", r[0], re, lo, hi)
		}
	}
}

// JSON Lines in: members carried through unchanged in JSONL output, keys of
// the first object as CSV columns, a row with another key rejected, a
// non-object line rejected, numbers or strings both accepted as values.
func TestJSONLines(t *testing.T) {
	in := `{"id": 1, "length (mm)": 300, "speed (cm/s)": "60", "note": {"nested": true}}
{"id": 2, "length (mm)": "12 mm", "speed (cm/s)": 5}
{"id": 3, "length (mm)": 12, "speed (cm/s)": 5, "extra": 1}
[1, 2, 3]
`
	out, rejects, sum := runBatch(t, []byte(in), Config{InFormat: JSONL, OutFormat: JSONL})
	if sum.Read != 4 || sum.Written != 2 || len(rejects) != 2 {
		t.Fatalf("read %d written %d rejects %v", sum.Read, sum.Written, rejects)
	}
	if !strings.Contains(rejects[0].Reason, `key "extra"`) || rejects[0].Line != 3 || !strings.Contains(rejects[1].Reason, "not a JSON object") {
		t.Errorf("rejects %+v", rejects)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	var first map[string]any
	if err := json.Unmarshal([]byte(lines[0]), &first); err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, lines[0])
	}
	if first["speed (cm/s)"] != "60" || first["note"].(map[string]any)["nested"] != true || first["regime"] != "inertial" {
		t.Errorf("first row %v", first)
	}
	if _, ok := first["reynolds"].(float64); !ok {
		t.Errorf("reynolds is not a number: %v", first["reynolds"])
	}
	csvOut, _, _ := runBatch(t, []byte(in), Config{InFormat: JSONL, OutFormat: CSV})
	if !strings.HasPrefix(csvOut, "id,length (mm),speed (cm/s),note,density_kg_m3") {
		t.Errorf("CSV header from the first object's keys: %q", strings.SplitN(csvOut, "\n", 2)[0])
	}
}

// TSV in, TSV out; a table output for people.
func TestTSVAndTable(t *testing.T) {
	in := "species\tlength (mm)\tspeed (cm/s)\ncopepod, adult\t1.5\t2\n"
	out, rejects, _ := runBatch(t, []byte(in), Config{InFormat: TSV, OutFormat: TSV})
	if len(rejects) != 0 || !strings.HasPrefix(out, "species\tlength (mm)\tspeed (cm/s)\tdensity_kg_m3") || !strings.Contains(out, "copepod, adult\t1.5\t2\t") {
		t.Errorf("TSV: %v\n%s", rejects, out)
	}
	tab, _, _ := runBatch(t, []byte(in), Config{InFormat: TSV, OutFormat: Table})
	if !strings.Contains(tab, "│ copepod, adult") || !strings.Contains(tab, "reynolds") {
		t.Errorf("table:\n%s", tab)
	}
}

// Without propagation, a value given with an uncertainty is flagged as
// ignored; a "±" in a column that holds no input is not.
func TestUncertaintyIgnoredFlag(t *testing.T) {
	in := "note,length (mm),speed (mm/s)\n" +
		"plain,12,40\n" +
		"given,12±1,40\n" +
		"note says ±,12,40\n"
	recs := batchRecords(t, in, Config{})
	for i, want := range []bool{false, true, false} {
		flags := recs[i+1][slices.Index(recs[0], "flags")]
		if reason := recs[i+1][slices.Index(recs[0], "flag_reasons")]; want != strings.Contains(reason, "±") {
			t.Errorf("row %q: reasons %q", recs[i+1][0], reason)
		}
		if got := strings.Contains(flags, WarnUncertaintyIgnored); got != want {
			t.Errorf("row %q: flags %q, %s expected %v", recs[i+1][0], flags, WarnUncertaintyIgnored, want)
		}
	}
}

// A flag constant given with an uncertainty is flagged on every row when
// it is not propagated.
func TestUncertaintyIgnoredConstant(t *testing.T) {
	in := "length (mm),speed (mm/s)\n12,40\n13,41\n"
	out, rejects, sum := runBatch(t, []byte(in), Config{InFormat: CSV, OutFormat: CSV, Constants: inputs.Flags{"temperature": "12±1C"}})
	if len(rejects) > 0 {
		t.Fatalf("rejects: %v", rejects)
	}
	if sum.Flags[WarnUncertaintyIgnored] != 2 {
		t.Errorf("flag counts %v, want %s on both rows; output:\n%s", sum.Flags, WarnUncertaintyIgnored, out)
	}
}

// A JSON object cut short is rejected with a reason a user can act on.
func TestJSONLinesUnclosed(t *testing.T) {
	in := "{\"length (mm)\": 12, \"speed (cm/s)\": 5}\n{\"length (mm)\": 12, \"speed (cm/s)\": 5\n"
	_, rejects, sum := runBatch(t, []byte(in), Config{InFormat: JSONL, OutFormat: JSONL})
	if sum.Written != 1 || len(rejects) != 1 || rejects[0].Line != 2 || !strings.Contains(rejects[0].Reason, "not closed with }") {
		t.Errorf("written %d, rejects %+v", sum.Written, rejects)
	}
}

// A panic in one of Run's goroutines (here the reader's, through the
// progress callback, past the first megabyte) ends the run with a readable
// error instead of a crash, and the run stops.
func TestPanicBecomesError(t *testing.T) {
	table := "length (mm),speed (cm/s)\n" + strings.Repeat("12,5\n", 400_000) // 2 MB: read past the header by the reader goroutine
	cfg := Config{InFormat: CSV, OutFormat: CSV, DefaultMedium: "freshwater", Constants: inputs.Flags{},
		Progress: func(n int64) {
			if n > 1<<20 {
				panic("boom")
			}
		}}
	sum, err := Run(context.Background(), strings.NewReader(table), io.Discard, func(Reject) error { return nil }, cfg)
	if err == nil || !strings.Contains(err.Error(), "internal error (boom)") {
		t.Errorf("err %v", err)
	}
	if sum.Written >= 400_000 {
		t.Errorf("the run went on after the crash: %d rows written", sum.Written)
	}
}
