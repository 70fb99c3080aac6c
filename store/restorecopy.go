package store

import (
	"os"
	"path/filepath"
	"strings"
)

// restoreCopyPrefix names the temporary copies RestoreFile writes beside a
// library before renaming one over it: .LIB.restore-RANDOM (and that
// copy's -wal, -shm and -journal files).
func restoreCopyPrefix(dest string) string { return "." + filepath.Base(dest) + ".restore-" }

// RemoveStaleRestoreCopies deletes the temporary copies a restore of the
// library at dest left behind when it was killed (each as large as the
// library), and returns their paths. A restore in progress holds a lock on
// the library's folder while its copy exists; when another process holds
// it, nothing is removed. Open calls it for every SQLite library, so the
// next start cleans up; RestoreFile calls it under its own lock.
func RemoveStaleRestoreCopies(dest string) ([]string, error) {
	if IsPostgres(dest) {
		return nil, nil
	}
	unlock, ok := lockFolder(filepath.Dir(dest), false)
	if !ok {
		return nil, nil // a restore is running: its copy is not stale
	}
	defer unlock()
	return removeRestoreCopies(dest)
}

// removeRestoreCopies deletes every restore copy of dest; the caller holds
// the folder lock.
func removeRestoreCopies(dest string) ([]string, error) {
	dir := filepath.Dir(dest)
	entries, err := os.ReadDir(dir)
	if err != nil {
		return nil, err
	}
	prefix := restoreCopyPrefix(dest)
	var removed []string
	for _, e := range entries {
		if e.IsDir() || !strings.HasPrefix(e.Name(), prefix) {
			continue
		}
		p := filepath.Join(dir, e.Name())
		if err := os.Remove(p); err != nil && !os.IsNotExist(err) {
			return removed, err
		}
		removed = append(removed, p)
	}
	return removed, nil
}
