package stockparts

import (
	"testing"

	"biasbin/solver"
	"biasbin/store"
)

// TestStoreDefaultsAreSolvers: the figures the stock writes into a blank
// rating are the solver's defaults (solver/defaults.go holds the sources:
// IEC 60115-1 style derating, from memory; VBE(on), Tj max, common
// practice), so a line converted here means the same as an inline part
// with the field left out.
func TestStoreDefaultsAreSolvers(t *testing.T) {
	tests := []struct {
		name         string
		store, solve float64
	}{
		{"derating knee", store.DefaultKnee_C, solver.DefaultResistorKnee_C},
		{"zero-power temperature", store.DefaultMax_C, solver.DefaultResistorMax_C},
		{"VBE(on)", store.DefaultVBEOn_V, solver.DefaultVBEOn_V},
		{"VBE(on) test current", store.DefaultVBEAt_A, solver.DefaultVBEAt_A},
		{"Tj max", store.DefaultTjMax_C, solver.DefaultTjMax_C},
	}
	for _, tt := range tests {
		if tt.store != tt.solve {
			t.Errorf("%s: the stock writes %g, the solver assumes %g", tt.name, tt.store, tt.solve)
		}
	}
	// A transistor line left blank converts to what the solver assumes for
	// an inline datasheet left blank.
	d, err := Sheet(store.Transistor{ID: 1, Label: "QN-1", Polarity: "npn", HFEMin: 100, HFEMax: 300})
	if err != nil {
		t.Fatal(err)
	}
	inline := solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 300}
	if d.VBEOnOrDefault_V() != inline.VBEOnOrDefault_V() || d.VBEAtOrDefault_A() != inline.VBEAtOrDefault_A() ||
		d.TjMaxOrDefault_C() != inline.TjMaxOrDefault_C() || d.VCESatOrDefault_V() != inline.VCESatOrDefault_V() {
		t.Errorf("stock line %+v differs from the inline datasheet's defaults", d)
	}
}
