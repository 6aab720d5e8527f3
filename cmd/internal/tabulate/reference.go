package tabulate

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Reference is the exponent a fitted scaling law is compared with: one the
// user expects (--expect) or isometry.
type Reference struct {
	Exponent float64
	Source   string // "expected" or "isometry"
}

// Verdict is the comparison of a fit's exponent interval with a reference.
type Verdict struct {
	Reference
	OutsideSMA, OutsideOLS bool // the 95 % interval excludes the reference
}

// lengthPower is the power of length a geometric quantity scales with
// under geometric similarity (mass ∝ L³ at constant density; areas ∝ L²),
// the definition of isometry (Schmidt-Nielsen, K. (1984), Scaling: why is
// animal size so important?, Cambridge University Press, chapter 1;
// recalled from memory). Computed quantities (Re, drag, power) have no
// isometric exponent without assumptions about speed, so none is given.
var lengthPower = map[string]float64{
	"length": 1, "diameter": 1, "span": 1, "chord": 1, "amplitude": 1, "wing_length": 1,
	"wing_area": 2, "area": 2, "mass": 3,
}

// Isometry returns the isometric exponent of y against x, if both are
// geometric quantities.
func Isometry(p Pair) (Reference, bool) {
	py, oky := lengthPower[p.Y]
	px, okx := lengthPower[p.X]
	if !oky || !okx {
		return Reference{}, false
	}
	return Reference{Exponent: py / px, Source: "isometry"}, true
}

// Compare says whether the fit's 95 % exponent intervals exclude ref.
// A fit without intervals (too few points) excludes nothing.
func Compare(f Fit, ref Reference) Verdict {
	outside := func(lo, hi float64) bool { return lo > ref.Exponent || hi < ref.Exponent }
	return Verdict{Reference: ref, OutsideSMA: outside(f.SMALow, f.SMAHigh), OutsideOLS: outside(f.OLSLow, f.OLSHigh)}
}

// ParseExpect reads "y=x:b" (b a number or a fraction such as 2/3).
func ParseExpect(s string) (Pair, float64, error) {
	pair, num, ok := strings.Cut(s, ":")
	y, x, ok2 := strings.Cut(pair, "=")
	y, x, num = strings.TrimSpace(y), strings.TrimSpace(x), strings.TrimSpace(num)
	if !ok || !ok2 || y == "" || x == "" || num == "" {
		return Pair{}, 0, fmt.Errorf("write y=x:exponent, e.g. power_W=mass:0.75")
	}
	b, err := fraction(num)
	if err != nil {
		return Pair{}, 0, fmt.Errorf("exponent %q: give a number such as 0.75 or 2/3", num)
	}
	return Pair{Y: y, X: x}, b, nil
}

func fraction(s string) (float64, error) {
	n, d, isFrac := strings.Cut(s, "/")
	a, err := strconv.ParseFloat(strings.TrimSpace(n), 64)
	if err != nil {
		return 0, err
	}
	if isFrac {
		b, err := strconv.ParseFloat(strings.TrimSpace(d), 64)
		if err != nil || b == 0 {
			return 0, fmt.Errorf("bad fraction")
		}
		a /= b
	}
	if math.IsNaN(a) || math.IsInf(a, 0) {
		return 0, fmt.Errorf("not finite")
	}
	return a, nil
}
