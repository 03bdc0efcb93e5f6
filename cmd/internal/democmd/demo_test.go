package democmd

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
)

// runDemo runs `biasbin demo args...` with buffer streams.
func runDemo(t *testing.T, args ...string) (stdout, stderr string, err error) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut)}
	err = cmdtest.Execute(New(f), args, &out, &errOut)
	return out.String(), errOut.String(), err
}

// section returns the text of s from the first from up to to.
func section(s, from, to string) string {
	i := strings.Index(s, from)
	if i < 0 {
		return ""
	}
	s = s[i:]
	if j := strings.Index(s, to); j >= 0 {
		s = s[:j]
	}
	return s
}

func TestDemoKeepRefusesExistingFile(t *testing.T) {
	path := filepath.Join(t.TempDir(), "mine.db")
	if err := os.WriteFile(path, []byte("precious"), 0o644); err != nil {
		t.Fatal(err)
	}
	out, _, err := runDemo(t, "--keep", path)
	if cmdutil.ExitCode(err) != 2 || err == nil || !strings.Contains(err.Error(), "the file exists") {
		t.Errorf("err %v, want a usage error saying the file exists", err)
	}
	if out != "" {
		t.Errorf("stdout %q", out)
	}
	if b, _ := os.ReadFile(path); string(b) != "precious" {
		t.Error("the existing file was changed")
	}
}

func TestDemoPathRemovedAfterwards(t *testing.T) {
	path, cleanup, err := demoPath("")
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	cleanup()
	if _, err := os.Stat(filepath.Dir(path)); !os.IsNotExist(err) {
		t.Errorf("temporary folder %s still there after cleanup (err %v)", filepath.Dir(path), err)
	}
}
