package store

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"strconv"
	"strings"

	"fogbench/calc"
	"fogbench/calc/valid"
)

// FieldDiff is one field of the case file compared across several cases or
// revisions: its dotted path (as in docs/case-format.md) and its value in
// each, in the order they were given.
type FieldDiff struct {
	Path    string
	Values  []string // display text; "" where the field is absent
	Present []bool
	raws    []json.RawMessage // compact JSON per case, nil when absent
}

// Differs reports whether the field's value in case i differs from case j
// (a field present in one and absent in the other differs).
func (f FieldDiff) Differs(i, j int) bool {
	return !bytes.Equal(f.raws[i], f.raws[j])
}

// Changed reports whether any case differs from the first.
func (f FieldDiff) Changed() bool {
	for i := 1; i < len(f.raws); i++ {
		if f.Differs(0, i) {
			return true
		}
	}
	return false
}

// Number is the field's value in case i when it is a JSON number.
func (f FieldDiff) Number(i int) (float64, bool) {
	raw := f.raws[i]
	if len(raw) == 0 || !(raw[0] == '-' || (raw[0] >= '0' && raw[0] <= '9')) {
		return 0, false
	}
	v, err := strconv.ParseFloat(string(raw), 64)
	return v, err == nil
}

// Numbers is the field's value in case i when it is a JSON array of
// numbers (class edges, fractions).
func (f FieldDiff) Numbers(i int) ([]float64, bool) {
	raw := f.raws[i]
	if len(raw) == 0 || raw[0] != '[' {
		return nil, false
	}
	var xs []float64
	if err := json.Unmarshal(raw, &xs); err != nil {
		return nil, false
	}
	return xs, true
}

// caseField is one leaf of a case file. Arrays are leaves: a list of class
// edges is one input, changed as a whole.
type caseField struct {
	keys []string
	raw  json.RawMessage
}

func (f caseField) path() string { return strings.Join(f.keys, ".") }

// flattenCase lists the leaves of a case's canonical JSON in file order.
func flattenCase(c calc.Case) ([]caseField, error) {
	body, err := encodeCase(c)
	if err != nil {
		return nil, fmt.Errorf("store: encode case: %w", err)
	}
	var out []caseField
	if err := flattenObject(body, nil, &out); err != nil {
		return nil, fmt.Errorf("store: flatten case: %w", err)
	}
	return out, nil
}

func flattenObject(data []byte, prefix []string, out *[]caseField) error {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	if tok, err := dec.Token(); err != nil || tok != json.Delim('{') {
		return fmt.Errorf("expected an object at %q", strings.Join(prefix, "."))
	}
	for dec.More() {
		tok, err := dec.Token()
		if err != nil {
			return err
		}
		key, _ := tok.(string)
		var raw json.RawMessage
		if err := dec.Decode(&raw); err != nil {
			return err
		}
		keys := append(append([]string(nil), prefix...), key)
		if len(raw) > 0 && raw[0] == '{' {
			if err := flattenObject(raw, keys, out); err != nil {
				return err
			}
			continue
		}
		var compact bytes.Buffer
		if err := json.Compact(&compact, raw); err != nil {
			return err
		}
		*out = append(*out, caseField{keys: keys, raw: compact.Bytes()})
	}
	return nil
}

// displayJSON shows a leaf for people: strings without quotes, lists
// separated by commas.
func displayJSON(raw json.RawMessage) string {
	if len(raw) == 0 {
		return ""
	}
	switch raw[0] {
	case '"':
		var s string
		if json.Unmarshal(raw, &s) == nil {
			return s
		}
	case '[':
		var items []json.RawMessage
		if json.Unmarshal(raw, &items) == nil {
			parts := make([]string, len(items))
			for i, it := range items {
				parts[i] = displayJSON(it)
			}
			return strings.Join(parts, ", ")
		}
	}
	return string(raw)
}

// CompareCases lines up the fields of two or more cases: one row per field
// that any of them has, in the order of the first case's file, then fields
// only later cases have. The diff is computed on the canonical case JSON, so
// it sees exactly what a save stores.
func CompareCases(cases ...calc.Case) ([]FieldDiff, error) {
	var order []string
	byPath := map[string]*FieldDiff{}
	for i, c := range cases {
		fields, err := flattenCase(c)
		if err != nil {
			return nil, err
		}
		for _, f := range fields {
			p := f.path()
			d, ok := byPath[p]
			if !ok {
				d = &FieldDiff{Path: p, Values: make([]string, len(cases)), Present: make([]bool, len(cases)), raws: make([]json.RawMessage, len(cases))}
				byPath[p] = d
				order = append(order, p)
			}
			d.Values[i] = displayJSON(f.raw)
			d.Present[i] = true
			d.raws[i] = f.raw
		}
	}
	out := make([]FieldDiff, len(order))
	for i, p := range order {
		out[i] = *byPath[p]
	}
	return out, nil
}

// DiffRevisions compares two revisions of a case field by field.
func (s *Store) DiffRevisions(ctx context.Context, id int64, a, b int) ([]FieldDiff, error) {
	ra, err := s.GetRevision(ctx, id, a)
	if err != nil {
		return nil, err
	}
	rb, err := s.GetRevision(ctx, id, b)
	if err != nil {
		return nil, err
	}
	return CompareCases(ra.Case, rb.Case)
}

// MergeCases builds a case from theirs with the fields named in takeMine
// (dotted paths) taken from mine; a field mine lacks is removed. Unknown
// paths are an error, so a stale form cannot silently drop a choice.
func MergeCases(theirs, mine calc.Case, takeMine []string) (calc.Case, error) {
	tf, err := flattenCase(theirs)
	if err != nil {
		return calc.Case{}, err
	}
	mf, err := flattenCase(mine)
	if err != nil {
		return calc.Case{}, err
	}
	mineBy := map[string]caseField{}
	for _, f := range mf {
		mineBy[f.path()] = f
	}
	theirsBy := map[string]int{}
	for i, f := range tf {
		theirsBy[f.path()] = i
	}
	take := map[string]bool{}
	for _, p := range takeMine {
		_, inMine := mineBy[p]
		_, inTheirs := theirsBy[p]
		if !inMine && !inTheirs {
			return calc.Case{}, &valid.FieldError{Field: "merge", Value: p, Message: "no such field in either version"}
		}
		take[p] = true
	}
	var merged []caseField
	for _, f := range tf {
		p := f.path()
		if !take[p] {
			merged = append(merged, f)
			continue
		}
		if m, ok := mineBy[p]; ok {
			merged = append(merged, m)
		}
	}
	for _, f := range mf { // fields only mine has, chosen
		if _, inTheirs := theirsBy[f.path()]; !inTheirs && take[f.path()] {
			merged = append(merged, f)
		}
	}
	c, err := calc.DecodeOne(unflatten(merged))
	if err != nil {
		return calc.Case{}, fmt.Errorf("store: merged case does not decode: %w", err)
	}
	return c, nil
}

// ReapplyChanges takes theirs and re-applies every field mine changed
// relative to base (the revision mine was edited from): a three-way merge.
// It also returns the fields both sides changed differently; mine wins
// there, and the caller shows them so the user can look again.
func ReapplyChanges(base, mine, theirs calc.Case) (calc.Case, []string, error) {
	rows, err := CompareCases(base, mine, theirs)
	if err != nil {
		return calc.Case{}, nil, err
	}
	var take, both []string
	for _, r := range rows {
		if !r.Differs(0, 1) {
			continue
		}
		take = append(take, r.Path)
		if r.Differs(0, 2) && r.Differs(1, 2) {
			both = append(both, r.Path)
		}
	}
	c, err := MergeCases(theirs, mine, take)
	return c, both, err
}

// unflatten rebuilds JSON from leaves, keeping their order.
func unflatten(fields []caseField) []byte {
	type node struct {
		order    []string
		children map[string]*node
		leaf     json.RawMessage
	}
	root := &node{children: map[string]*node{}}
	for _, f := range fields {
		n := root
		for i, k := range f.keys {
			child, ok := n.children[k]
			if !ok {
				child = &node{children: map[string]*node{}}
				n.children[k] = child
				n.order = append(n.order, k)
			}
			if i == len(f.keys)-1 {
				child.leaf = f.raw
			}
			n = child
		}
	}
	var buf bytes.Buffer
	var write func(n *node)
	write = func(n *node) {
		if n.leaf != nil {
			buf.Write(n.leaf)
			return
		}
		buf.WriteByte('{')
		for i, k := range n.order {
			if i > 0 {
				buf.WriteByte(',')
			}
			key, _ := json.Marshal(k)
			buf.Write(key)
			buf.WriteByte(':')
			write(n.children[k])
		}
		buf.WriteByte('}')
	}
	write(root)
	return buf.Bytes()
}

// RestoreRevision makes an old revision the newest: its content is saved as
// a new revision, so the history keeps everything in between. base is the
// newest revision the user saw; a newer one is a *ConflictError.
func (s *Store) RestoreRevision(ctx context.Context, id int64, rev, base int, author string) (CaseRecord, error) {
	old, err := s.GetRevision(ctx, id, rev)
	if err != nil {
		return CaseRecord{}, err
	}
	return s.UpdateCase(ctx, id, base, old.Case, author)
}

// MaxNameLen bounds a case name (in characters).
const MaxNameLen = calc.MaxNameChars

// RenameCase saves a new revision that differs only in its name.
func (s *Store) RenameCase(ctx context.Context, id int64, base int, name, author string) (CaseRecord, error) {
	name = strings.TrimSpace(name)
	if err := calc.CheckName(name); err != nil {
		return CaseRecord{}, err
	}
	cur, err := s.GetRevision(ctx, id, base)
	if err != nil {
		return CaseRecord{}, err
	}
	c := cur.Case
	c.Name = name
	return s.UpdateCase(ctx, id, base, c, author)
}
