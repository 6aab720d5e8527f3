package media

import (
	"fmt"
	"math"
	"sort"
)

// ViscosityPoint is one measured viscosity of a fluid: temperature (°C) and
// dynamic viscosity (Pa·s).
type ViscosityPoint struct {
	TemperatureC float64
	Viscosity    float64
}

// Oil is a user-measured Newtonian oil: Andrade's law ln μ = A + B/T (T in
// K) fitted through two or more measured points, and a density taken as
// constant (oils change density by well under 0.1 % per °C; stated in every
// result).
type Oil struct {
	Name     string
	Density  float64 // kg/m³, as given
	A, B     float64 // ln(μ / Pa·s) = A + B/T
	MinC     float64 // measured temperature range, °C
	MaxC     float64
	Residual float64 // largest |ln μ − fit| over the points; 0 for two points
}

// FitOil fits Andrade's law to the points by least squares in ln μ against
// 1/T (through them exactly for two points).
//
// Reference: Andrade, E. N. da C. (1934), A theory of the viscosity of
// liquids, Part II, Phil. Mag. 17, 698–732: μ = A exp(b/T).
func FitOil(name string, density float64, pts []ViscosityPoint) (Oil, error) {
	if len(pts) < 2 {
		return Oil{}, errorf("an oil needs two or more measured (temperature, viscosity) points, got %d", len(pts))
	}
	if !finite(density) || density <= 0 {
		return Oil{}, errorf("the oil's density must be a positive number")
	}
	ps := append([]ViscosityPoint(nil), pts...)
	sort.Slice(ps, func(i, j int) bool { return ps[i].TemperatureC < ps[j].TemperatureC })
	var sx, sy, sxx, sxy float64
	for i, p := range ps {
		if !finite(p.TemperatureC, p.Viscosity) || p.Viscosity <= 0 || p.TemperatureC <= -ZeroCelsiusK {
			return Oil{}, errorf("oil point %.4g °C, %.4g Pa·s: give a temperature above absolute zero and a positive viscosity", p.TemperatureC, p.Viscosity)
		}
		if i > 0 && p.TemperatureC == ps[i-1].TemperatureC {
			return Oil{}, errorf("two oil points at %.4g °C; give points at different temperatures", p.TemperatureC)
		}
		x, y := 1/(p.TemperatureC+ZeroCelsiusK), math.Log(p.Viscosity)
		sx, sy, sxx, sxy = sx+x, sy+y, sxx+x*x, sxy+x*y
	}
	n := float64(len(ps))
	b := (n*sxy - sx*sy) / (n*sxx - sx*sx)
	a := (sy - b*sx) / n
	if !(b > 0) {
		return Oil{}, errorf("the oil's viscosity does not fall as its temperature rises; check the points")
	}
	o := Oil{Name: name, Density: density, A: a, B: b, MinC: ps[0].TemperatureC, MaxC: ps[len(ps)-1].TemperatureC}
	for _, p := range ps {
		o.Residual = math.Max(o.Residual, math.Abs(math.Log(p.Viscosity)-o.lnMu(p.TemperatureC)))
	}
	return o, nil
}

func (o Oil) lnMu(tC float64) float64 { return o.A + o.B/(tC+ZeroCelsiusK) }

// Viscosity returns the fitted dynamic viscosity (Pa·s) at tC (°C).
func (o Oil) Viscosity(tC float64) float64 { return math.Exp(o.lnMu(tC)) }

// ActivationEnergy returns Andrade's B times the gas constant, J/mol.
func (o Oil) ActivationEnergy() float64 { return o.B * 8.314462618 }

// oilReach is how far outside the measured range the fit is still used,
// with a warning (common practice, no source).
const oilReachC = 10.0

// Properties returns the oil at tC (°C): a warning outside the measured
// range, an error more than 10 °C beyond it.
func (o Oil) Properties(tC float64) (Properties, error) {
	if !finite(tC) || tC < o.MinC-oilReachC || tC > o.MaxC+oilReachC {
		return Properties{}, errorf("%s was measured at %.4g–%.4g °C; %.4g °C is more than %.0f °C beyond, measure it there", o.Name, o.MinC, o.MaxC, tC, oilReachC)
	}
	p := blank(o.Name)
	p.TemperatureC, p.PressurePa = tC, StandardPressurePa
	p.Density, p.DynamicViscosity = o.Density, o.Viscosity(tC)
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	p.Methods = append(p.Methods,
		fmt.Sprintf("viscosity: Andrade's law ln μ = A + B/T fitted to the measured points (B = %.5g K, largest misfit %.2g %%); Andrade 1934, Phil. Mag. 17:698", o.B, 100*(math.Exp(o.Residual)-1)),
		fmt.Sprintf("density: %.6g kg/m³ as given, taken as constant with temperature", o.Density))
	if tC < o.MinC || tC > o.MaxC {
		p.Warnings = append(p.Warnings, Warning{Code: WarnOutOfRange, Message: fmt.Sprintf("medium: %.4g °C is outside the oil's measured %.4g–%.4g °C; the fit is extrapolated", tC, o.MinC, o.MaxC)})
	}
	return p, nil
}

// TemperatureFor returns the temperature (°C) at which the oil has kinematic
// viscosity nu (m²/s), by inverting Andrade's law, T = B/(ln(νρ) − A); an
// *OutOfReachError when that lies more than 10 °C beyond the measured range.
func (o Oil) TemperatureFor(nu float64) (float64, error) {
	if !finite(nu) || nu <= 0 {
		return 0, errorf("the wanted kinematic viscosity must be a positive number")
	}
	tK := o.B / (math.Log(nu*o.Density) - o.A)
	lo, hi := o.MinC-oilReachC, o.MaxC+oilReachC
	if !(tK > 0) || tK-ZeroCelsiusK < lo || tK-ZeroCelsiusK > hi {
		return 0, &OutOfReachError{Fluid: o.Name + fmt.Sprintf(" over %.4g–%.4g °C", lo, hi), Want: nu,
			Low: o.Viscosity(hi) / o.Density, High: o.Viscosity(lo) / o.Density, TC: math.NaN()}
	}
	return tK - ZeroCelsiusK, nil
}
