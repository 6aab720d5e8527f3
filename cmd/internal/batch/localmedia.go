package batch

import (
	"math"

	"github.com/flowregime/flowregime/media"
)

// localMedia is one worker's table of built-in media (air, fresh and sea
// water) by condition, in front of the shared mediumCache. A slot holds, in
// one 64-byte cache line, the medium, up to three given conditions and what
// a row's computation reads of the properties (density, viscosities,
// temperature, warning count), so that a hit costs one trip to memory and
// no lock. Failed lookups are not kept (they are rejected rows); medium
// files and rows with more than three conditions go to the shared cache.
type localMedia struct {
	slots []mediaSlot // open addressing, linear probing; length a power of two
	used  int
	max   int // slots at most
	// lookups that hit and missed since the table last grew or was last
	// judged (grows)
	hits, misses int
	shared       *mediumCache
	p            media.Properties // the last hit, rebuilt; valid until the next lookup
}

// localKey is a condition in compact form: its medium and which
// conditions are given in w0, the given conditions' values in order.
type localKey struct {
	w0 condWord
	v  [3]uint64
}

// condWord packs into one word a built-in medium, which of the eight
// conditions are given and, in a table slot only, how many out-of-range
// warnings the properties carry:
//
//	bits  0–7   medium: 1 air, 2 fresh water, 3 sea water (0: an empty slot)
//	bits  8–15  one bit per given condition, in mediumCache.key's order
//	bits 16–23  the warning count (slots only)
type condWord uint64

const (
	givenShift = 8
	warnShift  = 16
	keyMask    = 1<<warnShift - 1 // the medium and the given conditions
)

// medium is the built-in medium's name ("" for an empty slot).
func (w condWord) medium() string { return builtinName[w&0xff] }

// gas is media.Properties.Gas of the word's built-in medium.
func (w condWord) gas() bool { return builtinGas[w&0xff] }

// water is media.Properties.Water of the word's built-in medium.
func (w condWord) water() bool { return builtinWater[w&0xff] }

// given marks condition i (0–7) as given.
func (w condWord) given(i int) condWord { return w | 1<<(givenShift+i) }

// key is the word without the warning count, as a lookup's key has it.
func (w condWord) key() condWord { return w & keyMask }

// warnings is the number of out-of-range warnings a slot's properties carry.
func (w condWord) warnings() int { return int(w >> warnShift) }

// withWarnings is the word with n warnings (n ≤ len(outOfRange)).
func (w condWord) withWarnings(n int) condWord { return w.key() | condWord(n)<<warnShift }

// empty reports whether a slot holds nothing.
func (w condWord) empty() bool { return w == 0 }

type mediaSlot struct {
	key                localKey // key.w0 holds the warning count too
	tempC, rho, mu, nu float64
}

const (
	localFirst = 1 << 12 // slots at first
	probes     = 4       // slots tried before one is overwritten
)

var builtinName = [4]string{1: media.KindAir, 2: media.KindFreshWater, 3: media.KindSeawater}

// builtinGas and builtinWater are media.Properties.Gas and Water of each
// built-in medium, by the same index, as media's own lookup sets them.
var builtinGas, builtinWater = builtinFlags()

func builtinFlags() (gas, water [4]bool) {
	for i, name := range builtinName {
		if name == "" {
			continue
		}
		p, _ := media.Lookup(media.Unset(name)) // at default conditions it cannot fail (TestLocalMediaMatchesLookup checks the flags)
		gas[i], water[i] = p.Gas, p.Water
	}
	return gas, water
}

// outOfRange are shared, read-only warnings that rebuilt properties point to.
var outOfRange = func() []media.Warning {
	ws := make([]media.Warning, 8)
	for i := range ws {
		ws[i].Code = media.WarnOutOfRange
	}
	return ws
}()

func newLocalMedia(shared *mediumCache, maxSlots int) *localMedia {
	return &localMedia{slots: make([]mediaSlot, localFirst), max: max(maxSlots, localFirst), shared: shared}
}

// compact returns the compact key, or false when the medium is not built in
// or more than three conditions are given. The conditions are taken in
// mediumCache.key's order, so that equal keys mean equal conditions.
func compact(c *media.Conditions) (localKey, bool) {
	var lk localKey
	switch c.Medium {
	case media.KindAir:
		lk.w0 = 1
	case media.KindFreshWater:
		lk.w0 = 2
	case media.KindSeawater:
		lk.w0 = 3
	default:
		return lk, false
	}
	n := 0
	for i, v := range [...]float64{c.TemperatureC, c.TemperatureOffset, c.SalinityPractical, c.PressurePa,
		c.DepthM, c.AltitudeM, c.HumidityPercent, c.LatitudeDeg} {
		if v != v { // unset
			continue
		}
		if n == len(lk.v) {
			return lk, false
		}
		lk.v[n] = math.Float64bits(v)
		lk.w0 = lk.w0.given(i)
		n++
	}
	return lk, true
}

func (k *localKey) hash() uint64 {
	ws := [4]uint64{uint64(k.w0.key()), k.v[0], k.v[1], k.v[2]}
	return hashWords(ws[:])
}

func (s *mediaSlot) matches(k *localKey) bool {
	return s.key.w0.key() == k.w0 && s.key.v == k.v
}

// lookup returns the medium's properties; the result must not be modified
// and is valid until the next call.
func (l *localMedia) lookup(c media.Conditions) (*media.Properties, error) {
	k, ok := compact(&c)
	if !ok {
		return l.shared.lookup(c)
	}
	h := k.hash()
	mask := uint64(len(l.slots) - 1)
	for i := range uint64(probes) {
		s := &l.slots[(h+i)&mask]
		if s.matches(&k) {
			l.hits++
			l.rebuild(s)
			return &l.p, nil
		}
		if s.key.w0.empty() {
			break
		}
	}
	p, err := brief.Lookup(c)
	if err != nil {
		return nil, err
	}
	if p.Rheology != nil || len(p.Warnings) > len(outOfRange) {
		return l.shared.lookup(c)
	}
	for _, w := range p.Warnings {
		if w.Code != media.WarnOutOfRange {
			return l.shared.lookup(c)
		}
	}
	l.misses++
	s := mediaSlot{key: k, tempC: p.TemperatureC, rho: p.Density, mu: p.DynamicViscosity, nu: p.KinematicViscosity}
	s.key.w0 = s.key.w0.withWarnings(len(p.Warnings))
	l.insert(s, h)
	l.rebuild(&s) // the same properties as a hit gives
	return &l.p, nil
}

// rebuild sets l.p from a slot: the fields a row's computation reads, NaN
// for the rest.
func (l *localMedia) rebuild(s *mediaSlot) {
	nan := math.NaN()
	n := s.key.w0.warnings()
	l.p = media.Properties{Medium: s.key.w0.medium(), Gas: s.key.w0.gas(), Water: s.key.w0.water(), TemperatureC: s.tempC, Density: s.rho, DynamicViscosity: s.mu,
		KinematicViscosity: s.nu, PressurePa: nan, SalinityPractical: nan, SalinityAbsolute: nan,
		SeaPressureDbar: nan, DepthM: nan, AltitudeM: nan, GeopotentialM: nan, HumidityPercent: nan,
		Warnings: outOfRange[:n:n]}
}

// insert stores a slot, doubling the table when grows says so, and
// overwriting an old slot when it does not grow.
func (l *localMedia) insert(s mediaSlot, h uint64) {
	if l.grows() {
		old := l.slots
		l.slots, l.used = make([]mediaSlot, 2*len(old)), 0
		for i := range old {
			if !old[i].key.w0.empty() {
				l.insert(old[i], old[i].key.hash())
			}
		}
	}
	mask := uint64(len(l.slots) - 1)
	for i := range uint64(probes) {
		if t := &l.slots[(h+i)&mask]; t.key.w0.empty() {
			*t = s
			l.used++
			return
		}
	}
	l.slots[h&mask] = s
}

// grows reports whether the table should double: it is half full, below
// its size limit, and it has earned it: since it last grew or was last
// judged (half its size in misses ago), at least one lookup in three hit.
// A table of conditions that rarely repeat (most of a realistic survey's)
// so stays small, in the processor's cache, instead of growing to
// megabytes that cost a trip to memory on every miss; a table of
// conditions that repeat grows to hold them.
func (l *localMedia) grows() bool {
	if 2*(l.used+1) <= len(l.slots) || 2*len(l.slots) > l.max || 2*l.misses < len(l.slots) {
		return false
	}
	earned := 2*l.hits >= l.misses
	l.hits, l.misses = 0, 0
	return earned
}

// hashWords hashes a key of up to nine 64-bit words, every word counting:
// each word times its own odd constant, summed (independent multiplies,
// no chain), then SplitMix64's finaliser (Steele, Lea & Flood 2014, Fast
// splittable pseudorandom number generators, OOPSLA '14) mixes the sum.
func hashWords(ws []uint64) uint64 {
	var h uint64
	for i, w := range ws {
		h += w * hashMul[i]
	}
	h ^= h >> 30
	h *= 0xbf58476d1ce4e5b9
	h ^= h >> 27
	h *= 0x94d049bb133111eb
	return h ^ h>>31
}

// hashMul are odd constants with well-mixed bits, one per key word (the
// golden ratio's and others of the kind used by MurmurHash3, xxHash and
// SplitMix64; any such constants would do).
var hashMul = [len(cacheKey{})]uint64{0x9e3779b97f4a7c15, 0xc2b2ae3d27d4eb4f, 0x165667b19e3779f9, 0xd6e8feb86659fd93,
	0x87c37b91114253d5, 0x4cf5ad432745937f, 0xff51afd7ed558ccd, 0xc4ceb9fe1a85ec53, 0xbf58476d1ce4e5b9}
