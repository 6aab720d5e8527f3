// Package figure draws flowregime's figures with gonum/plot: the regime
// map, drag curves, flight power curves, flow curves, sweeps and scaling
// fits. Each kind has a function that returns a *Figure; a Figure writes
// itself as SVG, PNG or PDF, and [Figure.SVG] gives the bytes to embed in a
// page. Data that cannot be drawn (a value ≤ 0 on a log axis, a missing
// number) is left out and said in [Figure.Notes]; nothing panics.
package figure

import (
	"bytes"
	"errors"
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Formats a figure is written in, chosen by the output file's extension.
const (
	FormatSVG = "svg"
	FormatPNG = "png"
	FormatPDF = "pdf"
)

// ColumnWidth is a journal's single-column width (8.5 cm); every figure is
// drawn at this width so that its text stays readable when printed there.
const ColumnWidth = 8.5 * vg.Centimeter

// yLabelRoom is the room left of the panels for the y axis labels.
const yLabelRoom = vg.Length(15)

// xLabelRoom is the room below a panel for its x axis label.
const xLabelRoom = vg.Length(12)

// PNGDPI is the resolution of PNG output, enough for print at column width.
const PNGDPI = 300

// Figure is one or more panels stacked top to bottom, with an optional
// legend below them, and notes that say what was left out and why.
type Figure struct {
	panels  []*plot.Plot
	heights []vg.Length // of each panel
	legend  []legendEntry
	// Notes say which data were left out of the figure and why, and any
	// choice that changes what is drawn; callers print or show them.
	Notes []string
}

// note adds a note to the figure.
func (f *Figure) note(format string, args ...any) {
	f.Notes = append(f.Notes, fmt.Sprintf(format, args...))
}

// addPanel appends a panel of the given height.
func (f *Figure) addPanel(p *plot.Plot, h vg.Length) {
	f.panels = append(f.panels, p)
	f.heights = append(f.heights, h)
}

// Size returns the figure's width and height.
func (f *Figure) Size() (w, h vg.Length) {
	for _, ph := range f.heights {
		h += ph
	}
	return ColumnWidth, h + legendHeight(len(f.legend), legendColumnsFor(f.legend))
}

// FormatFor returns the figure format for an output file name by its
// extension (.svg, .png or .pdf), or an error naming the accepted ones.
func FormatFor(name string) (string, error) {
	ext := strings.ToLower(strings.TrimPrefix(filepath.Ext(name), "."))
	switch ext {
	case FormatSVG, FormatPNG, FormatPDF:
		return ext, nil
	}
	return "", fmt.Errorf("%s: a figure is written as .svg, .png or .pdf", name)
}

// SVG returns the figure as SVG bytes, for embedding in a page. The same
// figure always gives the same bytes.
func (f *Figure) SVG() ([]byte, error) {
	var b bytes.Buffer
	if err := f.Encode(&b, FormatSVG); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// Encode writes the figure to w in the given format (svg, png or pdf).
func (f *Figure) Encode(w io.Writer, format string) (err error) {
	if len(f.panels) == 0 {
		return errors.New("figure: nothing to draw")
	}
	width, height := f.Size()
	var c vg.CanvasWriterTo
	switch format {
	case FormatSVG:
		c = vgsvg.NewWith(vgsvg.UseWH(width, height))
	case FormatPNG:
		c = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseDPI(PNGDPI), vgimg.UseBackgroundColor(color.White))}
	case FormatPDF:
		c = vgpdf.New(width, height)
	default:
		return fmt.Errorf("figure: unknown format %q (svg, png or pdf)", format)
	}
	if err := f.draw(c); err != nil {
		return err
	}
	_, err = c.WriteTo(w)
	return err
}

// draw lays the panels out top to bottom and the legend below them. A
// panic inside the plotting library is turned into an error as a last
// guard; the figure builders filter data so that none is expected.
func (f *Figure) draw(c vg.CanvasSizer) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("figure: could not be drawn: %v", r)
		}
	}()
	dc := draw.New(c)
	pc := dc
	pc.Min.Y = dc.Max.Y
	for _, h := range f.heights {
		pc.Min.Y -= h
	}
	// Panels share the left edge of their data areas (plot.Align), so
	// that stacked panels' x axes line up; they are drawn in equal rows.
	// The axis labels are drawn here, not by gonum/plot, which centres a
	// label's room at the linear midpoint of a log axis and so shrinks
	// the data area under a long label.
	rows := make([][]*plot.Plot, len(f.panels))
	xl, yl := make([]string, len(f.panels)), make([]string, len(f.panels))
	for i, p := range f.panels {
		rows[i] = []*plot.Plot{p}
		xl[i], p.X.Label.Text = p.X.Label.Text, ""
		yl[i], p.Y.Label.Text = p.Y.Label.Text, ""
	}
	defer func() {
		for i, p := range f.panels {
			p.X.Label.Text, p.Y.Label.Text = xl[i], yl[i]
		}
	}()
	pc.Min.X += yLabelRoom
	pc.Max.X -= 8 // room for the last x tick label
	pc.Max.Y -= 4
	cs := plot.Align(rows, draw.Tiles{Rows: len(rows), Cols: 1}, pc)
	ysty := textStyle(labelSize, color.Black)
	ysty.Rotation, ysty.XAlign, ysty.YAlign = math.Pi/2, draw.XCenter, draw.YTop
	xsty := textStyle(labelSize, color.Black)
	xsty.XAlign = draw.XCenter
	for i, p := range f.panels {
		c := cs[i][0]
		if xl[i] != "" {
			c.Min.Y += xLabelRoom
		}
		p.Draw(c)
		da := p.DataCanvas(c)
		dc.FillText(ysty, vg.Point{X: dc.Min.X + 1, Y: (da.Min.Y + da.Max.Y) / 2}, yl[i])
		if xl[i] != "" {
			dc.FillText(xsty, vg.Point{X: (da.Min.X + da.Max.X) / 2, Y: c.Min.Y - xLabelRoom + 2}, xl[i])
		}
	}
	if len(f.legend) > 0 {
		lc := dc
		lc.Max.Y = pc.Min.Y
		drawLegend(lc, f.legend, legendColumnsFor(f.legend))
	}
	return nil
}
