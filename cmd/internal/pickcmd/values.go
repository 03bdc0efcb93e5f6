package pickcmd

import (
	"math"
	"strconv"

	"biasbin/solver/notation"
)

// quantity writes a value with an SI prefix and unit: "2.01 mA".
func quantity(v float64, unit string) string { return notation.FormatSI(v, unit) }

// percent writes a fraction as a percentage with up to one decimal:
// 0.987 → "98.7 %", 0.05 → "5 %".
func percent(frac float64) string {
	return strconv.FormatFloat(math.Round(frac*1000)/10+0, 'f', -1, 64) + " %"
}
