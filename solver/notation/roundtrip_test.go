package notation

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"

	"biasbin/solver/eseries"
)

// round3 rounds v to three significant digits by way of decimal text,
// independently of FormatResistance.
func round3(v float64) float64 {
	r, err := strconv.ParseFloat(strconv.FormatFloat(v, 'e', 2, 64), 64)
	if err != nil {
		panic(err)
	}
	return r
}

// Property: for any resistance from 10 µΩ to 100 TΩ, the code reads back
// to the value rounded to three significant digits, and writing that again
// gives the same code (format∘parse is stable).
func TestFormatParseStable(t *testing.T) {
	rng := rand.New(rand.NewPCG(60062, 2016)) // seeded: failures reproduce
	for i := 0; i < 20000; i++ {
		v := math.Pow(10, -5+19*rng.Float64())
		code := FormatResistance(v)
		got, _, hasTol, err := ParseResistance(code)
		if err != nil || hasTol {
			t.Fatalf("ParseResistance(FormatResistance(%v) = %q): %v, %v, %v", v, code, got, hasTol, err)
		}
		if want := round3(v); got != want {
			t.Fatalf("ParseResistance(%q) = %v, want %v (from %v)", code, got, want, v)
		}
		if again := FormatResistance(got); again != code {
			t.Fatalf("FormatResistance(%v) = %q, then %q", v, code, again)
		}
		// The SI screen form reads back to the same rounding.
		if si, err := ParseOhms(FormatResistanceSI(v)); err != nil || si != round3(v) {
			t.Fatalf("ParseOhms(FormatResistanceSI(%v) = %q) = %v, %v", v, FormatResistanceSI(v), si, err)
		}
	}
}

// Every E-series value from 0.1 Ω to 10 MΩ survives the code exactly
// (source: IEC 60063:2015 Tables 1 and 2 values, IEC 60062:2016 code).
func TestESeriesValuesRoundTrip(t *testing.T) {
	for _, s := range []eseries.Series{eseries.E24, eseries.E192} {
		for _, v := range eseries.Range(s, 0.1, 1e7) {
			code := FormatResistance(v)
			got, _, _, err := ParseResistance(code)
			if err != nil || got != v {
				t.Errorf("%s value %v → %q → %v, %v", s, v, code, got, err)
			}
		}
	}
}
