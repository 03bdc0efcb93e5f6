package cmdtest

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"os/exec"

	"github.com/spf13/cobra"

	"biasbin/cmd/internal/cmdutil"
)

// ChildMain makes a test binary run as biasbin when the environment
// variable env is "1": it builds the command tree with root, runs the
// arguments that follow "--" on the command line as main does, and exits.
// A package's TestMain calls it first; it returns when env is not set.
func ChildMain(env string, root func(*cmdutil.Factory) *cobra.Command) {
	if os.Getenv(env) != "1" {
		return
	}
	args := os.Args[1:]
	for i, a := range args {
		if a == "--" {
			args = args[i+1:]
			break
		}
	}
	f := cmdutil.New()
	cmd := root(f)
	cmd.SetArgs(args)
	err := cmd.Execute()
	if cerr := f.Close(); err == nil && cerr != nil {
		err = cerr
	}
	if err != nil && err != cmdutil.ErrSilent {
		fmt.Fprintln(os.Stderr, "biasbin:", err)
	}
	os.Exit(cmdutil.ExitCode(err))
}

// Child returns a command that runs this test binary as biasbin (see
// ChildMain, with env set) on the stock file db: a real separate process.
func Child(env, db string, args ...string) *exec.Cmd {
	cmd := exec.Command(os.Args[0], append([]string{"--", "--db", db}, args...)...)
	cmd.Env = append(os.Environ(), env+"=1")
	return cmd
}

// RunChild runs Child to its end and returns what it wrote and its exit
// status (-1 when it could not run, with the reason on stderr).
func RunChild(env, db string, args ...string) (stdout, stderr string, code int) {
	cmd := Child(env, db, args...)
	var out, errOut bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errOut
	err := cmd.Run()
	var ee *exec.ExitError
	switch {
	case errors.As(err, &ee):
		code = ee.ExitCode()
	case err != nil:
		code = -1
		errOut.WriteString(err.Error())
	}
	return out.String(), errOut.String(), code
}
