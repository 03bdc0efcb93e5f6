package store

import (
	"context"
	"errors"
	"path/filepath"
	"strings"
	"testing"
	"testing/fstest"
	"time"

	"github.com/jmoiron/sqlx"

	"biasbin/migrations"
)

// sumLedger adds up each line's ledger deltas, the way quantities are
// rebuilt from the ledger (a stock ledger's running balance, common
// practice).
func sumLedger(t *testing.T, db *DB) map[int64]int {
	t.Helper()
	es, err := db.Ledger(context.Background(), LedgerFilter{})
	if err != nil {
		t.Fatal(err)
	}
	out := map[int64]int{}
	for _, e := range es {
		out[e.Line] += e.Delta
		if e.QtyAfter != out[e.Line] {
			t.Errorf("entry %d: qty after %d, running sum %d", e.Seq, e.QtyAfter, out[e.Line])
		}
	}
	return out
}

// lastEntry returns the newest ledger entry.
func lastEntry(t *testing.T, db *DB) LedgerEntry {
	t.Helper()
	es, err := db.Ledger(context.Background(), LedgerFilter{})
	if err != nil || len(es) == 0 {
		t.Fatalf("ledger: %v (%d entries)", err, len(es))
	}
	return es[len(es)-1]
}

// TestEveryQuantityChangeIsOneLedgerRow runs each kind of change in turn
// and checks it wrote exactly one row with its reason, delta and quantity
// after, and that the ledger sums to the stock.
func TestEveryQuantityChangeIsOneLedgerRow(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	var line int64
	steps := []struct {
		name   string
		do     func() error
		reason Reason
		delta  int
		after  int
	}{
		{"add", func() error {
			r, err := db.AddResistor(ctx, r4k7(10, "A"))
			line = r.ID
			return err
		}, ReasonAdd, 10, 10},
		{"import", func() error {
			_, err := db.Import(ctx, Batch{Resistors: []Resistor{r4k7(5, "A")}}, ImportOptions{})
			return err
		}, ReasonImport, 5, 15},
		{"adjust", func() error { _, err := db.Adjust(ctx, line, -4); return err }, ReasonAdjust, -4, 11},
		{"count", func() error { _, err := db.SetQty(ctx, line, 20); return err }, ReasonCount, 9, 20},
		{"build", func() error {
			_, err := db.Reserve(ctx, BuildOrder{Candidate: "bx", Boards: 3,
				Parts: []PartUse{{Line: line, Kind: KindResistor, PerBoard: 2}}})
			return err
		}, ReasonBuild, -6, 14},
		{"cancel", func() error { return db.CancelBuild(ctx, 1) }, ReasonCancel, 6, 20},
		{"remove", func() error { return db.Remove(ctx, line) }, ReasonRemove, -20, 0},
	}
	rows := 0
	for _, s := range steps {
		if err := s.do(); err != nil {
			t.Fatalf("%s: %v", s.name, err)
		}
		rows++
		es, _ := db.Ledger(ctx, LedgerFilter{})
		if len(es) != rows {
			t.Fatalf("%s: %d ledger rows, want %d", s.name, len(es), rows)
		}
		e := es[len(es)-1]
		if e.Reason != s.reason || e.Delta != s.delta || e.QtyAfter != s.after || e.Line != line {
			t.Errorf("%s: entry %+v, want reason %s delta %d after %d", s.name, e, s.reason, s.delta, s.after)
		}
		if (s.reason == ReasonBuild || s.reason == ReasonCancel) != (e.Build == 1) {
			t.Errorf("%s: entry names build %d", s.name, e.Build)
		}
		if time.Since(e.Time) > time.Minute || time.Since(e.Time) < -time.Minute {
			t.Errorf("%s: time %v is not now", s.name, e.Time)
		}
		if ps, err := db.Verify(ctx); err != nil || len(ps) > 0 {
			t.Fatalf("%s: verify: %v %v", s.name, ps, err)
		}
	}
	if s := sumLedger(t, db); s[line] != 0 {
		t.Fatalf("removed line sums to %d", s[line])
	}
	// A refused change writes nothing.
	if _, err := db.AddResistor(ctx, r4k7(1, "B")); err != nil {
		t.Fatal(err)
	}
	n := len(mustLedger(t, db, LedgerFilter{}))
	db.Adjust(ctx, line+1, -5)
	if got := len(mustLedger(t, db, LedgerFilter{})); got != n {
		t.Fatalf("a refused adjust wrote %d rows", got-n)
	}
}

func mustLedger(t *testing.T, db *DB, f LedgerFilter) []LedgerEntry {
	t.Helper()
	es, err := db.Ledger(context.Background(), f)
	if err != nil {
		t.Fatal(err)
	}
	return es
}

// TestLedgerFilters selects by line, build and time.
func TestLedgerFilters(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, _ := db.AddResistor(ctx, r4k7(10, "A"))
	b, _ := db.AddTransistor(ctx, bc547(10, "B"))
	if _, err := db.Reserve(ctx, BuildOrder{Candidate: "bx", Boards: 2, Parts: []PartUse{
		{Line: a.ID, Kind: KindResistor, PerBoard: 3}, {Line: b.ID, Kind: KindTransistor, PerBoard: 1}}}); err != nil {
		t.Fatal(err)
	}
	if got := mustLedger(t, db, LedgerFilter{Line: a.ID}); len(got) != 2 || got[1].Delta != -6 {
		t.Errorf("line %d: %+v", a.ID, got)
	}
	if got := mustLedger(t, db, LedgerFilter{Build: 1}); len(got) != 2 {
		t.Errorf("build 1: %+v", got)
	}
	if got := mustLedger(t, db, LedgerFilter{Since: time.Now().Add(time.Hour)}); len(got) != 0 {
		t.Errorf("since an hour ahead: %+v", got)
	}
	if got := mustLedger(t, db, LedgerFilter{Since: time.Now().Add(-time.Hour)}); len(got) != 4 {
		t.Errorf("since an hour ago: %d entries", len(got))
	}
}

// TestUpgradeMakesOpeningRows brings a file of the schema before the
// ledger forward: its quantities become opening rows and verify is clean.
func TestUpgradeMakesOpeningRows(t *testing.T) {
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "old.db")
	old := fstest.MapFS{}
	names, _ := migrationFiles(migrations.FS)
	for _, n := range names {
		if n >= "0005" {
			break
		}
		body, _ := migrations.FS.ReadFile(n)
		old[n] = &fstest.MapFile{Data: body}
	}
	x, err := sqlx.Open("sqlite", dsn(path))
	if err != nil {
		t.Fatal(err)
	}
	if err := migrate(ctx, x, old); err != nil {
		t.Fatal(err)
	}
	x.MustExec(`INSERT INTO parts (id, kind, ident, qty, bin) VALUES (7, 'resistor', '4700|0.05|0.25|metal film', 12, 'A1')`)
	x.MustExec(`INSERT INTO resistors (part_id, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech)
		VALUES (7, 4700, 0.05, 0.25, 70, 155, 50, 'metal film')`)
	x.MustExec(`INSERT INTO parts (id, kind, ident, qty, bin) VALUES (9, 'transistor', 'Q-OLD', 0, 'T1')`)
	x.MustExec(`INSERT INTO transistors (part_id, label, polarity, hfe_min, hfe_max, vbe_on_v, vbe_at_a, tj_max_c)
		VALUES (9, 'Q-OLD', 'npn', 100, 300, 0.65, 0.001, 150)`)
	x.Close()

	db, err := Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	es := mustLedger(t, db, LedgerFilter{})
	if len(es) != 1 || es[0].Line != 7 || es[0].Delta != 12 || es[0].QtyAfter != 12 || es[0].Reason != ReasonOpening {
		t.Fatalf("opening rows %+v, want one for line 7 of 12", es)
	}
	if _, err := db.Adjust(ctx, 9, +4); err != nil {
		t.Fatal(err)
	}
	if ps, err := db.Verify(ctx); err != nil || len(ps) > 0 {
		t.Fatalf("verify after upgrade: %v %v", ps, err)
	}
}

// TestVerifyFindsQuantitiesOffTheLedger changes the stock or the ledger
// behind the store's back; verify must name each mismatch.
func TestVerifyFindsQuantitiesOffTheLedger(t *testing.T) {
	for _, tc := range []struct{ name, sql, want string }{
		{"ledger row lost", `DELETE FROM ledger WHERE id = 2`, "line 1: quantity 7 but the ledger sums to 10"},
		{"qty after wrong", `UPDATE ledger SET qty_after = 99 WHERE id = 1`, "ledger entry 1: line 1 quantity after 99"},
		{"build took other than it says", `UPDATE build_parts SET taken = 4`, "build 1 (open): line 1 took 4"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db, _ := openTemp(t)
			ctx := context.Background()
			r, _ := db.AddResistor(ctx, r4k7(10, "A"))
			if _, err := db.Reserve(ctx, BuildOrder{Candidate: "bx", Boards: 1,
				Parts: []PartUse{{Line: r.ID, Kind: KindResistor, PerBoard: 3}}}); err != nil {
				t.Fatal(err)
			}
			if ps, _ := db.Verify(ctx); len(ps) > 0 {
				t.Fatalf("clean file: %v", ps)
			}
			db.x.MustExec(tc.sql)
			ps, err := db.Verify(ctx)
			if err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(strings.Join(ps, "\n"), tc.want) {
				t.Fatalf("problems %q, want one containing %q", ps, tc.want)
			}
		})
	}
}

// TestRemovedLineIDIsNotReused removes the newest line and adds another:
// the new line gets a fresh ID, so the ledger never mixes two lines.
func TestRemovedLineIDIsNotReused(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, _ := db.AddResistor(ctx, r4k7(1, "A"))
	b, _ := db.AddResistor(ctx, r4k7(1, "B"))
	if err := db.Remove(ctx, b.ID); err != nil {
		t.Fatal(err)
	}
	c, _ := db.AddResistor(ctx, r4k7(1, "C"))
	if c.ID == b.ID || c.ID == a.ID {
		t.Fatalf("new line got ID %d (removed %d)", c.ID, b.ID)
	}
}

// errorIs fails unless err wraps target.
func errorIs(t *testing.T, what string, err, target error) {
	t.Helper()
	if !errors.Is(err, target) {
		t.Fatalf("%s: error %v, want %v", what, err, target)
	}
}
