package media

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"strings"
)

// Medium file schema, version 1. A medium file describes a measured fluid:
//
//	{
//	  "format": "flowregime-medium",
//	  "version": 1,
//	  "name": "snail mucus, pedal",         // free text
//	  "density_kg_m3": 1010,
//	  "temperature_C": 20,                   // optional: of the measurement
//	  "model": "herschel-bulkley",           // one of ModelNames
//	  "parameters": {"yield_stress_Pa": 12, "consistency_Pa_sn": 1.5, "flow_index": 0.6},
//	  "standard_errors": {…},                // optional
//	  "shear_rate_range_1_s": [0.1, 300],    // measured range
//	  "fit": {"points": 20, "r_squared": 0.999, "rms_relative_error": 0.02,
//	          "aicc": -150, "residuals": "log stress"},   // optional
//	  "class": "yield-stress",               // optional
//	  "relaxation_time_s": 0.5,              // optional, for viscoelastic fluids
//	  "gas": false                           // optional, default false
//	}
//
// "gas": true says the fluid is a gas ([Properties.Gas]): organisms in it
// fly. It is what switches the physics, never "name". A file does not carry
// a pressure, so slip correction of settling particles is not applied to
// it. Readers from before this key refuse a file that sets it (unknown
// fields are an error), rather than treating a gas as a liquid.
//
// Version 2 adds one optional field, the change of viscosity with
// temperature (see [TemperatureDependence]); it needs "temperature_C":
//
//	"temperature_dependence": {"method": "arrhenius",
//	    "activation_energy_J_mol": 16500, "range_C": [15, 37]}
//
// Files without it are written as version 1, so older readers keep
// reading them. Unknown fields are an error, so a misspelt name is not
// silently ignored.
const (
	MediumFileFormat  = "flowregime-medium"
	MediumFileVersion = 1
	// MediumFileVersionTemperature is the version of files that carry a
	// temperature dependence, and the newest version read.
	MediumFileVersionTemperature = 2
)

// MediumFile is a measured fluid as stored on disk.
type MediumFile struct {
	Format         string             `json:"format"`
	Version        int                `json:"version"`
	Name           string             `json:"name"`
	Density        float64            `json:"density_kg_m3"`
	TemperatureC   *float64           `json:"temperature_C,omitempty"`
	Model          string             `json:"model"`
	Parameters     map[string]float64 `json:"parameters"`
	StandardErrors map[string]float64 `json:"standard_errors,omitempty"`
	ShearRateRange [2]float64         `json:"shear_rate_range_1_s"`
	Fit            *FitQuality        `json:"fit,omitempty"`
	Class          string             `json:"class,omitempty"`
	RelaxationTime *float64           `json:"relaxation_time_s,omitempty"`
	Gas            bool               `json:"gas,omitempty"`

	TemperatureDependence *TemperatureDependence `json:"temperature_dependence,omitempty"`
}

// FitQuality records how well the model fitted.
type FitQuality struct {
	Points    int     `json:"points"`
	R2        float64 `json:"r_squared"`
	RMSRel    float64 `json:"rms_relative_error"`
	AICc      float64 `json:"aicc"`
	Residuals string  `json:"residuals"`
}

// MaxMediumFileBytes is the largest medium file read; real ones are well
// under 2 kB.
const MaxMediumFileBytes = 1 << 20

// ReadMediumFile decodes and checks a medium file of at most
// [MaxMediumFileBytes].
func ReadMediumFile(r io.Reader) (MediumFile, error) {
	var f MediumFile
	b, err := io.ReadAll(io.LimitReader(r, MaxMediumFileBytes))
	if err != nil {
		return f, err
	}
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&f); err != nil {
		var se *json.SyntaxError
		if errors.As(err, &se) {
			return f, errorf("medium file is not valid JSON (at byte %d): %v", se.Offset, err)
		}
		return f, errorf("medium file: %v", err)
	}
	if dec.More() {
		return f, errorf("medium file has text after its JSON object")
	}
	return f, f.Check()
}

// Check validates the file's fields.
func (f MediumFile) Check() error {
	switch {
	case f.Format != MediumFileFormat:
		return errorf("not a medium file: \"format\" is %q, want %q", f.Format, MediumFileFormat)
	case f.Version < 1:
		return errorf("medium file has no valid \"version\" (want %d)", MediumFileVersion)
	case f.Version > MediumFileVersionTemperature:
		return errorf("medium file version %d is newer than this flowregime reads (%d); upgrade flowregime", f.Version, MediumFileVersionTemperature)
	case !(f.Density > 0) || math.IsInf(f.Density, 0):
		return errorf("medium file needs a positive \"density_kg_m3\"")
	case !(f.ShearRateRange[0] > 0) || !(f.ShearRateRange[1] >= f.ShearRateRange[0]) || math.IsInf(f.ShearRateRange[1], 0):
		return errorf("\"shear_rate_range_1_s\" must be [min, max] with 0 < min ≤ max")
	case f.RelaxationTime != nil && !(*f.RelaxationTime > 0):
		return errorf("\"relaxation_time_s\" must be positive")
	}
	if err := f.checkTemperature(); err != nil {
		return err
	}
	_, err := NewModel(f.Model, f.Parameters)
	return err
}

// checkTemperature validates the optional temperature dependence.
func (f MediumFile) checkTemperature() error {
	d := f.TemperatureDependence
	switch {
	case d == nil:
		return nil
	case f.Version < MediumFileVersionTemperature:
		return errorf("\"temperature_dependence\" needs \"version\": %d", MediumFileVersionTemperature)
	case f.TemperatureC == nil || !finite(*f.TemperatureC):
		return errorf("\"temperature_dependence\" needs \"temperature_C\", the temperature the model was fitted at")
	}
	return d.Check()
}

// MeasuredRheology is a fitted model with the range it was measured over.
type MeasuredRheology struct {
	Model
	MinRate, MaxRate float64 // 1/s
	RelaxationTime   float64 // s; NaN when not given
}

// Properties returns the measured fluid as a medium. Its dynamic viscosity
// is the apparent viscosity at the geometric mean of the measured shear
// rates; organisms use the apparent viscosity at their own shear rate.
func (f MediumFile) Properties() (Properties, error) {
	if err := f.Check(); err != nil {
		return Properties{}, err
	}
	m, _ := NewModel(f.Model, f.Parameters)
	p := blank(f.Name)
	if p.Medium == "" {
		p.Medium = "measured fluid"
	}
	p.TemperatureC, p.PressurePa = math.NaN(), math.NaN()
	if f.TemperatureC != nil {
		p.TemperatureC = *f.TemperatureC
	}
	p.Density = f.Density
	p.Gas = f.Gas
	ref := math.Sqrt(f.ShearRateRange[0] * f.ShearRateRange[1])
	p.DynamicViscosity = m.ApparentViscosity(ref)
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	mr := MeasuredRheology{Model: m, MinRate: f.ShearRateRange[0], MaxRate: f.ShearRateRange[1], RelaxationTime: math.NaN()}
	if f.RelaxationTime != nil {
		mr.RelaxationTime = *f.RelaxationTime
	}
	p.Rheology = mr
	var ps []string
	for _, q := range m.Params() {
		ps = append(ps, fmt.Sprintf("%s = %.4g", q.Name, q.Value))
	}
	method := fmt.Sprintf("rheology: %s model (%s) measured over %.3g–%.3g 1/s", f.Model, strings.Join(ps, ", "), f.ShearRateRange[0], f.ShearRateRange[1])
	if f.Fit != nil {
		method += fmt.Sprintf(", fit R² %.4g on %s from %d points", f.Fit.R2, f.Fit.Residuals, f.Fit.Points)
	}
	p.Methods = []string{method, fmt.Sprintf("dynamic viscosity shown at the geometric-mean measured shear rate, %.3g 1/s", ref)}
	return p, nil
}

// At returns the measured fluid as a medium under conditions c: at c's
// temperature when the file carries a temperature dependence (a warning
// says so when it does not); the other conditions cannot change it, and a
// warning says so when c sets any of them.
func (f MediumFile) At(c Conditions) (Properties, error) {
	c = c.stated()
	p, err := f.PropertiesAt(c.TemperatureC)
	if err != nil {
		return p, err
	}
	for _, v := range []float64{c.SalinityPractical, c.PressurePa, c.DepthM, c.AltitudeM, c.HumidityPercent} {
		if !math.IsNaN(v) {
			p.Warnings = append(p.Warnings, Warning{Code: WarnIgnored, Message: "medium: salinity, depth, pressure, altitude and humidity are ignored for a measured medium, whose properties are fixed by its file"})
			break
		}
	}
	return p, nil
}

// ExtrapolationWarning returns a warning when shear rate γ̇ lies outside the
// measured range of a measured fluid, else nil.
func (p Properties) ExtrapolationWarning(shearRate float64) *Warning {
	mr, ok := p.Rheology.(MeasuredRheology)
	if !ok || (shearRate >= mr.MinRate && shearRate <= mr.MaxRate) {
		return nil
	}
	return &Warning{Code: WarnExtrapolate, Message: fmt.Sprintf("medium: the organism's shear rate %.3g 1/s is outside the measured %.3g–%.3g 1/s; the %s model is extrapolated", shearRate, mr.MinRate, mr.MaxRate, mr.Name())}
}
