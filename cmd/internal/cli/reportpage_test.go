package cli

import (
	"bytes"
	"encoding/base64"
	"encoding/csv"
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/demo"
)

// node is an element of a parsed page.
type node struct {
	name     string
	attr     map[string]string
	children []*node
	text     strings.Builder
}

// parseXHTML parses the page with encoding/xml in strict mode: the page is
// written as well-formed XHTML, so any unclosed or stray tag fails here.
func parseXHTML(t *testing.T, page []byte) *node {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(page))
	d.Strict = true
	root := &node{name: "#document"}
	stack := []*node{root}
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("the page is not well-formed XHTML: %v", err)
		}
		top := stack[len(stack)-1]
		switch tok := tok.(type) {
		case xml.StartElement:
			n := &node{name: tok.Name.Local, attr: map[string]string{}}
			for _, a := range tok.Attr {
				n.attr[a.Name.Local] = a.Value
			}
			top.children = append(top.children, n)
			stack = append(stack, n)
		case xml.EndElement:
			stack = stack[:len(stack)-1]
		case xml.CharData:
			for _, n := range stack {
				n.text.Write(tok)
			}
		}
	}
	return root
}

// find returns every element named name under n, in document order.
func (n *node) find(name string) []*node {
	var out []*node
	for _, c := range n.children {
		if c.name == name {
			out = append(out, c)
		}
		out = append(out, c.find(name)...)
	}
	return out
}

// byID returns the element with that id, or fails.
func (n *node) byID(t *testing.T, id string) *node {
	t.Helper()
	var walk func(*node) *node
	walk = func(m *node) *node {
		if m.attr["id"] == id {
			return m
		}
		for _, c := range m.children {
			if r := walk(c); r != nil {
				return r
			}
		}
		return nil
	}
	if r := walk(n); r != nil {
		return r
	}
	t.Fatalf("the page has no element with id %q", id)
	return nil
}

// bodyRows returns the cells' texts of each row of a table's body.
func (n *node) bodyRows() [][]string {
	var rows [][]string
	for _, tb := range n.find("tbody") {
		for _, tr := range tb.find("tr") {
			var cells []string
			for _, td := range tr.find("td") {
				cells = append(cells, strings.TrimSpace(td.text.String()))
			}
			rows = append(rows, cells)
		}
	}
	return rows
}

// surveyWithBadRows writes the demo survey with two rows that cannot be
// computed and one whose taxon is markup, each at a known data row, and
// returns the file and its records (read back by encoding/csv).
func surveyWithBadRows(t *testing.T) (string, [][]string) {
	t.Helper()
	recs, err := csv.NewReader(bytes.NewReader(demo.Survey)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	bad := map[int][]string{
		10:  {"tarn", "2026-06-01", "stickleback", "freshwater", "11", "", "", "-5", "9", "175", "4", "9", "", "", ""},
		100: {"tarn", "2026-06-02", "stickleback", "lava", "11", "", "", "47", "9", "175", "4", "9", "", "", ""},
		200: {"tarn", "2026-06-03", "<script>alert(1)</script>", "freshwater", "11", "", "", "47", "9", "175", "4", "9", "", "", ""},
		250: {"tarn", "2026-06-04", "bell\x07 and \xff byte", "freshwater", "11", "", "", "47", "9", "175", "4", "9", "", "", ""},
	}
	out := [][]string{recs[0]}
	for _, r := range recs[1:] {
		if b, ok := bad[len(out)]; ok {
			out = append(out, b)
		}
		out = append(out, r)
	}
	path := filepath.Join(t.TempDir(), "survey.csv")
	var buf bytes.Buffer
	w := csv.NewWriter(&buf)
	w.WriteAll(out)
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	return path, out
}

// The page of a survey with bad rows: every count, table and row checked
// against the survey as encoding/csv reads it.
func TestReportPageStructure(t *testing.T) {
	survey, recs := surveyWithBadRows(t)
	page := filepath.Join(filepath.Dir(survey), "report.html")
	_, errs, code := run(t, "report", survey, "-o", page, "--by", "taxon")
	if code != ExitRejected {
		t.Fatalf("exit %d, want %d (rows rejected): %s", code, ExitRejected, errs)
	}
	if strings.Count(errs, "\n") != 1 {
		t.Errorf("stderr should be one line: %q", errs)
	}
	data, err := os.ReadFile(page)
	if err != nil {
		t.Fatal(err)
	}
	doc := parseXHTML(t, data)

	// Self-contained and script-free: no script element, nothing fetched.
	if n := len(doc.find("script")); n != 0 {
		t.Errorf("%d script elements; the markup in a cell was not escaped", n)
	}
	if !strings.Contains(doc.text.String(), "<script>alert(1)</script>") {
		t.Errorf("the taxon written as markup is not shown as text")
	}
	if !strings.Contains(doc.text.String(), "bell\u2407 and \uFFFD byte") {
		t.Errorf("the taxon with a control character and a stray byte is not shown as bell␇ and � byte")
	}
	for _, tag := range []string{"img", "link", "a", "iframe", "object"} {
		for _, e := range doc.find(tag) {
			for _, a := range []string{"src", "href", "data"} {
				if v := e.attr[a]; v != "" && !strings.HasPrefix(v, "#") && !strings.HasPrefix(v, "data:") {
					t.Errorf("<%s %s=%q> refers outside the page", tag, a, v)
				}
			}
		}
	}

	// Counts: data rows of the file, 2 of them uncomputable; the flagged
	// rows of each kind as many as listed.
	suspect, limits := doc.byID(t, "suspect-table").bodyRows(), doc.byID(t, "limit-table").bodyRows()
	if len(suspect) == 0 || len(limits) == 0 {
		t.Fatal("no flagged row listed; the demo survey has rows of both kinds")
	}
	dataRows := len(recs) - 1
	counts := doc.byID(t, "counts").find("b")
	want := []int{dataRows, dataRows - 2, 2, len(suspect), len(limits)} // fewer than MaxListed of each
	for i, w := range want {
		if got, _ := strconv.Atoi(counts[i].text.String()); got != w {
			t.Errorf("count %d = %s, want %d", i, counts[i].text.String(), w)
		}
	}

	// The rejects: line = data row + 1 (the header), and the same row,
	// column and reason as batch --rejects gives for the same file.
	rejFile := filepath.Join(filepath.Dir(survey), "rejects.csv")
	run(t, "batch", survey, "-o", os.DevNull, "--rejects", rejFile, "-q")
	rf, err := os.ReadFile(rejFile)
	if err != nil {
		t.Fatal(err)
	}
	batchRejects, err := csv.NewReader(bytes.NewReader(rf)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	rejects := doc.byID(t, "reject-table").bodyRows()
	wantLines := []string{"11", "101"}
	if len(rejects) != len(wantLines) || len(batchRejects) != len(wantLines)+1 {
		t.Fatalf("%d rejects listed, batch gives %d, want %d: %v", len(rejects), len(batchRejects)-1, len(wantLines), rejects)
	}
	for i, w := range wantLines {
		if rejects[i][0] != w || !slices.Equal(rejects[i], batchRejects[i+1][:4]) || rejects[i][3] == "" {
			t.Errorf("reject %d = %v, want line %s and batch's %v", i, rejects[i], w, batchRejects[i+1][:4])
		}
	}

	// One column row per column of the header.
	if got := len(doc.byID(t, "column-table").bodyRows()); got != len(recs[0]) {
		t.Errorf("%d columns described, the header has %d", got, len(recs[0]))
	}

	// One regime row and one summary row per taxon computed.
	taxa := map[string]bool{}
	for _, r := range recs[1:] {
		if r[3] != "lava" && r[7] != "-5" {
			taxa[r[2]] = true
		}
	}
	if got := len(doc.byID(t, "regime-table").bodyRows()); got != len(taxa) {
		t.Errorf("%d groups in the regime table, want %d taxa", got, len(taxa))
	}
	if got := len(doc.byID(t, "groups").find("tbody")[0].find("tr")); got != len(taxa) {
		t.Errorf("%d groups summarised, want %d taxa", got, len(taxa))
	}

	// Each regime row's shares add up to 100 %.
	for _, r := range doc.byID(t, "regime-table").bodyRows() {
		sum := 0.0
		for _, c := range r[3:6] {
			v, err := strconv.ParseFloat(strings.TrimSuffix(c, " %"), 64)
			if err != nil {
				t.Fatalf("share %q: %v", c, err)
			}
			sum += v
		}
		if sum < 99.8 || sum > 100.2 { // three shares rounded to 0.1 %
			t.Errorf("group %s: shares add up to %g %%", r[0], sum)
		}
	}

	// Flagged rows: each row number leads to the survey row with the same
	// taxon, site and date (the rejects before it counted in).
	flagged := append(suspect, limits...)
	shown := strings.NewReplacer("\x07", "\u2407", "\xff", "\uFFFD") // as the page shows them
	for _, f := range flagged {
		row, err := strconv.Atoi(f[0])
		if err != nil || row < 1 || row >= len(recs) {
			t.Fatalf("flagged row number %q", f[0])
		}
		r := recs[row]
		if f[1] != shown.Replace(r[2]) || f[2] != r[0] || f[3] != r[1] {
			t.Errorf("flagged row %d lists %v, the survey's row is %v", row, f[1:4], r[:3])
		}
	}

	// Figures: the regime map and one per default fit (reynolds=length,
	// power_W=mass: the survey has a mass column), each an SVG inside the
	// page. The map names its bands, labels its axes with units and lists
	// each taxon with its number of computed rows; each fit's figure
	// labels its axes.
	figs := doc.find("figure")
	if len(figs) != 3 {
		t.Fatalf("%d figures, want 3 (the regime map and two fits)", len(figs))
	}
	svgText := func(fig *node) string {
		src := fig.find("img")[0].attr["src"]
		b64, ok := strings.CutPrefix(src, "data:image/svg+xml;base64,")
		if !ok {
			t.Fatalf("figure %s is not an SVG data URI: %.40s", fig.attr["id"], src)
		}
		svg, err := base64.StdEncoding.DecodeString(b64)
		if err != nil {
			t.Fatal(err)
		}
		return parseXHTML(t, svg).text.String()
	}
	for i, labels := range [][]string{{"Reynolds number, Re", "length (m)"}, {"power (W)", "mass (kg)"}} {
		text := svgText(figs[i+1])
		for _, l := range labels {
			if !strings.Contains(text, l) {
				t.Errorf("figure %s lacks the label %q", figs[i+1].attr["id"], l)
			}
		}
	}
	mapText := svgText(doc.byID(t, "regime-map"))
	perTaxon := map[string]int{}
	for _, r := range recs[1:] {
		if r[3] != "lava" && r[7] != "-5" {
			perTaxon[r[2]]++
		}
	}
	wantText := []string{"viscous", "intermediate", "inertial", "Reynolds number, Re", "body length (mm)"}
	for taxon, n := range perTaxon {
		wantText = append(wantText, shown.Replace(taxon)+" ("+strconv.Itoa(n)+")")
	}
	for _, w := range wantText {
		if !strings.Contains(mapText, w) {
			t.Errorf("the regime map lacks %q", w)
		}
	}

	// Provenance: the command as run.
	if cmd := doc.byID(t, "provenance").find("code")[0].text.String(); !strings.Contains(cmd, "flowregime report") || !strings.Contains(cmd, "--by=taxon") {
		t.Errorf("command line %q", cmd)
	}
	if !strings.Contains(doc.byID(t, "estimates").text.String(), "not a design basis") {
		t.Errorf("the estimates notice is missing")
	}
}

// The page refuses what would damage an input or cannot be written.
func TestReportPageRefusals(t *testing.T) {
	dir := t.TempDir()
	survey := filepath.Join(dir, "survey.csv")
	if err := os.WriteFile(survey, demo.Survey, 0o644); err != nil {
		t.Fatal(err)
	}
	results := filepath.Join(dir, "results.csv")
	if _, errs, code := run(t, "batch", survey, "-o", results, "-q"); code != 0 {
		t.Fatalf("batch: exit %d: %s", code, errs)
	}
	for _, c := range []struct {
		name string
		args []string
		code int
	}{
		{"output is the input", []string{"report", survey, "-o", survey}, ExitUsage},
		{"output is a folder", []string{"report", survey, "-o", dir}, ExitUsage},
		{"batch output as input", []string{"report", results, "-o", filepath.Join(dir, "r.html")}, ExitUsage},
		{"no such grouping column", []string{"report", survey, "-o", filepath.Join(dir, "r.html"), "--by", "genus"}, ExitUsage},
		{"no such file", []string{"report", filepath.Join(dir, "none.csv"), "-o", filepath.Join(dir, "r.html")}, ExitFailure},
		{"two arguments", []string{"report", survey, survey}, ExitUsage},
	} {
		before, _ := os.ReadFile(survey)
		_, errs, code := run(t, c.args...)
		if code != c.code || strings.Count(errs, "\n") != 1 {
			t.Errorf("%s: exit %d, stderr %q; want exit %d and one line", c.name, code, errs, c.code)
		}
		if after, _ := os.ReadFile(survey); !bytes.Equal(before, after) {
			t.Errorf("%s: the survey was changed", c.name)
		}
		if _, err := os.Stat(filepath.Join(dir, "r.html")); err == nil {
			t.Errorf("%s: a page was written", c.name)
		}
		entries, _ := os.ReadDir(dir)
		if len(entries) != 2 {
			names := []string{}
			for _, e := range entries {
				names = append(names, e.Name())
			}
			t.Errorf("%s: the folder holds %v; a temporary file was left", c.name, names)
		}
	}
}

// A survey larger than the regime map holds is drawn as a sample of
// surveypage.MaxPoints rows, said so in the caption; the same survey gives
// the same page byte for byte.
func TestReportPageSampleAndRepeatable(t *testing.T) {
	dir := t.TempDir()
	header, body, _ := strings.Cut(string(demo.Survey), "\n")
	survey := filepath.Join(dir, "big.csv")
	if err := os.WriteFile(survey, []byte(header+"\n"+strings.Repeat(body, 20)), 0o644); err != nil {
		t.Fatal(err)
	}
	rows := 20 * strings.Count(body, "\n")
	var pages [2][]byte
	page := filepath.Join(dir, "page.html")
	for i := range pages {
		if _, errs, code := run(t, "report", survey, "-o", page); code != 0 {
			t.Fatalf("exit %d: %s", code, errs)
		}
		pages[i], _ = os.ReadFile(page)
	}
	if !bytes.Equal(pages[0], pages[1]) {
		t.Errorf("two runs on the same survey gave different pages")
	}
	doc := parseXHTML(t, pages[0])
	caption := doc.byID(t, "regime-map").find("figcaption")[0].text.String()
	want := "A random sample of 5000 of the " + strconv.Itoa(rows) + " computed rows"
	if !strings.Contains(caption, want) {
		t.Errorf("caption %q lacks %q", caption, want)
	}
}
