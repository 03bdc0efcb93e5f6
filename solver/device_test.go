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

// TestThermalVoltage: VT = kT/q is 25.865 mV at 300.15 K with the SI
// constants (REFERENCE.md §4 [D]).
func TestThermalVoltage(t *testing.T) {
	if got := solver.ThermalVoltage_V(27); math.Abs(got-25.865e-3) > 0.0005e-3 {
		t.Errorf("VT(27 °C) = %.6g V, want 25.865 mV", got)
	}
}

// TestModelForDefaults: parameters not on a datasheet take the SPICE
// defaults XTI = 3, EG = 1.11 eV, BR = 1, NF = 1 (source: ngspice manual
// §8.2.1 table, REFERENCE.md §4 [C]), XTB = 1.5 (common practice) and
// TNOM = 25 °C (datasheet conditions).
func TestModelForDefaults(t *testing.T) {
	m, err := solver.ModelFor(solver.Datasheet{Label: "x", Polarity: solver.PNP, HFEMin: 100, HFEMax: 300, VAF_V: 74, ICBO_A: 15e-9}, 170)
	if err != nil {
		t.Fatal(err)
	}
	want := solver.Model{Polarity: solver.PNP, IS_A: m.IS_A, BF: 170, BR: 1, NF: 1, VAF_V: 74, XTI: 3, XTB: 1.5, EG_eV: 1.11, TNOM_C: 25, ICBO_A: 15e-9}
	if m != want {
		t.Errorf("ModelFor = %+v, want %+v", m, want)
	}
	// IC = IS(exp(VBE/VT) − 1) at 0.65 V, 1 mA, 25 °C with VT from
	// REFERENCE.md §4 scaled to 298.15 K (Ebers–Moll, Massobrio &
	// Antognetti ch. 2, from memory).
	vt := 25.865e-3 * 298.15 / 300.15
	if wantIS := 1e-3 / math.Expm1(0.65/vt); math.Abs(m.IS_A/wantIS-1) > 1e-4 {
		t.Errorf("IS = %g A, want %g A", m.IS_A, wantIS)
	}
}

// TestModelForAgainstNgspice puts the .model card ModelFor builds into
// ngspice with VBE held at the datasheet's VBE(on) and VCE = 5 V: at TNOM
// the collector current must be the VBE(on) test current, and at −20 and
// 85 °C the value IS(T)·(exp(VBE/VT)−1) the solver uses (IC within 0.1 %;
// source: ngspice op run).
func TestModelForAgainstNgspice(t *testing.T) {
	spicecheck.Require(t)
	sheets := []solver.Datasheet{
		{Label: "default npn", Polarity: solver.NPN, HFEMin: 100, HFEMax: 300},
		{Label: "npn 0.7 V at 10 mA, VAF 100", Polarity: solver.NPN, HFEMin: 40, HFEMax: 160, VBEOn_V: 0.7, VBEAt_A: 10e-3, VAF_V: 100},
		{Label: "pnp 0.62 V at 0.1 mA", Polarity: solver.PNP, HFEMin: 120, HFEMax: 460, VBEOn_V: 0.62, VBEAt_A: 0.1e-3},
	}
	temps := []float64{-20, 25, 85}
	var jobs []spicecheck.Job
	type point struct {
		d     solver.Datasheet
		m     solver.Model
		tj    float64
		vbe_V float64
	}
	var pts []point
	for _, d := range sheets {
		m, err := solver.ModelFor(d, 200)
		if err != nil {
			t.Fatal(err)
		}
		vbe := d.VBEOn_V
		if vbe == 0 {
			vbe = solver.DefaultVBEOn_V
		}
		// The .model card exactly as the netlist writer prints it.
		sg := 1.0
		if d.Polarity == solver.PNP {
			sg = -1
		}
		deck := solver.Netlist(stage(solver.Divider, 10*sg, 0, R{solver.R1: 1e3, solver.R2: 1e3, solver.RC: 1e3, solver.RE: 1e3}), m, 25, "card")
		card := ""
		for line := range strings.Lines(deck) {
			if strings.HasPrefix(line, ".model") {
				card = line
			}
		}
		for _, tj := range temps {
			jobs = append(jobs, spicecheck.Job{
				Deck: fmt.Sprintf("* %s at %g C\nvbe b 0 dc %.12g\nvce c 0 dc %g\nq1 c b 0 qdut\n%s.options tnom=25 temp=%g reltol=1e-9 vntol=1e-12 abstol=1e-18\n.end\n",
					d.Label, tj, sg*vbe, sg*5, card, tj),
				Vectors: []string{"@q1[ic]"},
			})
			pts = append(pts, point{d, m, tj, vbe})
		}
	}
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	defer cancel()
	got, err := spicecheck.Run(ctx, jobs)
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range pts {
		ng := math.Abs(got[i]["@q1[ic]"])
		want := p.d.VBEAt_A // at TNOM: the datasheet's test current
		if want == 0 {
			want = solver.DefaultVBEAt_A
		}
		if p.tj != 25 {
			is, _, _, _ := p.m.At(p.tj)
			want = is * math.Expm1(p.vbe_V/solver.ThermalVoltage_V(p.tj))
		}
		if p.m.VAF_V > 0 {
			want *= 1 - (p.vbe_V-5)/p.m.VAF_V // Early factor at VBC = VBE − 5 V
		}
		if math.Abs(ng/want-1) > 1e-3 {
			t.Errorf("%s at %g °C: ngspice IC = %.6g A, want %.6g A", p.d.Label, p.tj, ng, want)
		}
	}
	t.Logf("ngspice: %d model cards checked", len(pts))
}
