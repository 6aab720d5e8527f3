package figure

import (
	"errors"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// logTicks labels a log axis with readable powers of ten. Unlike
// plot.LogTicks it labels 2× and 5× (or every multiple) when the axis spans
// less than a decade, so that every axis carries at least two numbers, and
// it starts at the decade below the minimum (math.Floor, not truncation).
type logTicks struct{}

// Ticks implements plot.Ticker.
func (logTicks) Ticks(min, max float64) []plot.Tick {
	if !(min > 0) || !(max > min) || math.IsInf(max, 0) {
		return nil
	}
	span := math.Log10(max / min)
	labelled := func(m, d int) bool {
		switch {
		case span > 6.5: // a wide axis: every other decade, so labels do not touch
			return m == 1 && d%2 == 0
		case span < 0.5:
			return true
		case span < 1.2:
			return m == 1 || m == 2 || m == 5
		}
		return m == 1
	}
	var ts []plot.Tick
	nLabels := 0
	for d := int(math.Floor(math.Log10(min))); d <= int(math.Ceil(math.Log10(max))); d++ {
		for m := 1; m <= 9; m++ {
			v := float64(m) * math.Pow(10, float64(d))
			if v < min*(1-1e-9) || v > max*(1+1e-9) {
				continue
			}
			t := plot.Tick{Value: v}
			if labelled(m, d) {
				t.Label = tickLabel(m, d)
				nLabels++
			}
			ts = append(ts, t)
		}
	}
	if nLabels < 2 { // a narrow axis between two multiples: label the ends
		ts = append(ts, plot.Tick{Value: min, Label: shortNumber(min)}, plot.Tick{Value: max, Label: shortNumber(max)})
	}
	return ts
}

// tickLabel writes m×10^d: as a plain number from 0.01 to 1000, otherwise
// as a power of ten whose exponent follows a caret, raised by
// [exponentHandler] when drawn.
func tickLabel(m, d int) string {
	if d >= -2 && d <= 3 {
		return shortNumber(float64(m) * math.Pow(10, float64(d)))
	}
	p := "10^" + strings.ReplaceAll(strconv.Itoa(d), "-", "−")
	if m == 1 {
		return p
	}
	return strconv.Itoa(m) + "×" + p
}

// exponentHandler draws one line of text in which "base^exponent" is
// written with the exponent smaller and raised: the embedded fonts lack
// superscript minus, zero and nine, and gonum/plot's LaTeX handler does
// not draw superscripts.
type exponentHandler struct{ text.Plain }

// exponentScale is the exponent's size relative to the base text.
const exponentScale = 0.72

// split returns the base text and the exponent's font.
func (h exponentHandler) split(txt string, fnt font.Font) (base, exp string, small font.Font) {
	base, exp, _ = strings.Cut(txt, "^")
	small = fnt
	small.Size = fnt.Size * exponentScale
	return base, exp, small
}

// Box implements text.Handler.
func (h exponentHandler) Box(txt string, fnt font.Font) (width, height, depth vg.Length) {
	base, exp, small := h.split(txt, fnt)
	width, height, depth = h.Plain.Box(base, fnt)
	if exp != "" {
		w, _, _ := h.Plain.Box(exp, small)
		width += w
		height *= 1.3
	}
	return width, height, depth
}

// Draw implements text.Handler; rotation is not supported (tick labels
// are drawn upright).
func (h exponentHandler) Draw(c vg.Canvas, txt string, sty text.Style, pt vg.Point) {
	base, exp, small := h.split(strings.TrimRight(txt, "\n"), sty.Font)
	if base == "" && exp == "" {
		return
	}
	c.SetColor(sty.Color)
	face := h.Fonts.Lookup(sty.Font, sty.Font.Size)
	sface := h.Fonts.Lookup(small, small.Size)
	width := face.Width(base) + sface.Width(exp)
	pt.X += vg.Length(sty.XAlign) * width
	pt.Y += sty.Height(txt)*vg.Length(sty.YAlign) - face.Extents().Ascent + sty.Font.Size
	c.FillString(face, pt, base)
	if exp != "" {
		c.FillString(sface, vg.Point{X: pt.X + face.Width(base), Y: pt.Y + sty.Font.Size*0.42}, exp)
	}
}

// shortNumber formats v with at most three significant digits, without an
// exponent from 0.001 to 99 999.
func shortNumber(v float64) string {
	if a := math.Abs(v); a >= 1e-3 && a < 1e5 {
		r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 3, 64), 64)
		return strconv.FormatFloat(r, 'f', -1, 64)
	}
	return strconv.FormatFloat(v, 'g', 3, 64)
}

// isFinite reports whether v is neither NaN nor infinite.
func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// errNoPositive says a log axis has nothing it can show.
var errNoPositive = errors.New("no value above zero to draw on a logarithmic axis")

// logRange returns the limits of a log axis that shows every positive
// finite value in vs, widened by pad decades on each side; a single value
// gets half a decade each side. It fails when no value is positive.
func logRange(vs []float64, pad float64) (lo, hi float64, err error) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range vs {
		if v > 0 && isFinite(v) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	if math.IsInf(lo, 1) {
		return 0, 0, errNoPositive
	}
	if hi/lo < 1.0001 {
		pad = math.Max(pad, 0.5)
	}
	f := math.Pow(10, pad)
	return lo / f, hi * f, nil
}

// linRange returns the limits of a linear axis showing every finite value
// in vs with a margin of frac of the span; a single value gets ±10 % (or
// ±1 at zero). ok is false when no value is finite.
func linRange(vs []float64, frac float64) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range vs {
		if isFinite(v) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	if math.IsInf(lo, 1) {
		return 0, 0, false
	}
	if hi == lo {
		d := math.Abs(lo) * 0.1
		if d == 0 {
			d = 1
		}
		return lo - d, hi + d, true
	}
	m := (hi - lo) * frac
	return lo - m, hi + m, true
}

// setLog makes a a log axis from lo to hi with readable ticks.
func setLog(a *plot.Axis, lo, hi float64) {
	a.Scale = plot.LogScale{}
	a.Tick.Marker = logTicks{}
	a.Min, a.Max = lo, hi
}

// positive keeps the pairs whose x and y are both finite and (where the
// axis is logarithmic) above zero; it returns the kept pairs' indices.
func positive(xs, ys []float64, logX, logY bool) []int {
	var keep []int
	for i := range xs {
		x, y := xs[i], ys[i]
		if !isFinite(x) || !isFinite(y) || (logX && x <= 0) || (logY && y <= 0) {
			continue
		}
		keep = append(keep, i)
	}
	return keep
}

// nan marks a value that is missing.
var nan = math.NaN()

// errNoFinite says an axis has no number to show.
var errNoFinite = errors.New("no finite value to draw")
