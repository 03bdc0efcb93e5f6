package cmdutil

import (
	"encoding/json"
	"fmt"
	"io"
	"os"

	"golang.org/x/term"
)

// IOStreams carries the command's standard streams and whether each is a
// terminal. Data goes to Out, progress and warnings to ErrOut.
type IOStreams struct {
	In     io.Reader
	Out    io.Writer
	ErrOut io.Writer

	outTTY bool
	errTTY bool
}

// System returns the process's own streams.
func System() *IOStreams { return Files(os.Stdin, os.Stdout, os.Stderr) }

// Files returns streams over open files, each output marked a terminal
// only when it is one (a pipe or a regular file is not).
func Files(in, out, errOut *os.File) *IOStreams {
	return &IOStreams{
		In:     in,
		Out:    out,
		ErrOut: errOut,
		outTTY: term.IsTerminal(int(out.Fd())),
		errTTY: term.IsTerminal(int(errOut.Fd())),
	}
}

// IsStdoutTTY reports whether Out is a terminal (text output may then
// mark what must not be missed in bold).
func (s *IOStreams) IsStdoutTTY() bool { return s.outTTY }

// IsStderrTTY reports whether ErrOut is a terminal (progress indicators
// are drawn only then).
func (s *IOStreams) IsStderrTTY() bool { return s.errTTY }

// WriteJSON writes v to w indented by two spaces, with a final newline:
// the --json output of every command.
func WriteJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return fmt.Errorf("write JSON: %w", err)
	}
	return nil
}
