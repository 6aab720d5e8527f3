package batch

import (
	"bytes"
	"io"
	"strings"
	"testing"
)

// BenchmarkRecords measures the record reading alone (chunker and
// eachCSVRecord) on the synthetic survey, plain and with every row's
// species quoted.
func BenchmarkRecords(b *testing.B) {
	plain := surveyData(b, 200000)
	quoted := bytes.ReplaceAll(plain, []byte(",copepod,"), []byte(`,"copepod, adult",`))
	for _, c := range []struct {
		name string
		data []byte
	}{{"plain", plain}, {"quoted", quoted}} {
		b.Run(c.name, func(b *testing.B) {
			b.SetBytes(int64(len(c.data)))
			rule := recordRule{quotes: true, delim: ',', fields: 13}
			var fields []string
			for range b.N {
				ck := newChunker(bytes.NewReader(c.data), rule, 1, chunkSize)
				n := 0
				for {
					ch, err := ck.next()
					if err == io.EOF {
						break
					}
					fields = eachCSVRecord(ch.data, rule, fields, func(_ string, f []string, _ error, _ int) { n += len(f) })
				}
				if n == 0 {
					b.Fatal("no fields")
				}
			}
		})
	}
}

var _ = strings.Count
