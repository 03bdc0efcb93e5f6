package store

import (
	"context"
	"path/filepath"
	"testing"
	"testing/fstest"

	"biasbin/migrations"

	"github.com/jmoiron/sqlx"
)

// TestTransistorSpreadsKept: a transistor line's part-to-part VBE(on) and
// Early-voltage ranges (migration 0004) are stored and read back, an
// import --replace changes them and names the change, and a broken pair
// is refused before anything is written.
func TestTransistorSpreadsKept(t *testing.T) {
	ctx := context.Background()
	db, err := Open(ctx, filepath.Join(t.TempDir(), "s.db"))
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	q := Transistor{Label: "QX-9", Polarity: "npn", HFEMin: 100, HFEMax: 300, VBEOn_V: 0.65, VAF_V: 80,
		VBEMin_V: 0.62, VBEMax_V: 0.68, VAFMin_V: 60, VAFMax_V: 110, Qty: 5, Bin: "T"} // invented line
	res, err := db.AddTransistor(ctx, q)
	if err != nil {
		t.Fatal(err)
	}
	got, err := db.TransistorByID(ctx, res.ID)
	if err != nil {
		t.Fatal(err)
	}
	if got.VBEMin_V != 0.62 || got.VBEMax_V != 0.68 || got.VAFMin_V != 60 || got.VAFMax_V != 110 {
		t.Fatalf("read back %+v", got)
	}
	q.VBEMin_V, q.VBEMax_V = 0.6, 0.7
	rep, err := db.Import(ctx, Batch{Transistors: []Transistor{q}}, ImportOptions{Replace: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Changes) == 0 {
		t.Errorf("replace named no change: %+v", rep)
	}
	if got, _ = db.TransistorByID(ctx, res.ID); got.VBEMin_V != 0.6 || got.VBEMax_V != 0.7 {
		t.Errorf("after replace %+v", got)
	}
	for _, bad := range []Transistor{
		{Label: "QX-10", Polarity: "npn", HFEMin: 100, HFEMax: 300, VBEMin_V: 0.6, Qty: 1},
		{Label: "QX-11", Polarity: "npn", HFEMin: 100, HFEMax: 300, VAFMin_V: 90, VAFMax_V: 50, Qty: 1},
	} {
		if _, err := db.AddTransistor(ctx, bad); err == nil {
			t.Errorf("%+v: stocked, want refused", bad)
		}
	}
}

// TestUpgradeAddsSpreads opens a stock file that has every migration but
// 0004 (a file made before it existed) holding a transistor: the line
// reads with no stocked ranges, and a range can then be stocked on it.
func TestUpgradeAddsSpreads(t *testing.T) {
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "before0004.db")
	names, err := migrationFiles(migrations.FS)
	if err != nil {
		t.Fatal(err)
	}
	old := fstest.MapFS{}
	for _, n := range names {
		if n[:4] == "0004" {
			continue
		}
		b, err := migrations.FS.ReadFile(n)
		if err != nil {
			t.Fatal(err)
		}
		old[n] = &fstest.MapFile{Data: b}
	}
	x, err := sqlx.Open("sqlite", dsn(path))
	if err != nil {
		t.Fatal(err)
	}
	if err := migrate(ctx, x, old); err != nil {
		t.Fatal(err)
	}
	x.MustExec(`INSERT INTO parts (id, kind, ident, qty, bin) VALUES (3, 'transistor', 'QN-1', 4, 'T')`)
	x.MustExec(`INSERT INTO transistors (part_id, label, polarity, hfe_min, hfe_max, vbe_on_v, vbe_at_a, tj_max_c)
		VALUES (3, 'QN-1', 'npn', 100, 300, 0.65, 0.001, 150)`)
	x.Close()

	db, err := Open(ctx, path)
	if err != nil {
		t.Fatalf("open: %v", err)
	}
	defer db.Close()
	q, err := db.TransistorByID(ctx, 3)
	if err != nil {
		t.Fatal(err)
	}
	if q.VBEMin_V != 0 || q.VBEMax_V != 0 || q.VAFMin_V != 0 || q.VAFMax_V != 0 || q.Qty != 4 {
		t.Fatalf("after upgrade %+v", q)
	}
	q.VBEMin_V, q.VBEMax_V = 0.6, 0.7
	if _, err := db.Import(ctx, Batch{Transistors: []Transistor{q}}, ImportOptions{Replace: true}); err != nil {
		t.Fatal(err)
	}
	if q, _ = db.TransistorByID(ctx, 3); q.VBEMin_V != 0.6 || q.VBEMax_V != 0.7 {
		t.Errorf("range not stocked: %+v", q)
	}
	if ps, err := db.Verify(ctx); err != nil || len(ps) > 0 {
		t.Fatalf("verify after upgrade: %v %v", ps, err)
	}
}
