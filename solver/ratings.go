package solver

import "fmt"

// Rating names a datasheet limit the analyses hold a transistor to.
type Rating int

const (
	// RatingVCEO is the collector-emitter breakdown voltage with the base
	// open: a stage that cuts off puts the whole supply across it.
	RatingVCEO Rating = iota + 1
	// RatingDissipation is the power rating: PD at 25 °C or θJA.
	RatingDissipation
	// RatingICMax is the collector current limit.
	RatingICMax
)

// String returns the rating's name as used in JSON output ("vceo",
// "dissipation", "ic_max").
func (r Rating) String() string {
	switch r {
	case RatingVCEO:
		return "vceo"
	case RatingDissipation:
		return "dissipation"
	case RatingICMax:
		return "ic_max"
	}
	return fmt.Sprintf("Rating(%d)", int(r))
}

// MarshalText writes the rating's name.
func (r Rating) MarshalText() ([]byte, error) { return []byte(r.String()), nil }

// UnratedICMaxMatters_A is the collector current above which an unknown
// IC max matters: the lowest IC max of the usual small-signal types is
// 100 mA (from memory), and a design keeps IC within half of it (the
// picker's current derating, common practice). Below it every stocked
// bipolar part can be taken to carry the current.
const UnratedICMaxMatters_A = 0.05

// UnknownRatings lists the ratings d does not state that matter for a
// stage drawing ic_A: VCEO always (a stage that cuts off puts the supply
// across the part), the dissipation always (every active part heats), IC
// max above UnratedICMaxMatters_A. Without them no analysis can say the
// part survives, so a build on such a part is not to be called safe.
func UnknownRatings(d Datasheet, ic_A float64) []Rating {
	var out []Rating
	if !(d.VCEO_V > 0) {
		out = append(out, RatingVCEO)
	}
	if !(d.PD25_W > 0) && !(d.ThetaJA_KPerW > 0) {
		out = append(out, RatingDissipation)
	}
	if !(d.ICMax_A > 0) && ic_A > UnratedICMaxMatters_A {
		out = append(out, RatingICMax)
	}
	return out
}
