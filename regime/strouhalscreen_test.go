package regime

import (
	"math"
	"testing"

	"github.com/flowregime/flowregime/media"
)

func hasCode(ws []Warning, code string) bool {
	for _, w := range ws {
		if w.Code == code {
			return true
		}
	}
	return false
}

// TestStrouhalScreenByLocomotion: a bumblebee flying slowly has St well
// above 1, which is normal in slow and hovering flight and not flagged; the
// same stroke by a swimmer is flagged, as is a flyer's St below 0.05.
func TestStrouhalScreenByLocomotion(t *testing.T) {
	// Bumblebee at 1 m/s: wingbeat about 150 Hz, stroke amplitude about
	// 116°, wing length about 13 mm (Dudley & Ellington 1990, J. Exp. Biol.
	// 148, 19–52; recalled from memory). Tip excursion A = 2R sin(Φ/2).
	const f, phi, wing, u = 150.0, 116 * math.Pi / 180, 0.013, 1.0
	amp := 2 * wing * math.Sin(phi/2)
	o := NewOrganism(Body{Shape: Spheroid, Length: 0.016, Diameter: 0.006}, u)
	o.Frequency, o.Amplitude = f, amp
	air, err := media.Air(media.AirConditions{TemperatureC: 20, PressurePa: 101325})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Calc(o, air)
	if err != nil {
		t.Fatal(err)
	}
	if want := f * amp / u; math.Abs(r.Strouhal-want) > 1e-12*want || r.Strouhal < 3 {
		t.Fatalf("St = %g, want %g (about 3.4)", r.Strouhal, want)
	}
	if hasCode(r.Warnings, WarnStrouhal) {
		t.Errorf("slow flight at St %.3g flagged: %v", r.Strouhal, r.Warnings)
	}
	water, err := media.Lookup(media.Conditions{Medium: media.KindFreshWater, TemperatureC: 20, TemperatureOffset: math.NaN(),
		SalinityPractical: math.NaN(), PressurePa: math.NaN(), DepthM: math.NaN(), AltitudeM: math.NaN(), HumidityPercent: math.NaN(), LatitudeDeg: math.NaN()})
	if err != nil {
		t.Fatal(err)
	}
	if r, err := Calc(o, water); err != nil || !hasCode(r.Warnings, WarnStrouhal) {
		t.Errorf("a swimmer at St %.3g not flagged (err %v)", r.Strouhal, err)
	}
	o.Frequency = 1 // St = 0.022, below 0.05 in air too
	if r, err := Calc(o, air); err != nil || !hasCode(r.Warnings, WarnStrouhal) {
		t.Errorf("a flyer at St %.3g not flagged (err %v)", r.Strouhal, err)
	}
}
