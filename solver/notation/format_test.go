package notation

import (
	"math"
	"testing"
)

// source: SI Brochure, 9th ed. (2019), §5.4.3: a space between number and
// unit symbol, prefixes in steps of 10^3 for engineering display (common
// practice).
func TestFormatSI(t *testing.T) {
	tests := []struct {
		got, want string
	}{
		{FormatCurrent(0.00213), "2.13 mA"},
		{FormatCurrent(4.129268e-3), "4.13 mA"},
		{FormatCurrent(41.29268e-6), "41.3 µA"},
		{FormatCurrent(0), "0 A"},
		{FormatVoltage(0.65), "650 mV"},
		{FormatVoltage(-12), "-12 V"},
		{FormatVoltage(6.7001), "6.7 V"},
		{FormatVoltage(999.7), "1 kV"},
		{FormatPower(0.25), "250 mW"},
		{FormatPower(2), "2 W"},
		{FormatPower(27.69537e-3), "27.7 mW"},
		{FormatResistanceSI(4700), "4.7 kΩ"},
		{FormatResistanceSI(1803.3), "1.8 kΩ"},
		{FormatResistanceSI(0.47), "470 mΩ"},
		{FormatSI(1.5e-18, "A"), "1.5e-18 A"},
		{FormatSI(2.5e3, ""), "2.5 k"},
		{FormatSI(42, ""), "42"},
		{FormatSI(math.Inf(1), "V"), "+Inf V"},
		{FormatTemperature(25), "25 °C"},
		{FormatTemperature(-40), "-40 °C"},
		{FormatTemperature(85.27), "85.3 °C"},
		{FormatTemperature(-0.01), "0 °C"},
		{FormatThermalResistance(200), "200 K/W"},
		{FormatThermalResistance(62.54), "62.5 K/W"},
		{FormatTCR(100), "100 ppm/K"},
		{FormatTCR(-500), "-500 ppm/K"},
	}
	for _, tc := range tests {
		if tc.got != tc.want {
			t.Errorf("got %q, want %q", tc.got, tc.want)
		}
	}
}

// The screen formats read back through the parsers within three
// significant digits.
func TestFormatParsesBack(t *testing.T) {
	tests := []struct {
		v      float64
		format func(float64) string
		parse  Parser
	}{
		{0.00213, FormatCurrent, ParseCurrent},
		{41.3e-6, FormatCurrent, ParseCurrent},
		{-12, FormatVoltage, ParseVoltage},
		{0.6918, FormatVoltage, ParseVoltage},
		{0.25, FormatPower, ParsePower},
		{85.3, FormatTemperature, ParseTemperature},
		{200, FormatThermalResistance, ParseThermalResistance},
		{-500, FormatTCR, ParseTCR},
		{4700, FormatResistanceSI, ParseOhms},
		{0.47, FormatResistanceSI, ParseOhms},
	}
	for _, tc := range tests {
		s := tc.format(tc.v)
		got, err := tc.parse(s)
		if err != nil || math.Abs(got-tc.v) > 0.005*math.Abs(tc.v) {
			t.Errorf("%v → %q → %v, %v", tc.v, s, got, err)
		}
	}
}
