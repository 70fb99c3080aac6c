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

// plantRestoreCopy writes what a restore killed after its copy leaves: a
// hidden .LIB.restore-RANDOM file (with a -wal beside it).
func plantRestoreCopy(t *testing.T, lib, suffix string) []string {
	t.Helper()
	base := filepath.Join(filepath.Dir(lib), "."+filepath.Base(lib)+".restore-"+suffix)
	for _, p := range []string{base, base + "-wal"} {
		if err := os.WriteFile(p, make([]byte, 4096), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return []string{base, base + "-wal"}
}

func gone(t *testing.T, paths []string) {
	t.Helper()
	for _, p := range paths {
		if _, err := os.Stat(p); !os.IsNotExist(err) {
			t.Errorf("%s is still there (%v)", filepath.Base(p), err)
		}
	}
}

// A restore that was killed leaves its copy; the next restore and the next
// start (Open) remove it, and leave other files alone. While a restore
// holds the folder lock, opening the library removes nothing.
func TestStaleRestoreCopiesAreRemoved(t *testing.T) {
	ctx := context.Background()
	dir := t.TempDir()
	lib := filepath.Join(dir, "lib.db")
	s, err := Open(ctx, lib)
	if err != nil {
		t.Fatal(err)
	}
	backup := filepath.Join(dir, "backup.db")
	if err := s.Backup(ctx, backup); err != nil {
		t.Fatal(err)
	}
	s.Close()
	other := filepath.Join(dir, ".other.db.restore-0123456789ab") // another library's
	if err := os.WriteFile(other, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}

	// The next restore.
	stale := plantRestoreCopy(t, lib, "a1b2c3d4e5f6")
	rep, err := RestoreFile(ctx, backup, lib)
	if err != nil {
		t.Fatal(err)
	}
	gone(t, stale)
	if len(rep.RemovedCopies) != 2 {
		t.Errorf("report names %d removed copies, want 2: %v", len(rep.RemovedCopies), rep.RemovedCopies)
	}

	// The next start.
	stale = plantRestoreCopy(t, lib, "0f0f0f0f0f0f")
	s, err = Open(ctx, lib)
	if err != nil {
		t.Fatal(err)
	}
	gone(t, stale)
	if len(s.RemovedRestoreCopies) != 2 {
		t.Errorf("Open reports %v removed", s.RemovedRestoreCopies)
	}
	s.Close()
	if _, err := os.Stat(other); err != nil {
		t.Errorf("another library's copy was removed: %v", err)
	}

	// A restore in progress (holding the lock) keeps its copy.
	running := plantRestoreCopy(t, lib, "777777777777")
	unlock, ok := lockFolder(dir, true)
	if !ok {
		t.Fatal("could not take the folder lock")
	}
	s, err = Open(ctx, lib)
	if err != nil {
		t.Fatal(err)
	}
	s.Close()
	unlock()
	for _, p := range running {
		if _, err := os.Stat(p); err != nil {
			t.Errorf("the copy of a running restore was removed: %v", err)
		}
	}
}
