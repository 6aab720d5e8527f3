package media

import (
	"fmt"
	"math"
	"sort"
)

// GasConstant is the molar gas constant, J/(mol·K) (CODATA 2018; exact in
// the SI since 2019).
const GasConstant = 8.314462618

// Ways a medium file states how its viscosity changes with temperature.
const (
	TempArrhenius  = "arrhenius"
	TempTable      = "table"
	TempWaterRatio = "water-ratio"
)

// TemperatureDependence says how a measured fluid's viscosity changes with
// temperature. Every viscosity of the fitted model, and every stress at a
// given shear rate, is multiplied by one shift factor a_T; flow indices and
// time constants are kept (a vertical shift).
type TemperatureDependence struct {
	Method string `json:"method"` // TempArrhenius, TempTable or TempWaterRatio
	// ActivationEnergy is E_a in J/mol (arrhenius).
	ActivationEnergy *float64 `json:"activation_energy_J_mol,omitempty"`
	// Table holds viscosities measured at several temperatures, at one
	// shear rate (table); only their ratios are used.
	Table []TemperatureViscosity `json:"viscosity_table,omitempty"`
	// RangeC is the temperature range, °C, over which the dependence was
	// measured or is trusted (arrhenius, water-ratio; a table's own span
	// is its range).
	RangeC *[2]float64 `json:"range_C,omitempty"`
}

// TemperatureViscosity is one viscosity at one temperature.
type TemperatureViscosity struct {
	TemperatureC float64 `json:"temperature_C"`
	Viscosity    float64 `json:"viscosity_Pa_s"`
}

// ArrheniusShift is the shift factor a_T = exp[(E_a/R)(1/T − 1/T_ref)] of
// the Arrhenius (Andrade) form η = A·exp(E_a/(RT)), T in K (Andrade 1930,
// Nature 125:309; the form as quoted in Steffe 1996, §1.5).
func ArrheniusShift(ea, tRefC, tC float64) float64 {
	return math.Exp(ea / GasConstant * (1/(tC+ZeroCelsiusK) - 1/(tRefC+ZeroCelsiusK)))
}

// ActivationEnergy is the two-point E_a = R ln(η₁/η₂)/(1/T₁ − 1/T₂), J/mol,
// from viscosities η₁ at t1C and η₂ at t2C (°C).
func ActivationEnergy(t1C, eta1, t2C, eta2 float64) float64 {
	return GasConstant * math.Log(eta1/eta2) / (1/(t1C+ZeroCelsiusK) - 1/(t2C+ZeroCelsiusK))
}

// WaterRatioShift is η_w(T)/η_w(T_ref) for pure water at one standard
// atmosphere (IAPWS 2008 viscosity, IAPWS-IF97 density): the temperature
// dependence of dilute aqueous fluids such as plasma follows that of water
// (Quemada, quoting Cokelet 1972).
func WaterRatioShift(tRefC, tC float64) float64 {
	w := func(c float64) float64 {
		tK := c + ZeroCelsiusK
		return WaterViscosity(tK, WaterDensityIF97(tK, StandardPressurePa))
	}
	return w(tC) / w(tRefC)
}

// Check validates the dependence.
func (d TemperatureDependence) Check() error {
	rangeOK := d.RangeC != nil && finite(d.RangeC[0], d.RangeC[1]) && d.RangeC[0] <= d.RangeC[1]
	switch d.Method {
	case TempArrhenius:
		if d.ActivationEnergy == nil || !finite(*d.ActivationEnergy) {
			return errorf("\"arrhenius\" needs \"activation_energy_J_mol\"")
		}
		if !rangeOK {
			return errorf("\"arrhenius\" needs \"range_C\": [low, high], the temperatures the activation energy was measured over")
		}
	case TempWaterRatio:
		if !rangeOK {
			return errorf("\"water-ratio\" needs \"range_C\": [low, high], the temperatures it is trusted over")
		}
	case TempTable:
		if len(d.Table) < 2 {
			return errorf("\"table\" needs \"viscosity_table\" with two temperatures or more")
		}
		seen := map[float64]bool{}
		for _, p := range d.Table {
			if !finite(p.TemperatureC) || p.TemperatureC <= -ZeroCelsiusK || !positive(p.Viscosity) || seen[p.TemperatureC] {
				return errorf("\"viscosity_table\" needs distinct finite temperatures above absolute zero and positive viscosities")
			}
			seen[p.TemperatureC] = true
		}
	default:
		return errorf("unknown temperature \"method\" %q; accepted: %s, %s, %s", d.Method, TempArrhenius, TempTable, TempWaterRatio)
	}
	return nil
}

// Range is the temperature range, °C, the dependence holds over.
func (d TemperatureDependence) Range() (lo, hi float64) {
	if d.Method == TempTable {
		lo, hi = math.Inf(1), math.Inf(-1)
		for _, p := range d.Table {
			lo, hi = math.Min(lo, p.TemperatureC), math.Max(hi, p.TemperatureC)
		}
		return lo, hi
	}
	return d.RangeC[0], d.RangeC[1]
}

// Shift returns the factor a_T that takes viscosities from tRefC to tC.
func (d TemperatureDependence) Shift(tRefC, tC float64) float64 {
	switch d.Method {
	case TempArrhenius:
		return ArrheniusShift(*d.ActivationEnergy, tRefC, tC)
	case TempWaterRatio:
		return WaterRatioShift(tRefC, tC)
	}
	return math.Exp(tableLogViscosity(d.Table, tC) - tableLogViscosity(d.Table, tRefC))
}

// tableLogViscosity interpolates ln η linearly in 1/T between neighbouring
// table temperatures (Arrhenius between neighbours), and extends the end
// segments beyond the table.
func tableLogViscosity(table []TemperatureViscosity, tC float64) float64 {
	t := append([]TemperatureViscosity(nil), table...)
	sort.Slice(t, func(i, j int) bool { return t[i].TemperatureC < t[j].TemperatureC })
	i := sort.Search(len(t)-1, func(i int) bool { return t[i+1].TemperatureC >= tC })
	i = min(i, len(t)-2)
	inv := func(c float64) float64 { return 1 / (c + ZeroCelsiusK) }
	x0, x1 := inv(t[i].TemperatureC), inv(t[i+1].TemperatureC)
	y0, y1 := math.Log(t[i].Viscosity), math.Log(t[i+1].Viscosity)
	return y0 + (y1-y0)*(inv(tC)-x0)/(x1-x0)
}

// shiftModel multiplies every parameter that carries pascals (viscosities,
// consistency, yield stress) by a, which multiplies the stress at every
// shear rate by a.
func shiftModel(m Model, a float64) (Model, error) {
	p := map[string]float64{}
	for _, q := range m.Params() {
		switch q.Name {
		case PFlowIndex, PTime, PTransition:
			p[q.Name] = q.Value
		default:
			p[q.Name] = q.Value * a
		}
	}
	return NewModel(m.Name(), p)
}

// PropertiesAt is [MediumFile.Properties] at temperature tC (°C; NaN for the
// file's own temperature). A file without a temperature dependence keeps
// its properties and warns that the temperature is ignored; one with a
// dependence is shifted, with a warning outside the dependence's range.
func (f MediumFile) PropertiesAt(tC float64) (Properties, error) {
	p, err := f.Properties()
	if err != nil || math.IsNaN(tC) {
		return p, err
	}
	d := f.TemperatureDependence
	if d == nil {
		p.Warnings = append(p.Warnings, Warning{Code: WarnIgnored, Message: fmt.Sprintf("medium: the file gives no temperature dependence; its properties are used as measured, not at %.3g °C", tC)})
		return p, nil
	}
	ref := *f.TemperatureC
	a := d.Shift(ref, tC)
	mr := p.Rheology.(MeasuredRheology)
	if mr.Model, err = shiftModel(mr.Model, a); err != nil {
		return p, errorf("the viscosity shifted to %.3g °C is not usable: %v", tC, trimMedia(err))
	}
	p.Rheology = mr
	p.TemperatureC = tC
	p.DynamicViscosity *= a
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	p.Methods[0] += fmt.Sprintf("; at %.3g °C every viscosity and stress × %.4g (%s temperature dependence from %.3g °C; flow index, time constants and density kept)", tC, a, d.Method, ref)
	if lo, hi := d.Range(); tC < lo || tC > hi {
		p.Warnings = append(p.Warnings, Warning{Code: WarnOutOfRange, Message: fmt.Sprintf("medium: %.3g °C is outside %.3g–%.3g °C, where the file's temperature dependence was measured; the viscosity is extrapolated", tC, lo, hi)})
	}
	return p, nil
}
