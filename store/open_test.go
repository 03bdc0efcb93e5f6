package store

import (
	"context"
	"crypto/sha256"
	"errors"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"
	"testing"
	"testing/fstest"

	"github.com/jmoiron/sqlx"

	"biasbin/migrations"
)

// TestPragmasOnEveryConnection holds several pooled connections at once and
// checks each got the DSN's pragmas.
func TestPragmasOnEveryConnection(t *testing.T) {
	db, _ := openTemp(t)
	ctx := context.Background()
	const n = 4
	conns := make([]*sqlx.Conn, n)
	for i := range conns {
		c, err := db.x.Connx(ctx)
		if err != nil {
			t.Fatal(err)
		}
		conns[i] = c
	}
	defer func() {
		for _, c := range conns {
			c.Close()
		}
	}()
	for i, c := range conns {
		for _, tc := range []struct{ pragma, want string }{
			{"journal_mode", "wal"},
			{"foreign_keys", "1"},
			{"busy_timeout", "10000"},
			{"synchronous", "2"}, // FULL
		} {
			var got string
			if err := c.GetContext(ctx, &got, "PRAGMA "+tc.pragma); err != nil {
				t.Fatalf("conn %d: PRAGMA %s: %v", i, tc.pragma, err)
			}
			if got != tc.want {
				t.Errorf("conn %d: PRAGMA %s = %q, want %q", i, tc.pragma, got, tc.want)
			}
		}
	}
}

// TestWriteTransactionsAreImmediate checks that a write transaction holds
// the write lock from BEGIN: a second writer cannot begin while it is open.
func TestWriteTransactionsAreImmediate(t *testing.T) {
	db, path := openTemp(t)
	ctx := context.Background()
	other, err := sqlx.Open("sqlite", dsnBusy(path, 0))
	if err != nil {
		t.Fatal(err)
	}
	defer other.Close()
	tx, err := db.x.BeginTxx(ctx, nil)
	if err != nil {
		t.Fatal(err)
	}
	defer tx.Rollback()
	tx2, err := other.BeginTxx(ctx, nil)
	if err == nil {
		tx2.Rollback()
		t.Fatal("a second BEGIN succeeded while a write transaction was open: transactions are not IMMEDIATE")
	}
	if !isBusy(err) {
		t.Fatalf("second BEGIN: %v, want SQLITE_BUSY", err)
	}
}

func TestFreshFileGetsEveryMigration(t *testing.T) {
	db, _ := openTemp(t)
	var got []string
	if err := db.x.Select(&got, `SELECT name FROM schema_migrations ORDER BY name`); err != nil {
		t.Fatal(err)
	}
	want, err := migrationFiles(migrations.FS)
	if err != nil {
		t.Fatal(err)
	}
	if len(want) < 2 || strings.Join(got, ",") != strings.Join(want, ",") {
		t.Fatalf("applied %v, want %v", got, want)
	}
}

// TestUpgradeFromOldestSchema makes a stock file with only the first
// migration, stocks a part in it, and opens it with the full binary.
func TestUpgradeFromOldestSchema(t *testing.T) {
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "old.db")
	names, err := migrationFiles(migrations.FS)
	if err != nil {
		t.Fatal(err)
	}
	first, err := migrations.FS.ReadFile(names[0])
	if err != nil {
		t.Fatal(err)
	}
	x, err := sqlx.Open("sqlite", dsn(path))
	if err != nil {
		t.Fatal(err)
	}
	if err := migrate(ctx, x, fstest.MapFS{names[0]: {Data: first}}); err != nil {
		t.Fatal(err)
	}
	x.MustExec(`INSERT INTO parts (id, kind, ident, qty, bin) VALUES (7, 'resistor', '4700|0.05|0.25|metal film', 12, 'A1')`)
	x.MustExec(`INSERT INTO resistors (part_id, ohm, tol, rated_w, knee_c, max_c, tcr_ppm_per_k, tech)
		VALUES (7, 4700, 0.05, 0.25, 70, 155, 50, 'metal film')`)
	x.Close()

	db, err := Open(ctx, path)
	if err != nil {
		t.Fatalf("open old file: %v", err)
	}
	defer db.Close()
	if _, err := db.Tag(ctx, 7, "approved"); err != nil {
		t.Fatalf("tag after upgrade: %v", err)
	}
	r, err := db.ResistorByID(ctx, 7)
	if err != nil {
		t.Fatal(err)
	}
	if r.Qty != 12 || r.Ohm != 4700 || len(r.Tags) != 1 || r.Tech != TechMetalFilm || r.TCR_PPMPerK != 50 ||
		r.LEV_V != 0 || r.PartNumber != "" {
		t.Fatalf("after upgrade: %+v", r)
	}
	if ps, err := db.Verify(ctx); err != nil || len(ps) > 0 {
		t.Fatalf("verify after upgrade: %v %v", ps, err)
	}
}

// fileSum hashes the database file and its WAL (if any).
func fileSum(t *testing.T, path string) [32]byte {
	t.Helper()
	h := sha256.New()
	for _, p := range []string{path, path + "-wal"} {
		b, err := os.ReadFile(p)
		if err != nil && !errors.Is(err, os.ErrNotExist) {
			t.Fatal(err)
		}
		h.Write(b)
	}
	var s [32]byte
	copy(s[:], h.Sum(nil))
	return s
}

// TestNewerSchemaIsRefusedAndUntouched records a migration this binary does
// not have, as a newer biasbin would, and checks Open refuses the file with
// a clear message and leaves its bytes as they were.
func TestNewerSchemaIsRefusedAndUntouched(t *testing.T) {
	ctx := context.Background()
	db, path := openTemp(t)
	if _, err := db.AddResistor(ctx, r4k7(5, "A1")); err != nil {
		t.Fatal(err)
	}
	db.x.MustExec(`INSERT INTO schema_migrations (name) VALUES ('9001_future.sql')`)
	db.Close()
	before := fileSum(t, path)

	db2, err := Open(ctx, path)
	if err == nil {
		db2.Close()
		t.Fatal("Open accepted a file with an unknown migration")
	}
	if !errors.Is(err, ErrNewerSchema) {
		t.Fatalf("error %v, want ErrNewerSchema", err)
	}
	for _, want := range []string{"newer biasbin", "9001_future.sql", "not changed", path} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("message %q lacks %q", err, want)
		}
	}
	if after := fileSum(t, path); after != before {
		t.Fatal("refused file was modified")
	}
}

func TestMigrationNamesAreChecked(t *testing.T) {
	for _, tc := range []struct {
		name    string
		files   []string
		wantErr bool
	}{
		{"in order", []string{"0002_b.sql", "0001_a.sql", "README.md"}, false},
		{"bad name", []string{"0001_a.sql", "2_b.sql"}, true},
		{"upper case", []string{"0001_A.sql"}, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			fsys := fstest.MapFS{}
			for _, f := range tc.files {
				fsys[f] = &fstest.MapFile{Data: []byte("SELECT 1;")}
			}
			got, err := migrationFiles(fsys)
			if (err != nil) != tc.wantErr {
				t.Fatalf("err = %v, wantErr %v", err, tc.wantErr)
			}
			if err == nil && !sort.StringsAreSorted(got) {
				t.Fatalf("not sorted: %v", got)
			}
		})
	}
}

// TestConcurrentOpenMigratesOnce opens a fresh file from several goroutines
// at once: every Open succeeds and each migration is recorded once.
func TestConcurrentOpenMigratesOnce(t *testing.T) {
	path := filepath.Join(t.TempDir(), "stock.db")
	var wg sync.WaitGroup
	errs := make([]error, 4)
	for i := range errs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			db, err := Open(context.Background(), path)
			if err == nil {
				db.Close()
			}
			errs[i] = err
		}()
	}
	wg.Wait()
	for i, err := range errs {
		if err != nil {
			t.Fatalf("open %d: %v", i, err)
		}
	}
	db, err := Open(context.Background(), path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	var n int
	db.x.Get(&n, `SELECT count(*) FROM schema_migrations`)
	want, _ := migrationFiles(migrations.FS)
	if n != len(want) {
		t.Fatalf("%d migrations recorded, want %d", n, len(want))
	}
}
