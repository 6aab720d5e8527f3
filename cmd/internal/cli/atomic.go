package cli

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// atomicFile is an output written to a temporary file beside its target and
// renamed over it only on success, so that a failed or interrupted run never
// leaves a half-written file.
//
// Large outputs are synced to disk in the background as they grow, so that
// the sync before the rename, which makes the new file durable, has little
// left to do.
type atomicFile struct {
	*os.File
	target   string
	done     bool
	written  int64
	nextSync int64
	syncing  chan error // the background sync running, if any
	syncErr  error      // the first background sync's failure
}

// syncEvery is how many bytes are written between background syncs.
const syncEvery = 32 << 20

func (a *atomicFile) Write(p []byte) (int, error) {
	n, err := a.File.Write(p)
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

func createAtomic(target string) (*atomicFile, error) {
	dir, base := filepath.Split(target)
	if dir == "" {
		dir = "."
	}
	f, err := os.CreateTemp(dir, "."+base+".*.tmp")
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil, fmt.Errorf("the folder %s does not exist", filepath.Clean(dir))
	case errors.Is(err, fs.ErrPermission):
		return nil, fmt.Errorf("no permission to create files in %s", filepath.Clean(dir))
	case err != nil:
		return nil, err
	}
	return &atomicFile{File: f, target: target, nextSync: syncEvery}, nil
}

// commit flushes, closes and renames the file into place.
func (a *atomicFile) commit() error {
	if err := a.File.Chmod(0o644); err != nil {
		a.abort()
		return err
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
		os.Remove(a.File.Name())
		return err
	}
	a.done = true
	return os.Rename(a.File.Name(), a.target)
}

// abort removes the temporary file; it is safe after commit.
func (a *atomicFile) abort() {
	if a.done {
		return
	}
	a.done = true
	a.wait()
	a.File.Close()
	os.Remove(a.File.Name())
}
