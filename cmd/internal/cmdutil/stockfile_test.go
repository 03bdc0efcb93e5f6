package cmdutil_test

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/cmd/internal/root"
	"biasbin/store"
)

// tour is the README tour's example files.
var tour = filepath.Join("..", "..", "..", "testdata", "tour")

// run executes biasbin args through the whole command tree with BIASBIN_DB
// set to envDB, and returns stdout, stderr and the error main would print.
func run(t *testing.T, envDB string, args ...string) (stdout, stderr string, err error) {
	t.Helper()
	var out, errOut bytes.Buffer
	f := &cmdutil.Factory{IO: cmdtest.Streams(nil, &out, &errOut), Getenv: func(k string) string {
		if k == "BIASBIN_DB" {
			return envDB
		}
		return ""
	}}
	err = cmdtest.Execute(root.New(f), args, &out, &errOut)
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	return out.String(), errOut.String(), err
}

// leftIn lists what is under dir, relative to it.
func leftIn(t *testing.T, dir string) []string {
	t.Helper()
	var got []string
	err := filepath.WalkDir(dir, func(p string, _ os.DirEntry, err error) error {
		if err == nil && p != dir {
			rel, _ := filepath.Rel(dir, p)
			got = append(got, rel)
		}
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return got
}

// TestReadingCommandsCreateNoStockFile: every command that only reads the
// stock or changes parts already in it, given a stock file that is not there (its folder there or not,
// named by --db or BIASBIN_DB), fails with an error that names the path
// and what to do, and leaves nothing behind: no file, folder, -wal or -shm.
func TestReadingCommandsCreateNoStockFile(t *testing.T) {
	checkArgs := []string{"check", "--vcc", "12V", "--r1", "47K", "--r2", "10K", "--rc", "2K2", "--re", "470R", "--transistor", "QX-1"}
	commands := []struct {
		name string
		args []string
	}{
		{"stock list", []string{"stock", "list"}},
		{"stock list --json", []string{"stock", "list", "--json"}},
		{"stock export", []string{"stock", "export", "--kind", "resistor"}},
		{"stock export to a file", []string{"stock", "export", "--kind", "transistor", "OUT"}},
		{"stock verify", []string{"stock", "verify"}},
		{"pick", []string{"pick", "--vcc", "12V", "--ic", "1mA"}},
		{"check --transistor", checkArgs},
		// These change parts already stocked, so they need the file too.
		{"stock adjust", []string{"stock", "adjust", "1", "+5"}},
		{"stock remove", []string{"stock", "remove", "1"}},
		{"stock tag", []string{"stock", "tag", "1", "approved"}},
		{"stock untag", []string{"stock", "untag", "1", "approved"}},
	}
	places := []struct {
		name  string
		rel   string // the stock file under a fresh temporary folder
		byEnv bool   // named by BIASBIN_DB instead of --db
	}{
		{"--db, folder there", "stock.db", false},
		{"--db, folder missing", filepath.Join("typo", "stock.db"), false},
		{"BIASBIN_DB, folder missing", filepath.Join("typo", "stock.db"), true},
	}
	for _, c := range commands {
		for _, p := range places {
			t.Run(c.name+"/"+p.name, func(t *testing.T) {
				dir := t.TempDir()
				path := filepath.Join(dir, p.rel)
				args := c.args
				for i, a := range args {
					if a == "OUT" {
						args = append(append(append([]string{}, args[:i]...), filepath.Join(dir, "out.csv")), args[i+1:]...)
					}
				}
				env := path
				if !p.byEnv {
					args, env = append([]string{"--db", path}, args...), ""
				}
				out, errOut, err := run(t, env, args...)
				if cmdutil.ExitCode(err) == 0 {
					t.Fatalf("exit 0 on a missing stock file\nstdout %q\nstderr %q", out, errOut)
				}
				if !errors.Is(err, store.ErrNoFile) {
					t.Errorf("error %v: want the missing stock file", err)
				}
				for _, want := range []string{"no stock file at " + path, `"biasbin stock import"`, "--db"} {
					if !strings.Contains(err.Error(), want) {
						t.Errorf("message %q lacks %q", err, want)
					}
				}
				if out != "" {
					t.Errorf("stdout %q, want nothing", out)
				}
				if left := leftIn(t, dir); len(left) != 0 {
					t.Errorf("left behind in %s: %v", dir, left)
				}
			})
		}
	}
}

// TestDryRunImportCreatesNoStockFile: `stock import --dry-run` on a missing
// stock file checks the rows against an empty stock, says so, and creates
// nothing; a bad file still fails. The real import then creates the file
// and its folder.
func TestDryRunImportCreatesNoStockFile(t *testing.T) {
	bad := filepath.Join(t.TempDir(), "bad.csv")
	if err := os.WriteFile(bad, []byte("label,polarity,hfe_min,hfe_max,qty\nQX-9,npn,300,100,5\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name     string
		file     string
		wantOut  string // on stdout
		wantFail string // in the error, when the import must fail
		wantNote bool   // stderr says there is no stock file yet
	}{
		// The tour file has seven rows, no two alike: seven new lines.
		{"good file", filepath.Join(tour, "resistors.csv"), "7 new lines, 0 would be added to existing lines (dry run: nothing written)", "", true},
		// The reader refuses the row before any stock is opened.
		{"bad file", bad, "", "nothing was imported", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, "typo", "stock.db")
			out, errOut, err := run(t, "", "--db", path, "stock", "import", tc.file, "--dry-run")
			switch {
			case tc.wantFail == "" && err != nil:
				t.Fatalf("dry run: %v\n%s", err, errOut)
			case tc.wantFail != "" && (err == nil || !strings.Contains(err.Error(), tc.wantFail)):
				t.Fatalf("dry run of a bad file: %v, want %q", err, tc.wantFail)
			}
			if !strings.Contains(out, tc.wantOut) {
				t.Errorf("stdout %q lacks %q", out, tc.wantOut)
			}
			if want := "no stock file at " + path + " yet"; strings.Contains(errOut, want) != tc.wantNote {
				t.Errorf("stderr %q: note %q expected %v", errOut, want, tc.wantNote)
			}
			if left := leftIn(t, dir); len(left) != 0 {
				t.Errorf("dry run left %v in %s", left, dir)
			}
		})
	}
}

// TestWritingCommandsCreateStockFile: a command that writes creates the
// stock file and its folder on first use, and the reading commands then
// read it.
func TestWritingCommandsCreateStockFile(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
		want string // in stock list afterwards
	}{
		{"stock add", []string{"stock", "add", "transistor", "QN-230", "--polarity", "npn", "--hfe", "100..300", "--qty", "5"}, "QN-230"},
		{"stock import", []string{"stock", "import", filepath.Join(tour, "transistors.csv")}, "QX-1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			path := filepath.Join(t.TempDir(), "new", "folder", "stock.db")
			if _, errOut, err := run(t, "", append([]string{"--db", path}, tc.args...)...); err != nil {
				t.Fatalf("%v: %v\n%s", tc.args, err, errOut)
			}
			if _, err := os.Stat(path); err != nil {
				t.Fatalf("stock file not created: %v", err)
			}
			out, errOut, err := run(t, path, "stock", "list")
			if err != nil || !strings.Contains(out, tc.want) {
				t.Errorf("stock list after %s: %v\n%s%s", tc.name, err, out, errOut)
			}
		})
	}
}
