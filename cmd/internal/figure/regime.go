package figure

import (
	"errors"
	"fmt"
	"image/color"
	"math"

	"github.com/flowregime/flowregime/regime"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// RegimePoint is one survey row on the regime map.
type RegimePoint struct {
	Group    string  // the value of the grouping column ("" for none)
	Reynolds float64 // on the body length
	Y        float64 // the second quantity, in the unit of RegimeOptions.YLabel
}

// RegimeOptions say what the regime map's second axis shows.
type RegimeOptions struct {
	YLabel   string // axis label with its unit, e.g. "length (mm)"
	Strouhal bool   // Y is the Strouhal number: draw the cruising band
	LinearY  bool   // a linear second axis (default logarithmic)
	Title    string // optional
}

// MaxGroups is the number of groups the regime map tells apart; further
// groups are drawn together as "other" and a note says so.
const MaxGroups = 14

// RegimeMap returns the regime map of pts as SVG bytes; see [RegimeMapFigure].
func RegimeMap(pts []RegimePoint, o RegimeOptions) ([]byte, error) {
	f, err := RegimeMapFigure(pts, o)
	if err != nil {
		return nil, err
	}
	return f.SVG()
}

// RegimeMapFigure draws survey rows as points of Reynolds number (log
// axis) against a second quantity, one colour and marker shape per group,
// over the viscous (Re < 1), intermediate and inertial (Re ≥ 1000) bands of
// [regime.Classify] and, for the Strouhal number, the efficient cruising
// band 0.2–0.4 (Taylor, Nudds & Thomas 2003, Nature 425, 707). Rows
// without a drawable Re or Y are left out and counted in the notes.
func RegimeMapFigure(pts []RegimePoint, o RegimeOptions) (*Figure, error) {
	f := &Figure{}
	res, ys := make([]float64, len(pts)), make([]float64, len(pts))
	for i, pt := range pts {
		res[i], ys[i] = pt.Reynolds, pt.Y
	}
	keep := positive(res, ys, true, !o.LinearY)
	if left := len(pts) - len(keep); left > 0 {
		why := "Re or " + o.YLabel + " missing, not finite or not above zero (log axes)"
		if o.LinearY {
			why = "Re missing or not above zero, or " + o.YLabel + " missing"
		}
		f.note("%d of %d rows left out: %s", left, len(pts), why)
	}
	if len(keep) == 0 {
		return nil, errors.New("regime map: no row has a Reynolds number and " + o.YLabel + " that can be drawn")
	}
	kx, ky := pick(res, keep), pick(ys, keep)
	xlo, xhi, _ := logRange(kx, 0.3)
	var ylo, yhi float64
	if o.LinearY {
		ylo, yhi, _ = linRange(ky, 0.08)
	} else {
		ylo, yhi, _ = logRange(ky, 0.15)
	}
	if o.Strouhal && !o.LinearY { // keep the cruising band in view
		ylo, yhi = math.Min(ylo, regime.StrouhalLow/1.5), math.Max(yhi, regime.StrouhalHigh*1.5)
	}

	p := newPanel(o.Title, "Reynolds number, Re", o.YLabel)
	addRegimeBands(p, xlo, xhi, ylo, yhi)
	if o.Strouhal && addStrouhalBand(p, xlo, xhi, ylo, yhi) {
		f.legend = append(f.legend, legendEntry{label: "efficient cruising, St 0.2–0.4", fill: strouhalBandColour})
	}
	f.legend = append(f.legend, addGroups(p, pts, keep, f)...)
	addRegimeNames(p, xlo, xhi, yhi) // over the points, to stay readable
	setLog(&p.X, xlo, xhi)
	if o.LinearY {
		p.Y.Min, p.Y.Max = ylo, yhi
	} else {
		setLog(&p.Y, ylo, yhi)
	}
	f.addPanel(p, 6.5*vg.Centimeter)
	return f, nil
}

// pick returns vs at the indices idx.
func pick(vs []float64, idx []int) []float64 {
	out := make([]float64, len(idx))
	for i, j := range idx {
		out[i] = vs[j]
	}
	return out
}

// regimeBand is a flow regime's range of Re and its label on the map.
type regimeBand struct {
	lo, hi float64
	label  string
}

// regimeBands follow regime.Classify's boundaries (Re = 1 and 1000).
var regimeBands = []regimeBand{
	{0, 1, "viscous"},
	{1, 1000, "intermediate"},
	{1000, math.Inf(1), "inertial"},
}

// addRegimeBands shades each regime's part of the x range.
func addRegimeBands(p *plot.Plot, xlo, xhi, ylo, yhi float64) {
	for i, b := range regimeBands {
		if lo, hi := math.Max(b.lo, xlo), math.Min(b.hi, xhi); hi > lo {
			addRect(p, lo, hi, ylo, yhi, bandColours[i])
		}
	}
}

// addRegimeNames names each regime at the top of its band when the band is
// wide enough (0.6 decade) to hold the word.
func addRegimeNames(p *plot.Plot, xlo, xhi, yhi float64) {
	sty := textStyle(noteSize, color.NRGBA{0x30, 0x30, 0x30, 0xFF})
	sty.XAlign = draw.XCenter
	for _, b := range regimeBands {
		if lo, hi := math.Max(b.lo, xlo), math.Min(b.hi, xhi); hi > lo && math.Log10(hi/lo) >= 0.6 {
			addLabels(p, []float64{math.Sqrt(lo * hi)}, []float64{yhi}, []string{b.label}, sty, vg.Point{Y: -9})
		}
	}
}

// addStrouhalBand shades 0.2 ≤ St ≤ 0.4 across the map; it reports
// whether any of the band is in view.
func addStrouhalBand(p *plot.Plot, xlo, xhi, ylo, yhi float64) bool {
	lo, hi := math.Max(regime.StrouhalLow, ylo), math.Min(regime.StrouhalHigh, yhi)
	if !(hi > lo) {
		return false
	}
	addRect(p, xlo, xhi, lo, hi, strouhalBandColour)
	return true
}

// addRect adds a filled rectangle without an outline.
func addRect(p *plot.Plot, x0, x1, y0, y1 float64, c color.Color) {
	poly, err := plotter.NewPolygon(plotter.XYs{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}})
	if err != nil {
		return
	}
	poly.Color = c
	poly.LineStyle.Width = 0
	p.Add(poly)
}

// addGroups draws the kept rows, one scatter per group in order of first
// appearance, and returns the legend entries with each group's count.
func addGroups(p *plot.Plot, pts []RegimePoint, keep []int, f *Figure) []legendEntry {
	var order []string
	byGroup := map[string]plotter.XYs{}
	for _, i := range keep {
		g := pts[i].Group
		if _, seen := byGroup[g]; !seen {
			order = append(order, g)
		}
		byGroup[g] = append(byGroup[g], plotter.XY{X: pts[i].Reynolds, Y: pts[i].Y})
	}
	if len(order) > MaxGroups {
		var other plotter.XYs
		for _, g := range order[MaxGroups-1:] {
			other = append(other, byGroup[g]...)
		}
		f.note("%d groups drawn together as \"other\": the map tells %d apart", len(order)-MaxGroups+1, MaxGroups)
		order = append(order[:MaxGroups-1], otherGroup)
		byGroup[otherGroup] = other
	}
	var legend []legendEntry
	for i, g := range order {
		s, err := plotter.NewScatter(byGroup[g])
		if err != nil {
			continue
		}
		s.GlyphStyle = groupStyle(i)
		p.Add(s)
		name := g
		if name == "" {
			name = "rows without a group"
			if len(order) == 1 {
				name = "all rows"
			}
		}
		gs := s.GlyphStyle
		legend = append(legend, legendEntry{label: fmt.Sprintf("%s (%d)", name, len(byGroup[g])), glyph: &gs})
	}
	return legend
}

// otherGroup names the groups beyond MaxGroups.
const otherGroup = "other groups"
