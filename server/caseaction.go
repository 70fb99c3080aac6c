package server

import (
	"errors"
	"fmt"
	"net/http"
	"strconv"
	"strings"

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
	tags := store.NormalizeTags(strings.Split(r.PostFormValue("tags"), ","))
	if err := s.Store.SetTags(r.Context(), id, tags); err != nil {
		s.error(w, r, err)
		return
	}
	s.redirectWithFlash(w, r, backTo(r, id), fmt.Sprintf("Case %d tagged: %s", id, strings.Join(tags, ", ")))
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
