package figure

import (
	"fmt"
	"image/color"
	"math"

	"github.com/flowregime/flowregime/regime"
	"gonum.org/v1/plot/vg"
)

// DragCase is the body and fluid of the drag figure, and the one case
// (speed) to mark on it; Speed 0 marks none.
type DragCase struct {
	Body      regime.Body
	Density   float64 // kg/m³
	Viscosity float64 // Pa·s
	Speed     float64 // m/s, the case to mark
}

// Range of Re (on the shape's choice length) the drag figure spans, and
// its samples per decade.
const (
	dragReLo, dragReHi = 1e-3, 1e7
	dragPerDecade      = 40
)

// DragCurves returns the drag figure as SVG bytes; see [DragFigure].
func DragCurves(c DragCase) ([]byte, error) {
	f, err := DragFigure(c)
	if err != nil {
		return nil, err
	}
	return f.SVG()
}

// frontalArea is the area every curve's coefficient is put on, so that
// laws on different areas compare: the disc of the diameter for a body
// moving along its axis, length × diameter for a cylinder broadside, the
// given area for a measured coefficient.
func frontalArea(b regime.Body) (float64, string) {
	switch b.Shape {
	case regime.Sphere:
		return math.Pi * b.Length * b.Length / 4, "frontal area"
	case regime.Cylinder:
		return b.Length * b.Diameter, "projected area"
	case regime.Measured:
		return b.ReferenceArea, "reference area"
	}
	return math.Pi * b.Diameter * b.Diameter / 4, "frontal area"
}

// DragFigure draws the drag coefficient of the body against the Reynolds
// number on the shape's choice length ([regime.ChoiceLength]), from Re
// 10⁻³ to 10⁷: each law of the shape (from [regime.Drag]'s estimates)
// only where it is inside its published range, the law the package
// chooses as a broad grey band under the laws, its smooth joins dashed, and the case's
// speed as a marker. Every coefficient is put on one area (frontalArea),
// C_D = F/(½ρU²A), so that laws on other areas compare.
func DragFigure(c DragCase) (*Figure, error) {
	if err := c.Body.Validate(); err != nil {
		return nil, err
	}
	area, areaName := frontalArea(c.Body)
	L := regime.ChoiceLength(c.Body)
	if !(area > 0) || !(L > 0) || !(c.Density > 0) || !(c.Viscosity > 0) {
		return nil, fmt.Errorf("drag figure: body and fluid must have sizes, density and viscosity above zero")
	}
	f := &Figure{}
	coef := func(u float64) (regime.DragResult, float64, error) {
		r, err := regime.Drag(c.Body, regime.Flow{Speed: u, Density: c.Density, Viscosity: c.Viscosity})
		return r, 0.5 * c.Density * u * u * area, err
	}
	type series struct{ re, cd []float64 }
	laws := map[string]*series{}
	var order []string
	var chosen, joins series
	n := int(math.Log10(dragReHi/dragReLo)) * dragPerDecade
	for i := 0; i <= n; i++ {
		re := dragReLo * math.Pow(10, float64(i)/dragPerDecade)
		u := re * c.Viscosity / (c.Density * L)
		r, q, err := coef(u)
		if err != nil || !(q > 0) {
			chosen.re, chosen.cd = append(chosen.re, re), append(chosen.cd, nan)
			continue
		}
		cd := r.Chosen.Force / q
		chosen.re, chosen.cd = append(chosen.re, re), append(chosen.cd, cd)
		jcd := nan
		if isJoin(r.Chosen.Law) {
			jcd = cd
		}
		joins.re, joins.cd = append(joins.re, re), append(joins.cd, jcd)
		for _, e := range r.Estimates {
			s := laws[e.Law]
			if s == nil {
				s = &series{}
				laws[e.Law] = s
				order = append(order, e.Law)
			}
			v := nan
			if e.InRange && !isJoin(e.Law) {
				v = e.Force / q
			}
			s.re, s.cd = append(s.re, re), append(s.cd, v)
		}
	}
	p := newPanel("", "Reynolds number, Re (on "+choiceName(c.Body)+")", "drag coefficient (on "+areaName+")")
	// The chosen law is a broad grey band under the laws, so that the law
	// it follows stays visible on top of it; the laws take the palette's
	// colours without black, dashed once the colours repeat.
	band := lineStyle(color.NRGBA{0xB0, 0xB0, 0xB0, 0xFF}, 4)
	addLine(p, chosen.re, chosen.cd, band, true, true)
	f.legend = append(f.legend, legendEntry{label: "law chosen by flowregime (grey band)", line: &band})
	var all []float64
	colours := len(palette) - 1 // black is kept for marks
	k := 0
	for _, name := range order {
		s := laws[name]
		if isJoin(name) || allNaN(s.cd) {
			continue
		}
		sty := lineStyle(palette[k%colours], 1)
		if k >= colours {
			sty.Dashes = []vg.Length{3, 2}
		}
		addLine(p, s.re, s.cd, sty, true, true)
		f.legend = append(f.legend, legendEntry{label: name + " (published range)", line: &sty})
		all = append(all, s.cd...)
		k++
	}
	if !allNaN(joins.cd) {
		js := dashed(colour(1), 2)
		addLine(p, joins.re, joins.cd, js, true, true)
		f.legend = append(f.legend, legendEntry{label: "smooth join between laws", line: &js})
	}
	all = append(all, chosen.cd...)
	if c.Speed > 0 {
		r, q, err := coef(c.Speed)
		re := c.Density * c.Speed * L / c.Viscosity
		switch {
		case err != nil:
			f.note("the case was not marked: %v", err)
		case re < dragReLo || re > dragReHi:
			f.note("the case (Re = %.3g) lies outside the drawn range 10⁻³–10⁷ and is not marked", re)
		default:
			cd := r.Chosen.Force / q
			g := groupStyle(1)
			g.Radius = 3.5
			addPoints(p, []float64{re}, []float64{cd}, g, true, true)
			f.legend = append(f.legend, legendEntry{label: fmt.Sprintf("this case: Re %.3g, drag coefficient %.3g", re, cd), glyph: &g})
		}
	}
	setLog(&p.X, dragReLo, dragReHi)
	if err := setAxis(&p.Y, all, true); err != nil {
		return nil, fmt.Errorf("drag figure: %v", err)
	}
	f.addPanel(p, 6.5*vg.Centimeter)
	return f, nil
}

// isJoin reports whether the named law is one of regime's smooth joins.
func isJoin(name string) bool {
	for _, l := range regime.Laws() {
		if l.Name == name {
			return l.Join != nil
		}
	}
	return false
}

// choiceName names the length the shape's Reynolds number is on.
func choiceName(b regime.Body) string {
	if b.Shape == regime.Sphere || b.Shape == regime.Cylinder {
		return "diameter"
	}
	return "length"
}

// allNaN reports whether no value of vs is a number.
func allNaN(vs []float64) bool {
	for _, v := range vs {
		if !math.IsNaN(v) {
			return false
		}
	}
	return true
}
