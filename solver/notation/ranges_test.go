package notation

import (
	"errors"
	"strings"
	"testing"
)

func TestParseRange(t *testing.T) {
	tests := []struct {
		in     string
		parse  Parser
		lo, hi float64
	}{
		{"100..300", ParseNumber, 100, 300},
		{"-10..60", ParseTemperature, -10, 60},
		{"-40..-5", ParseTemperature, -40, -5},
		{"0..50C", ParseTemperature, 0, 50},
		{"0 .. 50 °C", ParseTemperature, 0, 50},
		{"100..300mA", ParseCurrent, 0.1, 0.3}, // the low end takes the unit of the high end
		{"1.5..4.7k", ParseOhms, 1500, 4700},   // likewise for a prefix
		{"1K..4K7", ParseOhms, 1000, 4700},     // codes on both ends
		{"1..4K7", ParseOhms, 1, 4700},         // a code's letter is not shared
		{"0.5..1.5", ParseNumber, 0.5, 1.5},    // decimal points are not range dots
		{"11.5V..12.5V", ParseVoltage, 11.5, 12.5},
		{"200", ParseNumber, 200, 200}, // a single value
		{"5..5", ParseNumber, 5, 5},
	}
	for _, tc := range tests {
		lo, hi, err := ParseRange(tc.in, tc.parse)
		if err != nil || lo != tc.lo || hi != tc.hi {
			t.Errorf("ParseRange(%q) = %v, %v, %v; want %v, %v", tc.in, lo, hi, err, tc.lo, tc.hi)
		}
	}
}

func TestParseRangeErrors(t *testing.T) {
	tests := []struct {
		in    string
		parse Parser
		kind  error
		msg   string
	}{
		{"300..100", ParseNumber, ErrRange, `range "300..100": low end above high end`},
		{"1...2", ParseNumber, ErrSyntax, `range "1...2": use two dots between the ends, like 100..300`},
		{"..5", ParseNumber, ErrSyntax, `range "..5": missing end`},
		{"5..", ParseNumber, ErrSyntax, `range "5..": missing end`},
		{"1..4x7", ParseNumber, ErrSyntax, `range "1..4x7": high end: number "4x7": unexpected character 'x'`},
		{"a..4", ParseNumber, ErrSyntax, `range "a..4": low end: number "a": unexpected character 'a'`},
		{"1..2..3", ParseNumber, ErrSyntax, `range "1..2..3": high end: number "2..3": unexpected character '.'`},
		{"-1..5mA", ParseCurrent, ErrRange, `range "-1..5mA": low end: current "-1mA": must not be negative`},
		{"", ParseNumber, ErrSyntax, `range "": empty`},
	}
	for _, tc := range tests {
		_, _, err := ParseRange(tc.in, tc.parse)
		if err == nil || err.Error() != tc.msg || !errors.Is(err, tc.kind) {
			t.Errorf("ParseRange(%q) error = %v, want %q (%v)", tc.in, err, tc.msg, tc.kind)
		}
	}
}

func TestParseAt(t *testing.T) {
	tests := []struct {
		in    string
		v, at float64
		hasAt bool
		err   string
	}{
		{"0.65V@1mA", 0.65, 0.001, true, ""},
		{"650 mV @ 1 mA", 0.65, 0.001, true, ""},
		{"0.65", 0.65, 0, false, ""},
		{"0.65V@0", 0, 0, false, `value "0.65V@0": test current must not be zero`},
		{"0.65V@1mA@2mA", 0, 0, false, `more than one '@'`},
		{"0.65V@", 0, 0, false, `value "0.65V@": test current: current "": empty`},
		{"@1mA", 0, 0, false, `voltage "": empty`},
	}
	for _, tc := range tests {
		v, at, hasAt, err := ParseAt(tc.in, ParseVoltage)
		if tc.err != "" {
			if err == nil || !strings.Contains(err.Error(), tc.err) {
				t.Errorf("ParseAt(%q) error = %v, want %q", tc.in, err, tc.err)
			}
			continue
		}
		if err != nil || v != tc.v || at != tc.at || hasAt != tc.hasAt {
			t.Errorf("ParseAt(%q) = %v, %v, %v, %v; want %v, %v, %v", tc.in, v, at, hasAt, err, tc.v, tc.at, tc.hasAt)
		}
	}
}

func TestParseRangeAt(t *testing.T) {
	lo, hi, at, hasAt, err := ParseRangeAt("100..300@2mA", ParseNumber)
	if err != nil || lo != 100 || hi != 300 || at != 0.002 || !hasAt {
		t.Errorf(`ParseRangeAt("100..300@2mA") = %v, %v, %v, %v, %v`, lo, hi, at, hasAt, err)
	}
	lo, hi, at, hasAt, err = ParseRangeAt("110..220", ParseNumber)
	if err != nil || lo != 110 || hi != 220 || at != 0 || hasAt {
		t.Errorf(`ParseRangeAt("110..220") = %v, %v, %v, %v, %v`, lo, hi, at, hasAt, err)
	}
	if _, _, _, _, err = ParseRangeAt("300..100@2mA", ParseNumber); err == nil {
		t.Error(`ParseRangeAt("300..100@2mA"): no error`)
	}
}
