package store

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestOpenExistingCreatesNothing: a missing file, with or without its
// folder, is ErrNoFile naming the path, and afterwards the folder holds
// nothing new (no file, no -wal, no -shm, no folder).
func TestOpenExistingCreatesNothing(t *testing.T) {
	for _, tc := range []struct {
		name string
		rel  string // path under a fresh temporary folder
	}{
		{"file missing", "stock.db"},
		{"folder missing", filepath.Join("no", "such", "stock.db")},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, tc.rel)
			db, err := OpenExisting(context.Background(), path)
			if err == nil {
				db.Close()
				t.Fatal("OpenExisting opened a missing file")
			}
			if !errors.Is(err, ErrNoFile) || !strings.Contains(err.Error(), path) {
				t.Errorf("error %q: want ErrNoFile naming %s", err, path)
			}
			if left, _ := os.ReadDir(dir); len(left) != 0 {
				t.Errorf("OpenExisting left %v in %s", names(left), dir)
			}
		})
	}
}

func names(es []os.DirEntry) []string {
	out := make([]string, len(es))
	for i, e := range es {
		out[i] = e.Name()
	}
	return out
}

// TestOpenExistingReadsWhileAnotherWrites opens an existing stock while
// another handle holds an open write transaction: with WAL the reader
// opens and sees the last committed stock, not the uncommitted line.
func TestOpenExistingReadsWhileAnotherWrites(t *testing.T) {
	ctx := context.Background()
	w, path := openTemp(t)
	if _, err := w.AddTransistor(ctx, bc547(3, "A")); err != nil {
		t.Fatal(err)
	}
	tx, err := w.x.BeginTxx(ctx, nil)
	if err != nil {
		t.Fatal(err)
	}
	defer tx.Rollback()
	tx.MustExec(`UPDATE parts SET qty = 99`)

	r, err := OpenExisting(ctx, path)
	if err != nil {
		t.Fatalf("OpenExisting during a write: %v", err)
	}
	defer r.Close()
	ts, err := r.ListTransistors(ctx, Filter{})
	if err != nil || len(ts) != 1 || ts[0].Qty != 3 {
		t.Fatalf("read during a write: %+v %v, want the committed line with 3", ts, err)
	}
}

// TestOpenExistingNeverRecreates removes the file under an open handle:
// a new pooled connection fails instead of making an empty file.
func TestOpenExistingNeverRecreates(t *testing.T) {
	ctx := context.Background()
	w, path := openTemp(t)
	w.Close()
	db, err := OpenExisting(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	held, err := db.x.Connx(ctx) // the pool's one idle connection
	if err != nil {
		t.Fatal(err)
	}
	defer held.Close()
	for _, p := range []string{path, path + "-wal", path + "-shm"} {
		if err := os.Remove(p); err != nil && !errors.Is(err, os.ErrNotExist) {
			t.Fatal(err)
		}
	}
	if c, err := db.x.Connx(ctx); err == nil {
		c.Close()
		t.Error("a new connection opened with the file gone")
	}
	if _, err := os.Stat(path); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("stock file came back: %v", err)
	}
}
