package diagnosecmd

import (
	"fmt"
	"io"
	"math"
	"text/tabwriter"

	"biasbin/cmd/internal/report"
	"biasbin/picker/repair"
	"biasbin/solver/fault"
	"biasbin/solver/notation"
)

// WriteText renders a diagnosis: the readings and the meter assumed, the
// working stage's fit, the ranked faults (top rows), the verdict and the
// next measurement.
func WriteText(w io.Writer, req repair.DiagnoseRequest, d *repair.Diagnosis, top int) {
	m := d.Settings.Meter
	r := req.Readings
	fmt.Fprintf(w, "Readings: VB %s, VE %s, VC %s (meter %s of the reading + %s, %s input)\n",
		volts(r.VB_V), volts(r.VE_V), volts(r.VC_V), notation.FormatTolerance(m.Fraction), notation.FormatVoltage(m.Offset_V), notation.FormatResistanceSI(m.Input_Ohm))
	wk := d.Working
	fmt.Fprintf(w, "A working stage reads VB %s, VE %s, VC %s: fit %.2f", volts(wk.Predicted.VB_V), volts(wk.Predicted.VE_V), volts(wk.Predicted.VC_V), wk.Fit)
	if d.Healthy {
		fmt.Fprintln(w, ", the readings match a working stage.")
	} else {
		fmt.Fprintln(w, ", not a working stage.")
	}
	fmt.Fprintf(w, "\nSingle faults, best fit first (FIT = the worst reading's deviation in units of the meter accuracy; ≤ 1 is within the meter;\n"+
		"the transistor's hFE fitted within %g..%g, its VBE(on) within ±%s):\n", req.Device.HFEMin, req.Device.HFEMax, notation.FormatVoltage(d.Settings.VBESpread_V))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "#\tPART\tFAULT\tVALUE\tFIT\tVB\tVE\tVC")
	for i, c := range d.Faults {
		if i == top {
			break
		}
		fmt.Fprintf(tw, "%d\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", c.Rank, report.PositionName(c.Fault.Position), report.FaultKind(c.Fault.Kind), dash(report.FaultValue(c.Fault)),
			fit(c.Fit), volts(c.Predicted.VB_V), volts(c.Predicted.VE_V), volts(c.Predicted.VC_V))
	}
	tw.Flush()
	if n := len(d.Faults) - top; n > 0 {
		fmt.Fprintf(w, "(%d more; --top or --json lists them)\n", n)
	}
	best := d.Faults[0]
	fmt.Fprintln(w)
	switch {
	case d.Explained:
		fmt.Fprintf(w, "Explained: %s %s%s matches every reading within the meter's accuracy.\n", report.PositionName(best.Fault.Position), report.FaultKind(best.Fault.Kind), valueSuffix(best.Fault))
	case d.Healthy:
		fmt.Fprintln(w, "No single fault fits better than a working stage: check the supply and the readings, or look beyond this stage.")
	default:
		fmt.Fprintf(w, "Not explained: no single fault matches the readings within the meter's accuracy (best fit %s). Two faults at once, a resistor value other than the service notes give, a wrong supply or a misread meter remain; check the supply at the stage first.\n", fit(best.Fit))
	}
	if n := d.Next; n != nil && len(d.Faults) > 1 {
		second := d.Faults[1]
		fmt.Fprintf(w, "Next, to tell #1 (%s %s) from #2 (%s %s): %s.\n", report.PositionName(best.Fault.Position), report.FaultKind(best.Fault.Kind),
			report.PositionName(second.Fault.Position), report.FaultKind(second.Fault.Kind), report.CheckAction(n.Check, n.Position))
		fmt.Fprintf(w, "  expect %s if #1, %s if #2\n", report.Expectation(n.Check, n.IfFirst), report.Expectation(n.Check, n.IfSecond))
	}
}

func volts(v float64) string {
	if math.Abs(v) < 0.0005 {
		v = 0 // no "-0.000 V"
	}
	return fmt.Sprintf("%.3f V", v)
}

func fit(f float64) string {
	if f > 999 {
		return ">999"
	}
	return fmt.Sprintf("%.2f", f)
}

func dash(s string) string {
	if s == "" {
		return "—"
	}
	return s
}

func valueSuffix(f fault.Fault) string {
	if v := report.FaultValue(f); v != "" {
		return " (" + v + ")"
	}
	return ""
}
