package store

import (
	"context"
	"database/sql"
	"encoding/json"
	"errors"
	"fmt"
	"regexp"
	"time"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/calc/valid"
)

// LiquidRecord is a stored user-defined liquid.
type LiquidRecord struct {
	Spec      fluid.CustomSpec
	Revision  int
	CreatedAt time.Time
	UpdatedAt time.Time
}

// liquidID is the shape of a user liquid id: it appears in URLs and case
// files, so it is kept to lower-case letters, digits and single hyphens.
var liquidID = regexp.MustCompile(`^[a-z0-9]+(-[a-z0-9]+)*$`)

// checkLiquid validates a spec as a case would use it, plus the id rules of
// the store, so nothing unusable is ever written.
func checkLiquid(spec fluid.CustomSpec) error {
	var errs valid.Errors
	if spec.ID != "" && (!liquidID.MatchString(spec.ID) || len(spec.ID) > 40) {
		errs = append(errs, &valid.FieldError{Field: "custom.id", Value: spec.ID,
			Message: "use 1–40 lower-case letters, digits and hyphens (e.g. plant-solvent-2)"})
	}
	if len(spec.Name) > 120 {
		errs = append(errs, &valid.FieldError{Field: "custom.name", Message: "must be at most 120 characters"})
	}
	if _, err := fluid.NewCustomLiquid(spec); err != nil {
		if !errs.Add(err) {
			return err
		}
	}
	return errs.Err()
}

// CreateLiquid stores a new user liquid. An id already taken is a conflict.
func (s *Store) CreateLiquid(ctx context.Context, spec fluid.CustomSpec) (LiquidRecord, error) {
	if err := checkLiquid(spec); err != nil {
		return LiquidRecord{}, err
	}
	tx, err := s.write.begin(ctx)
	if err != nil {
		return LiquidRecord{}, wrapTx("create liquid", err)
	}
	defer tx.Rollback()
	if _, err := getLiquid(ctx, tx, spec.ID, ""); err == nil {
		return LiquidRecord{}, &valid.FieldError{Field: "custom.id", Value: spec.ID, Message: "is taken by another user liquid; choose another id"}
	} else if calc.ErrorCode(err) != calc.NotFound {
		return LiquidRecord{}, err
	}
	if err := insertLiquid(ctx, tx, spec, s.now()); err != nil {
		return LiquidRecord{}, err
	}
	if err := tx.Commit(); err != nil {
		return LiquidRecord{}, wrapTx("create liquid", err)
	}
	return s.GetLiquid(ctx, spec.ID)
}

func insertLiquid(ctx context.Context, tx *txn, spec fluid.CustomSpec, now string) error {
	body, err := json.Marshal(spec)
	if err != nil {
		return fmt.Errorf("store: encode liquid %s: %w", spec.ID, err)
	}
	_, err = tx.ExecContext(ctx, `INSERT INTO custom_liquids(id, name, revision, body, created_at, updated_at) VALUES (?, ?, 1, ?, ?, ?)`,
		spec.ID, spec.Name, string(body), now, now)
	if tx.d.isDuplicate(err) { // another server created it since the check
		return &valid.FieldError{Field: "custom.id", Value: spec.ID, Message: "is taken by another user liquid; choose another id"}
	}
	return wrapTx("insert liquid "+spec.ID, err)
}

// UpdateLiquid replaces the definition of user liquid id. base is the
// revision the user edited; a newer stored one is a conflict and nothing is
// written. The id itself cannot change (cases name it).
func (s *Store) UpdateLiquid(ctx context.Context, id string, base int, spec fluid.CustomSpec) (LiquidRecord, error) {
	if spec.ID != id {
		return LiquidRecord{}, &valid.FieldError{Field: "custom.id", Value: spec.ID, Message: fmt.Sprintf("cannot change; save a new liquid instead of renaming %q", id)}
	}
	if err := checkLiquid(spec); err != nil {
		return LiquidRecord{}, err
	}
	tx, err := s.write.begin(ctx)
	if err != nil {
		return LiquidRecord{}, wrapTx("update liquid", err)
	}
	defer tx.Rollback()
	cur, err := getLiquid(ctx, tx, id, tx.d.forUpdate())
	if err != nil {
		return LiquidRecord{}, err
	}
	if cur.Revision != base {
		return LiquidRecord{}, calc.Errorf(calc.Conflict, "liquid %s was saved as revision %d since you opened revision %d; reload it and apply your change again", id, cur.Revision, base)
	}
	body, err := json.Marshal(spec)
	if err != nil {
		return LiquidRecord{}, fmt.Errorf("store: encode liquid %s: %w", id, err)
	}
	if _, err := tx.ExecContext(ctx, `UPDATE custom_liquids SET name = ?, revision = ?, body = ?, updated_at = ? WHERE id = ? AND revision = ?`,
		spec.Name, cur.Revision+1, string(body), s.now(), id, cur.Revision); err != nil {
		return LiquidRecord{}, wrapTx("update liquid "+id, err)
	}
	if err := tx.Commit(); err != nil {
		return LiquidRecord{}, wrapTx("update liquid", err)
	}
	return s.GetLiquid(ctx, id)
}

// GetLiquid returns a stored user liquid; an unknown id is NotFound.
func (s *Store) GetLiquid(ctx context.Context, id string) (LiquidRecord, error) {
	return getLiquid(ctx, s.read, id, "")
}

// getLiquid reads a liquid; lock is "" or the dialect's FOR UPDATE.
func getLiquid(ctx context.Context, q queryer, id, lock string) (LiquidRecord, error) {
	var rec LiquidRecord
	var body, created, updated string
	err := q.QueryRowContext(ctx, `SELECT revision, body, created_at, updated_at FROM custom_liquids WHERE id = ?`+lock, id).
		Scan(&rec.Revision, &body, &created, &updated)
	if errors.Is(err, sql.ErrNoRows) {
		return LiquidRecord{}, calc.Errorf(calc.NotFound, "there is no user liquid %q", id)
	}
	if err != nil {
		return LiquidRecord{}, fmt.Errorf("store: get liquid %s: %w", id, err)
	}
	if err := json.Unmarshal([]byte(body), &rec.Spec); err != nil {
		return LiquidRecord{}, fmt.Errorf("store: decode liquid %s: %w", id, err)
	}
	rec.CreatedAt, _ = time.Parse(timeLayout, created)
	rec.UpdatedAt, _ = time.Parse(timeLayout, updated)
	return rec, nil
}

// ListLiquids returns every user liquid, by name.
func (s *Store) ListLiquids(ctx context.Context) ([]LiquidRecord, error) {
	rows, err := s.read.QueryContext(ctx, `SELECT id FROM custom_liquids ORDER BY `+s.d.foldCase("name")+`, id`)
	if err != nil {
		return nil, fmt.Errorf("store: list liquids: %w", err)
	}
	var ids []string
	for rows.Next() {
		var id string
		if err := rows.Scan(&id); err != nil {
			rows.Close()
			return nil, fmt.Errorf("store: list liquids: %w", err)
		}
		ids = append(ids, id)
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, fmt.Errorf("store: list liquids: %w", err)
	}
	out := make([]LiquidRecord, 0, len(ids))
	for _, id := range ids {
		rec, err := s.GetLiquid(ctx, id)
		if err != nil {
			return nil, err
		}
		out = append(out, rec)
	}
	return out, nil
}

// DeleteLiquid removes a user liquid. Cases that used it keep working: they
// carry their own copy of the definition.
func (s *Store) DeleteLiquid(ctx context.Context, id string) error {
	res, err := s.write.ExecContext(ctx, `DELETE FROM custom_liquids WHERE id = ?`, id)
	if err != nil {
		return wrapTx("delete liquid "+id, err)
	}
	if n, _ := res.RowsAffected(); n == 0 {
		return calc.Errorf(calc.NotFound, "there is no user liquid %q", id)
	}
	return nil
}
