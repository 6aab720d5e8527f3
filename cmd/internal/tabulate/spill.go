package tabulate

import (
	"bufio"
	"encoding/binary"
	"fmt"
	"io"
	"os"
	"slices"
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
	// os.TempDir(), unlinked at once where the system allows (openSpill).
	TempFile func() (*os.File, error)
}

// SpillError is a failure to make, write or read the spill file: the
// system's fault, not the input's.
type SpillError struct{ Err error }

func (e SpillError) Error() string { return e.Err.Error() }
func (e SpillError) Unwrap() error { return e.Err }

// extent is a run of values written to the spill file.
type extent struct {
	off int64 // byte offset of the first value
	n   int   // values
}

// series is one column of a group's values in input order: those written
// to the spill file first (spilled of them, in blocks chained backwards
// from the one at last), then those in memory. Its size does not grow
// with the blocks.
type series struct {
	mem     []float64
	last    int64 // offset of the last block's head; 0 for none
	spilled int
}

func (s *series) len() int { return s.spilled + len(s.mem) }

// blockHead is the head of a block in the spill file: the offset of the
// series' previous block's head (0 for none) and the number of values.
const blockHead = 16

// spillFile is the temporary file values are written to past the budget:
// blocks of a head and values, appended through a buffer (flush before
// reading), starting past one unused head so that offset 0 means none.
type spillFile struct {
	f    *os.File
	name string // removed on close, "" when already unlinked
	w    *bufio.Writer
	size int64 // bytes written, buffered ones included
}

// newTempFile makes a file in os.TempDir().
func newTempFile() (*os.File, error) {
	return os.CreateTemp("", "flowregime-tabulate-*")
}

// openSpill makes the spill file and unlinks it at once where the system
// allows it (Unix), so that no exit, a signal or a crash included, can
// leave it behind; elsewhere close removes it.
func openSpill(create func() (*os.File, error)) (*spillFile, error) {
	if create == nil {
		create = newTempFile
	}
	f, err := create()
	if err != nil {
		return nil, SpillError{fmt.Errorf("cannot make a temporary file for values past the memory budget: %v", err)}
	}
	sp := &spillFile{f: f, name: f.Name(), w: bufio.NewWriterSize(f, 1<<20), size: blockHead}
	if os.Remove(sp.name) == nil {
		sp.name = ""
	}
	if _, err := sp.w.Write(make([]byte, blockHead)); err != nil {
		sp.close()
		return nil, sp.writeError(err)
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

func (sp *spillFile) writeError(err error) error {
	return SpillError{fmt.Errorf("cannot write values past the memory budget to a temporary file: %v", err)}
}

// spill appends s's values in memory to the file as a block and frees
// them.
func (sp *spillFile) spill(s *series) error {
	if len(s.mem) == 0 {
		return nil
	}
	var head [blockHead]byte
	binary.LittleEndian.PutUint64(head[:8], uint64(s.last))
	binary.LittleEndian.PutUint64(head[8:], uint64(len(s.mem)))
	b := unsafe.Slice((*byte)(unsafe.Pointer(unsafe.SliceData(s.mem))), len(s.mem)*8)
	if _, err := sp.w.Write(head[:]); err != nil {
		return sp.writeError(err)
	}
	if _, err := sp.w.Write(b); err != nil {
		return sp.writeError(err)
	}
	s.last = sp.size
	s.spilled += len(s.mem)
	sp.size += blockHead + int64(len(b))
	s.mem = nil
	return nil
}

// flush writes the buffered blocks to the file.
func (sp *spillFile) flush() error {
	if err := sp.w.Flush(); err != nil {
		return sp.writeError(err)
	}
	return nil
}

func readError(err error) error {
	if err == io.EOF {
		err = io.ErrUnexpectedEOF
	}
	return SpillError{fmt.Errorf("cannot read back values spilled to a temporary file: %v", err)}
}

// extents are s's blocks in the file, in order, found by following the
// chain back from the last.
func (sp *spillFile) extents(s *series) ([]extent, error) {
	var ext []extent
	var head [blockHead]byte
	for off, total := s.last, 0; off != 0; {
		if _, err := sp.f.ReadAt(head[:], off); err != nil {
			return nil, readError(err)
		}
		n := int(binary.LittleEndian.Uint64(head[8:]))
		total += n
		if n <= 0 || total > s.spilled {
			return nil, readError(fmt.Errorf("block at byte %d is damaged", off))
		}
		ext = append(ext, extent{off: off + blockHead, n: n})
		off = int64(binary.LittleEndian.Uint64(head[:8]))
	}
	slices.Reverse(ext)
	return ext, nil
}

// read fills v (len(v) ≤ e.n − from) with the values of e from index from.
func (sp *spillFile) read(e extent, from int, v []float64) error {
	b := unsafe.Slice((*byte)(unsafe.Pointer(unsafe.SliceData(v))), len(v)*8)
	if _, err := sp.f.ReadAt(b, e.off+int64(from)*8); err != nil {
		return readError(err)
	}
	return nil
}

// load returns all of s's values in order, in one new slice.
func (sp *spillFile) load(s *series) ([]float64, error) {
	if s.spilled == 0 {
		return s.mem, nil
	}
	ext, err := sp.extents(s)
	if err != nil {
		return nil, err
	}
	v := make([]float64, 0, s.len())
	for _, e := range ext {
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
	xext, err := sp.extents(xs)
	if err != nil {
		return err
	}
	var yext []extent
	if ys != nil {
		if yext, err = sp.extents(ys); err != nil {
			return err
		}
	}
	var bx, by []float64
	for i, e := range xext {
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
				if err := sp.read(yext[i], from, by[:n]); err != nil {
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
