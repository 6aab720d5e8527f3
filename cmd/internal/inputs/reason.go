package inputs

import (
	"errors"
	"strings"

	"github.com/flowregime/flowregime/media"
)

// Reason is a library error's message for people: a media error's Reason
// (its message without the "media: " prefix) with the command line's advice
// where the library has none to give, or a regime error without its
// "regime: " prefix.
func Reason(err error) string {
	r, ok := err.(interface{ Reason() string })
	if !ok {
		return strings.TrimPrefix(err.Error(), "regime: ")
	}
	s := r.Reason()
	var re *media.RangeError
	if errors.As(err, &re) && re.Field == media.FieldAltitude && re.Quantity == "altitude" {
		s += " (with --pressure and --temp it is only reported)"
	}
	return s
}
