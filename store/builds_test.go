package store

import (
	"context"
	"errors"
	"path/filepath"
	"sync"
	"testing"
	"time"
)

// TestReserveTakesAllOrNothing orders a build two of whose three lines are
// short: the error lists both with needed and on hand, and nothing moves.
func TestReserveTakesAllOrNothing(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, _ := db.AddResistor(ctx, r4k7(10, "A"))
	b, _ := db.AddResistor(ctx, Resistor{Ohm: 1000, Tol: 0.05, Rated_W: 0.25, Qty: 3, Bin: "B"})
	q, _ := db.AddTransistor(ctx, bc547(2, "T"))
	order := BuildOrder{Candidate: "bx", Boards: 4, Parts: []PartUse{
		{Line: a.ID, Kind: KindResistor, PerBoard: 2}, {Line: b.ID, Kind: KindResistor, PerBoard: 1},
		{Line: q.ID, Kind: KindTransistor, PerBoard: 1}}}
	_, err := db.Reserve(ctx, order)
	var se *ShortageError
	if !errors.As(err, &se) || !errors.Is(err, ErrShortage) {
		t.Fatalf("error %v, want a shortage", err)
	}
	want := []Shortage{
		{Line: b.ID, Kind: KindResistor, Ohm: 1000, Bin: "B", Needed: 4, OnHand: 3},
		{Line: q.ID, Kind: KindTransistor, Label: "Q-TEST", Bin: "T", Needed: 4, OnHand: 2},
	}
	if len(se.Shortages) != len(want) {
		t.Fatalf("shortages %+v, want %+v", se.Shortages, want)
	}
	for i := range want {
		if se.Shortages[i] != want[i] {
			t.Errorf("shortage %d: %+v, want %+v", i, se.Shortages[i], want[i])
		}
	}
	if r, _ := db.ResistorByID(ctx, a.ID); r.Qty != 10 {
		t.Fatalf("line %d changed to %d", a.ID, r.Qty)
	}
	if bs, _ := db.Builds(ctx, false); len(bs) != 0 {
		t.Fatalf("a refused build was recorded: %+v", bs)
	}
	order.Boards = 2
	got, err := db.Reserve(ctx, order)
	if err != nil {
		t.Fatal(err)
	}
	if got.State != BuildOpen || got.Boards != 2 || len(got.Parts) != 3 || got.Parts[0].Bin != "A" || got.Parts[0].Taken != 4 {
		t.Fatalf("build %+v", got)
	}
	for id, want := range map[int64]int{a.ID: 6, b.ID: 1} {
		if r, _ := db.ResistorByID(ctx, id); r.Qty != want {
			t.Errorf("line %d: %d left, want %d", id, r.Qty, want)
		}
	}
}

// TestBuildStates walks a build through cancel and close: neither twice,
// no cancel after close, parts back only on cancel, a held line not
// removable while the build is open.
func TestBuildStates(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, _ := db.AddResistor(ctx, r4k7(10, "A"))
	order := BuildOrder{Candidate: "bx", Boards: 2, Parts: []PartUse{{Line: a.ID, Kind: KindResistor, PerBoard: 1}}}
	b1, _ := db.Reserve(ctx, order)
	b2, _ := db.Reserve(ctx, order)
	err := db.Remove(ctx, a.ID)
	var he *HeldError
	if !errors.As(err, &he) || len(he.Builds) != 2 || he.Builds[0] != b1.ID {
		t.Fatalf("remove a held line: %v", err)
	}
	if err := db.CancelBuild(ctx, b1.ID); err != nil {
		t.Fatal(err)
	}
	errorIs(t, "cancel twice", db.CancelBuild(ctx, b1.ID), ErrBuildState)
	errorIs(t, "close a cancelled build", db.CloseBuild(ctx, b1.ID), ErrBuildState)
	if err := db.CloseBuild(ctx, b2.ID); err != nil {
		t.Fatal(err)
	}
	errorIs(t, "cancel a closed build", db.CancelBuild(ctx, b2.ID), ErrBuildState)
	errorIs(t, "close twice", db.CloseBuild(ctx, b2.ID), ErrBuildState)
	errorIs(t, "cancel no build", db.CancelBuild(ctx, 99), ErrNoBuild)
	if r, _ := db.ResistorByID(ctx, a.ID); r.Qty != 8 {
		t.Fatalf("qty %d, want 8 (10, -2, -2, +2 back)", r.Qty)
	}
	open, _ := db.Builds(ctx, true)
	all, _ := db.Builds(ctx, false)
	if len(open) != 0 || len(all) != 2 || all[0].ID != b2.ID || all[0].State != BuildClosed || all[0].Ended.IsZero() {
		t.Fatalf("open %+v, all %+v", open, all)
	}
	if err := db.Remove(ctx, a.ID); err != nil {
		t.Fatalf("remove after the builds ended: %v", err)
	}
	if ps, err := db.Verify(ctx); err != nil || len(ps) > 0 {
		t.Fatalf("verify: %v %v", ps, err)
	}
}

// TestRecordBoard stores readings per board, replacing a re-measured one,
// and refuses a board the build does not have.
func TestRecordBoard(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	a, _ := db.AddResistor(ctx, r4k7(10, "A"))
	b, _ := db.Reserve(ctx, BuildOrder{Candidate: "bx", Boards: 2, Parts: []PartUse{{Line: a.ID, Kind: KindResistor, PerBoard: 1}}})
	for _, r := range []BoardReading{
		{Board: 2, VB_V: 2, VE_V: 1.3, VC_V: 7, Verdict: "pass"},
		{Board: 1, VB_V: 2, VE_V: 1.3, VC_V: 9, Verdict: "out", Detail: []byte(`{"x":1}`)},
		{Board: 1, VB_V: 2, VE_V: 1.3, VC_V: 7, Verdict: "pass"},
	} {
		if err := db.RecordBoard(ctx, b.ID, r); err != nil {
			t.Fatal(err)
		}
	}
	errorIs(t, "board 3 of 2", db.RecordBoard(ctx, b.ID, BoardReading{Board: 3}), ErrInvalid)
	got, _ := db.Build(ctx, b.ID)
	if len(got.Readings) != 2 || got.Readings[0].Board != 1 || got.Readings[0].VC_V != 7 || got.Readings[1].Board != 2 {
		t.Fatalf("readings %+v", got.Readings)
	}
}

// TestConcurrentBuildsNeverOversell races eight builds of 3 boards, one
// part each, on a line of 10 through two handles: exactly 3 succeed, the
// rest are refused as short, and the ledger holds the 1 left.
func TestConcurrentBuildsNeverOversell(t *testing.T) {
	a, path := openTemp(t)
	ctx := context.Background()
	b, err := Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	line, _ := a.AddResistor(ctx, r4k7(10, "A"))
	var wg sync.WaitGroup
	var mu sync.Mutex
	ok, short := 0, 0
	for i := range 8 {
		db := []*DB{a, b}[i%2]
		wg.Add(1)
		go func() {
			defer wg.Done()
			_, err := db.Reserve(ctx, BuildOrder{Candidate: "bx", Boards: 3,
				Parts: []PartUse{{Line: line.ID, Kind: KindResistor, PerBoard: 1}}})
			mu.Lock()
			defer mu.Unlock()
			switch {
			case err == nil:
				ok++
			case errors.Is(err, ErrShortage):
				short++
			default:
				t.Errorf("build: %v", err)
			}
		}()
	}
	wg.Wait()
	r, _ := a.ResistorByID(ctx, line.ID)
	if ok != 3 || short != 5 || r.Qty != 1 || sumLedger(t, a)[line.ID] != 1 {
		t.Fatalf("%d built, %d short, %d left", ok, short, r.Qty)
	}
}

// TestBackupWhileWriting copies the stock while writers adjust it: the
// copy opens, verifies clean and holds a quantity some writer left.
func TestBackupWhileWriting(t *testing.T) {
	db, path := openTemp(t)
	ctx := context.Background()
	line, _ := db.AddResistor(ctx, r4k7(1000, "A"))
	other, err := Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer other.Close()
	stop := make(chan struct{})
	var wg sync.WaitGroup
	for range 2 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				select {
				case <-stop:
					return
				default:
				}
				if _, err := other.Adjust(ctx, line.ID, -1); err != nil {
					t.Error(err)
					return
				}
			}
		}()
	}
	time.Sleep(20 * time.Millisecond)
	out := filepath.Join(t.TempDir(), "copy.db")
	err = db.Backup(ctx, out)
	close(stop)
	wg.Wait()
	if err != nil {
		t.Fatal(err)
	}
	errorIs(t, "backup over a file", db.Backup(ctx, out), ErrBackupExists)
	cp, err := OpenExisting(ctx, out)
	if err != nil {
		t.Fatal(err)
	}
	defer cp.Close()
	if ps, err := cp.Verify(ctx); err != nil || len(ps) > 0 {
		t.Fatalf("verify the copy: %v %v", ps, err)
	}
	r, _ := cp.ResistorByID(ctx, line.ID)
	if r.Qty > 1000 || r.Qty < 0 {
		t.Fatalf("copy holds %d", r.Qty)
	}
}

// TestKeptPicks keeps picks under their IDs, replaces a re-picked ID and
// forgets those older than PickKeep.
func TestKeptPicks(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	if err := db.KeepPicks(ctx, []KeptPick{{Candidate: "b1", Plan: []byte(`{"v":1}`)}, {Candidate: "b2", Plan: []byte(`{}`)}}); err != nil {
		t.Fatal(err)
	}
	if err := db.KeepPicks(ctx, []KeptPick{{Candidate: "b1", Plan: []byte(`{"v":2}`)}}); err != nil {
		t.Fatal(err)
	}
	p, err := db.Pick(ctx, "b1")
	if err != nil || string(p.Plan) != `{"v":2}` {
		t.Fatalf("b1: %+v %v", p, err)
	}
	old := time.Now().Add(-PickKeep - time.Hour).UTC().Format(TimeLayout)
	db.x.MustExec(`UPDATE picks SET created = ? WHERE candidate = 'b2'`, old)
	_, err = db.Pick(ctx, "b2")
	errorIs(t, "expired pick", err, ErrNoPick)
	_, err = db.Pick(ctx, "b9")
	errorIs(t, "unknown pick", err, ErrNoPick)
}
