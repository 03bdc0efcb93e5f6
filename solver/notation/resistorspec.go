package notation

import (
	"fmt"
	"strings"
)

// ResistorText is a resistor as a technician writes it on one flag: its
// value, and after slashes its tolerance and its power rating, in any
// order: "6K8", "6K8/10%/1W", "4K7F/0.5W", "10k/1W/1%".
type ResistorText struct {
	Ohm      float64
	Tol      float64 // fraction; valid when HasTol
	HasTol   bool
	Rated_W  float64 // valid when HasPower
	HasPower bool
}

// ParseResistorText reads a ResistorText. The value follows
// ParseResistance (a tolerance letter after the code counts); each part
// after a slash ending in W is the power rating, any other is the
// tolerance (5%, ±1 %, J). A tolerance given twice, or a power given
// twice, is an error.
func ParseResistorText(s string) (ResistorText, error) {
	parts := strings.Split(s, "/")
	var r ResistorText
	var err error
	if r.Ohm, r.Tol, r.HasTol, err = ParseResistance(strings.TrimSpace(parts[0])); err != nil {
		return r, err
	}
	for _, p := range parts[1:] {
		p = strings.TrimSpace(p)
		switch {
		case p == "":
			return r, fmt.Errorf("%q: an empty part after a slash (want VALUE/TOLERANCE/POWER, like 6K8/10%%/1W)", s)
		case strings.HasSuffix(strings.ToUpper(p), "W"):
			if r.HasPower {
				return r, fmt.Errorf("%q: two power ratings", s)
			}
			if r.Rated_W, err = ParsePower(p); err != nil {
				return r, err
			}
			r.HasPower = true
		default:
			if r.HasTol {
				return r, fmt.Errorf("%q: two tolerances", s)
			}
			if r.Tol, err = ParseTolerance(p); err != nil {
				return r, err
			}
			r.HasTol = true
		}
	}
	return r, nil
}
