package checkcmd

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/picture"
	"biasbin/cmd/internal/stockparts"
	"biasbin/picker"
	"biasbin/picker/job"
	"biasbin/solver"
	"biasbin/store"
)

// keptPick stocks an invented wall, picks from it and keeps the builds as
// pick does; it returns the stock file and the pick.
func keptPick(t *testing.T) (string, *job.PickOutcome) {
	t.Helper()
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "stock.db")
	db, err := store.Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	var b store.Batch
	for i, ohm := range []float64{470, 1e3, 1.5e3, 2.2e3, 3.3e3, 4.7e3, 10e3, 15e3, 22e3, 47e3} {
		b.Resistors = append(b.Resistors, store.Resistor{Ohm: ohm, Tol: 0.05, Rated_W: 0.25, Qty: 20,
			Bin: "R" + string(rune('A'+i)), Tech: store.TechCarbonFilm})
	}
	b.Transistors = []store.Transistor{{Label: "QN-7", Polarity: "npn", HFEMin: 110, HFEMax: 330, HFEAt_A: 2e-3,
		VCESat_V: 0.2, VCEO_V: 40, ICMax_A: 0.2, PD25_W: 0.625, ThetaJA_KPerW: 200, Qty: 10, Bin: "T1"}}
	if _, err := db.Import(ctx, b, store.ImportOptions{}); err != nil {
		t.Fatal(err)
	}
	stock, err := stockparts.Read(ctx, db)
	if err != nil {
		t.Fatal(err)
	}
	out, err := job.Pick(stock, picker.Request{Polarity: solver.NPN, VCC_V: 12, VCCTol: 0.05, IC_A: 1e-3, Top: 2, Seed: 1}, picker.Pick)
	if err != nil || len(out.Builds) < 2 {
		t.Fatalf("pick: %v (%d builds)", err, len(out.Builds))
	}
	if err := buildjob.KeepPick(ctx, db, out, stock); err != nil {
		t.Fatal(err)
	}
	return path, out
}

// TestPlotBuildIDs draws two kept builds by their IDs: two traces, each
// named by its ID, each at the nominal point the pick found for it, and
// refuses build flags beside IDs (exit 2) and an ID never kept (exit 1).
func TestPlotBuildIDs(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the real search")
	}
	path, out := keptPick(t)
	ids := []string{out.Builds[0].ID, out.Builds[1].ID}
	exec := func(args []string, runF func(*Options) error) (string, error) {
		var so, se bytes.Buffer
		f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &so, &se), DBPath: path, Getenv: func(string) string { return "" }}
		defer f.Close()
		err := cmdtest.Execute(newPlotCmd(f, runF), args, &so, &se)
		return se.String(), err
	}
	var chart picture.LoadLineChart
	_, err := exec(append([]string{"--out", filepath.Join(t.TempDir(), "two.svg"), "--sim-boards", "200"}, ids...), func(o *Options) error {
		_, c, _, err := o.refChart(context.Background())
		if err != nil {
			return err
		}
		var ok bool
		if chart, ok = c.(picture.LoadLineChart); !ok {
			t.Errorf("plot of two builds drew %T", c)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if len(chart.Traces) != 2 {
		t.Fatalf("%d traces drawn, want 2", len(chart.Traces))
	}
	for i, tr := range chart.Traces {
		b := out.Builds[i]
		if !strings.HasPrefix(tr.Name, b.ID+" ") || tr.Nominal.IC_A != b.Nominal.IC_A || tr.Nominal.VCE_V != b.Nominal.VCE_V {
			t.Errorf("trace %d %q at %g A, %g V; the pick had %s at %g A, %g V", i, tr.Name, tr.Nominal.IC_A, tr.Nominal.VCE_V, b.ID, b.Nominal.IC_A, b.Nominal.VCE_V)
		}
	}
	pngPath := filepath.Join(t.TempDir(), "one.png")
	if stderr, err := exec([]string{"--out", pngPath, "--kind", "ic-histogram", "--sim-boards", "200", ids[1]}, nil); err != nil || !strings.Contains(stderr, "ic-histogram of "+ids[1]+" written to "+pngPath) {
		t.Errorf("plot --kind ic-histogram %s: %v (%s)", ids[1], err, stderr)
	}
	if data, err := os.ReadFile(pngPath); err != nil || !bytes.HasPrefix(data, []byte("\x89PNG")) {
		t.Errorf("no PNG written: %v", err)
	}
	if _, err := exec(append([]string{"--out", filepath.Join(t.TempDir(), "x.svg"), "--vcc", "12V"}, ids[0]), nil); cmdutil.ExitCode(err) != 2 {
		t.Errorf("build flags beside an ID: %v, want exit 2", err)
	}
	if stderr, err := exec([]string{"--out", filepath.Join(t.TempDir(), "x.svg"), "b000000000000"}, nil); cmdutil.ExitCode(err) != 1 || !strings.Contains(err.Error(), "b000000000000") {
		t.Errorf("an ID never kept: %v (%s), want exit 1 naming it", err, stderr)
	}
}
