package figure

import (
	"fmt"

	"gonum.org/v1/plot/vg"
)

// Change is a point along a sweep where something changes, such as the
// drag law or the flow regime.
type Change struct {
	X     float64 // where, on the sweep's x axis
	Label string  // what changes, in plain words
}

// Sweep is one quantity against another, with the changes along it.
type Sweep struct {
	X, Y           []float64
	XLabel, YLabel string // each with its unit
	LogX, LogY     bool
	Changes        []Change
}

// SweepCurve returns the sweep figure as SVG bytes; see [SweepFigure].
func SweepCurve(s Sweep) ([]byte, error) {
	f, err := SweepFigure(s)
	if err != nil {
		return nil, err
	}
	return f.SVG()
}

// SweepFigure draws a sweep as a line with its points, and each change as
// a dashed vertical line named in the legend. Points that cannot be drawn
// on the chosen axes are left out and counted in the notes.
func SweepFigure(s Sweep) (*Figure, error) {
	f := &Figure{}
	if len(s.X) != len(s.Y) {
		return nil, fmt.Errorf("sweep figure: %d x values but %d y values", len(s.X), len(s.Y))
	}
	p := newPanel("", s.XLabel, s.YLabel)
	keep := positive(s.X, s.Y, s.LogX, s.LogY)
	if left := len(s.X) - len(keep); left > 0 {
		f.note("%d of %d points left out: not a finite number, or not above zero on a logarithmic axis", left, len(s.X))
	}
	if len(keep) == 0 {
		return nil, fmt.Errorf("sweep figure: no point of %s against %s can be drawn", s.YLabel, s.XLabel)
	}
	kx, ky := pick(s.X, keep), pick(s.Y, keep)
	if err := setAxes(p, kx, ky, s.LogX, s.LogY); err != nil {
		return nil, fmt.Errorf("sweep figure: %v", err)
	}
	for i, c := range s.Changes {
		if !isFinite(c.X) || (s.LogX && c.X <= 0) {
			f.note("change %q not marked: its position cannot be drawn", c.Label)
			continue
		}
		sty := dashed(colour(i+1), 1)
		addLine(p, []float64{c.X, c.X}, []float64{p.Y.Min, p.Y.Max}, sty, s.LogX, s.LogY)
		f.legend = append(f.legend, legendEntry{label: c.Label, line: &sty})
	}
	line := lineStyle(colour(0), 1.2)
	addLine(p, s.X, s.Y, line, s.LogX, s.LogY)
	g := groupStyle(0)
	g.Radius = 1.5
	addPoints(p, s.X, s.Y, g, s.LogX, s.LogY)
	f.addPanel(p, 6*vg.Centimeter)
	return f, nil
}
