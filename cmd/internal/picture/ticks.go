package picture

import (
	"math"
	"strconv"

	"gonum.org/v1/plot"
)

// niceTicks labels an axis at a round step (1, 2 or 5 times a power of
// ten) that gives at most ten labels, with four unlabelled ticks between
// (one with a step of 2·10ⁿ), and writes each label with the decimals the
// step needs and no more ("0.5", "1.0", "1.5"; "2", "4", "6").
type niceTicks struct{}

// Ticks implements plot.Ticker.
func (niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || math.IsInf(hi-lo, 0) {
		return nil
	}
	step, minor := niceStep((hi - lo) / 9)
	dec := max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	var ticks []plot.Tick
	sub := step / float64(minor)
	for i := math.Ceil(lo / sub); i*sub <= hi+1e-9*step; i++ {
		v := i * sub
		t := plot.Tick{Value: v}
		if math.Mod(math.Abs(i), float64(minor)) == 0 {
			t.Label = strconv.FormatFloat(v+0, 'f', dec, 64)
			if t.Label == "-"+strconv.FormatFloat(0, 'f', dec, 64) {
				t.Label = t.Label[1:]
			}
		}
		ticks = append(ticks, t)
	}
	return ticks
}

// niceStep rounds a rough step up to 1, 2 or 5 times a power of ten and
// gives the number of minor intervals per step.
func niceStep(rough float64) (step float64, minor int) {
	p := math.Pow(10, math.Floor(math.Log10(rough)))
	switch f := rough / p * (1 - 1e-9); { // a rough step of 2.0000001 is 2
	case f <= 1:
		return p, 5
	case f <= 2:
		return 2 * p, 4
	case f <= 5:
		return 5 * p, 5
	}
	return 10 * p, 5
}
