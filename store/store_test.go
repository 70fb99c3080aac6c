package store

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"fogbench/calc"
	"fogbench/store/storetest"
)

// lib opens libraries in one database for a test that runs once per
// database (eachBackend).
type lib struct{ b storetest.Backend }

// eachBackend runs test once for SQLite and once for PostgreSQL: the same
// assertions hold for both.
func eachBackend(t *testing.T, test func(t *testing.T, l lib)) {
	for _, b := range storetest.Backends() {
		t.Run(b.Name, func(t *testing.T) { test(t, lib{b}) })
	}
}

// dsn is the -db value of a fresh, empty library.
func (l lib) dsn(t *testing.T) string { return l.b.New(t) }

// open opens dsn with a clock that ticks one second per call, and closes
// it when the test ends.
func (l lib) open(t *testing.T, dsn string) *Store {
	t.Helper()
	s, err := Open(context.Background(), dsn)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { s.Close() })
	clock := time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC)
	var mu sync.Mutex
	s.Clock = func() time.Time { mu.Lock(); defer mu.Unlock(); clock = clock.Add(time.Second); return clock }
	return s
}

// fresh opens a new, empty library.
func (l lib) fresh(t *testing.T) *Store { return l.open(t, l.dsn(t)) }

func demoCase(t *testing.T) calc.Case {
	t.Helper()
	cs, err := DemoCases()
	if err != nil || len(cs) == 0 {
		t.Fatalf("demo cases: %v", err)
	}
	return cs[0]
}

func TestMigrationsRecordedOnce(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		dsn := l.dsn(t)
		for range 2 { // reopening applies nothing twice
			s, err := Open(ctx, dsn)
			if err != nil {
				t.Fatal(err)
			}
			v, err := s.SchemaVersion(ctx)
			if err != nil || v != 3 {
				t.Fatalf("schema version %d, %v", v, err)
			}
			if err := s.IntegrityCheck(ctx); err != nil {
				t.Fatal(err)
			}
			var n int
			s.read.QueryRowContext(ctx, `SELECT count(*) FROM schema_migrations`).Scan(&n)
			if n != 3 {
				t.Fatalf("%d migrations recorded, want 3", n)
			}
			s.Close()
		}
	})
}

// Servers starting at once on one new library all open it: each migration
// is applied once and the demo cases are seeded once.
func TestConcurrentStartMigratesAndSeedsOnce(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		dsn := l.dsn(t)
		const servers = 4
		stores := make([]*Store, servers)
		errs := make([]error, servers)
		seeded := make([]int, servers)
		var wg sync.WaitGroup
		for i := range servers {
			wg.Add(1)
			go func() {
				defer wg.Done()
				stores[i], errs[i] = Open(ctx, dsn)
				if errs[i] == nil {
					seeded[i], errs[i] = stores[i].SeedDemo(ctx)
				}
			}()
		}
		wg.Wait()
		total := 0
		for i := range servers {
			if stores[i] != nil {
				defer stores[i].Close()
			}
			if errs[i] != nil {
				t.Fatalf("server %d: %v", i, errs[i])
			}
			total += seeded[i]
		}
		demo, _ := DemoCases()
		if total != len(demo) {
			t.Fatalf("seeded %d demo cases in all, want %d once", total, len(demo))
		}
		if n, err := stores[0].CountCases(ctx); err != nil || n != len(demo) {
			t.Fatalf("library holds %d cases (%v), want %d", n, err, len(demo))
		}
		var recorded int
		stores[0].read.QueryRowContext(ctx, `SELECT count(*) FROM schema_migrations`).Scan(&recorded)
		if recorded != 3 {
			t.Fatalf("%d migration rows, want 3", recorded)
		}
	})
}

func TestCreateGetUpdateRevisions(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
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
	})
}

// The lost-update case: two people open revision 1; the second save must not
// overwrite the first.
func TestLostUpdateIsAConflict(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
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
	})
}

// Writers on separate connections (two Store values on one library: two
// servers) all land: SQLite serialises them through the busy timeout and
// immediate transactions, PostgreSQL runs them side by side.
func TestConcurrentWriters(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		dsn := l.dsn(t)
		s1, s2 := l.open(t, dsn), l.open(t, dsn)
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
		n, err := s2.CountCases(ctx)
		if err != nil || n != 40 {
			t.Fatalf("count %d %v", n, err)
		}
	})
}

// Many saves of one case, all based on revision 1, from two Store values on
// one library (two servers), at once: exactly one wins, every other one is
// a *ConflictError carrying the winner, and the history holds revisions 1
// and 2 only. Repeated a few rounds; no lost update, whatever the timing.
func TestConcurrentSavesOneWinner(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		dsn := l.dsn(t)
		s1, s2 := l.open(t, dsn), l.open(t, dsn)
		const rounds, savers = 5, 8
		for round := range rounds {
			rec, err := s1.CreateCase(ctx, demoCase(t), "ana")
			if err != nil {
				t.Fatal(err)
			}
			start := make(chan struct{})
			type outcome struct {
				rec   CaseRecord
				err   error
				notes string
			}
			out := make(chan outcome, savers)
			for i := range savers {
				go func() {
					c := rec.Case
					c.Notes = fmt.Sprintf("round %d saver %d", round, i)
					<-start
					got, err := []*Store{s1, s2}[i%2].UpdateCase(ctx, rec.ID, 1, c, fmt.Sprintf("saver %d", i))
					out <- outcome{got, err, c.Notes}
				}()
			}
			close(start)
			var winner string
			conflicts := 0
			for range savers {
				o := <-out
				var ce *ConflictError
				switch {
				case o.err == nil:
					if winner != "" {
						t.Fatalf("round %d: two saves won: %q and %q", round, winner, o.notes)
					}
					winner = o.notes
					if o.rec.Revision != 2 {
						t.Fatalf("round %d: winner saved revision %d", round, o.rec.Revision)
					}
				case errors.As(o.err, &ce):
					conflicts++
					if ce.Current.Revision != 2 || ce.Base != 1 {
						t.Fatalf("round %d: conflict carries revision %d base %d", round, ce.Current.Revision, ce.Base)
					}
				default:
					t.Fatalf("round %d: %v", round, o.err)
				}
			}
			if winner == "" || conflicts != savers-1 {
				t.Fatalf("round %d: winner %q, %d conflicts", round, winner, conflicts)
			}
			got, _ := s2.GetCase(ctx, rec.ID)
			revs, _ := s2.Revisions(ctx, rec.ID)
			if got.Case.Notes != winner || got.Revision != 2 || len(revs) != 2 {
				t.Fatalf("round %d: stored %q rev %d with %d revisions, winner %q", round, got.Case.Notes, got.Revision, len(revs), winner)
			}
		}
	})
}

func TestListSearchTagsTrash(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
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
	})
}

func TestBackup(t *testing.T) {
	ctx := context.Background()
	s := lib{storetest.SQLite}.fresh(t)
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

// A PostgreSQL library is backed up with pg_dump; Backup says so instead of
// writing a file.
func TestBackupPostgresPointsToPgDump(t *testing.T) {
	s := lib{storetest.Postgres}.fresh(t)
	dest := filepath.Join(t.TempDir(), "copy.db")
	err := s.Backup(context.Background(), dest)
	if calc.ErrorCode(err) != calc.Invalid || !strings.Contains(err.Error(), "pg_dump") {
		t.Fatalf("want an error naming pg_dump, got %v", err)
	}
	if _, serr := os.Stat(dest); serr == nil {
		t.Fatal("Backup wrote a file")
	}
	if !s.IsPostgres() || strings.Contains(s.Path(), "password") {
		t.Fatalf("path %q", s.Path())
	}
}

// The library's own check finds a case whose newest revision is missing,
// in either database.
func TestIntegrityCheckFindsMissingRevision(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
		rec, err := s.CreateCase(ctx, demoCase(t), "ana")
		if err != nil {
			t.Fatal(err)
		}
		if err := s.IntegrityCheck(ctx); err != nil {
			t.Fatal(err)
		}
		if _, err := s.write.ExecContext(ctx, `DELETE FROM revisions WHERE case_id = ?`, rec.ID); err != nil {
			t.Fatal(err)
		}
		if err := s.IntegrityCheck(ctx); err == nil || !strings.Contains(err.Error(), "1 cases") {
			t.Fatalf("want the damage reported, got %v", err)
		}
	})
}

// The embedded migrations are numbered 1, 2, 3 … without gaps or repeats.
func TestMigrationNumbersAreUnique(t *testing.T) {
	for _, dir := range []string{sqliteMigrations, postgresMigrations} {
		ms, err := loadMigrations(dir)
		if err != nil {
			t.Fatal(err)
		}
		for i, m := range ms {
			if m.version != i+1 {
				t.Fatalf("%s: migration %d is numbered %04d (%s)", dir, i+1, m.version, m.name)
			}
		}
	}
}

// Both databases have the same migrations under the same names, so a
// schema change is never made for one and forgotten for the other.
func TestMigrationsInStep(t *testing.T) {
	lite, err := loadMigrations(sqliteMigrations)
	if err != nil {
		t.Fatal(err)
	}
	pg, err := loadMigrations(postgresMigrations)
	if err != nil {
		t.Fatal(err)
	}
	if len(lite) != len(pg) {
		t.Fatalf("%d SQLite migrations, %d PostgreSQL ones", len(lite), len(pg))
	}
	for i := range lite {
		if lite[i].version != pg[i].version || lite[i].name != pg[i].name {
			t.Fatalf("migration %d: %04d_%s (SQLite) vs %04d_%s (PostgreSQL)", i+1, lite[i].version, lite[i].name, pg[i].version, pg[i].name)
		}
	}
}

func TestNumberedPlaceholders(t *testing.T) {
	for in, want := range map[string]string{
		`SELECT 1`:        `SELECT 1`,
		`a = ? AND b = ?`: `a = $1 AND b = $2`,
		`x LIKE ? ESCAPE '\' OR y LIKE ? ESCAPE '\'`: `x LIKE $1 ESCAPE '\' OR y LIKE $2 ESCAPE '\'`,
		`'?' = ? AND 'it''s?' = ?`:                   `'?' = $1 AND 'it''s?' = $2`,
	} {
		if got := numberedPlaceholders(in); got != want {
			t.Errorf("%s: got %s, want %s", in, got, want)
		}
	}
}

// Stored times sort as text in time order, also within one second.
func TestStoredTimesSortAsText(t *testing.T) {
	a := time.Date(2026, 1, 2, 3, 4, 5, 100_000_000, time.UTC).Format(storedTimeLayout)
	b := time.Date(2026, 1, 2, 3, 4, 5, 120_000_000, time.UTC).Format(storedTimeLayout)
	if !(a < b) {
		t.Fatalf("%s does not sort before %s", a, b)
	}
	if got, err := time.Parse(timeLayout, a); err != nil || got.Nanosecond() != 100_000_000 {
		t.Fatalf("read back %v %v", got, err)
	}
}
