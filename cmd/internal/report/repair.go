package report

import (
	"fmt"

	"biasbin/picker"
	"biasbin/picker/repair"
	"biasbin/solver/fault"
	"biasbin/solver/notation"
)

// BenchCaution words one repair-bench caution.
func BenchCaution(c repair.Caution) string {
	switch c.Kind {
	case repair.CautionMains:
		return "the unit on the bench may hold mains voltage elsewhere on it, whatever this stage's supply; keep one hand clear and work from an isolating transformer where the unit draws from the mains"
	case repair.CautionCharged:
		return "capacitors can stay charged after the power is off; discharge them through a resistor before lifting or fitting a part"
	case repair.CautionServiceSupply:
		return "measure with the supply applied as the service notes say (the voltages here assume the stated rails)"
	case repair.CautionHighSupply:
		return fmt.Sprintf("the stage's own supply spans %s, above the %s extra-low-voltage boundary: touching it can hurt", notation.FormatVoltage(c.Value), notation.FormatVoltage(c.Limit))
	case repair.CautionLocalCodes:
		return "follow local codes and licensed practice; hand a unit you may not open to someone who may"
	}
	return fmt.Sprintf("caution %d", int(c.Kind))
}

// SubstituteFailure words one limit a substitute (or a changed stage)
// breaks.
func SubstituteFailure(f repair.Failure) string {
	switch f.Kind {
	case repair.FailVCEO:
		return fmt.Sprintf("VCEO %s derated to %.0f %% is below the %s supply span", notation.FormatVoltage(f.Limit), 100*picker.VoltageDerating, notation.FormatVoltage(f.Value))
	case repair.FailICMax:
		return fmt.Sprintf("IC max %s derated to %.0f %% is below the worst-case IC %s", notation.FormatCurrent(f.Limit), 100*picker.CurrentDerating, notation.FormatCurrent(f.Value))
	case repair.FailDissipation:
		return fmt.Sprintf("a part runs at %.0f %% of its derated, margined dissipation at some corner", 100*f.Value)
	case repair.FailNotActive:
		return fmt.Sprintf("%.0f of %.0f worst-case corners leave the active region or the VCE margin", f.Value, f.Limit)
	case repair.FailSolve:
		return fmt.Sprintf("the stage does not solve with this part: %v", f.Err)
	}
	return fmt.Sprintf("failure %d", int(f.Kind))
}

// FaultKind words a fault kind as a technician says it.
func FaultKind(k fault.Kind) string {
	switch k {
	case fault.None:
		return "no fault"
	case fault.Open:
		return "open"
	case fault.Short:
		return "shorted"
	case fault.Drift:
		return "drifted"
	case fault.BEOpen:
		return "base-emitter junction open"
	case fault.BEShort:
		return "base-emitter junction shorted"
	case fault.BCOpen:
		return "base-collector junction open"
	case fault.BCShort:
		return "base-collector junction shorted"
	case fault.CEShort:
		return "collector-emitter shorted"
	case fault.Leak:
		return "collector-base leakage"
	case fault.LowHFE:
		return "hFE far below its range"
	}
	return k.String()
}

// FaultValue words a fitted fault's own value ("" when it has none).
func FaultValue(f fault.Fault) string {
	switch f.Kind {
	case fault.Drift:
		return notation.FormatResistance(f.Ohm)
	case fault.Leak:
		return notation.FormatCurrent(f.Leak_A)
	case fault.LowHFE:
		return fmt.Sprintf("hFE %.3g", f.HFE)
	}
	return ""
}

// Expectation words what a check is expected to show.
func Expectation(c fault.Check, e fault.Expect) string {
	switch e.Outcome {
	case fault.OpenCircuit:
		if c == fault.Resistance {
			return "open (over range)"
		}
		return "open: no conduction either way"
	case fault.ShortCircuit:
		return "a short: near 0 Ω"
	case fault.Normal:
		switch c {
		case fault.DiodeBE, fault.DiodeBC:
			return "a normal junction: about 0.5–0.7 V one way, open the other"
		case fault.ResistanceCE:
			return "open both ways (no path)"
		case fault.HFE:
			return "within its datasheet range"
		case fault.LeakageCB:
			return "no leakage worth reading"
		}
		return "normal"
	case fault.Value:
		switch c {
		case fault.Resistance:
			return notation.FormatResistance(e.Value)
		case fault.HFE:
			return fmt.Sprintf("about %.3g", e.Value)
		case fault.LeakageCB:
			return "about " + notation.FormatCurrent(e.Value)
		}
	}
	return e.Outcome.String()
}

// CheckAction words how to take a check.
func CheckAction(c fault.Check, p fault.Position) string {
	switch c {
	case fault.Resistance:
		return fmt.Sprintf("power off, discharge, lift one leg of %s and measure its resistance", upper(p.String()))
	case fault.DiodeBE:
		return "power off, discharge, take the transistor out and diode-test base to emitter both ways"
	case fault.DiodeBC:
		return "power off, discharge, take the transistor out and diode-test base to collector both ways"
	case fault.ResistanceCE:
		return "power off, discharge, take the transistor out and measure collector to emitter both ways"
	case fault.HFE:
		return "power off, take the transistor out and measure its hFE on a tester"
	case fault.LeakageCB:
		return "power off, take the transistor out and measure the collector-base reverse current"
	}
	return c.String()
}

// upper is the position as printed on a board ("R1", "RC", "Q").
func upper(s string) string {
	b := []byte(s)
	for i, c := range b {
		if c >= 'a' && c <= 'z' {
			b[i] = c - 'a' + 'A'
		}
	}
	return string(b)
}

// PositionName is a fault position as printed on a board ("R1", "Q").
func PositionName(p fault.Position) string { return upper(p.String()) }
