package picker

import (
	"testing"

	"biasbin/solver/eseries"
)

// benchTransistors returns n invented NPN types, all different: hFE min
// from 60 up in steps of 15, ranges from 2:1 to 4:1.
func benchTransistors(n int) []Transistor {
	var ts []Transistor
	for i := range n {
		hmin := 60 + 15*float64(i)
		ts = append(ts, smallNPN(int64(1+i), hmin, hmin*(2+float64(i%3))))
	}
	return ts
}

func benchPick(b *testing.B, st Stock, req Request) {
	b.ReportAllocs()
	var res Result
	for b.Loop() {
		var err error
		if res, err = Pick(st, req); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(res.Solved), "solves/op")
	b.ReportMetric(float64(res.Evaluated), "evaluated/op")
}

// BenchmarkE96Singles: every E96 value 10 Ω–1 MΩ at 1 %, 12 transistors,
// pairs off, top 10 (goal: under 300 ms).
func BenchmarkE96Singles(b *testing.B) {
	st := Stock{Resistors: seriesStock(eseries.E96, 10, 1e6, 0.01, 0.25, 100, 1000), Transistors: benchTransistors(12)}
	benchPick(b, st, Request{VCC_V: 12, IC_A: 1e-3, Top: 10})
}

// BenchmarkE12Pairs: E12 10 Ω–1 MΩ (61 values) with pairs on, top 10
// (goal: under 1 s).
func BenchmarkE12Pairs(b *testing.B) {
	st := Stock{Resistors: seriesStock(eseries.E12, 10, 1e6, 0.05, 0.25, 100, 1000), Transistors: benchTransistors(1)}
	benchPick(b, st, Request{VCC_V: 12, IC_A: 1e-3, Top: 10, Pairs: true})
}

// e12Small is the stock of the default-versus-exhaustive comparison:
// E12 100 Ω–10 kΩ (25 values), one transistor — small enough for the
// exhaustive search to finish.
func e12Small() Stock {
	return Stock{Resistors: seriesStock(eseries.E12, 100, 10e3, 0.05, 0.25, 100, 1000), Transistors: benchTransistors(1)}
}

// BenchmarkE12SinglesDefault and BenchmarkE12SinglesExhaustive: the
// default search must be at least 50× faster with the identical top 10
// (TestE12DefaultEqualsExhaustive checks the identity).
func BenchmarkE12SinglesDefault(b *testing.B) {
	benchPick(b, e12Small(), Request{VCC_V: 12, IC_A: 1e-3, Top: 10})
}

func BenchmarkE12SinglesExhaustive(b *testing.B) {
	benchPick(b, e12Small(), Request{VCC_V: 12, IC_A: 1e-3, Top: 10, Exhaustive: true})
}
