package batch

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/flowregime/flowregime/media"
)

// BenchmarkCacheHit measures a hit in a worker's table of built-in media.
func BenchmarkCacheHit(b *testing.B) {
	lm := newLocalMedia(newMediumCache(newMediumFiles(&Config{})), localSlots)
	c := media.Unset("seawater")
	c.TemperatureC, c.SalinityPractical = 12.3, 33.1
	lm.lookup(c)
	b.ResetTimer()
	for range b.N {
		lm.lookup(c)
	}
}

// The worker's table must give what a lookup without any cache gives
// (a brief media lookup), field by field where a row's computation reads it,
// including when a table far too small for the conditions overwrites its
// slots, and for conditions it does not hold (more than three given).
func TestLocalMediaMatchesLookup(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for _, size := range []int{localFirst, localSlots} {
		lm := newLocalMedia(newMediumCache(newMediumFiles(&Config{})), size)
		for range 60000 {
			var c media.Conditions
			switch rng.IntN(4) {
			case 0:
				c = media.Unset(media.KindAir)
				c.TemperatureC, c.AltitudeM = math.Round(rng.Float64()*400)/10, float64(rng.IntN(3000))
			case 1:
				c = media.Unset(media.KindFreshWater)
				c.TemperatureC = math.Round(rng.Float64()*300) / 10
			case 2:
				c = media.Unset(media.KindSeawater)
				c.TemperatureC, c.SalinityPractical = math.Round(rng.Float64()*300)/10, math.Round(rng.Float64()*400)/10
			default: // four conditions: the shared cache's path
				c = media.Unset(media.KindSeawater)
				c.TemperatureC, c.SalinityPractical, c.DepthM, c.LatitudeDeg = 10, 35, float64(rng.IntN(50)), 45
			}
			want, werr := brief.Lookup(c)
			got, gerr := lm.lookup(c)
			if (werr != nil) != (gerr != nil) {
				t.Fatalf("%+v: error %v, want %v", c, gerr, werr)
			}
			if werr != nil {
				continue
			}
			if got.Medium != want.Medium || got.Density != want.Density || got.DynamicViscosity != want.DynamicViscosity ||
				got.KinematicViscosity != want.KinematicViscosity || got.TemperatureC != want.TemperatureC || len(got.Warnings) != len(want.Warnings) ||
				got.Gas != want.Gas || got.Water != want.Water {
				t.Fatalf("%+v: got %+v, want %+v", c, *got, want)
			}
		}
	}
}

// The shared cache spreads keys over its shards whichever condition
// varies: 1600 keys that differ in one condition only (each of the eight
// in turn, and the medium) give every shard at least half its fair share
// (100). A hash that ignores a condition puts all 1600 in one shard.
// Common practice for hash tables, no source.
func TestSharedCacheSpreadsEveryCondition(t *testing.T) {
	mc := newMediumCache(newMediumFiles(&Config{}))
	for word := range len(cacheKey{}) {
		var counts [len(mc.shards)]int
		for i := range 1600 {
			k := mc.key(media.Unset(media.KindSeawater))
			k[word] = math.Float64bits(float64(i) / 10)
			if word == 0 {
				k[0] = uint64(i + 1)
			}
			counts[shardOf(&k)]++
		}
		for s, n := range counts {
			if n < 50 {
				t.Errorf("key word %d: shard %d holds %d of 1600 keys; want ≥ 50", word, s, n)
			}
		}
	}
}

// A worker's table grows when its conditions repeat and stays at its
// first, cache-sized length when they rarely do (design rule of grows, no
// source): 40,000 lookups cycling over 6,000 conditions (more than half
// the first table) double it at least once; 40,000 distinct conditions
// leave it at localFirst slots, and the answers stay those of an uncached
// lookup (TestLocalMediaMatchesLookup).
func TestLocalMediaGrowsOnlyWhenConditionsRepeat(t *testing.T) {
	fresh := func(i int) media.Conditions {
		c := media.Unset(media.KindFreshWater)
		c.TemperatureC, c.DepthM = float64(i%300)/10, float64(1+i/300)/10
		return c
	}
	repeating := newLocalMedia(newMediumCache(newMediumFiles(&Config{})), localSlots)
	distinct := newLocalMedia(newMediumCache(newMediumFiles(&Config{})), localSlots)
	for i := range 40000 {
		if _, err := repeating.lookup(fresh(i % 6000)); err != nil {
			t.Fatal(err)
		}
		if _, err := distinct.lookup(fresh(i)); err != nil {
			t.Fatal(err)
		}
	}
	if len(repeating.slots) <= localFirst {
		t.Errorf("repeating conditions: %d slots, want more than %d", len(repeating.slots), localFirst)
	}
	if len(distinct.slots) != localFirst {
		t.Errorf("distinct conditions: %d slots, want %d", len(distinct.slots), localFirst)
	}
}
