package main

import (
	"bytes"
	"context"
	"strings"
	"testing"

	"fogbench/store"
	"fogbench/store/storetest"
)

// fogbench migrate-store moves a library to the other database and back;
// the result serves the same cases. A second run into the filled library is
// refused with exit 2.
func TestMigrateStoreCommand(t *testing.T) {
	ctx := context.Background()
	lite := storetest.SQLite.New(t)
	st, err := store.Open(ctx, lite)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := st.SeedDemo(ctx); err != nil {
		t.Fatal(err)
	}
	st.Close()
	for _, b := range storetest.Backends() {
		t.Run("sqlite-to-"+b.Name, func(t *testing.T) {
			to := b.New(t)
			var out, errb bytes.Buffer
			if code := run([]string{"migrate-store", "-from", lite, "-to", to}, nil, &out, &errb); code != 0 {
				t.Fatalf("exit %d: %s", code, errb.String())
			}
			if !strings.Contains(out.String(), "copied 3 cases") {
				t.Fatalf("output %q", out.String())
			}
			got, err := store.Open(ctx, to)
			if err != nil {
				t.Fatal(err)
			}
			defer got.Close()
			if n, _ := got.CountCases(ctx); n != 3 {
				t.Fatalf("the copy holds %d cases", n)
			}
			out.Reset()
			errb.Reset()
			if code := run([]string{"migrate-store", "-from", lite, "-to", to}, nil, &out, &errb); code != 2 || !strings.Contains(errb.String(), "empty library") {
				t.Fatalf("second copy: exit %d: %s", code, errb.String())
			}
		})
	}
	var errb bytes.Buffer
	if code := run([]string{"migrate-store", "-from", lite}, nil, &bytes.Buffer{}, &errb); code != 2 {
		t.Fatalf("without -to: exit %d", code)
	}
}

// fogbench backup on a PostgreSQL library points to pg_dump and writes
// nothing; restore onto one points to pg_restore.
func TestBackupRestorePostgresPointToPgTools(t *testing.T) {
	pg := storetest.PostgresDSN(t)
	dest := t.TempDir() + "/copy.db"
	var errb bytes.Buffer
	if code := run([]string{"backup", "-db", pg, dest}, nil, &bytes.Buffer{}, &errb); code != 2 || !strings.Contains(errb.String(), "pg_dump") {
		t.Fatalf("backup: exit %d: %s", code, errb.String())
	}
	errb.Reset()
	if code := run([]string{"restore", dest, "-db", pg}, nil, &bytes.Buffer{}, &errb); code != 2 || !strings.Contains(errb.String(), "pg_restore") {
		t.Fatalf("restore: exit %d: %s", code, errb.String())
	}
}
