package inputs

import (
	"errors"
	"testing"

	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// Reason drops the library's prefix and nothing else: a regime error by
// its Reason method, a media error by its "media: " prefix, any other
// error as it is.
func TestReason(t *testing.T) {
	w, err := media.FreshWater(20, media.StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	_, rerr := regime.Calc(regime.Organism{Body: regime.Body{Shape: regime.Sphere, Length: 0.01}, Speed: -1}, w)
	_, merr := media.FreshWater(500, media.StandardPressurePa)
	for _, c := range []struct {
		err  error
		want string
	}{
		{rerr, "speed must be positive, got -1 m/s"},
		{errors.New("regime: not from regime"), "regime: not from regime"},
		{errors.New("a plain error"), "a plain error"},
	} {
		if got := Reason(c.err); got != c.want {
			t.Errorf("Reason(%q) = %q, want %q", c.err, got, c.want)
		}
	}
	if merr == nil || Reason(merr) != merr.Error()[len("media: "):] {
		t.Errorf("media error %v: %q", merr, Reason(merr))
	}
}
