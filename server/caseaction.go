package server

import (
	"errors"
	"fmt"
	"net/http"
	"net/url"
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
	if strings.HasPrefix(b, "/cases") && !strings.HasPrefix(b, "//") && !strings.ContainsAny(b, "\\\r\n") {
		return b
	}
	return fmt.Sprintf("/cases/%d", id)
}

// withFlash adds a one-line notice to a local URL.
func withFlash(u, msg string) string {
	sep := "?"
	if strings.Contains(u, "?") {
		sep = "&"
	}
	return u + sep + "flash=" + url.QueryEscape(msg)
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
		http.Redirect(w, r, withFlash(backTo(r, id), ce.Error()+"; not renamed, look again"), http.StatusSeeOther)
		return
	}
	if err != nil {
		s.error(w, r, err)
		return
	}
	http.Redirect(w, r, withFlash(backTo(r, id), fmt.Sprintf("Case %d renamed to %q (revision %d)", id, rec.Case.Name, rec.Revision)), http.StatusSeeOther)
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
		s.error(w, r, err)
		return
	}
	if err := s.Store.SetTags(r.Context(), id, tags); err != nil {
		s.error(w, r, err)
		return
	}
	http.Redirect(w, r, withFlash(backTo(r, id), fmt.Sprintf("Case %d tagged: %s", id, strings.Join(tags, ", "))), http.StatusSeeOther)
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
	http.Redirect(w, r, withFlash(back, fmt.Sprintf("Case %d moved to the trash; restore it from the trash list", id)), http.StatusSeeOther)
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
	http.Redirect(w, r, withFlash(backTo(r, id), fmt.Sprintf("Case %d restored from the trash", id)), http.StatusSeeOther)
}

// familyOptions lists the atomizer families for the library filter.
func familyOptions() []views.Option {
	var out []views.Option
	for _, f := range atomize.Families() {
		out = append(out, views.Option{Value: f.ID, Label: f.Name})
	}
	return out
}
