package tabulate

import (
	"math"
	"testing"
)

// Three points at log10 x = −1, 0, 1 with residuals +d, −2d, +d (orthogonal
// to 1 and x) about log10 y = a + b log10 x. By hand: the OLS line is
// exactly a, b; s² = 6d²/(n − 2); x̄ = 0, Sxx = 2, so SE(a) = s/√3.
// SMA: s_x² = 1, s_xy = b, s_y² = b² + 3d², slope B = √(b² + 3d²),
// s_r² = (s_y² − 2B s_xy + B² s_x²)(n − 1)/(n − 2) = 4B(B − b), and
// SE(a)² = s_r²/n (Warton et al. 2006, Table 4, with x̄ = 0).
// t₀.₉₇₅ with 1 degree of freedom = 12.706 (NIST/SEMATECH e-Handbook of
// Statistical Methods, table 1.3.6.7.2, printed to 3 decimals): tolerance
// 1e-4 relative.
func TestInterceptIntervalsByHand(t *testing.T) {
	const a, b, d = 0.5, 0.75, 0.01
	lx := []float64{-1, 0, 1}
	e := []float64{d, -2 * d, d}
	var x, y []float64
	for i := range lx {
		x = append(x, math.Pow(10, lx[i]))
		y = append(y, math.Pow(10, a+b*lx[i]+e[i]))
	}
	f := ScalingFit(x, y)
	const t975 = 12.706
	olsHalf := t975 * math.Sqrt(6*d*d/1) / math.Sqrt(3)
	B := math.Sqrt(b*b + 3*d*d)
	smaHalf := t975 * math.Sqrt(4*B*(B-b)/3)
	checks := []struct {
		name      string
		got, want float64
	}{
		{"OLS intercept", f.OLSIntercept, a},
		{"OLS intercept low", f.OLSInterceptLow, a - olsHalf},
		{"OLS intercept high", f.OLSInterceptHigh, a + olsHalf},
		{"SMA slope", f.SMASlope, B},
		{"SMA intercept", f.SMAIntercept, a},
		{"SMA intercept low", f.SMAInterceptLow, a - smaHalf},
		{"SMA intercept high", f.SMAInterceptHigh, a + smaHalf},
	}
	for _, c := range checks {
		if math.Abs(c.got-c.want) > 1e-4*math.Abs(c.want)+1e-12 {
			t.Errorf("%s = %.8g, want %.8g", c.name, c.got, c.want)
		}
	}
}

// Isometry: mass against length is cubic, span against mass one third
// (geometric similarity, Schmidt-Nielsen 1984, recalled from memory);
// power against mass has none.
func TestIsometryAndCompare(t *testing.T) {
	if r, ok := Isometry(Pair{Y: "mass", X: "length"}); !ok || r.Exponent != 3 {
		t.Errorf("mass on length: %v %v", r, ok)
	}
	if r, ok := Isometry(Pair{Y: "span", X: "mass"}); !ok || math.Abs(r.Exponent-1.0/3) > 1e-15 {
		t.Errorf("span on mass: %v %v", r, ok)
	}
	if _, ok := Isometry(Pair{Y: "power_W", X: "mass"}); ok {
		t.Error("power on mass has no isometric exponent")
	}
	f := Fit{SMALow: 0.70, SMAHigh: 0.80, OLSLow: 0.76, OLSHigh: 0.79}
	v := Compare(f, Reference{Exponent: 0.75, Source: "expected"})
	if v.OutsideSMA || !v.OutsideOLS {
		t.Errorf("0.75 in [0.70, 0.80] and outside [0.76, 0.79]: %+v", v)
	}
	nan := math.NaN()
	if v := Compare(Fit{SMALow: nan, SMAHigh: nan, OLSLow: nan, OLSHigh: nan}, v.Reference); v.OutsideSMA || v.OutsideOLS {
		t.Error("a fit without intervals excludes nothing")
	}
}

func TestParseExpect(t *testing.T) {
	p, b, err := ParseExpect("power_W=mass:0.75")
	if err != nil || p != (Pair{Y: "power_W", X: "mass"}) || b != 0.75 {
		t.Errorf("got %v %v %v", p, b, err)
	}
	if _, b, err := ParseExpect("span=mass:1/3"); err != nil || math.Abs(b-1.0/3) > 1e-15 {
		t.Errorf("1/3: %v %v", b, err)
	}
	for _, bad := range []string{"power_W=mass", "power_W:0.75", "=mass:1", "a=b:x", "a=b:1/0", "a=b:NaN", "a=b:Inf"} {
		if _, _, err := ParseExpect(bad); err == nil {
			t.Errorf("%q accepted", bad)
		}
	}
}
