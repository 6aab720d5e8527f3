package batch

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"sync"

	"github.com/flowregime/flowregime/media"
)

// mediumFiles opens the medium files that a table's cells name, once per
// name. A name is taken relative to the table's folder and, unless
// anywhere is set, must stay inside it: no absolute path, no "..", and no
// symbolic link that leads out (os.Root refuses those). A file that cannot
// be used is refused by a short category only; its contents and keys are
// never quoted, since the file may be any file the table's author chose.
type mediumFiles struct {
	dir      string // the table's folder
	anywhere bool   // --media-anywhere
	trusted  string // the --medium file (absolute), named on the command line

	mu   sync.Mutex
	seen map[string]fileVerdict
}

type fileVerdict struct {
	f   media.MediumFile
	err error
}

// maxNames bounds the verdicts kept; past it they are forgotten and
// files are read again.
const maxNames = 4096

func newMediumFiles(cfg *Config) *mediumFiles {
	dir := cfg.MediaDir
	if dir == "" {
		dir = "."
	}
	return &mediumFiles{dir: dir, anywhere: cfg.MediaAnywhere, trusted: cfg.DefaultMedium, seen: map[string]fileVerdict{}}
}

// load returns the medium file a cell names.
func (mf *mediumFiles) load(name string) (media.MediumFile, error) {
	mf.mu.Lock()
	v, ok := mf.seen[name]
	mf.mu.Unlock()
	if ok {
		return v.f, v.err
	}
	v.f, v.err = mf.read(name)
	if v.err != nil {
		v.err = fmt.Errorf("medium %q is not a usable medium file: %w", name, v.err)
	}
	mf.mu.Lock()
	if len(mf.seen) >= maxNames {
		clear(mf.seen)
	}
	mf.seen[name] = v
	mf.mu.Unlock()
	return v.f, v.err
}

func (mf *mediumFiles) read(name string) (media.MediumFile, error) {
	fh, err := mf.open(name)
	if err != nil {
		return media.MediumFile{}, err
	}
	defer fh.Close()
	return checkMediumFile(fh)
}

// opener is what mediumFiles opens through: the table's folder as an
// os.Root, or the file system as a whole.
type opener interface {
	Stat(name string) (fs.FileInfo, error)
	Open(name string) (*os.File, error)
}

type anyFile struct{}

func (anyFile) Stat(name string) (fs.FileInfo, error) { return os.Stat(name) }
func (anyFile) Open(name string) (*os.File, error)    { return os.Open(name) }

// open opens the file by the rules of mediumFiles.
func (mf *mediumFiles) open(name string) (*os.File, error) {
	switch {
	case name == mf.trusted:
		return openRegular(anyFile{}, name)
	case mf.anywhere:
		if !filepath.IsAbs(name) {
			name = filepath.Join(mf.dir, name)
		}
		return openRegular(anyFile{}, name)
	case filepath.IsAbs(name):
		return nil, errors.New("an absolute path; a table may name only files in its own folder (--media-anywhere allows more)")
	case !filepath.IsLocal(name):
		return nil, errors.New("the path leads outside the table's folder (--media-anywhere allows it)")
	}
	root, err := os.OpenRoot(mf.dir)
	if err != nil {
		return nil, errors.New("the table's folder cannot be opened")
	}
	defer root.Close()
	fh, err := openRegular(root, name)
	if err != nil && linksOut(mf.dir, name) {
		return nil, errors.New("a link in the path leads outside the table's folder (--media-anywhere allows it)")
	}
	return fh, err
}

// openRegular opens a regular file (not a folder, device or pipe, which
// could block or never end), giving a failure's category only.
func openRegular(o opener, name string) (*os.File, error) {
	st, err := o.Stat(name)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil, errors.New("no such file")
	case errors.Is(err, fs.ErrPermission):
		return nil, errors.New("permission denied")
	case err != nil:
		return nil, errors.New("it cannot be opened")
	case st.IsDir():
		return nil, errors.New("it is a folder")
	case !st.Mode().IsRegular():
		return nil, errors.New("it is not a regular file")
	}
	fh, err := o.Open(name)
	if err != nil {
		return nil, errors.New("it cannot be opened")
	}
	return fh, nil
}

// linksOut reports whether name, in dir, resolves through links to a
// place outside dir.
func linksOut(dir, name string) bool {
	real, err := filepath.EvalSymlinks(filepath.Join(dir, name))
	if err != nil {
		return false
	}
	realDir, err := filepath.EvalSymlinks(dir)
	if err != nil {
		return false
	}
	rel, err := filepath.Rel(realDir, real)
	return err != nil || !filepath.IsLocal(rel)
}

// maxMediumFile is the size a medium file may have; media.ReadMediumFile
// reads no more either.
const maxMediumFile = 1 << 20

// checkMediumFile reads a medium file and says by category only what is
// wrong with it: not JSON, JSON of another kind, a newer version, or
// values that are not a valid medium ('flowregime medium FILE' shows which).
func checkMediumFile(r io.Reader) (media.MediumFile, error) {
	b, err := io.ReadAll(io.LimitReader(r, maxMediumFile+1))
	switch {
	case err != nil:
		return media.MediumFile{}, errors.New("it cannot be read")
	case len(b) > maxMediumFile:
		return media.MediumFile{}, fmt.Errorf("it is larger than %d MiB", maxMediumFile>>20)
	case !json.Valid(b):
		return media.MediumFile{}, errors.New("it is not JSON")
	}
	var head struct {
		Format  any `json:"format"`
		Version any `json:"version"`
	}
	if json.Unmarshal(b, &head) != nil || head.Format != media.MediumFileFormat {
		return media.MediumFile{}, fmt.Errorf("it is JSON but not a %s file", media.MediumFileFormat)
	}
	if v, ok := head.Version.(float64); ok && v > media.MediumFileVersion {
		return media.MediumFile{}, errors.New("its version is newer than this flowregime reads")
	}
	f, err := media.ReadMediumFile(bytes.NewReader(b))
	if err != nil {
		return f, errors.New("its values do not make a valid medium (flowregime medium FILE shows why)")
	}
	return f, nil
}
