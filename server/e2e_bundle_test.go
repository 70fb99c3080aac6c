package server

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"

	"fogbench/store"
)

// TestE2EBundleImportShowsProgress uploads a bundle of 1,500 cases (about
// 4.5 MB) on the import page in a real browser: the page stays in place,
// the progress box shows the upload and then the check, the preview lists
// every case, and the import applies them all.
func TestE2EBundleImportShowsProgress(t *testing.T) {
	e := newE2E(t)
	demo, err := store.DemoCases()
	if err != nil {
		t.Fatal(err)
	}
	const n = 1500
	file := filepath.Join(t.TempDir(), "rig-library.json")
	if err := os.WriteFile(file, rigBundle(t, demo, rigNotes, 10000, 10000+n), 0o644); err != nil {
		t.Fatal(err)
	}
	// Every text the progress box shows, recorded as it changes; the
	// window survives because the page is replaced in place, not reloaded.
	const watch = `(() => {
		window.fbSeen = [];
		const box = document.querySelector('[data-testid=upload-progress]');
		new MutationObserver(() => { window.fbSeen.push((box.hidden ? 'hidden:' : '') + box.textContent.trim()); })
			.observe(box, {subtree: true, childList: true, characterData: true, attributes: true});
		return true;
	})()`
	e.do("open the import page", chromedp.Navigate(e.base+"/bundle/import"),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=bundle-upload]`)))
	if _, err := chromedp.Run(e.ctx, chromedp.Evaluate[bool](watch)); err != nil {
		t.Fatal(err)
	}
	e.do("upload the bundle",
		chromedp.SetUploadFiles(chromedp.ID("bundle-file"), []string{file}),
		chromedp.Click(chromedp.CSS(`[data-testid=bundle-check]`)))
	e.shot("uploading")
	e.do("preview", chromedp.WaitVisible(chromedp.CSS(`[data-testid=bundle-preview]`)))
	seen, err := chromedp.Run(e.ctx, chromedp.Evaluate[[]string](`window.fbSeen || []`))
	if err != nil {
		t.Fatal(err)
	}
	all := strings.Join(seen, " | ")
	if !strings.Contains(all, "Sending") || !strings.Contains(all, "checking every case") {
		t.Errorf("the progress box showed %q", all)
	}
	if got := e.text(`[data-testid=bundle-summary]`); !strings.Contains(got, "1500 cases: 1500 new") {
		t.Errorf("preview summary %q", got)
	}
	e.shot("preview")
	e.do("apply", chromedp.Click(chromedp.CSS(`[data-testid=bundle-confirm]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=bundle-done]`)))
	if got := e.text(`[data-testid=bundle-done]`); !strings.Contains(got, "1500 added") {
		t.Errorf("after the import: %q", got)
	}
	e.shot("imported")
}
