package media

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Lab fluids: mixtures made up in a tank for scale models. A lab fluid is
// named by its solute, a colon and the solute's mass fraction, as a number
// from 0 to 1 or a percentage: "glycerol:0.85", "glycerol:85%",
// "sucrose:40%".
const (
	KindGlycerol = "glycerol"
	KindSucrose  = "sucrose"
)

// LabKinds lists the lab fluids [Lookup] accepts with a mass fraction.
var LabKinds = []string{KindGlycerol + ":<mass fraction>", KindSucrose + ":<mass fraction>"}

// WarnLabCaution marks a practical hazard of a lab fluid: steep temperature
// dependence, water uptake, crystallisation.
const WarnLabCaution = "lab-fluid-caution"

// Published ranges of the glycerol–water methods.
const (
	chengMinC = 0.0   // Cheng (2008): 0–100 °C, 0–100 % glycerol
	chengMaxC = 100.0 //
	volkMinC  = 15.0  // Volk & Kähler (2018): Bosart & Snoddy's data, 15–30 °C
	volkMaxC  = 30.0  //
	// glycerolColdC is the coldest temperature accepted: water-rich
	// mixtures are ice below 0 °C, and Cheng's pure-glycerol term is an
	// extrapolation there.
	glycerolColdC = -20.0
)

// ParseLabFluid splits a lab-fluid name such as "glycerol:85%" into its kind
// and solute mass fraction (0–1). ok is false when name is not a lab fluid;
// err says what is wrong with a lab-fluid name that cannot be read.
func ParseLabFluid(name string) (kind string, fraction float64, ok bool, err error) {
	k, text, found := strings.Cut(strings.TrimSpace(name), ":")
	k = strings.ToLower(strings.TrimSpace(k))
	if k != KindGlycerol && k != KindSucrose {
		return "", 0, false, nil
	}
	if !found || strings.TrimSpace(text) == "" {
		return k, 0, true, errorf("%s needs its mass fraction, e.g. %s:0.6 or %s:60%%", k, k, k)
	}
	text = strings.TrimSpace(text)
	scale := 1.0
	if t, pct := strings.CutSuffix(text, "%"); pct {
		text, scale = strings.TrimSpace(t), 0.01
	}
	v, perr := strconv.ParseFloat(text, 64)
	if perr != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return k, 0, true, errorf("%s mass fraction %q is not a number; give e.g. %s:0.6 or %s:60%%", k, text, k, k)
	}
	v *= scale
	if v < 0 || v > 1 {
		return k, 0, true, errorf("%s mass fraction %.4g is outside 0 to 1 (0 %% to 100 %%)", k, v)
	}
	return k, v, true, nil
}

// labFluidName returns the name [Lookup] reads for a lab fluid.
func labFluidName(kind string, fraction float64) string {
	return kind + ":" + strconv.FormatFloat(fraction, 'g', 6, 64)
}

// lookupLab evaluates a lab fluid for [Lookup]; ok is false when the name
// is not a lab fluid.
func lookupLab(c Conditions, brief bool) (p Properties, ok bool, err error) {
	kind, w, ok, err := ParseLabFluid(c.Medium)
	if !ok || err != nil {
		return p, ok, err
	}
	if !math.IsNaN(c.HumidityPercent) || !math.IsNaN(c.TemperatureOffset) || !math.IsNaN(c.SalinityPractical) || !math.IsNaN(c.AltitudeM) {
		return p, true, errorf("humidity, temperature offset, salinity and altitude do not apply to %s solutions", kind)
	}
	t := or(c.TemperatureC, DefaultWaterTemperatureC)
	if kind == KindGlycerol {
		p, err = glycerol(w, t, brief)
	} else {
		p, err = sucrose(w, t, brief)
	}
	if err != nil {
		return p, true, err
	}
	if !math.IsNaN(c.DepthM) || !math.IsNaN(c.PressurePa) {
		addWarning(&p.Warnings, brief, WarnIgnored, func() string {
			return "medium: depth and pressure are ignored for a lab fluid, whose properties are taken at atmospheric pressure"
		})
	}
	return p, true, nil
}

// chengWaterViscosity returns water's viscosity in Pa·s at tC (°C), Cheng
// (2008) eq. 21: μ_w = 1.790 exp[(−1230 − T)T / (36100 + 360T)] mPa·s.
func chengWaterViscosity(tC float64) float64 {
	return 1.790e-3 * math.Exp((-1230-tC)*tC/(36100+360*tC))
}

// chengGlycerolViscosity returns pure glycerol's viscosity in Pa·s at tC
// (°C), Cheng (2008) eq. 22: μ_g = 12100 exp[(−1233 + T)T / (9900 + 70T)] mPa·s.
func chengGlycerolViscosity(tC float64) float64 {
	return 12.100 * math.Exp((-1233+tC)*tC/(9900+70*tC))
}

// GlycerolViscosity returns the dynamic viscosity (Pa·s) of a glycerol–water
// mixture of glycerol mass fraction w at tC (°C): μ = μ_w^α μ_g^(1−α), with
// α = 1 − w + a b w(1 − w)/(a w + b(1 − w)), a = 0.705 − 0.0017T,
// b = (4.9 + 0.036T) a^2.5.
//
// Reference: Cheng, N.-S. (2008), Formula for the viscosity of a
// glycerol–water mixture, Ind. Eng. Chem. Res. 47, 3285–3288, eqs. 6, 21,
// 22; published range 0–100 °C, 0–100 % glycerol.
func GlycerolViscosity(w, tC float64) float64 {
	a := 0.705 - 0.0017*tC
	b := (4.9 + 0.036*tC) * math.Pow(a, 2.5)
	alpha := 1 - w + a*b*w*(1-w)/(a*w+b*(1-w))
	return math.Pow(chengWaterViscosity(tC), alpha) * math.Pow(chengGlycerolViscosity(tC), 1-alpha)
}

// GlycerolDensity returns the density (kg/m³) of a glycerol–water mixture of
// glycerol mass fraction w at tC (°C): the ideal volume-weighted mixture of
// ρ_g = 1273.3 − 0.6121T and ρ_w = 1000[1 − |(T − 3.98)/615|^1.71] times the
// contraction factor κ = 1 + c sin(w^1.31 π)^0.81, c = 1.78e-6 T² −
// 1.82e-4 T + 1.41e-2.
//
// Reference: Volk, A. & Kähler, C. J. (2018), Density model for aqueous
// glycerol solutions, Exp. Fluids 59, 75; fitted to Bosart & Snoddy (1927)
// at 15–30 °C.
func GlycerolDensity(w, tC float64) float64 {
	rg := 1273.3 - 0.6121*tC
	rw := 1000 * (1 - math.Pow(math.Abs((tC-3.98)/615), 1.71))
	cv := (w / rg) / (w/rg + (1-w)/rw)
	c := 1.78e-6*tC*tC - 1.82e-4*tC + 1.41e-2
	kappa := 1 + c*math.Pow(math.Sin(math.Pow(w, 1.31)*math.Pi), 0.81)
	return kappa * (rg*cv + rw*(1-cv))
}

// GlycerolKinematicViscosity returns ν = μ/ρ (m²/s) of the mixture.
func GlycerolKinematicViscosity(w, tC float64) float64 {
	return GlycerolViscosity(w, tC) / GlycerolDensity(w, tC)
}

// Glycerol returns the properties of a glycerol–water mixture of glycerol
// mass fraction w (0–1) at tC (°C) and atmospheric pressure.
func Glycerol(w, tC float64) (Properties, error) { return glycerol(w, tC, false) }

func glycerol(w, tC float64, brief bool) (Properties, error) {
	if !finite(w, tC) || w < 0 || w > 1 {
		return Properties{}, errorf("glycerol mass fraction must be a number from 0 to 1")
	}
	if tC < glycerolColdC || tC > chengMaxC {
		return Properties{}, errorf("glycerol–water at %.4g °C: outside %.0f to %.0f °C the mixture freezes or boils at atmospheric pressure, and Cheng's formula has no data", tC, glycerolColdC, chengMaxC)
	}
	p := blank(labFluidName(KindGlycerol, w))
	p.TemperatureC, p.PressurePa = tC, StandardPressurePa
	p.DynamicViscosity = GlycerolViscosity(w, tC)
	p.Density = GlycerolDensity(w, tC)
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	p.addMethod(brief, func() string {
		return "viscosity: Cheng 2008, Ind. Eng. Chem. Res. 47:3285, eqs. 6, 21, 22 (0–100 °C)"
	})
	p.addMethod(brief, func() string {
		return "density: Volk & Kähler 2018, Exp. Fluids 59:75 (data 15–30 °C)"
	})
	if tC < chengMinC {
		addWarning(&p.Warnings, brief, WarnOutOfRange, func() string {
			return fmt.Sprintf("medium: %.4g °C is below Cheng's 0–100 °C; water-rich mixtures freeze below 0 °C", tC)
		})
	}
	if tC < volkMinC || tC > volkMaxC {
		addWarning(&p.Warnings, brief, WarnOutOfRange, func() string {
			return fmt.Sprintf("medium: %.4g °C is outside the 15–30 °C of the density data behind Volk & Kähler's model", tC)
		})
	}
	glycerolCautions(&p, w, tC, brief)
	return p, nil
}

// Thresholds of the glycerol cautions (common practice, no source).
const (
	hygroscopicFraction = 0.8  // above this, water taken up from the air shifts ν noticeably
	steepPercentPerK    = 5.0  // |dν/dT| in % per °C above which temperature control is urged
	hotGlycerolC        = 40.0 // above this, evaporation of water changes the mixture
)

// glycerolSensitivity returns the relative change of ν per °C at (w, tC),
// in % per °C, by a central difference over ±0.5 °C.
func glycerolSensitivity(w, tC float64) float64 {
	lo, hi := GlycerolKinematicViscosity(w, tC-0.5), GlycerolKinematicViscosity(w, tC+0.5)
	return 100 * (hi - lo) / GlycerolKinematicViscosity(w, tC)
}

func glycerolCautions(p *Properties, w, tC float64, brief bool) {
	if s := glycerolSensitivity(w, tC); math.Abs(s) > steepPercentPerK {
		addWarning(&p.Warnings, brief, WarnLabCaution, func() string {
			return fmt.Sprintf("medium: the viscosity of this mixture changes by %.3g %% per °C; hold the tank within ±0.2 °C and log its temperature", s)
		})
	}
	if w >= hygroscopicFraction {
		addWarning(&p.Warnings, brief, WarnLabCaution, func() string {
			drop := 100 * (1 - GlycerolKinematicViscosity(w-0.01, tC)/GlycerolKinematicViscosity(w, tC))
			return fmt.Sprintf("medium: concentrated glycerol takes up water from the air; here one percent more water lowers ν by %.3g %%; cover the tank and check the viscosity or density before each run", drop)
		})
	}
	if tC > hotGlycerolC {
		addWarning(&p.Warnings, brief, WarnLabCaution, func() string {
			return fmt.Sprintf("medium: at %.4g °C water evaporates from the mixture and raises its glycerol fraction; cover the tank and check the mixture", tC)
		})
	}
}

// bisect returns x in [lo, hi] with f(x) = 0 for f increasing in x, to a
// relative width of 1e-12; f(lo) ≤ 0 ≤ f(hi) must hold.
func bisect(f func(float64) float64, lo, hi float64) float64 {
	for range 200 {
		mid := (lo + hi) / 2
		if f(mid) < 0 {
			lo = mid
		} else {
			hi = mid
		}
		if hi-lo <= 1e-12*math.Max(1, math.Abs(mid)) {
			break
		}
	}
	return (lo + hi) / 2
}

// OutOfReachError says that no composition of a lab fluid gives the wanted
// kinematic viscosity; Low and High are the fluid's reachable range, m²/s.
type OutOfReachError struct {
	Fluid     string
	Want      float64
	Low, High float64
	TC        float64
}

func (e *OutOfReachError) Error() string { return "media: " + e.Reason() }

// Reason is the message without the "media: " prefix.
func (e *OutOfReachError) Reason() string {
	at := ""
	if !math.IsNaN(e.TC) {
		at = fmt.Sprintf(" at %.4g °C", e.TC)
	}
	return fmt.Sprintf("%s%s spans kinematic viscosities %.4g to %.4g m²/s; %.4g m²/s is outside", e.Fluid, at, e.Low, e.High, e.Want)
}

// GlycerolFractionFor returns the glycerol mass fraction whose mixture has
// kinematic viscosity nu (m²/s) at tC (°C), found by bisection (ν rises
// monotonically with the glycerol fraction). It returns an
// *OutOfReachError when nu lies outside water's to pure glycerol's.
func GlycerolFractionFor(nu, tC float64) (float64, error) {
	if !finite(nu, tC) || nu <= 0 {
		return 0, errorf("the wanted kinematic viscosity must be a positive number")
	}
	if tC < glycerolColdC || tC > chengMaxC {
		return 0, errorf("glycerol–water at %.4g °C is outside %.0f to %.0f °C", tC, glycerolColdC, chengMaxC)
	}
	lo, hi := GlycerolKinematicViscosity(0, tC), GlycerolKinematicViscosity(1, tC)
	if nu < lo || nu > hi {
		return 0, &OutOfReachError{Fluid: "glycerol–water", Want: nu, Low: lo, High: hi, TC: tC}
	}
	return bisect(func(w float64) float64 { return GlycerolKinematicViscosity(w, tC) - nu }, 0, 1), nil
}

// GlycerolTemperatureFor returns the temperature (°C) at which a mixture of
// glycerol mass fraction w has kinematic viscosity nu (m²/s), searched by
// bisection over Cheng's 0–100 °C (ν falls as temperature rises). It
// returns an *OutOfReachError when nu is outside the mixture's range there.
func GlycerolTemperatureFor(w, nu float64) (float64, error) {
	if !finite(w, nu) || w < 0 || w > 1 || nu <= 0 {
		return 0, errorf("give a mass fraction from 0 to 1 and a positive kinematic viscosity")
	}
	cold, hot := GlycerolKinematicViscosity(w, chengMinC), GlycerolKinematicViscosity(w, chengMaxC)
	if nu > cold || nu < hot {
		return 0, &OutOfReachError{Fluid: fmt.Sprintf("glycerol–water of mass fraction %.4g over 0–100 °C", w), Want: nu, Low: hot, High: cold, TC: math.NaN()}
	}
	return bisect(func(t float64) float64 { return nu - GlycerolKinematicViscosity(w, t) }, chengMinC, chengMaxC), nil
}
