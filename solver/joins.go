package solver

import "fmt"

// Terminal is a point of a stage a resistor joins: a transistor lead or a
// rail.
type Terminal int

// The points of a stage.
const (
	// BaseLead, CollectorLead and EmitterLead are the transistor's leads.
	BaseLead Terminal = iota + 1
	CollectorLead
	EmitterLead
	// CollectorRail is VCC, the rail RC returns to.
	CollectorRail
	// EmitterRail is the rail RE returns to: the emitter-side rail of a
	// single-supply stage, VEE of the split-supply stage.
	EmitterRail
	// Common is the split-supply stage's 0 V between its two supplies,
	// where RB returns.
	Common
)

// String returns the terminal's lower-case name.
func (t Terminal) String() string {
	switch t {
	case BaseLead:
		return "base"
	case CollectorLead:
		return "collector"
	case EmitterLead:
		return "emitter"
	case CollectorRail:
		return "collector-rail"
	case EmitterRail:
		return "emitter-rail"
	case Common:
		return "common"
	}
	return fmt.Sprintf("Terminal(%d)", int(t))
}

// Lead reports whether t is a transistor lead.
func (t Terminal) Lead() bool { return t == BaseLead || t == CollectorLead || t == EmitterLead }

// Joins returns the two points resistor slot s joins in topology t, the
// one nearer the collector rail first (ok false when t has no such slot):
// the wiring of the three bias circuits (Topology's doc comments).
func (t Topology) Joins(s Slot) (a, b Terminal, ok bool) {
	switch {
	case s == RC:
		return CollectorRail, CollectorLead, t.usesSlot(s)
	case s == RE:
		return EmitterLead, EmitterRail, t.usesSlot(s)
	case t == Divider && s == R1:
		return CollectorRail, BaseLead, true
	case t == Divider && s == R2:
		return BaseLead, EmitterRail, true
	case t == CollectorFeedback && s == RF:
		return CollectorLead, BaseLead, true
	case t == SplitSupply && s == RB:
		return BaseLead, Common, true
	}
	return 0, 0, false
}

// usesSlot reports whether s is one of t's slots.
func (t Topology) usesSlot(s Slot) bool {
	for _, u := range t.Slots() {
		if u == s {
			return true
		}
	}
	return false
}

// RailVoltage_V is rail terminal r of stage s as a meter reads it against
// the stage's ground: VCC, the emitter-side rail (VEE for split supply)
// or the common. ok is false for a transistor lead.
func (s Stage) RailVoltage_V(r Terminal) (v float64, ok bool) {
	switch r {
	case CollectorRail:
		return s.Ground.Meter(s.VCC_V, s.VCC_V), true
	case EmitterRail:
		if s.Topology == SplitSupply {
			return s.VEE_V, true
		}
		return s.Ground.Meter(0, s.VCC_V), true
	case Common:
		return 0, true
	}
	return 0, false
}
