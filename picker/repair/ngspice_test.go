package repair_test

import (
	"context"
	"fmt"
	"math"
	"testing"
	"time"

	"biasbin/picker/repair"
	"biasbin/solver"
	"biasbin/solver/fault"
	"biasbin/solver/spicecheck"
)

func runDecks(t *testing.T, jobs []spicecheck.Job) []map[string]float64 {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	res, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// pointDeck is the deck of a solved nominal point: the stage at its
// nominal values, the model at the junction temperature the point settled
// at.
func pointDeck(p repair.Point, title string) spicecheck.Job {
	return spicecheck.Job{Deck: solver.Netlist(p.Build.NominalStage(), p.Model, p.Nominal.Tj_C, title), Vectors: []string{"@q1[ic]"}}
}

// TestSubstituteAgainstNgspice is the outside check: ngspice
// (Debian package, run by the test) re-solves the original stage with the
// original's ranges, every substitute and every changed stage, and the
// collector current must agree with biasbin's within 0.1 %.
func TestSubstituteAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	orig := npnSheet("ORIG-1", 100, 160, 0.65)
	origP := pnpSheet("ORIG-P", 80, 250, 0.7)
	pnpDiv := dividerBuild(-9)
	pnpPos := pnpDiv
	pnpPos.Ground = solver.CollectorRailGround
	type run struct {
		name string
		req  repair.SubstituteRequest
	}
	var points []repair.Point
	var names []string
	for _, r := range []run{
		{"feedback", repair.SubstituteRequest{Build: feedbackBuild(), Polarity: solver.NPN, Original: &orig, Stock: bench(), Pairs: true}},
		{"divider", repair.SubstituteRequest{Build: dividerBuild(12), Polarity: solver.NPN, Original: &orig, Stock: bench()}},
		{"pnp divider", repair.SubstituteRequest{Build: pnpDiv, Polarity: solver.PNP, Original: &origP, Stock: bench()}},
		{"pnp divider on a positive supply", repair.SubstituteRequest{Build: pnpPos, Polarity: solver.PNP, Original: &origP, Stock: bench()}},
	} {
		out, err := repair.Substitute(r.req)
		if err != nil {
			t.Fatalf("%s: %v", r.name, err)
		}
		points = append(points, *out.Original.Ranges)
		names = append(names, r.name+": original")
		for _, c := range out.Candidates {
			points = append(points, c.Point)
			names = append(names, fmt.Sprintf("%s: %s", r.name, c.Transistor.Sheet.Label))
			if c.Change != nil {
				points = append(points, c.Change.After)
				names = append(names, fmt.Sprintf("%s: %s with %v changed", r.name, c.Transistor.Sheet.Label, c.Change.Position))
			}
		}
	}
	jobs := make([]spicecheck.Job, len(points))
	for i, p := range points {
		jobs[i] = pointDeck(p, names[i])
	}
	res := runDecks(t, jobs)
	worst := 0.0
	for i, p := range points {
		got := math.Abs(res[i]["@q1[ic]"])
		rel := math.Abs(p.Nominal.IC_A/got - 1)
		worst = max(worst, rel)
		if rel > 1e-3 {
			t.Errorf("%s: IC %.6g A, ngspice %.6g A (%.2g relative, want ≤ 0.1 %%)", names[i], p.Nominal.IC_A, got, rel)
		}
	}
	t.Logf("ngspice: %d substitute stages re-solved (originals, substitutes, changed stages); largest IC difference %.2g relative", len(points), worst)
}

// meterDisplay rounds v as a 3½-digit meter on its best range shows it:
// 1999 counts on the 200 mV, 2 V, 20 V and 200 V ranges (common practice).
func meterDisplay(v float64) float64 {
	for _, fullScale := range []float64{0.2, 2, 20, 200} {
		if math.Abs(v) < fullScale*1999/2000 {
			step := fullScale / 2000
			return math.Round(v/step) * step
		}
	}
	return math.Round(v)
}

// TestInferAgainstNgspice is the outside check of the Q-point
// inference: ngspice solves known working stages, their node voltages are
// rounded as a 3½-digit meter shows them, and the IC inferred from them
// must lie within 1 % of ngspice's.
func TestInferAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	split := solver.Build{Topology: solver.SplitSupply, VCC_V: 12, VEE_V: -12, VCCTol: 0.02}
	split.Resistors[solver.RB] = solver.ResistorSpec{Nominal_Ohm: 22e3, Tol: 0.05}
	split.Resistors[solver.RC] = solver.ResistorSpec{Nominal_Ohm: 5.6e3, Tol: 0.05}
	split.Resistors[solver.RE] = solver.ResistorSpec{Nominal_Ohm: 10e3, Tol: 0.05}
	splitP := split
	splitP.VCC_V, splitP.VEE_V = -15, 15
	pnpPos := dividerBuild(-9) // on a positive supply: 0 V on its collector side, readings positive
	pnpPos.Ground = solver.CollectorRailGround
	fbRE := feedbackBuild()
	fbRE.Resistors[solver.RE] = solver.ResistorSpec{Nominal_Ohm: 470, Tol: 0.05}
	cases := []struct {
		name string
		b    solver.Build
		d    solver.Datasheet
		hfe  float64
	}{
		{"npn divider", dividerBuild(12), npnSheet("A", 100, 300, 0.65), 150},
		{"pnp divider", dividerBuild(-9), pnpSheet("B", 100, 300, 0.7), 250},
		{"pnp divider on a positive supply", pnpPos, pnpSheet("B", 100, 300, 0.7), 250},
		{"npn feedback, no RE", feedbackBuild(), npnSheet("C", 100, 300, 0.65), 120},
		{"npn feedback with RE", fbRE, npnSheet("D", 100, 300, 0.62), 280},
		{"npn split supply", split, npnSheet("E", 50, 300, 0.65), 60},
		{"pnp split supply", splitP, pnpSheet("F", 100, 300, 0.68), 200},
	}
	jobs := make([]spicecheck.Job, len(cases))
	for i, c := range cases {
		m, err := solver.ModelFor(c.d, c.hfe)
		if err != nil {
			t.Fatal(err)
		}
		jobs[i] = spicecheck.Job{Deck: solver.Netlist(c.b.NominalStage(), m, 25, c.name), Vectors: []string{"v(b)", "v(e)", "v(c)", "@q1[ic]"}}
	}
	res := runDecks(t, jobs)
	worst := 0.0
	for i, c := range cases {
		r := fault.Readings{VB_V: meterDisplay(res[i]["v(b)"]), VE_V: meterDisplay(res[i]["v(e)"]), VC_V: meterDisplay(res[i]["v(c)"])}
		in, err := repair.InferQPoint(c.b, c.d.Polarity, r, fault.Meter{}, 0)
		if err != nil {
			t.Errorf("%s: readings %+v: %v", c.name, r, err)
			continue
		}
		want := math.Abs(res[i]["@q1[ic]"])
		rel := math.Abs(in.IC_A/want - 1)
		worst = max(worst, rel)
		if rel > 0.01 {
			t.Errorf("%s: readings %+v: IC inferred %.5g A, ngspice %.5g A (%.2g relative, want ≤ 1 %%)", c.name, r, in.IC_A, want, rel)
		}
	}
	t.Logf("ngspice: %d working stages read as a 3½-digit meter and their IC inferred; largest difference %.2g relative", len(cases), worst)
}
