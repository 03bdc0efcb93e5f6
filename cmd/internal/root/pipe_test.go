package root

import (
	"io"
	"os"
	"path/filepath"
	"testing"

	"biasbin/cmd/internal/cmdutil"
)

// TestPipedOutputIsPlain runs the commands with stdout and stderr on real
// pipes, as in `biasbin pick ... | less`: nothing but data and plain lines
// come out — no progress indicator, no carriage return, no escape
// sequence, no other control character (only newline and tab).
func TestPipedOutputIsPlain(t *testing.T) {
	dir := t.TempDir()
	db := filepath.Join(dir, "stock.db")
	tour := filepath.Join("..", "..", "..", "testdata", "tour")
	commands := [][]string{
		{"--db", db, "stock", "import", filepath.Join(tour, "resistors.csv")},
		{"--db", db, "stock", "import", filepath.Join(tour, "transistors.csv")},
		{"--db", db, "stock", "list"},
		{"--db", db, "pick", "--vcc", "12V", "--ic", "1mA", "--boards", "2"},
		{"--db", db, "pick", "--vcc", "12V", "--ic", "1mA", "--boards", "400"}, // nothing fits: the notes
		{"--db", db, "pick", "--vcc", "60V", "--ic", "1mA", "--json"},
		{"--db", db, "check", "--vcc", "60V", "--r1", "470K", "--r2", "47K", "--rc", "22K", "--re", "4K7", "--transistor", "QX-1"},
		{"demo"},
	}
	for _, args := range commands {
		out, errOut := piped(t, args)
		for name, text := range map[string]string{"stdout": out, "stderr": errOut} {
			for i, r := range text {
				if r < 0x20 && r != '\n' && r != '\t' || r == 0x7f || r >= 0x80 && r < 0xa0 {
					t.Errorf("%v: %s holds control character %U at byte %d:\n%q", args, name, r, i, text[max(0, i-40):min(len(text), i+40)])
					break
				}
			}
		}
		if out == "" {
			t.Errorf("%v: nothing on stdout", args)
		}
	}
}

// piped runs biasbin args with stdout and stderr on pipes and returns what
// came out of each.
func piped(t *testing.T, args []string) (stdout, stderr string) {
	t.Helper()
	outR, outW, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	errR, errW, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	read := func(r *os.File, dst *string, done chan<- struct{}) {
		b, _ := io.ReadAll(r)
		*dst = string(b)
		r.Close()
		close(done)
	}
	outDone, errDone := make(chan struct{}), make(chan struct{})
	go read(outR, &stdout, outDone)
	go read(errR, &stderr, errDone)
	f := &cmdutil.Factory{IO: cmdutil.Files(os.Stdin, outW, errW), Getenv: func(string) string { return "" }}
	if f.IO.IsStdoutTTY() || f.IO.IsStderrTTY() {
		t.Fatal("a pipe is taken for a terminal")
	}
	cmd := New(f)
	cmd.SetArgs(args)
	err = cmd.Execute()
	f.Close()
	if err != nil && err != cmdutil.ErrSilent {
		errW.WriteString("biasbin: " + err.Error() + "\n")
	}
	outW.Close()
	errW.Close()
	<-outDone
	<-errDone
	return stdout, stderr
}
