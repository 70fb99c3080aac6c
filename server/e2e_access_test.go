package server

import (
	"net/url"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// TestE2EStatusNoticeComesFromTheServer: in a real browser, text put in
// the URL shows no banner, and the notice of an action (a signed cookie
// set with the redirect) shows once on the page the browser lands on.
func TestE2EStatusNoticeComesFromTheServer(t *testing.T) {
	e := newE2E(t)
	noBanner := `document.querySelector("[data-testid=flash]") === null`

	e.do("open a planted link", chromedp.Navigate(e.base+"/cases?flash="+url.QueryEscape("Reviewed and approved by the safety board")),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=case-row]`)))
	e.shot("planted-flash-link")
	if ok, err := chromedp.Run(e.ctx, chromedp.Evaluate[bool](noBanner+` && !document.body.innerText.includes("safety board")`)); err != nil || !ok {
		t.Fatalf("text from the URL is shown (%v)", err)
	}

	// Tag the first case from its row's actions.
	if _, err := chromedp.Run(e.ctx, chromedp.Evaluate[bool](`(() => {
		const d = document.querySelector("details.row-actions"); d.open = true;
		d.querySelector("input[name=tags]").value = "notice-check"; return true })()`)); err != nil {
		t.Fatal(err)
	}
	e.reloaded("set tags", `!!document.querySelector("[data-testid=flash]")`,
		chromedp.Click(chromedp.CSS(`details.row-actions [data-testid=set-tags]`)))
	e.shot("notice-after-tagging")
	if got := e.text(`[data-testid=flash]`); !strings.Contains(got, "tagged: notice-check") {
		t.Errorf("notice %q", got)
	}
	e.reloaded("reload", `!!document.querySelector("[data-testid=case-row]")`, chromedp.Reload())
	if ok, err := chromedp.Run(e.ctx, chromedp.Evaluate[bool](noBanner)); err != nil || !ok {
		t.Errorf("the notice shows again after a reload (%v)", err)
	}
}
