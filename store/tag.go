package store

import (
	"context"
	"fmt"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"fogbench/calc/valid"
)

// Limits on a case's tags: a tag is a short label, and the library page
// lists every tag of every case (200,000 tags on one case once made it
// 9 MB).
const (
	MaxTagsPerCase = 50
	MaxTagChars    = 40
)

// CheckTags normalizes tags (NormalizeTags) and refuses, as a field error
// on "tags", more than MaxTagsPerCase distinct tags, a tag longer than
// MaxTagChars characters, and a tag with control characters or bytes that
// are not UTF-8. Nothing is dropped silently.
func CheckTags(tags []string) ([]string, error) {
	tags = NormalizeTags(tags)
	for _, t := range tags {
		shown := t
		if r := []rune(t); len(r) > MaxTagChars {
			shown = string(r[:MaxTagChars]) + "…"
		}
		switch {
		case !utf8.ValidString(t):
			return nil, &valid.FieldError{Field: "tags", Value: strconv.Quote(shown), Message: "a tag holds bytes that are not UTF-8 text"}
		case strings.IndexFunc(t, unicode.IsControl) >= 0:
			return nil, &valid.FieldError{Field: "tags", Value: strconv.Quote(shown), Message: "a tag must be plain text, without control characters (line breaks, tabs, NUL)"}
		case utf8.RuneCountInString(t) > MaxTagChars:
			return nil, &valid.FieldError{Field: "tags", Value: strconv.Quote(shown), Message: fmt.Sprintf("each tag must be at most %d characters", MaxTagChars)}
		}
	}
	if len(tags) > MaxTagsPerCase {
		return nil, &valid.FieldError{Field: "tags", Value: strconv.Itoa(len(tags)), Message: fmt.Sprintf("at most %d tags per case", MaxTagsPerCase)}
	}
	return tags, nil
}

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
