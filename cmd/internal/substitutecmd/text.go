package substitutecmd

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"biasbin/cmd/internal/report"
	"biasbin/picker"
	"biasbin/picker/repair"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// WriteText renders a substitution as a readable report: the original
// Q-point and where it comes from, the ranked substitutes (top rows), and
// the resistor changes with the stage before and after.
func WriteText(w io.Writer, s *repair.Substitution, top int) {
	o := s.Original
	fmt.Fprintf(w, "Original Q-point (%s): IC %s, VCE %s\n", sourceWords(o), notation.FormatCurrent(o.IC_A), notation.FormatVoltage(o.VCE_V))
	if in := o.Inference; in != nil {
		if in.HasFromRE {
			fmt.Fprintf(w, "  IC from the drop on RE  %s (%s .. %s)\n", notation.FormatCurrent(in.FromRE.Value_A), notation.FormatCurrent(in.FromRE.Min_A), notation.FormatCurrent(in.FromRE.Max_A))
		}
		if in.HasFromRC {
			fmt.Fprintf(w, "  IC from the drop on RC  %s (%s .. %s)\n", notation.FormatCurrent(in.FromRC.Value_A), notation.FormatCurrent(in.FromRC.Min_A), notation.FormatCurrent(in.FromRC.Max_A))
		}
		if in.HasFromRE && in.HasFromRC {
			fmt.Fprintln(w, "  the two agree within the meter accuracy and the resistor and supply tolerances")
		}
	}
	if r := o.Ranges; r != nil && o.Source == repair.SourceMeasured {
		fmt.Fprintf(w, "  (the original's ranges give IC %s, VCE %s)\n", notation.FormatCurrent(r.Nominal.IC_A), notation.FormatVoltage(r.Nominal.VCE_V))
	}
	tol := notation.FormatTolerance(s.Tolerance)
	fmt.Fprintf(w, "\nSubstitutes in stock, IC tolerance %s (nominal at the typical hFE; worst case over hFE, tolerances, supply and ambient):\n", tol)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "#\tTRANSISTOR\tBIN\tQTY\tIC\tSHIFT\tIC WORST\tVCE\tVCE WORST\tSAT MARGIN\tVCEO MARGIN\tIC MAX MARGIN\tPOWER\tVERDICT")
	for i, c := range s.Candidates {
		if i == top {
			break
		}
		t := c.Transistor
		if len(c.Failing) > 0 && c.Failing[0].Kind == repair.FailSolve {
			fmt.Fprintf(tw, "%d\t%s\t%s\t%d\t—\t—\t—\t—\t—\t—\t—\t—\t—\t%s\n", c.Rank, t.Sheet.Label, t.Bin, t.Qty, report.SubstituteFailure(c.Failing[0]))
			continue
		}
		fmt.Fprintf(tw, "%d\t%s\t%s\t%d\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", c.Rank, t.Sheet.Label, t.Bin, t.Qty,
			notation.FormatCurrent(c.Nominal.IC_A), pct(c.ICShift), icRange(c.Worst), notation.FormatVoltage(c.Nominal.VCE_V), vceRange(c.Worst),
			signedV(c.Margins.Saturation_V), vceoMargin(c.Margins), icMaxMargin(c.Margins), power(c.Margins), verdict(c.Within, c.Failing, tol))
	}
	tw.Flush()
	if n := len(s.Candidates) - top; n > 0 {
		fmt.Fprintf(w, "(%d more; --top or --json lists them)\n", n)
	}
	for i, c := range s.Candidates {
		if i == top {
			break
		}
		for _, f := range c.Failing {
			fmt.Fprintf(w, "  #%d %s: %s\n", c.Rank, c.Transistor.Sheet.Label, report.SubstituteFailure(f))
		}
	}
	for _, sk := range s.Skipped {
		why := "none on hand"
		if !sk.Empty {
			why = fmt.Sprint(sk.Err)
		}
		fmt.Fprintf(w, "  not tried: %s (line %d, bin %s): %s\n", sk.Transistor.Sheet.Label, sk.Transistor.ID, sk.Transistor.Bin, why)
	}
	if !s.NoneWithin {
		fmt.Fprintf(w, "\nFit #1 as it is: no resistor needs changing.\n")
		return
	}
	fmt.Fprintf(w, "\nNo stocked transistor keeps IC within %s. The one resistor change that re-centres each of the best:\n", tol)
	any := false
	shown := map[*repair.Change]int{}
	for i, c := range s.Candidates {
		ch := c.Change
		if ch == nil || i >= top {
			continue
		}
		any = true
		if first, ok := shown[ch]; ok {
			fmt.Fprintf(w, "\n#%d %s (bin %s): the same change as #%d\n", c.Rank, c.Transistor.Sheet.Label, c.Transistor.Bin, first)
			continue
		}
		shown[ch] = c.Rank
		fmt.Fprintf(w, "\n#%d %s: %s %s → %s (%s)\n", c.Rank, c.Transistor.Sheet.Label, strings.ToUpper(ch.Position.String()),
			notation.FormatResistance(ch.FromOhm), notation.FormatResistance(ch.Filling.Ohm), filling(ch.Filling))
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "  \tIC\tSHIFT\tIC WORST\tVCE\tVCE SHIFT\tVCE WORST\tVERDICT")
		fmt.Fprintf(tw, "  before\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", notation.FormatCurrent(c.Nominal.IC_A), pct(c.ICShift), icRange(c.Worst),
			notation.FormatVoltage(c.Nominal.VCE_V), pct(c.VCEShift), vceRange(c.Worst), verdict(c.Within, c.Failing, tol))
		fmt.Fprintf(tw, "  after\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", notation.FormatCurrent(ch.After.Nominal.IC_A), pct(ch.ICShift), icRange(ch.After.Worst),
			notation.FormatVoltage(ch.After.Nominal.VCE_V), pct(ch.VCEShift), vceRange(ch.After.Worst), verdict(ch.Within, ch.Failing, tol))
		tw.Flush()
		for _, f := range ch.Failing {
			fmt.Fprintf(w, "  after the change: %s\n", report.SubstituteFailure(f))
		}
	}
	if !any {
		fmt.Fprintln(w, "  no single stocked resistor or pair brings any of them closer")
	}
}

func sourceWords(o repair.Original) string {
	if o.Source == repair.SourceMeasured {
		return "measured on a working twin"
	}
	return "solved from the original's ranges"
}

func pct(f float64) string {
	if math.IsInf(f, 0) || math.IsNaN(f) {
		return "—"
	}
	return fmt.Sprintf("%+.1f %%", 100*f)
}

func signedV(v float64) string {
	s := notation.FormatVoltage(v)
	if v >= 0 {
		return "+" + s
	}
	return s
}

func icRange(wc solver.WorstCase) string {
	return notation.FormatCurrent(wc.ICMin_A) + " .. " + notation.FormatCurrent(wc.ICMax_A)
}

func vceRange(wc solver.WorstCase) string {
	return notation.FormatVoltage(wc.VCEMin_V) + " .. " + notation.FormatVoltage(wc.VCEMax_V)
}

func vceoMargin(m repair.Margins) string {
	if !m.HasVCEO {
		return "unrated"
	}
	return signedV(m.VCEO_V)
}

func icMaxMargin(m repair.Margins) string {
	if !m.HasICMax {
		return "unrated"
	}
	return "+" + notation.FormatCurrent(m.ICMax_A)
}

func power(m repair.Margins) string {
	if !m.HasPower {
		return "unrated"
	}
	return fmt.Sprintf("%.0f %%", 100*m.Power)
}

func verdict(within bool, failing []repair.Failure, tol string) string {
	switch {
	case len(failing) > 0:
		return "breaks a limit"
	case within:
		return "nominal within " + tol
	}
	return "nominal outside " + tol
}

// filling names a stocked part or pair with its bins and line IDs.
func filling(p picker.Position) string {
	var parts []string
	for _, pt := range p.Parts {
		parts = append(parts, fmt.Sprintf("%s from bin %s, line %d", notation.FormatResistance(pt.Ohm), pt.Bin, pt.ID))
	}
	if len(parts) == 1 {
		return parts[0]
	}
	return p.Arrangement + ": " + strings.Join(parts, " + ")
}
