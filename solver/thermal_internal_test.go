package solver

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// TestSelfHeatedRandomStages: over random stages and thermal resistances
// the self-heated solve either returns a stable equilibrium of the heat
// balance Tj = Ta + θJA·P(Tj) (REFERENCE.md §8), Tj within 1e-5 K, with
// θ·dP/dTj < 1 by finite differences, or reports thermal runaway; never
// another error.
func TestSelfHeatedRandomStages(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	var settled, runaway int
	for i := range 3000 {
		s, m, _ := randomStage(rng)
		ta := -55 + 205*rng.Float64()
		th := 10 * math.Pow(100, rng.Float64())
		tjMax := math.Min(ta+1+rng.Float64()*150, MaxTj_C)
		op, err := SolveSelfHeated(s, m, ta, th, tjMax)
		if errors.Is(err, ErrThermalRunaway) {
			runaway++
			continue
		}
		if err != nil {
			t.Fatalf("#%d: %v", i, err)
		}
		settled++
		if op.Tj_C > tjMax+1e-9 {
			t.Fatalf("#%d: Tj %g above the limit %g", i, op.Tj_C, tjMax)
		}
		lo, hi := math.Max(MinTemp_C, op.Tj_C-0.01), math.Min(MaxTj_C, op.Tj_C+0.01)
		a, errA := Solve(s, m, lo)
		b, errB := Solve(s, m, hi)
		if errA != nil || errB != nil || !(hi > lo) {
			t.Fatalf("#%d: neighbours of Tj %g: %v %v", i, op.Tj_C, errA, errB)
		}
		loop := th * (heating(b) - heating(a)) / (hi - lo) // θ·dP/dTj
		if loop >= 1+1e-6 {
			t.Fatalf("#%d: equilibrium at %g °C is unstable (θ·dP/dTj = %g)", i, op.Tj_C, loop)
		}
		// Tj is within 1e-5 K of the root, so the balance is within
		// that times the slope of Ta + θP − Tj.
		if d := ta + th*heating(op) - op.Tj_C; math.Abs(d) > 1e-5*(1+math.Abs(loop-1)) {
			t.Fatalf("#%d: heat balance off by %g K (Tj %g, θ·dP/dTj %g)", i, d, op.Tj_C, loop)
		}
	}
	t.Logf("%d settled, %d thermal runaway", settled, runaway)
}
