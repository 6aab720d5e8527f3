package batch

import (
	"math"
	"sort"
	"strconv"
	"strings"
	"sync"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// Computed are the columns appended to every output row, in order.
var Computed = []string{
	"density_kg_m3", "kinematic_viscosity_m2_s", "reynolds", "regime", "strouhal",
	"drag_law", "drag_N", "power_kind", "power_W", "flags",
}

// rowSource serves one row's cells, with flag constants for quantities that
// have no column.
type rowSource struct {
	m      *mapping
	fields []string
	consts inputs.Flags
}

func (s *rowSource) Lookup(f int) (string, string, string, bool) {
	if c := s.m.col[f]; c >= 0 {
		if c >= len(s.fields) {
			return "", "", s.m.label[f], false
		}
		t := strings.TrimSpace(s.fields[c])
		return t, s.m.unit[f], s.m.label[f], t != ""
	}
	return s.consts.Lookup(f)
}

// mediumCache holds medium properties by condition, shared by the workers
// in shards with their own locks. Entries keep only what a row's
// computation reads and the warning codes (batch prints codes, not
// messages), so that a million distinct conditions stay within a few tens
// of megabytes.
type mediumCache struct {
	shards [16]cacheShard
}

type cacheShard struct {
	mu sync.Mutex
	m  map[media.Conditions]cached
}

func newMediumCache() *mediumCache {
	mc := &mediumCache{}
	for i := range mc.shards {
		mc.shards[i].m = map[media.Conditions]cached{}
	}
	return mc
}

type cached struct {
	medium          string
	tC, rho, mu, nu float64
	warnings        []media.Warning
	rheology        media.Rheology
	err             error
}

func (c cached) properties() media.Properties {
	nan := math.NaN()
	return media.Properties{Medium: c.medium, TemperatureC: c.tC, Density: c.rho, DynamicViscosity: c.mu,
		KinematicViscosity: c.nu, Warnings: c.warnings, Rheology: c.rheology, SalinityPractical: nan, SalinityAbsolute: nan,
		SeaPressureDbar: nan, DepthM: nan, AltitudeM: nan, GeopotentialM: nan, HumidityPercent: nan}
}

const shardLimit = 1 << 13 // entries per shard; 131072 in all

func noNaN(c media.Conditions) media.Conditions {
	fix := func(v *float64) {
		if math.IsNaN(*v) {
			*v = -math.MaxFloat64
		}
	}
	for _, v := range []*float64{&c.TemperatureC, &c.TemperatureOffset, &c.SalinityPractical, &c.PressurePa, &c.DepthM, &c.AltitudeM, &c.HumidityPercent, &c.LatitudeDeg} {
		fix(v)
	}
	return c
}

func (mc *mediumCache) lookup(c media.Conditions) (media.Properties, error) {
	key := noNaN(c)
	h := math.Float64bits(key.TemperatureC)*31 + math.Float64bits(key.SalinityPractical)*17 + math.Float64bits(key.AltitudeM)*7 + uint64(len(key.Medium))
	sh := &mc.shards[(h^h>>29)%uint64(len(mc.shards))]
	sh.mu.Lock()
	e, ok := sh.m[key]
	sh.mu.Unlock()
	if ok {
		return e.properties(), e.err
	}
	p, err := media.Lookup(c)
	e = cached{medium: p.Medium, tC: p.TemperatureC, rho: p.Density, mu: p.DynamicViscosity, nu: p.KinematicViscosity, rheology: p.Rheology, err: err}
	for _, w := range p.Warnings {
		e.warnings = append(e.warnings, media.Warning{Code: w.Code})
	}
	sh.mu.Lock()
	if len(sh.m) >= shardLimit {
		clear(sh.m)
	}
	sh.m[key] = e
	sh.mu.Unlock()
	return e.properties(), err
}

// outcome is one computed row.
type outcome struct {
	r     regime.Result
	flags []string
}

// compute evaluates one row.
func compute(src inputs.Source, defMedium string, mc *mediumCache) (outcome, error) {
	in, err := inputs.Build(src, defMedium, false)
	if err != nil {
		return outcome{}, err
	}
	m, err := mc.lookup(in.Conditions)
	if err != nil {
		return outcome{}, err
	}
	r, err := regime.CalcChosen(in.Organism, m)
	if err != nil {
		return outcome{}, err
	}
	ws := append(r.Warnings, regime.Screen(in.Organism, r)...)
	return outcome{r: r, flags: flagCodes(ws)}, nil
}

// flagCodes returns the sorted distinct warning codes.
func flagCodes(ws []media.Warning) []string {
	if len(ws) == 0 {
		return nil
	}
	out := make([]string, 0, len(ws))
	for _, w := range ws {
		out = append(out, w.Code)
	}
	sort.Strings(out)
	j := 0
	for i := range out {
		if i == 0 || out[i] != out[j-1] {
			out[j] = out[i]
			j++
		}
	}
	return out[:j]
}

// appendNum formats v with 6 significant digits; NaN gives "".
func appendNum(b []byte, v float64) []byte {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return b
	}
	return strconv.AppendFloat(b, v, 'g', 6, 64)
}

// values returns the computed columns as text, in the order of Computed.
func (o outcome) values(dst []string) []string {
	r := o.r
	var buf [32]byte
	num := func(v float64) string { return string(appendNum(buf[:0], v)) }
	return append(dst,
		num(r.Medium.Density), num(r.Viscosity/r.Medium.Density), num(r.Reynolds), r.Regime, num(r.Strouhal),
		r.Drag.Chosen.Law, num(r.Drag.Chosen.Force), r.Power.Kind, num(r.Power.Total), strings.Join(o.flags, ";"),
	)
}

// appendCSV appends the computed columns to a CSV or TSV row, each preceded
// by the delimiter, without building intermediate strings.
func (o outcome) appendCSV(b []byte, delim byte) []byte {
	r := o.r
	num := func(v float64) {
		b = append(b, delim)
		b = appendNum(b, v)
	}
	text := func(s string) {
		b = append(b, delim)
		b = appendField(b, s, delim)
	}
	num(r.Medium.Density)
	num(r.Viscosity / r.Medium.Density)
	num(r.Reynolds)
	text(r.Regime)
	num(r.Strouhal)
	text(r.Drag.Chosen.Law)
	num(r.Drag.Chosen.Force)
	text(r.Power.Kind)
	num(r.Power.Total)
	b = append(b, delim)
	for i, f := range o.flags {
		if i > 0 {
			b = append(b, ';')
		}
		b = append(b, f...)
	}
	return b
}
