package report

import (
	"fmt"
	"strings"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/solver/notation"
)

// Failure words one hard limit a build breaks.
func Failure(f picker.Failure) string {
	switch f.Kind {
	case picker.FailCorners:
		what := "saturates"
		if f.Region == solver.Cutoff {
			what = "is cut off"
		}
		return fmt.Sprintf("%d of %d corners outside the active region or the VCE margin: the worst %s with VCE %.3g V (VCE(sat) %.3g V + %.3g V margin) at hFE %.0f, %g °C ambient, VCC %.3g V",
			f.NotActive, f.Corners, what, f.VCE_V, f.VCESat_V, f.Margin_V, f.HFE, f.Ambient_C, f.VCC_V)
	case picker.FailAllowance:
		part := f.Part
		if part == picker.PartTransistor {
			part = "the transistor"
		}
		return fmt.Sprintf("%s reaches %.0f %% of its derated, margined allowance at the worst corner", part, 100*f.Utilization)
	case picker.FailICMax:
		return fmt.Sprintf("IC reaches %.3g A, over the %.3g A IC max", f.IC_A, f.ICMax_A)
	case picker.FailVoltage:
		return fmt.Sprintf("%s sees %s at a worst-case corner, over the %s its limiting element voltage allows with margin",
			strings.ToUpper(f.Part), notation.FormatVoltage(f.Voltage_V), notation.FormatVoltage(f.VoltageAllowed_V))
	case picker.FailWorstCase:
		return fmt.Sprintf("worst case: %v", f.Err)
	case picker.FailBench:
		at := map[picker.HFEPoint]string{picker.HFEAtMin: "hFE min", picker.HFEAtTyp: "typical hFE", picker.HFEAtMax: "hFE max"}[f.HFEPoint]
		state := map[solver.Region]string{solver.Saturation: "saturates", solver.Cutoff: "is cut off",
			solver.ReverseActive: "runs reverse-active"}[f.Region]
		if state == "" {
			state = "runs inside the VCE margin"
		}
		return fmt.Sprintf("at the %g °C bench point with %s the stage %s: VCE %.3g V (VCE(sat) %.3g V + %.3g V margin)",
			f.Ambient_C, at, state, f.VCE_V, f.VCESat_V, f.Margin_V)
	}
	return fmt.Sprintf("hard limit %d broken", f.Kind)
}

// limitSay is what a build does when it breaks a limit, for the summary of
// the nearest builds.
var limitSay = map[picker.FailureKind]string{
	picker.FailCorners:   "saturates or cuts off at a worst-case corner",
	picker.FailAllowance: "overloads a part at a worst-case corner",
	picker.FailICMax:     "exceeds the transistor's IC max",
	picker.FailWorstCase: "has a worst-case corner that cannot be solved",
	picker.FailBench:     "leaves the active region or the VCE margin on the bench",
	picker.FailVoltage:   "puts a resistor over its limiting element voltage",
}

// Reason words one cause of a shortfall.
func Reason(r picker.Reason) string {
	switch r.Kind {
	case picker.NoTransistor:
		return fmt.Sprintf("no %v transistor with at least %d in stock and ratings that hold at %.3g V and %s",
			r.Polarity, r.Boards, r.VCC_V, notation.FormatCurrent(r.IC_A))
	case picker.NoResistorLine:
		return fmt.Sprintf("no resistor line holds the %d parts %d boards need", r.Boards, r.Boards)
	case picker.NoOperatingPoint:
		return "no combination of stocked values has an operating point (every solve failed)"
	case picker.OffTarget:
		return fmt.Sprintf("no build reaches the target: the nearest runs at IC %s, VCE %s against %s, %s",
			notation.FormatCurrent(r.IC_A), notation.FormatVoltage(r.VCE_V), notation.FormatCurrent(r.TargetIC_A), notation.FormatVoltage(r.TargetVCE_V))
	case picker.NearestFail:
		if r.Count == r.Of {
			return "every build found " + limitSay[r.Limit]
		}
		return fmt.Sprintf("%d of the %d nearest builds %s", r.Count, r.Of, limitSay[r.Limit])
	case picker.NotStiff:
		return fmt.Sprintf("no divider stiff enough: the nearest builds move IC by at least %.0f %% over the hFE range", 100*r.BetaSpread)
	case picker.NoPurchase:
		return "no purchase of one or two resistor values gives a passing build"
	case picker.KeptStay:
		var kept []string
		for _, k := range r.Kept {
			kept = append(kept, strings.ToUpper(k.Position)+" "+notation.FormatResistance(k.Ohm))
		}
		return fmt.Sprintf("the kept parts (%s) stay as they are and nothing is bought for them: a build that fits may need one replaced (pick again without keeping it)",
			strings.Join(kept, ", "))
	case picker.NoApprovedPurchase:
		return fmt.Sprintf("nothing on the approved list (parts tagged %s) would do: no line of it, topped up to the %d parts the run needs, gives a good build",
			strings.Join(r.Tags, " and "), r.Boards)
	}
	return fmt.Sprintf("shortfall reason %d", r.Kind)
}

// Rejection words why a transistor line was left out of a search.
func Rejection(r picker.Rejection) string {
	name := fmt.Sprintf("%s (line %d, bin %s)", r.Line.Sheet.Label, r.Line.ID, r.Line.Bin)
	var why string
	switch r.Kind {
	case picker.RejectQty:
		why = fmt.Sprintf("only %d in stock; %d boards need one each", r.Qty, r.Boards)
		if r.Boards == 1 {
			why = "none in stock; the board needs one"
		}
	case picker.RejectVCEO:
		why = fmt.Sprintf("VCEO %g V is below the %.3g V supply / %.0f %% derating", r.VCEO_V, r.VCC_V, 100*picker.VoltageDerating)
	case picker.RejectICMax:
		why = fmt.Sprintf("IC max %g A is below the %g A target / %.0f %% derating", r.ICMax_A, r.IC_A, 100*picker.CurrentDerating)
	case picker.RejectPower:
		why = fmt.Sprintf("%.3g W at the target (mid-supply VCE) is over its %.3g W allowance at %g °C", r.Power_W, r.Allowed_W, r.Ambient_C)
	case picker.RejectDatasheet:
		why = fmt.Sprintf("datasheet: %v", r.Err)
	case picker.RejectUnrated:
		why = fmt.Sprintf("its %s not stated, so no build on it can be called safe (--allow-unrated uses it anyway)", RatingList(r.Unknown))
	default:
		why = fmt.Sprintf("left out (%d)", r.Kind)
	}
	return name + ": " + why
}

// Purchase words one part to buy, e.g. "RE: 1K0 (E24, ±5 %, 0.25 W), 2 pieces",
// or a top-up of an approved stock line, e.g. "RE: 1K0 as line #12 (bin
// A3, ±5 %, 0.25 W), 3 more pieces (it holds 2)".
func Purchase(p picker.Purchase) string {
	if p.Line != 0 {
		slot, what := strings.ToUpper(p.Slot), fmt.Sprintf("%s as line #%d (bin %s, ±%g %%, %g W)", notation.FormatResistance(p.Ohm), p.Line, p.Bin, 100*p.Tol, p.Rated_W)
		if p.Slot == picker.PartTransistor {
			slot, what = p.Slot, fmt.Sprintf("%s as line #%d (bin %s)", p.Label, p.Line, p.Bin)
		}
		return fmt.Sprintf("%s: %s, %s more (it holds %d)", slot, what, Pieces(p.Qty), p.OnHand)
	}
	if p.Slot == picker.PartTransistor {
		return fmt.Sprintf("transistor: %v with VCEO ≥ %.3g V, IC max ≥ %s, %s", p.Polarity, p.VCEO_V, notation.FormatCurrent(p.ICMax_A), Pieces(p.Qty))
	}
	return fmt.Sprintf("%s: %s (%s, ±%g %%, %g W), %s", strings.ToUpper(p.Slot), notation.FormatResistance(p.Ohm), p.Series, 100*p.Tol, p.Rated_W, Pieces(p.Qty))
}

// Pieces writes a count of parts: "1 piece", "4 pieces".
func Pieces(n int) string {
	if n == 1 {
		return "1 piece"
	}
	return fmt.Sprintf("%d pieces", n)
}

// Words applies word to each item of xs.
func Words[T any](xs []T, word func(T) string) []string {
	out := make([]string, len(xs))
	for i, x := range xs {
		out[i] = word(x)
	}
	return out
}
