package solver

import "math"

// LimitJunction is SPICE's junction-voltage limiting (ngspice devsup.c
// DEVpnjlim), exported for solvers of other networks built on the same
// device model: it returns the junction voltage to evaluate the device at
// after a Newton step from vold to vnew, and whether it limited the step.
// vt is the junction's N·VT and vcrit its critical voltage
// (CriticalVoltage_V).
func LimitJunction(vnew, vold, vt, vcrit float64) (float64, bool) {
	return pnjlim(vnew, vold, vt, vcrit)
}

// CriticalVoltage_V is SPICE's critical junction voltage
// N·VT·ln(N·VT/(√2·IS)), above which LimitJunction limits a forward step.
func CriticalVoltage_V(nvt, is_A float64) float64 {
	return nvt * math.Log(nvt/(math.Sqrt2*is_A))
}
