package media

import (
	"fmt"
	"math"
)

// PracticalFromAbsolute converts reference-composition salinity SR (g/kg) to
// practical salinity SP: SP = SR · 35/35.16504 (Millero et al. 2008, Deep-Sea
// Res. I 55, 50, eq. (7)). TEOS-10 Absolute Salinity differs from SR by the
// composition anomaly δSA, under 0.03 g/kg in the open ocean; it is not
// modelled here (see DEVELOPERS.md for the Baltic exception).
func PracticalFromAbsolute(sr float64) float64 { return sr * saltToPractical }

// AbsoluteFromPractical is the inverse of [PracticalFromAbsolute].
func AbsoluteFromPractical(sp float64) float64 { return sp / saltToPractical }

// SeawaterDensityEOS80 returns the in-situ density of sea water in kg/m³ from
// the UNESCO International Equation of State of Seawater 1980 at practical
// salinity sp, temperature t68 (°C, IPTS-68) and sea pressure pBar (bar,
// absolute pressure less one atmosphere). Valid for SP 0–42, t −2–40 °C and
// 0–1000 bar.
//
// Reference: Millero, F. J. & Poisson, A. (1981), Deep-Sea Res. 28A, 625;
// UNESCO (1981), Tech. Pap. Mar. Sci. 36 and 38; algorithm as in Fofonoff,
// N. P. & Millard, R. C. (1983), UNESCO Tech. Pap. Mar. Sci. 44, pp. 15–18.
func SeawaterDensityEOS80(sp, t68, pBar float64) float64 {
	t := t68
	s := sp
	s15 := s * math.Sqrt(s)
	rhoW := 999.842594 + t*(6.793952e-2+t*(-9.095290e-3+t*(1.001685e-4+t*(-1.120083e-6+t*6.536332e-9))))
	a := 8.24493e-1 + t*(-4.0899e-3+t*(7.6438e-5+t*(-8.2467e-7+t*5.3875e-9)))
	b := -5.72466e-3 + t*(1.0227e-4-t*1.6546e-6)
	c := 4.8314e-4
	rho0 := rhoW + a*s + b*s15 + c*s*s // one-atmosphere density
	if pBar == 0 {
		return rho0
	}
	return rho0 / (1 - pBar/seawaterSecantBulkModulus(s, t, pBar))
}

// seawaterSecantBulkModulus returns K(S, t, p) in bar (Millero et al. 1980,
// Deep-Sea Res. 27A, 255; Fofonoff & Millard 1983).
func seawaterSecantBulkModulus(s, t, p float64) float64 {
	s15 := s * math.Sqrt(s)
	kw := 19652.21 + t*(148.4206+t*(-2.327105+t*(1.360477e-2-t*5.155288e-5)))
	aw := 3.239908 + t*(1.43713e-3+t*(1.16092e-4-t*5.77905e-7))
	bw := 8.50935e-5 + t*(-6.12293e-6+t*5.2787e-8)
	k0 := kw + (54.6746+t*(-0.603459+t*(1.09987e-2-t*6.1670e-5)))*s + (7.944e-2+t*(1.6483e-2-t*5.3009e-4))*s15
	a := aw + (2.2838e-3+t*(-1.0981e-5-t*1.6078e-6))*s + 1.91075e-4*s15
	b := bw + (-9.9348e-7+t*(2.0816e-8+t*9.1697e-10))*s
	return k0 + a*p + b*p*p
}

// SeawaterViscosity returns the dynamic viscosity of sea water in Pa·s as
// μ_w (1 + A S + B S²) with S the reference-composition salinity in kg/kg
// and μ_w the pure-water viscosity given by the caller. Published range
// 0–180 °C, 0–150 g/kg, accuracy ±1.5 %.
//
// Reference: Sharqawy, M. H., Lienhard, J. H. & Zubair, S. M. (2010),
// Thermophysical properties of seawater: a review of existing correlations
// and data, Desalination and Water Treatment 16, 354–380, eq. (22).
func SeawaterViscosity(muW, tC, srGkg float64) float64 {
	s := srGkg / 1000
	a := 1.541 + 1.998e-2*tC - 9.52e-5*tC*tC
	b := 7.974 - 7.561e-2*tC + 4.724e-4*tC*tC
	return muW * (1 + a*s + b*s*s)
}

// SeawaterFreezingC returns the freezing point of sea water in °C at
// practical salinity sp and sea pressure dbar (UNESCO 1983 formula of
// Millero & Leung 1976 with the pressure term of Fofonoff & Millard 1983,
// UNESCO Tech. Pap. Mar. Sci. 44, p. 29; published range SP 4–40,
// 0–500 dbar).
func SeawaterFreezingC(sp, dbar float64) float64 {
	return (-0.0575+1.710523e-3*math.Sqrt(sp)-2.154996e-4*sp)*sp - 7.53e-4*dbar
}

// SeaPressureAtDepth returns the sea pressure in dbar at depth z (m) below
// the sea surface at latitude lat (degrees), inverting the depth formula of
// Saunders & Fofonoff (1976), as given by Fofonoff & Millard (1983), UNESCO
// Tech. Pap. Mar. Sci. 44, p. 28 (a standard ocean of 0 °C and SP 35 with
// gravity varying with latitude and pressure).
func SeaPressureAtDepth(z, lat float64) float64 {
	x := sinSquared(lat) // once, not at every evaluation of the depth
	p := z               // dbar ≈ m as a first guess
	for range 30 {
		f := depthAtSeaPressure(p, x) - z
		h := 1e-3
		df := (depthAtSeaPressure(p+h, x) - depthAtSeaPressure(p-h, x)) / (2 * h)
		step := f / df
		p -= step
		if math.Abs(step) < 1e-9 {
			break
		}
	}
	return p
}

// DepthAtSeaPressure returns the depth in m at sea pressure p (dbar) and
// latitude lat (degrees) by the formula of Saunders & Fofonoff (1976) in
// Fofonoff & Millard (1983), p. 28.
func DepthAtSeaPressure(p, lat float64) float64 {
	return depthAtSeaPressure(p, sinSquared(lat))
}

// sinSquared returns sin²(lat) for lat in degrees, the x of the
// Saunders–Fofonoff gravity formula.
func sinSquared(lat float64) float64 {
	x := math.Sin(lat * math.Pi / 180)
	return x * x
}

// depthAtSeaPressure is [DepthAtSeaPressure] with x = sin²(latitude).
func depthAtSeaPressure(p, x float64) float64 {
	g := 9.780318*(1+(5.2788e-3+2.36e-5*x)*x) + 1.092e-6*p
	return (((-1.82e-15*p+2.279e-10)*p-2.2512e-5)*p + 9.72659) * p / g
}

// Seawater returns the properties of sea water at tC (°C, ITS-90), practical
// salinity sp and absolute pressure pPa. Density is EOS-80 (temperature
// converted to IPTS-68 by t68 = 1.00024 t90, Saunders 1990); viscosity is
// Sharqawy et al. (2010) eq. (22) on the IAPWS R12-08 pure-water viscosity at
// the same temperature and pressure, which carries the pressure dependence.
func Seawater(tC, sp, pPa float64) (Properties, error) { return seawater(tC, sp, pPa, false) }

// seawater is [Seawater]; brief leaves out the method notes and the
// warnings' texts.
func seawater(tC, sp, pPa float64, brief bool) (Properties, error) {
	if !finite(tC, sp, pPa) {
		return Properties{}, errorf("sea water needs finite temperature, salinity and pressure")
	}
	if sp < 0 {
		return Properties{}, outOfRange("salinity", FieldSalinity, sp, 0, PracticalFromAbsolute(MaxSalinityGkg), "", "salinity %.4g is negative; give a practical salinity of 0 or more", sp)
	}
	if pPa < StandardPressurePa*0.5 {
		return Properties{}, errorf("sea-water pressure %.6g Pa is below half an atmosphere; give an absolute pressure (sea surface 101325 Pa)", pPa)
	}
	dbar := (pPa - StandardPressurePa) / 1e4
	if tf := SeawaterFreezingC(sp, math.Max(dbar, 0)); tC < tf-1e-9 {
		return Properties{}, errorf("sea water of salinity %.4g at %.4g °C and %.5g dbar is below its freezing point (%.3f °C); give a temperature at or above it", sp, tC, dbar, tf)
	}
	if tb := waterBoilingC(pPa); tC > tb {
		return Properties{}, errorf("sea water at %.4g °C and %.6g Pa is above the boiling point of water (%.4g °C)", tC, pPa, tb)
	}
	if sr := AbsoluteFromPractical(sp); sr >= MaxSalinityGkg {
		return Properties{}, outOfRange("salinity", FieldSalinity, sp, 0, PracticalFromAbsolute(MaxSalinityGkg), "", "salinity %.4g (%.4g g/kg) is impossible: salt per kilogram of sea water must stay below 1000 g/kg", sp, sr)
	}
	if tC > SeawaterMaxTemperatureC {
		return Properties{}, errorf("sea water at %.4g °C is above %g °C, the highest accepted: EOS-80 (published for −2–40 °C) gives a density that rises with temperature beyond it; give a lower temperature", tC, SeawaterMaxTemperatureC)
	}
	if err := checkWaterPressure("sea-water", pPa); err != nil {
		return Properties{}, err
	}
	p := blank("seawater")
	p.Water = true
	p.TemperatureC, p.PressurePa = tC, pPa
	p.SalinityPractical, p.SalinityAbsolute = sp, AbsoluteFromPractical(sp)
	p.SeaPressureDbar = dbar
	p.Density = SeawaterDensityEOS80(sp, 1.00024*tC, dbar/10)
	tK := tC + ZeroCelsiusK
	muW := WaterViscosity(tK, WaterDensityIF97(tK, pPa))
	p.DynamicViscosity = SeawaterViscosity(muW, tC, p.SalinityAbsolute)
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	if !brief {
		p.Methods = []string{
			"density: UNESCO EOS-80 (Millero & Poisson 1981; Fofonoff & Millard 1983), temperature on IPTS-68",
			"viscosity: Sharqawy, Lienhard & Zubair 2010 eq. 22 on IAPWS R12-08 pure water at the same temperature and pressure",
			"salinity: practical (PSS-78); reference-composition salinity SR = SP × 35.16504/35 g/kg (Millero et al. 2008)",
		}
	}
	const seaDensityVisibleSalinity, seaDensityVisibleC = 60.0, 60.0
	// Beyond EOS-80's stated ranges the density is flagged only where its
	// measured error could show in 3 digits (PrintedPrecision, 0.05 %):
	// above 60 of salinity (0.01 % at 60, 0.07 % at 80) and above 60 °C
	// (0.02 % at 60 °C, 0.2 % at 80 °C), per the measurements quoted below.
	if sp > seaDensityVisibleSalinity {
		addDetailed(&p.Warnings, brief, WarnOutOfRange, Detail{Quantity: "practical salinity", Value: sp, Relation: "> 60: EOS-80 density extrapolated (range 0–42)"}, func() string {
			return fmt.Sprintf("sea water: practical salinity %.4g is above the EOS-80 range 0–42; density is extrapolated (above TEOS-10 by 0.01 %% at 60, 0.07 %% at 80, 0.3 %% at 100, 0.9 %% at 120, measured at the surface)", sp)
		})
	}
	if tC < -2 || tC > seaDensityVisibleC {
		addDetailed(&p.Warnings, brief, WarnOutOfRange, Detail{Quantity: "sea water temperature", Value: tC, Unit: "°C", Relation: "outside −2–60 °C: EOS-80 density extrapolated (range −2–40 °C)"}, func() string {
			return fmt.Sprintf("sea water: %.4g °C is outside the EOS-80 range −2 to 40 °C; density is extrapolated (its pure-water part is 0.02 %% above IAPWS-95 at 60 °C, 0.2 %% at 80 °C, 1.1 %% at 100 °C, measured)", tC)
		})
	}
	if dbar > 10000 {
		addDetailed(&p.Warnings, brief, WarnOutOfRange, Detail{Quantity: "sea pressure", Value: dbar, Unit: "dbar", Relation: "> 10000: EOS-80 extrapolated"}, func() string {
			return fmt.Sprintf("sea water: sea pressure %.5g dbar is above the EOS-80 limit of 10000 dbar (and the Saunders–Fofonoff depth relation's); extrapolated (for pure water at 0–40 °C within 0.05 %% of IAPWS-95 up to 200 MPa, measured)", dbar)
		})
	}
	if tC < 0 {
		addDetailed(&p.Warnings, brief, WarnOutOfRange, Detail{Quantity: "sea water temperature", Value: tC, Unit: "°C", Relation: "< 0 °C: Sharqawy viscosity extrapolated"}, func() string {
			return fmt.Sprintf("sea water: %.4g °C is below the 0 °C lower limit of the Sharqawy et al. viscosity correlation; viscosity is extrapolated", tC)
		})
	}
	if p.SalinityAbsolute > 150 {
		addDetailed(&p.Warnings, brief, WarnOutOfRange, Detail{Quantity: "salinity", Value: p.SalinityAbsolute, Unit: "g/kg", Relation: "> 150: Sharqawy viscosity extrapolated"}, func() string {
			return fmt.Sprintf("sea water: %.4g g/kg is above the 150 g/kg limit of the Sharqawy et al. viscosity correlation", p.SalinityAbsolute)
		})
	}
	return p, checkPhysical(&p)
}
