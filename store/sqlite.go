package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"net/url"
	"time"

	"github.com/mattn/go-sqlite3"
)

// sqliteDialect keeps the library in one SQLite file: one writer connection
// whose immediate transactions already exclude every other writer, and a
// query-only pool for readers.
type sqliteDialect struct{}

// dsn builds the connection string with the settings every connection needs:
// WAL so readers never block the writer, foreign keys, a busy timeout, and
// immediate write transactions so a read-then-write waits for the lock
// instead of failing with SQLITE_BUSY (see DEVELOPERS.md).
func dsn(path string, readOnly bool) string {
	q := url.Values{}
	q.Set("_journal_mode", "WAL")
	q.Set("_busy_timeout", "5000")
	q.Set("_foreign_keys", "on")
	q.Set("_synchronous", "NORMAL")
	if readOnly {
		q.Set("_query_only", "1")
	} else {
		q.Set("_txlock", "immediate")
	}
	return "file:" + path + "?" + q.Encode()
}

func openSQLite(ctx context.Context, path string) (*Store, error) {
	w, err := sql.Open("sqlite3", dsn(path, false))
	if err != nil {
		return nil, fmt.Errorf("store: open %s: %w", path, err)
	}
	w.SetMaxOpenConns(1)
	d := sqliteDialect{}
	s := newStore(conn{w, d}, path)
	if err := pingSQLite(ctx, w, d); err != nil {
		w.Close()
		return nil, openError(path, err)
	}
	if err := s.migrate(ctx, sqliteMigrations); err != nil {
		w.Close()
		return nil, openError(path, err)
	}
	r, err := sql.Open("sqlite3", dsn(path, true))
	if err != nil {
		w.Close()
		return nil, fmt.Errorf("store: open reader %s: %w", path, err)
	}
	r.SetMaxOpenConns(4)
	s.read = conn{r, d}
	// Not being able to list the folder does not stop the library opening.
	s.RemovedRestoreCopies, _ = RemoveStaleRestoreCopies(path)
	return s, nil
}

// openBusyWait bounds how long opening a library waits for other processes
// opening it at the same moment (see pingSQLite).
const openBusyWait = 10 * time.Second

// pingSQLite makes the first connection. Its settings switch a new file to
// WAL, which needs the file to itself: when several servers open one new
// library at once, SQLite can answer "database is locked" at once, without
// waiting out the busy timeout (it would risk a deadlock), so the
// connection is tried again for up to openBusyWait.
func pingSQLite(ctx context.Context, db *sql.DB, d sqliteDialect) error {
	deadline := time.Now().Add(openBusyWait)
	for wait := 5 * time.Millisecond; ; wait = min(2*wait, 200*time.Millisecond) {
		err := db.PingContext(ctx)
		if err == nil || !d.isBusy(err) || time.Now().After(deadline) {
			return err
		}
		select {
		case <-ctx.Done():
			return ctx.Err()
		case <-time.After(wait):
		}
	}
}

func (sqliteDialect) rebind(q string) string                  { return q }
func (sqliteDialect) like() string                            { return "LIKE" }
func (sqliteDialect) foldCase(expr string) string             { return expr + " COLLATE NOCASE" }
func (sqliteDialect) forUpdate() string                       { return "" }
func (sqliteDialect) lock(context.Context, *txn, int64) error { return nil }

func (sqliteDialect) tagList() string {
	return `(SELECT group_concat(tag, char(31)) FROM (SELECT tag FROM case_tags t WHERE t.case_id = c.id ORDER BY tag))`
}

// integrity runs PRAGMA integrity_check and returns an error unless the
// answer is "ok".
func (sqliteDialect) integrity(ctx context.Context, db *sql.DB) error {
	var res string
	if err := db.QueryRowContext(ctx, `PRAGMA integrity_check`).Scan(&res); err != nil {
		return fmt.Errorf("store: integrity check: %w", err)
	}
	if res != "ok" {
		return fmt.Errorf("store: integrity check: %s", res)
	}
	return nil
}

// backup uses VACUUM INTO, which is safe while the server runs (readers and
// the writer carry on).
func (sqliteDialect) backup(ctx context.Context, db *sql.DB, dest string) error {
	if _, err := db.ExecContext(ctx, `VACUUM INTO ?`, dest); err != nil {
		return fmt.Errorf("store: backup to %s: %w", dest, err)
	}
	return nil
}

func (sqliteDialect) isBusy(err error) bool {
	var se sqlite3.Error
	return errors.As(err, &se) && (se.Code == sqlite3.ErrBusy || se.Code == sqlite3.ErrLocked)
}

func (sqliteDialect) isDuplicate(err error) bool {
	var se sqlite3.Error
	return errors.As(err, &se) && (se.ExtendedCode == sqlite3.ErrConstraintUnique || se.ExtendedCode == sqlite3.ErrConstraintPrimaryKey)
}

// openError names the real cause when SQLite could not open the library
// for writing (a read-only folder or file system, a full disk), where its
// own message can mislead ("no such file or directory").
func openError(path string, err error) error {
	if storageFault(err) != "" {
		if why := whyNotWritable(path); why != nil {
			return fmt.Errorf("store: open %s: the library cannot be written: %w", path, why)
		}
	}
	var se *StorageError
	if errors.As(err, &se) {
		return fmt.Errorf("store: open %s: %w", path, err)
	}
	return fmt.Errorf("store: open %s: %w", path, classify(err))
}
