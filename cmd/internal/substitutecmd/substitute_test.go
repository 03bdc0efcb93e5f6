package substitutecmd

import (
	"bytes"
	"context"
	"encoding/json"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/store"
)

// The stock below is invented test data; the tests check the command's
// flags, errors and output shape, not the computation (picker/repair's
// tests hold that against ngspice).
func testStock(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "stock.db")
	ctx := context.Background()
	db, err := store.Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	for _, tr := range []store.Transistor{
		{Label: "TN-1", Polarity: "npn", HFEMin: 100, HFEMax: 300, VCEO_V: 40, ICMax_A: 0.2, PD25_W: 0.5, Qty: 5, Bin: "T1"},
		{Label: "TN-2", Polarity: "npn", HFEMin: 300, HFEMax: 800, VCEO_V: 30, ICMax_A: 0.1, PD25_W: 0.5, Qty: 2, Bin: "T2"},
		{Label: "TP-1", Polarity: "pnp", HFEMin: 100, HFEMax: 300, VCEO_V: 40, Qty: 5, Bin: "T3"},
	} {
		if _, err := db.AddTransistor(ctx, tr); err != nil {
			t.Fatal(err)
		}
	}
	for _, ohm := range []float64{10e3, 22e3, 47e3, 100e3, 220e3, 470e3} {
		if _, err := db.AddResistor(ctx, store.Resistor{Ohm: ohm, Tol: 0.01, Rated_W: 0.25, Qty: 10, Bin: "R"}); err != nil {
			t.Fatal(err)
		}
	}
	return path
}

func run(t *testing.T, db string, args ...string) (string, string, error) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut), DBPath: db, Getenv: func(string) string { return "" }}
	defer f.Close()
	err := cmdtest.Execute(New(f), args, &out, &errOut)
	return out.String(), errOut.String(), err
}

var stage = []string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "4K7", "--re", "1K"}

// TestFlagErrors: usage mistakes exit 2 naming the flag; readings the
// stage cannot give exit 1 naming the reading (the bad-input
// list); nothing is written to stdout either way.
func TestFlagErrors(t *testing.T) {
	db := testStock(t)
	for _, c := range []struct {
		name string
		args []string
		code int
		want string
	}{
		{"nothing known of the original", stage, 2, "--original LABEL"},
		{"two of three readings", append(append([]string{}, stage...), "--vb", "2V", "--ve", "1.4V"), 2, "--vc: missing"},
		{"meter without a floor", append(append([]string{}, stage...), "--vb", "2V", "--ve", "1.4V", "--vc", "5.5V", "--meter", "1%+0V"), 2, "--meter"},
		{"tolerance of zero", append(append([]string{}, stage...), "--hfe", "100..300", "--ic-tol", "0%"), 2, "--ic-tol"},
		{"VE above VB", append(append([]string{}, stage...), "--vb", "1.5V", "--ve", "1.9V", "--vc", "7V"), 1, "--ve: 1.9 V is above vb"},
		{"VC beyond the supply", append(append([]string{}, stage...), "--vb", "2.1V", "--ve", "1.45V", "--vc", "13.5V"), 1, "--vc: 13.5 V lies outside the supply rails"},
		{"IC from RE and RC disagree", append(append([]string{}, stage...), "--vb", "2.1V", "--ve", "1.45V", "--vc", "10V"), 1, "--ve and --vc: IC from the drop on RE"},
		{"unknown original label", append(append([]string{}, stage...), "--original", "NOPE"), 2, `--original: "NOPE" is not in stock`},
	} {
		out, _, err := run(t, db, c.args...)
		if got := cmdutil.ExitCode(err); got != c.code || err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: exit %d, error %v; want exit %d naming %q", c.name, got, err, c.code, c.want)
		}
		if out != "" {
			t.Errorf("%s: wrote to stdout:\n%s", c.name, out)
		}
	}
}

// TestJSONShape: the --json document carries the fields the issue lists,
// in SI units, with change null or {position, ohms, parts[]}.
func TestJSONShape(t *testing.T) {
	db := testStock(t)
	args := []string{"--topology", "collector-feedback", "--vcc", "12V", "--rf", "180K", "--rc", "4K7", "--hfe", "25..50", "--json"}
	out, errOut, err := run(t, db, args...)
	if err != nil {
		t.Fatalf("%v\n%s", err, errOut)
	}
	var doc struct {
		Original struct {
			IC_A   *float64 `json:"ic_a"`
			VCE_V  *float64 `json:"vce_v"`
			Source string   `json:"source"`
		} `json:"original"`
		Candidates []struct {
			Rank       int `json:"rank"`
			Transistor struct {
				ID    int64  `json:"id"`
				Label string `json:"label"`
				Bin   string `json:"bin"`
				Qty   int    `json:"qty"`
			} `json:"transistor"`
			Nominal map[string]float64 `json:"nominal"`
			Worst   map[string]any     `json:"worst"`
			ICShift *float64           `json:"ic_shift"`
			Change  *struct {
				Position string           `json:"position"`
				Ohms     float64          `json:"ohms"`
				Parts    []map[string]any `json:"parts"`
			} `json:"change"`
		} `json:"candidates"`
		Cautions []string `json:"cautions"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	if doc.Original.IC_A == nil || doc.Original.VCE_V == nil || doc.Original.Source != "ranges" {
		t.Errorf("original %+v: want ic_a, vce_v and source ranges", doc.Original)
	}
	if len(doc.Candidates) != 2 {
		t.Fatalf("%d candidates, want the two NPN lines", len(doc.Candidates))
	}
	changed := 0
	for _, c := range doc.Candidates {
		if c.Rank < 1 || c.Transistor.Label == "" || c.Transistor.Bin == "" || c.Transistor.Qty < 1 || c.ICShift == nil {
			t.Errorf("candidate %+v: missing rank, transistor or ic_shift", c)
		}
		for _, k := range []string{"ic_a", "vce_v"} {
			if _, ok := c.Nominal[k]; !ok {
				t.Errorf("candidate %d: nominal lacks %s", c.Rank, k)
			}
		}
		for _, k := range []string{"ic_min_a", "ic_max_a", "vce_min_v", "vce_max_v"} {
			if _, ok := c.Worst[k]; !ok {
				t.Errorf("candidate %d: worst lacks %s", c.Rank, k)
			}
		}
		if c.Change != nil {
			changed++
			if c.Change.Position == "" || c.Change.Ohms <= 0 || len(c.Change.Parts) == 0 {
				t.Errorf("candidate %d: change %+v lacks position, ohms or parts", c.Rank, c.Change)
			}
		}
	}
	if changed == 0 {
		t.Error("no change proposed though both stocked types are of a far higher gain class than hFE 25..50")
	}
	if len(doc.Cautions) == 0 || !strings.Contains(errOut, "local codes and licensed practice") {
		t.Errorf("cautions missing: json %v, stderr %q", doc.Cautions, errOut)
	}
}
