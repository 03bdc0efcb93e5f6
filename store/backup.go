package store

import (
	"context"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// ErrBackupExists means the backup's target file is already there; it is
// left as it was.
var ErrBackupExists = errors.New("backup file already exists")

// Backup writes a consistent copy of the stock file to path while other
// processes may go on writing: SQLite's VACUUM INTO reads one snapshot.
// The copy is written beside path under a temporary name and renamed into
// place, so path is either the whole copy or absent. An existing path is
// refused with ErrBackupExists.
func (db *DB) Backup(ctx context.Context, path string) error {
	if _, err := os.Lstat(path); err == nil {
		return fmt.Errorf("backup to %s: %w", path, ErrBackupExists)
	} else if !errors.Is(err, fs.ErrNotExist) {
		return fmt.Errorf("backup to %s: %w", path, err)
	}
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return fmt.Errorf("backup to %s: %w", path, err)
	}
	tmpName := tmp.Name()
	tmp.Close()
	os.Remove(tmpName) // VACUUM INTO wants to create the file itself
	defer os.Remove(tmpName)
	err = retry(ctx, func() error {
		_, err := db.x.ExecContext(ctx, `VACUUM INTO ?`, tmpName)
		return err
	})
	if err != nil {
		return fmt.Errorf("backup to %s: %w", path, err)
	}
	if err := syncFile(tmpName); err != nil {
		return fmt.Errorf("backup to %s: %w", path, err)
	}
	if err := os.Link(tmpName, path); err != nil {
		if errors.Is(err, fs.ErrExist) {
			return fmt.Errorf("backup to %s: %w", path, ErrBackupExists)
		}
		// No hard links on this file system: rename instead.
		if err := os.Rename(tmpName, path); err != nil {
			return fmt.Errorf("backup to %s: %w", path, err)
		}
	}
	return nil
}

// syncFile flushes a written file to disk.
func syncFile(name string) error {
	f, err := os.Open(name)
	if err != nil {
		return err
	}
	defer f.Close()
	return f.Sync()
}
