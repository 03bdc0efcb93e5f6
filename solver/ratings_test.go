package solver

import (
	"slices"
	"testing"
)

// TestUnknownRatings checks which unstated ratings matter. Sources: a
// stage that cuts off puts the whole supply across the collector-emitter
// junction, so VCEO always matters (common practice); every conducting
// part dissipates VCE·IC (REFERENCE.md §8); the lowest IC max of the
// usual small-signal types is 100 mA (from memory), kept within 50 %
// (common practice).
func TestUnknownRatings(t *testing.T) {
	rated := Datasheet{Polarity: NPN, HFEMin: 100, HFEMax: 300, VCEO_V: 40, PD25_W: 0.5, ICMax_A: 0.2}
	tests := []struct {
		name string
		d    Datasheet
		ic_A float64
		want []Rating
	}{
		{"fully rated", rated, 0.1, nil},
		{"a pull with nothing stated, 30 mA", Datasheet{Polarity: NPN, HFEMin: 100, HFEMax: 300}, 0.03, []Rating{RatingVCEO, RatingDissipation}},
		{"a pull with nothing stated, 80 mA", Datasheet{Polarity: NPN, HFEMin: 100, HFEMax: 300}, 0.08, []Rating{RatingVCEO, RatingDissipation, RatingICMax}},
		{"θJA alone rates the power", Datasheet{VCEO_V: 40, ThetaJA_KPerW: 200}, 0.01, nil},
		{"no VCEO", Datasheet{PD25_W: 0.5}, 0.001, []Rating{RatingVCEO}},
	}
	for _, tt := range tests {
		if got := UnknownRatings(tt.d, tt.ic_A); !slices.Equal(got, tt.want) {
			t.Errorf("%s: %v, want %v", tt.name, got, tt.want)
		}
	}
}
