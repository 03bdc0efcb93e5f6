package eseries

// Tolerance returns the tolerance customarily paired with s, as a fraction:
// E6 0.20, E12 0.10, E24 0.05, E48 0.02, E96 0.01, E192 0.005. For E3,
// for which the customary statement is only "wider than ±20 %", it returns
// 0.40 as a conservative stand-in.
//
// IEC 60063:2015 makes the series-to-tolerance relation informative: a
// 4K7 ±1 % part is an E3 value. Use this as a hint when a stocked part has
// no tolerance recorded, never to override a recorded one.
func Tolerance(s Series) float64 {
	s.mustValid()
	switch s {
	case E3:
		return 0.40 // from memory: catalogues that still list E3 give ±40 %
	case E6:
		return 0.20
	case E12:
		return 0.10
	case E24:
		return 0.05
	case E48:
		return 0.02
	case E96:
		return 0.01
	}
	return 0.005
}
