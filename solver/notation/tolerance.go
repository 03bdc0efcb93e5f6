package notation

import (
	"math"
	"strconv"
	"strings"
	"unicode"
)

// toleranceLetters are the symmetric tolerance letters of IEC 60062:2016
// §5 (resistors), as fractions. F, G, J, K and M are confirmed by several
// sources; L, P, W, B, C, D and N are from the same table (from memory).
var toleranceLetters = []struct {
	letter string
	tol    float64
}{
	{"L", 0.0001}, {"P", 0.0002}, {"W", 0.0005}, {"B", 0.001},
	{"C", 0.0025}, {"D", 0.005}, {"F", 0.01}, {"G", 0.02},
	{"J", 0.05}, {"K", 0.10}, {"M", 0.20}, {"N", 0.30},
}

// letterTolerance returns the tolerance of an IEC 60062 letter.
func letterTolerance(letter string) (float64, bool) {
	for _, l := range toleranceLetters {
		if l.letter == letter {
			return l.tol, true
		}
	}
	return 0, false
}

// ToleranceLetter returns the IEC 60062 letter for tol ("J" for 0.05) and
// true, or "" and false when no letter stands for it.
func ToleranceLetter(tol float64) (string, bool) {
	for _, l := range toleranceLetters {
		if math.Abs(tol-l.tol) <= 1e-9*l.tol {
			return l.letter, true
		}
	}
	return "", false
}

// cutPlusMinus removes a leading "±", "+/-" or "+-" and the white space
// after it.
func cutPlusMinus(t string) (string, bool) {
	for _, pm := range []string{"±", "+/-", "+-"} {
		if rest, ok := strings.CutPrefix(t, pm); ok {
			return strings.TrimLeftFunc(rest, unicode.IsSpace), true
		}
	}
	return t, false
}

// ParseTolerance reads a symmetric tolerance and returns it as a fraction:
// "1%", "±5 %", "+/-5%", "5" (a bare number is percent), "0.5%", or one
// IEC 60062 letter (F = 0.01, G = 0.02, J = 0.05, K = 0.10, M = 0.20; also
// L P W B C D N). Zero is allowed (an ideal part); negative values and
// 100 % or more are rejected.
func ParseTolerance(s string) (float64, error) {
	v, p := toleranceValue(s)
	if p != nil {
		return 0, p.wrap("tolerance", s)
	}
	return v, nil
}

func toleranceValue(s string) (float64, *problem) {
	t, p := clean(s)
	if p != nil {
		return 0, p
	}
	if v, ok := letterTolerance(t); ok {
		return v, nil
	}
	t, _ = cutPlusMinus(t)
	n, rest, p := scanNumber(t)
	if p != nil {
		return 0, p
	}
	rest = strings.TrimLeftFunc(rest, unicode.IsSpace)
	if rest != "" && rest != "%" {
		return 0, unexpected(rest)
	}
	v, p := n.float(-2)
	if p != nil {
		return 0, p
	}
	switch {
	case v < 0:
		return 0, rangef("must not be negative")
	case v >= 1:
		return 0, rangef("must be below 100 %%")
	}
	return v + 0, nil // + 0 turns -0 into 0
}

// FormatTolerance writes a tolerance fraction for screens: 0.05 → "±5 %",
// 0.005 → "±0.5 %" (three significant digits at most).
func FormatTolerance(tol float64) string {
	return "±" + sig3(tol*100) + " %"
}

// sig3 writes v with at most three significant digits and no exponent for
// ordinary magnitudes: 5 → "5", 0.25 → "0.25", 62.54 → "62.5", 1250 → "1250".
func sig3(v float64) string {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return strconv.FormatFloat(v+0, 'g', -1, 64)
	}
	r, err := strconv.ParseFloat(strconv.FormatFloat(v, 'e', 2, 64), 64)
	if err != nil {
		r = v
	}
	return strconv.FormatFloat(r, 'f', -1, 64)
}
