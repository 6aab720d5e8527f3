package batch

import (
	"testing"

	"github.com/flowregime/flowregime/media"
)

// BenchmarkCacheHit measures a medium-cache hit.
func BenchmarkCacheHit(b *testing.B) {
	mc := newMediumCache()
	c := media.Unset("seawater")
	c.TemperatureC, c.SalinityPractical = 12.3, 33.1
	mc.lookup(c)
	b.ResetTimer()
	for range b.N {
		mc.lookup(c)
	}
}
