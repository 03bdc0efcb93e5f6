package notation

import (
	"math"
	"strings"
)

// ParseSupply reads a supply voltage as a single value ("12V") or as the
// range it moves over ("7V..9.6V", a battery from flat to fresh). A range
// is returned as its midpoint with the tolerance that spans it,
//
//	nominal = (lo + hi)/2,  tol = (hi − lo)/(hi + lo),
//
// so that nominal·(1 ± tol) gives back lo and hi exactly; isRange is then
// true. A single value gives tol 0. Both ends must have the same sign and
// neither may be 0.
func ParseSupply(s string) (nominal, tol float64, isRange bool, err error) {
	lo, hi, err := ParseRange(s, ParseVoltage)
	if err != nil {
		return 0, 0, false, err
	}
	if !strings.Contains(s, "..") {
		return lo, 0, false, nil
	}
	if lo == 0 || hi == 0 || (lo < 0) != (hi < 0) {
		return 0, 0, false, rangef("both ends of a supply range must be on the same side of 0 V").wrap("supply", s)
	}
	nominal = (lo + hi) / 2
	return nominal, math.Abs((hi - lo) / (hi + lo)), true, nil
}
