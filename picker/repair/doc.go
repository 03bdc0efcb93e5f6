// Package repair holds the repair-bench jobs of biasbin's application
// layer, beside package job and in its style: a front end builds a
// request, calls one function, and renders the typed result (figures,
// kinds and stock lines, never English).
//
//	Substitute(SubstituteRequest) → *Substitution: the original stage's
//	    Q-point (inferred from a working twin's voltages, or solved from
//	    the original transistor's ranges), every stocked transistor of the
//	    same polarity ranked by how well it keeps that Q-point, and for the
//	    best substitutes, when none stays within the IC tolerance, the one
//	    resistor change that re-centres the stage.
//	Diagnose(DiagnoseRequest) → *Diagnosis: the single faults that explain
//	    the voltages measured on a faulty unit (package solver/fault, the
//	    engine a build's measured-board comparison uses too).
//
// Both carry the bench cautions (Caution): a unit on the bench may hold
// mains or charged capacitors, measure with the supply as the service
// notes say, follow local codes and licensed practice.
//
// # Inferring the original Q-point
//
// From VB, VE and VC measured on a working twin (signed, to ground), in the
// stage's mirrored-NPN frame (package solver, doc.go):
//
//	IC from RC = (VCC − VC)/RC, less the feedback current (VC − VB)/RF in
//	             collector feedback (RC carries IC + IB there)
//	IE from RE = (VE − V_emitter rail)/RE,  IC from RE = IE − IB
//	IB         = (VCC − VB)/R1 − VB/R2 (divider), (VC − VB)/RF (feedback),
//	             −VB/RB (split supply), held within 0..IE/(1 + hFE min)
//
// Each estimate carries its worst-case bounds from the meter accuracy
// (fault.Meter) on every reading, the supply tolerance and the resistors'
// tolerances. The readings are consistent when the two intervals overlap;
// the IC inferred is the two central values weighted by the inverse square
// of their half-widths, and VCE = VC − VE. Before that, readings a working
// stage cannot give are refused (fault.ReadingError): a node outside the
// rails, VE above VB (NPN; below for PNP), or VB − VE beyond a silicon
// junction (MaxVBE_V).
package repair
