package figure

import (
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg/draw"
)

// addLine draws the drawable pairs of xs, ys (finite; above zero on a log
// axis) as one line; a gap in the data breaks the line. It returns the
// number of pairs left out.
func addLine(p *plot.Plot, xs, ys []float64, sty draw.LineStyle, logX, logY bool) int {
	keep := positive(xs, ys, logX, logY)
	var seg plotter.XYs
	flush := func() {
		if len(seg) >= 2 {
			if l, err := plotter.NewLine(seg); err == nil {
				l.LineStyle = sty
				p.Add(clippedLine{l})
			}
		}
		seg = nil
	}
	for k, i := range keep {
		if k > 0 && i != keep[k-1]+1 {
			flush()
		}
		seg = append(seg, plotter.XY{X: xs[i], Y: ys[i]})
	}
	flush()
	return len(xs) - len(keep)
}

// addPoints draws the drawable pairs as markers of one style and returns
// the number left out.
func addPoints(p *plot.Plot, xs, ys []float64, sty draw.GlyphStyle, logX, logY bool) int {
	keep := positive(xs, ys, logX, logY)
	if len(keep) == 0 {
		return len(xs)
	}
	xy := make(plotter.XYs, len(keep))
	for k, i := range keep {
		xy[k] = plotter.XY{X: xs[i], Y: ys[i]}
	}
	if s, err := plotter.NewScatter(xy); err == nil {
		s.GlyphStyle = sty
		p.Add(s)
	}
	return len(xs) - len(keep)
}

// setAxes sets both axes' ranges from the values to be shown, log or
// linear; it fails when a log axis has no value above zero or an axis no
// finite value.
func setAxes(p *plot.Plot, xs, ys []float64, logX, logY bool) error {
	if err := setAxis(&p.X, xs, logX); err != nil {
		return err
	}
	return setAxis(&p.Y, ys, logY)
}

// setAxis sets one axis's range from vs.
func setAxis(a *plot.Axis, vs []float64, log bool) error {
	if log {
		lo, hi, err := logRange(vs, 0.05)
		if err != nil {
			return err
		}
		setLog(a, lo, hi)
		return nil
	}
	lo, hi, ok := linRange(vs, 0.04)
	if !ok {
		return errNoFinite
	}
	a.Min, a.Max = lo, hi
	return nil
}

// clippedLine is a line that is clipped at the axes and asks for no room
// beyond them: plotter.Line's glyph boxes at points outside the axis range
// would shrink the whole data area.
type clippedLine struct{ *plotter.Line }

// GlyphBoxes implements plot.GlyphBoxer with no boxes.
func (clippedLine) GlyphBoxes(*plot.Plot) []plot.GlyphBox { return nil }
