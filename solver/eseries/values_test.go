package eseries

import (
	"math"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"
)

func TestString(t *testing.T) {
	tests := []struct {
		s    Series
		want string
	}{
		{E3, "E3"}, {E6, "E6"}, {E12, "E12"}, {E24, "E24"},
		{E48, "E48"}, {E96, "E96"}, {E192, "E192"}, {Series(7), "E?(7)"},
	}
	for _, tc := range tests {
		if got := tc.s.String(); got != tc.want {
			t.Errorf("Series(%d).String() = %q, want %q", int(tc.s), got, tc.want)
		}
	}
}

func TestParseSeries(t *testing.T) {
	tests := []struct {
		in      string
		want    Series
		wantErr bool
	}{
		{"E12", E12, false},
		{"e24", E24, false},
		{" E192 ", E192, false},
		{"96", E96, false},
		{"E3", E3, false},
		{"E7", 0, true},
		{"E", 0, true},
		{"", 0, true},
		{"E012", 0, true},
		{"E+12", 0, true},
		{"E12x", 0, true},
	}
	for _, tc := range tests {
		got, err := ParseSeries(tc.in)
		if (err != nil) != tc.wantErr || got != tc.want {
			t.Errorf("ParseSeries(%q) = %v, %v; want %v, error %v", tc.in, got, err, tc.want, tc.wantErr)
		}
	}
	for _, s := range All() { // String and ParseSeries are inverse
		if got, err := ParseSeries(s.String()); err != nil || got != s {
			t.Errorf("ParseSeries(%q) = %v, %v", s.String(), got, err)
		}
	}
}

// Expected values below come from the IEC 60063:2015 tables (source:
// IEC 60063:2015 Table 1/Table 2) with the neighbours' ratios worked by hand.
func TestNearest(t *testing.T) {
	tests := []struct {
		s    Series
		ohm  float64
		want float64
		why  string
	}{
		{E12, 5000, 4700, "5000/4700 = 1.064 < 5600/5000 = 1.12"},
		{E24, 5000, 5100, "5100/5000 = 1.02 < 5000/4700 = 1.064"},
		{E12, 9000, 8200, "9000/8200 = 1.098 < 10000/9000 = 1.111"},
		{E12, 9100, 10000, "10000/9100 = 1.099 < 9100/8200 = 1.110"},
		{E6, 95, 100, "next decade"},
		{E6, 1.05, 1, "decade start"},
		{E3, 0.33, 0.47, "0.47/0.33 = 1.424 < 0.33/0.22 = 1.5"},
		{E96, 4800, 4750, "4800/4750 = 1.0105 < 4870/4800 = 1.0146"},
		{E192, 919.9, 920, "the irregular E192 value"},
		{E12, 4700, 4700, "exact value"},
		{E12, 0, 0, "not positive"},
		{E12, -10, 0, "not positive"},
		{E12, math.NaN(), 0, "not a number"},
		{E12, math.Inf(1), 0, "not finite"},
	}
	for _, tc := range tests {
		if got := Nearest(tc.s, tc.ohm); got != tc.want {
			t.Errorf("Nearest(%s, %v) = %v, want %v (%s)", tc.s, tc.ohm, got, tc.want, tc.why)
		}
	}
}

func TestRange(t *testing.T) {
	tests := []struct {
		s      Series
		lo, hi float64
		want   []float64
	}{
		// source: IEC 60063:2015 Table 1, E12 times 10^3 and the next decade's first value.
		{E12, 1000, 10000, []float64{1000, 1200, 1500, 1800, 2200, 2700, 3300, 3900, 4700, 5600, 6800, 8200, 10000}},
		{E6, 0.5, 3, []float64{0.68, 1, 1.5, 2.2}},
		{E24, 4700, 4700, []float64{4700}},
		{E24, 4.7e3 * (1 + 1e-12), 4.7e3 * (1 + 1e-12), []float64{4700}},
		{E48, 900, 1100, []float64{909, 953, 1000, 1050, 1100}},
		{E12, 4800, 5500, nil},
		{E12, 10, 1, nil},
		{E12, 0, 100, nil},
		{E12, 1, math.Inf(1), nil},
	}
	for _, tc := range tests {
		got := Range(tc.s, tc.lo, tc.hi)
		if !slices.Equal(got, tc.want) {
			t.Errorf("Range(%s, %v, %v) = %v, want %v", tc.s, tc.lo, tc.hi, got, tc.want)
		}
	}
}

func TestRangeValuesAreExactDecimals(t *testing.T) {
	// Every value is the float64 nearest a decimal of at most 2 (E3-E24)
	// or 3 (E48-E192) significant digits: the shortest text that reads
	// back to it has no more digits (4700, never 4699.999999999999).
	for _, s := range All() {
		max := 2
		if s >= E48 {
			max = 3
		}
		vals := Range(s, 1e-3, 1e12)
		if want := 15 * int(s); len(vals) != want+1 {
			t.Errorf("%s: %d values in 1 mΩ..1 TΩ, want %d", s, len(vals), want+1)
		}
		for i, v := range vals {
			m, _, _ := strings.Cut(strconv.FormatFloat(v, 'e', -1, 64), "e")
			if digits := len(strings.Replace(m, ".", "", 1)); digits > max {
				t.Errorf("%s: %s has more than %d significant digits", s, m, max)
			}
			if i > 0 && v <= vals[i-1] {
				t.Errorf("%s: not ascending at %v", s, v)
			}
		}
	}
}

func TestOf(t *testing.T) {
	tests := []struct {
		ohm  float64
		want Series
		ok   bool
	}{
		{4700, E3, true},         // 4.7 is in E3 (IEC 60063 Table 1)
		{0.47, E3, true},         // any decade
		{1.5e6, E6, true},        // 1.5 first appears in E6
		{5600, E12, true},        // 5.6 first appears in E12
		{5100, E24, true},        // 5.1 first appears in E24
		{4640, E48, true},        // 464 is in E48 (Table 2)
		{4750, E96, true},        // 475 is in E96 but not E48
		{4810, E192, true},       // 481 only in E192
		{920, E192, true},        // the irregular E192 value
		{919, 0, false},          // its geometric neighbour is not a value
		{4800, 0, false},         // in no series
		{4700.0000001, E3, true}, // within 1e-9 relative
		{0, 0, false},
		{-4700, 0, false},
		{math.NaN(), 0, false},
	}
	for _, tc := range tests {
		got, ok := Of(tc.ohm)
		if got != tc.want || ok != tc.ok {
			t.Errorf("Of(%v) = %v, %v; want %v, %v", tc.ohm, got, ok, tc.want, tc.ok)
		}
	}
}

func TestNextUpDown(t *testing.T) {
	tests := []struct {
		s        Series
		ohm      float64
		up, down float64
	}{
		{E12, 4700, 5600, 3900},
		{E12, 8200, 10000, 6800},
		{E12, 1000, 1200, 820},
		{E12, 4800, 5600, 4700},
		{E96, 976, 1000, 953},
		{E6, 0, 0, 0},
	}
	for _, tc := range tests {
		if got := NextUp(tc.s, tc.ohm); got != tc.up {
			t.Errorf("NextUp(%s, %v) = %v, want %v", tc.s, tc.ohm, got, tc.up)
		}
		if got := NextDown(tc.s, tc.ohm); got != tc.down {
			t.Errorf("NextDown(%s, %v) = %v, want %v", tc.s, tc.ohm, got, tc.down)
		}
	}
}

func TestTolerance(t *testing.T) {
	// common practice: the customary pairing (REFERENCE §1; informative
	// in IEC 60063:2015). E3: "wider than ±20 %", 40 % from memory.
	tests := []struct {
		s    Series
		want float64
	}{
		{E3, 0.40}, {E6, 0.20}, {E12, 0.10}, {E24, 0.05}, {E48, 0.02}, {E96, 0.01}, {E192, 0.005},
	}
	for _, tc := range tests {
		if got := Tolerance(tc.s); got != tc.want {
			t.Errorf("Tolerance(%s) = %v, want %v", tc.s, got, tc.want)
		}
	}
}

func TestInvalidSeriesPanics(t *testing.T) {
	calls := map[string]func(){
		"Values":    func() { Values(Series(7)) },
		"Nearest":   func() { Nearest(Series(0), 100) },
		"Range":     func() { Range(Series(-1), 1, 10) },
		"NextUp":    func() { NextUp(Series(13), 100) },
		"Tolerance": func() { Tolerance(Series(100)) },
	}
	for name, call := range calls {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s with an invalid series did not panic", name)
				}
			}()
			call()
		}()
	}
}

func BenchmarkNearest(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		Nearest(E96, 1000+float64(i%9000))
	}
}

func BenchmarkRangeE96(b *testing.B) {
	for b.Loop() {
		Range(E96, 10, 1e6)
	}
}

func TestDecimalMatchesParseFloat(t *testing.T) {
	// The fast path must give the float64 that the decimal text reads as.
	for exp := -40; exp <= 40; exp++ {
		for _, m := range []int{1, 10, 47, 82, 100, 309, 487, 920, 976, 999} {
			want, err := strconv.ParseFloat(strconv.Itoa(m)+"e"+strconv.Itoa(exp), 64)
			if err != nil {
				t.Fatal(err)
			}
			if got := decimal(m, exp); got != want {
				t.Errorf("decimal(%d, %d) = %v, want %v", m, exp, got, want)
			}
		}
	}
}

func TestNearestMatchesFullSearch(t *testing.T) {
	// Nearest looks only near the geometric position; compare with a
	// search over every value of the neighbouring decades.
	rng := rand.New(rand.NewPCG(60063, 2015))
	for _, s := range All() {
		for i := 0; i < 2000; i++ {
			ohm := math.Pow(10, -2+10*rng.Float64())
			d := int(math.Floor(math.Log10(ohm)))
			best, bestDist := 0.0, math.Inf(1)
			for _, lo := range []float64{math.Pow10(d - 1), math.Pow10(d), math.Pow10(d + 1)} {
				for _, m := range Values(s) {
					v := lo * m
					if dist := math.Abs(math.Log(v / ohm)); dist < bestDist {
						best, bestDist = v, dist
					}
				}
			}
			if got := Nearest(s, ohm); math.Abs(got-best) > 1e-9*best {
				t.Fatalf("Nearest(%s, %v) = %v, full search %v", s, ohm, got, best)
			}
			if up, down := NextUp(s, ohm), NextDown(s, ohm); !(down < ohm && ohm < up) && !Contains(s, ohm) {
				t.Fatalf("NextDown/NextUp(%s, %v) = %v, %v", s, ohm, down, up)
			}
		}
	}
}
