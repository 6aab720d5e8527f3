package cli

import (
	"math"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/regime"
)

// resolvedJSON is one input as the computation used it: the value in SI
// units and the text it was read from ("3BL/s" → 0.9 m/s).
type resolvedJSON struct {
	Value float64  `json:"value"`
	SD    *float64 `json:"sd,omitempty"`
	Unit  string   `json:"unit"`
	Given string   `json:"given"`
}

// assumedJSON is a default or assumption that changed the result.
type assumedJSON struct {
	Code    string `json:"code"`
	Meaning string `json:"meaning"`
}

// resolvedInputs returns the numeric inputs given in src as the computation
// used them, in SI units; the speed is the organism's, so that a speed in
// body lengths per second appears in m/s.
func resolvedInputs(src inputs.Source, in inputs.Input) map[string]resolvedJSON {
	out := map[string]resolvedJSON{}
	for f, fd := range inputs.Fields {
		if fd.Text || in.Values == nil || math.IsNaN(in.Values[f].SI) {
			continue
		}
		text, _, _, _ := src.Lookup(f)
		v := in.Values[f]
		r := resolvedJSON{Value: v.SI, Unit: quantity.SIUnit(fd.Kind), Given: text}
		if v.SD > 0 {
			sd := v.SD
			r.SD = &sd
		}
		if f == inputs.Speed {
			r.Value, r.Unit = in.Organism.Speed, "m/s"
			if v.PerBodyLength {
				r.SD = nil
				if v.SD > 0 {
					sd := v.SD * in.Organism.Body.Length
					r.SD = &sd
				}
			}
		}
		out[fd.Name] = r
	}
	return out
}

// assumedList names the defaults and assumptions behind r, as batch's
// assumed column does.
func assumedList(in *inputs.Input, r *regime.Result, shapeGiven bool) []assumedJSON {
	out := []assumedJSON{}
	for _, c := range batch.Assumptions(nil, in, r, shapeGiven) {
		out = append(out, assumedJSON{Code: c, Meaning: batch.AssumedMeaning[c]})
	}
	return out
}

// assumedTexts says each assumption as "code: meaning", for tables.
func assumedTexts(as []assumedJSON) []string {
	out := make([]string, len(as))
	for i, a := range as {
		out[i] = a.Code + ": " + a.Meaning
	}
	return out
}
