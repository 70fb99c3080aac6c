package server

// Journeys in a real browser: Debian's chromium, headless, driven by
// chromedp against the real server on a loopback port with a fresh
// database. Without chromium the tests skip (locally) or fail (CI=true).
// Screenshots of every step go to $FOGBENCH_E2E_SHOTS, or to a temporary
// folder that is named in the log.

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"

	"fogbench/calc"
	"fogbench/calc/sizedist"
	"fogbench/calc/units"
	"fogbench/store"
	"fogbench/views"
)

// e2eBrowser is where CI installs chromium; FOGBENCH_CHROMIUM overrides it.
func e2eBrowser() string {
	if p := os.Getenv("FOGBENCH_CHROMIUM"); p != "" {
		return p
	}
	return "/usr/bin/chromium"
}

// e2e holds one browser tab on one server for a journey.
type e2e struct {
	t     *testing.T
	ctx   context.Context
	st    *store.Store // the server's library, for cases a journey starts from
	base  string
	shots string
	n     int
}

func newE2E(t *testing.T) *e2e {
	t.Helper()
	if testing.Short() {
		t.Skip("browser journeys skipped with -short")
	}
	path := e2eBrowser()
	if _, err := os.Stat(path); err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("CI=true but no browser at %s (apt-get install chromium): %v", path, err)
		}
		t.Skipf("browser tests skipped: no chromium at %s (install Debian's chromium or set FOGBENCH_CHROMIUM)", path)
	}

	ctx := context.Background()
	st := openTestStore(t)
	if _, err := st.SeedDemo(ctx); err != nil {
		t.Fatal(err)
	}
	ts := httptest.NewServer(New(st, slog.New(slog.NewTextHandler(io.Discard, nil))).Handler())
	t.Cleanup(ts.Close)

	opts := append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(path),
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.UserDataDir(t.TempDir()),
		chromedp.WindowSize(1400, 1000),
	)
	allocCtx, cancelAlloc := chromedp.NewExecAllocator(ctx, opts...)
	t.Cleanup(cancelAlloc)
	tab, cancelTab := chromedp.NewContext(allocCtx)
	t.Cleanup(cancelTab)
	// The first run starts the browser; it gets no timeout of its own, since
	// cancelling it would take the browser down.
	if err := chromedp.Do(tab, chromedp.EmulateViewport(1400, 1000)); err != nil {
		t.Fatalf("start chromium: %v", err)
	}

	shots := os.Getenv("FOGBENCH_E2E_SHOTS")
	if shots == "" {
		shots = t.TempDir()
	}
	shots = filepath.Join(shots, t.Name())
	if err := os.MkdirAll(shots, 0o755); err != nil {
		t.Fatal(err)
	}
	t.Logf("screenshots in %s", shots)
	return &e2e{t: t, ctx: tab, st: st, base: ts.URL, shots: shots}
}

// do runs steps with a time limit, failing the test with what was being done.
func (e *e2e) do(what string, steps ...chromedp.Action[chromedp.Void]) {
	e.t.Helper()
	ctx, cancel := context.WithTimeout(e.ctx, 15*time.Second)
	defer cancel()
	if err := chromedp.Do(ctx, steps...); err != nil {
		e.shot("failed-" + what)
		e.t.Fatalf("%s: %v", what, err)
	}
}

// reloaded runs steps that leave the page (a form posted and redirected
// back to the same page, say) and waits until a new document has loaded
// and cond, a JavaScript expression, holds on it. Waiting for an element
// is not enough when the old page has it too; queries made while the
// browser swaps documents fail, so they are retried.
func (e *e2e) reloaded(what, cond string, steps ...chromedp.Action[chromedp.Void]) {
	e.t.Helper()
	if _, err := chromedp.Run(e.ctx, chromedp.Evaluate[bool](`window.fbOldPage = true`)); err != nil {
		e.t.Fatalf("%s: mark the page: %v", what, err)
	}
	e.do(what, steps...)
	js := `window.fbOldPage === undefined && document.readyState === "complete" && (` + cond + `)`
	deadline := time.Now().Add(15 * time.Second)
	for {
		ctx, cancel := context.WithTimeout(e.ctx, 2*time.Second)
		ok, err := chromedp.Run(ctx, chromedp.Evaluate[bool](js))
		cancel()
		if err == nil && ok {
			return
		}
		if time.Now().After(deadline) {
			e.shot("failed-" + what)
			e.t.Fatalf("%s: the page did not come back with %s (last error: %v)", what, cond, err)
		}
		time.Sleep(50 * time.Millisecond)
	}
}

// text is the trimmed text of the first element matching sel, once visible.
func (e *e2e) text(sel string) string {
	e.t.Helper()
	ctx, cancel := context.WithTimeout(e.ctx, 15*time.Second)
	defer cancel()
	s, err := chromedp.Run(ctx, chromedp.Text(chromedp.CSS(sel), chromedp.NodeVisible))
	if err != nil {
		e.shot("failed-text")
		e.t.Fatalf("text of %s: %v", sel, err)
	}
	return strings.TrimSpace(s)
}

// value is the current value of a form control, read by JavaScript in the
// page (chromedp's own node lookups can still point into the document a
// reload has just replaced), retried until the control exists.
func (e *e2e) value(sel string) string {
	e.t.Helper()
	js := fmt.Sprintf(`(() => { const el = document.querySelector(%q); return el ? [el.value] : []; })()`, sel)
	deadline := time.Now().Add(15 * time.Second)
	for {
		ctx, cancel := context.WithTimeout(e.ctx, 2*time.Second)
		v, err := chromedp.Run(ctx, chromedp.Evaluate[[]string](js))
		cancel()
		if err == nil && len(v) == 1 {
			return v[0]
		}
		if time.Now().After(deadline) {
			e.t.Fatalf("value of %s: no such control (last error: %v)", sel, err)
		}
		time.Sleep(50 * time.Millisecond)
	}
}

// waitText waits until the element's text (or its first number) equals
// want: the live preview answers after a debounce, so the test waits for
// the DOM, not for a fixed time.
func (e *e2e) waitText(what, sel, want string) {
	e.t.Helper()
	js := fmt.Sprintf(`(() => { const el = document.querySelector(%q); return !!el && el.textContent.trim().split(/\s+/)[0] === %q; })()`, sel, want)
	ctx, cancel := context.WithTimeout(e.ctx, 15*time.Second)
	defer cancel()
	if _, err := chromedp.Run(ctx, chromedp.Poll[bool](js, chromedp.WithPollingTimeout(12*time.Second))); err != nil {
		got := "(absent)"
		if s, err := chromedp.Run(e.ctx, chromedp.Evaluate[string](fmt.Sprintf(`(document.querySelector(%q) || {textContent: "(absent)"}).textContent`, sel))); err == nil {
			got = strings.TrimSpace(s)
		}
		e.shot("failed-" + what)
		e.t.Fatalf("%s: %s shows %q, want %q", what, sel, got, want)
	}
}

// shot saves a full-page screenshot named after the step.
func (e *e2e) shot(name string) {
	e.t.Helper()
	e.n++
	buf, err := chromedp.Run(e.ctx, chromedp.FullScreenshot(100))
	if err != nil {
		e.t.Logf("screenshot %s: %v", name, err)
		return
	}
	p := filepath.Join(e.shots, fmt.Sprintf("%02d-%s.png", e.n, name))
	if err := os.WriteFile(p, buf, 0o644); err != nil {
		e.t.Logf("screenshot %s: %v", name, err)
	}
}

// expectedSummary evaluates a case in Go, as the page should show it.
func expectedSummary(t *testing.T, c calc.Case) (d32, dv50 string) {
	t.Helper()
	res, err := calc.Evaluate(c)
	if err != nil {
		t.Fatalf("calc.Evaluate: %v", err)
	}
	return views.Micro(res.Summary.D32M), views.Micro(res.Summary.Dv50M)
}

func routeExists(t *testing.T, u string) bool {
	resp, err := http.Get(u)
	if err != nil {
		return false
	}
	resp.Body.Close()
	return resp.StatusCode == http.StatusOK
}

// TestE2EJourney walks the main path of a working session: the library,
// the unit switch, a new case with live results, a measured CSV imported,
// fitted and applied, saving, duplicating and opening the case page.
func TestE2EJourney(t *testing.T) {
	e := newE2E(t)

	// The library lists the demo cases.
	e.do("open the library", chromedp.Navigate(e.base+"/cases"),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=case-row]`)))
	rows, err := chromedp.Run(e.ctx, chromedp.Nodes(chromedp.CSSAll(`[data-testid=case-row]`)))
	if err != nil || len(rows) != 3 {
		t.Fatalf("library rows: %d, %v", len(rows), err)
	}
	e.shot("library")

	// Switch to US customary units with the header control's Apply button
	// (the keyboard path: the value is set without a change event, which
	// would submit the form by itself); the page comes back in psi.
	if _, err := chromedp.Run(e.ctx, chromedp.Evaluate[string](`document.getElementById("units-system").value = "us"`)); err != nil {
		t.Fatal(err)
	}
	e.reloaded("choose US units", `!!document.querySelector("[data-testid=case-row]")`,
		chromedp.Click(chromedp.CSS(`[data-testid=units-apply]`)))
	if got := e.value("#units-system"); got != "us" {
		t.Fatalf("units switch shows %q after applying us", got)
	}

	// A new case: the blank form starts in the chosen units, and the live
	// panel computes it at once.
	e.do("open the new-case form", chromedp.Click(chromedp.CSS(`nav a[href="/cases/new"]`)),
		chromedp.WaitVisible(chromedp.ID("case-form")))
	if got := e.value(`select[name=pressure_unit]`); got != "psi" {
		t.Errorf("new form pressure unit %q, want psi", got)
	}
	want := newCaseDefaults()
	want.Name = "Browser nozzle"
	d32, _ := expectedSummary(t, want)
	e.waitText("first live result", `[data-testid="fig-D32"]`, d32)

	// Typing recomputes the panel after the debounce, without a reload.
	e.do("type a name and a new X", chromedp.SendKeys(chromedp.ID("f-name"), "Browser nozzle"),
		chromedp.Clear(chromedp.ID("f-x")), chromedp.SendKeys(chromedp.ID("f-x"), "80"))
	want.Distribution.XM = 80e-6
	d32, dv50 := expectedSummary(t, want)
	e.waitText("live D32 after typing X", `[data-testid="fig-D32"]`, d32)
	e.waitText("live Dv50 after typing X", `[data-testid="fig-Dv50"]`, dv50)
	e.shot("new-case-live")

	// Switching units with unsaved edits keeps them: after the reload the
	// name, X and X's own unit are back, and the live results follow them.
	// Switch to SI and back, so the journey goes on in US units; choosing
	// in the select submits the switch by itself (SetValue fires change).
	xUnit := e.value(`select[name=x_unit]`)
	for _, system := range []string{"si", "us"} {
		e.reloaded("switch to "+system+" with unsaved edits", `!!document.getElementById("case-form")`,
			chromedp.SetValue(chromedp.ID("units-system"), system))
		if got := e.value("#units-system"); got != system {
			t.Fatalf("units switch shows %q after applying %s", got, system)
		}
		if got := []string{e.value("#f-name"), e.value("#f-x"), e.value(`select[name=x_unit]`)}; got[0] != "Browser nozzle" || got[1] != "80" || got[2] != xUnit {
			t.Fatalf("after switching to %s the form holds name, X, X unit %q, want the unsaved %q", system, got, []string{"Browser nozzle", "80", xUnit})
		}
		if note := e.text(`[data-testid=unsaved-kept]`); !strings.Contains(note, "unsaved edits were kept") {
			t.Errorf("no notice of the kept edits: %q", note)
		}
		e.waitText("live D32 after the units switch", `[data-testid="fig-D32"]`, d32)
		e.shot("unsaved-form-kept-" + system)
	}

	// Import a measured CSV: open the import block, choose the file, read it.
	csvPath, err := filepath.Abs("../testdata/sizedist/bins_volume_semicolon.csv")
	if err != nil {
		t.Fatal(err)
	}
	e.do("read the CSV", chromedp.Click(chromedp.CSS(`#import summary`)),
		chromedp.SetUploadFiles(chromedp.ID("f-import-file"), []string{csvPath}),
		chromedp.Click(chromedp.CSS(`[data-testid=import-read]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=import-detected]`)))
	if got := e.text(`[data-testid=detected-separator]`); got != "semicolon" {
		t.Errorf("detected separator %q", got)
	}
	if got := e.text(`[data-testid=detected-decimal]`); got != "comma" {
		t.Errorf("detected decimal mark %q", got)
	}
	if got := e.value(`#f-name`); got != "Browser nozzle" {
		t.Errorf("reading the file changed the name to %q", got)
	}
	e.shot("import-detected")

	// Fit the four families; the table shows them with the best marked.
	e.do("fit the classes", chromedp.Click(chromedp.CSS(`[data-testid=import-fit]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=fit-table]`)))
	data, err := os.ReadFile(csvPath)
	if err != nil {
		t.Fatal(err)
	}
	imp, err := sizedist.ImportCSV(bytes.NewReader(data), importMaxBytes)
	if err != nil {
		t.Fatal(err)
	}
	fit, err := sizedist.Fit(imp.Binned, "log-normal")
	if err != nil {
		t.Fatal(err)
	}
	if got := e.text(`[data-testid=fit-r2-log-normal]`); got != r2Text(fit.R2) {
		t.Errorf("log-normal R² shown %q, calc says %s", got, r2Text(fit.R2))
	}
	e.shot("import-fits")

	// Apply the classes: the model becomes "bins", the other values stay,
	// and the live panel recomputes the measured distribution.
	e.do("apply the classes", chromedp.Click(chromedp.CSS(`[data-testid=import-apply]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=import-applied]`)))
	if got := e.value(`#f-model`); got != "bins" {
		t.Fatalf("model after apply %q", got)
	}
	if got := e.value(`#f-name`); got != "Browser nozzle" {
		t.Errorf("apply lost the name: %q", got)
	}
	measured := want
	measured.Distribution = calc.Distribution{Model: "bins", EdgesM: imp.Binned.Edges, Fraction: imp.Binned.Volume, Basis: "volume"}
	d32, dv50 = expectedSummary(t, measured)
	e.waitText("live D32 of the measured classes", `[data-testid="fig-D32"]`, d32)
	e.waitText("live Dv50 of the measured classes", `[data-testid="fig-Dv50"]`, dv50)
	e.shot("import-applied")

	// Save: the case page shows the computed figures and the distribution
	// plots with the fitted curve.
	e.do("save", chromedp.Click(chromedp.CSS(`.form-actions button.primary[type=submit]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=case-page]`)))
	if got := e.text(`[data-testid=case-name]`); got != "Browser nozzle" {
		t.Errorf("saved case name %q", got)
	}
	e.waitText("saved D32", `[data-testid="fig-D32"]`, d32)
	if cap := e.text(`[data-testid=plot-dist-density] figcaption`); !strings.Contains(cap, "R²") {
		t.Errorf("no fitted curve named on the density plot: %q", cap)
	}
	// The page is in US units: the inputs panel gives the pressure in psi.
	if in := e.text(`.inputs`); !strings.Contains(in, units.Default(units.US, units.Pressure).Symbol) {
		t.Errorf("inputs not in US units: %q", in)
	}
	e.shot("case-page")
	savedURL, err := chromedp.Run(e.ctx, chromedp.Location())
	if err != nil {
		t.Fatal(err)
	}

	// Duplicate: the copy opens in the form; cancel leads to its page.
	e.do("duplicate", chromedp.Click(chromedp.CSS(`.actions form[action$="/duplicate"] button`)),
		chromedp.WaitVisible(chromedp.ID("case-form")))
	if got := e.value(`#f-name`); got != "Copy of Browser nozzle" {
		t.Errorf("copy is named %q", got)
	}
	e.shot("duplicate-form")
	e.do("open the copy's page", chromedp.Click(chromedp.CSS(`.form-actions a.button`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=case-page]`)))
	if got := e.text(`[data-testid=case-name]`); got != "Copy of Browser nozzle" {
		t.Errorf("copy's page shows %q", got)
	}
	e.waitText("copy's D32", `[data-testid="fig-D32"]`, d32)
	e.shot("copy-page")
	copyURL, err := chromedp.Run(e.ctx, chromedp.Location())
	if err != nil {
		t.Fatal(err)
	}

	// Compare and report, where those pages exist.
	id := func(u string) string {
		m := caseURL.FindStringSubmatch(strings.TrimPrefix(u, e.base))
		if m == nil {
			t.Fatalf("not a case URL: %s", u)
		}
		return m[1]
	}
	a, b := id(savedURL), id(copyURL)
	if u := e.base + "/compare?ids=" + a + "," + b; routeExists(t, u) {
		e.do("compare", chromedp.Navigate(u), chromedp.WaitVisible(chromedp.CSS(`main`)))
		page := e.text(`main`)
		if !strings.Contains(page, "Browser nozzle") || !strings.Contains(page, "Copy of Browser nozzle") {
			t.Errorf("comparison does not name both cases")
		}
		e.shot("compare")
	} else {
		t.Log("no /compare page yet: comparison step left out")
	}
	if u := e.base + "/cases/" + a + "/report"; routeExists(t, u) {
		e.do("report", chromedp.Navigate(u), chromedp.WaitVisible(chromedp.CSS(`body`)))
		if page := e.text(`body`); !strings.Contains(page, "Browser nozzle") || !strings.Contains(page, d32) {
			t.Errorf("report lacks the case name or its D32 %s", d32)
		}
		e.shot("report")
	} else {
		t.Log("no report page yet: report step left out")
	}
}

// TestE2EBadFileAndNoScript checks the refusal of a bad file beside the file
// field, and that the case form saves with JavaScript off.
func TestE2EBadFileAndNoScript(t *testing.T) {
	e := newE2E(t)
	bad := filepath.Join(t.TempDir(), "single.csv")
	if err := os.WriteFile(bad, []byte("Lower (µm),Upper (µm),Volume (%)\n10,20,100\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	e.do("read a bad file", chromedp.Navigate(e.base+"/cases/new"),
		chromedp.WaitVisible(chromedp.ID("case-form")),
		chromedp.SendKeys(chromedp.ID("f-name"), "Kept name"),
		chromedp.Click(chromedp.CSS(`#import summary`)),
		chromedp.SetUploadFiles(chromedp.ID("f-import-file"), []string{bad}),
		chromedp.Click(chromedp.CSS(`[data-testid=import-read]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=error-import-file]`)))
	if msg := e.text(`[data-testid=error-import-file]`); !strings.Contains(msg, "not imported") {
		t.Errorf("bad file message %q", msg)
	}
	if got := e.value(`#f-name`); got != "Kept name" {
		t.Errorf("name after a refused file %q", got)
	}
	if n, _ := chromedp.Run(e.ctx, chromedp.Nodes(chromedp.CSSAll(`input[name=import_edges]`), chromedp.AtLeast(0))); len(n) != 0 {
		t.Error("a refused file left classes to apply")
	}
	e.shot("bad-file")

	// With scripts off the form is a plain form post and still saves.
	noScript := chromedp.Func(func(ctx context.Context, t *chromedp.Target) error {
		_, err := cdp.Call(ctx, t, emulation.SetScriptExecutionDisabled, emulation.SetScriptExecutionDisabledParams{Value: true})
		return err
	})
	e.do("scripts off", noScript,
		chromedp.Navigate(e.base+"/cases/new"), chromedp.WaitVisible(chromedp.ID("case-form")),
		chromedp.SendKeys(chromedp.ID("f-name"), "No-script case"),
		chromedp.Click(chromedp.CSS(`.form-actions button.primary[type=submit]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=case-page]`)))
	if got := e.text(`[data-testid=case-name]`); got != "No-script case" {
		t.Errorf("saved without scripts: %q", got)
	}
	want := newCaseDefaults()
	want.Name = "No-script case"
	d32, _ := expectedSummary(t, want)
	if got := strings.Fields(e.text(`[data-testid="fig-D32"]`))[0]; got != d32 {
		t.Errorf("D32 %s, calc says %s", got, d32)
	}
	e.shot("no-script-saved")
}
