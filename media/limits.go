package media

import (
	"fmt"
	"math"
)

// Where the water and air methods stop giving physical results. Each bound
// is refused beyond; between a method's published range and these bounds
// the result carries a warning that says how far it may be off.
const (
	// IF97MaxPressurePa is the upper pressure of IAPWS-IF97 region 1
	// (IAPWS R7-97(2012), section 5: 100 MPa) and of EOS-80 (1000 bar sea
	// pressure; Fofonoff & Millard 1983).
	IF97MaxPressurePa = 100e6

	// WaterMaxPressurePa is the highest absolute pressure accepted for
	// water. Compared with IAPWS-95 (Wagner & Pruss 2002, as computed by
	// the python3-iapws package) at 0–40 °C, the IF97 region 1 density
	// extrapolated to 200 MPa stays within 0.05 % and the R12-08
	// viscosity on it within 0.05 %, and EOS-80 at zero salinity within
	// 0.04 %; at 300 MPa IF97 is 0.4 % off and the viscosity 1.1 %, and by
	// 700 MPa the IF97 density is negative. Measured for this project.
	WaterMaxPressurePa = 200e6

	// IF97MaxTemperatureC is the upper temperature of IAPWS-IF97 region 1,
	// 623.15 K (IAPWS R7-97(2012), section 5); above it liquid water
	// belongs to region 3, which is not implemented.
	IF97MaxTemperatureC = 350.0

	// SeawaterMaxTemperatureC is the highest sea-water temperature
	// accepted. EOS-80 is published for −2–40 °C; its pure-water part is
	// 0.2 % above IAPWS-95 at 80 °C and 1.1 % above at 100 °C, and at
	// practical salinity 35 its density rises again with temperature above
	// about 100 °C (1017 kg/m³ at 120 °C against 999 at 100 °C), which no
	// liquid does. Measured for this project against IAPWS-95.
	SeawaterMaxTemperatureC = 100.0

	// MaxWaterDepthM is the deepest water accepted: a little below the
	// deepest ocean, the Challenger Deep at about 10.9 km (recalled from
	// memory). The Saunders & Fofonoff (1976) depth–pressure relation is
	// fitted to 0–10,000 dbar (about 9.8 km); to 12 km it is extrapolated
	// and says so through the EOS-80 pressure warning.
	MaxWaterDepthM = 12000.0

	// AirMaxPressurePa is the highest air pressure accepted. The CIPM-2007
	// density (published for 600–1100 hPa) stays within 0.03 % of the
	// reference equation for air of Lemmon et al. (2000, J. Phys. Chem.
	// Ref. Data 29, 331; as computed by the python3-iapws package) up to
	// 5 MPa at −20–40 °C and within 0.5 % at 10 MPa, but is 1–4 % off at
	// 20 MPa and worse beyond (at 1 GPa its compressibility factor is
	// about 200). Measured for this project.
	AirMaxPressurePa = 10e6

	// MaxSalinityGkg bounds reference-composition salinity by its
	// definition: grams of salt per kilogram of sea water cannot reach
	// 1000 g/kg.
	MaxSalinityGkg = 1000.0
)

// checkWaterPressure refuses a water pressure beyond [WaterMaxPressurePa].
func checkWaterPressure(what string, pPa float64) error {
	if pPa > WaterMaxPressurePa {
		return outOfRange(what+" pressure", FieldPressure, pPa, 0, WaterMaxPressurePa, "Pa", "%s pressure %.4g MPa is above %g MPa, the highest accepted: IAPWS-IF97 region 1 and EOS-80 end at 100 MPa and beyond 200 MPa their extrapolation departs from IAPWS-95 (by 700 MPa the density is negative)", what, pPa/1e6, WaterMaxPressurePa/1e6)
	}
	return nil
}

// warnHighPressure warns of water between the published 100 MPa and the
// accepted 200 MPa.
func warnHighPressure(ws *[]Warning, brief bool, what, method string, pPa float64) {
	if pPa <= IF97MaxPressurePa {
		return
	}
	addDetailed(ws, brief, WarnOutOfRange, Detail{Quantity: "pressure", Value: pPa / 1e6, Unit: "MPa", Relation: "> 100 MPa: " + method + " extrapolated"}, func() string {
		return fmt.Sprintf("%s: %.4g MPa is above the 100 MPa limit of %s; extrapolated (for pure water at 0–40 °C within 0.05 %% of IAPWS-95 up to 200 MPa, measured)", what, pPa/1e6, method)
	})
}

// checkPhysical refuses properties that are not finite positive numbers,
// the last guard behind the range checks: no NaN, infinity or negative
// density or viscosity leaves this package. The message is formatted only
// on failure (batch looks up many conditions).
func checkPhysical(p *Properties) error {
	for _, q := range [...]struct {
		name string
		v    float64
	}{{"density", p.Density}, {"dynamic viscosity", p.DynamicViscosity}, {"kinematic viscosity", p.KinematicViscosity}} {
		if !(q.v > 0) || math.IsInf(q.v, 0) {
			at := fmt.Sprintf("%s at %.4g °C and %.6g Pa", p.Medium, p.TemperatureC, p.PressurePa)
			if !math.IsNaN(p.SalinityPractical) {
				at += fmt.Sprintf(", practical salinity %.4g", p.SalinityPractical)
			}
			return errorf("%s: the %s comes out as %.4g, which is not physical; the conditions are beyond its methods' range", at, q.name, q.v)
		}
	}
	return nil
}
