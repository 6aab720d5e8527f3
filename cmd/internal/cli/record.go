package cli

import (
	"encoding/json"
	"fmt"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
)

// runRecord is what `batch --record FILE.json` writes beside the output:
// enough to say later how the output was made.
type runRecord struct {
	Program     Build                `json:"program"`
	CommandLine []string             `json:"command_line"`
	Input       string               `json:"input"`
	Output      string               `json:"output"`
	Rejects     string               `json:"rejects,omitempty"`
	Mapping     []batch.MappedColumn `json:"mapping"`
	Constants   map[string]string    `json:"constants"` // quantities given by flags for every row
	Medium      string               `json:"default_medium"`
	Uncertainty *recordUncertainty   `json:"uncertainty,omitempty"`
	Counts      recordCounts         `json:"counts"`
	Flags       map[string]int       `json:"flags"`
	Assumed     map[string]int       `json:"assumed"`
	ElapsedS    float64              `json:"elapsed_s"`
}

type recordUncertainty struct {
	Method string `json:"method"`
	Draws  int    `json:"draws,omitempty"`
	Seed   uint64 `json:"seed"`
}

type recordCounts struct {
	Read     int `json:"read"`
	Written  int `json:"written"`
	Rejected int `json:"rejected"`
	Blank    int `json:"blank_lines"`
	Filtered int `json:"unflagged_left_out"`
}

// newRunRecord gathers the record of a finished batch run.
func newRunRecord(o *batchOptions, s Streams, cfg batch.Config, sum batch.Summary) runRecord {
	r := runRecord{
		Program: BuildInfo(), CommandLine: append([]string{"flowregime"}, s.args...),
		Input: o.input, Output: o.output, Rejects: o.rejects,
		Mapping: sum.Mapping, Constants: map[string]string{}, Medium: cfg.DefaultMedium,
		Counts: recordCounts{Read: sum.Read, Written: sum.Written, Rejected: sum.Rejected, Blank: sum.Blank, Filtered: sum.Filtered},
		Flags:  sum.Flags, Assumed: sum.Assumed, ElapsedS: sum.Elapsed.Seconds(),
	}
	if r.Output == "" {
		r.Output = "standard output"
	}
	if r.Mapping == nil {
		r.Mapping = []batch.MappedColumn{}
	}
	for f, fd := range inputs.Fields {
		if t, _, _, ok := cfg.Constants.Lookup(f); ok {
			r.Constants[fd.Name] = t
		}
	}
	if sum.Uncertainty != "" {
		r.Uncertainty = &recordUncertainty{Method: sum.Uncertainty, Draws: sum.Draws, Seed: cfg.Seed}
	}
	return r
}

// writeRecord writes the run record to name atomically.
func writeRecord(name string, s Streams, rec runRecord) error {
	f, err := s.outs.create(name)
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", name, err)
	}
	defer f.abort()
	enc := json.NewEncoder(f)
	enc.SetIndent("", "  ")
	if err := enc.Encode(rec); err != nil {
		return fmt.Errorf("cannot write %s: %v", name, withoutPath(err))
	}
	if err := f.commit(); err != nil {
		return fmt.Errorf("cannot write %s: %v", name, withoutPath(err))
	}
	return nil
}
