package solver

import (
	"math"
	"math/rand/v2"
	"reflect"
	"runtime"
	"testing"
)

// oneInputBuild varies only the named input: no supply tolerance, no
// ambient range, no self-heating.
func oneInputBuild(keep Slot, betaSpread bool) Build {
	b := dividerBuild()
	b.VCCTol = 0
	b.Device.ThetaJA_KPerW = 0
	b.AmbientMin_C, b.AmbientMax_C = 25, 25
	b.Device.VBEMin_V, b.Device.VBEMax_V = 0.65, 0.65 // no VBE(on) spread
	if !betaSpread {
		b.Device.HFEMin, b.Device.HFEMax = 200, 200
	}
	for s := range NumSlots {
		if s != keep {
			b.Resistors[s].Tol = 0
		}
	}
	return b
}

// icAt solves b with RE moved by dev (a fraction) and forward beta bf.
func icAt(t *testing.T, b Build, devRE, bf float64) float64 {
	t.Helper()
	m, err := ModelFor(b.Device, bf)
	if err != nil {
		t.Fatal(err)
	}
	var dev [NumSlots]float64
	dev[RE] = devRE
	op, err := Solve(b.Resolve(dev, 1, 25), m, 25)
	if err != nil {
		t.Fatal(err)
	}
	return op.IC_A
}

func TestYieldFractions(t *testing.T) {
	// source: hand derivation (probability of a preimage): when IC is a monotonic function of one random input,
	// the pass share is the probability of the preimage of the window. IC
	// falls as RE rises (REFERENCE.md §9 [D]) and rises with beta.
	reBuild := oneInputBuild(RE, false)
	betaBuild := oneInputBuild(-1, true)
	gm := math.Sqrt(100 * 300)
	tests := []struct {
		name string
		b    Build
		w    Window
		opt  YieldOptions
		want float64
	}{
		// RE uniform on ±5 % (REFERENCE.md §9): P(dev ≥ +2.5 %) = 0.25.
		{"RE uniform, upper quarter", reBuild, Window{ICMax_A: icAt(t, reBuild, 0.025, 200)}, YieldOptions{}, 0.25},
		// RE normal σ = tol/3 truncated at ±tol (REFERENCE.md §9):
		// P(Z ≥ 1.5 | |Z| ≤ 3) = (Φ(3) − Φ(1.5))/(2Φ(3) − 1)
		// = (0.998650 − 0.933193)/0.997300 = 0.065634 (source: standard
		// normal table values Φ(1.5), Φ(3)).
		{"RE truncated normal, beyond 1.5 sigma", reBuild, Window{ICMax_A: icAt(t, reBuild, 0.025, 200)}, YieldOptions{Resistors: ResistorNormal}, 0.065634},
		// hFE uniform on [100, 300]: P(β ≥ √(100·300)) = (300 − 173.205)/200.
		{"hFE uniform above the geometric mean", betaBuild, Window{ICMin_A: icAt(t, betaBuild, 0, gm)}, YieldOptions{}, (300 - gm) / 200},
		// hFE log-uniform: the geometric mean is the median, P = 0.5.
		{"hFE log-uniform above the geometric mean", betaBuild, Window{ICMin_A: icAt(t, betaBuild, 0, gm)}, YieldOptions{Beta: BetaLogUniform}, 0.5},
	}
	for i, tt := range tests {
		y, err := EvalYieldSeeded(tt.b, tt.w, 4000, uint64(i+1), tt.opt)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		se := math.Sqrt(tt.want * (1 - tt.want) / 4000)
		if math.Abs(y.Yield-tt.want) > 3*se {
			t.Errorf("%s: yield %.4f ± %.4f, want %.4f within 3 standard errors (%.4f)", tt.name, y.Yield, y.StdErr, tt.want, 3*se)
		}
		// source: REFERENCE.md §9, standard error √(p̂(1−p̂)/M).
		if want := math.Sqrt(y.Yield * (1 - y.Yield) / 4000); math.Abs(y.StdErr-want) > 1e-15 {
			t.Errorf("%s: StdErr %g, want √(p(1−p)/n) = %g", tt.name, y.StdErr, want)
		}
		if y.Boards != 4000 || y.Pass != int(math.Round(y.Yield*4000)) || y.Failed != 0 || y.Seed != uint64(i+1) {
			t.Errorf("%s: counts %+v inconsistent", tt.name, y)
		}
	}
}

func TestYieldInsideCorners(t *testing.T) {
	// source: REFERENCE.md §9: when IC and VCE are monotonic in every
	// input, every board lies between the corner extremes, so a window
	// spanning the corners passes every board: yield exactly 1, StdErr 0.
	b := dividerBuild()
	wc, err := WorstCaseExtremes(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	w := Window{ICMin_A: wc.ICMin_A * (1 - 1e-9), ICMax_A: wc.ICMax_A * (1 + 1e-9), VCEMin_V: wc.VCEMin_V - 1e-9, VCEMax_V: wc.VCEMax_V + 1e-9}
	for _, opt := range []YieldOptions{{}, {Resistors: ResistorNormal, Beta: BetaLogUniform}} {
		y, err := EvalYieldWith(b, w, 2000, rand.New(rand.NewPCG(7, 7)), opt)
		if err != nil {
			t.Fatal(err)
		}
		if y.Pass != 2000 || y.Yield != 1 || y.StdErr != 0 {
			t.Errorf("options %+v: yield %+v, want every board to pass", opt, y)
		}
	}
	// A window that only the nominal neighbourhood meets loses boards.
	w.ICMax_A = 0.5 * (wc.ICMin_A + wc.ICMax_A)
	y, err := EvalYield(b, w, 2000, rand.New(rand.NewPCG(7, 7)))
	if err != nil {
		t.Fatal(err)
	}
	if y.Yield <= 0 || y.Yield >= 1 {
		t.Errorf("half window: yield %g, want strictly between 0 and 1", y.Yield)
	}
}

func TestYieldReproducible(t *testing.T) {
	b := dividerBuild()
	wc, err := WorstCaseExtremes(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	w := Window{ICMax_A: 0.5 * (wc.ICMin_A + wc.ICMax_A)}
	a, err := EvalYieldSeeded(b, w, 1000, 42, YieldOptions{})
	if err != nil {
		t.Fatal(err)
	}
	again, err := EvalYieldSeeded(b, w, 1000, 42, YieldOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(a, again) {
		t.Errorf("same seed gave %+v then %+v", a, again)
	}
}

func TestYieldBadInput(t *testing.T) {
	b := dividerBuild()
	rng := rand.New(rand.NewPCG(1, 1))
	for _, tt := range []struct {
		name string
		w    Window
		n    int
	}{
		{"no boards", Window{}, 0},
		{"inverted IC window", Window{ICMin_A: 2e-3, ICMax_A: 1e-3}, 10},
		{"NaN bound", Window{VCEMin_V: math.NaN()}, 10},
	} {
		if _, err := EvalYield(b, tt.w, tt.n, rng); err == nil {
			t.Errorf("%s: no error", tt.name)
		}
	}
}

func TestModelForBetaOnlyInBF(t *testing.T) {
	// The analyses build one model and move BF; this holds only while
	// ModelFor depends on its bf argument through BF alone.
	d := dividerBuild().Device
	base, err := ModelFor(d, 100)
	if err != nil {
		t.Fatal(err)
	}
	for _, bf := range []float64{50, 173.2, 300} {
		m, err := ModelFor(d, bf)
		if err != nil {
			t.Fatal(err)
		}
		moved := base
		moved.BF = bf
		if m != moved {
			t.Errorf("ModelFor(bf=%g) = %+v, want the bf=100 model with BF moved: %+v", bf, m, moved)
		}
	}
}

// BenchmarkYield10k is the yield of one build over 10,000 boards, each
// solved self-heated at both ambient ends (-10 and 60 °C) and checked for
// a turning point between them (goal: under 100 ms).
func BenchmarkYield10k(b *testing.B) {
	bd := dividerBuild()
	w := Window{ICMin_A: 3.5e-3, ICMax_A: 4.5e-3, VCEMin_V: 4, VCEMax_V: 9}
	for b.Loop() {
		if _, err := EvalYieldSeeded(bd, w, 10000, 1, YieldOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

// TestYieldKeepBoards checks the kept samples against the yield's own
// definition (a board passes when its IC and VCE lie in the window at every
// ambient of the range; YieldDefinition, REFERENCE.md §9): each board
// keeps the two ends of the range in order, a passing board is inside at
// both, a failing one outside at one of them unless it turned between
// them, the kept boards reproduce the counts, and keeping them changes no
// figure.
func TestYieldKeepBoards(t *testing.T) {
	b := dividerBuild()
	b.AmbientMin_C, b.AmbientMax_C = -10, 60
	wc, err := WorstCaseExtremes(b, Limits{})
	if err != nil {
		t.Fatal(err)
	}
	w := Window{ICMax_A: 0.5 * (wc.ICMin_A + wc.ICMax_A)}
	plain, err := EvalYieldSeeded(b, w, 500, 3, YieldOptions{})
	if err != nil {
		t.Fatal(err)
	}
	kept, err := EvalYieldSeeded(b, w, 500, 3, YieldOptions{KeepBoards: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(kept.Samples) != 500 || plain.Samples != nil {
		t.Fatalf("%d samples kept, %d without asking; want 500 and 0", len(kept.Samples), len(plain.Samples))
	}
	samples := kept.Samples
	kept.Samples = nil
	if !reflect.DeepEqual(kept, plain) {
		t.Errorf("keeping boards changed the result: %+v, want %+v", kept, plain)
	}
	pass, between := 0, 0
	for i, s := range samples {
		if len(s.Points) != 2 {
			t.Fatalf("board %d: %d points, want both ends", i, len(s.Points))
		}
		in := true
		for j, p := range s.Points {
			if p.Ambient_C < b.AmbientMin_C || p.Ambient_C > b.AmbientMax_C {
				t.Errorf("board %d: ambient %g °C outside the range", i, p.Ambient_C)
			}
			if j < 2 && p.Ambient_C != [2]float64{b.AmbientMin_C, b.AmbientMax_C}[j] {
				t.Errorf("board %d point %d: ambient %g °C, want the range's ends in order", i, j, p.Ambient_C)
			}
			in = in && w.Contains(&OperatingPoint{IC_A: p.IC_A, VCE_V: p.VCE_V})
		}
		// Only the ends are kept: a board inside at both may still fail
		// between them, never the other way round.
		if s.Pass && !in {
			t.Errorf("board %d: passed, but an end lies outside the window", i)
		}
		if !s.Pass && in {
			between++
		}
		if s.Pass {
			pass++
		}
	}
	if between > kept.Turned {
		t.Errorf("%d boards failed between ends that are inside, but only %d turned", between, kept.Turned)
	}
	if pass != kept.Pass || pass == 0 || pass == 500 {
		t.Errorf("%d kept boards pass, result says %d (want strictly between 0 and 500)", pass, kept.Pass)
	}
}

// TestYieldFailLimit checks the early stop against the full run of the
// same seed, board by board (YieldOptions.KeepBoards): source: the
// definition of a sequential test that stops at the first board where the
// failures exceed the limit — the boards before it are the same draws, a
// run whose failures never exceed the limit is the full run.
func TestYieldFailLimit(t *testing.T) {
	b := oneInputBuild(-1, true)
	gm := math.Sqrt(100 * 300)
	w := Window{ICMin_A: icAt(t, b, 0, gm)} // about 37 % pass (hFE uniform)
	const n = 400
	full, err := EvalYieldSeeded(b, w, n, 11, YieldOptions{KeepBoards: true})
	if err != nil {
		t.Fatal(err)
	}
	if full.Pass < 50 || full.Pass > n-50 {
		t.Fatalf("fixture too weak: %d of %d boards pass", full.Pass, n)
	}
	for _, limit := range []int{1, 40, n - full.Pass - 1, n - full.Pass, n} {
		y, err := EvalYieldSeeded(b, w, n, 11, YieldOptions{FailLimit: limit})
		if err != nil {
			t.Fatal(err)
		}
		// the board at which the failures first exceed the limit
		stopAt, fails := 0, 0
		for i, s := range full.Samples {
			if !s.Pass {
				fails++
			}
			if fails > limit {
				stopAt = i + 1
				break
			}
		}
		if stopAt == 0 {
			if y.Stopped || y.Boards != n || y.Pass != full.Pass || y.Yield != full.Yield || y.Low95 != full.Low95 {
				t.Errorf("limit %d never reached: got %+v, want the full run %d/%d", limit, y, full.Pass, n)
			}
			continue
		}
		pass := 0
		for _, s := range full.Samples[:stopAt] {
			if s.Pass {
				pass++
			}
		}
		if !y.Stopped || y.Boards != stopAt || y.Pass != pass || y.Boards-y.Pass != limit+1 {
			t.Errorf("limit %d: got stopped %v after %d boards, %d passed; want a stop after %d boards, %d passed",
				limit, y.Stopped, y.Boards, y.Pass, stopAt, pass)
		}
	}
}

// TestYieldSameOnAnyCPUCount checks that judging boards concurrently
// changes no figure: the run on one CPU (boards one at a time) and on four
// give identical results, with and without a failure limit (source: the
// definition of the run — each board's outcome depends on its own draws).
func TestYieldSameOnAnyCPUCount(t *testing.T) {
	b := oneInputBuild(-1, true)
	w := Window{ICMin_A: icAt(t, b, 0, math.Sqrt(100*300))}
	prev := runtime.GOMAXPROCS(1)
	defer runtime.GOMAXPROCS(prev)
	for _, limit := range []int{0, 40, 1000} {
		runtime.GOMAXPROCS(1)
		one, err := EvalYieldSeeded(b, w, 700, 5, YieldOptions{FailLimit: limit})
		if err != nil {
			t.Fatal(err)
		}
		runtime.GOMAXPROCS(4)
		four, err := EvalYieldSeeded(b, w, 700, 5, YieldOptions{FailLimit: limit})
		if err != nil {
			t.Fatal(err)
		}
		if one.Pass == 0 || one.Pass == one.Boards {
			t.Fatalf("fixture too weak: %d of %d boards pass", one.Pass, one.Boards)
		}
		if !reflect.DeepEqual(one, four) {
			t.Errorf("limit %d: one CPU %+v, four %+v", limit, one, four)
		}
	}
}
