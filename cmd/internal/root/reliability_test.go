package root

import (
	"context"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"sync/atomic"
	"syscall"
	"testing"
	"time"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/store"
)

// child returns a command that runs this test binary as biasbin on the
// stock file db.
func child(db string, args ...string) *exec.Cmd { return cmdtest.Child(childEnv, db, args...) }

// runChild runs a child to its end.
func runChild(db string, args ...string) (stdout, stderr string, code int) {
	return cmdtest.RunChild(childEnv, db, args...)
}

// picked stocks the tour's parts, picks a build for 4 boards and returns
// the stock file, the build ID and the parts one board takes from each
// line (read from the pick's own pull list for 4 boards).
func picked(t *testing.T) (db, id string, perBoard map[int64]int) {
	t.Helper()
	db = filepath.Join(t.TempDir(), "stock.db")
	tour := filepath.Join("..", "..", "..", "testdata", "tour")
	for _, f := range []string{"resistors.csv", "transistors.csv"} {
		if _, errOut, code := runChild(db, "stock", "import", filepath.Join(tour, f)); code != 0 {
			t.Fatalf("import %s: %s", f, errOut)
		}
	}
	out, errOut, code := runChild(db, "pick", "--vcc", "12V", "--ic", "1mA", "--boards", "4", "--top", "1", "--json")
	if code != 0 {
		t.Fatalf("pick: %s", errOut)
	}
	var p struct {
		Candidates []struct {
			ID   string `json:"id"`
			Pull []struct {
				ID  int64 `json:"id"`
				Qty int   `json:"qty"`
			} `json:"pull"`
		} `json:"candidates"`
	}
	if err := json.Unmarshal([]byte(out), &p); err != nil || len(p.Candidates) == 0 || len(p.Candidates[0].Pull) == 0 {
		t.Fatalf("pick --json: %v\n%s", err, out)
	}
	perBoard = map[int64]int{}
	for _, l := range p.Candidates[0].Pull {
		perBoard[l.ID] = l.Qty / 4
	}
	return db, p.Candidates[0].ID, perBoard
}

// setQty sets each line to boards × what one board takes.
func setQty(t *testing.T, db string, perBoard map[int64]int, boards int) {
	t.Helper()
	for id, n := range perBoard {
		if _, errOut, code := runChild(db, "stock", "adjust", fmt.Sprint(id), fmt.Sprintf("=%d", n*boards)); code != 0 {
			t.Fatalf("adjust %d: %s", id, errOut)
		}
	}
}

// state reads every line's quantity, the ledger's sum per line and the
// builds, and fails on any problem stock verify finds.
func state(t *testing.T, db string) (qty, ledger map[int64]int, builds []store.Build) {
	t.Helper()
	ctx := context.Background()
	s, err := store.OpenExisting(ctx, db)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	qty, ledger = map[int64]int{}, map[int64]int{}
	rs, _ := s.ListResistors(ctx, store.Filter{})
	ts, _ := s.ListTransistors(ctx, store.Filter{})
	for _, r := range rs {
		qty[r.ID] = r.Qty
	}
	for _, q := range ts {
		qty[q.ID] = q.Qty
	}
	es, err := s.Ledger(ctx, store.LedgerFilter{})
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range es {
		ledger[e.Line] += e.Delta
	}
	if builds, err = s.Builds(ctx, false); err != nil {
		t.Fatal(err)
	}
	if ps, err := s.Verify(ctx); err != nil || len(ps) > 0 {
		t.Fatalf("verify: %v %v", ps, err)
	}
	return qty, ledger, builds
}

// lockedWords are what a locked database would say to a user.
func lockedWords(s string) bool {
	s = strings.ToLower(s)
	return strings.Contains(s, "locked") || strings.Contains(s, "busy")
}

// TestEightProcessesBuildFromStockForTen starts 8 processes at once, each
// building 3 boards from stock that holds exactly enough for 10: exactly 3
// succeed, the other 5 are refused with the shortage, each line is left
// with exactly one board's parts, the ledger sums to the quantities, and
// no process reports a locked database.
func TestEightProcessesBuildFromStockForTen(t *testing.T) {
	db, id, perBoard := picked(t)
	setQty(t, db, perBoard, 10)
	const procs = 8
	type outcome struct {
		code           int
		stdout, stderr string
	}
	results := make([]outcome, procs)
	start := make(chan struct{})
	var wg sync.WaitGroup
	for i := range procs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			<-start
			out, errOut, code := runChild(db, "build", "new", id, "--boards", "3")
			results[i] = outcome{code, out, errOut}
		}()
	}
	close(start)
	wg.Wait()
	built, short := 0, 0
	for i, r := range results {
		switch {
		case lockedWords(r.stderr):
			t.Errorf("process %d: a locked database reached the user: %s", i, r.stderr)
		case r.code == 0:
			built++
		case r.code == 1 && strings.Contains(r.stderr, "not enough parts in stock for 3 boards; nothing was taken"):
			short++
		default:
			t.Errorf("process %d: exit %d: %s%s", i, r.code, r.stdout, r.stderr)
		}
	}
	if built != 3 || short != 5 {
		t.Fatalf("%d built, %d refused as short; want 3 and 5", built, short)
	}
	qty, ledger, builds := state(t, db)
	for line, n := range perBoard {
		if qty[line] != n || ledger[line] != qty[line] {
			t.Errorf("line %d: %d left (ledger %d), want %d (10 boards' worth less 9 boards)", line, qty[line], ledger[line], n)
		}
	}
	if len(builds) != 3 {
		t.Errorf("%d builds recorded, want 3", len(builds))
	}
}

// TestKilledBuildIsAllOrNothing kills `build new` with SIGKILL at moments
// spread over its run: each time the stock holds either the whole build or
// none of it, and verify is clean. At least one kill must land before the
// commit, or the test would show nothing.
func TestKilledBuildIsAllOrNothing(t *testing.T) {
	if testing.Short() {
		t.Skip("runs many processes")
	}
	seedDB, id, perBoard := picked(t)
	setQty(t, seedDB, perBoard, 50)
	seedFile, err := os.ReadFile(seedDB)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(seedDB + "-wal"); err == nil {
		// The checkpointed main file alone is the stock: close cleanly first.
		s, _ := store.OpenExisting(context.Background(), seedDB)
		s.Close()
		seedFile, _ = os.ReadFile(seedDB)
	}
	fresh := func() string {
		p := filepath.Join(t.TempDir(), "stock.db")
		if err := os.WriteFile(p, seedFile, 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	before, _, _ := state(t, fresh())
	start := time.Now()
	full := fresh()
	if _, errOut, code := runChild(full, "build", "new", id, "--boards", "4"); code != 0 {
		t.Fatalf("full run: %s", errOut)
	}
	took := time.Since(start)
	rng := rand.New(rand.NewPCG(uint64(time.Now().UnixNano()), 11))
	const runs = 8
	rolledBack := 0
	for i := range runs {
		db := fresh()
		slot := int64(took) / runs
		at := time.Duration(int64(i)*slot + rng.Int64N(slot))
		cmd := child(db, "build", "new", id, "--boards", "4")
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(at)
		cmd.Process.Signal(syscall.SIGKILL)
		cmd.Wait()
		qty, ledger, builds := state(t, db)
		whole, none := len(builds) == 1, len(builds) == 0
		for line, was := range before {
			taken := 4 * perBoard[line]
			whole = whole && qty[line] == was-taken
			none = none && qty[line] == was
			if ledger[line] != qty[line] {
				t.Errorf("run %d: line %d: qty %d, ledger %d", i, line, qty[line], ledger[line])
			}
		}
		switch {
		case none:
			rolledBack++
		case whole:
		default:
			t.Errorf("run %d, killed after %v: neither the whole build nor none of it (%d builds, %v)", i, at, len(builds), qty)
		}
	}
	if rolledBack == 0 {
		t.Fatalf("no run was killed before the build committed; the test showed nothing")
	}
	t.Logf("full run %v; %d of %d runs killed before the commit", took, rolledBack, runs)
}

// TestCancelRacingANewBuildLosesNothing cancels a build that holds all of
// a line while another process builds the same parts, over several
// rounds; at the end every open build is cancelled and each line must hold
// exactly what it held at the start.
func TestCancelRacingANewBuildLosesNothing(t *testing.T) {
	if testing.Short() {
		t.Skip("runs many processes")
	}
	db, id, perBoard := picked(t)
	setQty(t, db, perBoard, 5)
	start, _, _ := state(t, db)
	if _, errOut, code := runChild(db, "build", "new", id, "--boards", "5"); code != 0 {
		t.Fatalf("first build: %s", errOut)
	}
	open := []int64{1}
	next := int64(2)
	for round := range 6 {
		var wg sync.WaitGroup
		var cancelErr, buildErr string
		var cancelCode, buildCode int
		wg.Add(2)
		go func() {
			defer wg.Done()
			_, cancelErr, cancelCode = runChild(db, "build", "cancel", fmt.Sprint(open[0]))
		}()
		go func() {
			defer wg.Done()
			_, buildErr, buildCode = runChild(db, "build", "new", id, "--boards", "5")
		}()
		wg.Wait()
		if cancelCode != 0 || lockedWords(cancelErr) {
			t.Fatalf("round %d: cancel: exit %d: %s", round, cancelCode, cancelErr)
		}
		open = open[1:]
		switch {
		case buildCode == 0:
			open = append(open, next)
		case buildCode == 1 && strings.Contains(buildErr, "not enough parts"):
		default:
			t.Fatalf("round %d: build: exit %d: %s", round, buildCode, buildErr)
		}
		// Builds are numbered in creation order; a refused build takes
		// no number.
		if buildCode == 0 {
			next++
		}
		if len(open) == 0 {
			if _, errOut, code := runChild(db, "build", "new", id, "--boards", "5"); code != 0 {
				t.Fatalf("round %d: rebuild: %s", round, errOut)
			}
			open = append(open, next)
			next++
		}
	}
	for _, b := range open {
		if _, errOut, code := runChild(db, "build", "cancel", fmt.Sprint(b)); code != 0 {
			t.Fatalf("cancel %d: %s", b, errOut)
		}
	}
	end, ledger, _ := state(t, db)
	for line, was := range start {
		if end[line] != was || ledger[line] != was {
			t.Errorf("line %d: %d at the start, %d at the end (ledger %d)", line, was, end[line], ledger[line])
		}
	}
}

// TestBackupWhileFourProcessesAdjust takes a backup while 4 processes
// adjust quantities: the copy opens and passes stock verify.
func TestBackupWhileFourProcessesAdjust(t *testing.T) {
	if testing.Short() {
		t.Skip("runs many processes")
	}
	db, _, perBoard := picked(t)
	var lines []int64
	for l := range perBoard {
		lines = append(lines, l)
	}
	stop := make(chan struct{})
	var wg sync.WaitGroup
	var mu sync.Mutex
	var failures []string
	var adjusted atomic.Int64 // adjustments finished before the backup starts
	for i := range 4 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			change := []string{"-1", "+2"}[i%2]
			for n := 0; ; n++ {
				select {
				case <-stop:
					return
				default:
				}
				if _, errOut, code := runChild(db, "stock", "adjust", fmt.Sprint(lines[(i+n)%len(lines)]), change); code != 0 {
					mu.Lock()
					failures = append(failures, errOut)
					mu.Unlock()
				} else {
					adjusted.Add(1)
				}
			}
		}()
	}
	// Wait for real adjustments rather than a fixed time: on a loaded
	// machine a child process can take longer than any sleep to start.
	for deadline := time.Now().Add(2 * time.Minute); adjusted.Load() < 4 && time.Now().Before(deadline); {
		time.Sleep(20 * time.Millisecond)
	}
	if adjusted.Load() < 4 {
		t.Fatalf("only %d adjustments finished in 2 minutes", adjusted.Load())
	}
	backup := filepath.Join(t.TempDir(), "copy.db")
	out, errOut, code := runChild(db, "backup", backup)
	time.Sleep(100 * time.Millisecond)
	close(stop)
	wg.Wait()
	for _, f := range failures {
		t.Errorf("adjust failed: %s", f)
	}
	if code != 0 {
		t.Fatalf("backup: exit %d: %s%s", code, out, errOut)
	}
	if out, errOut, code := runChild(backup, "stock", "verify"); code != 0 || out != "ok\n" {
		t.Fatalf("verify the backup: exit %d: %s%s", code, out, errOut)
	}
	if out, _, code := runChild(backup, "ledger", "--json"); code != 0 || !strings.Contains(out, `"reason": "adjust"`) {
		t.Fatalf("the backup's ledger holds no adjustment taken during the run:\n%s", out)
	}
}
