package store

import (
	"context"
	"errors"
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"github.com/jackc/pgx/v5/pgconn"

	"fogbench/calc"
	"fogbench/store/storetest"
)

// The database errors of a full disk and a read-only library become a
// *StorageError of code calc.Unavailable; others stay as they are.
func TestStorageFaultsAreClassified(t *testing.T) {
	for _, tc := range []struct {
		err  error
		want StorageFault
	}{
		{&pgconn.PgError{Code: "53100", Message: "could not extend file"}, StorageFull},
		{&pgconn.PgError{Code: "25006", Message: "cannot execute INSERT in a read-only transaction"}, StorageReadOnly},
		{&pgconn.PgError{Code: "23505"}, ""},
		{errors.New("something else"), ""},
	} {
		err := classify(fmt.Errorf("wrapped: %w", tc.err))
		var se *StorageError
		got := StorageFault("")
		if errors.As(err, &se) {
			got = se.Fault
		}
		if got != tc.want {
			t.Errorf("%v: fault %q, want %q", tc.err, got, tc.want)
		}
		if tc.want != "" && (calc.ErrorCode(err) != calc.Unavailable || !strings.Contains(calc.ErrorMessage(err), "nothing was saved")) {
			t.Errorf("%v: code %s, message %q", tc.err, calc.ErrorCode(err), calc.ErrorMessage(err))
		}
	}

	// SQLite's own errors, provoked.
	for _, f := range []StorageFault{StorageFull, StorageReadOnly} {
		ctx := context.Background()
		s, err := Open(ctx, filepath.Join(t.TempDir(), "lib.db"))
		if err != nil {
			t.Fatal(err)
		}
		if err := s.SimulateStorageFault(ctx, f); err != nil {
			t.Fatal(err)
		}
		c := demoCase(t)
		c.Notes = strings.Repeat("n", 60000) // needs pages of its own
		_, err = s.CreateCase(ctx, c, "test")
		var se *StorageError
		if !errors.As(err, &se) || se.Fault != f || calc.ErrorCode(err) != calc.Unavailable {
			t.Errorf("%s: CreateCase gave %v", f, err)
		}
		if n, _ := s.CountCases(ctx); n != 0 {
			t.Errorf("%s: %d cases stored", f, n)
		}
		if _, err := s.CheckWritable(ctx); (err == nil) != (f == StorageFull) {
			// A full disk still takes a write that changes nothing.
			t.Errorf("%s: write check says %v", f, err)
		}
		s.Close()
	}
}

// On PostgreSQL a read-only session (a standby, or
// default_transaction_read_only) refuses a save with 25006: the save is a
// StorageError and the write check says so; opening a library on such a
// session fails naming it. (SQLite: above.)
func TestReadOnlyPostgresLibrary(t *testing.T) {
	dsn := storetest.PostgresDSN(t) // skips without FOGBENCH_TEST_PG
	ctx := context.Background()
	s, err := Open(ctx, dsn)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	if _, err := s.CheckWritable(ctx); err != nil {
		t.Fatalf("writable library: %v", err)
	}
	// One connection, made read-only for the rest of its session.
	s.write.db.SetMaxOpenConns(1)
	if _, err := s.write.db.ExecContext(ctx, `SET SESSION CHARACTERISTICS AS TRANSACTION READ ONLY`); err != nil {
		t.Fatal(err)
	}
	_, err = s.CreateCase(ctx, demoCase(t), "test")
	var se *StorageError
	if !errors.As(err, &se) || se.Fault != StorageReadOnly || calc.ErrorCode(err) != calc.Unavailable {
		t.Fatalf("save on a read-only session: %v", err)
	}
	if _, err := s.CheckWritable(ctx); !errors.As(err, &se) {
		t.Fatalf("write check on a read-only session: %v", err)
	}

	sep := "?"
	if strings.Contains(dsn, "?") {
		sep = "&"
	}
	_, err = Open(ctx, dsn+sep+"default_transaction_read_only=on")
	if !errors.As(err, &se) || !strings.Contains(err.Error(), "read-only") {
		t.Fatalf("opening on a read-only session: %v", err)
	}
}
