package job

import "biasbin/solver"

// Point is a place on the board one end of a resistor joins, as a
// technician names it: a transistor lead, or a rail by what a meter reads
// on it against the circuit's 0 V.
type Point int

// The points of a stage.
const (
	PointBase Point = iota + 1
	PointCollector
	PointEmitter
	// PointPlus is the positive supply rail, +V.
	PointPlus
	// PointMinus is the negative supply rail, −V.
	PointMinus
	// PointZero is the circuit's 0 V, where the meter's black lead goes.
	PointZero
)

// String returns the point's lower-case name: "base", "collector",
// "emitter", "+v", "-v" or "0v".
func (p Point) String() string {
	switch p {
	case PointBase:
		return "base"
	case PointCollector:
		return "collector"
	case PointEmitter:
		return "emitter"
	case PointPlus:
		return "+v"
	case PointMinus:
		return "-v"
	case PointZero:
		return "0v"
	}
	return "point?"
}

// MarshalText writes the point's name.
func (p Point) MarshalText() ([]byte, error) { return []byte(p.String()), nil }

// Join is one fitted resistor and the two points it joins, the one at the
// higher voltage first (for the NPN stage the collector-rail side, for the
// PNP stage the emitter-rail side).
type Join struct {
	Slot     solver.Slot
	From, To Point
}

// Joins lists the fitted resistors of build b (a position marked 0 Ω is a
// wire and is left out) in the topology's order, each with the points it
// joins as a meter reads them against the build's ground.
func Joins(b solver.Build) []Join {
	st := b.NominalStage()
	point := func(t solver.Terminal) Point {
		switch t {
		case solver.BaseLead:
			return PointBase
		case solver.CollectorLead:
			return PointCollector
		case solver.EmitterLead:
			return PointEmitter
		}
		v, _ := st.RailVoltage_V(t)
		switch {
		case v > 0:
			return PointPlus
		case v < 0:
			return PointMinus
		}
		return PointZero
	}
	var out []Join
	for _, sl := range b.Topology.Slots() {
		if b.Resistors[sl].Nominal_Ohm == 0 {
			continue
		}
		t1, t2, _ := b.Topology.Joins(sl)
		if b.Device.Polarity == solver.PNP {
			t1, t2 = t2, t1
		}
		out = append(out, Join{Slot: sl, From: point(t1), To: point(t2)})
	}
	return out
}
