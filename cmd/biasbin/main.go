// Command biasbin biases single-transistor stages from the parts in stock.
package main

import (
	"fmt"
	"os"

	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/root"
)

func main() {
	f := cmdutil.New()
	cmd := root.New(f)
	err := cmd.Execute()
	if cerr := f.Close(); err == nil && cerr != nil {
		err = cerr
	}
	if err != nil && err != cmdutil.ErrSilent {
		fmt.Fprintln(os.Stderr, "biasbin:", err)
	}
	os.Exit(cmdutil.ExitCode(err))
}
