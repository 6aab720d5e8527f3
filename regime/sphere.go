package regime

import "math"

// Drag coefficients of a rigid sphere, each on the frontal area πd²/4 with
// the Reynolds number Re = ρUd/μ on the diameter d.

// StokesCD returns C_D = 24/Re, Stokes' creeping-flow drag F = 3πμdU.
// Good to 2 % for Re ≤ 0.1.
//
// Reference: Stokes, G. G. (1851), On the effect of the internal friction of
// fluids on the motion of pendulums, Trans. Camb. Phil. Soc. 9, 8–106.
func StokesCD(re float64) float64 { return 24 / re }

// OseenCD returns C_D = (24/Re)(1 + 3Re/16), Oseen's first inertial
// correction (Oseen, C. W. (1910), Ark. Mat. Astr. Fys. 6, no. 29). Re ≲ 1.
func OseenCD(re float64) float64 { return 24 / re * (1 + 3*re/16) }

// ProudmanPearsonCD returns the matched-asymptotic expansion
// C_D = (24/Re)[1 + 3Re/16 + (9/160)Re² ln(Re/2)]. Re ≲ 1.
//
// Reference: Proudman, I. & Pearson, J. R. A. (1957), Expansions at small
// Reynolds numbers for the flow past a sphere and a circular cylinder,
// J. Fluid Mech. 2, 237–262.
func ProudmanPearsonCD(re float64) float64 {
	return 24 / re * (1 + 3*re/16 + 9.0/160*re*re*math.Log(re/2))
}

// SchillerNaumannCD returns C_D = (24/Re)(1 + 0.15 Re^0.687), for Re ≤ 800.
//
// Reference: Schiller, L. & Naumann, A. (1933), Über die grundlegenden
// Berechnungen bei der Schwerkraftaufbereitung, Z. Ver. Dtsch. Ing. 77, 318.
func SchillerNaumannCD(re float64) float64 { return 24 / re * (1 + 0.15*pow(re, 0.687)) }

// CliftGauvinCD returns
// C_D = (24/Re)(1 + 0.15 Re^0.687) + 0.42/(1 + 4.25e4 Re^−1.16), smooth and
// continuous in Re, for Re ≤ 3e5.
//
// Reference: Clift, R. & Gauvin, W. H. (1970), Proc. Chemeca '70, vol. 1,
// 14–28; as given in Clift, Grace & Weber (1978), Bubbles, Drops, and
// Particles, Academic Press,.
func CliftGauvinCD(re float64) float64 {
	return 24/re*(1+0.15*pow(re, 0.687)) + 0.42/(1+4.25e4*pow(re, -1.16))
}

// StandardCurveCD returns the standard drag curve of a smooth sphere, the
// recommended correlations of Clift, Grace & Weber (1978), Bubbles, Drops,
// and Particles, Academic Press, Table 5.2, over all Re > 0, including the
// drag crisis (3.38e5 < Re ≤ 1e6) and the post-critical branch.
func StandardCurveCD(re float64) float64 {
	w := math.Log10(re)
	switch {
	case re <= 0.01:
		return 3.0/16 + 24/re
	case re <= 20:
		return 24 / re * (1 + 0.1315*pow(re, 0.82-0.05*w))
	case re <= 260:
		return 24 / re * (1 + 0.1935*pow(re, 0.6305))
	case re <= 1500:
		return exp10(1.6435 - 1.1242*w + 0.1558*w*w)
	case re <= 1.2e4:
		return exp10(-2.4571 + 2.5558*w - 0.9295*w*w + 0.1049*w*w*w)
	case re <= 4.4e4:
		return exp10(-1.9181 + 0.6370*w - 0.0636*w*w)
	case re <= 3.38e5:
		return exp10(-4.3390 + 1.5809*w - 0.1546*w*w)
	case re <= 4e5:
		return 29.78 - 5.3*w
	case re <= 1e6:
		return 0.1*w - 0.49
	default:
		return 0.19 - 8e4/re
	}
}

// NewtonCD is the constant drag coefficient of the quadratic (Newton) regime
// of a sphere, C_D ≈ 0.44 for 1e3 < Re < 2e5 (common practice, e.g. Perry's
// Chemical Engineers' Handbook; within about ±10 % of the standard curve).
const NewtonCD = 0.44

// HaiderLevenspielCD returns the drag coefficient of an isometric or
// elongated particle of sphericity phi (0 < phi ≤ 1), with Re on the
// diameter of the sphere of equal volume and C_D on that sphere's frontal
// area; published for Re < 2.6e5.
//
// Reference: Haider, A. & Levenspiel, O. (1989), Drag coefficient and
// terminal velocity of spherical and nonspherical particles, Powder Technol.
// 58, 63–70, eqs. 10–11. The coefficients were checked against the form
// and coefficients reproduced in the ANSYS Fluent 12.0 Theory Guide (2009),
// §15.3.2, eqs. 15.3-2 and 15.3-3 (identical); at phi = 1 they agree with
// the authors' own sphere fit to a few per cent (see the tests).
func HaiderLevenspielCD(re, phi float64) float64 {
	a := math.Exp(2.3288 - 6.4581*phi + 2.4486*phi*phi)
	b := 0.0964 + 0.5565*phi
	c := math.Exp(4.905 - 13.8944*phi + 18.4222*phi*phi - 10.2599*phi*phi*phi)
	d := math.Exp(1.4681 + 12.2584*phi - 20.7322*phi*phi + 15.8855*phi*phi*phi)
	return 24/re*(1+a*pow(re, b)) + c/(1+d/re)
}
