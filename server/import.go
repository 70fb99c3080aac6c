package server

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"net/http"
	"net/url"
	"strconv"
	"strings"

	"fogbench/calc"
	"fogbench/calc/sizedist"
	"fogbench/calc/valid"
	"fogbench/views"
)

// importMaxBytes bounds a measured size table. The request as a whole is
// capped at MaxBodyBytes as well, so a file near the limit together with the
// rest of the form is refused by whichever limit it meets first; both give
// the same message beside the file field.
const importMaxBytes = 8 << 20

// maxFieldBytes bounds one text field of the multipart form.
const maxFieldBytes = 1 << 20

const tooLargeMessage = "The file is larger than the limit of 8 MiB. Nothing was imported; split the file or bin the drops first."

// importRequest is the case form posted with its import step: every typed
// value, and the file when one was chosen.
type importRequest struct {
	values   url.Values
	fileName string
	file     []byte
	hasFile  bool
	fileErr  string // the upload itself was refused (too large)
}

// readImportRequest reads the multipart case form part by part, so that an
// oversized file still leaves the values typed before it.
func readImportRequest(r *http.Request) (importRequest, error) {
	req := importRequest{values: url.Values{}}
	mr, err := r.MultipartReader()
	if errors.Is(err, http.ErrNotMultipart) {
		if err := r.ParseForm(); err != nil {
			return req, err
		}
		req.values = r.PostForm
		return req, nil
	}
	if err != nil {
		return req, calc.Errorf(calc.Invalid, "The form could not be read: %v.", err)
	}
	for {
		part, err := mr.NextPart()
		if err == io.EOF {
			break
		}
		if err != nil {
			if isTooLarge(err) {
				req.fileErr = tooLargeMessage
				break
			}
			return req, calc.Errorf(calc.Invalid, "The form could not be read: %v.", err)
		}
		name := part.FormName()
		if name == "import_file" {
			data, err := io.ReadAll(io.LimitReader(part, importMaxBytes+1))
			if isTooLarge(err) || len(data) > importMaxBytes {
				req.fileErr = tooLargeMessage
				break
			}
			if err != nil {
				return req, calc.Errorf(calc.Invalid, "The file could not be read: %v.", err)
			}
			if part.FileName() != "" || len(data) > 0 {
				req.fileName, req.file, req.hasFile = part.FileName(), data, true
			}
			continue
		}
		data, err := io.ReadAll(io.LimitReader(part, maxFieldBytes+1))
		if isTooLarge(err) {
			req.fileErr = tooLargeMessage
			break
		}
		if err != nil {
			return req, calc.Errorf(calc.Invalid, "The form could not be read: %v.", err)
		}
		if len(data) > maxFieldBytes {
			return req, calc.Errorf(calc.Invalid, "The field %q is longer than 1 MiB.", name)
		}
		req.values.Add(name, string(data))
	}
	return req, nil
}

// handleCaseImport serves POST /cases/import-preview: the case form posted
// with one import step. "preview" reads the file and shows what was
// detected; "apply" puts the classes read into the form's bins fields;
// "fit" fits the four model families to them (or to the typed classes);
// "use:<family>" puts that fit's model and parameters into the form. Every
// other typed value comes back as it was, and nothing is stored.
func (s *Server) handleCaseImport(w http.ResponseWriter, r *http.Request) {
	req, err := readImportRequest(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	_, cf := parseCaseForm(req.values)
	vals, us := cf.Values, cf.Units
	id, _ := strconv.ParseInt(req.values.Get("case_id"), 10, 64)
	rev, _ := strconv.Atoi(req.values.Get("revision"))
	title, action := "New case", "/cases"
	if id > 0 {
		title, action = "Edit "+vals["name"], fmt.Sprintf("/cases/%d", id)
	}
	carry := views.ImportCarry{
		Name: req.values.Get("import_name"), Edges: req.values.Get("import_edges"),
		Fractions: req.values.Get("import_fractions"), Basis: req.values.Get("import_basis"),
	}
	var iv views.ImportView
	status := http.StatusOK
	step := req.values.Get("import_step")
	switch {
	case req.fileErr != "":
		iv.Error, status = req.fileErr, http.StatusUnprocessableEntity
	case step == "" || step == "preview":
		if !req.hasFile {
			iv.Error, status = "Choose a CSV file first.", http.StatusUnprocessableEntity
			break
		}
		imp, err := sizedist.ImportCSV(bytes.NewReader(req.file), importMaxBytes)
		if err != nil {
			iv.Error, status = importMessage(err), http.StatusUnprocessableEntity
			break
		}
		iv = importView(req.fileName, imp)
	case step == "apply":
		b, err := carriedBins(carry)
		if err != nil {
			iv.Error, status = calc.ErrorMessage(err), http.StatusUnprocessableEntity
			break
		}
		vals["model"], vals["bins_basis"] = "bins", carry.Basis
		vals["edges"], us["edges"] = strings.Join(strings.Fields(carry.Edges), "\n"), "µm"
		vals["fractions"] = strings.Join(strings.Fields(carry.Fractions), "\n")
		iv.Carry = carry
		iv.Applied = fmt.Sprintf("%d classes from %s are now the case's drop sizes (measured classes, %s basis).",
			b.Len(), nameOr(carry.Name, "the file"), carry.Basis)
	case step == "fit":
		iv.Carry = carry
		b, err := fitSource(carry, vals, us)
		if err != nil {
			iv.FitError, status = calc.ErrorMessage(err), http.StatusUnprocessableEntity
			break
		}
		iv.Fits = fitRows(b)
	case strings.HasPrefix(step, "use:"):
		iv.Carry = carry
		family := strings.TrimPrefix(step, "use:")
		b, err := fitSource(carry, vals, us)
		if err != nil {
			iv.FitError, status = calc.ErrorMessage(err), http.StatusUnprocessableEntity
			break
		}
		fit, err := sizedist.Fit(b, family)
		if err != nil {
			iv.FitError, status = calc.ErrorMessage(err), http.StatusUnprocessableEntity
			break
		}
		useFit(vals, us, fit, b)
		iv.Applied = fmt.Sprintf("The %s fit (R² = %s) is now the case's drop sizes; the smallest and largest diameters were set to the measured range %s–%s µm.",
			views.ModelLabel(family), r2Text(fit.R2), views.Micro(b.Edges[0]), views.Micro(b.Edges[b.Len()]))
	default:
		s.error(w, r, calc.Errorf(calc.Invalid, "Unknown import step %q.", step))
		return
	}
	f := s.formView(r, title, action, id, rev, vals, us, nil, "")
	f.Import = iv
	s.render(w, r, status, f.Chrome, views.CaseFormPage(f))
}

// importMessage is the reader's message for a refused file: the calc side
// names the line, so it is shown as it is.
func importMessage(err error) string {
	var fe *valid.FieldError
	if errors.As(err, &fe) {
		msg := fe.Message
		if fe.Value != "" {
			msg += " (got " + fe.Value + ")"
		}
		return "The file was not imported: " + msg + "."
	}
	return "The file was not imported: " + err.Error() + "."
}

func nameOr(s, alt string) string {
	if s == "" {
		return alt
	}
	return s
}

var shapeText = map[sizedist.Shape]string{
	sizedist.ShapeBins:       "classes with a share each",
	sizedist.ShapeCumulative: "cumulative undersize curve",
	sizedist.ShapeRaw:        "single drop diameters",
}

var separatorText = map[string]string{",": "comma", ";": "semicolon", "\t": "tab", "": "none (one column)"}

// importView shows what ImportCSV found, and carries the classes in the
// basis the file gave (volume for cumulative tables and drop lists).
func importView(name string, imp *sizedist.Import) views.ImportView {
	b := imp.Binned
	decimal := "point"
	if imp.DecimalComma {
		decimal = "comma"
	}
	rows := strconv.Itoa(imp.Rows) + " data rows"
	if imp.Shape == sizedist.ShapeRaw {
		rows = strconv.Itoa(imp.RawCount) + " drops"
	}
	v := views.ImportView{
		FileName: name,
		Detected: []views.Figure{
			{Label: "Layout", Symbol: "shape", Value: nameOr(shapeText[imp.Shape], string(imp.Shape))},
			{Label: "Separator", Symbol: "separator", Value: nameOr(separatorText[imp.Separator], imp.Separator)},
			{Label: "Decimal mark", Symbol: "decimal", Value: decimal},
			{Label: "Diameter unit", Symbol: "unit", Value: imp.Unit},
			{Label: "Basis", Symbol: "basis", Value: string(imp.Basis)},
			{Label: "Read", Symbol: "rows", Value: rows},
			{Label: "Classes", Symbol: "classes", Value: strconv.Itoa(b.Len())},
		},
		Preview:          imp.Preview,
		PreviewHasHeader: len(imp.Header) > 0,
	}
	if imp.Raw != nil {
		v.Detected = append(v.Detected, views.Figure{Label: "D32 of the drops themselves", Symbol: "raw-d32", Value: views.Micro(imp.Raw.D32) + " µm"})
	}
	seen := map[string]bool{}
	for _, w := range append(append([]string(nil), imp.Warnings...), b.Warnings...) {
		if !seen[w] {
			seen[w] = true
			v.Warnings = append(v.Warnings, w)
		}
	}
	for i := range b.Len() {
		v.Classes = append(v.Classes, views.ClassRow{
			Range:  views.Micro(b.Edges[i]) + "–" + views.Micro(b.Edges[i+1]),
			Number: views.Percent(b.Number[i]), Volume: views.Percent(b.Volume[i]),
		})
	}
	basis, shares := "volume", b.Volume
	if imp.Basis == sizedist.BasisNumber {
		basis, shares = "number", b.Number
	}
	v.Carry = views.ImportCarry{Name: name, Edges: joinScaled(b.Edges, 1e6), Fractions: joinScaled(shares, 100), Basis: basis}
	return v
}

// joinScaled writes values×k with enough digits that reading them back
// gives the same classes.
func joinScaled(xs []float64, k float64) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = strconv.FormatFloat(x*k, 'g', 10, 64)
	}
	return strings.Join(parts, " ")
}

// carriedBins rebuilds the classes read from a file from the hidden fields.
func carriedBins(c views.ImportCarry) (*sizedist.Binned, error) {
	if c.Edges == "" || c.Fractions == "" {
		return nil, calc.Errorf(calc.Invalid, "Read a file first: there are no imported classes to apply.")
	}
	edges, err := parseList(c.Edges)
	if err != nil {
		return nil, calc.Errorf(calc.Invalid, "The imported class edges were damaged: %v. Read the file again.", err)
	}
	for i := range edges {
		edges[i] *= 1e-6
	}
	fr, err := parseList(c.Fractions)
	if err != nil {
		return nil, calc.Errorf(calc.Invalid, "The imported shares were damaged: %v. Read the file again.", err)
	}
	b, err := sizedist.FromFractions(edges, fr, sizedist.Basis(c.Basis))
	if err != nil {
		return nil, calc.Errorf(calc.Invalid, "The imported classes are not usable: %s.", calc.ErrorMessage(err))
	}
	return b, nil
}

// fitSource is the classes a fit works on: those read from a file, else the
// classes typed into the form.
func fitSource(c views.ImportCarry, vals, us map[string]string) (*sizedist.Binned, error) {
	if c.Edges != "" {
		return carriedBins(c)
	}
	if vals["model"] != "bins" {
		return nil, calc.Errorf(calc.Invalid, "There are no measured classes to fit: read a file, or choose measured classes and type them.")
	}
	// Only the classes are read; the name is set so its absence is not an
	// error here.
	typed, cf := parseCaseForm(url.Values{
		"model": {"bins"}, "name": {"fit"}, "edges": {vals["edges"]}, "edges_unit": {us["edges"]},
		"fractions": {vals["fractions"]}, "bins_basis": {vals["bins_basis"]},
	})
	if len(cf.Errors) > 0 {
		e := cf.Errors[0]
		return nil, calc.Errorf(calc.Invalid, "The typed classes cannot be fitted: %s: %s.", e.Field, e.Message)
	}
	d := typed.Distribution
	b, err := sizedist.FromFractions(d.EdgesM, d.Fraction, sizedist.Basis(d.Basis))
	if err != nil {
		return nil, calc.Errorf(calc.Invalid, "The typed classes cannot be fitted: %s.", calc.ErrorMessage(err))
	}
	return b, nil
}

// fitParam is one fitted parameter as the form and the table name it.
type fitParam struct {
	key, field, label string
	length            bool
}

// fitParams maps Fit's parameter names to the case form's fields.
var fitParams = map[string][]fitParam{
	"rosin-rammler":     {{"x_m", "x", "X", true}, {"q", "q", "q", false}},
	"log-normal":        {{"median_m", "median", "volume median", true}, {"gsd", "gsd", "σg", false}},
	"upper-limit":       {{"d_max_m", "d_upper", "largest drop", true}, {"dv50_m", "dv50", "Dv50", true}, {"delta", "delta", "δ", false}},
	"nukiyama-tanasawa": {{"scale_m", "scale", "scale b^(−1/q)", true}, {"p", "p", "p", false}, {"q", "q_nt", "q", false}},
}

// formParams are a fit's parameters under the form's names; the
// Nukiyama–Tanasawa b becomes the scale diameter the case file uses.
func formParams(fit sizedist.FitResult) map[string]float64 {
	p := map[string]float64{}
	for k, v := range fit.Params {
		p[k] = v
	}
	if fit.Family == "nukiyama-tanasawa" {
		p["scale_m"] = math.Pow(p["b"], -1/p["q"])
	}
	return p
}

// fitRows fits every family and marks the best R².
func fitRows(b *sizedist.Binned) []views.FitRow {
	rows := make([]views.FitRow, 0, len(sizedist.Families))
	best, bestR2 := -1, math.Inf(-1)
	for _, fam := range sizedist.Families {
		row := views.FitRow{Family: fam, Label: views.ModelLabel(fam)}
		fit, err := sizedist.Fit(b, fam)
		if err != nil {
			row.Failed = "No fit: " + calc.ErrorMessage(err)
			rows = append(rows, row)
			continue
		}
		p := formParams(fit)
		for _, fp := range fitParams[fam] {
			v := p[fp.key]
			f := views.Figure{Label: fp.label, Value: views.Num(v, 4)}
			if fp.length {
				f.Value, f.Unit = views.Micro(v), "µm"
			}
			row.Params = append(row.Params, f)
		}
		row.RMS = views.Num(fit.RMS*100, 3)
		row.R2 = r2Text(fit.R2)
		row.Warnings = fit.Warnings
		if fit.R2 > bestR2 {
			best, bestR2 = len(rows), fit.R2
		}
		rows = append(rows, row)
	}
	if best >= 0 {
		rows[best].Best = true
	}
	return rows
}

// useFit writes a fit into the form: the model, its parameters (lengths in
// µm) and the measured range as the range the model is cut over.
func useFit(vals, us map[string]string, fit sizedist.FitResult, b *sizedist.Binned) {
	show := func(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
	vals["model"] = fit.Family
	// The fit gives the model's own parameters; a D32 left on the form
	// would size the model instead of them.
	delete(vals, "d32")
	p := formParams(fit)
	for _, fp := range fitParams[fit.Family] {
		v := p[fp.key]
		if fp.length {
			vals[fp.field], us[fp.field] = show(v*1e6), "µm"
		} else {
			vals[fp.field] = show(v)
		}
	}
	if fit.Family == "log-normal" {
		vals["ln_basis"] = "volume" // Fit fits the volume median
	}
	vals["d_min"], us["d_min"] = show(b.Edges[0]*1e6), "µm"
	vals["d_max"], us["d_max"] = show(b.Edges[b.Len()]*1e6), "µm"
	vals["spacing"] = "log"
	if n, err := strconv.Atoi(strings.TrimSpace(vals["bins"])); err != nil || n < 2 || n > 2000 {
		vals["bins"] = "40"
	}
}
