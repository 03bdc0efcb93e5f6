package checkcmd

import (
	"bytes"
	"encoding/json"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
)

// run executes `biasbin check args...` with buffer streams and returns
// stdout, stderr and the exit code.
func run(t *testing.T, args []string) (string, string, int) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut)}
	err := cmdtest.Execute(New(f), args, &out, &errOut)
	if err != nil && err != cmdutil.ErrSilent {
		errOut.WriteString("biasbin: " + err.Error() + "\n")
	}
	return out.String(), errOut.String(), cmdutil.ExitCode(err)
}

// golden compares got with testdata/name, or rewrites it under -update.
func golden(t *testing.T, name, got string) {
	t.Helper()
	cmdtest.Golden(t, filepath.Join("testdata", name), got)
}

// roundJSON rewrites every number of a JSON document to 6 significant
// digits, so golden files do not hang on the last bits of a float.
func roundJSON(t *testing.T, doc string) string {
	t.Helper()
	var v any
	if err := json.Unmarshal([]byte(doc), &v); err != nil {
		t.Fatalf("output is not JSON: %v", err)
	}
	var walk func(any) any
	walk = func(x any) any {
		switch x := x.(type) {
		case map[string]any:
			for k, e := range x {
				x[k] = walk(e)
			}
		case []any:
			for i, e := range x {
				x[i] = walk(e)
			}
		case float64:
			r, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'g', 6, 64), 64)
			return r
		}
		return x
	}
	out, err := json.MarshalIndent(walk(v), "", "  ")
	if err != nil {
		t.Fatal(err)
	}
	return string(out) + "\n"
}

func TestBehaviour(t *testing.T) {
	tests := []struct {
		name     string
		args     []string
		code     int
		json     bool
		stderrIn string // a substring stderr must hold ("" = stderr empty)
	}{
		{"divider_text", args("--theta-ja", "200", "--sim-boards", "2000"), 0, false, ""},
		{"saturated_json", []string{"--vcc", "15V", "--r1", "10K", "--r2", "5K", "--rc", "3K3", "--re", "1K", "--hfe", "100..300",
			"--theta-ja", "200", "--sim-boards", "500", "--json"}, 1, true, "the build fails: 256 of 256 worst-case corners"},
		{"pnp_split_spice", []string{"--topology", "split-supply", "--polarity", "pnp", "--vcc", "15V", "--vee", "15V",
			"--rb", "10K", "--rc", "10K", "--re", "20K", "--hfe", "100..300", "--spice", "--sim-boards", "100"}, 0, false, "caution: the transistor's VCEO and power rating"},
		{"pnp_positive_spice", []string{"--polarity", "pnp", "--vcc", "5V", "--r1", "1K", "--r2", "470R", "--rc", "1K5", "--re", "1K",
			"--hfe", "100..300", "--spice", "--sim-boards", "100"}, 0, false, "caution: the transistor's VCEO and power rating"},
		{"pnp_negative_json", []string{"--polarity", "pnp", "--vcc", "5V", "--rail", "negative", "--r1", "1K", "--r2", "470R", "--rc", "1K5", "--re", "1K",
			"--hfe", "100..300", "--sim-boards", "100", "--json"}, 0, true, "caution: the transistor's VCEO and power rating"},
		{"feedback_text", []string{"--topology", "collector-feedback", "--vcc", "10V", "--rf", "250K", "--rc", "4K7", "--re", "1K2",
			"--hfe", "90..135", "--bypass", "--load", "10K", "--ambient", "-10..60", "--sim-boards", "1000"}, 0, false, ""},
		{"hot_text", []string{"--vcc", "60V", "--r1", "470K", "--r2", "47K", "--rc", "22K", "--re", "4K7", "--hfe", "100..300",
			"--pd", "625mW", "--sim-boards", "500"}, 0, false, ""},
		{"runaway_text", []string{"--vcc", "60V", "--r1", "47K", "--r2", "5K6", "--rc", "1K", "--re", "470R", "--hfe", "100..300",
			"--pd", "625mW", "--sim-boards", "500"}, 1, false, "thermal runaway"},
		{"vceo_text", []string{"--vcc", "40V", "--r1", "470K", "--r2", "47K", "--rc", "22K", "--re", "4K7", "--hfe", "100..300",
			"--vceo", "30V", "--ic-max", "1mA", "--sim-boards", "200"}, 0, false, ""},
		{"vceo_fails_text", []string{"--vcc", "250V", "--r1", "2M2", "--r2", "100K", "--rc", "100K", "--re", "10K", "--hfe", "100..300",
			"--vceo", "80V", "--pd", "625mW", "--ic-max", "100mA", "--sim-boards", "200"}, 1, false, "the build fails: VCE reaches"},
		{"bad_flag", args("--r1", "4K7X9"), 2, false, "--r1"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out, errOut, code := run(t, tt.args)
			if code != tt.code {
				t.Fatalf("exit code %d, want %d; stderr:\n%s", code, tt.code, errOut)
			}
			if tt.stderrIn == "" && errOut != "" {
				t.Errorf("unexpected stderr:\n%s", errOut)
			}
			if tt.stderrIn != "" && !strings.Contains(errOut, tt.stderrIn) {
				t.Errorf("stderr does not mention %q:\n%s", tt.stderrIn, errOut)
			}
			if tt.json {
				out = roundJSON(t, out)
			}
			golden(t, tt.name+".stdout", out)
		})
	}
}

func TestJSONFields(t *testing.T) {
	// The fields issue 3 names, in SI base units.
	out, errOut, code := run(t, []string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--hfe", "100..300",
		"--load", "10K", "--bypass", "--sim-boards", "200", "--json"})
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var doc map[string]any
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	need := map[string][]string{
		"nominal":     {"ic_a", "ib_a", "ie_a", "vce_v", "vbe_v", "vb_v", "ve_v", "vc_v", "beta", "tj_c"},
		"model":       {"is_a", "bf", "br", "nf", "vaf_v", "xti", "xtb", "eg_ev", "tnom_c"},
		"worst":       {"ic_min_a", "ic_max_a", "vce_min_v", "vce_max_v", "all_active"},
		"swing":       {"rac_ohms", "v_peak_v", "clips_first", "optimum_ic_a"},
		"yield":       {"value", "low95", "high95", "boards", "passed", "method", "definition", "seed", "window", "inputs", "ambient_min_c", "ambient_max_c"},
		"dissipation": {"nominal", "worst"},
	}
	for obj, keys := range need {
		m, ok := doc[obj].(map[string]any)
		if !ok {
			t.Fatalf("%s missing or not an object", obj)
		}
		for _, k := range keys {
			if _, ok := m[k]; !ok {
				t.Errorf("%s.%s missing", obj, k)
			}
		}
	}
	if doc["region"] != "active" {
		t.Errorf("region %v, want active", doc["region"])
	}
	res := doc["resistors"].(map[string]any)
	for _, name := range []string{"r1", "r2", "rc", "re"} {
		r, ok := res[name].(map[string]any)
		if !ok {
			t.Fatalf("resistors.%s missing", name)
		}
		for _, k := range []string{"ohms", "effective_ohms", "power_w", "utilization"} {
			if _, ok := r[k]; !ok {
				t.Errorf("resistors.%s.%s missing", name, k)
			}
		}
	}
	corners := doc["corners"].([]any)
	// 4 resistors, supply, hFE, VBE(on), ambient: 2^8 (REFERENCE.md §9).
	if len(corners) != 256 {
		t.Fatalf("%d corners, want 256", len(corners))
	}
	c := corners[0].(map[string]any)
	for _, k := range []string{"bf", "vbe_on_v", "is_a", "vaf_v", "temp_c", "tj_c", "vcc_v", "ohms", "ic_a", "vce_v", "region"} {
		if _, ok := c[k]; !ok {
			t.Errorf("corners[0].%s missing", k)
		}
	}
	if _, ok := doc["spice"]; ok {
		t.Errorf("spice netlist in the JSON without --spice")
	}
	// beta is IC/IB at the nominal point.
	n := doc["nominal"].(map[string]any)
	if b := n["ic_a"].(float64) / n["ib_a"].(float64); math.Abs(b-n["beta"].(float64)) > 1e-9*b {
		t.Errorf("nominal beta %v, want IC/IB = %g", n["beta"], b)
	}
}

func TestSpiceWithJSON(t *testing.T) {
	out, errOut, code := run(t, args("--json", "--spice", "--sim-boards", "50"))
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var doc struct {
		Spice string `json:"spice"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"q1 c b e qdut", ".model qdut npn", "r1 vcc b 10000", ".end"} {
		if !strings.Contains(doc.Spice, want) {
			t.Errorf("spice netlist lacks %q:\n%s", want, doc.Spice)
		}
	}
}

// TestPNPPositiveJSON: a PNP stage on a positive supply (the default)
// says so in the JSON, gives the supply and every node voltage as a meter
// shows them against 0 V (the collector-side rail: all positive, the
// emitter above the base above the collector) and names what each
// resistor joins (common practice: RE and R2 from +V, RC and R1 to 0 V).
func TestPNPPositiveJSON(t *testing.T) {
	out, errOut, code := run(t, []string{"--polarity", "pnp", "--vcc", "5V", "--r1", "1K", "--r2", "470R", "--rc", "1K5", "--re", "1K",
		"--hfe", "100..300", "--sim-boards", "100", "--json"})
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var doc struct {
		VCC_V      float64 `json:"vcc_v"`
		Rail       string  `json:"rail"`
		Ground     string  `json:"ground"`
		TestPoints map[string]struct {
			Nominal_V, Min_V, Max_V float64
		} `json:"test_points"`
		Resistors map[string]struct {
			Joins [2]string `json:"joins"`
		} `json:"resistors"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.VCC_V != 5 || doc.Rail != "positive" || doc.Ground != "collector-rail" {
		t.Errorf("vcc_v %g rail %q ground %q; want 5, positive, collector-rail", doc.VCC_V, doc.Rail, doc.Ground)
	}
	vb, ve, vc := doc.TestPoints["vb"], doc.TestPoints["ve"], doc.TestPoints["vc"]
	if !(ve.Nominal_V > vb.Nominal_V && vb.Nominal_V > vc.Nominal_V && vc.Min_V > 0 && ve.Max_V < 5.25) {
		t.Errorf("test points VE %+v VB %+v VC %+v: want 0 < VC < VB < VE below the supply", ve, vb, vc)
	}
	want := map[string][2]string{"r1": {"base", "0v"}, "r2": {"+v", "base"}, "rc": {"collector", "0v"}, "re": {"+v", "emitter"}}
	for slot, w := range want {
		if got := doc.Resistors[slot].Joins; got != w {
			t.Errorf("%s joins %v, want %v", slot, got, w)
		}
	}
}
