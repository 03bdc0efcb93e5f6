package solver

import (
	"fmt"
	"math"
)

// handLoop is the base loop of a stage in the hand method's closed form,
// in the mirrored-NPN frame: V = IB·Rb + VBE + IE·Re with IE = IC + IB.
// Divider: V = VTH, Rb = RTH, Re = RE. Split supply: V = |VEE|, Rb = RB,
// Re = RE. Collector feedback: V = VCC, Rb = RF, Re = RC + RE (RC carries
// IE).
type handLoop struct{ v, rb, re float64 }

func loopOf(s Stage, p Polarity) handLoop {
	sg := p.sign()
	r := &s.R_Ohm
	switch s.Topology {
	case Divider:
		sum := r[R1] + r[R2]
		return handLoop{v: s.VCC_V * sg * r[R2] / sum, rb: r[R1] * r[R2] / sum, re: r[RE]}
	case CollectorFeedback:
		return handLoop{v: s.VCC_V * sg, rb: r[RF], re: r[RC] + r[RE]}
	default:
		return handLoop{v: -s.VEE_V * sg, rb: r[RB], re: r[RE]}
	}
}

// ic is the closed-form collector current with leakage,
// IC = [β(V−VBE) + (β+1)(Rb+Re)·ICBO] / [Rb + (β+1)Re].
func (l handLoop) ic(beta, vbe, icbo float64) float64 {
	return (beta*(l.v-vbe) + (beta+1)*(l.rb+l.re)*icbo) / (l.rb + (beta+1)*l.re)
}

func checkHandInput(s Stage, p Polarity, beta, vbe_V, icbo_A float64) error {
	if err := s.Validate(p); err != nil {
		return fmt.Errorf("%v stage: %w", s.Topology, err)
	}
	if !(beta > 0) || math.IsInf(beta, 0) {
		return &InputError{Field: "beta", Problem: fmt.Sprintf("%g: want a finite value > 0", beta)}
	}
	if !finite(vbe_V) || vbe_V < 0 || vbe_V > 1.5 {
		return &InputError{Field: "vbe", Problem: fmt.Sprintf("%g V: want 0..1.5 V", vbe_V)}
	}
	if !finite(icbo_A) || icbo_A < 0 {
		return &InputError{Field: "icbo", Problem: fmt.Sprintf("%g A: want a finite value >= 0", icbo_A)}
	}
	return nil
}

// SolveFixedVBE is the hand method: the transistor as a fixed VBE drop
// (vbe_V, a magnitude, e.g. 0.7 V) with IC = β·IB + (β+1)·ICBO, solved in
// closed form (REFERENCE formulas for the three stages). It assumes the
// forward-active region; when that fails the Region says so
// (Cutoff: the loop cannot forward-bias the junction, all currents 0;
// Saturation: the linear result would need VCE ≤ 0, and its numbers are
// the hand method's, not the circuit's). Tj_C is left 0.
func SolveFixedVBE(s Stage, p Polarity, beta, vbe_V, icbo_A float64) (OperatingPoint, error) {
	if err := checkHandInput(s, p, beta, vbe_V, icbo_A); err != nil {
		return OperatingPoint{}, fmt.Errorf("fixed-VBE solve: %w", err)
	}
	sg := p.sign()
	l := loopOf(s, p)
	ck := reduce(s, sg)
	ic := l.ic(beta, vbe_V, icbo_A)
	ib := (ic - (beta+1)*icbo_A) / beta
	region := Active
	if l.v-vbe_V <= 0 {
		ib, ic, region = 0, 0, Cutoff
	}
	vb := ck.b0 + ck.bb*ib + ck.bc*ic
	vc := ck.c0 + ck.cb*ib + ck.cc*ic
	ve := ck.e0 + ck.eb*ib + ck.ec*ic
	if region == Active && vc-ve <= 0 {
		region = Saturation
	}
	op := ck.assemble(s, ib, ic, vb, vc, ve, sg)
	op.Region = region
	if !op.finite() {
		return OperatingPoint{}, fmt.Errorf("fixed-VBE solve: result not finite: %w", ErrNoConvergence)
	}
	return op, nil
}

// StabilityClosedForm returns the textbook stability factors of s for a
// transistor of polarity p with dc current gain beta, a fixed VBE (vbe_V,
// magnitude) and leakage icbo_A, from the closed form
// IC = [β(V−VBE) + (β+1)(Rb+Re)·ICBO] / [Rb + (β+1)Re]:
//
//	S_I = ∂IC/∂ICBO = (β+1)(Rb+Re) / (Rb + (β+1)Re)
//	S_V = ∂IC/∂VBE  = −β / (Rb + (β+1)Re)
//	S_β = ∂IC/∂β    = (Rb+Re)(V − VBE + Rb·ICBO) / (Rb + (β+1)Re)²
//
// (the stability factors of Millman & Halkias, Integrated Electronics,
// ch. 9 and Boylestad & Nashelsky §4.12 with R_B → Rb, from memory). Rb,
// Re and V per topology: divider R_TH, RE, V_TH; collector feedback RF,
// RC+RE, VCC; split supply RB, RE, |VEE|. BetaSpread is left 0.
func StabilityClosedForm(s Stage, p Polarity, beta, vbe_V, icbo_A float64) (Sensitivity, error) {
	if err := checkHandInput(s, p, beta, vbe_V, icbo_A); err != nil {
		return Sensitivity{}, fmt.Errorf("closed-form stability: %w", err)
	}
	l := loopOf(s, p)
	den := l.rb + (beta+1)*l.re
	return Sensitivity{
		SI:      (beta + 1) * (l.rb + l.re) / den,
		SV_S:    -beta / den,
		SBeta_A: (l.rb + l.re) * (l.v - vbe_V + l.rb*icbo_A) / (den * den),
	}, nil
}
