package solver_test

import (
	"fmt"

	"biasbin/solver"
)

// A divider stage solved exactly with a transistor built from datasheet
// ranges, at 25 °C and then self-heated at 200 K/W.
func ExampleSolve() {
	s := solver.Stage{Topology: solver.Divider, VCC_V: 15}
	s.R_Ohm[solver.R1] = 10e3
	s.R_Ohm[solver.R2] = 5e3
	s.R_Ohm[solver.RC] = 1e3
	s.R_Ohm[solver.RE] = 1e3
	d := solver.Datasheet{Label: "general-purpose npn", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300}
	m, err := solver.ModelFor(d, 173)
	if err != nil {
		fmt.Println(err)
		return
	}
	op, err := solver.Solve(s, m, 25)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: IC %.4f mA, VCE %.3f V, VBE %.4f V, P %.2f mW\n", op.Region, op.IC_A*1e3, op.VCE_V, op.VBE_V, op.PTransistor_W*1e3)
	hot, err := solver.SolveSelfHeated(s, m, 25, 200, 150)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("self-heated: Tj %.2f °C, IC %.4f mA\n", hot.Tj_C, hot.IC_A*1e3)
	// Output:
	// active: IC 4.2077 mA, VCE 6.560 V, VBE 0.6869 V, P 27.62 mW
	// self-heated: Tj 30.52 °C, IC 4.2195 mA
}
