package inputs

import (
	"fmt"
	"math"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/regime"
)

// checkOrganism refuses a size, speed or rate that is zero or negative, and
// an efficiency outside (0, 1], naming where it came from (labels), so that
// a command line and a table row get the same message. Given values are
// finite already (quantity refuses the rest).
func checkOrganism(o *regime.Organism, labels *[NumFields]string) error {
	for _, f := range aboveZero {
		v := *organismField(o, f)
		if v <= 0 { // NaN (not given) compares false
			return notPositive(f, v, labels[f])
		}
	}
	for _, f := range fractions {
		if v := *organismField(o, f); v <= 0 || v > 1 {
			return notFraction(f, v, orName(labels[f], Fields[f].Name))
		}
	}
	return nil
}

func notFraction(f int, v float64, label string) error {
	return fmt.Errorf("%s: %s must be in (0, 1], got %g", label, Fields[f].Name, v)
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
		if Fields[field].Check == Fraction {
			return notFraction(field, v, label)
		}
		return notPositive(field, v, label)
	}
	return nil
}
