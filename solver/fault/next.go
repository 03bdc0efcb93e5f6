package fault

import (
	"math"

	"biasbin/solver"
)

// Check is an out-of-circuit measurement that tells faults apart.
type Check int

// The checks NextMeasurement can name.
const (
	// Resistance: lift one leg of the resistor and measure it.
	Resistance Check = iota + 1
	// DiodeBE: diode test of the base-emitter junction, transistor out.
	DiodeBE
	// DiodeBC: diode test of the base-collector junction, transistor out.
	DiodeBC
	// ResistanceCE: collector-emitter resistance, transistor out.
	ResistanceCE
	// HFE: the transistor's hFE on a tester, transistor out.
	HFE
	// LeakageCB: the collector-base reverse current, transistor out.
	LeakageCB
)

var checkNames = [...]string{"", "resistance", "diode-be", "diode-bc", "resistance-ce", "hfe", "leakage-cb"}

// String returns the check's name: "resistance", "diode-be", "diode-bc",
// "resistance-ce", "hfe" or "leakage-cb".
func (c Check) String() string {
	if c <= 0 || int(c) >= len(checkNames) {
		return "Check(?)"
	}
	return checkNames[c]
}

// MarshalText writes the check's name.
func (c Check) MarshalText() ([]byte, error) { return []byte(c.String()), nil }

// Outcome is what a check is expected to show.
type Outcome int

// Expected outcomes.
const (
	// Normal: a working part (a junction that conducts one way, no
	// collector-emitter path, hFE in range, no leakage worth naming).
	Normal Outcome = iota + 1
	// OpenCircuit: no conduction.
	OpenCircuit
	// ShortCircuit: near zero ohms.
	ShortCircuit
	// Value: the figure in Expect.Value (ohms, hFE or amperes).
	Value
)

var outcomeNames = [...]string{"", "normal", "open", "short", "value"}

// String returns "normal", "open", "short" or "value".
func (o Outcome) String() string {
	if o <= 0 || int(o) >= len(outcomeNames) {
		return "Outcome(?)"
	}
	return outcomeNames[o]
}

// MarshalText writes the outcome's name.
func (o Outcome) MarshalText() ([]byte, error) { return []byte(o.String()), nil }

// Expect is the expected result of a check under one fault.
type Expect struct {
	Outcome Outcome
	Value   float64 // ohms (Resistance), hFE (HFE) or amperes (LeakageCB) when Outcome is Value
}

// Next is the check that tells the top two faults apart.
type Next struct {
	Check    Check
	Position Position
	// IfFirst and IfSecond are the expected results should the first or
	// the second ranked fault be the real one.
	IfFirst, IfSecond Expect
}

// checkFor is the check that confirms fault f.
func checkFor(f Fault) (Check, Position) {
	switch f.Kind {
	case Open, Short, Drift:
		return Resistance, f.Position
	case BEOpen, BEShort:
		return DiodeBE, Transistor
	case BCOpen, BCShort:
		return DiodeBC, Transistor
	case CEShort:
		return ResistanceCE, Transistor
	case LowHFE:
		return HFE, Transistor
	}
	return LeakageCB, Transistor
}

// expect is what check c at position p shows when f is the fault.
func expect(s solver.Stage, c Check, p Position, f Fault) Expect {
	here := f.Position == p
	switch c {
	case Resistance:
		sl, _ := p.Slot()
		switch {
		case here && f.Kind == Open:
			return Expect{Outcome: OpenCircuit}
		case here && f.Kind == Short:
			return Expect{Outcome: ShortCircuit}
		case here && f.Kind == Drift:
			return Expect{Outcome: Value, Value: f.Ohm}
		}
		return Expect{Outcome: Value, Value: s.R_Ohm[sl]}
	case DiodeBE:
		switch f.Kind {
		case BEOpen:
			return Expect{Outcome: OpenCircuit}
		case BEShort:
			return Expect{Outcome: ShortCircuit}
		}
	case DiodeBC:
		switch f.Kind {
		case BCOpen:
			return Expect{Outcome: OpenCircuit}
		case BCShort:
			return Expect{Outcome: ShortCircuit}
		}
	case ResistanceCE:
		if f.Kind == CEShort {
			return Expect{Outcome: ShortCircuit}
		}
	case HFE:
		if f.Kind == LowHFE {
			return Expect{Outcome: Value, Value: f.HFE}
		}
	case LeakageCB:
		if f.Kind == Leak {
			return Expect{Outcome: Value, Value: f.Leak_A}
		}
	}
	return Expect{Outcome: Normal}
}

// differ reports whether two expected results can be told apart: a
// different outcome, or values more than 20 % apart (past the tolerance
// of a resistor and the resolution of a hand-held meter).
func differ(a, b Expect) bool {
	if a.Outcome != b.Outcome {
		return true
	}
	if a.Outcome != Value {
		return false
	}
	return math.Abs(math.Log(a.Value/b.Value)) > math.Log(1.2)
}

// nextMeasurement picks the check of the first fault, else of the second,
// whose expected results differ between the two; nil when none does.
func nextMeasurement(s solver.Stage, first, second Candidate) *Next {
	for _, f := range []Fault{first.Fault, second.Fault} {
		c, p := checkFor(f)
		a, b := expect(s, c, p, first.Fault), expect(s, c, p, second.Fault)
		if differ(a, b) {
			return &Next{Check: c, Position: p, IfFirst: a, IfSecond: b}
		}
	}
	return nil
}
