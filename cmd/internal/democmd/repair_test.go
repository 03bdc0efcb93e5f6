package democmd

import (
	"bytes"
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/diagnosecmd"
	"biasbin/cmd/internal/substitutecmd"
)

// TestRepairExamplesAskWhatTheyShow: the demo hands the repair jobs typed
// requests but shows the command line; each shown command, run on the
// demo stock, prints exactly what the demo printed under it (its stdout,
// then its cautions).
func TestRepairExamplesAskWhatTheyShow(t *testing.T) {
	keep := filepath.Join(t.TempDir(), "demo.db")
	demo, errOut, err := runDemo(t, "--keep", keep)
	if err != nil {
		t.Fatalf("demo: %v\n%s", err, errOut)
	}
	names := []string{"substitute", "diagnose"}
	for i, args := range [][]string{substituteArgs(), diagnoseArgs()} {
		t.Run(names[i], func(t *testing.T) {
			var out, notes bytes.Buffer
			f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &notes), DBPath: keep, Getenv: func(string) string { return "" }}
			defer f.Close()
			cmd := substitutecmd.New(f)
			if i == 1 {
				cmd = diagnosecmd.New(f)
			}
			if err := cmdtest.Execute(cmd, args, &out, &notes); err != nil {
				t.Fatalf("biasbin %s %s: %v", names[i], strings.Join(args, " "), err)
			}
			shown := section(demo, fmt.Sprintf("$ biasbin %s %s\n\n", names[i], strings.Join(args, " ")), "\n=== ")
			if want := out.String() + notes.String(); !strings.Contains(shown, want) {
				t.Errorf("the demo's repair %d differs from biasbin %s:\n--- demo\n%s\n--- command\n%s", i+1, names[i], shown, want)
			}
		})
	}
}
