package eseries

// The tables hold each series' values in one decade as integers: two
// significant digits for E3 to E24 (47 means 4.7·10^n), three for E48 to
// E192 (475 means 4.75·10^n). Source: IEC 60063:2015 Table 1 and Table 2.
// They are returned only through functions that copy them.

// e3 to e24 hold E3, E6, E12 and E24 (IEC 60063:2015 Table 1).
var (
	e3  = [...]int{10, 22, 47}
	e6  = [...]int{10, 15, 22, 33, 47, 68}
	e12 = [...]int{10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82}
	e24 = [...]int{
		10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30,
		33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91,
	}
)

// e192 holds E192 (IEC 60063:2015 Table 2). E96 is every second value and
// E48 every fourth value of it. 920 is the one value that differs from
// round(100·10^(k/192)).
var e192 = [...]int{
	100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120,
	121, 123, 124, 126, 127, 129, 130, 132, 133, 135, 137, 138, 140, 142, 143, 145,
	147, 149, 150, 152, 154, 156, 158, 160, 162, 164, 165, 167, 169, 172, 174, 176,
	178, 180, 182, 184, 187, 189, 191, 193, 196, 198, 200, 203, 205, 208, 210, 213,
	215, 218, 221, 223, 226, 229, 232, 234, 237, 240, 243, 246, 249, 252, 255, 258,
	261, 264, 267, 271, 274, 277, 280, 284, 287, 291, 294, 298, 301, 305, 309, 312,
	316, 320, 324, 328, 332, 336, 340, 344, 348, 352, 357, 361, 365, 370, 374, 379,
	383, 388, 392, 397, 402, 407, 412, 417, 422, 427, 432, 437, 442, 448, 453, 459,
	464, 470, 475, 481, 487, 493, 499, 505, 511, 517, 523, 530, 536, 542, 549, 556,
	562, 569, 576, 583, 590, 597, 604, 612, 619, 626, 634, 642, 649, 657, 665, 673,
	681, 690, 698, 706, 715, 723, 732, 741, 750, 759, 768, 777, 787, 796, 806, 816,
	825, 835, 845, 856, 866, 876, 887, 898, 909, 920, 931, 942, 953, 965, 976, 988,
}

// mantissas returns the integer mantissas of s for one decade and the
// number of significant digits they carry. The slice is a fresh copy.
func mantissas(s Series) (m []int, digits int) {
	s.mustValid()
	switch s {
	case E3:
		return append([]int(nil), e3[:]...), 2
	case E6:
		return append([]int(nil), e6[:]...), 2
	case E12:
		return append([]int(nil), e12[:]...), 2
	case E24:
		return append([]int(nil), e24[:]...), 2
	}
	step := 192 / int(s)
	m = make([]int, 0, int(s))
	for i := 0; i < len(e192); i += step {
		m = append(m, e192[i])
	}
	return m, 3
}
