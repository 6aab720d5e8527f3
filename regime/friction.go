package regime

import "math"

// Skin-friction coefficients of a flat plate, one side, averaged over the
// length L, on the wetted area, with Re_L = UL/ν.

// BlasiusCf returns the laminar mean skin friction C_f = 1.32824/√Re_L
// (twice Blasius' wall-shear constant f”(0) = 0.332057, ×2 for the mean).
// Laminar boundary layers, about 1e3 < Re_L < 5e5.
//
// Reference: Blasius, H. (1908), Grenzschichten in Flüssigkeiten mit kleiner
// Reibung, Z. Math. Phys. 56, 1–37; Schlichting, H. (1979), Boundary-Layer
// Theory, 7th ed., ch. 7.
func BlasiusCf(re float64) float64 { return 1.32824 / math.Sqrt(re) }

// PrandtlSchlichtingCf returns the turbulent flat-plate friction
// C_f = 0.455/(log₁₀ Re_L)^2.58, for 5e5 < Re_L < 1e9.
//
// Reference: Schlichting, H. (1979), Boundary-Layer Theory, 7th ed.,
// ch. 21 (Prandtl–Schlichting, 1932).
func PrandtlSchlichtingCf(re float64) float64 { return 0.455 / pow(math.Log10(re), 2.58) }

// ITTC1957Cf returns the ITTC-1957 model–ship correlation line
// C_F = 0.075/(log₁₀ Re − 2)², for Re ≳ 1e5. It is not a flat-plate law: it
// holds about 12 % form allowance at model scale.
//
// Reference: ITTC (1957), Proc. 8th International Towing Tank Conference,
// Madrid; ITTC Recommended Procedure 7.5-02-02-02 (2017).
func ITTC1957Cf(re float64) float64 {
	x := math.Log10(re) - 2
	return 0.075 / (x * x)
}

// TransitionCf returns the mean skin friction of a plate whose boundary layer
// is laminar up to Re_cr and turbulent (Prandtl–Schlichting) after it,
// C_f = C_f,turb − A/Re_L with A = Re_cr (C_f,turb − C_f,lam) at Re_cr, so
// that it meets the laminar law at Re_cr. With Re_cr = 5e5, A = 1614
// (Schlichting's Table 21.1 gives the rounded 1700).
//
// Reference: Prandtl, L. (1927), as in Schlichting (1979), ch. 21.
func TransitionCf(re, reCr float64) float64 { return transitionAt(reCr)(re) }

// transitionAt returns [TransitionCf] for a fixed Re_cr, with its constant
// A computed once.
func transitionAt(reCr float64) func(re float64) float64 {
	a := reCr * (PrandtlSchlichtingCf(reCr) - BlasiusCf(reCr))
	return func(re float64) float64 {
		if re <= reCr {
			return BlasiusCf(re)
		}
		return PrandtlSchlichtingCf(re) - a/re
	}
}

// transition5e5 is [TransitionCf] with Re_cr = 5e5.
var transition5e5 = transitionAt(5e5)

// HoernerFormFactor returns the ratio of a streamlined body of revolution's
// drag to its skin friction on the wetted area, 1 + 1.5(d/l)^1.5 + 7(d/l)³,
// at fineness ratio l/d.
//
// Reference: Hoerner, S. F. (1965), Fluid-Dynamic Drag, published by the
// author, ch. 6.
func HoernerFormFactor(l, d float64) float64 {
	r := d / l
	return 1 + 1.5*r*math.Sqrt(r) + 7*r*r*r
}

// bodyTurbulentFrom is the Re_L (1.2e4 to two figures) where the
// Prandtl–Schlichting line meets the laminar (Blasius) one.
const bodyTurbulentFrom = 1.2e4

// AnimalBodyCf returns the skin friction of a rigid animal body: the
// larger of the laminar (Blasius) and turbulent (Prandtl–Schlichting)
// lines, turbulent from Re_L ≈ 1.2e4 where they meet, so that drag never
// falls or jumps. Animal bodies are not smooth plates in still water: the
// boundary layer of swimming rainbow trout was turbulent over the whole
// measured surface at Re 4e5 (Yanase, K. & Saarenrinne, P. (2015),
// Unsteady turbulent boundary layers in swimming rainbow trout, J. Exp.
// Biol. 218, 1373–1385), and rigid gliding sailfish and swordfish have
// C_D 0.0075 and 0.0091 on the wetted area (Sagong, W., Jeon, W.-P. &
// Choi, H. (2013), PLoS ONE 8, e81323), above even the turbulent plate;
// a laminar layer up to Re 5e5 gives 2–3 times less. Below Re_L 5e5 the
// turbulent line is extrapolated below its published range.
func AnimalBodyCf(re float64) float64 {
	return math.Max(BlasiusCf(re), PrandtlSchlichtingCf(re))
}
