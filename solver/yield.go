package solver

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"
	"sync/atomic"
)

// Window is the acceptance band for yield. A zero maximum means no upper
// bound; a zero minimum means no lower bound (IC and VCE are magnitudes).
type Window struct {
	ICMin_A, ICMax_A   float64
	VCEMin_V, VCEMax_V float64
}

// Contains reports whether op's IC and VCE lie inside w.
func (w Window) Contains(op *OperatingPoint) bool {
	return op.IC_A >= w.ICMin_A && (w.ICMax_A == 0 || op.IC_A <= w.ICMax_A) &&
		op.VCE_V >= w.VCEMin_V && (w.VCEMax_V == 0 || op.VCE_V <= w.VCEMax_V)
}

// validate reports a window that no board can meet.
func (w Window) validate() error {
	for _, v := range []float64{w.ICMin_A, w.ICMax_A, w.VCEMin_V, w.VCEMax_V} {
		if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
			return &InputError{Field: "window", Problem: fmt.Sprintf("%g: want finite magnitudes >= 0", v)}
		}
	}
	if w.ICMax_A != 0 && w.ICMax_A < w.ICMin_A {
		return &InputError{Field: "window", Problem: fmt.Sprintf("IC max %g A below IC min %g A", w.ICMax_A, w.ICMin_A)}
	}
	if w.VCEMax_V != 0 && w.VCEMax_V < w.VCEMin_V {
		return &InputError{Field: "window", Problem: fmt.Sprintf("VCE max %g V below VCE min %g V", w.VCEMax_V, w.VCEMin_V)}
	}
	return nil
}

// YieldDefinition is what the yield counts, as stated to the user.
const YieldDefinition = "the share of boards, every uncertain input drawn at random within its stated limits, " +
	"whose IC and VCE stay inside the window at every ambient temperature of the range: " +
	"each board is solved at both ends of the range, and where its IC or VCE turns between the ends, at the turning point too"

// YieldIntervalMethod names the interval reported with the yield.
const YieldIntervalMethod = "Clopper-Pearson exact binomial, 95 % two-sided " +
	"(Clopper & Pearson, Biometrika 26, 1934)"

// YieldResult is a Monte Carlo yield estimate.
type YieldResult struct {
	Boards int
	Pass   int
	Yield  float64 // Pass/Boards, the point estimate
	// Low95 and High95 are the Clopper–Pearson 95 % two-sided interval of
	// the yield (YieldIntervalMethod); never of zero width.
	Low95, High95 float64
	// StdErr is the binomial standard error √(p(1−p)/n) of the point
	// estimate (REFERENCE.md §9); it is 0 when every board passes, so it
	// is no interval: report Low95..High95.
	StdErr float64
	Seed   uint64 // the seed when run by EvalYieldSeeded; 0 from EvalYield
	Failed int    // boards whose solve returned an error (counted as failures)
	// Turned counts boards whose IC or VCE was not monotonic over the
	// ambient range, so that a turning point between the ends was solved.
	Turned int
	// Samples holds every board's operating points, in drawing order, when
	// YieldOptions.KeepBoards is set (nil otherwise).
	Samples []BoardSample
	// Stopped reports a run cut short by YieldOptions.FailLimit: more
	// than FailLimit of the boards failed, and Yield and the interval are
	// those of the boards run (Boards counts them), not a yield estimate.
	Stopped bool
}

// BoardSample is one Monte Carlo board as solved: its Q-point at the
// minimum and then the maximum ambient (one point for a range of one
// temperature; fewer when a solve failed), and whether it passed. The
// points the monotonicity check solved between the ends are not kept.
type BoardSample struct {
	Points []SamplePoint // the ends solved before a failure, if any
	Pass   bool          // inside the window at every ambient of the range
	Failed bool          // a solve returned an error (the board counts as a failure)
}

// SamplePoint is a board's Q-point at one ambient temperature.
type SamplePoint struct {
	Ambient_C float64
	IC_A      float64
	VCE_V     float64
}

// ResistorDist is how resistor values are drawn within their tolerance.
type ResistorDist int

const (
	// ResistorUniform draws uniformly on ±tol: the rectangular
	// distribution of limits alone (JCGM 101:2008 §6.4.2.1; REFERENCE.md
	// §9, §13).
	ResistorUniform ResistorDist = iota
	// ResistorNormal draws from a normal distribution with σ = tol/3,
	// truncated at ±tol (common practice, REFERENCE.md §9).
	ResistorNormal
)

// BetaDist is how the forward gain is drawn within [hFE min, hFE max].
type BetaDist int

const (
	// BetaUniform draws hFE uniformly on [min, max] (REFERENCE.md §9).
	BetaUniform BetaDist = iota
	// BetaLogUniform draws log hFE uniformly (REFERENCE.md §9).
	BetaLogUniform
)

// YieldOptions selects the sampling distributions. The zero value is what
// EvalYield uses: every input rectangular between its limits.
type YieldOptions struct {
	Resistors ResistorDist
	Beta      BetaDist
	// KeepBoards fills YieldResult.Samples with every board's Q-points
	// (for pictures of the spread); it changes no figure.
	KeepBoards bool
	// FailLimit, when positive, stops the run as soon as more than
	// FailLimit boards have failed: the caller only needs to know that the
	// yield is below (Boards − FailLimit)/Boards. The result then has
	// Stopped set and its counts cover the boards run. The boards run are
	// drawn exactly as in a full run, so a run that does not stop gives the
	// same result as one without the limit.
	FailLimit int
}

// EvalYield runs a seeded Monte Carlo over n boards with the default
// YieldOptions (YieldDefinition). Each board draws, independently and in
// the order of Uncertainties: every used resistor's value on its ±tol and
// its TCR on ± its stated bound, the supply factor on ±VCCTol, hFE on
// [hFE min, hFE max], VBE(on) on VBEOnRange (through IS), the Early
// voltage on VAFRange and, for a split supply, the emitter rail's factor
// on ± its own tolerance (Build.EmitterRailTol), each rectangular (only limits are known, JCGM
// 101:2008 §6.4.2.1). The ambient is not drawn: the board is solved,
// self-heated, with its resistors at the ambient, at both ends of the
// range and counts as good only if IC and VCE are inside w at both.
//
// Between the ends: the response is checked for monotonicity by the
// slope of IC and VCE at each end (a one-sided difference over 1 % of the
// range, the points solved being checked too). Where a slope changes sign
// the response has a turning point inside the range, which is found by a
// golden-section search (each point it solves is checked) and checked.
// Every temperature mechanism of the model is monotonic and smooth in the
// temperature (IS(T), BF(T) and ICBO(T) rise, each resistor drifts
// linearly), so a response with at most one turning point is covered
// exactly; TestYieldSweepAgrees checks the rule against a dense sweep.
//
// The result carries the Clopper–Pearson 95 % interval. A board whose
// solve fails counts as a failure. The same rng state gives the same
// result.
func EvalYield(b Build, w Window, n int, rng *rand.Rand) (YieldResult, error) {
	return EvalYieldWith(b, w, n, rng, YieldOptions{})
}

// EvalYieldSeeded is EvalYield with a PCG source seeded from seed, which
// it records in the result.
func EvalYieldSeeded(b Build, w Window, n int, seed uint64, opt YieldOptions) (YieldResult, error) {
	rng := rand.New(rand.NewPCG(seed, yieldStream))
	y, err := EvalYieldWith(b, w, n, rng, opt)
	y.Seed = seed
	return y, err
}

// yieldStream is the second PCG word of EvalYieldSeeded's source.
const yieldStream = 0x62696173 // "bias"

// EvalYieldWith is EvalYield with selectable distributions. Without
// KeepBoards the boards are judged on every CPU (GOMAXPROCS), with the
// same result as one at a time; a run stopped by FailLimit may then leave
// rng up to yieldChunk boards' draws further on.
func EvalYieldWith(b Build, w Window, n int, rng *rand.Rand, opt YieldOptions) (YieldResult, error) {
	if err := b.Validate(); err != nil {
		return YieldResult{}, fmt.Errorf("yield: %w", err)
	}
	if err := w.validate(); err != nil {
		return YieldResult{}, fmt.Errorf("yield: %w", err)
	}
	if err := YieldBoardsRange.Check(float64(n)); err != nil {
		return YieldResult{}, fmt.Errorf("yield: %w", err)
	}
	if rng == nil {
		panic("solver: EvalYield with a nil random source")
	}
	smp, err := newBoardSampler(&b, rng, opt)
	if err != nil {
		return YieldResult{}, fmt.Errorf("yield: %w", err)
	}
	j := newBoardJudge(&b, w)
	res := YieldResult{Boards: n}
	// tally counts one board's outcome and reports whether the run stops
	// there (more than FailLimit failures after board i).
	tally := func(i int, o boardOutcome) bool {
		switch {
		case o.err != nil:
			res.Failed++
		case o.pass:
			res.Pass++
		}
		if o.turned {
			res.Turned++
		}
		if opt.FailLimit > 0 && i+1-res.Pass > opt.FailLimit {
			res.Boards, res.Stopped = i+1, true
			return true
		}
		return false
	}
	if workers := runtime.GOMAXPROCS(0); workers > 1 && !opt.KeepBoards && n > 1 {
		judgeInChunks(j, smp, n, workers, opt.FailLimit, tally)
	} else {
		if opt.KeepBoards {
			res.Samples = make([]BoardSample, 0, n)
		}
		var bd board
		for i := range n {
			smp.draw(&bd)
			// A board's sample is made only when kept: taking the address of
			// one per board would move it to the heap for every board.
			var sample *BoardSample
			if opt.KeepBoards {
				sample = &BoardSample{}
				j.keep = sample
			}
			var o boardOutcome
			o.pass, o.turned, o.err = j.judge(&bd)
			if sample != nil {
				sample.Pass, sample.Failed = o.pass && o.err == nil, o.err != nil
				res.Samples = append(res.Samples, *sample)
			}
			if tally(i, o) {
				break
			}
		}
	}
	n = res.Boards
	res.Yield = float64(res.Pass) / float64(n)
	res.StdErr = math.Sqrt(res.Yield * (1 - res.Yield) / float64(n))
	res.Low95, res.High95 = ClopperPearson95(res.Pass, n)
	return res, nil
}

// boardOutcome is what judging one board gave.
type boardOutcome struct {
	pass, turned bool
	err          error
}

// yieldChunk is the most boards judgeInChunks draws at a time: enough
// work per worker to outweigh starting it and waiting for the others at
// the chunk's end (256 judged 10,000 boards in 27 ms where 64 took 31,
// BenchmarkYield10k on two CPUs).
const yieldChunk = 256

// judgeInChunks judges boards 0..n−1 on up to workers goroutines: it draws
// a chunk of boards in order from smp (so each board is the one a
// sequential run draws), judges them concurrently (a board's judgement
// depends on the board alone: j keeps nothing between boards when no
// samples are kept) and passes the outcomes to tally in board order,
// stopping at the first for which tally reports a stop. So the result is
// the sequential run's; only the random source may have advanced by up to
// one chunk past the board the run stopped at. With a failure limit the
// chunks start at limit + 1 boards (the fewest a stopped run judges, and
// at least one per worker) and double up to yieldChunk, so a run that
// stops early judges few boards past the stop.
func judgeInChunks(j *boardJudge, smp *boardSampler, n, workers, failLimit int, tally func(int, boardOutcome) bool) {
	size := yieldChunk
	if failLimit > 0 {
		size = min(yieldChunk, max(workers, failLimit+1))
	}
	boards := make([]board, min(n, yieldChunk))
	outs := make([]boardOutcome, len(boards))
	for start := 0; start < n; {
		m := min(size, n-start)
		for i := range m {
			smp.draw(&boards[i])
		}
		// boards differ in cost (one that fails at the cold end takes one
		// solve, a passing one four or more), so each worker takes the
		// next board left
		var wg sync.WaitGroup
		var next atomic.Int64
		for range min(workers, m) {
			wg.Go(func() {
				for i := int(next.Add(1) - 1); i < m; i = int(next.Add(1) - 1) {
					outs[i].pass, outs[i].turned, outs[i].err = j.judge(&boards[i])
				}
			})
		}
		wg.Wait()
		for i := range m {
			if tally(start+i, outs[i]) {
				return
			}
		}
		start += m
		size = min(2*size, yieldChunk)
	}
}
