package store

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"fogbench/calc"
)

// seededLibrary holds the demo cases, one of them edited twice and tagged,
// and one in the trash.
func seededLibrary(t *testing.T, l lib) *Store {
	t.Helper()
	ctx := context.Background()
	s := l.fresh(t)
	if _, err := s.SeedDemo(ctx); err != nil {
		t.Fatal(err)
	}
	rows, _, err := s.ListCases(ctx, ListOptions{Sort: "id"})
	if err != nil || len(rows) < 3 {
		t.Fatalf("seed: %v", err)
	}
	rec, _ := s.GetCase(ctx, rows[0].ID)
	c := rec.Case
	c.Notes = "edited once"
	if _, err := s.UpdateCase(ctx, rec.ID, rec.Revision, c, "ana"); err != nil {
		t.Fatal(err)
	}
	if err := s.SetTags(ctx, rec.ID, []string{"dryer", "team-a"}); err != nil {
		t.Fatal(err)
	}
	if err := s.TrashCase(ctx, rows[2].ID); err != nil {
		t.Fatal(err)
	}
	return s
}

func exportBytes(t *testing.T, s *Store, o ExportOptions) []byte {
	t.Helper()
	b, err := s.Export(context.Background(), o)
	if err != nil {
		t.Fatal(err)
	}
	data, err := b.Encode()
	if err != nil {
		t.Fatal(err)
	}
	return data
}

// snapshot is everything the library holds, to prove an import changed
// nothing.
func snapshot(t *testing.T, s *Store) string {
	t.Helper()
	var b strings.Builder
	for _, q := range []string{
		`SELECT id, uid, name, revision, checksum, coalesce(deleted_at, '') FROM cases ORDER BY id`,
		`SELECT case_id, revision, checksum, author FROM revisions ORDER BY case_id, revision`,
		`SELECT case_id, tag FROM case_tags ORDER BY case_id, tag`,
	} {
		rows, err := s.read.QueryContext(context.Background(), q)
		if err != nil {
			t.Fatal(err)
		}
		cols, _ := rows.Columns()
		vals := make([]any, len(cols))
		ptrs := make([]any, len(cols))
		for i := range vals {
			ptrs[i] = &vals[i]
		}
		for rows.Next() {
			rows.Scan(ptrs...)
			for _, v := range vals {
				b.WriteString(" ")
				b.WriteString(toString(v))
			}
			b.WriteString("\n")
		}
		rows.Close()
	}
	return b.String()
}

func toString(v any) string {
	switch x := v.(type) {
	case []byte:
		return string(x)
	case nil:
		return "NULL"
	}
	data, _ := json.Marshal(v)
	return string(data)
}

// Export then import into an empty library gives the same cases (content,
// checksum, uid, tags) and the same evaluation results.
func TestBundleRoundTrip(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		src := seededLibrary(t, l)
		data := exportBytes(t, src, ExportOptions{})
		b, err := DecodeBundle(bytes.NewReader(data))
		if err != nil {
			t.Fatal(err)
		}
		if len(b.Cases) != 2 {
			t.Fatalf("exported %d cases, want the 2 outside the trash", len(b.Cases))
		}
		dst := l.fresh(t)
		plan, err := dst.PlanImport(ctx, b)
		if err != nil {
			t.Fatal(err)
		}
		for _, it := range plan {
			if it.Action != ImportAdd {
				t.Fatalf("empty library plans %s for %s", it.Action, it.Name)
			}
		}
		res, err := dst.Import(ctx, b, nil, "", "importer")
		if err != nil {
			t.Fatal(err)
		}
		if len(res.Added) != 2 || len(res.Replaced)+len(res.Kept) != 0 {
			t.Fatalf("result %+v", res)
		}
		for i, it := range res.Added {
			srcUID := b.Cases[i].UID
			var srcID int64
			src.read.QueryRowContext(ctx, `SELECT id FROM cases WHERE uid = ?`, srcUID).Scan(&srcID)
			a, _ := src.GetCase(ctx, srcID)
			d, err := dst.GetCase(ctx, it.ResultID)
			if err != nil {
				t.Fatal(err)
			}
			if a.Checksum != d.Checksum || !reflect.DeepEqual(a.Tags, d.Tags) || !reflect.DeepEqual(a.Case, d.Case) {
				t.Fatalf("case %q differs after the round trip:\n%+v\n%+v", a.Case.Name, a, d)
			}
			ra, errA := calc.Evaluate(a.Case)
			rd, errD := calc.Evaluate(d.Case)
			if errA != nil || errD != nil {
				t.Fatalf("evaluate: %v %v", errA, errD)
			}
			ja, _ := json.Marshal(ra)
			jd, _ := json.Marshal(rd)
			if !bytes.Equal(ja, jd) {
				t.Fatalf("results of %q differ after the round trip", a.Case.Name)
			}
		}
		// The same bundle again: everything is recognised and kept.
		res, err = dst.Import(ctx, b, nil, "", "importer")
		if err != nil || len(res.Kept) != 2 || len(res.Added) != 0 {
			t.Fatalf("second import %+v %v", res, err)
		}
		// An export of the imported library carries the same uids and checksums.
		again, _ := dst.Export(ctx, ExportOptions{})
		for i := range again.Cases {
			if again.Cases[i].UID != b.Cases[i].UID || again.Cases[i].Checksum != b.Cases[i].Checksum {
				t.Fatalf("re-export differs at %d", i)
			}
		}
	})
}

func TestExportSelections(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := seededLibrary(t, l)
		b, err := s.Export(ctx, ExportOptions{Tag: "team-a"})
		if err != nil || len(b.Cases) != 1 || b.Cases[0].Tags[1] != "team-a" {
			t.Fatalf("tag export %+v %v", b, err)
		}
		rows, _, _ := s.ListCases(ctx, ListOptions{Sort: "id"})
		b, err = s.Export(ctx, ExportOptions{IDs: []int64{rows[1].ID}})
		if err != nil || len(b.Cases) != 1 || b.CaseCount != 1 {
			t.Fatalf("ids export %+v %v", b, err)
		}
		if _, err := s.Export(ctx, ExportOptions{IDs: []int64{rows[1].ID, 999}}); calc.ErrorCode(err) != calc.NotFound {
			t.Fatalf("unknown id: %v", err)
		}
	})
}

// A conflict (same uid, other content) is settled per case by keep-both or
// replace; neither loses a revision.
func TestImportConflictChoices(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		src := seededLibrary(t, l)
		b, err := DecodeBundle(bytes.NewReader(exportBytes(t, src, ExportOptions{})))
		if err != nil {
			t.Fatal(err)
		}
		dst := l.fresh(t)
		res, err := dst.Import(ctx, b, nil, "", "x")
		if err != nil {
			t.Fatal(err)
		}
		// Both cases are edited in the destination library.
		for _, it := range res.Added {
			rec, _ := dst.GetCase(ctx, it.ResultID)
			c := rec.Case
			c.Notes = "local edit"
			if _, err := dst.UpdateCase(ctx, rec.ID, rec.Revision, c, "local"); err != nil {
				t.Fatal(err)
			}
		}
		plan, _ := dst.PlanImport(ctx, b)
		for _, it := range plan {
			if it.Action != ImportConflict || it.ExistingRevision != 2 {
				t.Fatalf("plan %+v", it)
			}
		}
		replaceUID, keepUID := b.Cases[0].UID, b.Cases[1].UID
		res, err = dst.Import(ctx, b, map[string]ImportChoice{replaceUID: ImportReplace}, "", "x")
		if err != nil {
			t.Fatal(err)
		}
		if len(res.Replaced) != 1 || len(res.Added) != 1 || res.Replaced[0].UID != replaceUID || res.Added[0].UID != keepUID {
			t.Fatalf("result %+v", res)
		}
		rep, _ := dst.GetCase(ctx, res.Replaced[0].ResultID)
		if rep.Revision != 3 || rep.Checksum != b.Cases[0].Checksum {
			t.Fatalf("replaced case rev %d", rep.Revision)
		}
		if old, _ := dst.GetRevision(ctx, rep.ID, 2); old.Case.Notes != "local edit" {
			t.Fatal("replace lost the local revision")
		}
		both, _ := dst.GetCase(ctx, res.Added[0].ResultID)
		local, _ := dst.GetCase(ctx, res.Added[0].ExistingID)
		if both.ParentID != local.ID || local.Case.Notes != "local edit" || both.Checksum != b.Cases[1].Checksum {
			t.Fatalf("keep-both: new %+v local %+v", both.ParentID, local.Case.Notes)
		}
		if _, err := dst.Import(ctx, b, map[string]ImportChoice{keepUID: "merge"}, "", "x"); calc.ErrorCode(err) != calc.Invalid {
			t.Fatalf("bad choice: %v", err)
		}
	})
}

// Malformed, truncated or altered bundles are refused whole, and the
// library is exactly as before.
func TestBadBundleLeavesLibraryUntouched(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := seededLibrary(t, l)
		good := exportBytes(t, s, ExportOptions{})
		before := snapshot(t, s)
		altered := bytes.Replace(good, []byte(`"fluid": "water"`), []byte(`"fluid": "n-heptane"`), 1)
		if bytes.Equal(altered, good) {
			t.Fatal("test bundle has no water case to alter")
		}
		cases := map[string][]byte{
			"empty":     nil,
			"not json":  []byte("this is not a bundle"),
			"truncated": good[:len(good)*2/3],
			"cut":       good[:len(good)-3],
			"altered":   altered,
			"format":    bytes.Replace(good, []byte(BundleFormat), []byte("fogbench-bundle/9"), 1),
			"count":     bytes.Replace(good, []byte(`"case_count": 2`), []byte(`"case_count": 3`), 1),
			"trailing":  append(append([]byte{}, good...), []byte("{}")...),
			"unknown":   bytes.Replace(good, []byte(`"cases":`), []byte(`"extra": 1, "cases":`), 1),
		}
		for name, data := range cases {
			_, err := DecodeBundle(bytes.NewReader(data))
			if calc.ErrorCode(err) != calc.Invalid {
				t.Errorf("%s: want an invalid-input error, got %v", name, err)
			}
		}
		if snapshot(t, s) != before {
			t.Fatal("library changed")
		}
		// A failure part-way through applying a good bundle rolls back the
		// cases already written.
		other := l.fresh(t)
		b, _ := DecodeBundle(bytes.NewReader(good))
		otherBefore := snapshot(t, other)
		importHook = func(i int) error {
			if i == 1 {
				return errors.New("disk gone")
			}
			return nil
		}
		defer func() { importHook = nil }()
		if _, err := other.Import(ctx, b, nil, "", "x"); err == nil {
			t.Fatal("import should fail")
		}
		if snapshot(t, other) != otherBefore {
			t.Fatal("a failed import left cases behind")
		}
	})
}

func FuzzDecodeBundle(f *testing.F) {
	s, err := Open(context.Background(), filepath.Join(f.TempDir(), "lib.db"))
	if err != nil {
		f.Fatal(err)
	}
	if _, err := s.SeedDemo(context.Background()); err != nil {
		f.Fatal(err)
	}
	b, _ := s.Export(context.Background(), ExportOptions{})
	good, _ := b.Encode()
	s.Close()
	f.Add(good)
	f.Add(good[:len(good)/2])
	f.Add([]byte(`{"format":"fogbench-bundle/1","created_at":"","case_count":0,"cases":[]}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		b, err := DecodeBundle(bytes.NewReader(data))
		if err != nil {
			if calc.ErrorCode(err) != calc.Invalid {
				t.Fatalf("a bad bundle must be an invalid-input error: %v", err)
			}
			return
		}
		// What decodes has verified checksums and re-encodes to a bundle
		// that decodes to the same cases.
		out, err := b.Encode()
		if err != nil {
			t.Fatal(err)
		}
		b2, err := DecodeBundle(bytes.NewReader(out))
		if err != nil || len(b2.Cases) != len(b.Cases) {
			t.Fatalf("re-decode: %v", err)
		}
		for i := range b.Cases {
			body, _ := encodeCase(b.Cases[i].Decoded())
			if Checksum(body) != b.Cases[i].Checksum {
				t.Fatal("checksum not verified")
			}
		}
	})
}

// The seed corpus under testdata/fuzz stays decodable where it should be.
func TestBundleSeedCorpusPresent(t *testing.T) {
	entries, err := os.ReadDir(filepath.Join("testdata", "fuzz", "FuzzDecodeBundle"))
	if err != nil || len(entries) == 0 {
		t.Fatalf("seed corpus missing: %v", err)
	}
}
