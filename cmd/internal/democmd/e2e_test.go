package democmd

import (
	"context"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"biasbin/store"
)

// TestDemoEndToEnd runs the whole demo on the real store and picker and
// checks that it shows the job: three picks, a build with a series pair,
// and a run the stock cannot supply with what to buy.
func TestDemoEndToEnd(t *testing.T) {
	keep := filepath.Join(t.TempDir(), "demo.db")
	out, errOut, err := runDemo(t, "--keep", keep)
	if err != nil {
		t.Fatalf("demo failed: %v\n%s%s", err, out, errOut)
	}
	if errOut != "" {
		t.Errorf("demo wrote to stderr: %q", errOut)
	}
	for _, want := range []string{
		"Stocked 80 resistor lines and 6 transistor lines",
		"=== Pick 1:", "=== Pick 2:", "=== Pick 3:",
		"$ biasbin pick --vcc 12V --ic 2mA",
		"Pull list for #1",
		"measure   VB",
		"nothing fits this request", "parts to buy", "(pick exits with status 1 here",
		"kept at " + keep,
	} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q", want)
		}
	}
	// A series pair appears in pick 2's builds, shown as VALUE+VALUE.
	pick2 := section(out, "=== Pick 2:", "=== Pick 3:")
	if !regexp.MustCompile(`\s[0-9R]+[RKM][0-9]*\+[0-9R]+[RKM][0-9]*\s+series`).MatchString(pick2) {
		t.Errorf("pick 2 shows no series pair:\n%s", pick2)
	}
	if t.Failed() {
		t.Logf("demo output:\n%s", out)
	}
	// --keep left a stock file that opens and holds the wall.
	db, err := store.Open(context.Background(), keep)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	ts, err := db.ListTransistors(context.Background(), store.Filter{})
	if err != nil || len(ts) != 6 {
		t.Errorf("kept stock: %d transistor lines, err %v", len(ts), err)
	}
}
