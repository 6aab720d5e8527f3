package cli

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/regime"
)

// calcJSON is the object `calc --format json` prints; scripts read these names.
type calcJSON struct {
	Reynolds         float64                 `json:"reynolds"`
	ReynoldsLength   string                  `json:"reynolds_length"`
	Regime           string                  `json:"regime"`
	BoundaryLayer    string                  `json:"boundary_layer,omitempty"`
	Strouhal         *float64                `json:"strouhal"`
	StrouhalBand     string                  `json:"strouhal_band,omitempty"`
	AdvanceRatio     *float64                `json:"advance_ratio,omitempty"`
	ReducedFrequency *float64                `json:"reduced_frequency,omitempty"`
	Drag             dragJSON                `json:"drag"`
	Power            powerJSON               `json:"power"`
	CoastTime        *float64                `json:"coasting_time_s,omitempty"`
	CoastDistance    *float64                `json:"coasting_distance_m,omitempty"`
	CoastStops       *bool                   `json:"coasting_stops,omitempty"`
	Peclet           *float64                `json:"peclet,omitempty"`
	GeneralizedRe    *float64                `json:"generalized_reynolds,omitempty"`
	BinghamNumber    *float64                `json:"bingham_number,omitempty"`
	Deborah          *float64                `json:"deborah,omitempty"`
	Weissenberg      *float64                `json:"weissenberg,omitempty"`
	Diffusivity      *float64                `json:"diffusivity_m2_s,omitempty"`
	Medium           mediumJSON              `json:"medium"`
	Warnings         []string                `json:"warnings"`
	Uncertainty      *uncertaintyJSON        `json:"uncertainty,omitempty"`
	Inputs           map[string]resolvedJSON `json:"inputs"`  // as used, in SI
	Assumed          []assumedJSON           `json:"assumed"` // defaults that changed the result
}

type bandJSON struct {
	Median *float64 `json:"median"`
	Low95  *float64 `json:"low95"`
	High95 *float64 `json:"high95"`
}

type uncertaintyJSON struct {
	Method            string             `json:"method"`
	Draws             int                `json:"draws,omitempty"`
	Seed              *uint64            `json:"seed,omitempty"`
	FailedDraws       int                `json:"failed_draws,omitempty"`
	Reynolds          bandJSON           `json:"reynolds"`
	Strouhal          bandJSON           `json:"strouhal"`
	Drag              bandJSON           `json:"drag_N"`
	Power             bandJSON           `json:"power_W"`
	RegimeProbability map[string]float64 `json:"regime_probability"`
	LawProbability    map[string]float64 `json:"drag_law_probability,omitempty"`
}

func newBand(b regime.Band) bandJSON {
	return bandJSON{report.Opt(b.Median), report.Opt(b.Low95), report.Opt(b.High95)}
}

func newUncertaintyJSON(u *regime.Uncertainty) *uncertaintyJSON {
	if u == nil {
		return nil
	}
	j := &uncertaintyJSON{Method: u.Method, Draws: u.Draws, FailedDraws: u.Failed, Reynolds: newBand(u.Reynolds), Strouhal: newBand(u.Strouhal),
		Drag: newBand(u.Drag), Power: newBand(u.Power), RegimeProbability: u.RegimeProbability, LawProbability: u.LawProbability}
	if u.Method == regime.MethodMonteCarlo {
		seed := u.Seed
		j.Seed = &seed
	}
	return j
}

// uncertaintyFields lists the uncertainty for tables and CSV.
func uncertaintyFields(u *regime.Uncertainty) []report.Field {
	if u == nil {
		return nil
	}
	band := func(key, label string, b regime.Band) []report.Field {
		if math.IsNaN(b.Median) {
			return nil
		}
		return []report.Field{{Key: key + "_median", Label: label + ", median [95 % interval]",
			Value: fmt.Sprintf("%s [%s, %s]", report.Num(b.Median, 4), report.Num(b.Low95, 4), report.Num(b.High95, 4))}}
	}
	method := u.Method
	if u.Method == regime.MethodMonteCarlo {
		method = fmt.Sprintf("Monte Carlo, %d draws, seed %d", u.Draws, u.Seed)
	}
	fs := []report.Field{{Key: "uncertainty_method", Label: "uncertainty", Value: method}}
	fs = append(fs, band("reynolds", "  Reynolds number", u.Reynolds)...)
	fs = append(fs, band("strouhal", "  Strouhal number", u.Strouhal)...)
	fs = append(fs, band("drag_N", "  drag (N)", u.Drag)...)
	fs = append(fs, band("power_W", "  power (W)", u.Power)...)
	for _, name := range regime.Regimes() {
		if p, ok := u.RegimeProbability[name]; ok {
			fs = append(fs, report.F("p_"+name, "  probability "+name, p, 3))
		}
	}
	laws := make([]string, 0, len(u.LawProbability))
	for l := range u.LawProbability {
		laws = append(laws, l)
	}
	sort.Strings(laws)
	for _, l := range laws {
		fs = append(fs, report.F("p_law_"+strings.ReplaceAll(l, " ", "_"), "  probability of law "+l, u.LawProbability[l], 3))
	}
	return fs
}

type dragJSON struct {
	Law           string  `json:"law"`
	Source        string  `json:"source"`
	Coefficient   float64 `json:"coefficient"`
	ReferenceArea float64 `json:"reference_area_m2"`
	AreaName      string  `json:"reference_area"`
	Reynolds      float64 `json:"reynolds"`
	ReynoldsBasis string  `json:"reynolds_on"`
	Force         float64 `json:"force_N"`
	InRange       bool    `json:"in_range"`
	// The bracket of the drag (see regime.Estimate), absent without one.
	Low         *float64       `json:"drag_low_N,omitempty"`
	High        *float64       `json:"drag_high_N,omitempty"`
	BracketFrom string         `json:"bracket_from,omitempty"`
	Estimates   []estimateJSON `json:"estimates"`
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
	ProfileMethod   string   `json:"profile_method,omitempty"`
	ProfileRatio    *float64 `json:"profile_power_ratio,omitempty"`
	BodyCD          *float64 `json:"body_drag_coefficient,omitempty"`
	SinkSpeed       *float64 `json:"sink_speed_m_s,omitempty"`
	GlideRatio      *float64 `json:"glide_ratio,omitempty"`
}

func newCalcJSON(r regime.Result) calcJSON {
	c := r.Drag.Chosen
	j := calcJSON{
		Reynolds: r.Reynolds, ReynoldsLength: reynoldsLength(r), Regime: r.Regime,
		BoundaryLayer: r.BoundaryLayer, Strouhal: report.Opt(r.Strouhal), StrouhalBand: r.StrouhalBand,
		AdvanceRatio: report.Opt(r.AdvanceRatio), ReducedFrequency: report.Opt(r.ReducedFrequency),
		Drag: dragJSON{Law: c.Law, Source: c.Source, Coefficient: c.Coefficient, ReferenceArea: c.ReferenceArea,
			AreaName: c.AreaName, Reynolds: c.Reynolds, ReynoldsBasis: c.Basis, Force: c.Force, InRange: c.InRange,
			Low: report.Opt(c.Low), High: report.Opt(c.High), BracketFrom: c.BracketFrom},
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
	if r.Power.Flight == nil {
		j.Power.Efficiency = report.Opt(r.Power.Efficiency)
	}
	if f := r.Power.Flight; f != nil {
		j.Power.Induced, j.Power.Parasite, j.Power.Profile = report.Opt(f.Induced), report.Opt(f.Parasite), report.Opt(f.Profile)
		if !f.Gliding {
			j.Power.HoverInduced = report.Opt(f.HoverInduced)
		}
		j.Power.InducedVelocity = report.Opt(f.InducedVelocity)
		j.Power.DiscArea, j.Power.ProfileCD = report.Opt(f.DiscArea), report.Opt(f.ProfileCD)
		j.Power.ChordReynolds = report.Opt(f.ChordReynolds)
		j.Power.ProfileMethod, j.Power.ProfileRatio, j.Power.BodyCD = f.ProfileMethod, report.Opt(f.ProfileRatio), report.Opt(f.BodyDragCoefficient)
		j.Power.SinkSpeed, j.Power.GlideRatio = report.Opt(f.SinkSpeed), report.Opt(f.GlideRatio)
	}
	if !math.IsNaN(r.CoastTime) {
		j.CoastStops = &r.CoastStops
	}
	if !r.Medium.Newtonian() {
		j.Medium.ShearRate, j.Medium.ApparentViscosity = report.Opt(r.ShearRate), report.Opt(r.Viscosity)
	}
	return j
}

// reynoldsLength names the length the reported Reynolds number is on.
func reynoldsLength(r regime.Result) string {
	if r.Shape == regime.Sphere || r.Shape == regime.Cylinder {
		return "diameter"
	}
	return "length"
}
