package job

import (
	"math"
	"testing"

	"biasbin/picker"
	"biasbin/solver"
)

// divider60 is a divider stage on a 60 V rail (invented values; the test
// checks which cautions the analysis raises, not the solved figures).
func divider60() solver.Build {
	spec := func(ohm float64) solver.ResistorSpec {
		return solver.ResistorSpec{Nominal_Ohm: ohm, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25}
	}
	var b solver.Build
	b.Topology = solver.Divider
	b.VCC_V, b.VCCTol = 60, 0.05
	b.Resistors[solver.R1], b.Resistors[solver.R2] = spec(100e3), spec(10e3)
	b.Resistors[solver.RC], b.Resistors[solver.RE] = spec(10e3), spec(2.2e3)
	b.Device = solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, VCEO_V: 45}
	b.AmbientMin_C, b.AmbientMax_C, b.NominalAmbient_C = 0, 50, 25
	return b
}

// TestCheckCautions: a 60 V supply at +5 % (63 V) is above the 60 V d.c.
// generally safe to touch (IEC 62368-1 ES1, REFERENCE.md §17), and above the
// transistor's 45 V VCEO, so the analysis cautions both, as figures.
func TestCheckCautions(t *testing.T) {
	a, err := Check(CheckRequest{Build: divider60(), Boards: 200, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	var supply, vceo bool
	for _, c := range a.Cautions {
		switch c.Kind {
		case CautionSupply:
			supply = math.Abs(c.Value-63) < 1e-9 && c.Limit == 60
		case CautionVCEO, CautionVCEOCutoff:
			vceo = c.Limit == 45
		}
	}
	if !supply || !vceo {
		t.Errorf("cautions %+v: want the 63 V supply above 60 V and VCEO 45 V", a.Cautions)
	}
	if len(a.TestPoints) != 3 || !a.TestPoints[0].HaveBand || a.TestPoints[0].Min_V > a.TestPoints[0].Nominal_V || a.TestPoints[0].Max_V < a.TestPoints[0].Nominal_V {
		t.Errorf("test points %+v: want VB, VE, VC with bands around the nominal", a.TestPoints)
	}
}

// TestCheckWindow: check's window follows the one rule (picker.WindowRule):
// without a target it sits around the nominal point, with --ic/--vce
// targets around them, ±10 % IC and ±20 % VCE by default.
func TestCheckWindow(t *testing.T) {
	a, err := Check(CheckRequest{Build: divider60(), Boards: 50, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	w, n := a.Window, a.Nominal
	if math.Abs(w.ICMin_A-0.9*n.IC_A) > 1e-15 || math.Abs(w.ICMax_A-1.1*n.IC_A) > 1e-15 ||
		math.Abs(w.VCEMin_V-0.8*n.VCE_V) > 1e-12 || math.Abs(w.VCEMax_V-1.2*n.VCE_V) > 1e-12 ||
		w.Centre.ICOf != picker.CentreNominal || w.Centre.VCEOf != picker.CentreNominal {
		t.Errorf("window %+v around nominal IC %g A, VCE %g V", w, n.IC_A, n.VCE_V)
	}
	a, err = Check(CheckRequest{Build: divider60(), Boards: 50, Seed: 1, TargetIC_A: 2e-3})
	if err != nil {
		t.Fatal(err)
	}
	if w := a.Window; math.Abs(w.ICMin_A-1.8e-3) > 1e-15 || math.Abs(w.ICMax_A-2.2e-3) > 1e-15 ||
		w.Centre.ICOf != picker.CentreTarget || w.Centre.VCEOf != picker.CentreNominal {
		t.Errorf("window %+v, want IC 1.8..2.2 mA around the 2 mA target", w)
	}
}
