package solver

import (
	"math"
	"math/rand/v2"
	"testing"
)

// dividerBuild is a four-resistor divider stage with a 3:1 hFE window
// (common practice, REFERENCE.md §4): 15 V, 10k/5k, RC 1k, RE 1k — the
// circuit of REFERENCE.md §10 row 7 and §11.
func dividerBuild() Build {
	b := Build{
		Topology: Divider,
		VCC_V:    15,
		VCCTol:   0.05,
		Device: Datasheet{Polarity: NPN, HFEMin: 100, HFEMax: 300, VBEOn_V: 0.65, VBEAt_A: 1e-3,
			VCESat_V: 0.2, ThetaJA_KPerW: 200, TjMax_C: 150},
		AmbientMin_C:     -10,
		AmbientMax_C:     60,
		NominalAmbient_C: 25,
	}
	for s, r := range map[Slot]float64{R1: 10e3, R2: 5e3, RC: 1e3, RE: 1e3} {
		b.Resistors[s] = ResistorSpec{Nominal_Ohm: r, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.25}
	}
	return b
}

func TestWorstCaseCorners(t *testing.T) {
	b := dividerBuild()
	wc, err := EvalWorstCase(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	// source: REFERENCE.md §9, EVA evaluates all 2^n min/max corners
	// (Boyd's binary-counter method): 4 resistors, supply, hFE, VBE(on),
	// ambient.
	if len(wc.Corners) != 256 || wc.Count != 256 || CornerCount(b) != 256 {
		t.Fatalf("corners = %d (count %d, CornerCount %d), want 2^8 = 256", len(wc.Corners), wc.Count, CornerCount(b))
	}
	// source: REFERENCE.md §9 [D]: in divider bias IC rises with VCC↑,
	// R2↑, R1↓, RE↓, β↑, VBE↓; and with temperature (VBE falls about 2 mV/°C and
	// beta rises, common practice). The IC extremes must sit on those
	// corners.
	hi, lo := wc.ICMaxAt, wc.ICMinAt
	checks := []struct {
		name string
		ok   bool
	}{
		{"IC max at hFE max", hi.BF == 300},
		{"IC max at VCC +5 %", hi.VCC_V > 15},
		{"IC max at R1 -5 %", hi.R_Ohm[R1] < 10e3},
		{"IC max at R2 +5 %", hi.R_Ohm[R2] > 5e3},
		{"IC max at RE -5 %", hi.R_Ohm[RE] < 1e3},
		{"IC max at the hot ambient", hi.Temp_C == 60},
		{"IC max at the low VBE(on)", hi.VBEOn_V == 0.65-DefaultVBESpread_V},
		{"IC min at the high VBE(on)", lo.VBEOn_V == 0.65+DefaultVBESpread_V},
		{"IC min at hFE min", lo.BF == 100},
		{"IC min at VCC -5 %", lo.VCC_V < 15},
		{"IC min at R1 +5 %", lo.R_Ohm[R1] > 10e3},
		{"IC min at the cold ambient", lo.Temp_C == -10},
	}
	for _, c := range checks {
		if !c.ok {
			t.Errorf("%s: not so (IC max corner %+v, IC min corner %+v)", c.name, hi, lo)
		}
	}
	if wc.Corners[wc.ICMaxCorner].OP.IC_A != wc.ICMax_A || wc.Corners[wc.VCEMinCorner].OP.VCE_V != wc.VCEMin_V {
		t.Errorf("extreme indices do not point at their corners")
	}
	// Each corner's TCR shift: R = R0(1+dev)(1+TCR(T-25)), ngspice manual
	// eq. (6) §1.3.1 (REFERENCE.md §3), with the TCR anywhere within ±100
	// ppm/K: the high level is the largest value, 1.05·(1 + 100e-6·|T−25|)
	// (RC at -10 °C: factor 1.0035).
	for _, c := range wc.Corners {
		want := 1e3 * (1 + 0.05) * (1 + 100e-6*math.Abs(c.Temp_C-25))
		if c.R_Ohm[RC] > 1e3 && math.Abs(c.R_Ohm[RC]-want) > 1e-9 {
			t.Fatalf("RC at %g °C = %g, want %g", c.Temp_C, c.R_Ohm[RC], want)
		}
		// Self-heating: Tj = Ta + θJA·P (REFERENCE.md §8).
		if tj := c.Temp_C + 200*c.OP.PTransistor_W; math.Abs(c.Tj_C-tj) > 1e-3 {
			t.Fatalf("corner Tj %g °C, want Ta + θJA·P = %g °C", c.Tj_C, tj)
		}
	}
	// The worst dissipation is each part's highest utilization over the
	// corners, each judged at its own ambient.
	var maxRC, maxQ float64
	for _, c := range wc.Corners {
		d := EvalDissipation(b, c.OP, c.Temp_C, Limits{})
		maxRC, maxQ = math.Max(maxRC, d.Resistor[RC].Utilization), math.Max(maxQ, d.Transistor.Utilization)
	}
	if wc.Dissipation.Resistor[RC].Utilization != maxRC || wc.Dissipation.Transistor.Utilization != maxQ || maxRC == 0 {
		t.Errorf("worst utilization RC %g, Q %g; want the corners' maximum %g, %g",
			wc.Dissipation.Resistor[RC].Utilization, wc.Dissipation.Transistor.Utilization, maxRC, maxQ)
	}
	if !wc.AllActive || wc.NotActive != 0 {
		t.Errorf("AllActive = %v (%d corners not active), want all active", wc.AllActive, wc.NotActive)
	}
	// The fast path gives the same extremes without the corner list.
	fast, err := WorstCaseExtremes(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	if fast.Corners != nil || fast.ICMax_A != wc.ICMax_A || fast.VCEMin_V != wc.VCEMin_V || fast.ICMaxCorner != wc.ICMaxCorner || fast.RSSIC_A != wc.RSSIC_A {
		t.Errorf("WorstCaseExtremes differs from EvalWorstCase")
	}
}

func TestWorstCaseSaturation(t *testing.T) {
	// A large RC drives the stage into saturation. source: REFERENCE.md §5
	// hand estimate: IC ≈ (VTH − VBE)/(RE + RTH/β) ≈ 4.2 mA would need
	// IC·(RC + RE) ≈ 14.3 V of the 15 V supply, leaving VCE below
	// VCE(sat) + 0.5 V; the region is confirmed by ngspice in
	// cmd/internal/checkcmd's saturation test.
	b := dividerBuild()
	b.Resistors[RC].Nominal_Ohm = 2.4e3
	wc, err := EvalWorstCase(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	if wc.AllActive || wc.NotActive == 0 {
		t.Errorf("AllActive = %v with VCE min %g V, want false", wc.AllActive, wc.VCEMin_V)
	}
	if wc.VCEMinAt.OP.Region != Saturation {
		t.Errorf("VCE-min corner region %v, want saturation", wc.VCEMinAt.OP.Region)
	}
}

func TestRSSLinearCase(t *testing.T) {
	// source: hand derivation from REFERENCE.md §5. With only RC toleranced, no self-heating and no Early
	// effect, IC does not depend on RC in the active region and
	// VCE = VCC − IC·RC − IE·RE (REFERENCE.md §5) is linear in RC with
	// slope −IC. So the corners give VCE ± IC·RC·tol exactly, and the GUM
	// combination (JCGM 100:2008 §5.1.2 eq. (10), from memory) with the
	// uniform u = a/√3 (GUM §4.3.7, from memory) gives u(VCE) = IC·RC·tol/√3.
	b := dividerBuild()
	b.VCCTol = 0
	b.Device.HFEMax = b.Device.HFEMin
	b.Device.VBEMin_V, b.Device.VBEMax_V = 0.65, 0.65 // no VBE(on) spread
	b.Device.ThetaJA_KPerW = 0
	b.AmbientMin_C, b.AmbientMax_C = 25, 25
	for s := range NumSlots {
		if s != RC {
			b.Resistors[s].Tol = 0
		}
	}
	wc, err := EvalWorstCase(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	if wc.Count != 2 {
		t.Fatalf("%d corners, want 2", wc.Count)
	}
	ic := wc.ICMax_A
	a := ic * 1e3 * 0.05
	if got := wc.VCEMax_V - wc.VCEMin_V; math.Abs(got-2*a) > 1e-6*a {
		t.Errorf("corner VCE spread %g V, want 2·IC·RC·tol = %g V", got, 2*a)
	}
	if math.Abs(wc.RSSVCE_V-a/math.Sqrt(3)) > 1e-4*a {
		t.Errorf("RSS u(VCE) = %g V, want IC·RC·tol/√3 = %g V", wc.RSSVCE_V, a/math.Sqrt(3))
	}
	if wc.RSSIC_A > 1e-9*ic {
		t.Errorf("RSS u(IC) = %g A, want 0 (IC independent of RC)", wc.RSSIC_A)
	}
}

func TestRSSAgainstCorners(t *testing.T) {
	// source: REFERENCE.md §9: the linearised EVA spread Σ|∂Y/∂x·a| matches
	// the corner spread when the output is near-linear and monotonic.
	b := dividerBuild()
	b.Device.HFEMin, b.Device.HFEMax = 180, 220 // keep beta near-linear
	wc, err := EvalWorstCase(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	r, err := EvalRSS(b)
	if err != nil {
		t.Fatal(err)
	}
	if r.UIC_A != wc.RSSIC_A || r.UVCE_V != wc.RSSVCE_V {
		t.Errorf("EvalRSS %g/%g differs from WorstCase %g/%g", r.UIC_A, r.UVCE_V, wc.RSSIC_A, wc.RSSVCE_V)
	}
	// 4 resistors and their 4 TCR bounds, vcc, hfe, vbe_on, ambient: the
	// inputs of Uncertainties.
	if r.N != 12 || r.N != len(Uncertainties(b, YieldOptions{})) {
		t.Errorf("%d RSS terms, want 12 (4 resistors, 4 TCRs, vcc, hfe, vbe_on, ambient)", r.N)
	}
	for _, tt := range []struct {
		name          string
		lin, evaHalfW float64
	}{
		{"IC", r.LinIC_A, (wc.ICMax_A - wc.ICMin_A) / 2},
		{"VCE", r.LinVCE_V, (wc.VCEMax_V - wc.VCEMin_V) / 2},
	} {
		if math.Abs(tt.lin-tt.evaHalfW) > 0.1*tt.evaHalfW {
			t.Errorf("%s: linearised EVA %g vs corner half-spread %g: more than 10 %% apart", tt.name, tt.lin, tt.evaHalfW)
		}
	}
}

// TestRSSMatchesSampledSpread checks the RSS figure against the spread of
// the output itself. source: for a linear response to independent inputs
// the GUM law of propagation (JCGM 100:2008 §5.1.2 eq. (10), from memory
// for the clause) gives exactly the output's standard deviation, and
// propagating the distributions by Monte Carlo (JCGM 101:2008, REFERENCE.md
// §9) estimates that deviation; each input rectangular on its range
// (JCGM 101 §6.4.2, REFERENCE.md §13). The build is kept near-linear
// (1 % parts, a narrow hFE range, ±10 K around 25 °C), so the two must
// agree to a few percent: an RSS that left out an input (the VBE(on)
// spread dominates here) or took u = a instead of a/√3 would not. The
// sampling below is this test's own: it solves each draw with Solve
// through SolveSelfHeated, not through the yield code.
func TestRSSMatchesSampledSpread(t *testing.T) {
	b := dividerBuild()
	b.Device.HFEMin, b.Device.HFEMax = 190, 210
	b.AmbientMin_C, b.AmbientMax_C = 15, 35
	for s := range NumSlots {
		b.Resistors[s].Tol = 0.01
	}
	r, err := EvalRSS(b)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(3, 5))
	u := func(lo, hi float64) float64 { return lo + (hi-lo)*rng.Float64() }
	vbeLo, vbeHi, _ := VBEOnRange(b.Device)
	const n = 6000
	var ic, vce []float64
	for range n {
		var dev, tcr [NumSlots]float64
		for _, s := range []Slot{R1, R2, RC, RE} {
			dev[s] = u(-0.01, 0.01)
			tcr[s] = u(-100, 100)
		}
		vccF := u(0.95, 1.05)
		d := b.Device
		d.VBEOn_V = u(vbeLo, vbeHi)
		m, err := ModelFor(d, u(190, 210))
		if err != nil {
			t.Fatal(err)
		}
		ta := u(15, 35)
		st := b.resolveTCR(&dev, &tcr, vccF, vccF, ta)
		op, err := SolveSelfHeated(st, m, ta, ThermalResistance(d), 150)
		if err != nil {
			t.Fatal(err)
		}
		ic, vce = append(ic, op.IC_A), append(vce, op.VCE_V)
	}
	sd := func(x []float64) float64 {
		var s, s2 float64
		for _, v := range x {
			s += v
		}
		mean := s / float64(len(x))
		for _, v := range x {
			s2 += (v - mean) * (v - mean)
		}
		return math.Sqrt(s2 / float64(len(x)-1))
	}
	// The sample deviation of n = 6000 draws has a relative standard
	// error of about 1/√(2n) ≈ 0.9 %; allow 5 %.
	for _, tt := range []struct {
		name    string
		rss, mc float64
	}{{"IC", r.UIC_A, sd(ic)}, {"VCE", r.UVCE_V, sd(vce)}} {
		if math.Abs(tt.rss-tt.mc) > 0.05*tt.mc {
			t.Errorf("%s: RSS %g, sampled standard deviation %g: more than 5 %% apart", tt.name, tt.rss, tt.mc)
		}
	}
}

func BenchmarkWorstCaseDivider(b *testing.B) {
	bd := dividerBuild()
	for b.Loop() {
		if _, err := WorstCaseExtremes(bd, Limits{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkWorstCaseDividerCorners(b *testing.B) {
	bd := dividerBuild()
	for b.Loop() {
		if _, err := EvalWorstCaseWith(bd, Limits{}, WorstCaseOptions{SkipRSS: true}); err != nil {
			b.Fatal(err)
		}
	}
}
