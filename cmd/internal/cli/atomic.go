package cli

import (
	"os"
	"path/filepath"
)

// atomicFile is an output written to a temporary file beside its target and
// renamed over it only on success, so that a failed or interrupted run never
// leaves a half-written file.
type atomicFile struct {
	*os.File
	target string
	done   bool
}

func createAtomic(target string) (*atomicFile, error) {
	dir, base := filepath.Split(target)
	if dir == "" {
		dir = "."
	}
	f, err := os.CreateTemp(dir, "."+base+".*.tmp")
	if err != nil {
		return nil, err
	}
	return &atomicFile{File: f, target: target}, nil
}

// commit flushes, closes and renames the file into place.
func (a *atomicFile) commit() error {
	if err := a.File.Chmod(0o644); err != nil {
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
	a.File.Close()
	os.Remove(a.File.Name())
}
