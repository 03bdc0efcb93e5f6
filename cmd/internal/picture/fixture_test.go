package picture

import (
	"os"
	"path/filepath"
	"testing"

	"biasbin/solver"
)

// Test builds: our own values, solved by the solver the way the analysis
// of one build solves them.
func dividerFixture() solver.Build {
	b := solver.Build{
		Topology: solver.Divider, VCC_V: 12, VCCTol: 0.05,
		Device: solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, VBEOn_V: 0.65, VBEAt_A: 1e-3,
			VCESat_V: 0.2, ThetaJA_KPerW: 200, TjMax_C: 150},
		RL_Ohm: 10e3, AmbientMin_C: 0, AmbientMax_C: 50, NominalAmbient_C: 25,
	}
	for s, r := range map[solver.Slot]float64{solver.R1: 47e3, solver.R2: 10e3, solver.RC: 2.2e3, solver.RE: 470} {
		b.Resistors[s] = solver.ResistorSpec{Nominal_Ohm: r, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25}
	}
	b.RBypass_Ohm = 470
	return b
}

func feedbackFixture() solver.Build {
	b := dividerFixture()
	b.Topology, b.RBypass_Ohm, b.RL_Ohm = solver.CollectorFeedback, 0, 0
	b.Resistors = [solver.NumSlots]solver.ResistorSpec{}
	for s, r := range map[solver.Slot]float64{solver.RF: 220e3, solver.RC: 2.2e3, solver.RE: 470} {
		b.Resistors[s] = solver.ResistorSpec{Nominal_Ohm: r, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25}
	}
	return b
}

func splitFixture() solver.Build {
	b := dividerFixture()
	b.Topology, b.VCC_V, b.VEE_V, b.RBypass_Ohm, b.RL_Ohm = solver.SplitSupply, 9, -9, 0, 0
	b.Resistors = [solver.NumSlots]solver.ResistorSpec{}
	for s, r := range map[solver.Slot]float64{solver.RB: 10e3, solver.RC: 3.3e3, solver.RE: 4.7e3} {
		b.Resistors[s] = solver.ResistorSpec{Nominal_Ohm: r, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25}
	}
	return b
}

// subjectOf analyses b as check does (nominal point, corners, swing, a
// yield run with both ambient ends and the boards kept) with a ±10 %,
// ±20 % window around the nominal point.
func subjectOf(t testing.TB, b solver.Build, boards int) Subject {
	t.Helper()
	op, _, err := solver.Nominal(b)
	if err != nil {
		t.Fatal(err)
	}
	wc, err := solver.EvalWorstCase(b, solver.Limits{})
	if err != nil {
		t.Fatal(err)
	}
	w := solver.Window{ICMin_A: 0.9 * op.IC_A, ICMax_A: 1.1 * op.IC_A, VCEMin_V: 0.8 * op.VCE_V, VCEMax_V: 1.2 * op.VCE_V}
	y, err := solver.EvalYieldSeeded(b, w, boards, 1, solver.YieldOptions{KeepBoards: true})
	if err != nil {
		t.Fatal(err)
	}
	return Subject{
		Name: BuildName(b, "NPN-T1"), Build: b, Nominal: op, VCESat_V: b.Device.VCESat_V,
		Swing: solver.EvalSwing(b.NominalStage(), op, b.Device.VCESat_V), Corners: wc.Corners, Window: w, Yield: &y,
	}
}

// TestWritePictures writes the fixtures' pictures to $PICTURE_OUT for a
// person to look at; it is skipped otherwise.
func TestWritePictures(t *testing.T) {
	dir := os.Getenv("PICTURE_OUT")
	if dir == "" {
		t.Skip("set PICTURE_OUT to a folder to write the pictures")
	}
	div, fb, sp := subjectOf(t, dividerFixture(), 2000), subjectOf(t, feedbackFixture(), 2000), subjectOf(t, splitFixture(), 2000)
	write := func(name string, c Chart) {
		for _, ext := range []string{".png", ".svg", ".pdf"} {
			f, err := os.Create(filepath.Join(dir, name+ext))
			if err != nil {
				t.Fatal(err)
			}
			format, _ := FormatOf(f.Name())
			if err := Render(f, c, format, DefaultSize); err != nil {
				t.Fatal(err)
			}
			f.Close()
		}
	}
	for name, s := range map[string]Subject{"divider": div, "feedback": fb, "split": sp} {
		c, err := LoadLine([]Subject{s}, LoadLineOptions{})
		if err != nil {
			t.Fatal(err)
		}
		write(name, c)
		h, err := Histogram(s)
		if err != nil {
			t.Fatal(err)
		}
		write(name+"-hist", h)
	}
	c, err := LoadLine([]Subject{div, fb, sp}, LoadLineOptions{MaxBoards: 500})
	if err != nil {
		t.Fatal(err)
	}
	write("compare", c)
}
