package checkcmd

import (
	"bytes"
	"context"
	"encoding/json"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/picture"
)

// plotData parses plot's flags as the command does and returns the chart
// it would draw.
func plotData(t *testing.T, args []string) picture.Chart {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut)}
	var got picture.Chart
	err := cmdtest.Execute(newPlotCmd(f, func(o *Options) error {
		pic, a, err := o.analysePlot(context.Background())
		if err != nil {
			return err
		}
		got, err = pic.chart(a)
		return err
	}), args, &out, &errOut)
	if err != nil {
		t.Fatalf("plot %v: %v", args, err)
	}
	return got
}

// checkJSON is the part of check --json a picture must agree with.
type checkJSON struct {
	Nominal struct {
		IC_A  float64 `json:"ic_a"`
		VCE_V float64 `json:"vce_v"`
	} `json:"nominal"`
	Corners []struct {
		IC_A  float64 `json:"ic_a"`
		VCE_V float64 `json:"vce_v"`
	} `json:"corners"`
	Yield struct {
		Boards int `json:"boards"`
		Pass   int `json:"passed"`
		Window struct {
			ICMin_A  float64 `json:"ic_min_a"`
			ICMax_A  float64 `json:"ic_max_a"`
			VCEMin_V float64 `json:"vce_min_v"`
			VCEMax_V float64 `json:"vce_max_v"`
		} `json:"window"`
	} `json:"yield"`
	Swing struct {
		ICSatDC_A  float64 `json:"ic_sat_dc_a"`
		VCECutDC_V float64 `json:"vce_cut_dc_v"`
		ICSatAC_A  float64 `json:"ic_sat_ac_a"`
		VCECutAC_V float64 `json:"vce_cut_ac_v"`
		RAC_Ohm    float64 `json:"rac_ohms"`
	} `json:"swing"`
}

// TestPlotAgreesWithCheckJSON draws three builds and checks the picture's
// data against check --json for the same flags: the nominal point is the
// JSON's, every corner lies inside the drawn hull, the boards drawn inside
// the window box are as many as the JSON's yield passes, and the load
// lines end where the JSON's swing says. Independently of the JSON, the DC
// load line ends at (VCC, 0) and (0, VCC/(RC+RE)) (REFERENCE.md §7; the
// split-supply stage spans VCC+|VEE|) and the AC load line has slope
// −1/r_ac with r_ac = RC‖RL (REFERENCE.md §7, §19).
func TestPlotAgreesWithCheckJSON(t *testing.T) {
	for _, tc := range []struct {
		name          string
		args          []string
		span_V, rdc_Ω float64
		rac_Ω         float64 // 0: no AC load line
	}{
		{"divider with load", []string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--hfe", "100..300", "--load", "10K", "--bypass"}, 12, 2670, 2200 * 10e3 / 12.2e3},
		{"collector feedback", []string{"--topology", "collector-feedback", "--vcc", "12V", "--rf", "220K", "--rc", "2K2", "--re", "470R", "--hfe", "100..400", "--theta-ja", "250"}, 12, 2670, 0},
		{"split supply", []string{"--topology", "split-supply", "--vcc", "9V", "--vee", "9V", "--rb", "10K", "--rc", "3K3", "--re", "4K7", "--hfe", "100..300"}, 18, 8000, 0},
	} {
		args := append(tc.args, "--sim-boards", "300", "--seed", "5")
		stdout, stderr, code := run(t, append(args, "--json"))
		if code != 0 {
			t.Fatalf("%s: check exit %d: %s", tc.name, code, stderr)
		}
		var doc checkJSON
		if err := json.Unmarshal([]byte(stdout), &doc); err != nil {
			t.Fatal(err)
		}
		c, ok := plotData(t, append(args, "--out", "q.svg")).(picture.LoadLineChart)
		if !ok {
			t.Fatalf("%s: plot drew no load-line chart", tc.name)
		}
		tr := c.Traces[0]
		if tr.Nominal.IC_A != doc.Nominal.IC_A || tr.Nominal.VCE_V != doc.Nominal.VCE_V {
			t.Errorf("%s: nominal drawn at %g A, %g V; check --json has %g A, %g V", tc.name, tr.Nominal.IC_A, tr.Nominal.VCE_V, doc.Nominal.IC_A, doc.Nominal.VCE_V)
		}
		if len(doc.Corners) == 0 || len(tr.Hull) < 3 {
			t.Fatalf("%s: %d corners in the JSON, hull of %d", tc.name, len(doc.Corners), len(tr.Hull))
		}
		for i, k := range doc.Corners {
			if !inside(picture.Point{VCE_V: k.VCE_V, IC_A: k.IC_A}, tr.Hull) {
				t.Errorf("%s: JSON corner %d (%g A, %g V) outside the drawn hull", tc.name, i, k.IC_A, k.VCE_V)
			}
		}
		w := tr.Window
		if dw := doc.Yield.Window; w.ICMin_A != dw.ICMin_A || w.ICMax_A != dw.ICMax_A || w.VCEMin_V != dw.VCEMin_V || w.VCEMax_V != dw.VCEMax_V {
			t.Errorf("%s: window drawn %+v, JSON %+v", tc.name, w, doc.Yield)
		}
		inWindow := 0
		for _, pts := range tr.Cloud.BoardPoints {
			in := true
			for _, p := range pts {
				in = in && w.Contains(p)
			}
			if in {
				inWindow++
			}
		}
		// A board inside the window at both ends fails only where its IC or
		// VCE turned between them (the yield's whole-range rule).
		if tr.Cloud.Drawn != doc.Yield.Boards || tr.Cloud.Passed != doc.Yield.Pass || inWindow < doc.Yield.Pass || inWindow-doc.Yield.Pass > tr.Cloud.Turned {
			t.Errorf("%s: %d of %d boards drawn inside the window (%d turned); check --json: %d of %d pass", tc.name, inWindow, tr.Cloud.Drawn, tr.Cloud.Turned, doc.Yield.Pass, doc.Yield.Boards)
		}
		dc := tr.DC
		if dc[0] != (picture.Point{VCE_V: doc.Swing.VCECutDC_V}) || dc[1] != (picture.Point{IC_A: doc.Swing.ICSatDC_A}) {
			t.Errorf("%s: DC load line %v, JSON swing %+v", tc.name, dc, doc.Swing)
		}
		if math.Abs(dc[0].VCE_V-tc.span_V) > 1e-9 || math.Abs(dc[1].IC_A-tc.span_V/tc.rdc_Ω) > 1e-12 {
			t.Errorf("%s: DC load line ends %v, want (%g V, 0) and (0, %g A)", tc.name, dc, tc.span_V, tc.span_V/tc.rdc_Ω)
		}
		switch {
		case tc.rac_Ω == 0 && tr.AC != nil:
			t.Errorf("%s: AC load line drawn without an AC load", tc.name)
		case tc.rac_Ω > 0 && len(tr.AC) != 2:
			t.Errorf("%s: no AC load line", tc.name)
		case tc.rac_Ω > 0:
			if slope := -tr.AC[1].IC_A / tr.AC[0].VCE_V; math.Abs(slope*tc.rac_Ω+1) > 1e-9 {
				t.Errorf("%s: AC slope %g S, want −1/%g Ω", tc.name, slope, tc.rac_Ω)
			}
			if tr.AC[0].VCE_V != doc.Swing.VCECutAC_V || tr.AC[1].IC_A != doc.Swing.ICSatAC_A {
				t.Errorf("%s: AC load line %v, JSON swing %+v", tc.name, tr.AC, doc.Swing)
			}
		}
	}
}

// inside reports whether p lies in the counter-clockwise convex polygon h
// (edges included, with room for rounding).
func inside(p picture.Point, h []picture.Point) bool {
	for i := range h {
		a, b := h[i], h[(i+1)%len(h)]
		cross := (b.VCE_V-a.VCE_V)*(p.IC_A-a.IC_A) - (b.IC_A-a.IC_A)*(p.VCE_V-a.VCE_V)
		if cross < -1e-15 {
			return false
		}
	}
	return true
}

// runPlot executes `biasbin plot args...`.
func runPlot(t *testing.T, args []string) (string, string, int) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut)}
	err := cmdtest.Execute(NewPlot(f), args, &out, &errOut)
	if err != nil && err != cmdutil.ErrSilent {
		errOut.WriteString("biasbin: " + err.Error() + "\n")
	}
	return out.String(), errOut.String(), cmdutil.ExitCode(err)
}

// TestPlotFiles checks the files the commands write: a PNG of the asked
// size (decoded by image/png), an IC histogram as PDF (%PDF- … %%EOF),
// check --plot beside the usual report, and bad picture flags refused
// with exit 2 before anything is written.
func TestPlotFiles(t *testing.T) {
	dir := t.TempDir()
	build := []string{"--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--hfe", "100..300", "--sim-boards", "200"}
	pngPath := filepath.Join(dir, "q.png")
	if _, stderr, code := runPlot(t, append([]string{"--out", pngPath, "--size", "700x450"}, build...)); code != 0 {
		t.Fatalf("plot png: exit %d: %s", code, stderr)
	}
	data, err := os.ReadFile(pngPath)
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("plot wrote no PNG: %v", err)
	}
	if b := img.Bounds(); b.Dx() != 700 || b.Dy() != 450 {
		t.Errorf("PNG %dx%d, want 700x450", b.Dx(), b.Dy())
	}
	pdfPath := filepath.Join(dir, "ic.PDF")
	if _, stderr, code := runPlot(t, append([]string{"--out", pdfPath, "--kind", "ic-histogram"}, build...)); code != 0 {
		t.Fatalf("plot pdf: exit %d: %s", code, stderr)
	}
	if data, _ := os.ReadFile(pdfPath); !bytes.HasPrefix(data, []byte("%PDF-")) || !bytes.HasSuffix(bytes.TrimSpace(data), []byte("%%EOF")) {
		t.Errorf("the histogram is no PDF")
	}
	svgPath := filepath.Join(dir, "check.svg")
	stdout, stderr, code := run(t, append([]string{"--plot", svgPath}, build...))
	if code != 0 || !bytes.Contains([]byte(stdout), []byte("divider stage")) || !bytes.Contains([]byte(stderr), []byte(svgPath)) {
		t.Errorf("check --plot: exit %d, stdout %q…, stderr %q", code, stdout[:min(60, len(stdout))], stderr)
	}
	if data, _ := os.ReadFile(svgPath); !bytes.HasPrefix(bytes.TrimSpace(data), []byte("<?xml")) {
		t.Errorf("check --plot wrote no SVG")
	}
	for _, bad := range [][]string{
		{"--out", filepath.Join(dir, "q.jpg")},
		{"--out", filepath.Join(dir, "q.svg"), "--size", "20x20"},
		{"--out", filepath.Join(dir, "q.svg"), "--kind", "pie"},
		{},
	} {
		_, stderr, code := runPlot(t, append(bad, build...))
		if code != 2 {
			t.Errorf("plot %v: exit %d (%s), want 2", bad, code, stderr)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "q.svg")); !os.IsNotExist(err) {
		t.Errorf("a refused plot left a file behind: %v", err)
	}
}
