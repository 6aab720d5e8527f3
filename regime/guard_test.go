package regime

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// Inputs beyond the range of IEEE 754 binary64 numbers (largest finite
// about 1.8e308, smallest normal about 2.2e-308; IEEE 754-2019, table
// 3.5) make a result overflow or underflow. The result is refused with the
// input named, never returned as Inf, NaN or a false zero.
func TestOutOfRangeInputsNamed(t *testing.T) {
	w := water20(t)
	air, err := media.Air(media.AirConditions{TemperatureC: 20, PressurePa: math.NaN()})
	if err != nil {
		t.Fatal(err)
	}
	sphere := func(l, u float64) Organism { return NewOrganism(Body{Shape: Sphere, Length: l}, u) }
	cases := []struct {
		name string
		o    Organism
		m    media.Properties
		want string
	}{
		{"huge length", sphere(1e308, 1), w, "length 1e+308 m is too large: the Reynolds number overflows"},
		{"tiny length", sphere(1e-300, 1), w, "length 1e-300 m is too small: the drag underflows to zero"},
		{"huge speed", sphere(0.01, 1e300), w, "speed 1e+300 m/s is too large: the drag overflows"},
		{"tiny speed", sphere(0.01, 1e-300), w, "speed 1e-300 m/s is too small: the drag underflows to zero"},
		{"huge frequency", func() Organism {
			o := sphere(0.01, 0.1)
			o.Frequency, o.Amplitude = 1e308, 1
			return o
		}(), w, "frequency 1e+308 Hz is too large: the Strouhal number overflows"},
		{"huge measured drag coefficient", NewOrganism(Body{Shape: Measured, Length: 0.01, DragCoefficient: 1e308, ReferenceArea: 1e300}, 1),
			w, "drag coefficient 1e+308 is too large: the drag overflows"},
		{"huge mass in flight", func() Organism {
			o := NewOrganism(Body{Shape: Spheroid, Length: 0.1, Diameter: 0.02}, 5)
			o.Mass, o.Span = 1e300, 1e-300
			return o
		}(), air, "mass 1e+300 kg is too large"},
	}
	for _, c := range cases {
		for _, all := range []bool{true, false} {
			var r Result
			err := calc(&r, &c.o, &c.m, all)
			var re *RangeError
			if !errors.As(err, &re) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("%s (all laws %v): error %v, want a RangeError containing %q", c.name, all, err, c.want)
			}
		}
	}
}

// Values at the edge of biology stay computable: a 0.2 µm bacterium at
// 1 µm/s and a 30 m whale at 10 m/s (sizes from common practice, no
// source) give finite, positive results.
func TestOrdinaryExtremesPass(t *testing.T) {
	w := water20(t)
	for _, o := range []Organism{
		NewOrganism(Body{Shape: Sphere, Length: 0.2e-6}, 1e-6),
		NewOrganism(Body{Shape: Spheroid, Length: 30, Diameter: 4}, 10),
	} {
		if _, err := Calc(o, w); err != nil {
			t.Errorf("%+v: %v", o.Body, err)
		}
	}
}
