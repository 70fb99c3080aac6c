package server

import (
	"errors"
	"fmt"
	"net/http"
	"net/url"
	"slices"
	"strconv"
	"strings"

	"fogbench/calc"
	"fogbench/calc/atomize"
	"fogbench/store"
	"fogbench/views"
)

// backTo is where a library action returns: the list page it came from
// when that is a library URL, else the case.
func backTo(r *http.Request, id int64) string {
	b := r.PostFormValue("back")
	if strings.HasPrefix(b, "/cases") && safeNext(b) == b {
		return b
	}
	return fmt.Sprintf("/cases/%d", id)
}

// handleCaseRename serves POST /cases/{id}/rename: a new revision with the
// new name, refused when the case changed since the list was drawn.
func (s *Server) handleCaseRename(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	base, _ := strconv.Atoi(r.PostFormValue("revision"))
	rec, err := s.Store.RenameCase(r.Context(), id, base, r.PostFormValue("name"), s.author(r))
	var ce *store.ConflictError
	if errors.As(err, &ce) {
		s.redirectWithFlash(w, r, backTo(r, id), ce.Error()+"; not renamed, look again")
		return
	}
	if fes := calc.FieldErrors(err); len(fes) == 1 && fes[0].Field == "name" {
		s.refuseRowInput(w, r, id, "name", r.PostFormValue("name"), err)
		return
	}
	if err != nil {
		s.error(w, r, err)
		return
	}
	s.redirectWithFlash(w, r, backTo(r, id), fmt.Sprintf("Case %d renamed to %q (revision %d)", id, rec.Case.Name, rec.Revision))
}

// handleCaseTags serves POST /cases/{id}/tags with tags separated by commas.
func (s *Server) handleCaseTags(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	// Refused before the store is touched: too many tags, or one too long
	// or not plain text, is a 400 that says which (nothing is dropped).
	tags, err := store.CheckTags(strings.Split(r.PostFormValue("tags"), ","))
	if err != nil {
		s.refuseRowInput(w, r, id, "tags", r.PostFormValue("tags"), err)
		return
	}
	if err := s.Store.SetTags(r.Context(), id, tags); err != nil {
		s.error(w, r, err)
		return
	}
	s.redirectWithFlash(w, r, backTo(r, id), fmt.Sprintf("Case %d tagged: %s", id, strings.Join(tags, ", ")))
}

// refuseRowInput answers a refused rename or tags of a library row with
// 400 and the library page it came from, that row's actions open with what
// was typed and the message beside the field; nothing was saved.
func (s *Server) refuseRowInput(w http.ResponseWriter, r *http.Request, id int64, field, typed string, err error) {
	var q url.Values
	if u, perr := url.Parse(backTo(r, id)); perr == nil && u.Path == "/cases" {
		q = u.Query()
	}
	v, verr := s.libraryView(r, q)
	if verr != nil {
		s.error(w, r, verr)
		return
	}
	if !slices.ContainsFunc(v.Rows, func(row views.CaseRow) bool { return row.ID == id }) {
		s.error(w, r, err) // not on that page: the message alone
		return
	}
	msg := calc.ErrorMessage(err)
	if fes := calc.FieldErrors(err); len(fes) > 0 {
		msg = fes[0].Message
		if fes[0].Value != "" {
			msg += " (got " + fes[0].Value + ")"
		}
	}
	v.Refused = &views.RowInput{ID: id, Field: field, Value: typed, Message: msg + "; nothing was saved."}
	s.render(w, r, http.StatusBadRequest, v.Chrome, views.LibraryPage(v))
}

// handleCaseTrash serves POST /cases/{id}/trash.
func (s *Server) handleCaseTrash(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	if err := s.Store.TrashCase(r.Context(), id); err != nil {
		s.error(w, r, err)
		return
	}
	back := backTo(r, id)
	if back == fmt.Sprintf("/cases/%d", id) {
		back = "/cases"
	}
	s.redirectWithFlash(w, r, back, fmt.Sprintf("Case %d moved to the trash; restore it from the trash list", id))
}

// handleCaseRestore serves POST /cases/{id}/restore: out of the trash.
func (s *Server) handleCaseRestore(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	if err := s.Store.RestoreCase(r.Context(), id); err != nil {
		s.error(w, r, err)
		return
	}
	s.redirectWithFlash(w, r, backTo(r, id), fmt.Sprintf("Case %d restored from the trash", id))
}

// familyOptions lists the atomizer families for the library filter.
func familyOptions() []views.Option {
	var out []views.Option
	for _, f := range atomize.Families() {
		out = append(out, views.Option{Value: f.ID, Label: f.Name})
	}
	return out
}
