package solver

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/stat/distuv"
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

// YieldResult is a Monte Carlo yield estimate.
type YieldResult struct {
	Boards int
	Pass   int
	Yield  float64
	StdErr float64
	Seed   uint64 // the seed when run by EvalYieldSeeded; 0 from EvalYield
	Failed int    // boards whose solve returned an error (counted as failures)
	// Samples holds every board's operating points, in drawing order, when
	// YieldOptions.KeepBoards is set (nil otherwise).
	Samples []BoardSample
}

// BoardSample is one Monte Carlo board as solved: its Q-point at each
// ambient it was solved at (one with AmbientUniform, the minimum then the
// maximum with AmbientExtremes) and whether it passed.
type BoardSample struct {
	Points []SamplePoint // the ambients solved before a failure, if any
	Pass   bool          // inside the window at every ambient solved
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
	// ResistorUniform draws uniformly on ±tol: the conservative choice
	// (common practice, REFERENCE.md §9).
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

// AmbientMode is how the ambient temperature enters a board.
type AmbientMode int

const (
	// AmbientUniform gives each board one ambient drawn uniformly over
	// [AmbientMin_C, AmbientMax_C].
	AmbientUniform AmbientMode = iota
	// AmbientExtremes solves each board at both ambient extremes and
	// passes it only if both points are inside the window: the board must
	// work over the whole range (temperature swept at its extremes rather
	// than sampled, common practice, REFERENCE.md §9). Twice the solves.
	AmbientExtremes
)

// YieldOptions selects the sampling distributions. The zero value is what
// EvalYield uses: resistors, hFE, supply and ambient all uniform.
type YieldOptions struct {
	Resistors ResistorDist
	Beta      BetaDist
	Ambient   AmbientMode
	// KeepBoards fills YieldResult.Samples with every board's Q-points
	// (for pictures of the spread); it changes no figure.
	KeepBoards bool
}

// EvalYield runs a seeded Monte Carlo over n boards with the default
// YieldOptions. Each board draws, independently: every used resistor
// uniform on its ±tol (conservative, common practice, REFERENCE.md §9),
// hFE uniform on [hFE min, hFE max], the supply factor uniform on ±VCCTol,
// and the ambient uniform over [AmbientMin_C, AmbientMax_C]; the resistors
// sit at the ambient (TCR applied) and the transistor is self-heated. The
// yield is the share of boards whose IC and VCE lie in w, with the
// binomial standard error √(p(1−p)/n) (REFERENCE.md §9). A board whose
// solve fails counts as a failure. The same rng state gives the same result.
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

// EvalYieldWith is EvalYield with selectable distributions.
func EvalYieldWith(b Build, w Window, n int, rng *rand.Rand, opt YieldOptions) (YieldResult, error) {
	if err := b.Validate(); err != nil {
		return YieldResult{}, fmt.Errorf("yield: %w", err)
	}
	if err := w.validate(); err != nil {
		return YieldResult{}, fmt.Errorf("yield: %w", err)
	}
	if n < 1 {
		return YieldResult{}, fmt.Errorf("yield: %w", &InputError{Field: "boards", Problem: fmt.Sprintf("%d: want at least 1", n)})
	}
	if rng == nil {
		panic("solver: EvalYield with a nil random source")
	}
	d := b.Device
	m, err := ModelFor(d, d.HFEMin)
	if err != nil {
		return YieldResult{}, fmt.Errorf("yield: %w", err)
	}
	theta, tjMax := ThermalResistance(d), tjMaxOf(d)
	unit := distuv.Uniform{Min: -1, Max: 1, Src: rng}
	norm := distuv.Normal{Mu: 0, Sigma: 1.0 / 3, Src: rng}
	var slots [NumSlots]Slot
	ns := 0
	for i := range NumSlots {
		if b.usedSlot(i) && b.Resistors[i].Tol > 0 {
			slots[ns] = i
			ns++
		}
	}
	logMin, logMax := math.Log(d.HFEMin), math.Log(d.HFEMax)
	res := YieldResult{Boards: n}
	for range n {
		var dev [NumSlots]float64
		for _, i := range slots[:ns] {
			x := 0.0
			if opt.Resistors == ResistorNormal {
				x = norm.Rand()
				for math.Abs(x) > 1 { // truncate at ±tol by redrawing
					x = norm.Rand()
				}
			} else {
				x = unit.Rand()
			}
			dev[i] = x * b.Resistors[i].Tol
		}
		u := 0.5 * (unit.Rand() + 1) // [0, 1)
		if opt.Beta == BetaLogUniform {
			m.BF = math.Exp(logMin + u*(logMax-logMin))
		} else {
			m.BF = d.HFEMin + u*(d.HFEMax-d.HFEMin) // ModelFor depends on bf only through BF
		}
		vccFactor := 1 + b.VCCTol*unit.Rand()
		pass, failed := true, false
		var sample BoardSample
		keep := func(ta float64, op *OperatingPoint) {
			if opt.KeepBoards {
				sample.Points = append(sample.Points, SamplePoint{Ambient_C: ta, IC_A: op.IC_A, VCE_V: op.VCE_V})
			}
		}
		if opt.Ambient == AmbientExtremes {
			for _, ta := range [2]float64{b.AmbientMin_C, b.AmbientMax_C} {
				op, err := SolveSelfHeated(b.Resolve(dev, vccFactor, ta), m, ta, theta, tjMax)
				if err != nil {
					failed = true
					break
				}
				keep(ta, &op)
				if !w.Contains(&op) {
					pass = false
				}
			}
		} else {
			ta := b.AmbientMin_C + 0.5*(unit.Rand()+1)*(b.AmbientMax_C-b.AmbientMin_C)
			op, err := SolveSelfHeated(b.Resolve(dev, vccFactor, ta), m, ta, theta, tjMax)
			if err != nil {
				failed = true
			} else {
				keep(ta, &op)
				pass = w.Contains(&op)
			}
		}
		if opt.KeepBoards {
			sample.Pass, sample.Failed = pass && !failed, failed
			res.Samples = append(res.Samples, sample)
		}
		switch {
		case failed:
			res.Failed++
		case pass:
			res.Pass++
		}
	}
	res.Yield = float64(res.Pass) / float64(n)
	res.StdErr = math.Sqrt(res.Yield * (1 - res.Yield) / float64(n))
	return res, nil
}
