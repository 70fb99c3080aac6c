package store

import (
	"context"
	"errors"
	"slices"
	"testing"

	"fogbench/calc"
)

func changedPaths(rows []FieldDiff) []string {
	var out []string
	for _, r := range rows {
		if r.Changed() {
			out = append(out, r.Path)
		}
	}
	return out
}

func TestDiffRevisions(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
		c := demoCase(t)
		rec, err := s.CreateCase(ctx, c, "ana")
		if err != nil {
			t.Fatal(err)
		}
		c2 := rec.Case
		c2.Gas.PressurePa = 2 * c2.Gas.PressurePa
		c2.Notes = "raised pressure"
		rh := 0.4
		c2.Gas.RelativeHumidity, c2.Gas.VaporMoleFraction = &rh, nil
		if _, err := s.UpdateCase(ctx, rec.ID, 1, c2, "ben"); err != nil {
			t.Fatal(err)
		}
		rows, err := s.DiffRevisions(ctx, rec.ID, 1, 2)
		if err != nil {
			t.Fatal(err)
		}
		got := changedPaths(rows)
		want := []string{"notes", "gas.pressure_pa", "gas.relative_humidity"}
		if rec.Case.Gas.VaporMoleFraction != nil {
			want = append(want, "gas.vapor_mole_fraction")
		}
		slices.Sort(got)
		slices.Sort(want)
		if !slices.Equal(got, want) {
			t.Fatalf("changed fields %v, want %v", got, want)
		}
		for _, r := range rows {
			switch r.Path {
			case "gas.pressure_pa":
				a, okA := r.Number(0)
				b, okB := r.Number(1)
				if !okA || !okB || b != 2*a {
					t.Fatalf("pressure values %v %v", r.Values, r.raws)
				}
			case "gas.relative_humidity":
				if r.Present[0] || !r.Present[1] || r.Values[1] != "0.4" {
					t.Fatalf("humidity present %v values %q", r.Present, r.Values)
				}
			case "name":
				if r.Changed() {
					t.Fatal("name marked changed")
				}
			}
		}
		if _, err := s.DiffRevisions(ctx, rec.ID, 1, 7); calc.ErrorCode(err) != calc.NotFound {
			t.Fatalf("diff with a missing revision: %v", err)
		}
	})
}

// Arrays are one field; objects nest with dots.
func TestCompareCasesArraysAndAbsence(t *testing.T) {
	a := demoCase(t)
	a.Distribution = calc.Distribution{Model: "bins", EdgesM: []float64{1e-6, 2e-6, 4e-6}, Fraction: []float64{0.5, 0.5}, Basis: "volume"}
	b := a
	b.Distribution.Fraction = []float64{0.4, 0.6}
	rows, err := CompareCases(a, b, a)
	if err != nil {
		t.Fatal(err)
	}
	got := changedPaths(rows)
	if !slices.Equal(got, []string{"distribution.fraction"}) {
		t.Fatalf("changed %v", got)
	}
	for _, r := range rows {
		if r.Path == "distribution.fraction" {
			if r.Values[1] != "0.4, 0.6" || r.Differs(0, 2) || !r.Differs(1, 2) {
				t.Fatalf("fraction row %+v", r)
			}
		}
	}
}

func TestMergeAndReapply(t *testing.T) {
	base := demoCase(t)
	base.Normalize()
	mine, theirs := base, base
	mine.Notes = "mine"
	mine.Gas.TemperatureK = base.Gas.TemperatureK + 10
	theirs.Gas.PressurePa = base.Gas.PressurePa * 3
	theirs.Gas.TemperatureK = base.Gas.TemperatureK + 20
	merged, both, err := ReapplyChanges(base, mine, theirs)
	if err != nil {
		t.Fatal(err)
	}
	if merged.Notes != "mine" || merged.Gas.PressurePa != theirs.Gas.PressurePa || merged.Gas.TemperatureK != mine.Gas.TemperatureK {
		t.Fatalf("reapply gave notes %q p %g T %g", merged.Notes, merged.Gas.PressurePa, merged.Gas.TemperatureK)
	}
	if !slices.Equal(both, []string{"gas.temperature_k"}) {
		t.Fatalf("both changed %v", both)
	}
	// Per-field choice: take only my notes.
	m2, err := MergeCases(theirs, mine, []string{"notes"})
	if err != nil {
		t.Fatal(err)
	}
	if m2.Notes != "mine" || m2.Gas.TemperatureK != theirs.Gas.TemperatureK {
		t.Fatalf("merge gave %q %g", m2.Notes, m2.Gas.TemperatureK)
	}
	// Taking "mine" for a field mine lacks removes it.
	theirs.Notes = "theirs only"
	mine.Notes = ""
	m3, err := MergeCases(theirs, mine, []string{"notes"})
	if err != nil || m3.Notes != "" {
		t.Fatalf("removing notes: %q %v", m3.Notes, err)
	}
	if _, err := MergeCases(theirs, mine, []string{"no.such"}); calc.ErrorCode(err) != calc.Invalid {
		t.Fatalf("unknown path: %v", err)
	}
	// Merging every field from mine gives mine back exactly.
	rows, _ := CompareCases(theirs, mine)
	var all []string
	for _, r := range rows {
		all = append(all, r.Path)
	}
	m4, err := MergeCases(theirs, mine, all)
	if err != nil {
		t.Fatal(err)
	}
	bm, _ := encodeCase(mine)
	b4, _ := encodeCase(m4)
	if Checksum(bm) != Checksum(b4) {
		t.Fatalf("full merge differs from mine:\n%s\n%s", bm, b4)
	}
}

func TestRestoreRevisionAndRename(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
		c := demoCase(t)
		rec, _ := s.CreateCase(ctx, c, "ana")
		c2 := rec.Case
		c2.Notes = "second"
		if _, err := s.UpdateCase(ctx, rec.ID, 1, c2, "ben"); err != nil {
			t.Fatal(err)
		}
		got, err := s.RestoreRevision(ctx, rec.ID, 1, 2, "cleo")
		if err != nil {
			t.Fatal(err)
		}
		if got.Revision != 3 || got.Checksum != rec.Checksum || got.Author != "cleo" {
			t.Fatalf("restored %d %s by %s", got.Revision, got.Checksum, got.Author)
		}
		// Restoring from a stale view of the case is a conflict, not an
		// overwrite.
		var ce *ConflictError
		if _, err := s.RestoreRevision(ctx, rec.ID, 2, 2, "dan"); !errors.As(err, &ce) || ce.Current.Revision != 3 {
			t.Fatalf("stale restore: %v", err)
		}
		r4, err := s.RenameCase(ctx, rec.ID, 3, "  Renamed nozzle ", "ana")
		if err != nil || r4.Case.Name != "Renamed nozzle" || r4.Revision != 4 {
			t.Fatalf("rename: %+v %v", r4.Case.Name, err)
		}
		if _, err := s.RenameCase(ctx, rec.ID, 4, "   ", "ana"); calc.ErrorCode(err) != calc.Invalid {
			t.Fatalf("empty name: %v", err)
		}
		if _, err := s.RenameCase(ctx, rec.ID, 3, "x", "ana"); !errors.As(err, &ce) {
			t.Fatalf("stale rename: %v", err)
		}
		revs, _ := s.Revisions(ctx, rec.ID)
		if len(revs) != 4 {
			t.Fatalf("%d revisions, want 4 (nothing lost, nothing extra)", len(revs))
		}
	})
}
