package notation

import (
	"errors"
	"math"
	"testing"
)

func TestParseTolerance(t *testing.T) {
	tests := []struct {
		in     string
		want   float64
		source string
	}{
		{"1%", 0.01, "common practice"},
		{"±5 %", 0.05, "common practice"},
		{"+/-5%", 0.05, "common practice"},
		{"+-10%", 0.10, "common practice"},
		{"5", 0.05, "bare number is percent (doc.go)"},
		{"0.5%", 0.005, "common practice"},
		{"0.1 %", 0.001, "common practice"},
		{"0", 0, "an ideal part"},
		{"F", 0.01, "source: IEC 60062:2016 tolerance letter F"},
		{"G", 0.02, "source: IEC 60062:2016 tolerance letter G"},
		{"J", 0.05, "source: IEC 60062:2016 tolerance letter J"},
		{"K", 0.10, "source: IEC 60062:2016 tolerance letter K"},
		{"M", 0.20, "source: IEC 60062:2016 tolerance letter M"},
		{"L", 0.0001, "from memory: IEC 60062 tolerance letter L"},
		{"P", 0.0002, "from memory: IEC 60062 tolerance letter P"},
		{"W", 0.0005, "from memory: IEC 60062 tolerance letter W"},
		{"B", 0.001, "from memory: IEC 60062 tolerance letter B"},
		{"C", 0.0025, "from memory: IEC 60062 tolerance letter C"},
		{"D", 0.005, "from memory: IEC 60062 tolerance letter D"},
		{"N", 0.30, "from memory: IEC 60062 tolerance letter N"},
	}
	for _, tc := range tests {
		got, err := ParseTolerance(tc.in)
		if err != nil || got != tc.want {
			t.Errorf("ParseTolerance(%q) = %v, %v; want %v (%s)", tc.in, got, err, tc.want, tc.source)
		}
	}
}

func TestParseToleranceErrors(t *testing.T) {
	tests := []struct {
		in   string
		kind error
		msg  string
	}{
		{"", ErrSyntax, `tolerance "": empty`},
		{"X", ErrSyntax, `tolerance "X": unexpected character 'X'`},
		{"j", ErrSyntax, `tolerance "j": unexpected character 'j'`},
		{"-1%", ErrRange, `tolerance "-1%": must not be negative`},
		{"100%", ErrRange, `tolerance "100%": must be below 100 %`},
		{"5%%", ErrSyntax, `tolerance "5%%": unexpected character '%'`},
		{"5 ppm", ErrSyntax, `tolerance "5 ppm": unexpected character 'p'`},
		{"NaN%", ErrSyntax, `tolerance "NaN%": unexpected character 'N'`},
	}
	for _, tc := range tests {
		_, err := ParseTolerance(tc.in)
		if err == nil || err.Error() != tc.msg || !errors.Is(err, tc.kind) {
			t.Errorf("ParseTolerance(%q) error = %v, want %q (%v)", tc.in, err, tc.msg, tc.kind)
		}
	}
}

func TestToleranceLetterRoundTrip(t *testing.T) {
	for _, l := range "LPWBCDFGJKMN" {
		tol, err := ParseTolerance(string(l))
		if err != nil {
			t.Fatal(err)
		}
		if got, ok := ToleranceLetter(tol); !ok || got != string(l) {
			t.Errorf("ToleranceLetter(%v) = %q, %v; want %q", tol, got, ok, string(l))
		}
	}
	if l, ok := ToleranceLetter(0.03); ok {
		t.Errorf("ToleranceLetter(0.03) = %q, want none", l)
	}
}

func TestFormatTolerance(t *testing.T) {
	tests := []struct {
		tol  float64
		want string
	}{
		{0.05, "±5 %"}, {0.005, "±0.5 %"}, {0.0025, "±0.25 %"}, {0.1, "±10 %"},
		{0.0001, "±0.01 %"}, {0.01234, "±1.23 %"}, {0, "±0 %"},
	}
	for _, tc := range tests {
		if got := FormatTolerance(tc.tol); got != tc.want {
			t.Errorf("FormatTolerance(%v) = %q, want %q", tc.tol, got, tc.want)
		}
		// Three significant digits: the text reads back within half a unit.
		if back, err := ParseTolerance(FormatTolerance(tc.tol)); err != nil || math.Abs(back-tc.tol) > 0.005*tc.tol {
			t.Errorf("ParseTolerance(FormatTolerance(%v)) = %v, %v", tc.tol, back, err)
		}
	}
}
