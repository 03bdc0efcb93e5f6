package solver

import (
	"math"
	"math/rand/v2"
	"testing"
)

// fixedBuild is dividerBuild with no spread at all: no tolerances, no
// TCR, one hFE, one VBE(on), no supply tolerance, no self-heating, the
// ambient fixed at 25 °C. Each test below gives back one input its spread.
func fixedBuild() Build {
	b := dividerBuild()
	b.VCCTol = 0
	b.Device.ThetaJA_KPerW = 0
	b.Device.HFEMin, b.Device.HFEMax = 200, 200
	b.Device.VBEMin_V, b.Device.VBEMax_V = 0.65, 0.65
	b.AmbientMin_C, b.AmbientMax_C = 25, 25
	for s := range NumSlots {
		b.Resistors[s].Tol, b.Resistors[s].TCR_PPMPerK = 0, 0
	}
	return b
}

// icWith solves b (no self-heating) with supply factor vccF and the TCR
// of RE set to tcrRE, at ambient ta.
func icWith(t *testing.T, b Build, vccF, tcrRE, ta float64) float64 {
	t.Helper()
	m, err := ModelFor(b.Device, b.Device.HFEMin)
	if err != nil {
		t.Fatal(err)
	}
	var dev, tcr [NumSlots]float64
	tcr[RE] = tcrRE
	op, err := Solve(b.resolveTCR(&dev, &tcr, vccF, vccF, ta), m, ta)
	if err != nil {
		t.Fatal(err)
	}
	return op.IC_A
}

// TestYieldDrawsEveryInput catches a Monte Carlo that holds an uncertain
// input fixed. source: hand derivation (probability of a preimage): when
// IC is monotonic in the one input that varies, the pass share is the
// probability that input falls in the preimage of the window; each input
// is rectangular on its limits (JCGM 101:2008 §6.4.2.1, REFERENCE.md
// §13). IC rises with VCC and falls as RE rises (REFERENCE.md §9 [D]).
func TestYieldDrawsEveryInput(t *testing.T) {
	supply := fixedBuild()
	supply.VCCTol = 0.05
	// The supply factor is uniform on 1 ± 0.05: P(factor ≤ 1.025) = 0.75.
	// A Monte Carlo ignoring the supply tolerance passes every board.
	supplyW := Window{ICMax_A: icWith(t, supply, 1.025, 0, 25)}

	tcr := fixedBuild()
	tcr.Resistors[RE].TCR_PPMPerK = 1000
	tcr.AmbientMin_C, tcr.AmbientMax_C = 75, 75
	// RE's TCR uniform on ±1000 ppm/K, 50 K above 25 °C: P(TCR ≤ +500) =
	// 0.75. A TCR held at its stated +1000 passes no board; one ignored
	// passes every board.
	tcrW := Window{ICMin_A: icWith(t, tcr, 1, 500, 75)}

	vbe := fixedBuild()
	vbe.Device.VBEMin_V, vbe.Device.VBEMax_V = 0.62, 0.68
	// VBE(on) uniform on 0.62..0.68 V: P(VBE ≥ 0.665) = 0.25; IC falls as
	// VBE rises (REFERENCE.md §9 [D]).
	vbeHigh := vbe
	vbeHigh.Device.VBEMin_V, vbeHigh.Device.VBEMax_V, vbeHigh.Device.VBEOn_V = 0.665, 0.665, 0.665
	vbeW := Window{ICMax_A: icWith(t, vbeHigh, 1, 0, 25)}

	tests := []struct {
		name string
		b    Build
		w    Window
		want float64
	}{
		{"supply within its tolerance", supply, supplyW, 0.75},
		{"TCR within ± its bound", tcr, tcrW, 0.75},
		{"VBE(on) within the stocked spread", vbe, vbeW, 0.25},
	}
	const n = 4000
	for i, tt := range tests {
		y, err := EvalYieldSeeded(tt.b, tt.w, n, uint64(i+11), YieldOptions{})
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		se := math.Sqrt(tt.want * (1 - tt.want) / n)
		if math.Abs(y.Yield-tt.want) > 4*se {
			t.Errorf("%s: yield %.4f, want %.4f within 4 standard errors (%.4f)", tt.name, y.Yield, tt.want, 4*se)
		}
		if !(y.Low95 <= y.Yield && y.Yield <= y.High95) || y.High95-y.Low95 <= 0 {
			t.Errorf("%s: interval [%g, %g] around %g", tt.name, y.Low95, y.High95, y.Yield)
		}
	}
}

// TestYieldWholeAmbientRange catches a Monte Carlo that fixes the ambient
// at one end or draws one ambient per board. Nothing is drawn here; IC
// rises with temperature (VBE falls about 2 mV/K and beta rises, REFERENCE
// §9 [D], common practice). source: the yield's definition (YieldDefinition,
// issue 8): a board counts only if it is inside the window at every
// ambient of the range, so a window holding only the cold end's IC, or
// only the hot end's, passes no board, and one holding both passes all.
func TestYieldWholeAmbientRange(t *testing.T) {
	b := fixedBuild()
	b.AmbientMin_C, b.AmbientMax_C = -20, 70
	cold, hot := icWith(t, b, 1, 0, -20), icWith(t, b, 1, 0, 70)
	if !(hot > cold*1.01) {
		t.Fatalf("fixture: IC %g A at -20 °C, %g A at 70 °C: want a clear rise", cold, hot)
	}
	mid := 0.5 * (cold + hot)
	tests := []struct {
		name string
		w    Window
		want int
	}{
		{"only the cold end inside", Window{ICMin_A: cold * 0.99, ICMax_A: mid}, 0},
		{"only the hot end inside", Window{ICMin_A: mid, ICMax_A: hot * 1.01}, 0},
		{"both ends inside", Window{ICMin_A: cold * 0.99, ICMax_A: hot * 1.01}, 200},
	}
	for _, tt := range tests {
		y, err := EvalYieldSeeded(b, tt.w, 200, 5, YieldOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if y.Pass != tt.want {
			t.Errorf("%s: %d of 200 boards pass, want %d", tt.name, y.Pass, tt.want)
		}
	}
}

// TestYieldSweepAgrees checks the between-the-ends rule of EvalYield: a
// board it passes must be inside the window at every one of 121 ambients
// across the range, and one it fails must be outside at one of them or at
// a point it solved. source: the yield's definition (YieldDefinition).
// Resistor TCR bounds of ±6000 ppm/K let the resistors' drift oppose the
// transistor's, so responses turn inside the range and the turning-point
// search is exercised.
func TestYieldSweepAgrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 19))
	var boards, passed, turned int
	for range 120 {
		b := randomBuild(rng)
		if b.AmbientMax_C-b.AmbientMin_C < 20 {
			continue
		}
		for s := range NumSlots {
			if b.Resistors[s].Nominal_Ohm > 0 {
				b.Resistors[s].TCR_PPMPerK = 6000
			}
		}
		if b.Validate() != nil {
			continue
		}
		nom, _, err := Nominal(b)
		if err != nil || nom.Region != Active {
			continue
		}
		w := Window{ICMin_A: nom.IC_A * 0.9, ICMax_A: nom.IC_A * 1.1, VCEMin_V: nom.VCE_V * 0.8, VCEMax_V: nom.VCE_V * 1.2}
		smp, err := newBoardSampler(&b, rand.New(rand.NewPCG(1, 2)), YieldOptions{})
		if err != nil {
			t.Fatal(err)
		}
		j := newBoardJudge(&b, w)
		var bd board
		for range 30 {
			smp.draw(&bd)
			pass, turn, err := j.judge(&bd)
			if err != nil {
				continue
			}
			boards++
			if !pass {
				continue
			}
			passed++
			if turn {
				turned++
			}
			for k := 0; k <= 120; k++ {
				ta := b.AmbientMin_C + (b.AmbientMax_C-b.AmbientMin_C)*float64(k)/120
				op, err := j.at(&bd, ta, nil)
				if err != nil || !w.Contains(&op) {
					t.Fatalf("board passed but at %.2f °C IC %g A, VCE %g V (err %v) is outside %+v", ta, op.IC_A, op.VCE_V, err, w)
				}
			}
		}
	}
	t.Logf("%d boards, %d passed, %d of those turned inside the range", boards, passed, turned)
	if passed < 20 || turned < 5 {
		t.Fatalf("fixture too weak: %d passed, %d turned", passed, turned)
	}
}

// TestYieldTurningPoint checks the turning-point rule where it decides:
// each board gets the window spanned by its own IC and VCE at the two
// ambient ends and at the two points next to them where the end slopes
// are taken, so it passes exactly when its response stays inside that
// span over the whole range. source: the yield's definition
// (YieldDefinition), against a 241-point sweep: a board whose swept IC or
// VCE leaves that span by more than 1e-5 must fail, one the rule passes
// must stay inside at every swept point. A rule that checked those points
// alone would pass every board here.
func TestYieldTurningPoint(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 29))
	var boards, leave int
	for range 60 {
		b := randomBuild(rng)
		if b.AmbientMax_C-b.AmbientMin_C < 20 {
			continue
		}
		for s := range NumSlots {
			if b.Resistors[s].Nominal_Ohm > 0 {
				b.Resistors[s].TCR_PPMPerK = 6000
			}
		}
		if b.Validate() != nil {
			continue
		}
		smp, err := newBoardSampler(&b, rand.New(rand.NewPCG(3, 4)), YieldOptions{})
		if err != nil {
			t.Fatal(err)
		}
		var bd board
		for range 20 {
			smp.draw(&bd)
			j := newBoardJudge(&b, Window{})
			// The span of the ends and of the points the end slopes are
			// taken at (1 % of the range inside each end).
			h := 0.01 * (b.AmbientMax_C - b.AmbientMin_C)
			var ops [4]OperatingPoint
			bad := false
			for k, ta := range [4]float64{b.AmbientMin_C, b.AmbientMin_C + h, b.AmbientMax_C - h, b.AmbientMax_C} {
				op, err := j.at(&bd, ta, nil)
				bad = bad || err != nil || op.Region != Active
				ops[k] = op
			}
			if bad {
				continue
			}
			const widen = 1e-9
			j.w = Window{ICMin_A: math.Inf(1), VCEMin_V: math.Inf(1)}
			for _, op := range ops {
				j.w.ICMin_A, j.w.ICMax_A = min(j.w.ICMin_A, op.IC_A), max(j.w.ICMax_A, op.IC_A)
				j.w.VCEMin_V, j.w.VCEMax_V = min(j.w.VCEMin_V, op.VCE_V), max(j.w.VCEMax_V, op.VCE_V)
			}
			j.w.ICMin_A, j.w.ICMax_A = j.w.ICMin_A*(1-widen), j.w.ICMax_A*(1+widen)
			j.w.VCEMin_V, j.w.VCEMax_V = j.w.VCEMin_V*(1-widen), j.w.VCEMax_V*(1+widen)
			pass, _, err := j.judge(&bd)
			if err != nil {
				continue
			}
			boards++
			out := 0.0 // the largest relative excursion outside the span
			for k := 0; k <= 240; k++ {
				ta := b.AmbientMin_C + (b.AmbientMax_C-b.AmbientMin_C)*float64(k)/240
				op, err := j.at(&bd, ta, nil)
				if err != nil {
					t.Fatal(err)
				}
				out = max(out, op.IC_A/j.w.ICMax_A-1, 1-op.IC_A/j.w.ICMin_A, op.VCE_V/j.w.VCEMax_V-1, 1-op.VCE_V/j.w.VCEMin_V)
			}
			if pass && out > 0 {
				t.Fatalf("board passed but the sweep leaves its end span by %.3g (relative)", out)
			}
			if out > 1e-5 {
				leave++
				if pass {
					t.Fatalf("board leaves its end span by %.3g but passed", out)
				}
			}
		}
	}
	t.Logf("%d boards, %d leave their end span between the ends", boards, leave)
	if leave < 10 {
		t.Fatalf("fixture too weak: %d boards leave their end span", leave)
	}
}
