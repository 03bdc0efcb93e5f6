package store

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// readOnlyChildEnv names the stock a child test process reads as another
// user; see TestReadOnlyStock.
const readOnlyChildEnv = "BIASBIN_STORE_READONLY_CHILD"

// TestReadOnlyChild is the part of TestReadOnlyStock that runs as the user
// who may only read: it lists the stock and tries a change, and prints
// what happened for the parent to judge.
func TestReadOnlyChild(t *testing.T) {
	path := os.Getenv(readOnlyChildEnv)
	if path == "" {
		t.Skip("runs only as the child of TestReadOnlyStock")
	}
	ctx := context.Background()
	db, err := OpenExisting(ctx, path)
	if err != nil {
		fmt.Printf("OPEN: %v\n", err)
		return
	}
	defer db.Close()
	ts, err := db.ListTransistors(ctx, Filter{})
	fmt.Printf("LIST: %d lines, %v\n", len(ts), err)
	_, err = db.Adjust(ctx, 1, 1)
	fmt.Printf("ADJUST: readonly=%v %v\n", errors.Is(err, ErrReadOnly), err)
}

// Point 5 of the stock-safety issue: a stock the user may only read still
// serves reads, a change is refused with ErrReadOnly saying what is in the
// way, nothing is left behind, and a -shm left by another user gets a
// message saying what to do. Run as root, the reading side runs as user
// nobody (65534) in a child process, since root may write anything.
func TestReadOnlyStock(t *testing.T) {
	for _, tc := range []struct {
		name             string
		dirMode, dbMode  os.FileMode
		leftoverShm      bool
		wantAdjust       string
		wantNewFilesNone bool
	}{
		{"read-only file in a read-only folder", 0o555, 0o444, false, "stock.db is not writable by you", true},
		{"read-only file in a writable folder", 0o777, 0o444, false, "stock.db is not writable by you", true},
		{"another user's -shm", 0o777, 0o666, true, "left by another user", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ctx := context.Background()
			dir := sharedTempDir(t)
			path := filepath.Join(dir, "stock.db")
			w, err := Open(ctx, path)
			if err != nil {
				t.Fatal(err)
			}
			if _, err := w.AddTransistor(ctx, bc547(3, "A")); err != nil {
				t.Fatal(err)
			}
			if tc.leftoverShm {
				// Keep the writer's connection (and so its -shm) open, owned
				// by this user and not writable by the child.
				if _, err := w.ListTransistors(ctx, Filter{}); err != nil {
					t.Fatal(err)
				}
				defer w.Close()
				if os.Geteuid() != 0 {
					os.Chmod(path+"-shm", 0o444)
					os.Chmod(path+"-wal", 0o444)
				}
			} else {
				w.Close()
			}
			if err := os.Chmod(path, tc.dbMode); err != nil {
				t.Fatal(err)
			}
			if err := os.Chmod(dir, tc.dirMode); err != nil {
				t.Fatal(err)
			}
			defer os.Chmod(dir, 0o755)
			before, _ := os.ReadDir(dir)
			out := runAsReader(t, path)
			for _, want := range []string{"LIST: 1 lines, <nil>", "ADJUST: readonly=true", tc.wantAdjust} {
				if !strings.Contains(out, want) {
					t.Errorf("reader's output lacks %q:\n%s", want, out)
				}
			}
			if strings.Contains(out, "(8)") || strings.Contains(out, "(1544)") {
				t.Errorf("raw SQLite code in:\n%s", out)
			}
			if after, _ := os.ReadDir(dir); tc.wantNewFilesNone && len(after) != len(before) {
				t.Errorf("reading left files: %v -> %v", names(before), names(after))
			}
		})
	}
}

// sharedTempDir is a temporary folder the child user can reach.
func sharedTempDir(t *testing.T) string {
	t.Helper()
	dir, err := os.MkdirTemp("", "biasbin-readonly-")
	if err != nil {
		t.Fatal(err)
	}
	os.Chmod(dir, 0o755)
	t.Cleanup(func() { os.Chmod(dir, 0o755); os.RemoveAll(dir) })
	return dir
}

// runAsReader runs TestReadOnlyChild on path: as user nobody when this
// process is root, else as this user.
func runAsReader(t *testing.T, path string) string {
	t.Helper()
	exe, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	if os.Geteuid() == 0 {
		// The test binary sits in a folder only root may enter: copy it.
		bin := filepath.Join(sharedTempDir(t), "store.test")
		src, err := os.Open(exe)
		if err != nil {
			t.Fatal(err)
		}
		dst, err := os.OpenFile(bin, os.O_CREATE|os.O_WRONLY, 0o755)
		if err != nil {
			t.Fatal(err)
		}
		io.Copy(dst, src)
		src.Close()
		dst.Close()
		exe = bin
	}
	cmd := exec.Command(exe, "-test.run", "^TestReadOnlyChild$", "-test.v")
	cmd.Env = append(os.Environ(), readOnlyChildEnv+"="+path, "HOME=/tmp")
	if os.Geteuid() == 0 {
		cmd.SysProcAttr = &syscall.SysProcAttr{Credential: &syscall.Credential{Uid: 65534, Gid: 65534}}
	}
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("child: %v\n%s", err, out)
	}
	return string(out)
}
