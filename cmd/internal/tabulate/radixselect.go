package tabulate

import "math"

// radixKey maps v to an integer of the same order (−0 as +0), the
// order-preserving bits of an IEEE 754 double: the sign bit flipped for
// positive values, every bit flipped for negative ones (Knuth, D. E.
// (1998), The Art of Computer Programming vol. 3, 2nd ed., §5.2.5, radix
// sorting, on keys of floating-point numbers; recalled from memory,
// checked by the tests against sort.Float64s).
func radixKey(v float64) uint64 {
	u := math.Float64bits(v + 0)
	if u>>63 == 1 {
		return ^u
	}
	return u | 1<<63
}

// radixDigit is the bits of a key taken at each pass.
const radixDigit = 16

// selectSpilled is the value at index k of s's values sorted in
// increasing order, found without holding them all: radix selection by
// 16-bit digits of radixKey from the top, one counting pass over the file
// per digit, until the values sharing the digits found so far number at
// most limit; those are then loaded and selectNth picks among them.
func (sp *spillFile) selectSpilled(s *series, k, limit int) (float64, error) {
	var prefix uint64 // the digits of the wanted key found so far
	for shift := uint(64 - radixDigit); ; shift -= radixDigit {
		var count [1 << radixDigit]int
		err := sp.each(s, nil, func(v, _ []float64) {
			for _, x := range v {
				if key := radixKey(x); key>>(shift+radixDigit) == prefix { // key>>64 is 0: the first pass counts all
					count[key>>shift&(1<<radixDigit-1)]++
				}
			}
		})
		if err != nil {
			return 0, err
		}
		digit := 0
		for ; k >= count[digit]; digit++ {
			k -= count[digit]
		}
		prefix = prefix<<radixDigit | uint64(digit)
		if count[digit] <= limit || shift == 0 {
			return sp.pick(s, prefix, shift, k, count[digit])
		}
	}
}

// pick loads the n values whose keys begin with prefix (the bits above
// shift) and returns the one at index k of them sorted.
func (sp *spillFile) pick(s *series, prefix uint64, shift uint, k, n int) (float64, error) {
	cand := make([]float64, 0, n)
	err := sp.each(s, nil, func(v, _ []float64) {
		for _, x := range v {
			if radixKey(x)>>shift == prefix {
				cand = append(cand, x)
			}
		}
	})
	if err != nil {
		return 0, err
	}
	return selectNth(cand, k), nil
}
