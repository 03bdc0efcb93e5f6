package solver

// Limiting element voltage (LEV, U_max): the highest voltage that may be
// applied continuously across a resistor element whatever its resistance
// (IEC 60115-1 term; REFERENCE.md §16). The voltage a resistor may carry
// is the lower of the LEV and its rated voltage √(P₇₀·R); the power check
// already holds the second, so only the LEV is checked on its own.

// Default limiting element voltages by power rating, for a line that
// states none (common practice, the lowest figure of the usual packages of
// each rating, REFERENCE.md §16): 0402 and 0603 chips (up to 0.1 W) 50 V,
// 0805 chips (0.125 W) 150 V, 1206 chips (0.25 W) 200 V; axial ¼ W parts
// are 250–300 V, so 200 V is also the conservative figure for ¼ W and up
// (from memory above ¼ W: 2010 and 2512 chips 200 V).
const (
	// DefaultLEVSmall_V is the default for ratings up to 0.1 W.
	DefaultLEVSmall_V = 50.0
	// DefaultLEVEighth_V is the default for ratings above 0.1 W up to 0.125 W.
	DefaultLEVEighth_V = 150.0
	// DefaultLEVLarge_V is the default for ratings above 0.125 W.
	DefaultLEVLarge_V = 200.0
)

// DefaultLEV_V returns the limiting element voltage assumed for a resistor
// rated ratedW that states none, and 0 for an unrated part (nothing to
// check against).
func DefaultLEV_V(ratedW float64) float64 {
	switch {
	case !(ratedW > 0):
		return 0
	case ratedW <= 0.1*(1+1e-9):
		return DefaultLEVSmall_V
	case ratedW <= 0.125*(1+1e-9):
		return DefaultLEVEighth_V
	}
	return DefaultLEVLarge_V
}

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
