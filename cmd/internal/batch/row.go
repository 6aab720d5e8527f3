package batch

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"
	"sync"
	"unsafe"

	"github.com/flowregime/flowregime/cmd/internal/decimal"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// UncertaintyColumns follow Computed when uncertainty is propagated.
var UncertaintyColumns = []string{
	"reynolds_low95", "reynolds_high95", "strouhal_low95", "strouhal_high95",
	"drag_N_low95", "drag_N_high95", "power_W_low95", "power_W_high95", "regime_probability",
}

// WarnUncertaintyIgnored flags a row with "±" in it when uncertainty is not
// being propagated.
const WarnUncertaintyIgnored = "uncertainty-ignored"

// columns returns the appended column names for a configuration.
func (cfg Config) columns() []string {
	if cfg.Uncertainty {
		return append(append([]string{}, Computed...), UncertaintyColumns...)
	}
	return Computed
}

// rowCells reads rows into inputs.Cells: the flag constants once, the
// columns row by row, plain numbers converted by the column's unit without
// the general parser.
type rowCells struct {
	m         *mapping
	direct    *inputs.Direct // rows of plain numbers, when the columns allow; nil otherwise
	cells     inputs.Cells
	plan      []column // the columns that hold inputs
	constSD   bool     // a flag constant carries an uncertainty
	uncertain bool     // the last row filled has a value with an uncertainty
	missing   []string // cell texts that mean "not measured"
	missLen   int      // the longest of them, in bytes
	missNum   bool     // one of them is a plain number ("-999"): every cell is checked first
}

// column is how one input column is read.
type column struct {
	field, col, sdCol int
	text              bool // a text field (shape, medium, disc)
	fast              bool // plain numbers convert by conv
	conv              quantity.Conv
	full              bool // the cell's Value holds conv's unit and flags, so a plain number sets SI alone
}

func newRowCells(m *mapping, constants inputs.Flags, defaultMedium string, uncertainty bool, missing []string) *rowCells {
	rc := &rowCells{m: m, missing: missing}
	for _, t := range missing {
		rc.missLen = max(rc.missLen, len(t))
		if _, ok := quantity.PlainNumber(t); ok {
			rc.missNum = true
		}
	}
	rc.cells.Read(constants)
	var cols []inputs.Column
	direct := !uncertainty && !rc.missNum // the direct path reads numbers without the missing-value check
	for f := range inputs.Fields {
		if m.col[f] >= 0 {
			cols = append(cols, inputs.Column{Field: f, Col: m.col[f], Conv: m.conv[f]})
			direct = direct && m.sdCol[f] < 0 && (inputs.Fields[f].Text || m.convOK[f])
		}
	}
	if direct {
		rc.direct, _ = inputs.NewDirect(&rc.cells, cols, m.label, defaultMedium)
		if rc.direct != nil {
			rc.direct.SetMissing(missing)
		}
	}
	for f := range inputs.Fields {
		if m.col[f] < 0 && rc.cells.Given[f] && rc.cells.Err[f] == nil && rc.cells.Value[f].SD > 0 {
			rc.constSD = true
		}
		if m.col[f] >= 0 {
			rc.plan = append(rc.plan, column{field: f, col: m.col[f], sdCol: m.sdCol[f], text: inputs.Fields[f].Text,
				fast: m.sdCol[f] < 0 && m.convOK[f], conv: m.conv[f]})
			rc.cells.Label[f] = m.label[f]
		}
	}
	return rc
}

// fill reads one row's fields; the cells are valid until the next call.
func (rc *rowCells) fill(fields []string) *inputs.Cells {
	c := &rc.cells
	rc.uncertain = rc.constSD
	for i := range rc.plan {
		p := &rc.plan[i]
		f := p.field
		t := ""
		if p.col < len(fields) {
			t = strings.TrimSpace(fields[p.col])
		}
		c.Given[f] = t != ""
		if c.Err[f] != nil { // pointer stores only when something changes
			c.Err[f] = nil
		}
		if p.text && rc.isMissing(t) {
			t, c.Given[f] = "", false
		}
		if p.text {
			if c.Text[f] != t {
				c.Text[f] = t
			}
			continue
		}
		if t == "" {
			continue
		}
		if rc.missNum && rc.isMissing(t) {
			c.Given[f] = rc.markMissing(f, t)
			continue
		}
		if p.fast {
			if v, ok := quantity.PlainNumber(t); ok {
				if p.full {
					c.Value[f].SI = p.conv.SI(v)
				} else {
					c.Value[f], p.full = p.conv.Apply(v), true
				}
				continue
			}
		}
		p.full = false
		if rc.isMissing(t) {
			c.Given[f] = rc.markMissing(f, t)
			continue
		}
		c.Value[f], c.Err[f] = quantity.ParseDefault(inputs.Fields[f].Kind, t, rc.m.unit[f])
		if c.Err[f] == nil && p.sdCol >= 0 && p.sdCol < len(fields) {
			if sd := strings.TrimSpace(fields[p.sdCol]); sd != "" && !rc.isMissing(sd) {
				c.Value[f], c.Err[f] = rc.withSD(f, p.sdCol, c.Value[f], sd)
			}
		}
		if c.Err[f] == nil && c.Value[f].SD > 0 {
			rc.uncertain = true
		}
	}
	return c
}

// isMissing reports whether a trimmed, non-blank cell says "not measured".
func (rc *rowCells) isMissing(t string) bool {
	return len(t) <= rc.missLen && inputs.Missing(t, rc.missing)
}

// markMissing handles a cell that says "not measured": an optional
// field is absent (false), a required one (length, speed) stays given
// with an error that says so (true).
func (rc *rowCells) markMissing(f int, t string) bool {
	if f != inputs.Length && f != inputs.Speed {
		return false
	}
	rc.cells.Err[f] = fmt.Errorf("%q marks a missing value, and %s is required", t, inputs.Fields[f].Name)
	return true
}

// withSD adds to v the uncertainty sd from column sdCol: converted from
// its own unit, or from the sd column's header unit, else the value
// column's, never used to reread the value. A value that already carries
// a "±" is refused rather than given two uncertainties.
func (rc *rowCells) withSD(f, sdCol int, v quantity.Value, sd string) (quantity.Value, error) {
	name := rc.m.header[sdCol]
	if v.SD > 0 {
		return v, fmt.Errorf("the value has an uncertainty (±) and column %q gives another; keep one", name)
	}
	unit := rc.m.sdUnit[f]
	if unit == "" {
		unit = rc.m.unit[f]
	}
	out, err := quantity.WithUncertainty(inputs.Fields[f].Kind, v, sd, unit)
	if err != nil {
		return v, fmt.Errorf("uncertainty in column %q: %v", name, err)
	}
	return out, nil
}

// mediumCache holds medium properties by condition, shared by the workers
// in shards with their own locks. Entries keep only what a row's
// computation reads and the warning codes (batch prints codes, not
// messages), so that many distinct conditions stay within a few tens of
// megabytes.
type mediumCache struct {
	shards [16]cacheShard
	mu     sync.Mutex
	ids    map[string]uint64 // medium name → small id, for compact keys
	files  *mediumFiles      // medium files named by cells
}

type cacheShard struct {
	mu sync.Mutex
	m  map[cacheKey]*cached
}

// cacheKey is a medium id and the bits of the eight conditions (NaN for
// unset has one bit pattern, so unset conditions compare equal); shardOf
// hashes all nine words.
type cacheKey [9]uint64

type cached struct {
	p   media.Properties
	err error
}

func newMediumCache(files *mediumFiles) *mediumCache {
	mc := &mediumCache{ids: map[string]uint64{}, files: files}
	for i := range mc.shards {
		mc.shards[i].m = map[cacheKey]*cached{}
	}
	return mc
}

const shardLimit = 1 << 13 // entries per shard; 131072 in all

// shardOf is the shard that holds a key: one hash over the whole key.
func shardOf(k *cacheKey) int {
	return int(hashWords(k[:]) % uint64(len(mediumCache{}.shards)))
}

var canonicalNaN = math.Float64bits(math.NaN())

func bits(v float64) uint64 {
	if math.IsNaN(v) {
		return canonicalNaN
	}
	return math.Float64bits(v)
}

func (mc *mediumCache) key(c media.Conditions) cacheKey {
	var id uint64
	switch c.Medium {
	case media.KindAir:
		id = 1
	case media.KindFreshWater:
		id = 2
	case media.KindSeawater:
		id = 3
	default:
		mc.mu.Lock()
		var ok bool
		if id, ok = mc.ids[c.Medium]; !ok {
			id = uint64(len(mc.ids) + 4)
			mc.ids[c.Medium] = id
		}
		mc.mu.Unlock()
	}
	return cacheKey{id, bits(c.TemperatureC), bits(c.TemperatureOffset), bits(c.SalinityPractical), bits(c.PressurePa),
		bits(c.DepthM), bits(c.AltitudeM), bits(c.HumidityPercent), bits(c.LatitudeDeg)}
}

// lookup returns the medium's properties; the result must not be modified.
func (mc *mediumCache) lookup(c media.Conditions) (*media.Properties, error) {
	k := mc.key(c)
	sh := &mc.shards[shardOf(&k)]
	sh.mu.Lock()
	e, ok := sh.m[k]
	sh.mu.Unlock()
	if ok {
		return &e.p, e.err
	}
	p, err := mc.properties(c)
	e = &cached{err: err}
	nan := math.NaN()
	e.p = media.Properties{Medium: p.Medium, Gas: p.Gas, Water: p.Water, TemperatureC: p.TemperatureC, Density: p.Density, DynamicViscosity: p.DynamicViscosity,
		KinematicViscosity: p.KinematicViscosity, Rheology: p.Rheology, PressurePa: p.PressurePa, SalinityPractical: nan, SalinityAbsolute: nan,
		SeaPressureDbar: nan, DepthM: nan, AltitudeM: nan, GeopotentialM: nan, HumidityPercent: nan}
	for _, w := range p.Warnings {
		e.p.Warnings = append(e.p.Warnings, media.Warning{Code: w.Code, Detail: w.Detail})
	}
	sh.mu.Lock()
	if len(sh.m) >= shardLimit {
		clear(sh.m)
	}
	sh.m[k] = e
	sh.mu.Unlock()
	return &e.p, err
}

// brief looks built-in media up without method notes or warning texts.
var brief = media.Options{Brief: true}

// properties looks a medium up: a medium file through mc.files, which
// holds it to the table's folder, a built-in medium by a brief media lookup.
func (mc *mediumCache) properties(c media.Conditions) (media.Properties, error) {
	if !inputs.IsMediumFile(c.Medium) {
		return brief.Lookup(c)
	}
	f, err := mc.files.load(c.Medium)
	if err != nil {
		return media.Properties{}, err
	}
	return f.At(c)
}

// outcome is one computed row; r and flags belong to the worker's scratch
// and are valid until its next row.
type outcome struct {
	r       *regime.Result
	flags   []string
	assumed []string
	ignored bool // a ± was read and not propagated (WarnUncertaintyIgnored)
	unc     *regime.Uncertainty
}

// scratch is a worker's reusable space for one row's results.
type scratch struct {
	r          regime.Result
	flags      []string
	assumed    []string
	reasons    []byte
	cell       []byte  // one computed text cell (computedColumn.text)
	row        outcome // the row's outcome, whose address the text columns take (kept here, not copied to the heap per row)
	shapeGiven bool    // the row names its shape (set before each row)
}

// compute evaluates one row. With cfg.Uncertainty it also propagates the
// uncertainty of the row's values, seeded by seed.
func compute(c *inputs.Cells, cfg *Config, mc *localMedia, seed uint64, s *scratch) (outcome, error) {
	in, err := inputs.BuildCells(c, cfg.DefaultMedium, cfg.Uncertainty)
	if err != nil {
		return outcome{}, err
	}
	return computeInput(&in, cfg, mc, seed, s)
}

// computeInput evaluates one row's input.
func computeInput(in *inputs.Input, cfg *Config, mc *localMedia, seed uint64, s *scratch) (outcome, error) {
	m, err := mc.lookup(in.Conditions)
	if err != nil {
		return outcome{}, err
	}
	r := &s.r
	if err := regime.CalcInto(r, in.Organism, m, regime.Options{Brief: true, Screen: true}); err != nil {
		return outcome{}, err
	}
	o := outcome{r: r}
	if cfg.Uncertainty {
		if us, idx := in.Uncertain(); len(us) > 0 {
			eval := in.Evaluator(idx, mc.lookup)
			var u regime.Uncertainty
			if cfg.Method == regime.MethodLinear {
				u, err = regime.Linear(us, eval)
			} else {
				u, err = regime.MonteCarlo(us, eval, cfg.Draws, seed)
			}
			if err != nil {
				return outcome{}, err
			}
			if u.Failed > 0 {
				r.Warnings = append(r.Warnings, media.Warning{Code: regime.WarnModel})
			}
			o.unc = &u
			if err := o.finiteBands(); err != nil {
				return outcome{}, err
			}
		}
	}
	if w, ok := SphereForStroker(in, s.shapeGiven); ok {
		r.Warnings = append(r.Warnings, w)
	}
	s.flags = flagCodes(s.flags[:0], r.Warnings)
	o.flags = s.flags
	s.assumed = Assumptions(s.assumed[:0], in, r, s.shapeGiven)
	o.assumed = s.assumed
	return o, nil
}

// flagCodes appends the sorted distinct warning codes to out.
func flagCodes(out []string, ws []media.Warning) []string {
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
	return decimal.AppendG(b, v, 6)
}

// reasons returns the flags' reasons, built in s.reasons; "" without flags.
func (o outcome) reasons(s *scratch) []byte {
	s.reasons = s.reasons[:0]
	if len(o.flags) > 0 {
		s.reasons = appendReasons(s.reasons, o.r.Warnings, &o.r.Medium, o.ignored)
	}
	return s.reasons
}

// values returns the computed columns as text, in the order of columns().
func (o outcome) values(dst []string, withUnc bool, s *scratch) []string {
	var buf [32]byte
	s.row = o
	for i := range computedColumns {
		c := &computedColumns[i]
		if c.num != nil {
			dst = append(dst, string(appendNum(buf[:0], c.num(o.r))))
		} else {
			s.cell = c.text(s.cell[:0], &s.row, s)
			dst = append(dst, string(s.cell))
		}
	}
	if withUnc {
		for _, v := range o.uncValues() {
			dst = append(dst, string(appendNum(buf[:0], v)))
		}
	}
	return dst
}

// finiteBands refuses a row whose uncertainty interval overflowed, which
// would otherwise print as an empty cell; NaN stays (a quantity that does
// not apply, such as a Strouhal number without a stroke).
func (o outcome) finiteBands() error {
	for i, v := range o.uncValues() {
		if math.IsInf(v, 0) {
			return fmt.Errorf("%s is not a finite number (%g); check the uncertainties' units", UncertaintyColumns[i], v)
		}
	}
	return nil
}

// uncValues returns the uncertainty columns' numbers (NaN when absent).
func (o outcome) uncValues() []float64 {
	n := math.NaN()
	u := o.unc
	if u == nil {
		return []float64{n, n, n, n, n, n, n, n, n}
	}
	p, ok := u.RegimeProbability[o.r.Regime]
	if !ok {
		p = 0
	}
	return []float64{u.Reynolds.Low95, u.Reynolds.High95, u.Strouhal.Low95, u.Strouhal.High95,
		u.Drag.Low95, u.Drag.High95, u.Power.Low95, u.Power.High95, p}
}

// appendTextField appends the text column c of the row s.row to b as a
// CSV or TSV field: written in place, and rewritten in quotes only when it
// holds something that needs them (the rare case), so the common cell is
// not copied twice.
func appendTextField(b []byte, c *computedColumn, delim byte, s *scratch) []byte {
	start := len(b)
	b = c.text(b, &s.row, s)
	cell := b[start:]
	if !needsQuote(unsafe.String(unsafe.SliceData(cell), len(cell)), delim) {
		return b
	}
	s.cell = append(s.cell[:0], cell...)
	return appendBytesField(b[:start], s.cell, delim)
}

// appendCSV appends the computed columns to a CSV or TSV row, each preceded
// by the delimiter, without building intermediate strings.
func (o outcome) appendCSV(b []byte, delim byte, withUnc bool, s *scratch) []byte {
	b = slices.Grow(b, 256)
	s.row = o
	for i := range computedColumns {
		c := &computedColumns[i]
		b = append(b, delim)
		switch {
		case c.num != nil:
			b = appendNum(b, c.num(o.r))
		case c.quoted:
			b = appendTextField(b, c, delim, s)
		default:
			b = c.text(b, &s.row, s)
		}
	}
	if withUnc {
		for _, v := range o.uncValues() {
			b = appendNum(append(b, delim), v)
		}
	}
	return b
}
