package figure

import (
	"fmt"
	"image/color"
	"math"

	"github.com/flowregime/flowregime/cmd/internal/tabulate"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

// Scaling is a tabulate scaling fit with the data it was fitted to.
type Scaling struct {
	X, Y           []float64 // in the units of the labels
	XLabel, YLabel string
	Fit            tabulate.Fit
}

// ScalingPlot returns the scaling figure as SVG bytes; see [ScalingFigure].
func ScalingPlot(s Scaling) ([]byte, error) {
	f, err := ScalingFigure(s)
	if err != nil {
		return nil, err
	}
	return f.SVG()
}

// ScalingFigure draws the pairs on log–log axes with the ordinary least
// squares and standardised major axis lines (Warton et al. 2006, Biol.
// Rev. 81, 259–291), each through the centroid of log x and log y, which
// both lines pass through. Each line's band spans the lines through the
// centroid with the slope's 95 % limits: it shows the exponent's
// uncertainty, not where new points would fall. The fit's exponents are
// stated in the legend. The fit's own intercepts may be on SI units; the
// lines here are placed by the drawn data, so they hold in the axes'
// units.
func ScalingFigure(s Scaling) (*Figure, error) {
	f := &Figure{}
	if len(s.X) != len(s.Y) {
		return nil, fmt.Errorf("scaling figure: %d x values but %d y values", len(s.X), len(s.Y))
	}
	keep := positive(s.X, s.Y, true, true)
	if left := len(s.X) - len(keep); left > 0 {
		f.note("%d of %d pairs left out: a value missing or not above zero (log axes)", left, len(s.X))
	}
	if len(keep) == 0 {
		return nil, fmt.Errorf("scaling figure: no pair of %s and %s above zero", s.YLabel, s.XLabel)
	}
	kx, ky := pick(s.X, keep), pick(s.Y, keep)
	p := newPanel("", s.XLabel, s.YLabel)
	xlo, xhi, _ := logRange(kx, 0.1)
	ylo, yhi, _ := logRange(ky, 0.1)
	var mx, my float64
	for i := range kx {
		mx += math.Log10(kx[i]) / float64(len(kx))
		my += math.Log10(ky[i]) / float64(len(ky))
	}
	line := func(b, x float64) float64 { return math.Pow(10, my+b*(math.Log10(x)-mx)) }
	fits := []struct {
		name      string
		b, lo, hi float64
		col       int
		dash      []vg.Length
	}{{"OLS", s.Fit.OLSSlope, s.Fit.OLSLow, s.Fit.OLSHigh, 0, nil}, {"SMA", s.Fit.SMASlope, s.Fit.SMALow, s.Fit.SMAHigh, 1, []vg.Length{4, 2}}}
	for _, ft := range fits {
		if !isFinite(ft.b) {
			f.note("%s line not drawn: the fit has no slope (fewer than 3 pairs or no spread)", ft.name)
			continue
		}
		xs := []float64{xlo, xhi}
		if isFinite(ft.lo) && isFinite(ft.hi) { // a bow tie meeting at the centroid
			c := plotter.XY{X: math.Pow(10, mx), Y: math.Pow(10, my)}
			addBand(p, plotter.XYs{{X: xlo, Y: line(ft.lo, xlo)}, c, {X: xhi, Y: line(ft.lo, xhi)},
				{X: xhi, Y: line(ft.hi, xhi)}, c, {X: xlo, Y: line(ft.hi, xlo)}}, colour(ft.col))
		}
		sty := lineStyle(colour(ft.col), 1.4)
		sty.Dashes = ft.dash
		addLine(p, xs, []float64{line(ft.b, xlo), line(ft.b, xhi)}, sty, true, true)
		f.legend = append(f.legend, legendEntry{label: fmt.Sprintf("%s: exponent %.3g (95 %% %.3g to %.3g)", ft.name, ft.b, ft.lo, ft.hi), line: &sty})
	}
	g := groupStyle(6)
	addPoints(p, kx, ky, g, true, true)
	f.legend = append([]legendEntry{{label: fmt.Sprintf("data (%d pairs)", len(kx)), glyph: &g}}, f.legend...)
	setLog(&p.X, xlo, xhi)
	setLog(&p.Y, ylo, yhi)
	f.addPanel(p, 6.5*vg.Centimeter)
	return f, nil
}

// addBand fills a translucent polygon of the colour.
func addBand(p interface{ Add(...plot.Plotter) }, xy plotter.XYs, c color.NRGBA) {
	poly, err := plotter.NewPolygon(xy)
	if err != nil {
		return
	}
	c.A = 0x38
	poly.Color = c
	poly.LineStyle.Width = 0
	p.Add(poly)
}
