package solver

import (
	"fmt"
	"math"
)

// Finite-difference steps of StabilityNumeric.
const (
	fdVBEStep_V  = 1e-4 // VBE shift at constant current (central difference)
	fdBetaRel    = 1e-4 // relative change of BF (central difference)
	fdLeakRelIC  = 1e-5 // leakage step as a share of IC (one-sided, second order)
	fdLeakMin_A  = 1e-12
	fdMinIC_Unit = 1e-9
)

// StabilityNumeric returns the stability factors of s with transistor m at
// junction temperature tj_C by finite differences of the exact solver,
// for every topology and region:
//
//	S_I: ∂IC/∂ICBO(T), second-order one-sided difference (ICBO ≥ 0);
//	S_V: ∂IC/∂VBE, VBE shifted by ±0.1 mV at constant current (IS scaled
//	     by exp(∓δ/(NF·VT)));
//	S_β: ∂IC/∂β with β = BF(T), BF changed by ±0.01 %.
//
// They differ from StabilityClosedForm by the junction's own dynamic
// resistance (the closed form holds VBE fixed); see the tests.
// BetaSpread is left 0.
func StabilityNumeric(s Stage, m Model, tj_C float64) (Sensitivity, error) {
	if err := checkSolveInput(s, m, tj_C); err != nil {
		return Sensitivity{}, fmt.Errorf("numeric stability: %w", err)
	}
	ic := func(mm Model) (float64, error) {
		op, err := solveChecked(s, mm, tj_C, nil)
		if err != nil {
			return 0, fmt.Errorf("numeric stability: %w", err)
		}
		return op.IC_A, nil
	}
	central := func(mp, mn Model) (float64, error) {
		ip, err := ic(mp)
		if err != nil {
			return 0, err
		}
		in, err := ic(mn)
		return ip - in, err
	}
	ic0, err := ic(m)
	if err != nil {
		return Sensitivity{}, err
	}
	var out Sensitivity

	// S_I: leakage at tj raised by h and 2h.
	h := math.Max(fdLeakMin_A, fdLeakRelIC*math.Max(math.Abs(ic0), fdMinIC_Unit))
	scale := math.Exp2((tj_C - m.TNOM_C) / 10)
	m1, m2 := m, m
	m1.ICBO_A += h / scale
	m2.ICBO_A += 2 * h / scale
	d1, err := central(m1, m)
	if err != nil {
		return Sensitivity{}, err
	}
	d2, err := central(m2, m)
	if err != nil {
		return Sensitivity{}, err
	}
	out.SI = (4*d1 - d2) / (2 * h) // (−3f0 + 4f1 − f2)/(2h)

	// S_V: VBE at constant current shifted by ±δ.
	nvt := m.NF * thermalVoltage(tj_C)
	mp, mn := m, m
	mp.IS_A *= math.Exp(-fdVBEStep_V / nvt)
	mn.IS_A *= math.Exp(fdVBEStep_V / nvt)
	d, err := central(mp, mn)
	if err != nil {
		return Sensitivity{}, err
	}
	out.SV_S = d / (2 * fdVBEStep_V)

	// S_β: BF(T) changed by ±ε·BF(T).
	_, bfT, _, _ := m.At(tj_C)
	mp, mn = m, m
	mp.BF *= 1 + fdBetaRel
	mn.BF *= 1 - fdBetaRel
	if d, err = central(mp, mn); err != nil {
		return Sensitivity{}, err
	}
	out.SBeta_A = d / (2 * fdBetaRel * bfT)
	return out, nil
}
