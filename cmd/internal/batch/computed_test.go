package batch

import (
	"encoding/csv"
	"encoding/json"
	"slices"
	"strings"
	"testing"
)

// TestComputedColumnTable: every computed column is a number or a text,
// once, and Computed names them in the table's order.
func TestComputedColumnTable(t *testing.T) {
	seen := map[string]bool{}
	for i, c := range computedColumns {
		if (c.num == nil) == (c.text == nil) {
			t.Errorf("%s: give num or text, exactly one", c.name)
		}
		if seen[c.name] || Computed[i] != c.name {
			t.Errorf("%s: repeated, or Computed[%d] = %q", c.name, i, Computed[i])
		}
		seen[c.name] = true
	}
}

// TestComputedColumnsAgreeAcrossFormats reads the same rows written as CSV
// (read back with Go's encoding/csv) and as JSON Lines (encoding/json):
// every computed column holds the same text, numbers as JSON numbers or
// null when empty, texts as JSON strings. The second row is flagged, so
// flags and flag_reasons (which hold commas) are not empty.
func TestComputedColumnsAgreeAcrossFormats(t *testing.T) {
	in := "species,length (mm),speed (m/s),frequency (Hz),amplitude (mm)\n" +
		"trout,300,0.6,4,60\n" +
		"odd trout,300,0.1,20,100\n"
	csvOut, rejects, _ := runBatch(t, []byte(in), Config{InFormat: CSV, OutFormat: CSV})
	jsonOut, _, _ := runBatch(t, []byte(in), Config{InFormat: CSV, OutFormat: JSONL})
	if len(rejects) != 0 {
		t.Fatalf("rejects: %v", rejects)
	}
	records, err := csv.NewReader(strings.NewReader(csvOut)).ReadAll()
	if err != nil {
		t.Fatalf("CSV output: %v", err)
	}
	lines := strings.Split(strings.TrimSpace(jsonOut), "\n")
	if len(records) != 3 || len(lines) != 2 {
		t.Fatalf("%d CSV records, %d JSON lines; want 3 and 2", len(records), len(lines))
	}
	header := records[0]
	for r, line := range lines {
		var obj map[string]json.RawMessage
		if err := json.Unmarshal([]byte(line), &obj); err != nil {
			t.Fatalf("row %d: %v", r+1, err)
		}
		for _, c := range computedColumns {
			cell := records[r+1][slices.Index(header, c.name)]
			raw := string(obj[c.name])
			switch {
			case c.text != nil:
				var s string
				if err := json.Unmarshal(obj[c.name], &s); err != nil || s != cell {
					t.Errorf("row %d %s: JSON %s, CSV %q", r+1, c.name, raw, cell)
				}
			case cell == "":
				if raw != "null" {
					t.Errorf("row %d %s: JSON %s for an empty CSV cell", r+1, c.name, raw)
				}
			case raw != cell:
				t.Errorf("row %d %s: JSON %s, CSV %q", r+1, c.name, raw, cell)
			}
		}
	}
	if reasons := records[2][slices.Index(header, "flag_reasons")]; reasons == "" {
		t.Errorf("the odd trout (St = 20 × 0.1 / 0.1 = 20) has no flag reasons")
	}
}
