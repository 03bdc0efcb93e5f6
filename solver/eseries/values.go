package eseries

import (
	"math"
	"strconv"
)

// matchRel is the relative difference below which a resistance counts as
// equal to a series value (float64 values read from text or computed by
// division carry a few ulps of error).
const matchRel = 1e-9

// Values returns the values of s in the decade [1, 10), ascending: 1.0, 2.2,
// 4.7 for E3; 1.00, 1.02 ... 9.76 for E96. The slice is new on every call.
func Values(s Series) []float64 {
	m, digits := mantissas(s)
	out := make([]float64, len(m))
	for i, v := range m {
		out[i] = decimal(v, 1-digits)
	}
	return out
}

// decimal returns the float64 nearest to m·10^exp, exactly as the decimal
// text would read (4700, not 4699.999999).
func decimal(m, exp int) float64 {
	// 10^0 .. 10^22 are exact in float64, and one IEEE multiplication or
	// division of exact operands is correctly rounded: the result is the
	// float64 nearest the decimal, as ParseFloat would give.
	switch {
	case exp >= 0 && exp <= 22:
		return float64(m) * math.Pow10(exp)
	case exp < 0 && exp >= -22:
		return float64(m) / math.Pow10(-exp)
	}
	v, err := strconv.ParseFloat(strconv.Itoa(m)+"e"+strconv.Itoa(exp), 64)
	if err != nil {
		// Only reachable for decades far outside float64 range, which the
		// callers never request.
		return math.Inf(1)
	}
	return v
}

// positive reports whether ohm is finite and greater than zero.
func positive(ohm float64) bool {
	return ohm > 0 && !math.IsInf(ohm, 1) // NaN fails ohm > 0
}

// mantissaAt returns the i-th integer mantissa of s (0 <= i < n) and its
// number of significant digits, without copying the table.
func mantissaAt(s Series, i int) (m, digits int) {
	switch s {
	case E3:
		return e3[i], 2
	case E6:
		return e6[i], 2
	case E12:
		return e12[i], 2
	case E24:
		return e24[i], 2
	}
	return e192[i*(192/int(s))], 3
}

// valueAt returns the k-th value of s counted from 1 Ω (k = 0 is 1 Ω,
// k = n is 10 Ω, k = -1 is the last value below 1 Ω).
func valueAt(s Series, k int) float64 {
	n := int(s)
	d := k / n
	if k%n != 0 && k < 0 {
		d--
	}
	m, digits := mantissaAt(s, k-d*n)
	return decimal(m, d+1-digits)
}

// position returns the index k of the geometric step nearest below ohm.
// Every series value lies within one step of its geometric value (the
// irregular E24 values deviate by 3.4 % at most, a step is 10 %), so the
// neighbours of ohm are within k-2 .. k+2.
func position(s Series, ohm float64) int {
	return int(math.Floor(math.Log10(ohm) * float64(s)))
}

// Nearest returns the value of s closest to ohm on a logarithmic scale (the
// smallest ratio between the two). A tie goes to the lower value. Nearest
// returns 0 when ohm is not finite and positive.
func Nearest(s Series, ohm float64) float64 {
	s.mustValid()
	if !positive(ohm) {
		return 0
	}
	best, bestDist := 0.0, math.Inf(1)
	k := position(s, ohm)
	for j := k - 2; j <= k+2; j++ {
		v := valueAt(s, j)
		dist := math.Abs(math.Log(v / ohm))
		if dist < bestDist {
			best, bestDist = v, dist
		}
	}
	return best
}

// Contains reports whether ohm is a value of s (within a relative 1e-9, so
// 4.7e3 read from text and 4700 both count).
func Contains(s Series, ohm float64) bool {
	s.mustValid()
	if !positive(ohm) {
		return false
	}
	return math.Abs(Nearest(s, ohm)-ohm) <= matchRel*ohm
}

// Of returns the coarsest series that contains ohm (E3 before E6 before E12
// ...) and true, or 0 and false when no series contains it. 4700 gives E3,
// 5600 gives E12, 5100 gives E24, 4640 gives E48, 4750 gives E96 and 4810
// gives E192.
func Of(ohm float64) (Series, bool) {
	for _, s := range All() {
		if Contains(s, ohm) {
			return s, true
		}
	}
	return 0, false
}

// Range returns every value of s in [lo, hi] ohms, ascending, as exact
// decimal values. It returns nil unless 0 < lo <= hi and both are finite.
// Bounds match within a relative 1e-9, so Range(E12, 4700, 4700) is [4700].
func Range(s Series, lo, hi float64) []float64 {
	s.mustValid()
	if !positive(lo) || !positive(hi) || lo > hi {
		return nil
	}
	loM, hiM := lo*(1-matchRel), hi*(1+matchRel)
	var out []float64
	for k := position(s, lo) - 2; ; k++ {
		v := valueAt(s, k)
		if v > hiM {
			return out
		}
		if v >= loM {
			out = append(out, v)
		}
	}
}

// NextUp returns the smallest value of s strictly above ohm (a value equal
// to ohm within a relative 1e-9 does not count). It returns 0 when ohm is
// not finite and positive.
func NextUp(s Series, ohm float64) float64 {
	s.mustValid()
	if !positive(ohm) {
		return 0
	}
	k := position(s, ohm) - 2
	for valueAt(s, k) <= ohm*(1+matchRel) {
		k++
	}
	return valueAt(s, k)
}

// NextDown returns the largest value of s strictly below ohm (a value equal
// to ohm within a relative 1e-9 does not count). It returns 0 when ohm is
// not finite and positive.
func NextDown(s Series, ohm float64) float64 {
	s.mustValid()
	if !positive(ohm) {
		return 0
	}
	k := position(s, ohm) + 2
	for valueAt(s, k) >= ohm*(1-matchRel) {
		k--
	}
	return valueAt(s, k)
}
