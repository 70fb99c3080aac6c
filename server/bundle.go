package server

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"net/http"
	"strconv"
	"strings"
	"time"

	"fogbench/calc"
	"fogbench/store"
	"fogbench/views"
)

// exportOptions reads ?tag= or ?ids= (one comma list or repeated, as the
// library's checkboxes send them).
func exportOptions(r *http.Request) (store.ExportOptions, error) {
	q := r.URL.Query()
	o := store.ExportOptions{Tag: strings.TrimSpace(q.Get("tag"))}
	for _, v := range q["ids"] {
		for _, part := range strings.Split(v, ",") {
			if part = strings.TrimSpace(part); part == "" {
				continue
			}
			id, err := strconv.ParseInt(part, 10, 64)
			if err != nil || id <= 0 {
				return o, calc.Errorf(calc.Invalid, "%q in ids is not a case number", part)
			}
			o.IDs = append(o.IDs, id)
		}
	}
	if len(o.IDs) == 0 && len(q["ids"]) > 0 {
		return o, calc.Errorf(calc.Invalid, "No case was ticked: tick the cases to export in the library.")
	}
	return o, nil
}

// handleAPIExport serves GET /api/export: a bundle of the library, of one
// tag (?tag=) or of chosen cases (?ids=), as a download.
func (s *Server) handleAPIExport(w http.ResponseWriter, r *http.Request) {
	o, err := exportOptions(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	b, err := s.Store.Export(r.Context(), o)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	data, err := b.Encode()
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	w.Header().Set("Content-Type", "application/json")
	w.Header().Set("Content-Disposition", fmt.Sprintf(`attachment; filename="%s"`, store.BundleFileName(b.Selection, s.Store.Now())))
	w.Write(data)
}

type importItemJSON struct {
	UID        string `json:"uid"`
	Name       string `json:"name"`
	ID         int64  `json:"id,omitempty"`
	ExistingID int64  `json:"existing_id,omitempty"`
	Action     string `json:"action,omitempty"`
}

func importItemsJSON(items []store.ImportItem) []importItemJSON {
	out := make([]importItemJSON, len(items))
	for i, it := range items {
		out[i] = importItemJSON{UID: it.UID, Name: it.Name, ID: it.ResultID, ExistingID: it.ExistingID}
	}
	return out
}

// handleAPIImport serves POST /api/import: a bundle in; every case added,
// replaced or kept in one transaction. Conflicts take ?on_conflict=
// keep-both (default) or replace; ?dry_run=1 answers the plan and writes
// nothing. A malformed or truncated bundle answers 400 and changes nothing.
func (s *Server) handleAPIImport(w http.ResponseWriter, r *http.Request) {
	ctx, cancel := bundleContext(w, r)
	defer cancel()
	b, err := store.DecodeBundle(r.Body)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	def := store.ImportChoice(r.URL.Query().Get("on_conflict"))
	if def != "" && def != store.ImportKeepBoth && def != store.ImportReplace {
		s.apiError(w, r, calc.Errorf(calc.Invalid, "on_conflict must be keep-both or replace, not %q", def))
		return
	}
	if r.URL.Query().Get("dry_run") == "1" {
		plan, err := s.Store.PlanImport(ctx, b)
		if err != nil {
			s.apiError(w, r, err)
			return
		}
		out := importItemsJSON(plan)
		for i, it := range plan {
			out[i].Action = string(it.Action)
		}
		writeJSON(w, http.StatusOK, map[string]any{"plan": out})
		return
	}
	res, err := s.Store.Import(ctx, b, nil, def, s.author(r))
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	writeJSON(w, http.StatusOK, map[string]any{
		"added": importItemsJSON(res.Added), "replaced": importItemsJSON(res.Replaced), "kept": importItemsJSON(res.Kept),
	})
}

// handleExportPage serves GET /bundle/export.
func (s *Server) handleExportPage(w http.ResponseWriter, r *http.Request) {
	n, err := s.Store.CountCases(r.Context())
	if err != nil {
		s.error(w, r, err)
		return
	}
	v := views.ExportView{Chrome: views.Chrome{Title: "Export cases", Nav: "sharing", Display: display(r)}, Total: n}
	if v.Tags, err = s.tagOptions(r); err != nil {
		s.error(w, r, err)
		return
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.ExportPage(v))
}

func (s *Server) tagOptions(r *http.Request) ([]views.Option, error) {
	tags, err := s.Store.Tags(r.Context())
	var out []views.Option
	for _, t := range tags {
		out = append(out, views.Option{Value: t.Tag, Label: fmt.Sprintf("%s (%d)", t.Tag, t.Cases)})
	}
	return out, err
}

func importChrome(r *http.Request) views.Chrome {
	return views.Chrome{Title: "Import cases", Nav: "sharing", Display: display(r)}
}

// handleImportPage serves GET /bundle/import.
func (s *Server) handleImportPage(w http.ResponseWriter, r *http.Request) {
	v := views.BundleImportView{Chrome: importChrome(r), MaxBytes: store.MaxBundleBytes}
	s.render(w, r, http.StatusOK, v.Chrome, views.BundleImportPage(v))
}

func itemView(it store.ImportItem) views.BundleItem {
	return views.BundleItem{UID: it.UID, Name: it.Name, Action: string(it.Action), ExistingID: it.ExistingID,
		ExistingName: it.ExistingName, ExistingRev: it.ExistingRevision, ResultID: it.ResultID}
}

// handleImportPreview serves POST /bundle/import: the uploaded bundle is
// checked and the page lists what importing it would add, replace or keep.
// Nothing is written.
func (s *Server) handleImportPreview(w http.ResponseWriter, r *http.Request) {
	ctx, cancel := bundleContext(w, r)
	defer cancel()
	v := views.BundleImportView{Chrome: importChrome(r), MaxBytes: store.MaxBundleBytes}
	// The file is decoded as it arrives (store.DecodeBundle reads a
	// stream), never buffered whole or spilled to a temporary file.
	var (
		b        store.Bundle
		filename string
		found    bool
		err      error
	)
	mr, merr := r.MultipartReader()
	for merr == nil {
		part, perr := mr.NextPart()
		if perr != nil {
			if perr != io.EOF {
				err = perr
			}
			break
		}
		if part.FormName() == "file" && part.FileName() != "" {
			found, filename = true, part.FileName()
			b, err = store.DecodeBundle(part)
			break
		}
	}
	if isTooLarge(err) || (err != nil && calc.ErrorCode(err) != calc.Invalid) {
		s.error(w, r, err)
		return
	}
	if !found && err == nil {
		v.Error = "Choose a bundle file to upload."
		s.render(w, r, http.StatusBadRequest, v.Chrome, views.BundleImportPage(v))
		return
	}
	if err != nil {
		v.Error = filename + " cannot be imported: " + err.Error()
		s.render(w, r, http.StatusBadRequest, v.Chrome, views.BundleImportPage(v))
		return
	}
	hdr := struct{ Filename string }{filename}
	plan, err := s.Store.PlanImport(ctx, b)
	if err != nil {
		s.error(w, r, err)
		return
	}
	store.SortItems(plan)
	for _, it := range plan {
		v.Items = append(v.Items, itemView(it))
	}
	v.FileName = hdr.Filename
	data, err := json.Marshal(b) // carried to the apply step in the form
	if err != nil {
		s.error(w, r, err)
		return
	}
	v.BundleJSON = string(data)
	if len(v.Items) == 0 {
		v.Error = hdr.Filename + " holds no cases."
		s.render(w, r, http.StatusOK, v.Chrome, views.BundleImportPage(v))
		return
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.BundleImportPage(v))
}

// handleImportApply serves POST /bundle/import/apply: the previewed bundle
// with the user's choices, applied in one transaction.
func (s *Server) handleImportApply(w http.ResponseWriter, r *http.Request) {
	ctx, cancel := bundleContext(w, r)
	defer cancel()
	v := views.BundleImportView{Chrome: importChrome(r), MaxBytes: store.MaxBundleBytes}
	b, choices, err := readApplyForm(r)
	if err != nil {
		if calc.ErrorCode(err) != calc.Invalid || isTooLarge(err) {
			s.error(w, r, err)
			return
		}
		v.Error = "The bundle cannot be imported: " + err.Error()
		s.render(w, r, http.StatusBadRequest, v.Chrome, views.BundleImportPage(v))
		return
	}
	res, err := s.Store.Import(ctx, b, choices, store.ImportKeepBoth, s.author(r))
	if err != nil {
		s.error(w, r, err)
		return
	}
	v.Done = true
	for _, it := range res.Added {
		v.Added = append(v.Added, itemView(it))
	}
	for _, it := range res.Replaced {
		v.Replaced = append(v.Replaced, itemView(it))
	}
	for _, it := range res.Kept {
		v.Kept = append(v.Kept, itemView(it))
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.BundleImportPage(v))
}

// readApplyForm reads the apply step's form: the bundle (decoded as it
// arrives when the form is multipart, as the page sends it) and the
// choice.UID conflict choices.
func readApplyForm(r *http.Request) (store.Bundle, map[string]store.ImportChoice, error) {
	choices := map[string]store.ImportChoice{}
	mr, err := r.MultipartReader()
	if err != nil { // a plain form: parsed whole, within the body limit
		b, err := store.DecodeBundle(strings.NewReader(r.PostFormValue("bundle")))
		for k, vals := range r.PostForm {
			if uid, ok := strings.CutPrefix(k, "choice."); ok && len(vals) > 0 {
				choices[uid] = store.ImportChoice(vals[0])
			}
		}
		return b, choices, err
	}
	var (
		b    store.Bundle
		seen bool
	)
	for {
		part, err := mr.NextPart()
		if err == io.EOF {
			break
		}
		if err != nil {
			return b, nil, err
		}
		name := part.FormName()
		uid, isChoice := strings.CutPrefix(name, "choice.")
		switch {
		case name == "bundle" && !seen:
			seen = true
			if b, err = store.DecodeBundle(part); err != nil {
				return b, nil, err
			}
		case isChoice:
			val, err := io.ReadAll(io.LimitReader(part, 64))
			if err != nil {
				return b, nil, err
			}
			choices[uid] = store.ImportChoice(val)
		}
	}
	if !seen {
		b, err := store.DecodeBundle(strings.NewReader(""))
		return b, nil, err
	}
	return b, choices, nil
}

// BundleDeadline bounds a bundle import. Reading, checking and writing a
// bundle near its limit takes minutes (a 29 MB bundle of 10,000 cases took
// 22 s on a loaded machine), past the 30 s handler deadline and the
// server's 60 s read and write timeouts that every other request keeps.
const BundleDeadline = 10 * time.Minute

// bundleContext extends the connection's read and write deadlines of a
// bundle import to BundleDeadline and returns the context the import runs
// under: BundleDeadline from now, no longer ended by the handler deadline
// (nor by the client leaving: the import is all or nothing either way).
func bundleContext(w http.ResponseWriter, r *http.Request) (context.Context, context.CancelFunc) {
	until := time.Now().Add(BundleDeadline)
	rc := http.NewResponseController(w)
	rc.SetReadDeadline(until) // not every writer supports deadlines (tests' recorders)
	rc.SetWriteDeadline(until)
	return context.WithDeadline(context.WithoutCancel(r.Context()), until)
}
