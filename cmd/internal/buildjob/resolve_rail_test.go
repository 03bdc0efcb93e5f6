package buildjob

import (
	"context"
	"path/filepath"
	"testing"

	"biasbin/cmd/internal/stockparts"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/store"
)

// TestResolveKeepsTheRail: a kept PNP build solved again (its lines
// changed) stays on the rail it was picked on, so the bands a board was
// measured against do not flip sign; a plan stored before builds kept a
// ground (0 V on the emitter-side rail, the negative supply) stays there.
func TestResolveKeepsTheRail(t *testing.T) {
	ctx := context.Background()
	db, err := store.Open(ctx, filepath.Join(t.TempDir(), "stock.db"))
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	for _, ohm := range []float64{470, 1e3, 1.5e3, 2.2e3, 3.3e3, 4.7e3, 10e3} {
		if _, err := db.AddResistor(ctx, store.Resistor{Ohm: ohm, Tol: 0.05, Rated_W: 0.25, Tech: store.TechCarbonFilm, Qty: 50, Bin: "A"}); err != nil {
			t.Fatal(err)
		}
	}
	if _, err := db.AddTransistor(ctx, store.Transistor{Label: "QP-9", Polarity: "pnp", HFEMin: 100, HFEMax: 300,
		VCEO_V: 40, ICMax_A: 0.1, PD25_W: 0.5, ThetaJA_KPerW: 250, Qty: 25, Bin: "T"}); err != nil {
		t.Fatal(err)
	}
	st, err := stockparts.Read(ctx, db)
	if err != nil {
		t.Fatal(err)
	}
	out, err := job.Pick(st, picker.Request{Polarity: solver.PNP, VCC_V: -5, VCCTol: 0.05, IC_A: 1e-3, Top: 1, Seed: 1}, picker.Pick)
	if err != nil || len(out.Builds) == 0 {
		t.Fatalf("pick: %v", err)
	}
	c := out.Builds[0].Candidate
	if c.Build.Ground != solver.CollectorRailGround {
		t.Fatalf("picked ground %v, want collector-rail (the positive supply, the default)", c.Build.Ground)
	}
	for _, tt := range []struct {
		name   string
		ground solver.Ground
		rail   solver.RailSign
	}{
		{"kept on the positive supply", solver.CollectorRailGround, solver.PositiveRail},
		{"stored before grounds were kept", solver.EmitterRailGround, solver.RailFromSupply},
	} {
		p := PlanFor(c, out.Request, st)
		p.Build.Ground, p.Request.Rail = tt.ground, tt.rail
		got, ok, err := resolve(p, st)
		if err != nil || !ok {
			t.Fatalf("%s: resolve: %v, found %v", tt.name, err, ok)
		}
		if got.Build.Ground != tt.ground {
			t.Errorf("%s: solved again on ground %v, want %v", tt.name, got.Build.Ground, tt.ground)
		}
	}
}
