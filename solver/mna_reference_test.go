package solver_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"biasbin/solver"
)

// mnaSolve is an independent reference: nodal analysis of the stage with
// the node voltages VB, VC, VE as unknowns, KCL residuals, the Ebers–Moll
// equations written directly for either polarity, and damped Newton steps
// solved with gonum's LU. It shares nothing with the solver but the
// temperature-scaled parameters from Model.At.
//
// It returns the node voltages and the forward-referenced IC.
func mnaSolve(t *testing.T, s solver.Stage, m solver.Model, tj float64) (v [3]float64, ic float64) {
	t.Helper()
	const b, c, e = 0, 1, 2
	type res struct {
		n1    int     // node index, or -1 for a fixed node
		fixed float64 // voltage of the fixed far end
		n2    int
		r     float64
	}
	r := s.R_Ohm
	var rs []res
	switch s.Topology {
	case solver.Divider:
		rs = []res{{b, s.VCC_V, -1, r[solver.R1]}, {b, 0, -1, r[solver.R2]}, {c, s.VCC_V, -1, r[solver.RC]}, {e, 0, -1, r[solver.RE]}}
	case solver.CollectorFeedback:
		rs = []res{{c, 0, b, r[solver.RF]}, {c, s.VCC_V, -1, r[solver.RC]}, {e, 0, -1, r[solver.RE]}}
	case solver.SplitSupply:
		rs = []res{{b, 0, -1, r[solver.RB]}, {c, s.VCC_V, -1, r[solver.RC]}, {e, s.VEE_V, -1, r[solver.RE]}}
	}
	is, bf, br, leak := m.At(tj)
	vt := m.NF * solver.ThermalVoltage_V(tj)
	vtr := solver.ThermalVoltage_V(tj)
	p := 1.0 // the device equations in forward-referenced junction voltages
	if m.Polarity == solver.PNP {
		p = -1
	}
	invVAF := 0.0
	if m.VAF_V > 0 {
		invVAF = 1 / m.VAF_V
	}
	// Terminal currents into B and C (signed, physical) and their
	// derivatives in VB, VC, VE.
	device := func(x [3]float64) (ib, icc float64, dib, dic [3]float64) {
		ube, ubc := p*(x[b]-x[e]), p*(x[b]-x[c])
		ebe, ebc := math.Exp(ube/vt), math.Exp(ubc/vtr)
		ibe, ibc := is*(ebe-1), is*(ebc-1)
		q := 1 - ubc*invVAF
		fc := (ibe-ibc)*q - ibc/br + leak
		fb := ibe/bf + ibc/br - leak
		gbe, gbc := is*ebe/vt, is*ebc/vtr
		dfcBE, dfcBC := gbe*q, -gbc*q-(ibe-ibc)*invVAF-gbc/br
		dfbBE, dfbBC := gbe/bf, gbc/br
		// ube = p(VB−VE), ubc = p(VB−VC); physical current = p·f.
		chain := func(dBE, dBC float64) [3]float64 {
			return [3]float64{p * p * (dBE + dBC), -p * p * dBC, -p * p * dBE}
		}
		return p * fb, p * fc, chain(dfbBE, dfbBC), chain(dfcBE, dfcBC)
	}
	var x [3]float64 // all nodes at ground: both junctions at 0 V
	J := mat.NewDense(3, 3, nil)
	F := mat.NewVecDense(3, nil)
	var dx mat.VecDense
	for it := 0; it < 5000; it++ {
		J.Zero()
		F.Zero()
		for _, rr := range rs {
			g := 1 / rr.r
			far := rr.fixed
			if rr.n2 >= 0 {
				far = x[rr.n2]
				J.Set(rr.n1, rr.n2, J.At(rr.n1, rr.n2)-g)
				J.Set(rr.n2, rr.n1, J.At(rr.n2, rr.n1)-g)
				J.Set(rr.n2, rr.n2, J.At(rr.n2, rr.n2)+g)
				F.SetVec(rr.n2, F.AtVec(rr.n2)+(far-x[rr.n1])*g)
			}
			J.Set(rr.n1, rr.n1, J.At(rr.n1, rr.n1)+g)
			F.SetVec(rr.n1, F.AtVec(rr.n1)+(x[rr.n1]-far)*g)
		}
		ib, icc, dib, dic := device(x)
		F.SetVec(b, F.AtVec(b)+ib)
		F.SetVec(c, F.AtVec(c)+icc)
		F.SetVec(e, F.AtVec(e)-ib-icc)
		for k := range 3 {
			J.Set(b, k, J.At(b, k)+dib[k])
			J.Set(c, k, J.At(c, k)+dic[k])
			J.Set(e, k, J.At(e, k)-dib[k]-dic[k])
		}
		if err := dx.SolveVec(J, F); err != nil {
			t.Fatalf("reference solve: %v", err)
		}
		// Damping: no junction voltage moves by more than 50 mV a step.
		dbe := math.Abs(dx.AtVec(b) - dx.AtVec(e))
		dbc := math.Abs(dx.AtVec(b) - dx.AtVec(c))
		scale := math.Min(1, 0.05/math.Max(1e-300, math.Max(dbe, dbc)))
		step := 0.0
		for k := range 3 {
			x[k] -= scale * dx.AtVec(k)
			step = math.Max(step, math.Abs(scale*dx.AtVec(k)))
		}
		if scale == 1 && step < 1e-13*(1+math.Abs(s.VCC_V)) {
			_, icc, _, _ = device(x)
			return x, p * icc
		}
	}
	t.Fatalf("reference solve did not converge for %+v", s)
	return
}

// TestSolveAgainstNodalReference compares Solve with the independent
// nodal solution above on seeded random stages of every topology and both
// polarities (node voltages within 1e-9 V per volt of supply, IC within
// 1e-7 relative or 1 fA).
func TestSolveAgainstNodalReference(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 19))
	logU := func(lo, hi float64) float64 { return lo * math.Pow(hi/lo, rng.Float64()) }
	for i := range 300 {
		top := solver.Topology(1 + i%3)
		r := R{}
		for _, sl := range top.Slots() {
			r[sl] = logU(50, 2e6)
		}
		vee := 0.0
		if top == solver.SplitSupply {
			vee = -logU(0.5, 30)
		}
		s := stage(top, logU(1, 50), vee, r)
		m := npnModel(logU(1e-16, 1e-12), logU(20, 800), 0, 0)
		if i%2 == 0 {
			m.VAF_V = logU(10, 300)
		}
		if i%5 == 0 {
			m.ICBO_A = logU(1e-11, 1e-7)
		}
		if i%4 >= 2 {
			s, m = mirror(s, m)
		}
		tj := -40 + 165*rng.Float64()
		op, err := solver.Solve(s, m, tj)
		if err != nil {
			t.Fatalf("#%d: %v", i, err)
		}
		x, ic := mnaSolve(t, s, m, tj)
		tolV := 1e-9 * (1 + math.Abs(s.VCC_V) + math.Abs(s.VEE_V))
		for k, got := range []float64{op.VB_V, op.VC_V, op.VE_V} {
			if math.Abs(got-x[k]) > tolV {
				t.Errorf("#%d %v %v %v: node %d = %.12g V, nodal reference %.12g V", i, top, m.Polarity, op.Region, k, got, x[k])
			}
		}
		if math.Abs(op.IC_A-ic) > 1e-7*math.Abs(ic)+1e-15 {
			t.Errorf("#%d %v %v %v: IC = %.10g A, nodal reference %.10g A", i, top, m.Polarity, op.Region, op.IC_A, ic)
		}
	}
}
