package store

import (
	"context"
	"crypto/sha256"
	"database/sql"
	"encoding/hex"
	"errors"
	"fmt"
	"sort"
	"strings"
	"time"

	"fogbench/calc"
)

// CaseRecord is a stored case at one revision.
type CaseRecord struct {
	ID        int64
	Revision  int
	Case      calc.Case
	Checksum  string
	ParentID  int64 // the case this one was duplicated from, or 0
	Tags      []string
	Author    string // author of this revision
	CreatedAt time.Time
	UpdatedAt time.Time
	DeletedAt time.Time // zero unless in the trash
}

// ConflictError is returned when a save is based on a revision that is no
// longer the newest: Current is what is stored now, so the user can see both.
type ConflictError struct {
	Base    int
	Current CaseRecord
}

func (e *ConflictError) Error() string {
	return fmt.Sprintf("case %d was saved as revision %d by %s since you opened revision %d",
		e.Current.ID, e.Current.Revision, orSomeone(e.Current.Author), e.Base)
}

// Unwrap lets calc.ErrorCode classify the conflict.
func (e *ConflictError) Unwrap() error {
	return &calc.Error{Code: calc.Conflict, Message: e.Error()}
}

func orSomeone(a string) string {
	if a == "" {
		return "someone else"
	}
	return a
}

// Checksum is the hex SHA-256 of a case's canonical JSON (the stored body).
func Checksum(body []byte) string {
	sum := sha256.Sum256(body)
	return hex.EncodeToString(sum[:])
}

func encodeCase(c calc.Case) ([]byte, error) {
	c.Normalize()
	return c.Encode()
}

// timeLayout reads stored times (any fraction width); storedTimeLayout
// writes them with a fixed nine-digit fraction, so that sorting the text
// sorts the times (RFC 3339 with trailing zeros trimmed put 05.1Z after
// 05.12Z).
const (
	timeLayout       = time.RFC3339Nano
	storedTimeLayout = "2006-01-02T15:04:05.000000000Z07:00"
)

func (s *Store) now() string { return s.Now().UTC().Format(storedTimeLayout) }

// CreateCase stores a new case as revision 1.
func (s *Store) CreateCase(ctx context.Context, c calc.Case, author string) (CaseRecord, error) {
	tx, err := s.write.begin(ctx)
	if err != nil {
		return CaseRecord{}, wrapTx("create case", err)
	}
	defer tx.Rollback()
	id, err := insertCase(ctx, tx, c, author, 0, s.now())
	if err != nil {
		return CaseRecord{}, err
	}
	if err := tx.Commit(); err != nil {
		return CaseRecord{}, wrapTx("create case", err)
	}
	return s.GetCase(ctx, id)
}

func insertCase(ctx context.Context, tx *txn, c calc.Case, author string, parent int64, now string) (int64, error) {
	body, err := encodeCase(c)
	if err != nil {
		return 0, fmt.Errorf("store: encode case: %w", err)
	}
	sum := Checksum(body)
	var parentArg any
	if parent > 0 {
		parentArg = parent
	}
	var id int64
	err = tx.QueryRowContext(ctx, `INSERT INTO cases(name, fluid, model, family, revision, body, checksum, parent_id, created_at, updated_at)
		VALUES (?, ?, ?, ?, 1, ?, ?, ?, ?, ?) RETURNING id`,
		c.Name, c.Fluid, c.Distribution.Model, c.Distribution.Family, string(body), sum, parentArg, now, now).Scan(&id)
	if err != nil {
		return 0, wrapTx("insert case", err)
	}
	if err := insertRevision(ctx, tx, id, 1, c.Name, body, sum, author, now); err != nil {
		return 0, err
	}
	return id, nil
}

func insertRevision(ctx context.Context, tx *txn, id int64, rev int, name string, body []byte, sum, author, now string) error {
	_, err := tx.ExecContext(ctx, `INSERT INTO revisions(case_id, revision, name, body, checksum, author, created_at) VALUES (?, ?, ?, ?, ?, ?, ?)`,
		id, rev, name, string(body), sum, author, now)
	if err != nil {
		return wrapTx(fmt.Sprintf("insert revision %d of case %d", rev, id), err)
	}
	return nil
}

// UpdateCase saves c as a new revision of case id. base is the revision the
// user started from; when it is not the newest, nothing is written and a
// *ConflictError carries the stored version.
func (s *Store) UpdateCase(ctx context.Context, id int64, base int, c calc.Case, author string) (CaseRecord, error) {
	tx, err := s.write.begin(ctx)
	if err != nil {
		return CaseRecord{}, wrapTx("update case", err)
	}
	defer tx.Rollback()
	if err := lockCase(ctx, tx, id); err != nil {
		return CaseRecord{}, err
	}
	cur, err := getCase(ctx, tx, id)
	if err != nil {
		return CaseRecord{}, err
	}
	if cur.Revision != base {
		return CaseRecord{}, &ConflictError{Base: base, Current: cur}
	}
	body, err := encodeCase(c)
	if err != nil {
		return CaseRecord{}, fmt.Errorf("store: encode case %d: %w", id, err)
	}
	sum := Checksum(body)
	if sum == cur.Checksum {
		return cur, nil // nothing changed: no empty revision
	}
	now := s.now()
	rev := cur.Revision + 1
	// The row lock makes the revision read above current; the condition
	// on the revision is a second guard, so a save can never overwrite a
	// revision it did not start from.
	res, err := tx.ExecContext(ctx, `UPDATE cases SET name = ?, fluid = ?, model = ?, family = ?, revision = ?, body = ?, checksum = ?, updated_at = ? WHERE id = ? AND revision = ?`,
		c.Name, c.Fluid, c.Distribution.Model, c.Distribution.Family, rev, string(body), sum, now, id, cur.Revision)
	if err != nil {
		return CaseRecord{}, wrapTx(fmt.Sprintf("update case %d", id), err)
	}
	if n, err := res.RowsAffected(); err != nil || n != 1 {
		tx.Rollback()
		if latest, gerr := s.GetCase(ctx, id); gerr == nil {
			return CaseRecord{}, &ConflictError{Base: base, Current: latest}
		}
		return CaseRecord{}, calc.Errorf(calc.Conflict, "case %d changed while it was being saved; reload it", id)
	}
	if err := insertRevision(ctx, tx, id, rev, c.Name, body, sum, author, now); err != nil {
		return CaseRecord{}, err
	}
	if err := tx.Commit(); err != nil {
		return CaseRecord{}, wrapTx("update case", err)
	}
	return s.GetCase(ctx, id)
}

// lockCase locks case id's row until the transaction ends, so a
// read-then-write of the case cannot interleave with another server's; a
// missing case is NotFound.
func lockCase(ctx context.Context, tx *txn, id int64) error {
	var got int64
	err := tx.QueryRowContext(ctx, `SELECT id FROM cases WHERE id = ?`+tx.d.forUpdate(), id).Scan(&got)
	if errors.Is(err, sql.ErrNoRows) {
		return calc.Errorf(calc.NotFound, "case %d does not exist", id)
	}
	if err != nil {
		return wrapTx(fmt.Sprintf("lock case %d", id), err)
	}
	return nil
}

type queryer interface {
	QueryRowContext(ctx context.Context, query string, args ...any) *sql.Row
	QueryContext(ctx context.Context, query string, args ...any) (*sql.Rows, error)
}

// GetCase returns the newest revision of a case (also when it is in the
// trash).
func (s *Store) GetCase(ctx context.Context, id int64) (CaseRecord, error) {
	return getCase(ctx, s.read, id)
}

func getCase(ctx context.Context, q queryer, id int64) (CaseRecord, error) {
	var (
		rec              CaseRecord
		body             string
		parent           sql.NullInt64
		created, updated string
		deleted          sql.NullString
		author           sql.NullString
	)
	err := q.QueryRowContext(ctx, `SELECT c.id, c.revision, c.body, c.checksum, c.parent_id, c.created_at, c.updated_at, c.deleted_at,
		(SELECT author FROM revisions r WHERE r.case_id = c.id AND r.revision = c.revision)
		FROM cases c WHERE c.id = ?`, id).
		Scan(&rec.ID, &rec.Revision, &body, &rec.Checksum, &parent, &created, &updated, &deleted, &author)
	if errors.Is(err, sql.ErrNoRows) {
		return CaseRecord{}, calc.Errorf(calc.NotFound, "case %d does not exist", id)
	}
	if err != nil {
		return CaseRecord{}, fmt.Errorf("store: get case %d: %w", id, err)
	}
	c, err := calc.DecodeOne([]byte(body))
	if err != nil {
		return CaseRecord{}, fmt.Errorf("store: decode case %d: %w", id, err)
	}
	rec.Case = c
	rec.ParentID = parent.Int64
	rec.Author = author.String
	rec.CreatedAt, _ = time.Parse(timeLayout, created)
	rec.UpdatedAt, _ = time.Parse(timeLayout, updated)
	if deleted.Valid {
		rec.DeletedAt, _ = time.Parse(timeLayout, deleted.String)
	}
	rec.Tags, err = tagsOf(ctx, q, id)
	return rec, err
}

func tagsOf(ctx context.Context, q queryer, id int64) ([]string, error) {
	rows, err := q.QueryContext(ctx, `SELECT tag FROM case_tags WHERE case_id = ? ORDER BY tag`, id)
	if err != nil {
		return nil, fmt.Errorf("store: tags of case %d: %w", id, err)
	}
	defer rows.Close()
	var tags []string
	for rows.Next() {
		var t string
		if err := rows.Scan(&t); err != nil {
			return nil, err
		}
		tags = append(tags, t)
	}
	return tags, rows.Err()
}

// CaseSummary is one row of the library list.
type CaseSummary struct {
	ID        int64
	Name      string
	Fluid     string
	Model     string
	Family    string
	Revision  int
	Tags      []string
	UpdatedAt time.Time
}

// ListOptions filters and pages the library.
type ListOptions struct {
	Query  string // substring of name or case text
	Tag    string
	Fluid  string
	Family string
	Sort   string // "updated" (default, newest first), "name", "id"
	Trash  bool   // list the trash instead of the library
	Limit  int    // default 50, at most 500
	Offset int
}

// ListCases returns one page of case summaries and the total that match.
func (s *Store) ListCases(ctx context.Context, o ListOptions) ([]CaseSummary, int, error) {
	var where []string
	var args []any
	if o.Trash {
		where = append(where, "c.deleted_at IS NOT NULL")
	} else {
		where = append(where, "c.deleted_at IS NULL")
	}
	if q := strings.TrimSpace(o.Query); q != "" {
		like := "%" + escapeLike(q) + "%"
		op := s.d.like()
		where = append(where, `(c.name `+op+` ? ESCAPE '\' OR c.body `+op+` ? ESCAPE '\')`)
		args = append(args, like, like)
	}
	if o.Tag != "" {
		where = append(where, "EXISTS (SELECT 1 FROM case_tags t WHERE t.case_id = c.id AND t.tag = ?)")
		args = append(args, o.Tag)
	}
	if o.Fluid != "" {
		where = append(where, "c.fluid = ?")
		args = append(args, o.Fluid)
	}
	if o.Family != "" {
		where = append(where, "c.family = ?")
		args = append(args, o.Family)
	}
	cond := strings.Join(where, " AND ")
	var total int
	if err := s.read.QueryRowContext(ctx, "SELECT count(*) FROM cases c WHERE "+cond, args...).Scan(&total); err != nil {
		return nil, 0, fmt.Errorf("store: count cases: %w", err)
	}
	order := "c.updated_at DESC, c.id DESC"
	switch o.Sort {
	case "name":
		order = s.d.foldCase("c.name") + ", c.id"
	case "id":
		order = "c.id"
	}
	limit := o.Limit
	if limit <= 0 {
		limit = 50
	}
	limit = min(limit, 500)
	rows, err := s.read.QueryContext(ctx, `SELECT c.id, c.name, c.fluid, c.model, c.family, c.revision, c.updated_at, `+s.d.tagList()+`
		FROM cases c WHERE `+cond+` ORDER BY `+order+` LIMIT ? OFFSET ?`, append(args, limit, max(o.Offset, 0))...)
	if err != nil {
		return nil, 0, fmt.Errorf("store: list cases: %w", err)
	}
	defer rows.Close()
	var out []CaseSummary
	for rows.Next() {
		var cs CaseSummary
		var updated string
		var tags sql.NullString
		if err := rows.Scan(&cs.ID, &cs.Name, &cs.Fluid, &cs.Model, &cs.Family, &cs.Revision, &updated, &tags); err != nil {
			return nil, 0, fmt.Errorf("store: list cases: %w", err)
		}
		cs.UpdatedAt, _ = time.Parse(timeLayout, updated)
		if tags.String != "" {
			cs.Tags = strings.Split(tags.String, "\x1f")
		}
		out = append(out, cs)
	}
	return out, total, rows.Err()
}

func escapeLike(s string) string {
	r := strings.NewReplacer(`\`, `\\`, `%`, `\%`, `_`, `\_`)
	return r.Replace(s)
}

// Revision is one saved state of a case.
type Revision struct {
	CaseID    int64
	Revision  int
	Name      string
	Case      calc.Case
	Author    string
	CreatedAt time.Time
}

// Revisions lists a case's revisions, newest first.
func (s *Store) Revisions(ctx context.Context, id int64) ([]Revision, error) {
	if _, err := s.GetCase(ctx, id); err != nil {
		return nil, err
	}
	rows, err := s.read.QueryContext(ctx, `SELECT revision, name, body, author, created_at FROM revisions WHERE case_id = ? ORDER BY revision DESC`, id)
	if err != nil {
		return nil, fmt.Errorf("store: revisions of case %d: %w", id, err)
	}
	defer rows.Close()
	var out []Revision
	for rows.Next() {
		r := Revision{CaseID: id}
		var body, created string
		if err := rows.Scan(&r.Revision, &r.Name, &body, &r.Author, &created); err != nil {
			return nil, err
		}
		if r.Case, err = calc.DecodeOne([]byte(body)); err != nil {
			return nil, fmt.Errorf("store: decode revision %d of case %d: %w", r.Revision, id, err)
		}
		r.CreatedAt, _ = time.Parse(timeLayout, created)
		out = append(out, r)
	}
	return out, rows.Err()
}

// GetRevision returns one revision of a case.
func (s *Store) GetRevision(ctx context.Context, id int64, rev int) (Revision, error) {
	r := Revision{CaseID: id, Revision: rev}
	var body, created string
	err := s.read.QueryRowContext(ctx, `SELECT name, body, author, created_at FROM revisions WHERE case_id = ? AND revision = ?`, id, rev).
		Scan(&r.Name, &body, &r.Author, &created)
	if errors.Is(err, sql.ErrNoRows) {
		return Revision{}, calc.Errorf(calc.NotFound, "case %d has no revision %d", id, rev)
	}
	if err != nil {
		return Revision{}, fmt.Errorf("store: revision %d of case %d: %w", rev, id, err)
	}
	if r.Case, err = calc.DecodeOne([]byte(body)); err != nil {
		return Revision{}, fmt.Errorf("store: decode revision %d of case %d: %w", rev, id, err)
	}
	r.CreatedAt, _ = time.Parse(timeLayout, created)
	return r, nil
}

// DuplicateCase copies the newest revision of a case into a new case named
// name, keeping a link to the parent.
func (s *Store) DuplicateCase(ctx context.Context, id int64, name, author string) (CaseRecord, error) {
	tx, err := s.write.begin(ctx)
	if err != nil {
		return CaseRecord{}, wrapTx("duplicate case", err)
	}
	defer tx.Rollback()
	src, err := getCase(ctx, tx, id)
	if err != nil {
		return CaseRecord{}, err
	}
	c := src.Case
	c.Name = name
	newID, err := insertCase(ctx, tx, c, author, id, s.now())
	if err != nil {
		return CaseRecord{}, err
	}
	if err := setTags(ctx, tx, newID, src.Tags); err != nil {
		return CaseRecord{}, err
	}
	if err := tx.Commit(); err != nil {
		return CaseRecord{}, wrapTx("duplicate case", err)
	}
	return s.GetCase(ctx, newID)
}

// TrashCase moves a case to the trash; RestoreCase brings it back.
func (s *Store) TrashCase(ctx context.Context, id int64) error {
	return s.setDeleted(ctx, id, true)
}

// RestoreCase takes a case out of the trash.
func (s *Store) RestoreCase(ctx context.Context, id int64) error {
	return s.setDeleted(ctx, id, false)
}

func (s *Store) setDeleted(ctx context.Context, id int64, deleted bool) error {
	var val any
	if deleted {
		val = s.now()
	}
	res, err := s.write.ExecContext(ctx, `UPDATE cases SET deleted_at = ? WHERE id = ?`, val, id)
	if err != nil {
		return wrapTx(fmt.Sprintf("trash case %d", id), err)
	}
	if n, _ := res.RowsAffected(); n == 0 {
		return calc.Errorf(calc.NotFound, "case %d does not exist", id)
	}
	return nil
}

// SetTags replaces a case's tags. Tags are trimmed, lower-cased and
// de-duplicated.
func (s *Store) SetTags(ctx context.Context, id int64, tags []string) error {
	tx, err := s.write.begin(ctx)
	if err != nil {
		return wrapTx("set tags", err)
	}
	defer tx.Rollback()
	if err := lockCase(ctx, tx, id); err != nil {
		return err
	}
	if err := setTags(ctx, tx, id, tags); err != nil {
		return err
	}
	return wrapTx("set tags", tx.Commit())
}

// NormalizeTags trims, lower-cases, drops empties and de-duplicates; it
// refuses nothing (CheckTags does).
func NormalizeTags(tags []string) []string {
	seen := map[string]bool{}
	var out []string
	for _, t := range tags {
		t = strings.ToLower(strings.TrimSpace(t))
		if t == "" || seen[t] {
			continue
		}
		seen[t] = true
		out = append(out, t)
	}
	sort.Strings(out)
	return out
}

func setTags(ctx context.Context, tx *txn, id int64, tags []string) error {
	tags, err := CheckTags(tags)
	if err != nil {
		return err
	}
	if _, err := tx.ExecContext(ctx, `DELETE FROM case_tags WHERE case_id = ?`, id); err != nil {
		return wrapTx("clear tags", err)
	}
	for _, t := range tags {
		if _, err := tx.ExecContext(ctx, `INSERT INTO case_tags(case_id, tag) VALUES (?, ?)`, id, t); err != nil {
			return wrapTx("insert tag", err)
		}
	}
	return nil
}

// CountCases counts the cases outside the trash.
func (s *Store) CountCases(ctx context.Context) (int, error) {
	var n int
	err := s.read.QueryRowContext(ctx, `SELECT count(*) FROM cases WHERE deleted_at IS NULL`).Scan(&n)
	return n, err
}

// wrapTx adds context, and turns lock contention that outlasted the busy
// timeout into a message a user can act on.
func wrapTx(what string, err error) error {
	if err == nil {
		return nil
	}
	if isBusy(err) {
		return &calc.Error{Code: calc.Conflict, Message: "the case library is busy; try again in a moment", Err: err}
	}
	return fmt.Errorf("store: %s: %w", what, classify(err))
}
