package picker

import (
	"math"
	"testing"
)

// TestCombinationsNeverWrap: the count of combinations a search covers
// saturates instead of wrapping negative (a 60,000-line stock once printed
// -5486744073709551616). The products are plain arithmetic: 10·50⁴ =
// 62,500,000 and 10·60000⁴ ≈ 1.3e20 > 2⁶³.
func TestCombinationsNeverWrap(t *testing.T) {
	for _, tc := range []struct {
		devs, values int
		want         int64
	}{
		{10, 50, 62_500_000},
		{10, 60_000, math.MaxInt64},
		{0, 60_000, 0},
		{3, 0, 0},
	} {
		e := &evaluator{lay: &layout{n: 4}, vs: &valueSet{values: make([]value, tc.values)}, devs: make([]device, tc.devs)}
		if got := e.combinations(); got != tc.want {
			t.Errorf("%d devices, %d values: %d, want %d", tc.devs, tc.values, got, tc.want)
		}
	}
}
