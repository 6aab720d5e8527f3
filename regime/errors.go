package regime

import (
	"fmt"
	"math"
)

// Every error this package returns is one of three types, each with a
// Reason method that gives its message without the "regime: " prefix:
//
//   - [InputError]: one input is outside its accepted range (a negative
//     frequency, an efficiency above 1);
//   - [RangeError]: a result left the floating-point range because an input
//     is far beyond any organism;
//   - [Error]: anything else (a combination of inputs that does not apply, a
//     model that fails).
//
// A caller that shows errors to people without the prefix writes
//
//	var e interface{ Reason() string }
//	if errors.As(err, &e) { msg = e.Reason() }

// InputError says that an input is outside its accepted range: above Min
// and at most Max, in Unit. Field names the input as the message does
// ("frequency", "particle density").
type InputError struct {
	Field    string
	Value    float64 // as given, SI
	Min, Max float64 // accepted: Min < Value ≤ Max
	Unit     string  // SI unit of Value, Min and Max; "" for a pure number

	// wording keeps each message as it has always read: "" for "must be
	// positive, got 3 m/s", size for "must be a positive size", bare for
	// "must be positive, got 3" (no unit after the number).
	wording wording
}

type wording int

const (
	withUnit wording = iota
	size
	bare
)

// positiveError refuses v, which should be positive and finite.
func positiveError(field string, v float64, unit string, w wording) *InputError {
	return &InputError{Field: field, Value: v, Min: 0, Max: math.MaxFloat64, Unit: unit, wording: w}
}

func (e *InputError) Error() string { return "regime: " + e.Reason() }

// Reason is the message without the package prefix.
func (e *InputError) Reason() string {
	if e.Max < math.MaxFloat64 {
		return fmt.Sprintf("%s must be in (%g, %g], got %g", e.Field, e.Min, e.Max, e.Value)
	}
	switch e.wording {
	case size:
		return fmt.Sprintf("%s must be a positive size, got %g %s", e.Field, e.Value, e.Unit)
	case bare:
		return fmt.Sprintf("%s must be positive, got %g", e.Field, e.Value)
	}
	return fmt.Sprintf("%s must be positive, got %g %s", e.Field, e.Value, e.Unit)
}

// RangeError says that a result left the range of floating-point numbers
// (it overflowed, underflowed to zero or became NaN) because an input is
// far beyond any organism. It names the input most likely at fault: of the
// inputs the result depends on, the one farthest from 1 in orders of
// magnitude of its SI unit.
type RangeError struct {
	Input  string  // "length", "speed", …
	Value  float64 // in SI units
	Unit   string
	Result string // "the Reynolds number overflows"
}

func (e *RangeError) Error() string { return "regime: " + e.Reason() }

// Reason is the message without the package prefix.
func (e *RangeError) Reason() string {
	size := "large"
	if math.Abs(e.Value) < 1 {
		size = "small"
	}
	unit := ""
	if e.Unit != "" {
		unit = " " + e.Unit
	}
	return fmt.Sprintf("%s %.4g%s is too %s: %s; check its unit", e.Input, e.Value, unit, size, e.Result)
}

// Error is any other error of this package: inputs that do not go
// together, a model that does not apply, a computation that failed.
type Error struct {
	Msg string // the message without the package prefix
}

func (e *Error) Error() string { return "regime: " + e.Msg }

// Reason is the message without the package prefix.
func (e *Error) Reason() string { return e.Msg }

// errorf returns an *Error with the formatted message.
func errorf(format string, a ...any) error { return &Error{Msg: fmt.Sprintf(format, a...)} }
