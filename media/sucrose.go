package media

import (
	"fmt"
	"math"
)

// sucroseRow is one row of the sucrose table: mass fraction, density
// (kg/m³) and dynamic viscosity (Pa·s) at 20 °C.
type sucroseRow struct{ w, rho, mu float64 }

// sucrose20C is aqueous sucrose at 20 °C from the CRC Handbook of Chemistry
// and Physics, 102nd ed. (2021), "Concentrative properties of aqueous
// solutions" (sucrose rows; pure water 0.99820 g/cm³ and 1.002 mPa·s from the
// same table's notes). The 32 % row (3.762 mPa·s, out of line with its
// neighbours) and the 22 % and 26 % rows (kept apart to test the
// interpolation) are left out.
var sucrose20C = []sucroseRow{
	{0, 998.20, 1.002e-3}, {0.05, 1017.8, 1.146e-3}, {0.10, 1038.1, 1.336e-3}, {0.15, 1059.2, 1.592e-3},
	{0.20, 1081.0, 1.945e-3}, {0.24, 1099.0, 2.331e-3}, {0.28, 1117.5, 2.855e-3}, {0.30, 1127.0, 3.187e-3},
	{0.34, 1146.4, 4.052e-3}, {0.36, 1156.2, 4.621e-3}, {0.38, 1166.3, 5.315e-3}, {0.40, 1176.5, 6.162e-3},
	{0.42, 1186.8, 7.234e-3}, {0.44, 1197.2, 8.596e-3}, {0.46, 1207.9, 10.301e-3}, {0.48, 1218.6, 12.515e-3},
	{0.50, 1229.5, 15.431e-3}, {0.60, 1286.4, 58.487e-3}, {0.70, 1347.2, 481.561e-3},
}

// sucroseTableC is the one temperature of the sucrose table, and
// sucroseToleranceC how far from it a stated temperature is still taken as
// the table's (with a warning).
const (
	sucroseTableC     = 20.0
	sucroseToleranceC = 0.5
	sucroseSparseW    = 0.5 // above this the table's rows are 10 % apart
)

// SucroseProperties returns the density (kg/m³) and dynamic viscosity (Pa·s)
// of aqueous sucrose of mass fraction w (0–0.70) at 20 °C, interpolated in
// the CRC table: density linearly, ln μ by monotone piecewise-cubic Hermite
// interpolation (Fritsch, F. N. & Carlson, R. E. (1980), Monotone piecewise
// cubic interpolation, SIAM J. Numer. Anal. 17, 238–246).
func SucroseProperties(w float64) (rho, mu float64) {
	n := len(sucrose20C)
	i := 0
	for i < n-2 && w > sucrose20C[i+1].w {
		i++
	}
	a, b := sucrose20C[i], sucrose20C[i+1]
	t := (w - a.w) / (b.w - a.w)
	rho = a.rho + t*(b.rho-a.rho)
	h := b.w - a.w
	y0, y1 := math.Log(a.mu), math.Log(b.mu)
	d0, d1 := sucroseSlope(i), sucroseSlope(i+1)
	h00, h10 := 2*t*t*t-3*t*t+1, t*t*t-2*t*t+t
	h01, h11 := -2*t*t*t+3*t*t, t*t*t-t*t
	return rho, math.Exp(h00*y0 + h10*h*d0 + h01*y1 + h11*h*d1)
}

// sucroseSlope is the Fritsch–Carlson derivative of ln μ at row i: the
// weighted harmonic mean of the neighbouring secants (zero where they
// differ in sign), one-sided at the ends.
func sucroseSlope(i int) float64 {
	secant := func(j int) float64 {
		a, b := sucrose20C[j], sucrose20C[j+1]
		return (math.Log(b.mu) - math.Log(a.mu)) / (b.w - a.w)
	}
	n := len(sucrose20C)
	switch i {
	case 0:
		return secant(0)
	case n - 1:
		return secant(n - 2)
	}
	s0, s1 := secant(i-1), secant(i)
	if s0*s1 <= 0 {
		return 0
	}
	h0, h1 := sucrose20C[i].w-sucrose20C[i-1].w, sucrose20C[i+1].w-sucrose20C[i].w
	w1, w2 := 2*h1+h0, h1+2*h0
	return (w1 + w2) / (w1/s0 + w2/s1)
}

// SucroseMaxFraction is the largest mass fraction with a tabulated viscosity.
func SucroseMaxFraction() float64 { return sucrose20C[len(sucrose20C)-1].w }

// Sucrose returns aqueous sucrose of mass fraction w at tC (°C). The table
// is for 20 °C only: temperatures more than 0.5 °C away are refused.
func Sucrose(w, tC float64) (Properties, error) { return sucrose(w, tC, false) }

func sucrose(w, tC float64, brief bool) (Properties, error) {
	if !finite(w, tC) || w < 0 || w > SucroseMaxFraction() {
		return Properties{}, errorf("sucrose viscosity is tabulated for mass fractions 0 to %.2g; %.4g is outside", SucroseMaxFraction(), w)
	}
	if math.Abs(tC-sucroseTableC) > sucroseToleranceC {
		return Properties{}, errorf("sucrose solutions are tabulated at 20 °C only, not %.4g °C; hold the tank at 20 °C or measure the solution and give it as a medium file", tC)
	}
	p := blank(labFluidName(KindSucrose, w))
	p.TemperatureC, p.PressurePa = sucroseTableC, StandardPressurePa
	p.Density, p.DynamicViscosity = SucroseProperties(w)
	p.KinematicViscosity = p.DynamicViscosity / p.Density
	p.addMethod(brief, func() string {
		return "density and viscosity: CRC Handbook of Chemistry and Physics, 102nd ed. (2021), concentrative properties of aqueous solutions, sucrose at 20 °C, interpolated (ln viscosity: monotone cubic)"
	})
	if tC != sucroseTableC {
		addWarning(&p.Warnings, brief, WarnOutOfRange, func() string {
			return fmt.Sprintf("medium: sucrose is tabulated at 20 °C; the 20 °C values are used for %.4g °C", tC)
		})
	}
	if w > sucroseSparseW {
		addWarning(&p.Warnings, brief, WarnOutOfRange, func() string {
			return "medium: above 50 % sucrose the table's rows are 10 % apart; the interpolated viscosity is less certain there"
		})
	}
	return p, nil
}

// SucroseFractionFor returns the sucrose mass fraction whose solution has
// kinematic viscosity nu (m²/s) at 20 °C, by bisection; an *OutOfReachError
// when nu is outside the table.
func SucroseFractionFor(nu float64) (float64, error) {
	if !finite(nu) || nu <= 0 {
		return 0, errorf("the wanted kinematic viscosity must be a positive number")
	}
	nuAt := func(w float64) float64 { rho, mu := SucroseProperties(w); return mu / rho }
	lo, hi := nuAt(0), nuAt(SucroseMaxFraction())
	if nu < lo || nu > hi {
		return 0, &OutOfReachError{Fluid: "sucrose solution", Want: nu, Low: lo, High: hi, TC: sucroseTableC}
	}
	return bisect(func(w float64) float64 { return nuAt(w) - nu }, 0, SucroseMaxFraction()), nil
}
