package report

import (
	"strings"

	"biasbin/solver"
)

// RatingList names unknown transistor ratings for a sentence, the verb
// included: "VCEO and power rating (PD or θJA) are".
func RatingList(rs []solver.Rating) string {
	names := make([]string, len(rs))
	for i, r := range rs {
		switch r {
		case solver.RatingVCEO:
			names[i] = "VCEO"
		case solver.RatingDissipation:
			names[i] = "power rating (PD or θJA)"
		case solver.RatingICMax:
			names[i] = "IC max"
		default:
			names[i] = r.String()
		}
	}
	switch len(names) {
	case 0:
		return ""
	case 1:
		return names[0] + " is"
	}
	return strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1] + " are"
}
