package cli

import (
	"fmt"
	"io"
	"math"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
)

type reduceOptions struct {
	input, geometry, output, format, inFormat, wall, fallDistance string
	dims                                                          map[string]*string // geometry flags by name
	window                                                        int
	units                                                         []string
	fit                                                           bool
	fitOptions
}

// geometryFlags are the instrument flags each geometry needs, then those
// it may take.
var geometryFlags = map[string][2][]string{
	media.GeometryCouette:       {{"bob-radius", "cup-radius", "bob-length"}, nil},
	media.GeometryConePlate:     {{"radius", "cone-angle"}, nil},
	media.GeometryParallelPlate: {{"radius", "gap"}, nil},
	media.GeometryCapillary:     {{"diameter", "length"}, {"density"}},
	media.GeometryFallingBall:   {{"ball-diameter", "tube-diameter", "ball-density", "density"}, {"wall", "fall-distance"}},
}

var dimensionFlags = []struct{ name, help string }{
	{"bob-radius", "concentric cylinder: radius of the bob, e.g. 10mm"},
	{"cup-radius", "concentric cylinder: inner radius of the cup, e.g. 11mm"},
	{"bob-length", "concentric cylinder: immersed length of the bob, e.g. 40mm"},
	{"radius", "cone and plate, parallel plates: radius, e.g. 20mm"},
	{"cone-angle", "cone and plate: cone angle, e.g. 1deg"},
	{"gap", "parallel plates: gap, e.g. 1mm"},
	{"diameter", "capillary: inner diameter, e.g. 1mm"},
	{"length", "capillary: length, unless a length column gives each reading's tube"},
	{"ball-diameter", "falling ball: ball diameter, e.g. 2mm"},
	{"tube-diameter", "falling ball: tube inner diameter, e.g. 40mm"},
	{"ball-density", "falling ball: ball density, e.g. 7800kg/m3"},
}

func newReduceCmd(s Streams) *cobra.Command {
	o := &reduceOptions{dims: map[string]*string{}}
	cmd := &cobra.Command{
		Use:   "reduce {FILE | -} --geometry NAME [instrument flags] [flags]",
		Short: "Turn raw viscometer readings into a flow curve, and fit it",
		Long: `Turn a table of raw readings from one viscometer into a flow curve: shear
rate and shear stress with the geometry's corrections applied.

Geometries and their readings (columns found by header; units from the
header, e.g. "torque (mN·m)", or --unit torque=mN·m):
  couette         speed, torque        --bob-radius --cup-radius --bob-length
  cone-plate      speed, torque        --radius --cone-angle
  parallel-plate  speed, torque        --radius --gap
  capillary       flow, pressure [, length]   --diameter --length [--density]
  falling-ball    speed (or time with --fall-distance)
                  --ball-diameter --tube-diameter --ball-density --density [--wall]

Corrections: concentric cylinder, the shear rate at the bob from the local
slope of ln torque against ln speed; parallel plates, the rim stress from
the same slope; capillary, the Bagley end correction when a length column
holds two tube lengths or more at one flow rate, then the
Rabinowitsch–Mooney wall shear rate; falling ball, Stokes's law with the
Haberman & Sayre (default) or Faxén wall correction. Local slopes come from
a quadratic in ln–ln fitted over --window neighbouring readings. Each
point shows the slope and how much the correction changed it.

The flow curve goes to -o FILE (CSV, readable by 'flowregime fit') or to
standard output. --fit fits it at once; --save FILE.json writes the best
model as a medium file (a falling ball writes its mean viscosity as a
Newtonian medium). A row that cannot be read or reduced is reported on
standard error with its line and reason, and the exit code is 3.`,
		Example: `  flowregime reduce cup.csv --geometry couette --bob-radius 12.5mm --cup-radius 13.6mm --bob-length 37.5mm -o curve.csv
  flowregime reduce cup.csv --geometry couette --bob-radius 12.5mm --cup-radius 13.6mm --bob-length 37.5mm --fit --density 1020kg/m3 --save mucus.json`,
		Args: oneTable("reduce", "a file of readings"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.input = args[0]
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			g, err := o.buildGeometry(cmd.Flags())
			if err != nil {
				return err
			}
			return runReduce(o, g, s)
		},
	}
	fs := cmd.Flags()
	fs.StringVar(&o.geometry, "geometry", "", "instrument: "+strings.Join(media.GeometryNames, ", "))
	for _, d := range dimensionFlags {
		o.dims[d.name] = fs.String(d.name, "", d.help)
	}
	fs.StringVar(&o.density, "density", "", "density of the fluid, e.g. 1020kg/m3 (falling ball; capillary laminar check; --save)")
	fs.StringVar(&o.wall, "wall", media.WallHabermanSayre, "falling ball wall correction: haberman-sayre or faxen")
	fs.StringVar(&o.fallDistance, "fall-distance", "", "falling ball: distance timed, when the table gives fall times")
	fs.IntVar(&o.window, "window", media.DefaultSlopeWindow, "readings in each local slope fit (3 or more)")
	fs.StringArrayVar(&o.units, "unit", nil, "role=unit for a column without a unit in its header, e.g. torque=mN·m, speed=rpm")
	fs.StringVarP(&o.output, "output", "o", "", "write the flow curve to this CSV file")
	fs.StringVar(&o.inFormat, "input-format", "", "csv or tsv (default: from the extension)")
	fs.StringVar(&o.format, "format", report.FormatTable, "standard output: table, json or csv")
	fs.BoolVar(&o.fit, "fit", false, "fit the flow curve with every model, as 'flowregime fit' does")
	fs.StringVar(&o.save, "save", "", "write the best model as a medium file (JSON); implies --fit")
	fs.StringVar(&o.name, "name", "", "name of the fluid, for the medium file")
	fs.StringVar(&o.temp, "temp", "", "temperature of the measurement, recorded in the medium file")
	return cmd
}

// buildGeometry reads the instrument flags of the chosen geometry and
// refuses flags of another.
func (o *reduceOptions) buildGeometry(fs *pflag.FlagSet) (media.Geometry, error) {
	want, ok := geometryFlags[o.geometry]
	if !ok {
		return nil, usagef("--geometry %q: accepted: %s", o.geometry, strings.Join(media.GeometryNames, ", "))
	}
	uses := map[string]bool{}
	for _, n := range append(append([]string{}, want[0]...), want[1]...) {
		uses[n] = true
	}
	var err error
	fs.Visit(func(f *pflag.Flag) {
		if _, isDim := o.dims[f.Name]; (isDim || f.Name == "wall" || f.Name == "fall-distance") && !uses[f.Name] && err == nil {
			err = usagef("--%s does not apply to --geometry %s, which takes %s", f.Name, o.geometry, flagList(want))
		}
	})
	if err != nil {
		return nil, err
	}
	for _, n := range want[0] {
		if v := o.flagValue(n); v == "" {
			return nil, usagef("--geometry %s needs --%s (it takes %s)", o.geometry, n, flagList(want))
		}
	}
	g, err := o.geometryFromFlags()
	if err != nil {
		return nil, err
	}
	if err := g.Check(); err != nil {
		return nil, usagef("%s", trimPkg(err))
	}
	return g, nil
}

func flagList(want [2][]string) string {
	var out []string
	for _, n := range want[0] {
		out = append(out, "--"+n)
	}
	for _, n := range want[1] {
		out = append(out, "[--"+n+"]")
	}
	return strings.Join(out, " ")
}

func (o *reduceOptions) flagValue(name string) string {
	switch name {
	case "density":
		return o.density
	case "wall":
		return o.wall
	case "fall-distance":
		return o.fallDistance
	}
	return *o.dims[name]
}

// dim parses an instrument flag as kind k; an unset optional flag is 0.
func (o *reduceOptions) dim(name string, k quantity.Kind) (float64, error) {
	text := o.flagValue(name)
	if text == "" {
		return 0, nil
	}
	v, err := quantity.Parse(k, text)
	if err != nil {
		return 0, usagef("--%s: %v", name, err)
	}
	return v.SI, nil
}

// geometryFromFlags builds the chosen geometry from its flags.
func (o *reduceOptions) geometryFromFlags() (media.Geometry, error) {
	var v [4]float64
	spec := map[string][]struct {
		name string
		kind quantity.Kind
	}{
		media.GeometryCouette:       {{"bob-radius", quantity.Length}, {"cup-radius", quantity.Length}, {"bob-length", quantity.Length}},
		media.GeometryConePlate:     {{"radius", quantity.Length}, {"cone-angle", quantity.Angle}},
		media.GeometryParallelPlate: {{"radius", quantity.Length}, {"gap", quantity.Length}},
		media.GeometryCapillary:     {{"diameter", quantity.Length}, {"length", quantity.Length}, {"density", quantity.Density}},
		media.GeometryFallingBall:   {{"ball-diameter", quantity.Length}, {"tube-diameter", quantity.Length}, {"ball-density", quantity.Density}, {"density", quantity.Density}},
	}
	for i, f := range spec[o.geometry] {
		x, err := o.dim(f.name, f.kind)
		if err != nil {
			return nil, err
		}
		v[i] = x
	}
	switch o.geometry {
	case media.GeometryCouette:
		return media.Couette{BobRadius: v[0], CupRadius: v[1], BobLength: v[2]}, nil
	case media.GeometryConePlate:
		return media.ConePlate{Radius: v[0], Angle: v[1]}, nil
	case media.GeometryParallelPlate:
		return media.ParallelPlate{Radius: v[0], Gap: v[1]}, nil
	case media.GeometryCapillary:
		return media.Capillary{Diameter: v[0], Length: v[1], FluidDensity: v[2]}, nil
	}
	return media.FallingBall{BallDiameter: v[0], TubeDiameter: v[1], BallDensity: v[2], FluidDensity: v[3], Wall: o.wall}, nil
}

func runReduce(o *reduceOptions, g media.Geometry, s Streams) error {
	if o.window < 3 {
		return usagef("--window %d: a local quadratic needs 3 readings or more", o.window)
	}
	falling := o.geometry == media.GeometryFallingBall
	if falling && o.fit {
		return usagef("--fit does not apply to a falling ball, which measures one Newtonian viscosity; --save writes it as a medium")
	}
	if o.save != "" && o.density == "" {
		return usagef("--save needs the fluid's --density, e.g. --density 1020kg/m3")
	}
	if o.output != "" && o.output == o.save {
		return usagef("-o and --save name the same file %s", o.output)
	}
	if err := checkOutputs(tableFiles(s, o.input, namedFile{what: "-o " + o.output, path: o.output}, namedFile{what: "--save " + o.save, path: o.save})); err != nil {
		return err
	}
	units, err := keyValues("unit", o.units)
	if err != nil {
		return err
	}
	in, done, err := openTable(s, o.input)
	if err != nil {
		return err
	}
	defer done()
	tsv := readsTSV(o.inFormat, o.input)
	byTime := falling && o.fallDistance != ""
	table, err := readReadings(in, tsv, rolesFor(o.geometry, byTime), units)
	if err != nil {
		return err
	}
	if byTime {
		d, err := o.dim("fall-distance", quantity.Length)
		if err != nil {
			return err
		}
		table = table.timesToSpeeds(d)
	}
	curve, err := g.Reduce(table.readings, o.window)
	if err != nil {
		return fmt.Errorf("%s", trimPkg(err))
	}
	rejects := mergeRejects(table.rejects, curve.Rejected)
	res := reduceResult{curve: curve, rejects: rejects}
	if len(curve.Points) == 0 {
		reportRejects(s, rejects)
		return fmt.Errorf("no reading could be reduced (%d rejected)", len(rejects))
	}
	if o.fit || (o.save != "" && !falling) {
		if err := res.fitCurve(g); err != nil {
			return err
		}
	}
	if o.save != "" {
		if err := o.saveReduced(res, s); err != nil {
			return err
		}
	}
	if o.output != "" {
		if err := writeCurveFile(s.outs, o.output, curve); err != nil {
			return err
		}
	}
	if err := res.write(s.Out, o.format, o.save); err != nil {
		return err
	}
	reportRejects(s, rejects)
	if len(rejects) > 0 {
		return exitError{code: ExitRejected, msg: fmt.Sprintf("%d row(s) rejected; %d point(s) reduced", len(rejects), len(curve.Points))}
	}
	return nil
}

// timesToSpeeds turns fall times over distance d into fall speeds,
// rejecting times that are not positive.
func (t readingTable) timesToSpeeds(d float64) readingTable {
	out := readingTable{rejects: t.rejects}
	for _, r := range t.readings {
		if !(r.FallSpeed > 0) {
			out.rejects = append(out.rejects, rowReject{r.Line, fmt.Sprintf("fall time %g s must be positive", r.FallSpeed)})
			continue
		}
		r.FallSpeed = d / r.FallSpeed
		out.readings = append(out.readings, r)
	}
	return out
}

type reduceResult struct {
	curve   media.FlowCurve
	rejects []rowReject
	fit     *media.FitReport
	fitNote []string // warnings about the fit that depend on the geometry
}

// mergeRejects lists every row that gave no point, in line order.
func mergeRejects(read []rowReject, reduced []media.Rejected) []rowReject {
	out := append([]rowReject{}, read...)
	for _, r := range reduced {
		for _, l := range r.Lines {
			out = append(out, rowReject{l, r.Reason})
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].line < out[j].line })
	return out
}

func reportRejects(s Streams, rs []rowReject) {
	for _, r := range rs {
		fmt.Fprintf(s.Err, "flowregime: line %d rejected: %s\n", r.line, r.reason)
	}
}

// fitCurve fits the reduced points and adds the geometry's own checks on
// the fitted model.
func (r *reduceResult) fitCurve(g media.Geometry) error {
	var pts []media.RheometerPoint
	for _, p := range r.curve.Points {
		pts = append(pts, media.RheometerPoint{ShearRate: p.ShearRate, Stress: p.Stress})
	}
	rep, err := media.FitRheology(pts)
	if err != nil {
		return fmt.Errorf("%s", trimPkg(err))
	}
	r.fit = &rep
	if c, ok := g.(media.Couette); ok {
		if best := bestFit(rep); best.Model != nil {
			r.fitNote = c.UnshearedWarnings(r.curve.Points, media.YieldStress(best.Model))
		}
	}
	return nil
}

func bestFit(rep media.FitReport) media.ModelFit {
	for _, f := range rep.Fits {
		if f.Model != nil && f.Model.Name() == rep.Best {
			return f
		}
	}
	return media.ModelFit{}
}

// saveReduced writes the medium file: the best fitted model, or for a
// falling ball the mean viscosity as a Newtonian medium.
func (o *reduceOptions) saveReduced(r reduceResult, s Streams) error {
	if r.fit != nil {
		return o.saveMedium(*r.fit, s)
	}
	d, err := quantity.Parse(quantity.Density, o.density)
	if err != nil {
		return usagef("--density: %v", err)
	}
	mean, se := meanViscosity(r.curve.Points)
	lo, hi := rateRange(r.curve.Points)
	mf := media.MediumFile{Format: media.MediumFileFormat, Version: media.MediumFileVersion, Name: o.name, Density: d.SI,
		Model: media.ModelNewtonian, Parameters: map[string]float64{media.PViscosity: mean}, ShearRateRange: [2]float64{lo, hi},
		Class: media.ClassNewtonian}
	if !math.IsNaN(se) {
		mf.StandardErrors = map[string]float64{media.PViscosity: se}
	}
	if mf.Name == "" {
		mf.Name = strings.TrimSuffix(filepath.Base(o.save), ".json")
	}
	if o.temp != "" {
		t, err := quantity.Parse(quantity.Temperature, o.temp)
		if err != nil {
			return usagef("--temp: %v", err)
		}
		mf.TemperatureC = &t.SI
	}
	return writeMediumFile(s.outs, o.save, mf)
}

// meanViscosity is the mean of the points' viscosities and its standard
// error (NaN for one point).
func meanViscosity(pts []media.FlowPoint) (mean, se float64) {
	var sum, sum2 float64
	for _, p := range pts {
		sum += p.Viscosity()
	}
	n := float64(len(pts))
	mean = sum / n
	for _, p := range pts {
		sum2 += (p.Viscosity() - mean) * (p.Viscosity() - mean)
	}
	if n < 2 {
		return mean, math.NaN()
	}
	return mean, math.Sqrt(sum2 / (n - 1) / n)
}

func rateRange(pts []media.FlowPoint) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, p := range pts {
		lo, hi = math.Min(lo, p.ShearRate), math.Max(hi, p.ShearRate)
	}
	return lo, hi
}

// curveHeader names the flow-curve columns; 'flowregime fit' reads the
// shear rate and stress by these names.
var curveHeader = []string{"line", "shear rate (1/s)", "shear stress (Pa)", "viscosity (Pa·s)", "local slope", "slope standard error", "slope uncertainty (%)", "correction (%)", "corrected", "Reynolds number", "notes"}

func curveRows(c media.FlowCurve) [][]string {
	var rows [][]string
	for _, p := range c.Points {
		rows = append(rows, []string{lineList(p.Lines), report.Num(p.ShearRate, 6), report.Num(p.Stress, 6), report.Num(p.Viscosity(), 6),
			report.Num(p.Slope, 4), report.Num(p.SlopeSE, 2), report.Num(100*p.SlopeSpread, 2), report.Num(100*p.Correction, 3), p.Corrects, report.Num(p.Reynolds, 3), strings.Join(p.Notes, "; ")})
	}
	return rows
}

func lineList(ls []int) string {
	var out []string
	for _, l := range ls {
		out = append(out, strconv.Itoa(l))
	}
	return strings.Join(out, " ")
}

func writeCurveFile(outs *outputSet, path string, c media.FlowCurve) error {
	af, err := outs.create(path)
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	defer af.abort()
	if err := report.CSV(af, curveHeader, curveRows(c)); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := af.commit(); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	return nil
}

type reducePointJSON struct {
	Lines       []int    `json:"lines"`
	ShearRate   float64  `json:"shear_rate_1_s"`
	Stress      float64  `json:"shear_stress_Pa"`
	Viscosity   float64  `json:"viscosity_Pa_s"`
	Slope       *float64 `json:"local_slope"`
	SlopeSE     *float64 `json:"slope_standard_error"`
	SlopeSpread *float64 `json:"slope_uncertainty_percent"`
	Correction  float64  `json:"correction_percent"`
	Corrects    string   `json:"corrected"`
	Reynolds    *float64 `json:"reynolds_number"`
	Notes       []string `json:"notes"`
}

type rejectJSON struct {
	Line   int    `json:"line"`
	Reason string `json:"reason"`
}

type reduceJSON struct {
	Geometry string            `json:"geometry"`
	Points   []reducePointJSON `json:"points"`
	Rejected []rejectJSON      `json:"rejected"`
	Methods  []string          `json:"methods"`
	Warnings []string          `json:"warnings"`
	Fit      *fitJSON          `json:"fit,omitempty"`
}

func (r reduceResult) json() reduceJSON {
	j := reduceJSON{Geometry: r.curve.Geometry, Points: []reducePointJSON{}, Rejected: []rejectJSON{}, Methods: nonNil(r.curve.Methods),
		Warnings: nonNil(append(append([]string{}, r.curve.Warnings...), r.fitNote...))}
	for _, p := range r.curve.Points {
		j.Points = append(j.Points, reducePointJSON{Lines: p.Lines, ShearRate: p.ShearRate, Stress: p.Stress, Viscosity: p.Viscosity(),
			Slope: report.Opt(p.Slope), SlopeSE: report.Opt(p.SlopeSE), SlopeSpread: report.Opt(100 * p.SlopeSpread), Correction: 100 * p.Correction, Corrects: p.Corrects,
			Reynolds: report.Opt(p.Reynolds), Notes: nonNil(p.Notes)})
	}
	for _, rj := range r.rejects {
		j.Rejected = append(j.Rejected, rejectJSON{rj.line, rj.reason})
	}
	if r.fit != nil {
		fj := newFitJSON(*r.fit)
		j.Fit = &fj
	}
	return j
}

func (r reduceResult) write(w io.Writer, format, saved string) error {
	switch format {
	case report.FormatJSON:
		return report.JSON(w, r.json())
	case report.FormatCSV:
		return report.CSV(w, curveHeader, curveRows(r.curve))
	}
	var rows [][]string
	for _, row := range curveRows(r.curve) {
		rows = append(rows, []string{row[0], row[1], row[2], row[3], row[4], row[7], row[10]})
	}
	fmt.Fprintf(w, "%s: %d point(s)\n", r.curve.Geometry, len(r.curve.Points))
	if err := report.Table(w, []string{"line", "shear rate (1/s)", "shear stress (Pa)", "viscosity (Pa·s)", "local slope", "correction (%)", "notes"}, rows); err != nil {
		return err
	}
	report.List(w, "Methods", r.curve.Methods)
	report.List(w, "Warnings", append(append([]string{}, r.curve.Warnings...), r.fitNote...))
	var rj []string
	for _, x := range r.rejects {
		rj = append(rj, fmt.Sprintf("line %d: %s", x.line, x.reason))
	}
	report.List(w, "Rejected", rj)
	if r.fit != nil {
		writeFitSummary(w, *r.fit)
	}
	if saved != "" {
		fmt.Fprintf(w, "Saved the medium file %s.\n", saved)
	}
	return nil
}

// writeFitSummary prints the best model with its parameters and the fit's
// warnings.
func writeFitSummary(w io.Writer, rep media.FitReport) {
	best := bestFit(rep)
	var ps []string
	for i, p := range best.Params {
		ps = append(ps, fmt.Sprintf("%s = %s ± %s", p.Name, report.Num(p.Value, 4), report.Num(best.StdErrors[i], 2)))
	}
	report.Paragraph(w, "  ", fmt.Sprintf("Fit: best model %s (class %s), R² (ln τ) %s: %s", rep.Best, rep.Class, report.Num(best.R2, 5), strings.Join(ps, ", ")))
	var ws []string
	ws = append(ws, rep.Warnings...)
	ws = append(ws, best.Warnings...)
	report.List(w, "Fit warnings", ws)
}
