package cli

import (
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/regime"
)

// calcJSON is the object `calc --format json` prints; scripts read these names.
type calcJSON struct {
	Reynolds         float64    `json:"reynolds"`
	ReynoldsLength   string     `json:"reynolds_length"`
	Regime           string     `json:"regime"`
	BoundaryLayer    string     `json:"boundary_layer,omitempty"`
	Strouhal         *float64   `json:"strouhal"`
	StrouhalBand     string     `json:"strouhal_band,omitempty"`
	AdvanceRatio     *float64   `json:"advance_ratio,omitempty"`
	ReducedFrequency *float64   `json:"reduced_frequency,omitempty"`
	Drag             dragJSON   `json:"drag"`
	Power            powerJSON  `json:"power"`
	CoastTime        *float64   `json:"coasting_time_s,omitempty"`
	CoastDistance    *float64   `json:"coasting_distance_m,omitempty"`
	Peclet           *float64   `json:"peclet,omitempty"`
	GeneralizedRe    *float64   `json:"generalized_reynolds,omitempty"`
	BinghamNumber    *float64   `json:"bingham_number,omitempty"`
	Deborah          *float64   `json:"deborah,omitempty"`
	Weissenberg      *float64   `json:"weissenberg,omitempty"`
	Diffusivity      *float64   `json:"diffusivity_m2_s,omitempty"`
	Medium           mediumJSON `json:"medium"`
	Warnings         []string   `json:"warnings"`
}

type dragJSON struct {
	Law           string         `json:"law"`
	Source        string         `json:"source"`
	Coefficient   float64        `json:"coefficient"`
	ReferenceArea float64        `json:"reference_area_m2"`
	AreaName      string         `json:"reference_area"`
	Reynolds      float64        `json:"reynolds"`
	ReynoldsBasis string         `json:"reynolds_on"`
	Force         float64        `json:"force_N"`
	InRange       bool           `json:"in_range"`
	Estimates     []estimateJSON `json:"estimates"`
}

type estimateJSON struct {
	Law         string  `json:"law"`
	Force       float64 `json:"force_N"`
	Coefficient float64 `json:"coefficient"`
	Reynolds    float64 `json:"reynolds"`
	Basis       string  `json:"reynolds_on"`
	InRange     bool    `json:"in_range"`
	Range       string  `json:"range"`
}

type powerJSON struct {
	Kind            string   `json:"kind"`
	Total           float64  `json:"total_W"`
	Efficiency      *float64 `json:"efficiency,omitempty"`
	Induced         *float64 `json:"induced_W,omitempty"`
	Parasite        *float64 `json:"parasite_W,omitempty"`
	Profile         *float64 `json:"profile_W,omitempty"`
	HoverInduced    *float64 `json:"hover_induced_W,omitempty"`
	InducedVelocity *float64 `json:"induced_velocity_m_s,omitempty"`
	DiscArea        *float64 `json:"disc_area_m2,omitempty"`
	ProfileCD       *float64 `json:"profile_drag_coefficient,omitempty"`
	ChordReynolds   *float64 `json:"chord_reynolds,omitempty"`
}

func newCalcJSON(r regime.Result) calcJSON {
	c := r.Drag.Chosen
	j := calcJSON{
		Reynolds: r.Reynolds, ReynoldsLength: "length (the diameter for a sphere)", Regime: r.Regime,
		BoundaryLayer: r.BoundaryLayer, Strouhal: report.Opt(r.Strouhal), StrouhalBand: r.StrouhalBand,
		AdvanceRatio: report.Opt(r.AdvanceRatio), ReducedFrequency: report.Opt(r.ReducedFrequency),
		Drag: dragJSON{Law: c.Law, Source: c.Source, Coefficient: c.Coefficient, ReferenceArea: c.ReferenceArea,
			AreaName: c.AreaName, Reynolds: c.Reynolds, ReynoldsBasis: c.Basis, Force: c.Force, InRange: c.InRange},
		Power:     powerJSON{Kind: r.Power.Kind, Total: r.Power.Total},
		CoastTime: report.Opt(r.CoastTime), CoastDistance: report.Opt(r.CoastDistance),
		Peclet: report.Opt(r.Peclet), Diffusivity: report.Opt(r.Diffusivity),
		Medium:        newMediumJSON(r.Medium),
		GeneralizedRe: report.Opt(r.GeneralizedRe), BinghamNumber: report.Opt(r.BinghamNumber),
		Deborah: report.Opt(r.Deborah), Weissenberg: report.Opt(r.Weissenberg),
		Warnings: nonNil(warningTexts(r.Warnings)),
	}
	for _, e := range r.Drag.Estimates {
		j.Drag.Estimates = append(j.Drag.Estimates, estimateJSON{Law: e.Law, Force: e.Force, Coefficient: e.Coefficient,
			Reynolds: e.Reynolds, Basis: e.Basis, InRange: e.InRange, Range: regime.Law{ReMin: e.ReMin, ReMax: e.ReMax}.Range()})
	}
	if r.Power.Kind != regime.PowerFlight {
		j.Power.Efficiency = report.Opt(r.Power.Efficiency)
	}
	if f := r.Power.Flight; f != nil {
		j.Power.Induced, j.Power.Parasite, j.Power.Profile = report.Opt(f.Induced), report.Opt(f.Parasite), report.Opt(f.Profile)
		j.Power.HoverInduced, j.Power.InducedVelocity = report.Opt(f.HoverInduced), report.Opt(f.InducedVelocity)
		j.Power.DiscArea, j.Power.ProfileCD = report.Opt(f.DiscArea), report.Opt(f.ProfileCD)
		j.Power.ChordReynolds = report.Opt(f.ChordReynolds)
	}
	if !r.Medium.Newtonian() {
		j.Medium.ShearRate, j.Medium.ApparentViscosity = report.Opt(r.ShearRate), report.Opt(r.Viscosity)
	}
	return j
}
