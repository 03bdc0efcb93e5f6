package notation

import (
	"math"
	"strconv"
	"strings"
)

// FormatBand writes a range lo..hi in one unit with one SI prefix, the one
// FormatSI would give the end of larger magnitude, so the two ends read
// side by side: FormatBand(-1.17, -0.709, "V") is "-1.17 V..-0.709 V",
// not "-1.17 V..-709 mV". Each end keeps three significant digits (at
// most four decimals) in that prefix.
func FormatBand(lo, hi float64, unit string) string {
	big := math.Max(math.Abs(lo), math.Abs(hi))
	if big == 0 || math.IsNaN(big) || math.IsInf(big, 0) {
		return FormatSI(lo, unit) + ".." + FormatSI(hi, unit)
	}
	e := int(math.Floor(math.Log10(big)))
	// A rounding up to the next decade (999.7 → 1000) moves the prefix.
	if r, _ := strconv.ParseFloat(strconv.FormatFloat(big, 'g', 3, 64), 64); r >= math.Pow(10, float64(e+1)) {
		e++
	}
	m := floorDiv(e, 3) * 3
	idx := m/3 + 5
	if idx < 0 || idx >= len(engPrefixes) {
		return FormatSI(lo, unit) + ".." + FormatSI(hi, unit)
	}
	scale := math.Pow(10, float64(m))
	end := func(v float64) string {
		decimals := 0
		if x := math.Abs(v / scale); x > 0 {
			decimals = min(4, max(0, 2-int(math.Floor(math.Log10(x)))))
		}
		s := strconv.FormatFloat(v/scale, 'f', decimals, 64)
		if strings.Contains(s, ".") {
			s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
		}
		if s == "-0" {
			s = "0"
		}
		if u := engPrefixes[idx] + unit; u != "" {
			s += " " + u
		}
		return s
	}
	return end(lo) + ".." + end(hi)
}
