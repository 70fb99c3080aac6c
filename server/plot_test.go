package server

import (
	"regexp"
	"strings"
	"testing"
)

func TestStyleToAttributes(t *testing.T) {
	in := `<path d="M0 0" style="fill:none;stroke:#1F5F7A;stroke-width:1.6"/><text style="font-family:Liberation Sans;font-size:10px">x</text>`
	want := `<path d="M0 0" fill="none" stroke="#1F5F7A" stroke-width="1.6"/><text font-family="Liberation Sans" font-size="10px">x</text>`
	if got := styleToAttributes(in); got != want {
		t.Fatalf("got  %s\nwant %s", got, want)
	}
}

// Every chart kind draws to an SVG that carries no inline style (the CSP
// would block it) and labels its axes with units.
func TestChartsDrawWithoutInlineStyle(t *testing.T) {
	c := chart{Title: "t", XLabel: "Drop diameter d (µm)", YLabel: "y (–)", LogX: true,
		Series: []series{{Name: "a", X: []float64{1, 10, 100}, Y: []float64{0.1, 0.5, 0.2}, Step: true}},
		Marks:  []float64{10}, MarkNames: []string{"m"}}
	svg, err := c.SVG()
	if err != nil {
		t.Fatal(err)
	}
	if inline := regexp.MustCompile(`\sstyle=`).FindString(svg); inline != "" || !strings.HasPrefix(svg, "<svg") {
		t.Fatalf("svg starts %q; inline style attribute found: %q", svg[:40], inline)
	}
	if !strings.Contains(svg, "(µm)") {
		t.Error("axis label with unit missing")
	}
	// Points a log axis cannot show are dropped rather than panicking.
	c.Series[0].Y[1] = 0
	if _, err := c.SVG(); err != nil {
		t.Fatal(err)
	}
	c.Series[0].Y = []float64{0, 0, 0}
	c.LogY = true
	if _, err := c.SVG(); err == nil {
		t.Error("a chart with nothing drawable must be an error")
	}
	png, err := c.PNG(72)
	if err == nil || png != nil {
		t.Error("PNG of an empty chart must fail too")
	}
}
