package regime

import "math"

// ProlateSpheroidArea returns the surface area (m²) of a prolate spheroid of
// length l and maximum diameter d (l ≥ d): S = 2πb²[1 + (a/(b e)) asin e]
// with a = l/2, b = d/2, e = √(1 − b²/a²). A sphere (l = d) gives πd².
func ProlateSpheroidArea(l, d float64) float64 {
	a, b := l/2, d/2
	if a <= b {
		return math.Pi * d * d
	}
	e := math.Sqrt(1 - b*b/(a*a))
	return 2 * math.Pi * b * b * (1 + a/(b*e)*math.Asin(e))
}

// ProlateSpheroidVolume returns the volume (m³) of a spheroid of length l and
// diameter d, πld²/6.
func ProlateSpheroidVolume(l, d float64) float64 { return math.Pi * l * d * d / 6 }

// Sphericity returns the Wadell sphericity of a prolate spheroid: the area of
// the sphere of equal volume over the spheroid's area.
func Sphericity(l, d float64) float64 {
	deq := math.Cbrt(l * d * d)
	return math.Pi * deq * deq / ProlateSpheroidArea(l, d)
}

// ProlateAxialStokesDrag returns the creeping-flow drag (N) on a prolate
// spheroid of length l and maximum diameter d (l ≥ d) translating along its
// axis of symmetry at speed u through a fluid of viscosity mu:
// F = 16πμUa e³/((1 + e²)L − 2e), L = ln((1+e)/(1−e)), a = l/2,
// e = √(1 − d²/l²). The sphere limit is 3πμdU.
//
// Reference: Oberbeck, A. (1876), J. reine angew. Math. 81, 62; Happel, J. &
// Brenner, H. (1965), Low Reynolds Number Hydrodynamics, Prentice-Hall,
// ch. 4.
func ProlateAxialStokesDrag(mu, u, l, d float64) float64 {
	a := l / 2
	e := math.Sqrt(1 - d*d/(l*l))
	if e < 1e-4 { // series limit e → 0: F → 6πμaU (1 − 2e²/5 …), from (1+e²)L − 2e = (8/3)e³ + (16/15)e⁵ + …
		return 6 * math.Pi * mu * a * u * (1 - 2*e*e/5)
	}
	bigL := math.Log((1 + e) / (1 - e))
	return 16 * math.Pi * mu * u * a * e * e * e / ((1+e*e)*bigL - 2*e)
}

// SlenderRodAxialDrag returns the creeping-flow drag (N) on a straight rod of
// length l and radius a with blunt ends moving along its axis at speed u,
// to leading orders in 1/ln(l/a): F = 2πμlU/(ln(l/a) − 0.807). Poor for
// l/a < 10.
//
// Reference: Cox, R. G. (1970), The motion of long slender bodies in a
// viscous fluid. Part 1. General theory, J. Fluid Mech. 44, 791–810;
// constants ln 2 − 3/2 as in Batchelor, G. K. (1970), J. Fluid Mech. 44, 419.
func SlenderRodAxialDrag(mu, u, l, a float64) float64 {
	return 2 * math.Pi * mu * l * u / (math.Log(l/a) + math.Ln2 - 1.5)
}

// SlenderRodBroadsideDrag is the drag (N) of the same rod moving
// perpendicular to its axis: F = 4πμlU/(ln(l/a) + 0.193) (Cox 1970).
func SlenderRodBroadsideDrag(mu, u, l, a float64) float64 {
	return 4 * math.Pi * mu * l * u / (math.Log(l/a) + math.Ln2 - 0.5)
}

// GrayHancockCoefficients returns the resistive-force coefficients per unit
// length (N s/m²) of a filament of radius a beating with wavelength lambda:
// normal C_N = 4πμ/(ln(2λ/a) + 1/2), tangential C_T = 2πμ/(ln(2λ/a) − 1/2).
//
// Reference: Gray, J. & Hancock, G. J. (1955), The propulsion of sea-urchin
// spermatozoa, J. Exp. Biol. 32, 802–814.
func GrayHancockCoefficients(mu, a, lambda float64) (cn, ct float64) {
	l := math.Log(2 * lambda / a)
	return 4 * math.Pi * mu / (l + 0.5), 2 * math.Pi * mu / (l - 0.5)
}

// LighthillCoefficients returns Lighthill's resistive-force coefficients per
// unit length (N s/m²): C_N = 4πμ/(ln(2q/a) + 1/2), C_T = 2πμ/ln(2q/a),
// q = 0.09Λ with Λ the wavelength measured along the filament.
//
// Reference: Lighthill, J. (1976), Flagellar hydrodynamics, SIAM Review 18,
// 161–230.
func LighthillCoefficients(mu, a, lambda float64) (cn, ct float64) {
	l := math.Log(2 * 0.09 * lambda / a)
	return 4 * math.Pi * mu / (l + 0.5), 2 * math.Pi * mu / l
}

// LambCylinderCD returns Lamb's Oseen-flow drag coefficient of a circular
// cylinder in cross-flow, per unit length on the projected area d·1, with Re
// on the diameter: C_D = 8π/(Re (1/2 − γ − ln(Re/8))). Re ≲ 0.5.
//
// Reference: Lamb, H. (1911), On the uniform motion of a sphere through a
// viscous fluid, Phil. Mag. (6) 21, 112–121; Lamb (1932), Hydrodynamics,
// 6th ed., §343.
func LambCylinderCD(re float64) float64 {
	const eulerGamma = 0.57721566490153286
	return 8 * math.Pi / (re * (0.5 - eulerGamma - math.Log(re/8)))
}

// WhiteCylinderCD returns White's curve fit for the drag coefficient of a
// circular cylinder in cross-flow, C_D ≈ 1 + 10 Re^(−2/3), for
// 1 < Re < 2e5 (Re on the diameter, C_D on the projected area).
//
// Reference: White, F. M. (2006), Viscous Fluid Flow, 3rd ed., McGraw-Hill,
// ch. 3.
func WhiteCylinderCD(re float64) float64 { return 1 + 10*pow(re, -2.0/3) }

// OseenCorrection returns the creeping-flow drag fS (N) of a body translating
// along an axis of symmetry corrected for the first effect of inertia,
// F = F_S (1 + F_S ρ/(16πμ²)), valid for any shape at Re ≲ 1; for a sphere
// it is Oseen's (1 + 3Re/16).
//
// Reference: Brenner, H. (1961), The Oseen resistance of a particle of
// arbitrary shape, J. Fluid Mech. 11, 604–610.
func OseenCorrection(fS, rho, mu float64) float64 {
	return fS * (1 + fS*rho/(16*math.Pi*mu*mu))
}

// WaveSwimmingSpeed returns the swimming speed of a headless filament
// passing small-amplitude planar waves of speed c, U = c (C_N/C_T − 1)(kA)²/2,
// with k the wavenumber and A the wave amplitude (kA ≪ 1), from
// resistive-force theory. At C_N/C_T = 2 it is Taylor's swimming sheet,
// U/c = (kA)²/2.
//
// Reference: Gray, J. & Hancock, G. J. (1955), J. Exp. Biol. 32, 802;
// Lauga, E. & Powers, T. R. (2009), The hydrodynamics of swimming
// microorganisms, Rep. Prog. Phys. 72, 096601, §4.
func WaveSwimmingSpeed(c, cnOverCt, kA float64) float64 {
	return c * (cnOverCt - 1) * kA * kA / 2
}

// HolzerSommerfeldCD returns the drag coefficient of a non-spherical
// particle of any orientation,
// C_D = 8/(Re√φ∥) + 16/(Re√φ) + 3/(√Re φ^(3/4)) + 0.42·10^(0.4(−log₁₀ φ)^0.2)/φ⊥,
// with Re on the diameter of the equal-volume sphere and C_D on that
// sphere's frontal area; φ is the sphericity, φ⊥ the crosswise sphericity
// (the equal-volume sphere's cross-section over the particle's projected
// area across the flow) and φ∥ the lengthwise sphericity (that
// cross-section over half the surface less the particle's projected area
// along the flow). At φ = φ⊥ = φ∥ = 1 its creeping limit is 24/Re.
//
// Reference: Hölzer, A. & Sommerfeld, M. (2008), New simple correlation
// formula for the drag coefficient of non-spherical particles, Powder
// Technol. 184, 361–365 (the form and coefficients as reproduced, alike,
// in two independent implementations; the area convention checked by the
// Stokes limit).
func HolzerSommerfeldCD(re, phi, phiPerp, phiPar float64) float64 {
	// pow and exp10 (exp/log, about 1e-15 relative) in place of math.Pow:
	// this runs once per elongated body per row in batch.
	lead := 0.42 / phiPerp // φ = 1 (a sphere): -log10 φ = 0, 0^0.2 = 0, so 10^0 = 1
	if phi < 1 {
		lead *= exp10(0.4 * pow(-math.Log10(phi), 0.2))
	}
	return 8/(re*math.Sqrt(phiPar)) + 16/(re*math.Sqrt(phi)) + 3/(math.Sqrt(re)*pow(phi, 0.75)) + lead
}

// alignedSphericities returns φ, φ⊥ and φ∥ of a body moving along its
// axis from its volume-equivalent diameter, surface area, frontal area and
// longitudinal section.
func alignedSphericities(deq, area, frontal, section float64) (phi, perp, par float64) {
	cross := math.Pi * deq * deq / 4
	return math.Pi * deq * deq / area, cross / frontal, cross / (area/2 - section)
}
