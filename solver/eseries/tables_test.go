package eseries

import (
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// The published value lists, copied as text so that each expected value
// is the exact decimal the standard prints.
var published = []struct {
	s      Series
	values string
	shift  int // decimal exponent that turns a listed value into [1, 10)
	source string
}{
	{E3, "1.0 2.2 4.7", 0,
		"common practice (every second E6 value; IEC 60063 Table 1 from memory)"},
	{E6, "1.0 1.5 2.2 3.3 4.7 6.8", 0,
		"source: IEC 60063:2015 Table 1"},
	{E12, "1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2", 0,
		"source: IEC 60063:2015 Table 1"},
	{E24, "1.0 1.1 1.2 1.3 1.5 1.6 1.8 2.0 2.2 2.4 2.7 3.0 3.3 3.6 3.9 4.3 4.7 5.1 5.6 6.2 6.8 7.5 8.2 9.1", 0,
		"source: IEC 60063:2015 Table 1"},
	{E48, "100 105 110 115 121 127 133 140 147 154 162 169 178 187 196 205 215 226 237 249 261 274 287 301 " +
		"316 332 348 365 383 402 422 442 464 487 511 536 562 590 619 649 681 715 750 787 825 866 909 953", -2,
		"source: IEC 60063:2015 Table 2"},
	{E96, "100 102 105 107 110 113 115 118 121 124 127 130 133 137 140 143 147 150 154 158 162 165 169 174 " +
		"178 182 187 191 196 200 205 210 215 221 226 232 237 243 249 255 261 267 274 280 287 294 301 309 " +
		"316 324 332 340 348 357 365 374 383 392 402 412 422 432 442 453 464 475 487 499 511 523 536 549 " +
		"562 576 590 604 619 634 649 665 681 698 715 732 750 768 787 806 825 845 866 887 909 931 953 976", -2,
		"source: IEC 60063:2015 Table 2"},
}

func TestValuesMatchPublishedTables(t *testing.T) {
	for _, tc := range published {
		t.Run(tc.s.String(), func(t *testing.T) {
			fields := strings.Fields(tc.values)
			got := Values(tc.s)
			if len(got) != len(fields) || len(got) != int(tc.s) {
				t.Fatalf("%s: %d values, want %d (%s)", tc.s, len(got), len(fields), tc.source)
			}
			for i, f := range fields {
				want, err := strconv.ParseFloat(f+"e"+strconv.Itoa(tc.shift), 64)
				if err != nil {
					t.Fatal(err)
				}
				if got[i] != want { // exact: both are the float64 nearest the decimal
					t.Errorf("%s value %d = %v, want %v (%s)", tc.s, i, got[i], want, tc.source)
				}
			}
		})
	}
}

// geometric returns round(10^(k/n)) to the given number of significant
// digits, as an integer mantissa (2 digits: 10..99, 3 digits: 100..999).
func geometric(k, n, digits int) int {
	return int(math.Round(math.Pow(10, float64(digits-1)+float64(k)/float64(n))))
}

// irregular returns the values of s whose mantissa differs from the
// rounded geometric series.
func irregular(t *testing.T, s Series, digits int) []string {
	t.Helper()
	var out []string
	for k, v := range Values(s) {
		m := int(math.Round(v * math.Pow10(digits-1)))
		if m != geometric(k, int(s), digits) {
			out = append(out, strconv.FormatFloat(v, 'f', digits-1, 64))
		}
	}
	return out
}

func TestIrregularValues(t *testing.T) {
	tests := []struct {
		s      Series
		digits int
		want   []string
		source string
	}{
		// source: IEC 60063:2015 Table 1 against round(10^(k/24)); the
		// eight irregular E24 values (re-derived by script, REFERENCE §1).
		{E24, 2, []string{"2.7", "3.0", "3.3", "3.6", "3.9", "4.3", "4.7", "8.2"}, "IEC 60063:2015 Table 1"},
		// E12 and E6 inherit the irregular values they share with E24.
		{E12, 2, []string{"2.7", "3.3", "3.9", "4.7", "8.2"}, "IEC 60063:2015 Table 1"},
		{E6, 2, []string{"3.3", "4.7"}, "IEC 60063:2015 Table 1"},
		// source: IEC 60063:2015 Table 2: E48 and E96 follow the formula
		// without exception; E192 has the single exception 920 (919.48).
		{E48, 3, nil, "IEC 60063:2015 Table 2"},
		{E96, 3, nil, "IEC 60063:2015 Table 2"},
		{E192, 3, []string{"9.20"}, "IEC 60063:2015 Table 2"},
	}
	for _, tc := range tests {
		if got := irregular(t, tc.s, tc.digits); !slices.Equal(got, tc.want) {
			t.Errorf("%s irregular values = %v, want %v (source: %s)", tc.s, got, tc.want, tc.source)
		}
	}
}

func TestE192Exception(t *testing.T) {
	// source: IEC 60063:2015 Table 2: the 186th E192 value is 920 while
	// 100·10^(185/192) = 919.48.
	geo := 100 * math.Pow(10, 185.0/192)
	if math.Abs(geo-919.48) > 0.005 {
		t.Fatalf("geometric value %v, want 919.48", geo)
	}
	if got := Values(E192)[185]; got != 9.2 {
		t.Errorf("E192[185] = %v, want 9.2", got)
	}
}

func TestSeriesNest(t *testing.T) {
	// source: IEC 60063:2015 Tables 1 and 2: each series takes every
	// second value of the next finer one within its table.
	pairs := [][2]Series{{E3, E6}, {E6, E12}, {E12, E24}, {E48, E96}, {E96, E192}}
	for _, p := range pairs {
		coarse, fine := Values(p[0]), Values(p[1])
		for i, v := range coarse {
			if fine[2*i] != v {
				t.Errorf("%s[%d] = %v, %s[%d] = %v: want equal", p[0], i, v, p[1], 2*i, fine[2*i])
			}
		}
	}
}

func TestValuesAreCopies(t *testing.T) {
	v := Values(E12)
	v[0] = 99
	if Values(E12)[0] != 1 {
		t.Error("Values returned the stored table, not a copy")
	}
}
