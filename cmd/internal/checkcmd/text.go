package checkcmd

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"biasbin/cmd/internal/report"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// Short display helpers (three significant digits, SI prefixes).
var (
	fV = notation.FormatVoltage
	fA = notation.FormatCurrent
	fW = notation.FormatPower
	fT = notation.FormatTemperature
	fR = notation.FormatResistance
)

// writeText writes the readable report.
func writeText(w io.Writer, r *job.Analysis) {
	b := r.Request.Build
	d := b.Device
	op := r.Nominal

	// Build.
	supply := b.Ground.Supply_V(b.VCC_V)
	fmt.Fprintf(w, "%s %s stage, VCC %s", d.Polarity, b.Topology, fV(supply))
	if b.Topology == solver.SplitSupply {
		fmt.Fprintf(w, ", VEE %s", fV(b.VEE_V))
	}
	fmt.Fprintf(w, " ±%s (%s), ambient %s..%s\n", pct(b.VCCTol), report.SupplyBand(supply, b.VCCTol), fT(b.AmbientMin_C), fT(b.AmbientMax_C))
	fmt.Fprintf(w, "%s; every voltage against 0 V\n", report.Rail(d.Polarity, solver.RailOf(d.Polarity, b.Topology, b.Ground)))
	var rs []string
	for _, j := range r.Joins {
		spec := b.Resistors[j.Slot]
		rs = append(rs, fmt.Sprintf("%s %s ±%s (%s)", strings.ToUpper(j.Slot.String()), fR(spec.Nominal_Ohm), pct(spec.Tol), report.Join(j)))
	}
	fmt.Fprintf(w, "resistors: %s\n", strings.Join(rs, ", "))
	name := "inline"
	if r.Request.Label != "" {
		name = r.Request.Label
	}
	fmt.Fprintf(w, "transistor: %s, hFE %s..%s, VBE(on) %s at %s, VCE(sat) %s",
		name, num(d.HFEMin), num(d.HFEMax), fV(d.VBEOnOrDefault_V()), fA(d.VBEAtOrDefault_A()), fV(r.VCESat_V))
	if th := solver.ThermalResistance(d); th > 0 {
		fmt.Fprintf(w, ", θJA %s", notation.FormatThermalResistance(th))
	}
	fmt.Fprintln(w)

	// Operating point.
	fmt.Fprintf(w, "\nOperating point (%s ambient, beta %s at TNOM): %s\n", fT(b.NominalAmbient_C), num(r.Model.BF), strings.ToUpper(op.Region.String()))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "  IC\t%s\tIB\t%s\tIE\t%s\n", fA(op.IC_A), fA(op.IB_A), fA(op.IE_A))
	fmt.Fprintf(tw, "  VCE\t%s\tVBE\t%s\tIC/IB\t%s\n", fV(op.VCE_V), fV(op.VBE_V), num(r.DCBeta()))
	fmt.Fprintf(tw, "  Tj\t%s\tPD\t%s\n", fT(op.Tj_C), fW(op.PTransistor_W))
	tw.Flush()
	if op.Region != solver.Active {
		fmt.Fprintf(w, "  the transistor is in %s at the nominal point: not a linear amplifier\n", op.Region)
	}

	// Test points.
	fmt.Fprintf(w, "\nTest points (measure to 0 V, %s)\n", report.ZeroV(b.Topology, b.Ground))
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  node\tnominal\tworst-case band")
	for _, tp := range r.TestPoints {
		band := "not solved"
		if tp.HaveBand {
			band = notation.FormatBand(tp.Min_V, tp.Max_V, "V")
		}
		fmt.Fprintf(tw, "  %s\t%s\t%s\n", strings.ToUpper(tp.Node.String()), fV(tp.Nominal_V), band)
	}
	tw.Flush()

	// Worst case.
	if wc := r.Worst; wc != nil {
		fmt.Fprintf(w, "\nWorst case (%d corners: hFE, VBE(on), resistor and supply tolerance, ± TCR, ambient; self-heated)\n", wc.Count)
		tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintf(tw, "  IC\t%s\tRSS u(IC) %s\n", notation.FormatBand(wc.ICMin_A, wc.ICMax_A, "A"), fA(wc.RSSIC_A))
		fmt.Fprintf(tw, "  VCE\t%s\tRSS u(VCE) %s\n", notation.FormatBand(wc.VCEMin_V, wc.VCEMax_V, "V"), fV(wc.RSSVCE_V))
		fmt.Fprintf(tw, "  Tj\tup to %s\n", fT(wc.TjMax_C))
		tw.Flush()
		if wc.AllActive {
			fmt.Fprintf(w, "  every corner active with VCE >= %s (VCE(sat) + margin)\n", fV(r.VCEFloor_V()))
		} else {
			fmt.Fprintf(w, "  %d of %d corners NOT active with VCE >= %s; lowest VCE %s (%s) at hFE %s, %s ambient\n",
				wc.NotActive, wc.Count, fV(r.VCEFloor_V()), fV(wc.VCEMin_V), wc.VCEMinAt.OP.Region, num(wc.VCEMinAt.BF), fT(wc.VCEMinAt.Temp_C))
		}
	}

	// Yield.
	if y := r.Yield; y != nil {
		fmt.Fprintf(w, "\nYield: %s — %s\n", report.Yield(*y), report.YieldBoards(*y, b.AmbientMin_C, b.AmbientMax_C))
		fmt.Fprintf(w, "  window  %s\n", report.Window(r.Window))
		fmt.Fprintf(w, "  drawn   %s, each rectangular within its stated limits (seed %d; --json lists them with the reason)\n", report.DrawnInputs(b), y.Seed)
	}

	// Dissipation.
	worst := r.WorstDissipation()
	fmt.Fprintf(w, "\nDissipation (design limit: resistors %.0f %%, transistor %.0f %% of the derated rating)\n",
		100*r.Limits.ResistorMaxFraction, 100*r.Limits.TransistorMaxFraction)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "  part\tat %s\tlimit\tuse\tworst corner\tuse\n", fT(b.NominalAmbient_C))
	nom := r.Loads(r.NominalDissipation)
	for i, p := range r.Loads(worst) {
		n := nom[i].Load
		fmt.Fprintf(tw, "  %s\t%s\t%s\t%s\t%s\t%s\n", strings.ToUpper(p.Part), fW(n.Power_W), limit(n), use(n), fW(p.Load.Power_W), use(p.Load))
	}
	tw.Flush()
	if !worst.Ok {
		fmt.Fprintln(w, "  a part exceeds its design limit")
	}

	// Swing.
	sw := r.Swing
	fmt.Fprintln(w, "\nSwing")
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "  DC load line\t%s to %s\tRdc %s\n", fA(sw.ICSatDC_A), fV(sw.VCECutDC_V), fR(sw.RDC_Ohm))
	fmt.Fprintf(tw, "  AC load line\t%s to %s\trac %s\n", fA(sw.ICSatAC_A), fV(sw.VCECutAC_V), fR(sw.RAC_Ohm))
	fmt.Fprintf(tw, "  max symmetrical swing\t%s peak\t%s clips first\n", fV(sw.VPeak_V), sw.ClipsFirst)
	fmt.Fprintf(tw, "  optimum Q\tIC %s, VCE %s\t%s peak\n", fA(sw.OptimumIC_A), fV(sw.OptimumVCE_V), fV(sw.OptimumVPeak_V))
	tw.Flush()

	// Sensitivity.
	if s := r.Sensitivity; s != nil {
		fmt.Fprintf(w, "\nSensitivity: S_I %s, S_V %s/V, S_beta %s/unit; hFE min to max moves IC %s .. %s (%.1f %% of nominal)\n",
			num(s.SI), fA(s.SV_S), fA(s.SBeta_A), fA(s.ICAtHFEMin_A), fA(s.ICAtHFEMax_A), 100*s.BetaSpread)
	}
}

// pct writes a fraction as a percentage.
func pct(f float64) string { return num(100*f) + " %" }

// num writes a plain number with up to four significant digits.
func num(v float64) string { return fmt.Sprintf("%.4g", v) }

// limit writes a part's allowance, or "-" for an unrated part.
func limit(l solver.PartLoad) string {
	if !l.Rated {
		return "-"
	}
	return fW(l.Allowed_W)
}

// use writes a part's utilization of its design limit.
func use(l solver.PartLoad) string {
	if !l.Rated {
		return "-"
	}
	if l.Utilization > 9.99 {
		return ">999 %"
	}
	return fmt.Sprintf("%.0f %%", 100*l.Utilization)
}
