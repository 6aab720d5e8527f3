package regime

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/media"
	"gonum.org/v1/gonum/integrate/quad"
)

func relErr(got, want float64) float64 { return math.Abs(got/want - 1) }

func checkRel(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if e := relErr(got, want); !(e <= tol) {
		t.Errorf("%s = %.8g, want %.8g (relative error %.3g > %.3g)", what, got, want, e, tol)
	}
}

func water20(t *testing.T) media.Properties {
	t.Helper()
	p, err := media.FreshWater(20, media.StandardPressurePa)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// Stokes (1851): F = 6πμaU for a sphere of radius a in creeping flow.
func TestStokesLimit(t *testing.T) {
	w := water20(t)
	const d, u = 10e-6, 100e-6
	res, err := Drag(Body{Shape: Sphere, Length: d}, Flow{Speed: u, Density: w.Density, Viscosity: w.DynamicViscosity})
	if err != nil {
		t.Fatal(err)
	}
	if res.Chosen.Law != "Stokes" {
		t.Fatalf("chosen law %q at Re %.3g, want Stokes", res.Chosen.Law, res.Chosen.Reynolds)
	}
	checkRel(t, "Stokes force", res.Chosen.Force, 6*math.Pi*w.DynamicViscosity*(d/2)*u, 1e-12)
}

// Standard drag curve of a sphere against published tables.
//
// Pruppacher & Klett (1997), Microphysics of Clouds and Precipitation,
// Table 10.1 (p. 381), C_D of rigid spheres: 4.29 at Re 10, 2.11 at 30,
// 1.51 at 57, 1.10 at 100 and 0.63 at 300 (read in a public copy
// of that table, headed "Table 10.1 p381 Pruppacher and Klett", kept as
// cloud-drag data by the exojax project). Clift, Grace & Weber's curve
// (1978, Table 5.2) is within 3.6 % of them (worst at Re 300, 3.1 % at
// 57), so 4 % is allowed: two independently compiled tables.
//
// Readings at Re 0.1, 1, 1e3, 1e4 and 1e5 of the curve (Lapple & Shepherd
// 1940; Schlichting 1979, Fig. 1.5) are recalled from memory, approximate
// to about 3–5 %: no published table of them could be read.
func TestStandardCurveReadings(t *testing.T) {
	table101 := []struct{ re, cd float64 }{{10, 4.29}, {30, 2.11}, {57, 1.51}, {100, 1.10}, {300, 0.63}}
	for _, r := range table101 {
		checkRel(t, fmt.Sprintf("C_D at Re %g against Pruppacher & Klett Table 10.1", r.re), StandardCurveCD(r.re), r.cd, 0.04)
	}
	recalled := []struct{ re, cd, tol float64 }{
		{0.1, 242, 0.02}, {1, 27, 0.05}, {1e3, 0.47, 0.05}, {1e4, 0.40, 0.05}, {1e5, 0.48, 0.05},
	}
	for _, r := range recalled {
		checkRel(t, "C_D standard curve (recalled)", StandardCurveCD(r.re), r.cd, r.tol)
	}
	// Clift, Grace & Weber (1978) Table 5.2 branches meet at Re = 1e6:
	// 0.1·6 − 0.49 = 0.11 and 0.19 − 8e4/1e6 = 0.11.
	checkRel(t, "continuity at 1e6", StandardCurveCD(1e6), StandardCurveCD(1e6*(1+1e-9)), 1e-6)
}

// Cross-checks of independently published sphere laws against the standard
// curve (Clift, Grace & Weber 1978, Table 5.2), over each law's range.
// Clift, Grace & Weber (1978, Table 5.1, recalled from memory) give the
// deviations of Schiller–Naumann (Re < 800) and Clift–Gauvin (Re < 3e5) from
// their curve as about ±5 % and −4 % to +6 %; computed here the worst are
// 5.1 % and 6.0 %, so both are bounded at 6.5 %. Proudman–Pearson is within
// 1.5 % for Re ≤ 1, Oseen within 5 %, and Stokes 1.7 % low at Re = 0.1
// (computed from the formulas).
func TestSphereLawsAgainstStandardCurve(t *testing.T) {
	worst := func(fn func(float64) float64, lo, hi float64) float64 {
		w := 0.0
		for x := math.Log10(lo); x <= math.Log10(hi)+1e-9; x += 0.05 {
			re := math.Pow(10, x)
			w = math.Max(w, relErr(fn(re), StandardCurveCD(re)))
		}
		return w
	}
	cases := []struct {
		name   string
		fn     func(float64) float64
		lo, hi float64
		tol    float64
	}{
		{"Clift–Gauvin", CliftGauvinCD, 0.1, 3e5, 0.065},
		{"Schiller–Naumann", SchillerNaumannCD, 0.1, 800, 0.065},
		{"Proudman–Pearson", ProudmanPearsonCD, 0.01, 1, 0.016},
		{"Oseen", OseenCD, 0.01, 1, 0.05},
		{"Stokes", StokesCD, 0.001, 0.1, 0.018},
	}
	for _, c := range cases {
		if w := worst(c.fn, c.lo, c.hi); w > c.tol {
			t.Errorf("%s vs standard curve on %g–%g: worst %.3g > %.3g", c.name, c.lo, c.hi, w, c.tol)
		} else {
			t.Logf("%s vs standard curve on %g–%g: worst %.3g", c.name, c.lo, c.hi, w)
		}
	}
}

// Haider & Levenspiel (1989): at sphericity 1 their general correlation
// should agree with their own sphere fit,
// C_D = 24/Re (1 + 0.1806 Re^0.6459) + 0.4251/(1 + 6880.95/Re)
// (as given by Barati et al. 2014, Powder Technol. 257, 11, and the fluids
// library's Haider_Levenspiel; the general correlation's coefficients as in
// the ANSYS Fluent 12.0 Theory Guide, §15.3.2), and with the standard curve.
// The general correlation is fitted to many shapes, so at φ = 1 it runs up
// to 7 % above the sphere fit and 9 % above the standard curve (computed);
// the bounds, 8 % and 10 %, catch a wrong coefficient, not fitting error.
func TestHaiderLevenspielSphere(t *testing.T) {
	for x := -1.0; x <= 5; x += 0.25 {
		re := math.Pow(10, x)
		own := 24/re*(1+0.1806*math.Pow(re, 0.6459)) + 0.4251/(1+6880.95/re)
		checkRel(t, "H–L φ=1 vs H–L sphere fit", HaiderLevenspielCD(re, 1), own, 0.08)
		checkRel(t, "H–L φ=1 vs standard curve", HaiderLevenspielCD(re, 1), StandardCurveCD(re), 0.10)
	}
}

// Happel & Brenner (1965): the prolate-spheroid axial drag tends to the
// sphere's 3πμdU as l → d, and to the slender-body limit
// 4πμaU/(ln(2a/b) − 1/2) for large aspect ratio (1e-4 relative at a/b = 100).
func TestProlateSpheroidLimits(t *testing.T) {
	const mu, u = 1e-3, 1e-4
	checkRel(t, "sphere limit", ProlateAxialStokesDrag(mu, u, 1e-5, 1e-5*(1-1e-9)), 3*math.Pi*mu*1e-5*u, 1e-6)
	l, d := 1e-3, 1e-5
	a, b := l/2, d/2
	checkRel(t, "slender limit", ProlateAxialStokesDrag(mu, u, l, d), 4*math.Pi*mu*a*u/(math.Log(2*a/b)-0.5), 2e-4)
	// Cox (1970) rod and the spheroid agree to leading order at large l/a.
	checkRel(t, "rod vs spheroid, l/a = 1e4", SlenderRodAxialDrag(mu, u, 1, 1e-4), ProlateAxialStokesDrag(mu, u, 1, 2e-4), 0.1)
}

// Cox's (1970) broadside rod drag against the exact Stokes drag of a prolate
// spheroid moving broadside, F = 32πμaUe³/(2e + (3e² − 1) ln((1+e)/(1−e)))
// with a the semi-major axis (Chwang & Wu 1975, J. Fluid Mech. 67, 787;
// Happel & Brenner 1965, ch. 4; the form recalled from memory and checked
// here by its sphere limit, 6πμaU as e → 0).
// The two slender bodies differ only in the end constant (ln 2 − 1/2 for a
// blunt rod, 1/2 for a spheroid), 3 % at l/a = 1e4. And broadside drag is
// twice axial drag in the slender limit (Batchelor 1970, J. Fluid Mech. 44,
// 419), approached as 1/ln(l/a): 7 % short at l/a = 1e6, 4 % at 1e12.
func TestSlenderRodBroadside(t *testing.T) {
	const mu, u = 1e-3, 1e-4
	spheroid := func(l, d float64) float64 {
		a, b := l/2, d/2
		e := math.Sqrt(1 - b*b/(a*a))
		bigL := math.Log((1 + e) / (1 - e))
		return 32 * math.Pi * mu * a * u * e * e * e / (2*e + (3*e*e-1)*bigL)
	}
	checkRel(t, "spheroid formula, sphere limit", spheroid(1e-5, 1e-5*(1-1e-6)), 3*math.Pi*mu*1e-5*u, 1e-5)
	checkRel(t, "rod vs spheroid broadside, l/a = 1e4", SlenderRodBroadsideDrag(mu, u, 1, 1e-4), spheroid(1, 2e-4), 0.05)
	checkRel(t, "broadside/axial, l/a = 1e6", SlenderRodBroadsideDrag(mu, u, 1, 1e-6)/SlenderRodAxialDrag(mu, u, 1, 1e-6), 2, 0.08)
	checkRel(t, "broadside/axial, l/a = 1e12", SlenderRodBroadsideDrag(mu, u, 1, 1e-12)/SlenderRodAxialDrag(mu, u, 1, 1e-12), 2, 0.04)
}

// Skin friction laws by their published formulas: Blasius C_f =
// 1.328/√Re_L (Schlichting 1979); ITTC-1957 at Re = 1e7 is
// 0.075/(7 − 2)² = 0.003 and at 1e6 0.075/16; Schlichting's table of the
// transition constant gives A = 1700 for Re_cr = 5e5 (the derived value
// with Prandtl–Schlichting is 1614).
func TestSkinFriction(t *testing.T) {
	checkRel(t, "Blasius 1e5", BlasiusCf(1e5), 1.328/math.Sqrt(1e5), 2e-4)
	checkRel(t, "ITTC-1957 1e7", ITTC1957Cf(1e7), 0.003, 1e-12)
	checkRel(t, "ITTC-1957 1e6", ITTC1957Cf(1e6), 0.075/16, 1e-12)
	a := 5e5 * (PrandtlSchlichtingCf(5e5) - BlasiusCf(5e5))
	checkRel(t, "transition constant A", a, 1700, 0.06)
	checkRel(t, "transition continuity", TransitionCf(5e5*(1+1e-9), 5e5), BlasiusCf(5e5), 1e-6)
	// Prandtl–Schlichting against the 1/7-power law 0.074 Re^−0.2 at 1e6
	// (both in Schlichting 1979): within 5 %.
	checkRel(t, "P–S vs 0.074 law", PrandtlSchlichtingCf(1e6), 0.074*math.Pow(1e6, -0.2), 0.05)
}

// Hoerner (1965) form factor at fineness 4.5 by hand: 1 + 1.5/4.5^1.5 +
// 7/4.5³ = 1.2340. This restates Hoerner's formula (recalled from memory of
// Hoerner 1965, ch. 6): no page printing the formula or a tabulated form
// factor could be read, so it checks the arithmetic only.
func TestHoernerFormFactor(t *testing.T) {
	checkRel(t, "form factor", HoernerFormFactor(4.5, 1), 1+1.5*math.Pow(1/4.5, 1.5)+7/math.Pow(4.5, 3), 1e-12)
	checkRel(t, "form factor value", HoernerFormFactor(4.5, 1), 1.2340, 1e-4)
}

// Prolate spheroid area by the closed form against a 2-D surface of
// revolution integral 2π∫ y √(1 + y'²) dx done numerically here.
func TestSpheroidArea(t *testing.T) {
	l, d := 4.0, 1.0
	a, b := l/2, d/2
	n := 200000
	sum := 0.0
	for i := 0; i < n; i++ {
		x := -a + (float64(i)+0.5)*(2*a)/float64(n)
		y := b * math.Sqrt(1-x*x/(a*a))
		dy := -b * x / (a * a * math.Sqrt(1-x*x/(a*a)))
		sum += 2 * math.Pi * y * math.Sqrt(1+dy*dy) * (2 * a / float64(n))
	}
	checkRel(t, "spheroid area", ProlateSpheroidArea(l, d), sum, 1e-5)
	checkRel(t, "sphere area", ProlateSpheroidArea(1, 1), math.Pi, 1e-12)
}

// Lamb (1911): C_D = 8π/(Re(2.0022 − ln Re)) with 1/2 − γ + ln 8 = 2.00223.
// This restates Lamb's formula (recalled from memory of Lamb 1932, §343)
// with the constant written out: it checks the constant, not the law.
// Tritton's (1959, J. Fluid Mech. 6, 547) measured C_D at Re 0.5–100 would
// test it, but only the paper's abstract could be read, not its numbers.
func TestLambCylinder(t *testing.T) {
	checkRel(t, "Lamb 0.1", LambCylinderCD(0.1), 8*math.Pi/(0.1*(2.00223-math.Log(0.1))), 1e-5)
}

// Rankine–Froude hover by hand: m = 1 kg, span 1 m, ρ = 1.225 kg/m³, k = 1:
// T = 9.80665 N, A = π/4 m², v_h = √(T/(2ρA)) = 2.257524 m/s,
// P = T v_h = 22.1387 W.
func TestRankineFroudeHover(t *testing.T) {
	fp, err := Flight(FlightInput{Mass: 1, Speed: 0, Density: 1.225, Viscosity: 1.8e-5, InducedFactor: 1, Wings: Wings{Span: 1}})
	if err != nil {
		t.Fatal(err)
	}
	checkRel(t, "v_h", fp.HoverVelocity, 2.257524, 1e-6)
	checkRel(t, "hover induced power", fp.HoverInduced, 22.1387, 1e-5)
	checkRel(t, "induced at V = 0", fp.Induced, fp.HoverInduced, 1e-12)
}

// Glauert's relation T = 2ρA v_i √(V² + v_i²) solved here by bisection
// matches the closed form; at high speed v_i → T/(2ρAV).
func TestGlauertInducedVelocity(t *testing.T) {
	const T, rho, A = 9.80665, 1.225, 0.785398
	for _, v := range []float64{0, 1, 3, 10, 30} {
		lo, hi := 0.0, 10.0
		for range 200 {
			m := (lo + hi) / 2
			if 2*rho*A*m*math.Sqrt(v*v+m*m) > T {
				hi = m
			} else {
				lo = m
			}
		}
		checkRel(t, "v_i", InducedVelocity(T, rho, A, v), lo, 1e-9)
	}
	checkRel(t, "fast limit", InducedVelocity(T, rho, A, 300), T/(2*rho*A*300), 1e-4)
}

// The span integral's closed form against gonum's Gauss–Legendre
// quadrature (quad.Fixed, 200 nodes; the integrand is smooth).
func TestSpanIntegralAgainstQuadrature(t *testing.T) {
	for _, c := range []struct{ v, omega, r float64 }{
		{5, 0, 0.2}, {0, 80, 0.2}, {5, 80, 0.2}, {10, 1, 0.21}, {0.3, 400, 0.012}, {12, 3000, 0.004}, {1e-3, 50, 1},
	} {
		want := quad.Fixed(func(x float64) float64 {
			s := c.v*c.v + c.omega*c.omega*x*x
			return s * math.Sqrt(s)
		}, 0, c.r, 200, quad.Legendre{}, 0)
		checkRel(t, fmt.Sprintf("span integral V=%g ω=%g R=%g", c.v, c.omega, c.r), spanIntegral(c.v, c.omega, c.r), want, 1e-12)
	}
}

// Blade-element profile power in hover against the closed form
// ρC_D c (πΦf)³ (4/(3π)) R⁴/4 (two wings, simple-harmonic stroke; cycle
// mean of |sin|³ = 4/(3π)), and gliding against ½ρC_D S V³.
func TestProfilePowerClosedForms(t *testing.T) {
	const rho, cd, c, r, phi, f = 1.2, 0.1, 0.01, 0.05, 2.0, 30.0
	want := rho * cd * c * math.Pow(math.Pi*phi*f, 3) * 4 / (3 * math.Pi) * math.Pow(r, 4) / 4
	checkRel(t, "hover profile power", ProfilePower(rho, cd, c, r, 0, phi, f), want, 1e-6)
	checkRel(t, "gliding profile power", ProfilePower(rho, cd, c, r, 5, 0, 0), 0.5*rho*cd*(2*c*r)*125, 1e-12)
}

// St = fA/U on a stated case: 4 Hz, 0.1 m peak-to-peak, 2 m/s gives 0.2
// (definition of Taylor, Nudds & Thomas 2003).
func TestStrouhal(t *testing.T) {
	checkRel(t, "St", Strouhal(4, 0.1, 2), 0.2, 1e-12)
	for _, c := range []struct {
		st   float64
		band string
	}{{0.1, "below"}, {0.3, "within"}, {0.5, "above"}} {
		if b := StrouhalBand(c.st); b != c.band {
			t.Errorf("band(%g) = %s, want %s", c.st, b, c.band)
		}
	}
}

// Reynolds numbers of organisms, Vogel (1994), Life in Moving Fluids, 2nd
// ed., ch. 5 table (recalled from memory). The table gives Re and speed; the
// lengths here are typical sizes assumed for each (also from memory), so
// only the order of magnitude is checked: |log10(Re/Re_table)| < 0.5.
func TestOrganismReynoldsPlausible(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 20, PressurePa: math.NaN()})
	sea, _ := media.Seawater(15, 35, media.StandardPressurePa)
	fresh := water20(t)
	rows := []struct {
		name  string
		m     media.Properties
		l, u  float64
		table float64
	}{
		{"large whale", sea, 25, 10, 3e8},
		{"tuna", sea, 2, 10, 3e7},
		{"duck", air, 0.3, 20, 3e5},
		{"large dragonfly", air, 0.07, 7, 3e4},
		{"copepod in a pulse", sea, 1.5e-3, 0.2, 3e2},
		{"invertebrate larva", sea, 0.3e-3, 1e-3, 0.3},
		{"sea-urchin sperm", sea, 0.15e-3, 0.2e-3, 0.03},
		{"bacterium", fresh, 1e-6, 1e-5, 1e-5},
	}
	for _, r := range rows {
		re := Reynolds(r.u, r.l, r.m.KinematicViscosity)
		if d := math.Abs(math.Log10(re / r.table)); d > 0.5 {
			t.Errorf("%s: Re = %.3g, Vogel's table %.3g (|Δlog10| = %.2f > 0.5)", r.name, re, r.table, d)
		}
	}
}

// Purcell (1977): a bacterium of radius 1 µm swimming at 30 µm/s coasts
// about 0.1 Å after its motor stops (his estimate, without added mass;
// here added mass makes it 1.5× longer). Checked within a factor of 2.
func TestPurcellCoasting(t *testing.T) {
	w := water20(t)
	o := NewOrganism(Body{Shape: Sphere, Length: 2e-6}, 30e-6)
	r, err := Calc(o, w)
	if err != nil {
		t.Fatal(err)
	}
	if r.CoastDistance < 0.05e-10 || r.CoastDistance > 0.2e-10 {
		t.Errorf("coasting distance %.3g m, want about 1e-11 m (0.1 Å)", r.CoastDistance)
	}
}

// Stokes' law in its range: a 20 µm quartz grain (2650 kg/m³) in water at
// 20 °C falls at (ρp − ρf) g d²/(18μ) = 0.359 mm/s at Re ≈ 0.007; the
// Clift–Gauvin correlation used by Settle is within 1 % of Stokes there.
func TestSettleStokesRange(t *testing.T) {
	w := water20(t)
	s, err := Settle(Particle{Shape: Sphere, Diameter: 20e-6, Density: 2650}, w)
	if err != nil {
		t.Fatal(err)
	}
	stokes := (2650 - w.Density) * media.StandardGravity * 20e-6 * 20e-6 / (18 * w.DynamicViscosity)
	checkRel(t, "settling vs Stokes", s.Speed, stokes, 0.01)
	if s.Direction != Sinking {
		t.Errorf("direction %s, want sinking", s.Direction)
	}
	if s.Reynolds > 0.01 {
		t.Errorf("Re = %g, want about 0.007", s.Reynolds)
	}
}

// Gunn & Kinzer (1949), J. Meteorol. 6, 243: terminal speeds of water drops
// in still air at 1013 hPa, 20 °C: 27, 72, 117, 162, 206, 247, 327 and
// 403 cm/s at 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8 and 1.0 mm (their table,
// read in a public copy of it in a droplet-coalescence code that
// cites the paper by its DOI, 10.1175/1520-0469(1949)006<0243:TTVOFF>2.0.CO;2).
// Rigid spheres match within 10 % up to 1 mm, where drops are still nearly
// spherical (common practice: 5–10 % between rigid-sphere theory and
// measured drops); computed here, the worst is 7.2 % low at 0.1 mm, then
// within 4 %. Beyond 1 mm drops flatten and fall slower than spheres.
func TestSettleWaterDropsGunnKinzer(t *testing.T) {
	air, _ := media.Air(media.AirConditions{TemperatureC: 20, PressurePa: 101300, HumidityPercent: 50})
	rows := []struct{ d, u float64 }{{0.1e-3, 0.27}, {0.2e-3, 0.72}, {0.3e-3, 1.17}, {0.4e-3, 1.62}, {0.5e-3, 2.06}, {0.6e-3, 2.47}, {0.8e-3, 3.27}, {1.0e-3, 4.03}}
	for _, r := range rows {
		s, err := Settle(Particle{Shape: Sphere, Diameter: r.d, Density: 998.2}, air)
		if err != nil {
			t.Fatal(err)
		}
		checkRel(t, fmt.Sprintf("drop of %g mm against Gunn & Kinzer", r.d*1e3), s.Speed, r.u, 0.10)
	}
}

// Hinds (1999), Aerosol Technology, Table 3.2 (recalled from memory): slip
// correction 1.168 at 1 µm and 2.9 at 0.1 µm with λ = 0.0665 µm.
func TestCunningham(t *testing.T) {
	const lambda = 0.0665e-6
	checkRel(t, "Cc(1 µm)", Cunningham(2*lambda/1e-6), 1.168, 0.005)
	checkRel(t, "Cc(0.1 µm)", Cunningham(2*lambda/0.1e-6), 2.9, 0.02)
	// Mean free path at 23 °C, 1 atm: 0.0665 µm (Hinds 1999).
	checkRel(t, "λ", MeanFreePath(media.SutherlandViscosity(296.15), 296.15, 101325), 0.0665e-6, 0.01)
}

func TestSettleRisingAndErrors(t *testing.T) {
	w := water20(t)
	s, err := Settle(Particle{Shape: Sphere, Diameter: 1e-3, Density: 900}, w)
	if err != nil || s.Direction != Rising {
		t.Errorf("oil drop: %v %v, want rising", s.Direction, err)
	}
	if _, err := Settle(Particle{Shape: Sphere, Diameter: 1e-3, Density: w.Density}, w); err == nil || !strings.Contains(err.Error(), "equals the medium") {
		t.Errorf("neutral particle: error %v", err)
	}
	if _, err := Settle(Particle{Shape: Sphere, Diameter: -1, Density: 2000}, w); err == nil {
		t.Error("negative diameter accepted")
	}
}

func TestCalcErrorsAndWarnings(t *testing.T) {
	w := water20(t)
	fish := Body{Shape: Spheroid, Length: 0.3, Diameter: 0.06}
	if _, err := Calc(NewOrganism(fish, 0), w); err == nil {
		t.Error("zero speed accepted")
	}
	if _, err := Calc(NewOrganism(Body{Shape: Spheroid, Length: 0.3}, 1), w); err == nil {
		t.Error("spheroid without diameter accepted")
	}
	if _, err := Calc(NewOrganism(Body{Shape: "blob", Length: 0.3}, 1), w); err == nil {
		t.Error("unknown shape accepted")
	}
	o := NewOrganism(fish, 1)
	o.Frequency = 3
	r, err := Calc(o, w)
	if err != nil {
		t.Fatal(err)
	}
	// A frequency without an amplitude is incomplete, not inconsistent:
	// field sheets often record only the beat frequency.
	if !math.IsNaN(r.Strouhal) || !hasWarning(r.Warnings, WarnStrokeIncomplete) || hasWarning(r.Warnings, WarnInconsistent) {
		t.Errorf("frequency without amplitude: St %g, warnings %v", r.Strouhal, r.Warnings)
	}
	o.Amplitude = 0.5 // larger than the 0.3 m body
	r, _ = Calc(o, w)
	if !hasWarning(r.Warnings, WarnInconsistent) {
		t.Errorf("amplitude > body length not flagged: %v", r.Warnings)
	}
}

func hasWarning(ws []Warning, code string) bool {
	for _, w := range ws {
		if w.Code == code {
			return true
		}
	}
	return false
}

// Regime choice across a sphere's range: each Re picks the law of its range.
func TestSphereLawChoice(t *testing.T) {
	w := water20(t)
	nu := w.KinematicViscosity
	cases := []struct {
		re  float64
		law string
	}{{0.01, "Stokes"}, {0.5, "Proudman–Pearson"}, {50, "standard drag curve"}, {1e5, "standard drag curve"}}
	for _, c := range cases {
		d := 1e-3
		u := c.re * nu / d
		res, err := Drag(Body{Shape: Sphere, Length: d}, Flow{Speed: u, Density: w.Density, Viscosity: w.DynamicViscosity})
		if err != nil {
			t.Fatal(err)
		}
		if res.Chosen.Law != c.law {
			t.Errorf("Re %g: law %q, want %q", c.re, res.Chosen.Law, c.law)
		}
		for _, e := range res.Estimates {
			if e.Law == "Stokes" && e.InRange != (c.re <= 0.1) {
				t.Errorf("Re %g: Stokes in-range flag %v", c.re, e.InRange)
			}
		}
	}
}

// Brenner (1961): for a sphere the general Oseen correction, written for
// any shape as F_S(1 + F_S ρ/(16πμ²)), must give Oseen's (1910) published
// F = 3πμdU (1 + 3Re/16) — the coefficient 3/16 is Oseen's, not computed
// from the code's formula (recalled from memory of Oseen 1910 and of
// Happel & Brenner 1965; no tabulated Oseen–Brenner correction for a
// spheroid could be read).
func TestOseenBrennerSphere(t *testing.T) {
	const mu, rho, d, u = 1e-3, 1000.0, 1e-3, 5e-4
	fs := 3 * math.Pi * mu * d * u
	re := rho * u * d / mu
	checkRel(t, "Brenner sphere", OseenCorrection(fs, rho, mu), fs*(1+3*re/16), 1e-12)
}

// Resistive-force coefficients (Gray & Hancock 1955; Lighthill 1976): the
// drag anisotropy C_N/C_T tends to 2 for very slender filaments, and for a
// sea-urchin sperm flagellum (a = 0.1 µm, λ = 25 µm) Gray & Hancock give
// 2(ln(2λ/a) − ½)/(ln(2λ/a) + ½) = 1.70 (closed form). Taylor's (1951)
// swimming sheet, U/c = (kA)²/2, is the C_N/C_T = 2 case of the wave speed.
func TestResistiveForce(t *testing.T) {
	const mu = 1e-3
	cn, ct := GrayHancockCoefficients(mu, 0.1e-6, 25e-6)
	l := math.Log(2 * 25e-6 / 0.1e-6)
	checkRel(t, "GH C_N/C_T", cn/ct, 2*(l-0.5)/(l+0.5), 1e-12)
	checkRel(t, "GH C_N/C_T value", cn/ct, 1.70, 0.005)
	cn, ct = GrayHancockCoefficients(mu, 1e-30, 1)
	checkRel(t, "slender limit", cn/ct, 2, 0.02)
	cn, ct = LighthillCoefficients(mu, 0.1e-6, 25e-6)
	q := math.Log(2 * 0.09 * 25e-6 / 0.1e-6)
	checkRel(t, "Lighthill C_N", cn, 4*math.Pi*mu/(q+0.5), 1e-12)
	checkRel(t, "Lighthill C_T", ct, 2*math.Pi*mu/q, 1e-12)
	checkRel(t, "Taylor sheet", WaveSwimmingSpeed(1, 2, 0.3), 0.045, 1e-12)
}

// The speed of sound in air against the U.S. Standard Atmosphere 1976's
// tables (340.294 m/s at sea level, 15 °C; 295.070 m/s at 11 km, −56.5 °C;
// both recalled from memory); a body at Mach 0.87 is warned about, one at
// 10 m/s is not.
func TestSpeedOfSoundAndMach(t *testing.T) {
	checkRel(t, "sea level", SpeedOfSoundAir(15), 340.294, 2e-6)
	checkRel(t, "11 km", SpeedOfSoundAir(-56.5), 295.070, 2e-6)
	air, _ := media.Air(media.AirConditions{TemperatureC: 15, PressurePa: math.NaN()})
	for _, c := range []struct {
		speed float64
		warn  bool
	}{{300, true}, {10, false}} {
		r, err := Calc(NewOrganism(Body{Shape: Spheroid, Length: 0.3, Diameter: 0.05}, c.speed), air)
		if err != nil {
			t.Fatal(err)
		}
		warned := false
		for _, w := range r.Warnings {
			warned = warned || strings.Contains(w.Message, "Mach")
		}
		if warned != c.warn {
			t.Errorf("%g m/s: Mach warning %v, want %v", c.speed, warned, c.warn)
		}
	}
}
