package store

import (
	"context"
	"errors"
	"fmt"
	"io/fs"
	"net/url"
	"os"
	"strings"

	"github.com/jmoiron/sqlx"
	_ "modernc.org/sqlite" // database/sql driver "sqlite"
	sqlite3 "modernc.org/sqlite/lib"

	"biasbin/migrations"
)

// DB is an open stock database.
type DB struct {
	x    *sqlx.DB
	path string
	// readOnly is set when the stock could only be opened for reading;
	// every write then fails with ErrReadOnly.
	readOnly bool
}

// busyTimeoutMS is how long a connection waits on another process's lock
// before SQLite reports SQLITE_BUSY.
const busyTimeoutMS = 10000

// dsn returns the data source name for path: the pragmas are in the DSN so
// that every pooled connection gets them, and write transactions begin
// IMMEDIATE.
func dsn(path string) string { return dsnBusy(path, busyTimeoutMS) }

// dsnExisting is dsn for a file that must already exist: SQLite's mode=rw
// makes every connection fail with SQLITE_CANTOPEN instead of creating a
// missing file.
func dsnExisting(path string) string { return dsn(path) + "&mode=rw" }

// dsnBusy is dsn with another busy timeout in milliseconds.
func dsnBusy(path string, busyMS int) string {
	q := url.Values{}
	q.Add("_pragma", fmt.Sprintf("busy_timeout(%d)", busyMS))
	q.Add("_pragma", "foreign_keys(1)")
	q.Add("_pragma", "journal_mode(wal)")
	q.Add("_pragma", "synchronous(full)")
	q.Set("_txlock", "immediate")
	return "file:" + escapePath(path) + "?" + q.Encode()
}

// escapePath keeps a file name with '?' or '#' from being read as a query.
func escapePath(p string) string {
	r := strings.NewReplacer("%", "%25", "?", "%3F", "#", "%23")
	return r.Replace(p)
}

// Open opens the stock database at path, creating the file if needed and
// bringing an older schema up to date. A database written by a newer
// biasbin is refused with ErrNewerSchema and left as it was.
//
// Open refuses what is not a stock file (a folder, a link to nothing, a
// file that is not an SQLite database) with ErrNotStockFile, and writes
// nothing into it.
func Open(ctx context.Context, path string) (*DB, error) {
	if err := checkStockPath(path, true); err != nil {
		return nil, err
	}
	if !writable(path) {
		return openReadOnly(ctx, path)
	}
	db, err := open(ctx, path, dsn(path))
	return db, explainOpen(path, err)
}

// OpenExisting opens the stock database at path like Open, but only when
// the file is already there: a missing file is reported with ErrNoFile and
// nothing is created (no file, no folder, no -wal or -shm). Every pooled
// connection opens without the create flag, so a file removed meanwhile is
// not made again either. Another process may write the stock meanwhile.
//
// A stock the user may only read (the file, its folder or a -shm left by
// another user is not writable) is opened read-only, immutable when SQLite
// cannot otherwise read it without writing; it serves every read and
// refuses every change with ErrReadOnly. What is not a stock file is
// refused as Open does, and so is an empty file (ErrEmptyFile).
func OpenExisting(ctx context.Context, path string) (*DB, error) {
	if err := checkStockPath(path, false); err != nil {
		return nil, err
	}
	if !writable(path) {
		return openReadOnly(ctx, path)
	}
	db, err := open(ctx, path, dsnExisting(path))
	if err != nil && sqliteCode(err)&0xff == sqlite3.SQLITE_CANTOPEN && missing(path) {
		return nil, fmt.Errorf("open stock file %s: %w", path, ErrNoFile)
	}
	if err != nil && readOnlyCause(err) {
		if ro, rerr := openReadOnly(ctx, path); rerr == nil {
			return ro, nil
		}
	}
	return db, explainOpen(path, err)
}

// missing reports whether nothing at all is at path.
func missing(path string) bool {
	_, err := os.Lstat(path)
	return errors.Is(err, fs.ErrNotExist)
}

// open opens path through the data source name dsn and readies its schema.
func open(ctx context.Context, path, dsn string) (*DB, error) {
	x, err := sqlx.Open("sqlite", dsn)
	if err != nil {
		return nil, fmt.Errorf("open stock file %s: %w", path, err)
	}
	db := &DB{x: x, path: path}
	if err := db.setup(ctx, path); err != nil {
		x.Close()
		return nil, err
	}
	return db, nil
}

func (db *DB) setup(ctx context.Context, path string) error {
	var mode string
	if err := retry(ctx, func() error {
		return db.x.GetContext(ctx, &mode, "PRAGMA journal_mode")
	}); err != nil {
		return fmt.Errorf("open stock file %s: %w", path, err)
	}
	if !strings.EqualFold(mode, "wal") {
		return fmt.Errorf("open stock file %s: %w (journal_mode is %q)", path, ErrNotWAL, mode)
	}
	if err := migrate(ctx, db.x, migrations.FS); err != nil {
		if errors.Is(err, ErrNewerSchema) {
			return fmt.Errorf("open stock file %s: %w", path, err)
		}
		return fmt.Errorf("upgrade stock file %s: %w", path, err)
	}
	return nil
}

// Close closes the database.
func (db *DB) Close() error {
	if db == nil || db.x == nil {
		return nil
	}
	return db.x.Close()
}
