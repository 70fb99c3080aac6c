package store

import (
	"context"
	"crypto/rand"
	"database/sql"
	"encoding/hex"
	"fmt"
	"os"
	"path/filepath"
	"time"

	"fogbench/calc"
)

// RestoreReport says what RestoreFile put in place.
type RestoreReport struct {
	Cases         int    // cases outside the trash in the restored library
	SchemaVersion int    // after migrating the copy
	KeptAside     string // where the replaced library now lies, or ""
	// RemovedCopies are the temporary copies an earlier, killed restore
	// had left beside the library, now removed.
	RemovedCopies []string
}

// RestoreFile replaces the library at dest with a copy of the backup src.
//
// The backup is checked first (PRAGMA integrity_check, and that it is a
// fogbench library no newer than this program), then copied with VACUUM INTO
// to a temporary file beside dest, migrated and checked again, and only then
// renamed over dest, so dest is at every moment either the old library or
// the complete new one. The old library stays beside it as
// dest.before-restore-TIMESTAMP.
//
// Whether another process has dest open cannot be told reliably from
// outside SQLite. RestoreFile refuses when dest's write-ahead log exists,
// which is the case while a fogbench has the library open (or after one
// crashed); stop the server before restoring.
func RestoreFile(ctx context.Context, src, dest string) (RestoreReport, error) {
	var rep RestoreReport
	if IsPostgres(dest) || IsPostgres(src) {
		return rep, calc.Errorf(calc.Invalid, "a PostgreSQL library is restored with pg_restore from a pg_dump file, not with fogbench restore; see docs/stores.md")
	}
	if _, err := os.Stat(src); err != nil {
		return rep, calc.Errorf(calc.Invalid, "backup %s: %v", src, err)
	}
	if err := checkBackup(ctx, src); err != nil {
		return rep, err
	}
	if _, err := os.Stat(dest + "-wal"); err == nil {
		return rep, calc.Errorf(calc.Conflict, "%s-wal exists: the library is open in a running fogbench (or one stopped uncleanly); stop it, then restore", dest)
	}
	// One restore of a folder at a time; the copies an earlier, killed
	// restore left are removed first.
	unlock, _ := lockFolder(filepath.Dir(dest), true)
	defer unlock()
	removed, err := removeRestoreCopies(dest)
	rep.RemovedCopies = removed
	if err != nil {
		return rep, fmt.Errorf("store: restore: remove the copies an earlier restore left: %w", err)
	}
	suffix := make([]byte, 6)
	if _, err := rand.Read(suffix); err != nil {
		return rep, err
	}
	tmp := filepath.Join(filepath.Dir(dest), "."+filepath.Base(dest)+".restore-"+hex.EncodeToString(suffix))
	defer removeDB(tmp) // a no-op once renamed
	if err := vacuumInto(ctx, src, tmp); err != nil {
		return rep, err
	}
	st, err := Open(ctx, tmp) // applies migrations the backup lacks
	if err != nil {
		return rep, err
	}
	err = st.IntegrityCheck(ctx)
	if err == nil {
		rep.Cases, err = st.CountCases(ctx)
	}
	if err == nil {
		rep.SchemaVersion, err = st.SchemaVersion(ctx)
	}
	if cerr := st.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return rep, fmt.Errorf("store: restore: checking the copy: %w", err)
	}
	if _, err := os.Stat(dest); err == nil {
		aside := dest + ".before-restore-" + time.Now().UTC().Format("20060102-150405")
		if err := os.Link(dest, aside); err != nil {
			return rep, fmt.Errorf("store: restore: keep the old library as %s: %w", aside, err)
		}
		rep.KeptAside = aside
	}
	if err := os.Rename(tmp, dest); err != nil {
		return rep, fmt.Errorf("store: restore: put the copy in place: %w", err)
	}
	syncDir(filepath.Dir(dest))
	return rep, nil
}

// checkBackup opens src read-only and checks it before anything is copied.
func checkBackup(ctx context.Context, src string) error {
	db, err := sql.Open("sqlite3", "file:"+src+"?mode=ro&_query_only=1")
	if err != nil {
		return fmt.Errorf("store: open backup: %w", err)
	}
	defer db.Close()
	var res string
	if err := db.QueryRowContext(ctx, `PRAGMA integrity_check`).Scan(&res); err != nil {
		return calc.Errorf(calc.Invalid, "%s is not a readable SQLite database: %v", src, err)
	}
	if res != "ok" {
		return calc.Errorf(calc.Invalid, "%s failed the integrity check: %s", src, res)
	}
	var n int
	if err := db.QueryRowContext(ctx, `SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name IN ('cases', 'revisions', 'schema_migrations')`).Scan(&n); err != nil || n != 3 {
		return calc.Errorf(calc.Invalid, "%s is not a fogbench case library", src)
	}
	var v sql.NullInt64
	if err := db.QueryRowContext(ctx, `SELECT max(version) FROM schema_migrations`).Scan(&v); err != nil {
		return calc.Errorf(calc.Invalid, "%s: cannot read its schema version: %v", src, err)
	}
	ms, err := loadMigrations(sqliteMigrations)
	if err != nil {
		return err
	}
	if latest := ms[len(ms)-1].version; int(v.Int64) > latest {
		return calc.Errorf(calc.Invalid, "%s was written by a newer fogbench (schema %d, this one knows %d)", src, v.Int64, latest)
	}
	return nil
}

func vacuumInto(ctx context.Context, src, dest string) error {
	db, err := sql.Open("sqlite3", "file:"+src+"?mode=ro")
	if err != nil {
		return fmt.Errorf("store: open backup: %w", err)
	}
	defer db.Close()
	if _, err := db.ExecContext(ctx, `VACUUM INTO ?`, dest); err != nil {
		return fmt.Errorf("store: copy backup: %w", err)
	}
	return nil
}

func removeDB(path string) {
	for _, p := range []string{path, path + "-wal", path + "-shm"} {
		os.Remove(p) // absent files are fine
	}
}

// syncDir makes the rename durable where the platform allows it.
func syncDir(dir string) {
	if d, err := os.Open(dir); err == nil {
		d.Sync()
		d.Close()
	}
}
