package tabulate

// selectNth returns the value that would be at index k of v sorted in
// increasing order, and leaves v with every value before index k at most
// that one and every value after it at least that one. v holds no NaN.
// Hoare's selection (Hoare, C. A. R. (1961), Algorithm 65: FIND, Comm. ACM
// 4(7), 321–322) with the median of three as pivot, insertion sort below
// 16 values.
func selectNth(v []float64, k int) float64 {
	lo, hi := 0, len(v)-1
	for hi-lo > 16 {
		p := medianOfThree(v, lo, lo+(hi-lo)/2, hi)
		i, j := lo, hi
		for i <= j {
			for v[i] < p {
				i++
			}
			for v[j] > p {
				j--
			}
			if i <= j {
				v[i], v[j] = v[j], v[i]
				i++
				j--
			}
		}
		// now v[lo..j] ≤ p ≤ v[i..hi], and values between j and i equal p
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return v[k]
		}
	}
	insertionSort(v[lo : hi+1])
	return v[k]
}

// medianOfThree is the median of v[a], v[b] and v[c].
func medianOfThree(v []float64, a, b, c int) float64 {
	x, y, z := v[a], v[b], v[c]
	if x > y {
		x, y = y, x
	}
	if y > z {
		y = z
	}
	if x > y {
		return x
	}
	return y
}

func insertionSort(v []float64) {
	for i := 1; i < len(v); i++ {
		for j := i; j > 0 && v[j] < v[j-1]; j-- {
			v[j], v[j-1] = v[j-1], v[j]
		}
	}
}
