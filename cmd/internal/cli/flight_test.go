package cli

import (
	"strings"
	"testing"
)

// A glide says so and prints no flapping power; its polar has the speeds of
// minimum sink and best glide and no hover. The glide ratio of a wandering
// albatross-sized glider (8.5 kg, span 3 m, 0.6 m²) lies in 10–30, the
// range of large soaring birds (Pennycuick 2008, Modelling the Flying Bird,
// ch. 5; recalled from memory).
func TestGlidingCommands(t *testing.T) {
	args := []string{"--length", "1.2m", "--diameter", "0.2m", "--mass", "8.5kg", "--span", "3m", "--wing-area", "0.6m2", "--medium", "air", "--gliding"}
	out, errs, code := run(t, append([]string{"calc", "--speed", "15m/s"}, args...)...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "gliding: no flapping power") || strings.Contains(out, "power needed") || strings.Contains(out, "in hover") {
		t.Errorf("glide output:\n%s", out)
	}
	out, errs, code = run(t, append([]string{"powercurve", "--from", "5m/s", "--to", "30m/s", "--format", "json"}, args...)...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := decode(t, out)
	if m["kind"] != "gliding" || m["hover_W"] != nil {
		t.Errorf("glide polar: %s", out)
	}
	if r := num(t, m, "best_glide_ratio"); r < 10 || r > 30 {
		t.Errorf("best glide ratio %g outside 10–30", r)
	}
	if num(t, m, "best_glide_speed_m_s") <= num(t, m, "min_sink_speed_m_s") {
		t.Errorf("best glide not above minimum sink speed: %s", out)
	}
	// --gliding for what cannot glide is a usage error, not ignored.
	for _, bad := range [][]string{
		{"calc", "--length", "30cm", "--diameter", "5cm", "--speed", "1m/s", "--gliding"},
		{"calc", "--length", "30cm", "--diameter", "5cm", "--speed", "1m/s", "--medium", "air", "--mass", "1kg", "--gliding"},
		{"powercurve", "--length", "30cm", "--diameter", "5cm", "--medium", "freshwater", "--mass", "1kg", "--span", "1m", "--gliding"},
	} {
		_, errs, code := run(t, bad...)
		if code != ExitUsage || !strings.Contains(errs, "--gliding needs a flyer") || strings.Count(errs, "\n") > 1 {
			t.Errorf("%v: exit %d, %q", bad, code, errs)
		}
	}
}
