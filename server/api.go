package server

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net/http"
	"strconv"

	"github.com/go-chi/chi/v5/middleware"

	"fogbench/calc"
	"fogbench/calc/valid"
	"fogbench/store"
)

// handleAPIEvaluate serves POST /api/evaluate: a case file in, its result
// out (an array in, an array out). In an array a case that cannot be
// computed gets its error object (calc.CaseError) in its place and the
// answer is still 200, so one case never aborts the batch; with
// ?strict=1 the first failing case's error is the answer, as for a single
// case. A stop (time limit, client gone) ends the whole request.
func (s *Server) handleAPIEvaluate(w http.ResponseWriter, r *http.Request) {
	cases, isArray, err := decodeBody(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	if err := calc.CheckWork(cases); err != nil {
		s.apiError(w, r, err)
		return
	}
	strict := r.URL.Query().Get("strict") == "1" || r.URL.Query().Get("strict") == "true"
	results := make([]*calc.Result, len(cases))
	failures := make([]error, len(cases))
	for i, c := range cases {
		res, err := calc.EvaluateContext(r.Context(), c)
		if err != nil {
			if !isArray {
				s.apiError(w, r, err)
				return
			}
			// The list index names the case, as for a decoding error:
			// "[1].gas.pressure_pa" (calc.InBatch; eval does the same).
			err = calc.InBatch(i, err)
			if strict || calc.ErrorCode(err) == calc.Canceled {
				s.apiError(w, r, err)
				return
			}
			if calc.ErrorCode(err) == calc.Internal {
				s.Logger.Error("api evaluate: case failed", "path", r.URL.Path, "request_id", middleware.GetReqID(r.Context()), "err", err)
			}
			failures[i] = err
		}
		results[i] = res
	}
	// calc's encoder writes what encoding/json writes, without reflection,
	// into a pooled buffer: a fresh 50 KB one per request was a third of
	// the request's allocation (docs/performance.md).
	buf := pageBuffer()
	defer putPageBuffer(buf)
	data := buf.AvailableBuffer()
	switch {
	case !isArray:
		data, err = results[0].AppendJSON(data)
	case !hasError(failures):
		data, err = calc.AppendResultsJSON(data, results)
	default:
		data = append(data, '[')
		for i, res := range results {
			if i > 0 {
				data = append(data, ',')
			}
			if failures[i] != nil {
				var e []byte
				e, err = json.Marshal(calc.NewCaseError(failures[i]))
				data = append(data, e...)
			} else {
				data, err = res.AppendJSON(data)
			}
			if err != nil {
				break
			}
		}
		data = append(data, ']')
	}
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	data = append(data, '\n')
	buf.Write(data) // keeps the grown array for the next request
	w.Header().Set("Content-Type", "application/json")
	w.Header().Set("Content-Length", strconv.Itoa(len(data)))
	w.WriteHeader(http.StatusOK)
	w.Write(data)
}

func hasError(errs []error) bool {
	for _, err := range errs {
		if err != nil {
			return true
		}
	}
	return false
}

// decodeBody reads one case or an array of cases from a request body.
func decodeBody(r *http.Request) ([]calc.Case, bool, error) {
	data, err := io.ReadAll(r.Body)
	if err != nil {
		return nil, false, err
	}
	cases, err := calc.Decode(bytes.NewReader(data))
	if err != nil {
		return nil, false, err
	}
	return cases, calc.IsArray(data), nil
}

type caseJSON struct {
	ID        int64      `json:"id"`
	Revision  int        `json:"revision"`
	Name      string     `json:"name"`
	Fluid     string     `json:"fluid,omitempty"`
	Model     string     `json:"model,omitempty"`
	Tags      []string   `json:"tags"`
	UpdatedAt string     `json:"updated_at"`
	Case      *calc.Case `json:"case,omitempty"`
	Author    string     `json:"author,omitempty"`
	ParentID  int64      `json:"parent_id,omitempty"`
}

func recordJSON(rec store.CaseRecord) caseJSON {
	c := rec.Case
	return caseJSON{ID: rec.ID, Revision: rec.Revision, Name: c.Name, Fluid: c.Fluid, Model: c.Distribution.Model,
		Tags: nonNil(rec.Tags), UpdatedAt: rec.UpdatedAt.Format("2006-01-02T15:04:05Z07:00"), Case: &c,
		Author: rec.Author, ParentID: rec.ParentID}
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// handleAPICaseList serves GET /api/cases.
func (s *Server) handleAPICaseList(w http.ResponseWriter, r *http.Request) {
	q := r.URL.Query()
	limit, _ := strconv.Atoi(q.Get("limit"))
	offset, _ := strconv.Atoi(q.Get("offset"))
	rows, total, err := s.Store.ListCases(r.Context(), store.ListOptions{Query: q.Get("q"), Fluid: q.Get("fluid"),
		Tag: q.Get("tag"), Sort: q.Get("sort"), Limit: limit, Offset: offset})
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	out := make([]caseJSON, len(rows))
	for i, c := range rows {
		out[i] = caseJSON{ID: c.ID, Revision: c.Revision, Name: c.Name, Fluid: c.Fluid, Model: c.Model,
			Tags: nonNil(c.Tags), UpdatedAt: c.UpdatedAt.Format("2006-01-02T15:04:05Z07:00")}
	}
	writeJSON(w, http.StatusOK, map[string]any{"cases": out, "total": total})
}

// handleAPICaseGet serves GET /api/cases/{id}.
func (s *Server) handleAPICaseGet(w http.ResponseWriter, r *http.Request) {
	rec, err := s.storedCase(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	writeJSON(w, http.StatusOK, recordJSON(rec))
}

// handleAPICaseFile serves GET /api/cases/{id}/file: the case file alone,
// as a download.
func (s *Server) handleAPICaseFile(w http.ResponseWriter, r *http.Request) {
	rec, err := s.storedCase(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	data, err := rec.Case.Encode()
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	w.Header().Set("Content-Type", "application/json")
	w.Header().Set("Content-Disposition", fmt.Sprintf(`attachment; filename="case-%d-rev%d.json"`, rec.ID, rec.Revision))
	w.Write(append(data, '\n'))
}

// handleAPICaseCreate serves POST /api/cases: a case file in, 201 with its
// id and revision.
func (s *Server) handleAPICaseCreate(w http.ResponseWriter, r *http.Request) {
	cases, isArray, err := decodeBody(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	if isArray || len(cases) != 1 {
		s.apiError(w, r, &valid.FieldError{Field: "file", Message: "send one case, not an array"})
		return
	}
	if err := calc.Validate(cases[0]); err != nil {
		s.apiError(w, r, err)
		return
	}
	rec, err := s.Store.CreateCase(r.Context(), cases[0], s.author(r))
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	w.Header().Set("Location", fmt.Sprintf("/api/cases/%d", rec.ID))
	writeJSON(w, http.StatusCreated, recordJSON(rec))
}

// handleAPICaseUpdate serves PUT /api/cases/{id} with
// {"revision":N,"case":{…}}; 409 with both versions when N is not the newest.
func (s *Server) handleAPICaseUpdate(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	var body struct {
		Revision int             `json:"revision"`
		Case     json.RawMessage `json:"case"`
	}
	data, err := io.ReadAll(r.Body)
	if err != nil {
		s.apiError(w, r, err) // 413 with the limit, not a JSON complaint
		return
	}
	if err := valid.DecodeJSON(data, &body, "request"); err != nil {
		s.apiError(w, r, err)
		return
	}
	if body.Revision <= 0 {
		s.apiError(w, r, &valid.FieldError{Field: "revision", Message: "give the revision your change is based on"})
		return
	}
	if len(body.Case) == 0 || string(body.Case) == "null" {
		s.apiError(w, r, &valid.FieldError{Field: "case", Message: `give the case: {"revision":N,"case":{…}}`})
		return
	}
	c, err := calc.DecodeAt(body.Case, "case")
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	if err := calc.Validate(c); err != nil {
		s.apiError(w, r, valid.Within("case", err)) // the case's fields sit under "case"
		return
	}
	rec, err := s.Store.UpdateCase(r.Context(), id, body.Revision, c, s.author(r))
	var ce *store.ConflictError
	if errors.As(err, &ce) {
		writeJSON(w, http.StatusConflict, map[string]any{
			"error": ce.Error(), "yours": map[string]any{"revision": body.Revision, "case": c},
			"current": recordJSON(ce.Current),
		})
		return
	}
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	writeJSON(w, http.StatusOK, recordJSON(rec))
}

// handleAPIRevisions serves GET /api/cases/{id}/revisions.
func (s *Server) handleAPIRevisions(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	revs, err := s.Store.Revisions(r.Context(), id)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	out := make([]map[string]any, len(revs))
	for i, rv := range revs {
		out[i] = map[string]any{"revision": rv.Revision, "name": rv.Name, "author": rv.Author,
			"created_at": rv.CreatedAt.Format("2006-01-02T15:04:05Z07:00")}
	}
	writeJSON(w, http.StatusOK, map[string]any{"revisions": out})
}
