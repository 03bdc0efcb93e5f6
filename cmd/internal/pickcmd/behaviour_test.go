package pickcmd

import (
	"bytes"
	"context"
	"errors"
	"strings"
	"testing"
	"time"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/stockcsv"
	"biasbin/picker"
	"biasbin/solver"
	"biasbin/store"
)

// invocation is one run of the pick command against a stock file.
type invocation struct {
	stdout, stderr string
	err            error
	picks          []picker.Request // what the search was asked, in order
}

// runPick runs `biasbin pick args...` on the stock at dbPath with pick as
// the search (nil = the real picker).
func runPick(t *testing.T, dbPath string, pick func(picker.Stock, picker.Request) (picker.Result, error), args ...string) invocation {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut), DBPath: dbPath, Getenv: func(string) string { return "" }}
	defer f.Close()
	var inv invocation
	cmd := newCmd(f, func(o *Options) error {
		if pick != nil {
			o.Pick = func(s picker.Stock, r picker.Request) (picker.Result, error) {
				inv.picks = append(inv.picks, r)
				return pick(s, r)
			}
		}
		return Run(context.Background(), o)
	})
	cmd.SetArgs(args)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	inv.err = cmd.Execute()
	inv.stdout, inv.stderr = out.String(), errOut.String()
	return inv
}

// snapshot is the stock export (the CSV of both kinds, as biasbin stock
// export writes it), to show a command changed nothing.
func snapshot(t *testing.T, path string) string {
	t.Helper()
	ctx := context.Background()
	db, err := store.Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	rs, err := db.ListResistors(ctx, store.Filter{})
	if err != nil {
		t.Fatal(err)
	}
	ts, err := db.ListTransistors(ctx, store.Filter{})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := stockcsv.WriteResistors(&buf, rs); err != nil {
		t.Fatal(err)
	}
	if err := stockcsv.WriteTransistors(&buf, ts); err != nil {
		t.Fatal(err)
	}
	return buf.String()
}

// smallBatch is a few invented stock lines: NPN transistors only.
func smallBatch() store.Batch {
	return store.Batch{
		Resistors: []store.Resistor{
			{Ohm: 10e3, Tol: 0.05, Rated_W: 0.25, Qty: 20, Bin: "A1", Tags: []string{"approved"}},
			{Ohm: 4.7e3, Tol: 0.05, Rated_W: 0.25, Qty: 20, Bin: "A2"},
			{Ohm: 1e3, Tol: 0.05, Rated_W: 0.25, Qty: 20, Bin: "A3"},
		},
		Transistors: []store.Transistor{
			{Label: "QN-104A", Polarity: "npn", HFEMin: 110, HFEMax: 330, VCEO_V: 40, ICMax_A: 0.2, Qty: 10, Bin: "D1"},
		},
	}
}

// neverCalled fails the test if the search runs.
func neverCalled(t *testing.T) func(picker.Stock, picker.Request) (picker.Result, error) {
	return func(picker.Stock, picker.Request) (picker.Result, error) {
		t.Error("the search ran although the input is bad")
		return picker.Result{}, nil
	}
}

func TestBadInput(t *testing.T) {
	tests := []struct {
		name  string
		batch store.Batch
		args  []string
		pick  func(picker.Stock, picker.Request) (picker.Result, error)
		code  int
		want  []string
	}{
		{"impossible vce", smallBatch(), []string{"--vcc", "5V", "--ic", "1mA", "--vce", "6V"}, nil, 2,
			[]string{"cannot exist", "choose a VCE below 4.75 V or raise --vcc"}},
		{"empty stock", store.Batch{}, []string{"--vcc", "12V", "--ic", "1mA"}, nil, 1,
			[]string{"no resistors", "biasbin stock import"}},
		{"no pnp", smallBatch(), []string{"--vcc", "12V", "--ic", "1mA", "--polarity", "pnp"}, nil, 1,
			[]string{"no PNP transistor", "--polarity pnp", "--polarity npn (1 line in stock)"}},
		{"no part with the tag", smallBatch(), []string{"--vcc", "12V", "--ic", "1mA", "--require-tag", "mil"}, nil, 1,
			[]string{"tagged mil", "biasbin stock tag"}},
		{"transistor lacks the tag", smallBatch(), []string{"--vcc", "12V", "--ic", "1mA", "--require-tag", "approved"}, nil, 1,
			[]string{"no NPN transistor in stock tagged approved"}},
		{"negative weight", smallBatch(), []string{"--vcc", "12V", "--ic", "1mA", "--weights", "yield=-2"}, nil, 2,
			[]string{"yield=-2", "cannot be negative"}},
		{"picker refuses the request", smallBatch(), []string{"--vcc", "12V", "--ic", "1mA"},
			func(picker.Stock, picker.Request) (picker.Result, error) {
				return picker.Result{}, errors.New("target IC 1 A exceeds every stocked transistor's IC max")
			}, 1, []string{"pick: target IC"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			path := newTestDB(t, tt.batch)
			before := snapshot(t, path)
			pick := tt.pick
			if pick == nil {
				pick = neverCalled(t)
			}
			inv := runPick(t, path, pick, tt.args...)
			if got := cmdutil.ExitCode(inv.err); got != tt.code {
				t.Errorf("exit %d (%v), want %d", got, inv.err, tt.code)
			}
			if inv.err == nil {
				t.Fatal("no error")
			}
			for _, w := range tt.want {
				if !strings.Contains(inv.err.Error(), w) {
					t.Errorf("message %q lacks %q", inv.err, w)
				}
			}
			if inv.stdout != "" {
				t.Errorf("stdout not empty on bad input: %q", inv.stdout)
			}
			if after := snapshot(t, path); after != before {
				t.Errorf("stock changed:\nbefore %s\nafter  %s", before, after)
			}
		})
	}
}

func TestNothingFits(t *testing.T) {
	path := newTestDB(t, smallBatch())
	before := snapshot(t, path)
	short := &picker.Shortfall{
		Reasons:   []picker.Reason{{Kind: picker.NoTransistor, Polarity: solver.NPN, Boards: 40, VCC_V: 12.6, IC_A: 1e-3}},
		Purchases: []picker.Purchase{{Slot: picker.PartTransistor, Qty: 40, Polarity: solver.NPN, VCEO_V: 16, ICMax_A: 2e-3}},
	}
	pick := func(s picker.Stock, r picker.Request) (picker.Result, error) {
		// As the picker does when nothing passes: the nearest builds,
		// each with the limit it breaks, and the shortfall.
		c := fakeCandidate(1, picker.Failure{Kind: picker.FailAllowance, Part: "rc", Utilization: 1.3})
		return picker.Result{Candidates: []picker.Candidate{c}, Shortfall: short}, nil
	}
	inv := runPick(t, path, pick, "--vcc", "12V", "--ic", "1mA", "--boards", "40")
	if cmdutil.ExitCode(inv.err) != 1 || !errors.Is(inv.err, cmdutil.ErrSilent) {
		t.Errorf("err %v, want the silent exit 1 (the explanation is already on stderr)", inv.err)
	}
	for _, w := range []string{"nothing fits this request", "no npn transistor with at least 40 in stock", "parts to buy", "transistor: npn with VCEO ≥ 16 V, IC max ≥ 2 mA, 40 pieces"} {
		if !strings.Contains(inv.stderr, w) {
			t.Errorf("stderr lacks %q:\n%s", w, inv.stderr)
		}
	}
	for _, w := range []string{"NOTHING FITS: the nearest builds", "FAILS: rc reaches 130 % of its derated, margined allowance"} {
		if !strings.Contains(inv.stdout, w) {
			t.Errorf("stdout lacks %q:\n%s", w, inv.stdout)
		}
	}
	if snapshot(t, path) != before {
		t.Error("stock changed")
	}
}

// TestStoppedSearchClaimsNothingMissing: when the search stopped at its
// time limit without a build that fits, the output says that none was
// found in the time, never that nothing fits.
func TestStoppedSearchClaimsNothingMissing(t *testing.T) {
	path := newTestDB(t, smallBatch())
	pick := func(s picker.Stock, r picker.Request) (picker.Result, error) {
		c := fakeCandidate(1, picker.Failure{Kind: picker.FailAllowance, Part: "rc", Utilization: 1.3})
		return picker.Result{Candidates: []picker.Candidate{c}, Shortfall: &picker.Shortfall{},
			Ranking: picker.Ranking{Stopped: true, TimeLimit: r.TimeLimit, Ranked: 1}}, nil
	}
	inv := runPick(t, path, pick, "--vcc", "12V", "--ic", "1mA", "--time-limit", "2s")
	for _, w := range []string{"NO FITTING BUILD FOUND: the search stopped at its 2 s time limit", "order: the search stopped at its 2 s time limit"} {
		if !strings.Contains(inv.stdout, w) {
			t.Errorf("stdout lacks %q:\n%s", w, inv.stdout)
		}
	}
	if !strings.Contains(inv.stderr, "no fitting build found before the 2 s time limit") {
		t.Errorf("stderr lacks the stopped search's words:\n%s", inv.stderr)
	}
	if out := inv.stdout + inv.stderr; strings.Contains(out, "NOTHING FITS") || strings.Contains(out, "nothing fits") {
		t.Errorf("a stopped search claims that nothing fits:\n%s", out)
	}
}

func TestStockRunsShort(t *testing.T) {
	path := newTestDB(t, smallBatch()) // QN-104A: 10 in stock
	pick := func(_ picker.Stock, r picker.Request) (picker.Result, error) {
		if r.Boards > 10 {
			return picker.Result{Shortfall: &picker.Shortfall{Rejected: []picker.Rejection{{Kind: picker.RejectQty,
				Line: picker.Transistor{ID: 4, Bin: "D1", Qty: 10, Sheet: solver.Datasheet{Label: "QN-104A"}}, Qty: 10, Boards: r.Boards}}}}, nil
		}
		return picker.Result{Candidates: []picker.Candidate{fakeCandidate(1)}}, nil
	}
	inv := runPick(t, path, pick, "--vcc", "12V", "--ic", "1mA", "--boards", "25")
	if cmdutil.ExitCode(inv.err) != 1 {
		t.Errorf("exit %d, want 1: the run as asked does not fit", cmdutil.ExitCode(inv.err))
	}
	for _, w := range []string{"NOTHING FITS 25 BOARDS: the stock on hand builds at most 10.", "Pull list for #1, 25 boards"} {
		if !strings.Contains(inv.stdout, w) {
			t.Errorf("stdout lacks %q:\n%s", w, inv.stdout)
		}
	}
	// fakeCandidate's QN-104A line 10 holds 8 (fakeStock is not this
	// stock: the pull list counts on-hand from the stock read, where
	// line 10 does not exist, so all 25 are to buy).
	for _, w := range []string{"left out: QN-104A", "25 × QN-104A for build #1 on all 25 boards", "builds 10 of the 25 boards"} {
		if !strings.Contains(inv.stderr, w) {
			t.Errorf("stderr lacks %q:\n%s", w, inv.stderr)
		}
	}
}

func TestPickPassesStockAndRequest(t *testing.T) {
	path := newTestDB(t, smallBatch())
	var got picker.Stock
	pick := func(s picker.Stock, r picker.Request) (picker.Result, error) {
		got = s
		return picker.Result{Candidates: []picker.Candidate{fakeCandidate(1)}}, nil
	}
	inv := runPick(t, path, pick, "--vcc", "12V", "--ic", "1mA", "--json")
	if inv.err != nil {
		t.Fatal(inv.err)
	}
	if len(got.Resistors) != 3 || len(got.Transistors) != 1 || got.Transistors[0].Sheet.Label != "QN-104A" {
		t.Errorf("stock passed to the search: %+v", got)
	}
	if len(inv.picks) != 1 || inv.picks[0].Progress != nil {
		t.Errorf("searches %d, progress callback set when stderr is not a terminal", len(inv.picks))
	}
	if !strings.HasPrefix(inv.stdout, "{") || inv.stderr != "" {
		t.Errorf("JSON run: stdout %.40q, stderr %q", inv.stdout, inv.stderr)
	}
}

func TestProgress(t *testing.T) {
	var buf bytes.Buffer
	now := time.Unix(0, 0)
	clock := func() time.Time { return now }
	p := newProgress(&buf, clock)
	steps := []struct {
		after time.Duration
		done  int64
		drawn bool
	}{
		{500 * time.Millisecond, 10, false},  // under a second: nothing
		{1100 * time.Millisecond, 20, true},  // past a second: drawn
		{1150 * time.Millisecond, 30, false}, // within 100 ms of the last draw
		{1300 * time.Millisecond, 40, true},
	}
	for _, s := range steps {
		now = time.Unix(0, 0).Add(s.after)
		n := buf.Len()
		p.update(s.done, 100)
		if drawn := buf.Len() > n; drawn != s.drawn {
			t.Errorf("at %v: drawn %v, want %v", s.after, drawn, s.drawn)
		}
	}
	if !strings.Contains(buf.String(), "searching: 40 % (40 of 100 steps)") {
		t.Errorf("indicator %q", buf.String())
	}
	p.finish()
	if !strings.HasSuffix(buf.String(), "\r\033[K") {
		t.Errorf("finish did not erase the line: %q", buf.String())
	}
	var quiet bytes.Buffer
	q := newProgress(&quiet, clock)
	q.finish()
	if quiet.Len() != 0 {
		t.Errorf("a search under a second left %q on stderr", quiet.String())
	}
}
