package cli

import (
	"fmt"
	"runtime/debug"
	"strings"
)

// Build describes the running program, from the Go toolchain's build
// information (runtime/debug.ReadBuildInfo): module path and version, the
// VCS revision and time it was built from, whether the tree had local
// changes, and the Go version.
type Build struct {
	Module    string `json:"module"`
	Version   string `json:"version"`
	Revision  string `json:"revision,omitempty"`
	Time      string `json:"revision_time,omitempty"`
	Modified  bool   `json:"modified,omitempty"`
	GoVersion string `json:"go_version"`
}

// BuildInfo returns the running program's [Build]; fields the toolchain did
// not record are "unknown" (module, version) or empty (revision).
func BuildInfo() Build {
	b := Build{Module: "unknown", Version: "unknown", GoVersion: "unknown"}
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return b
	}
	b.GoVersion = bi.GoVersion
	if bi.Main.Path != "" {
		b.Module = bi.Main.Path
	}
	if bi.Main.Version != "" {
		b.Version = bi.Main.Version
	}
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			b.Revision = s.Value
		case "vcs.time":
			b.Time = s.Value
		case "vcs.modified":
			b.Modified = s.Value == "true"
		}
	}
	return b
}

// String is the text of --version.
func (b Build) String() string {
	var s strings.Builder
	fmt.Fprintf(&s, "flowregime %s\n  module:   %s\n", b.Version, b.Module)
	switch {
	case b.Revision == "":
		s.WriteString("  revision: not recorded (built outside a VCS checkout or with -buildvcs=false)\n")
	default:
		fmt.Fprintf(&s, "  revision: %s", b.Revision)
		if b.Time != "" {
			fmt.Fprintf(&s, " of %s", b.Time)
		}
		if b.Modified {
			s.WriteString(", with uncommitted changes")
		}
		s.WriteString("\n")
	}
	fmt.Fprintf(&s, "  go:       %s\n", b.GoVersion)
	return s.String()
}
