package server

import (
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// Refused text in a real browser: a case name with a tab (pasted) comes
// back on the form with the message beside it and the name as typed; a tag
// too long comes back on the library page with the row's actions open, the
// tags as typed and the message beside them.
func TestE2ERefusedTextStaysOnTheForm(t *testing.T) {
	e := newE2E(t)
	e.do("open the form", chromedp.Navigate(e.base+"/cases/new"), chromedp.WaitVisible(chromedp.ID("case-form")))
	const pasted = "Pasted\tname with a tab"
	if _, err := chromedp.Run(e.ctx, chromedp.Evaluate[bool](`document.getElementById("f-name").value = "Pasted\tname with a tab"; true`)); err != nil {
		t.Fatal(err)
	}
	e.do("save a name with a tab", chromedp.Click(chromedp.CSS(`.form-actions button.primary[type=submit]`)),
		chromedp.WaitVisible(chromedp.CSS(`[data-testid=error-name]`)))
	if msg := e.text(`[data-testid=error-name]`); !strings.Contains(msg, "control characters") {
		t.Errorf("name message %q", msg)
	}
	if got := e.value(`#f-name`); got != pasted {
		t.Errorf("name after the refusal %q, want %q", got, pasted)
	}
	e.shot("name-with-tab")

	long := "dryer, " + strings.Repeat("x", 41)
	e.do("open the library", chromedp.Navigate(e.base+"/cases"), chromedp.WaitVisible(chromedp.CSS(`[data-testid=set-tags]`)))
	if _, err := chromedp.Run(e.ctx, chromedp.Evaluate[bool](`(() => { const i = document.querySelector("input[name=tags]"); i.value = "`+long+`"; i.closest("form").submit(); return true; })()`)); err != nil {
		t.Fatal(err)
	}
	e.do("set a tag too long", chromedp.WaitVisible(chromedp.CSS(`[data-testid=error-tags]`)))
	if msg := e.text(`[data-testid=error-tags]`); !strings.Contains(msg, "at most 40 characters") || !strings.Contains(msg, "nothing was saved") {
		t.Errorf("tags message %q", msg)
	}
	if got := e.value(`details[open] input[name=tags]`); got != long {
		t.Errorf("tags after the refusal %q, want %q", got, long)
	}
	e.shot("tag-too-long")
}
