// Package eseries holds the IEC 60063:2015 preferred-number series E3, E6,
// E12, E24 (Table 1, two significant digits) and E48, E96, E192 (Table 2,
// three significant digits) and answers questions about them: the values in
// a resistance range, the nearest series value, the next value up or down and
// the coarsest series a marked value belongs to.
//
// Units: every resistance is in ohms (float64). Values returned by this
// package are the exact decimal values of the series (4700, not
// 4699.999999), that is the float64 nearest to mantissa·10^n.
//
// The tables are stored, not computed: E3 to E24 contain irregular values
// (2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2 differ from the rounded
// geometric series) and E192 has one (920 where the geometric value is
// 919.48). Closeness is measured on a logarithmic scale (by ratio), which
// is how the series are spaced.
//
// The pairing of a series with a tolerance (E12 with ±10 % and so on) is the
// customary one; IEC 60063:2015 makes that relation informative only, so
// treat Tolerance as a hint, never as a property of a stocked part.
//
// A Series outside the seven defined ones is a programmer error: functions
// taking one panic with an "eseries: ..." message. Resistances that are not
// finite and positive are answered with zero values as each function
// documents, never with a panic.
package eseries
