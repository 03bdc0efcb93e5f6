package solver_test

import (
	"fmt"

	"biasbin/solver"
)

// The load lines and swing of a stage with RE fully bypassed and a 10k
// load, at the Q-point that maximises symmetrical swing (REFERENCE.md §7
// derived check values: rac 1803.3 Ω, ICQ 2.638 mA, VCEQ 4.957 V,
// Vpk 4.757 V).
func ExampleEvalSwing() {
	s := solver.Stage{
		Topology:    solver.Divider,
		VCC_V:       12,
		R_Ohm:       [solver.NumSlots]float64{solver.R1: 10e3, solver.R2: 2.2e3, solver.RC: 2.2e3, solver.RE: 470},
		RBypass_Ohm: 470,
		RL_Ohm:      10e3,
	}
	q := solver.EvalSwing(s, solver.OperatingPoint{IC_A: 2e-3, VCE_V: 6}, 0.2)
	fmt.Printf("rac %.1f Ω; at 2 mA, 6 V: %.3f V peak, %s clips first\n", q.RAC_Ohm, q.VPeak_V, q.ClipsFirst)
	fmt.Printf("optimum Q: %.3f mA, %.3f V, %.3f V peak\n", q.OptimumIC_A*1e3, q.OptimumVCE_V, q.OptimumVPeak_V)
	// Output:
	// rac 1803.3 Ω; at 2 mA, 6 V: 3.607 V peak, cutoff clips first
	// optimum Q: 2.638 mA, 4.957 V, 4.757 V peak
}
