package store

import (
	"context"
	"os"
	"path/filepath"
	"testing"

	"fogbench/calc"
)

func TestRestoreFile(t *testing.T) {
	ctx := context.Background()
	dir := t.TempDir()
	lib := filepath.Join(dir, "lib.db")
	s, err := Open(ctx, lib)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := s.SeedDemo(ctx); err != nil {
		t.Fatal(err)
	}
	backup := filepath.Join(dir, "backup.db")
	if err := s.Backup(ctx, backup); err != nil {
		t.Fatal(err)
	}
	// After the backup the library gains a case that the restore drops.
	if _, err := s.CreateCase(ctx, demoCase(t), "late"); err != nil {
		t.Fatal(err)
	}
	// While the library is open its write-ahead log exists: refuse.
	if _, err := RestoreFile(ctx, backup, lib); calc.ErrorCode(err) != calc.Conflict {
		t.Fatalf("restore over an open library: %v", err)
	}
	s.Close()

	// A damaged backup is refused before anything is touched.
	bad := filepath.Join(dir, "bad.db")
	data, _ := os.ReadFile(backup)
	for i := 100; i < len(data); i += 97 {
		data[i] ^= 0xff
	}
	os.WriteFile(bad, data, 0o644)
	if _, err := RestoreFile(ctx, bad, lib); calc.ErrorCode(err) != calc.Invalid {
		t.Fatalf("damaged backup: %v", err)
	}
	notLib := filepath.Join(dir, "text.db")
	os.WriteFile(notLib, []byte("hello"), 0o644)
	if _, err := RestoreFile(ctx, notLib, lib); calc.ErrorCode(err) != calc.Invalid {
		t.Fatalf("not a library: %v", err)
	}

	rep, err := RestoreFile(ctx, backup, lib)
	if err != nil {
		t.Fatal(err)
	}
	if rep.Cases != 3 || rep.KeptAside == "" {
		t.Fatalf("report %+v", rep)
	}
	r, err := Open(ctx, lib)
	if err != nil {
		t.Fatal(err)
	}
	defer r.Close()
	if n, _ := r.CountCases(ctx); n != 3 {
		t.Fatalf("restored library holds %d cases", n)
	}
	old, err := Open(ctx, rep.KeptAside)
	if err != nil {
		t.Fatal(err)
	}
	defer old.Close()
	if n, _ := old.CountCases(ctx); n != 4 {
		t.Fatalf("the replaced library kept aside holds %d cases", n)
	}
	left, _ := filepath.Glob(filepath.Join(dir, ".lib.db.restore-*"))
	if len(left) != 0 {
		t.Fatalf("temporary files left: %v", left)
	}
}
