package pickcmd

import (
	"bytes"
	"encoding/xml"
	"errors"
	"image/png"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdutil"
)

// TestPickPlot runs pick --plot through the real picker on tinyWall: the
// first build as a PNG of the asked size (decoded by image/png), the first
// two overlaid as SVG (parsed as XML), and the picture flags refused with
// exit 2 before the search when they cannot work.
func TestPickPlot(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the real search")
	}
	path := newTestDB(t, tinyWall())
	dir := t.TempDir()
	request := []string{"--vcc", "12V", "--ic", "1mA", "--top", "2"}

	pngPath := filepath.Join(dir, "first.png")
	inv := runPick(t, path, nil, append(request, "--plot", pngPath, "--plot-size", "640x480")...)
	if inv.err != nil || !strings.Contains(inv.stdout, "#1  QN-104A") || !strings.Contains(inv.stderr, "the first build written to "+pngPath) {
		t.Fatalf("pick --plot: %v\n%s\n%s", inv.err, inv.stdout, inv.stderr)
	}
	data, err := os.ReadFile(pngPath)
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("no PNG: %v", err)
	}
	if b := img.Bounds(); b.Dx() != 640 || b.Dy() != 480 {
		t.Errorf("PNG %dx%d, want 640x480", b.Dx(), b.Dy())
	}

	svgPath := filepath.Join(dir, "two.svg")
	inv = runPick(t, path, nil, append(request, "--plot", svgPath, "--compare", "2")...)
	if inv.err != nil || !strings.Contains(inv.stderr, "the first 2 builds written to") {
		t.Fatalf("pick --compare 2: %v\n%s", inv.err, inv.stderr)
	}
	f, err := os.Open(svgPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	d := xml.NewDecoder(f)
	for {
		if _, err := d.Token(); errors.Is(err, io.EOF) {
			break
		} else if err != nil {
			t.Fatalf("the SVG is no XML: %v", err)
		}
	}

	for _, bad := range [][]string{
		{"--plot", filepath.Join(dir, "q.gif")},
		{"--plot", filepath.Join(dir, "q.svg"), "--compare", "5"},
		{"--plot", filepath.Join(dir, "q.svg"), "--compare", "1"},
		{"--compare", "2"},
		{"--plot-size", "800x600"},
	} {
		inv := runPick(t, path, nil, append(request, bad...)...)
		if cmdutil.ExitCode(inv.err) != 2 {
			t.Errorf("pick %v: exit %d (%v), want 2", bad, cmdutil.ExitCode(inv.err), inv.err)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "q.svg")); !os.IsNotExist(err) {
		t.Errorf("a refused pick --plot left a file: %v", err)
	}
}
