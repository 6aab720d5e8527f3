package cli

import (
	"fmt"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// froudeTolerance is the relative Froude mismatch above which the caution
// about free surfaces is given (common practice, no source).
const froudeTolerance = 0.1

// scaleResult is the command's answer.
type scaleResult struct {
	plan     scalePlan
	organism regime.Groups
	rows     []scaleRow
	notes    []string
	cautions []string
}

func (r scaleResult) anyMatch() bool {
	for _, row := range r.rows {
		if row.Matches {
			return true
		}
	}
	return false
}

func (r scaleResult) anyUsable() bool {
	for _, row := range r.rows {
		if !row.Failed {
			return true
		}
	}
	return false
}

func newScaleResult(p scalePlan, rows []scaleRow) scaleResult {
	o := p.proto
	r := scaleResult{plan: p, rows: rows, organism: regime.Groups{
		Reynolds: regime.Reynolds(o.Speed, o.Length, o.Nu), Strouhal: regime.Strouhal(o.Frequency, o.Amplitude, o.Speed),
		ReducedFrequency: regime.ReducedFrequency(o.Frequency, o.Chord, o.Speed), Froude: regime.Froude(o.Speed, o.Length)}}
	if math.IsNaN(r.organism.Strouhal) {
		r.notes = append(r.notes, "no --freq and --amplitude: the stroke is not scaled (St not matched)")
	}
	if !math.IsNaN(p.target) {
		r.notes = append(r.notes, fmt.Sprintf("target: ν = %s m²/s in the tank, for %s", report.Num(p.target, 4), p.targetWhy))
		if !r.anyMatch() {
			r.notes = append(r.notes, r.whatWould())
		}
	}
	for _, row := range r.rows {
		if !row.Failed && (math.IsNaN(row.Colder) || math.IsNaN(row.Warmer)) {
			r.notes = append(r.notes, row.Fluid+": ν one degree colder or warmer is not known (the fluid's data stop there); hold the tank at the stated temperature")
		}
	}
	r.cautions = r.fluidCautions()
	if c := r.similarityCaution(); c != "" {
		r.cautions = append(r.cautions, c)
	}
	return r
}

// whatWould says which fluid ranges would cover the target.
func (r scaleResult) whatWould() string {
	p := r.plan
	gLo, gHi := media.GlycerolKinematicViscosity(0, p.tankC), media.GlycerolKinematicViscosity(1, p.tankC)
	sLo, sMu := media.SucroseProperties(0)
	sHiRho, sHiMu := media.SucroseProperties(media.SucroseMaxFraction())
	return fmt.Sprintf("no candidate reaches ν = %s m²/s (%s cSt). Glycerol–water covers %s to %s m²/s at %s °C (outside 0–100 °C Cheng's formula has no data); sucrose covers %s to %s m²/s at 20 °C; beyond these, an oil of that viscosity (silicone oils are sold by nominal viscosity in cSt): measure it at two temperatures and give --fluid oil --oil-point … --oil-density …; or change the model length or target speed",
		report.Num(p.target, 4), report.Num(p.target*1e6, 4), report.Num(gLo, 3), report.Num(gHi, 3), report.Num(p.tankC, 4),
		report.Num(sMu/sLo, 3), report.Num(sHiMu/sHiRho, 3))
}

// fluidCautions lists the warnings of the organism's medium and of every
// candidate fluid, each once, named by its fluid.
func (r scaleResult) fluidCautions() []string {
	var out []string
	seen := map[string]bool{}
	add := func(who string, ws []media.Warning) {
		for _, w := range ws {
			msg := who + ": " + strings.TrimPrefix(w.Message, "medium: ")
			if !seen[msg] {
				seen[msg] = true
				out = append(out, msg)
			}
		}
	}
	add("organism medium", r.plan.medium.Warnings)
	for _, row := range r.rows {
		add(row.Fluid, row.Props.Warnings)
	}
	return out
}

// similarityCaution warns about the group the mode leaves unmatched.
func (r scaleResult) similarityCaution() string {
	for _, row := range r.rows {
		if row.Failed || !(row.Matches || math.IsNaN(r.plan.target)) {
			continue
		}
		m := row.Sim.Model
		switch r.plan.mode {
		case regime.MatchReynolds:
			if !r.plan.medium.Gas && math.Abs(m.Froude/r.organism.Froude-1) > froudeTolerance {
				return fmt.Sprintf("Froude number not matched (organism %s, model %s in %s): the model holds only well away from a free surface; at the surface use --match froude or both",
					report.Num(r.organism.Froude, 3), report.Num(m.Froude, 3), row.Fluid)
			}
		case regime.MatchFroude:
			return fmt.Sprintf("Reynolds number not matched (organism %s, %s; model %s, %s in %s): drag and power coefficients carry over only within one regime",
				report.Num(r.organism.Reynolds, 4), regime.Classify(r.organism.Reynolds), report.Num(m.Reynolds, 4), regime.Classify(m.Reynolds), row.Fluid)
		}
	}
	return ""
}

func writeScaleResult(s Streams, format string, r scaleResult) error {
	switch format {
	case report.FormatJSON:
		return report.JSON(s.Out, newScaleJSON(r))
	case report.FormatCSV:
		return report.CSV(s.Out, scaleCSVHeaders, r.csvRows())
	}
	if err := report.Fields(s.Out, format, r.fields()); err != nil {
		return err
	}
	fmt.Fprintln(s.Out, "\nCandidate fluids in the model's tank:")
	if err := report.Table(s.Out, scaleTableHeaders, r.tableRows()); err != nil {
		return err
	}
	report.List(s.Out, "Notes", r.notes)
	report.List(s.Out, "Cautions", r.cautions)
	return nil
}

func (r scaleResult) fields() []report.Field {
	p, o := r.plan, r.plan.proto
	return []report.Field{
		report.F("length_m", "organism length (m)", o.Length, 4),
		report.F("speed_m_s", "organism speed (m/s)", o.Speed, 4),
		report.Maybe("frequency_Hz", "organism stroke frequency (Hz)", o.Frequency, 4),
		report.Maybe("amplitude_m", "organism stroke amplitude, peak to peak (m)", o.Amplitude, 4),
		{Key: "medium", Label: "organism medium", Value: mediumLine(p.medium)},
		report.F("kinematic_viscosity_m2_s", "organism medium ν (m²/s)", o.Nu, 4),
		report.F("reynolds", "Reynolds number (on the length)", r.organism.Reynolds, 4),
		report.Maybe("strouhal", "Strouhal number (peak-to-peak)", r.organism.Strouhal, 3),
		report.Maybe("reduced_frequency", "reduced frequency k (on the chord)", r.organism.ReducedFrequency, 3),
		report.F("froude", "Froude number (on the length)", r.organism.Froude, 3),
		report.F("model_length_m", "model length (m)", p.lm, 4),
		report.F("scale", "scale (model/organism length)", p.lm/o.Length, 4),
		{Key: "match", Label: "matched with St", Value: matchLabel(p)},
		report.Maybe("target_nu_m2_s", "target ν in the tank (m²/s)", p.target, 4),
		report.F("tank_temperature_C", "tank temperature (°C)", p.tankC, 4),
	}
}

func matchLabel(p scalePlan) string {
	if p.mode == regime.MatchFroude {
		return "Froude number"
	}
	if !math.IsNaN(p.target) && strings.HasPrefix(p.targetWhy, "Re and Fr") {
		return "Reynolds and Froude numbers"
	}
	return "Reynolds number"
}

var scaleTableHeaders = []string{"fluid", "mass fraction", "ρ (kg/m³)", "ν (m²/s)", "ν at −1/+1 °C (%)",
	"model speed (m/s)", "model stroke (Hz)", "model amplitude (m)", "Re model", "Fr model", "F model/F organism", "P model/P organism", "status"}

func pct(v float64) string {
	if math.IsNaN(v) {
		return "n/a"
	}
	return fmt.Sprintf("%+.3g", 100*v)
}

func (r scaleResult) tableRows() [][]string {
	var rows [][]string
	for _, row := range r.rows {
		if row.Failed {
			rows = append(rows, []string{row.Fluid, "", "", "", "", "", "", "", "", "", "", "", "cannot: " + row.Status})
			continue
		}
		m := row.Sim
		rows = append(rows, []string{row.Fluid, report.Num(row.Fraction, 4), report.Num(row.Props.Density, 5), report.Num(row.Props.KinematicViscosity, 4),
			pct(row.Colder) + " / " + pct(row.Warmer), report.Num(m.Speed, 4), report.Num(m.Frequency, 4), report.Num(m.Amplitude, 4),
			report.Num(m.Model.Reynolds, 4), report.Num(m.Model.Froude, 3), report.Num(m.ForceRatio, 4), report.Num(m.PowerRatio, 4), row.Status})
	}
	return rows
}

var scaleCSVHeaders = []string{"fluid", "mass_fraction", "tank_temperature_C", "density_kg_m3", "kinematic_viscosity_m2_s",
	"nu_change_minus_1C_percent", "nu_change_plus_1C_percent", "model_length_m", "model_speed_m_s", "model_frequency_Hz", "model_amplitude_m",
	"organism_reynolds", "model_reynolds", "organism_strouhal", "model_strouhal", "organism_froude", "model_froude",
	"force_ratio_model_over_organism", "power_ratio_model_over_organism", "time_ratio_model_over_organism", "target_nu_m2_s", "status", "cautions"}

func (r scaleResult) csvRows() [][]string {
	var rows [][]string
	caution := strings.Join(r.cautions, "; ")
	for _, row := range r.rows {
		m := row.Sim
		status := row.Status
		if row.Failed {
			status = "cannot: " + status
			m = regime.Similarity{Speed: math.NaN(), Frequency: math.NaN(), Amplitude: math.NaN(), ForceRatio: math.NaN(), PowerRatio: math.NaN(), TimeRatio: math.NaN(),
				Model: regime.Groups{Reynolds: math.NaN(), Strouhal: math.NaN(), Froude: math.NaN()}}
			row.Props.Density, row.Props.KinematicViscosity = math.NaN(), math.NaN()
		}
		rows = append(rows, []string{row.Fluid, report.Num(row.Fraction, 6), report.Num(r.plan.tankC, 6), report.Num(row.Props.Density, 6), report.Num(row.Props.KinematicViscosity, 6),
			csvPct(row.Colder), csvPct(row.Warmer), report.Num(r.plan.lm, 6), report.Num(m.Speed, 6), report.Num(m.Frequency, 6), report.Num(m.Amplitude, 6),
			report.Num(r.organism.Reynolds, 6), report.Num(m.Model.Reynolds, 6), report.Num(r.organism.Strouhal, 6), report.Num(m.Model.Strouhal, 6),
			report.Num(r.organism.Froude, 6), report.Num(m.Model.Froude, 6), report.Num(m.ForceRatio, 6), report.Num(m.PowerRatio, 6), report.Num(m.TimeRatio, 6),
			report.Num(r.plan.target, 6), status, caution})
	}
	return rows
}

func csvPct(v float64) string { return report.Num(100*v, 4) }

// scaleJSON is the scale model for scripts; names carry units.
type scaleJSON struct {
	Organism struct {
		LengthM            float64     `json:"length_m"`
		SpeedMS            float64     `json:"speed_m_s"`
		FrequencyHz        *float64    `json:"frequency_Hz"`
		AmplitudeM         *float64    `json:"amplitude_m"`
		Medium             string      `json:"medium"`
		KinematicViscosity float64     `json:"kinematic_viscosity_m2_s"`
		Density            float64     `json:"density_kg_m3"`
		Groups             dimlessJSON `json:"groups"`
	} `json:"organism"`
	ModelLengthM float64        `json:"model_length_m"`
	Scale        float64        `json:"scale"`
	Match        string         `json:"match"`
	TargetNu     *float64       `json:"target_nu_m2_s"`
	TankC        float64        `json:"tank_temperature_C"`
	Fluids       []scaleRowJSON `json:"fluids"`
	Notes        []string       `json:"notes"`
	Cautions     []string       `json:"cautions"`
}

type dimlessJSON struct {
	Reynolds         *float64 `json:"reynolds"`
	Strouhal         *float64 `json:"strouhal"`
	ReducedFrequency *float64 `json:"reduced_frequency"`
	Froude           *float64 `json:"froude"`
}

func newDimlessJSON(g regime.Groups) dimlessJSON {
	return dimlessJSON{report.Opt(g.Reynolds), report.Opt(g.Strouhal), report.Opt(g.ReducedFrequency), report.Opt(g.Froude)}
}

type scaleRowJSON struct {
	Fluid              string      `json:"fluid"`
	MassFraction       *float64    `json:"mass_fraction"`
	Density            *float64    `json:"density_kg_m3"`
	KinematicViscosity *float64    `json:"kinematic_viscosity_m2_s"`
	NuMinus1C          *float64    `json:"nu_change_minus_1C_percent"`
	NuPlus1C           *float64    `json:"nu_change_plus_1C_percent"`
	SpeedMS            *float64    `json:"model_speed_m_s"`
	FrequencyHz        *float64    `json:"model_frequency_Hz"`
	AmplitudeM         *float64    `json:"model_amplitude_m"`
	Model              dimlessJSON `json:"model"`
	ForceRatio         *float64    `json:"force_ratio_model_over_organism"`
	PowerRatio         *float64    `json:"power_ratio_model_over_organism"`
	TimeRatio          *float64    `json:"time_ratio_model_over_organism"`
	MatchesTarget      bool        `json:"matches_target"`
	Usable             bool        `json:"usable"`
	Status             string      `json:"status"`
	Methods            []string    `json:"methods"`
}

func newScaleJSON(r scaleResult) scaleJSON {
	var j scaleJSON
	p, o := r.plan, r.plan.proto
	j.Organism.LengthM, j.Organism.SpeedMS = o.Length, o.Speed
	j.Organism.FrequencyHz, j.Organism.AmplitudeM = report.Opt(o.Frequency), report.Opt(o.Amplitude)
	j.Organism.Medium, j.Organism.KinematicViscosity, j.Organism.Density = p.medium.Medium, o.Nu, o.Rho
	j.Organism.Groups = newDimlessJSON(r.organism)
	j.ModelLengthM, j.Scale, j.Match, j.TargetNu, j.TankC = p.lm, p.lm/o.Length, matchLabel(p), report.Opt(p.target), p.tankC
	for _, row := range r.rows {
		rj := scaleRowJSON{Fluid: row.Fluid, MassFraction: report.Opt(row.Fraction), MatchesTarget: row.Matches, Usable: !row.Failed, Status: row.Status, Methods: nonNil(row.Props.Methods)}
		if !row.Failed {
			m := row.Sim
			rj.Density, rj.KinematicViscosity = report.Opt(row.Props.Density), report.Opt(row.Props.KinematicViscosity)
			rj.NuMinus1C, rj.NuPlus1C = report.Opt(100*row.Colder), report.Opt(100*row.Warmer)
			rj.SpeedMS, rj.FrequencyHz, rj.AmplitudeM = report.Opt(m.Speed), report.Opt(m.Frequency), report.Opt(m.Amplitude)
			rj.Model = newDimlessJSON(m.Model)
			rj.ForceRatio, rj.PowerRatio, rj.TimeRatio = report.Opt(m.ForceRatio), report.Opt(m.PowerRatio), report.Opt(m.TimeRatio)
		}
		j.Fluids = append(j.Fluids, rj)
	}
	j.Notes, j.Cautions = nonNil(r.notes), nonNil(r.cautions)
	return j
}
