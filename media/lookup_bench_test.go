package media

import (
	"math"
	"testing"
)

// BenchmarkLookup measures one medium lookup without any cache, for the
// three built-in media at conditions typical of a field survey (water
// also at depth, where the pressure is found by iteration).
func BenchmarkLookup(b *testing.B) {
	air := Unset(KindAir)
	air.TemperatureC, air.AltitudeM = 18.3, 1620
	fresh := Unset(KindFreshWater)
	fresh.TemperatureC = 12.4
	deep := fresh
	deep.DepthM = 35
	sea := Unset(KindSeawater)
	sea.TemperatureC, sea.SalinityPractical = 9.7, 33.1
	seaDeep := sea
	seaDeep.DepthM = 35
	for _, c := range []struct {
		name string
		c    Conditions
	}{{"air", air}, {"freshwater", fresh}, {"freshwater-depth", deep}, {"seawater", sea}, {"seawater-depth", seaDeep}} {
		for _, l := range []struct {
			name string
			f    func(Conditions) (Properties, error)
		}{{"", Lookup}, {"/brief", Options{Brief: true}.Lookup}} {
			b.Run(c.name+l.name, func(b *testing.B) {
				for i := range b.N {
					cc := c.c
					cc.TemperatureC += float64(i%7) * 0.1
					p, err := l.f(cc)
					if err != nil || math.IsNaN(p.Density) {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
