package cli

import (
	"bytes"
	"context"
	"os"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/survey"
	"github.com/flowregime/flowregime/cmd/internal/tabulate"
)

// benchBatchOutput is the batch output of a synthetic survey of n rows, or
// the file named by FLOWREGIME_TABULATE_BENCH (for profiling on a large
// table; not set in CI).
func benchBatchOutput(b *testing.B, n int) []byte {
	if f := os.Getenv("FLOWREGIME_TABULATE_BENCH"); f != "" {
		data, err := os.ReadFile(f)
		if err != nil {
			b.Fatal(err)
		}
		return data
	}
	var in, out bytes.Buffer
	if err := survey.Generate(&in, n, 1); err != nil {
		b.Fatal(err)
	}
	if _, err := batch.Run(context.Background(), &in, &out, func(batch.Reject) error { return nil }, batch.Config{Workers: 2, InFormat: batch.CSV, OutFormat: batch.CSV}); err != nil {
		b.Fatal(err)
	}
	return out.Bytes()
}

// BenchmarkTabulate summarises 20000 rows of batch output by taxon with two
// scaling fits, as `tabulate out.csv --by taxon` does.
func BenchmarkTabulate(b *testing.B) {
	data := benchBatchOutput(b, 20000)
	spec := func([]string) (tabulate.Spec, error) {
		return tabulate.Spec{By: []string{"taxon"}, Fits: []tabulate.Pair{{Y: "reynolds", X: "length"}, {Y: "power_W", X: "mass"}}}, nil
	}
	b.SetBytes(int64(len(data)))
	b.ReportAllocs()
	for b.Loop() {
		groups, rejected, err := tabulateStream(context.Background(), bytes.NewReader(data), batch.Config{}, spec, 0, func(batch.Reject) {})
		if err != nil || rejected != 0 || len(groups) != 8 {
			b.Fatalf("%d groups, %d rejected, %v", len(groups), rejected, err)
		}
	}
}
