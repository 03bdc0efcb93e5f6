// Package notation reads and writes the values a technician types or finds
// printed on parts: resistances in the IEC 60062 letter-and-digit code
// (4K7, R47, 470R, 2M2, 1R8J) or in SI form (4.7k, 4.7 kΩ, 4700, 4.7e3),
// tolerances (±5 %, 1%, J), power ratings (0.25W, 250mW, 1/4W), voltages,
// currents, temperatures, thermal resistances, temperature coefficients,
// MIN..MAX ranges and value@current pairs.
//
// Units: every parser returns SI base units as float64: ohms, volts,
// amperes, watts; temperatures in degrees Celsius; thermal resistance in
// kelvin per watt (equal to °C/W); temperature coefficients in ppm/K;
// tolerances as fractions (0.05 for ±5 %). The formatters take the same
// units.
//
// Standards: the letter-and-digit code and the tolerance letters follow
// IEC 60062:2016 (+A1:2019): a multiplier letter stands for the decimal
// point (L = 10⁻³, R = 1, K = 10³, M = 10⁶, G = 10⁹, T = 10¹²) and one
// tolerance letter may follow (F = ±1 %, G = ±2 %, J = ±5 %, K = ±10 %,
// M = ±20 % ...). SI prefixes follow the SI brochure; the parsers also take
// the forms common in the trade (k or K for kilo, u for micro, 1/4W).
//
// Choices where notation is ambiguous:
//   - In a resistance, a bare lower-case m ("220m") is rejected: it means
//     milli in SI and mega to many technicians. Write 220mΩ, R22 or 220M.
//     SPICE's "meg" is read as mega.
//   - A trailing K or M after a complete letter-and-digit code is a
//     tolerance letter: 27KK is 27 kΩ ±10 %, 1MM is 1 MΩ ±20 %.
//   - A bare tolerance number is percent: "5" is ±5 %.
//   - A bare number elsewhere is in the base unit: "0.001" is 1 mA for a
//     current, "25" is 25 °C.
//
// Values that cannot be meant are rejected: empty text, NaN, Inf, numbers
// beyond float64 range, trailing text, invalid UTF-8, negative
// resistances, currents, powers, tolerances and thermal resistances, a
// power rating or thermal resistance of zero, and temperatures below
// absolute zero. A resistance of zero is allowed (a zero-ohm link, "0R").
//
// Every parse error is an *Error naming the quantity, the input and the
// problem; errors.Is tells ErrSyntax from ErrRange. Parsers never panic.
package notation
