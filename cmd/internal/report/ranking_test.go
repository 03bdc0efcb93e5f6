package report

import (
	"strings"
	"testing"
	"time"

	"biasbin/picker"
)

// TestRankingNote: each state of a pick's ranking reads as what it is; a
// search stopped at its time limit never reads as proven, and names the
// limit and the way to search to the end.
func TestRankingNote(t *testing.T) {
	tests := []struct {
		r       picker.Ranking
		want    []string
		notWant string
	}{
		{picker.Ranking{Proven: true, Ranked: 15, Rounds: 1}, []string{"proven", "15 builds"}, "stopped"},
		{picker.Ranking{Ranked: 1}, []string{"proven among the 1 build", "--settle"}, "stopped"},
		{picker.Ranking{Stopped: true, TimeLimit: 30 * time.Second, Ranked: 15}, []string{"stopped at its 30 s time limit", "not proven the best", "--time-limit 0"}, "proven:"},
		{picker.Ranking{Stopped: true, TimeLimit: 1500 * time.Millisecond}, []string{"1.5 s"}, "proven:"},
	}
	for _, tt := range tests {
		got := RankingNote(tt.r)
		for _, w := range tt.want {
			if !strings.Contains(got, w) {
				t.Errorf("%+v: %q lacks %q", tt.r, got, w)
			}
		}
		if strings.Contains(got, tt.notWant) {
			t.Errorf("%+v: %q says %q", tt.r, got, tt.notWant)
		}
	}
}
