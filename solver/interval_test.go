package solver

import (
	"math"
	"testing"
)

func TestClopperPearson95(t *testing.T) {
	// source: REFERENCE.md §14, worked Clopper–Pearson 95 % limits (Beta
	// quantiles by bisection, cross-checked against exact binomial tail
	// sums), after Clopper & Pearson, Biometrika 26 (1934); the x = n and
	// x = 0 closed forms (α/2)^(1/n).
	tests := []struct {
		x, n      int
		low, high float64
		tol       float64
	}{
		{10000, 10000, 0.9996311801, 1, 1e-10},
		{95, 100, 0.887165, 0.983568, 1e-6},
		{100, 100, 0.963783, 1, 1e-6},
		{0, 100, 0, 0.0362167, 1e-7},
		{999, 1000, 0.994441, 0.999975, 1e-6},
	}
	for _, tt := range tests {
		lo, hi := ClopperPearson95(tt.x, tt.n)
		if math.Abs(lo-tt.low) > tt.tol || math.Abs(hi-tt.high) > tt.tol {
			t.Errorf("%d/%d: [%.10f, %.10f], want [%.10f, %.10f] ± %g", tt.x, tt.n, lo, hi, tt.low, tt.high, tt.tol)
		}
		// The interval never collapses: it has width even at 0 and n.
		if !(hi > lo) || lo > float64(tt.x)/float64(tt.n) || hi < float64(tt.x)/float64(tt.n) {
			t.Errorf("%d/%d: [%g, %g] does not hold the point estimate with a width", tt.x, tt.n, lo, hi)
		}
	}
}
