package solver

// Limiting element voltage (LEV, U_max): the highest voltage that may be
// applied continuously across a resistor element whatever its resistance
// (IEC 60115-1 term; REFERENCE.md §16). The voltage a resistor may carry
// is the lower of the LEV and its rated voltage √(P₇₀·R); the power check
// already holds the second, so only the LEV is checked on its own.

// LimitingVoltage_V returns the resistor's limiting element voltage: its
// own LEV_V, else DefaultLEV_V of its rating; 0 means not checked.
func (r ResistorSpec) LimitingVoltage_V() float64 {
	if r.LEV_V > 0 {
		return r.LEV_V
	}
	return DefaultLEV_V(r.Rated_W)
}

// LEVDefaulted reports whether the resistor's limiting voltage is the
// default by power rating rather than a figure the stock line states.
func (r ResistorSpec) LEVDefaulted() bool { return !(r.LEV_V > 0) && r.Rated_W > 0 }
