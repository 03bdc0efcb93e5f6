package root

import (
	"encoding/json"
	"path/filepath"
	"reflect"
	"sort"
	"strings"
	"testing"
)

// keysOf returns the sorted keys of a JSON object.
func keysOf(t *testing.T, raw json.RawMessage) []string {
	t.Helper()
	var m map[string]json.RawMessage
	if err := json.Unmarshal(raw, &m); err != nil {
		t.Fatalf("%v: %s", err, raw)
	}
	var ks []string
	for k := range m {
		ks = append(ks, k)
	}
	sort.Strings(ks)
	return ks
}

// TestTourBuild runs the README's build steps on the tour's stock: commit
// a picked build, show it, record one board inside its bands and one with
// the collector at the rail (RC shorted: VC = VCC, REFERENCE.md §22 table
// "R_C short"), print the sheet, read the ledger, close the run. JSON
// fields are the ones the issue lists.
func TestTourBuild(t *testing.T) {
	db := filepath.Join(t.TempDir(), "stock.db")
	env := map[string]string{"BIASBIN_DB": db}
	tour := filepath.Join("..", "..", "..", "testdata", "tour")
	for _, f := range []string{"resistors.csv", "transistors.csv"} {
		if _, errOut, code := run(t, env, "stock", "import", filepath.Join(tour, f)); code != 0 {
			t.Fatalf("import %s: %s", f, errOut)
		}
	}
	out, errOut, code := run(t, env, "pick", "--vcc", "12V", "--ic", "1mA", "--boards", "4", "--top", "1", "--json")
	if code != 0 {
		t.Fatalf("pick: %s", errOut)
	}
	var picked struct {
		Candidates []struct {
			ID string `json:"id"`
		} `json:"candidates"`
	}
	if err := json.Unmarshal([]byte(out), &picked); err != nil || len(picked.Candidates) != 1 {
		t.Fatalf("pick: %v", err)
	}
	id := picked.Candidates[0].ID
	if out, errOut, code = run(t, env, "build", "new", id, "--boards", "4", "--note", "tour run"); code != 0 ||
		!strings.Contains(out, "build 1: 4 boards of "+id) {
		t.Fatalf("build new: exit %d: %s%s", code, out, errOut)
	}
	out, _, _ = run(t, env, "build", "list", "--json")
	var list struct {
		Builds []json.RawMessage `json:"builds"`
	}
	if err := json.Unmarshal([]byte(out), &list); err != nil || len(list.Builds) != 1 {
		t.Fatalf("build list --json: %v\n%s", err, out)
	}
	if got, want := keysOf(t, list.Builds[0]), []string{"boards", "candidate", "created", "id", "note", "state"}; !reflect.DeepEqual(got, want) {
		t.Errorf("build list --json fields %v, want %v", got, want)
	}
	out, _, _ = run(t, env, "build", "show", "1", "--json")
	var show struct {
		Parts []json.RawMessage `json:"parts"`
		Bands map[string]struct {
			Min float64 `json:"min"`
			Max float64 `json:"max"`
		} `json:"bands"`
	}
	if err := json.Unmarshal([]byte(out), &show); err != nil || len(show.Parts) == 0 {
		t.Fatalf("build show --json: %v\n%s", err, out)
	}
	for _, k := range []string{"vb_v", "ve_v", "vc_v"} {
		if b := show.Bands[k]; !(b.Min < b.Max) {
			t.Errorf("band %s: %+v", k, b)
		}
	}
	for _, p := range show.Parts {
		ks := strings.Join(keysOf(t, p), ",")
		if ks != "bin,kind,line,ohms,per_board,taken" && ks != "bin,kind,label,line,per_board,taken" {
			t.Errorf("part fields %s", ks)
		}
	}
	mid := func(k string) string { return jsonNumber((show.Bands[k].Min + show.Bands[k].Max) / 2) }
	if out, errOut, code = run(t, env, "build", "measure", "1", "--board", "1", "--vb", mid("vb_v"), "--ve", mid("ve_v"),
		"--vc", mid("vc_v")); code != 0 || !strings.HasSuffix(out, ": pass\n") {
		t.Fatalf("measure board 1: exit %d: %s%s", code, out, errOut)
	}
	if out, errOut, code = run(t, env, "build", "measure", "1", "--board", "2", "--vb", mid("vb_v"), "--ve", mid("ve_v"),
		"--vc", "12"); code != 0 || !strings.Contains(out, "OUT OF BAND") || !strings.Contains(out, "most likely: RC shorted") {
		t.Fatalf("measure board 2: exit %d: %s%s", code, out, errOut)
	}
	out, _, _ = run(t, env, "build", "show", "1", "--json")
	var boards struct {
		Boards []json.RawMessage `json:"boards"`
	}
	json.Unmarshal([]byte(out), &boards)
	if len(boards.Boards) != 4 {
		t.Fatalf("show lists %d boards, want 4", len(boards.Boards))
	}
	for _, k := range []string{"board", "vb_v", "ve_v", "vc_v", "verdict", "causes"} {
		if !strings.Contains(string(boards.Boards[1]), `"`+k+`"`) {
			t.Errorf("board 2 lacks %q: %s", k, boards.Boards[1])
		}
	}
	if out, _, code = run(t, env, "build", "sheet", "1", "--format", "csv"); code != 0 ||
		!strings.Contains(out, ",out-of-band,RC shorted\n") || strings.Count(out, "\nboard,") != 4 {
		t.Errorf("sheet csv:\n%s", out)
	}
	out, _, _ = run(t, env, "ledger", "--build", "1", "--json")
	var led struct {
		Entries []map[string]any `json:"entries"`
	}
	if err := json.Unmarshal([]byte(out), &led); err != nil || len(led.Entries) == 0 {
		t.Fatalf("ledger --json: %v\n%s", err, out)
	}
	for _, e := range led.Entries {
		if len(e) != 6 || e["reason"] != "build" || e["build"] != 1.0 {
			t.Errorf("ledger entry %v", e)
		}
	}
	var line struct {
		Line int64 `json:"line"`
	}
	json.Unmarshal(show.Parts[0], &line)
	if _, errOut, code = run(t, env, "stock", "remove", jsonNumber(float64(line.Line))); code != 1 ||
		!strings.Contains(errOut, "held by open build 1") {
		t.Errorf("remove a line the open build holds: exit %d: %s", code, errOut)
	}
	if _, errOut, code = run(t, env, "build", "close", "1"); code != 0 {
		t.Fatalf("close: %s", errOut)
	}
	if _, errOut, code = run(t, env, "build", "cancel", "1"); code != 1 || !strings.Contains(errOut, "build 1 is closed already") {
		t.Errorf("cancel a closed build: exit %d: %s", code, errOut)
	}
	if out, _, code = run(t, env, "stock", "verify"); code != 0 || out != "ok\n" {
		t.Errorf("verify: %s", out)
	}
}
