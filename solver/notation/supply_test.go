package notation

import (
	"math"
	"testing"
)

// TestParseSupply: a supply range is its midpoint ± the tolerance that
// reaches both ends (arithmetic: nominal·(1 ± tol) = lo, hi). A 9 V
// alkaline battery runs from about 9.6 V fresh to a 7 V end point
// (common practice).
func TestParseSupply(t *testing.T) {
	tests := []struct {
		in            string
		nominal, tol  float64
		isRange, fail bool
	}{
		{"12V", 12, 0, false, false},
		{"7V..9.6V", 8.3, 1.3 / 8.3, true, false},
		{"7..9.6V", 8.3, 1.3 / 8.3, true, false},
		{"-9.6V..-7V", -8.3, 1.3 / 8.3, true, false},
		{"12V..12V", 12, 0, true, false},
		{"-5V..5V", 0, 0, false, true},
		{"0V..5V", 0, 0, false, true},
		{"9.6V..7V", 0, 0, false, true},
		{"7V..", 0, 0, false, true},
	}
	for _, tt := range tests {
		nom, tol, isRange, err := ParseSupply(tt.in)
		if (err != nil) != tt.fail {
			t.Errorf("%q: err %v", tt.in, err)
			continue
		}
		if tt.fail {
			continue
		}
		if math.Abs(nom-tt.nominal) > 1e-12 || math.Abs(tol-tt.tol) > 1e-12 || isRange != tt.isRange {
			t.Errorf("%q: %g ±%g (range %v), want %g ±%g (%v)", tt.in, nom, tol, isRange, tt.nominal, tt.tol, tt.isRange)
		}
		if isRange {
			lo, hi := nom*(1-tol), nom*(1+tol)
			if nom < 0 {
				lo, hi = hi, lo
			}
			want := map[string][2]float64{"7V..9.6V": {7, 9.6}, "7..9.6V": {7, 9.6}, "-9.6V..-7V": {-9.6, -7}, "12V..12V": {12, 12}}[tt.in]
			if math.Abs(lo-want[0]) > 1e-12 || math.Abs(hi-want[1]) > 1e-12 {
				t.Errorf("%q: gives back %g..%g", tt.in, lo, hi)
			}
		}
	}
}
