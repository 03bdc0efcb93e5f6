package solver

import (
	"errors"
	"testing"
)

// TestCheckTolerance: the one tolerance rule, from 0 up to, not including,
// ±50 % (a supply range 6..18 V is ±50 % around 12 V, its top 3 times its
// bottom: arithmetic, refused).
func TestCheckTolerance(t *testing.T) {
	tests := []struct {
		tol float64
		ok  bool
	}{{0, true}, {0.05, true}, {0.499, true}, {(18.0 - 6) / (18 + 6), false}, {0.6, false}, {-0.01, false}}
	for _, tt := range tests {
		err := CheckTolerance("vcc_tol", tt.tol)
		var ie *InputError
		if tt.ok != (err == nil) || !tt.ok && (!errors.As(err, &ie) || ie.Field != "vcc_tol") {
			t.Errorf("CheckTolerance(%g) = %v, want ok %v", tt.tol, err, tt.ok)
		}
	}
}

// TestCheckAmbient: each end within AmbientRange (-55..150 °C, the
// military range, common practice), the minimum not above the maximum.
func TestCheckAmbient(t *testing.T) {
	tests := []struct {
		lo, hi float64
		ok     bool
	}{{0, 50, true}, {-55, 150, true}, {25, 25, true}, {60, -10, false}, {0, 200, false}, {-60, 20, false}}
	for _, tt := range tests {
		if err := CheckAmbient(tt.lo, tt.hi); tt.ok != (err == nil) {
			t.Errorf("CheckAmbient(%g, %g) = %v, want ok %v", tt.lo, tt.hi, err, tt.ok)
		}
	}
}
