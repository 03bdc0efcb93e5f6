package safety

import (
	"math"
	"slices"
	"testing"

	"biasbin/solver"
)

// build is a divider stage with the given resistor ratings (invented
// demo-style values; only the figures under test matter).
func build(vcc float64, rated_W float64, d solver.Datasheet) solver.Build {
	b := solver.Build{Topology: solver.Divider, VCC_V: vcc, Device: d, AmbientMin_C: 0, AmbientMax_C: 25, NominalAmbient_C: 25}
	for _, s := range []solver.Slot{solver.R1, solver.R2, solver.RC, solver.RE} {
		b.Resistors[s] = solver.ResistorSpec{Nominal_Ohm: 1000, Tol: 0.05, Rated_W: rated_W}
	}
	return b
}

var rated = solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, VCEO_V: 80, PD25_W: 0.625, ICMax_A: 0.2}

// assess runs Assess on a worst case whose RC power, VCE and Tj are given.
func assess(b solver.Build, pRC, vce, tj float64) []Caution {
	var op solver.OperatingPoint
	op.P_W[solver.RC] = pRC
	op.V_V[solver.RC] = math.Sqrt(pRC * b.Resistors[solver.RC].Nominal_Ohm)
	op.VCE_V, op.IC_A, op.Tj_C = vce, 1e-3, tj
	wc := solver.WorstCase{AllActive: true, Count: 1, VCEMax_V: vce, ICMax_A: 1e-3, TjMax_C: tj,
		Dissipation: solver.EvalDissipation(b, op, b.AmbientMax_C, solver.Limits{})}
	return Assess(Input{Build: b, Nominal: op, Worst: &wc})
}

func find(cs []Caution, k Kind, part string) *Caution {
	for i := range cs {
		if cs[i].Kind == k && cs[i].Part == part {
			return &cs[i]
		}
	}
	return nil
}

// TestOverRating: a ⅛ W resistor dissipating 0.2 W at 25 °C is at 160 %
// of its rating (below the 70 °C knee the full rating holds, REFERENCE.md
// §3); to keep 0.2 W within the 50 % design limit (common practice,
// REFERENCE.md §3) it needs a rating of at least 0.4 W.
func TestOverRating(t *testing.T) {
	cs := assess(build(12, 0.125, rated), 0.2, 6, 40)
	c := find(cs, OverRating, "rc")
	if c == nil {
		t.Fatalf("no over-rating caution for RC: %+v", cs)
	}
	if math.Abs(c.RatingUse-1.6) > 1e-12 || math.Abs(c.NeedRated_W-0.4) > 1e-12 || !c.Fails {
		t.Fatalf("RC: rating use %g, need %g W, fails %v; want 1.6, 0.4 W, true", c.RatingUse, c.NeedRated_W, c.Fails)
	}
	if v := VerdictOf(cs); !v.Fails || v.First.Kind != OverRating {
		t.Fatalf("verdict %+v", v)
	}
	// 0.11 W in a ¼ W part is at 88 % of its 0.125 W design limit: a
	// caution, not a failure.
	cs = assess(build(12, 0.25, rated), 0.11, 6, 40)
	if find(cs, NearDesignLimit, "rc") == nil || VerdictOf(cs).Fails {
		t.Fatalf("¼ W at 0.11 W: %+v", cs)
	}
}

// TestHotSurface: a resistor's element rises P/P_rated·(155 − 70) K above
// the ambient (the IEC 60115-1 derating curve, REFERENCE.md §3); the touch
// limit is 60 °C (ISO 13732-1 / IEC 62368-1, REFERENCE.md §15, from
// memory). A ¼ W part at 0.1 W rises 34 K: 59 °C at 25 °C ambient is
// below the limit, 64 °C at 30 °C is above it, though both are within the
// part's rating.
func TestHotSurface(t *testing.T) {
	b := build(12, 0.25, rated)
	if c := find(assess(b, 0.1, 6, 40), HotSurface, "rc"); c != nil {
		t.Fatalf("25 °C: %+v", c)
	}
	b.AmbientMax_C = 30
	c := find(assess(b, 0.1, 6, 40), HotSurface, "rc")
	if c == nil || math.Abs(c.Surface_C-64) > 1e-9 || c.Limit_C != 60 || c.Fails {
		t.Fatalf("30 °C: %+v", c)
	}
	// A transistor whose junction reaches 75 °C: its case can burn too.
	if c := find(assess(build(12, 0.25, rated), 0.01, 6, 75), HotSurface, PartTransistor); c == nil || c.Surface_C != 75 {
		t.Fatalf("transistor at Tj 75 °C: %+v", c)
	}
}

// TestVCEOFailsTheBuild: a corner with VCE 234 V on an 80 V part breaks
// down the part (VCEO is the breakdown voltage with the base open, common
// practice); the verdict fails on it.
func TestVCEOFailsTheBuild(t *testing.T) {
	cs := assess(build(250, 0.25, rated), 0.01, 234, 40)
	c := find(cs, OverVCEO, "")
	if c == nil || c.VCE_V != 234 || c.VCEO_V != 80 {
		t.Fatalf("%+v", cs)
	}
	if v := VerdictOf(cs); !v.Fails {
		t.Fatalf("verdict %+v", v)
	}
	// Within VCEO at every corner but a supply above it: a caution only.
	cs = assess(build(100, 0.25, rated), 0.01, 40, 40)
	if find(cs, SupplyOverVCEO, "") == nil || find(cs, OverVCEO, "") != nil {
		t.Fatalf("%+v", cs)
	}
}

// TestSupplyVoltageBands: 60 V d.c. is the touchable limit (IEC 62368-1
// ES1, IEC 60364-4-41 §414.4.5; from memory), 120 V ripple-free d.c. the
// top of the ELV band (IEC 61140; REFERENCE.md §17). The span is taken at
// the top of the supply tolerance.
func TestSupplyVoltageBands(t *testing.T) {
	tests := []struct {
		vcc, tol float64
		want     Kind
	}{
		{48, 0.05, 0},                  // 50.4 V
		{58, 0.05, AboveTouchVoltage},  // 60.9 V
		{110, 0.05, AboveTouchVoltage}, // 115.5 V
		{118, 0.05, AboveELV},          // 123.9 V
		{230, 0, AboveELV},
	}
	hv := rated
	hv.VCEO_V = 400
	for _, tt := range tests {
		b := build(tt.vcc, 0.25, hv)
		b.VCCTol = tt.tol
		cs := assess(b, 0.01, 10, 40)
		got := Kind(0)
		for _, c := range cs {
			if c.Kind == AboveTouchVoltage || c.Kind == AboveELV {
				got = c.Kind
			}
		}
		if got != tt.want {
			t.Errorf("%g V ±%g: %v, want %v", tt.vcc, tt.tol, got, tt.want)
		}
	}
}

// TestUnknownRatingsCaution: an inline transistor with only its hFE says
// which ratings are unknown (solver.UnknownRatings).
func TestUnknownRatingsCaution(t *testing.T) {
	cs := assess(build(12, 0.25, solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 300}), 0.01, 6, 25)
	c := find(cs, UnknownRatings, "")
	if c == nil || !slices.Equal(c.Ratings, []solver.Rating{solver.RatingVCEO, solver.RatingDissipation}) || c.Fails {
		t.Fatalf("%+v", cs)
	}
}

// TestElementVoltageFails: a 1 MΩ ¼ W resistor at 170 V is within its
// power but over 80 % of the 200 V default LEV (REFERENCE.md §3, §16).
func TestElementVoltageFails(t *testing.T) {
	b := build(250, 0.25, solver.Datasheet{Polarity: solver.NPN, HFEMin: 100, HFEMax: 300, VCEO_V: 400, PD25_W: 1})
	b.Resistors[solver.RC].Nominal_Ohm = 1e6
	cs := assess(b, 170*170/1e6, 50, 40)
	c := find(cs, OverElementVoltage, "rc")
	if c == nil || c.LEV_V != 200 || !c.LEVDefaulted || c.VoltageAllow != 160 || !c.Fails {
		t.Fatalf("%+v", cs)
	}
}
