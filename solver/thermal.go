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
	return solveSelfHeatedFrom(s, m, ambient_C, thetaJA_KPerW, tjMax_C, nil)
}

// junctionStart carries a warm start from one self-heated solve to the
// next of a nearby circuit (the same board at a nearby ambient): the
// junction voltages of the earlier solve at its ambient, before any
// self-heating, and that ambient. The zero value is no start (the hand
// estimate). Only where Newton starts changes; the solution is the same
// to the solver's tolerance.
type junctionStart struct {
	x [2]float64
	t float64
}

// solveSelfHeatedFrom is SolveSelfHeated with the ambient solve's Newton
// started from start (moved to the ambient along the junctions'
// tempco), which then receives this solve's ambient junction voltages.
func solveSelfHeatedFrom(s Stage, m Model, ambient_C, thetaJA_KPerW, tjMax_C float64, start *junctionStart) (OperatingPoint, error) {
	if tjMax_C == 0 {
		tjMax_C = DefaultTjMax_C
	}
	if err := checkSelfHeated(&m, ambient_C, thetaJA_KPerW, tjMax_C); err != nil {
		return OperatingPoint{}, err
	}
	d := m.at(ambient_C)
	return solveSelfHeated(s, &m, &d, ambient_C, thetaJA_KPerW, tjMax_C, start)
}

// checkSelfHeated is SolveSelfHeated's input check of everything but the
// stage (tjMax_C with its default applied).
func checkSelfHeated(m *Model, ambient_C, thetaJA_KPerW, tjMax_C float64) error {
	if !AmbientRange.Contains(ambient_C) {
		return fmt.Errorf("self-heated solve: %w", AmbientRange.Check(ambient_C))
	}
	if !finite(thetaJA_KPerW) || thetaJA_KPerW < 0 {
		return fmt.Errorf("self-heated solve: %w", &InputError{Field: "theta_ja", Problem: fmt.Sprintf("%g K/W: want a finite value >= 0", thetaJA_KPerW)})
	}
	if !finite(tjMax_C) || tjMax_C < ambient_C || tjMax_C > MaxTj_C {
		return fmt.Errorf("self-heated solve: %w", &InputError{Field: "tj_max", Problem: fmt.Sprintf("%g °C: want at least the ambient %g °C and at most %g °C", tjMax_C, ambient_C, MaxTj_C)})
	}
	if err := m.Validate(); err != nil {
		return fmt.Errorf("self-heated solve: solve: model: %w", err)
	}
	return nil
}

// solveSelfHeated is SolveSelfHeated after checkSelfHeated has passed,
// with the device at the ambient, dAmb = m.at(ambient_C), given (callers
// solving many stages share it), and a warm start when start is not nil
// (solveSelfHeatedFrom). It checks the stage.
func solveSelfHeated(s Stage, m *Model, dAmb *device, ambient_C, thetaJA_KPerW, tjMax_C float64, start *junctionStart) (OperatingPoint, error) {
	if err := s.Validate(m.Polarity); err != nil {
		return OperatingPoint{}, fmt.Errorf("self-heated solve: solve: %v stage: %w", s.Topology, err)
	}
	sg := m.Polarity.sign()
	th := thermalProblem{s: s, m: m, ck: reduce(s, sg), sg: sg, ta: ambient_C, theta: thetaJA_KPerW}
	th.d, th.lastT = *dAmb, ambient_C
	if start != nil && start.x != ([2]float64{}) {
		th.guess, th.lastT = start.x, start.t
		th.extrapolate(ambient_C)
		th.lastT = ambient_C
	}
	if err := th.solve(ambient_C); err != nil {
		return OperatingPoint{}, err
	}
	if start != nil {
		*start = junctionStart{x: th.x, t: ambient_C}
	}
	if thetaJA_KPerW == 0 {
		return th.point()
	}
	return th.equilibrium(tjMax_C)
}

// heating is the power that heats the junction: PTransistor_W, or 0 when
// that is negative (possible only in saturation with a large ICBO, where
// the constant leakage source of the model delivers power).
func heating(op OperatingPoint) float64 { return heatingOf(op.PTransistor_W) }

// heatingOf is heating for a transistor dissipation p.
func heatingOf(p float64) float64 { return max(0, p) }

type thermalProblem struct {
	s     Stage
	m     *Model
	ck    circuit
	sg    float64
	ta    float64
	theta float64
	guess [2]float64 // junction voltages of the last solve: the next one's start
	lastT float64    // temperature guess was solved at
	evals int
	// The last solve: its temperature, device, junction voltages,
	// terminal currents and transistor dissipation. The full
	// OperatingPoint is built only for the one returned (point).
	t      float64
	d      device
	x      [2]float64
	ib, ic float64
	p      float64
}

// solve solves the stage at tj with the device th.d (= m.at(tj)),
// starting Newton from th.guess (zero: from the hand estimate), and keeps
// the result.
func (th *thermalProblem) solve(tj float64) error {
	th.t = tj
	x, ib, ic, ok := th.ck.junctions(&th.d, &th.guess)
	if !ok {
		return errNoConvergence(th.s, th.m.Polarity, tj)
	}
	th.x, th.ib, th.ic = x, ib, ic
	vb, vc, ve := th.ck.nodes(th.ib, th.ic)
	th.p = transistorPower(th.ib, th.ic, vb, vc, ve)
	if !finite(th.ib) || !finite(th.ic) || !finite(th.p) {
		return fmt.Errorf("solve %v %v stage at %g °C: result not finite: %w", th.m.Polarity, th.s.Topology, tj, ErrNoConvergence)
	}
	return nil
}

// point is the OperatingPoint of the last solve.
func (th *thermalProblem) point() (OperatingPoint, error) {
	return th.ck.point(th.s, &th.d, th.x, th.ib, th.ic, th.sg, th.m.Polarity, th.t)
}

// g evaluates the heat balance at tj, keeping the operating point.
func (th *thermalProblem) g(tj float64) (float64, error) {
	th.evals++
	th.extrapolate(tj)
	th.m.reheat(&th.d, tj)
	err := th.solve(tj)
	th.lastT = tj
	if err != nil {
		return 0, fmt.Errorf("self-heated solve at Tj %.3g °C: %w", tj, err)
	}
	return th.ta + th.theta*heatingOf(th.p) - tj, nil
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

// equilibrium searches the heat balance from the solve at the ambient.
func (th *thermalProblem) equilibrium(tjMax float64) (OperatingPoint, error) {
	tPrev, gPrev := th.ta, th.theta*heatingOf(th.p)
	if gPrev <= thermalTol_K {
		return th.point() // no (or negligible) dissipation
	}
	lo, hi, haveHi := tPrev, 0.0, false
	t := min(th.ta+gPrev, tjMax)
	for range 60 {
		gt, err := th.g(t)
		if err != nil {
			return OperatingPoint{}, err
		}
		if math.Abs(gt) <= thermalTol_K {
			return th.point()
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
		next = min(next, tjMax)
		if haveHi && hi-lo <= thermalTol_K {
			if _, err := th.g(0.5 * (lo + hi)); err != nil {
				return OperatingPoint{}, err
			}
			return th.point()
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
		gt, err := th.g(t)
		if err != nil {
			return OperatingPoint{}, err
		}
		if gt <= 0 {
			lo, hi := prevT, t
			for hi-lo > thermalTol_K {
				mid := 0.5 * (lo + hi)
				gm, err := th.g(mid)
				if err != nil {
					return OperatingPoint{}, err
				}
				if gm > 0 {
					lo = mid
				} else {
					hi = mid
				}
			}
			if _, err := th.g(0.5 * (lo + hi)); err != nil {
				return OperatingPoint{}, err
			}
			return th.point()
		}
		prevT, prevG = t, gt
		if i == thermalScan {
			op, err := th.point()
			if err != nil {
				return op, err
			}
			return op, fmt.Errorf("self-heated solve: ambient %g °C, θJA %g K/W: dissipation %.3g W still heats the junction past Tj max %g °C (balance +%.3g K): %w",
				th.ta, th.theta, op.PTransistor_W, tjMax, prevG, ErrThermalRunaway)
		}
	}
	return OperatingPoint{}, ErrThermalRunaway // unreachable
}
