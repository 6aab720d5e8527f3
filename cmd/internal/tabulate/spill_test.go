package tabulate

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/batch"
	"gonum.org/v1/gonum/floats"
)

// Outside reference: gonum's floats.Sum on a freshly made slice (16-byte
// aligned, as ScalingFit's are). Exact equality for every length 0–300
// and a few long ones, whose lane boundaries all differ.
func TestLaneSumEqualsGonumSum(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	sizes := []int{1000, 4099, 65537}
	for n := 0; n <= 300; n++ {
		sizes = append(sizes, n)
	}
	for _, n := range sizes {
		v := make([]float64, n)
		for i := range v {
			v[i] = rng.NormFloat64() * math.Pow(10, float64(rng.IntN(12)-6))
		}
		l := laneSum{n: n}
		for _, x := range v {
			l.add(x)
		}
		if got, want := l.sum(), floats.Sum(v); math.Float64bits(got) != math.Float64bits(want) {
			t.Fatalf("n %d: laneSum %v, floats.Sum %v", n, got, want)
		}
	}
}

// sameBits says whether two fits are equal bit for bit (NaN as NaN).
func sameBits(a, b Fit) bool { return fmt.Sprintf("%#v", a) == fmt.Sprintf("%#v", b) }

// Outside reference: ScalingFit, which calls gonum's stat functions on
// slices. streamFit, given the same pairs a pass at a time, gives every
// field bit for bit, on random pairs with non-positive and infinite
// values (left out by both) and every length 0–200 and a few long ones.
func TestStreamFitEqualsScalingFit(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	sizes := []int{1000, 4099, 30011}
	for n := 0; n <= 200; n++ {
		sizes = append(sizes, n)
	}
	for _, n := range sizes {
		x, y := make([]float64, n), make([]float64, n)
		for i := range x {
			x[i] = math.Exp(rng.NormFloat64())
			y[i] = 3 * math.Pow(x[i], 0.75) * math.Exp(0.2*rng.NormFloat64())
			switch rng.IntN(40) {
			case 0:
				x[i] = 0
			case 1:
				y[i] = -1
			case 2:
				x[i] = math.Inf(1)
			}
		}
		got, err := streamFit(logPairs(func(fn func(x, y []float64)) error { fn(x, y); return nil }))
		if want := ScalingFit(x, y); err != nil || !sameBits(got, want) {
			t.Fatalf("n %d (%v):\nstream %#v\nslices %#v", n, err, got, want)
		}
	}
}

// Outside reference: sort.Float64s. Ordering by radixKey gives the same
// order, on negatives, ±0, infinities and subnormals.
func TestRadixKeyOrder(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	v := []float64{0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), 5e-324, -5e-324, math.MaxFloat64, -math.MaxFloat64}
	for range 2000 {
		v = append(v, rng.NormFloat64()*math.Pow(10, float64(rng.IntN(40)-20)))
	}
	want := slices.Clone(v)
	sort.Float64s(want)
	got := slices.Clone(v)
	slices.SortStableFunc(got, func(a, b float64) int {
		ka, kb := radixKey(a), radixKey(b)
		if ka < kb {
			return -1
		}
		if ka > kb {
			return 1
		}
		return 0
	})
	for i := range got {
		if got[i] != want[i] { // −0 == +0: their order is free
			t.Fatalf("at %d: %v, sort.Float64s %v", i, got[i], want[i])
		}
	}
}

// tiedTable is a CSV table of n rows in groups of very unequal sizes,
// half its values drawn from few distinct numbers (many ties) over signs
// and magnitudes, half spread, NaN-free.
func tiedTable(n int) []byte {
	rng := rand.New(rand.NewPCG(11, 12))
	var b bytes.Buffer
	b.WriteString("site,reynolds,strouhal,drag_N,power_W,regime\n")
	groups := []string{"big", "big", "big", "big", "mid", "mid", "small", "tiny"}
	value := func() string {
		if rng.IntN(50) == 0 {
			return "" // a missing value: left out of that column only
		}
		if rng.IntN(2) == 0 {
			return fmt.Sprint(float64(rng.IntN(7)-2) * math.Pow(10, float64(rng.IntN(3))))
		}
		return fmt.Sprint(math.Exp(rng.NormFloat64()))
	}
	for i := range n {
		g := groups[rng.IntN(len(groups))]
		if i%97 == 0 {
			g = "rare"
		}
		fmt.Fprintf(&b, "%s,%s,%s,%s,%s,laminar\n", g, value(), value(), value(), value())
	}
	return b.Bytes()
}

// chunksWith is Chunks on data under a budget, its spill files made in
// dir; it returns how many were made.
func chunksWith(t *testing.T, data []byte, spec Spec, budget int, dir string, fail error) ([]Group, int, error) {
	t.Helper()
	r, err := batch.NewReader(bytes.NewReader(data), ',')
	if err != nil {
		t.Fatal(err)
	}
	made := 0
	temp := func() (*os.File, error) { made++; return os.CreateTemp(dir, "spill-*") }
	chunks := 0
	next := func() (batch.Chunk, error) {
		c, err := r.NextChunk()
		chunks++
		if fail != nil && chunks > 1 && err == nil {
			return c, fail
		}
		return c, err
	}
	groups, err := Chunks(r.Header(), next, spec, Options{Workers: 2, Budget: budget, TempFile: temp}, func(batch.Record) {})
	return groups, made, err
}

// Spilled and in-memory summaries are equal bit for bit: every median,
// percentile and fit field printed exactly (%v of a float64 is its
// shortest exact form), with budgets that spill and then load groups whole
// (1000 values) or select and fit in passes over the file (50), and the
// spill file is gone afterwards.
func TestSpilledEqualsInMemory(t *testing.T) {
	data := tiedTable(20000)
	spec := Spec{By: []string{"site"}, Fits: []Pair{{Y: "power_W", X: "drag_N"}, {Y: "reynolds", X: "strouhal"}}}
	want, made, err := chunksWith(t, data, spec, 1<<30, t.TempDir(), nil)
	if err != nil || made != 0 {
		t.Fatalf("in memory: %v, %d spill files", err, made)
	}
	for _, budget := range []int{50, 1000, 30000} {
		dir := t.TempDir()
		got, made, err := chunksWith(t, data, spec, budget, dir, nil)
		if err != nil || made != 1 {
			t.Fatalf("budget %d: %v, %d spill files", budget, err, made)
		}
		if g, w := fmt.Sprintf("%v", got), fmt.Sprintf("%v", want); g != w {
			t.Errorf("budget %d: spilled\n%s\nin memory\n%s", budget, g, w)
		}
		if left, _ := os.ReadDir(dir); len(left) != 0 {
			t.Errorf("budget %d: %d files left in the temporary folder", budget, len(left))
		}
	}
}

// A read failure after values were spilled is returned as it is, and the
// spill file is gone.
func TestSpillRemovedOnReadFailure(t *testing.T) {
	data := tiedTable(20000)
	dir := t.TempDir()
	failure := errors.New("disk gone")
	_, made, err := chunksWith(t, data, Spec{By: []string{"site"}}, 50, dir, failure)
	if !errors.Is(err, failure) || made != 1 {
		t.Fatalf("got %v, %d spill files", err, made)
	}
	if left, _ := os.ReadDir(dir); len(left) != 0 {
		t.Errorf("%d files left in the temporary folder", len(left))
	}
}

// A spill file that cannot be made is an error of its own, saying so.
func TestSpillFileRefused(t *testing.T) {
	data := tiedTable(5000)
	r, err := batch.NewReader(bytes.NewReader(data), ',')
	if err != nil {
		t.Fatal(err)
	}
	refuse := func() (*os.File, error) { return nil, os.ErrPermission }
	_, err = Chunks(r.Header(), r.NextChunk, Spec{}, Options{Budget: 10, TempFile: refuse}, func(batch.Record) {})
	if se := (SpillError{}); !errors.As(err, &se) || !strings.Contains(err.Error(), "temporary file") {
		t.Errorf("got %v", err)
	}
}
