package media

import (
	"fmt"
	"math"
)

// WaterViscosity returns the dynamic viscosity of pure water in Pa·s at
// temperature tK (K) and density rho (kg/m³), by the IAPWS 2008
// formulation without the critical enhancement (μ̄₂ = 1), which the release
// permits everywhere outside the immediate vicinity of the critical point.
//
// Reference: IAPWS R12-08, Release on the IAPWS Formulation 2008 for the
// Viscosity of Ordinary Water Substance (2008); Huber, M. L. et al. (2009),
// J. Phys. Chem. Ref. Data 38, 101–125, eqs. (10), (11), (12); Tables 1, 2.
func WaterViscosity(tK, rho float64) float64 {
	const (
		tStar   = 647.096 // K
		rhoStar = 322.0   // kg/m³
		muStar  = 1.00e-6 // Pa·s
	)
	tb, rb := tK/tStar, rho/rhoStar
	h := [4]float64{1.67752, 2.20462, 0.6366564, -0.241605}
	sum, tbi := 0.0, 1.0
	for _, hi := range h {
		sum += hi / tbi
		tbi *= tb
	}
	mu0 := 100 * math.Sqrt(tb) / sum // eq. (11)
	x, y := 1/tb-1, rb-1
	var px [6]float64
	var py [7]float64
	px[0], py[0] = 1, 1
	for i := 1; i < len(px); i++ {
		px[i] = px[i-1] * x
	}
	for j := 1; j < len(py); j++ {
		py[j] = py[j-1] * y
	}
	inner := 0.0
	for _, c := range r12Hij {
		inner += c.h * px[c.i] * py[c.j]
	}
	mu1 := math.Exp(rb * inner) // eq. (12)
	return muStar * mu0 * mu1   // eq. (10) with μ̄₂ = 1
}

// r12Hij are the 21 non-zero coefficients H_ij of IAPWS R12-08 Table 2.
var r12Hij = []struct {
	i, j int
	h    float64
}{
	{0, 0, 5.20094e-1}, {1, 0, 8.50895e-2}, {2, 0, -1.08374}, {3, 0, -2.89555e-1},
	{0, 1, 2.22531e-1}, {1, 1, 9.99115e-1}, {2, 1, 1.88797}, {3, 1, 1.26613}, {5, 1, 1.20573e-1},
	{0, 2, -2.81378e-1}, {1, 2, -9.06851e-1}, {2, 2, -7.72479e-1}, {3, 2, -4.89837e-1}, {4, 2, -2.57040e-1},
	{0, 3, 1.61913e-1}, {1, 3, 2.57399e-1},
	{0, 4, -3.25372e-2}, {3, 4, 6.98452e-2},
	{4, 5, 8.72102e-3},
	{3, 6, -4.35673e-3}, {5, 6, -5.93264e-4},
}

// WaterDensityIF97 returns the density of liquid water in kg/m³ at
// temperature tK (K) and absolute pressure pPa (Pa) from the Gibbs free
// energy of IAPWS-IF97 region 1 (compressed liquid), valid for
// 273.15 K ≤ T ≤ 623.15 K and saturation pressure ≤ p ≤ 100 MPa. At
// 0.1 MPa and 0–40 °C it lies within 1e-5 relative of IAPWS-95.
//
// Reference: IAPWS R7-97(2012), Revised Release on the IAPWS Industrial
// Formulation 1997 for the Thermodynamic Properties of Water and Steam,
// eq. (7), Tables 2 and 4.
func WaterDensityIF97(tK, pPa float64) float64 {
	var t if97Isotherm
	t.set(tK)
	return t.density(pPa)
}

// IAPWS-IF97 region 1 constants (R7-97(2012), eq. (7)).
const (
	if97R     = 461.526 // J/(kg K), specific gas constant of IF97
	if97PStar = 16.53e6 // Pa
	if97TStar = 1386.0  // K
)

// if97Isotherm is region 1 at one temperature: the powers (τ − 1.222)^J
// of eq. (7), built once, so that the density at several pressures of one
// temperature (the depth-to-pressure iteration) does not rebuild them. The
// arithmetic is the term-by-term evaluation of γ_π, to the last bit.
type if97Isotherm struct {
	tK float64
	pb [59]float64 // (τ − 1.222)^j for j = −41…17, indexed j+41
}

// set builds the powers for temperature tK (K).
func (t *if97Isotherm) set(tK float64) {
	t.tK = tK
	b := if97TStar/tK - 1.222
	// Integer powers by repeated multiplication, the running power kept in
	// a register rather than read back from the table at each step.
	t.pb[41] = 1
	up := 1.0
	for j := 1; j <= 17; j++ {
		up *= b
		t.pb[41+j] = up
	}
	down, bi := 1.0, 1/b
	for j := 1; j <= 41; j++ {
		down *= bi
		t.pb[41-j] = down
	}
}

// density returns the density in kg/m³ at absolute pressure pPa (Pa).
func (t *if97Isotherm) density(pPa float64) float64 {
	pi := pPa / if97PStar
	a := 7.1 - pi
	// a^k for k = 0…31 by repeated multiplication, the running power in a
	// register
	var pa [32]float64
	pa[0] = 1
	for k, ak := 1, 1.0; k < len(pa); k++ {
		ak *= a
		pa[k] = ak
	}
	gammaPi := 0.0
	for _, c := range if97GammaPiTerms {
		gammaPi += c.nI * pa[c.a] * t.pb[c.b]
	}
	v := pi * gammaPi * if97R * t.tK / pPa // Table 4: v = (RT/p) π γ_π
	return 1 / v
}

// if97GammaPiTerms are the terms of γ_π = Σ −n_i I_i (7.1 − π)^(I_i−1)
// (τ − 1.222)^J_i, in the order of Table 2, without the I = 0 terms, which
// do not depend on π: −n_i·I_i (the same product the sum would form) and
// the indices of the two powers in the density's and the isotherm's tables.
var if97GammaPiTerms = func() (terms []if97GammaPiTerm) {
	for _, c := range if97Region1 {
		if c.i != 0 {
			terms = append(terms, if97GammaPiTerm{nI: -c.n * float64(c.i), a: c.i - 1, b: 41 + c.j})
		}
	}
	return terms
}()

// if97GammaPiTerm is one term of γ_π: −n·I and where (7.1 − π)^(I−1) and
// (τ − 1.222)^J are found.
type if97GammaPiTerm struct {
	nI   float64
	a, b int
}

// if97Region1 holds I_i, J_i, n_i of IAPWS-IF97 Table 2.
var if97Region1 = [...]struct {
	i, j int
	n    float64
}{
	{0, -2, 0.14632971213167}, {0, -1, -0.84548187169114}, {0, 0, -0.37563603672040e1},
	{0, 1, 0.33855169168385e1}, {0, 2, -0.95791963387872}, {0, 3, 0.15772038513228},
	{0, 4, -0.16616417199501e-1}, {0, 5, 0.81214629983568e-3}, {1, -9, 0.28319080123804e-3},
	{1, -7, -0.60706301565874e-3}, {1, -1, -0.18990068218419e-1}, {1, 0, -0.32529748770505e-1},
	{1, 1, -0.21841717175414e-1}, {1, 3, -0.52838357969930e-4}, {2, -3, -0.47184321073267e-3},
	{2, 0, -0.30001780793026e-3}, {2, 1, 0.47661393906987e-4}, {2, 3, -0.44141845330846e-5},
	{2, 17, -0.72694996297594e-15}, {3, -4, -0.31679644845054e-4}, {3, 0, -0.28270797985312e-5},
	{3, 6, -0.85205128120103e-9}, {4, -5, -0.22425281908000e-5}, {4, -2, -0.65171222895601e-6},
	{4, 10, -0.14341729937924e-12}, {5, -8, -0.40516996860117e-6}, {8, -11, -0.12734301741641e-8},
	{8, -6, -0.17424871230634e-9}, {21, -29, -0.68762131295531e-18}, {23, -31, 0.14478307828521e-19},
	{29, -38, 0.26335781662795e-22}, {30, -39, -0.11947622640071e-22}, {31, -40, 0.18228094581404e-23},
	{32, -41, -0.93537087292458e-25},
}

// waterFreezingK returns the melting temperature of ice Ih under air-saturated
// water at absolute pressure pPa: 273.15 K at one standard atmosphere, falling
// by 0.0742 K per MPa, the slope of the IAPWS melting-pressure equation near
// the ice point (IAPWS R14-08, Revised Release on the Pressure along the
// Melting and Sublimation Curves of Ordinary Water Substance, eq. (1)).
// Linear to better than 0.01 K up to 20 MPa.
func waterFreezingK(pPa float64) float64 {
	return ZeroCelsiusK - 0.0742e-6*(pPa-StandardPressurePa)
}

// FreshWater returns the properties of pure liquid water at tC (°C) and
// absolute pressure pPa (Pa). Viscosity is IAPWS R12-08 evaluated at the
// IAPWS-IF97 density. It is an error for the water to be frozen or boiling at
// those conditions, above 350 °C (the end of IF97 region 1) or above
// [WaterMaxPressurePa]; below 0 °C and between 100 and 200 MPa the result
// carries a warning.
func FreshWater(tC, pPa float64) (Properties, error) { return freshWater(tC, pPa, false, nil) }

// freshWater is [FreshWater]; brief leaves out the method notes and the
// warnings' texts. iso, when not nil, is the IF97 isotherm already built
// for tC (by the depth-to-pressure step), so it is not built twice.
func freshWater(tC, pPa float64, brief bool, iso *if97Isotherm) (Properties, error) {
	if !finite(tC, pPa) {
		return Properties{}, errorf("fresh water needs finite temperature and pressure")
	}
	if pPa <= 0 {
		return Properties{}, errorf("pressure %.6g Pa is not positive; give an absolute pressure above 0 Pa", pPa)
	}
	tK := tC + ZeroCelsiusK
	if tf := waterFreezingK(pPa); tK < tf-1e-9 {
		return Properties{}, errorf("fresh water at %.4g °C and %.6g Pa is below its freezing point (%.4g °C); give a temperature at or above it", tC, pPa, tf-ZeroCelsiusK)
	}
	if tb := waterBoilingC(pPa); tC > tb {
		return Properties{}, errorf("fresh water at %.4g °C and %.6g Pa is above its boiling point (%.4g °C); give a lower temperature or a higher pressure", tC, pPa, tb)
	}
	if tC > IF97MaxTemperatureC {
		return Properties{}, errorf("fresh water at %.4g °C is above %g °C, the end of IAPWS-IF97 region 1 (623.15 K); give a lower temperature", tC, IF97MaxTemperatureC)
	}
	if err := checkWaterPressure("fresh-water", pPa); err != nil {
		return Properties{}, err
	}
	p := blank("freshwater")
	p.Water = true
	p.TemperatureC, p.PressurePa = tC, pPa
	p.SeaPressureDbar = (pPa - StandardPressurePa) / 1e4
	if iso == nil {
		iso = new(if97Isotherm)
		iso.set(tK)
	}
	p.Density = iso.density(pPa)
	p.DynamicViscosity = WaterViscosity(tK, p.Density)
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	if !brief {
		p.Methods = []string{
			"density: IAPWS-IF97 region 1 (IAPWS R7-97(2012))",
			"viscosity: IAPWS 2008 formulation (IAPWS R12-08; Huber et al. 2009, J. Phys. Chem. Ref. Data 38, 101)",
		}
	}
	if tC < 0 {
		addDetailed(&p.Warnings, brief, WarnOutOfRange, Detail{Quantity: "water temperature", Value: tC, Unit: "°C", Relation: "< 0 °C: IAPWS-IF97 extrapolated"}, func() string {
			return fmt.Sprintf("fresh water: %.4g °C is below 0 °C; IAPWS-IF97 region 1 starts at 273.15 K and is extrapolated here", tC)
		})
	}
	warnHighPressure(&p.Warnings, brief, "fresh water", "IAPWS-IF97 region 1", pPa)
	return p, checkPhysical(&p)
}

// waterBoilingC returns the saturation temperature of water (°C) at absolute
// pressure pPa from the IAPWS-IF97 region 4 backward equation (R7-97(2012),
// eq. (31)); valid from the triple point to the critical point.
func waterBoilingC(pPa float64) float64 {
	n := [11]float64{0, 0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2,
		0.12020824702470e5, -0.32325550322333e7, 0.14915108613530e2, -0.48232657361591e4,
		0.40511340542057e6, -0.23855557567849, 0.65017534844798e3}
	if pPa >= 22.064e6 {
		return 373.946 // critical temperature; above it there is no boiling
	}
	beta := math.Sqrt(math.Sqrt(pPa / 1e6))
	e := beta*beta + n[3]*beta + n[6]
	f := n[1]*beta*beta + n[4]*beta + n[7]
	g := n[2]*beta*beta + n[5]*beta + n[8]
	d := 2 * g / (-f - math.Sqrt(f*f-4*e*g))
	t := (n[10] + d - math.Sqrt((n[10]+d)*(n[10]+d)-4*(n[9]+n[10]*d))) / 2
	return t - ZeroCelsiusK
}
