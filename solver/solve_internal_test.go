package solver

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// TestCurrentsJacobian checks the analytic partial derivatives Newton uses
// against central finite differences of the currents.
func TestCurrentsJacobian(t *testing.T) {
	m := Model{Polarity: NPN, IS_A: 2e-14, BF: 150, BR: 2, NF: 1.1, VAF_V: 60, XTI: 3, XTB: 1.5, EG_eV: 1.11, TNOM_C: 25, ICBO_A: 1e-9}
	d := m.at(40)
	const h = 1e-7
	for _, x := range [][2]float64{{0.65, -5}, {0.7, 0.6}, {0.2, -0.1}, {-1, 0.65}, {0.75, 0.72}} {
		ib, ic, gbb, gbc, gcb, gcc := d.currents(x[0], x[1])
		ibP, icP, _, _, _, _ := d.currents(x[0]+h, x[1])
		ibM, icM, _, _, _, _ := d.currents(x[0]-h, x[1])
		ibQ, icQ, _, _, _, _ := d.currents(x[0], x[1]+h)
		ibN, icN, _, _, _, _ := d.currents(x[0], x[1]-h)
		for _, c := range []struct {
			name      string
			analytic  float64
			fd, scale float64
		}{
			{"dIB/dVBE", gbb, (ibP - ibM) / (2 * h), math.Abs(ib)},
			{"dIB/dVBC", gbc, (ibQ - ibN) / (2 * h), math.Abs(ib)},
			{"dIC/dVBE", gcb, (icP - icM) / (2 * h), math.Abs(ic)},
			{"dIC/dVBC", gcc, (icQ - icN) / (2 * h), math.Abs(ic)},
		} {
			if diff := math.Abs(c.analytic - c.fd); diff > 1e-6*math.Abs(c.fd)+1e-9*c.scale/d.vt+1e-18 {
				t.Errorf("at %v: %s analytic %.9g, finite difference %.9g", x, c.name, c.analytic, c.fd)
			}
		}
	}
}

// randomStage draws a stage and model over wide ranges (log-uniform
// resistances 10 Ω..10 MΩ, supplies 0.2..200 V, IS 1e-18..1e-10 A, BF
// 5..2000, Tj −55..200 °C).
func randomStage(rng *rand.Rand) (Stage, Model, float64) {
	logU := func(lo, hi float64) float64 { return lo * math.Pow(hi/lo, rng.Float64()) }
	s := Stage{Topology: Topology(1 + rng.IntN(3)), VCC_V: logU(0.2, 200)}
	for sl := range NumSlots {
		s.R_Ohm[sl] = logU(10, 10e6)
	}
	if rng.IntN(4) == 0 {
		s.R_Ohm[RE] = 0
	}
	if rng.IntN(6) == 0 && s.Topology != CollectorFeedback {
		s.R_Ohm[RC] = 0
	}
	if s.Topology == SplitSupply {
		s.VEE_V = -logU(0.1, 100)
		if rng.IntN(4) == 0 {
			s.R_Ohm[RB] = 0
		}
		if s.R_Ohm[RB] == 0 && s.R_Ohm[RE] == 0 {
			s.R_Ohm[RE] = 100
		}
	}
	m := Model{Polarity: NPN, IS_A: logU(1e-18, 1e-10), BF: logU(5, 2000), BR: logU(0.1, 10), NF: 1 + rng.Float64(),
		XTI: 3, XTB: 1.5, EG_eV: 1.11, TNOM_C: 25}
	if rng.IntN(2) == 0 {
		m.VAF_V = logU(5, 500)
	}
	if rng.IntN(3) == 0 {
		m.ICBO_A = logU(1e-12, 1e-6)
	}
	if rng.IntN(2) == 0 {
		m.Polarity = PNP
		s.VCC_V, s.VEE_V = -s.VCC_V, -s.VEE_V
	}
	return s, m, -55 + 255*rng.Float64()
}

// TestSolveRandomStages: over many random stages the solver always
// converges, never returns NaN or Inf, and its result satisfies the device
// equations at the junction voltages implied by its own node voltages
// (KCL and KVL hold by construction of the reduction).
func TestSolveRandomStages(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 7))
	regions := map[Region]int{}
	const n = 20000
	for i := range n {
		s, m, tj := randomStage(rng)
		if err := checkSolveInput(s, m, tj); err != nil {
			t.Fatalf("#%d: generator made bad input: %v", i, err)
		}
		var x [2]float64
		op, err := solveChecked(s, m, tj, &x)
		if err != nil {
			t.Fatalf("#%d %+v %+v at %g °C: %v", i, s, m, tj, err)
		}
		if !op.finite() {
			t.Fatalf("#%d: non-finite result %+v", i, op)
		}
		regions[op.Region]++
		// The loop equations hold at the solution: the junction voltages
		// implied by the node voltages (which the reduction computes from
		// the device currents at x) are x itself, to 1e-8 V per volt of
		// supply, plus the rounding of the junction injections (IC in deep
		// saturation is a small difference of two large injections)
		// carried through the stage's resistance.
		sg := m.Polarity.sign()
		vbe, vbc := sg*(op.VB_V-op.VE_V), sg*(op.VB_V-op.VC_V)
		d := m.at(tj)
		inj := d.is * (math.Exp(x[0]/d.nvt) + math.Exp(x[1]/d.vt))
		rsum := 0.0
		for _, r := range s.R_Ohm {
			rsum += r
		}
		tol := 1e-8*(1+math.Abs(s.VCC_V)+math.Abs(s.VEE_V)) + 1e-14*inj*rsum
		if math.Abs(vbe-x[0]) > tol || math.Abs(vbc-x[1]) > tol {
			t.Fatalf("#%d: loop residual: VBE %.12g vs %.12g, VBC %.12g vs %.12g", i, vbe, x[0], vbc, x[1])
		}
	}
	t.Logf("%d random stages: %v", n, regions)
	for _, r := range []Region{Active, Saturation, Cutoff} {
		if regions[r] == 0 {
			t.Errorf("no random stage landed in %v", r)
		}
	}
}

// TestSourceSteppingAgreesWithNewton exercises the fallback path: the
// continuation must land on the same solution as the direct iteration.
func TestSourceSteppingAgreesWithNewton(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 13))
	for i := range 500 {
		s, m, tj := randomStage(rng)
		ck := reduce(s, m.Polarity.sign())
		d := m.at(tj)
		direct := ck.initialGuess(&d)
		if _, _, ok := ck.newton(&d, &direct, 1); !ok {
			t.Fatalf("#%d: direct Newton failed", i)
		}
		var stepped [2]float64
		if _, _, ok := ck.sourceStepping(&d, &stepped); !ok {
			t.Fatalf("#%d: source stepping failed", i)
		}
		for k := range 2 {
			if math.Abs(direct[k]-stepped[k]) > 1e-8 {
				t.Fatalf("#%d: direct %v, source stepping %v", i, direct, stepped)
			}
		}
	}
}

// TestNoConvergenceIsAnError drives the iteration with a model that
// cannot converge (IS = NaN slips past validation only inside the
// package): the result is an error wrapping ErrNoConvergence and a zero
// OperatingPoint, never NaN.
func TestNoConvergenceIsAnError(t *testing.T) {
	s := Stage{Topology: Divider, VCC_V: 15, R_Ohm: [NumSlots]float64{R1: 10e3, R2: 5e3, RC: 1e3, RE: 1e3}}
	for _, m := range []Model{
		{Polarity: NPN, IS_A: math.NaN(), BF: 100, BR: 1, NF: 1, XTI: 3, EG_eV: 1.11, TNOM_C: 25},
		{Polarity: PNP, IS_A: 1e-14, BF: 100, BR: 1, NF: math.NaN(), XTI: 3, EG_eV: 1.11, TNOM_C: 25},
	} {
		ss := s
		ss.VCC_V *= m.Polarity.sign()
		op, err := solveChecked(ss, m, 25, nil)
		if !errors.Is(err, ErrNoConvergence) {
			t.Errorf("%+v: err = %v, want ErrNoConvergence", m, err)
		}
		if op != (OperatingPoint{}) {
			t.Errorf("%+v: returned %+v with the error", m, op)
		}
	}
}
