package solver

import (
	"fmt"
	"math"
)

// The sign convention is applied once, where a supply enters the program:
// a user gives a rail as a magnitude or already signed, and Rail turns it
// into the signed rail every solver type carries (VCC < 0 for a PNP stage,
// VEE opposite to VCC).

// RailSide says which rail of a stage a supply feeds.
type RailSide int

// The rails of a stage.
const (
	// Collector is the VCC rail: positive for NPN, negative for PNP.
	Collector RailSide = iota + 1
	// Emitter is the split-supply stage's VEE rail, opposite to VCC.
	Emitter
)

// Rail returns the signed rail of side for a stage of polarity p from v,
// given as a magnitude (it takes the rail's sign) or already signed (the
// sign must be the rail's). Zero, a non-finite value or a sign against the
// rail's is an *InputError (Field "vcc" or "vee").
func Rail(v float64, p Polarity, side RailSide) (float64, error) {
	field, sign := "vcc", p.sign()
	if side == Emitter {
		field, sign = "vee", -sign
	}
	switch {
	case math.IsNaN(v) || math.IsInf(v, 0):
		return 0, &InputError{Field: field, Problem: "not a finite voltage"}
	case v == 0:
		return 0, &InputError{Field: field, Problem: "a supply of 0 V: a stage needs a supply; give its voltage, e.g. 12V"}
	case v < 0 && sign > 0:
		return 0, &InputError{Field: field, Problem: fmt.Sprintf("%g V: this rail is positive for the %s stage; give the magnitude %g V",
			v, p, math.Abs(v))}
	}
	return math.Abs(v) * sign, nil
}
