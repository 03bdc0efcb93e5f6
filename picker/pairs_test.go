package picker

import (
	"math"
	"testing"
)

// network evaluates a two-part network directly (Kirchhoff: series values
// add, parallel conductances add).
func network(arr string, a, b float64) float64 {
	if arr == Series {
		return a + b
	}
	return a * b / (a + b)
}

// TestPairTolerance checks the pair's tolerance against the direct
// evaluation of the network at every combination of the parts' extremes
// (source: Kirchhoff's laws applied to the two parts at ±tol; the network
// is monotonic in each part, so the corners hold its extremes).
func TestPairTolerance(t *testing.T) {
	cases := []struct {
		a, b Resistor
	}{
		{Resistor{Ohm: 1000, Tol: 0.05}, Resistor{Ohm: 1000, Tol: 0.05}},
		{Resistor{Ohm: 4700, Tol: 0.01}, Resistor{Ohm: 330, Tol: 0.05}},
		{Resistor{Ohm: 10e3, Tol: 0.10}, Resistor{Ohm: 22e3, Tol: 0.01}},
		{Resistor{Ohm: 100, Tol: 0.02}, Resistor{Ohm: 1e6, Tol: 0.20}},
	}
	for _, c := range cases {
		for _, arr := range []string{Series, Parallel} {
			spec := seriesSpec(c.a, c.b)
			if arr == Parallel {
				spec = parallelSpec(c.a, c.b)
			}
			nom := network(arr, c.a.Ohm, c.b.Ohm)
			if math.Abs(spec.Nominal_Ohm-nom) > 1e-9*nom {
				t.Errorf("%s %g,%g: value %g, direct %g", arr, c.a.Ohm, c.b.Ohm, spec.Nominal_Ohm, nom)
			}
			worst := 0.0
			for _, sa := range []float64{-1, 1} {
				for _, sb := range []float64{-1, 1} {
					r := network(arr, c.a.Ohm*(1+sa*c.a.Tol), c.b.Ohm*(1+sb*c.b.Tol))
					worst = math.Max(worst, math.Abs(r/nom-1))
				}
			}
			if math.Abs(spec.Tol-worst) > 1e-12 {
				t.Errorf("%s %g±%g, %g±%g: tolerance %.6g, direct worst case %.6g", arr, c.a.Ohm, c.a.Tol, c.b.Ohm, c.b.Tol, spec.Tol, worst)
			}
		}
	}
}

// TestPairTCR checks the pair's TCR against the network evaluated
// directly with each part at R(1 + α·ΔT) (source: the first-order TCR
// model R(T) = R0[1 + TC1(T − T0)], ngspice manual eq. (6) §1.3.1, and
// Kirchhoff's laws); the slope is taken over ±1 K.
func TestPairTCR(t *testing.T) {
	parts := [][2]Resistor{
		{{Ohm: 1000, TCR_PPMPerK: 100}, {Ohm: 1000, TCR_PPMPerK: -300}},
		{{Ohm: 4700, TCR_PPMPerK: 50}, {Ohm: 330, TCR_PPMPerK: -500}},
		{{Ohm: 100, TCR_PPMPerK: 200}, {Ohm: 68e3, TCR_PPMPerK: 0}},
	}
	for _, p := range parts {
		a, b := p[0], p[1]
		for _, arr := range []string{Series, Parallel} {
			spec := seriesSpec(a, b)
			if arr == Parallel {
				spec = parallelSpec(a, b)
			}
			at := func(dT float64) float64 {
				return network(arr, a.Ohm*(1+a.TCR_PPMPerK*1e-6*dT), b.Ohm*(1+b.TCR_PPMPerK*1e-6*dT))
			}
			direct := (at(1) - at(-1)) / 2 / at(0) * 1e6
			if math.Abs(spec.TCR_PPMPerK-direct) > 1e-3*math.Max(1, math.Abs(direct)) {
				t.Errorf("%s %g/%g, %g/%g ppm/K: TCR %.6g, direct %.6g", arr, a.Ohm, a.TCR_PPMPerK, b.Ohm, b.TCR_PPMPerK, spec.TCR_PPMPerK, direct)
			}
		}
	}
}

// TestPairRating checks the pair's rating: at the rated total power the
// part that reaches its own rating first is exactly at it and the other
// within its own (source: power split ∝ R in series, ∝ 1/R in parallel,
// from Joule's law with one current or one voltage).
func TestPairRating(t *testing.T) {
	parts := [][2]Resistor{
		{{Ohm: 1000, Rated_W: 0.25}, {Ohm: 1000, Rated_W: 0.25}},
		{{Ohm: 4700, Rated_W: 0.25}, {Ohm: 330, Rated_W: 0.5}},
		{{Ohm: 100, Rated_W: 1}, {Ohm: 2200, Rated_W: 0.125}},
	}
	for _, p := range parts {
		a, b := p[0], p[1]
		for _, arr := range []string{Series, Parallel} {
			spec := seriesSpec(a, b)
			if arr == Parallel {
				spec = parallelSpec(a, b)
			}
			r := spec.Nominal_Ohm
			var pa, pb float64
			if arr == Series {
				i2 := spec.Rated_W / r
				pa, pb = i2*a.Ohm, i2*b.Ohm
			} else {
				v2 := spec.Rated_W * r
				pa, pb = v2/a.Ohm, v2/b.Ohm
			}
			ua, ub := pa/a.Rated_W, pb/b.Rated_W
			if math.Abs(math.Max(ua, ub)-1) > 1e-12 || ua > 1+1e-12 || ub > 1+1e-12 {
				t.Errorf("%s %g/%gW, %g/%gW: rating %g W puts the parts at %.4g and %.4g of their ratings", arr, a.Ohm, a.Rated_W, b.Ohm, b.Rated_W, spec.Rated_W, ua, ub)
			}
		}
	}
}

// TestPairLimitingVoltage checks the pair's limiting element voltage: at
// the pair's limit the part that reaches its own limit first is exactly at
// it and the other within its own (source: the voltage divides ∝ R in
// series and is the same across both in parallel, Ohm's law). A part that
// states no LEV takes the default by rating (REFERENCE.md §16).
func TestPairLimitingVoltage(t *testing.T) {
	parts := [][2]Resistor{
		{{Ohm: 1e6, Rated_W: 0.25, LEV_V: 250}, {Ohm: 1e6, Rated_W: 0.25, LEV_V: 250}},
		{{Ohm: 470e3, Rated_W: 0.25}, {Ohm: 33e3, Rated_W: 0.1}},
		{{Ohm: 2.2e6, Rated_W: 0.5, LEV_V: 350}, {Ohm: 100e3, Rated_W: 0.125}},
	}
	for _, p := range parts {
		a, b := p[0], p[1]
		la, lb := levOf(a), levOf(b)
		for _, arr := range []string{Series, Parallel} {
			spec := seriesSpec(a, b)
			va, vb := spec.LEV_V*a.Ohm/spec.Nominal_Ohm, spec.LEV_V*b.Ohm/spec.Nominal_Ohm
			if arr == Parallel {
				spec = parallelSpec(a, b)
				va, vb = spec.LEV_V, spec.LEV_V
			}
			ua, ub := va/la, vb/lb
			if math.Abs(math.Max(ua, ub)-1) > 1e-12 || ua > 1+1e-12 || ub > 1+1e-12 {
				t.Errorf("%s %g Ω/%g V, %g Ω/%g V: pair limit %g V puts the parts at %.4g and %.4g of theirs", arr, a.Ohm, la, b.Ohm, lb, spec.LEV_V, ua, ub)
			}
		}
	}
}
