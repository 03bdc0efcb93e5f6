package fault_test

import (
	"fmt"

	"biasbin/solver"
	"biasbin/solver/fault"
)

// A divider stage whose collector sits low: the readings are ranked
// against every single fault, and the check that separates the top two is
// named.
func ExampleDiagnose() {
	s := solver.Stage{Topology: solver.Divider, VCC_V: 10}
	s.R_Ohm[solver.R1], s.R_Ohm[solver.R2], s.R_Ohm[solver.RC], s.R_Ohm[solver.RE] = 10e3, 2.2e3, 3.6e3, 1e3
	d := solver.Datasheet{Label: "small-signal npn", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300}
	dg, err := fault.Diagnose(s, d, fault.Readings{VB_V: 3.34, VE_V: 2.68, VC_V: 2.72}, fault.Settings{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range dg.Faults[:3] {
		fmt.Printf("%d %v %v fit %.1f\n", c.Rank, c.Fault.Position, c.Fault.Kind, c.Fit)
	}
	n := dg.Next
	fmt.Printf("explained: %v; next: %v of %v, %.2g ohm if the first, %.2g ohm if the second\n", dg.Explained, n.Check, n.Position, n.IfFirst.Value, n.IfSecond.Value)
	// Output:
	// 1 r1 drift fit 0.0
	// 2 r2 open fit 0.2
	// 3 r2 drift fit 2.9
	// explained: true; next: resistance of r1, 3.1e+03 ohm if the first, 1e+04 ohm if the second
}
