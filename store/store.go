// Package store keeps fogbench's case library in SQLite: one database file
// shared by a team, written through one connection in immediate transactions
// and read through a small pool, with numbered migrations embedded in the
// binary.
package store

import (
	"context"
	"database/sql"
	"embed"
	"errors"
	"fmt"
	"io/fs"
	"net/url"
	"path"
	"sort"
	"strconv"
	"strings"
	"time"

	"github.com/mattn/go-sqlite3"
)

//go:embed migrations/*.sql
var migrationFS embed.FS

// Store is the case library.
type Store struct {
	write *sql.DB // one connection: SQLite has one writer at a time
	read  *sql.DB // query-only pool
	path  string
	// Now is the clock; tests replace it.
	Now func() time.Time
}

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

// Open opens (creating if needed) the library at path and applies any
// migrations it lacks.
func Open(ctx context.Context, path string) (*Store, error) {
	w, err := sql.Open("sqlite3", dsn(path, false))
	if err != nil {
		return nil, fmt.Errorf("store: open %s: %w", path, err)
	}
	w.SetMaxOpenConns(1)
	s := &Store{write: w, path: path, Now: func() time.Time { return time.Now().UTC() }}
	if err := w.PingContext(ctx); err != nil {
		w.Close()
		return nil, fmt.Errorf("store: open %s: %w", path, err)
	}
	if err := s.migrate(ctx); err != nil {
		w.Close()
		return nil, err
	}
	r, err := sql.Open("sqlite3", dsn(path, true))
	if err != nil {
		w.Close()
		return nil, fmt.Errorf("store: open reader %s: %w", path, err)
	}
	r.SetMaxOpenConns(4)
	s.read = r
	return s, nil
}

// Close closes both pools.
func (s *Store) Close() error {
	return errors.Join(s.read.Close(), s.write.Close())
}

// Path is the database file.
func (s *Store) Path() string { return s.path }

type migration struct {
	version int
	name    string
	sql     string
}

func loadMigrations() ([]migration, error) {
	entries, err := fs.ReadDir(migrationFS, "migrations")
	if err != nil {
		return nil, err
	}
	var ms []migration
	for _, e := range entries {
		base := e.Name()
		num, name, ok := strings.Cut(strings.TrimSuffix(base, ".sql"), "_")
		v, err := strconv.Atoi(num)
		if !ok || err != nil {
			return nil, fmt.Errorf("store: migration %s: name must be NNNN_name.sql", base)
		}
		body, err := migrationFS.ReadFile(path.Join("migrations", base))
		if err != nil {
			return nil, err
		}
		ms = append(ms, migration{v, name, string(body)})
	}
	sort.Slice(ms, func(i, j int) bool { return ms[i].version < ms[j].version })
	for i := 1; i < len(ms); i++ {
		// Two files with one number would leave the second silently
		// unapplied, since the version is what records a migration.
		if ms[i].version == ms[i-1].version {
			return nil, fmt.Errorf("store: migrations %04d_%s and %04d_%s share a number", ms[i-1].version, ms[i-1].name, ms[i].version, ms[i].name)
		}
	}
	return ms, nil
}

// migrate applies each migration the database lacks, each in its own
// transaction together with the row that records it.
func (s *Store) migrate(ctx context.Context) error {
	if _, err := s.write.ExecContext(ctx, `CREATE TABLE IF NOT EXISTS schema_migrations (
		version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)`); err != nil {
		return fmt.Errorf("store: create schema_migrations: %w", err)
	}
	ms, err := loadMigrations()
	if err != nil {
		return err
	}
	for _, m := range ms {
		if err := s.applyMigration(ctx, m); err != nil {
			return err
		}
	}
	return nil
}

func (s *Store) applyMigration(ctx context.Context, m migration) error {
	tx, err := s.write.BeginTx(ctx, nil)
	if err != nil {
		return fmt.Errorf("store: migration %04d: %w", m.version, err)
	}
	defer tx.Rollback()
	var n int
	if err := tx.QueryRowContext(ctx, `SELECT count(*) FROM schema_migrations WHERE version = ?`, m.version).Scan(&n); err != nil {
		return fmt.Errorf("store: migration %04d: %w", m.version, err)
	}
	if n > 0 {
		return nil
	}
	if _, err := tx.ExecContext(ctx, m.sql); err != nil {
		return fmt.Errorf("store: migration %04d_%s: %w", m.version, m.name, err)
	}
	if _, err := tx.ExecContext(ctx, `INSERT INTO schema_migrations(version, name, applied_at) VALUES (?, ?, ?)`,
		m.version, m.name, s.Now().Format(time.RFC3339Nano)); err != nil {
		return fmt.Errorf("store: record migration %04d: %w", m.version, err)
	}
	return tx.Commit()
}

// SchemaVersion is the highest applied migration.
func (s *Store) SchemaVersion(ctx context.Context) (int, error) {
	var v sql.NullInt64
	err := s.read.QueryRowContext(ctx, `SELECT max(version) FROM schema_migrations`).Scan(&v)
	return int(v.Int64), err
}

// IntegrityCheck runs PRAGMA integrity_check and returns an error unless the
// answer is "ok".
func (s *Store) IntegrityCheck(ctx context.Context) error {
	var res string
	if err := s.write.QueryRowContext(ctx, `PRAGMA integrity_check`).Scan(&res); err != nil {
		return fmt.Errorf("store: integrity check: %w", err)
	}
	if res != "ok" {
		return fmt.Errorf("store: integrity check: %s", res)
	}
	return nil
}

// Backup writes a consistent copy of the library to dest with VACUUM INTO,
// which is safe while the server runs (readers and the writer carry on).
func (s *Store) Backup(ctx context.Context, dest string) error {
	if _, err := s.write.ExecContext(ctx, `VACUUM INTO ?`, dest); err != nil {
		return fmt.Errorf("store: backup to %s: %w", dest, err)
	}
	return nil
}

// isBusy reports SQLite lock contention that outlasted the busy timeout.
func isBusy(err error) bool {
	var se sqlite3.Error
	return errors.As(err, &se) && (se.Code == sqlite3.ErrBusy || se.Code == sqlite3.ErrLocked)
}
