// Package regime computes the flow regime of a swimming or flying organism
// and what follows from it: Reynolds and Strouhal numbers, the drag from the
// published law whose range holds the case (with the neighbouring laws'
// estimates), the power needed, terminal settling speeds, and how input
// uncertainty carries into all of these.
//
// All inputs and outputs are SI. Each drag law is a value in [Laws] with its
// source, the length its Reynolds number is on, the area its coefficient is
// on, its published range and the range in which it is chosen; see
// [Drag]. [Calc] computes everything for one organism in a
// media.Properties; [Settle] solves for terminal speed.
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
//	power curve minima            FlightPowerCurve         Brent 1973 (Minimize1D)
//	settling                      Settle                   Clift & Gauvin 1970; Cunningham 1910 / Davies 1945
//	power-law creeping drag       RenaudX                  Renaud, Mauret & Chhabra 2004
//	yield criterion               BerisCritical            Beris et al. 1985, J. Fluid Mech. 158
//	coasting                      Coasting, CoastingPowerLaw, CoastingDrag  Purcell 1977; Newton's law integrated
//	O₂ diffusivity, Péclet        OxygenDiffusivityWater   Han & Bartels 1996; Stokes–Einstein
//	uncertainty                   MonteCarlo, Linear       seeded Monte Carlo; first order in log space
//
// Errors start with "regime:". A law used outside its published range is
// not an error: the result carries a [Warning] with code
// "correlation-out-of-range".
package regime
