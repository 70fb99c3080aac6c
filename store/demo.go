package store

import (
	"context"
	"embed"
	"fmt"
	"io/fs"
	"sort"

	"fogbench/calc"
)

// The demo cases describe invented nozzles at an invented plant (the
// "Quillmere Works" spray dryer, gas-turbine rig and humidifier); they are
// examples of our own, not measurements.
//
//go:embed demo/*.json
var demoFS embed.FS

// DemoCases returns the embedded demo cases in file-name order.
func DemoCases() ([]calc.Case, error) {
	names, err := fs.Glob(demoFS, "demo/*.json")
	if err != nil {
		return nil, err
	}
	sort.Strings(names)
	var out []calc.Case
	for _, n := range names {
		data, err := demoFS.ReadFile(n)
		if err != nil {
			return nil, err
		}
		c, err := calc.DecodeOne(data)
		if err != nil {
			return nil, fmt.Errorf("store: demo case %s: %w", n, err)
		}
		out = append(out, c)
	}
	return out, nil
}

// SeedDemo stores the demo cases when the library has never held a case, so
// a first start shows examples but a team that emptied its library is not
// refilled.
func (s *Store) SeedDemo(ctx context.Context) (int, error) {
	cases, err := DemoCases()
	if err != nil {
		return 0, err
	}
	tx, err := s.write.begin(ctx)
	if err != nil {
		return 0, wrapTx("seed demo", err)
	}
	defer tx.Rollback()
	// Counted under the library lock, so two servers starting at once on
	// one PostgreSQL seed the examples once.
	if err := s.d.lock(ctx, tx, lockLibrary); err != nil {
		return 0, wrapTx("seed demo: lock", err)
	}
	var ever int
	if err := tx.QueryRowContext(ctx, `SELECT count(*) FROM cases`).Scan(&ever); err != nil {
		return 0, fmt.Errorf("store: seed demo: %w", err)
	}
	if ever > 0 {
		return 0, nil
	}
	now := s.now()
	for _, c := range cases {
		id, err := insertCase(ctx, tx, c, "fogbench demo", 0, now)
		if err != nil {
			return 0, err
		}
		if err := setTags(ctx, tx, id, []string{"demo"}); err != nil {
			return 0, err
		}
	}
	return len(cases), wrapTx("seed demo", tx.Commit())
}
