package store

import (
	"context"
	"reflect"
	"testing"

	"fogbench/calc"
	"fogbench/store/storetest"
)

// A library moves between databases, in each direction, with every
// revision, tag, link, trash state and user liquid; the copy goes on
// numbering cases after the copied ones, and a second copy into a library
// that holds cases is refused.
func TestCopyLibraryBetweenDatabases(t *testing.T) {
	for _, from := range storetest.Backends() {
		for _, to := range storetest.Backends() {
			t.Run(from.Name+"-to-"+to.Name, func(t *testing.T) {
				ctx := context.Background()
				src := seededLibrary(t, lib{from})
				rows, _, _ := src.ListCases(ctx, ListOptions{Sort: "id"})
				dup, err := src.DuplicateCase(ctx, rows[1].ID, "copy of the second", "ben")
				if err != nil {
					t.Fatal(err)
				}
				if _, err := src.CreateLiquid(ctx, testLiquid()); err != nil {
					t.Fatal(err)
				}
				dst := lib{to}.fresh(t)
				rep, err := CopyLibrary(ctx, src, dst)
				if err != nil {
					t.Fatal(err)
				}
				if rep.Cases != 4 || rep.Revisions != 5 || rep.Liquids != 1 || rep.Tags != 5 {
					t.Fatalf("report %+v", rep)
				}
				for _, trash := range []bool{false, true} {
					a, na, _ := src.ListCases(ctx, ListOptions{Sort: "id", Trash: trash})
					b, nb, _ := dst.ListCases(ctx, ListOptions{Sort: "id", Trash: trash})
					if na != nb || !reflect.DeepEqual(a, b) {
						t.Fatalf("trash=%v: lists differ:\n%+v\n%+v", trash, a, b)
					}
				}
				for id := int64(1); id <= dup.ID; id++ {
					a, errA := src.GetCase(ctx, id)
					b, errB := dst.GetCase(ctx, id)
					if errA != nil || errB != nil || !reflect.DeepEqual(a, b) {
						t.Fatalf("case %d differs: %v %v\n%+v\n%+v", id, errA, errB, a, b)
					}
					ra, _ := src.Revisions(ctx, id)
					rb, _ := dst.Revisions(ctx, id)
					if !reflect.DeepEqual(ra, rb) {
						t.Fatalf("history of case %d differs", id)
					}
				}
				ea, _ := src.Export(ctx, ExportOptions{})
				eb, _ := dst.Export(ctx, ExportOptions{})
				if !reflect.DeepEqual(ea.Cases, eb.Cases) {
					t.Fatal("exports differ (uids, checksums or tags)")
				}
				if l, err := dst.GetLiquid(ctx, "plant-solvent"); err != nil || l.Spec != testLiquid() {
					t.Fatalf("liquid: %v", err)
				}
				if err := dst.IntegrityCheck(ctx); err != nil {
					t.Fatal(err)
				}
				next, err := dst.CreateCase(ctx, demoCase(t), "ana")
				if err != nil || next.ID != dup.ID+1 {
					t.Fatalf("new case after the copy is %d (%v), want %d", next.ID, err, dup.ID+1)
				}
				if _, err := CopyLibrary(ctx, src, dst); calc.ErrorCode(err) != calc.Invalid {
					t.Fatalf("copy into a full library: %v", err)
				}
			})
		}
	}
}
