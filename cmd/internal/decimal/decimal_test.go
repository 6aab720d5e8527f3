package decimal

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// The reference throughout is Go's strconv, which reads and writes
// correctly rounded decimals (strconv package documentation); both
// functions here promise its exact output.

func checkG(t *testing.T, v float64, prec int) {
	t.Helper()
	want := strconv.FormatFloat(v, 'g', prec, 64)
	if got := string(AppendG(nil, v, prec)); got != want {
		t.Fatalf("AppendG(%v [%x], %d) = %q, strconv gives %q", v, math.Float64bits(v), prec, got, want)
	}
}

func TestAppendGSpecialValues(t *testing.T) {
	vals := []float64{0, math.Copysign(0, -1), math.NaN(), math.Inf(1), math.Inf(-1), 1, -1, 0.5, 1.5,
		100000, 999999, 999999.5, 999999.4999, 9999995, 1e6, 1e-5, 1e-4, 0.0001234565, 123456.5, 1e21, 1e22, 1e23,
		math.MaxFloat64, math.SmallestNonzeroFloat64, 1e-300, 1e300, 9.999995e-301, 2.5, 0.125, 12345650, 1.0000005}
	for _, v := range vals {
		for prec := 1; prec <= 9; prec++ { // above 9, AppendG is strconv itself
			checkG(t, v, prec)
			checkG(t, -v, prec)
		}
	}
}

func TestAppendGPowersOfTenAndNeighbours(t *testing.T) {
	for k := -320; k <= 308; k++ {
		p, _ := strconv.ParseFloat("1e"+strconv.Itoa(k), 64)
		for _, v := range []float64{p, math.Nextafter(p, 0), math.Nextafter(p, math.Inf(1)), 9.999995 * p, 9.9999949 * p, 5 * p} {
			for prec := 1; prec <= 9; prec++ {
				checkG(t, v, prec)
			}
		}
	}
}

func TestAppendGRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	n := 2000000
	if testing.Short() {
		n = 200000
	}
	for range n {
		var v float64
		switch rng.IntN(4) {
		case 0: // any bit pattern
			v = math.Float64frombits(rng.Uint64())
		case 1: // log-uniform over the range measured quantities take
			v = math.Pow(10, -25+45*rng.Float64())
		case 2: // decimals with one digit more than printed, ending in 5
			v = float64(rng.IntN(10000000)*10+5) * math.Pow(10, float64(rng.IntN(30)-20))
		default: // short decimals, as read from tables
			v, _ = strconv.ParseFloat(strconv.Itoa(rng.IntN(1000000))+"e"+strconv.Itoa(rng.IntN(40)-25), 64)
		}
		checkG(t, v, 1+rng.IntN(9))
		checkG(t, v, 6)
	}
}

func TestParse(t *testing.T) {
	for _, s := range []string{"0", "-0", "+0", "1", "-1", "12.5", ".5", "5.", "1e5", "1E-5", "1e+22", "1e23", "1e-22", "1e-23",
		"9007199254740993", "9007199254740992", "123456789012345678901", "0.000000000000000000000000001",
		"00012.3400", "1e", "1e+", "e5", ".", "-", "+", "", "1.2.3", "1e5e5", "--1", "1-", "1e400", "1e-400",
		"4.9e-324", "2.2250738585072014e-308", "1.7976931348623157e308", "0.1", "0.2", "0.3", "3.0000000000000004",
		"1e99999999999", "0e99999999999", "7.2196e3", "inf", "-Inf", "NaN", "0x1p-2", "1_000", " 1", "1 "} {
		checkParse(t, s)
	}
}

func checkParse(t *testing.T, s string) {
	t.Helper()
	want, err := strconv.ParseFloat(s, 64)
	for i := 0; i < len(s); i++ {
		if c := s[i]; !(c >= '0' && c <= '9' || c == '.' || c == '+' || c == '-' || c == 'e' || c == 'E') {
			err = strconv.ErrSyntax // not a plain decimal: Parse declines
		}
	}
	got, ok := Parse(s)
	if ok != (err == nil) {
		t.Fatalf("Parse(%q) ok = %v, strconv error %v", s, ok, err)
	}
	if ok && math.Float64bits(got) != math.Float64bits(want) {
		t.Fatalf("Parse(%q) = %v [%x], strconv gives %v [%x]", s, got, math.Float64bits(got), want, math.Float64bits(want))
	}
}

func TestParseRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	const alphabet = "0123456789.-+eE"
	n := 2000000
	if testing.Short() {
		n = 200000
	}
	var b []byte
	for range n {
		b = b[:0]
		switch rng.IntN(3) {
		case 0: // random text over the number alphabet
			for range 1 + rng.IntN(12) {
				b = append(b, alphabet[rng.IntN(len(alphabet))])
			}
		case 1: // well-formed decimals of up to 20 digits
			b = strconv.AppendInt(b, rng.Int64N(math.MaxInt64)>>rng.IntN(63), 10)
			if p := rng.IntN(len(b) + 1); p < len(b) {
				b = append(b[:p], append([]byte{'.'}, b[p:]...)...)
			}
			if rng.IntN(2) == 0 {
				b = append(b, 'e')
				b = strconv.AppendInt(b, int64(rng.IntN(80)-40), 10)
			}
		default: // what the formatter writes
			b = strconv.AppendFloat(b, math.Float64frombits(rng.Uint64()), 'g', 1+rng.IntN(17), 64)
		}
		checkParse(t, string(b))
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"12.5", "1e-5", "-0.003", "9007199254740993", "1e23"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) { checkParse(t, s) })
}

func FuzzAppendG(f *testing.F) {
	f.Add(uint64(0x3ff0000000000000), 6)
	f.Add(uint64(0x412e847fffffffff), 6)
	f.Fuzz(func(t *testing.T, bits uint64, prec int) {
		checkG(t, math.Float64frombits(bits), 1+(prec&0xff)%9)
	})
}

func BenchmarkAppendG(b *testing.B) {
	vals := []float64{1027.43, 1.05123e-6, 146325.2, 0.41, 3.0281e-13, 0.0266}
	buf := make([]byte, 0, 32)
	for i := range b.N {
		buf = AppendG(buf[:0], vals[i%len(vals)], 6)
	}
}

func BenchmarkStrconvG(b *testing.B) {
	vals := []float64{1027.43, 1.05123e-6, 146325.2, 0.41, 3.0281e-13, 0.0266}
	buf := make([]byte, 0, 32)
	for i := range b.N {
		buf = strconv.AppendFloat(buf[:0], vals[i%len(vals)], 'g', 6, 64)
	}
}

func BenchmarkParse(b *testing.B) {
	ss := []string{"15.3", "30.9", "146.7614", "25.8991", "7219.1779", "0.0026"}
	for i := range b.N {
		Parse(ss[i%len(ss)])
	}
}

func BenchmarkStrconvParse(b *testing.B) {
	ss := []string{"15.3", "30.9", "146.7614", "25.8991", "7219.1779", "0.0026"}
	for i := range b.N {
		strconv.ParseFloat(ss[i%len(ss)], 64)
	}
}

// BenchmarkAppendGMixed formats log-uniform values over the range the batch
// prints (10⁻¹³ to 10⁶), in an order the branch predictor cannot learn.
func BenchmarkAppendGMixed(b *testing.B) {
	rng := rand.New(rand.NewPCG(3, 4))
	vals := make([]float64, 4096)
	for i := range vals {
		vals[i] = math.Pow(10, -13+19*rng.Float64())
	}
	buf := make([]byte, 0, 32)
	b.ResetTimer()
	for i := range b.N {
		buf = AppendG(buf[:0], vals[i%len(vals)], 6)
	}
}

// BenchmarkParseMixed reads survey-like cells of varying length in an order
// the branch predictor cannot learn.
func BenchmarkParseMixed(b *testing.B) {
	rng := rand.New(rand.NewPCG(5, 6))
	ss := make([]string, 4096)
	for i := range ss {
		ss[i] = strconv.FormatFloat(math.Pow(10, -3+7*rng.Float64()), 'f', rng.IntN(5), 64)
	}
	b.ResetTimer()
	for i := range b.N {
		Parse(ss[i%len(ss)])
	}
}
