package store

import (
	"bufio"
	"bytes"
	"context"
	"database/sql"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"sort"
	"strconv"
	"strings"
	"time"

	"fogbench/calc"
	"fogbench/calc/valid"
)

// BundleFormat tags version 1 of the bundle file (docs/bundle-format.md).
const BundleFormat = "fogbench-bundle/1"

// MaxBundleBytes bounds a bundle read by DecodeBundle: 256 MiB, room for
// a library of about 290,000 cases of the size the demo cases have (10,000
// of them export to 9.0 MB). The server accepts bundle
// uploads up to this size on its import routes, above the 8 MiB of every
// other request (docs/bundle-format.md).
const MaxBundleBytes = 256 << 20

// Bundle is a set of cases for sharing between libraries: the newest
// revision of each case with its tags, a stable uid and a checksum.
type Bundle struct {
	Format    string       `json:"format"`
	CreatedAt string       `json:"created_at"`
	Selection string       `json:"selection,omitempty"` // what was exported, for people
	CaseCount int          `json:"case_count"`
	Cases     []BundleCase `json:"cases"`
}

// BundleCase is one case of a bundle. Checksum is the hex SHA-256 of the
// case's canonical encoding (what the library stores), not of the bytes in
// the bundle, so re-indenting a bundle does not break it.
type BundleCase struct {
	UID       string          `json:"uid"`
	Revision  int             `json:"revision"` // in the exporting library; for people
	UpdatedAt string          `json:"updated_at"`
	Tags      []string        `json:"tags"`
	Checksum  string          `json:"checksum"`
	Case      json.RawMessage `json:"case"`

	decoded calc.Case
}

// Decoded is the case, once DecodeBundle has checked it.
func (bc BundleCase) Decoded() calc.Case { return bc.decoded }

// ExportOptions chooses what to export: the whole library (zero value), one
// tag, or the listed cases.
type ExportOptions struct {
	Tag string
	IDs []int64
}

// Export builds a bundle of the newest revision of each chosen case,
// ordered by case number. Cases in the trash are left out unless named in
// IDs; a named case that does not exist is an error.
func (s *Store) Export(ctx context.Context, o ExportOptions) (Bundle, error) {
	q := `SELECT c.id, c.uid, c.revision, c.updated_at, c.body, c.checksum, ` + s.d.tagList() + `
		FROM cases c`
	var args []any
	b := Bundle{Format: BundleFormat, CreatedAt: s.now(), Cases: []BundleCase{}}
	switch {
	case len(o.IDs) > 0:
		ph := make([]string, len(o.IDs))
		for i, id := range o.IDs {
			ph[i] = "?"
			args = append(args, id)
		}
		q += " WHERE c.id IN (" + strings.Join(ph, ",") + ")"
		b.Selection = "cases " + joinIDs(o.IDs)
	case o.Tag != "":
		q += " WHERE c.deleted_at IS NULL AND EXISTS (SELECT 1 FROM case_tags t WHERE t.case_id = c.id AND t.tag = ?)"
		args = append(args, o.Tag)
		b.Selection = "tag " + o.Tag
	default:
		q += " WHERE c.deleted_at IS NULL"
		b.Selection = "library"
	}
	rows, err := s.read.QueryContext(ctx, q+" ORDER BY c.id", args...)
	if err != nil {
		return Bundle{}, fmt.Errorf("store: export: %w", err)
	}
	defer rows.Close()
	seen := map[int64]bool{}
	for rows.Next() {
		var (
			id            int64
			bc            BundleCase
			updated, body string
			tags          sql.NullString
			uid           sql.NullString
		)
		if err := rows.Scan(&id, &uid, &bc.Revision, &updated, &body, &bc.Checksum, &tags); err != nil {
			return Bundle{}, fmt.Errorf("store: export: %w", err)
		}
		seen[id] = true
		bc.UID = uid.String
		bc.UpdatedAt = updated
		bc.Case = json.RawMessage(body)
		bc.Tags = []string{}
		if tags.String != "" {
			bc.Tags = strings.Split(tags.String, "\x1f")
		}
		b.Cases = append(b.Cases, bc)
	}
	if err := rows.Err(); err != nil {
		return Bundle{}, fmt.Errorf("store: export: %w", err)
	}
	for _, id := range o.IDs {
		if !seen[id] {
			return Bundle{}, calc.Errorf(calc.NotFound, "case %d does not exist", id)
		}
	}
	b.CaseCount = len(b.Cases)
	return b, nil
}

func joinIDs(ids []int64) string {
	parts := make([]string, len(ids))
	for i, id := range ids {
		parts[i] = strconv.FormatInt(id, 10)
	}
	return strings.Join(parts, ",")
}

// Encode writes the bundle as indented JSON.
func (b Bundle) Encode() ([]byte, error) {
	data, err := json.MarshalIndent(b, "", "  ")
	if err != nil {
		return nil, fmt.Errorf("store: encode bundle: %w", err)
	}
	return append(data, '\n'), nil
}

// DecodeBundle reads and checks a bundle completely before anything uses
// it: the format tag, the case count, each uid, each case (decoded strictly
// and validated) and each checksum. A truncated or altered bundle is a
// *valid.FieldError naming the first thing wrong.
//
// The bundle is decoded as it is read, never held whole as bytes, and at
// most MaxBundleBytes are read.
func DecodeBundle(r io.Reader) (Bundle, error) {
	lr := &countingReader{r: io.LimitReader(r, MaxBundleBytes+1)}
	br := bufio.NewReaderSize(lr, 64<<10)
	if bom, _ := br.Peek(3); bytes.Equal(bom, []byte("\xef\xbb\xbf")) {
		br.Discard(3)
	}
	tooLarge := func() error {
		return &valid.FieldError{Field: "bundle", Message: fmt.Sprintf("larger than %d MiB", MaxBundleBytes>>20)}
	}
	b, err := decodeBundleParts(&spaceSqueezer{r: br})
	switch {
	case lr.err != nil: // the reader failed (a body past the server's limit, a lost connection)
		return Bundle{}, fmt.Errorf("store: read bundle: %w", lr.err)
	case lr.n > MaxBundleBytes:
		return Bundle{}, tooLarge()
	case err != nil:
		return Bundle{}, err
	}
	if b.Format != BundleFormat {
		msg := "not a fogbench bundle (expected format " + BundleFormat + ")"
		if strings.HasPrefix(b.Format, "fogbench-bundle/") {
			msg = "bundle format version not supported by this fogbench (expected " + BundleFormat + ")"
		}
		return Bundle{}, &valid.FieldError{Field: "format", Value: clip(b.Format), Message: msg}
	}
	if b.CaseCount != len(b.Cases) {
		return Bundle{}, &valid.FieldError{Field: "case_count", Value: strconv.Itoa(b.CaseCount),
			Message: fmt.Sprintf("the bundle holds %d cases; it is incomplete or altered", len(b.Cases))}
	}
	uids := map[string]bool{}
	for i := range b.Cases {
		bc := &b.Cases[i]
		at := fmt.Sprintf("cases[%d]", i)
		if !isUID(bc.UID) {
			return Bundle{}, &valid.FieldError{Field: at + ".uid", Value: clip(bc.UID), Message: "must be 32 lower-case hex digits"}
		}
		if uids[bc.UID] {
			return Bundle{}, &valid.FieldError{Field: at + ".uid", Value: bc.UID, Message: "appears twice in the bundle"}
		}
		uids[bc.UID] = true
		if len(bc.Case) == 0 || bc.Case[0] != '{' {
			return Bundle{}, &valid.FieldError{Field: at + ".case", Message: "missing case object"}
		}
		c, err := calc.DecodeAt(bc.Case, at+".case")
		if err != nil {
			return Bundle{}, err
		}
		if err := calc.Validate(c); err != nil {
			return Bundle{}, fmt.Errorf("case %q: %w", clip(c.Name), valid.Within(at+".case", err))
		}
		body, err := encodeCase(c)
		if err != nil {
			return Bundle{}, &valid.FieldError{Field: at + ".case", Message: err.Error()}
		}
		if sum := Checksum(body); sum != bc.Checksum {
			return Bundle{}, &valid.FieldError{Field: at + ".checksum", Value: clip(bc.Checksum),
				Message: "does not match the case; the bundle was altered or damaged"}
		}
		c.Normalize()
		bc.decoded = c
		if bc.Tags, err = CheckTags(bc.Tags); err != nil {
			return Bundle{}, valid.Within(at, err)
		}
	}
	return b, nil
}

// countingReader counts the bytes read and keeps the first error that is
// not io.EOF (a broken connection, a body past the server's limit).
type countingReader struct {
	r   io.Reader
	n   int64
	err error
}

func (c *countingReader) Read(p []byte) (int, error) {
	n, err := c.r.Read(p)
	c.n += int64(n)
	if err != nil && err != io.EOF && c.err == nil {
		c.err = err
	}
	return n, err
}

// spaceSqueezer passes JSON through with each run of white space outside
// strings cut to one space. encoding/json's Decoder rescans the white
// space it has buffered at every refill when it looks for the next token
// (Token, More), so a bundle padded with megabytes of spaces took time
// quadratic in their length (256 MiB: minutes); one space still separates
// what the spaces separated, so the JSON means, and fails, the same.
type spaceSqueezer struct {
	r        io.Reader
	inString bool
	escaped  bool
	spaced   bool // the last byte passed on was white space outside a string
}

func (s *spaceSqueezer) Read(p []byte) (int, error) {
	for {
		n, err := s.r.Read(p)
		out := 0
		for _, c := range p[:n] {
			switch {
			case s.inString:
				switch {
				case s.escaped:
					s.escaped = false
				case c == '\\':
					s.escaped = true
				case c == '"':
					s.inString = false
				}
			case c == ' ' || c == '\t' || c == '\n' || c == '\r':
				if s.spaced {
					continue
				}
				s.spaced = true
				p[out] = c
				out++
				continue
			case c == '"':
				s.inString = true
			}
			s.spaced = false
			p[out] = c
			out++
		}
		if out > 0 || err != nil {
			return out, err
		}
	}
}

// decodeBundleParts reads a bundle from a stream one part at a time: the
// top-level fields, and each case of the list on its own, so that memory
// holds one case's bytes beside the decoded bundle and each error is
// named by its full path ("cases[3].uid") by valid.DecodeJSON, which
// needs the bytes of what it explains.
func decodeBundleParts(r io.Reader) (Bundle, error) {
	var b Bundle
	dec := json.NewDecoder(r)
	explain := func(err error) error { return valid.ExplainJSONError(err, "bundle") }
	tok, err := dec.Token()
	switch {
	case err == io.EOF:
		return b, &valid.FieldError{Field: "bundle", Message: "the file is empty"}
	case err != nil:
		return b, explain(err)
	case tok != json.Delim('{'):
		return b, &valid.FieldError{Field: "bundle", Message: "must be an object"}
	}
	part := func(key string, v any) error {
		var raw json.RawMessage
		if err := dec.Decode(&raw); err != nil {
			return explain(err)
		}
		return valid.DecodeJSON(raw, v, key)
	}
	seen := map[string]bool{}
	for dec.More() {
		tok, err := dec.Token()
		if err != nil {
			return b, explain(err)
		}
		key, _ := tok.(string)
		if seen[key] {
			return b, &valid.FieldError{Field: key, Message: "appears twice in the bundle"}
		}
		seen[key] = true
		switch key {
		case "format":
			err = part(key, &b.Format)
		case "created_at":
			err = part(key, &b.CreatedAt)
		case "selection":
			err = part(key, &b.Selection)
		case "case_count":
			err = part(key, &b.CaseCount)
		case "cases":
			err = decodeBundleCases(dec, &b)
		default:
			return b, &valid.FieldError{Field: key, Message: "unknown field; check its spelling against the format"}
		}
		if err != nil {
			return b, err
		}
	}
	if _, err := dec.Token(); err != nil { // the closing brace
		return b, explain(err)
	}
	if _, err := dec.Token(); err != io.EOF {
		return b, &valid.FieldError{Field: "bundle", Message: "has more after the end of the bundle"}
	}
	return b, nil
}

// decodeBundleCases reads the "cases" list element by element.
func decodeBundleCases(dec *json.Decoder, b *Bundle) error {
	tok, err := dec.Token()
	if err != nil {
		return valid.ExplainJSONError(err, "bundle")
	}
	if tok == nil { // "cases": null
		return nil
	}
	if tok != json.Delim('[') {
		return &valid.FieldError{Field: "cases", Message: "must be a list"}
	}
	for i := 0; dec.More(); i++ {
		var raw json.RawMessage
		if err := dec.Decode(&raw); err != nil {
			return valid.ExplainJSONError(err, "bundle")
		}
		var bc BundleCase
		at := fmt.Sprintf("cases[%d]", i)
		if err := valid.DecodeJSON(raw, &bc, ""); err != nil {
			return valid.Within(at, err)
		}
		b.Cases = append(b.Cases, bc)
	}
	_, err = dec.Token() // the closing bracket
	if err != nil {
		return valid.ExplainJSONError(err, "bundle")
	}
	return nil
}

func isUID(s string) bool {
	if len(s) != 32 {
		return false
	}
	for _, r := range s {
		if !(r >= '0' && r <= '9' || r >= 'a' && r <= 'f') {
			return false
		}
	}
	return true
}

func clip(s string) string {
	if r := []rune(s); len(r) > 60 {
		return string(r[:60]) + "…"
	}
	return s
}

// ImportAction is what an import does with one case of a bundle.
type ImportAction string

const (
	// ImportAdd: the library has no case with this uid or content.
	ImportAdd ImportAction = "add"
	// ImportKeep: the library already holds this exact case (same
	// checksum); nothing is written.
	ImportKeep ImportAction = "keep"
	// ImportConflict: the library holds this case (same uid) with other
	// content; the user chooses ImportReplace or ImportKeepBoth.
	ImportConflict ImportAction = "conflict"
)

// ImportChoice settles a conflict.
type ImportChoice string

const (
	// ImportKeepBoth adds the bundle's version as a new case linked to the
	// library's case, which stays as it is.
	ImportKeepBoth ImportChoice = "keep-both"
	// ImportReplace saves the bundle's version as a new revision of the
	// library's case; the older revisions stay in its history.
	ImportReplace ImportChoice = "replace"
)

// ImportItem is one case of a bundle and what the import does with it.
type ImportItem struct {
	UID              string
	Name             string
	Checksum         string
	Action           ImportAction
	ExistingID       int64 // the library's case for keep and conflict
	ExistingName     string
	ExistingRevision int
	ResultID         int64 // after the import: the case that holds it
}

// ImportResult sorts the bundle's cases by what the import did.
type ImportResult struct {
	Added, Replaced, Kept []ImportItem
}

// PlanImport says what importing b would do, writing nothing.
func (s *Store) PlanImport(ctx context.Context, b Bundle) ([]ImportItem, error) {
	return planImport(ctx, s.read, b)
}

func planImport(ctx context.Context, q queryer, b Bundle) ([]ImportItem, error) {
	items := make([]ImportItem, len(b.Cases))
	for i, bc := range b.Cases {
		it := ImportItem{UID: bc.UID, Name: bc.decoded.Name, Checksum: bc.Checksum, Action: ImportAdd}
		var (
			id   int64
			name string
			rev  int
			sum  string
		)
		err := q.QueryRowContext(ctx, `SELECT id, name, revision, checksum FROM cases WHERE uid = ?`, bc.UID).Scan(&id, &name, &rev, &sum)
		switch {
		case err == nil:
			it.ExistingID, it.ExistingName, it.ExistingRevision = id, name, rev
			it.Action = ImportConflict
			if sum == bc.Checksum {
				it.Action = ImportKeep
			}
		case errors.Is(err, sql.ErrNoRows):
			// The same content under another uid (a copy someone imported
			// with keep-both) is also already here.
			err = q.QueryRowContext(ctx, `SELECT id, name, revision FROM cases WHERE checksum = ? AND deleted_at IS NULL ORDER BY id LIMIT 1`, bc.Checksum).Scan(&id, &name, &rev)
			if err == nil {
				it.ExistingID, it.ExistingName, it.ExistingRevision = id, name, rev
				it.Action = ImportKeep
			} else if !errors.Is(err, sql.ErrNoRows) {
				return nil, fmt.Errorf("store: plan import: %w", err)
			}
		default:
			return nil, fmt.Errorf("store: plan import: %w", err)
		}
		items[i] = it
	}
	return items, nil
}

// importHook lets a test fail an import part-way to check that nothing of
// it remains.
var importHook func(i int) error

// Import applies a checked bundle in one transaction: every case is added,
// replaced or kept, or, on any failure, nothing is. choices settles the
// conflicts by uid; a conflict without a choice takes def (keep-both when
// def is empty, so nothing is lost by default).
func (s *Store) Import(ctx context.Context, b Bundle, choices map[string]ImportChoice, def ImportChoice, author string) (ImportResult, error) {
	if def == "" {
		def = ImportKeepBoth
	}
	tx, err := s.write.begin(ctx)
	if err != nil {
		return ImportResult{}, wrapTx("import", err)
	}
	defer tx.Rollback()
	// Two imports at once would both plan to add a case; the library lock
	// makes the second plan after the first has committed.
	if err := s.d.lock(ctx, tx, lockLibrary); err != nil {
		return ImportResult{}, wrapTx("import: lock", err)
	}
	items, err := planImport(ctx, tx, b)
	if err != nil {
		return ImportResult{}, err
	}
	now := s.now()
	var res ImportResult
	for i, it := range items {
		if importHook != nil {
			if err := importHook(i); err != nil {
				return ImportResult{}, err
			}
		}
		bc := b.Cases[i]
		switch it.Action {
		case ImportKeep:
			it.ResultID = it.ExistingID
			res.Kept = append(res.Kept, it)
			continue
		case ImportAdd:
			id, err := insertCase(ctx, tx, bc.decoded, author, 0, now)
			if err != nil {
				return ImportResult{}, err
			}
			if _, err := tx.ExecContext(ctx, `UPDATE cases SET uid = ? WHERE id = ?`, bc.UID, id); err != nil {
				return ImportResult{}, wrapTx("import: set uid", err)
			}
			if err := setTags(ctx, tx, id, bc.Tags); err != nil {
				return ImportResult{}, err
			}
			it.ResultID = id
			res.Added = append(res.Added, it)
			continue
		}
		choice := choices[it.UID]
		if choice == "" {
			choice = def
		}
		switch choice {
		case ImportReplace:
			if err := replaceInTx(ctx, tx, it.ExistingID, bc, author, now); err != nil {
				return ImportResult{}, err
			}
			it.ResultID = it.ExistingID
			res.Replaced = append(res.Replaced, it)
		case ImportKeepBoth:
			id, err := insertCase(ctx, tx, bc.decoded, author, it.ExistingID, now)
			if err != nil {
				return ImportResult{}, err
			}
			if err := setTags(ctx, tx, id, bc.Tags); err != nil {
				return ImportResult{}, err
			}
			it.ResultID = id
			res.Added = append(res.Added, it)
		default:
			return ImportResult{}, &valid.FieldError{Field: "choice", Value: string(choice), Message: "choose keep-both or replace"}
		}
	}
	if err := tx.Commit(); err != nil {
		return ImportResult{}, wrapTx("import", err)
	}
	return res, nil
}

// replaceInTx saves a bundle case as the newest revision of case id and
// takes it out of the trash: the user asked for this version.
func replaceInTx(ctx context.Context, tx *txn, id int64, bc BundleCase, author, now string) error {
	var rev int
	if err := tx.QueryRowContext(ctx, `SELECT revision FROM cases WHERE id = ?`+tx.d.forUpdate(), id).Scan(&rev); err != nil {
		return wrapTx(fmt.Sprintf("import: read case %d", id), err)
	}
	body, err := encodeCase(bc.decoded)
	if err != nil {
		return fmt.Errorf("store: encode case: %w", err)
	}
	c := bc.decoded
	rev++
	if _, err := tx.ExecContext(ctx, `UPDATE cases SET name = ?, fluid = ?, model = ?, family = ?, revision = ?, body = ?, checksum = ?, updated_at = ?, deleted_at = NULL WHERE id = ?`,
		c.Name, c.Fluid, c.Distribution.Model, c.Distribution.Family, rev, string(body), bc.Checksum, now, id); err != nil {
		return wrapTx(fmt.Sprintf("import: replace case %d", id), err)
	}
	if err := insertRevision(ctx, tx, id, rev, c.Name, body, bc.Checksum, author, now); err != nil {
		return err
	}
	return setTags(ctx, tx, id, bc.Tags)
}

// BundleFileName is a download name for a bundle made at t.
func BundleFileName(selection string, t time.Time) string {
	var b strings.Builder
	for _, r := range strings.ToLower(selection) {
		switch {
		case r >= 'a' && r <= 'z', r >= '0' && r <= '9':
			b.WriteRune(r)
		case b.Len() > 0 && !strings.HasSuffix(b.String(), "-"):
			b.WriteByte('-')
		}
	}
	name := strings.Trim(b.String(), "-")
	if len(name) > 40 {
		name = name[:40]
	}
	if name == "" {
		name = "cases"
	}
	return "fogbench-" + name + "-" + t.UTC().Format("20060102-1504") + ".json"
}

// SortItems orders import items for display: conflicts first, then adds,
// then the cases kept.
func SortItems(items []ImportItem) {
	rank := map[ImportAction]int{ImportConflict: 0, ImportAdd: 1, ImportKeep: 2}
	sort.SliceStable(items, func(i, j int) bool { return rank[items[i].Action] < rank[items[j].Action] })
}
