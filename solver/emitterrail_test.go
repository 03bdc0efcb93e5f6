package solver_test

import (
	"math"
	"testing"

	"biasbin/solver"
)

// splitBuild is a split-supply stage on +12 V / −12 V (RB 10K, RC 5K6,
// RE 11K) with 1 % resistors and a fixed-hFE transistor.
func splitBuild(vccTol, veeTol float64) solver.Build {
	b := solver.Build{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, VCCTol: vccTol, VEETol: veeTol,
		AmbientMin_C: 25, AmbientMax_C: 25, NominalAmbient_C: 25,
		Device: solver.Datasheet{Label: "QX", Polarity: solver.NPN, HFEMin: 150, HFEMax: 150, VBEOn_V: 0.65, VBEAt_A: 1e-3,
			VBEMin_V: 0.65, VBEMax_V: 0.65, VCESat_V: 0.2}}
	for sl, ohm := range map[solver.Slot]float64{solver.RB: 10e3, solver.RC: 5.6e3, solver.RE: 11e3} {
		b.Resistors[sl] = solver.ResistorSpec{Nominal_Ohm: ohm, Tol: 0.01}
	}
	return b
}

// TestEmitterRailOwnTolerance: the emitter rail of a split supply is a
// supply of its own. The worst case has an axis for each rail (every
// combination of VCC ± its tolerance and VEE ± its own), the RSS a "vee"
// term whose sensitivity is the closed form's, ∂IE/∂VEE = 1/(RE +
// RB/(β+1)) (REFERENCE.md §6 [D], β = IC/IB of the midpoint), and a looser
// emitter rail widens the IC band and lowers the yield in a tight window.
func TestEmitterRailOwnTolerance(t *testing.T) {
	tight, loose := splitBuild(0.05, 0.01), splitBuild(0.05, 0.10)
	if n, m := solver.CornerCount(tight), solver.CornerCount(splitBuild(0, 0)); n != 4*m {
		t.Errorf("%d corners with both rails toleranced, %d with none: want 4 times (one axis per rail)", n, m)
	}
	wc, err := solver.EvalWorstCase(loose, solver.Limits{})
	if err != nil {
		t.Fatal(err)
	}
	rails := map[[2]float64]bool{}
	for _, c := range wc.Corners {
		rails[[2]float64{math.Round(c.VCC_V*1e3) / 1e3, math.Round(c.VEE_V*1e3) / 1e3}] = true
	}
	for _, want := range [][2]float64{{11.4, -10.8}, {11.4, -13.2}, {12.6, -10.8}, {12.6, -13.2}} {
		if !rails[want] {
			t.Errorf("no corner with VCC %g V and VEE %g V (corners hold %v)", want[0], want[1], rails)
		}
	}
	// IC follows VEE: the highest IC comes with VEE at −13.2 V, the lowest
	// with −10.8 V.
	if wc.ICMaxAt.VEE_V > -13.19 || wc.ICMinAt.VEE_V < -10.81 {
		t.Errorf("IC extremes at VEE %g and %g V, want -13.2 and -10.8 V", wc.ICMaxAt.VEE_V, wc.ICMinAt.VEE_V)
	}
	wcTight, err := solver.EvalWorstCase(tight, solver.Limits{})
	if err != nil {
		t.Fatal(err)
	}
	if wc.ICMax_A-wc.ICMin_A < 5*(wcTight.ICMax_A-wcTight.ICMin_A) {
		t.Errorf("IC band %g..%g A with VEE ±10 %%, %g..%g A with ±1 %%: want at least five times as wide",
			wc.ICMin_A, wc.ICMax_A, wcTight.ICMin_A, wcTight.ICMax_A)
	}

	r, err := solver.EvalRSS(loose)
	if err != nil {
		t.Fatal(err)
	}
	var vee *solver.RSSTerm
	for i := range r.N {
		if r.Terms[i].Input == "vee" {
			vee = &r.Terms[i]
		}
	}
	if vee == nil || math.Abs(vee.HalfWidth-1.2) > 1e-9 {
		t.Fatalf("RSS terms %+v: want a vee term of half-width 1.2 V", r.Terms[:r.N])
	}
	op, _, err := solver.Nominal(loose)
	if err != nil {
		t.Fatal(err)
	}
	beta := op.IC_A / op.IB_A
	want := beta / (beta + 1) / (11e3 + 10e3/(beta+1)) // ∂IC/∂VEE = α·∂IE/∂VEE
	if math.Abs(vee.DIC/want-1) > 0.02 {
		t.Errorf("∂IC/∂VEE = %g A/V, closed form %g A/V (REFERENCE.md §6): off by more than 2 %%", vee.DIC, want)
	}

	w := solver.Window{ICMin_A: op.IC_A * 0.97, ICMax_A: op.IC_A * 1.03, VCEMin_V: 0, VCEMax_V: 30}
	yt, err := solver.EvalYieldSeeded(tight, w, 2000, 1, solver.YieldOptions{})
	if err != nil {
		t.Fatal(err)
	}
	yl, err := solver.EvalYieldSeeded(loose, w, 2000, 1, solver.YieldOptions{})
	if err != nil {
		t.Fatal(err)
	}
	// VEE ±1 % moves IC about ±1.1 %: nearly every board stays within
	// ±3 %; at ±10 % only some 3/11 of the VEE draws do.
	if yt.Yield < 0.95 || yl.Yield > 0.45 {
		t.Errorf("yield %.3f with VEE ±1 %%, %.3f with ±10 %%: want above 0.95 and below 0.45", yt.Yield, yl.Yield)
	}
}
