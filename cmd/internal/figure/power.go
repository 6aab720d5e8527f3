package figure

import (
	"errors"
	"fmt"
	"image/color"
	"math"

	"github.com/flowregime/flowregime/regime"
	"gonum.org/v1/plot/vg"
)

// PowerCurve returns the flight power figure as SVG bytes; see
// [PowerFigure].
func PowerCurve(pc regime.PowerCurve) ([]byte, error) {
	f, err := PowerFigure(pc)
	if err != nil {
		return nil, err
	}
	return f.SVG()
}

// PowerFigure draws a flight power curve ([regime.OrganismPowerCurve]) in
// two panels on one speed axis: above, the mechanical power and its
// induced, parasite and profile parts, with the speeds of minimum power
// (V_mp) and maximum range (V_mr) marked; below, the cost of transport
// P/V (J/m) with V_mr at its minimum. A glide has no parts: the panels show
// the power m g × sink speed and P/V = m g / glide ratio, with the speeds
// of minimum sink and best glide.
func PowerFigure(pc regime.PowerCurve) (*Figure, error) {
	if len(pc.Points) < 2 {
		return nil, errors.New("power figure: the curve has fewer than two speeds")
	}
	f := &Figure{}
	n := len(pc.Points)
	v, tot, ind, par, pro, cot := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	for i, pt := range pc.Points {
		v[i], tot[i], ind[i], par[i], pro[i] = pt.Speed, pt.Total, pt.Induced, pt.Parasite, pt.Profile
		cot[i] = pt.Total / pt.Speed
	}
	top := newPanel("", "", "mechanical power, P (W)")
	minName, rangeName := "minimum power", "maximum range"
	if pc.Gliding {
		minName, rangeName = "minimum sink", "best glide"
		top.Y.Label.Text = "height energy lost, m g × sink (W)"
	}
	totSty := lineStyle(color.Black, 1.6)
	left := addLine(top, v, tot, totSty, false, false)
	f.legend = append(f.legend, legendEntry{label: "total", line: &totSty})
	if !pc.Gliding {
		for i, part := range []struct {
			name string
			ys   []float64
		}{{"induced", ind}, {"parasite", par}, {"profile", pro}} {
			sty := lineStyle(colour(i), 1)
			sty.Dashes = [][]vg.Length{nil, {4, 2}, {1.5, 1.5}}[i]
			addLine(top, v, part.ys, sty, false, false)
			f.legend = append(f.legend, legendEntry{label: part.name, line: &sty})
		}
	}
	if left > 0 {
		f.note("%d speeds left out: power not a finite number", left)
	}
	mp, mr := groupStyle(1), groupStyle(2)
	mp.Shape, mr.Shape = markCircle, markDiamond
	mp.Radius, mr.Radius = 3.5, 3.5
	minP := pc.MinPower
	addPoints(top, []float64{pc.MinPowerSpeed}, []float64{minP}, mp, false, false)
	mrPower := pc.MinCostOfTr * pc.MaxRangeSpeed
	addPoints(top, []float64{pc.MaxRangeSpeed}, []float64{mrPower}, mr, false, false)
	mpText := fmt.Sprintf("%s: %.3g m/s, %.3g W", minName, pc.MinPowerSpeed, minP)
	mrText := fmt.Sprintf("%s: %.3g m/s, %.3g J/m", rangeName, pc.MaxRangeSpeed, pc.MinCostOfTr)
	if pc.Gliding && pc.Weight > 0 {
		mpText = fmt.Sprintf("%s: %.3g m/s down at %.3g m/s", minName, minP/pc.Weight, pc.MinPowerSpeed)
		mrText = fmt.Sprintf("%s: ratio %.3g at %.3g m/s", rangeName, pc.Weight/pc.MinCostOfTr, pc.MaxRangeSpeed)
	}
	f.legend = append(f.legend, legendEntry{label: mpText, glyph: &mp}, legendEntry{label: mrText, glyph: &mr})
	ys := append(append(append(append([]float64{0}, tot...), ind...), par...), pro...)
	if pc.Gliding {
		ys = append([]float64{0}, tot...)
	}
	if err := setAxes(top, v, ys, false, false); err != nil {
		return nil, fmt.Errorf("power figure: %v", err)
	}

	bottom := newPanel("", "flight speed, V (m/s)", "cost of transport, P/V (J/m)")
	addLine(bottom, v, cot, totSty, false, false)
	addPoints(bottom, []float64{pc.MaxRangeSpeed}, []float64{pc.MinCostOfTr}, mr, false, false)
	if err := setAxes(bottom, v, append([]float64{0}, cot...), false, false); err != nil {
		return nil, fmt.Errorf("power figure: %v", err)
	}
	// The steep rise of P/V at low speed would flatten the minimum: show
	// up to four times the minimum cost.
	if hi := 4 * pc.MinCostOfTr; hi > 0 && hi < bottom.Y.Max {
		bottom.Y.Max = hi
		f.note("cost of transport drawn up to 4 × its minimum (%.3g J/m); it rises further at low speed", hi)
	}
	top.X.Min, top.X.Max = bottom.X.Min, bottom.X.Max
	top.Y.Min, bottom.Y.Min = math.Max(top.Y.Min, 0), math.Max(bottom.Y.Min, 0) // costs are not negative
	f.addPanel(top, 5*vg.Centimeter)
	f.addPanel(bottom, 5*vg.Centimeter)
	return f, nil
}
