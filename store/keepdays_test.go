package store

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestPickKeepStated: the words that state how long a pick's builds are
// kept read the one constant: the help texts build it in, and the README,
// which cannot, is held to it here.
func TestPickKeepStated(t *testing.T) {
	if PickKeep.Hours() != float64(24*PickKeepDays) {
		t.Fatalf("PickKeep %v is not %d days", PickKeep, PickKeepDays)
	}
	b, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	text := strings.Join(strings.Fields(string(b)), " ")
	if want := "stock file for " + strconv.Itoa(PickKeepDays) + " days"; !strings.Contains(text, want) {
		t.Errorf("README.md does not say %q", want)
	}
}
