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
	if st, err := fh.Stat(); err == nil && st.IsDir() {
		return media.MediumFile{}, errors.New("it is a folder")
	}
	return checkMediumFile(fh)
}

// open opens the file by the rules of mediumFiles.
func (mf *mediumFiles) open(name string) (*os.File, error) {
	switch {
	case name == mf.trusted:
		return openCategory(os.Open(name))
	case mf.anywhere:
		if !filepath.IsAbs(name) {
			name = filepath.Join(mf.dir, name)
		}
		return openCategory(os.Open(name))
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
	fh, err := root.Open(name)
	if err != nil && !errors.Is(err, fs.ErrNotExist) && !errors.Is(err, fs.ErrPermission) {
		return nil, errors.New("a link in the path leads outside the table's folder (--media-anywhere allows it)")
	}
	return openCategory(fh, err)
}

// openCategory turns an open error into its category.
func openCategory(fh *os.File, err error) (*os.File, error) {
	switch {
	case err == nil:
		return fh, nil
	case errors.Is(err, fs.ErrNotExist):
		return nil, errors.New("no such file")
	case errors.Is(err, fs.ErrPermission):
		return nil, errors.New("permission denied")
	}
	return nil, errors.New("it cannot be opened")
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
