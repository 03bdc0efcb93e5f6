package solver_test

import (
	"math"
	"testing"

	"biasbin/solver"
)

// TestStabilityClosedFormReference checks S_I against the check values of
// REFERENCE.md §5 (beta = 50; scenario from memory as Boylestad &
// Nashelsky §4.12, values [D]): S_I = (β+1)(1+RB/RE)/((β+1)+RB/RE).
func TestStabilityClosedFormReference(t *testing.T) {
	for _, c := range []struct {
		rbOverRE, wantSI float64
	}{
		{250, 42.53}, // source: REFERENCE.md §5 table, R_B/R_E = 250
		{10, 9.20},   // source: REFERENCE.md §5 table, R_B/R_E = 10
		{0.01, 1.01}, // source: REFERENCE.md §5 table, R_B/R_E = 0.01
	} {
		s := stage(solver.SplitSupply, 10, -10, R{solver.RB: c.rbOverRE * 1e3, solver.RC: 2e3, solver.RE: 1e3})
		got, err := solver.StabilityClosedForm(s, solver.NPN, 50, 0.7, 0)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got.SI-c.wantSI) > 0.005 {
			t.Errorf("RB/RE = %g: S_I = %.4f, want %.2f", c.rbOverRE, got.SI, c.wantSI)
		}
	}
}

var stabilityStages = []struct {
	name string
	s    solver.Stage
}{
	{"divider (Hambley Ex. 12.7 circuit)", stage(solver.Divider, 15, 0, R{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3})},
	{"divider, high R_TH", stage(solver.Divider, 22, 0, R{solver.R1: 39e3, solver.R2: 3.9e3, solver.RC: 10e3, solver.RE: 1.5e3})},
	{"collector feedback", stage(solver.CollectorFeedback, 10, 0, R{solver.RF: 250e3, solver.RC: 4.7e3, solver.RE: 1.2e3})},
	{"collector feedback, RE = 0", stage(solver.CollectorFeedback, 12, 0, R{solver.RF: 100e3, solver.RC: 2.2e3})},
	{"split supply", stage(solver.SplitSupply, 15, -15, R{solver.RB: 47e3, solver.RC: 10e3, solver.RE: 20e3})},
}

// TestStabilityClosedFormDerivatives checks the closed-form factors
// against central finite differences of the closed-form collector current
// (the hand method, SolveFixedVBE) in ICBO, VBE and beta.
func TestStabilityClosedFormDerivatives(t *testing.T) {
	const beta, vbe, icbo = 120.0, 0.68, 20e-9
	for _, c := range stabilityStages {
		for _, pol := range []solver.Polarity{solver.NPN, solver.PNP} {
			s := c.s
			if pol == solver.PNP {
				s, _ = mirror(s, solver.Model{})
			}
			sens, err := solver.StabilityClosedForm(s, pol, beta, vbe, icbo)
			if err != nil {
				t.Fatal(err)
			}
			ic := func(b, v, l float64) float64 {
				op, err := solver.SolveFixedVBE(s, pol, b, v, l)
				if err != nil {
					t.Fatal(err)
				}
				return op.IC_A
			}
			fd := []struct {
				name         string
				closed, numd float64
			}{
				{"S_I", sens.SI, (ic(beta, vbe, icbo+1e-9) - ic(beta, vbe, icbo-1e-9)) / 2e-9},
				{"S_V", sens.SV_S, (ic(beta, vbe+1e-5, icbo) - ic(beta, vbe-1e-5, icbo)) / 2e-5},
				{"S_beta", sens.SBeta_A, (ic(beta+1e-3, vbe, icbo) - ic(beta-1e-3, vbe, icbo)) / 2e-3},
			}
			for _, f := range fd {
				if math.Abs(f.closed/f.numd-1) > 1e-6 {
					t.Errorf("%s %v: %s closed form %.8g, finite difference %.8g", c.name, pol, f.name, f.closed, f.numd)
				}
			}
		}
	}
}

// TestStabilityNumericAgreesWithClosedForm holds the finite-difference
// factors of the exact solver against the textbook closed forms (Millman &
// Halkias ch. 9, Boylestad & Nashelsky §4.12, from memory; REFERENCE.md
// §5–6) evaluated with the exact point's beta, VBE and ICBO. The closed
// form holds VBE fixed, while the exact junction adds its dynamic
// resistance NF·VT/IC to the loop, i.e. β·NF·VT/IC beside
// Rb + (β+1)Re in the denominator [D]; the stated tolerance is that
// relative term plus 0.2 %.
func TestStabilityNumericAgreesWithClosedForm(t *testing.T) {
	for _, c := range stabilityStages {
		for _, tj := range []float64{-20, 25, 85} {
			m := npnModel(2e-14, 150, 0, 5e-9)
			for _, pol := range []solver.Polarity{solver.NPN, solver.PNP} {
				s := c.s
				if pol == solver.PNP {
					s, m = mirror(s, m)
				}
				op, err := solver.Solve(s, m, tj)
				if err != nil {
					t.Fatal(err)
				}
				if op.Region != solver.Active {
					t.Fatalf("%s: region %v", c.name, op.Region)
				}
				_, bfT, _, leak := m.At(tj)
				closed, err := solver.StabilityClosedForm(s, pol, bfT, op.VBE_V, leak)
				if err != nil {
					t.Fatal(err)
				}
				num, err := solver.StabilityNumeric(s, m, tj)
				if err != nil {
					t.Fatal(err)
				}
				// Relative size of the junction's dynamic resistance term.
				den := -bfT / closed.SV_S // Rb + (β+1)Re
				tol := bfT*m.NF*solver.ThermalVoltage_V(tj)/(op.IC_A-leak)/den + 2e-3
				for _, f := range []struct {
					name       string
					num, close float64
				}{{"S_I", num.SI, closed.SI}, {"S_V", num.SV_S, closed.SV_S}, {"S_beta", num.SBeta_A, closed.SBeta_A}} {
					if rel := math.Abs(f.num/f.close - 1); rel > tol {
						t.Errorf("%s %v %g °C: %s numeric %.6g, closed form %.6g (%.3f %% apart, tolerance %.3f %%)",
							c.name, pol, tj, f.name, f.num, f.close, 100*rel, 100*tol)
					}
				}
			}
		}
	}
}

// TestBetaFiniteChange: the finite-change form of the beta stability
// factor, exact when ICBO = 0 (REFERENCE.md §5 [D]):
// ΔIC/IC1 = Δβ·S_I(β2)/(β1(1+β2)). For Hambley's Example 12.7 circuit
// (β 100 → 300) that is the 2.85 % the printed answers show (4.12 → 4.24
// mA, source: Hambley, Electrical Engineering: Principles & Applications,
// Example 12.7).
func TestBetaFiniteChange(t *testing.T) {
	for _, c := range stabilityStages {
		for _, pair := range [][2]float64{{100, 300}, {50, 150}, {200, 220}} {
			b1, b2 := pair[0], pair[1]
			op1, err := solver.SolveFixedVBE(c.s, solver.NPN, b1, 0.7, 0)
			if err != nil {
				t.Fatal(err)
			}
			op2, err := solver.SolveFixedVBE(c.s, solver.NPN, b2, 0.7, 0)
			if err != nil {
				t.Fatal(err)
			}
			s2, err := solver.StabilityClosedForm(c.s, solver.NPN, b2, 0.7, 0)
			if err != nil {
				t.Fatal(err)
			}
			want := (b2 - b1) * s2.SI / (b1 * (1 + b2))
			if got := op2.IC_A/op1.IC_A - 1; math.Abs(got-want) > 1e-9 {
				t.Errorf("%s β %g→%g: ΔIC/IC = %.8f, finite-change form %.8f", c.name, b1, b2, got, want)
			}
			if c.name == stabilityStages[0].name && b1 == 100 && b2 == 300 && math.Abs(want-(4.24/4.12-1)) > 0.003 {
				t.Errorf("Hambley Ex. 12.7: finite-change form %.4f, printed answers give %.4f", want, 4.24/4.12-1)
			}
		}
	}
}
