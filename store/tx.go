package store

import (
	"context"
	"database/sql"
	"fmt"
	"time"

	"github.com/jmoiron/sqlx"
	sqlite3 "modernc.org/sqlite/lib"
)

// retryFor bounds how long a write keeps retrying after SQLITE_BUSY on top
// of the connection's own busy_timeout.
const retryFor = 60 * time.Second

// retry runs fn again while it fails with SQLITE_BUSY, backing off, until
// retryFor has passed or ctx ends.
func retry(ctx context.Context, fn func() error) error {
	deadline := time.Now().Add(retryFor)
	wait := 5 * time.Millisecond
	for {
		err := fn()
		if err == nil || !isBusy(err) || time.Now().After(deadline) {
			return err
		}
		select {
		case <-ctx.Done():
			return ctx.Err()
		case <-time.After(wait):
		}
		if wait < 200*time.Millisecond {
			wait *= 2
		}
	}
}

// write runs fn in one IMMEDIATE transaction, committing when fn returns
// nil and rolling back otherwise; a busy database is retried from the start.
func (db *DB) write(ctx context.Context, fn func(tx *sqlx.Tx) error) error {
	if err := db.refuseWrite(); err != nil {
		return err
	}
	return retry(ctx, func() error {
		tx, err := db.x.BeginTxx(ctx, nil)
		if err != nil && sqliteCode(err)&0xff == sqlite3.SQLITE_READONLY {
			return readOnlyError(db.path)
		}
		if err != nil {
			return fmt.Errorf("begin write: %w", err)
		}
		if err := fn(tx); err != nil {
			tx.Rollback()
			return err
		}
		if err := tx.Commit(); err != nil {
			return fmt.Errorf("commit: %w", err)
		}
		return nil
	})
}

// writeStream runs fn once in one IMMEDIATE transaction, committing when
// fn returns nil: only taking the write lock is retried while another
// process holds it, so fn may consume a stream.
func (db *DB) writeStream(ctx context.Context, fn func(tx *sqlx.Tx) error) error {
	if err := db.refuseWrite(); err != nil {
		return err
	}
	var tx *sqlx.Tx
	err := retry(ctx, func() error {
		var err error
		tx, err = db.x.BeginTxx(ctx, nil)
		return err
	})
	if err != nil && sqliteCode(err)&0xff == sqlite3.SQLITE_READONLY {
		return readOnlyError(db.path)
	}
	if err != nil {
		return fmt.Errorf("begin write: %w", err)
	}
	if err := fn(tx); err != nil {
		tx.Rollback()
		return err
	}
	if err := tx.Commit(); err != nil {
		return fmt.Errorf("commit: %w", err)
	}
	return nil
}

// read runs fn in one read-only (deferred) transaction, so that its queries
// see one snapshot of the stock.
func (db *DB) read(ctx context.Context, fn func(tx *sqlx.Tx) error) error {
	return retry(ctx, func() error {
		tx, err := db.x.BeginTxx(ctx, &sql.TxOptions{ReadOnly: true})
		if err != nil {
			return fmt.Errorf("begin read: %w", err)
		}
		defer tx.Rollback()
		return fn(tx)
	})
}
