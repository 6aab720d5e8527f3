package batch

import (
	"bytes"
	"context"
	"io"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/survey"
)

func surveyData(b *testing.B, n int) []byte {
	b.Helper()
	var buf bytes.Buffer
	if err := survey.Generate(&buf, n, 1); err != nil {
		b.Fatal(err)
	}
	return buf.Bytes()
}

// BenchmarkBatchCSV measures end-to-end CSV → CSV throughput on the
// synthetic survey (per-row medium and temperature); reports rows/s.
func BenchmarkBatchCSV(b *testing.B) {
	const n = 200000
	data := surveyData(b, n)
	b.SetBytes(int64(len(data)))
	b.ResetTimer()
	for range b.N {
		_, err := Run(context.Background(), bytes.NewReader(data), io.Discard, func(Reject) error { return nil },
			Config{InFormat: CSV, OutFormat: CSV, DefaultMedium: "freshwater", Constants: inputs.Flags{}})
		if err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(n*b.N)/b.Elapsed().Seconds(), "rows/s")
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
