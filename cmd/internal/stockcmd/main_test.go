package stockcmd

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
)

// childEnv, when set, makes the test binary run as a biasbin with only the
// stock commands (the arguments follow "--" on its command line), so the
// reliability tests can run real processes.
const childEnv = "BIASBIN_STOCKCMD_CHILD"

func TestMain(m *testing.M) {
	cmdtest.ChildMain(childEnv, testRoot)
	os.Exit(m.Run())
}

// testRoot is the root command reduced to what the stock commands need:
// the persistent --db flag and the usage-error mapping.
func testRoot(f *cmdutil.Factory) *cobra.Command {
	cmd := &cobra.Command{Use: "biasbin", SilenceUsage: true, SilenceErrors: true}
	cmd.SetOut(f.IO.Out)
	cmd.SetErr(f.IO.ErrOut)
	cmd.PersistentFlags().StringVar(&f.DBPath, "db", "", "stock database file")
	cmd.SetFlagErrorFunc(func(_ *cobra.Command, err error) error { return &cmdutil.UsageError{Err: err} })
	cmd.AddCommand(New(f))
	return cmd
}

// result is what one in-process command run produced.
type result struct {
	out, errOut string
	code        int
}

// run executes `biasbin --db db ARGS...` in process with stdin in.
func run(t testing.TB, db, in string, args ...string) result {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(strings.NewReader(in), &out, &errOut),
		Getenv: func(string) string { return "" }}
	cmd := testRoot(f)
	cmd.SetArgs(append([]string{"--db", db}, args...))
	err := cmd.ExecuteContext(context.Background())
	if cerr := f.Close(); err == nil && cerr != nil {
		err = cerr
	}
	if err != nil {
		fmt.Fprintln(&errOut, "biasbin:", err)
	}
	return result{out: out.String(), errOut: errOut.String(), code: cmdutil.ExitCode(err)}
}

// tempDB returns a path for a fresh stock file under t.TempDir().
func tempDB(t testing.TB) string {
	t.Helper()
	return filepath.Join(t.TempDir(), "stock.db")
}
