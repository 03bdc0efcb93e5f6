package checkcmd

import (
	"bytes"
	"encoding/json"
	"strconv"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/report"
)

// TestCheckIDYieldAsPicked: `check ID` runs the yield against the window
// the pick used (the same rule around the pick's target), so with the
// pick's board count and seed it counts the same boards passing; the
// window says it sits around the target.
func TestCheckIDYieldAsPicked(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the real search")
	}
	path, out := keptPick(t)
	for _, b := range out.Builds {
		var so, se bytes.Buffer
		f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &so, &se), DBPath: path, Getenv: func(string) string { return "" }}
		args := []string{b.ID, "--json", "--sim-boards", strconv.Itoa(b.Yield.Boards), "--seed", strconv.FormatUint(b.Yield.Seed, 10)}
		err := cmdtest.Execute(New(f), args, &so, &se)
		f.Close()
		if err != nil && cmdutil.ExitCode(err) != 1 {
			t.Fatalf("check %v: %v\n%s", args, err, se.String())
		}
		var doc struct {
			Yield report.YieldJSON `json:"yield"`
		}
		if err := json.Unmarshal(so.Bytes(), &doc); err != nil {
			t.Fatal(err)
		}
		y, w := doc.Yield, doc.Yield.Window
		if y.Passed != b.Yield.Pass || y.Boards != b.Yield.Boards {
			t.Errorf("build %s: check counts %d of %d, the pick %d of %d", b.ID, y.Passed, y.Boards, b.Yield.Pass, b.Yield.Boards)
		}
		if w.ICMin_A != b.Window.ICMin_A || w.ICMax_A != b.Window.ICMax_A || w.VCEMin_V != b.Window.VCEMin_V || w.VCEMax_V != b.Window.VCEMax_V ||
			w.IC.Of != "target" || w.VCE.Of != "target" {
			t.Errorf("build %s: check's window %+v, the pick's %+v", b.ID, w, b.Window)
		}
	}
}
