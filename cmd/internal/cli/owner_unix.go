//go:build unix

package cli

import (
	"io/fs"
	"os"
	"syscall"
)

// keepOwner gives f the owner and group of the file it replaces, where the
// user may: root always, others only a group of their own.
func keepOwner(f *os.File, old fs.FileInfo) {
	if st, ok := old.Sys().(*syscall.Stat_t); ok {
		f.Chown(int(st.Uid), int(st.Gid))
	}
}
