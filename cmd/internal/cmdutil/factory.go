// Package cmdutil holds what every biasbin command shares: the streams, the
// lazily opened stock database and the error types mapped to exit codes.
package cmdutil

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"biasbin/store"
)

// Factory hands commands what they need without opening anything until a
// command asks for it, so --help and completion never touch the database.
type Factory struct {
	IO *IOStreams
	// DBPath is the --db flag's value ("" means BIASBIN_DB, then the default).
	DBPath string
	// Getenv reads the environment (os.Getenv outside tests).
	Getenv func(string) string

	db *store.DB
}

// New returns a factory over the process's streams and environment.
func New() *Factory {
	return &Factory{IO: System(), Getenv: os.Getenv}
}

// ResolveDBPath returns the stock file to use: --db, else $BIASBIN_DB, else
// $XDG_DATA_HOME/biasbin/stock.db, else ~/.local/share/biasbin/stock.db.
func (f *Factory) ResolveDBPath() (string, error) {
	if f.DBPath != "" {
		return f.DBPath, nil
	}
	getenv := f.Getenv
	if getenv == nil {
		getenv = os.Getenv
	}
	if p := getenv("BIASBIN_DB"); p != "" {
		return p, nil
	}
	if x := getenv("XDG_DATA_HOME"); x != "" {
		return filepath.Join(x, "biasbin", "stock.db"), nil
	}
	home := getenv("HOME")
	if home == "" {
		h, err := os.UserHomeDir()
		if err != nil {
			return "", fmt.Errorf("find the stock file: no --db, BIASBIN_DB or home directory: %w", err)
		}
		home = h
	}
	return filepath.Join(home, ".local", "share", "biasbin", "stock.db"), nil
}

// Store opens the stock database for a command that writes it, creating
// the file and its folder on first use, and returns the same handle
// afterwards.
func (f *Factory) Store(ctx context.Context) (*store.DB, error) {
	return f.open(ctx, func(ctx context.Context, path string) (*store.DB, error) {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			return nil, fmt.Errorf("create folder for stock file %s: %w", path, err)
		}
		return store.Open(ctx, path)
	})
}

// ExistingStore opens the stock database for a command that only reads
// it or that changes parts already stocked (adjust, remove, tag): the file
// must be there already. A missing file is a
// *NoStockFileError naming the path, and nothing is created (no file,
// folder, -wal or -shm), so a mistyped --db never reads as an empty stock.
// Another process may write the stock meanwhile.
func (f *Factory) ExistingStore(ctx context.Context) (*store.DB, error) {
	return f.open(ctx, func(ctx context.Context, path string) (*store.DB, error) {
		db, err := store.OpenExisting(ctx, path)
		if errors.Is(err, store.ErrNoFile) {
			return nil, &NoStockFileError{Path: path}
		}
		return db, err
	})
}

// open resolves the stock file's path and opens it with openPath on first
// use; later calls return the same handle.
func (f *Factory) open(ctx context.Context, openPath func(context.Context, string) (*store.DB, error)) (*store.DB, error) {
	if f.db != nil {
		return f.db, nil
	}
	path, err := f.ResolveDBPath()
	if err != nil {
		return nil, err
	}
	db, err := openPath(ctx, path)
	if err != nil {
		return nil, err
	}
	f.db = db
	return db, nil
}

// NoStockFileError means a command that needs an existing stock found no
// stock file; errors.Is(err, store.ErrNoFile) holds.
type NoStockFileError struct {
	// Path is the stock file looked for.
	Path string
}

func (e *NoStockFileError) Error() string {
	return fmt.Sprintf(`no stock file at %s: add parts with "biasbin stock add" or "biasbin stock import", `+
		"or name another file with --db PATH or BIASBIN_DB", e.Path)
}

// Unwrap returns store.ErrNoFile.
func (e *NoStockFileError) Unwrap() error { return store.ErrNoFile }

// Close closes the database if a command opened it.
func (f *Factory) Close() error {
	if f.db == nil {
		return nil
	}
	err := f.db.Close()
	f.db = nil
	return err
}

// UsageError is a mistake in how a command was called (exit status 2).
type UsageError struct{ Err error }

func (e *UsageError) Error() string { return e.Err.Error() }
func (e *UsageError) Unwrap() error { return e.Err }

// Usagef returns a UsageError with a formatted message.
func Usagef(format string, a ...any) error {
	return &UsageError{Err: fmt.Errorf(format, a...)}
}

// ErrSilent means the command already reported the problem; exit 1.
var ErrSilent = errors.New("silent error")

// ExitCode maps an error returned by a command to the process exit status:
// 0 success, 2 usage, 1 anything else.
func ExitCode(err error) int {
	if err == nil {
		return 0
	}
	var u *UsageError
	if errors.As(err, &u) {
		return 2
	}
	return 1
}
