package cli

import (
	"errors"
	"fmt"
	"github.com/spf13/cobra"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// namedFile is a file a command reads or writes, with the words that name
// it in messages ("-o out.csv", "the input data.csv").
type namedFile struct {
	what, path string
	file       *os.File // standard input or output, when path is empty
}

// identity is what tells whether two names mean one file: its information
// when it exists, else its absolute path with the folder's links followed.
type identity struct {
	info fs.FileInfo
	path string
}

func identify(f namedFile) (identity, bool) {
	if f.file != nil {
		info, err := f.file.Stat()
		return identity{info: info}, err == nil
	}
	if f.path == "" || f.path == "-" {
		return identity{}, false
	}
	path, info, err := resolveOutput(f.path)
	if err != nil {
		return identity{}, false
	}
	if info != nil {
		return identity{info: info}, true
	}
	abs, err := filepath.Abs(path)
	if err != nil {
		return identity{}, false
	}
	dir, base := filepath.Split(abs)
	if real, err := filepath.EvalSymlinks(dir); err == nil {
		dir = real
	}
	return identity{path: filepath.Join(dir, base)}, true
}

// clashes reports whether writing b would damage a: the same regular file,
// or the same name not yet created. Devices and pipes may be shared.
func (a identity) clashes(b identity) bool {
	if a.info != nil && b.info != nil {
		return a.info.Mode().IsRegular() && os.SameFile(a.info, b.info)
	}
	return a.info == nil && b.info == nil && a.path != "" && a.path == b.path
}

// checkOutputs refuses, before anything is read, an output that is a folder,
// is the same file as an input (through links too), or is the same file as
// another output.
func checkOutputs(ins, outs []namedFile) error {
	var seen []identity
	var seenNames []namedFile
	for _, in := range ins {
		if id, ok := identify(in); ok {
			seen, seenNames = append(seen, id), append(seenNames, in)
		}
	}
	for _, out := range outs {
		id, ok := identify(out)
		if !ok {
			continue
		}
		if id.info != nil && id.info.IsDir() {
			return usagef("%s is a folder; name a file", out.what)
		}
		for i, other := range seen {
			if id.clashes(other) {
				return usagef("%s is the same file as %s; writing it would destroy that; choose another name", out.what, seenNames[i].what)
			}
		}
		seen, seenNames = append(seen, id), append(seenNames, out)
	}
	return nil
}

// stdFile returns the file behind a stream, if it is one.
func stdFile(v any) *os.File {
	switch s := v.(type) {
	case *os.File:
		return s
	case *checkedWriter:
		return stdFile(s.w)
	}
	return nil
}

// checkedWriter passes writes on to w and keeps the first error: once a
// write failed, later ones fail the same way, and Main reports it, so that
// no command can end in success with its output lost (a full disk, a closed
// pipe).
type checkedWriter struct {
	w       io.Writer
	err     error
	columns int // the width tables are fitted to (see bindWidth)
}

func (c *checkedWriter) Write(p []byte) (int, error) {
	if c.err != nil {
		return 0, c.err
	}
	n, err := c.w.Write(p)
	if err == nil && n < len(p) {
		err = io.ErrShortWrite
	}
	if err != nil {
		c.err = err
	}
	return n, err
}

// failed returns the first write error, without the file's name.
func (c *checkedWriter) failed() error { return withoutPath(c.err) }

// withoutPath drops the file name from err, for messages that name the
// file themselves (and would otherwise show a temporary file's name).
func withoutPath(err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}

// writeFailure returns "cannot write NAME: …" when a write to f failed,
// else nil.
func writeFailure(name string, f *atomicFile) error {
	if f != nil && f.writeErr != nil {
		return fmt.Errorf("cannot write %s: %v", name, withoutPath(f.writeErr))
	}
	return nil
}

// tableFiles names a command's input table (a path, or "-" for the
// standard input) and its outputs (the standard output and each named
// file whose path is set), for checkOutputs.
func tableFiles(s Streams, input string, files ...namedFile) (ins, outs []namedFile) {
	ins = []namedFile{{what: "the input " + input, path: input}}
	if input == "-" {
		ins[0] = namedFile{what: "the standard input", file: stdFile(s.In)}
	}
	outs = []namedFile{{what: "the standard output", file: stdFile(s.Out)}}
	for _, f := range files {
		if f.path != "" {
			outs = append(outs, f)
		}
	}
	return ins, outs
}

// openTable opens the input table, or hands back the standard input for
// "-"; done closes what was opened.
func openTable(s Streams, input string) (in io.Reader, done func(), err error) {
	if input == "-" {
		return s.In, func() {}, nil
	}
	f, err := os.Open(input)
	if err != nil {
		return nil, nil, fmt.Errorf("cannot read %s: %v", input, err)
	}
	return f, func() { f.Close() }, nil
}

// oneTable checks that a command that reads one table got exactly one
// argument: what (a file, a file of readings) or - for standard input.
func oneTable(command, what string) cobra.PositionalArgs {
	return func(_ *cobra.Command, args []string) error {
		if len(args) != 1 {
			return usagef("%s needs one argument: %s, or - for standard input", command, what)
		}
		return nil
	}
}
