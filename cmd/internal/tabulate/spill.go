package tabulate

import (
	"fmt"
	"io"
	"os"
	"unsafe"
)

// DefaultBudget is the most values (float64, 8 bytes each: 64 MiB) the
// merged groups hold in memory before they are written to a temporary
// file. Summarising a spilled table loads at most this many more at once,
// so the values take at most twice the budget whatever the row count.
const DefaultBudget = 8 << 20

// Options tune Chunks.
type Options struct {
	Workers int // goroutines; 0 for GOMAXPROCS
	// Budget is the most values held in memory before they are spilled
	// to a temporary file; 0 for DefaultBudget. Tests set it small.
	Budget int
	// TempFile makes the spill file; nil for an unnamed file in
	// os.TempDir() (see newTempFile).
	TempFile func() (*os.File, error)
}

// SpillError is a failure to make, write or read the spill file: the
// system's fault, not the input's.
type SpillError struct{ Err error }

func (e SpillError) Error() string { return e.Err.Error() }
func (e SpillError) Unwrap() error { return e.Err }

// extent is a run of values written to the spill file.
type extent struct {
	off int64 // byte offset
	n   int   // values
}

// series is one column of a group's values in input order: those written
// to the spill file first (ext, spilled of them), then those in memory.
type series struct {
	mem     []float64
	ext     []extent
	spilled int
}

func (s *series) len() int { return s.spilled + len(s.mem) }

// spillFile is the temporary file values are written to past the budget.
type spillFile struct {
	f    *os.File
	name string // removed on close, "" when already unlinked
	size int64
}

// newTempFile makes a file in os.TempDir() and unlinks it at once where
// the system allows it (Unix), so that no exit, a signal or a crash
// included, can leave it behind; elsewhere close removes it.
func newTempFile() (*os.File, error) {
	return os.CreateTemp("", "flowregime-tabulate-*")
}

func openSpill(create func() (*os.File, error)) (*spillFile, error) {
	if create == nil {
		create = newTempFile
	}
	f, err := create()
	if err != nil {
		return nil, SpillError{fmt.Errorf("cannot make a temporary file for values past the memory budget: %v", err)}
	}
	sp := &spillFile{f: f, name: f.Name()}
	if os.Remove(sp.name) == nil {
		sp.name = ""
	}
	return sp, nil
}

// close closes the file and removes it if it still has a name.
func (sp *spillFile) close() {
	if sp == nil {
		return
	}
	sp.f.Close()
	if sp.name != "" {
		os.Remove(sp.name)
	}
}

// spill appends s's values in memory to the file and frees them.
func (sp *spillFile) spill(s *series) error {
	if len(s.mem) == 0 {
		return nil
	}
	b := unsafe.Slice((*byte)(unsafe.Pointer(unsafe.SliceData(s.mem))), len(s.mem)*8)
	if _, err := sp.f.WriteAt(b, sp.size); err != nil {
		return SpillError{fmt.Errorf("cannot write values past the memory budget to a temporary file: %v", err)}
	}
	s.ext = append(s.ext, extent{off: sp.size, n: len(s.mem)})
	s.spilled += len(s.mem)
	sp.size += int64(len(b))
	s.mem = nil
	return nil
}

// read fills v (len(v) ≤ e.n − from) with the values of e from index from.
func (sp *spillFile) read(e extent, from int, v []float64) error {
	b := unsafe.Slice((*byte)(unsafe.Pointer(unsafe.SliceData(v))), len(v)*8)
	if _, err := sp.f.ReadAt(b, e.off+int64(from)*8); err != nil {
		if err == io.EOF {
			err = io.ErrUnexpectedEOF
		}
		return SpillError{fmt.Errorf("cannot read back values spilled to a temporary file: %v", err)}
	}
	return nil
}

// load returns all of s's values in order, in one new slice.
func (sp *spillFile) load(s *series) ([]float64, error) {
	if s.spilled == 0 {
		return s.mem, nil
	}
	v := make([]float64, 0, s.len())
	for _, e := range s.ext {
		if err := sp.read(e, 0, v[len(v):len(v)+e.n]); err != nil {
			return nil, err
		}
		v = v[:len(v)+e.n]
	}
	return append(v, s.mem...), nil
}

// blockValues is how many values each streams at once.
const blockValues = 1 << 15

// each passes the values of xs, and of ys alongside when it is not nil
// (a series of the same length, spilled alike), in order, a block at a
// time.
func (sp *spillFile) each(xs, ys *series, fn func(x, y []float64)) error {
	var bx, by []float64
	for i, e := range xs.ext {
		for from := 0; from < e.n; from += blockValues {
			n := min(blockValues, e.n-from)
			if bx == nil {
				bx = make([]float64, blockValues)
				if ys != nil {
					by = make([]float64, blockValues)
				}
			}
			if err := sp.read(e, from, bx[:n]); err != nil {
				return err
			}
			if ys != nil {
				if err := sp.read(ys.ext[i], from, by[:n]); err != nil {
					return err
				}
				fn(bx[:n], by[:n])
				continue
			}
			fn(bx[:n], nil)
		}
	}
	if ys != nil {
		fn(xs.mem, ys.mem)
	} else {
		fn(xs.mem, nil)
	}
	return nil
}
