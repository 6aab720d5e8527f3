package cli

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/spf13/cobra"
)

type fitOptions struct {
	input, inFormat, density, name, temp, relaxation, save, format string
	units                                                          []string
}

// newFitCmd builds fit; a test passes runF to receive the checked options
// instead of running.
func newFitCmd(s Streams, runF func(*fitOptions) error) *cobra.Command {
	o := &fitOptions{}
	cmd := &cobra.Command{
		Use:   "fit {FILE | -} [flags]",
		Short: "Fit rheometer data, classify the fluid, and save it as a medium file",
		Long: `Fit a steady-shear flow curve (a table of shear rate with shear stress or
apparent viscosity, CSV or TSV) with the Newtonian, power-law, Cross,
Carreau, Carreau–Yasuda, Bingham, Herschel–Bulkley and Casson models.

Columns are found by header — "shear rate (1/s)", "shear stress (Pa)",
"viscosity (mPa·s)" — with units from the header or --unit rate=1/s,
--unit stress=Pa, --unit viscosity=mPa·s.

Fits minimise log residuals, ln τ_model − ln τ (equal to log residuals of
viscosity), so every decade of shear rate weighs alike. Parameters stay
physical (positive; flow indices 0.05–2). Reported per model: parameters
with standard errors from the Jacobian at the optimum, R² on ln τ, RMS
relative error, AICc; the best model by AICc; and the class of the fluid
(newtonian, shear-thinning, shear-thickening or yield-stress) with its
evidence.

--save FILE.json writes a medium file (format "flowregime-medium",
version 1) that 'flowregime medium FILE.json' shows and every other command
takes as --medium FILE.json.`,
		Example: `  flowregime fit mucus.csv --density 1010kg/m3 --name "pedal mucus" --save mucus.json
  flowregime calc --medium mucus.json --length 2cm --speed 1mm/s`,
		Args: oneTable("fit", "a file"),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.input = args[0]
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			if runF != nil {
				return runF(o)
			}
			return runFit(o, s)
		},
	}
	fs := cmd.Flags()
	fs.StringVar(&o.density, "density", "", "density of the fluid, e.g. 1010kg/m3 (needed for --save)")
	fs.StringVar(&o.name, "name", "", "name of the fluid, for the medium file")
	fs.StringVar(&o.temp, "temp", "", "temperature of the measurement, recorded in the medium file")
	fs.StringVar(&o.relaxation, "relaxation-time", "", "relaxation time of a viscoelastic fluid, e.g. 0.5s, recorded in the medium file")
	fs.StringVar(&o.save, "save", "", "write the best model as a medium file (JSON)")
	fs.StringVar(&o.inFormat, "input-format", "", "csv or tsv (default: from the extension)")
	fs.StringArrayVar(&o.units, "unit", nil, "rate=…, stress=… or viscosity=…: unit of that column")
	fs.StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	return cmd
}

// rheometer column roles.
var fitRoles = map[string][]string{
	"rate":      {"shear rate", "rate", "gamma dot", "shear strain rate", "strain rate"},
	"stress":    {"shear stress", "stress", "tau"},
	"viscosity": {"viscosity", "apparent viscosity", "eta", "dynamic viscosity"},
}

func fitColumn(h string) (role, unit string) {
	h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
	name := h
	for _, p := range [][2]string{{"(", ")"}, {"[", "]"}} {
		if strings.HasSuffix(h, p[1]) {
			if i := strings.LastIndex(h, p[0]); i > 0 {
				name, unit = h[:i], strings.TrimSpace(h[i+1:len(h)-1])
			}
		}
	}
	n := normName(name)
	for r, names := range fitRoles {
		for _, a := range names {
			if n == a {
				return r, unit
			}
		}
	}
	return "", ""
}

func normName(s string) string {
	s = strings.ToLower(strings.TrimSpace(s))
	s = strings.NewReplacer("_", " ", "-", " ", ".", " ").Replace(s)
	return strings.Join(strings.Fields(s), " ")
}

// readRheometer reads a rheometer table by batch's record rule. A header
// problem is a usage error; a row that cannot be read or computed stops the
// fit with its line.
func readRheometer(r io.Reader, tsv bool, units map[string]string) ([]media.RheometerPoint, error) {
	delim := byte(',')
	if tsv {
		delim = '\t'
	}
	tr, err := batch.NewReader(r, delim)
	var he batch.HeaderError
	if errors.As(err, &he) {
		return nil, usagef("%v; a header with shear rate and stress or viscosity is needed", err)
	}
	if err != nil {
		return nil, usagef("cannot read the header: %v", err)
	}
	header := tr.Header()
	col := map[string]int{}
	unit := map[string]string{}
	for i, h := range header {
		if role, u := fitColumn(h); role != "" {
			if _, dup := col[role]; dup {
				return nil, usagef("two columns hold the %s; keep one", role)
			}
			col[role], unit[role] = i, u
		}
	}
	for role, u := range units {
		if _, ok := fitRoles[role]; !ok {
			return nil, usagef("--unit %s=%s: the columns are rate, stress and viscosity", role, u)
		}
		unit[role] = u
	}
	if _, ok := col["rate"]; !ok {
		return nil, usagef("no shear-rate column; name one \"shear rate (1/s)\" (columns: %s)", strings.Trim(fmt.Sprintf("%q", header), "[]"))
	}
	_, hasStress := col["stress"]
	_, hasVisc := col["viscosity"]
	if !hasStress && !hasVisc {
		return nil, usagef("no shear-stress or viscosity column; name one \"shear stress (Pa)\" or \"viscosity (Pa·s)\"")
	}
	kinds := map[string]quantity.Kind{"rate": quantity.ShearRate, "stress": quantity.Stress, "viscosity": quantity.Viscosity}
	var pts []media.RheometerPoint
	for {
		rec, err := tr.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("cannot read the table: %v", err)
		}
		if rec.Err != nil {
			return nil, fmt.Errorf("line %d: %v", rec.Line, rec.Err)
		}
		get := func(role string) (float64, error) {
			i := col[role]
			v, err := quantity.ParseDefault(kinds[role], rec.Fields[i], unit[role])
			if err != nil {
				return 0, fmt.Errorf("line %d, column %q: %v", rec.Line, header[i], err)
			}
			return v.SI, nil
		}
		g, err := get("rate")
		if err != nil {
			return nil, err
		}
		var tau float64
		if hasStress {
			tau, err = get("stress")
		} else {
			var eta float64
			eta, err = get("viscosity")
			tau = eta * g
		}
		if err != nil {
			return nil, err
		}
		pts = append(pts, media.RheometerPoint{ShearRate: g, Stress: tau})
	}
	return pts, nil
}

func runFit(o *fitOptions, s Streams) error {
	units, err := keyValues("unit", o.units)
	if err != nil {
		return err
	}
	if err := checkOutputs(tableFiles(s, o.input, namedFile{what: "--save " + o.save, path: o.save})); err != nil {
		return err
	}
	in, done, err := openTable(s, o.input)
	if err != nil {
		return err
	}
	defer done()
	tsv := readsTSV(o.inFormat, o.input)
	pts, err := readRheometer(in, tsv, units)
	if err != nil {
		return err
	}
	rep, err := media.FitRheology(pts)
	if err != nil {
		return fmt.Errorf("%s", trimPkg(err))
	}
	if o.save != "" {
		if err := o.saveMedium(rep, s); err != nil {
			return err
		}
	}
	switch o.format {
	case report.FormatJSON:
		return report.JSON(s.Out, newFitJSON(rep))
	case report.FormatCSV:
		h := []string{"model", "parameter", "value", "standard_error", "r_squared", "rms_relative_error", "aicc", "best"}
		var rows [][]string
		for _, f := range rep.Fits {
			for i, p := range f.Params {
				rows = append(rows, []string{f.Model.Name(), p.Name, report.Num(p.Value, 8), report.Num(f.StdErrors[i], 4),
					report.Num(f.R2, 6), report.Num(f.RMSRel, 4), report.Num(f.AICc, 6), fmt.Sprint(f.Model.Name() == rep.Best)})
			}
		}
		return report.CSV(s.Out, h, rows)
	}
	var rows [][]string
	for _, f := range rep.Fits {
		if f.Err != nil {
			rows = append(rows, []string{f.Model.Name(), "not fitted: " + f.Err.Error(), "", "", ""})
			continue
		}
		var ps []string
		for i, p := range f.Params {
			se := report.Num(f.StdErrors[i], 2)
			if se == "" {
				se = "not identified"
			}
			ps = append(ps, fmt.Sprintf("%s = %s ± %s", p.Name, report.Num(p.Value, 4), se))
		}
		best := ""
		if f.Model.Name() == rep.Best {
			best = " (best)"
		}
		rows = append(rows, []string{f.Model.Name() + best, strings.Join(ps, "\n"), report.Num(f.R2, 5), report.Num(f.RMSRel, 3), report.Num(f.AICc, 5)})
	}
	fmt.Fprintf(s.Out, "%d points, shear rate %s–%s 1/s; fitted on ln(stress)\n", rep.N, report.Num(rep.MinRate, 3), report.Num(rep.MaxRate, 3))
	if err := report.Table(s.Out, []string{"model", "parameters ± standard error (SI units)", "R² (ln τ)", "RMS relative error", "AICc"}, rows); err != nil {
		return err
	}
	fmt.Fprintf(s.Out, "Class: %s\n", rep.Class)
	report.Paragraph(s.Out, "  ", "Class rule: "+rep.Rule)
	report.List(s.Out, "Evidence", rep.Evidence)
	var ws []string
	ws = append(ws, rep.Warnings...)
	for _, f := range rep.Fits {
		for _, w := range f.Warnings {
			ws = append(ws, f.Model.Name()+": "+w)
		}
	}
	report.List(s.Out, "Warnings", ws)
	if o.save != "" {
		fmt.Fprintf(s.Out, "Saved the %s model as %s.\n", rep.Best, o.save)
	}
	return nil
}

func (o *fitOptions) saveMedium(rep media.FitReport, s Streams) error {
	if o.density == "" {
		return usagef("--save needs the fluid's --density, e.g. --density 1010kg/m3")
	}
	d, err := quantity.Parse(quantity.Density, o.density)
	if err != nil {
		return usagef("--density: %v", err)
	}
	var best media.ModelFit
	for _, f := range rep.Fits {
		if f.Model.Name() == rep.Best {
			best = f
		}
	}
	mf := media.MediumFile{Format: media.MediumFileFormat, Version: media.MediumFileVersion, Name: o.name, Density: d.SI,
		Model: rep.Best, Parameters: map[string]float64{}, StandardErrors: map[string]float64{},
		ShearRateRange: [2]float64{rep.MinRate, rep.MaxRate}, Class: rep.Class,
		Fit: &media.FitQuality{Points: rep.N, R2: best.R2, RMSRel: best.RMSRel, AICc: best.AICc, Residuals: "log stress"}}
	if mf.Name == "" {
		mf.Name = strings.TrimSuffix(o.save, ".json")
	}
	for i, p := range best.Params {
		mf.Parameters[p.Name] = p.Value
		if se := best.StdErrors[i]; !math.IsNaN(se) {
			mf.StandardErrors[p.Name] = se
		}
	}
	if o.temp != "" {
		t, err := quantity.Parse(quantity.Temperature, o.temp)
		if err != nil {
			return usagef("--temp: %v", err)
		}
		mf.TemperatureC = &t.SI
	}
	if o.relaxation != "" {
		t, err := quantity.Parse(quantity.Time, o.relaxation)
		if err != nil {
			return usagef("--relaxation-time: %v", err)
		}
		mf.RelaxationTime = &t.SI
	}
	return writeMediumFile(s.outs, o.save, mf)
}

// writeMediumFile checks a medium file and writes it atomically to path.
func writeMediumFile(outs *outputSet, path string, mf media.MediumFile) error {
	if err := mf.Check(); err != nil {
		return fmt.Errorf("%s", trimPkg(err))
	}
	af, err := outs.create(path)
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	defer af.abort()
	e := json.NewEncoder(af)
	e.SetIndent("", "  ")
	if err := e.Encode(mf); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, withoutPath(err))
	}
	if err := af.commit(); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, withoutPath(err))
	}
	return nil
}

type modelJSON struct {
	Model          string              `json:"model"`
	Parameters     map[string]float64  `json:"parameters"`
	StandardErrors map[string]*float64 `json:"standard_errors"`
	R2             *float64            `json:"r_squared"`
	RMSRel         *float64            `json:"rms_relative_error"`
	AICc           *float64            `json:"aicc"`
	Warnings       []string            `json:"warnings"`
	Error          string              `json:"error,omitempty"`
}

type fitJSON struct {
	Class     string      `json:"class"`
	ClassRule string      `json:"class_rule"`
	Best      string      `json:"best"`
	Evidence  []string    `json:"evidence"`
	Points    int         `json:"points"`
	RateRange [2]float64  `json:"shear_rate_range_1_s"`
	Residuals string      `json:"residuals"`
	Models    []modelJSON `json:"models"`
	Warnings  []string    `json:"warnings"`
}

func newFitJSON(rep media.FitReport) fitJSON {
	j := fitJSON{Class: rep.Class, ClassRule: rep.Rule, Best: rep.Best, Evidence: nonNil(rep.Evidence), Points: rep.N,
		RateRange: [2]float64{rep.MinRate, rep.MaxRate}, Residuals: "log stress", Warnings: nonNil(rep.Warnings)}
	for _, f := range rep.Fits {
		m := modelJSON{Model: f.Model.Name(), Parameters: map[string]float64{}, StandardErrors: map[string]*float64{},
			R2: report.Opt(f.R2), RMSRel: report.Opt(f.RMSRel), AICc: report.Opt(f.AICc), Warnings: nonNil(f.Warnings)}
		if f.Err != nil {
			m.Error = f.Err.Error()
		} else {
			for i, p := range f.Params {
				m.Parameters[p.Name] = p.Value
				m.StandardErrors[p.Name] = report.Opt(f.StdErrors[i])
			}
		}
		j.Models = append(j.Models, m)
	}
	return j
}
