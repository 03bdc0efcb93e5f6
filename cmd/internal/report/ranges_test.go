package report

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestREADMEHasTheRangesTable: the README's table of accepted ranges is
// the one the program enforces, row for row (regenerate it from
// RangesMarkdown when a range changes).
func TestREADMEHasTheRangesTable(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	table := RangesMarkdown(AllRanges())
	if !strings.Contains(string(b), table) {
		t.Errorf("README.md lacks the accepted-ranges table; it should read:\n%s", table)
	}
	if n := strings.Count(table, "\n"); n != len(AllRanges())+2 {
		t.Errorf("table has %d lines for %d ranges", n, len(AllRanges()))
	}
}
