package eseries

import (
	"math"
	"sort"
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
	v, err := strconv.ParseFloat(strconv.Itoa(m)+"e"+strconv.Itoa(exp), 64)
	if err != nil {
		// Only reachable for decades far outside float64 range, which the
		// callers never request.
		return math.Inf(1)
	}
	return v
}

// decadeValues returns the values of s in the decade [10^d, 10^(d+1)).
func decadeValues(s Series, d int) []float64 {
	m, digits := mantissas(s)
	out := make([]float64, len(m))
	for i, v := range m {
		out[i] = decimal(v, d+1-digits)
	}
	return out
}

// positive reports whether ohm is finite and greater than zero.
func positive(ohm float64) bool {
	return ohm > 0 && !math.IsInf(ohm, 1) // NaN fails ohm > 0
}

// decadeOf returns floor(log10(ohm)) for a positive finite ohm.
func decadeOf(ohm float64) int {
	return int(math.Floor(math.Log10(ohm)))
}

// around returns the values of s in the decades next to ohm's, ascending,
// so that every neighbour of ohm is present despite rounding in log10.
func around(s Series, ohm float64) []float64 {
	d := decadeOf(ohm)
	var out []float64
	for k := d - 1; k <= d+1; k++ {
		out = append(out, decadeValues(s, k)...)
	}
	return out
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
	for _, v := range around(s, ohm) {
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
	for d := decadeOf(lo) - 1; d <= decadeOf(hi)+1; d++ {
		for _, v := range decadeValues(s, d) {
			if v >= loM && v <= hiM {
				out = append(out, v)
			}
		}
	}
	return out
}

// NextUp returns the smallest value of s strictly above ohm (a value equal
// to ohm within a relative 1e-9 does not count). It returns 0 when ohm is
// not finite and positive.
func NextUp(s Series, ohm float64) float64 {
	s.mustValid()
	if !positive(ohm) {
		return 0
	}
	vals := around(s, ohm)
	i := sort.Search(len(vals), func(i int) bool { return vals[i] > ohm*(1+matchRel) })
	return vals[i] // the next decade up always holds a larger value
}

// NextDown returns the largest value of s strictly below ohm (a value equal
// to ohm within a relative 1e-9 does not count). It returns 0 when ohm is
// not finite and positive.
func NextDown(s Series, ohm float64) float64 {
	s.mustValid()
	if !positive(ohm) {
		return 0
	}
	vals := around(s, ohm)
	i := sort.Search(len(vals), func(i int) bool { return vals[i] >= ohm*(1-matchRel) })
	return vals[i-1] // the decade below always holds a smaller value
}
