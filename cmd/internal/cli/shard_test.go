package cli

import (
	"encoding/csv"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A shard told where it starts (--first-line) names the whole file's lines
// in its rejects: the second half of corrupt.csv, cut at line 8 and fed
// without its header, rejects the same lines as the whole file does past
// line 7.
func TestShardFirstLine(t *testing.T) {
	raw, err := os.ReadFile("../../../testdata/batch/corrupt.csv")
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.SplitAfter(string(raw), "\n")
	dir := t.TempDir()
	shard := filepath.Join(dir, "shard.csv")
	if err := os.WriteFile(shard, []byte(strings.Join(lines[7:], "")), 0o644); err != nil {
		t.Fatal(err)
	}
	wholeRej, shardRej := filepath.Join(dir, "whole-rej.csv"), filepath.Join(dir, "shard-rej.csv")
	run(t, "batch", "../../../testdata/batch/corrupt.csv", "-q", "--rejects", wholeRej)
	_, errs, code := run(t, "batch", shard, "-q", "--names", strings.TrimRight(lines[0], "\r\n"), "--first-line", "8", "--rejects", shardRej)
	if code != ExitRejected {
		t.Fatalf("exit %d: %s", code, errs)
	}
	read := func(path string) [][]string {
		f, err := os.Open(path)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		recs, err := csv.NewReader(f).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		return recs[1:]
	}
	var want []string
	for _, r := range read(wholeRej) {
		if n := r[0]; len(n) > 1 || n >= "8" {
			want = append(want, n+" "+r[3])
		}
	}
	var got []string
	for _, r := range read(shardRej) {
		got = append(got, r[0]+" "+r[3])
	}
	if strings.Join(got, "\n") != strings.Join(want, "\n") || len(got) == 0 {
		t.Errorf("shard rejects:\n%s\nwhole file's from line 8:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	if _, _, code := run(t, "batch", shard, "--names", "a,b", "--first-line", "0"); code != ExitUsage {
		t.Errorf("--first-line 0: exit %d, want %d", code, ExitUsage)
	}
}
