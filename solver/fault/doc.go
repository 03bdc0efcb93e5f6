// Package fault finds the single faulty part of a bias stage from the DC
// voltages measured on it: the engine behind `biasbin diagnose` and the
// measured-board comparison of a build. It is pure: a stage, a transistor
// datasheet and three readings in, ranked faults out; no I/O, no English.
//
// # The faulty circuit
//
// Each single fault is a change to the stage's network, solved exactly with
// the solver package's transistor model (Ebers–Moll transport, ngspice's
// BJT with no leakage diodes, doc.go of package solver) at the ambient
// temperature, by nodal analysis with Newton's method and SPICE's junction
// limiting, with GMIN (1e-12 S) across each junction as ngspice adds it:
//
//	open      the part is replaced by OpenOhm (1 TΩ)
//	short     the part is replaced by ShortOhm (0.1 Ω)
//	drift     the part's value, fitted within MarkedOhm/MaxDrift..MarkedOhm·MaxDrift
//	be-open   the emitter lead is open inside the case (OpenOhm in series)
//	bc-open   the collector lead is open inside the case (OpenOhm in series)
//	be-short  base and emitter joined by ShortOhm
//	bc-short  base and collector joined by ShortOhm
//	ce-short  collector and emitter joined by ShortOhm
//	leak      a collector-base leakage current, fitted within 100 nA..10 mA
//	low-hfe   the forward beta, fitted within 1..hFE min
//
// A position whose marked value is 0 Ω (an emitter tied to its rail) is a
// wire (WireOhm) and has no faults of its own.
//
// # The meter
//
// A reading is taken with the meter's input resistance (default 10 MΩ, a
// digital multimeter's DC-volts input, common practice) between the probed
// node and ground, one node at a time, so each predicted reading is its own
// solve. This matters where a fault leaves a node floating (an open emitter
// resistor): the meter then reads what it pulls the node to. The meter's
// accuracy is ±(Fraction·|reading| + Offset_V), default ±(1 % + 10 mV).
//
// # The fit
//
// The replacement transistor is not known exactly: its hFE lies anywhere in
// the datasheet range and its VBE(on) within ±VBESpread_V of the datasheet
// figure (default 30 mV, the part-to-part spread of one type, common
// practice). For each fault those two, and the fault's own value where it
// has one (drift, leak, low-hfe), are fitted by least squares of the
// readings' deviations in units of the meter accuracy (Nelder–Mead from a
// coarse grid). The fit reported is the worst of the three readings'
// deviations at that point, in the same units:
//
//	fit = max over VB, VE, VC of |predicted − measured| / (Fraction·|measured| + Offset_V)
//
// so fit ≤ 1 means every predicted reading lies within the meter's accuracy
// of what was read. Faults are ranked by fit (then by the root-mean-square
// deviation, then in the order of the list above). The readings are
// explained when the best fault's fit is at most ExplainLimit (default 1);
// otherwise no single fault explains them (two faults, a wrong resistor
// value in the service notes, a wrong supply or a misread meter remain).
//
// # What to measure next
//
// When two faults fit, NextMeasurement names one out-of-circuit check
// (power off, capacitors discharged, one leg lifted) whose expected result
// differs between the top two: the resistance of a position, a diode test of
// a junction, collector-emitter resistance, the hFE, or the collector-base
// leakage.
package fault
