package solver

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// randomBuild draws a build over bench-realistic ranges (seeded): any
// topology and polarity, resistors 100 Ω..1 MΩ with tolerances 0..10 %
// and TCR up to ±500 ppm/K, supplies 3..30 V with 0..10 %, hFE windows up
// to 4:1, θJA 0 or 50..500 K/W, ambient ranges within −40..100 °C.
func randomBuild(rng *rand.Rand) Build {
	logU := func(lo, hi float64) float64 { return lo * math.Pow(hi/lo, rng.Float64()) }
	pick := func(v ...float64) float64 { return v[rng.IntN(len(v))] }
	b := Build{Topology: Topology(1 + rng.IntN(3)), VCC_V: logU(3, 30), VCCTol: pick(0, 0.02, 0.05, 0.1)}
	for _, sl := range b.Topology.Slots() {
		b.Resistors[sl] = ResistorSpec{Nominal_Ohm: logU(100, 1e6), Tol: pick(0, 0.01, 0.02, 0.05, 0.1),
			TCR_PPMPerK: pick(0, 50, 100, 250, -500) * rng.Float64(), Rated_W: pick(0, 0.125, 0.25, 0.5)}
	}
	if rng.IntN(4) == 0 {
		b.Resistors[RE] = ResistorSpec{}
	}
	if b.Topology == SplitSupply {
		b.VEE_V = -logU(1, 15)
		// 0 (VCCTol's) or a tolerance of its own, taken from the rail's
		// digits so the draws that follow stay as they were
		b.VEETol = []float64{0, 0, 0.01, 0.1}[int(-b.VEE_V*1e3)%4]
		if b.Resistors[RE].Nominal_Ohm == 0 {
			b.Resistors[RE] = ResistorSpec{Nominal_Ohm: logU(100, 1e5), Tol: 0.05}
		}
	}
	hfeMin := logU(30, 300)
	b.Device = Datasheet{Polarity: NPN, HFEMin: hfeMin, HFEMax: hfeMin * pick(1, 1.5, 2, 4), VBEOn_V: 0.55 + 0.2*rng.Float64(),
		VBEAt_A: logU(1e-4, 1e-2), VCESat_V: 0.2, ThetaJA_KPerW: pick(0, logU(50, 500), logU(50, 500)), TjMax_C: pick(0, 125, 150, 175)}
	if rng.IntN(2) == 0 {
		b.Device.VAF_V = logU(20, 200)
		if rng.IntN(2) == 0 {
			b.Device.VAFMin_V, b.Device.VAFMax_V = 0.7*b.Device.VAF_V, 1.5*b.Device.VAF_V
		}
	}
	if rng.IntN(3) == 0 {
		b.Device.VBEMin_V, b.Device.VBEMax_V = b.Device.VBEOn_V-0.04*rng.Float64(), b.Device.VBEOn_V+0.04*rng.Float64()
	}
	if rng.IntN(3) == 0 {
		b.Device.ICBO_A = logU(1e-10, 1e-7)
	}
	if rng.IntN(2) == 0 {
		b.Device.Polarity = PNP
		b.VCC_V, b.VEE_V = -b.VCC_V, -b.VEE_V
	}
	b.AmbientMin_C = -40 + 65*rng.Float64()
	b.AmbientMax_C = b.AmbientMin_C
	if rng.IntN(5) != 0 {
		b.AmbientMax_C += 75 * rng.Float64()
	}
	b.NominalAmbient_C = 25
	return b
}

// referenceCorner solves corner k of b the plain way: the corner's inputs
// taken from its number as EvalWorstCase documents it (bit j high = axis j
// at its high level; axes are the toleranced resistors in slot order, then
// the supply, the emitter rail of a split supply, hFE, VBE(on), VAF and
// the ambient, each only when it has a
// spread; a resistor's level at ambient Ta is R·(1 ± tol)·(1 ± |TCR|·|Ta −
// 25 °C|), one without tolerance at its upper end) and one SolveSelfHeated
// call from scratch.
func referenceCorner(b Build, k int) (Corner, error) {
	n := 0
	for i := range NumSlots {
		if b.Topology.uses(i) && b.Resistors[i].Nominal_Ohm > 0 && b.Resistors[i].Tol > 0 {
			n++
		}
	}
	vbeLo, vbeHi, _ := VBEOnRange(b.Device)
	vafLo, vafHi := VAFRange(b.Device)
	split := b.Topology == SplitSupply && (b.VEETol > 0 || b.VCCTol > 0)
	veeTol := b.VEETol
	if veeTol == 0 {
		veeTol = b.VCCTol
	}
	for _, spread := range []bool{b.VCCTol > 0, split, b.Device.HFEMax > b.Device.HFEMin, vbeHi > vbeLo, vafHi > vafLo} {
		if spread {
			n++
		}
	}
	ambient := b.AmbientMin_C
	if b.AmbientMax_C > b.AmbientMin_C && k>>n&1 == 1 {
		ambient = b.AmbientMax_C
	}
	drift := math.Abs(ambient-25) * 1e-6
	var r [NumSlots]float64
	vccFactor, bf, vbe, vaf := 1.0, b.Device.HFEMin, vbeLo, vafLo
	j := 0
	bit := func() bool { hi := k>>j&1 == 1; j++; return hi }
	for i := range NumSlots {
		rs := b.Resistors[i]
		if !b.Topology.uses(i) || rs.Nominal_Ohm == 0 {
			continue
		}
		a := math.Abs(rs.TCR_PPMPerK) * drift
		if rs.Tol == 0 || bit() {
			r[i] = rs.Nominal_Ohm * (1 + rs.Tol) * (1 + a)
		} else {
			r[i] = rs.Nominal_Ohm * (1 - rs.Tol) * (1 - a)
		}
	}
	if b.VCCTol > 0 {
		vccFactor = 1 - b.VCCTol
		if bit() {
			vccFactor = 1 + b.VCCTol
		}
	}
	veeFactor := vccFactor
	if split {
		veeFactor = 1 - veeTol
		if bit() {
			veeFactor = 1 + veeTol
		}
	}
	if b.Device.HFEMax > b.Device.HFEMin && bit() {
		bf = b.Device.HFEMax
	}
	if vbeHi > vbeLo && bit() {
		vbe = vbeHi
	}
	if vafHi > vafLo && bit() {
		vaf = vafHi
	}
	d := b.Device
	d.VBEOn_V, d.VBEMin_V, d.VBEMax_V = vbe, 0, 0
	d.VAF_V, d.VAFMin_V, d.VAFMax_V = vaf, 0, 0
	m, err := ModelFor(d, bf)
	if err != nil {
		return Corner{}, err
	}
	s := b.Resolve([NumSlots]float64{}, vccFactor, 25)
	s.VEE_V = b.VEE_V * veeFactor
	for i := range NumSlots {
		if r[i] > 0 {
			s.R_Ohm[i] = r[i]
		}
	}
	if re := b.Resistors[RE].Nominal_Ohm; re > 0 && b.RBypass_Ohm > 0 {
		s.RBypass_Ohm = s.R_Ohm[RE] * math.Min(b.RBypass_Ohm/re, 1)
	}
	op, err := SolveSelfHeated(s, m, ambient, ThermalResistance(b.Device), tjMaxOf(b.Device))
	return Corner{BF: bf, VBEOn_V: vbe, VAF_V: vaf, IS_A: m.IS_A, Temp_C: ambient, Tj_C: op.Tj_C, VCC_V: s.VCC_V, VEE_V: s.VEE_V, R_Ohm: s.R_Ohm, OP: op}, err
}

// TestWorstCaseFastPathMatchesReferencePath is a regression check of the
// corner enumeration's fast path (models, devices and input checks shared
// across corners, the full result built only where kept) against the
// reference path, one plain SolveSelfHeated per corner, over random
// builds: the same corners, IC, VCE and Tj to 1e-9 relative, the same
// regions, the same extremes with the same first-k tie-breaking, and the
// same error for a build that fails. The outside references for the
// solves themselves are the ngspice comparisons (ngspice_test.go,
// thermal_test.go).
func TestWorstCaseFastPathMatchesReferencePath(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 43))
	near := func(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b)) }
	var corners, failed int
	for i := range 1500 {
		b := randomBuild(rng)
		wc, err := EvalWorstCase(b, Limits{})
		n := CornerCount(b)
		var ref []Corner
		var refErr error
		for k := range n {
			c, err := referenceCorner(b, k)
			if err != nil {
				refErr = err
				break
			}
			ref = append(ref, c)
		}
		if refErr != nil || err != nil {
			failed++
			if refErr == nil || err == nil || !strings.Contains(err.Error(), refErr.Error()) {
				t.Fatalf("#%d: fast path error %v, reference path error %v", i, err, refErr)
			}
			continue
		}
		if len(wc.Corners) != n {
			t.Fatalf("#%d: %d corners, want %d", i, len(wc.Corners), n)
		}
		icMin, icMax, vceMin, vceMax := 0, 0, 0, 0
		for k, r := range ref {
			c := wc.Corners[k]
			corners++
			sameR := true
			for s := range NumSlots {
				sameR = sameR && near(c.R_Ohm[s], r.R_Ohm[s])
			}
			if c.BF != r.BF || c.VBEOn_V != r.VBEOn_V || c.VAF_V != r.VAF_V || !near(c.IS_A, r.IS_A) || c.Temp_C != r.Temp_C || c.VCC_V != r.VCC_V || !sameR {
				t.Fatalf("#%d corner %d: inputs %+v, reference %+v", i, k, c, r)
			}
			if !near(c.OP.IC_A, r.OP.IC_A) || !near(c.OP.VCE_V, r.OP.VCE_V) || !near(c.Tj_C, r.Tj_C) || c.OP.Region != r.OP.Region {
				t.Fatalf("#%d corner %d: IC %.12g A, VCE %.12g V, Tj %.12g °C, %v; reference %.12g A, %.12g V, %.12g °C, %v",
					i, k, c.OP.IC_A, c.OP.VCE_V, c.Tj_C, c.OP.Region, r.OP.IC_A, r.OP.VCE_V, r.Tj_C, r.OP.Region)
			}
			// First k in increasing k wins a tie.
			if r.OP.IC_A < ref[icMin].OP.IC_A {
				icMin = k
			}
			if r.OP.IC_A > ref[icMax].OP.IC_A {
				icMax = k
			}
			if r.OP.VCE_V < ref[vceMin].OP.VCE_V {
				vceMin = k
			}
			if r.OP.VCE_V > ref[vceMax].OP.VCE_V {
				vceMax = k
			}
		}
		if wc.ICMinCorner != icMin || wc.ICMaxCorner != icMax || wc.VCEMinCorner != vceMin || wc.VCEMaxCorner != vceMax {
			t.Fatalf("#%d: extreme corners IC %d/%d, VCE %d/%d; reference %d/%d, %d/%d", i,
				wc.ICMinCorner, wc.ICMaxCorner, wc.VCEMinCorner, wc.VCEMaxCorner, icMin, icMax, vceMin, vceMax)
		}
	}
	t.Logf("%d corners compared, %d builds failed alike", corners, failed)
	if failed == 1500 || corners == 0 {
		t.Fatalf("no build evaluated")
	}
}

// TestCornerStageIsTheCorner: CornerStage, the one home of a corner's
// circuit for callers outside the enumeration, gives exactly the
// resistances and rails of the corner EvalWorstCase solves with the same
// ends (axes in the documented order: the toleranced resistors by slot,
// the supply, a split supply's own rail, hFE, VBE(on), VAF, the ambient),
// over random builds. The outside reference for the corners themselves is
// TestWorstCaseFastPathMatchesReferencePath.
func TestCornerStageIsTheCorner(t *testing.T) {
	rng := rand.New(rand.NewPCG(47, 53))
	compared := 0
	for i := range 400 {
		b := randomBuild(rng)
		wc, err := EvalWorstCase(b, Limits{})
		if err != nil {
			continue
		}
		k := rng.IntN(wc.Count)
		j := 0
		bit := func() bool { hi := k>>j&1 == 1; j++; return hi }
		var high [NumSlots]bool
		for s := range NumSlots {
			if b.usedSlot(s) && b.Resistors[s].Tol > 0 {
				high[s] = bit()
			}
		}
		vccHigh := b.VCCTol > 0 && bit()
		veeHigh := b.railsApart() && bit()
		vbeLo, vbeHi, _ := VBEOnRange(b.Device)
		vafLo, vafHi := VAFRange(b.Device)
		for _, axis := range []bool{b.Device.HFEMax > b.Device.HFEMin, vbeHi > vbeLo, vafHi > vafLo} {
			if axis {
				bit()
			}
		}
		ambHigh := b.AmbientMax_C > b.AmbientMin_C && bit()
		s := b.CornerStage(high, vccHigh, veeHigh, ambHigh)
		c := wc.Corners[k]
		if s.R_Ohm != c.R_Ohm || s.VCC_V != c.VCC_V || s.VEE_V != c.VEE_V {
			t.Fatalf("#%d corner %d: CornerStage R %v VCC %g VEE %g, the corner's %v %g %g", i, k, s.R_Ohm, s.VCC_V, s.VEE_V, c.R_Ohm, c.VCC_V, c.VEE_V)
		}
		amb := b.AmbientMin_C
		if ambHigh {
			amb = b.AmbientMax_C
		}
		for sl := range NumSlots {
			if !b.usedSlot(sl) {
				continue
			}
			// CornerFactor is the same rule, one resistor at a time
			if f := b.Resistors[sl].Nominal_Ohm * b.Resistors[sl].CornerFactor(high[sl], amb); math.Abs(f-s.R_Ohm[sl]) > 1e-12*s.R_Ohm[sl] {
				t.Fatalf("#%d corner %d slot %d: CornerFactor gives %g, the corner %g", i, k, sl, f, s.R_Ohm[sl])
			}
		}
		compared++
	}
	if compared < 200 {
		t.Fatalf("only %d builds compared", compared)
	}
}

// TestCornerFactor: a part marked with a tolerance lies within (1 ± tol)
// of its marking at 25 °C, and its TCR (ppm/K, referred to 25 °C) moves it
// by TCR·ΔT beyond that (common practice: tolerance and TCR as resistor
// datasheets state them); a worst-case corner takes the end of both that
// moves it one way.
func TestCornerFactor(t *testing.T) {
	for _, c := range []struct {
		name string
		r    ResistorSpec
		high bool
		amb  float64
		want float64
	}{
		{"5 %, 100 ppm/K, high end at 75 °C", ResistorSpec{Nominal_Ohm: 1e4, Tol: 0.05, TCR_PPMPerK: 100}, true, 75, 1.05 * 1.005},
		{"5 %, 100 ppm/K, low end at 75 °C", ResistorSpec{Nominal_Ohm: 1e4, Tol: 0.05, TCR_PPMPerK: 100}, false, 75, 0.95 * 0.995},
		{"1 %, −50 ppm/K, high end at 0 °C", ResistorSpec{Nominal_Ohm: 1e4, Tol: 0.01, TCR_PPMPerK: -50}, true, 0, 1.01 * 1.00125},
		{"1 %, 50 ppm/K, low end at 0 °C", ResistorSpec{Nominal_Ohm: 1e4, Tol: 0.01, TCR_PPMPerK: 50}, false, 0, 0.99 * 0.99875},
		{"no tolerance, 200 ppm/K, low asked at 75 °C: up", ResistorSpec{Nominal_Ohm: 1e4, TCR_PPMPerK: 200}, false, 75, 1.01},
		{"no tolerance, no TCR", ResistorSpec{Nominal_Ohm: 1e4}, true, 75, 1},
	} {
		if got := c.r.CornerFactor(c.high, c.amb); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("%s: %.12g, want %.12g", c.name, got, c.want)
		}
	}
}
