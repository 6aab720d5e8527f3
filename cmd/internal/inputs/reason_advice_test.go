package inputs

import (
	"testing"

	"github.com/flowregime/flowregime/media"
)

// The command line's advice for an altitude beyond the standard atmosphere
// is added here, not by the library; the message is otherwise the
// library's without its prefix.
func TestReasonAddsFlagAdvice(t *testing.T) {
	_, err := media.Lookup(media.Conditions{Medium: media.KindAir, AltitudeM: 40000})
	const lib = "altitude 40000 m (geopotential 39749.9 m') is outside the standard atmosphere implemented here, −5 km to 32 km geopotential; give an altitude in that range"
	if err == nil || err.Error() != "media: "+lib {
		t.Fatalf("library error %v", err)
	}
	if got, want := Reason(err), lib+" (with --pressure and --temp it is only reported)"; got != want {
		t.Errorf("Reason = %q, want %q", got, want)
	}
}
