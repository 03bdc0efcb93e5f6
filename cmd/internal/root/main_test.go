package root

import (
	"fmt"
	"os"
	"testing"

	"biasbin/cmd/internal/cmdutil"
)

// childEnv, when set, makes the test binary run as biasbin itself (the
// arguments follow "--" on its command line), so the reliability tests can
// run real separate processes.
const childEnv = "BIASBIN_ROOT_CHILD"

func TestMain(m *testing.M) {
	if os.Getenv(childEnv) == "1" {
		args := os.Args[1:]
		for i, a := range args {
			if a == "--" {
				args = args[i+1:]
				break
			}
		}
		f := cmdutil.New()
		cmd := New(f)
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
	os.Exit(m.Run())
}
