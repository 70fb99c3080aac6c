package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"net/url"
	"strings"
	"time"

	"github.com/jackc/pgx/v5"
	"github.com/jackc/pgx/v5/pgconn"
	"github.com/jackc/pgx/v5/stdlib"

	"fogbench/calc"
)

// postgresDialect keeps the library in a PostgreSQL database shared by any
// number of fogbench servers: one pool for reads and writes, row locks
// (SELECT … FOR UPDATE) around each read-then-write of a case or liquid,
// and advisory locks for migrations, seeding and imports.
type postgresDialect struct{}

// IsPostgres reports whether -db names a PostgreSQL database (a postgres://
// or postgresql:// URL) rather than a SQLite file.
func IsPostgres(dsnOrPath string) bool {
	return strings.HasPrefix(dsnOrPath, "postgres://") || strings.HasPrefix(dsnOrPath, "postgresql://")
}

// redact hides a password in a PostgreSQL URL for logs and messages.
func redact(dsn string) string {
	u, err := url.Parse(dsn)
	if err != nil {
		return "postgres://…"
	}
	return u.Redacted()
}

func openPostgres(ctx context.Context, dsn string) (*Store, error) {
	cfg, err := pgx.ParseConfig(dsn)
	if err != nil {
		return nil, calc.Errorf(calc.Invalid, "-db %s: %v", redact(dsn), err)
	}
	// A row lock held by a stalled transaction surfaces as "the library
	// is busy" after a few seconds, as SQLite's busy timeout does.
	if _, ok := cfg.RuntimeParams["lock_timeout"]; !ok {
		cfg.RuntimeParams["lock_timeout"] = "5s"
	}
	if _, ok := cfg.RuntimeParams["application_name"]; !ok {
		cfg.RuntimeParams["application_name"] = "fogbench"
	}
	db := stdlib.OpenDB(*cfg)
	db.SetMaxOpenConns(16)
	db.SetMaxIdleConns(4)
	db.SetConnMaxIdleTime(5 * time.Minute)
	where := redact(dsn)
	if err := db.PingContext(ctx); err != nil {
		db.Close()
		return nil, fmt.Errorf("store: open %s: %w", where, err)
	}
	c := conn{db, postgresDialect{}}
	s := newStore(c, where)
	s.read = c
	if err := s.migrate(ctx, postgresMigrations); err != nil {
		db.Close()
		return nil, err
	}
	return s, nil
}

func (postgresDialect) rebind(q string) string      { return numberedPlaceholders(q) }
func (postgresDialect) like() string                { return "ILIKE" }
func (postgresDialect) foldCase(expr string) string { return "lower(" + expr + ")" }
func (postgresDialect) forUpdate() string           { return " FOR UPDATE" }

func (postgresDialect) tagList() string {
	return `(SELECT string_agg(tag, chr(31) ORDER BY tag) FROM case_tags t WHERE t.case_id = c.id)`
}

func (postgresDialect) lock(ctx context.Context, tx *txn, key int64) error {
	_, err := tx.ExecContext(ctx, `SELECT pg_advisory_xact_lock(?)`, key)
	return err
}

// integrity has nothing to add on PostgreSQL: the server checks its own
// pages (with data checksums on) and the library's invariants are checked
// by IntegrityCheck for both databases.
func (postgresDialect) integrity(ctx context.Context, db *sql.DB) error {
	return db.PingContext(ctx)
}

// backup is pg_dump's job on PostgreSQL: it takes a consistent snapshot of
// a running database, and the database's owners already schedule it.
func (postgresDialect) backup(context.Context, *sql.DB, string) error {
	return calc.Errorf(calc.Invalid, "a PostgreSQL library is backed up with pg_dump (for example: pg_dump -Fc -f fogbench.dump \"$URL\"), not with fogbench backup; see docs/stores.md")
}

func pgCode(err error) string {
	var pe *pgconn.PgError
	if errors.As(err, &pe) {
		return pe.Code
	}
	return ""
}

func (postgresDialect) isBusy(err error) bool {
	switch pgCode(err) {
	case "40001", "40P01", "55P03": // serialization failure, deadlock, lock not available
		return true
	}
	return false
}

func (postgresDialect) isDuplicate(err error) bool { return pgCode(err) == "23505" }
