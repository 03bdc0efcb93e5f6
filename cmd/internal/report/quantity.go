package report

import (
	"math"
	"strconv"
	"strings"
)

// prefixes are the SI prefixes used on screen, from 1e-12 to 1e9.
var prefixes = []struct {
	exp    int
	symbol string
}{
	{9, "G"}, {6, "M"}, {3, "k"}, {0, ""}, {-3, "m"}, {-6, "µ"}, {-9, "n"}, {-12, "p"},
}

// Quantity writes v with an SI prefix and unit and three significant
// digits, trailing zeros dropped: Quantity(0.00201, "A") = "2.01 mA",
// Quantity(-5.4, "V") = "-5.4 V", Quantity(0, "V") = "0 V".
func Quantity(v float64, unit string) string {
	return number(v, 3) + " " + prefixFor(v) + unit
}

// Number writes v with an SI prefix (no unit) and three significant digits.
func Number(v float64) string {
	p := prefixFor(v)
	if p == "" {
		return number(v, 3)
	}
	return number(v, 3) + " " + p
}

// prefixFor returns the prefix symbol Quantity uses for v.
func prefixFor(v float64) string {
	e := exponent(v)
	for _, p := range prefixes {
		if e == p.exp {
			return p.symbol
		}
	}
	return ""
}

// exponent is the multiple of three the mantissa of v is scaled by,
// clamped to the prefixes table; 0 for zero, NaN and infinities.
func exponent(v float64) int {
	a := math.Abs(v)
	if a == 0 || math.IsNaN(a) || math.IsInf(a, 0) {
		return 0
	}
	// Round to three significant digits first so 999.96 shows as 1 k.
	a, _ = strconv.ParseFloat(strconv.FormatFloat(a, 'g', 3, 64), 64)
	e := int(math.Floor(math.Log10(a)/3)) * 3
	return max(-12, min(9, e))
}

// number writes v scaled by its exponent with sig significant digits.
func number(v float64, sig int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return strconv.FormatFloat(v, 'g', -1, 64)
	}
	m := v / math.Pow(10, float64(exponent(v)))
	s := strconv.FormatFloat(m, 'g', sig, 64)
	if strings.ContainsAny(s, "e") { // tiny mantissas after clamping
		s = strconv.FormatFloat(m, 'f', 3, 64)
	}
	return s
}

// Percent writes a fraction as a percentage with up to one decimal:
// Percent(0.987) = "98.7 %", Percent(0.05) = "5 %".
func Percent(frac float64) string {
	return strconv.FormatFloat(math.Round(frac*1000)/10, 'f', -1, 64) + " %"
}
