package server

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"net/http"
	"strconv"
	"strings"

	"github.com/go-chi/chi/v5"

	"fogbench/calc"
	"fogbench/store"
	"fogbench/views"
)

func revisionRow(rv store.Revision, sum string) views.RevisionRow {
	return views.RevisionRow{Revision: rv.Revision, Name: rv.Name, Author: rv.Author, Created: rv.CreatedAt, Checksum: sum}
}

// handleRevisions serves GET /cases/{id}/revisions.
func (s *Server) handleRevisions(w http.ResponseWriter, r *http.Request) {
	rec, err := s.storedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	id := rec.ID
	revs, err := s.Store.Revisions(r.Context(), id)
	if err != nil {
		s.error(w, r, err)
		return
	}
	v := views.RevisionsView{
		Chrome: views.Chrome{Title: "History of " + rec.Case.Name, Nav: "library", Display: display(r)},
		ID:     id, Name: rec.Case.Name, Current: rec.Revision, Trashed: !rec.DeletedAt.IsZero(),
	}
	for _, rv := range revs {
		c := rv.Case
		c.Normalize()
		body, err := c.Encode()
		if err != nil {
			s.error(w, r, err)
			return
		}
		v.Rows = append(v.Rows, revisionRow(rv, store.Checksum(body)))
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.RevisionsPage(v))
}

func revisionParam(raw string) (int, error) {
	n, err := strconv.Atoi(raw)
	if err != nil || n <= 0 {
		return 0, calc.Errorf(calc.NotFound, "%q is not a revision number", raw)
	}
	return n, nil
}

// handleRevisionShow serves GET /cases/{id}/revisions/{rev}: the case page
// of an old revision, read-only.
func (s *Server) handleRevisionShow(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	rev, err := revisionParam(chi.URLParam(r, "rev"))
	if err != nil {
		s.error(w, r, err)
		return
	}
	rec, err := s.Store.GetCase(r.Context(), id)
	if err != nil {
		s.error(w, r, err)
		return
	}
	old, err := s.Store.GetRevision(r.Context(), id, rev)
	if err != nil {
		s.error(w, r, err)
		return
	}
	current := rec.Revision
	rec.Revision, rec.Case, rec.Author, rec.UpdatedAt = old.Revision, old.Case, old.Author, old.CreatedAt
	v := s.caseView(r, rec)
	v.ReadOnly = true
	v.CurrentRevision = current
	v.Title = fmt.Sprintf("%s (revision %d)", old.Case.Name, old.Revision)
	s.render(w, r, http.StatusOK, v.Chrome, views.CasePage(v))
}

// handleRevisionDiff serves GET /cases/{id}/diff?a=1&b=2.
func (s *Server) handleRevisionDiff(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	q := r.URL.Query()
	a, errA := strconv.Atoi(q.Get("a"))
	b, errB := strconv.Atoi(q.Get("b"))
	if errA != nil || errB != nil {
		s.error(w, r, calc.Errorf(calc.Invalid, "Choose two revisions to compare (a and b)."))
		return
	}
	if a > b {
		a, b = b, a // older on the left
	}
	ra, err := s.Store.GetRevision(r.Context(), id, a)
	if err != nil {
		s.error(w, r, err)
		return
	}
	rb, err := s.Store.GetRevision(r.Context(), id, b)
	if err != nil {
		s.error(w, r, err)
		return
	}
	rows, err := store.CompareCases(ra.Case, rb.Case)
	if err != nil {
		s.error(w, r, err)
		return
	}
	v := views.DiffView{
		Chrome: views.Chrome{Title: fmt.Sprintf("%s: revisions %d and %d", rb.Name, a, b), Nav: "library", Display: display(r)},
		ID:     id, Name: rb.Name, A: revisionRow(ra, ""), B: revisionRow(rb, ""), OnlyChanged: q.Get("changed") == "1",
	}
	for _, f := range rows {
		v.Rows = append(v.Rows, views.DiffRow{Path: f.Path, A: f.Values[0], B: f.Values[1], Changed: f.Changed()})
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.DiffPage(v))
}

// handleRevisionRestore serves POST /cases/{id}/revisions/{rev}/restore:
// the old content becomes a new newest revision.
func (s *Server) handleRevisionRestore(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	rev, err := revisionParam(chi.URLParam(r, "rev"))
	if err != nil {
		s.error(w, r, err)
		return
	}
	base, _ := strconv.Atoi(r.PostFormValue("base"))
	rec, err := s.Store.RestoreRevision(r.Context(), id, rev, base, s.author(r))
	var ce *store.ConflictError
	if errors.As(err, &ce) {
		msg := ce.Error() + "; look at the history again before restoring."
		s.redirectWithFlash(w, r, fmt.Sprintf("/cases/%d/revisions", id), msg)
		return
	}
	if err != nil {
		s.error(w, r, err)
		return
	}
	flash := fmt.Sprintf("Revision %d restored as revision %d", rev, rec.Revision)
	if rec.Revision == base {
		flash = fmt.Sprintf("Revision %d has the same content as the newest; nothing to restore", rev)
	}
	s.redirectWithFlash(w, r, fmt.Sprintf("/cases/%d", id), flash)
}

// conflictView lays the user's unsaved case beside the stored newest one.
// base is the revision the user started from; its content tells which side
// changed each field.
func (s *Server) conflictView(r *http.Request, id int64, base int, mine calc.Case, cur store.CaseRecord) (views.ConflictView, error) {
	mine.Normalize()
	mineJSON, err := mine.Encode()
	if err != nil {
		return views.ConflictView{}, err
	}
	// When the base revision is unknown, every difference counts as the
	// user's change, so the user's values are preselected.
	orig := cur.Case
	if rv, err := s.Store.GetRevision(r.Context(), id, base); err == nil {
		orig = rv.Case
	}
	rows, err := store.CompareCases(orig, mine, cur.Case)
	if err != nil {
		return views.ConflictView{}, err
	}
	v := views.ConflictView{
		Chrome: views.Chrome{Title: "Conflict: " + cur.Case.Name, Nav: "library", Display: display(r)},
		ID:     id, Name: cur.Case.Name, BaseRevision: base, Current: cur.Revision,
		CurrentAuthor: cur.Author, CurrentTime: cur.UpdatedAt, MineJSON: compactJSON(mineJSON),
	}
	for _, f := range rows {
		v.Rows = append(v.Rows, views.ConflictRow{Path: f.Path, Mine: f.Values[1], Theirs: f.Values[2],
			Differs: f.Differs(1, 2), MineChanged: f.Differs(0, 1), TheirsChanged: f.Differs(0, 2)})
	}
	return v, nil
}

// renderConflict answers a save that met a newer revision with 409 and the
// conflict page; nothing has been written.
func (s *Server) renderConflict(w http.ResponseWriter, r *http.Request, id int64, base int, mine calc.Case, ce *store.ConflictError, note string) {
	v, err := s.conflictView(r, id, base, mine, ce.Current)
	if err != nil {
		s.error(w, r, err)
		return
	}
	v.Note = note
	s.render(w, r, http.StatusConflict, v.Chrome, views.ConflictPage(v))
}

// handleCaseMerge serves POST /cases/{id}/merge: the conflict page's
// answer. action=merge takes the per-field choices, action=reapply puts the
// user's changes on top of the stored revision, action=copy saves the
// user's version as a new case.
func (s *Server) handleCaseMerge(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	if err := r.ParseForm(); err != nil {
		s.error(w, r, err)
		return
	}
	mine, err := calc.DecodeOne([]byte(r.PostForm.Get("mine")))
	if err != nil {
		s.error(w, r, err)
		return
	}
	base, _ := strconv.Atoi(r.PostForm.Get("base"))
	current, _ := strconv.Atoi(r.PostForm.Get("current"))
	theirs, err := s.Store.GetRevision(r.Context(), id, current)
	if err != nil {
		s.error(w, r, err)
		return
	}
	var merged calc.Case
	var note string
	switch r.PostForm.Get("action") {
	case "copy":
		if err := calc.Validate(mine); err != nil {
			s.mergeFormError(w, r, id, current, mine, err)
			return
		}
		rec, err := s.Store.CreateCase(r.Context(), mine, s.author(r))
		if err != nil {
			s.error(w, r, err)
			return
		}
		s.redirectWithFlash(w, r, fmt.Sprintf("/cases/%d", rec.ID), "Your version is saved as a new case")
		return
	case "reapply":
		orig, err := s.Store.GetRevision(r.Context(), id, base)
		if err != nil {
			s.error(w, r, err)
			return
		}
		var both []string
		merged, both, err = store.ReapplyChanges(orig.Case, mine, theirs.Case)
		if err != nil {
			s.error(w, r, err)
			return
		}
		if len(both) > 0 {
			note = "Both of you changed " + strings.Join(both, ", ") + "; your values were kept there."
		}
	case "merge":
		var takeMine []string
		for k, vals := range r.PostForm {
			if path, ok := strings.CutPrefix(k, "pick."); ok && len(vals) > 0 && vals[0] == "mine" {
				takeMine = append(takeMine, path)
			}
		}
		merged, err = store.MergeCases(theirs.Case, mine, takeMine)
		if err != nil {
			s.error(w, r, err)
			return
		}
	default:
		s.error(w, r, calc.Errorf(calc.Invalid, "Choose how to settle the conflict."))
		return
	}
	if err := calc.Validate(merged); err != nil {
		s.mergeFormError(w, r, id, current, merged, err)
		return
	}
	rec, err := s.Store.UpdateCase(r.Context(), id, current, merged, s.author(r))
	var ce *store.ConflictError
	if errors.As(err, &ce) {
		// Someone saved yet again: show the new state, still based on the
		// revision the user first opened.
		s.renderConflict(w, r, id, base, mine, ce, "Another revision was saved while you merged; here is the newest.")
		return
	}
	if err != nil {
		s.error(w, r, err)
		return
	}
	flash := fmt.Sprintf("Merged and saved as revision %d", rec.Revision)
	if note != "" {
		flash += ". " + note
	}
	s.redirectWithFlash(w, r, fmt.Sprintf("/cases/%d", id), flash)
}

// mergeFormError shows a merged case that does not validate in the edit
// form, based on the stored revision, so the user can fix it and save.
func (s *Server) mergeFormError(w http.ResponseWriter, r *http.Request, id int64, current int, c calc.Case, err error) {
	fes := calc.FieldErrors(err)
	if fes == nil {
		s.error(w, r, err)
		return
	}
	vals, us := fillForm(c, display(r))
	f := s.formView(r, "Edit "+c.Name, fmt.Sprintf("/cases/%d", id), id, current, vals, us, fes, c.Distribution.Model)
	f.General = "The merged case needs a fix before it can be saved. " + f.General
	s.render(w, r, http.StatusUnprocessableEntity, f.Chrome, views.CaseFormPage(f))
}

func compactJSON(data []byte) string {
	var b bytes.Buffer
	if err := json.Compact(&b, data); err != nil {
		return string(data)
	}
	return b.String()
}
