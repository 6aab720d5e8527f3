package figure

import (
	"bytes"
	"encoding/xml"
	"image/color"
	"image/png"
	"math"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/tabulate"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// svgDoc is what the tests read back from an SVG: its texts and the paths
// drawn with the markers' line width.
type svgDoc struct {
	texts   []string
	markers int
}

// parseSVG decodes an SVG with encoding/xml.
func parseSVG(t *testing.T, b []byte) svgDoc {
	t.Helper()
	var doc svgDoc
	d := xml.NewDecoder(bytes.NewReader(b))
	inText := false
	for {
		tok, err := d.Token()
		if err != nil {
			if err.Error() == "EOF" {
				break
			}
			t.Fatalf("SVG does not parse: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			inText = e.Name.Local == "text"
			if e.Name.Local == "path" {
				for _, a := range e.Attr {
					if a.Name.Local == "style" && strings.Contains(a.Value, "stroke-width:0.9;") || strings.HasSuffix(a.Value, "stroke-width:0.9") {
						doc.markers++
					}
				}
			}
		case xml.CharData:
			if inText {
				doc.texts = append(doc.texts, string(e))
			}
		case xml.EndElement:
			inText = false
		}
	}
	return doc
}

// hasText reports whether some text element contains s.
func (d svgDoc) hasText(s string) bool {
	for _, t := range d.texts {
		if strings.Contains(t, s) {
			return true
		}
	}
	return false
}

// checkPNG decodes the figure as PNG: 8.5 cm at 300 dpi is 1004 pixels
// wide (8.5/2.54 × 300 = 1003.9), and a drawn figure is not blank: it has
// dark pixels and at least one colour that is not grey.
func checkPNG(t *testing.T, f *Figure) {
	t.Helper()
	var b bytes.Buffer
	if err := f.Encode(&b, FormatPNG); err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(&b)
	if err != nil {
		t.Fatalf("PNG does not decode: %v", err)
	}
	if w := img.Bounds().Dx(); w < 1003 || w > 1005 {
		t.Errorf("PNG width %d px, want 1004 (8.5 cm at 300 dpi)", w)
	}
	dark, coloured := 0, 0
	bnd := img.Bounds()
	for y := bnd.Min.Y; y < bnd.Max.Y; y += 2 {
		for x := bnd.Min.X; x < bnd.Max.X; x += 2 {
			c := color.NRGBAModel.Convert(img.At(x, y)).(color.NRGBA)
			if int(c.R)+int(c.G)+int(c.B) < 200 {
				dark++
			}
			if max3(c.R, c.G, c.B)-min3(c.R, c.G, c.B) > 60 {
				coloured++
			}
		}
	}
	if dark < 500 || coloured < 50 {
		t.Errorf("PNG looks blank: %d dark and %d coloured pixels sampled", dark, coloured)
	}
}

func max3(a, b, c uint8) int { return int(max(a, b, c)) }
func min3(a, b, c uint8) int { return int(min(a, b, c)) }

// svgOf renders the figure as SVG and parses it.
func svgOf(t *testing.T, f *Figure) svgDoc {
	t.Helper()
	b, err := f.SVG()
	if err != nil {
		t.Fatal(err)
	}
	return parseSVG(t, b)
}

// Invented survey rows: two groups, plus one row with Re ≤ 0, one with a
// missing y and one with a negative y, which a log axis cannot show.
func inventedRegimeRows() []RegimePoint {
	return []RegimePoint{
		{"copepod", 0.5, 0.3}, {"copepod", 2, 0.25}, {"copepod", 8, 0.35},
		{"trout", 3e4, 0.22}, {"trout", 1e5, 0.28},
		{"trout", 0, 0.3}, {"copepod", 5, math.NaN()}, {"trout", 2e4, -0.1},
	}
}

func TestRegimeMapDrawsEveryRowOnce(t *testing.T) {
	f, err := RegimeMapFigure(inventedRegimeRows(), RegimeOptions{YLabel: "Strouhal number, St", Strouhal: true})
	if err != nil {
		t.Fatal(err)
	}
	d := svgOf(t, f)
	// 5 drawable rows and one legend marker for each of the 2 groups.
	if d.markers != 5+2 {
		t.Errorf("%d markers, want 7 (5 rows + 2 legend entries)", d.markers)
	}
	for _, want := range []string{"Reynolds number, Re", "Strouhal number, St", "viscous", "intermediate", "inertial",
		"efficient cruising, St 0.2–0.4", "copepod (3)", "trout (2)"} {
		if !d.hasText(want) {
			t.Errorf("no text %q in %q", want, d.texts)
		}
	}
	if len(f.Notes) != 1 || !strings.Contains(f.Notes[0], "3 of 8 rows left out") {
		t.Errorf("notes %q, want 3 of 8 rows left out", f.Notes)
	}
	checkPNG(t, f)
	a, _ := f.SVG()
	b, _ := f.SVG()
	if !bytes.Equal(a, b) {
		t.Error("the same figure gave different SVG bytes")
	}
}

// Bad data never panics: nothing drawable is an error, one point is drawn
// with a widened range.
func TestRegimeMapBadData(t *testing.T) {
	for _, pts := range [][]RegimePoint{nil, {{"a", 0, 1}}, {{"a", -1, -1}}, {{"a", math.Inf(1), 1}}, {{"a", math.NaN(), math.NaN()}}} {
		if _, err := RegimeMap(pts, RegimeOptions{YLabel: "length (mm)"}); err == nil {
			t.Errorf("%v: no error", pts)
		}
	}
	f, err := RegimeMapFigure([]RegimePoint{{"", 1, 1}}, RegimeOptions{YLabel: "length (mm)"})
	if err != nil {
		t.Fatal(err)
	}
	if d := svgOf(t, f); d.markers != 2 || !d.hasText("all rows (1)") {
		t.Errorf("single point: %d markers, texts %q", d.markers, d.texts)
	}
	// A linear second axis takes zero and negative values.
	f, err = RegimeMapFigure([]RegimePoint{{"a", 1, 0}, {"a", 10, -2}}, RegimeOptions{YLabel: "depth (m)", LinearY: true})
	if err != nil {
		t.Fatal(err)
	}
	if d := svgOf(t, f); d.markers != 3 {
		t.Errorf("linear axis: %d markers, want 3", d.markers)
	}
}

func TestRegimeMapManyGroups(t *testing.T) {
	var pts []RegimePoint
	for i := 0; i < 20; i++ {
		pts = append(pts, RegimePoint{Group: string(rune('a' + i)), Reynolds: float64(i + 1), Y: 1})
	}
	f, err := RegimeMapFigure(pts, RegimeOptions{YLabel: "length (mm)"})
	if err != nil {
		t.Fatal(err)
	}
	d := svgOf(t, f)
	if d.markers != 20+MaxGroups || !d.hasText("other groups (7)") {
		t.Errorf("%d markers, want %d; texts %q", d.markers, 20+MaxGroups, d.texts)
	}
}

// Axes narrower than a decade still carry labelled ticks: from 0.05 to 0.5
// the labels are 0.05, 0.1, 0.2 and 0.5 (powers of ten and their 2× and 5×
// multiples, by definition).
func TestLogTicksNarrowAxis(t *testing.T) {
	var labels []string
	for _, tk := range (logTicks{}).Ticks(0.05, 0.5) {
		if tk.Label != "" {
			labels = append(labels, tk.Label)
		}
	}
	if got := strings.Join(labels, " "); got != "0.05 0.1 0.2 0.5" {
		t.Errorf("labels %q", got)
	}
	labels = nil
	for _, tk := range (logTicks{}).Ticks(1.2e-5, 1.6e-5) {
		if tk.Label != "" {
			labels = append(labels, tk.Label)
		}
	}
	if len(labels) < 2 {
		t.Errorf("a quarter of a decade got labels %q", labels)
	}
	if got := tickLabel(1, -4); got != "10^−4" {
		t.Errorf("tickLabel(1, -4) = %q", got)
	}
	for _, bad := range [][2]float64{{0, 1}, {-1, 1}, {1, 1}, {1, math.Inf(1)}, {math.NaN(), 1}} {
		if ts := (logTicks{}).Ticks(bad[0], bad[1]); ts != nil {
			t.Errorf("Ticks(%v) = %v, want none", bad, ts)
		}
	}
}

// A sphere in water: Stokes' law C_D = 24/Re is drawn where it is
// published (Stokes 1851), the chosen law is continuous, and the case is
// marked once. Water at 20 °C: 998.2 kg/m³, 1.0016 mPa·s (ISO/TR 3666).
func TestDragFigure(t *testing.T) {
	c := DragCase{Body: regime.Body{Shape: regime.Sphere, Length: 1e-3}, Density: 998.2, Viscosity: 1.0016e-3, Speed: 0.01}
	f, err := DragFigure(c)
	if err != nil {
		t.Fatal(err)
	}
	d := svgOf(t, f)
	if d.markers != 2 { // the case and its legend entry
		t.Errorf("%d markers, want 2", d.markers)
	}
	for _, want := range []string{"Reynolds number, Re (on diameter)", "drag coefficient (on frontal area)", "law chosen by flowregime", "this case: Re 9.97"} {
		if !d.hasText(want) {
			t.Errorf("no text %q in %q", want, d.texts)
		}
	}
	checkPNG(t, f)
	if _, err := DragFigure(DragCase{Body: regime.Body{Shape: regime.Sphere, Length: 0}, Density: 1, Viscosity: 1}); err == nil {
		t.Error("a sphere of zero size was drawn")
	}
	f, err = DragFigure(DragCase{Body: c.Body, Density: 998.2, Viscosity: 1.0016e-3, Speed: 1e6})
	if err != nil || len(f.Notes) != 1 || !strings.Contains(f.Notes[0], "outside the drawn range") {
		t.Errorf("a case beyond Re 1e7: %v, notes %q", err, f.Notes)
	}
}

// An invented U-shaped curve, P = 2/V + 0.01 V³ + 0.5 W: minimum power at
// V = (2/0.03)^(1/4) = 2.857 m/s by calculus.
func inventedPowerCurve() regime.PowerCurve {
	pc := regime.PowerCurve{Weight: 0.4 * 9.80665, Hover: math.NaN()}
	for v := 0.5; v <= 10; v += 0.5 {
		ind, par, pro := 2/v, 0.01*v*v*v, 0.5
		pc.Points = append(pc.Points, regime.CurvePoint{Speed: v, Induced: ind, Parasite: par, Profile: pro, Total: ind + par + pro})
	}
	pc.MinPowerSpeed = math.Pow(2/0.03, 0.25)
	pc.MinPower = 2/pc.MinPowerSpeed + 0.01*math.Pow(pc.MinPowerSpeed, 3) + 0.5
	pc.MaxRangeSpeed, pc.MinCostOfTr = 4, (0.5+0.5+0.64)/4
	return pc
}

func TestPowerFigure(t *testing.T) {
	f, err := PowerFigure(inventedPowerCurve())
	if err != nil {
		t.Fatal(err)
	}
	d := svgOf(t, f)
	// V_mp once, V_mr in both panels, and their two legend entries.
	if d.markers != 5 {
		t.Errorf("%d markers, want 5", d.markers)
	}
	for _, want := range []string{"mechanical power, P (W)", "cost of transport, P/V (J/m)", "flight speed, V (m/s)", "minimum power: 2.86 m/s", "maximum range: 4 m/s", "induced", "parasite", "profile"} {
		if !d.hasText(want) {
			t.Errorf("no text %q in %q", want, d.texts)
		}
	}
	checkPNG(t, f)
	if _, err := PowerFigure(regime.PowerCurve{Points: []regime.CurvePoint{{Speed: 1, Total: 1}}}); err == nil {
		t.Error("a one-speed curve was drawn")
	}
	bad := inventedPowerCurve()
	bad.Points[3].Total = math.NaN()
	if f, err := PowerFigure(bad); err != nil || len(f.Notes) == 0 || !strings.Contains(f.Notes[0], "1 speeds left out") {
		t.Errorf("a NaN power: %v, notes %q", err, f.Notes)
	}
}

// A power-law fluid, τ = 2 γ̇^0.5 Pa (invented), with a zero and a negative
// point that the log axes leave out.
func TestFlowFigure(t *testing.T) {
	var pts []media.RheometerPoint
	for _, g := range []float64{0.1, 0.3, 1, 3, 10, 30, 100} {
		pts = append(pts, media.RheometerPoint{ShearRate: g, Stress: 2 * math.Sqrt(g)})
	}
	rep, err := media.FitRheology(pts)
	if err != nil {
		t.Fatal(err)
	}
	pts = append(pts, media.RheometerPoint{ShearRate: 0, Stress: 1}, media.RheometerPoint{ShearRate: 5, Stress: -1})
	f, err := FlowFigure(pts, rep, 12)
	if err != nil {
		t.Fatal(err)
	}
	d := svgOf(t, f)
	if d.markers != 7+1 {
		t.Errorf("%d markers, want 8 (7 points + legend)", d.markers)
	}
	for _, want := range []string{"shear rate, γ̇ (1/s)", "shear stress, τ (Pa)", "(best by AICc)", "measured (7 points)", "organism's shear rate, 12 1/s"} {
		if !d.hasText(want) {
			t.Errorf("no text %q in %q", want, d.texts)
		}
	}
	if !strings.Contains(strings.Join(f.Notes, "; "), "2 of 9 points left out") {
		t.Errorf("notes %q", f.Notes)
	}
	checkPNG(t, f)
	if _, err := FlowFigure([]media.RheometerPoint{{ShearRate: 0, Stress: 0}}, rep, 0); err == nil {
		t.Error("no drawable point, no error")
	}
}

func TestSweepFigure(t *testing.T) {
	s := Sweep{X: []float64{1, 2, 3, 4, 5, 6}, Y: []float64{1, 4, 9, 16, math.NaN(), 36}, XLabel: "speed (m/s)", YLabel: "drag (N)",
		LogX: true, LogY: true, Changes: []Change{{2.5, "law A → B"}, {0, "bad position"}}}
	f, err := SweepFigure(s)
	if err != nil {
		t.Fatal(err)
	}
	d := svgOf(t, f)
	if d.markers != 5 {
		t.Errorf("%d markers, want 5", d.markers)
	}
	for _, want := range []string{"speed (m/s)", "drag (N)", "law A → B"} {
		if !d.hasText(want) {
			t.Errorf("no text %q in %q", want, d.texts)
		}
	}
	if len(f.Notes) != 2 {
		t.Errorf("notes %q, want the NaN point and the unplaceable change", f.Notes)
	}
	checkPNG(t, f)
	if _, err := SweepFigure(Sweep{X: []float64{1}, Y: []float64{-1}, LogY: true}); err == nil {
		t.Error("no drawable point, no error")
	}
}

// y = 3 x^0.75 with a little invented scatter: both lines have exponents
// near 0.75 (Kleiber's exponent, here only the invented slope).
func TestScalingFigure(t *testing.T) {
	var xs, ys []float64
	for i, x := range []float64{1, 2, 5, 10, 20, 50, 100, 200} {
		xs = append(xs, x)
		ys = append(ys, 3*math.Pow(x, 0.75)*(1+0.05*float64(i%3-1)))
	}
	xs, ys = append(xs, 0), append(ys, 5)
	s := Scaling{X: xs, Y: ys, XLabel: "mass (g)", YLabel: "power (W)", Fit: tabulate.ScalingFit(xs, ys)}
	f, err := ScalingFigure(s)
	if err != nil {
		t.Fatal(err)
	}
	d := svgOf(t, f)
	if d.markers != 8+1 {
		t.Errorf("%d markers, want 9", d.markers)
	}
	for _, want := range []string{"mass (g)", "power (W)", "OLS: exponent 0.7", "SMA: exponent 0.7", "data (8 pairs)"} {
		if !d.hasText(want) {
			t.Errorf("no text %q in %q", want, d.texts)
		}
	}
	checkPNG(t, f)
	one := Scaling{X: []float64{1}, Y: []float64{1}, Fit: tabulate.ScalingFit([]float64{1}, []float64{1})}
	if f, err := ScalingFigure(one); err != nil || len(f.Notes) != 2 {
		t.Errorf("one pair: %v, notes %q", err, f.Notes)
	}
}

func TestFormats(t *testing.T) {
	f, err := RegimeMapFigure(inventedRegimeRows(), RegimeOptions{YLabel: "St"})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := f.Encode(&b, FormatPDF); err != nil || !bytes.HasPrefix(b.Bytes(), []byte("%PDF-")) {
		t.Errorf("PDF: %v, starts %q", err, b.Bytes()[:min(8, b.Len())])
	}
	if err := f.Encode(&b, "gif"); err == nil {
		t.Error("gif accepted")
	}
	for name, want := range map[string]string{"a.svg": "svg", "B.PNG": "png", "c.pdf": "pdf", "d.jpg": "", "e": ""} {
		got, err := FormatFor(name)
		if got != want || (want == "") != (err != nil) {
			t.Errorf("FormatFor(%q) = %q, %v", name, got, err)
		}
	}
	if _, err := (&Figure{}).SVG(); err == nil {
		t.Error("an empty figure was drawn")
	}
}
