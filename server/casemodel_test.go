package server

import (
	"encoding/json"
	"fmt"
	"slices"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/calc"
)

// labelled collects label → value pairs of a definition list (case page)
// or a two-column table (report).
func labelled(doc *goquery.Document, label, value string) map[string]string {
	out := map[string]string{}
	doc.Find(label).Each(func(_ int, l *goquery.Selection) {
		out[strings.TrimSpace(l.Text())] = strings.Join(strings.Fields(l.NextFiltered(value).Text()), " ")
	})
	return out
}

// The case page, the print report, the PDF and the summary CSV state the
// model the results were computed with: how the drop temperature was found
// (fixed, steady per class, transient from the injection temperature), the
// convection model, the Fuchs–Sutugin transition correction and the
// accommodation coefficient. The case page said "steady (solved per class)"
// for a transient case.
func TestCasePageAndReportsStateTheModel(t *testing.T) {
	ts, _ := newTestServer(t)
	hc := client(t)
	t300, t293 := 300.0, 293.15
	base := func(name string) calc.Case {
		return calc.Case{Format: calc.CaseFormat, Name: name, Fluid: "n-heptane",
			Gas:          calc.Gas{ID: "air", PressurePa: 2e5, TemperatureK: 600},
			Distribution: calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 12}}
	}
	transient := base("transient")
	transient.Heating, transient.InjectionTemperatureK = "transient", &t300
	transient.Evaporation = calc.Evaporation{Convection: "frossling", AccommodationCoef: 0.04}
	fixed := base("fixed")
	fixed.LiquidTemperatureK = &t293
	fixed.Evaporation = calc.Evaporation{NoTransition: true, MaxTimeS: 0.002}
	steady := base("steady")

	for _, tc := range []struct {
		c    calc.Case
		want map[string]string // label → text the value must contain
		csv  []string          // the model columns of the summary CSV
	}{
		{transient, map[string]string{
			"Drop temperature":            "transient from 26.85 °C at injection",
			"Size-class table at":         "steady (solved per class)",
			"Convection":                  "Frössling",
			"Transition correction":       "Fuchs–Sutugin, on",
			"Accommodation coefficient α": "0.04",
		}, []string{"transient", "", "300", "frossling", "fuchs-sutugin", "0.04"}},
		{fixed, map[string]string{
			"Drop temperature":            "fixed at 20 °C",
			"Convection":                  "Ranz–Marshall",
			"Transition correction":       "off",
			"Accommodation coefficient α": "not used",
			"History ends":                "at 2 ms",
		}, []string{"fixed", "293.15", "", "ranz-marshall", "off", "1"}},
		{steady, map[string]string{
			"Drop temperature":            "steady (solved per class)",
			"Transition correction":       "Fuchs–Sutugin, on",
			"Accommodation coefficient α": "1 (default)",
			"History ends":                "99 %",
		}, []string{"steady", "", "", "ranz-marshall", "fuchs-sutugin", "1"}},
	} {
		t.Run(tc.c.Name, func(t *testing.T) {
			body, _ := json.Marshal(tc.c)
			createdID := createCaseAPI(t, hc, ts.URL, body)
			page, _ := getDoc(t, hc, fmt.Sprintf("%s/cases/%d", ts.URL, createdID))
			report, _ := getDoc(t, hc, fmt.Sprintf("%s/cases/%d/report", ts.URL, createdID))
			for where, got := range map[string]map[string]string{
				"case page": labelled(page, `aside.inputs dt`, "dd"),
				"report":    labelled(report, `[data-testid=section-inputs] th`, "td"),
			} {
				for label, want := range tc.want {
					if !strings.Contains(got[label], want) {
						t.Errorf("%s: %s = %q, want it to say %q", where, label, got[label], want)
					}
				}
			}
			if tc.c.Heating == "transient" && strings.HasPrefix(labelled(page, `aside.inputs dt`, "dd")["Drop temperature"], "steady") {
				t.Error("the case page calls a transient case steady")
			}

			pdf := spaces.ReplaceAllString(pdfToText(t, getPDF(t, fmt.Sprintf("%s/cases/%d/report.pdf", ts.URL, createdID))), " ")
			for label, want := range tc.want {
				if !strings.Contains(pdf, label) || !strings.Contains(pdf, want) {
					t.Errorf("PDF lacks %s: %q", label, want)
				}
			}

			_, recs := readCSV(t, fmt.Sprintf("%s/cases/%d/summary.csv", ts.URL, createdID))
			hdr, row := recs[0], recs[1]
			// The model columns come before the atomizer and equilibrium
			// columns: found by the first one's name.
			n := len(tc.csv)
			at := slices.Index(hdr, "drop_temperature_model")
			if at < 0 || at+n > len(hdr) {
				t.Fatalf("summary CSV header %q", hdr)
			}
			hdr, row = hdr[:at+n], row[:at+n]
			if got := strings.Join(hdr[len(hdr)-n:], ","); got != "drop_temperature_model,liquid_temperature (K),injection_temperature (K),convection,transition_correction,accommodation_coefficient (-)" {
				t.Errorf("summary CSV model columns %q", got)
			}
			if got, want := strings.Join(row[len(row)-n:], ","), strings.Join(tc.csv, ","); got != want {
				t.Errorf("summary CSV model cells %q, want %q", got, want)
			}
		})
	}
}
