package surveypage

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// The data row of each flagged output row, found from the rejected rows,
// equals the one found by walking the rows one by one (the reference: the
// k-th row written is the k-th data row not rejected).
func TestFlaggedRowNumbers(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for trial := range 200 {
		rows := 1 + rng.IntN(300)
		var rejected, written []int
		for r := 1; r <= rows; r++ {
			if rng.IntN(4) == 0 {
				rejected = append(rejected, r)
			} else {
				written = append(written, r)
			}
		}
		var l flagList
		for k := range written {
			if rng.IntN(3) == 0 {
				l.rows = append(l.rows, Flagged{})
				l.out = append(l.out, k+1)
			}
		}
		shuffled := slices.Clone(rejected)
		rng.Shuffle(len(shuffled), func(i, j int) { shuffled[i], shuffled[j] = shuffled[j], shuffled[i] })
		slices.Sort(shuffled)
		got := l.numbered(shuffled)
		for i, k := range l.out {
			if got[i].Row != written[k-1] {
				t.Fatalf("trial %d: output row %d is data row %d, got %d (rejected %v)", trial, k, written[k-1], got[i].Row, rejected)
			}
		}
	}
}

// The regime map's sample holds MaxPoints rows, each group in about its
// share of the survey (binomial: 3 standard deviations) though one group
// fills the first half of the rows and the other the second, and is the
// same for the same rows.
func TestSamplePoints(t *testing.T) {
	header := []string{"taxon", "length (mm)", "reynolds", "flags"}
	sample := func() []Point {
		c := NewCollector(header, Setup{By: []string{"taxon"}, LengthColumn: "length (mm)", LengthUnit: "mm"})
		for i := range 4 * MaxPoints {
			taxon := "fish"
			if i >= 2*MaxPoints {
				taxon = "snail"
			}
			c.Observe([]string{taxon, "12", "100", ""})
		}
		return c.Points()
	}
	pts := sample()
	if len(pts) != MaxPoints {
		t.Fatalf("%d points, want %d", len(pts), MaxPoints)
	}
	snails := 0
	for _, p := range pts {
		if p.Group == "snail" {
			snails++
		}
		if p.LengthMM != 12 || p.Re != 100 {
			t.Fatalf("point %+v, want 12 mm and Re 100", p)
		}
	}
	// Expected 2500 of 5000 with sd √(5000·0.5·0.5) ≈ 35.4 (sampling
	// without replacement has less spread); the first 5000 rows would
	// hold none.
	if snails < 2500-106 || snails > 2500+106 {
		t.Errorf("%d snails in the sample, want 2500 ± 106", snails)
	}
	if !slices.Equal(pts, sample()) {
		t.Errorf("two samples of the same rows differ")
	}
}
