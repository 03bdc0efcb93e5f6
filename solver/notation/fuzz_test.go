package notation

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// checkError asserts that a parse error is an *Error of a known kind that
// names the quantity.
func checkError(t *testing.T, in string, err error, quantity string) {
	t.Helper()
	var pe *Error
	if !errors.As(err, &pe) {
		t.Fatalf("%q: error %T %v is not an *Error", in, err, err)
	}
	if !errors.Is(err, ErrSyntax) && !errors.Is(err, ErrRange) {
		t.Fatalf("%q: error %v has no kind", in, err)
	}
	if !strings.HasPrefix(err.Error(), quantity+" ") {
		t.Fatalf("%q: error %q does not name %s", in, err, quantity)
	}
}

// FuzzParseResistance: no panic; an error is a typed error; a value is
// finite, not negative, and its code reads back to it within three
// significant digits, stably. Seed corpus: testdata/fuzz/FuzzParseResistance.
func FuzzParseResistance(f *testing.F) {
	f.Fuzz(func(t *testing.T, in string) {
		ohm, tol, hasTol, err := ParseResistance(in)
		if err != nil {
			checkError(t, in, err, "resistance")
			return
		}
		if math.IsNaN(ohm) || math.IsInf(ohm, 0) || ohm < 0 {
			t.Fatalf("%q: resistance %v", in, ohm)
		}
		if hasTol && !(tol >= 0 && tol < 1) || !hasTol && tol != 0 {
			t.Fatalf("%q: tolerance %v, %v", in, tol, hasTol)
		}
		code := FormatResistance(ohm)
		back, _, _, err := ParseResistance(code)
		if err != nil {
			t.Fatalf("%q → %v → %q: %v", in, ohm, code, err)
		}
		if ohm > 0 && back != round3(ohm) || ohm == 0 && back != 0 {
			t.Fatalf("%q → %v → %q → %v, want %v", in, ohm, code, back, round3(ohm))
		}
		if again := FormatResistance(back); again != code {
			t.Fatalf("%q → %q → %v → %q", in, code, back, again)
		}
	})
}

// FuzzParsePower: no panic; an error is a typed error; a value is finite
// and positive and its screen form reads back within three significant
// digits. Seed corpus: testdata/fuzz/FuzzParsePower.
func FuzzParsePower(f *testing.F) {
	f.Fuzz(func(t *testing.T, in string) {
		w, err := ParsePower(in)
		if err != nil {
			checkError(t, in, err, "power")
			return
		}
		if !(w > 0) || math.IsInf(w, 0) {
			t.Fatalf("%q: power %v", in, w)
		}
		if w < 1e-15 || w >= 1e15 {
			return // outside the f..T prefixes the screen form uses an exponent
		}
		back, err := ParsePower(FormatPower(w))
		if err != nil || math.Abs(back-w) > 0.005*w {
			t.Fatalf("%q → %v → %q → %v, %v", in, w, FormatPower(w), back, err)
		}
	})
}

// FuzzParseRange: no panic, lo <= hi on success, typed errors inside.
// Seed corpus: testdata/fuzz/FuzzParseRange.
func FuzzParseRange(f *testing.F) {
	f.Fuzz(func(t *testing.T, in string) {
		lo, hi, err := ParseRange(in, ParseVoltage)
		if err != nil {
			var pe *Error
			if !errors.As(err, &pe) {
				t.Fatalf("%q: error %v carries no *Error", in, err)
			}
			return
		}
		if !(lo <= hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
			t.Fatalf("%q: %v..%v", in, lo, hi)
		}
	})
}
