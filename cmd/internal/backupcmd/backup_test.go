package backupcmd

import (
	"bytes"
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"biasbin/cmd/internal/cmdtest"
	"biasbin/cmd/internal/cmdutil"
	"biasbin/store"
)

// TestBackupWritesAVerifiedCopyAndNeverOverwrites copies a stock file,
// opens the copy and checks it, then refuses to write over it.
func TestBackupWritesAVerifiedCopyAndNeverOverwrites(t *testing.T) {
	ctx := context.Background()
	dir := t.TempDir()
	path := filepath.Join(dir, "stock.db")
	db, err := store.Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := db.AddResistor(ctx, store.Resistor{Ohm: 4700, Tol: 0.05, Rated_W: 0.25, Qty: 7, Bin: "A"}); err != nil {
		t.Fatal(err)
	}
	db.Close()
	out := filepath.Join(dir, "copy.db")
	run := func() (string, error) {
		var o, e bytes.Buffer
		f := &cmdutil.Factory{IO: cmdtest.Streams(strings.NewReader(""), &o, &e), DBPath: path,
			Getenv: func(string) string { return "" }}
		defer f.Close()
		err := cmdtest.Execute(New(f), []string{out}, &o, &e)
		return o.String(), err
	}
	if got, err := run(); err != nil || got != "wrote "+out+"\n" {
		t.Fatalf("backup: %q %v", got, err)
	}
	cp, err := store.OpenExisting(ctx, out)
	if err != nil {
		t.Fatal(err)
	}
	rs, _ := cp.ListResistors(ctx, store.Filter{})
	ps, err := cp.Verify(ctx)
	cp.Close()
	if err != nil || len(ps) > 0 || len(rs) != 1 || rs[0].Qty != 7 {
		t.Fatalf("copy: %+v %v %v", rs, ps, err)
	}
	before, _ := os.ReadFile(out)
	_, err = run()
	if !errors.Is(err, store.ErrBackupExists) {
		t.Fatalf("second backup to the same file: %v", err)
	}
	if after, _ := os.ReadFile(out); !bytes.Equal(before, after) {
		t.Fatal("the existing file was changed")
	}
}
