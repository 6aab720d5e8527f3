package media

import (
	"math"
)

// Standard values used across the package.
const (
	StandardGravity    = 9.80665         // m/s², CGPM 1901; ISO 80000-3
	StandardPressurePa = 101325.0        // Pa, one standard atmosphere
	ZeroCelsiusK       = 273.15          // K
	saltToPractical    = 35.0 / 35.16504 // SP per (g/kg) of reference-composition salinity, Millero et al. 2008
)

// Warning says that a method was used outside its published range, or that a
// convention may surprise. Code is a short stable kind for scripts and
// summaries; Message is a full sentence for people.
type Warning struct {
	Code    string
	Message string
	Detail  Detail // the value at fault, kept even without Message
}

// Detail is a warning's reason in a few words with its value, for a table
// cell: Quantity, Value (formatted only when read) with Unit, and Relation,
// e.g. "strouhal" 2.08 "" "> 1". It holds no formatted text, so batch work
// that never reads it pays nothing for it.
type Detail struct {
	Quantity string
	Value    float64
	Unit     string
	Relation string
}

// addDetailed is [addWarning] with the warning's [Detail], which is kept
// even when brief.
func addDetailed(ws *[]Warning, brief bool, code string, d Detail, msg func() string) {
	w := Warning{Code: code, Detail: d}
	if !brief {
		w.Message = msg()
	}
	*ws = append(*ws, w)
}

func (w Warning) String() string { return w.Message }

// Warning codes.
const (
	WarnOutOfRange  = "medium-out-of-range"
	WarnExtrapolate = "shear-rate-extrapolated"
	WarnIgnored     = "conditions-ignored"
)

// addWarning appends a warning with its code to ws, and with its text from
// msg unless brief: work that reads only the codes, such as a batch over a
// survey, formats nothing.
func addWarning(ws *[]Warning, brief bool, code string, msg func() string) {
	w := Warning{Code: code}
	if !brief {
		w.Message = msg()
	}
	*ws = append(*ws, w)
}

// Rheology is a constitutive model of a non-Newtonian fluid: it gives the
// apparent viscosity (Pa·s) at a shear rate (1/s).
type Rheology interface {
	ApparentViscosity(shearRate float64) float64
}

// Properties is a fluid at fixed conditions.
type Properties struct {
	Medium             string  // "air", "freshwater", "seawater" or a measured fluid's name; for people only: physics reads the properties
	TemperatureC       float64 // °C (ITS-90)
	PressurePa         float64 // absolute pressure, Pa
	Density            float64 // kg/m³
	DynamicViscosity   float64 // Pa·s; for a non-Newtonian fluid, at its reference shear rate
	KinematicViscosity float64 // m²/s

	// Conditions that only some media have; NaN when not applicable.
	SalinityPractical float64 // practical salinity SP (PSS-78), unitless
	SalinityAbsolute  float64 // reference-composition salinity SR, g/kg
	SeaPressureDbar   float64 // absolute pressure less one standard atmosphere, dbar
	DepthM            float64 // depth below the surface, m
	AltitudeM         float64 // geometric altitude, m
	GeopotentialM     float64 // geopotential height, m'
	HumidityPercent   float64 // relative humidity, %

	// Gas is true for a gas (the built-in air, or a medium file that says
	// "gas": true): organisms in it fly, so flight power and the flyers'
	// Strouhal screen apply, and settling particles slip (Cunningham) when
	// the temperature and pressure are known. Physics reads this, never
	// the name.
	Gas bool

	// Water is true for the built-in fresh and sea water: the solvent is
	// water, so dissolved oxygen's diffusivity in water applies (scaled by
	// viscosity for salt). Physics reads this, never the name.
	Water bool

	Rheology Rheology // nil for a Newtonian fluid

	Methods  []string
	Warnings []Warning
	Assumed  []Default // conditions Lookup filled in because they were not given
}

// ApparentViscosity returns the viscosity in Pa·s at the given shear rate
// (1/s). A Newtonian fluid returns its dynamic viscosity at any shear rate.
func (p Properties) ApparentViscosity(shearRate float64) float64 {
	if p.Rheology == nil {
		return p.DynamicViscosity
	}
	return p.Rheology.ApparentViscosity(shearRate)
}

// Newtonian reports whether the fluid's viscosity is independent of shear rate.
func (p Properties) Newtonian() bool { return p.Rheology == nil }

func blank(name string) Properties {
	nan := math.NaN()
	return Properties{
		Medium: name, SalinityPractical: nan, SalinityAbsolute: nan, SeaPressureDbar: nan,
		DepthM: nan, AltitudeM: nan, GeopotentialM: nan, HumidityPercent: nan,
	}
}

// finite reports whether every value is a finite number.
func finite(vs ...float64) bool {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// addMethod notes a method used, unless brief.
func (p *Properties) addMethod(brief bool, note func() string) {
	if !brief {
		p.Methods = append(p.Methods, note())
	}
}
