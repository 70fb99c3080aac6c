// Package store keeps fogbench's case library in SQLite (one file, the
// default) or in PostgreSQL (a database several servers share). Both run the
// same code and the same SQL through a small dialect (dialect.go,
// sqlite.go, postgres.go), with numbered migrations for each database
// embedded in the binary and kept in step.
package store

import (
	"context"
	"database/sql"
	"embed"
	"errors"
	"fmt"
	"io/fs"
	"path"
	"sort"
	"strconv"
	"strings"
	"time"
)

// Each database has its own migrations with the same numbered names:
// migrations/ for SQLite, migrations_pg/ for PostgreSQL.
//
//go:embed migrations/*.sql migrations_pg/*.sql
var migrationFS embed.FS

const (
	sqliteMigrations   = "migrations"
	postgresMigrations = "migrations_pg"
)

// Store is the case library, in either database.
type Store struct {
	write conn // SQLite: one connection, one writer at a time
	read  conn // SQLite: query-only pool; PostgreSQL: the same pool as write
	d     dialect
	path  string
	// Clock is the time source; tests replace it.
	Clock func() time.Time
	// RemovedRestoreCopies are the copies a killed restore had left beside
	// the library, removed when it was opened (RemoveStaleRestoreCopies).
	RemovedRestoreCopies []string
}

func newStore(w conn, path string) *Store {
	return &Store{write: w, read: w, d: w.d, path: path, Clock: func() time.Time { return time.Now().UTC() }}
}

// Open opens the library named by dsnOrPath, creating it if needed, and
// applies any migrations it lacks: a postgres:// or postgresql:// URL opens
// a PostgreSQL database (which must exist), anything else is a SQLite file.
func Open(ctx context.Context, dsnOrPath string) (*Store, error) {
	if IsPostgres(dsnOrPath) {
		return openPostgres(ctx, dsnOrPath)
	}
	return openSQLite(ctx, dsnOrPath)
}

// Now is the store's clock.
func (s *Store) Now() time.Time { return s.Clock() }

// Close closes the connections.
func (s *Store) Close() error {
	if s.read.db == s.write.db {
		return s.write.db.Close()
	}
	return errors.Join(s.read.db.Close(), s.write.db.Close())
}

// Path is the database file, or the PostgreSQL URL without its password.
func (s *Store) Path() string { return s.path }

// IsPostgres reports whether the library lives in PostgreSQL.
func (s *Store) IsPostgres() bool {
	_, ok := s.d.(postgresDialect)
	return ok
}

type migration struct {
	version int
	name    string
	sql     string
}

func loadMigrations(dir string) ([]migration, error) {
	entries, err := fs.ReadDir(migrationFS, dir)
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
		body, err := migrationFS.ReadFile(path.Join(dir, base))
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
// transaction together with the row that records it. The transaction first
// takes the migration lock (PostgreSQL: an advisory lock; SQLite: the
// immediate transaction's write lock), so two servers starting at once
// apply each migration once.
func (s *Store) migrate(ctx context.Context, dir string) error {
	ms, err := loadMigrations(dir)
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
	tx, err := s.write.begin(ctx)
	if err != nil {
		return fmt.Errorf("store: migration %04d: %w", m.version, err)
	}
	defer tx.Rollback()
	if err := s.d.lock(ctx, tx, lockMigrate); err != nil {
		return fmt.Errorf("store: migration %04d: lock: %w", m.version, err)
	}
	if _, err := tx.ExecContext(ctx, `CREATE TABLE IF NOT EXISTS schema_migrations (
		version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)`); err != nil {
		return fmt.Errorf("store: create schema_migrations: %w", err)
	}
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

// IntegrityCheck runs the database's own check (SQLite: PRAGMA
// integrity_check must answer "ok") and then the library's: every case's
// newest revision is stored, with the case's checksum.
func (s *Store) IntegrityCheck(ctx context.Context) error {
	if err := s.d.integrity(ctx, s.write.db); err != nil {
		return err
	}
	var bad int
	if err := s.write.QueryRowContext(ctx, `SELECT count(*) FROM cases c
		LEFT JOIN revisions r ON r.case_id = c.id AND r.revision = c.revision
		WHERE r.case_id IS NULL OR r.checksum <> c.checksum`).Scan(&bad); err != nil {
		return fmt.Errorf("store: integrity check: %w", err)
	}
	if bad > 0 {
		return fmt.Errorf("store: integrity check: %d cases lack their newest revision", bad)
	}
	return nil
}

// Backup writes a consistent copy of a SQLite library to dest (VACUUM INTO,
// safe while the server runs). A PostgreSQL library is backed up with
// pg_dump; Backup says so as an invalid-input error.
func (s *Store) Backup(ctx context.Context, dest string) error {
	return s.d.backup(ctx, s.write.db, dest)
}
