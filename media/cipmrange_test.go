package media

import "testing"

// TestCIPMFlagOnlyWhenVisible: the CIPM-2007 air density is flagged outside
// its stated 15–27 °C only where its error could show in 3 significant
// digits: not inside the region where it was checked against the reference
// equation for air to 0.03 % (−20–40 °C, up to 5 MPa; media/limits.go),
// which holds the demo's cold meadow air (7.1 °C at sea level).
func TestCIPMFlagOnlyWhenVisible(t *testing.T) {
	flagged := func(tC, pPa float64) bool {
		p, err := Air(AirConditions{TemperatureC: tC, PressurePa: pPa})
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range p.Warnings {
			if w.Code == WarnOutOfRange {
				return true
			}
		}
		return false
	}
	cases := []struct {
		tC, pPa float64
		want    bool
	}{
		{7.1, 101325, false}, // outside 15–27 °C, inside the checked region
		{-20, 30000, false},  // a cold high-altitude flight
		{40, 101325, false},
		{-40, 101325, true}, // colder than checked
		{45, 101325, true},  // warmer than checked
		{20, 6e6, true},     // 0.5 % off at 10 MPa (media/limits.go)
		{20, 101325, false}, // in the stated range
	}
	for _, c := range cases {
		if got := flagged(c.tC, c.pPa); got != c.want {
			t.Errorf("%g °C, %g Pa: flagged %v, want %v", c.tC, c.pPa, got, c.want)
		}
	}
}

// TestSeawaterFlagOnlyWhenVisible: EOS-80 beyond its stated −2–40 °C and
// 0–42 salinity is flagged only where its measured extrapolation error
// (media/seawater.go: 0.02 % at 60 °C, 0.2 % at 80 °C; 0.01 % at salinity
// 60, 0.07 % at 80) could show in 3 significant digits (0.05 %).
func TestSeawaterFlagOnlyWhenVisible(t *testing.T) {
	for _, c := range []struct {
		tC, sp float64
		want   bool
	}{
		{45, 35, false}, {60, 35, false}, {70, 35, true}, {-2.1, 40, true},
		{20, 50, false}, {20, 60, false}, {20, 70, true},
	} {
		cond := Unset(KindSeawater)
		cond.TemperatureC, cond.SalinityPractical = c.tC, c.sp
		p, err := Lookup(cond)
		if err != nil {
			t.Fatal(err)
		}
		got := false
		for _, w := range p.Warnings {
			got = got || w.Code == WarnOutOfRange
		}
		if got != c.want {
			t.Errorf("%g °C, salinity %g: flagged %v, want %v (%v)", c.tC, c.sp, got, c.want, p.Warnings)
		}
	}
}
