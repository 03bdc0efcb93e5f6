package fault

import (
	"math"

	"gonum.org/v1/gonum/optimize"

	"biasbin/solver"
)

// Fit ranges (doc.go, "The fit").
const (
	// minLeak_A and maxLeak_A bound a fitted collector-base leakage.
	minLeak_A = 100e-9
	maxLeak_A = 10e-3
	// minLowHFE is the lowest forward beta a low-hfe fault is fitted to.
	minLowHFE = 1.0
	// gridPoints is the coarse grid over a fault's own value.
	gridPoints = 25
	// maxEvaluations bounds each Nelder–Mead polish.
	maxEvaluations = 400
	// failed is the objective of a point whose network does not solve.
	failed = 1e30
)

// bounded maps an unbounded coordinate onto [lo, hi] (on a log scale when
// logScale), so the simplex search needs no constraints.
type bounded struct {
	lo, hi   float64
	logScale bool
}

func (b bounded) at(u float64) float64 {
	t := 0.5 + 0.5*math.Tanh(u)
	if b.logScale {
		return b.lo * math.Pow(b.hi/b.lo, t)
	}
	return b.lo + (b.hi-b.lo)*t
}

// coordinate returns the u that maps to the fraction t of the range.
func coordinate(t float64) float64 { return math.Atanh(2*min(max(t, 1e-9), 1-1e-9) - 1) }

// fitter fits one fault to the readings.
type fitter struct {
	s        solver.Stage
	base     solver.Model // at the typical hFE
	hfe      bounded      // hFE range of the fit
	shift    bounded      // VBE(on) shift
	own      *bounded     // the fault's own value, nil when it has none
	fault    Fault
	meas     [3]float64
	acc      [3]float64
	mt       Meter
	warm     [3]*state // last solution with the meter on each node
	lastPred [3]float64
}

// probes are the nodes a reading is taken at, in Readings order.
var probes = [3]node{nB, nE, nC}

// params turns coordinates into the fault, the model and the fitted hFE
// and VBE shift.
func (f *fitter) params(u []float64) (Fault, solver.Model, float64, float64) {
	hfe := f.hfe.at(u[0])
	shift := f.shift.at(u[1])
	m := f.base
	m.BF = hfe
	// A VBE(on) higher by shift at the same current is IS smaller by
	// exp(shift/VT) at TNOM.
	m.IS_A = f.base.IS_A * math.Exp(-shift/solver.ThermalVoltage_V(m.TNOM_C))
	flt := f.fault
	if f.own != nil {
		v := f.own.at(u[2])
		switch flt.Kind {
		case Drift:
			flt.Ohm = v
		case Leak:
			flt.Leak_A = v
		}
	}
	if flt.Kind == LowHFE {
		flt.HFE = hfe
	}
	return flt, m, hfe, shift
}

// predict solves the three meter readings at coordinates u.
func (f *fitter) predict(u []float64) ([3]float64, bool) {
	flt, m, _, _ := f.params(u)
	var out [3]float64
	for i, p := range probes {
		nw := newNetwork(f.s, m, benchTemp_C, flt, p, f.mt.Input_Ohm)
		st, err := nw.solve(f.warm[i])
		if err != nil {
			st, err = nw.solve(nil)
			if err != nil {
				return out, false
			}
		}
		f.warm[i] = &st
		out[i] = nw.reading(&st, p)
	}
	return out, true
}

// objective is the sum of squared deviations in meter-accuracy units.
func (f *fitter) objective(u []float64) float64 {
	pred, ok := f.predict(u)
	if !ok {
		return failed
	}
	var sum float64
	for i := range pred {
		z := (pred[i] - f.meas[i]) / f.acc[i]
		sum += z * z
	}
	return sum
}

// run fits the fault: a coarse grid over its own value with the transistor
// at the middle of its ranges, then a simplex search from the two best
// grid points over every coordinate. It returns the best coordinates.
func (f *fitter) run() []float64 {
	dim := 2
	if f.own != nil {
		dim = 3
	}
	var starts [][]float64
	if f.own == nil {
		starts = [][]float64{make([]float64, dim)}
	} else {
		type scored struct {
			u []float64
			v float64
		}
		var grid []scored
		for k := range gridPoints {
			u := []float64{0, 0, coordinate((float64(k) + 0.5) / gridPoints)}
			grid = append(grid, scored{u, f.objective(u)})
		}
		for range 2 {
			best := -1
			for i, g := range grid {
				if g.u != nil && (best < 0 || g.v < grid[best].v) {
					best = i
				}
			}
			starts = append(starts, grid[best].u)
			grid[best].u = nil
		}
	}
	var bestU []float64
	bestV := math.Inf(1)
	for _, u0 := range starts {
		res, err := optimize.Minimize(optimize.Problem{Func: f.objective}, u0,
			&optimize.Settings{FuncEvaluations: maxEvaluations, Converger: &optimize.FunctionConverge{Absolute: 1e-4, Iterations: 40}},
			&optimize.NelderMead{SimplexSize: 0.5})
		u, v := u0, f.objective(u0)
		if err == nil || res != nil {
			if res != nil && res.F < v {
				u, v = res.X, res.F
			}
		}
		if v < bestV {
			bestU, bestV = append([]float64(nil), u...), v
		}
	}
	return bestU
}
