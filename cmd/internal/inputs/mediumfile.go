package inputs

import (
	"fmt"
	"io/fs"
	"os"
	"strings"
	"syscall"

	"github.com/flowregime/flowregime/media"
)

// IsMediumFile reports whether a medium name is a path to a medium file.
func IsMediumFile(name string) bool { return strings.HasSuffix(strings.ToLower(name), ".json") }

// LookupMedium evaluates the medium of c: a medium file (a name ending in
// .json) is read with LoadMediumFile and evaluated by its At method, any
// other name by media's lookup (brief: without method notes and warning
// texts).
func LookupMedium(c media.Conditions, brief bool) (media.Properties, error) {
	if !IsMediumFile(c.Medium) {
		return media.Options{Brief: brief}.Lookup(c)
	}
	f, err := LoadMediumFile(c.Medium)
	if err != nil {
		return media.Properties{}, err
	}
	return f.At(c)
}

// LoadMediumFile reads and checks the medium file at path. Only a regular
// file of at most media.MaxMediumFileBytes is read: it is opened without waiting
// (a FIFO would otherwise block until a writer comes) and checked before
// any byte is read.
func LoadMediumFile(path string) (media.MediumFile, error) {
	fh, err := openRegular(path, media.MaxMediumFileBytes)
	if err != nil {
		return media.MediumFile{}, fmt.Errorf("cannot read medium file: %v", err)
	}
	defer fh.Close()
	f, err := media.ReadMediumFile(fh)
	if err != nil {
		return f, &MediumFileError{Path: path, Err: err}
	}
	return f, nil
}

// MediumFileError is a medium file that was read but is not a valid one.
type MediumFileError struct {
	Path string
	Err  error // from media.ReadMediumFile
}

func (e *MediumFileError) Error() string { return e.Path + ": " + e.Err.Error() }
func (e *MediumFileError) Unwrap() error { return e.Err }

// openRegular opens path for reading if it is a regular file of at most
// limit bytes, and refuses it otherwise.
func openRegular(path string, limit int64) (*os.File, error) {
	fh, err := os.OpenFile(path, os.O_RDONLY|syscall.O_NONBLOCK, 0)
	if err != nil {
		return nil, err
	}
	info, err := fh.Stat()
	switch {
	case err != nil:
	case !info.Mode().IsRegular():
		err = fmt.Errorf("%s is %s, not a regular file", path, fileKind(info.Mode()))
	case info.Size() > limit:
		err = fmt.Errorf("%s has %d bytes; a medium file has at most %d", path, info.Size(), limit)
	}
	if err != nil {
		fh.Close()
		return nil, err
	}
	return fh, nil
}

// fileKind names the kind of a file that is not a regular one.
func fileKind(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe (FIFO)"
	case m&fs.ModeDevice != 0:
		return "a device"
	case m&fs.ModeSocket != 0:
		return "a socket"
	}
	return "a special file"
}
