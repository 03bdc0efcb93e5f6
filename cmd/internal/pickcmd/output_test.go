package pickcmd

import (
	"bytes"
	"encoding/json"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
)

// golden compares got with testdata/name, or rewrites it with -update.
func golden(t *testing.T, name, got string) {
	t.Helper()
	cmdtest.Golden(t, filepath.Join("testdata", name), got)
}

// render writes v as the command would: data on one stream, notes on the other.
func render(v *job.PickOutcome, asJSON bool) (stdout, stderr string) {
	var out, errOut bytes.Buffer
	if asJSON {
		if err := writeJSON(&out, v); err != nil {
			panic(err)
		}
	} else {
		WriteText(&out, v, Style{})
	}
	WriteNotes(&errOut, v)
	return out.String(), errOut.String()
}

func TestOutputGolden(t *testing.T) {
	hot := fakeRequest()
	hot.VCC_V = 60
	hotCand := fakeCandidate(1)
	hotCand.MaxUtilization = 0.9
	hotCand.Build.VCC_V = 60
	hotCand.Worst.Dissipation.Resistor[solver.RC] = solver.PartLoad{Power_W: 0.1125, Allowed_W: 0.125, Utilization: 0.9, Rated: true}
	// the second build stands for two near-duplicates folded into it
	folded := fakeCandidate(2)
	folded.Folded = 2
	tests := []struct {
		name string
		v    *job.PickOutcome
		json bool
	}{
		{"table", outcome(fakeRequest(), picker.Result{
			Candidates: []picker.Candidate{fakeCandidate(1), folded}, Evaluated: 321, Considered: 12345,
			Ranking: picker.Ranking{Ranked: 75, Rounds: 2}}, 0, picker.Result{}), false},
		{"json", outcome(fakeRequest(), picker.Result{
			Candidates: []picker.Candidate{fakeCandidate(1)}, Evaluated: 321, Considered: 12345,
			Ranking: picker.Ranking{Proven: true, Ranked: 4, Rounds: 1}}, 0, picker.Result{}), true},
		{"nothing_fits", outcome(fakeRequest(), picker.Result{
			Candidates: []picker.Candidate{fakeCandidate(1, picker.Failure{Kind: picker.FailAllowance, Part: "r2", Utilization: 1.12})},
			Evaluated:  12, Considered: 400, Ranking: picker.Ranking{Proven: true, Ranked: 1, Rounds: 1},
			Shortfall: &picker.Shortfall{
				Reasons:   []picker.Reason{{Kind: picker.NearestFail, Limit: picker.FailAllowance, Count: 1, Of: 1}},
				Purchases: []picker.Purchase{{Slot: "r2", Ohm: 4.7e3, Series: "E24", Tol: 0.05, Rated_W: 0.5, Qty: 4}},
			}}, 0, picker.Result{}), false},
		{"short_run", outcome(fakeRequest(),
			picker.Result{Shortfall: &picker.Shortfall{Rejected: []picker.Rejection{{Kind: picker.RejectQty,
				Line: picker.Transistor{ID: 10, Bin: "D1", Qty: 3, Sheet: solver.Datasheet{Label: "QN-104A"}}, Qty: 3, Boards: 4}}}},
			3, picker.Result{Candidates: []picker.Candidate{fakeCandidate(1)}, Ranking: picker.Ranking{Proven: true, Ranked: 1, Rounds: 1}}), false},
		{"short_run_json", outcome(fakeRequest(),
			picker.Result{Shortfall: &picker.Shortfall{Rejected: []picker.Rejection{{Kind: picker.RejectQty,
				Line: picker.Transistor{ID: 10, Bin: "D1", Qty: 3, Sheet: solver.Datasheet{Label: "QN-104A"}}, Qty: 3, Boards: 4}}}},
			3, picker.Result{Candidates: []picker.Candidate{fakeCandidate(1)}, Ranking: picker.Ranking{Proven: true, Ranked: 1, Rounds: 1}}), true},
		{"hot", outcome(hot, picker.Result{Candidates: []picker.Candidate{hotCand}, Ranking: picker.Ranking{Proven: true, Ranked: 1, Rounds: 1}}, 0, picker.Result{}), false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out, errOut := render(tt.v, tt.json)
			golden(t, tt.name+".stdout", out)
			golden(t, tt.name+".stderr", errOut)
		})
	}
}

// TestOutputContent checks the facts the golden files must hold, so a
// rewritten golden file cannot silently drop them.
func TestOutputContent(t *testing.T) {
	v := outcome(fakeRequest(), picker.Result{Candidates: []picker.Candidate{fakeCandidate(1)}}, 0, picker.Result{})
	out, errOut := render(v, false)
	for _, want := range []string{
		"4K7+330R", "series", // a series pair shown as a pair
		"10K‖10K", "parallel", // a parallel pair
		"39K", "2K2", "QN-104A",
		"bin B1 #2 4K7", "bin C2 #3 330R", // where each part of a pair comes from
		"VB 1.62 V (1.55 V..1.7 V)", "VE 950 mV", "VC 7.58 V", // test points with bands
		"IC 1.82 mA..2.21 mA", // worst-case band
		"98.70 % (95 % Clopper–Pearson 97.78..99.31 %) — 987 of 1,000 simulated boards pass", // yield with its interval
		"IC 1.8 mA..2.2 mA (±10 % of the target 2 mA)",                                       // the window and its rule
		"Q-point 0.010", "beta 0.052", // score terms
		"SHORT by 1", // 4 boards need 4 of line 2, which holds 3
	} {
		if !strings.Contains(out, want) {
			t.Errorf("table lacks %q:\n%s", want, out)
		}
	}
	// Line 5 feeds both halves of RE's parallel pair: 2 per board, 8 for 4 boards.
	if !regexp.MustCompile(`#5\s+10K\s+8\s+50\n`).MatchString(out) {
		t.Errorf("pull list should take 8 of line 5 (two per board, 4 boards):\n%s", out)
	}
	if errOut != "" {
		t.Errorf("notes on stderr for a clean fit: %q", errOut)
	}

	js, _ := render(v, true)
	var doc map[string]any
	if err := json.Unmarshal([]byte(js), &doc); err != nil {
		t.Fatal(err)
	}
	c := doc["candidates"].([]any)[0].(map[string]any)
	for _, key := range []string{"id", "rank", "score", "transistor", "resistors", "nominal", "worst", "yield", "beta_sensitivity", "max_utilization", "model"} {
		if _, ok := c[key]; !ok {
			t.Errorf("JSON candidate lacks %q", key)
		}
	}
	r2 := c["resistors"].(map[string]any)["r2"].(map[string]any)
	if r2["arrangement"] != "series" || len(r2["parts"].([]any)) != 2 {
		t.Errorf("r2 = %v, want a series pair of two parts", r2)
	}
	part := r2["parts"].([]any)[1].(map[string]any)
	if part["id"].(float64) != 3 || part["ohms"].(float64) != 330 || part["bin"] != "C2" {
		t.Errorf("r2 second part = %v, want id 3, 330 ohms, bin C2", part)
	}
	for _, k := range []string{"ic_a", "ib_a", "vce_v", "vb_v", "ve_v", "vc_v", "beta"} {
		if _, ok := c["nominal"].(map[string]any)[k]; !ok {
			t.Errorf("nominal lacks %q", k)
		}
	}
	for _, k := range []string{"ic_min_a", "ic_max_a", "vce_min_v", "vce_max_v"} {
		if _, ok := c["worst"].(map[string]any)[k]; !ok {
			t.Errorf("worst lacks %q", k)
		}
	}
	for _, k := range []string{"is_a", "bf", "br", "nf", "vaf_v", "xti", "xtb", "eg_ev", "tnom_c"} {
		if _, ok := c["model"].(map[string]any)[k]; !ok {
			t.Errorf("model lacks %q", k)
		}
	}
	if tr := c["transistor"].(map[string]any); tr["label"] != "QN-104A" || tr["id"].(float64) != 10 {
		t.Errorf("transistor = %v", tr)
	}
}

// TestStyleMarksOnlyOnATerminal: with a terminal's style the broken limit
// and the short stock line are in bold (ECMA-48 SGR 1 ... SGR 0); the plain
// style writes the same words without any escape sequence.
func TestStyleMarksOnlyOnATerminal(t *testing.T) {
	v := outcome(fakeRequest(), picker.Result{Candidates: []picker.Candidate{
		fakeCandidate(1), fakeCandidate(2, picker.Failure{Kind: picker.FailICMax, IC_A: 0.2, ICMax_A: 0.1})}}, 0, picker.Result{})
	var bold, plain bytes.Buffer
	WriteText(&bold, v, Style{Bold: true})
	WriteText(&plain, v, Style{})
	for _, want := range []string{"\x1b[1mFAILS:\x1b[0m", "\x1b[1mSHORT by 1\x1b[0m"} {
		if !strings.Contains(bold.String(), want) {
			t.Errorf("terminal output lacks %q:\n%s", want, bold.String())
		}
	}
	if strings.Contains(plain.String(), "\x1b") || !strings.Contains(plain.String(), "FAILS:") || !strings.Contains(plain.String(), "SHORT by 1") {
		t.Errorf("plain output:\n%s", plain.String())
	}
}
