package survey

import (
	"bufio"
	"io"
	"math"
	"math/rand/v2"
	"strconv"
)

// RichHeader is the realistic survey's header line.
const RichHeader = "id,species,length (mm),speed (cm/s),frequency (Hz),amplitude (mm),medium,temperature (C),salinity (psu),depth (m),altitude (m)"

// species is one kind of organism of the realistic survey: its medium,
// ranges of length (mm), speed (body lengths per second), stroke frequency
// (Hz) and peak-to-peak amplitude (fraction of length), and how often it
// is met. A zero frequency range means no stroke (microbes, gliders).
type species struct {
	name, medium         string
	lenLo, lenHi         float64
	blsLo, blsHi         float64
	freqLo, freqHi       float64
	ampLo, ampHi, weight float64
}

// richSpecies are 23 taxa from bacteria to the blue whale and from the
// fruit fly to the albatross. The ranges are invented to the right order
// of magnitude, not measured.
var richSpecies = []species{
	{"Escherichia coli", "freshwater", 0.0015, 0.003, 5, 15, 0, 0, 0, 0, 4},
	{"Paramecium caudatum", "freshwater", 0.17, 0.30, 3, 10, 0, 0, 0, 0, 4},
	{"Daphnia magna", "freshwater", 1.5, 5.0, 1, 5, 4, 10, 0.2, 0.5, 5},
	{"Chironomus riparius larva", "freshwater", 5, 12, 1, 4, 5, 12, 0.3, 0.6, 3},
	{"Danio rerio", "freshwater", 20, 40, 2, 10, 10, 25, 0.15, 0.25, 6},
	{"Oncorhynchus mykiss", "freshwater", 150, 500, 1, 3, 2, 6, 0.15, 0.22, 8},
	{"Esox lucius", "freshwater", 300, 1000, 0.5, 2, 1, 3, 0.15, 0.22, 3},
	{"Vibrio alginolyticus", "seawater", 0.002, 0.004, 15, 40, 0, 0, 0, 0, 4},
	{"Lingulodinium polyedra", "seawater", 0.04, 0.06, 3, 8, 0, 0, 0, 0, 3},
	{"Calanus finmarchicus", "seawater", 2, 3.5, 1, 10, 15, 40, 0.1, 0.3, 6},
	{"Euphausia superba", "seawater", 40, 60, 1, 4, 2, 6, 0.15, 0.3, 5},
	{"Aurelia aurita", "seawater", 50, 300, 0.1, 0.5, 0.5, 1.5, 0.2, 0.4, 3},
	{"Clupea harengus", "seawater", 200, 350, 1, 3, 3, 8, 0.15, 0.22, 8},
	{"Thunnus albacares", "seawater", 500, 2000, 1, 3, 2, 8, 0.15, 0.22, 4},
	{"Tursiops truncatus", "seawater", 2000, 3500, 0.7, 2.5, 1, 3, 0.15, 0.22, 3},
	{"Balaenoptera musculus", "seawater", 20000, 30000, 0.1, 0.25, 0.1, 0.3, 0.1, 0.2, 1},
	{"Drosophila melanogaster", "air", 2.4, 3.0, 100, 400, 180, 240, 1.3, 1.8, 5},
	{"Apis mellifera", "air", 12, 15, 150, 500, 200, 250, 0.6, 0.9, 6},
	{"Anax junius", "air", 70, 80, 40, 120, 25, 40, 0.6, 1.0, 3},
	{"Archilochus colubris", "air", 80, 95, 30, 130, 40, 60, 0.7, 0.9, 3},
	{"Apus apus", "air", 160, 180, 45, 70, 6, 10, 0.9, 1.4, 4},
	{"Columba livia", "air", 290, 370, 30, 60, 5, 9, 1.0, 1.3, 4},
	{"Diomedea exulans", "air", 1100, 1350, 8, 20, 0, 0, 0, 0, 2},
}

// rich draws the rows of the realistic survey.
type rich struct {
	r   *rand.Rand
	cum []float64 // cumulative species weights
	b   []byte
}

// GenerateRich writes the realistic survey's header and n rows,
// reproducibly for a seed: per row its own medium, a temperature written
// to 0.1 °C (70 %) or whole degrees (30 %), a salinity for sea water
// (brackish to Red Sea, 2–3 significant digits), a depth for water (2
// significant digits, blank at the surface for 15 % of rows), an altitude
// for air (3 significant digits, 0–4500 m, temperature falling with it),
// and a stroke frequency and amplitude for animals that beat a tail, fins
// or wings. About 600,000 distinct medium conditions per million rows.
func GenerateRich(w io.Writer, n int, seed uint64) error {
	g := &rich{r: rand.New(rand.NewPCG(seed, 0x21c4))}
	total := 0.0
	for _, s := range richSpecies {
		total += s.weight
		g.cum = append(g.cum, total)
	}
	bw := bufio.NewWriterSize(w, 1<<20)
	bw.WriteString(RichHeader)
	bw.WriteByte('\n')
	for i := range n {
		if _, err := bw.Write(g.row(i + 1)); err != nil {
			return err
		}
	}
	return bw.Flush()
}

func (g *rich) row(id int) []byte {
	r := g.r
	u := r.Float64() * g.cum[len(g.cum)-1]
	k := 0
	for g.cum[k] <= u {
		k++
	}
	s := &richSpecies[k]
	length, ld := sig(logUniform(r, s.lenLo, s.lenHi), 3)
	speed, sd := sig(length*logUniform(r, s.blsLo, s.blsHi)/10, 3) // cm/s
	b := strconv.AppendInt(g.b[:0], int64(id), 10)
	b = append(append(append(b, ','), s.name...), ',')
	b = append(strconv.AppendFloat(b, length, 'f', ld, 64), ',')
	b = append(strconv.AppendFloat(b, speed, 'f', sd, 64), ',')
	if s.freqHi > 0 {
		amp := length * (s.ampLo + (s.ampHi-s.ampLo)*r.Float64())
		freq := s.freqLo + (s.freqHi-s.freqLo)*r.Float64()
		if s.medium != "air" { // swimmers cruise at Strouhal 0.2–0.45 (Taylor et al. 2003, Nature 425, 707)
			freq = (0.2 + 0.25*r.Float64()) * speed * 10 / amp
		}
		digits := 2
		if freq >= 10 {
			digits = 3
		}
		f, fd := sig(freq, digits)
		a, ad := sig(amp, 3)
		b = strconv.AppendFloat(b, f, 'f', fd, 64)
		b = append(strconv.AppendFloat(append(b, ','), a, 'f', ad, 64), ',')
	} else {
		b = append(b, ',', ',')
	}
	b = append(append(b, s.medium...), ',')
	b = g.conditions(b, s.medium)
	g.b = append(b, '\n')
	return g.b
}

// conditions appends temperature, salinity, depth and altitude.
func (g *rich) conditions(b []byte, medium string) []byte {
	r := g.r
	whole := r.Float64() < 0.3
	switch medium {
	case "air":
		alt := 1 + 799*r.Float64()
		if r.Float64() >= 0.6 {
			alt = 800 + 3700*r.Float64()
		}
		alt, altd := sig(alt, 3)
		b = appendTemp(b, 8+26*r.Float64()-0.0065*alt, whole)
		b = append(b, ',', ',', ',')
		return strconv.AppendFloat(b, alt, 'f', altd, 64)
	case "seawater":
		sp := g.salinity()
		freeze := (-0.0575 + 1.710523e-3*math.Sqrt(sp) - 2.154996e-4*sp) * sp // UNESCO 1983 at the surface
		t := max(-1.5+31.5*r.Float64(), freeze+0.25)
		if whole && math.Round(t) < freeze+0.05 { // whole degrees may round below freezing
			whole = false
			t = math.Ceil((freeze+0.05)*10) / 10
		}
		b = appendTemp(b, t, whole)
		digits := 3
		if r.Float64() >= 0.7 {
			digits = 2
		}
		sp, spd := sig(sp, digits)
		b = strconv.AppendFloat(append(b, ','), sp, 'f', spd, 64)
		b = append(b, ',')
		b = g.depth(b, 0.2, 600)
	default:
		b = appendTemp(b, 0.3+29.7*r.Float64(), whole)
		b = append(b, ',')
		if r.Float64() < 0.2 {
			b = append(b, '0')
		}
		b = append(b, ',')
		b = g.depth(b, 0.1, 40)
	}
	return append(b, ',')
}

// salinity draws a practical salinity: brackish, coastal, open ocean or
// a warm enclosed sea.
func (g *rich) salinity() float64 {
	r := g.r
	var sp float64
	switch k := r.Float64(); {
	case k < 0.15:
		sp = 5 + 7*r.Float64()
	case k < 0.30:
		sp = 12 + 20*r.Float64()
	case k < 0.95:
		sp = 34.8 + 0.6*r.NormFloat64()
	default:
		sp = 38 + 2.5*r.Float64()
	}
	return min(max(sp, 5), 40.5)
}

// depth appends a depth (m) log-uniform in lo–hi to 2 significant digits,
// or nothing (at the surface) for 15 % of rows.
func (g *rich) depth(b []byte, lo, hi float64) []byte {
	d, dd := sig(logUniform(g.r, lo, hi), 2)
	if g.r.Float64() < 0.15 {
		return b
	}
	return strconv.AppendFloat(b, d, 'f', dd, 64)
}

// appendTemp appends a temperature to 0.1 °C or whole degrees, never "-0".
func appendTemp(b []byte, t float64, whole bool) []byte {
	prec := 1
	if whole {
		t, prec = math.Round(t), 0
	} else {
		t = math.Round(t*10) / 10
	}
	if t == 0 {
		t = 0
	}
	return strconv.AppendFloat(b, t, 'f', prec, 64)
}

func logUniform(r *rand.Rand, lo, hi float64) float64 {
	return math.Exp(math.Log(lo) + (math.Log(hi)-math.Log(lo))*r.Float64())
}

// sig rounds x to d significant digits and returns the decimals needed to
// write it (0–12).
func sig(x float64, d int) (float64, int) {
	e := int(math.Floor(math.Log10(math.Abs(x))))
	dec := d - 1 - e
	f := math.Pow(10, float64(dec))
	return math.Round(x*f) / f, min(max(dec, 0), 12)
}
