package solver_test

import (
	"testing"

	"biasbin/solver"
)

// BenchmarkSolveDivider times one exact operating point of a divider stage
// (goal: under 2 µs per op).
func BenchmarkSolveDivider(b *testing.B) {
	s := stage(solver.Divider, 15, 0, map[solver.Slot]float64{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3})
	m := npnModel(1e-14, 100, 100, 0)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := solver.Solve(s, m, 25); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSolveSelfHeated times one self-heated operating point.
func BenchmarkSolveSelfHeated(b *testing.B) {
	s := stage(solver.Divider, 15, 0, map[solver.Slot]float64{solver.R1: 10e3, solver.R2: 5e3, solver.RC: 1e3, solver.RE: 1e3})
	m := npnModel(1e-14, 100, 100, 0)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := solver.SolveSelfHeated(s, m, 25, 200, 150); err != nil {
			b.Fatal(err)
		}
	}
}
