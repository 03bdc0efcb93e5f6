package picker

import (
	"math"

	"biasbin/solver"
)

// Arrangements of a resistor position.
const (
	Single   = "single"
	Series   = "series"
	Parallel = "parallel"
)

// minPairShare is the smallest share the lesser part of a pair must
// contribute to the pair's value: a pair within 1 % of its dominant part
// adds nothing a single part would not give, so it is not formed.
const minPairShare = 0.01

// partSpec is the solver view of one stocked line, its derating defaults
// filled in.
func partSpec(r Resistor) solver.ResistorSpec {
	knee, top := derating(r)
	return solver.ResistorSpec{
		Nominal_Ohm: r.Ohm,
		Tol:         r.Tol,
		TCR_PPMPerK: r.TCR_PPMPerK,
		Rated_W:     r.Rated_W,
		Knee_C:      knee,
		Max_C:       top,
		LEV_V:       levOf(r),
	}
}

// levOf is the line's limiting element voltage with the default by power
// rating filled in (0 = not checked).
func levOf(r Resistor) float64 {
	return solver.ResistorSpec{Rated_W: r.Rated_W, LEV_V: r.LEV_V}.LimitingVoltage_V()
}

// derating is the line's derating knee and zero-power temperature, the
// solver's defaults in place of zeros.
func derating(r Resistor) (knee_C, max_C float64) {
	return solver.ResistorSpec{Knee_C: r.Knee_C, Max_C: r.Max_C}.Derating()
}

// seriesSpec is the pair a+b in series treated as one part.
//
// Tolerance: each part lies within Ri(1±ti), so the sum lies within
// (Ra+Rb) ± (Ra·ta + Rb·tb): the worst-case tolerance is the R-weighted
// mean (Ra·ta + Rb·tb)/(Ra+Rb).
//
// TCR: Ra(1+αaΔT) + Rb(1+αbΔT) = (Ra+Rb)(1 + αΔT) with
// α = (Ra·αa + Rb·αb)/(Ra+Rb), exact for first-order TCR.
//
// Rating: one current I flows in both, part i dissipates I²·Ri, so the
// pair may carry I² = min(Pa/Ra, Pb/Rb) and its rating is that times
// Ra+Rb. The derating curve is the pessimistic one of the two (lower knee,
// lower zero-power temperature), which is below both parts' curves at
// every ambient.
//
// Limiting voltage: part i carries V·Ri/(Ra+Rb) of the pair's voltage V,
// so the pair may see min(Ua·(Ra+Rb)/Ra, Ub·(Ra+Rb)/Rb); 0 (not checked)
// when either part has none.
func seriesSpec(a, b Resistor) solver.ResistorSpec {
	r := a.Ohm + b.Ohm
	s := solver.ResistorSpec{
		Nominal_Ohm: r,
		Tol:         (a.Ohm*a.Tol + b.Ohm*b.Tol) / r,
		TCR_PPMPerK: (a.Ohm*a.TCR_PPMPerK + b.Ohm*b.TCR_PPMPerK) / r,
	}
	ka, ma := derating(a)
	kb, mb := derating(b)
	s.Knee_C, s.Max_C = math.Min(ka, kb), math.Min(ma, mb)
	if a.Rated_W > 0 && b.Rated_W > 0 {
		s.Rated_W = math.Min(a.Rated_W/a.Ohm, b.Rated_W/b.Ohm) * r
	}
	if ua, ub := levOf(a), levOf(b); ua > 0 && ub > 0 {
		s.LEV_V = math.Min(ua*r/a.Ohm, ub*r/b.Ohm)
	}
	return s
}

// parallelSpec is the pair a‖b treated as one part.
//
// Tolerance: R = RaRb/(Ra+Rb) rises with each part, so its extremes are at
// both parts high or both low:
// R± = Ra(1±ta)·Rb(1±tb)/(Ra(1±ta)+Rb(1±tb)); the tolerance is the larger
// of |R±/R − 1| (equal to t when ta = tb = t).
//
// TCR: the conductances add, G(T) = Ga/(1+αaΔT) + Gb/(1+αbΔT); to first
// order R(T) = R(1 + αΔT) with α = (αa/Ra + αb/Rb)/(1/Ra + 1/Rb), the
// conductance-weighted mean.
//
// Rating: one voltage V across both, part i dissipates V²/Ri, so the pair
// may see V² = min(Pa·Ra, Pb·Rb) and its rating is that over R. The same
// voltage is across both, so the pair's limiting voltage is the lower one.
func parallelSpec(a, b Resistor) solver.ResistorSpec {
	r := a.Ohm * b.Ohm / (a.Ohm + b.Ohm)
	par := func(x, y float64) float64 { return x * y / (x + y) }
	hi := par(a.Ohm*(1+a.Tol), b.Ohm*(1+b.Tol))/r - 1
	lo := 1 - par(a.Ohm*(1-a.Tol), b.Ohm*(1-b.Tol))/r
	ga, gb := 1/a.Ohm, 1/b.Ohm
	s := solver.ResistorSpec{
		Nominal_Ohm: r,
		Tol:         math.Max(hi, lo),
		TCR_PPMPerK: (ga*a.TCR_PPMPerK + gb*b.TCR_PPMPerK) / (ga + gb),
	}
	ka, ma := derating(a)
	kb, mb := derating(b)
	s.Knee_C, s.Max_C = math.Min(ka, kb), math.Min(ma, mb)
	if a.Rated_W > 0 && b.Rated_W > 0 {
		s.Rated_W = math.Min(a.Rated_W*a.Ohm, b.Rated_W*b.Ohm) / r
	}
	if ua, ub := levOf(a), levOf(b); ua > 0 && ub > 0 {
		s.LEV_V = math.Min(ua, ub)
	}
	return s
}

// pairWorthwhile reports whether the lesser part of a pair carries at
// least minPairShare of its value (series: lo/(lo+hi) of the voltage;
// parallel: lo/(lo+hi) of the current flows in the larger part).
func pairWorthwhile(a, b Resistor) bool {
	lo, hi := math.Min(a.Ohm, b.Ohm), math.Max(a.Ohm, b.Ohm)
	return lo/(lo+hi) >= minPairShare
}
