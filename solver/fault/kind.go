package fault

import (
	"fmt"

	"biasbin/solver"
)

// Position is where a fault sits: a resistor position (a solver.Slot) or the
// transistor.
type Position int

// Transistor is the position of the stage's transistor.
const Transistor Position = -1

// ResistorAt returns the position of resistor slot s.
func ResistorAt(s solver.Slot) Position { return Position(s) }

// Slot returns the resistor slot of p and whether p is a resistor.
func (p Position) Slot() (solver.Slot, bool) {
	if p < 0 || solver.Slot(p) >= solver.NumSlots {
		return 0, false
	}
	return solver.Slot(p), true
}

// String returns "r1", "r2", "rc", "re", "rf", "rb" or "q".
func (p Position) String() string {
	if p == Transistor {
		return "q"
	}
	if s, ok := p.Slot(); ok {
		return s.String()
	}
	return fmt.Sprintf("Position(%d)", int(p))
}

// MarshalText writes the position's name.
func (p Position) MarshalText() ([]byte, error) { return []byte(p.String()), nil }

// Kind is the kind of a single fault.
type Kind int

// The fault kinds, in the order they are listed and tie-broken.
const (
	None    Kind = iota // no fault: the working stage
	Open                // a resistor open
	Short               // a resistor shorted
	Drift               // a resistor drifted to another value
	BEOpen              // base-emitter junction open
	BEShort             // base-emitter junction shorted
	BCOpen              // base-collector junction open
	BCShort             // base-collector junction shorted
	CEShort             // collector-emitter shorted
	Leak                // collector-base leakage
	LowHFE              // hFE far below its range
)

var kindNames = [...]string{"none", "open", "short", "drift", "be-open", "be-short", "bc-open", "bc-short", "ce-short", "leak", "low-hfe"}

// String returns the kind's name: "open", "short", "drift", "be-open",
// "be-short", "bc-open", "bc-short", "ce-short", "leak", "low-hfe" (and
// "none" for the working stage).
func (k Kind) String() string {
	if k < 0 || int(k) >= len(kindNames) {
		return fmt.Sprintf("Kind(%d)", int(k))
	}
	return kindNames[k]
}

// MarshalText writes the kind's name.
func (k Kind) MarshalText() ([]byte, error) { return []byte(k.String()), nil }

// ParseKind reads a kind's name as written by String.
func ParseKind(s string) (Kind, error) {
	for i, n := range kindNames {
		if n == s {
			return Kind(i), nil
		}
	}
	return 0, fmt.Errorf("fault kind %q: want one of open short drift be-open be-short bc-open bc-short ce-short leak low-hfe", s)
}

// Fault is one single fault with its value where it has one.
type Fault struct {
	Position Position
	Kind     Kind
	// Ohm is the drifted value (Drift only).
	Ohm float64
	// Leak_A is the collector-base leakage at 25 °C (Leak only).
	Leak_A float64
	// HFE is the forward beta (LowHFE only).
	HFE float64
}

// resistorKinds and transistorKinds list the faults tried at each position.
var (
	resistorKinds   = []Kind{Open, Short, Drift}
	transistorKinds = []Kind{BEOpen, BEShort, BCOpen, BCShort, CEShort, Leak, LowHFE}
)
