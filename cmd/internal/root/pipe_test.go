package root

import (
	"io"
	"os"
	"path/filepath"
	"regexp"
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
		{"--db", db, "plot", "--out", filepath.Join(dir, "q.svg"), "--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--transistor", "QX-1"},
		{"--db", db, "substitute", "--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--original", "QX-1"},
		{"--db", db, "diagnose", "--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--transistor", "QX-1",
			"--vb", "1.9V", "--ve", "1.2V", "--vc", "11.9V"},
		{"--db", db, "stock", "add", "resistor", "4K7", "--qty", "10", "--bin", "Z9"},
		{"--db", db, "stock", "tag", "--tag", "spare", "1"},
		{"--db", db, "stock", "adjust", "1", "+5"},
		{"--db", db, "stock", "export", "--kind", "resistor"},
		{"--db", db, "stock", "verify"},
		{"--db", db, "pick", "--vcc", "12V", "--ic", "1mA", "--boards", "2", "--json"},
		{"--db", db, "build", "new", "PICK-ID", "--boards", "2"}, // the first build of the pick before
		{"--db", db, "build", "list"},
		{"--db", db, "build", "show", "1"},
		{"--db", db, "build", "sheet", "1"},
		{"--db", db, "build", "measure", "1", "--board", "1", "--vb", "2V", "--ve", "1.3V", "--vc", "6.5V"},
		{"--db", db, "build", "close", "1"},
		{"--db", db, "ledger"},
		{"--db", db, "backup", filepath.Join(dir, "copy.db")},
		{"demo"},
	}
	// Commands that write a file say so on stderr and leave stdout empty.
	fileOnly := map[string]bool{"plot": true}
	pickID := regexp.MustCompile(`"id": "([0-9a-f]+)"`)
	lastID := ""
	for _, args := range commands {
		for i, a := range args {
			if a == "PICK-ID" {
				args[i] = lastID
			}
		}
		out, errOut := piped(t, args)
		if m := pickID.FindStringSubmatch(out); m != nil {
			lastID = m[1]
		}
		for name, text := range map[string]string{"stdout": out, "stderr": errOut} {
			for i, r := range text {
				if r < 0x20 && r != '\n' && r != '\t' || r == 0x7f || r >= 0x80 && r < 0xa0 {
					t.Errorf("%v: %s holds control character %U at byte %d:\n%q", args, name, r, i, text[max(0, i-40):min(len(text), i+40)])
					break
				}
			}
		}
		if out == "" && !fileOnly[args[2]] {
			t.Errorf("%v: nothing on stdout (stderr %q)", args, errOut)
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
