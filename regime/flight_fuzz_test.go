package regime

import (
	"math"
	"testing"
)

// FuzzFlight: any input either is refused with an error or gives finite,
// non-negative power parts; a glide gives a positive sink speed.
func FuzzFlight(f *testing.F) {
	f.Add(0.043, 0.42, 0.013, 9.0, 1.15, 0.0, 0.00096, false)
	f.Add(8.5, 3.0, 0.6, 15.0, 1.2, 0.02, 0.03, true)
	f.Add(1e-4, 0.02, 0.0, 0.0, 1.0, 0.0, 0.0, false)
	f.Fuzz(func(t *testing.T, m, b, area, v, k, cd, body float64, glide bool) {
		in := FlightInput{Mass: m, Speed: v, Density: 1.2, Viscosity: 1.8e-5, InducedFactor: k,
			Wings: Wings{Span: b, Area: area, ProfileCD: cd}, BodyArea: body, Gliding: glide}
		fp, err := Flight(in)
		if err != nil {
			return
		}
		for _, p := range []float64{fp.Induced, fp.Parasite, fp.Profile} {
			if math.IsNaN(p) || p < 0 {
				t.Fatalf("%+v: parts %g %g %g", in, fp.Induced, fp.Parasite, fp.Profile)
			}
		}
		if glide && !(fp.SinkSpeed >= 0) {
			t.Fatalf("%+v: sink %g", in, fp.SinkSpeed)
		}
	})
}
