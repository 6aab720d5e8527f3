package figure

import (
	"image/color"
	"math"
	"unicode/utf8"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Okabe–Ito colours, distinguishable by readers with the common forms of
// colour blindness (Okabe, M. & Ito, K. (2008), Color Universal Design
// (CUD): how to make figures and presentations that are friendly to
// colorblind people, J*FLY). Yellow (#F0E442) is left out: it is too pale
// on white for points and thin lines.
var palette = []color.NRGBA{
	{0x00, 0x72, 0xB2, 0xFF}, // blue
	{0xD5, 0x5E, 0x00, 0xFF}, // vermillion
	{0x00, 0x9E, 0x73, 0xFF}, // bluish green
	{0xCC, 0x79, 0xA7, 0xFF}, // reddish purple
	{0xE6, 0x9F, 0x00, 0xFF}, // orange
	{0x56, 0xB4, 0xE9, 0xFF}, // sky blue
	{0x00, 0x00, 0x00, 0xFF}, // black
}

// colour returns the i-th palette colour, cycling.
func colour(i int) color.NRGBA { return palette[i%len(palette)] }

// Light tints for the regime bands (of sky blue, grey and orange, so that
// the bands differ in lightness as well as hue).
var bandColours = []color.NRGBA{
	{0xD6, 0xEC, 0xF8, 0xFF},
	{0xEE, 0xEE, 0xEE, 0xFF},
	{0xFB, 0xEB, 0xCC, 0xFF},
}

// strouhalBandColour shades the cruising Strouhal band.
var strouhalBandColour = color.NRGBA{0x00, 0x9E, 0x73, 0x30}

// Text sizes chosen for print at column width (8.5 cm): 7 pt ticks and
// legend, 8 pt axis labels.
const (
	tickSize   = 7
	labelSize  = 8
	titleSize  = 8
	legendSize = 7
	noteSize   = 6.5
)

// markerWidth is the line width of every data marker and of nothing else,
// so that a test can count the markers in an SVG.
const markerWidth = vg.Length(0.9)

// markerRadius is the size of a data marker.
const markerRadius = vg.Length(2)

// marker is a data marker shape, drawn as one outlined path so that
// overlapping points stay visible.
type marker int

// Marker shapes, in the order groups receive them.
const (
	markCircle marker = iota
	markTriangle
	markSquare
	markDiamond
	markTriangleDown
	markPlus
	markCross
	markStar
	numMarkers
)

// DrawGlyph draws the marker as a single stroked path.
func (m marker) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	c.SetLineStyle(draw.LineStyle{Color: sty.Color, Width: markerWidth})
	r := sty.Radius
	var p vg.Path
	poly := func(n int, rot float64) {
		for i := 0; i <= n; i++ {
			a := rot + 2*math.Pi*float64(i)/float64(n)
			q := vg.Point{X: pt.X + r*vg.Length(math.Cos(a)), Y: pt.Y + r*vg.Length(math.Sin(a))}
			if i == 0 {
				p.Move(q)
			} else {
				p.Line(q)
			}
		}
	}
	switch m {
	case markCircle:
		p.Move(vg.Point{X: pt.X + r, Y: pt.Y})
		p.Arc(pt, r, 0, 2*math.Pi)
		p.Close()
	case markTriangle:
		poly(3, math.Pi/2)
	case markSquare:
		poly(4, math.Pi/4)
	case markDiamond:
		poly(4, 0)
	case markTriangleDown:
		poly(3, -math.Pi/2)
	case markPlus:
		p.Move(vg.Point{X: pt.X - r, Y: pt.Y})
		p.Line(vg.Point{X: pt.X + r, Y: pt.Y})
		p.Move(vg.Point{X: pt.X, Y: pt.Y - r})
		p.Line(vg.Point{X: pt.X, Y: pt.Y + r})
	case markCross:
		d := r * 0.8
		p.Move(vg.Point{X: pt.X - d, Y: pt.Y - d})
		p.Line(vg.Point{X: pt.X + d, Y: pt.Y + d})
		p.Move(vg.Point{X: pt.X - d, Y: pt.Y + d})
		p.Line(vg.Point{X: pt.X + d, Y: pt.Y - d})
	default: // star: three crossing strokes
		for i := 0; i < 3; i++ {
			a := math.Pi/2 + math.Pi*float64(i)/3
			dx, dy := r*vg.Length(math.Cos(a)), r*vg.Length(math.Sin(a))
			p.Move(vg.Point{X: pt.X - dx, Y: pt.Y - dy})
			p.Line(vg.Point{X: pt.X + dx, Y: pt.Y + dy})
		}
	}
	c.Stroke(p)
}

// groupStyle returns the i-th group's marker: colours and shapes both
// change from one group to the next, so that no two of the first 56 groups
// look alike and each can be told apart without colour.
func groupStyle(i int) draw.GlyphStyle {
	return draw.GlyphStyle{Color: colour(i), Radius: markerRadius, Shape: marker(i % int(numMarkers))}
}

// sans is the figures' typeface, Liberation Sans (embedded in gonum/plot).
var sans = font.Font{Typeface: "Liberation", Variant: "Sans"}

// tickHandler draws tick labels with raised exponents.
var tickHandler = exponentHandler{text.Plain{Fonts: font.DefaultCache}}

// newPanel returns a plot with the project's fonts and sizes.
func newPanel(title, xLabel, yLabel string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(sans, titleSize)
	p.Title.Padding = 3
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle.Font = font.From(sans, labelSize)
		a.Tick.Label.Font = font.From(sans, tickSize)
		a.Tick.Label.Handler = tickHandler
		a.Label.Padding = 2
		a.Padding = 2
	}
	p.X.Label.Text, p.Y.Label.Text = xLabel, yLabel
	p.Legend.TextStyle.Font = font.From(sans, legendSize)
	return p
}

// textStyle is a plain text style of the given size and colour.
func textStyle(size vg.Length, c color.Color) text.Style {
	return text.Style{Font: font.From(sans, size), Color: c, Handler: plot.DefaultTextHandler}
}

// lineStyle is a solid line of the given colour and width.
func lineStyle(c color.Color, w vg.Length) draw.LineStyle {
	return draw.LineStyle{Color: c, Width: w}
}

// dashed is a dashed line of the given colour and width.
func dashed(c color.Color, w vg.Length) draw.LineStyle {
	return draw.LineStyle{Color: c, Width: w, Dashes: []vg.Length{3, 2}}
}

// legendEntry is one line of a figure's legend: a marker or a line
// sample, and its text.
type legendEntry struct {
	label string
	glyph *draw.GlyphStyle
	line  *draw.LineStyle
	fill  color.Color // a shaded area
}

// legendRow is the height of one legend line.
const legendRow = vg.Length(9)

// legendColumnsFor puts short entries in two columns and long ones, which
// would run into each other at column width, in one.
func legendColumnsFor(es []legendEntry) int {
	for _, e := range es {
		if utf8.RuneCountInString(e.label) > 24 {
			return 1
		}
	}
	return 2
}

// legendHeight is the height a legend of n entries in cols columns takes
// below the panels.
func legendHeight(n, cols int) vg.Length {
	if n == 0 {
		return 0
	}
	rows := (n + cols - 1) / cols
	return vg.Length(rows)*legendRow + 6
}

// drawLegend draws the entries in columns, filling rows left to right.
func drawLegend(c draw.Canvas, es []legendEntry, cols int) {
	sty := textStyle(legendSize, color.Black)
	colW := (c.Max.X - c.Min.X - 12) / vg.Length(cols)
	for i, e := range es {
		x := c.Min.X + 12 + vg.Length(i%cols)*colW
		y := c.Max.Y - 4 - vg.Length(i/cols)*legendRow - legendRow/2
		switch {
		case e.glyph != nil:
			c.DrawGlyphNoClip(*e.glyph, vg.Point{X: x + 6, Y: y})
		case e.line != nil:
			c.StrokeLine2(*e.line, x, y, x+12, y)
		case e.fill != nil:
			c.FillPolygon(e.fill, []vg.Point{{X: x, Y: y - 3}, {X: x + 12, Y: y - 3}, {X: x + 12, Y: y + 3}, {X: x, Y: y + 3}})
		}
		c.FillText(sty, vg.Point{X: x + 16, Y: y - sty.Rectangle(e.label).Max.Y/2 + 1}, e.label)
	}
}

// addLabels adds text labels at data coordinates to p, in the style given;
// the caller makes sure that every coordinate suits the axes. Labels at a
// non-finite coordinate are not drawn.
func addLabels(p *plot.Plot, xs, ys []float64, texts []string, sty text.Style, offset vg.Point) {
	xyl := plotter.XYLabels{}
	for i := range xs {
		if isFinite(xs[i]) && isFinite(ys[i]) {
			xyl.XYs = append(xyl.XYs, plotter.XY{X: xs[i], Y: ys[i]})
			xyl.Labels = append(xyl.Labels, texts[i])
		}
	}
	if len(xyl.XYs) == 0 {
		return
	}
	l, err := plotter.NewLabels(xyl)
	if err != nil {
		return
	}
	for i := range l.TextStyle {
		l.TextStyle[i] = sty
	}
	l.Offset = offset
	p.Add(l)
}
