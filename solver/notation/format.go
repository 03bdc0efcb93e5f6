package notation

import (
	"math"
	"strconv"
	"strings"
)

// engPrefixes are the SI prefixes FormatSI uses, by exponent/3 + 5.
var engPrefixes = [...]string{"f", "p", "n", "µ", "m", "", "k", "M", "G", "T"}

// FormatSI writes v with at most three significant digits, an SI prefix
// whose exponent is a multiple of three, a space and unit: FormatSI(0.00213,
// "A") is "2.13 mA", FormatSI(4700, "Ω") is "4.7 kΩ", FormatSI(-12, "V") is
// "-12 V". Zero is "0 V"; magnitudes outside the f..T prefixes use an
// exponent ("1.5e-18 A"); NaN and infinities are written as Go does.
func FormatSI(v float64, unit string) string {
	sep := " "
	if unit == "" {
		sep = ""
	}
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return strconv.FormatFloat(v+0, 'g', -1, 64) + sep + unit
	}
	sign := ""
	if v < 0 {
		sign, v = "-", -v
	}
	digits, e := sigDigits(v)
	digits = strings.TrimRight(digits, "0")
	m := floorDiv(e, 3) * 3
	idx := m/3 + 5
	if idx < 0 || idx >= len(engPrefixes) {
		return sign + strconv.FormatFloat(v, 'g', 3, 64) + sep + unit
	}
	whole := e - m + 1
	for len(digits) < whole {
		digits += "0"
	}
	num := digits[:whole]
	if frac := digits[whole:]; frac != "" {
		num += "." + frac
	}
	if engPrefixes[idx]+unit == "" {
		return sign + num
	}
	return sign + num + " " + engPrefixes[idx] + unit
}

// FormatVoltage writes volts for screens: 0.65 → "650 mV", -12 → "-12 V".
func FormatVoltage(v float64) string { return FormatSI(v, "V") }

// FormatCurrent writes amperes for screens: 0.00213 → "2.13 mA".
func FormatCurrent(a float64) string { return FormatSI(a, "A") }

// FormatPower writes watts for screens: 0.25 → "250 mW", 2 → "2 W".
func FormatPower(w float64) string { return FormatSI(w, "W") }

// FormatTemperature writes degrees Celsius for screens, to 0.1 °C:
// 25 → "25 °C", -40 → "-40 °C", 85.27 → "85.3 °C".
func FormatTemperature(c float64) string {
	r := math.Round(c*10) / 10
	return strconv.FormatFloat(r+0, 'f', -1, 64) + " °C"
}

// FormatThermalResistance writes K/W for screens with at most three
// significant digits: 200 → "200 K/W", 62.54 → "62.5 K/W".
func FormatThermalResistance(kPerW float64) string { return sig3(kPerW) + " K/W" }

// FormatTCR writes a temperature coefficient in ppm/K for screens with at
// most three significant digits: 100 → "100 ppm/K", -500 → "-500 ppm/K".
func FormatTCR(ppmPerK float64) string { return sig3(ppmPerK) + " ppm/K" }
