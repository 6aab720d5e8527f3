package media

import (
	"math"
	"sort"
)

// Model is a constitutive model of a fluid in steady simple shear: the
// shear stress τ (Pa) at shear rate γ̇ (1/s). Its apparent viscosity is
// τ/γ̇. Parameters are in SI units and named with their units, as written to
// medium files.
type Model interface {
	Name() string
	Stress(shearRate float64) float64
	ApparentViscosity(shearRate float64) float64
	Params() []Param
}

// Param is a named model parameter.
type Param struct {
	Name  string // with its unit, e.g. "consistency_Pa_sn"
	Value float64
}

// Model names as used in medium files and fit output.
const (
	ModelNewtonian       = "newtonian"
	ModelPowerLaw        = "power-law"
	ModelCross           = "cross"
	ModelCarreau         = "carreau"
	ModelCarreauYasuda   = "carreau-yasuda"
	ModelBingham         = "bingham"
	ModelHerschelBulkley = "herschel-bulkley"
	ModelCasson          = "casson"
)

// ModelNames lists every model in a fixed order, that of the model table.
var ModelNames = modelNames()

// Parameter names.
const (
	PViscosity   = "viscosity_Pa_s"
	PConsistency = "consistency_Pa_sn"
	PFlowIndex   = "flow_index"
	PYield       = "yield_stress_Pa"
	PPlastic     = "plastic_viscosity_Pa_s"
	PZero        = "zero_shear_viscosity_Pa_s"
	PInfinite    = "infinite_shear_viscosity_Pa_s"
	PTime        = "time_constant_s"
	PTransition  = "transition_exponent"
)

// Newtonian: τ = μ γ̇.
type Newtonian struct{ Mu float64 }

// PowerLaw (Ostwald 1925; de Waele 1923): τ = K γ̇ⁿ.
type PowerLaw struct{ K, N float64 }

// Cross (Cross 1965, J. Colloid Sci. 20, 417): (η − η∞)/(η₀ − η∞) = 1/(1 + (λγ̇)^m),
// with m the transition exponent.
type Cross struct{ Eta0, EtaInf, Lambda, M float64 }

// Carreau (Carreau 1972, Trans. Soc. Rheol. 16, 99):
// (η − η∞)/(η₀ − η∞) = [1 + (λγ̇)²]^((n−1)/2).
type Carreau struct{ Eta0, EtaInf, Lambda, N float64 }

// CarreauYasuda (Yasuda, Armstrong & Cohen 1981, Rheol. Acta 20, 163):
// (η − η∞)/(η₀ − η∞) = [1 + (λγ̇)^a]^((n−1)/a).
type CarreauYasuda struct{ Eta0, EtaInf, Lambda, N, A float64 }

// Bingham (Bingham 1916, Bull. US Bur. Stand. 13, 309): τ = τ_y + μ_p γ̇
// while flowing.
type Bingham struct{ TauY, MuP float64 }

// HerschelBulkley (Herschel & Bulkley 1926, Kolloid-Z. 39, 291):
// τ = τ_y + K γ̇ⁿ while flowing.
type HerschelBulkley struct{ TauY, K, N float64 }

// Casson (Casson 1959, in Mill (ed.), Rheology of Disperse Systems,
// Pergamon, 84–104): √τ = √τ_y + √(η_c γ̇).
type Casson struct{ TauY, EtaC float64 }

func (m Newtonian) Name() string             { return ModelNewtonian }
func (m Newtonian) Stress(g float64) float64 { return m.Mu * g }
func (m Newtonian) ApparentViscosity(float64) float64 {
	return m.Mu
}
func (m Newtonian) Params() []Param { return []Param{{PViscosity, m.Mu}} }

func (m PowerLaw) Name() string             { return ModelPowerLaw }
func (m PowerLaw) Stress(g float64) float64 { return m.K * math.Pow(g, m.N) }
func (m PowerLaw) ApparentViscosity(g float64) float64 {
	return m.K * math.Pow(g, m.N-1)
}
func (m PowerLaw) Params() []Param { return []Param{{PConsistency, m.K}, {PFlowIndex, m.N}} }

func (m Cross) Name() string { return ModelCross }
func (m Cross) ApparentViscosity(g float64) float64 {
	return m.EtaInf + (m.Eta0-m.EtaInf)/(1+math.Pow(m.Lambda*g, m.M))
}
func (m Cross) Stress(g float64) float64 { return m.ApparentViscosity(g) * g }
func (m Cross) Params() []Param {
	return []Param{{PZero, m.Eta0}, {PInfinite, m.EtaInf}, {PTime, m.Lambda}, {PTransition, m.M}}
}

func (m Carreau) Name() string { return ModelCarreau }
func (m Carreau) ApparentViscosity(g float64) float64 {
	x := m.Lambda * g
	return m.EtaInf + (m.Eta0-m.EtaInf)*math.Pow(1+x*x, (m.N-1)/2)
}
func (m Carreau) Stress(g float64) float64 { return m.ApparentViscosity(g) * g }
func (m Carreau) Params() []Param {
	return []Param{{PZero, m.Eta0}, {PInfinite, m.EtaInf}, {PTime, m.Lambda}, {PFlowIndex, m.N}}
}

func (m CarreauYasuda) Name() string { return ModelCarreauYasuda }
func (m CarreauYasuda) ApparentViscosity(g float64) float64 {
	return m.EtaInf + (m.Eta0-m.EtaInf)*math.Pow(1+math.Pow(m.Lambda*g, m.A), (m.N-1)/m.A)
}
func (m CarreauYasuda) Stress(g float64) float64 { return m.ApparentViscosity(g) * g }
func (m CarreauYasuda) Params() []Param {
	return []Param{{PZero, m.Eta0}, {PInfinite, m.EtaInf}, {PTime, m.Lambda}, {PFlowIndex, m.N}, {PTransition, m.A}}
}

func (m Bingham) Name() string             { return ModelBingham }
func (m Bingham) Stress(g float64) float64 { return m.TauY + m.MuP*g }
func (m Bingham) ApparentViscosity(g float64) float64 {
	return m.Stress(g) / g
}
func (m Bingham) Params() []Param { return []Param{{PYield, m.TauY}, {PPlastic, m.MuP}} }

func (m HerschelBulkley) Name() string             { return ModelHerschelBulkley }
func (m HerschelBulkley) Stress(g float64) float64 { return m.TauY + m.K*math.Pow(g, m.N) }
func (m HerschelBulkley) ApparentViscosity(g float64) float64 {
	return m.Stress(g) / g
}
func (m HerschelBulkley) Params() []Param {
	return []Param{{PYield, m.TauY}, {PConsistency, m.K}, {PFlowIndex, m.N}}
}

func (m Casson) Name() string { return ModelCasson }
func (m Casson) Stress(g float64) float64 {
	s := math.Sqrt(m.TauY) + math.Sqrt(m.EtaC*g)
	return s * s
}
func (m Casson) ApparentViscosity(g float64) float64 { return m.Stress(g) / g }
func (m Casson) Params() []Param                     { return []Param{{PYield, m.TauY}, {PPlastic, m.EtaC}} }

// A model is one entry of modelDefs, the one place that lists the models:
// its name, its parameters (names with units, in the order make takes
// them), its constructor, the parameters that are its yield stress or time
// constant, and how FitRheology searches for it (fit.go). A model with an
// infinite-shear viscosity (PInfinite) is checked to have η∞ ≤ η₀ and is
// fitted in η₀ − η∞.
type modelDef struct {
	name   string
	params []string
	make   func(p params) Model
	yield  func(Model) (float64, bool) // nil: no yield stress
	lambda func(Model) (float64, bool) // nil: no time constant
	search func(r searchRanges) []paramSpec
	starts func(pts []RheometerPoint) [][]float64
}

// params holds a model's parameters in its params order.
type params [5]float64

// field returns a getter of a value of models of type T.
func field[T Model](get func(T) float64) func(Model) (float64, bool) {
	return func(m Model) (float64, bool) {
		v, ok := m.(T)
		if !ok {
			return 0, false
		}
		return get(v), true
	}
}

var modelDefs = []modelDef{
	{name: ModelNewtonian, params: []string{PViscosity},
		make:   func(p params) Model { return Newtonian{p[0]} },
		search: func(r searchRanges) []paramSpec { return []paramSpec{pos(PViscosity)} },
		starts: func(pts []RheometerPoint) [][]float64 { return [][]float64{{geoMeanViscosity(pts)}} }},
	{name: ModelPowerLaw, params: []string{PConsistency, PFlowIndex},
		make:   func(p params) Model { return PowerLaw{p[0], p[1]} },
		search: func(r searchRanges) []paramSpec { return []paramSpec{pos(PConsistency), nSpec} },
		starts: func(pts []RheometerPoint) [][]float64 { k, n := logLogLine(pts); return [][]float64{{k, clampN(n)}} }},
	{name: ModelCross, params: []string{PZero, PInfinite, PTime, PTransition},
		make:   func(p params) Model { return Cross{p[0], p[1], p[2], p[3]} },
		lambda: field(func(m Cross) float64 { return m.Lambda }),
		search: func(r searchRanges) []paramSpec {
			return []paramSpec{r.eta0, r.etaInf, r.lambda, {name: PTransition, lo: 0.1, hi: 3}}
		},
		starts: plateauStarts(false)},
	{name: ModelCarreau, params: []string{PZero, PInfinite, PTime, PFlowIndex},
		make:   func(p params) Model { return Carreau{p[0], p[1], p[2], p[3]} },
		lambda: field(func(m Carreau) float64 { return m.Lambda }),
		search: func(r searchRanges) []paramSpec { return []paramSpec{r.eta0, r.etaInf, r.lambda, nSpec} },
		starts: plateauStarts(true)},
	{name: ModelCarreauYasuda, params: []string{PZero, PInfinite, PTime, PFlowIndex, PTransition},
		make:   func(p params) Model { return CarreauYasuda{p[0], p[1], p[2], p[3], p[4]} },
		lambda: field(func(m CarreauYasuda) float64 { return m.Lambda }),
		search: func(r searchRanges) []paramSpec {
			return []paramSpec{r.eta0, r.etaInf, r.lambda, nSpec, {name: PTransition, lo: 0.1, hi: 10}}
		},
		starts: plateauStartsA},
	{name: ModelBingham, params: []string{PYield, PPlastic},
		make:   func(p params) Model { return Bingham{p[0], p[1]} },
		yield:  field(func(m Bingham) float64 { return m.TauY }),
		search: func(r searchRanges) []paramSpec { return []paramSpec{pos(PYield), pos(PPlastic)} },
		starts: binghamStarts},
	{name: ModelHerschelBulkley, params: []string{PYield, PConsistency, PFlowIndex},
		make:   func(p params) Model { return HerschelBulkley{p[0], p[1], p[2]} },
		yield:  field(func(m HerschelBulkley) float64 { return m.TauY }),
		search: func(r searchRanges) []paramSpec { return []paramSpec{pos(PYield), pos(PConsistency), nSpec} },
		starts: hbStarts},
	{name: ModelCasson, params: []string{PYield, PPlastic},
		make:   func(p params) Model { return Casson{p[0], p[1]} },
		yield:  field(func(m Casson) float64 { return m.TauY }),
		search: func(r searchRanges) []paramSpec { return []paramSpec{pos(PYield), pos(PPlastic)} },
		starts: cassonStarts},
}

func modelNames() []string {
	names := make([]string, len(modelDefs))
	for i, d := range modelDefs {
		names[i] = d.name
	}
	return names
}

// modelDefOf returns the table entry of the named model.
func modelDefOf(name string) (*modelDef, bool) {
	for i := range modelDefs {
		if modelDefs[i].name == name {
			return &modelDefs[i], true
		}
	}
	return nil, false
}

// plateau reports whether the model has an infinite-shear viscosity, so
// that η∞ ≤ η₀ is required and fits work in η₀ − η∞.
func (d *modelDef) plateau() bool {
	for _, n := range d.params {
		if n == PInfinite {
			return true
		}
	}
	return false
}

// YieldStress returns the model's yield stress (Pa), 0 for models without one.
func YieldStress(m Model) float64 {
	return valueOf(m, func(d *modelDef) func(Model) (float64, bool) { return d.yield })
}

// timeConstant returns the model's time constant (s), 0 for models without one.
func timeConstant(m Model) float64 {
	return valueOf(m, func(d *modelDef) func(Model) (float64, bool) { return d.lambda })
}

// valueOf returns the value that the table's getter gives for m, or 0.
func valueOf(m Model, getter func(d *modelDef) func(Model) (float64, bool)) float64 {
	for i := range modelDefs {
		if g := getter(&modelDefs[i]); g != nil {
			if v, ok := g(m); ok {
				return v
			}
		}
	}
	return 0
}

// NewModel builds the named model from parameters keyed by their names,
// checking that every parameter is present, finite and physical.
func NewModel(name string, p map[string]float64) (Model, error) {
	d, ok := modelDefOf(name)
	if !ok {
		return nil, errorf("unknown rheology model %q; accepted: %v", name, ModelNames)
	}
	names := d.params
	var vals params
	for i, n := range names {
		v, ok := p[n]
		if !ok {
			return nil, errorf("model %s needs parameter %q", name, n)
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, errorf("parameter %q must be a finite number", n)
		}
		vals[i] = v
		if n == PYield || n == PInfinite {
			if v < 0 {
				return nil, errorf("parameter %q must not be negative, got %g", n, v)
			}
			continue
		}
		if !(v > 0) {
			return nil, errorf("parameter %q must be positive, got %g", n, v)
		}
	}
	extra := []string{}
	for k := range p {
		found := false
		for _, n := range names {
			found = found || k == n
		}
		if !found {
			extra = append(extra, k)
		}
	}
	if len(extra) > 0 {
		sort.Strings(extra)
		return nil, errorf("model %s has no parameter %v; it takes %v", name, extra, names)
	}
	if d.plateau() && p[PInfinite] > p[PZero] {
		return nil, errorf("infinite-shear viscosity %g Pa·s exceeds zero-shear viscosity %g Pa·s", p[PInfinite], p[PZero])
	}
	return d.make(vals), nil
}
