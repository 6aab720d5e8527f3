package batch

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// mediaTree lays out a table's folder and its surroundings:
//
//	outer/secret.json      JSON of another kind, with keys that must not leak
//	outer/table/mucus.json a medium file (testdata/media/mucus.json)
//	outer/table/good.json  a link to mucus.json, inside the folder
//	outer/table/link.json  a link to ../secret.json, leading out
//	outer/table/other.json JSON that is not a medium file
//	outer/table/text.json  not JSON
func mediaTree(t *testing.T) (table, outer string) {
	t.Helper()
	outer = t.TempDir()
	table = filepath.Join(outer, "table")
	mucus, err := os.ReadFile("../../../testdata/media/mucus.json")
	if err != nil {
		t.Fatal(err)
	}
	write := func(name, text string) {
		if err := os.WriteFile(name, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.Mkdir(table, 0o755); err != nil {
		t.Fatal(err)
	}
	write(filepath.Join(outer, "secret.json"), `{"api_token": "hunter2", "format": "banana"}`)
	write(filepath.Join(table, "mucus.json"), string(mucus))
	write(filepath.Join(table, "other.json"), `{"api_token": "hunter2"}`)
	write(filepath.Join(table, "text.json"), "password=hunter2\n")
	for link, to := range map[string]string{"good.json": "mucus.json", "link.json": "../secret.json"} {
		if err := os.Symlink(to, filepath.Join(table, link)); err != nil {
			t.Skipf("no symbolic links here: %v", err)
		}
	}
	return table, outer
}

// Medium files named in cells are taken relative to the table's folder
// and held inside it; a refusal names a category, never the other file's
// contents or keys, and every row is in the output or the rejects.
func TestMediumFilesStayInTableFolder(t *testing.T) {
	table, outer := mediaTree(t)
	cells := map[string]string{ // cell → the category its reject must name ("" = computed)
		"mucus.json":                        "",
		"good.json":                         "",
		"./sub/../mucus.json":               "",
		filepath.Join(outer, "secret.json"): "an absolute path",
		filepath.Join(table, "mucus.json"):  "an absolute path",
		"../secret.json":                    "leads outside the table's folder",
		"../table/mucus.json":               "leads outside the table's folder",
		"link.json":                         "a link in the path leads outside",
		"other.json":                        "JSON but not a flowregime-medium file",
		"text.json":                         "not JSON",
		"missing.json":                      "no such file",
		"folder.json":                       "it is a folder",
		"fifo.json":                         "not a regular file", // opening it would wait for a writer
		"mucus.json/x.json":                 "cannot be opened",
		"nul\x00.json":                      "cannot be opened",
		".":                                 "unknown medium", // not a .json name: a medium kind
	}
	if err := os.Mkdir(filepath.Join(table, "sub"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.Mkdir(filepath.Join(table, "folder.json"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := syscall.Mkfifo(filepath.Join(table, "fifo.json"), 0o644); err != nil {
		t.Fatal(err)
	}
	var in strings.Builder
	in.WriteString("taxon,length (um),speed (um/s),medium\n")
	var order []string
	for cell := range cells {
		order = append(order, cell)
		in.WriteString("ciliate,200,50," + cell + "\n")
	}
	out, rejects, sum := runBatch(t, []byte(in.String()), Config{InFormat: CSV, OutFormat: CSV, MediaDir: table})
	if sum.Read != len(cells) || sum.Written+len(rejects) != sum.Read {
		t.Fatalf("read %d, written %d, rejected %d", sum.Read, sum.Written, len(rejects))
	}
	rejected := map[string]string{}
	for _, r := range rejects {
		rejected[order[r.Row-1]] = r.Reason
	}
	for cell, want := range cells {
		got, isRejected := rejected[cell]
		switch {
		case want == "" && isRejected:
			t.Errorf("%s: rejected: %s", cell, got)
		case want != "" && !isRejected:
			t.Errorf("%s: computed, want a reject naming %q", cell, want)
		case want != "" && !strings.Contains(got, want):
			t.Errorf("%s: reason %q, want it to name %q", cell, got, want)
		}
		if strings.Contains(got, "hunter2") || strings.Contains(got, "api_token") || strings.Contains(got, "banana") {
			t.Errorf("%s: the reason quotes the file: %q", cell, got)
		}
	}
	if n := strings.Count(out, "\n"); n != 4 { // header and three computed rows
		t.Errorf("output has %d lines:\n%s", n, out)
	}
}

// With MediaAnywhere, paths leave the folder (still taken relative to
// it), and a non-medium file is still refused by category only.
func TestMediumFilesAnywhere(t *testing.T) {
	table, outer := mediaTree(t)
	mucus := filepath.Join(table, "mucus.json")
	moved := filepath.Join(outer, "moved.json")
	b, _ := os.ReadFile(mucus)
	os.WriteFile(moved, b, 0o644)
	in := "taxon,length (um),speed (um/s),medium\nciliate,200,50,../moved.json\nciliate,200,50," + mucus + "\nciliate,200,50,link.json\n"
	_, rejects, sum := runBatch(t, []byte(in), Config{InFormat: CSV, OutFormat: CSV, MediaDir: table, MediaAnywhere: true})
	if sum.Written != 2 || len(rejects) != 1 {
		t.Fatalf("written %d, rejects %v", sum.Written, rejects)
	}
	if r := rejects[0].Reason; !strings.Contains(r, "not a flowregime-medium file") || strings.Contains(r, "api_token") || strings.Contains(r, "banana") {
		t.Errorf("reason %q", r)
	}
}

// A medium file whose values are wrong is refused without quoting them;
// one of a newer version says so.
func TestMediumFileCategories(t *testing.T) {
	var f map[string]any
	b, _ := os.ReadFile("../../../testdata/media/mucus.json")
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	for change, want := range map[string]string{
		"version":       "version is newer",
		"density_kg_m3": "values do not make a valid medium",
		"extra_key":     "values do not make a valid medium",
	} {
		g := map[string]any{}
		for k, v := range f {
			g[k] = v
		}
		switch change {
		case "version":
			g["version"] = 99
		case "density_kg_m3":
			g["density_kg_m3"] = -12345
		default:
			g["secret_extra_key"] = 1
		}
		text, _ := json.Marshal(g)
		_, err := checkMediumFile(strings.NewReader(string(text)))
		if err == nil || !strings.Contains(err.Error(), want) || strings.Contains(err.Error(), "12345") || strings.Contains(err.Error(), "secret_extra_key") {
			t.Errorf("%s: %v, want %q without the values", change, err, want)
		}
	}
}
