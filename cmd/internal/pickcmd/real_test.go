package pickcmd

import (
	"encoding/json"
	"regexp"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/store"
)

// tinyWall is a small invented stock for runs through the real picker:
// ten E12 values at 5 %, one NPN type with ten parts, one PNP type with two.
func tinyWall() store.Batch {
	var b store.Batch
	for i, code := range []string{"100R", "470R", "1K0", "1K5", "2K2", "3K3", "4K7", "10K", "22K", "47K"} {
		ohm := map[string]float64{"100R": 100, "470R": 470, "1K0": 1e3, "1K5": 1.5e3, "2K2": 2.2e3,
			"3K3": 3.3e3, "4K7": 4.7e3, "10K": 10e3, "22K": 22e3, "47K": 47e3}[code]
		b.Resistors = append(b.Resistors, store.Resistor{Ohm: ohm, Tol: 0.05, Rated_W: 0.25, Qty: 20,
			Bin: "R" + string(rune('A'+i)), Tech: store.TechCarbonFilm})
	}
	b.Transistors = []store.Transistor{
		{Label: "QN-104A", Polarity: "npn", HFEMin: 110, HFEMax: 330, HFEAt_A: 2e-3, VCESat_V: 0.2, VCEO_V: 40,
			ICMax_A: 0.2, PD25_W: 0.625, ThetaJA_KPerW: 200, Qty: 10, Bin: "T1"},
		{Label: "QP-104B", Polarity: "pnp", HFEMin: 100, HFEMax: 300, HFEAt_A: 2e-3, VCESat_V: 0.25, VCEO_V: 40,
			ICMax_A: 0.2, PD25_W: 0.625, ThetaJA_KPerW: 200, Qty: 2, Bin: "T2"},
	}
	return b
}

// searchEffort matches the counts of work done, which depend on how the
// picker's workers interleave (the builds found do not).
var searchEffort = regexp.MustCompile(`(search: |"evaluated": |"solved": )\d+`)

// TestRealPick runs pick end to end (store, conversion, the real picker,
// output) on tinyWall. The golden files pin the layout of real results;
// when the picker's ranking changes they are reviewed and rewritten with
// go test -update. The checks beside them hold whatever the ranking.
func TestRealPick(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the real search")
	}
	path := newTestDB(t, tinyWall())
	before := snapshot(t, path)
	tests := []struct {
		name   string
		args   []string
		code   int
		stdout []string // must appear
		stderr []string
	}{
		{"real_fits", []string{"--vcc", "12V", "--ic", "1mA", "--top", "2", "--boards", "4"}, 0,
			[]string{"#1  QN-104A", "Pull list for #1, 4 boards", "measure   VB"}, nil},
		{"real_json", []string{"--vcc", "12V", "--ic", "1mA", "--top", "1", "--json"}, 0,
			[]string{`"fits": true`, `"label": "QN-104A"`}, nil},
		{"real_off_target", []string{"--vcc", "12V", "--ic", "30mA", "--top", "1"}, 1,
			[]string{"NO BUILD REACHES THE TARGET (IC 30 mA)", "#1  QN-104A"}, []string{"no build reaches the target"}},
		{"real_short", []string{"--vcc", "12V", "--ic", "1mA", "--polarity", "pnp", "--boards", "5", "--top", "1"}, 1,
			[]string{"NOTHING FITS 5 BOARDS: the stock on hand builds at most 2.", "#1  QP-104B"},
			[]string{"nothing fits this request", "3 × QP-104B for build #1 on all 5 boards"}},
		{"real_feedback", []string{"--vcc", "12V", "--ic", "1mA", "--topology", "collector-feedback", "--top", "1", "--show-failing"}, -1,
			[]string{"NPN collector-feedback stage", "    RF  ", "    RC  ", "    RE  "}, nil},
		{"real_split_pnp", []string{"--vcc", "9V", "--vee", "9V", "--ic", "1mA", "--topology", "split-supply", "--polarity", "pnp", "--top", "1"}, -1,
			[]string{"PNP split-supply stage on -9 V ±5 % (-9.45 V..-8.55 V) and VEE 9 V ±5 % (8.55 V..9.45 V)", "    RB  ", "#1  QP-104B"}, nil},
		{"real_pnp_positive", []string{"--vcc", "5V", "--ic", "1mA", "--polarity", "pnp", "--top", "1"}, -1,
			[]string{"PNP divider stage on 5 V", "positive supply: emitter side to +V, collector side to 0 V", "+V to emitter", "collector to 0 V"}, nil},
		{"real_pnp_negative", []string{"--vcc", "5V", "--ic", "1mA", "--polarity", "pnp", "--rail", "negative", "--top", "1"}, -1,
			[]string{"PNP divider stage on -5 V", "negative supply: emitter side to 0 V, collector side to -V", "0 V to emitter", "collector to -V"}, nil},
		{"real_any", []string{"--vcc", "12V", "--vee", "12V", "--ic", "1mA", "--topology", "any", "--top", "3"}, -1,
			[]string{"NPN stage of any topology", "why #1 (", "the best "}, nil},
		{"split_without_vee", []string{"--vcc", "12V", "--ic", "1mA", "--topology", "split-supply"}, 2,
			nil, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			inv := runPick(t, path, nil, tt.args...)
			if got := cmdutil.ExitCode(inv.err); got != tt.code && (tt.code >= 0 || got > 1) {
				t.Fatalf("exit %d (%v), want %d\n%s%s", got, inv.err, tt.code, inv.stdout, inv.stderr)
			}
			for _, w := range tt.stdout {
				if !strings.Contains(inv.stdout, w) {
					t.Errorf("stdout lacks %q", w)
				}
			}
			for _, w := range tt.stderr {
				if !strings.Contains(inv.stderr, w) {
					t.Errorf("stderr lacks %q", w)
				}
			}
			golden(t, tt.name+".stdout", searchEffort.ReplaceAllString(inv.stdout, "${1}N"))
			golden(t, tt.name+".stderr", inv.stderr)
		})
	}
	if snapshot(t, path) != before {
		t.Error("pick changed the stock")
	}
}

// TestRealPickKeep: a repair keeping R1 and R2 (8K2 is not stocked) gets
// builds that show them as kept on the board, with the figures assumed,
// and never pulls them from stock, in text and in JSON.
func TestRealPickKeep(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the real search")
	}
	path := newTestDB(t, tinyWall())
	before := snapshot(t, path)
	args := []string{"--vcc", "12V", "--ic", "1mA", "--top", "1", "--keep", "r1=47K,r2=8K2/5%"}
	inv := runPick(t, path, nil, args...)
	if inv.err != nil {
		t.Fatalf("%v\n%s", inv.err, inv.stderr)
	}
	for _, w := range []string{"keeps on the board, not from stock: R1 47K (±10 %, 125 mW assumed), R2 8K2 (±5 %, 125 mW assumed)",
		"every kept part is taken with TCR 1000 ppm/K", "R1    47K ", "kept 10 % 125 mW", "on the board"} {
		if !strings.Contains(inv.stdout, w) {
			t.Errorf("stdout lacks %q:\n%s", w, inv.stdout)
		}
	}
	// the pull list names RC, RE and the transistor only
	pull := inv.stdout[strings.Index(inv.stdout, "Pull list"):]
	if strings.Contains(pull, "47K") || strings.Count(pull, "\n") != 5 {
		t.Errorf("the pull list takes a kept part or not three lines:\n%s", pull)
	}
	inv = runPick(t, path, nil, append(args, "--json")...)
	if inv.err != nil {
		t.Fatal(inv.err)
	}
	var doc struct {
		Request struct {
			Keep []jsonKept `json:"keep"`
		} `json:"request"`
		Candidates []struct {
			Resistors map[string]jsonPosition `json:"resistors"`
			Pull      []jsonPull              `json:"pull"`
		} `json:"candidates"`
	}
	if err := json.Unmarshal([]byte(inv.stdout), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Request.Keep) != 2 || doc.Request.Keep[0].Tol != 0.1 || doc.Request.Keep[1].Tol != 0.05 ||
		strings.Join(doc.Request.Keep[0].Assumed, ",") != "tol,rated_w,tcr_ppm_per_k" {
		t.Errorf("request keep %+v", doc.Request.Keep)
	}
	c := doc.Candidates[0]
	if r1 := c.Resistors["r1"]; r1.Arrangement != "kept" || len(r1.Parts) != 0 || r1.Ohms != 47e3 || r1.TCR_PPMPerK != 1000 {
		t.Errorf("r1 %+v", r1)
	}
	if len(c.Pull) != 3 {
		t.Errorf("pull %+v, want RC, RE and the transistor", c.Pull)
	}
	if snapshot(t, path) != before {
		t.Error("pick changed the stock")
	}
}
