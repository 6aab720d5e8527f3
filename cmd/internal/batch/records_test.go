package batch

import (
	"encoding/csv"
	"io"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"
)

// eachCSVRecord must find and split records exactly as eachRecord followed
// by splitFields, the two-pass reference kept for JSON Lines and quotes.
func checkCSVRecords(t *testing.T, data string, delim byte) {
	t.Helper()
	type rec struct {
		rec    string
		fields []string
		err    bool
		line   int
	}
	var want, got []rec
	eachRecord(data, true, func(r string, off int) {
		f, err := splitFields(nil, r, delim)
		want = append(want, rec{r, f, err != nil, off})
	})
	eachCSVRecord(data, delim, nil, func(r string, fields []string, err error, off int) {
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

func TestEachCSVRecordMatchesTwoPasses(t *testing.T) {
	for _, d := range []string{"", "\n", "a,b\n", "a,b", "a,b\r\n", "a,\r\n,\n", "\r\n\r\n", "\"a,b\",c\nd,e\n",
		"x,\"multi\nline\",y\nz\n", "5\" fish,3\n", "\"unclosed,1\n2,3\n", "a,\"\"\"\",b\r\n", "\"a\"x,b\n", ",,,\n"} {
		checkCSVRecords(t, d, ',')
	}
	rng := rand.New(rand.NewPCG(5, 6))
	const alphabet = "ab,\t\"\r\n 1"
	b := make([]byte, 0, 64)
	for range 200000 {
		b = b[:0]
		for range rng.IntN(40) {
			b = append(b, alphabet[rng.IntN(len(alphabet))])
		}
		checkCSVRecords(t, string(b), ',')
		checkCSVRecords(t, string(b), '\t')
	}
}

func FuzzEachCSVRecord(f *testing.F) {
	f.Add("a,\"b\nc\",d\r\ne,f\n")
	f.Fuzz(func(t *testing.T, data string) {
		checkCSVRecords(t, data, ',')
		checkCSVRecords(t, data, '\t')
	})
}

// Chunks of any size put back together are the input, and cut only where a
// record ends: the records of the chunks are the records of the whole.
func TestChunkerSizes(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	const alphabet = "ab,\"\r\n\n 1"
	for range 2000 {
		b := make([]byte, rng.IntN(3000))
		for i := range b {
			b[i] = alphabet[rng.IntN(len(alphabet))]
		}
		var whole []string
		eachRecord(string(b), true, func(r string, _ int) { whole = append(whole, r) })
		for _, size := range []int{1, 7, 64, 4096} {
			ck := newChunker(strings.NewReader(string(b)), true, 1, size)
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
				eachRecord(c.data, true, func(r string, _ int) { parts = append(parts, r) })
			}
			if joined.String() != string(b) {
				t.Fatalf("size %d: chunks do not join to the input %q", size, b)
			}
			if !reflect.DeepEqual(parts, whole) {
				t.Fatalf("size %d: records %q, want %q", size, parts, whole)
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
