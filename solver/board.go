package solver

import (
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/stat/distuv"
)

// board is one sampled board of the Monte Carlo yield: every drawn input.
type board struct {
	dev       [NumSlots]float64 // resistor deviations (fractions of nominal)
	tcr       [NumSlots]float64 // resistor TCRs, ppm/K
	vccFactor float64           // supply factor
	veeFactor float64           // emitter rail factor (split supply), else 1
	m         Model             // the board's transistor: BF, IS (from VBE(on)) and VAF drawn
	vbe_V     float64           // the drawn VBE(on) behind m.IS_A
}

// boardSampler draws boards of one build (see EvalYield for the
// distributions and the order of the draws).
type boardSampler struct {
	b              *Build
	opt            YieldOptions
	unit           distuv.Uniform
	norm           distuv.Normal
	tolSlots       []Slot
	tcrSlots       []Slot
	base           Model
	logMin, logMax float64
	vbeLo, vbeHi   float64
	vafLo, vafHi   float64
	vtNom          float64
}

func newBoardSampler(b *Build, rng *rand.Rand, opt YieldOptions) (*boardSampler, error) {
	d := b.Device
	m, err := ModelFor(d, d.HFEMin)
	if err != nil {
		return nil, err
	}
	s := &boardSampler{
		b: b, opt: opt, base: m,
		unit:   distuv.Uniform{Min: -1, Max: 1, Src: rng},
		norm:   distuv.Normal{Mu: 0, Sigma: 1.0 / 3, Src: rng},
		logMin: math.Log(d.HFEMin), logMax: math.Log(d.HFEMax),
		vtNom: thermalVoltage(DefaultTNOM_C),
	}
	for i := range NumSlots {
		if b.usedSlot(i) && b.Resistors[i].Tol > 0 {
			s.tolSlots = append(s.tolSlots, i)
		}
	}
	for i := range NumSlots {
		if b.usedSlot(i) && b.Resistors[i].TCR_PPMPerK != 0 {
			s.tcrSlots = append(s.tcrSlots, i)
		}
	}
	s.vbeLo, s.vbeHi, _ = VBEOnRange(d)
	s.vafLo, s.vafHi = VAFRange(d)
	return s, nil
}

// u01 draws uniformly on [0, 1).
func (s *boardSampler) u01() float64 { return 0.5 * (s.unit.Rand() + 1) }

// draw fills bd with the next board.
func (s *boardSampler) draw(bd *board) {
	b := s.b
	bd.dev, bd.tcr = [NumSlots]float64{}, [NumSlots]float64{}
	for _, i := range s.tolSlots {
		x := 0.0
		if s.opt.Resistors == ResistorNormal {
			x = s.norm.Rand()
			for math.Abs(x) > 1 { // truncate at ±tol by redrawing
				x = s.norm.Rand()
			}
		} else {
			x = s.unit.Rand()
		}
		bd.dev[i] = x * b.Resistors[i].Tol
	}
	for _, i := range s.tcrSlots {
		bd.tcr[i] = s.unit.Rand() * math.Abs(b.Resistors[i].TCR_PPMPerK)
	}
	bd.vccFactor = 1 + b.VCCTol*s.unit.Rand()
	bd.m = s.base
	d := &b.Device
	u := s.u01()
	if s.opt.Beta == BetaLogUniform {
		bd.m.BF = math.Exp(s.logMin + u*(s.logMax-s.logMin))
	} else {
		bd.m.BF = d.HFEMin + u*(d.HFEMax-d.HFEMin) // ModelFor depends on bf only through BF
	}
	bd.vbe_V = s.vbeLo + s.u01()*(s.vbeHi-s.vbeLo)
	bd.m.IS_A = vbeAtOf(*d) / math.Expm1(bd.vbe_V/s.vtNom) // isFor
	if s.vafHi > s.vafLo {
		bd.m.VAF_V = s.vafLo + s.u01()*(s.vafHi-s.vafLo)
	}
	bd.veeFactor = bd.vccFactor
	if b.Topology == SplitSupply {
		// the emitter rail is a supply of its own, drawn last (and only
		// here) so every other input is drawn as before
		bd.veeFactor = 1 + b.EmitterRailTol()*s.unit.Rand()
	}
}

// boardJudge decides whether a board stays in the window over the whole
// ambient range (YieldDefinition).
type boardJudge struct {
	b            *Build
	w            Window
	theta, tjMax float64
	lo, hi       float64 // the ambient range
	h            float64 // the slope step, K
	// keep, when set, collects every point solved.
	keep *BoardSample
}

// slopeStep is the step of the end slopes as a fraction of the ambient
// range.
const slopeStep = 0.01

// minSlopeStep_K is the smallest slope step: well above the 1e-6 K
// tolerance of the self-heated equilibrium.
const minSlopeStep_K = 0.01

func newBoardJudge(b *Build, w Window) *boardJudge {
	j := &boardJudge{b: b, w: w, theta: ThermalResistance(b.Device), tjMax: tjMaxOf(b.Device),
		lo: b.AmbientMin_C, hi: b.AmbientMax_C}
	j.h = math.Max(slopeStep*(j.hi-j.lo), minSlopeStep_K)
	return j
}

// at solves bd at ambient ta, Newton starting from start (a solve of the
// same board at a nearby ambient; nil or zero: the hand estimate), which
// then holds this solve's start for the next.
func (j *boardJudge) at(bd *board, ta float64, start *junctionStart) (OperatingPoint, error) {
	return solveSelfHeatedFrom(j.b.resolveTCR(&bd.dev, &bd.tcr, bd.vccFactor, bd.veeFactor, ta), bd.m, ta, j.theta, j.tjMax, start)
}

// end solves bd at one end of the ambient range (as at) and keeps the
// point when asked.
func (j *boardJudge) end(bd *board, ta float64, start *junctionStart) (OperatingPoint, error) {
	op, err := j.at(bd, ta, start)
	if err == nil && j.keep != nil {
		j.keep.Points = append(j.keep.Points, SamplePoint{Ambient_C: ta, IC_A: op.IC_A, VCE_V: op.VCE_V})
	}
	return op, err
}

// judge reports whether bd is inside the window over the whole ambient
// range, and whether a turning point had to be solved. A failed solve is
// returned as the error (the board fails).
func (j *boardJudge) judge(bd *board) (pass, turned bool, err error) {
	// each end's solve warm-starts the solve next to it (and the
	// middle's)
	var cold, hot junctionStart
	lo, err := j.end(bd, j.lo, &cold)
	if err != nil {
		return false, false, err
	}
	if j.hi == j.lo {
		return j.w.Contains(&lo), false, nil
	}
	if !j.w.Contains(&lo) && j.keep == nil {
		return false, false, nil
	}
	// Both ends are solved when the points are kept.
	hi, err := j.end(bd, j.hi, &hot)
	if !j.w.Contains(&lo) {
		return false, false, nil // failed at the cold end, whatever the hot end did
	}
	if err != nil {
		return false, false, err
	}
	if !j.w.Contains(&hi) {
		return false, false, nil
	}
	if j.hi-j.lo <= 2*j.h {
		// Too narrow for end slopes: check the middle as well.
		mid, err := j.at(bd, 0.5*(j.lo+j.hi), &cold)
		if err != nil {
			return false, false, err
		}
		return j.w.Contains(&mid), false, nil
	}
	lo2, err := j.at(bd, j.lo+j.h, &cold)
	if err != nil {
		return false, false, err
	}
	hi2, err := j.at(bd, j.hi-j.h, &hot)
	if err != nil {
		return false, false, err
	}
	if !j.w.Contains(&lo2) || !j.w.Contains(&hi2) {
		return false, false, nil
	}
	slopes := [2][2]float64{ // IC, VCE; at the low and the high end
		{lo2.IC_A - lo.IC_A, hi.IC_A - hi2.IC_A},
		{lo2.VCE_V - lo.VCE_V, hi.VCE_V - hi2.VCE_V},
	}
	for q, sl := range slopes {
		if sl[0]*sl[1] >= 0 {
			continue // same sign at both ends (or flat): monotonic
		}
		turned = true
		// A maximum when the slope goes from rising to falling, else a
		// minimum.
		ok, err := j.turningInside(bd, q == 1, sl[0] > 0)
		if err != nil || !ok {
			return false, turned, err
		}
	}
	return true, turned, nil
}

// goldenSteps bounds the golden-section search for a turning point: the
// bracket shrinks to 0.618^40 ≈ 4e-9 of the range.
const goldenSteps = 40

// turningInside finds the turning point of IC (of VCE when vce is set),
// a maximum when max is set, between the ambient ends by golden-section
// search, checking every point it solves against the window. It reports
// false at the first point outside.
func (j *boardJudge) turningInside(bd *board, vce, max bool) (bool, error) {
	const r = 0.6180339887498949 // (√5 − 1)/2
	a, c := j.lo, j.hi
	f := func(t float64) (float64, bool, error) {
		op, err := j.at(bd, t, nil)
		if err != nil {
			return 0, false, err
		}
		v := op.IC_A
		if vce {
			v = op.VCE_V
		}
		if !max {
			v = -v
		}
		return v, j.w.Contains(&op), nil
	}
	x1, x2 := c-r*(c-a), a+r*(c-a)
	f1, in1, err := f(x1)
	if err != nil || !in1 {
		return false, err
	}
	f2, in2, err := f(x2)
	if err != nil || !in2 {
		return false, err
	}
	for range goldenSteps {
		if c-a < 1e-6 {
			break
		}
		if f1 > f2 {
			c, x2, f2 = x2, x1, f1
			x1 = c - r*(c-a)
			if f1, in1, err = f(x1); err != nil || !in1 {
				return false, err
			}
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + r*(c-a)
			if f2, in2, err = f(x2); err != nil || !in2 {
				return false, err
			}
		}
	}
	return true, nil
}
