package server

import (
	"errors"
	"net/http"

	"github.com/go-chi/chi/v5/middleware"

	"fogbench/calc"
	"fogbench/store"
	"fogbench/views"
)

// storageStatus is the status of a write the library's storage refused
// (store.StorageError): 507 Insufficient Storage when its disk is full, 503
// Service Unavailable when it is read-only. ok is false for other errors.
func storageStatus(err error) (status int, ok bool) {
	var se *store.StorageError
	if !errors.As(err, &se) {
		if calc.ErrorCode(err) == calc.Unavailable {
			return http.StatusServiceUnavailable, true
		}
		return 0, false
	}
	if se.Fault == store.StorageFull {
		return http.StatusInsufficientStorage, true
	}
	return http.StatusServiceUnavailable, true
}

// storageCode names the fault in API answers ("storage_full",
// "storage_read_only").
func storageCode(err error) string {
	var se *store.StorageError
	if errors.As(err, &se) && se.Fault == store.StorageFull {
		return "storage_full"
	}
	return "storage_read_only"
}

// logStorage records why a save was refused, beside what the user is told.
func (s *Server) logStorage(r *http.Request, err error) {
	s.Logger.Warn("save refused by the library's storage", "path", r.URL.Path,
		"request_id", middleware.GetReqID(r.Context()), "err", err)
}

// keptFormNote follows the storage message on a form that comes back.
const keptFormNote = " Everything you typed is kept below: save again once it is fixed."

// caseSaveFailed answers a case form whose save failed. When the storage
// refused it (disk full, read-only library) the form comes back with
// everything typed, the message and the 507 or 503 status; any other
// error goes to s.error.
func (s *Server) caseSaveFailed(w http.ResponseWriter, r *http.Request, err error, f views.FormView) {
	status, ok := storageStatus(err)
	if !ok {
		s.error(w, r, err)
		return
	}
	s.logStorage(r, err)
	f.General = calc.ErrorMessage(err) + keptFormNote
	s.render(w, r, status, f.Chrome, views.CaseFormPage(f))
}
