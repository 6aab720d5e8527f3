package survey

import (
	"bytes"
	"fmt"
)

// WithNotes returns an invented survey of n rows with a free-text notes
// column, for tests of how records are read: notes gives some rows' notes
// (by row number, 1-based), the rest say "plain". The caller knows how many
// rows it asked for, so the count never comes from a reader under test.
func WithNotes(n int, notes map[int]string, finalNewline bool) []byte {
	var b bytes.Buffer
	b.WriteString("species,length (mm),speed (cm/s),notes\n")
	for i := 1; i <= n; i++ {
		note, ok := notes[i]
		if !ok {
			note = "plain"
		}
		fmt.Fprintf(&b, "fish %d,%d,%d,%s", i, 100+i%200, 20+i%50, note)
		if i < n || finalNewline {
			b.WriteByte('\n')
		}
	}
	return b.Bytes()
}
