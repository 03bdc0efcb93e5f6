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
// a run the stock cannot supply with what to buy, and the repair bench (a
// substitution with a resistor change, a diagnosis, the bench cautions).
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
		"=== Pick 1:", "=== Pick 2:", "=== Pick 3:", "=== Pick 4:", "=== Pick 5:", "=== Pick 6:", "=== Pick 8:", "hot enough to burn a finger",
		"--topology collector-feedback", "NPN collector-feedback stage", "    RF  ",
		"--topology split-supply", "NPN split-supply stage on 12 V ±5 % (11.4 V..12.6 V) and VEE -12 V ±5 % (-12.6 V..-11.4 V)", "    RB  ",
		"NPN stage of any topology", "why #1 (",
		"$ biasbin pick --vcc 12V --ic 2mA",
		"Pull list for #1",
		"measure   VB",
		"nothing fits this request", "parts to buy", "(pick exits with status 1 here",
		"kept at " + keep,
		"=== Build:", "parts taken out of stock", ": pass\n", "OUT OF BAND", "most likely: RC shorted",
		"$ biasbin ledger --build 1",
		"=== Repair 1:", "$ biasbin substitute", "the one resistor change", "=== Repair 2:", "$ biasbin diagnose",
		"Explained: Q base-emitter junction open", "follow local codes and licensed practice",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q", want)
		}
	}
	// A pair appears in pick 2's builds, shown as VALUE+VALUE (series) or
	// VALUE‖VALUE (parallel), then what it joins, then its arrangement.
	pick2 := section(out, "=== Pick 2:", "=== Pick 3:")
	if !regexp.MustCompile(`\s[0-9R]+[RKM][0-9]*(\+|‖)[0-9R]+[RKM][0-9]*\s+\S.*\s(series|parallel)\s`).MatchString(pick2) {
		t.Errorf("pick 2 shows no pair:\n%s", pick2)
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
	// It holds the demo build with two boards recorded, one out of band,
	// and its ledger adds up.
	b, err := db.Build(context.Background(), 1)
	if err != nil || b.State != store.BuildOpen || len(b.Readings) != 2 || b.Readings[0].Verdict != "pass" ||
		b.Readings[1].Verdict != "out-of-band" {
		t.Errorf("demo build: %+v %v", b, err)
	}
	if ps, err := db.Verify(context.Background()); err != nil || len(ps) > 0 {
		t.Errorf("verify the kept demo stock: %v %v", ps, err)
	}
}
