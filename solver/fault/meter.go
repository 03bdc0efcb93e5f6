package fault

import (
	"fmt"
	"math"

	"biasbin/solver"
)

// Meter defaults (doc.go, "The meter").
const (
	// DefaultFraction is the meter's accuracy as a fraction of the reading.
	DefaultFraction = 0.01
	// DefaultOffset_V is the meter's accuracy floor in volts.
	DefaultOffset_V = 0.010
	// DefaultInput_Ohm is a digital multimeter's DC-volts input resistance
	// (common practice).
	DefaultInput_Ohm = 10e6
)

// Meter is the voltmeter the readings were taken with. The zero value of
// each field means its default; a negative or non-finite field is an
// error.
type Meter struct {
	Fraction  float64 // accuracy, fraction of the reading; 0 = 0.01
	Offset_V  float64 // accuracy floor; 0 = 10 mV
	Input_Ohm float64 // input resistance; 0 = 10 MΩ
}

// WithDefaults returns m with each zero field set to its default.
func (m Meter) WithDefaults() Meter {
	if m.Fraction == 0 {
		m.Fraction = DefaultFraction
	}
	if m.Offset_V == 0 {
		m.Offset_V = DefaultOffset_V
	}
	if m.Input_Ohm == 0 {
		m.Input_Ohm = DefaultInput_Ohm
	}
	return m
}

// Validate reports the first bad field of m as a *solver.InputError.
func (m Meter) Validate() error {
	for _, c := range []struct {
		field string
		v     float64
		hi    float64
	}{{"meter_fraction", m.Fraction, 0.5}, {"meter_offset", m.Offset_V, 10}, {"meter_input", m.Input_Ohm, math.Inf(1)}} {
		if math.IsNaN(c.v) || c.v < 0 || c.v > c.hi || math.IsInf(c.v, 0) {
			return &solver.InputError{Field: c.field, Problem: fmt.Sprintf("%g: want 0 (default) up to %g", c.v, c.hi)}
		}
	}
	if m.Input_Ohm != 0 && m.Input_Ohm < 1e3 {
		return &solver.InputError{Field: "meter_input", Problem: fmt.Sprintf("%g ohm: a voltmeter's input is at least 1 kohm", m.Input_Ohm)}
	}
	return nil
}

// Accuracy_V is the meter's accuracy at reading v: Fraction·|v| + Offset_V.
func (m Meter) Accuracy_V(v float64) float64 { return m.Fraction*math.Abs(v) + m.Offset_V }

// Readings are the three node voltages measured to the stage's ground
// (solver.Stage.Ground), signed as the meter shows them.
type Readings struct {
	VB_V, VE_V, VC_V float64
}

// names of the readings as the user gives them.
var readingNames = [3]string{"vb", "ve", "vc"}

func (r Readings) values() [3]float64 { return [3]float64{r.VB_V, r.VE_V, r.VC_V} }

// ReadingError reports a reading that cannot come from the stated circuit.
// Reading is "vb", "ve" or "vc" (or two joined by "/" when they disagree
// with each other); Problem says why, with the numbers.
type ReadingError struct {
	Reading string
	Problem string
	// OtherGround, when not nil, is the ground of a single-supply PNP
	// stage between whose rails every reading does lie: the readings were
	// most likely taken on the stage built the other way round (on a
	// positive supply when stated negative, or the reverse).
	OtherGround *solver.Ground
}

func (e *ReadingError) Error() string { return e.Reading + ": " + e.Problem }

// CheckRails reports a reading that lies outside the stage's rails by more
// than the meter's accuracy: no fault of a passive network can put a node
// beyond its supplies. mt must have its defaults applied.
func CheckRails(s solver.Stage, r Readings, mt Meter) error {
	i, v, lo, hi, acc := outsideRails(s, r, mt)
	switch {
	case i < 0:
		return nil
	case math.IsNaN(v) || math.IsInf(v, 0):
		return &ReadingError{Reading: readingNames[i], Problem: "not a finite number"}
	}
	e := &ReadingError{Reading: readingNames[i], Problem: fmt.Sprintf("%g V lies outside the supply rails %g..%g V by more than the meter accuracy (±%.3g V); check the supply, the ground reference and the meter leads", v, lo, hi, acc)}
	if s.Topology != solver.SplitSupply && s.VCC_V < 0 { // a PNP stage: built either way round
		other := s
		other.Ground = solver.CollectorRailGround
		if s.Ground == solver.CollectorRailGround {
			other.Ground = solver.EmitterRailGround
		}
		if j, _, _, _, _ := outsideRails(other, r, mt); j < 0 {
			e.OtherGround = &other.Ground
		}
	}
	return e
}

// outsideRails returns the index of the first reading that is not finite
// or lies outside the rails of s (read against its ground) by more than
// the meter's accuracy, with the reading, the rails and the accuracy; -1
// when none does.
func outsideRails(s solver.Stage, r Readings, mt Meter) (int, float64, float64, float64, float64) {
	top, bottom := s.Ground.Meter(s.VCC_V, s.VCC_V), s.Ground.Meter(0, s.VCC_V)
	lo, hi := min(top, bottom), max(top, bottom)
	if s.Topology == solver.SplitSupply {
		lo, hi = min(lo, s.VEE_V), max(hi, s.VEE_V)
	}
	for i, v := range r.values() {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return i, v, lo, hi, 0
		}
		if acc := mt.Accuracy_V(v); v > hi+acc || v < lo-acc {
			return i, v, lo, hi, acc
		}
	}
	return -1, 0, lo, hi, 0
}
