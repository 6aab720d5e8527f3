// Package survey writes synthetic survey tables for benchmarks and load
// tests. The organisms, places and numbers are invented; only their orders
// of magnitude are meant to be plausible.
package survey

import (
	"bufio"
	"io"
	"math/rand/v2"
	"strconv"
)

// Header is the synthetic survey's header line.
const Header = "id,taxon,medium,temp_C,salinity_psu,altitude_m,length (mm),diameter (mm),speed (mm/s),frequency (Hz),amplitude (mm),mass (g),span (mm)"

type template struct {
	taxon, medium     string
	length, diameter  float64 // mm
	speedBL           float64 // body lengths per second
	freq, amplitudeBL float64 // Hz, fraction of length (0: none)
	mass, span        float64 // g, mm (0: none)
}

var templates = []template{
	{"rod bacterium", "freshwater", 0.003, 0.001, 10, 0, 0, 0, 0},
	{"ciliate", "freshwater", 0.15, 0.06, 5, 0, 0, 0, 0},
	{"copepod", "seawater", 1.2, 0.4, 10, 0, 0, 0, 0},
	{"midge larva", "freshwater", 6, 0.6, 3, 8, 0.3, 0, 0},
	{"minnow", "freshwater", 60, 10, 3, 6, 0.2, 0, 0},
	{"herring", "seawater", 250, 45, 2, 4, 0.2, 0, 0},
	{"bee", "air", 13, 5, 300, 230, 0, 0.1, 24},
	{"swallow", "air", 170, 30, 60, 7, 0, 19, 330},
}

// Generate writes the header and n rows, reproducibly for a seed. Its
// medium conditions are of middling variety: temperatures in 0.1 °C steps
// and altitudes in 10 m steps give about 60,000 distinct conditions.
func Generate(w io.Writer, n int, seed uint64) error { return generate(w, n, seed, false) }

// GenerateFew is [Generate] with few distinct medium conditions (5 °C
// steps of temperature, 2 PSU of salinity and 500 m of altitude; 38 in
// all), as in a survey of a few sites, each at its own conditions.
func GenerateFew(w io.Writer, n int, seed uint64) error { return generate(w, n, seed, true) }

func generate(w io.Writer, n int, seed uint64, few bool) error {
	r := rand.New(rand.NewPCG(seed, 0x5eed))
	bw := bufio.NewWriterSize(w, 1<<20)
	bw.WriteString(Header)
	bw.WriteByte('\n')
	var b []byte
	f := func(v float64, prec int) { b = strconv.AppendFloat(b, v, 'f', prec, 64) }
	for i := 0; i < n; i++ {
		t := templates[r.IntN(len(templates))]
		scale := 0.7 + 0.6*r.Float64()
		b = strconv.AppendInt(b[:0], int64(i+1), 10)
		b = append(b, ',')
		b = append(b, t.taxon...)
		b = append(b, ',')
		b = append(b, t.medium...)
		b = append(b, ',')
		// coarse keeps k of n steps of a draw: the same draws either way,
		// so that Generate's rows do not depend on GenerateFew.
		coarse := func(draw, steps, k int) float64 {
			if few {
				draw -= draw % (steps / k)
			}
			return float64(draw)
		}
		switch t.medium {
		case "air":
			f(5+coarse(r.IntN(250), 250, 5)/10, 1) // 5.0–29.9 °C in 0.1 °C steps, as loggers report
			b = append(b, ",,"...)
			f(10*coarse(r.IntN(200), 200, 4), 0) // 0–1990 m in 10 m steps
		case "seawater":
			f(coarse(r.IntN(200), 200, 4)/10, 1)
			b = append(b, ',')
			f(30+coarse(r.IntN(60), 60, 3)/10, 1)
			b = append(b, ',')
		default:
			f(coarse(r.IntN(300), 300, 6)/10, 1)
			b = append(b, ",,"...)
		}
		l := t.length * scale
		b = append(b, ',')
		f(l, 4)
		b = append(b, ',')
		f(t.diameter*scale, 4)
		b = append(b, ',')
		f(t.speedBL*l*(0.5+r.Float64()), 4)
		b = append(b, ',')
		if t.freq > 0 {
			f(t.freq*(0.8+0.4*r.Float64()), 2)
		}
		b = append(b, ',')
		if t.amplitudeBL > 0 {
			f(t.amplitudeBL*l, 3)
		}
		b = append(b, ',')
		if t.mass > 0 {
			f(t.mass*scale*scale*scale, 4)
		}
		b = append(b, ',')
		if t.span > 0 {
			f(t.span*scale, 1)
		}
		b = append(b, '\n')
		if _, err := bw.Write(b); err != nil {
			return err
		}
	}
	return bw.Flush()
}
