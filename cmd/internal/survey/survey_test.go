package survey

import (
	"bytes"
	"encoding/csv"
	"io"
	"strings"
	"testing"
)

// read parses a generated survey with Go's encoding/csv (the reference
// reader) and returns its records after the header, checking the header.
func read(t *testing.T, gen func(io.Writer, int, uint64) error, header string, n int) [][]string {
	t.Helper()
	var buf bytes.Buffer
	if err := gen(&buf, n, 1); err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if strings.Join(recs[0], ",") != header || len(recs) != n+1 {
		t.Fatalf("header %q and %d rows, want %q and %d", recs[0], len(recs)-1, header, n)
	}
	return recs[1:]
}

// The low-cardinality survey holds the 38 conditions its doc names (5 air
// temperatures × 4 altitudes, 4 sea temperatures × 3 salinities, 6 fresh
// temperatures), and its rows are the simple survey's but for those cells.
func TestGenerateFewConditions(t *testing.T) {
	few := read(t, GenerateFew, Header, 20000)
	simple := read(t, Generate, Header, 20000)
	seen := map[string]bool{}
	for i, r := range few {
		seen[strings.Join(r[2:6], ",")] = true
		if strings.Join(r[:2], ",") != strings.Join(simple[i][:2], ",") || strings.Join(r[6:], ",") != strings.Join(simple[i][6:], ",") {
			t.Fatalf("row %d: %q, simple survey %q", i+1, r, simple[i])
		}
	}
	if len(seen) != 38 {
		t.Errorf("%d distinct conditions, want 38", len(seen))
	}
}

// The realistic survey has its 23 taxa, a medium's conditions only where
// they apply (salinity for sea water or a fresh-water "0", depth for
// water, altitude for air), a temperature in every row (never "-0") and
// a stroke frequency exactly where there is an amplitude.
func TestGenerateRichShape(t *testing.T) {
	taxa := map[string]bool{}
	for i, r := range read(t, GenerateRich, RichHeader, 20000) {
		taxa[r[1]] = true
		medium, sal, depth, alt := r[6], r[8], r[9], r[10]
		ok := false
		switch medium {
		case "air":
			ok = sal == "" && depth == "" && alt != ""
		case "seawater":
			ok = sal != "" && alt == ""
		case "freshwater":
			ok = (sal == "" || sal == "0") && alt == ""
		}
		if !ok || (r[4] == "") != (r[5] == "") || r[7] == "" || strings.HasPrefix(r[7], "-0") && strings.Trim(r[7], "-0.") == "" {
			t.Fatalf("row %d: %q", i+1, r)
		}
	}
	if len(taxa) != len(richSpecies) || len(richSpecies) != 23 {
		t.Errorf("%d taxa of %d, want 23", len(taxa), len(richSpecies))
	}
}
