package inputs

import (
	"math"
	"testing"

	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// TestFieldTableIsComplete checks the table every other list derives from:
// one row per constant, each numeric field kept in exactly one place, no
// two fields kept in the same place, text fields kept in none.
func TestFieldTableIsComplete(t *testing.T) {
	if len(Fields) != NumFields {
		t.Fatalf("Fields has %d rows, want NumFields = %d", len(Fields), NumFields)
	}
	var in Input
	seen := map[*float64]string{}
	for i, f := range Fields {
		if f.Name == "" || f.Flag == "" {
			t.Errorf("field %d has no name or flag (a constant without a row?)", i)
		}
		places := 0
		if f.organism != nil {
			places++
		}
		if f.condition != nil {
			places++
		}
		switch {
		case f.Text && places != 0:
			t.Errorf("%s: a text field is kept as a number", f.Name)
		case !f.Text && places != 1:
			t.Errorf("%s: kept in %d places, want 1", f.Name, places)
		}
		if f.Check != AnyValue && f.organism == nil {
			t.Errorf("%s: checked by checkOrganism but not an organism field", f.Name)
		}
		if p := in.field(i); p != nil {
			if other, dup := seen[p]; dup {
				t.Errorf("%s and %s are kept in the same place", f.Name, other)
			}
			seen[p] = f.Name
		}
	}
}

// TestFieldPlaces sets each numeric field through the table and reads it
// back from the named struct member, so a row pointing at the wrong member
// fails.
func TestFieldPlaces(t *testing.T) {
	want := map[int]func(o regime.Organism, c media.Conditions) float64{
		Length:          func(o regime.Organism, _ media.Conditions) float64 { return o.Body.Length },
		Diameter:        func(o regime.Organism, _ media.Conditions) float64 { return o.Body.Diameter },
		Speed:           func(o regime.Organism, _ media.Conditions) float64 { return o.Speed },
		Frequency:       func(o regime.Organism, _ media.Conditions) float64 { return o.Frequency },
		Efficiency:      func(o regime.Organism, _ media.Conditions) float64 { return o.Efficiency },
		DragCoefficient: func(o regime.Organism, _ media.Conditions) float64 { return o.Body.DragCoefficient },
		Area:            func(o regime.Organism, _ media.Conditions) float64 { return o.Body.ReferenceArea },
		ProfileDrag:     func(o regime.Organism, _ media.Conditions) float64 { return o.ProfileCD },
		Temperature:     func(_ regime.Organism, c media.Conditions) float64 { return c.TemperatureC },
		TempOffset:      func(_ regime.Organism, c media.Conditions) float64 { return c.TemperatureOffset },
		Salinity:        func(_ regime.Organism, c media.Conditions) float64 { return c.SalinityPractical },
		Pressure:        func(_ regime.Organism, c media.Conditions) float64 { return c.PressurePa },
		Latitude:        func(_ regime.Organism, c media.Conditions) float64 { return c.LatitudeDeg },
	}
	for f, get := range want {
		in := Input{Conditions: media.Unset("")}.With(f, 42.5)
		if got := get(in.Organism, in.Conditions); got != 42.5 || math.IsNaN(got) {
			t.Errorf("%s: set 42.5, the member reads %g", Fields[f].Name, got)
		}
	}
}
