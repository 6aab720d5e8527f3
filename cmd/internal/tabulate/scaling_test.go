package tabulate

import (
	"errors"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat"
)

// Data on an exact power law y = 3 x^0.75 give both slopes 0.75 with zero
// width intervals (known answer).
func TestScalingExact(t *testing.T) {
	var x, y []float64
	for i := 1; i <= 20; i++ {
		xi := math.Pow(10, float64(i)/5)
		x, y = append(x, xi), append(y, 3*math.Pow(xi, 0.75))
	}
	f := ScalingFit(x, y)
	for _, v := range []float64{f.OLSSlope, f.SMASlope, f.OLSLow, f.OLSHigh, f.SMALow, f.SMAHigh} {
		if math.Abs(v-0.75) > 1e-9 {
			t.Errorf("slope or bound %g, want 0.75", v)
		}
	}
	if math.Abs(f.OLSIntercept-math.Log10(3)) > 1e-9 || math.Abs(f.R2-1) > 1e-12 {
		t.Errorf("intercept %g, r² %g", f.OLSIntercept, f.R2)
	}
}

// Against gonum/stat on scattered data: the SMA slope is the geometric mean
// of the OLS slope of y on x and the reciprocal of the OLS slope of x on y
// (Warton et al. 2006, Biol. Rev. 81, eq. for the SMA as the geometric mean
// regression); b_OLS = r · b_SMA; and the 95 % intervals contain the slopes.
// The data are fixed deterministic scatter, not random.
func TestScalingAgainstGonum(t *testing.T) {
	x := []float64{1.2, 2.5, 3.1, 4.8, 6.0, 7.7, 9.1, 12.4, 15.0, 21.3, 30.2, 41.0}
	y := []float64{2.0, 3.9, 4.1, 7.5, 7.2, 11.9, 10.8, 17.5, 16.1, 27.0, 31.9, 48.8}
	f := ScalingFit(x, y)
	lx, ly := make([]float64, len(x)), make([]float64, len(y))
	for i := range x {
		lx[i], ly[i] = math.Log10(x[i]), math.Log10(y[i])
	}
	_, byx := stat.LinearRegression(lx, ly, nil, false)
	_, bxy := stat.LinearRegression(ly, lx, nil, false)
	if math.Abs(f.SMASlope-math.Sqrt(byx/bxy)) > 1e-12 {
		t.Errorf("SMA %g, geometric mean %g", f.SMASlope, math.Sqrt(byx/bxy))
	}
	if r := stat.Correlation(lx, ly, nil); math.Abs(f.OLSSlope-r*f.SMASlope) > 1e-12 || math.Abs(f.OLSSlope-byx) > 1e-12 {
		t.Errorf("OLS %g, r·SMA %g, gonum %g", f.OLSSlope, r*f.SMASlope, byx)
	}
	if !(f.OLSLow < f.OLSSlope && f.OLSSlope < f.OLSHigh && f.SMALow < f.SMASlope && f.SMASlope < f.SMAHigh) {
		t.Errorf("intervals do not contain slopes: %+v", f)
	}
	// The SMA interval is not symmetric: b(√(B+1) − √B) · b(√(B+1) + √B) = b².
	if math.Abs(f.SMALow*f.SMAHigh-f.SMASlope*f.SMASlope) > 1e-12 {
		t.Errorf("SMA interval bounds %g, %g do not multiply to b²", f.SMALow, f.SMAHigh)
	}
}

func TestScalingTooFew(t *testing.T) {
	if f := ScalingFit([]float64{1, 2}, []float64{1, 2}); !math.IsNaN(f.SMASlope) || f.N != 2 {
		t.Errorf("two points: %+v", f)
	}
}

// The OLS interval against the textbook standard error computed directly
// from the residuals, SE = √(Σe²/(n − 2) / Σ(x − x̄)²).
func TestOLSIntervalFromResiduals(t *testing.T) {
	x := []float64{1.2, 2.5, 3.1, 4.8, 6.0, 7.7, 9.1, 12.4, 15.0, 21.3, 30.2, 41.0}
	y := []float64{2.0, 3.9, 4.1, 7.5, 7.2, 11.9, 10.8, 17.5, 16.1, 27.0, 31.9, 48.8}
	f := ScalingFit(x, y)
	var lx, ly []float64
	for i := range x {
		lx, ly = append(lx, math.Log10(x[i])), append(ly, math.Log10(y[i]))
	}
	mx := stat.Mean(lx, nil)
	var sse, sxx float64
	for i := range lx {
		e := ly[i] - f.OLSIntercept - f.OLSSlope*lx[i]
		sse += e * e
		sxx += (lx[i] - mx) * (lx[i] - mx)
	}
	se := math.Sqrt(sse / float64(len(lx)-2) / sxx)
	const t10 = 2.228138851986 // Student's t, 0.975 quantile, 10 degrees of freedom (standard tables)
	if math.Abs((f.OLSHigh-f.OLSSlope)-t10*se) > 1e-9 {
		t.Errorf("half-width %g, want %g", f.OLSHigh-f.OLSSlope, t10*se)
	}
}

// A grouping with more than MaxGroups groups (one per row id) is refused,
// not held in memory; MaxGroups groups are summarised. The limit is a
// stated bound of this program (common practice, no source).
func TestTabulateGroupBound(t *testing.T) {
	header := []string{"id", "reynolds", "strouhal", "drag_N", "power_W", "regime"}
	rows := func(n int) func() ([]string, error) {
		i := 0
		return func() ([]string, error) {
			if i == n {
				return nil, io.EOF
			}
			i++
			return []string{strconv.Itoa(i), "10", "0.3", "1e-6", "1e-7", "intermediate"}, nil
		}
	}
	groups, err := Tabulate(header, rows(MaxGroups), Spec{By: []string{"id"}})
	if err != nil || len(groups) != MaxGroups {
		t.Fatalf("%d groups: %v", len(groups), err)
	}
	if g := groups[0]; g.N != 1 || g.Stats["reynolds"].Median != 10 || g.Regimes["intermediate"] != 1 {
		t.Errorf("group %v", g)
	}
	_, err = Tabulate(header, rows(MaxGroups+1), Spec{By: []string{"id"}})
	var tm TooManyGroups
	if !errors.As(err, &tm) || !strings.Contains(err.Error(), "--by id makes more than 100000 groups") {
		t.Errorf("one group too many: %v", err)
	}
}
