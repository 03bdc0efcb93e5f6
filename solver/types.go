package solver

import (
	"errors"
	"fmt"
)

// Polarity is the transistor type.
type Polarity int

const (
	// NPN is an NPN bipolar transistor.
	NPN Polarity = iota + 1
	// PNP is a PNP bipolar transistor.
	PNP
)

// String returns "npn" or "pnp".
func (p Polarity) String() string {
	switch p {
	case NPN:
		return "npn"
	case PNP:
		return "pnp"
	}
	return fmt.Sprintf("Polarity(%d)", int(p))
}

// ParsePolarity reads "npn" or "pnp" (any case).
func ParsePolarity(s string) (Polarity, error) {
	switch s {
	case "npn", "NPN", "Npn":
		return NPN, nil
	case "pnp", "PNP", "Pnp":
		return PNP, nil
	}
	return 0, fmt.Errorf("polarity %q: want npn or pnp", s)
}

// sign is +1 for NPN and -1 for PNP: multiplying a PNP circuit's node
// voltages by sign gives the mirrored NPN circuit.
func (p Polarity) sign() float64 {
	if p == PNP {
		return -1
	}
	return 1
}

// Region is the operating region the transistor is found in.
type Region int

const (
	// Active is the forward-active region: base-emitter forward biased,
	// base-collector reverse biased.
	Active Region = iota + 1
	// Saturation: both junctions forward biased.
	Saturation
	// Cutoff: base-emitter junction not conducting.
	Cutoff
	// ReverseActive: base-collector forward, base-emitter reverse biased.
	ReverseActive
)

// String returns the region's name as used in JSON output.
func (r Region) String() string {
	switch r {
	case Active:
		return "active"
	case Saturation:
		return "saturation"
	case Cutoff:
		return "cutoff"
	case ReverseActive:
		return "reverse-active"
	}
	return fmt.Sprintf("Region(%d)", int(r))
}

// MarshalText writes the region's name.
func (r Region) MarshalText() ([]byte, error) { return []byte(r.String()), nil }

// UnmarshalText reads back what MarshalText writes.
func (r *Region) UnmarshalText(b []byte) error {
	for _, v := range []Region{Active, Saturation, Cutoff, ReverseActive} {
		if string(b) == v.String() {
			*r = v
			return nil
		}
	}
	var n int
	if _, err := fmt.Sscanf(string(b), "Region(%d)", &n); err != nil {
		return fmt.Errorf("region %q: want active, saturation, cutoff or reverse-active", b)
	}
	*r = Region(n)
	return nil
}

// ConductingCurrent_A is the ideal diode current at which the solver counts
// a junction as conducting when it names the region (doc.go, "Regions"): a
// forward-active operating point has a base-emitter injection of at least
// this much.
const ConductingCurrent_A = regionOn_A

// Topology is the bias circuit.
type Topology int

const (
	// Divider is voltage-divider bias: R1 from the collector rail to the
	// base, R2 from the base to ground, RC from the rail to the collector,
	// RE from the emitter to ground (RE may be 0).
	Divider Topology = iota + 1
	// CollectorFeedback: RF from the collector to the base, RC from the
	// rail to the collector, optional RE from the emitter to ground.
	CollectorFeedback
	// SplitSupply: RB from the base to ground, RC from the collector rail
	// (VCC) to the collector, RE from the emitter to the emitter rail (VEE).
	SplitSupply
)

// String returns "divider", "collector-feedback" or "split-supply".
func (t Topology) String() string {
	switch t {
	case Divider:
		return "divider"
	case CollectorFeedback:
		return "collector-feedback"
	case SplitSupply:
		return "split-supply"
	}
	return fmt.Sprintf("Topology(%d)", int(t))
}

// MarshalText writes the topology's name.
func (t Topology) MarshalText() ([]byte, error) { return []byte(t.String()), nil }

// UnmarshalText reads back what MarshalText writes (also the unset
// topology, "Topology(0)").
func (t *Topology) UnmarshalText(b []byte) error {
	if v, err := ParseTopology(string(b)); err == nil {
		*t = v
		return nil
	}
	var n int
	if _, err := fmt.Sscanf(string(b), "Topology(%d)", &n); err != nil {
		return fmt.Errorf("topology %q: want divider, collector-feedback or split-supply", b)
	}
	*t = Topology(n)
	return nil
}

// ParseTopology reads a topology name as written by String.
func ParseTopology(s string) (Topology, error) {
	for _, t := range []Topology{Divider, CollectorFeedback, SplitSupply} {
		if s == t.String() {
			return t, nil
		}
	}
	return 0, fmt.Errorf("topology %q: want divider, collector-feedback or split-supply", s)
}

// Slots lists the resistor positions the topology uses, in display order.
func (t Topology) Slots() []Slot {
	switch t {
	case Divider:
		return []Slot{R1, R2, RC, RE}
	case CollectorFeedback:
		return []Slot{RF, RC, RE}
	case SplitSupply:
		return []Slot{RB, RC, RE}
	}
	return nil
}

// Slot names a resistor position in a stage.
type Slot int

const (
	// R1 is the divider's upper resistor (rail to base).
	R1 Slot = iota
	// R2 is the divider's lower resistor (base to ground).
	R2
	// RC is the collector resistor.
	RC
	// RE is the emitter resistor (0 means the emitter is tied to its rail).
	RE
	// RF is the collector-to-base feedback resistor.
	RF
	// RB is the base resistor to ground of the split-supply stage.
	RB
	// NumSlots is the number of slots; arrays indexed by Slot have this length.
	NumSlots
)

var slotNames = [NumSlots]string{"r1", "r2", "rc", "re", "rf", "rb"}

// String returns the slot's lower-case name ("r1", "rc", ...).
func (s Slot) String() string {
	if s < 0 || s >= NumSlots {
		return fmt.Sprintf("Slot(%d)", int(s))
	}
	return slotNames[s]
}

// ParseSlot reads a slot name as written by String.
func ParseSlot(name string) (Slot, error) {
	for i, n := range slotNames {
		if n == name {
			return Slot(i), nil
		}
	}
	return 0, fmt.Errorf("resistor position %q: want one of r1 r2 rc re rf rb", name)
}

// InputError reports a non-physical or out-of-range input. Field names the
// offending input as the user knows it ("r1", "vcc", "hfe_min", ...).
type InputError struct {
	Field   string
	Problem string
	// Range, when set, is the accepted range the value fell outside.
	Range *Range
}

func (e *InputError) Error() string { return e.Field + ": " + e.Problem }

// ErrNoConvergence is wrapped by every error returned when the Newton
// iteration does not converge.
var ErrNoConvergence = errors.New("operating point did not converge")

// ErrThermalRunaway is wrapped by the error returned when self-heating has
// no stable equilibrium below the junction temperature limit.
var ErrThermalRunaway = errors.New("thermal runaway: no stable junction temperature")
