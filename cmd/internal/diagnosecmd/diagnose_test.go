package diagnosecmd

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
)

func run(t *testing.T, args ...string) (string, string, error) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut), DBPath: "/nonexistent/stock.db", Getenv: func(string) string { return "" }}
	defer f.Close()
	err := cmdtest.Execute(New(f), args, &out, &errOut)
	return out.String(), errOut.String(), err
}

// The stage and transistor are invented test data; the readings are those
// of REFERENCE.md §22's [D] table for an open emitter junction pattern
// (base at the unloaded divider, emitter at 0 V, collector at the rail),
// here for this stage: 12·10/57 V at the base.
var stage = []string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "4K7", "--re", "1K", "--hfe", "110..330"}

func with(extra ...string) []string { return append(append([]string{}, stage...), extra...) }

// TestFlagErrors: usage mistakes exit 2 naming the flag; a reading outside
// the rails exits 1 naming the reading; stdout stays empty.
func TestFlagErrors(t *testing.T) {
	for _, c := range []struct {
		name string
		args []string
		code int
		want string
	}{
		{"no readings", stage, 2, "--vb: missing"},
		{"no transistor", []string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "4K7", "--vb", "1V", "--ve", "0.4V", "--vc", "6V"}, 2, "--hfe: missing"},
		{"collector beyond the supply", with("--vb", "2.1V", "--ve", "1.45V", "--vc", "12.5V"), 1, "--vc: 12.5 V lies outside the supply rails"},
		{"base below ground", with("--vb", "-1V", "--ve", "0V", "--vc", "12V"), 1, "--vb: -1 V lies outside"},
		{"spread too wide", with("--vb", "2.1V", "--ve", "0V", "--vc", "12V", "--vbe-spread", "0.5V"), 2, "--vbe-spread"},
	} {
		out, _, err := run(t, c.args...)
		if got := cmdutil.ExitCode(err); got != c.code || err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: exit %d, error %v; want exit %d naming %q", c.name, got, err, c.code, c.want)
		}
		if out != "" {
			t.Errorf("%s: wrote to stdout:\n%s", c.name, out)
		}
	}
}

// TestJSONShape: faults[].{rank,position,kind,ohms,fit,predicted.{vb_v,
// ve_v,vc_v}}, explained and next_measurement as the issue lists; the
// open-emitter-junction pattern ranks be-open first (REFERENCE.md §22:
// emitter at 0 V, collector at the rail, base at the divider).
func TestJSONShape(t *testing.T) {
	out, errOut, err := run(t, with("--vb", "2.10V", "--ve", "0V", "--vc", "12.0V", "--json")...)
	if err != nil {
		t.Fatalf("%v\n%s", err, errOut)
	}
	var doc struct {
		Faults []struct {
			Rank      *int                `json:"rank"`
			Position  string              `json:"position"`
			Kind      string              `json:"kind"`
			Ohms      *float64            `json:"ohms"`
			Fit       *float64            `json:"fit"`
			Predicted map[string]*float64 `json:"predicted"`
		} `json:"faults"`
		Explained *bool          `json:"explained"`
		Next      map[string]any `json:"next_measurement"`
		Cautions  []string       `json:"cautions"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	if len(doc.Faults) < 2 || doc.Explained == nil || doc.Next == nil {
		t.Fatalf("document lacks faults, explained or next_measurement:\n%s", out)
	}
	kinds := map[string]bool{"open": true, "short": true, "drift": true, "be-open": true, "be-short": true, "bc-open": true, "bc-short": true, "ce-short": true, "leak": true, "low-hfe": true}
	positions := map[string]bool{"r1": true, "r2": true, "rc": true, "re": true, "q": true}
	for _, f := range doc.Faults {
		if f.Rank == nil || f.Fit == nil || !kinds[f.Kind] || !positions[f.Position] {
			t.Errorf("fault %+v: bad rank, fit, kind or position", f)
		}
		for _, k := range []string{"vb_v", "ve_v", "vc_v"} {
			if f.Predicted[k] == nil {
				t.Errorf("fault %s %s: predicted lacks %s", f.Position, f.Kind, k)
			}
		}
		if (f.Kind == "drift") != (f.Ohms != nil && f.Kind != "short") && f.Kind != "short" {
			t.Errorf("fault %s %s: ohms %v (set for drift only, and short)", f.Position, f.Kind, f.Ohms)
		}
	}
	if top := doc.Faults[0]; top.Position != "q" || top.Kind != "be-open" || !*doc.Explained {
		t.Errorf("first %s %s, explained %v; want q be-open, explained", top.Position, top.Kind, *doc.Explained)
	}
	if doc.Next["check"] != "diode-be" {
		t.Errorf("next %v, want the base-emitter diode test", doc.Next)
	}
	if len(doc.Cautions) == 0 || !strings.Contains(errOut, "mains") {
		t.Errorf("cautions missing: json %v, stderr %q", doc.Cautions, errOut)
	}
}

// TestPNPOnAPositiveSupply: the same stage built with a PNP on a positive
// supply (the default), read as the meter shows it from 0 V on the
// collector side. REFERENCE.md §22's open-emitter-junction pattern,
// mirrored: no current in RE, so the emitter sits at +V (12 V); no
// collector current, so the collector sits at 0 V; the base at the
// unloaded divider, 12·47/57 V (R2 from +V to the base, R1 from the base
// to 0 V). The JSON says what the readings are measured against.
func TestPNPOnAPositiveSupply(t *testing.T) {
	out, errOut, err := run(t, with("--polarity", "pnp", "--vb", "9.89V", "--ve", "12.0V", "--vc", "0V", "--json")...)
	if err != nil {
		t.Fatalf("%v\n%s", err, errOut)
	}
	var doc struct {
		Rail   string `json:"rail"`
		Ground string `json:"ground"`
		Faults []struct {
			Position string `json:"position"`
			Kind     string `json:"kind"`
		} `json:"faults"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	if doc.Rail != "positive" || doc.Ground != "collector-rail" {
		t.Errorf("rail %q ground %q, want positive, collector-rail", doc.Rail, doc.Ground)
	}
	if len(doc.Faults) == 0 || doc.Faults[0].Position != "q" || doc.Faults[0].Kind != "be-open" {
		t.Errorf("faults %+v, want q be-open first", doc.Faults)
	}
	// The same readings on a stage with its emitter side on 0 V lie
	// outside its rails (-12..0 V): exit 1 naming the reading.
	_, _, err = run(t, with("--polarity", "pnp", "--rail", "negative", "--vb", "9.89V", "--ve", "12.0V", "--vc", "0V")...)
	if cmdutil.ExitCode(err) != 1 || err == nil || !strings.Contains(err.Error(), "--vb: 9.89 V lies outside the supply rails -12..0 V") ||
		!strings.Contains(err.Error(), "--rail positive") {
		t.Errorf("readings of a positive-supply stage on --rail negative: %v, want exit 1 naming --vb outside -12..0 V and --rail positive", err)
	}
	// Readings from a stage with its emitter side on 0 V (all negative),
	// given without --rail: they fit the negative rail.
	_, _, err = run(t, with("--polarity", "pnp", "--vb", "-2.11V", "--ve", "0V", "--vc", "-12V")...)
	if cmdutil.ExitCode(err) != 1 || err == nil || !strings.Contains(err.Error(), "--rail negative") {
		t.Errorf("negative readings on the default positive supply: %v, want exit 1 suggesting --rail negative", err)
	}
	// An NPN stage read upside down gets no rail advice.
	_, _, err = run(t, with("--vb", "-2.11V", "--ve", "0V", "--vc", "-12V")...)
	if err == nil || strings.Contains(err.Error(), "--rail") {
		t.Errorf("npn with negative readings: %v, want an error without rail advice", err)
	}
}
