package store

import (
	"context"
	"errors"
	"path/filepath"
	"sync"
	"testing"
	"time"

	"fogbench/calc"
)

func openTest(t *testing.T) *Store {
	t.Helper()
	s, err := Open(context.Background(), filepath.Join(t.TempDir(), "lib.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { s.Close() })
	clock := time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC)
	s.Now = func() time.Time { clock = clock.Add(time.Second); return clock }
	return s
}

func demoCase(t *testing.T) calc.Case {
	t.Helper()
	cs, err := DemoCases()
	if err != nil || len(cs) == 0 {
		t.Fatalf("demo cases: %v", err)
	}
	return cs[0]
}

func TestMigrationsRecordedOnce(t *testing.T) {
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "lib.db")
	for range 2 { // reopening applies nothing twice
		s, err := Open(ctx, path)
		if err != nil {
			t.Fatal(err)
		}
		v, err := s.SchemaVersion(ctx)
		if err != nil || v < 1 {
			t.Fatalf("schema version %d, %v", v, err)
		}
		if err := s.IntegrityCheck(ctx); err != nil {
			t.Fatal(err)
		}
		s.Close()
	}
}

func TestCreateGetUpdateRevisions(t *testing.T) {
	ctx := context.Background()
	s := openTest(t)
	c := demoCase(t)
	rec, err := s.CreateCase(ctx, c, "ana")
	if err != nil {
		t.Fatal(err)
	}
	if rec.Revision != 1 || rec.Case.Name != c.Name || rec.Author != "ana" || rec.Checksum == "" {
		t.Fatalf("created %+v", rec)
	}
	c.Name = "renamed"
	rec2, err := s.UpdateCase(ctx, rec.ID, 1, c, "ben")
	if err != nil {
		t.Fatal(err)
	}
	if rec2.Revision != 2 || rec2.Case.Name != "renamed" || !rec2.UpdatedAt.After(rec.UpdatedAt) {
		t.Fatalf("updated %+v", rec2)
	}
	// Saving the same content again writes no empty revision.
	rec3, err := s.UpdateCase(ctx, rec.ID, 2, c, "ben")
	if err != nil || rec3.Revision != 2 {
		t.Fatalf("no-op save: %v rev %d", err, rec3.Revision)
	}
	revs, err := s.Revisions(ctx, rec.ID)
	if err != nil || len(revs) != 2 || revs[0].Revision != 2 || revs[1].Author != "ana" {
		t.Fatalf("revisions %+v %v", revs, err)
	}
	old, err := s.GetRevision(ctx, rec.ID, 1)
	if err != nil || old.Case.Name != demoCase(t).Name {
		t.Fatalf("revision 1: %+v %v", old, err)
	}
	if _, err := s.GetRevision(ctx, rec.ID, 9); calc.ErrorCode(err) != calc.NotFound {
		t.Fatalf("missing revision: %v", err)
	}
	if _, err := s.GetCase(ctx, 999); calc.ErrorCode(err) != calc.NotFound {
		t.Fatalf("missing case: %v", err)
	}
}

// The lost-update case: two people open revision 1; the second save must not
// overwrite the first.
func TestLostUpdateIsAConflict(t *testing.T) {
	ctx := context.Background()
	s := openTest(t)
	rec, _ := s.CreateCase(ctx, demoCase(t), "ana")
	a, b := rec.Case, rec.Case
	a.Notes = "ana's change"
	b.Notes = "ben's change"
	if _, err := s.UpdateCase(ctx, rec.ID, 1, a, "ana"); err != nil {
		t.Fatal(err)
	}
	_, err := s.UpdateCase(ctx, rec.ID, 1, b, "ben")
	var ce *ConflictError
	if !errors.As(err, &ce) || calc.ErrorCode(err) != calc.Conflict {
		t.Fatalf("want conflict, got %v", err)
	}
	if ce.Current.Case.Notes != "ana's change" || ce.Current.Revision != 2 || ce.Base != 1 {
		t.Fatalf("conflict carries %+v", ce.Current)
	}
	got, _ := s.GetCase(ctx, rec.ID)
	if got.Case.Notes != "ana's change" {
		t.Fatal("the first save was overwritten")
	}
}

// Writers on separate connections (two Store values on one file) serialise
// through the busy timeout and immediate transactions; every save lands.
func TestConcurrentWriters(t *testing.T) {
	ctx := context.Background()
	path := filepath.Join(t.TempDir(), "lib.db")
	s1, err := Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer s1.Close()
	s2, err := Open(ctx, path)
	if err != nil {
		t.Fatal(err)
	}
	defer s2.Close()
	c := demoCase(t)
	var wg sync.WaitGroup
	errs := make(chan error, 40)
	for i := range 40 {
		wg.Add(1)
		go func(s *Store) {
			defer wg.Done()
			_, err := s.CreateCase(ctx, c, "w")
			errs <- err
		}([]*Store{s1, s2}[i%2])
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		if err != nil {
			t.Fatal(err)
		}
	}
	n, err := s1.CountCases(ctx)
	if err != nil || n != 40 {
		t.Fatalf("count %d %v", n, err)
	}
}

func TestListSearchTagsTrash(t *testing.T) {
	ctx := context.Background()
	s := openTest(t)
	n, err := s.SeedDemo(ctx)
	if err != nil || n != 3 {
		t.Fatalf("seeded %d %v", n, err)
	}
	if n2, _ := s.SeedDemo(ctx); n2 != 0 {
		t.Fatal("seeding twice")
	}
	all, total, err := s.ListCases(ctx, ListOptions{})
	if err != nil || total != 3 || len(all) != 3 {
		t.Fatalf("list %d %v", total, err)
	}
	heptane, total, _ := s.ListCases(ctx, ListOptions{Fluid: "n-heptane"})
	if total != 1 || heptane[0].Fluid != "n-heptane" || heptane[0].Tags[0] != "demo" {
		t.Fatalf("fluid filter %+v", heptane)
	}
	// Search looks into the case text, and % is literal.
	if _, total, _ := s.ListCases(ctx, ListOptions{Query: "humidification"}); total != 1 {
		t.Fatalf("text search found %d", total)
	}
	if _, total, _ := s.ListCases(ctx, ListOptions{Query: "100%"}); total != 0 {
		t.Fatalf("LIKE wildcard leaked: %d", total)
	}
	id := heptane[0].ID
	if err := s.SetTags(ctx, id, []string{" Rig ", "rig", "pilot", ""}); err != nil {
		t.Fatal(err)
	}
	rec, _ := s.GetCase(ctx, id)
	if len(rec.Tags) != 2 || rec.Tags[0] != "pilot" || rec.Tags[1] != "rig" {
		t.Fatalf("tags %v", rec.Tags)
	}
	if err := s.TrashCase(ctx, id); err != nil {
		t.Fatal(err)
	}
	if _, total, _ := s.ListCases(ctx, ListOptions{}); total != 2 {
		t.Fatal("trashed case still listed")
	}
	if trash, total, _ := s.ListCases(ctx, ListOptions{Trash: true}); total != 1 || trash[0].ID != id {
		t.Fatal("trash does not list the case")
	}
	if err := s.RestoreCase(ctx, id); err != nil {
		t.Fatal(err)
	}
	if _, total, _ := s.ListCases(ctx, ListOptions{}); total != 3 {
		t.Fatal("restore failed")
	}
	dup, err := s.DuplicateCase(ctx, id, "copy", "ana")
	if err != nil || dup.ParentID != id || dup.Revision != 1 || len(dup.Tags) != 2 {
		t.Fatalf("duplicate %+v %v", dup, err)
	}
	if err := s.TrashCase(ctx, 12345); calc.ErrorCode(err) != calc.NotFound {
		t.Fatalf("trash missing: %v", err)
	}
}

func TestBackup(t *testing.T) {
	ctx := context.Background()
	s := openTest(t)
	if _, err := s.SeedDemo(ctx); err != nil {
		t.Fatal(err)
	}
	dest := filepath.Join(t.TempDir(), "copy.db")
	if err := s.Backup(ctx, dest); err != nil {
		t.Fatal(err)
	}
	b, err := Open(ctx, dest)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	if err := b.IntegrityCheck(ctx); err != nil {
		t.Fatal(err)
	}
	if n, _ := b.CountCases(ctx); n != 3 {
		t.Fatalf("backup holds %d cases", n)
	}
}

// The embedded migrations are numbered 1, 2, 3 … without gaps or repeats.
func TestMigrationNumbersAreUnique(t *testing.T) {
	ms, err := loadMigrations()
	if err != nil {
		t.Fatal(err)
	}
	for i, m := range ms {
		if m.version != i+1 {
			t.Fatalf("migration %d is numbered %04d (%s)", i+1, m.version, m.name)
		}
	}
}
