package surveypage

import (
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"strconv"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// Collector gathers from batch output rows, one at a time, what the page
// lists: the flagged rows, the flags, the drag laws, power kinds and media
// used. It holds at most MaxListed rows and one count per distinct law,
// kind, medium and flag, so that a survey of any length fits in memory.
type Collector struct {
	col        map[string]int // computed column → index
	ident      []int
	medium     int // the medium column, −1 for none
	defMedium  string
	written    int
	suspect    flagList // rows whose inputs look wrong
	limits     flagList // rows with only method-limit flags
	flags      map[string]int
	laws       map[string]int
	powers     map[string]int
	media      map[string]int
	by         []int
	length     int // the length column, −1 for none
	lengthUnit string
	points     []Point
	sample     *rand.Rand
}

// Point is a computed row on the regime map.
type Point struct {
	Group        string
	Re, LengthMM float64
}

// MaxPoints bounds the rows drawn on the regime map; a larger survey is
// drawn as a uniform random sample of this many rows (reservoir sampling
// with a fixed seed, so the same survey gives the same page).
const MaxPoints = 5000

// Setup says which input columns the collector reads.
type Setup struct {
	Ident         []string // columns that identify a flagged row
	By            []string // grouping columns
	MediumColumn  string   // "" for none
	DefaultMedium string   // the medium of rows without one
	LengthColumn  string   // "" for none
	LengthUnit    string   // its unit from the header, "" when cells give theirs
}

// maxMedia bounds the distinct media counted by name; further names are
// counted together.
const maxMedia = 50

// otherMedia names the media beyond maxMedia.
const otherMedia = "other media named in the table"

// NewCollector reads the batch output header.
func NewCollector(header []string, st Setup) *Collector {
	c := &Collector{col: map[string]int{}, medium: -1, defMedium: st.DefaultMedium,
		flags: map[string]int{}, laws: map[string]int{}, powers: map[string]int{}, media: map[string]int{},
		length: -1, lengthUnit: st.LengthUnit, sample: rand.New(rand.NewPCG(1, 2))}
	for i, h := range header {
		if _, seen := c.col[h]; !seen {
			c.col[h] = i
		}
	}
	for _, id := range st.Ident {
		c.ident = append(c.ident, slices.Index(header, id))
	}
	for _, b := range st.By {
		c.by = append(c.by, slices.Index(header, b))
	}
	if st.MediumColumn != "" {
		c.medium = slices.Index(header, st.MediumColumn)
	}
	if st.LengthColumn != "" {
		c.length = slices.Index(header, st.LengthColumn)
	}
	return c
}

func (c *Collector) cell(row []string, name string) string {
	if i, ok := c.col[name]; ok && i < len(row) {
		return row[i]
	}
	return ""
}

// Observe takes one output row.
func (c *Collector) Observe(row []string) {
	c.written++
	count(c.laws, c.cell(row, "drag_law"))
	count(c.powers, c.cell(row, "power_kind"))
	c.countMedium(row)
	c.samplePoint(row)
	f := c.cell(row, "flags")
	if f == "" {
		return
	}
	codes := strings.Split(f, ";")
	list := &c.limits
	for _, code := range codes {
		count(c.flags, code)
		if inputFlags[code] {
			list = &c.suspect
		}
	}
	list.n++
	if len(list.rows) == MaxListed {
		return
	}
	fl := Flagged{Re: c.cell(row, "reynolds"), St: c.cell(row, "strouhal"), Flags: codes}
	for _, i := range c.ident {
		v := ""
		if i >= 0 && i < len(row) {
			v = row[i]
		}
		fl.Ident = append(fl.Ident, v)
	}
	list.rows = append(list.rows, fl)
	list.out = append(list.out, c.written)
}

// flagList holds the first MaxListed flagged rows of one kind.
type flagList struct {
	n    int       // rows of this kind
	rows []Flagged // the first MaxListed
	out  []int     // output row (1-based) of each
}

// inputFlags are the flags that say an input looks wrong, as opposed to a
// method used near or beyond its limits.
var inputFlags = map[string]bool{regime.WarnStrouhal: true, regime.WarnSpeed: true, regime.WarnInconsistent: true, "uncertainty-ignored": true}

// samplePoint keeps the row for the regime map: all of the first
// MaxPoints rows, then each later row in place of a random one with
// probability MaxPoints/rows (Vitter 1985, Random sampling with a
// reservoir, ACM TOMS 11, 37–57, algorithm R).
func (c *Collector) samplePoint(row []string) {
	slot := len(c.points)
	if slot == MaxPoints {
		if slot = c.sample.IntN(c.written); slot >= MaxPoints {
			return
		}
	}
	pt := Point{Group: c.group(row), Re: math.NaN(), LengthMM: math.NaN()}
	if v, err := strconv.ParseFloat(c.cell(row, "reynolds"), 64); err == nil {
		pt.Re = v
	}
	if c.length >= 0 && c.length < len(row) {
		if v, err := quantity.ParseDefault(quantity.Length, strings.TrimSpace(row[c.length]), c.lengthUnit); err == nil {
			pt.LengthMM = v.SI * 1000
		}
	}
	if slot == len(c.points) {
		c.points = append(c.points, pt)
	} else {
		c.points[slot] = pt
	}
}

// group is the row's group as the summaries name it.
func (c *Collector) group(row []string) string {
	if len(c.by) == 0 {
		return "all"
	}
	key := make([]string, len(c.by))
	for i, b := range c.by {
		if b >= 0 && b < len(row) {
			key[i] = row[b]
		}
	}
	return strings.Join(key, " / ")
}

// Points returns the rows kept for the regime map.
func (c *Collector) Points() []Point { return c.points }

func (c *Collector) countMedium(row []string) {
	m := c.defMedium
	if c.medium >= 0 && c.medium < len(row) && strings.TrimSpace(row[c.medium]) != "" {
		m = strings.TrimSpace(row[c.medium])
	}
	if _, ok := c.media[m]; !ok && len(c.media) >= maxMedia {
		m = otherMedia
	}
	c.media[m]++
}

func count(m map[string]int, k string) {
	if k != "" {
		m[k]++
	}
}

// Written is the number of rows observed.
func (c *Collector) Written() int { return c.written }

// FlaggedCounts returns the number of rows with a flag that says an input
// looks wrong, and of rows with only method-limit flags.
func (c *Collector) FlaggedCounts() (suspect, limits int) { return c.suspect.n, c.limits.n }

// Flagged returns the listed rows whose inputs look wrong and those at a
// method's limit, with their input row numbers found from the rows
// rejected (rejectedRows, the data rows batch did not write, in any
// order): the k-th row written is the k-th data row not rejected.
func (c *Collector) Flagged(rejectedRows []int) (suspect, limits []Flagged) {
	rej := slices.Clone(rejectedRows)
	sort.Ints(rej)
	return c.suspect.numbered(rej), c.limits.numbered(rej)
}

// numbered returns the rows with their data row numbers; rej is sorted.
func (l flagList) numbered(rej []int) []Flagged {
	out := slices.Clone(l.rows)
	j := 0
	for i, k := range l.out {
		// Data row r has r − (rejects ≤ r) rows written up to it; find
		// the r where that reaches k.
		r := k + j
		for j < len(rej) && rej[j] <= r {
			j++
			r = k + j
		}
		out[i].Row = r
	}
	return out
}

// FlagKeys returns each flag met, with its meaning and count, most
// frequent first.
func (c *Collector) FlagKeys() []FlagKey {
	var keys []FlagKey
	for code, n := range c.flags {
		keys = append(keys, FlagKey{Code: code, Meaning: flagMeaning(code), Count: n})
	}
	sort.Slice(keys, func(i, j int) bool {
		if keys[i].Count != keys[j].Count {
			return keys[i].Count > keys[j].Count
		}
		return keys[i].Code < keys[j].Code
	})
	return keys
}

// flagMeanings say in plain words what each flag of batch means (as its
// help states them).
var flagMeanings = map[string]string{
	regime.WarnStrouhal:         "Strouhal number outside 0.05–1, where swimming and flying animals are not found: check frequency, amplitude and speed",
	regime.WarnSpeed:            "speed in body lengths per second beyond what organisms of that size are known to reach",
	regime.WarnLawOutOfRange:    "a drag correlation used outside its published range of Reynolds number",
	media.WarnOutOfRange:        "a medium condition (temperature, salinity, pressure, …) outside a method's published range",
	regime.WarnInconsistent:     "inputs that do not fit together, such as an amplitude larger than the body or a wingspan without a mass",
	regime.WarnStrokeIncomplete: "a stroke frequency without an amplitude, or the reverse: no Strouhal number (common in field data)",
	regime.WarnModel:            "the case lies where the model is a join or a bracket between validated laws, not a published law",
	regime.WarnDragCrisis:       "near the drag crisis, where the drag of a bluff body drops steeply with Re and depends on surface roughness",
	regime.WarnGeometry:         "a body shape outside the geometry the drag law was made for",
	"uncertainty-ignored":       "a cell gives an uncertainty (±) but uncertainty was not propagated",
}

func flagMeaning(code string) string {
	if m, ok := flagMeanings[code]; ok {
		return m
	}
	return "see 'flowregime batch --help'"
}

// Methods lists the methods used: the drag laws, power kinds and media
// met in the rows with their sources and counts, then the survey-wide
// methods (regimes, summaries, fits).
func (c *Collector) Methods() []Method {
	var ms []Method
	for _, name := range sortedKeys(c.laws) {
		ms = append(ms, Method{What: "drag: " + name, Method: lawSource(name), Rows: c.laws[name]})
	}
	for _, kind := range sortedKeys(c.powers) {
		ms = append(ms, Method{What: "power: " + kind, Method: powerMethods[kind], Rows: c.powers[kind]})
	}
	for _, m := range sortedKeys(c.media) {
		ms = append(ms, Method{What: "medium: " + m, Method: mediumMethods(m), Rows: c.media[m]})
	}
	return append(ms, surveyMethods...)
}

func sortedKeys(m map[string]int) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// lawSource returns the source of the drag law of that name in the
// registry (all of them, where laws of several shapes share the name).
func lawSource(name string) string {
	var srcs []string
	for _, l := range regime.Laws() {
		if l.Name == name && !slices.Contains(srcs, l.Source) {
			srcs = append(srcs, l.Source)
		}
	}
	if len(srcs) == 0 {
		return "see 'flowregime laws'"
	}
	return strings.Join(srcs, "; ")
}

// powerMethods say how each kind of power is found (as regime.Calc
// documents it).
var powerMethods = map[string]string{
	regime.PowerTowing:   "drag × speed: the power to tow the rigid body, efficiency 1",
	regime.PowerSwimming: "drag × speed ÷ the efficiency given",
	regime.PowerFlight:   "induced power by actuator disc (Rankine–Froude for hovering, Glauert in forward flight) + body drag × speed with a body drag coefficient of at least 0.1 on the frontal area + profile power by Pennycuick's ratio 8.4/AR, or blade element with a given profile-drag coefficient (Pennycuick 2008, Modelling the Flying Bird)",
	regime.PowerGliding:  "no flapping work: weight × sink speed (Pennycuick 2008)",
}

// mediumMethods returns the methods of a built-in medium at its default
// conditions, or says where to see those of a file or lab fluid.
func mediumMethods(name string) string {
	if name == otherMedia {
		return "see 'flowregime medium NAME' for each"
	}
	if inputs.IsMediumFile(name) {
		return "a measured flow curve fitted with 'flowregime fit'; see 'flowregime medium " + name + "'"
	}
	p, err := media.Lookup(media.Unset(name))
	if err != nil || len(p.Methods) == 0 {
		return "see 'flowregime medium " + name + "'"
	}
	return "as described at the medium's default conditions (each row used its own): " + strings.Join(p.Methods, "; ")
}

// surveyMethods are used for every survey.
var surveyMethods = []Method{
	{What: "flow regime", Method: "viscous below Re 1, intermediate from 1 to 1000, inertial from 1000 (on the body length; common practice, no single source)"},
	{What: "cruising Strouhal band", Method: "0.2–0.4 (Taylor, Nudds & Thomas 2003, Nature 425, 707–711)"},
	{What: "group summaries", Method: "median and 5th–95th percentiles by the empirical quantile (gonum stat.Quantile, Empirical)"},
	{What: "scaling fits", Method: "log10 y on log10 x by ordinary least squares and standardised major axis with 95 % intervals (Warton, Wright, Falster & Westoby 2006, Biol. Rev. 81, 259–291, Table 4)"},
}
