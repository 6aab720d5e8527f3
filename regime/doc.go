// Package regime computes the flow regime of a swimming or flying organism
// and what follows from it: Reynolds and Strouhal numbers, the drag from the
// published law whose range holds the case (with the neighbouring laws'
// estimates), the power needed, terminal settling speeds, and how input
// uncertainty carries into all of these. The fluid comes from package media.
//
// # Five lines
//
// A fish in sea water (error checks left out; the package's Example_fish
// has them and its output):
//
//	sea, err := media.Lookup(media.Conditions{Medium: media.KindSeawater, TemperatureC: 5, SalinityPractical: 35})
//	fish := regime.Organism{Body: regime.Body{Shape: regime.Spheroid, Length: 0.30, Diameter: 0.06}, Speed: 0.6}
//	r, err := regime.Calc(fish, sea)
//	fmt.Println(r.Reynolds, r.Regime, r.Drag.Chosen.Force, r.Power.Total)
//
// # Inputs
//
// Everything is SI: metres, seconds, kilograms, pascals. An [Organism] needs
// its [Body] (shape and size) and speed; every other number is optional and
// positive when given. Leave it zero when it was not measured (NaN means
// the same): Calc then uses the default its field's comment names (towing
// power without an efficiency, for example) and the [Result] shows what it
// used, with a warning where the default changes the answer much (a flyer
// without a wingbeat frequency flaps continuously). A [Particle] for
// [Settle] and a [FlightInput] for [Flight] follow the same rule.
//
// # Results
//
// [Calc] returns a [Result]: the numbers, the chosen drag law's [Estimate]
// with the other applicable laws' estimates, the [Power], and Warnings.
// A number that does not apply (a Strouhal number without a stroke) is NaN.
// A law used outside its published range is not an error: the result
// carries a Warning with code [WarnLawOutOfRange]; each code is a constant
// (Warn…). [Laws] lists the drag laws with their sources and ranges.
//
// For millions of rows, [CalcInto] writes into a Result it reuses and,
// with [Options].Brief, skips the neighbouring laws and warning texts:
// it allocates nothing per row.
//
// # Errors
//
// Errors start with "regime:". An input out of its range is an
// [*InputError] (field, value, accepted range, unit); a result pushed out
// of floating-point range by an absurd input is a [*RangeError] naming the
// input to check; anything else is an [*Error]. Each has a Reason method
// giving the message without the prefix.
//
// # Methods
//
//	Quantity                      Function                 Source
//	Reynolds, Strouhal numbers    Reynolds, Strouhal       St band: Taylor, Nudds & Thomas 2003, Nature 425
//	advance ratio                 AdvanceRatio             Ellington 1984, Phil. Trans. R. Soc. B 305, part III
//	sphere drag                   StokesCD … StandardCurveCD Stokes 1851; Oseen 1910; Proudman & Pearson 1957;
//	                                                       Schiller & Naumann 1933; Clift & Gauvin 1970;
//	                                                       Clift, Grace & Weber 1978, Table 5.2
//	non-spherical particles       HaiderLevenspielCD       Haider & Levenspiel 1989, Powder Technol. 58
//	prolate spheroid, Stokes flow ProlateAxialStokesDrag   Oberbeck 1876; Happel & Brenner 1965
//	Oseen correction, any shape   OseenCorrection          Brenner 1961, J. Fluid Mech. 11
//	slender rod                   SlenderRodAxialDrag      Cox 1970, J. Fluid Mech. 44
//	resistive-force coefficients  GrayHancockCoefficients  Gray & Hancock 1955; Lighthill 1976
//	cylinder in cross-flow        LambCylinderCD           Lamb 1911; White 2006 (fit)
//	skin friction                 BlasiusCf, …             Blasius 1908; Prandtl–Schlichting; ITTC 1957
//	form factor                   HoernerFormFactor        Hoerner 1965, Fluid-Dynamic Drag, ch. 6
//	flight power                  Flight                   Rankine 1865; Froude 1889; Glauert 1935;
//	                                                       Weis-Fogh 1973; Ellington 1984 part VI;
//	                                                       Pennycuick 2008 (body C_Db, profile ratio)
//	gliding                       Flight (Gliding)         Tucker & Heine 1990 (profile C_D)
//	power curve minima            FlightPowerCurve         Brent 1973
//	settling                      Settle                   Clift & Gauvin 1970; Cunningham 1910 / Davies 1945
//	power-law creeping drag       RenaudX                  Renaud, Mauret & Chhabra 2004
//	yield criterion               BerisCritical            Beris et al. 1985, J. Fluid Mech. 158
//	coasting                      Coasting, CoastingPowerLaw, CoastingDrag  Purcell 1977; Newton's law integrated
//	O₂ diffusivity, Péclet        OxygenDiffusivityWater   Han & Bartels 1996; Stokes–Einstein
//	uncertainty                   MonteCarlo, Linear       seeded Monte Carlo; first order in log space
package regime
