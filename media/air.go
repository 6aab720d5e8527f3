package media

import (
	"fmt"
	"math"
)

// US Standard Atmosphere 1976 constants (NOAA/NASA/USAF 1976, Table 1 and
// eqs. 18, 23, 33a, 33b), identical to ISO 2533:1975 below 32 km.
const (
	ussaR0    = 6356766.0  // m, effective Earth radius for geopotential height
	ussaRstar = 8.31432    // J/(mol K), gas constant as used by the 1976 tables
	ussaM0    = 28.9644e-3 // kg/mol, sea-level molar mass of air
	ussaTopH  = 32000.0    // m', top of the layers implemented here
	ussaLowH  = -5000.0    // m', bottom of the 1976 tables
)

// ussaLayers are the base geopotential heights (m'), base temperatures (K),
// base pressures (Pa) and lapse rates (K/m') of the three lowest layers.
var ussaLayers = []struct{ h, t, p, lapse float64 }{
	{0, 288.15, 101325.0, -0.0065},
	{11000, 216.65, 22632.06, 0},
	{20000, 216.65, 5474.889, 0.001},
}

// GeopotentialHeight converts geometric altitude z (m) to geopotential
// height (m'), H = r₀ z / (r₀ + z) (USSA-76 eq. 18).
func GeopotentialHeight(z float64) float64 { return ussaR0 * z / (ussaR0 + z) }

// geometricAltitude is the inverse of GeopotentialHeight: z = r₀ H / (r₀ − H).
func geometricAltitude(h float64) float64 { return ussaR0 * h / (ussaR0 - h) }

// StandardAtmosphere returns the temperature (K) and pressure (Pa) of the US
// Standard Atmosphere 1976 (= ISO 2533:1975) at geopotential height h (m'),
// for −5 km ≤ h ≤ 32 km: the troposphere and the lower stratosphere.
// Outside that range it returns NaN.
//
// Reference: NOAA, NASA & USAF (1976), U.S. Standard Atmosphere, 1976,
// eqs. (23), (33a), (33b).
func StandardAtmosphere(h float64) (tK, pPa float64) {
	if !(h >= ussaLowH-1e-6 && h <= ussaTopH+1e-6) {
		return math.NaN(), math.NaN()
	}
	l := ussaLayers[0]
	for _, c := range ussaLayers[1:] {
		if h >= c.h {
			l = c
		}
	}
	const g0 = StandardGravity
	tK = l.t + l.lapse*(h-l.h)
	if l.lapse == 0 {
		pPa = l.p * math.Exp(-g0*ussaM0*(h-l.h)/(ussaRstar*l.t)) // eq. (33b)
	} else {
		pPa = l.p * math.Exp(g0*ussaM0/(ussaRstar*l.lapse)*math.Log(l.t/tK)) // eq. (33a)
	}
	return tK, pPa
}

// SutherlandViscosity returns the dynamic viscosity of dry air in Pa·s at
// temperature tK (K), μ = β T^1.5/(T + S) with β = 1.458e-6 kg/(m s K^0.5)
// and S = 110.4 K (Sutherland 1893, Phil. Mag. 36, 507; constants of ISO
// 2533:1975 and USSA-76 eq. 51). Published for about 100–1900 K.
func SutherlandViscosity(tK float64) float64 {
	const beta, s = 1.458e-6, 110.4
	return beta * tK * math.Sqrt(tK) / (tK + s)
}

// SaturationVapourPressure returns the saturation vapour pressure of water
// over liquid water in Pa at tK (K), the formula adopted in CIPM-2007
// (Picard et al. 2008, eq. A1.6; from Davis 1992).
func SaturationVapourPressure(tK float64) float64 {
	const a, b, c, d = 1.2378847e-5, -1.9121316e-2, 33.93711047, -6.3431645e3
	return math.Exp(a*tK*tK + b*tK + c + d/tK)
}

// MoistAirDensity returns the density of moist air in kg/m³ at tK (K),
// absolute pressure pPa (Pa), relative humidity h (0–1) and CO₂ mole
// fraction xCO2 (0.0004 is the CIPM reference), by the CIPM-2007 equation.
// Published for 600–1100 hPa and 15–27 °C, relative uncertainty 22e-6.
//
// Reference: Picard, A., Davis, R. S., Gläser, M. & Fujii, K. (2008),
// Revised formula for the density of moist air (CIPM-2007), Metrologia 45,
// 149–155, eqs. (1), (A1.1)–(A1.6).
func MoistAirDensity(tK, pPa, h, xCO2 float64) float64 {
	const (
		r  = 8.314472    // J/(mol K)
		mv = 18.01528e-3 // kg/mol
	)
	t := tK - ZeroCelsiusK
	ma := (28.96546 + 12.011*(xCO2-0.0004)) * 1e-3 // eq. (A1.1)
	f := 1.00062 + 3.14e-8*pPa + 5.6e-7*t*t        // eq. (A1.5)
	xv := h * f * SaturationVapourPressure(tK) / pPa
	const (
		a0, a1, a2 = 1.58123e-6, -2.9331e-8, 1.1043e-10
		b0, b1     = 5.707e-6, -2.051e-8
		c0, c1     = 1.9898e-4, -2.376e-6
		d, e       = 1.83e-11, -0.765e-8
	)
	pt := pPa / tK
	z := 1 - pt*(a0+a1*t+a2*t*t+(b0+b1*t)*xv+(c0+c1*t)*xv*xv) + pt*pt*(d+e*xv*xv) // eq. (A1.4)
	return pPa * ma / (z * r * tK) * (1 - xv*(1-mv/ma))                           // eq. (1)
}

// PrintedPrecision is half a unit in the last of the three significant
// digits that tables print, relative, at its smallest (999 → 0.5 in 999 is
// 0.05 %). A method used outside its stated range is flagged only when its
// error there could reach it.
const PrintedPrecision = 5e-4

// Where the CIPM-2007 density was checked against the reference equation
// for air (Lemmon et al. 2000): within 0.03 % (media/limits.go, measured for
// this project with python3-iapws).
const (
	cipmCheckedMinC, cipmCheckedMaxC = -20.0, 40.0
	cipmCheckedMaxPa                 = 5e6
	cipmCheckedError                 = 3e-4
)

// cipmWithinPrintedPrecision reports whether the CIPM-2007 density's error
// at tC (°C) and pPa stays below [PrintedPrecision]. Its stated range is
// 15–27 °C and 600–1100 hPa with a relative uncertainty of 22 ppm (Picard et
// al. 2008); beyond it the stated uncertainty no longer holds, but against
// the reference equation for air it stays within 0.03 % at −20–40 °C up to
// 5 MPa, below the printed precision. Only outside that checked region is
// the density flagged.
func cipmWithinPrintedPrecision(tC, pPa float64) bool {
	return cipmCheckedError < PrintedPrecision && tC >= cipmCheckedMinC && tC <= cipmCheckedMaxC && pPa <= cipmCheckedMaxPa
}

// AirConditions says where the air is. Pressure wins over altitude when both
// are set. When TemperatureC is NaN the standard-atmosphere temperature at
// the altitude is used, plus OffsetK.
type AirConditions struct {
	TemperatureC    float64 // measured air temperature, °C; NaN for the standard atmosphere
	OffsetK         float64 // added to the standard-atmosphere temperature when TemperatureC is NaN
	PressurePa      float64 // absolute pressure, Pa; NaN to take it from the altitude
	AltitudeM       float64 // geometric altitude above mean sea level, m
	HumidityPercent float64 // relative humidity, 0–100 %
}

// Air returns the properties of moist air. Pressure is the given absolute
// pressure, or else the US Standard Atmosphere 1976 pressure at the
// geopotential height of the geometric altitude. Density is CIPM-2007;
// viscosity is Sutherland's law with ISO 2533 constants (dry air; the effect
// of humidity on viscosity, under 1 % at biological temperatures per
// Tsilingiris 2008, is not applied).
func Air(c AirConditions) (Properties, error) { return air(c, false) }

// air is [Air]; brief leaves out the method notes and the warnings' texts.
func air(c AirConditions, brief bool) (Properties, error) {
	if !finite(c.OffsetK, c.AltitudeM, c.HumidityPercent) || math.IsInf(c.TemperatureC, 0) || math.IsInf(c.PressurePa, 0) {
		return Properties{}, errorf("air needs finite altitude, humidity and temperature offset")
	}
	if c.HumidityPercent < 0 || c.HumidityPercent > 100 {
		return Properties{}, outOfRange("relative humidity", FieldHumidity, c.HumidityPercent, 0, 100, "%", "relative humidity %.4g %% is outside 0–100 %%", c.HumidityPercent)
	}
	p := blank("air")
	p.Gas = true
	p.AltitudeM = c.AltitudeM
	p.GeopotentialM = GeopotentialHeight(c.AltitudeM)
	p.HumidityPercent = c.HumidityPercent
	stdT, stdP := StandardAtmosphere(p.GeopotentialM)
	if math.IsNaN(stdT) {
		return Properties{}, outOfRange("altitude", FieldAltitude, c.AltitudeM, geometricAltitude(ussaLowH), geometricAltitude(ussaTopH), "m",
			"altitude %.6g m (geopotential %.6g m') is outside the standard atmosphere implemented here, −5 km to 32 km geopotential; give an altitude in that range", c.AltitudeM, p.GeopotentialM)
	}
	p.PressurePa = c.PressurePa
	if math.IsNaN(p.PressurePa) {
		p.PressurePa = stdP
		p.addMethod(brief, func() string {
			return fmt.Sprintf("pressure: US Standard Atmosphere 1976 (ISO 2533) at geometric altitude %.6g m = geopotential height %.6g m'", c.AltitudeM, p.GeopotentialM)
		})
	}
	if p.PressurePa <= 0 {
		return Properties{}, outOfRange("air pressure", FieldPressure, p.PressurePa, 0, AirMaxPressurePa, "Pa", "air pressure %.6g Pa is not positive; give an absolute pressure", p.PressurePa)
	}
	if p.PressurePa > AirMaxPressurePa {
		return Properties{}, outOfRange("air pressure", FieldPressure, p.PressurePa, 0, AirMaxPressurePa, "Pa", "air pressure %.4g MPa is above %g MPa, the highest accepted: beyond it the CIPM-2007 density departs from the reference equation for air (Lemmon et al. 2000) by 1–4 %% at 20 MPa and more above", p.PressurePa/1e6, AirMaxPressurePa/1e6)
	}
	if math.IsNaN(c.TemperatureC) {
		p.TemperatureC = stdT - ZeroCelsiusK + c.OffsetK
		p.addMethod(brief, func() string {
			return fmt.Sprintf("temperature: US Standard Atmosphere 1976 at that height %+.4g K offset", c.OffsetK)
		})
	} else {
		p.TemperatureC = c.TemperatureC
	}
	tK := p.TemperatureC + ZeroCelsiusK
	if tK <= 0 {
		return Properties{}, errorf("air temperature %.4g °C is below absolute zero", p.TemperatureC)
	}
	h := c.HumidityPercent / 100
	if h > 0 && SaturationVapourPressure(tK) >= p.PressurePa {
		return Properties{}, errorf("at %.4g °C the saturation vapour pressure exceeds the air pressure %.6g Pa; humid air cannot exist there", p.TemperatureC, p.PressurePa)
	}
	p.Density = MoistAirDensity(tK, p.PressurePa, h, 0.0004)
	p.DynamicViscosity = SutherlandViscosity(tK)
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	if !brief {
		p.Methods = append(p.Methods,
			"density: CIPM-2007 moist-air equation (Picard et al. 2008, Metrologia 45, 149), CO2 mole fraction 0.0004",
			"viscosity: Sutherland's law with ISO 2533 constants (beta = 1.458e-6 kg/(m s K^0.5), S = 110.4 K), dry air",
		)
	}
	if !cipmWithinPrintedPrecision(p.TemperatureC, p.PressurePa) {
		d := Detail{Quantity: "air temperature", Value: p.TemperatureC, Unit: "°C", Relation: "outside −20–40 °C where CIPM-2007 was checked"}
		if p.PressurePa > cipmCheckedMaxPa {
			d = Detail{Quantity: "air pressure", Value: p.PressurePa / 1e6, Unit: "MPa", Relation: "> 5 MPa where CIPM-2007 was checked"}
		}
		addDetailed(&p.Warnings, brief, WarnOutOfRange, d, func() string {
			return fmt.Sprintf("air: CIPM-2007 density is specified for 15–27 °C and 600–1100 hPa and checked to 0.03 %% at −20–40 °C up to 5 MPa; used at %.4g °C and %.5g hPa, its error may show in 3 significant digits", p.TemperatureC, p.PressurePa/100)
		})
	}
	if tK < 100 || tK > 1900 {
		addDetailed(&p.Warnings, brief, WarnOutOfRange, Detail{Quantity: "air temperature", Value: tK, Unit: "K", Relation: "outside 100–1900 K for Sutherland's law"}, func() string {
			return fmt.Sprintf("air: Sutherland's law is published for about 100–1900 K; used at %.4g K", tK)
		})
	}
	return p, checkPhysical(&p)
}
