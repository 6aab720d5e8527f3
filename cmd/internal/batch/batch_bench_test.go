package batch

import (
	"bytes"
	"context"
	"io"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/survey"
)

func surveyData(b testing.TB, n int) []byte {
	return generated(b, survey.Generate, n)
}

func generated(tb testing.TB, gen func(io.Writer, int, uint64) error, n int) []byte {
	tb.Helper()
	var buf bytes.Buffer
	if err := gen(&buf, n, 1); err != nil {
		tb.Fatal(err)
	}
	return buf.Bytes()
}

// surveys are the three benchmark surveys: the simple one (about 60,000
// distinct medium conditions), the realistic one (per-row depth, salinity
// and altitude; most conditions distinct) and one of 38 conditions, so
// that no change to the medium step wins on one and loses on another.
var surveys = []struct {
	name string
	gen  func(io.Writer, int, uint64) error
}{{"simple", survey.Generate}, {"rich", survey.GenerateRich}, {"few", survey.GenerateFew}}

// BenchmarkBatchCSV measures end-to-end CSV → CSV throughput on each
// survey; reports rows/s. 200,000 rows: the realistic survey then has
// about 140,000 distinct conditions (a million rows have 600,000).
func BenchmarkBatchCSV(b *testing.B) {
	const n = 200000
	for _, s := range surveys {
		b.Run(s.name, func(b *testing.B) {
			data := generated(b, s.gen, n)
			b.SetBytes(int64(len(data)))
			b.ResetTimer()
			for range b.N {
				sum, err := Run(context.Background(), bytes.NewReader(data), io.Discard, func(Reject) error { return nil },
					Config{InFormat: CSV, OutFormat: CSV, DefaultMedium: "freshwater", Constants: inputs.Flags{}})
				if err != nil || sum.Written != n {
					b.Fatalf("%d rows written of %d; %v", sum.Written, n, err)
				}
			}
			b.ReportMetric(float64(n*b.N)/b.Elapsed().Seconds(), "rows/s")
		})
	}
}

// Every row of each benchmark survey is computed: none is rejected, so
// the benchmarks time the whole per-row path.
func TestBenchmarkSurveysHaveNoRejects(t *testing.T) {
	for _, s := range surveys {
		data := generated(t, s.gen, 3000)
		var rejects []Reject
		sum, err := Run(context.Background(), bytes.NewReader(data), io.Discard, func(r Reject) error { rejects = append(rejects, r); return nil },
			Config{InFormat: CSV, OutFormat: CSV, DefaultMedium: "freshwater", Constants: inputs.Flags{}})
		if err != nil || sum.Written != 3000 || len(rejects) > 0 {
			t.Fatalf("%s: %d of 3000 written, rejects %v, error %v", s.name, sum.Written, rejects, err)
		}
	}
}

// rowBench prepares the rows of a 1000-row survey, split into fields, and
// a worker's reading and medium table.
func rowBench(b *testing.B) ([][]string, *rowCells, *localMedia, *Config) {
	data := surveyData(b, 1000)
	lines := bytes.Split(bytes.TrimSpace(data), []byte{'\n'})
	header, _ := splitFields(nil, string(lines[0]), ',')
	m, err := newMapping(header, nil, nil)
	if err != nil {
		b.Fatal(err)
	}
	var rows [][]string
	for _, l := range lines[1:] {
		f, _ := splitFields(nil, string(l), ',')
		rows = append(rows, f)
	}
	return rows, newRowCells(m, inputs.Flags{}, "freshwater", false, inputs.DefaultMissing), newLocalMedia(newMediumCache(newMediumFiles(&Config{})), localSlots), &Config{DefaultMedium: "freshwater"}
}

// BenchmarkRow measures the computation of one row, without reading or
// writing, the way batch computes rows of plain numbers.
func BenchmarkRow(b *testing.B) {
	rows, rc, cache, cfg := rowBench(b)
	var s scratch
	b.ResetTimer()
	for i := range b.N {
		fields := rows[i%len(rows)]
		in, ok, err := rc.direct.Row(fields)
		if ok && err == nil {
			_, err = computeInput(in, cfg, cache, 1, &s)
		} else if !ok {
			_, err = compute(rc.fill(fields), cfg, cache, 1, &s)
		}
		if err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRowCells is BenchmarkRow through cells for every row, the path
// for rows with units, uncertainties or words in their cells.
func BenchmarkRowCells(b *testing.B) {
	rows, rc, cache, cfg := rowBench(b)
	var s scratch
	b.ResetTimer()
	for i := range b.N {
		if _, err := compute(rc.fill(rows[i%len(rows)]), cfg, cache, 1, &s); err != nil {
			b.Fatal(err)
		}
	}
}
