package report

import (
	"strings"
	"testing"

	"biasbin/picker"
	"biasbin/solver/safety"
)

// TestWords: the verdict leads with what breaks (a transistor past VCEO
// fails: VCEO is the breakdown voltage with the base open, common
// practice), a resistor over its rating says it will overheat and what
// rating to use, and one part to buy is "1 piece".
func TestWords(t *testing.T) {
	vceo := safety.Caution{Kind: safety.OverVCEO, Fails: true, VCE_V: 234, VCEO_V: 80}
	if got := Verdict(safety.VerdictOf([]safety.Caution{vceo})); got != "fails — VCE reaches 234 V, beyond VCEO 80 V" {
		t.Errorf("verdict %q", got)
	}
	// 0.405 W at 162 % of a ¼ W rating; a 0.81 W design limit needs 0.81 W.
	over := safety.Caution{Kind: safety.OverRating, Fails: true, Part: "rc", Power_W: 0.405, RatingUse: 1.62, NeedRated_W: 0.81, Ambient_C: 25}
	for _, w := range []string{"RC dissipates 405 mW, 162 % of its rating", "will overheat and can burn or fail open", "use one rated at least 810 mW"} {
		if got := Caution(over); !strings.Contains(got, w) {
			t.Errorf("%q lacks %q", got, w)
		}
	}
	if got := Verdict(safety.Verdict{Cautions: 1}); got != "passes, with 1 caution" {
		t.Errorf("verdict %q", got)
	}
	if got := Purchase(picker.Purchase{Slot: "re", Ohm: 1000, Series: "E24", Tol: 0.05, Rated_W: 0.25, Qty: 1}); !strings.HasSuffix(got, ", 1 piece") {
		t.Errorf("purchase %q", got)
	}
	// A top-up of an approved line names the line and what it holds.
	if got := Purchase(picker.Purchase{Slot: "re", Ohm: 4700, Tol: 0.01, Rated_W: 0.25, Qty: 7, Line: 3, Bin: "A3", OnHand: 3}); got != "RE: 4K7 as line #3 (bin A3, ±1 %, 0.25 W), 7 pieces more (it holds 3)" {
		t.Errorf("top-up %q", got)
	}
	if got := Reason(picker.Reason{Kind: picker.NoApprovedPurchase, Tags: []string{"approved"}, Boards: 10}); !strings.HasPrefix(got, "nothing on the approved list (parts tagged approved) would do") {
		t.Errorf("reason %q", got)
	}
	if got := Reason(picker.Reason{Kind: picker.KeptStay, Kept: []picker.KeptPart{{Position: "r1", Ohm: 47e3}, {Position: "re", Ohm: 1e3}}}); !strings.HasPrefix(got, "the kept parts (R1 47K, RE 1K0) stay as they are") {
		t.Errorf("reason %q", got)
	}
	if got := Pieces(4); got != "4 pieces" {
		t.Errorf("%q", got)
	}
}
