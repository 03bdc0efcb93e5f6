package solver

// The defaults of the math: every figure the solver assumes when a part,
// a datasheet or the design limits leave a field zero, each with its
// source, and the functions that fill them in. This is the one file of
// them; the stock fills the same figures into a line left blank when it is
// written (store/defaults.go, kept equal by a test in stockparts, since
// the store may not import the solver).

// Transistor datasheet defaults.
const (
	// DefaultVBEOn_V is the VBE(on) assumed when a datasheet gives none
	// (common practice).
	DefaultVBEOn_V = 0.65
	// DefaultVBEAt_A is the test current assumed for VBE(on): small-signal
	// datasheets state VBE(on) at about 1 mA (common practice).
	DefaultVBEAt_A = 1e-3
	// DefaultVBESpread_V is the part-to-part VBE(on) half-range assumed
	// when the stock states none: the top of the usual ±10..30 mV spread
	// across makers and lots of one type at a fixed current and
	// temperature (common practice, from memory; REFERENCE.md §21), so
	// conservative for a bin of mixed lots.
	DefaultVBESpread_V = 0.03
	// DefaultVCESat_V is the VCE(sat) assumed when a datasheet gives none
	// (common practice).
	DefaultVCESat_V = 0.2
	// DefaultTjMax_C is the junction limit of small-signal plastic parts
	// when a datasheet gives none (common practice).
	DefaultTjMax_C = 150.0
)

// Resistor temperature defaults, IEC 60115-1 style (REFERENCE.md §3; from
// memory for the clause): full rating up to the rated ambient, linear
// derating to zero at the upper category temperature.
const (
	// DefaultResistorKnee_C is the rated ambient temperature where
	// derating starts.
	DefaultResistorKnee_C = 70.0
	// DefaultResistorMax_C is the upper category temperature where the
	// allowed dissipation reaches zero.
	DefaultResistorMax_C = 155.0
)

// Limit defaults.
const (
	// DefaultResistorMaxFraction keeps a resistor at or below 50 % of its
	// derated rating (common practice; REFERENCE.md §3).
	DefaultResistorMaxFraction = 0.5
	// DefaultTransistorMaxFraction keeps the transistor at or below 75 %
	// of its derated dissipation (common practice; REFERENCE.md §8).
	DefaultTransistorMaxFraction = 0.75
	// DefaultVCEMargin_V is the headroom above VCE(sat) every corner must
	// keep (common practice).
	DefaultVCEMargin_V = 0.5
	// DefaultVoltageMaxFraction keeps a resistor's voltage at or below 80 %
	// of its limiting element voltage (common practice; REFERENCE.md §3).
	DefaultVoltageMaxFraction = 0.8
)

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

// vbeOnOf returns the nominal VBE(on) magnitude of d: the stated one, else
// the middle of a stated range, else DefaultVBEOn_V.
func vbeOnOf(d Datasheet) float64 {
	switch {
	case d.VBEOn_V > 0:
		return d.VBEOn_V
	case d.VBEMin_V > 0 && d.VBEMax_V > 0:
		return 0.5 * (d.VBEMin_V + d.VBEMax_V)
	}
	return DefaultVBEOn_V
}

// vbeAtOf returns the VBE(on) test current of d or its default.
func vbeAtOf(d Datasheet) float64 {
	if d.VBEAt_A > 0 {
		return d.VBEAt_A
	}
	return DefaultVBEAt_A
}

// vceSatOf returns the datasheet VCE(sat) or its default.
func vceSatOf(d Datasheet) float64 {
	if d.VCESat_V > 0 {
		return d.VCESat_V
	}
	return DefaultVCESat_V
}

// tjMaxOf returns the datasheet TjMax or its default.
func tjMaxOf(d Datasheet) float64 {
	if d.TjMax_C != 0 {
		return d.TjMax_C
	}
	return DefaultTjMax_C
}

// derating returns the resistor's derating knee and zero-power
// temperature, the defaults in place of zeros.
func (r ResistorSpec) derating() (knee_C, max_C float64) {
	knee_C, max_C = r.Knee_C, r.Max_C
	if knee_C == 0 {
		knee_C = DefaultResistorKnee_C
	}
	if max_C == 0 {
		max_C = DefaultResistorMax_C
	}
	return knee_C, max_C
}

// VCESatOrDefault_V returns d's VCE(sat), else DefaultVCESat_V.
func (d Datasheet) VCESatOrDefault_V() float64 { return vceSatOf(d) }

// TjMaxOrDefault_C returns d's Tj max, else DefaultTjMax_C.
func (d Datasheet) TjMaxOrDefault_C() float64 { return tjMaxOf(d) }

// VBEOnOrDefault_V returns the nominal VBE(on) magnitude the solver uses
// for d: the stated one, else the middle of a stated range, else
// DefaultVBEOn_V.
func (d Datasheet) VBEOnOrDefault_V() float64 { return vbeOnOf(d) }

// VBEAtOrDefault_A returns the VBE(on) test current of d, else
// DefaultVBEAt_A.
func (d Datasheet) VBEAtOrDefault_A() float64 { return vbeAtOf(d) }

// Derating returns the resistor's derating knee and zero-power
// temperature, the defaults in place of zeros.
func (r ResistorSpec) Derating() (knee_C, max_C float64) { return r.derating() }
