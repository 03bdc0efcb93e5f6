// Package cmdtest holds what the command packages' tests share: golden
// files under testdata and running a cobra command with buffer streams
// the way the root command runs it. Test support only; no command imports it.
package cmdtest

import (
	"bytes"
	"flag"
	"io"
	"os"
	"path/filepath"
	"testing"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
)

// update is go test's -update flag: rewrite the golden files instead of
// comparing (review every change before committing).
var update = flag.Bool("update", false, "rewrite the golden files under testdata")

// Golden compares got with the file at path (under testdata), or writes it
// when the tests run with -update.
func Golden(t testing.TB, path, got string) {
	t.Helper()
	if *update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -update to create it, then review it)", err)
	}
	if got != string(want) {
		t.Errorf("output differs from %s (go test -update rewrites it after review):\n--- got\n%s\n--- want\n%s", path, got, want)
	}
}

// Execute runs cmd with args on buffer streams, silenced and with flag
// errors mapped to usage errors as the root command does, and returns what
// it wrote to stdout and stderr and the error it returned.
func Execute(cmd *cobra.Command, args []string, out, errOut *bytes.Buffer) error {
	cmd.SetArgs(args)
	cmd.SetOut(out)
	cmd.SetErr(errOut)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	cmd.SetFlagErrorFunc(func(_ *cobra.Command, err error) error { return &cmdutil.UsageError{Err: err} })
	return cmd.Execute()
}

// Streams returns command streams over the given buffers, none of them a
// terminal (as when output is piped).
func Streams(in io.Reader, out, errOut io.Writer) *cmdutil.IOStreams {
	return &cmdutil.IOStreams{In: in, Out: out, ErrOut: errOut}
}
