package server

import (
	"bytes"
	"mime/multipart"
	"net/http"
	"net/url"
	"os"
	"strconv"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"
	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/sizedist"
	"fogbench/store"
)

// postImport posts the case form as multipart with an optional file, the
// way the form's import buttons do.
func postImport(t *testing.T, c *http.Client, base string, v url.Values, fileName string, file []byte) (*goquery.Document, int) {
	t.Helper()
	var body bytes.Buffer
	mw := multipart.NewWriter(&body)
	for k, vs := range v {
		for _, x := range vs {
			mw.WriteField(k, x)
		}
	}
	if fileName != "" {
		fw, err := mw.CreateFormFile("import_file", fileName)
		if err != nil {
			t.Fatal(err)
		}
		fw.Write(file)
	}
	mw.Close()
	resp, err := c.Post(base+"/cases/import-preview", mw.FormDataContentType(), &body)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	doc, err := goquery.NewDocumentFromReader(resp.Body)
	if err != nil {
		t.Fatal(err)
	}
	return doc, resp.StatusCode
}

func readTestdata(t *testing.T, name string) []byte {
	t.Helper()
	data, err := os.ReadFile("../testdata/sizedist/" + name)
	if err != nil {
		t.Fatal(err)
	}
	return data
}

// hiddenValues collects the hidden import fields of a page, as the browser
// would send them back.
func hiddenValues(doc *goquery.Document) url.Values {
	v := url.Values{}
	doc.Find(`#import input[type=hidden]`).Each(func(_ int, s *goquery.Selection) {
		v.Set(s.AttrOr("name", ""), s.AttrOr("value", ""))
	})
	return v
}

func TestImportPreviewShowsWhatWasDetected(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	form := validForm()
	form.Set("notes", "typed before the import")
	form.Set("import_step", "preview")
	doc, code := postImport(t, c, ts.URL, form, "rig.csv", readTestdata(t, "bins_volume_semicolon.csv"))
	if code != http.StatusOK {
		t.Fatalf("status %d: %s", code, doc.Find(`[data-testid=error-import-file]`).Text())
	}
	for id, want := range map[string]string{
		"detected-shape": "classes with a share each", "detected-separator": "semicolon",
		"detected-decimal": "comma", "detected-unit": "µm", "detected-basis": "volume", "detected-classes": "10",
	} {
		if got := strings.TrimSpace(doc.Find(`[data-testid=` + id + `]`).Text()); got != want {
			t.Errorf("%s = %q, want %q", id, got, want)
		}
	}
	if n := doc.Find(`[data-testid=import-classes] tbody tr`).Length(); n != 10 {
		t.Errorf("class table has %d rows, want 10", n)
	}
	if doc.Find(`[data-testid=import-preview] tbody tr`).Length() == 0 {
		t.Error("no preview of the file's lines")
	}
	if !strings.Contains(doc.Find(`[data-testid=import-warnings]`).Text(), "normalised") {
		t.Error("the 99.9 % sum was normalised without a visible note")
	}
	// Nothing applied yet: the model and the typed values are as they were.
	if got := doc.Find(`#f-model option[selected]`).AttrOr("value", ""); got != "rosin-rammler" {
		t.Errorf("model changed to %q before apply", got)
	}
	if got := doc.Find(`#f-notes`).Text(); got != "typed before the import" {
		t.Errorf("notes = %q", got)
	}
	if got := doc.Find(`#f-name`).AttrOr("value", ""); got != "Test nozzle" {
		t.Errorf("name = %q", got)
	}
	if hiddenValues(doc).Get("import_edges") == "" {
		t.Error("the classes are not carried for apply")
	}
}

func TestImportApplyPutsClassesIntoTheForm(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	form := validForm()
	form.Set("import_step", "preview")
	doc, _ := postImport(t, c, ts.URL, form, "rig.tsv", readTestdata(t, "bins_number_edges.tsv"))
	carry := hiddenValues(doc)
	if carry.Get("import_basis") != "number" {
		t.Fatalf("basis carried %q, want number", carry.Get("import_basis"))
	}
	for k, v := range carry {
		form[k] = v
	}
	form.Set("import_step", "apply")
	doc, code := postImport(t, c, ts.URL, form, "", nil)
	if code != http.StatusOK {
		t.Fatalf("apply: status %d", code)
	}
	if got := doc.Find(`#f-model option[selected]`).AttrOr("value", ""); got != "bins" {
		t.Fatalf("model after apply %q", got)
	}
	if got := doc.Find(`select[name=bins_basis] option[selected]`).AttrOr("value", ""); got != "number" {
		t.Errorf("basis after apply %q", got)
	}
	edges := strings.Fields(doc.Find(`#f-edges`).Text())
	if len(edges) != 6 || edges[0] != "2" {
		t.Errorf("edges after apply %q", edges)
	}
	if got := doc.Find(`select[name=edges_unit] option[selected]`).AttrOr("value", ""); got != "µm" {
		t.Errorf("edge unit %q", got)
	}
	// The typed values outside the distribution are kept.
	if got := doc.Find(`#f-pressure`).AttrOr("value", ""); got != "101.325" {
		t.Errorf("pressure = %q", got)
	}
	if !strings.Contains(doc.Find(`[data-testid=import-applied]`).Text(), "5 classes") {
		t.Errorf("apply note %q", doc.Find(`[data-testid=import-applied]`).Text())
	}
	// The applied form saves as a bins case.
	save := url.Values{}
	for k, v := range form {
		if !strings.HasPrefix(k, "import_") {
			save[k] = v
		}
	}
	save.Set("model", "bins")
	save.Set("edges", doc.Find(`#f-edges`).Text())
	save.Set("edges_unit", "µm")
	save.Set("fractions", doc.Find(`#f-fractions`).Text())
	save.Set("bins_basis", "number")
	resp := postForm(t, c, ts.URL+"/cases", save)
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther {
		t.Fatalf("saving the applied classes: status %d", resp.StatusCode)
	}
}

// Every bad file gets its own message beside the file field, the typed
// values stay, and no classes are carried.
func TestImportRefusesBadFiles(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	cases := []struct {
		name, file, want string
	}{
		{"empty", "", "empty"},
		{"single bin", "Lower (µm),Upper (µm),Volume (%)\n10,20,100\n", "class"},
		{"non-monotonic edges", "Lower (µm),Upper (µm),Volume (%)\n10,20,40\n20,15,30\n15,40,30\n", "not above"},
		{"negative fraction", "Lower (µm),Upper (µm),Volume (%)\n10,20,-5\n20,30,60\n30,40,45\n", "negative"},
		{"non-numeric fraction", "Lower (µm),Upper (µm),Volume (%)\n10,20,abc\n20,30,60\n30,40,40\n", "line"},
		{"sum far off", "Lower (µm),Upper (µm),Volume (%)\n10,20,30\n20,30,30\n30,40,30\n", "sum"},
		{"unknown unit", "Lower (furlong),Upper (furlong),Volume (%)\n10,20,50\n20,30,50\n", "unit"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			form := validForm()
			form.Set("import_step", "preview")
			doc, code := postImport(t, c, ts.URL, form, "bad.csv", []byte(tc.file))
			if code != http.StatusUnprocessableEntity {
				t.Fatalf("status %d, want 422", code)
			}
			msg := doc.Find(`[data-testid=error-import-file]`).Text()
			if !strings.Contains(strings.ToLower(msg), tc.want) {
				t.Errorf("message %q does not mention %q", msg, tc.want)
			}
			if hiddenValues(doc).Get("import_edges") != "" {
				t.Error("a refused file left classes to apply")
			}
			if got := doc.Find(`#f-name`).AttrOr("value", ""); got != "Test nozzle" {
				t.Errorf("name lost: %q", got)
			}
		})
	}
	t.Run("no file", func(t *testing.T) {
		form := validForm()
		form.Set("import_step", "preview")
		doc, code := postImport(t, c, ts.URL, form, "", nil)
		if code != http.StatusUnprocessableEntity || !strings.Contains(doc.Find(`[data-testid=error-import-file]`).Text(), "Choose") {
			t.Errorf("status %d, message %q", code, doc.Find(`[data-testid=error-import-file]`).Text())
		}
	})
	t.Run("over the limit", func(t *testing.T) {
		form := validForm()
		form.Set("import_step", "preview")
		big := bytes.Repeat([]byte("12.5\n"), (MaxBodyBytes/5)+1000)
		doc, code := postImport(t, c, ts.URL, form, "big.csv", big)
		if code != http.StatusUnprocessableEntity {
			t.Fatalf("status %d, want 422", code)
		}
		if msg := doc.Find(`[data-testid=error-import-file]`).Text(); !strings.Contains(msg, "8 MiB") {
			t.Errorf("message %q", msg)
		}
		if got := doc.Find(`#f-name`).AttrOr("value", ""); got != "Test nozzle" {
			t.Errorf("values typed before the file are lost: name %q", got)
		}
	})
}

func TestImportFitAndUseFit(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	data := readTestdata(t, "cumulative_mm.csv")
	form := validForm()
	form.Set("import_step", "preview")
	doc, _ := postImport(t, c, ts.URL, form, "cum.csv", data)
	for k, v := range hiddenValues(doc) {
		form[k] = v
	}
	form.Set("import_step", "fit")
	doc, code := postImport(t, c, ts.URL, form, "", nil)
	if code != http.StatusOK {
		t.Fatalf("fit: status %d %s", code, doc.Find(`[data-testid=fit-error]`).Text())
	}
	if n := doc.Find(`[data-testid=fit-table] tbody tr`).Length(); n != len(sizedist.Families) {
		t.Fatalf("fit table has %d rows", n)
	}
	if doc.Find(`[data-testid=fit-table] tr.best`).Length() != 1 {
		t.Error("no single best fit marked")
	}
	// The R² shown is the one calc/sizedist computes for the same classes.
	imp, err := sizedist.ImportCSV(bytes.NewReader(data), importMaxBytes)
	if err != nil {
		t.Fatal(err)
	}
	want, err := sizedist.Fit(imp.Binned, "rosin-rammler")
	if err != nil {
		t.Fatal(err)
	}
	if got := doc.Find(`[data-testid=fit-r2-rosin-rammler]`).Text(); got != r2Text(want.R2) {
		t.Errorf("R² shown %q, calc says %s", got, r2Text(want.R2))
	}

	form.Set("import_step", "use:rosin-rammler")
	doc, code = postImport(t, c, ts.URL, form, "", nil)
	if code != http.StatusOK {
		t.Fatalf("use fit: status %d", code)
	}
	if got := doc.Find(`#f-model option[selected]`).AttrOr("value", ""); got != "rosin-rammler" {
		t.Fatalf("model %q", got)
	}
	x, err := strconv.ParseFloat(doc.Find(`#f-x`).AttrOr("value", ""), 64)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(x, want.Params["x_m"]*1e6, 0, 1e-5) {
		t.Errorf("X in the form %v µm, fit %v µm", x, want.Params["x_m"]*1e6)
	}
	if got := doc.Find(`#f-d_min`).AttrOr("value", ""); got != "10" {
		t.Errorf("d_min set to %q, want the measured 10 µm", got)
	}

	// Fitting typed classes works without a file.
	typed := validForm()
	typed.Set("model", "bins")
	typed.Set("edges", "5 10 20 40 80")
	typed.Set("edges_unit", "µm")
	typed.Set("fractions", "10 30 40 20")
	typed.Set("bins_basis", "volume")
	typed.Set("import_step", "fit")
	doc, code = postImport(t, c, ts.URL, typed, "", nil)
	if code != http.StatusOK || doc.Find(`[data-testid=fit-table] tbody tr`).Length() != len(sizedist.Families) {
		t.Errorf("typed classes: status %d, %s", code, doc.Find(`[data-testid=fit-error]`).Text())
	}
}

func TestMeasuredCasePlotsCarryAFit(t *testing.T) {
	ts, st := newTestServer(t)
	rows, _, err := st.ListCases(t.Context(), store.ListOptions{Limit: 50})
	if err != nil {
		t.Fatal(err)
	}
	var id int64
	for _, r := range rows {
		if r.Model == "bins" {
			id = r.ID
		}
	}
	if id == 0 {
		t.Skip("no demo case with measured classes")
	}
	doc, code := getDoc(t, client(t), ts.URL+"/cases/"+strconv.FormatInt(id, 10))
	if code != http.StatusOK {
		t.Fatalf("status %d", code)
	}
	dens := doc.Find(`[data-testid=plot-dist-density]`)
	if dens.Find("svg").Length() != 1 {
		t.Fatal("no density plot")
	}
	if !strings.Contains(dens.Find("svg").Text(), "fit") || !strings.Contains(dens.Find("figcaption").Text(), "R²") {
		t.Error("the measured case's plot has no fitted curve")
	}
	if doc.Find(`[data-testid=plot-dist-cumulative] svg`).Length() != 1 {
		t.Error("no cumulative plot")
	}
}
