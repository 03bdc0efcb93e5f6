package notation

import (
	"errors"
	"testing"
)

// Prefixes and unit symbols: source: SI Brochure, 9th ed. (2019), §3
// decimal prefixes (table number from memory). Fractional power ratings
// (1/4W) are common practice.
func TestParseQuantities(t *testing.T) {
	tests := []struct {
		parser string
		parse  Parser
		in     string
		want   float64
	}{
		{"power", ParsePower, "0.25W", 0.25},
		{"power", ParsePower, "250mW", 0.25},
		{"power", ParsePower, "1/4W", 0.25},
		{"power", ParsePower, "1/2 W", 0.5},
		{"power", ParsePower, "1/8", 0.125},
		{"power", ParsePower, "2W", 2},
		{"power", ParsePower, "3/4 kW", 750},
		{"voltage", ParseVoltage, "12V", 12},
		{"voltage", ParseVoltage, "-12 V", -12},
		{"voltage", ParseVoltage, "−12 V", -12}, // U+2212 MINUS SIGN
		{"voltage", ParseVoltage, "0.65V", 0.65},
		{"voltage", ParseVoltage, "650mV", 0.65},
		{"voltage", ParseVoltage, "650m", 0.65},
		{"voltage", ParseVoltage, "12", 12},
		{"voltage", ParseVoltage, "12v", 12},
		{"current", ParseCurrent, "1mA", 0.001},
		{"current", ParseCurrent, "2.5 mA", 0.0025},
		{"current", ParseCurrent, "100uA", 1e-4},
		{"current", ParseCurrent, "100µA", 1e-4}, // U+00B5 MICRO SIGN
		{"current", ParseCurrent, "100μA", 1e-4}, // U+03BC GREEK SMALL MU
		{"current", ParseCurrent, "0.001", 0.001},
		{"current", ParseCurrent, "10nA", 1e-8},
		{"current", ParseCurrent, "0", 0},
		{"temperature", ParseTemperature, "25", 25},
		{"temperature", ParseTemperature, "25C", 25},
		{"temperature", ParseTemperature, "25 °C", 25},
		{"temperature", ParseTemperature, "-40°C", -40},
		{"temperature", ParseTemperature, "125℃", 125},
		{"temperature", ParseTemperature, "-273.15", -273.15},
		{"thermal", ParseThermalResistance, "200K/W", 200},
		{"thermal", ParseThermalResistance, "200 °C/W", 200},
		{"thermal", ParseThermalResistance, "62.5", 62.5},
		{"tcr", ParseTCR, "100ppm", 100},
		{"tcr", ParseTCR, "±50 ppm/K", 50},
		{"tcr", ParseTCR, "-200 ppm/°C", -200},
		{"tcr", ParseTCR, "0", 0},
		{"number", ParseNumber, "100", 100},
		{"number", ParseNumber, "2.5e2", 250},
		{"number", ParseNumber, "-3", -3},
	}
	for _, tc := range tests {
		got, err := tc.parse(tc.in)
		if err != nil || got != tc.want {
			t.Errorf("%s %q = %v, %v; want %v", tc.parser, tc.in, got, err, tc.want)
		}
	}
}

func TestParseQuantityErrors(t *testing.T) {
	tests := []struct {
		parse Parser
		in    string
		kind  error
		msg   string
	}{
		{ParsePower, "0", ErrRange, `power "0": must not be zero`},
		{ParsePower, "-1W", ErrRange, `power "-1W": must not be negative`},
		{ParsePower, "1/0W", ErrRange, `power "1/0W": division by zero`},
		{ParsePower, "1.5/2W", ErrSyntax, `power "1.5/2W": unexpected character '/'`},
		{ParsePower, "1/2/3", ErrSyntax, `power "1/2/3": fraction must be whole numbers, like 1/4`},
		{ParsePower, "1/4 mV", ErrSyntax, `power "1/4 mV": unexpected character 'V'`},
		{ParsePower, "Inf", ErrSyntax, `power "Inf": unexpected character 'I'`},
		{ParsePower, "1e400W", ErrRange, `power "1e400W": too large`},
		{ParseVoltage, "12 A", ErrSyntax, `voltage "12 A": unexpected character 'A'`},
		{ParseVoltage, "12V ", ErrSyntax, ``}, // trailing space is trimmed, so this parses
		{ParseCurrent, "-1mA", ErrRange, `current "-1mA": must not be negative`},
		{ParseCurrent, "1ma", ErrSyntax, `current "1ma": unexpected character 'a'`},
		{ParseCurrent, "", ErrSyntax, `current "": empty`},
		{ParseTemperature, "-300", ErrRange, `temperature "-300": below -273.15`},
		{ParseTemperature, "25K", ErrSyntax, `temperature "25K": unexpected character 'K'`},
		{ParseTemperature, "25mC", ErrSyntax, `temperature "25mC": unexpected character 'm'`},
		{ParseThermalResistance, "0", ErrRange, `thermal resistance "0": must not be zero`},
		{ParseThermalResistance, "200 W/K", ErrSyntax, `thermal resistance "200 W/K": unexpected character 'W'`},
		{ParseTCR, "±", ErrSyntax, `temperature coefficient "±": missing number`},
		{ParseTCR, "50ppb", ErrSyntax, `temperature coefficient "50ppb": unexpected character 'b'`},
		{ParseNumber, "100x", ErrSyntax, `number "100x": unexpected character 'x'`},
		{ParseNumber, "NaN", ErrSyntax, `number "NaN": unexpected character 'N'`},
		{ParseNumber, "1k", ErrSyntax, `number "1k": unexpected character 'k'`},
	}
	for _, tc := range tests {
		_, err := tc.parse(tc.in)
		if tc.msg == "" {
			if err != nil {
				t.Errorf("%q: %v", tc.in, err)
			}
			continue
		}
		if err == nil || err.Error() != tc.msg || !errors.Is(err, tc.kind) {
			t.Errorf("%q: error = %v, want %q (%v)", tc.in, err, tc.msg, tc.kind)
		}
	}
}
