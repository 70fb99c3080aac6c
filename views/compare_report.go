package views

import (
	"fmt"
	"net/url"
	"strconv"
	"strings"
	"time"
)

// CompareReportView is a comparison laid out for print and PDF: the
// comparison's tables and overlay plots, then each case's full report.
type CompareReportView struct {
	CompareView
	Generated time.Time
	Paper     string       // "a4", "letter" or ""
	Reports   []ReportView // one per case, in column order
}

// Title names the comparison.
func (v CompareReportView) Title() string { return fmt.Sprintf("Comparison of %d cases", len(v.Cases)) }

// HeaderLine is the running header: which cases at which revisions.
func (v CompareReportView) HeaderLine() string {
	parts := make([]string, len(v.Cases))
	for i, c := range v.Cases {
		parts[i] = fmt.Sprintf("%d r%d", c.ID, c.Revision)
	}
	return "Cases " + strings.Join(parts, ", ") + " · drawn " + v.Generated.UTC().Format("2006-01-02")
}

// GeneratedText is the time the report was drawn.
func (v CompareReportView) GeneratedText() string {
	return v.Generated.UTC().Format("2006-01-02 15:04 UTC")
}

// PaperClass selects the named page of report.css, or none.
func (v CompareReportView) PaperClass() string { return ReportView{Paper: v.Paper}.PaperClass() }

// Query is the comparison's ids and baseline as a query string.
func (v CompareView) Query() string {
	ids := make([]string, len(v.Cases))
	for i, c := range v.Cases {
		ids[i] = strconv.FormatInt(c.ID, 10)
	}
	return "ids=" + url.QueryEscape(strings.Join(ids, ",")) + "&base=" + strconv.FormatInt(v.BaseCase().ID, 10)
}

// ReportURL is the print page of this comparison on the given paper.
func (v CompareView) ReportURL(paper string) string {
	u := "/compare/report?" + v.Query()
	if paper != "" {
		u += "&paper=" + paper
	}
	return u
}

// PDFURL is the PDF of this comparison.
func (v CompareView) PDFURL() string { return "/compare/report.pdf?" + v.Query() }

// CSVURL is the summary CSV of the compared cases, one row per case.
func (v CompareView) CSVURL() string { return "/compare/summary.csv?" + v.Query() }

// Cautions are the safety notes of all the cases, each once, in the order
// the cases give them.
func (v CompareReportView) Cautions() []string {
	seen := map[string]bool{}
	var out []string
	for _, r := range v.Reports {
		for _, c := range r.Cautions() {
			if !seen[c] {
				seen[c] = true
				out = append(out, c)
			}
		}
	}
	return out
}

// BaseNote says which case the differences are taken against.
func (v CompareReportView) BaseNote() string {
	b := v.BaseCase()
	return fmt.Sprintf("Differences are case minus baseline (case %d, %s), then relative to the baseline in %%. %d of %d inputs differ from it.",
		b.ID, b.Name, v.ChangedInputs(), len(v.Inputs))
}

// ChangedRows are the input rows that differ from the baseline in any case;
// the report lists those (the case reports that follow list every input).
func (v CompareReportView) ChangedRows() []CompareRow {
	var out []CompareRow
	for _, r := range v.Inputs {
		if r.AnyDiffers(v.Base) {
			out = append(out, r)
		}
	}
	return out
}

// RowLabel is a row's label with its symbol and unit.
func (r CompareRow) RowLabel() string {
	s := r.Label
	if r.Symbol != "" {
		s += " " + r.Symbol
	}
	if r.Unit != "" {
		s += ", " + r.Unit
	}
	return s
}
