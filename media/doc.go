// Package media gives the density and viscosity of the fluids organisms
// live in: fresh water, sea water and air at stated conditions, lab fluids
// (glycerol and sucrose solutions) and measured non-Newtonian fluids. Every
// result names the published methods it used and warns where a condition
// lies outside a method's published range.
//
// # Looking a medium up
//
// Fill in what you know and leave the rest at zero:
//
//	p, err := media.Lookup(media.Conditions{Medium: "seawater", TemperatureC: 12})
//	// p.Density (kg/m³), p.DynamicViscosity (Pa·s), p.KinematicViscosity (m²/s)
//
// A field left at zero (or NaN) is not given and takes its documented
// default (20 °C for water, 35 g/kg salinity, the surface, 45° latitude,
// dry air, the standard atmosphere); every default used is listed in
// [Properties.Assumed], each condition applied in [Properties.Methods].
// Where zero is a real value — 0 °C, salinity 0, the equator — name the
// field in [Conditions.StatedZero] to state it. [Unset] gives the other
// convention: every field NaN until set. [Options] with Brief set gives a
// lookup that formats no text, for many rows.
//
// A [Properties] value is a fluid at fixed conditions. Physics reads its
// properties, never its name: [Properties.Gas] says organisms fly in it,
// [Properties.Water] that dissolved oxygen diffuses as in water, and
// [Properties.ApparentViscosity] takes a shear rate, so that a measured
// non-Newtonian fluid (with a [Rheology]) fits the same type as water.
//
// # Measured fluids
//
// A medium file (schema in [MediumFile]) holds a fitted rheology model.
// This package reads files from an [io.Reader] only ([ReadMediumFile]) and
// evaluates them with [MediumFile.At]; it never opens a path, and [Lookup]
// knows only the built-in media and lab fluids. [FitRheology] fits the
// models (listed in [ModelNames]) to a flow curve, and the [Geometry]
// types reduce raw rheometer readings to one.
//
// # Errors
//
// Errors start with "media: "; each has a Reason method giving the message
// without it. A condition outside the accepted range is a [*RangeError],
// which names the quantity, its value and the accepted range; an unknown
// medium name wraps [ErrUnknownMedium]:
//
//	var re *media.RangeError
//	if errors.As(err, &re) { … re.Quantity, re.Value, re.Min, re.Max, re.Unit }
//
// # Units and methods
//
// All values are SI: kelvin or degrees Celsius where the name says so,
// pascals (absolute pressure unless the name says "sea pressure"),
// kg/m³, Pa·s and m²/s.
//
//	Quantity                     Function              Source
//	fresh-water viscosity        WaterViscosity        IAPWS R12-08 (Huber et al. 2009)
//	fresh-water density          WaterDensityIF97      IAPWS-IF97 region 1 (IAPWS R7-97(2012))
//	ice melting temperature      waterFreezingK        IAPWS R14-08 slope near the ice point
//	sea-water density            SeawaterDensityEOS80  UNESCO EOS-80 (Millero & Poisson 1981; Fofonoff & Millard 1983)
//	sea-water viscosity          SeawaterViscosity     Sharqawy, Lienhard & Zubair 2010, eq. 22
//	sea-water freezing point     SeawaterFreezingC     UNESCO 1983 (Fofonoff & Millard 1983)
//	depth to sea pressure        SeaPressureAtDepth    Saunders & Fofonoff 1976; Fofonoff & Millard 1983
//	standard atmosphere          StandardAtmosphere    US Standard Atmosphere 1976 = ISO 2533:1975
//	moist-air density            MoistAirDensity       CIPM-2007 (Picard et al. 2008)
//	air viscosity                SutherlandViscosity   Sutherland 1893 with ISO 2533 constants
//	glycerol–water viscosity     GlycerolViscosity     Cheng 2008; density Volk & Kähler 2018
//	sucrose solutions            SucroseProperties     CRC Handbook, 102nd ed. (2021), at 20 °C
//	rheology models              Newtonian … Casson    Ostwald; de Waele; Cross 1965; Carreau 1972;
//	                                                   Yasuda et al. 1981; Bingham 1916;
//	                                                   Herschel & Bulkley 1926; Casson 1959
//	rheometer fits               FitRheology           Levenberg–Marquardt on log residuals; AICc
//	                                                   (Burnham & Anderson 2002)
//	measured media               MediumFile            this package's schema, versions 1 and 2
package media
