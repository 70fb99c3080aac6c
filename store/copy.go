package store

import (
	"context"
	"database/sql"
	"fmt"

	"fogbench/calc"
)

// CopyReport counts what CopyLibrary wrote.
type CopyReport struct {
	Cases, Revisions, Tags, Liquids int
}

// copyTables lists what a library holds, parents before children, with the
// columns copied verbatim (ids, uids and times included, so links, bundles
// and history stay valid in the copy). cases.parent_id is set in a second
// pass, after every case exists.
var copyTables = []struct {
	table, columns, order string
}{
	{"cases", "id, uid, name, fluid, model, family, revision, body, checksum, created_at, updated_at, deleted_at", "id"},
	{"revisions", "case_id, revision, name, body, checksum, author, created_at", "case_id, revision"},
	{"case_tags", "case_id, tag", "case_id, tag"},
	{"custom_liquids", "id, name, revision, body, created_at, updated_at", "id"},
}

// CopyLibrary copies every case with its whole history, tags and trash
// state, and every user liquid, from src into dst, which must be empty.
// It reads src in one snapshot and writes dst in one transaction, so dst
// ends up with all of it or nothing; dst is checked before the commit. The
// two may be in different databases: this is how a library moves between
// SQLite and PostgreSQL.
func CopyLibrary(ctx context.Context, src, dst *Store) (CopyReport, error) {
	var rep CopyReport
	var opts *sql.TxOptions
	if src.IsPostgres() { // one snapshot for every table
		opts = &sql.TxOptions{Isolation: sql.LevelRepeatableRead, ReadOnly: true}
	}
	stx, err := src.read.db.BeginTx(ctx, opts)
	if err != nil {
		return rep, fmt.Errorf("store: copy: read %s: %w", src.Path(), err)
	}
	defer stx.Rollback()
	in := &txn{tx: stx, d: src.d}
	out, err := dst.write.begin(ctx)
	if err != nil {
		return rep, wrapTx("copy: write", err)
	}
	defer out.Rollback()
	if err := dst.d.lock(ctx, out, lockLibrary); err != nil {
		return rep, wrapTx("copy: lock", err)
	}
	var held int
	if err := out.QueryRowContext(ctx, `SELECT (SELECT count(*) FROM cases) + (SELECT count(*) FROM custom_liquids)`).Scan(&held); err != nil {
		return rep, fmt.Errorf("store: copy: %w", err)
	}
	if held > 0 {
		return rep, calc.Errorf(calc.Invalid, "%s already holds %d cases or liquids; copy into an empty library", dst.Path(), held)
	}
	counts := []*int{&rep.Cases, &rep.Revisions, &rep.Tags, &rep.Liquids}
	for i, tb := range copyTables {
		n, err := copyTable(ctx, in, out, tb.table, tb.columns, tb.order)
		if err != nil {
			return rep, err
		}
		*counts[i] = n
	}
	rows, err := in.QueryContext(ctx, `SELECT id, parent_id FROM cases WHERE parent_id IS NOT NULL ORDER BY id`)
	if err != nil {
		return rep, fmt.Errorf("store: copy: read links: %w", err)
	}
	type link struct{ id, parent int64 }
	var links []link
	for rows.Next() {
		var l link
		if err := rows.Scan(&l.id, &l.parent); err != nil {
			rows.Close()
			return rep, fmt.Errorf("store: copy: read links: %w", err)
		}
		links = append(links, l)
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return rep, fmt.Errorf("store: copy: read links: %w", err)
	}
	for _, l := range links {
		if _, err := out.ExecContext(ctx, `UPDATE cases SET parent_id = ? WHERE id = ?`, l.parent, l.id); err != nil {
			return rep, wrapTx("copy: link cases", err)
		}
	}
	if dst.IsPostgres() { // new cases continue after the copied ids
		if _, err := out.ExecContext(ctx, `SELECT setval(pg_get_serial_sequence('cases', 'id'), coalesce(max(id), 0) + 1, false) FROM cases`); err != nil {
			return rep, wrapTx("copy: case numbering", err)
		}
	}
	var bad int
	if err := out.QueryRowContext(ctx, `SELECT count(*) FROM cases c
		LEFT JOIN revisions r ON r.case_id = c.id AND r.revision = c.revision
		WHERE r.case_id IS NULL OR r.checksum <> c.checksum`).Scan(&bad); err != nil || bad > 0 {
		return rep, fmt.Errorf("store: copy: %d cases lack their newest revision in the copy (%v)", bad, err)
	}
	if err := out.Commit(); err != nil {
		return rep, wrapTx("copy", err)
	}
	return rep, nil
}

// copyTable copies one table's rows in order and returns how many.
func copyTable(ctx context.Context, in, out *txn, table, columns, order string) (int, error) {
	rows, err := in.QueryContext(ctx, `SELECT `+columns+` FROM `+table+` ORDER BY `+order)
	if err != nil {
		return 0, fmt.Errorf("store: copy %s: %w", table, err)
	}
	defer rows.Close()
	cols, err := rows.Columns()
	if err != nil {
		return 0, fmt.Errorf("store: copy %s: %w", table, err)
	}
	marks := "?"
	for range cols[1:] {
		marks += ", ?"
	}
	insert := `INSERT INTO ` + table + `(` + columns + `) VALUES (` + marks + `)`
	vals := make([]any, len(cols))
	ptrs := make([]any, len(cols))
	for i := range vals {
		ptrs[i] = &vals[i]
	}
	n := 0
	for rows.Next() {
		if err := rows.Scan(ptrs...); err != nil {
			return n, fmt.Errorf("store: copy %s: %w", table, err)
		}
		for i, v := range vals {
			if b, ok := v.([]byte); ok { // SQLite hands TEXT back as bytes
				vals[i] = string(b)
			}
		}
		if _, err := out.ExecContext(ctx, insert, vals...); err != nil {
			return n, wrapTx("copy "+table, err)
		}
		n++
	}
	if err := rows.Err(); err != nil {
		return n, fmt.Errorf("store: copy %s: %w", table, err)
	}
	return n, nil
}
