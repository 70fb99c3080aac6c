package store

import (
	"context"
	"database/sql"
	"strconv"
	"strings"
)

// dialect is what differs between the two databases a library can live in.
// Every query and every rule of the library (revisions, the conflict check,
// the import plan) is written once, in SQL both databases accept, with ?
// placeholders; a dialect rewrites placeholders, supplies the few
// expressions that are spelt differently, and owns opening, locking, checks
// and backups.
type dialect interface {
	// rebind rewrites the ? placeholders of shared SQL for the driver.
	rebind(query string) string
	// like is the operator for a case-insensitive (ASCII) LIKE.
	like() string
	// tagList is an expression for the tags of case c.id, sorted and
	// joined by char 31, or NULL when it has none.
	tagList() string
	// foldCase orders text without regard to ASCII case.
	foldCase(expr string) string
	// forUpdate is appended to a SELECT that reads a row about to be
	// changed, to lock it until the transaction ends ("" where the
	// transaction already holds the database's only write lock).
	forUpdate() string
	// lock takes a transaction-scoped lock named by key, serialising
	// read-then-write sequences (migrations, seeding, imports) between
	// servers sharing one database.
	lock(ctx context.Context, tx *txn, key int64) error
	// integrity runs the database's own consistency check, if it has one.
	integrity(ctx context.Context, db *sql.DB) error
	// backup writes a consistent copy of the library to dest.
	backup(ctx context.Context, db *sql.DB, dest string) error
	// isBusy reports lock contention that outlasted the wait the database
	// allows, or a transaction the database aborted to break a deadlock.
	isBusy(err error) bool
	// isDuplicate reports a unique-key violation.
	isDuplicate(err error) bool
}

// Keys of the transaction-scoped locks ("fogbench" in ASCII, plus one).
const (
	lockMigrate int64 = 0x666f6762656e6368
	lockLibrary int64 = lockMigrate + 1
)

// conn is a pool that speaks the shared SQL.
type conn struct {
	db *sql.DB
	d  dialect
}

// Writes go through ExecContext, begin and Commit, which turn a storage
// refusal (disk full, read-only) into a *StorageError (fault.go).
func (c conn) ExecContext(ctx context.Context, q string, args ...any) (sql.Result, error) {
	res, err := c.db.ExecContext(ctx, c.d.rebind(q), args...)
	return res, classify(err)
}

func (c conn) QueryContext(ctx context.Context, q string, args ...any) (*sql.Rows, error) {
	return c.db.QueryContext(ctx, c.d.rebind(q), args...)
}

func (c conn) QueryRowContext(ctx context.Context, q string, args ...any) *sql.Row {
	return c.db.QueryRowContext(ctx, c.d.rebind(q), args...)
}

func (c conn) begin(ctx context.Context) (*txn, error) {
	tx, err := c.db.BeginTx(ctx, nil)
	if err != nil {
		return nil, classify(err)
	}
	return &txn{tx: tx, d: c.d}, nil
}

// txn is a transaction that speaks the shared SQL. Unexported helpers take
// a *txn so that steps compose in one transaction.
type txn struct {
	tx *sql.Tx
	d  dialect
}

func (t *txn) ExecContext(ctx context.Context, q string, args ...any) (sql.Result, error) {
	res, err := t.tx.ExecContext(ctx, t.d.rebind(q), args...)
	return res, classify(err)
}

func (t *txn) QueryContext(ctx context.Context, q string, args ...any) (*sql.Rows, error) {
	return t.tx.QueryContext(ctx, t.d.rebind(q), args...)
}

func (t *txn) QueryRowContext(ctx context.Context, q string, args ...any) *sql.Row {
	return t.tx.QueryRowContext(ctx, t.d.rebind(q), args...)
}

func (t *txn) Commit() error   { return classify(t.tx.Commit()) }
func (t *txn) Rollback() error { return t.tx.Rollback() }

// numberedPlaceholders rewrites each ? outside quoted literals as $1, $2, …
func numberedPlaceholders(q string) string {
	if !strings.Contains(q, "?") {
		return q
	}
	var b strings.Builder
	b.Grow(len(q) + 8)
	n, quoted := 0, false
	for i := 0; i < len(q); i++ {
		ch := q[i]
		switch {
		case ch == '\'':
			quoted = !quoted
		case ch == '?' && !quoted:
			n++
			b.WriteByte('$')
			b.WriteString(strconv.Itoa(n))
			continue
		}
		b.WriteByte(ch)
	}
	return b.String()
}

// isBusy reports lock contention in either database (see dialect.isBusy).
func isBusy(err error) bool {
	return sqliteDialect{}.isBusy(err) || postgresDialect{}.isBusy(err)
}
