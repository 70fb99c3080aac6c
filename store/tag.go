package store

import (
	"context"
	"fmt"
)

// TagCount is a tag and how many cases outside the trash carry it.
type TagCount struct {
	Tag   string
	Cases int
}

// Tags lists the tags in use, alphabetically, for filters and export.
func (s *Store) Tags(ctx context.Context) ([]TagCount, error) {
	rows, err := s.read.QueryContext(ctx, `SELECT t.tag, count(*) FROM case_tags t JOIN cases c ON c.id = t.case_id
		WHERE c.deleted_at IS NULL GROUP BY t.tag ORDER BY t.tag`)
	if err != nil {
		return nil, fmt.Errorf("store: tags: %w", err)
	}
	defer rows.Close()
	var out []TagCount
	for rows.Next() {
		var tc TagCount
		if err := rows.Scan(&tc.Tag, &tc.Cases); err != nil {
			return nil, fmt.Errorf("store: tags: %w", err)
		}
		out = append(out, tc)
	}
	return out, rows.Err()
}
