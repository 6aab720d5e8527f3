package batch

import (
	"io"

	"github.com/flowregime/flowregime/cmd/internal/report"
)

// sizedWriter is the batch's buffered writer that passes on the width of
// the output it buffers, so that table pages fit a terminal (report.Sized).
type sizedWriter struct {
	io.Writer
	columns int
}

func (s sizedWriter) Columns() int { return s.columns }

// sized returns w, knowing out's width when out has one.
func sized(w io.Writer, out io.Writer) io.Writer {
	if s, ok := out.(report.Sized); ok && s.Columns() > 0 {
		return sizedWriter{Writer: w, columns: s.Columns()}
	}
	return w
}
