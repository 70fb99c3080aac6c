package store

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"github.com/jackc/pgx/v5/pgconn"
	"github.com/mattn/go-sqlite3"

	"fogbench/calc"
)

// StorageFault says why the library's storage refused a write.
type StorageFault string

const (
	// StorageFull: the disk (or the database's space) is full: SQLite's
	// SQLITE_FULL, PostgreSQL's disk_full (53100).
	StorageFull StorageFault = "full"
	// StorageReadOnly: the library cannot be written: SQLite's
	// SQLITE_READONLY or SQLITE_CANTOPEN (a read-only file, folder or
	// file system), PostgreSQL's read_only_sql_transaction (25006, a
	// read-only server or standby).
	StorageReadOnly StorageFault = "read-only"
)

// StorageError is a write the storage refused; the transaction was rolled
// back, so nothing of it was stored. Its chain holds a *calc.Error of code
// calc.Unavailable with the message for people, and the database's error.
type StorageError struct {
	Fault StorageFault
	Err   error
}

func (e *StorageError) Error() string { return "storage " + string(e.Fault) + ": " + e.Err.Error() }

// Message says what happened, for people.
func (e *StorageError) Message() string {
	if e.Fault == StorageFull {
		return "The disk holding the case library is full, so nothing was saved. Free some space on it."
	}
	return "The case library is read-only (its file, its folder or the disk cannot be written), so nothing was saved."
}

// Unwrap gives calc.ErrorCode the code and logs the database's error.
func (e *StorageError) Unwrap() []error {
	return []error{&calc.Error{Code: calc.Unavailable, Message: e.Message()}, e.Err}
}

// storageFault classifies a database error from either database.
func storageFault(err error) StorageFault {
	var se sqlite3.Error
	if errors.As(err, &se) {
		switch se.Code {
		case sqlite3.ErrFull:
			return StorageFull
		case sqlite3.ErrReadonly, sqlite3.ErrCantOpen:
			return StorageReadOnly
		}
		return ""
	}
	var pe *pgconn.PgError
	if errors.As(err, &pe) {
		switch pe.Code {
		case "53100": // disk_full
			return StorageFull
		case "25006": // read_only_sql_transaction
			return StorageReadOnly
		}
	}
	return ""
}

// classify turns a storage refusal into a *StorageError and leaves every
// other error (and nil) as it is.
func classify(err error) error {
	if err == nil {
		return nil
	}
	var already *StorageError
	if errors.As(err, &already) {
		return err
	}
	if f := storageFault(err); f != "" {
		return &StorageError{Fault: f, Err: err}
	}
	return err
}

// whyNotWritable finds the reason a SQLite library at path cannot be
// written, in the operating system's words ("read-only file system",
// "permission denied", "no space left on device"), or nil. SQLite reports
// a library in a read-only folder as "unable to open database file: no such
// file or directory" (it cannot create the -wal and -shm files beside it),
// which names the wrong cause.
func whyNotWritable(path string) error {
	dir := filepath.Dir(path)
	if _, err := os.Stat(dir); err != nil {
		return err // a folder that does not exist says so itself
	}
	f, err := os.CreateTemp(dir, ".fogbench-write-check-*")
	if err != nil {
		return fmt.Errorf("cannot create files in %s: %w", dir, osCause(err))
	}
	f.Close()
	os.Remove(f.Name())
	if _, err := os.Stat(path); err == nil {
		g, err := os.OpenFile(path, os.O_RDWR, 0)
		if err != nil {
			return fmt.Errorf("cannot write %s: %w", path, osCause(err))
		}
		g.Close()
	}
	return nil
}

// osCause strips the operation and path from an *os.PathError, leaving the
// system's reason.
func osCause(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}

// WriteCheck is what CheckWritable found.
type WriteCheck struct {
	// FreeBytes is the space left on a SQLite library's disk, -1 when
	// unknown (and for PostgreSQL).
	FreeBytes int64
}

// CheckWritable tries a write that changes nothing (an UPDATE of no row in
// a transaction that is rolled back), which the database refuses as it
// would a save when the library is read-only; the error is a
// *StorageError naming the cause. For SQLite it also reports the free
// space on the library's disk.
func (s *Store) CheckWritable(ctx context.Context) (WriteCheck, error) {
	wc := WriteCheck{FreeBytes: -1}
	if !s.IsPostgres() {
		wc.FreeBytes = freeBytes(filepath.Dir(s.path))
	}
	tx, err := s.write.begin(ctx)
	if err == nil {
		_, err = tx.ExecContext(ctx, `UPDATE schema_migrations SET version = version WHERE 1 = 0`)
		tx.Rollback()
	}
	if err != nil {
		if !s.IsPostgres() {
			if why := whyNotWritable(s.path); why != nil {
				return wc, &StorageError{Fault: StorageReadOnly, Err: why}
			}
		}
		return wc, fmt.Errorf("store: write check: %w", classify(err))
	}
	return wc, nil
}

// SimulateStorageFault makes the library refuse writes as a full disk
// (SQLite's max_page_count held at the current size, so a write that needs
// a new page fails with SQLITE_FULL) or a read-only file system would
// (query_only, which fails writes with SQLITE_READONLY), for tests and
// drills of what people are told. The real database errors come back.
// SQLite only; it lasts until the library is closed.
func (s *Store) SimulateStorageFault(ctx context.Context, f StorageFault) error {
	if s.IsPostgres() {
		return errors.New("store: SimulateStorageFault is for SQLite libraries")
	}
	var q string
	switch f {
	case StorageFull:
		var pages int64
		if err := s.write.db.QueryRowContext(ctx, `PRAGMA page_count`).Scan(&pages); err != nil {
			return err
		}
		q = fmt.Sprintf(`PRAGMA max_page_count = %d`, pages)
	case StorageReadOnly:
		q = `PRAGMA query_only = 1`
	default:
		return fmt.Errorf("store: no storage fault %q", f)
	}
	_, err := s.write.db.ExecContext(ctx, q)
	return err
}
