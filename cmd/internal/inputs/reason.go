package inputs

import (
	"errors"
	"strings"

	"github.com/flowregime/flowregime/media"
)

// Reason is a library error's message for a user: media's and regime's
// errors give it by their Reason method (the message without the package
// prefix), with the command line's advice added where the library, which
// knows no flags, gives none; any other error loses a leading "media: "
// and is otherwise kept as it is.
func Reason(err error) string {
	r, ok := err.(interface{ Reason() string })
	if !ok {
		return strings.TrimPrefix(err.Error(), "media: ")
	}
	s := r.Reason()
	var re *media.RangeError
	if errors.As(err, &re) && re.Field == media.FieldAltitude && re.Quantity == "altitude" {
		s += " (with --pressure and --temp it is only reported)"
	}
	return s
}
