package fault_test

import (
	"errors"
	"math"
	"testing"

	"biasbin/solver"
	"biasbin/solver/fault"
)

// TestSolveTroubleshootingTable holds the faulty-stage solver against the
// troubleshooting table of REFERENCE.md §22: the [D] recomputation of the
// voltage-divider circuit of Malvino & Bates, Electronic Principles, 7th
// ed., Ex. 8-1 (10 V; R1 10 k, R2 2.2 k, RC 3.6 k, RE 1 k; the attribution
// is from memory). That table takes VBE = 0.7 V fixed, β = 100, VCE(sat) =
// 0.1 V and shorts of 0 Ω; the model here has an exponential junction
// (VBE(on) 0.7 V at 1 mA), so the agreement asked is 0.1 V. Floating
// collectors (RC open) are left out, as the table does.
func TestSolveTroubleshootingTable(t *testing.T) {
	s := solver.Stage{Topology: solver.Divider, VCC_V: 10}
	s.R_Ohm[solver.R1], s.R_Ohm[solver.R2], s.R_Ohm[solver.RC], s.R_Ohm[solver.RE] = 10e3, 2.2e3, 3.6e3, 1e3
	m, err := solver.ModelFor(solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 100, VBEOn_V: 0.7}, 100)
	if err != nil {
		t.Fatal(err)
	}
	at := fault.ResistorAt
	nan := math.NaN()
	for _, c := range []struct {
		name       string
		f          fault.Fault
		vb, ve, vc float64
		tol        float64 // 0 = 0.1 V
	}{
		{"none", fault.Fault{Position: fault.Transistor, Kind: fault.None}, 1.784, 1.084, 6.137, 0},
		// Saturated: the table fixes VCE(sat) at 0.1 V; the model's hard
		// saturation (BR = 1) sits nearer 20 mV, so 0.2 V here.
		{"R1 short", fault.Fault{Position: at(solver.R1), Kind: fault.Short}, 10, 9.3, 9.4, 0.2},
		{"R1 open", fault.Fault{Position: at(solver.R1), Kind: fault.Open}, 0, 0, 10, 0},
		{"R2 short", fault.Fault{Position: at(solver.R2), Kind: fault.Short}, 0, 0, 10, 0},
		{"R2 open", fault.Fault{Position: at(solver.R2), Kind: fault.Open}, 3.371, 2.671, 2.771, 0},
		{"RE short", fault.Fault{Position: at(solver.RE), Kind: fault.Short}, 0.7, 0, 0.1, 0},
		{"RC short", fault.Fault{Position: at(solver.RC), Kind: fault.Short}, 1.784, 1.084, 10, 0},
		{"RC open", fault.Fault{Position: at(solver.RC), Kind: fault.Open}, 1.094, 0.394, nan, 0},
		{"C-E short only", fault.Fault{Position: fault.Transistor, Kind: fault.CEShort}, 1.803, 2.174, 2.174, 0},
	} {
		tol := c.tol
		if tol == 0 {
			tol = 0.1
		}
		p, err := fault.Solve(s, m, 25, c.f)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		for _, v := range []struct {
			name      string
			got, want float64
		}{{"VB", p.VB_V, c.vb}, {"VE", p.VE_V, c.ve}, {"VC", p.VC_V, c.vc}} {
			if !math.IsNaN(v.want) && math.Abs(v.got-v.want) > tol {
				t.Errorf("%s: %s = %.3f V, REFERENCE.md §22 table %.3f V (±%.1f V)", c.name, v.name, v.got, v.want, tol)
			}
		}
	}
}

// TestDiagnoseBadInput: readings beyond the rails and bad settings are
// refused with the reading or field named (common practice: no fault of a
// passive network drives a node past its supplies).
func TestDiagnoseBadInput(t *testing.T) {
	s := solver.Stage{Topology: solver.Divider, VCC_V: 12}
	s.R_Ohm[solver.R1], s.R_Ohm[solver.R2], s.R_Ohm[solver.RC], s.R_Ohm[solver.RE] = 39e3, 8.2e3, 3.9e3, 1e3
	d := solver.Datasheet{Polarity: solver.NPN, HFEMin: 110, HFEMax: 450}
	for _, c := range []struct {
		name    string
		r       fault.Readings
		set     fault.Settings
		reading string
		field   string
	}{
		{"collector above the supply", fault.Readings{VB_V: 2, VE_V: 1.4, VC_V: 12.5}, fault.Settings{}, "vc", ""},
		{"base below ground", fault.Readings{VB_V: -0.5, VE_V: 0, VC_V: 12}, fault.Settings{}, "vb", ""},
		{"emitter not a number", fault.Readings{VB_V: 2, VE_V: math.NaN(), VC_V: 7}, fault.Settings{}, "ve", ""},
		{"negative meter accuracy", fault.Readings{VB_V: 2, VE_V: 1.4, VC_V: 7}, fault.Settings{Meter: fault.Meter{Fraction: -0.01}}, "", "meter_fraction"},
		{"drift factor of one", fault.Readings{VB_V: 2, VE_V: 1.4, VC_V: 7}, fault.Settings{MaxDrift: 1}, "", "max_drift"},
	} {
		_, err := fault.Diagnose(s, d, c.r, c.set)
		var re *fault.ReadingError
		var ie *solver.InputError
		switch {
		case c.reading != "" && (!errors.As(err, &re) || re.Reading != c.reading):
			t.Errorf("%s: error %v, want a ReadingError on %s", c.name, err, c.reading)
		case c.field != "" && (!errors.As(err, &ie) || ie.Field != c.field):
			t.Errorf("%s: error %v, want an InputError on %s", c.name, err, c.field)
		}
	}
	// Within the meter's accuracy of the rail is a reading, not an error.
	if _, err := fault.Diagnose(s, d, fault.Readings{VB_V: 0, VE_V: 0, VC_V: 12.05}, fault.Settings{}); err != nil {
		t.Errorf("VC 12.05 V on a 12 V rail (within ±0.13 V): %v", err)
	}
}

// TestDiagnoseWorkingStage: readings of a working stage (ngspice-free: the
// hand figures of a stiff divider, common practice VBE ≈ 0.65 V) are
// reported as healthy.
func TestDiagnoseWorkingStage(t *testing.T) {
	s := solver.Stage{Topology: solver.Divider, VCC_V: 12}
	s.R_Ohm[solver.R1], s.R_Ohm[solver.R2], s.R_Ohm[solver.RC], s.R_Ohm[solver.RE] = 39e3, 8.2e3, 3.9e3, 1e3
	d := solver.Datasheet{Polarity: solver.NPN, HFEMin: 110, HFEMax: 450, VBEOn_V: 0.65}
	// Stiff-divider hand figures (common practice): VB = 12·8.2/47.2 less
	// the base current's drop in R_TH (6.8 k · ~8 µA ≈ 0.05 V), VE = VB − 0.65,
	// VC = 12 − 3.9·VE/1 k.
	vb := 12*8.2/47.2 - 0.05
	ve := vb - 0.65
	r := fault.Readings{VB_V: vb, VE_V: ve, VC_V: 12 - 3.9*ve}
	dg, err := fault.Diagnose(s, d, r, fault.Settings{Meter: fault.Meter{Fraction: 0.02, Offset_V: 0.03}})
	if err != nil {
		t.Fatal(err)
	}
	if !dg.Healthy {
		t.Errorf("working-stage readings %+v: not reported healthy (fit %.2f, predicted %+v)", r, dg.Working.Fit, dg.Working.Predicted)
	}
}

// TestNextMeasurementSeparatesTopTwo: a base-collector short and a heavy
// collector-base leakage give the same voltages; the check named must be
// the base-collector diode test, expecting a short under the one and a
// normal junction under the other (common practice: a shorted junction
// reads near 0 V on the diode range).
func TestNextMeasurementSeparatesTopTwo(t *testing.T) {
	s := solver.Stage{Topology: solver.Divider, VCC_V: 12}
	s.R_Ohm[solver.R1], s.R_Ohm[solver.R2], s.R_Ohm[solver.RC], s.R_Ohm[solver.RE] = 39e3, 8.2e3, 3.9e3, 1e3
	d := solver.Datasheet{Polarity: solver.NPN, HFEMin: 110, HFEMax: 450, VBEOn_V: 0.66}
	m, err := solver.ModelFor(d, 200)
	if err != nil {
		t.Fatal(err)
	}
	p, err := fault.Solve(s, m, 25, fault.Fault{Position: fault.Transistor, Kind: fault.BCShort})
	if err != nil {
		t.Fatal(err)
	}
	dg, err := fault.Diagnose(s, d, fault.Readings{VB_V: p.VB_V, VE_V: p.VE_V, VC_V: p.VC_V}, fault.Settings{})
	if err != nil {
		t.Fatal(err)
	}
	top := map[fault.Kind]bool{dg.Faults[0].Fault.Kind: true, dg.Faults[1].Fault.Kind: true}
	if !top[fault.BCShort] || !top[fault.Leak] {
		t.Fatalf("top two %v, %v; want bc-short and leak", dg.Faults[0].Fault.Kind, dg.Faults[1].Fault.Kind)
	}
	n := dg.Next
	if n == nil || n.Check != fault.DiodeBC {
		t.Fatalf("next %+v, want the base-collector diode test", n)
	}
	short, normal := n.IfFirst, n.IfSecond
	if dg.Faults[0].Fault.Kind == fault.Leak {
		short, normal = normal, short
	}
	if short.Outcome != fault.ShortCircuit || normal.Outcome != fault.Normal {
		t.Errorf("next %+v: want short under bc-short and normal under leak", n)
	}
}
