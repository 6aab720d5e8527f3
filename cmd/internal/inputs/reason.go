package inputs

import "strings"

// Reason is a library error's message for a user: regime's errors give it
// by their Reason method; media's lose their "media: " prefix.
func Reason(err error) string {
	if r, ok := err.(interface{ Reason() string }); ok {
		return r.Reason()
	}
	return strings.TrimPrefix(err.Error(), "media: ")
}
