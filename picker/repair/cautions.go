package repair

import (
	"math"

	"biasbin/solver"
)

// ELV_V is the supply span above which the stage itself earns the
// high-voltage caution: 50 V is the usual extra-low-voltage boundary for
// DC work (common practice; local rules differ).
const ELV_V = 50.0

// CautionKind says what a bench caution warns of.
type CautionKind int

// The bench cautions.
const (
	// CautionMains: a unit on the bench may hold mains voltage in other
	// parts of it, whatever this stage's supply.
	CautionMains CautionKind = iota + 1
	// CautionCharged: capacitors may stay charged after the power is off;
	// discharge them before lifting or replacing a part.
	CautionCharged
	// CautionServiceSupply: measure with the supply applied as the service
	// notes say.
	CautionServiceSupply
	// CautionLocalCodes: follow local codes and licensed practice.
	CautionLocalCodes
	// CautionHighSupply: the stage's own supply span Value (V) exceeds the
	// extra-low-voltage boundary Limit (V).
	CautionHighSupply
)

// Caution is one bench caution with its figures where it has any.
type Caution struct {
	Kind  CautionKind
	Value float64
	Limit float64
}

// benchCautions are the cautions every repair job carries, and the
// high-supply one when the stage's rails span more than ELV_V.
func benchCautions(s solver.Stage) []Caution {
	out := []Caution{{Kind: CautionMains}, {Kind: CautionCharged}, {Kind: CautionServiceSupply}}
	span := math.Abs(s.VCC_V)
	if s.Topology == solver.SplitSupply {
		span = math.Abs(s.VCC_V - s.VEE_V)
	}
	if span > ELV_V {
		out = append(out, Caution{Kind: CautionHighSupply, Value: span, Limit: ELV_V})
	}
	return append(out, Caution{Kind: CautionLocalCodes})
}
