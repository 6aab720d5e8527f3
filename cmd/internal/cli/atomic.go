package cli

import (
	"errors"
	"fmt"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"sync"
	"unicode/utf8"
)

// atomicFile is an output written to a temporary file beside its target and
// renamed over it only on success, so that a failed or interrupted run never
// leaves a half-written file. A target that is a device or a FIFO is
// written in place instead (direct): replacing it would destroy it.
//
// The temporary file is created by this program with permission 0666, so
// the umask applies to a new output; a file being replaced keeps its mode
// and, where the user may set them, its owner and group.
//
// Large outputs are synced to disk in the background as they grow, so that
// the sync before the rename, which makes the new file durable, has little
// left to do.
type atomicFile struct {
	*os.File
	target   string // the file renamed over: the output with its links followed
	direct   bool   // a device or FIFO written in place
	set      *outputSet
	done     bool
	written  int64
	nextSync int64
	syncing  chan error // the background sync running, if any
	syncErr  error      // the first background sync's failure
	writeErr error      // the first write's failure
}

// syncEvery is how many bytes are written between background syncs.
const syncEvery = 32 << 20

// maxNameBytes is the longest file name most file systems take (NAME_MAX
// of Linux, macOS and Windows).
const maxNameBytes = 255

func (a *atomicFile) Write(p []byte) (int, error) {
	n, err := a.File.Write(p)
	if err != nil && a.writeErr == nil {
		a.writeErr = err
	}
	if a.direct {
		return n, err
	}
	a.written += int64(n)
	if a.written >= a.nextSync {
		a.nextSync = a.written + syncEvery
		if a.syncing != nil { // still running: never hold up the writer for it
			select {
			case e := <-a.syncing:
				a.note(e)
			default:
				return n, err
			}
		}
		a.syncing = make(chan error, 1)
		go func(f *os.File, done chan<- error) { done <- f.Sync() }(a.File, a.syncing)
	}
	return n, err
}

func (a *atomicFile) note(err error) {
	if a.syncErr == nil {
		a.syncErr = err
	}
	a.syncing = nil
}

// wait waits for a background sync, if one is running, and returns the
// first background sync's error.
func (a *atomicFile) wait() error {
	if a.syncing != nil {
		a.note(<-a.syncing)
	}
	return a.syncErr
}

// outputSet holds the temporary files of one run, so that a signal or a
// panic can remove them; once stopped it lets no file be created or
// renamed into place. A nil outputSet works and tracks nothing.
type outputSet struct {
	mu      sync.Mutex
	stopped bool
	temps   map[*atomicFile]bool
	renamed []string // outputs already in place
}

func newOutputSet() *outputSet { return &outputSet{temps: map[*atomicFile]bool{}} }

// errStopped is returned by outputs of a run that is being stopped.
var errStopped = errors.New("the run is being stopped")

// stop removes every temporary file and refuses further outputs. It
// returns the outputs that were already in place.
func (set *outputSet) stop() []string {
	if set == nil {
		return nil
	}
	set.mu.Lock()
	defer set.mu.Unlock()
	set.stopped = true
	for a := range set.temps {
		os.Remove(a.File.Name())
		delete(set.temps, a)
	}
	return set.renamed
}

// track registers a temporary file, or removes it when the run is stopping.
func (set *outputSet) track(a *atomicFile) error {
	if set == nil {
		return nil
	}
	set.mu.Lock()
	defer set.mu.Unlock()
	if set.stopped {
		a.File.Close()
		os.Remove(a.File.Name())
		return errStopped
	}
	set.temps[a] = true
	return nil
}

// finish runs last (the rename or the removal of a temporary file) unless
// the run is stopping, and forgets the file.
func (set *outputSet) finish(a *atomicFile, last func() error) error {
	if set == nil {
		return last()
	}
	set.mu.Lock()
	defer set.mu.Unlock()
	if set.stopped {
		return errStopped
	}
	delete(set.temps, a)
	return last()
}

// create opens the output name: a temporary file beside it, or the device
// or FIFO itself. A symbolic link is followed, so that its target is
// replaced and the link kept.
func (set *outputSet) create(name string) (*atomicFile, error) {
	target, info, err := resolveOutput(name)
	if err != nil {
		return nil, err
	}
	if info != nil && info.IsDir() {
		return nil, fmt.Errorf("%s is a folder; name a file", name)
	}
	if info != nil && !info.Mode().IsRegular() {
		f, err := os.OpenFile(target, os.O_WRONLY, 0)
		if err != nil {
			return nil, err
		}
		return &atomicFile{File: f, target: target, direct: true}, nil
	}
	if info != nil {
		// Never replace what this user may not write: the rename alone
		// would not ask.
		f, err := os.OpenFile(target, os.O_WRONLY, 0)
		if err != nil {
			return nil, err
		}
		f.Close()
	}
	f, err := createTemp(target)
	if err != nil {
		return nil, err
	}
	if info != nil {
		keepOwner(f, info) // before the mode: chown clears set-id bits
		if err := f.Chmod(info.Mode().Perm()); err != nil {
			f.Close()
			os.Remove(f.Name())
			return nil, err
		}
	}
	a := &atomicFile{File: f, target: target, set: set, nextSync: syncEvery}
	if err := set.track(a); err != nil {
		return nil, err
	}
	return a, nil
}

// resolveOutput returns the file to write for the output name and its
// information, nil when it does not exist yet. A regular file is reached
// through its links, so that the link is kept and its target replaced; a
// device, FIFO or folder keeps its name (the kernel follows links such as
// /dev/stdout → /proc/self/fd/1 → pipe:[…] that name no real path).
func resolveOutput(name string) (string, fs.FileInfo, error) {
	info, err := os.Stat(name)
	switch {
	case err == nil && !info.Mode().IsRegular():
		return name, info, nil
	case err == nil:
		real, err := filepath.EvalSymlinks(name)
		return real, info, err
	case !errors.Is(err, fs.ErrNotExist):
		return "", nil, err
	}
	return missingTarget(name)
}

// missingTarget follows name's links to the file not made yet that they
// lead to.
func missingTarget(name string) (string, fs.FileInfo, error) {
	for range 40 { // the link limit of Linux path resolution, path_resolution(7)
		info, err := os.Lstat(name)
		switch {
		case errors.Is(err, fs.ErrNotExist):
			return name, nil, nil
		case err != nil:
			return "", nil, err
		case info.Mode()&fs.ModeSymlink == 0:
			return name, info, nil
		}
		link, err := os.Readlink(name)
		if err != nil {
			return "", nil, err
		}
		if !filepath.IsAbs(link) {
			link = filepath.Join(filepath.Dir(name), link)
		}
		name = link
	}
	return "", nil, errors.New("too many levels of symbolic links")
}

// createTemp creates a new, empty temporary file beside target with
// permission 0666 (less the umask), trying other names on a clash.
func createTemp(target string) (*os.File, error) {
	dir, base := filepath.Split(target)
	if dir == "" {
		dir = "."
	}
	for range 100 {
		f, err := os.OpenFile(filepath.Join(dir, tempName(base, rand.Uint32())), os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o666)
		switch {
		case errors.Is(err, fs.ErrExist):
			continue
		case errors.Is(err, fs.ErrNotExist):
			return nil, fmt.Errorf("the folder %s does not exist", filepath.Clean(dir))
		case errors.Is(err, fs.ErrPermission):
			return nil, fmt.Errorf("no permission to create files in %s", filepath.Clean(dir))
		}
		return f, err
	}
	return nil, fmt.Errorf("no free temporary file name in %s", filepath.Clean(dir))
}

// tempName is ".BASE.XXXXXXXX.tmp", with BASE shortened (at a character
// boundary) so that the name stays within maxNameBytes.
func tempName(base string, n uint32) string {
	suffix := fmt.Sprintf(".%08x.tmp", n)
	if room := maxNameBytes - 1 - len(suffix); len(base) > room {
		for room > 0 && !utf8.RuneStart(base[room]) {
			room--
		}
		base = base[:room]
	}
	return "." + base + suffix
}

// commit flushes, closes and renames the file into place; a device or FIFO
// is only closed.
func (a *atomicFile) commit() error {
	if a.direct {
		a.done = true
		return a.File.Close()
	}
	if err := a.wait(); err != nil {
		a.abort()
		return err
	}
	if err := a.File.Sync(); err != nil {
		a.abort()
		return err
	}
	if err := a.File.Close(); err != nil {
		a.abort()
		return err
	}
	a.done = true
	return a.set.finish(a, func() error {
		if err := os.Rename(a.File.Name(), a.target); err != nil {
			os.Remove(a.File.Name())
			return err
		}
		if a.set != nil {
			a.set.renamed = append(a.set.renamed, a.target)
		}
		return nil
	})
}

// abort removes the temporary file; it is safe after commit.
func (a *atomicFile) abort() {
	if a.done {
		return
	}
	a.done = true
	if a.direct {
		a.File.Close()
		return
	}
	a.wait()
	a.File.Close()
	a.set.finish(a, func() error { return os.Remove(a.File.Name()) })
}
