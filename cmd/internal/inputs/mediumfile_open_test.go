package inputs

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// A medium file is read only when it is a regular file of at most
// media.MaxMediumFileBytes: a folder and an oversized file are refused with a
// message that says why, before any byte is read. (A FIFO is refused the
// same way; the command-line tests check that it does not block.)
func TestLoadMediumFileRefusesSpecialAndHugeFiles(t *testing.T) {
	dir := t.TempDir()
	huge := filepath.Join(dir, "huge.json")
	if err := os.WriteFile(huge, []byte(`{"format": "flowregime-medium", "name": "`+strings.Repeat("x", media.MaxMediumFileBytes)+`"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	for path, want := range map[string]string{
		dir:  "is a folder, not a regular file",
		huge: "a medium file has at most 1048576",
	} {
		if _, err := LoadMediumFile(path); err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("%s: got %v, want %q", path, err, want)
		}
	}
	if _, err := LoadMediumFile(filepath.Join("..", "..", "..", "testdata", "media", "mucus.json")); err != nil {
		t.Errorf("a small regular medium file: %v", err)
	}
}
