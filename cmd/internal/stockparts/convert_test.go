package stockparts

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"biasbin/picker"
	"biasbin/solver"
	"biasbin/store"
)

func TestToStock(t *testing.T) {
	rs := []store.Resistor{
		// A line that states everything keeps it.
		{ID: 7, Ohm: 4700, Tol: 0.01, Rated_W: 0.25, Knee_C: 85, Max_C: 125, TCR_PPMPerK: 25, Tech: store.TechThinFilm, Qty: 12, Bin: "A1", Tags: []string{"approved"}},
		// Zero ratings take the store's documented defaults: 70 °C knee,
		// 155 °C zero power (IEC 60115-1 style, from memory), carbon film
		// -500 ppm/K (common practice).
		{ID: 8, Ohm: 330, Tol: 0.05, Rated_W: 0.5, Tech: store.TechCarbonFilm, Qty: 3, Bin: "B2"},
		// No technology: thick film, 100 ppm/K (common practice).
		{ID: 9, Ohm: 1e6, Tol: 0.05, Rated_W: 0.125, Qty: 0},
	}
	ts := []store.Transistor{
		{ID: 20, Label: "QP-220", Polarity: "pnp", HFEMin: 100, HFEMax: 300, HFETyp: 170, HFEAt_A: 2e-3, VBEOn_V: 0.68, VBEAt_A: 2e-3,
			VCESat_V: 0.25, VCEO_V: 45, ICMax_A: 0.5, PD25_W: 0.625, ThetaJA_KPerW: 200, TjMax_C: 150, VAF_V: 90, ICBO_A: 1e-8,
			Qty: 14, Bin: "D4", Tags: []string{"rohs"}},
		// Zero VBE(on), its current and Tj max take 0.65 V at 1 mA and
		// 150 °C (common practice).
		{ID: 21, Label: "QN-104A", Polarity: "NPN", HFEMin: 110, HFEMax: 330, Qty: 2, Bin: "D1"},
	}
	got, err := Stock(rs, ts)
	if err != nil {
		t.Fatal(err)
	}
	wantR := []picker.Resistor{
		{ID: 7, Ohm: 4700, Tol: 0.01, TCR_PPMPerK: 25, Rated_W: 0.25, Knee_C: 85, Max_C: 125, Qty: 12, Bin: "A1", Tags: []string{"approved"}},
		{ID: 8, Ohm: 330, Tol: 0.05, TCR_PPMPerK: -500, Rated_W: 0.5, Knee_C: 70, Max_C: 155, Qty: 3, Bin: "B2"},
		{ID: 9, Ohm: 1e6, Tol: 0.05, TCR_PPMPerK: 100, Rated_W: 0.125, Knee_C: 70, Max_C: 155, Qty: 0},
	}
	if len(got.Resistors) != len(wantR) {
		t.Fatalf("%d resistors, want %d", len(got.Resistors), len(wantR))
	}
	for i, w := range wantR {
		g := got.Resistors[i]
		if g.ID != w.ID || g.Ohm != w.Ohm || g.Tol != w.Tol || g.TCR_PPMPerK != w.TCR_PPMPerK || g.Rated_W != w.Rated_W ||
			g.Knee_C != w.Knee_C || g.Max_C != w.Max_C || g.Qty != w.Qty || g.Bin != w.Bin || strings.Join(g.Tags, ",") != strings.Join(w.Tags, ",") {
			t.Errorf("resistor %d:\n got %+v\nwant %+v", w.ID, g, w)
		}
	}
	wantT := []picker.Transistor{
		{ID: 20, Qty: 14, Bin: "D4", Tags: []string{"rohs"}, Sheet: solver.Datasheet{Label: "QP-220", Polarity: solver.PNP,
			HFEMin: 100, HFEMax: 300, HFETyp: 170, HFEAt_A: 2e-3, VBEOn_V: 0.68, VBEAt_A: 2e-3, VCESat_V: 0.25, VCEO_V: 45,
			ICMax_A: 0.5, PD25_W: 0.625, ThetaJA_KPerW: 200, TjMax_C: 150, VAF_V: 90, ICBO_A: 1e-8}},
		{ID: 21, Qty: 2, Bin: "D1", Sheet: solver.Datasheet{Label: "QN-104A", Polarity: solver.NPN, HFEMin: 110, HFEMax: 330,
			VBEOn_V: 0.65, VBEAt_A: 1e-3, TjMax_C: 150}},
	}
	if len(got.Transistors) != len(wantT) {
		t.Fatalf("%d transistors, want %d", len(got.Transistors), len(wantT))
	}
	for i, w := range wantT {
		g := got.Transistors[i]
		if g.ID != w.ID || g.Qty != w.Qty || g.Bin != w.Bin || g.Sheet != w.Sheet || strings.Join(g.Tags, ",") != strings.Join(w.Tags, ",") {
			t.Errorf("transistor %d:\n got %+v\nwant %+v", w.ID, g, w)
		}
	}
}

// TestBadStockLines: a line whose data the solver refuses is a
// *LineError naming the line and the field; the solver's accepted ranges
// are the reference (tolerance below 50 %, npn or pnp, hFE max not below
// hFE min).
func TestBadStockLines(t *testing.T) {
	tests := []struct {
		name  string
		rs    []store.Resistor
		ts    []store.Transistor
		id    int64
		field string
	}{
		{"polarity", nil, []store.Transistor{{ID: 5, Label: "QX-1", Polarity: "fet", HFEMin: 1, HFEMax: 2}}, 5, "polarity"},
		{"hFE reversed", nil, []store.Transistor{{ID: 6, Label: "QX-2", Polarity: "npn", HFEMin: 300, HFEMax: 100}}, 6, "hfe_max"},
		{"60 % tolerance", []store.Resistor{{ID: 7, Ohm: 4700, Tol: 0.6, Rated_W: 0.25, Qty: 3}}, nil, 7, "tolerance"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Stock(tt.rs, tt.ts)
			var le *LineError
			if !errors.As(err, &le) || le.ID != tt.id || le.Field != tt.field {
				t.Fatalf("err = %v, want a LineError for line %d, field %s", err, tt.id, tt.field)
			}
			if !strings.Contains(err.Error(), fmt.Sprintf("stock line #%d", tt.id)) {
				t.Errorf("message %q does not name the line", err)
			}
		})
	}
}

// TestSheetCarriesSpreads: a line's stocked VBE(on) and Early-voltage
// ranges reach the solver's datasheet (the Monte Carlo draws within them,
// solver.VBEOnRange); a line without them leaves the solver's default
// spread, ±solver.DefaultVBESpread_V around VBE(on) (common practice).
func TestSheetCarriesSpreads(t *testing.T) {
	line := store.Transistor{ID: 4, Label: "QX-9", Polarity: "npn", HFEMin: 100, HFEMax: 300, VBEOn_V: 0.66, VAF_V: 80,
		VBEMin_V: 0.62, VBEMax_V: 0.7, VAFMin_V: 60, VAFMax_V: 110} // invented line
	d, err := Sheet(line)
	if err != nil {
		t.Fatal(err)
	}
	if lo, hi, stated := solver.VBEOnRange(d); lo != 0.62 || hi != 0.7 || !stated {
		t.Errorf("VBE(on) range %g..%g (stated %v), want the stocked 0.62..0.7", lo, hi, stated)
	}
	if lo, hi := solver.VAFRange(d); lo != 60 || hi != 110 {
		t.Errorf("VAF range %g..%g, want the stocked 60..110", lo, hi)
	}
	line.VBEMin_V, line.VBEMax_V = 0, 0
	if d, err = Sheet(line); err != nil {
		t.Fatal(err)
	}
	if lo, hi, stated := solver.VBEOnRange(d); stated || math.Abs(lo-(0.66-solver.DefaultVBESpread_V)) > 1e-12 || math.Abs(hi-(0.66+solver.DefaultVBESpread_V)) > 1e-12 {
		t.Errorf("unstocked VBE(on) range %g..%g (stated %v), want 0.66 V ± the default spread", lo, hi, stated)
	}
	line.VBEOn_V = 0.75
	line.VBEMin_V, line.VBEMax_V = 0.62, 0.7
	var le *LineError
	if _, err := Sheet(line); !errors.As(err, &le) || le.Field != "vbe_on" {
		t.Errorf("VBE(on) outside the stocked range: err %v, want a LineError on vbe_on", err)
	}
}
