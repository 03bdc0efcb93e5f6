package store

import (
	"context"
	"errors"
	"fmt"
	"net/url"
	"os"

	"github.com/jmoiron/sqlx"
	sqlite3 "modernc.org/sqlite/lib"

	"biasbin/migrations"
)

// readOnlyCause reports whether err means SQLite could not get write
// access to the stock file, its folder or its -shm.
func readOnlyCause(err error) bool {
	c := sqliteCode(err) & 0xff
	return c == sqlite3.SQLITE_READONLY || c == sqlite3.SQLITE_CANTOPEN || c == sqlite3.SQLITE_PERM ||
		c == sqlite3.SQLITE_IOERR
}

// dsnReadOnly is the data source name of a stock opened for reading only;
// immutable tells SQLite the file cannot change, so it reads without the
// -shm (needed when the folder is not writable and there is no -shm).
func dsnReadOnly(path string, immutable bool) string {
	q := url.Values{}
	q.Add("_pragma", fmt.Sprintf("busy_timeout(%d)", busyTimeoutMS))
	q.Add("_pragma", "foreign_keys(1)")
	q.Set("mode", "ro")
	if immutable {
		q.Set("immutable", "1")
	}
	return "file:" + escapePath(path) + "?" + q.Encode()
}

// openReadOnly opens an existing stock for reading only: sharing the -shm
// with writers when there is one, else (or when SQLite cannot use it) as an
// immutable file, so that reading never leaves a -wal or -shm behind for
// the owner to trip over. The schema must be up to date (an upgrade would
// write).
func openReadOnly(ctx context.Context, path string) (*DB, error) {
	var last error
	modes := []bool{true}
	if _, err := os.Stat(path + "-shm"); err == nil {
		modes = []bool{false, true}
	}
	for _, immutable := range modes {
		x, err := sqlx.Open("sqlite", dsnReadOnly(path, immutable))
		if err != nil {
			return nil, fmt.Errorf("open stock file %s: %w", path, err)
		}
		db := &DB{x: x, path: path, readOnly: true}
		if err := db.checkSchemaReadOnly(ctx); err != nil {
			x.Close()
			if errors.Is(err, ErrNewerSchema) || errors.Is(err, errOldSchema) {
				return nil, fmt.Errorf("open stock file %s: %w", path, err)
			}
			last = err
			continue
		}
		return db, nil
	}
	return nil, fmt.Errorf("open stock file %s read-only: %w", path, last)
}

// errOldSchema means a read-only stock was written by an older biasbin and
// would need an upgrade, which needs write access.
var errOldSchema = errors.New("stock file was written by an older biasbin and must be upgraded " +
	"by a user who may write it (any biasbin command run by that user does it)")

// checkSchemaReadOnly reads the applied migrations (which also proves the
// file can be read) and compares them with the embedded ones.
func (db *DB) checkSchemaReadOnly(ctx context.Context) error {
	applied, err := appliedMigrations(ctx, db.x)
	if err != nil {
		return err
	}
	files, err := migrationFiles(migrations.FS)
	if err != nil {
		return err
	}
	known := map[string]bool{}
	for _, f := range files {
		known[f] = true
		if !applied[f] {
			return errOldSchema
		}
	}
	for name := range applied {
		if !known[name] {
			return ErrNewerSchema
		}
	}
	return nil
}

// refuseWrite returns ErrReadOnly, saying which file is in the way, when
// db was opened for reading only.
func (db *DB) refuseWrite() error {
	if !db.readOnly {
		return nil
	}
	return readOnlyError(db.path)
}

// readOnlyError says what keeps this user from writing the stock at path
// and what to do about it.
func readOnlyError(path string) error {
	what := notWritable(path)
	if !writable(path + "-shm") {
		return fmt.Errorf("%w: %s (left by another user's biasbin or sqlite3); it goes away when that "+
			"user runs any biasbin command on this stock, or delete it while no program has the stock open",
			ErrReadOnly, what)
	}
	return fmt.Errorf("%w: %s; ask its owner to make the change, or copy the stock file and use the copy "+
		"with --db", ErrReadOnly, what)
}

// writable reports whether this user may write the file at path (true
// when there is none yet).
func writable(path string) bool {
	fh, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return !errors.Is(err, os.ErrPermission)
	}
	fh.Close()
	return true
}

// notWritable names what keeps this user from writing the stock at path.
func notWritable(path string) string {
	for _, f := range StockFiles(path)[:3] {
		if !writable(f) {
			return f + " is not writable by you"
		}
	}
	return "its folder is not writable by you"
}

// explainOpen turns SQLite's codes for a file it cannot use into messages
// that say what to do; nil and other errors pass through.
func explainOpen(path string, err error) error {
	if err == nil {
		return nil
	}
	switch c := sqliteCode(err); {
	case c&0xff == sqlite3.SQLITE_NOTADB:
		return fmt.Errorf("open stock file %s: %w: the file is not an SQLite database "+
			"(a CSV file belongs to \"biasbin stock import\")", path, ErrNotStockFile)
	case readOnlyCause(err) && c&0xff != sqlite3.SQLITE_IOERR:
		return fmt.Errorf("open stock file %s: %w", path, readOnlyError(path))
	}
	return err
}
