package buildjob

import (
	"context"
	"errors"
	"path/filepath"
	"testing"

	"biasbin/cmd/internal/stockparts"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/solver/fault"
	"biasbin/store"
)

// The stock here is invented (demo-style labels); the tests check how a
// kept pick becomes a build, not the circuit math.

// seed stocks a small wall and keeps a pick of it for 1 mA at 12 V; it
// returns the store and the first build's ID.
func seed(t *testing.T) (*store.DB, picker.Candidate) {
	t.Helper()
	ctx := context.Background()
	db, err := store.Open(ctx, filepath.Join(t.TempDir(), "stock.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { db.Close() })
	for _, r := range []store.Resistor{
		{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Tech: store.TechCarbonFilm, Qty: 100, Bin: "A1"},
		{Ohm: 10e3, Tol: 0.05, Rated_W: 0.25, Tech: store.TechCarbonFilm, Qty: 100, Bin: "A2"},
		{Ohm: 1e3, Tol: 0.01, Rated_W: 0.25, Tech: store.TechMetalFilm, Qty: 50, Bin: "B1"},
		{Ohm: 2200, Tol: 0.01, Rated_W: 0.25, Tech: store.TechMetalFilm, Qty: 50, Bin: "B2"},
		{Ohm: 3300, Tol: 0.05, Rated_W: 0.25, Tech: store.TechCarbonFilm, Qty: 60, Bin: "A3"},
	} {
		if _, err := db.AddResistor(ctx, r); err != nil {
			t.Fatal(err)
		}
	}
	if _, err := db.AddTransistor(ctx, store.Transistor{Label: "QX-1", Polarity: "npn", HFEMin: 110, HFEMax: 450,
		VCEO_V: 40, ICMax_A: 0.1, PD25_W: 0.5, ThetaJA_KPerW: 250, Qty: 25, Bin: "T1"}); err != nil {
		t.Fatal(err)
	}
	st, err := stockparts.Read(ctx, db)
	if err != nil {
		t.Fatal(err)
	}
	req := picker.Request{Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 1e-3, Top: 2, Seed: 1}
	out, err := job.Pick(st, req, picker.Pick)
	if err != nil || len(out.Builds) == 0 {
		t.Fatalf("pick: %v", err)
	}
	if err := KeepPick(ctx, db, out, st); err != nil {
		t.Fatal(err)
	}
	return db, out.Builds[0].Candidate
}

// qtys reads every line's quantity.
func qtys(t *testing.T, db *store.DB) map[int64]int {
	t.Helper()
	st, err := stockparts.Read(context.Background(), db)
	if err != nil {
		t.Fatal(err)
	}
	out := map[int64]int{}
	for _, r := range st.Resistors {
		out[r.ID] = r.Qty
	}
	for _, q := range st.Transistors {
		out[q.ID] = q.Qty
	}
	return out
}

// TestReserveTakesWhatThePickListed reserves a kept build and checks each
// line lost exactly its positions' count times the boards, counted here
// from the candidate's own positions.
func TestReserveTakesWhatThePickListed(t *testing.T) {
	db, c := seed(t)
	ctx := context.Background()
	before := qtys(t, db)
	const boards = 3
	want := map[int64]int{c.Transistor.ID: boards}
	for _, pos := range c.Positions {
		for _, p := range pos.Parts {
			want[p.ID] += boards
		}
	}
	res, err := Reserve(ctx, db, Order{Candidate: c.ID, Boards: boards, Note: "first run"})
	if err != nil {
		t.Fatal(err)
	}
	if res.Build.State != store.BuildOpen || res.Build.Note != "first run" || len(res.Changes) != 0 {
		t.Fatalf("build %+v", res.Build)
	}
	after := qtys(t, db)
	for id, was := range before {
		if after[id] != was-want[id] {
			t.Errorf("line %d: %d -> %d, want %d taken", id, was, after[id], want[id])
		}
	}
	if ps, err := db.Verify(ctx); err != nil || len(ps) > 0 {
		t.Fatalf("verify: %v %v", ps, err)
	}
	v, err := Show(ctx, db, res.Build.ID)
	if err != nil || v.Plan.Candidate != c.ID || v.Plan.Bands.VC.Min_V != c.Worst.VCMin_V {
		t.Fatalf("show: %+v %v", v.Plan.Bands, err)
	}
}

// TestReserveRefusals: an unknown ID, a removed line, a line whose values
// changed so that the build now breaks a limit, and too many boards.
func TestReserveRefusals(t *testing.T) {
	ctx := context.Background()
	t.Run("not kept", func(t *testing.T) {
		db, _ := seed(t)
		if _, err := Reserve(ctx, db, Order{Candidate: "b000000000000", Boards: 1}); !errors.Is(err, store.ErrNoPick) {
			t.Fatalf("error %v", err)
		}
	})
	t.Run("line removed", func(t *testing.T) {
		db, c := seed(t)
		if err := db.Remove(ctx, c.Positions["re"].Parts[0].ID); err != nil {
			t.Fatal(err)
		}
		before := qtys(t, db)
		_, err := Reserve(ctx, db, Order{Candidate: c.ID, Boards: 1})
		var re *RefusedError
		if !errors.As(err, &re) || len(re.Changes) == 0 || !re.Changes[0].Removed {
			t.Fatalf("error %v", err)
		}
		assertSame(t, before, qtys(t, db))
	})
	t.Run("quantity only changed", func(t *testing.T) {
		db, c := seed(t)
		if _, err := db.Adjust(ctx, c.Transistor.ID, -1); err != nil {
			t.Fatal(err)
		}
		res, err := Reserve(ctx, db, Order{Candidate: c.ID, Boards: 1})
		if err != nil || len(res.Changes) != 0 {
			t.Fatalf("a changed quantity is not a changed line: %v %+v", err, res.Changes)
		}
	})
	t.Run("values changed, build now breaks a limit", func(t *testing.T) {
		db, c := seed(t)
		// The transistor line now says it stands only 5 V, below the 12 V
		// rail the build sits across: every corner breaks VCEO.
		tr, err := db.TransistorByID(ctx, c.Transistor.ID)
		if err != nil {
			t.Fatal(err)
		}
		tr.VCEO_V = 5
		if _, err := db.Import(ctx, store.Batch{Transistors: []store.Transistor{tr}}, store.ImportOptions{Replace: true}); err != nil {
			t.Fatal(err)
		}
		before := qtys(t, db)
		_, err = Reserve(ctx, db, Order{Candidate: c.ID, Boards: 1})
		var re *RefusedError
		if !errors.As(err, &re) || len(re.Changes) != 1 || re.Changes[0].Line != c.Transistor.ID ||
			(len(re.Failing) == 0 && !re.NotFound) {
			t.Fatalf("error %v (%+v)", err, re)
		}
		assertSame(t, before, qtys(t, db))
	})
	t.Run("short", func(t *testing.T) {
		db, c := seed(t)
		before := qtys(t, db)
		_, err := Reserve(ctx, db, Order{Candidate: c.ID, Boards: 26}) // 25 transistors stocked
		var se *store.ShortageError
		if !errors.As(err, &se) || se.Shortages[0].Line != c.Transistor.ID || se.Shortages[0].OnHand != 25 {
			t.Fatalf("error %v", err)
		}
		assertSame(t, before, qtys(t, db))
	})
}

func assertSame(t *testing.T, before, after map[int64]int) {
	t.Helper()
	for id, q := range before {
		if after[id] != q {
			t.Errorf("line %d changed %d -> %d on a refusal", id, q, after[id])
		}
	}
}

// TestMeasureRefusals: a board the build does not have, readings beyond
// the rails and a cancelled build are refused and nothing is recorded.
func TestMeasureRefusals(t *testing.T) {
	db, c := seed(t)
	ctx := context.Background()
	res, err := Reserve(ctx, db, Order{Candidate: c.ID, Boards: 2})
	if err != nil {
		t.Fatal(err)
	}
	id := res.Build.ID
	var be *BoardError
	if _, err := Measure(ctx, db, id, 3, fault.Readings{VB_V: 2, VE_V: 1.4, VC_V: 7}); !errors.As(err, &be) {
		t.Errorf("board 3 of 2: %v", err)
	}
	var re *fault.ReadingError
	if _, err := Measure(ctx, db, id, 1, fault.Readings{VB_V: 2, VE_V: 1.4, VC_V: 30}); !errors.As(err, &re) || re.Reading != "vc" {
		t.Errorf("VC above a 12 V rail: %v", err)
	}
	if err := Cancel(ctx, db, id); err != nil {
		t.Fatal(err)
	}
	if _, err := Measure(ctx, db, id, 1, fault.Readings{VB_V: 2, VE_V: 1.4, VC_V: 7}); !errors.Is(err, store.ErrBuildState) {
		t.Errorf("cancelled build: %v", err)
	}
	if v, _ := Show(ctx, db, id); len(v.Readings) != 0 {
		t.Errorf("recorded %+v", v.Readings)
	}
}

// TestFailingBuildIsRefused: a build the pick listed although it breaks a
// hard limit (--show-failing) is not taken.
func TestFailingBuildIsRefused(t *testing.T) {
	db, c := seed(t)
	ctx := context.Background()
	kept, err := db.Pick(ctx, c.ID)
	if err != nil {
		t.Fatal(err)
	}
	p, err := decodePlan(kept.Plan)
	if err != nil {
		t.Fatal(err)
	}
	p.Figures.Failing = []picker.Failure{{Kind: picker.FailCorners, NotActive: 3, Corners: 64}}
	enc, _ := p.encode()
	if err := db.KeepPicks(ctx, []store.KeptPick{{Candidate: c.ID, Plan: enc}}); err != nil {
		t.Fatal(err)
	}
	before := qtys(t, db)
	_, err = Reserve(ctx, db, Order{Candidate: c.ID, Boards: 1})
	var re *RefusedError
	if !errors.As(err, &re) || len(re.Failing) != 1 || len(re.Changes) != 0 {
		t.Fatalf("error %v", err)
	}
	assertSame(t, before, qtys(t, db))
}

// TestKeptCautionsFollowTheirBuild: a pick's supply caution goes with every
// build it keeps, a hot-part caution only with the build it names.
func TestKeptCautionsFollowTheirBuild(t *testing.T) {
	db, _ := seed(t)
	ctx := context.Background()
	st, err := stockparts.Read(ctx, db)
	if err != nil {
		t.Fatal(err)
	}
	req := picker.Request{Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 1e-3, Top: 2, Seed: 1}
	out, err := job.Pick(st, req, picker.Pick)
	if err != nil || len(out.Builds) < 2 {
		t.Fatalf("pick: %v", err)
	}
	out.Cautions = []job.Caution{{Kind: job.CautionSupply, Value: 63, Limit: 50},
		{Kind: job.CautionHotPart, Build: out.Builds[1].Rank, Utilization: 0.9}}
	if err := KeepPick(ctx, db, out, st); err != nil {
		t.Fatal(err)
	}
	for i, want := range []int{1, 2} {
		kept, err := db.Pick(ctx, out.Builds[i].ID)
		if err != nil {
			t.Fatal(err)
		}
		p, err := decodePlan(kept.Plan)
		if err != nil || len(p.Cautions) != want || p.Cautions[0].Kind != job.CautionSupply {
			t.Errorf("build %d: cautions %+v, want %d (%v)", i+1, p.Cautions, want, err)
		}
	}
}
