package solver

import (
	"fmt"
	"math"
)

// The reference of every node voltage is applied once, here: the solver
// works with 0 V on the emitter-side rail (doc.go), and a stage whose
// 0 V is the collector-side rail — the PNP stage on a positive supply,
// emitter side to +V, collector side to ground — has every node raised by
// |VCC|. Ground.Meter turns a node voltage of the solver's frame into the
// one a meter shows between the node and the circuit's 0 V, Ground.Node
// turns a reading back.

// Ground is the point of a stage its node voltages are measured against:
// the circuit's 0 V, where the meter's black lead goes.
type Ground int

const (
	// EmitterRailGround is 0 V on the emitter-side rail (the zero value):
	// the NPN stage on a positive supply, the PNP stage on a negative
	// supply, and the common of a split supply's two rails.
	EmitterRailGround Ground = iota
	// CollectorRailGround is 0 V on the collector-side rail, the emitter
	// side at |VCC|: the PNP stage on a positive supply. A single-supply
	// stage only.
	CollectorRailGround
)

// String returns "emitter-rail" or "collector-rail".
func (g Ground) String() string {
	switch g {
	case EmitterRailGround:
		return "emitter-rail"
	case CollectorRailGround:
		return "collector-rail"
	}
	return fmt.Sprintf("Ground(%d)", int(g))
}

// MarshalText writes the ground's name.
func (g Ground) MarshalText() ([]byte, error) { return []byte(g.String()), nil }

// UnmarshalText reads back what MarshalText writes.
func (g *Ground) UnmarshalText(b []byte) error {
	for _, v := range []Ground{EmitterRailGround, CollectorRailGround} {
		if string(b) == v.String() {
			*g = v
			return nil
		}
	}
	return fmt.Errorf("ground %q: want emitter-rail or collector-rail", b)
}

// shift_V is what g adds to a node voltage of the solver's frame in a
// stage whose collector rail is vcc (signed, as the solver carries it).
func (g Ground) shift_V(vcc float64) float64 {
	if g == CollectorRailGround {
		return -vcc
	}
	return 0
}

// Meter returns the node voltage v of the solver's frame (0 V on the
// emitter-side rail) as a meter reads it against g, in a stage whose
// collector rail is vcc (signed, as the solver carries it).
func (g Ground) Meter(v, vcc float64) float64 { return v + g.shift_V(vcc) }

// Node is the inverse of Meter: a reading against g as a node voltage of
// the solver's frame.
func (g Ground) Node(reading, vcc float64) float64 { return reading - g.shift_V(vcc) }

// Supply_V is the supply as a meter reads it between the rail that is not
// 0 V and 0 V (single supply): vcc itself when 0 V is the emitter-side
// rail, |vcc| when it is the collector-side rail.
func (g Ground) Supply_V(vcc float64) float64 {
	if g == CollectorRailGround {
		return -vcc
	}
	return vcc
}

// RailSign is how a single-supply stage is built: its supply positive or
// negative against the circuit's 0 V.
type RailSign int

const (
	// RailFromSupply (the zero value) takes the sign of the supply as
	// given: negative when it is given negative, else positive.
	RailFromSupply RailSign = iota
	// PositiveRail: the supply is positive against 0 V. NPN: collector
	// side to +V, emitter side to 0 V; PNP: emitter side to +V, collector
	// side to 0 V (the usual build).
	PositiveRail
	// NegativeRail: the supply is negative against 0 V. PNP only: emitter
	// side to 0 V, collector side to −V.
	NegativeRail
	// SplitRails: two supplies, measured from their common; the
	// split-supply stage's rail (SettleRail gives it, no flag does).
	SplitRails
)

// String returns "positive", "negative", "split" or "" for
// RailFromSupply.
func (r RailSign) String() string {
	switch r {
	case PositiveRail:
		return "positive"
	case NegativeRail:
		return "negative"
	case SplitRails:
		return "split"
	case RailFromSupply:
		return ""
	}
	return fmt.Sprintf("RailSign(%d)", int(r))
}

// ParseRailSign reads "positive" or "negative" ("" is RailFromSupply).
func ParseRailSign(s string) (RailSign, error) {
	switch s {
	case "":
		return RailFromSupply, nil
	case "positive", "pos", "+":
		return PositiveRail, nil
	case "negative", "neg", "-":
		return NegativeRail, nil
	}
	return 0, &InputError{Field: "rail", Problem: fmt.Sprintf("%q: want positive or negative", s)}
}

// SettleRail returns the rail sign of a stage of polarity p and topology t
// whose supply is given as vcc (a magnitude, or signed as a meter shows it
// against 0 V) and built on r. RailFromSupply becomes NegativeRail for a
// negative vcc and PositiveRail otherwise; a stated rail must agree with a
// signed vcc. The NPN stage is built on a positive supply only (Rail
// refuses its supply given negative). A
// split-supply stage is measured from the common of its two supplies, so
// it takes no stated rail (its rails carry their own signs) and settles
// on SplitRails; any other t (a search over every topology) settles as a
// single-supply stage. Errors are *InputError with Field "rail" or "vcc".
func SettleRail(vcc float64, p Polarity, t Topology, r RailSign) (RailSign, error) {
	switch {
	case r < RailFromSupply || r > SplitRails:
		return 0, &InputError{Field: "rail", Problem: fmt.Sprintf("%v: want positive or negative", r)}
	case t == SplitSupply && r != RailFromSupply && r != SplitRails:
		return 0, &InputError{Field: "rail", Problem: "a split-supply stage is measured from the common of its two supplies " +
			"(" + splitRails(p) + "); leave the rail out"}
	case t == SplitSupply:
		return SplitRails, nil
	case r == SplitRails:
		return 0, &InputError{Field: "rail", Problem: fmt.Sprintf("split rails are for the split-supply stage, not the %v stage", t)}
	case p == NPN && r == NegativeRail:
		return 0, &InputError{Field: "rail", Problem: "an NPN stage is built on a positive supply (collector side to +V, emitter side to 0 V); " +
			"the negative rail is for a PNP stage"}
	case r == PositiveRail && vcc < 0:
		return 0, &InputError{Field: "vcc", Problem: fmt.Sprintf("%g V on a positive rail: give the supply as %g V, or build on a negative rail", vcc, math.Abs(vcc))}
	case r == RailFromSupply && vcc < 0 && p == PNP:
		return NegativeRail, nil
	case r == RailFromSupply:
		return PositiveRail, nil
	}
	return r, nil
}

// splitRails says which rail of a split supply is which for p.
func splitRails(p Polarity) string {
	if p == PNP {
		return "a PNP stage's collector rail negative, its emitter rail positive"
	}
	return "an NPN stage's collector rail positive, its emitter rail negative"
}

// GroundOf is the ground of a stage of polarity p and topology t built on
// the settled rail r (SettleRail): the collector-side rail for a PNP
// single-supply stage on a positive rail, else the emitter-side rail (the
// common of a split supply).
func GroundOf(p Polarity, t Topology, r RailSign) Ground {
	if p == PNP && t != SplitSupply && r == PositiveRail {
		return CollectorRailGround
	}
	return EmitterRailGround
}

// RailOf is the rail sign a stage of polarity p and topology t with
// ground g is built on: what SettleRail settled for it.
func RailOf(p Polarity, t Topology, g Ground) RailSign {
	switch {
	case t == SplitSupply:
		return SplitRails
	case p == PNP && g != CollectorRailGround:
		return NegativeRail
	}
	return PositiveRail
}
