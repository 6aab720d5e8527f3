package regime

import (
	"testing"

	"github.com/flowregime/flowregime/media"
)

// BenchmarkCalcBrief measures one organism's computation as batch work
// does it, for a swimmer and for a flapping flyer with a wing chord (whose
// profile power is a phase average over the wingbeat).
func BenchmarkCalcBrief(b *testing.B) {
	water, err := media.FreshWater(12, media.StandardPressurePa)
	if err != nil {
		b.Fatal(err)
	}
	air, err := media.Air(media.AirConditions{TemperatureC: 18, PressurePa: 95000})
	if err != nil {
		b.Fatal(err)
	}
	fish := NewOrganism(Body{Shape: Spheroid, Length: 0.3, Diameter: 0.05}, 0.6)
	fish.Frequency, fish.Amplitude = 4, 0.06
	bird := NewOrganism(Body{Shape: Spheroid, Length: 0.16, Diameter: 0.035}, 10)
	bird.Mass, bird.Span, bird.Chord, bird.Frequency, bird.Amplitude = 0.04, 0.42, 0.04, 8, 0.2
	for _, c := range []struct {
		name string
		o    Organism
		m    media.Properties
	}{{"swimmer", fish, water}, {"flyer", bird, air}} {
		b.Run(c.name, func(b *testing.B) {
			var r Result
			for range b.N {
				if err := CalcInto(&r, c.o, &c.m, Options{Brief: true}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
