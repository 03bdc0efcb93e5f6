package eseries

import (
	"fmt"
	"strconv"
	"strings"
)

// Series is one IEC 60063 preferred-number series. Its integer value is the
// number of values per decade (E12 == 12).
type Series int

// The seven series of IEC 60063:2015.
const (
	E3   Series = 3
	E6   Series = 6
	E12  Series = 12
	E24  Series = 24
	E48  Series = 48
	E96  Series = 96
	E192 Series = 192
)

// All returns the seven series from the coarsest (E3) to the finest (E192).
// The slice is new on every call.
func All() []Series {
	return []Series{E3, E6, E12, E24, E48, E96, E192}
}

// Valid reports whether s is one of the seven defined series.
func (s Series) Valid() bool {
	switch s {
	case E3, E6, E12, E24, E48, E96, E192:
		return true
	}
	return false
}

// String returns the series name, e.g. "E12". An invalid series is written
// as "E?(7)".
func (s Series) String() string {
	if !s.Valid() {
		return "E?(" + strconv.Itoa(int(s)) + ")"
	}
	return "E" + strconv.Itoa(int(s))
}

// ParseSeries reads a series name: "E12", "e12" or "12" (surrounding space
// ignored).
func ParseSeries(name string) (Series, error) {
	t := strings.TrimSpace(name)
	t = strings.TrimPrefix(strings.TrimPrefix(t, "E"), "e")
	n, err := strconv.Atoi(t)
	if err != nil || !Series(n).Valid() || strings.HasPrefix(t, "+") || strings.HasPrefix(t, "0") {
		return 0, fmt.Errorf("series %q: unknown E series (want E3, E6, E12, E24, E48, E96 or E192)", name)
	}
	return Series(n), nil
}

// mustValid panics on an invalid series (a programmer error).
func (s Series) mustValid() {
	if !s.Valid() {
		panic("eseries: invalid series " + s.String())
	}
}
