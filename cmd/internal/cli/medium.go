package cli

import (
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/spf13/cobra"
)

type mediumOptions struct {
	medium string
	flags  mediumFlags
	format string
}

// newMediumCmd builds medium; a test passes runF to receive the checked
// options instead of running.
func newMediumCmd(s Streams, runF func(*mediumOptions) error) *cobra.Command {
	o := &mediumOptions{}
	cmd := &cobra.Command{
		Use:   "medium {air | freshwater | seawater | glycerol:<mass fraction> | sucrose:<mass fraction> | FILE.json}",
		Short: "Density and viscosity of air, fresh water, sea water or a measured fluid",
		Long: `Print the density, dynamic viscosity and kinematic viscosity of a medium at
the stated conditions, with the published methods used and a warning for
every condition outside a method's published range. A medium file written by
'flowregime fit --save' shows the measured fluid: its model, parameters and
measured shear-rate range.
` + mediumFlagHelp,
		Example: `  flowregime medium seawater --temp 12C --salinity 34.5psu --depth 40m
  flowregime medium freshwater --temp 4C --format json
  flowregime medium air --altitude 2500m --humidity 60%
  flowregime medium glycerol:85% --temp 22C`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) != 1 {
				return usagef("medium needs one argument, the medium: %s, %s, or a medium file (.json)", strings.Join(media.Kinds, ", "), strings.Join(media.LabKinds, ", "))
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.medium = args[0]
			if err := report.CheckFormat(o.format); err != nil {
				return usageError{err}
			}
			if runF != nil {
				return runF(o)
			}
			return runMedium(o, s)
		},
	}
	o.flags.bind(cmd.Flags())
	cmd.Flags().StringVar(&o.format, "format", report.FormatTable, "output: table, json or csv")
	return cmd
}

func runMedium(o *mediumOptions, s Streams) error {
	p, err := o.flags.lookup("medium", o.medium)
	if err != nil {
		return err
	}
	switch o.format {
	case report.FormatJSON:
		return report.JSON(s.Out, newMediumJSON(p))
	case report.FormatCSV:
		fs := append(mediumFields(p),
			report.Field{Key: "methods", Value: strings.Join(p.Methods, "; ")},
			report.Field{Key: "warnings", Value: strings.Join(warningTexts(p.Warnings), "; ")})
		return report.Fields(s.Out, o.format, fs)
	}
	if err := report.Fields(s.Out, o.format, mediumFields(p)); err != nil {
		return err
	}
	report.List(s.Out, "Methods", p.Methods)
	report.List(s.Out, "Warnings", warningTexts(p.Warnings))
	return nil
}

// mediumJSON is the medium object read by scripts; names carry units.
type mediumJSON struct {
	Medium             string        `json:"medium"`
	TemperatureC       *float64      `json:"temperature_C"`
	PressurePa         *float64      `json:"pressure_Pa"`
	SeaPressureDbar    *float64      `json:"sea_pressure_dbar,omitempty"`
	DepthM             *float64      `json:"depth_m,omitempty"`
	AltitudeM          *float64      `json:"altitude_m,omitempty"`
	GeopotentialM      *float64      `json:"geopotential_height_m,omitempty"`
	HumidityPercent    *float64      `json:"relative_humidity_percent,omitempty"`
	SalinityPractical  *float64      `json:"salinity_practical,omitempty"`
	SalinityAbsolute   *float64      `json:"salinity_reference_g_kg,omitempty"`
	Density            float64       `json:"density_kg_m3"`
	DynamicViscosity   float64       `json:"dynamic_viscosity_Pa_s"`
	KinematicViscosity float64       `json:"kinematic_viscosity_m2_s"`
	ShearRate          *float64      `json:"shear_rate_1_s,omitempty"`
	ApparentViscosity  *float64      `json:"apparent_viscosity_Pa_s,omitempty"`
	Rheology           *rheologyJSON `json:"rheology,omitempty"`
	Methods            []string      `json:"methods"`
	Warnings           []string      `json:"warnings"`
}

func newMediumJSON(p media.Properties) mediumJSON {
	return mediumJSON{
		Medium: p.Medium, TemperatureC: report.Opt(p.TemperatureC), PressurePa: report.Opt(p.PressurePa),
		SeaPressureDbar: report.Opt(p.SeaPressureDbar), DepthM: report.Opt(p.DepthM),
		AltitudeM: report.Opt(p.AltitudeM), GeopotentialM: report.Opt(p.GeopotentialM),
		HumidityPercent: report.Opt(p.HumidityPercent), SalinityPractical: report.Opt(p.SalinityPractical),
		SalinityAbsolute: report.Opt(p.SalinityAbsolute),
		Density:          p.Density, DynamicViscosity: p.DynamicViscosity, KinematicViscosity: p.KinematicViscosity,
		Methods: nonNil(p.Methods), Warnings: nonNil(warningTexts(p.Warnings)),
		Rheology: newRheologyJSON(p),
	}
}

// rheologyJSON describes a measured fluid's model.
type rheologyJSON struct {
	Model          string             `json:"model"`
	Parameters     map[string]float64 `json:"parameters"`
	ShearRateRange [2]float64         `json:"shear_rate_range_1_s"`
	RelaxationTime *float64           `json:"relaxation_time_s,omitempty"`
}

func newRheologyJSON(p media.Properties) *rheologyJSON {
	mr, ok := p.Rheology.(media.MeasuredRheology)
	if !ok {
		return nil
	}
	r := &rheologyJSON{Model: mr.Name(), Parameters: map[string]float64{}, ShearRateRange: [2]float64{mr.MinRate, mr.MaxRate}, RelaxationTime: report.Opt(mr.RelaxationTime)}
	for _, q := range mr.Params() {
		r.Parameters[q.Name] = q.Value
	}
	return r
}

// mediumFields lists the medium's conditions and properties with units;
// conditions that do not apply to the medium are left out.
func mediumFields(p media.Properties) []report.Field {
	fs := []report.Field{
		{Key: "medium", Label: "medium", Value: p.Medium},
		report.Maybe("temperature_C", "temperature (°C)", p.TemperatureC, 5),
		report.Maybe("pressure_Pa", "absolute pressure (Pa)", p.PressurePa, 7),
		report.Maybe("sea_pressure_dbar", "sea pressure (dbar)", p.SeaPressureDbar, 6),
		report.Maybe("depth_m", "depth (m)", p.DepthM, 6),
		report.Maybe("altitude_m", "geometric altitude (m)", p.AltitudeM, 6),
		report.Maybe("geopotential_height_m", "geopotential height (m')", p.GeopotentialM, 6),
		report.Maybe("relative_humidity_percent", "relative humidity (%)", p.HumidityPercent, 4),
		report.Maybe("salinity_practical", "practical salinity (PSS-78)", p.SalinityPractical, 6),
		report.Maybe("salinity_reference_g_kg", "reference-composition salinity (g/kg)", p.SalinityAbsolute, 6),
	}
	fs = append(fs,
		report.F("density_kg_m3", "density (kg/m³)", p.Density, 7),
		report.F("dynamic_viscosity_Pa_s", "dynamic viscosity (Pa·s)", p.DynamicViscosity, 5),
		report.F("kinematic_viscosity_m2_s", "kinematic viscosity (m²/s)", p.KinematicViscosity, 5),
	)
	if mr, ok := p.Rheology.(media.MeasuredRheology); ok {
		fs = append(fs, report.Field{Key: "model", Label: "rheology model", Value: mr.Name()})
		for _, q := range mr.Params() {
			fs = append(fs, report.F(q.Name, "  "+q.Name, q.Value, 5))
		}
		fs = append(fs, report.F("shear_rate_min_1_s", "measured from (1/s)", mr.MinRate, 4), report.F("shear_rate_max_1_s", "measured to (1/s)", mr.MaxRate, 4))
		fs = append(fs, report.Maybe("relaxation_time_s", "relaxation time (s)", mr.RelaxationTime, 4))
	}
	return fs
}

func warningTexts(ws []media.Warning) []string {
	out := make([]string, len(ws))
	for i, w := range ws {
		out[i] = w.Message
	}
	return out
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// mediumLine summarises a medium in one line under a result table.
func mediumLine(m media.Properties) string {
	s := m.Medium
	if !math.IsNaN(m.TemperatureC) {
		s += " at " + report.Num(m.TemperatureC, 4) + " °C"
	}
	s += ": ρ = " + report.Num(m.Density, 6) + " kg/m³, μ = " + report.Num(m.DynamicViscosity, 5) + " Pa·s"
	if !m.Newtonian() {
		s += " at its reference shear rate (organisms use the apparent viscosity at their own)"
	}
	for _, meth := range m.Methods {
		if strings.HasPrefix(meth, "rheology:") {
			s += "; " + meth
		}
	}
	return s
}
