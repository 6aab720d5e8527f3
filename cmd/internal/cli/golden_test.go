package cli

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files")

// TestGolden runs each testdata/golden/<case>/args through the command line
// in-process and compares stdout, stderr and the exit code with the files
// beside it. Golden files pin format and wiring; the physics is pinned by
// the sourced package tests. Run with -update to rewrite them, then review
// the diff.
func TestGolden(t *testing.T) {
	t.Setenv("COLUMNS", "") // golden tables are the unfitted ones
	root, _ := filepath.Abs("../../..")
	dirs, err := filepath.Glob(filepath.Join(root, "testdata/golden/*"))
	if err != nil || len(dirs) == 0 {
		t.Fatalf("no golden cases: %v", err)
	}
	for _, dir := range dirs {
		t.Run(filepath.Base(dir), func(t *testing.T) {
			raw, err := os.ReadFile(filepath.Join(dir, "args"))
			if err != nil {
				t.Fatal(err)
			}
			args := strings.Fields(strings.ReplaceAll(string(raw), "$ROOT", root))
			var out, errb bytes.Buffer
			code := Main(args, Streams{In: strings.NewReader(""), Out: &out, Err: &errb})
			got := map[string]string{"stdout.golden": out.String(), "stderr.golden": errb.String(), "code.golden": strconv.Itoa(code) + "\n"}
			for name, text := range got {
				path := filepath.Join(dir, name)
				if *update {
					if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
						t.Fatal(err)
					}
					continue
				}
				want, err := os.ReadFile(path)
				if err != nil {
					t.Fatalf("%v (run go test ./cmd/internal/cli -run TestGolden -update)", err)
				}
				if string(want) != text {
					t.Errorf("%s differs from %s:\n--- got ---\n%s\n--- want ---\n%s", name, path, text, want)
				}
			}
		})
	}
}
