package solver

import (
	"fmt"
	"math"
)

// Newton iteration settings.
const (
	newtonMaxIter = 150
	// newtonTol_V is the junction-voltage step below which an unlimited
	// Newton step counts as converged; the junction currents are then
	// consistent to about newtonTol_V/VT ≈ 4e-9 relative (quadratic
	// convergence makes the real error far smaller).
	newtonTol_V = 1e-10
	// newtonResRel bounds the loop-equation residual, relative to the
	// size of the terms summed, at the point a converged step starts
	// from: with large loop resistances a tiny step can still leave a
	// visible residual, and one more step removes it quadratically.
	newtonResRel = 1e-10
	// ulpFloor is a few float64 ulps (relative): the residual a junction
	// voltage rounded to its last bit leaves.
	ulpFloor = 8 * 0x1p-52
	// regionOn_A is the diode current at which a junction counts as
	// conducting (see doc.go, "Regions").
	regionOn_A = 100e-9
	// regionSatRatio: saturation once the base-collector injection reaches
	// this share of the base-emitter injection.
	regionSatRatio = 0.01
	// expArgMax caps exponent arguments; beyond it the exponential is
	// continued linearly (never reached at a converged point).
	expArgMax = 200.0
)

// Solve returns the exact DC operating point of s with the transistor m at
// device temperature tj_C (no self-heating).
//
// The stage is reduced by hand to two unknowns, the junction voltages VBE
// and VBC of the mirrored NPN circuit, and solved by Newton's method with
// SPICE's junction-voltage limiting; when that fails a source-stepping
// continuation takes over. Errors: *InputError for bad input, an error
// wrapping ErrNoConvergence when no solution is found. The result never
// holds NaN or Inf.
func Solve(s Stage, m Model, tj_C float64) (OperatingPoint, error) {
	if err := checkSolveInput(s, m, tj_C); err != nil {
		return OperatingPoint{}, err
	}
	return solveChecked(s, m, tj_C, nil)
}

func checkSolveInput(s Stage, m Model, tj_C float64) error {
	if err := m.Validate(); err != nil {
		return fmt.Errorf("solve: model: %w", err)
	}
	if err := s.Validate(m.Polarity); err != nil {
		return fmt.Errorf("solve: %v stage: %w", s.Topology, err)
	}
	if !finite(tj_C) || tj_C < MinTemp_C || tj_C > MaxTj_C {
		return fmt.Errorf("solve: %w", &InputError{Field: "tj", Problem: fmt.Sprintf("%g °C is outside %g..%g °C", tj_C, MinTemp_C, MaxTj_C)})
	}
	return nil
}

// solveChecked solves validated input; guess, when not nil, holds a
// starting (VBE, VBC) and receives the solution's junction voltages.
func solveChecked(s Stage, m Model, tj_C float64, guess *[2]float64) (OperatingPoint, error) {
	sg := m.Polarity.sign()
	ck := reduce(s, sg)
	d := m.at(tj_C)
	x, ib, ic, ok := ck.junctions(&d, guess)
	if !ok {
		return OperatingPoint{}, errNoConvergence(s, m.Polarity, tj_C)
	}
	return ck.point(s, &d, x, ib, ic, sg, m.Polarity, tj_C)
}

// junctions solves the junction voltages (VBE, VBC) of ck with device d by
// Newton's method: from guess when it is not nil and not zero, else (or
// when that fails) from the hand estimate, and by source stepping when
// both fail. It returns them with the terminal currents IB and IC there;
// guess, when not nil, receives the solution.
func (ck *circuit) junctions(d *device, guess *[2]float64) (x [2]float64, ib, ic float64, ok bool) {
	if guess != nil && (guess[0] != 0 || guess[1] != 0) {
		x = *guess
		ib, ic, ok = ck.newton(d, &x, 1)
	}
	if !ok {
		x = ck.initialGuess(d)
		ib, ic, ok = ck.newton(d, &x, 1)
	}
	if !ok {
		ib, ic, ok = ck.sourceStepping(d, &x)
	}
	if ok && guess != nil {
		*guess = x
	}
	return x, ib, ic, ok
}

// point fills the result at the converged junction voltages x, where the
// terminal currents are ib and ic, and checks that it is finite.
func (ck *circuit) point(s Stage, d *device, x [2]float64, ib, ic, sg float64, pol Polarity, tj_C float64) (OperatingPoint, error) {
	op := ck.operatingPoint(s, d, x, ib, ic, sg)
	op.Tj_C = tj_C
	if !op.finite() {
		return OperatingPoint{}, fmt.Errorf("solve %v %v stage at %g °C: result not finite: %w", pol, s.Topology, tj_C, ErrNoConvergence)
	}
	return op, nil
}

// errNoConvergence is the error of a solve that found no solution.
func errNoConvergence(s Stage, pol Polarity, tj_C float64) error {
	return fmt.Errorf("solve %v %v stage at %g °C: %w", pol, s.Topology, tj_C, ErrNoConvergence)
}

// circuit is a stage reduced to the mirrored-NPN frame: each node voltage
// is affine in the terminal currents, V = v0 + vb·IB + vc·IC.
type circuit struct {
	b0, bb, bc float64 // base node
	c0, cb, cc float64 // collector node
	e0, eb, ec float64 // emitter node
}

// reduce writes the node voltages of s as affine functions of the base and
// collector terminal currents (Thevenin form of the divider).
func reduce(s Stage, sg float64) circuit {
	vcc := s.VCC_V * sg
	r := &s.R_Ohm
	var ck circuit
	switch s.Topology {
	case Divider:
		sum := r[R1] + r[R2]
		ck.b0 = vcc * r[R2] / sum
		ck.bb = -r[R1] * r[R2] / sum
		ck.c0, ck.cc = vcc, -r[RC]
		ck.eb, ck.ec = r[RE], r[RE]
	case CollectorFeedback:
		ck.c0, ck.cb, ck.cc = vcc, -r[RC], -r[RC]
		ck.b0, ck.bb, ck.bc = vcc, -r[RC]-r[RF], -r[RC]
		ck.eb, ck.ec = r[RE], r[RE]
	case SplitSupply:
		ck.bb = -r[RB]
		ck.c0, ck.cc = vcc, -r[RC]
		ck.e0, ck.eb, ck.ec = s.VEE_V*sg, r[RE], r[RE]
	}
	return ck
}

// currents evaluates the transport model (mirrored NPN) at junction
// voltages vbe, vbc: terminal currents and their partial derivatives.
// It is the ngspice Gummel–Poon load with IKF, ISE, ISC and VAR at their
// defaults: IC = (Ibe−Ibc)·(1−VBC/VAF) − Ibc/BR, IB = Ibe/BF + Ibc/BR.
func (d *device) currents(vbe, vbc float64) (ib, ic, dibdbe, dibdbc, dicdbe, dicdbc float64) {
	ebe, gbe := expJunction(vbe / d.nvt)
	ebc, gbc := expJunction(vbc / d.vt)
	ibe := d.is * (ebe - 1)
	ibc := d.is * (ebc - 1)
	gbe *= d.is / d.nvt
	gbc *= d.is / d.vt
	qf := 1 - vbc*d.invVAF
	ic = (ibe-ibc)*qf - ibc/d.br + d.ileak
	ib = ibe/d.bf + ibc/d.br - d.ileak
	dicdbe = gbe * qf
	dicdbc = -gbc*qf - (ibe-ibc)*d.invVAF - gbc/d.br
	dibdbe = gbe / d.bf
	dibdbc = gbc / d.br
	return
}

// expNegligible is the exponent below which a junction's exp(a) is taken
// as 0: exp(−40) ≈ 4e-18 is below half an ulp of 1, so the injection
// IS·(exp(a) − 1) rounds to −IS either way, and the conductance left out,
// under 4e-18·IS/VT, vanishes in the rounding of every Newton quantity it
// enters (where it stands alone it only scales a step far below
// newtonTol_V).
const expNegligible = -40.0

// expJunction is expLin for a junction's injection: 0, 0 for a reverse
// bias below expNegligible (the common case of the base-collector junction
// in the active region), saving the exponential.
func expJunction(a float64) (e, de float64) {
	if a < expNegligible {
		return 0, 0
	}
	return expLin(a)
}

// expm1Junction is exp(a) − 1 for the region test, capped at expArgMax;
// below expNegligible it is −1, which is what exp(a) − 1 rounds to there.
func expm1Junction(a float64) float64 {
	if a < expNegligible {
		return -1
	}
	return math.Expm1(min(a, expArgMax))
}

// expLin returns exp(a) and its derivative, continued linearly above
// expArgMax so that no step can overflow.
func expLin(a float64) (e, de float64) {
	if a <= expArgMax {
		e = math.Exp(a)
		return e, e
	}
	e0 := math.Exp(expArgMax)
	return e0 * (1 + a - expArgMax), e0
}

// newton runs the damped Newton iteration from x with the sources scaled
// by lambda; it reports whether it converged, leaving the solution in x
// and returning the terminal currents there: those at the point the
// converged step starts from, carried along the step to first order (the
// step is under newtonTol_V, so what is left, of the order of
// (step/VT)², is far below a float64 ulp of the currents).
func (ck *circuit) newton(d *device, x *[2]float64, lambda float64) (ib, ic float64, ok bool) {
	a0 := lambda * (ck.b0 - ck.e0)
	ab, ac := ck.bb-ck.eb, ck.bc-ck.ec
	b0 := lambda * (ck.b0 - ck.c0)
	bb, bc := ck.bb-ck.cb, ck.bc-ck.cc
	dd := d
	if lambda != 1 {
		scaled := *d
		scaled.ileak = d.ileak * lambda
		dd = &scaled
	}
	critBE, critBC := d.critBE, d.critBC
	vbe, vbc := x[0], x[1]
	for it := 0; it < newtonMaxIter; it++ {
		var gbb, gbc, gcb, gcc float64
		ib, ic, gbb, gbc, gcb, gcc = dd.currents(vbe, vbc)
		f1 := a0 + ab*ib + ac*ic - vbe
		f2 := b0 + bb*ib + bc*ic - vbc
		j11 := ab*gbb + ac*gcb - 1
		j12 := ab*gbc + ac*gcc
		j21 := bb*gbb + bc*gcb
		j22 := bb*gbc + bc*gcc - 1
		det := j11*j22 - j12*j21
		if det == 0 || math.IsNaN(det) || math.IsInf(det, 0) {
			return 0, 0, false
		}
		dbe := (-f1*j22 + f2*j12) / det
		dbc := (-f2*j11 + f1*j21) / det
		nbe, limBE := pnjlim(vbe+dbe, vbe, d.nvt, critBE)
		nbc, limBC := pnjlim(vbc+dbc, vbc, d.vt, critBC)
		if math.IsNaN(nbe) || math.IsNaN(nbc) {
			return 0, 0, false
		}
		stepBE, stepBC := math.Abs(nbe-vbe), math.Abs(nbc-vbc)
		if limBE || limBC || stepBE > newtonTol_V || stepBC > newtonTol_V {
			vbe, vbc = nbe, nbc
			continue
		}
		stepIB := gbb*(nbe-vbe) + gbc*(nbc-vbc)
		stepIC := gcb*(nbe-vbe) + gcc*(nbc-vbc)
		// Residual floor: what one ulp of each junction voltage moves f by.
		ulpBE, ulpBC := ulpFloor*max(1, math.Abs(vbe)), ulpFloor*max(1, math.Abs(vbc))
		if math.Abs(f1) <= newtonResRel*(1+math.Abs(a0)+math.Abs(ab*ib)+math.Abs(ac*ic))+math.Abs(j11)*ulpBE+math.Abs(j12)*ulpBC &&
			math.Abs(f2) <= newtonResRel*(1+math.Abs(b0)+math.Abs(bb*ib)+math.Abs(bc*ic))+math.Abs(j21)*ulpBE+math.Abs(j22)*ulpBC {
			x[0], x[1] = nbe, nbc
			return ib + stepIB, ic + stepIC, true
		}
		vbe, vbc = nbe, nbc
	}
	return 0, 0, false
}

// pnjlim is SPICE's junction-voltage limiting (ngspice devsup.c
// DEVpnjlim): a forward step above vcrit larger than 2·vt is replaced by a
// logarithmic one, and large reverse steps are capped.
func pnjlim(vnew, vold, vt, vcrit float64) (float64, bool) {
	if vnew > vcrit && math.Abs(vnew-vold) > vt+vt {
		if vold > 0 {
			arg := 1 + (vnew-vold)/vt
			if arg > 0 {
				return vold + vt*math.Log(arg), true
			}
			return vcrit, true
		}
		return vt * math.Log(vnew/vt), true
	}
	if vnew < 0 {
		var arg float64
		if vold > 0 {
			arg = -vold - 1
		} else {
			arg = 2*vold - 1
		}
		if vnew < arg {
			return arg, true
		}
	}
	return vnew, false
}

// initialGuess estimates the junction voltages from the forward-active
// hand solution (IC = BF·IB) with VBE from the model at that current, so
// that Newton usually needs only a few steps.
func (ck *circuit) initialGuess(d *device) [2]float64 {
	a0, ab, ac := ck.b0-ck.e0, ck.bb-ck.eb, ck.bc-ck.ec
	b0, bb, bc := ck.b0-ck.c0, ck.bb-ck.cb, ck.bc-ck.cc
	crit := d.critBE
	den := ab + ac*d.bf
	if !(den < 0) {
		return [2]float64{crit, 0}
	}
	vbe := min(crit, d.nvt*math.Log(1e-3/d.is))
	var ib, ic float64
	for range 2 {
		ib = (vbe - a0) / den
		if ib <= 0 {
			// Cut off: the junctions see the open-circuit voltages.
			return [2]float64{min(a0, crit), min(b0, crit)}
		}
		ic = d.bf * ib
		vbe = d.nvt * math.Log1p(ic/d.is)
	}
	vbc := b0 + bb*ib + bc*ic
	if vbc > vbe-0.1 {
		vbc = vbe - 0.1
	}
	return [2]float64{vbe, vbc}
}

// sourceStepping ramps every source from zero to its value, solving at
// each step from the previous solution; the step shrinks on failure. It
// returns the terminal currents at the solution (the last step's, at the
// full sources).
func (ck *circuit) sourceStepping(d *device, x *[2]float64) (ib, ic float64, ok bool) {
	cur := [2]float64{0, 0}
	lambda, step := 0.0, 0.1
	for lambda < 1 {
		next := min(1, lambda+step)
		try := cur
		if b, c, ok := ck.newton(d, &try, next); ok {
			cur, lambda, ib, ic = try, next, b, c
			step = min(0.5, step*2)
			continue
		}
		step /= 4
		if step < 1e-6 {
			return 0, 0, false
		}
	}
	*x = cur
	return ib, ic, true
}

// operatingPoint fills the result from converged junction voltages x and
// the terminal currents there.
func (ck *circuit) operatingPoint(s Stage, d *device, x [2]float64, ib, ic, sg float64) OperatingPoint {
	vb, vc, ve := ck.nodes(ib, ic)
	op := ck.assemble(s, ib, ic, vb, vc, ve, sg)
	op.Region = d.region(x[0], x[1])
	return op
}

// nodes returns the node voltages (mirrored-NPN frame) at terminal
// currents ib, ic.
func (ck *circuit) nodes(ib, ic float64) (vb, vc, ve float64) {
	vb = ck.b0 + ck.bb*ib + ck.bc*ic
	vc = ck.c0 + ck.cb*ib + ck.cc*ic
	ve = ck.e0 + ck.eb*ib + ck.ec*ic
	return vb, vc, ve
}

// transistorPower is the transistor's dissipation VCE·IC + VBE·IB at node
// voltages vb, vc, ve and terminal currents ib, ic (mirrored-NPN frame).
func transistorPower(ib, ic, vb, vc, ve float64) float64 {
	return (vc-ve)*ic + (vb-ve)*ib
}

// assemble fills an OperatingPoint from the terminal currents and node
// voltages of the mirrored-NPN frame; the node voltages leave it against
// the stage's ground.
func (ck *circuit) assemble(s Stage, ib, ic, vb, vc, ve, sg float64) OperatingPoint {
	op := OperatingPoint{
		IB_A:  ib,
		IC_A:  ic,
		IE_A:  ib + ic,
		VB_V:  s.Ground.Meter(vb*sg, s.VCC_V),
		VC_V:  s.Ground.Meter(vc*sg, s.VCC_V),
		VE_V:  s.Ground.Meter(ve*sg, s.VCC_V),
		VCE_V: vc - ve,
		VBE_V: vb - ve,
	}
	r := &s.R_Ohm
	vcc := s.VCC_V * sg
	across := func(sl Slot, v float64) {
		if r[sl] <= 0 {
			return
		}
		op.P_W[sl] = v * v / r[sl]
		op.V_V[sl] = math.Abs(v)
	}
	switch s.Topology {
	case Divider:
		across(R1, vcc-vb)
		across(R2, vb)
		across(RC, vcc-vc)
		across(RE, ve)
		op.IDivider_A = vb / r[R2]
	case CollectorFeedback:
		across(RF, vc-vb)
		across(RC, vcc-vc)
		across(RE, ve)
	case SplitSupply:
		across(RB, vb)
		across(RC, vcc-vc)
		across(RE, ve-ck.e0)
		if r[RB] > 0 {
			op.IDivider_A = -vb / r[RB]
		} else {
			op.IDivider_A = ib
		}
	}
	op.PTransistor_W = transistorPower(ib, ic, vb, vc, ve)
	return op
}

// region names the operating region from the junction biases: a junction
// conducts once its ideal diode current reaches regionOn_A, and the stage
// is saturated once the base-collector injection reaches regionSatRatio of
// the base-emitter injection (see doc.go).
func (d *device) region(vbe, vbc float64) Region {
	fwd := d.is * expm1Junction(vbe/d.nvt)
	rev := d.is * expm1Junction(vbc/d.vt)
	switch {
	case fwd < regionOn_A && rev < regionOn_A:
		return Cutoff
	case fwd >= regionOn_A && rev < regionSatRatio*fwd:
		return Active
	case rev >= regionOn_A && fwd < regionSatRatio*rev:
		return ReverseActive
	}
	return Saturation
}

func (op *OperatingPoint) finite() bool {
	vals := []float64{op.IB_A, op.IC_A, op.IE_A, op.VB_V, op.VC_V, op.VE_V, op.VCE_V, op.VBE_V,
		op.IDivider_A, op.PTransistor_W, op.Tj_C}
	for _, v := range vals {
		if !finite(v) {
			return false
		}
	}
	for _, v := range op.P_W {
		if !finite(v) {
			return false
		}
	}
	return true
}
