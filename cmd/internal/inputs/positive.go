package inputs

import (
	"fmt"
	"math"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/regime"
)

// positiveFields are the organism's sizes, speeds, rates and factors: each
// must be above zero when given (regime reads a zero as not given, so a
// zero typed by a user is refused here). The drag coefficient and reference
// area are checked with the measured body that uses them.
var positiveFields = [...]int{Length, Diameter, Speed, Frequency, Amplitude, Mass, Span, WingLength, Chord,
	WingArea, StrokeAngle, Diffusivity, ShearRate, RelaxationTime, InducedFactor, ProfileDrag}

// MustBePositive reports whether a field's values must be above zero.
func MustBePositive(field int) bool {
	for _, f := range positiveFields {
		if f == field {
			return true
		}
	}
	return field == Efficiency
}

// checkOrganism refuses a size, speed or rate that is zero or negative, and
// an efficiency outside (0, 1], naming where it came from (labels), so that
// a command line and a table row get the same message. Given values are
// finite already (quantity refuses the rest).
func checkOrganism(o *regime.Organism, labels *[NumFields]string) error {
	for _, f := range positiveFields {
		v := *organismField(o, f)
		if v <= 0 { // NaN (not given) compares false
			return notPositive(f, v, labels[f])
		}
	}
	if e := o.Efficiency; e <= 0 || e > 1 {
		return fmt.Errorf("%s: efficiency must be in (0, 1], got %g", orName(labels[Efficiency], "efficiency"), e)
	}
	return nil
}

func notPositive(f int, v float64, label string) error {
	unit := quantity.SIUnit(Fields[f].Kind)
	if unit != "" {
		unit = " " + unit
	}
	return fmt.Errorf("%s: %s must be above 0%s, got %g%s", orName(label, Fields[f].Name), Fields[f].Name, unit, v, unit)
}

// CheckPositive refuses a value of a positive field (MustBePositive) that is
// not above zero, for a sweep's range; label names its origin.
func CheckPositive(field int, v float64, label string) error {
	if MustBePositive(field) && !(v > 0) && !math.IsNaN(v) {
		if field == Efficiency {
			return fmt.Errorf("%s: efficiency must be in (0, 1], got %g", label, v)
		}
		return notPositive(field, v, label)
	}
	return nil
}
