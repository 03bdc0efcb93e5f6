package store

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

var (
	// ErrEmptyFile means the stock file is there but holds 0 bytes: it is
	// not a stock (a cut-off copy or a file made by hand), and nothing
	// writes into it.
	ErrEmptyFile = errors.New("stock file is empty (0 bytes)")
	// ErrNotStockFile means the path holds something that is not a stock
	// file: a folder, a dangling link or a file that is not an SQLite
	// database.
	ErrNotStockFile = errors.New("not a stock file")
	// ErrReadOnly means the stock could only be opened for reading (the
	// file, its folder or its -shm is not writable by this user) and a
	// change was asked for.
	ErrReadOnly = errors.New("stock file is read-only for this user")
)

// companionSuffixes are the files SQLite keeps beside a stock file.
var companionSuffixes = []string{"", "-wal", "-shm", "-journal"}

// StockFiles returns the stock file at path and the files SQLite keeps
// beside it (-wal, -shm, -journal); writing any of them destroys stock.
func StockFiles(path string) []string {
	out := make([]string, len(companionSuffixes))
	for i, s := range companionSuffixes {
		out[i] = path + s
	}
	return out
}

// IsStockFile reports whether out names the stock file at dbPath or one of
// its companion files (StockFiles), through any spelling of the path,
// symbolic link or hard link. It is the check a command makes before it
// writes a file the user named.
func IsStockFile(dbPath, out string) bool {
	outCanon := canonicalPath(out)
	outInfo, outErr := os.Stat(out)
	// SQLite keeps the -wal and -shm beside the file a link points to.
	for _, f := range append(StockFiles(dbPath), StockFiles(canonicalPath(dbPath))...) {
		if canonicalPath(f) == outCanon {
			return true
		}
		if outErr != nil {
			continue
		}
		if fi, err := os.Stat(f); err == nil && os.SameFile(fi, outInfo) {
			return true
		}
	}
	return false
}

// canonicalPath returns p absolute with every symbolic link resolved; for
// a path (or link target) that does not exist yet, its folder is resolved
// and its name kept.
func canonicalPath(p string) string {
	abs, err := filepath.Abs(p)
	if err != nil {
		return filepath.Clean(p)
	}
	for range 40 { // follow dangling links by hand, as the kernel would (ELOOP after 40)
		if real, err := filepath.EvalSymlinks(abs); err == nil {
			return real
		}
		target, err := os.Readlink(abs)
		if err != nil {
			break
		}
		if !filepath.IsAbs(target) {
			target = filepath.Join(filepath.Dir(abs), target)
		}
		abs = filepath.Clean(target)
	}
	dir, err := filepath.EvalSymlinks(filepath.Dir(abs))
	if err != nil {
		return abs
	}
	return filepath.Join(dir, filepath.Base(abs))
}

// checkStockPath reports what at path keeps it from being opened as a
// stock file: nothing there (ErrNoFile), a link to nothing, a folder, an
// empty file. With mayCreate (a command that adds parts) a missing or
// empty file is fine: it is made a new stock (an empty file holds nothing
// to lose, and another process may be creating it this moment).
func checkStockPath(path string, mayCreate bool) error {
	li, err := os.Lstat(path)
	if errors.Is(err, fs.ErrNotExist) {
		if mayCreate {
			return nil
		}
		return fmt.Errorf("open stock file %s: %w", path, ErrNoFile)
	}
	if err != nil {
		return fmt.Errorf("open stock file %s: %w", path, err)
	}
	fi, err := os.Stat(path)
	if li.Mode()&fs.ModeSymlink != 0 && errors.Is(err, fs.ErrNotExist) {
		target, _ := os.Readlink(path)
		return fmt.Errorf("open stock file %s: %w: it is a symbolic link to %s, which does not exist "+
			"(fix or remove the link, or name the file itself with --db)", path, ErrNotStockFile, target)
	}
	if err != nil {
		return fmt.Errorf("open stock file %s: %w", path, err)
	}
	switch {
	case fi.IsDir():
		return fmt.Errorf("open stock file %s: %w: it is a folder (name the file inside it, like %s)",
			path, ErrNotStockFile, filepath.Join(path, "stock.db"))
	case !fi.Mode().IsRegular():
		return fmt.Errorf("open stock file %s: %w: it is not a regular file", path, ErrNotStockFile)
	case fi.Size() == 0 && !mayCreate:
		return fmt.Errorf("open stock file %s: %w: it holds no stock; restore it from a backup, "+
			"or remove it to start a new stock", path, ErrEmptyFile)
	}
	return nil
}
