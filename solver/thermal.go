package solver

import (
	"fmt"
	"math"
)

// thermalTol_K is the junction-temperature tolerance of the self-heating
// equilibrium.
const thermalTol_K = 1e-6

// thermalScan is the number of temperature samples searched for a stable
// equilibrium when the direct iteration finds none below the limit.
const thermalScan = 32

// SolveSelfHeated iterates Tj = ambient + PTransistor*thetaJA to
// equilibrium; thetaJA_KPerW = 0 means no self-heating. Returns an error
// wrapping ErrThermalRunaway when there is no stable equilibrium below
// tjMax_C (0 = DefaultTjMax_C).
//
// The equilibrium is the first root above the ambient of
// g(Tj) = ambient + θJA·max(P(Tj), 0) − Tj where g falls through zero: the
// temperature a junction warming up from the ambient settles at. It is
// found by a secant iteration safeguarded by bisection once a bracket is
// known, warm-starting each operating point from the previous one. On
// runaway the returned OperatingPoint is the one solved at tjMax_C, for
// reporting only.
func SolveSelfHeated(s Stage, m Model, ambient_C, thetaJA_KPerW, tjMax_C float64) (OperatingPoint, error) {
	if tjMax_C == 0 {
		tjMax_C = DefaultTjMax_C
	}
	if !finite(ambient_C) || ambient_C < MinTemp_C || ambient_C > MaxTemp_C {
		return OperatingPoint{}, fmt.Errorf("self-heated solve: %w", &InputError{Field: "ambient", Problem: fmt.Sprintf("%g °C is outside %g..%g °C", ambient_C, MinTemp_C, MaxTemp_C)})
	}
	if !finite(thetaJA_KPerW) || thetaJA_KPerW < 0 {
		return OperatingPoint{}, fmt.Errorf("self-heated solve: %w", &InputError{Field: "theta_ja", Problem: fmt.Sprintf("%g K/W: want a finite value >= 0", thetaJA_KPerW)})
	}
	if !finite(tjMax_C) || tjMax_C < ambient_C || tjMax_C > MaxTj_C {
		return OperatingPoint{}, fmt.Errorf("self-heated solve: %w", &InputError{Field: "tj_max", Problem: fmt.Sprintf("%g °C: want at least the ambient %g °C and at most %g °C", tjMax_C, ambient_C, MaxTj_C)})
	}
	if err := checkSolveInput(s, m, ambient_C); err != nil {
		return OperatingPoint{}, fmt.Errorf("self-heated solve: %w", err)
	}
	var guess [2]float64
	op, err := solveChecked(s, m, ambient_C, &guess)
	if err != nil || thetaJA_KPerW == 0 {
		return op, err
	}
	th := &thermalProblem{s: s, m: m, ta: ambient_C, theta: thetaJA_KPerW, guess: guess, lastT: ambient_C}
	return th.equilibrium(op, tjMax_C)
}

// heating is the power that heats the junction: PTransistor_W, or 0 when
// that is negative (possible only in saturation with a large ICBO, where
// the constant leakage source of the model delivers power).
func heating(op OperatingPoint) float64 { return math.Max(0, op.PTransistor_W) }

type thermalProblem struct {
	s     Stage
	m     Model
	ta    float64
	theta float64
	guess [2]float64
	lastT float64 // temperature guess was solved at
	evals int
}

// g evaluates the heat balance at tj: its value and the operating point.
func (th *thermalProblem) g(tj float64) (float64, OperatingPoint, error) {
	th.evals++
	th.extrapolate(tj)
	op, err := solveChecked(th.s, th.m, tj, &th.guess)
	th.lastT = tj
	if err != nil {
		return 0, op, fmt.Errorf("self-heated solve at Tj %.3g °C: %w", tj, err)
	}
	return th.ta + th.theta*heating(op) - tj, op, nil
}

// extrapolate moves the warm-start guess of each forward-biased junction
// to temperature tj along its constant-current tempco,
// dV/dT = (V − N·(XTI·VT + EG))/T (from the IS(T) law), saving Newton a
// step.
func (th *thermalProblem) extrapolate(tj float64) {
	dT := tj - th.lastT
	tk := th.lastT + kelvinOffset
	vt := thermalVoltage(th.lastT)
	for k, n := range [2]float64{th.m.NF, 1} {
		if v := th.guess[k]; v > 0.3 {
			th.guess[k] = v + dT*(v-n*(th.m.XTI*vt+th.m.EG_eV))/tk
		}
	}
}

func (th *thermalProblem) equilibrium(op0 OperatingPoint, tjMax float64) (OperatingPoint, error) {
	tPrev, gPrev := th.ta, th.theta*heating(op0)
	if gPrev <= thermalTol_K {
		return op0, nil // no (or negligible) dissipation
	}
	lo, hi, haveHi := tPrev, 0.0, false
	t := math.Min(th.ta+gPrev, tjMax)
	for range 60 {
		gt, op, err := th.g(t)
		if err != nil {
			return op, err
		}
		if math.Abs(gt) <= thermalTol_K {
			return op, nil
		}
		if gt > 0 {
			lo = t
		} else {
			hi, haveHi = t, true
		}
		if !haveHi && t >= tjMax {
			return th.scan(tjMax)
		}
		next := math.NaN()
		if gt != gPrev {
			next = t - gt*(t-tPrev)/(gt-gPrev)
		}
		switch {
		case haveHi && (math.IsNaN(next) || next <= lo || next >= hi):
			next = 0.5 * (lo + hi)
		case !haveHi && (math.IsNaN(next) || next <= t):
			next = t + gt // fixed-point step: still warming up
		}
		next = math.Min(next, tjMax)
		if haveHi && hi-lo <= thermalTol_K {
			_, op, err := th.g(0.5 * (lo + hi))
			return op, err
		}
		tPrev, gPrev, t = t, gt, next
	}
	return th.scan(tjMax)
}

// scan searches [ambient, tjMax] for the first downward crossing of the
// heat balance and bisects it; none means thermal runaway.
func (th *thermalProblem) scan(tjMax float64) (OperatingPoint, error) {
	prevT, prevG := th.ta, math.Inf(1)
	for i := 1; i <= thermalScan; i++ {
		t := th.ta + (tjMax-th.ta)*float64(i)/thermalScan
		gt, op, err := th.g(t)
		if err != nil {
			return op, err
		}
		if gt <= 0 {
			lo, hi := prevT, t
			for hi-lo > thermalTol_K {
				mid := 0.5 * (lo + hi)
				gm, _, err := th.g(mid)
				if err != nil {
					return OperatingPoint{}, err
				}
				if gm > 0 {
					lo = mid
				} else {
					hi = mid
				}
			}
			_, op, err := th.g(0.5 * (lo + hi))
			return op, err
		}
		prevT, prevG = t, gt
		if i == thermalScan {
			return op, fmt.Errorf("self-heated solve: ambient %g °C, θJA %g K/W: dissipation %.3g W still heats the junction past Tj max %g °C (balance +%.3g K): %w",
				th.ta, th.theta, op.PTransistor_W, tjMax, prevG, ErrThermalRunaway)
		}
	}
	return OperatingPoint{}, ErrThermalRunaway // unreachable
}
