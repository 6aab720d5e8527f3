package tabulate

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/survey"
	"gonum.org/v1/gonum/stat"
)

// Outside reference: gonum's stat.Quantile with stat.Empirical on the
// sorted values, which summarise stood on before it selected instead of
// sorting. Exact equality, on sizes 1–300 and 10,007 with many ties.
func TestSummariseEqualsGonumQuantile(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	sizes := []int{10007}
	for n := 1; n <= 300; n++ {
		sizes = append(sizes, n)
	}
	for _, n := range sizes {
		v := make([]float64, n)
		for i := range v {
			v[i] = float64(rng.IntN(n/3+1)) * rng.ExpFloat64() // ties and spread
			if i%7 == 0 {
				v[i] = float64(rng.IntN(5))
			}
		}
		sorted := append([]float64(nil), v...)
		sort.Float64s(sorted)
		got := summarise(v)
		for _, c := range []struct {
			p   float64
			got float64
		}{{0.05, got.P5}, {0.5, got.Median}, {0.95, got.P95}} {
			if want := stat.Quantile(c.p, stat.Empirical, sorted, nil); c.got != want {
				t.Fatalf("n %d: %g-quantile %g, gonum %g", n, c.p, c.got, want)
			}
		}
	}
}

// batchOutput is batch's output for n rows of the synthetic survey.
func batchOutput(t *testing.T, n int) []byte {
	t.Helper()
	var in, out bytes.Buffer
	if err := survey.Generate(&in, n, 7); err != nil {
		t.Fatal(err)
	}
	if _, err := batch.Run(context.Background(), &in, &out, func(batch.Reject) error { return nil }, batch.Config{Workers: 2, InFormat: batch.CSV, OutFormat: batch.CSV}); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}

// sequential is Tabulate on the rows of data read one at a time, with the
// unreadable records' lines.
func sequential(t *testing.T, data []byte, spec Spec) ([]Group, []int, error) {
	t.Helper()
	r, err := batch.NewReader(bytes.NewReader(data), ',')
	if err != nil {
		t.Fatal(err)
	}
	var rejected []int
	groups, err := Tabulate(r.Header(), func() ([]string, error) {
		for {
			rec, err := r.Next()
			if err != nil || rec.Err == nil {
				return rec.Fields, err
			}
			rejected = append(rejected, rec.Line)
		}
	}, spec)
	return groups, rejected, err
}

// parallel is Chunks on data with the given workers.
func parallel(t *testing.T, data []byte, spec Spec, workers int) ([]Group, []int, error) {
	t.Helper()
	r, err := batch.NewReader(bytes.NewReader(data), ',')
	if err != nil {
		t.Fatal(err)
	}
	var rejected []int
	groups, err := Chunks(r.Header(), r.NextChunk, spec, Options{Workers: workers}, func(rec batch.Record) { rejected = append(rejected, rec.Line) })
	return groups, rejected, err
}

// Chunks summed by several workers and merged give exactly what Tabulate
// gives reading row by row (the reference here is the row-by-row reading,
// itself checked against gonum above and in scaling_test.go): every
// number bit for bit, groups by two columns, two fits, and the unreadable
// rows in input order.
func TestChunksEqualsTabulate(t *testing.T) {
	data := batchOutput(t, 20000)
	// Break three rows far apart: one field too many, one too few, and an
	// unclosed quote.
	lines := strings.SplitAfter(string(data), "\n")
	lines[5] = strings.TrimSuffix(lines[5], "\n") + ",extra\n"
	lines[9000] = "1,bee\n"
	lines[17000] = `"unclosed,` + lines[17000]
	data = []byte(strings.Join(lines, ""))
	spec := Spec{By: []string{"taxon", "medium"}, Fits: []Pair{{Y: "reynolds", X: "length"}, {Y: "power_W", X: "mass"}}}
	want, wantRejected, err := sequential(t, data, spec)
	if err != nil {
		t.Fatal(err)
	}
	if len(wantRejected) != 3 || len(want) < 8 {
		t.Fatalf("reference: %d groups, rejected lines %v", len(want), wantRejected)
	}
	for _, workers := range []int{1, 2, 5} {
		got, gotRejected, err := parallel(t, data, spec, workers)
		if err != nil {
			t.Fatal(err)
		}
		if a, b := fmt.Sprintf("%v", got), fmt.Sprintf("%v", want); a != b {
			t.Errorf("%d workers:\n%s\nrow by row:\n%s", workers, a, b)
		}
		if fmt.Sprint(gotRejected) != fmt.Sprint(wantRejected) {
			t.Errorf("%d workers: rejected lines %v, row by row %v", workers, gotRejected, wantRejected)
		}
	}
}

// A grouping past MaxGroups is refused by Chunks as by Tabulate, and only
// the unreadable rows before the first row past the limit are passed on.
func TestChunksGroupBound(t *testing.T) {
	var b strings.Builder
	b.WriteString("id,reynolds,strouhal,drag_N,power_W,regime\n")
	for i := 1; i <= MaxGroups+10; i++ {
		if i == 50 || i == MaxGroups+5 {
			b.WriteString("bad row\n")
		}
		fmt.Fprintf(&b, "%d,10,0.3,1e-6,1e-7,intermediate\n", i)
	}
	data := []byte(b.String())
	_, wantRejected, wantErr := sequential(t, data, Spec{By: []string{"id"}})
	_, gotRejected, err := parallel(t, data, Spec{By: []string{"id"}}, 2)
	var tm TooManyGroups
	if !errors.As(err, &tm) || err.Error() != wantErr.Error() {
		t.Errorf("Chunks: %v; Tabulate: %v", err, wantErr)
	}
	if fmt.Sprint(gotRejected) != "[51]" || fmt.Sprint(wantRejected) != "[51]" {
		t.Errorf("rejected lines %v, row by row %v (want [51])", gotRejected, wantRejected)
	}
}

// A read failure of next is returned as it is, after the rows before it.
func TestChunksReadFailure(t *testing.T) {
	failure := errors.New("disk gone")
	header := []string{"reynolds", "strouhal", "drag_N", "power_W", "regime"}
	_, err := Chunks(header, func() (batch.Chunk, error) { return batch.Chunk{}, failure }, Spec{}, Options{Workers: 2}, func(batch.Record) {})
	if !errors.Is(err, failure) {
		t.Errorf("got %v", err)
	}
	_, err = Chunks(header, func() (batch.Chunk, error) { return batch.Chunk{}, io.EOF }, Spec{}, Options{Workers: 2}, func(batch.Record) {})
	if err != nil {
		t.Errorf("empty table: %v", err)
	}
}

// number reads plain decimals by decimal.Parse and everything else as
// before, through quantity.ParseDefault: for every text here both give the
// same bits or both refuse. The values are strconv.ParseFloat's (decimal's
// own tests hold it to that).
func TestNumberAsParseDefault(t *testing.T) {
	texts := []string{"7.3115", "-0", "+5", ".5", "5.", "1e-300", "4.9e-324", "1e400", "-1e400", " 3 ", "3 ", "Inf", "-Inf", "NaN",
		"1_0", "0x10", "3±1", "−2", "", " ", "abc", "123456789012345678901234567890", "1.7976931348623157e308", "2e-5mm"}
	for _, s := range texts {
		v, ok := number([]string{s}, column{idx: 0})
		old, err := quantity.ParseDefault(quantity.Number, strings.TrimSpace(s), "")
		oldOK := strings.TrimSpace(s) != "" && err == nil && !math.IsNaN(old.SI)
		if ok != oldOK || ok && math.Float64bits(v) != math.Float64bits(old.SI) {
			t.Errorf("%q: %v %v, ParseDefault %v %v", s, v, ok, old.SI, oldOK)
		}
	}
}
