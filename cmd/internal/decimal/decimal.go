// Package decimal reads and writes plain decimal numbers faster than
// strconv for the common cases of survey tables, with results identical to
// strconv's: Parse equals strconv.ParseFloat(s, 64) and AppendG equals
// strconv.AppendFloat(b, v, 'g', prec, 64) for every input they accept;
// the rest is handed to strconv itself.
package decimal

import (
	"math"
	"strconv"
)

// exact10 holds the powers of ten that float64 represents exactly.
var exact10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11,
	1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// Parse reads [+-]digits[.digits][(e|E)[+-]digits] into a float64, as
// strconv.ParseFloat(s, 64) does; ok is false when s is not such a number
// (strconv's "Inf", "NaN", hexadecimal and underscored forms are not) or is
// out of float64's range.
//
// Numbers of at most 19 digits whose significand is below 2⁵³, with a
// decimal exponent within ±22, are converted by one correctly rounded
// multiplication or division of two exactly represented numbers (Clinger,
// W. D. (1990), How to read floating point numbers accurately, PLDI '90,
// 92–101, the "fast path"); everything else goes to strconv.
func Parse(s string) (float64, bool) {
	i, neg := 0, false
	if len(s) > 0 && (s[0] == '+' || s[0] == '-') {
		neg = s[0] == '-'
		i = 1
	}
	start := i
	i, mant := accumulate(s, i, 0)
	digits, exp := i-start, 0
	if i < len(s) && s[i] == '.' {
		frac := i + 1
		i, mant = accumulate(s, frac, mant)
		digits += i - frac
		exp = frac - i
	}
	// 19 digits, leading zeros included, cannot overflow the significand.
	if digits == 0 || digits > 19 {
		return slow(s)
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		eneg := false
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			eneg = s[i] == '-'
			i++
		}
		if i == len(s) {
			return slow(s)
		}
		e := 0
		for ; i < len(s) && s[i] >= '0' && s[i] <= '9'; i++ {
			if e < 10000 {
				e = e*10 + int(s[i]-'0')
			}
		}
		if eneg {
			e = -e
		}
		exp += e
	}
	if i != len(s) || mant >= 1<<53 {
		return slow(s)
	}
	f := float64(mant)
	switch {
	case mant == 0:
	case exp >= 0 && exp < len(exact10):
		f *= exact10[exp]
	case exp < 0 && -exp < len(exact10):
		f /= exact10[-exp]
	default:
		return slow(s)
	}
	if neg {
		f = -f
	}
	return f, true
}

// accumulate appends the decimal digits of s from i to mant and returns
// the index after them.
func accumulate(s string, i int, mant uint64) (int, uint64) {
	for ; i < len(s); i++ {
		d := s[i] - '0'
		if d > 9 {
			break
		}
		mant = mant*10 + uint64(d)
	}
	return i, mant
}

func slow(s string) (float64, bool) {
	for i := 0; i < len(s); i++ {
		if c := s[i]; !(c >= '0' && c <= '9' || c == '.' || c == '+' || c == '-' || c == 'e' || c == 'E') {
			return 0, false
		}
	}
	f, err := strconv.ParseFloat(s, 64)
	return f, err == nil
}

// AppendG appends v formatted as strconv.AppendFloat(b, v, 'g', prec, 64)
// does, for 1 ≤ prec ≤ 9.
//
// The value is scaled to a prec-digit number x by a power of ten with at
// most two roundings, so x is within 3·10⁻⁷ of its exact value for prec ≤ 9
// and rounding it to an integer gives the correctly rounded digits unless x
// lies within 10⁻⁶ of a half. Those near-ties, NaN, infinities, zero and
// magnitudes beyond 10^±300 are handed to strconv.
func AppendG(b []byte, v float64, prec int) []byte {
	a := math.Abs(v)
	if !(a >= 1e-300 && a <= 1e300) || prec < 1 || prec > 9 {
		return strconv.AppendFloat(b, v, 'g', prec, 64)
	}
	lo, hi := exact10[prec-1], exact10[prec]
	// floor(log10 a) from the binary exponent, within one.
	e := (int(math.Float64bits(a)>>52&0x7ff) - 1023) * 78913 >> 18
	x := scale(a, prec-1-e)
	for x >= hi {
		e++
		x = scale(a, prec-1-e)
	}
	for x < lo {
		e--
		x = scale(a, prec-1-e)
	}
	r := math.Floor(x)
	switch f := x - r; {
	case f > 0.5-1e-6 && f < 0.5+1e-6:
		return strconv.AppendFloat(b, v, 'g', prec, 64)
	case f > 0.5:
		r++
	}
	if r >= hi { // 9.999996 rounds to 10.0000: one decade up
		r = lo
		e++
	}
	var digs [10]byte
	n := uint64(r)
	i := prec
	for ; i >= 2; i -= 2 { // two digits at a time
		q := n / 100
		d := 2 * (n - 100*q)
		digs[i-2], digs[i-1] = pairs[d], pairs[d+1]
		n = q
	}
	if i == 1 {
		digs[0] = byte('0' + n)
	}
	nd := prec
	for nd > 1 && digs[nd-1] == '0' {
		nd--
	}
	if v < 0 {
		b = append(b, '-')
	}
	return format(b, digs[:nd], e+1, prec)
}

// pairs holds "00" to "99".
const pairs = "00010203040506070809101112131415161718192021222324252627282930313233343536373839" +
	"40414243444546474849505152535455565758596061626364656667686970717273747576777879" +
	"8081828384858687888990919293949596979899"

// pow10 holds 10^k for k in −330…330, each correctly rounded.
var pow10 = func() (t [661]float64) {
	for k := range t {
		t[k], _ = strconv.ParseFloat("1e"+strconv.Itoa(k-330), 64)
	}
	return t
}()

// scale returns a·10^k: exact powers when |k| ≤ 22, else one rounded
// constant; two roundings at most.
func scale(a float64, k int) float64 {
	switch {
	case k >= 0 && k < len(exact10):
		return a * exact10[k]
	case k < 0 && -k < len(exact10):
		return a / exact10[-k]
	}
	return a * pow10[k+330]
}

// format lays out the digits d (no trailing zeros) with the decimal point
// after dp digits, following strconv's rules for 'g' with a precision.
func format(b []byte, d []byte, dp, prec int) []byte {
	nd := len(d)
	eprec := prec
	if eprec > nd && nd >= dp {
		eprec = nd
	}
	exp := dp - 1
	if exp < -4 || exp >= eprec {
		b = append(b, d[0])
		if nd > 1 {
			b = append(b, '.')
			b = append(b, d[1:]...)
		}
		b = append(b, 'e')
		if exp < 0 {
			b = append(b, '-')
			exp = -exp
		} else {
			b = append(b, '+')
		}
		switch {
		case exp < 10:
			b = append(b, '0', byte('0'+exp))
		case exp < 100:
			b = append(b, byte('0'+exp/10), byte('0'+exp%10))
		default:
			b = append(b, byte('0'+exp/100), byte('0'+exp/10%10), byte('0'+exp%10))
		}
		return b
	}
	switch {
	case dp <= 0:
		b = append(b, '0', '.')
		for range -dp {
			b = append(b, '0')
		}
		return append(b, d...)
	case dp >= nd:
		b = append(b, d...)
		for range dp - nd {
			b = append(b, '0')
		}
		return b
	default:
		b = append(b, d[:dp]...)
		b = append(b, '.')
		return append(b, d[dp:]...)
	}
}
