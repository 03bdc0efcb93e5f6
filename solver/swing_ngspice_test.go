package solver_test

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"biasbin/solver"
	"biasbin/solver/spicecheck"
)

// TestACLoadLineUnbypassedRE holds the AC load line of a stage whose RE is
// only partly bypassed (REFERENCE.md §19's stage: 12 V, 47k/10k, RC 2.2k,
// RE1 220 Ω unbypassed + RE2 820 Ω bypassed, 4.7k load) against ngspice.
// source: ngspice (Debian package), run by the test: the AC load line is
// the locus the Q-point moves along when the base drive moves and the
// capacitors hold their DC voltages. ngspice solves the stage with each
// capacitor replaced by a source holding its voltage at the Q-point (the
// coupling capacitor to RL, the bypass capacitor across RE2) for a base
// drive of ±20 mV; the slope −ΔVCE/ΔIC is the collector's AC resistance,
// which must be RC‖RL + RE1 as EvalSwing has it (REFERENCE.md §19, from
// memory: the standard treatment of the swamped stage; the base current
// through RE1 moves it by RE1/β, 0.13 %), and the line through the
// Q-point must reach VCE = EvalSwing's vce(cutoff) at IC = 0.
func TestACLoadLineUnbypassedRE(t *testing.T) {
	spicecheck.Require(t)
	s := stage(solver.Divider, 12, 0, map[solver.Slot]float64{solver.R1: 47e3, solver.R2: 10e3, solver.RC: 2.2e3, solver.RE: 1040})
	s.RBypass_Ohm, s.RL_Ohm = 820, 4.7e3
	m := npnModel(1e-14, 100, 0, 0)
	op, err := solver.Solve(s, m, 25)
	if err != nil {
		t.Fatal(err)
	}
	sw := solver.EvalSwing(s, op, 0.2)

	card := ""
	for line := range strings.Lines(solver.Netlist(s, m, 25, "ac load line")) {
		if strings.HasPrefix(line, ".model") {
			card = line
		}
	}
	if card == "" {
		t.Fatal("no .model card in the netlist")
	}
	const opts = ".options tnom=25 temp=25 reltol=1e-9 vntol=1e-12 abstol=1e-18\n"
	// The stage at DC: the Q-point's collector and RE2 voltages.
	dc := "* stage at DC\nvcc vcc 0 dc 12\nr1 vcc n 47k\nr2 n 0 10k\nvd n b dc 0\nrc vcc c 2.2k\nq1 c b e " +
		modelName(card) + "\nre1 e e2 220\nre2 e2 0 820\n" + card + opts + ".end\n"
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	defer cancel()
	q, err := spicecheck.Run(ctx, []spicecheck.Job{{Deck: dc, Vectors: []string{"v(c)", "v(e)", "v(e2)", "@q1[ic]"}}})
	if err != nil {
		t.Fatal(err)
	}
	vcq, veq, ve2q, icq := q[0]["v(c)"], q[0]["v(e)"], q[0]["v(e2)"], q[0]["@q1[ic]"]
	if math.Abs(icq/op.IC_A-1) > 1e-4 || math.Abs((vcq-veq)/op.VCE_V-1) > 1e-4 {
		t.Fatalf("Q-point: ngspice IC %g A, VCE %g V; EvalSwing's from Solve %g A, %g V", icq, vcq-veq, op.IC_A, op.VCE_V)
	}
	// The AC circuit at a moved base drive: the coupling capacitor holds
	// VC(Q) between the collector and RL, the bypass capacitor holds
	// VE2(Q) across RE2.
	var jobs []spicecheck.Job
	for _, d := range []float64{-0.02, 0.02} {
		jobs = append(jobs, spicecheck.Job{Deck: fmt.Sprintf("* AC equivalent, drive %g V\nvcc vcc 0 dc 12\nr1 vcc n 47k\nr2 n 0 10k\nvd n b dc %g\nrc vcc c 2.2k\nq1 c b e %s\nre1 e e2 220\nre2 e2 0 820\nvbyp e2 0 dc %.12g\nvcoup c l dc %.12g\nrl l 0 4.7k\n%s%s.end\n",
			d, d, modelName(card), ve2q, vcq, card, opts), Vectors: []string{"v(c)", "v(e)", "@q1[ic]"}})
	}
	got, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	vce := func(i int) float64 { return got[i]["v(c)"] - got[i]["v(e)"] }
	dIC := got[1]["@q1[ic]"] - got[0]["@q1[ic]"]
	if math.Abs(dIC) < 0.05*icq {
		t.Fatalf("fixture: the drive moved IC by only %g A", dIC)
	}
	rac := -(vce(1) - vce(0)) / dIC
	t.Logf("AC resistance: ngspice %.3f Ω, EvalSwing %.3f Ω; vce(cut) EvalSwing %.4f V", rac, sw.RAC_Ohm, sw.VCECutAC_V)
	if math.Abs(rac/sw.RAC_Ohm-1) > 0.005 {
		t.Errorf("AC resistance: ngspice %.2f Ω, EvalSwing %.2f Ω (RC‖RL + RE1)", rac, sw.RAC_Ohm)
	}
	if cut := (vcq - veq) + icq*rac; math.Abs(cut/sw.VCECutAC_V-1) > 0.005 {
		t.Errorf("vce(cutoff): ngspice's line reaches %.4f V at IC = 0, EvalSwing %.4f V", cut, sw.VCECutAC_V)
	}
	// The bypass really is partial: the fully bypassed RE would give
	// RC‖RL alone, 1498.55 Ω, which the test must tell apart.
	if math.Abs(rac-1498.551) < 100 {
		t.Errorf("AC resistance %.2f Ω is that of a fully bypassed RE", rac)
	}
}

// modelName is the model name of a .model card.
func modelName(card string) string {
	f := strings.Fields(card)
	if len(f) < 2 {
		return ""
	}
	return f[1]
}
