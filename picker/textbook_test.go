package picker

import (
	"math"
	"testing"

	"biasbin/solver"
)

// bookTransistor is a transistor line that behaves as a textbook's: hFE
// fixed at beta (min = max), VBE exactly 0.7 V at the example's collector
// current ic_A (the VBE(on) test current), no Early effect and no
// self-heating (no thermal rating stated, so the request allows unrated
// lines), at 25 °C.
func bookTransistor(beta, ic_A float64) Transistor {
	return Transistor{ID: 1, Qty: 10, Bin: "BK", Sheet: solver.Datasheet{Label: "BOOK", Polarity: solver.NPN,
		HFEMin: beta, HFEMax: beta, VBEOn_V: 0.7, VBEAt_A: ic_A, VCESat_V: 0.2, VCEO_V: 60, ICMax_A: 0.1}}
}

// bookFigure is one figure of a worked example's answer: the printed
// value and the exact recomputation with the book's own model.
type bookFigure struct {
	name       string
	get        func(solver.OperatingPoint) float64
	book, exct float64
}

// TestPickTextbookExamples: a stock holding a worked example's resistor
// values (among neighbours), asked for the example's Q-point with the
// Q-point term alone, picks exactly the example's build and reports the
// example's Q-point: within 0.1 % of the exact recomputation and within
// 2 % of the printed answer (books round intermediate values).
func TestPickTextbookExamples(t *testing.T) {
	ic := func(o solver.OperatingPoint) float64 { return o.IC_A }
	ib := func(o solver.OperatingPoint) float64 { return o.IB_A }
	vce := func(o solver.OperatingPoint) float64 { return o.VCE_V }
	vc := func(o solver.OperatingPoint) float64 { return o.VC_V }
	cases := []struct {
		name   string
		source string
		topo   solver.Topology
		vcc    float64
		vee    float64
		beta   float64
		want   map[string]float64 // the example's resistors by position
		decoys []float64
		figs   []bookFigure
	}{
		{
			name:   "feedback_4.11",
			source: "Boylestad & Nashelsky, Electronic Devices and Circuit Theory, 10th/11th ed., Example 4.11, collector feedback (from memory; REFERENCE.md §20(a))",
			topo:   solver.CollectorFeedback, vcc: 10, beta: 90,
			want:   map[string]float64{"rf": 250e3, "rc": 4.7e3, "re": 1.2e3},
			decoys: []float64{220e3, 270e3, 3.9e3, 5.6e3, 1e3, 1.5e3},
			// exact [D]: IB = (10 − 0.7)/(250k + 91·5.9k) with RC
			// carrying IE; the book's IC' ≈ IC form prints 11.91 µA,
			// 1.07 mA and 3.69 V.
			figs: []bookFigure{
				{"IB", ib, 11.91e-6, 11.8194e-6},
				{"IC", ic, 1.07e-3, 1.06375e-3},
				{"VCE", vce, 3.69, 3.6546},
			},
		},
		{
			name:   "split_8-5",
			source: "Malvino & Bates, Electronic Principles, 7th ed., Example 8-5, p. 271, two-supply emitter bias (REFERENCE.md §20(b))",
			topo:   solver.SplitSupply, vcc: 10, vee: -2, beta: 100,
			// V_RE = 1.3 V, so VEE = 2 V with VBE 0.7 V
			want:   map[string]float64{"rb": 2.7e3, "rc": 3.6e3, "re": 1.8e3},
			decoys: []float64{2.2e3, 3.3e3, 3.9e3, 1.5e3, 2e3},
			// exact [D], beta 100: IE = 1.3 V/(1.8k + 2.7k/101) =
			// 0.711653 mA, IC = IE·100/101 = 0.704607 mA, VC = 10 −
			// IC·3.6k = 7.46341 V; the book neglects the base current
			// and prints VC = 7.4 V.
			figs: []bookFigure{{"VC", vc, 7.4, 7.46341}},
		},
		{
			name:   "split_8-6",
			source: "Malvino & Bates, Electronic Principles, 7th ed., Example 8-6, p. 271, two-supply emitter bias (REFERENCE.md §10 row 4, §20(b))",
			topo:   solver.SplitSupply, vcc: 15, vee: -15, beta: 100,
			// the book grounds the base; a 10K base resistor here (the
			// [D] variant of REFERENCE.md §20(b))
			want:   map[string]float64{"rb": 10e3, "rc": 10e3, "re": 20e3},
			decoys: []float64{8.2e3, 12e3, 18e3, 22e3},
			// exact [D], beta 100: IE = 14.3 V/(20k + 10k/101) =
			// 0.711478 mA, VC = 15 − IE·(100/101)·10k = 7.9557 V; the
			// book prints IE = 0.715 mA and VC = 7.85 V (it takes IC =
			// IE and no base resistor).
			figs: []bookFigure{
				{"IE", func(o solver.OperatingPoint) float64 { return o.IE_A }, 0.715e-3, 0.711478e-3},
				{"VC", vc, 7.85, 7.9557},
			},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var exIC, exVCE float64
			for _, f := range c.figs {
				switch f.name {
				case "IC":
					exIC = f.exct
				case "VCE":
					exVCE = f.exct
				}
			}
			if exIC == 0 { // split supply: from the example's own figures
				exIC, exVCE = splitQPoint(c.vcc, -c.vee, c.beta, c.want)
			}
			var st Stock
			id := int64(100)
			for _, v := range append(valuesOf(c.want), c.decoys...) {
				st.Resistors = append(st.Resistors, Resistor{ID: id, Ohm: v, Tol: 0.01, TCR_PPMPerK: 50, Rated_W: 0.25, Qty: 10, Bin: "R"})
				id++
			}
			st.Transistors = []Transistor{bookTransistor(c.beta, exIC)}
			req := Request{Topology: c.topo, VCC_V: c.vcc, VEE_V: c.vee, VCCTol: 0.05, IC_A: exIC, VCE_V: exVCE,
				AmbientMin_C: 20, AmbientMax_C: 30, Weights: Weights{QPoint: 1}, AllowUnrated: true, ShowFailing: true, Top: 1}
			res, err := Pick(st, req)
			if err != nil {
				t.Fatalf("%s: %v", c.source, err)
			}
			if len(res.Candidates) == 0 {
				t.Fatalf("%s: no build", c.source)
			}
			got := res.Candidates[0]
			for name, ohm := range c.want {
				if p := got.Positions[name]; p.Ohm != ohm {
					t.Errorf("%s: picked %s = %g ohm, the example has %g", c.source, name, p.Ohm, ohm)
				}
			}
			for _, f := range c.figs {
				v := f.get(got.Nominal)
				if rel := math.Abs(v/f.exct - 1); rel > 1e-3 {
					t.Errorf("%s: %s = %.6g, exact recomputation %.6g (%.3f %% off, want <= 0.1 %%)", c.source, f.name, v, f.exct, 100*rel)
				}
				if rel := math.Abs(v/f.book - 1); rel > 0.02 {
					t.Errorf("%s: %s = %.6g, the book prints %.6g (%.2f %% off, want <= 2 %%)", c.source, f.name, v, f.book, 100*rel)
				}
			}
		})
	}
}

// valuesOf returns the values of a position map.
func valuesOf(m map[string]float64) []float64 {
	var out []float64
	for _, v := range m {
		out = append(out, v)
	}
	return out
}

// splitQPoint is the exact two-supply emitter bias of REFERENCE.md §6
// with VBE 0.7 V: IE = (VEE − VBE)/(RE + RB/(β+1)), IC = β/(β+1)·IE,
// VCE = VCC + VEE − IC·RC − IE·RE.
func splitQPoint(vcc, vee, beta float64, r map[string]float64) (ic, vce float64) {
	ie := (vee - 0.7) / (r["re"] + r["rb"]/(beta+1))
	ic = beta / (beta + 1) * ie
	return ic, vcc + vee - ic*r["rc"] - ie*r["re"]
}
