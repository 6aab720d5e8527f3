package figure

import (
	"errors"
	"fmt"
	"image/color"
	"math"

	"github.com/flowregime/flowregime/media"
	"gonum.org/v1/plot/vg"
)

// modelDashes tell the models apart together with their colours.
var modelDashes = [][]vg.Length{{3, 2}, {1, 1.5}, {5, 1.5, 1, 1.5}}

// FlowCurve returns the flow-curve figure as SVG bytes; see [FlowFigure].
func FlowCurve(points []media.RheometerPoint, rep media.FitReport, shearRate float64) ([]byte, error) {
	f, err := FlowFigure(points, rep, shearRate)
	if err != nil {
		return nil, err
	}
	return f.SVG()
}

// FlowFigure draws measured shear stress against shear rate on log–log
// axes with every model of the fit report that was fitted, each evaluated
// on a log-spaced grid over the measured range widened by half a decade;
// the best model (by AICc, rep.Best) is drawn thick and named first. A
// shear rate above zero (an organism's) is marked as a vertical line.
// Points at or below zero are left out and counted in the notes.
func FlowFigure(points []media.RheometerPoint, rep media.FitReport, shearRate float64) (*Figure, error) {
	f := &Figure{}
	xs, ys := make([]float64, len(points)), make([]float64, len(points))
	for i, pt := range points {
		xs[i], ys[i] = pt.ShearRate, pt.Stress
	}
	keep := positive(xs, ys, true, true)
	if left := len(points) - len(keep); left > 0 {
		f.note("%d of %d points left out: shear rate or stress not above zero (log axes)", left, len(points))
	}
	if len(keep) == 0 {
		return nil, errors.New("flow figure: no point with shear rate and stress above zero")
	}
	p := newPanel("", "shear rate, γ̇ (1/s)", "shear stress, τ (Pa)")
	xlo, xhi, _ := logRange(pick(xs, keep), 0.5)
	grid := make([]float64, 101)
	for i := range grid {
		grid[i] = xlo * math.Pow(xhi/xlo, float64(i)/100)
	}
	all := pick(ys, keep)
	k := 0
	for _, mf := range rep.Fits {
		if mf.Err != nil || mf.Model == nil {
			continue
		}
		best := mf.Model.Name() == rep.Best
		model := make([]float64, len(grid))
		for i, g := range grid {
			model[i] = mf.Model.Stress(g)
		}
		sty := lineStyle(colour(1+k%(len(palette)-1)), 0.8)
		sty.Dashes = modelDashes[(k+k/(len(palette)-1))%len(modelDashes)] // no colour and dash pair repeats within 18 models
		label := mf.Model.Name()
		if best {
			sty = lineStyle(colour(0), 2)
			label += " (best by AICc)"
		}
		if left := addLine(p, grid, model, sty, true, true); left == len(grid) {
			f.note("%s not drawn: its stress is not above zero over the range", mf.Model.Name())
			continue
		}
		e := legendEntry{label: label, line: &sty}
		if best {
			f.legend = append([]legendEntry{e}, f.legend...)
		} else {
			f.legend = append(f.legend, e)
		}
		k++
	}
	g := groupStyle(6)
	addPoints(p, xs, ys, g, true, true)
	f.legend = append([]legendEntry{{label: fmt.Sprintf("measured (%d points)", len(keep)), glyph: &g}}, f.legend...)
	lo, hi, _ := logRange(all, 0.15)
	if shearRate > 0 && isFinite(shearRate) {
		sty := lineStyle(color.NRGBA{0x77, 0x77, 0x77, 0xFF}, 1.5)
		sty.Dashes = []vg.Length{1, 2}
		addLine(p, []float64{shearRate, shearRate}, []float64{lo, hi}, sty, true, true)
		f.legend = append(f.legend, legendEntry{label: fmt.Sprintf("organism's shear rate, %.3g 1/s", shearRate), line: &sty})
		xlo, xhi = math.Min(xlo, shearRate/1.5), math.Max(xhi, shearRate*1.5)
	}
	setLog(&p.X, xlo, xhi)
	setLog(&p.Y, lo, hi)
	f.addPanel(p, 6.5*vg.Centimeter)
	return f, nil
}
