package main

import (
	"bufio"
	"bytes"
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
)

// TestMain lets the test binary stand in for flowregime: the wrapper
// script put on PATH by readmeSandbox runs it with FLOWREGIME_AS_MAIN=1.
func TestMain(m *testing.M) {
	if os.Getenv("FLOWREGIME_AS_MAIN") == "1" {
		main()
	}
	os.Exit(m.Run())
}

// readmeSkip lists the README commands not run by TestREADMECommands, each
// with its reason. Only commands that need a tool outside Go and the
// POSIX shell tools, or that are long-running, belong here.
var readmeSkip = []struct{ contains, reason string }{
	{"go test ./...", "runs the whole test suite, this test included"},
	{"parallel --pipe", "needs GNU parallel: TestParallelRecipe runs it where installed"},
}

// readmeCommands returns the commands of the README's fenced sh blocks in
// order: comments dropped, lines continued with a backslash joined.
func readmeCommands(t *testing.T) []string {
	raw, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	var cmds []string
	inBlock, cont := false, ""
	sc := bufio.NewScanner(bytes.NewReader(raw))
	for sc.Scan() {
		line := sc.Text()
		switch {
		case strings.HasPrefix(line, "```sh"):
			inBlock = true
			continue
		case strings.HasPrefix(line, "```"):
			inBlock = false
			continue
		}
		trimmed := strings.TrimSpace(line)
		if !inBlock || trimmed == "" || strings.HasPrefix(trimmed, "#") {
			continue
		}
		if strings.HasSuffix(trimmed, `\`) {
			cont += strings.TrimSuffix(trimmed, `\`) + " "
			continue
		}
		cmds = append(cmds, cont+trimmed)
		cont = ""
	}
	if len(cmds) < 20 {
		t.Fatalf("only %d commands found in the README's sh blocks", len(cmds))
	}
	return cmds
}

// readmeSandbox makes a working folder that sees the repository's testdata
// and a PATH on which flowregime is this test binary.
func readmeSandbox(t *testing.T) (dir string, env []string) {
	if _, err := exec.LookPath("sh"); err != nil {
		t.Skip("the README's commands are for a POSIX shell")
	}
	dir = t.TempDir()
	testdata, err := filepath.Abs("../../testdata")
	if err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(testdata, filepath.Join(dir, "testdata")); err != nil {
		t.Fatal(err)
	}
	self, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	bin := t.TempDir()
	script := fmt.Sprintf("#!/bin/sh\nFLOWREGIME_AS_MAIN=1 exec %q \"$@\"\n", self)
	if err := os.WriteFile(filepath.Join(bin, "flowregime"), []byte(script), 0o755); err != nil {
		t.Fatal(err)
	}
	env = append(os.Environ(), "PATH="+bin+string(os.PathListSeparator)+os.Getenv("PATH"), "COLUMNS=")
	return dir, env
}

// runShell runs one command line with sh in dir.
func runShell(t *testing.T, dir string, env []string, line string) (string, string, error) {
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, "sh", "-c", line)
	cmd.Dir, cmd.Env = dir, env
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	err := cmd.Run()
	return out.String(), errb.String(), err
}

// Every command in the README's sh blocks runs as written, in order, in
// one folder (a later line may use an earlier line's file), and succeeds
// (exit 0), but for the skip list. "go run ./cmd/flowregime" is run as
// flowregime, the same program.
func TestREADMECommands(t *testing.T) {
	if testing.Short() {
		t.Skip("runs every README command")
	}
	dir, env := readmeSandbox(t)
	ran := 0
	for _, line := range readmeCommands(t) {
		skip := ""
		for _, s := range readmeSkip {
			if strings.Contains(line, s.contains) {
				skip = s.reason
			}
		}
		if skip != "" {
			t.Logf("skipped (%s): %s", skip, line)
			continue
		}
		line = strings.ReplaceAll(line, "go run ./cmd/flowregime", "flowregime")
		out, errs, err := runShell(t, dir, env, line)
		if err != nil {
			t.Errorf("%s\n  failed: %v\n  stderr: %s", line, err, errs)
			continue
		}
		writesFile := strings.Contains(line, ">") || strings.Contains(line, " -o ") || strings.Contains(line, "--save")
		if strings.Contains(line, "flowregime") && !writesFile && out == "" {
			t.Errorf("%s\n  printed nothing", line)
		}
		ran++
	}
	t.Logf("%d README commands ran", ran)
}

// The README's GNU parallel recipe, as written, on a survey of 226,100
// rows (the demo survey 700 times: three shards of 100,000) with a bad row
// at line 150,001: the shards' output is the whole file's output without
// its header, byte for byte, and the reject names line 150,001 of the
// whole file.
func TestParallelRecipe(t *testing.T) {
	if _, err := exec.LookPath("parallel"); err != nil {
		t.Skip("GNU parallel is not installed")
	}
	if testing.Short() {
		t.Skip("runs batch on 226,100 rows three times")
	}
	var recipe string
	for _, line := range readmeCommands(t) {
		if strings.Contains(line, "parallel --pipe") {
			recipe = line
		}
	}
	if recipe == "" {
		t.Fatal("no parallel recipe in the README")
	}
	dir, env := readmeSandbox(t)
	demo, errs, err := runShell(t, dir, env, "flowregime demo --data")
	if err != nil {
		t.Fatalf("%v: %s", err, errs)
	}
	header, body, _ := strings.Cut(demo, "\n")
	var survey strings.Builder
	survey.WriteString(header + "\n")
	lines := strings.SplitAfter(strings.TrimSuffix(body, "\n"), "\n")
	const badLine = 150001
	n := 1
	for range 700 {
		for _, l := range lines {
			n++
			if n == badLine {
				l = strings.Replace(l, ",", ",BAD", 7) // the length column, seventh comma on
			}
			survey.WriteString(strings.TrimSuffix(l, "\n") + "\n")
		}
	}
	if err := os.WriteFile(filepath.Join(dir, "survey.csv"), []byte(survey.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	_, shardErrs, err := runShell(t, dir, env, recipe)
	if ee, ok := err.(*exec.ExitError); err != nil && !(ok && ee.ExitCode() == 1) { // parallel's status: the number of failed jobs (1: the shard with the reject)
		t.Fatalf("%s: %v\n%s", recipe, err, shardErrs)
	}
	whole, _, err := runShell(t, dir, env, "flowregime batch survey.csv -q 2>/dev/null; true")
	if err != nil {
		t.Fatal(err)
	}
	got, err := os.ReadFile(filepath.Join(dir, "results-body.csv"))
	if err != nil {
		t.Fatal(err)
	}
	_, wholeBody, _ := strings.Cut(whole, "\n")
	if string(got) != wholeBody {
		t.Errorf("the shards' output (%d bytes) differs from the whole file's body (%d bytes)", len(got), len(wholeBody))
	}
	if !regexp.MustCompile(fmt.Sprintf(`rejected line %d\b`, badLine)).MatchString(shardErrs) || strings.Count(shardErrs, "rejected") != 1 {
		t.Errorf("want one reject at line %d, got:\n%s", badLine, shardErrs)
	}
}
