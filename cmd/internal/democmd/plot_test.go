package democmd

import (
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/picture"
)

// TestDemoPlot: demo --plot draws the first pick's best build as a PNG of
// the default size (decoded by image/png), refuses an unknown picture type
// before doing anything, and the README shows the picture it documents,
// made by the command it names.
func TestDemoPlot(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the demo's picks")
	}
	path := filepath.Join(t.TempDir(), "demo.png")
	out, _, err := runDemo(t, "--plot", path)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out, "The load-line picture of #1 is in "+path) {
		t.Errorf("the demo does not say where the picture is:\n%s", out)
	}
	decode := func(p string) {
		t.Helper()
		f, err := os.Open(p)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		img, err := png.Decode(f)
		if err != nil {
			t.Fatalf("%s: %v", p, err)
		}
		if b := img.Bounds(); b.Dx() != picture.DefaultSize.Width_px || b.Dy() != picture.DefaultSize.Height_px {
			t.Errorf("%s: %dx%d, want the default %v", p, b.Dx(), b.Dy(), picture.DefaultSize)
		}
	}
	decode(path)

	readme, err := os.ReadFile(filepath.Join("..", "..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	const shown = "testdata/demo-pick1.png"
	for _, want := range []string{"go run ./cmd/biasbin demo --plot " + shown, "](" + shown + ")"} {
		if !strings.Contains(string(readme), want) {
			t.Errorf("README lacks %q", want)
		}
	}
	decode(filepath.Join("..", "..", "..", shown))

	if _, _, err := runDemo(t, "--plot", filepath.Join(t.TempDir(), "q.bmp")); cmdutil.ExitCode(err) != 2 {
		t.Errorf("demo --plot q.bmp: %v, want a usage error", err)
	}
}
