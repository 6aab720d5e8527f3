// Package media gives the density and viscosity of the fluids organisms live
// in: fresh water, sea water and air at stated conditions, each with the
// published methods it used and warnings where a condition lies outside a
// method's published range.
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
//	rheology models              Newtonian … Casson    Ostwald; de Waele; Cross 1965; Carreau 1972;
//	                                                   Yasuda et al. 1981; Bingham 1916;
//	                                                   Herschel & Bulkley 1926; Casson 1959
//	rheometer fits               FitRheology           Levenberg–Marquardt on log residuals; AICc
//	                                                   (Burnham & Anderson 2002)
//	measured media               MediumFile            this package's schema, version 1
//
// A medium at fixed conditions is a [Properties] value. Its
// [Properties.ApparentViscosity] takes a shear rate, so that a measured
// non-Newtonian fluid (with a [Rheology]) fits the same type as water and air.
package media
