package media

import (
	"errors"
	"fmt"
)

// mediaError is an error of this package.
type mediaError struct {
	reason  string
	wrapped error
}

func (e *mediaError) Error() string  { return "media: " + e.reason }
func (e *mediaError) Reason() string { return e.reason }
func (e *mediaError) Unwrap() error  { return e.wrapped }

// errorf formats an error of this package; %w wraps as in fmt.Errorf.
func errorf(format string, args ...any) error {
	e := fmt.Errorf(format, args...)
	return &mediaError{reason: e.Error(), wrapped: errors.Unwrap(e)}
}

// RangeError says that a quantity lies outside the range in which a medium
// is defined or accepted.
type RangeError struct {
	Quantity string  // in words, e.g. "depth" or "air pressure"
	Field    Field   // the Conditions field it came from; 0 for another quantity
	Value    float64 // in Unit
	Min, Max float64 // the accepted range in Unit; −Inf or +Inf where it is open
	Unit     string
	reason   string // the message for people
}

func (e *RangeError) Error() string { return "media: " + e.reason }

// Reason is the message without the "media: " prefix.
func (e *RangeError) Reason() string { return e.reason }

// outOfRange returns a RangeError whose message is format with args.
func outOfRange(q string, f Field, v, lo, hi float64, unit, format string, args ...any) *RangeError {
	return &RangeError{Quantity: q, Field: f, Value: v, Min: lo, Max: hi, Unit: unit, reason: fmt.Sprintf(format, args...)}
}
