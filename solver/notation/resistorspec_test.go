package notation

import (
	"math"
	"testing"
)

// TestParseResistorText: value, tolerance and power on one flag. The
// letter-and-digit code and the tolerance letters are IEC 60062
// (REFERENCE.md §2: 6K8 = 6.8 kΩ, F = ±1 %, K = ±10 %).
func TestParseResistorText(t *testing.T) {
	tests := []struct {
		in       string
		ohm, tol float64
		hasTol   bool
		w        float64
		hasW     bool
		fail     bool
	}{
		{"6K8", 6800, 0, false, 0, false, false},
		{"6K8/10%/1W", 6800, 0.10, true, 1, true, false},
		{"6K8/1W/10%", 6800, 0.10, true, 1, true, false},
		{"4K7F/0.5W", 4700, 0.01, true, 0.5, true, false},
		{"10k/K", 10000, 0.10, true, 0, false, false},
		{"6K8//1W", 0, 0, false, 0, false, true},
		{"6K8/1W/2W", 0, 0, false, 0, false, true},
		{"4K7F/5%", 0, 0, false, 0, false, true},
		{"6K8/lots", 0, 0, false, 0, false, true},
	}
	for _, tt := range tests {
		r, err := ParseResistorText(tt.in)
		if (err != nil) != tt.fail {
			t.Errorf("%q: err %v", tt.in, err)
			continue
		}
		if tt.fail {
			continue
		}
		if r.Ohm != tt.ohm || math.Abs(r.Tol-tt.tol) > 1e-12 || r.HasTol != tt.hasTol || r.Rated_W != tt.w || r.HasPower != tt.hasW {
			t.Errorf("%q: %+v", tt.in, r)
		}
	}
}
