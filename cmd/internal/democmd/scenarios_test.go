package democmd

import (
	"bytes"
	"context"
	"fmt"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/pickcmd"
	"biasbin/store"
)

// TestScenariosAskWhatTheyShow: the demo hands the picker typed requests
// but shows the command line; each shown command, run by biasbin pick on
// the demo stock, prints exactly what the demo printed under it (its
// stdout, then its notes).
func TestScenariosAskWhatTheyShow(t *testing.T) {
	keep := filepath.Join(t.TempDir(), "demo.db")
	demo, errOut, err := runDemo(t, "--keep", keep)
	if err != nil {
		t.Fatalf("demo: %v\n%s", err, errOut)
	}
	// The demo ends by committing a build; cancelling it puts the stock
	// back as the picks saw it.
	db, err := store.OpenExisting(context.Background(), keep)
	if err != nil {
		t.Fatal(err)
	}
	err = db.CancelBuild(context.Background(), 1)
	db.Close()
	if err != nil {
		t.Fatalf("cancel the demo build: %v", err)
	}
	for i, sc := range scenarios() {
		t.Run(fmt.Sprint(i+1), func(t *testing.T) {
			var out, notes bytes.Buffer
			f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &notes), DBPath: keep, Getenv: func(string) string { return "" }}
			defer f.Close()
			err := cmdtest.Execute(pickcmd.New(f), sc.args, &out, &notes)
			if (err != nil) != sc.nothingFits {
				t.Fatalf("biasbin pick %s: %v", strings.Join(sc.args, " "), err)
			}
			// The search runs in parallel: how many builds it solved in
			// full varies from run to run.
			solved := regexp.MustCompile(`\d+ builds solved in full`)
			shown := section(demo, fmt.Sprintf("$ biasbin pick %s\n\n", strings.Join(sc.args, " ")), "\n=== Pick")
			shown = solved.ReplaceAllString(shown, "N builds solved in full")
			want := solved.ReplaceAllString(out.String()+notes.String(), "N builds solved in full")
			if !strings.Contains(shown, want) {
				t.Errorf("the demo's pick %d differs from biasbin pick %s:\n--- demo\n%s\n--- pick\n%s", i+1, strings.Join(sc.args, " "), shown, want)
			}
		})
	}
}
