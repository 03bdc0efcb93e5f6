package stockcmd

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/store"
)

// child returns a command that runs this test binary as biasbin (see
// TestMain) with the stock file db.
func child(db string, args ...string) *exec.Cmd { return cmdtest.Child(childEnv, db, args...) }

// runChild runs a child to the end and returns its output and exit status.
func runChild(db string, args ...string) (stdout, stderr string, code int) {
	return cmdtest.RunChild(childEnv, db, args...)
}

// resistorQty reads every resistor line's quantity by ID.
func resistorQty(t *testing.T, db string) map[int64]int {
	t.Helper()
	s, err := store.Open(context.Background(), db)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	rs, err := s.ListResistors(context.Background(), store.Filter{})
	if err != nil {
		t.Fatal(err)
	}
	out := map[int64]int{}
	for _, r := range rs {
		out[r.ID] = r.Qty
	}
	return out
}

// TestTwoProcessesImportAndAdjust runs two streams of biasbin processes at
// once, each importing a file that adds to every stocked resistor line and
// adjusting one line, and checks the final quantities are exactly the sum
// of what every process did, with no process failing on a locked database.
func TestTwoProcessesImportAndAdjust(t *testing.T) {
	if testing.Short() {
		t.Skip("runs many processes")
	}
	db := seeded(t)
	before := resistorQty(t, db)
	// 2,100 rows cycling over the seven fixture lines (IDs 1..7 in file
	// order, the 1K row merged into 1K0), one part each.
	codes := []string{"4K7,5%,0.25W,1,A3,metal film", "10k,1%,0.25W,1,A4,metal film", "470R,J,1/4W,1,A1,carbon film",
		"1K0,5%,250mW,1,A2,thick film", "2M2,10%,0.5W,1,A9,carbon film", "R47,1%,1W,1,C1,wirewound", "47K3,0.5%,0.125W,1,A6,thin film"}
	var b strings.Builder
	b.WriteString("value,tolerance,power,qty,bin,tech\n")
	const rows = 2100
	for i := range rows {
		b.WriteString(codes[i%len(codes)] + "\n")
	}
	file := filepath.Join(t.TempDir(), "delta.csv")
	if err := os.WriteFile(file, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	const rounds = 8
	type stream struct{ change string }
	streams := []stream{{"-3"}, {"+5"}}
	var wg sync.WaitGroup
	var mu sync.Mutex
	var failures []string
	for _, s := range streams {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range rounds {
				for _, args := range [][]string{{"stock", "import", file}, {"stock", "adjust", "1", s.change}} {
					_, stderr, code := runChild(db, args...)
					if code != 0 || stderr != "" {
						mu.Lock()
						failures = append(failures, fmt.Sprintf("round %d %v: exit %d: %s", i, args, code, stderr))
						mu.Unlock()
					}
				}
			}
		}()
	}
	wg.Wait()
	for _, f := range failures {
		t.Error(f)
		if strings.Contains(f, "locked") || strings.Contains(f, "busy") {
			t.Error("a locked database reached the user")
		}
	}
	after := resistorQty(t, db)
	perLine := rows / len(codes) * len(streams) * rounds
	for id := int64(1); id <= 7; id++ {
		want := before[id] + perLine
		if id == 1 {
			want += rounds * (-3 + 5)
		}
		if after[id] != want {
			t.Errorf("line %d: qty %d, want %d (was %d)", id, after[id], want, before[id])
		}
	}
	if out, stderr, code := runChild(db, "stock", "verify"); code != 0 || out != "ok\n" {
		t.Fatalf("verify: exit %d %s%s", code, out, stderr)
	}
}

// bigImport writes a resistor file of n rows: new lines over many bins
// plus rows adding to the fixture's 4K7 line.
func bigImport(t *testing.T, n int) string {
	t.Helper()
	var b strings.Builder
	b.WriteString("value,tolerance,power,qty,bin,tags,tech\n")
	for i := range n {
		if i%10 == 0 {
			b.WriteString("4K7,5%,0.25W,1,A3,reel,metal film\n")
			continue
		}
		fmt.Fprintf(&b, "%dR,1%%,0.25W,%d,K%d,rohs;reel,\n", 100+i%900, 1+i%5, i/900)
	}
	path := filepath.Join(t.TempDir(), "big.csv")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestKilledImportLeavesStockAsItWas kills a large import with SIGKILL at
// several random moments; each time the stock must be exactly as before the
// import or exactly as after it (a kill that lands between the commit and
// the process's exit leaves the whole import in), never anything between,
// and stock verify must be clean. At least one kill must land before the
// commit, or the test would not have shown a rollback.
func TestKilledImportLeavesStockAsItWas(t *testing.T) {
	if testing.Short() {
		t.Skip("runs large imports")
	}
	file := bigImport(t, 20_000)
	fixture := seeded(t)
	before := exportAll(t, fixture)

	// One full run on a copy gives the stock after the import and its duration.
	full := seeded(t)
	start := time.Now()
	if _, stderr, code := runChild(full, "stock", "import", file); code != 0 {
		t.Fatalf("full import: %s", stderr)
	}
	took := time.Since(start)
	after := exportAll(t, full)
	if after == before {
		t.Fatal("the import changes nothing; the test would prove nothing")
	}

	rng := rand.New(rand.NewPCG(uint64(time.Now().UnixNano()), 3))
	const runs = 5
	killed, rolledBack := 0, 0
	for i := range runs {
		db := seeded(t)
		// One kill in each fifth of the first 90 % of the import's time.
		slot := int64(took) * 9 / 10 / runs
		at := time.Duration(int64(i)*slot + rng.Int64N(slot))
		cmd := child(db, "stock", "import", file)
		var errOut bytes.Buffer
		cmd.Stderr = &errOut
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(at)
		cmd.Process.Signal(syscall.SIGKILL)
		err := cmd.Wait()
		got := exportAll(t, db)
		var ee *exec.ExitError
		wasKilled := errors.As(err, &ee) && !ee.Exited()
		switch {
		case wasKilled:
			killed++
			switch got {
			case before:
				rolledBack++
			case after:
				t.Logf("run %d, killed after %v: the import had committed; the whole import is in", i, at)
			default:
				t.Errorf("run %d, killed after %v: the stock is neither as before nor as after the import", i, at)
			}
		case err == nil:
			if got != after {
				t.Errorf("run %d finished before the kill at %v but the stock is not the imported one", i, at)
			}
		default:
			t.Errorf("run %d: import failed on its own: %v %s", i, err, errOut.String())
		}
		if out, stderr, code := runChild(db, "stock", "verify"); code != 0 || out != "ok\n" {
			t.Errorf("run %d: verify after kill at %v: exit %d %s%s", i, at, code, out, stderr)
		}
	}
	if rolledBack == 0 {
		t.Fatalf("no run was killed before the import committed (%d killed); the test proved nothing", killed)
	}
	t.Logf("full import %v; %d of %d runs killed, %d of them before the commit", took, killed, runs, rolledBack)
}
