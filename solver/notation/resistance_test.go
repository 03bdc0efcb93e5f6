package notation

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func TestParseResistanceCode(t *testing.T) {
	tests := []struct {
		in     string
		ohm    float64
		tol    float64
		hasTol bool
		source string
	}{
		{"R47", 0.47, 0, false, "source: IEC 60062:2016 letter-and-digit code, example R47"},
		{"4R7", 4.7, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 4R7"},
		{"470R", 470, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 470R"},
		{"4K7", 4700, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 4K7"},
		{"47K", 47e3, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 47K"},
		{"47K3", 47.3e3, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 47K3"},
		{"470K", 470e3, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 470K"},
		{"4M7", 4.7e6, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 4M7"},
		{"2M2", 2.2e6, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 2M2"},
		{"1K0", 1000, 0, false, "source: IEC 60062:2016 letter-and-digit code, example 1K0"},
		{"R10", 0.1, 0, false, "source: IEC 60062:2016 letter-and-digit code, example R10"},
		{"R300", 0.3, 0, false, "source: IEC 60062:2016 fixed 4-character form R300"},
		{"1G0", 1e9, 0, false, "source: IEC 60062:2016 multiplier G = 10^9"},
		{"4L7", 4.7e-3, 0, false, "source: IEC 60062:2016 multiplier L = 10^-3"},
		{"1T5", 1.5e12, 0, false, "from memory: IEC 60062 multiplier T = 10^12"},
		{"1R8J", 1.8, 0.05, true, "source: IEC 60062:2016 tolerance letter J = ±5 %, example 1R8J"},
		{"27KK", 27e3, 0.10, true, "source: IEC 60062:2016 trailing K is tolerance ±10 %, example 27KK"},
		{"4K7F", 4700, 0.01, true, "source: IEC 60062:2016 tolerance letter F = ±1 %"},
		{"1MM", 1e6, 0.20, true, "source: IEC 60062:2016 trailing M is tolerance ±20 %"},
		{"10KG", 10e3, 0.02, true, "source: IEC 60062:2016 tolerance letter G = ±2 %"},
		{"4K7 J", 4700, 0.05, true, "common practice: code and letter apart"},
		{"4K7 ±1 %", 4700, 0.01, true, "common practice: code and percentage"},
		{"4k7", 4700, 0, false, "common practice: lower-case k written for K"},
		{"4r7", 4.7, 0, false, "common practice: lower-case r written for R"},
		{"0R", 0, 0, false, "common practice: zero-ohm link marking"},
		{"  2M2\t", 2.2e6, 0, false, "surrounding space ignored"},
	}
	for _, tc := range tests {
		ohm, tol, hasTol, err := ParseResistance(tc.in)
		if err != nil {
			t.Errorf("ParseResistance(%q): %v (%s)", tc.in, err, tc.source)
			continue
		}
		if ohm != tc.ohm || tol != tc.tol || hasTol != tc.hasTol {
			t.Errorf("ParseResistance(%q) = %v, %v, %v; want %v, %v, %v (%s)",
				tc.in, ohm, tol, hasTol, tc.ohm, tc.tol, tc.hasTol, tc.source)
		}
	}
}

func TestParseResistanceSI(t *testing.T) {
	// source: SI Brochure, 9th ed. (2019), §3 decimal prefixes (table
	// number from memory); unit symbol Ω with a space before it (§5.4.3,
	// from memory). "meg" is the SPICE spelling (ngspice manual §2.3.1,
	// from memory).
	tests := []struct {
		in     string
		ohm    float64
		tol    float64
		hasTol bool
	}{
		{"4.7k", 4700, 0, false},
		{"4.7K", 4700, 0, false},
		{"4.7 kΩ", 4700, 0, false},
		{"4.7 kΩ", 4700, 0, false}, // U+2126 OHM SIGN
		{"4.7kohm", 4700, 0, false},
		{"4.7 kOhms", 4700, 0, false},
		{"4700", 4700, 0, false},
		{"4.7e3", 4700, 0, false},
		{"4.7E+3", 4700, 0, false},
		{"470 Ω", 470, 0, false},
		{"1.5M", 1.5e6, 0, false},
		{"1meg", 1e6, 0, false},
		{"1 MΩ", 1e6, 0, false},
		{"220mΩ", 0.22, 0, false},
		{"220 mohm", 0.22, 0, false},
		{"470 nΩ", 470e-9, 0, false},
		{".47", 0.47, 0, false},
		{"+100", 100, 0, false},
		{"4.7 K", 4700, 0, false}, // a lone K after an SI number is kilo, not ±10 %
		{"4.7k 5%", 4700, 0.05, true},
		{"4.7kΩ±1%", 4700, 0.01, true},
		{"4.7 kΩ +/-0.5 %", 4700, 0.005, true},
		{"0", 0, 0, false},
	}
	for _, tc := range tests {
		ohm, tol, hasTol, err := ParseResistance(tc.in)
		if err != nil {
			t.Errorf("ParseResistance(%q): %v", tc.in, err)
			continue
		}
		if ohm != tc.ohm || tol != tc.tol || hasTol != tc.hasTol {
			t.Errorf("ParseResistance(%q) = %v, %v, %v; want %v, %v, %v",
				tc.in, ohm, tol, hasTol, tc.ohm, tc.tol, tc.hasTol)
		}
	}
}

func TestParseResistanceErrors(t *testing.T) {
	tests := []struct {
		in   string
		kind error
		msg  string // the whole message when it starts with "resistance", else a fragment
	}{
		{"", ErrSyntax, `resistance "": empty`},
		{"   ", ErrSyntax, `resistance "   ": empty`},
		{"4x7", ErrSyntax, `resistance "4x7": unexpected character 'x'`},
		{"--3k", ErrSyntax, `resistance "--3k": unexpected character '-'`},
		{"1e999", ErrRange, `resistance "1e999": too large`},
		{"1e-999", ErrRange, `too small`},
		{"1e999999999", ErrRange, `exponent too large`},
		{"1e308k", ErrRange, `too large`},
		{"NaN", ErrSyntax, `unexpected character 'N'`},
		{"Inf", ErrSyntax, `unexpected character 'I'`},
		{"+Inf", ErrSyntax, `unexpected character 'I'`},
		{"0x1p3", ErrSyntax, `unexpected character 'x'`},
		{"-4K7", ErrRange, `must not be negative`},
		{"-470", ErrRange, `must not be negative`},
		{"4K7abc", ErrSyntax, `unexpected character 'a'`},
		{"4K7X", ErrSyntax, `unexpected character 'X'`},
		{"4K7JJ", ErrSyntax, `unexpected character 'J'`},
		{"4.7kx", ErrSyntax, `unexpected character 'x'`},
		{"4.7 k Ω", ErrSyntax, `unexpected character ' '`},
		{"220m", ErrSyntax, `ambiguous 'm'`},
		{"2m2", ErrSyntax, `ambiguous 'm'`},
		{"4\xff7", ErrSyntax, `invalid UTF-8`},
		{"R", ErrSyntax, `unexpected character 'R'`},
		{"K", ErrSyntax, `unexpected character 'K'`},
		{".", ErrSyntax, `missing number`},
		{"1µ", ErrSyntax, `missing unit after "µ"`},
		{"1 mΩx", ErrSyntax, `unexpected character 'x'`},
		{"1 Ωm", ErrSyntax, `unexpected character 'm'`},
		{"1e", ErrSyntax, `unexpected character 'e'`},
		{"1 2", ErrSyntax, `unexpected character '2'`},
		{"4K7 ±200%", ErrRange, `tolerance: must be below 100 %`},
		{"4K7J ±1%", ErrSyntax, `two tolerances`},
		{"4.7kJ", ErrSyntax, `unexpected character 'J'`},
	}
	for _, tc := range tests {
		_, _, _, err := ParseResistance(tc.in)
		if err == nil {
			t.Errorf("ParseResistance(%q): no error, want %q", tc.in, tc.msg)
			continue
		}
		var pe *Error
		if !errors.As(err, &pe) || pe.Input != tc.in || pe.Quantity != "resistance" {
			t.Errorf("ParseResistance(%q): error %#v is not an *Error naming the input", tc.in, err)
		}
		if !errors.Is(err, tc.kind) {
			t.Errorf("ParseResistance(%q): %v is not %v", tc.in, err, tc.kind)
		}
		if strings.HasPrefix(tc.msg, "resistance") && err.Error() != tc.msg ||
			!strings.Contains(err.Error(), tc.msg) {
			t.Errorf("ParseResistance(%q) error = %q, want %q", tc.in, err, tc.msg)
		}
	}
}

func TestParseOhms(t *testing.T) {
	if v, err := ParseOhms("4K7"); err != nil || v != 4700 {
		t.Errorf(`ParseOhms("4K7") = %v, %v; want 4700`, v, err)
	}
	if _, err := ParseOhms("4K7J"); err == nil {
		t.Error(`ParseOhms("4K7J"): no error for a tolerance`)
	}
}

func TestFormatResistance(t *testing.T) {
	tests := []struct {
		ohm    float64
		want   string
		source string
	}{
		{4700, "4K7", "source: IEC 60062:2016 example 4K7"},
		{470, "470R", "source: IEC 60062:2016 example 470R"},
		{0.47, "R47", "source: IEC 60062:2016 example R47"},
		{4.7, "4R7", "source: IEC 60062:2016 example 4R7"},
		{1000, "1K0", "source: IEC 60062:2016 example 1K0"},
		{47300, "47K3", "source: IEC 60062:2016 example 47K3"},
		{47e3, "47K", "source: IEC 60062:2016 example 47K"},
		{470e3, "470K", "source: IEC 60062:2016 example 470K"},
		{4.7e6, "4M7", "source: IEC 60062:2016 example 4M7"},
		{2.2e6, "2M2", "source: IEC 60062:2016 example 2M2"},
		{1e6, "1M0", "source: IEC 60062:2016 form of 1K0 applied to M"},
		{0.1, "R10", "source: IEC 60062:2016 example R10"},
		{1e9, "1G0", "source: IEC 60062:2016 multiplier G"},
		{4.7e-3, "4L7", "source: IEC 60062:2016 multiplier L"},
		{0.047, "R047", "common practice: current-sense marking R047"},
		{0.01, "R010", "common practice: current-sense marking R010"},
		{4.7e-4, "L47", "IEC 60062 L as decimal point, below 1 mΩ"},
		{1, "1R0", "two digits at least, as 1K0"},
		{10, "10R", "two digits"},
		{100, "100R", "three digits before the letter"},
		{4749, "4K75", "three significant digits"},
		{4745.1, "4K75", "rounded to three significant digits"},
		{999.7, "1K0", "rounding carries into the next letter"},
		{1.5e15, "1500T", "beyond T stays in T"},
		{0, "0R", "common practice: zero-ohm link"},
		{-1, "?-1", "not a part value"},
		{math.NaN(), "?NaN", "not a part value"},
	}
	for _, tc := range tests {
		if got := FormatResistance(tc.ohm); got != tc.want {
			t.Errorf("FormatResistance(%v) = %q, want %q (%s)", tc.ohm, got, tc.want, tc.source)
		}
	}
}

func TestFormatResistanceCode(t *testing.T) {
	tests := []struct {
		ohm, tol float64
		want     string
	}{
		{27e3, 0.10, "27KK"}, // source: IEC 60062:2016 example 27KK
		{1.8, 0.05, "1R8J"},  // source: IEC 60062:2016 example 1R8J
		{4700, 0.01, "4K7F"}, // source: IEC 60062:2016 letter F
		{4700, 0.03, "4K7 ±3 %"},
	}
	for _, tc := range tests {
		if got := FormatResistanceCode(tc.ohm, tc.tol); got != tc.want {
			t.Errorf("FormatResistanceCode(%v, %v) = %q, want %q", tc.ohm, tc.tol, got, tc.want)
		}
	}
}
