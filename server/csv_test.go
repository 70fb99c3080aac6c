package server

import (
	"context"
	"encoding/csv"
	"io"
	"net/http"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// csvPieces splits one CSV line as a spreadsheet may, on sep and without
// regard to quotes, and returns the pieces with quotes and spaces trimmed.
func csvPieces(line string, sep string) []string {
	var out []string
	for _, p := range strings.Split(line, sep) {
		out = append(out, strings.TrimLeft(p, `" `))
	}
	return out
}

// Text cells of every CSV export are quoted, and no separator-delimited
// piece of one starts a formula, whatever separator a spreadsheet splits
// on and whether or not it honours the quotes; numbers stay bare.
func TestCSVExportsDisarmHostileNames(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	hostile := []string{
		"a;=1+1", `=HYPERLINK("http://evil.example","x")`, "@SUM(A1)", "x|+cmd|' /C calc'!A0",
		"-2+3", `say "hi", =1+1`, "ok\t=1", "pipe | -1", "semi; @x", "12", "plain",
	}
	base, err := st.GetCase(ctx, 1)
	if err != nil {
		t.Fatal(err)
	}
	var ids []string
	for _, name := range hostile {
		c := base.Case
		c.Name = name
		rec, err := st.CreateCase(ctx, c, "test")
		if err != nil {
			t.Fatal(err)
		}
		ids = append(ids, strconv.FormatInt(rec.ID, 10))
	}
	triggers := "=+-@\t\r"
	check := func(what, body string, nameCol int, names []string) {
		t.Helper()
		recs, err := csv.NewReader(strings.NewReader(body)).ReadAll()
		if err != nil {
			t.Fatalf("%s: %v", what, err)
		}
		lines := strings.Split(strings.TrimSuffix(body, "\n"), "\n")
		for i, name := range names {
			cell := recs[i+1][nameCol]
			if strings.TrimPrefix(strings.ReplaceAll(cell, "'", ""), "") != strings.ReplaceAll(name, "'", "") {
				t.Errorf("%s: name %q came out as %q (only apostrophes may be added)", what, name, cell)
			}
			if !strings.Contains(lines[i+1], `,"`+strings.ReplaceAll(cell, `"`, `""`)+`",`) {
				t.Errorf("%s: name cell %q is not quoted in %q", what, cell, lines[i+1])
			}
		}
		for _, line := range lines {
			for _, sep := range []string{",", ";", "\t", "|"} {
				for _, p := range csvPieces(line, sep) {
					if p == "" || !strings.ContainsRune(triggers, rune(p[0])) {
						continue
					}
					num := p
					if k := strings.IndexAny(num, ",;\t|\""); k >= 0 {
						num = num[:k]
					}
					if _, err := strconv.ParseFloat(num, 64); err != nil {
						t.Errorf("%s: split on %q, a piece starts a formula: %q", what, sep, p)
					}
				}
			}
		}
	}
	for i, id := range ids {
		body := getText(t, ts.URL+"/cases/"+id+"/summary.csv")
		check("summary.csv of "+strconv.Quote(hostile[i]), body, 2, hostile[i:i+1])
		if i == 0 {
			bins := getText(t, ts.URL+"/cases/"+id+"/bins.csv")
			check("bins.csv", bins, 0, nil)
			line := strings.Split(bins, "\n")[1]
			if strings.HasPrefix(line, `"`) || !regexp.MustCompile(`,"[a-z-]+",`).MatchString(line) {
				t.Errorf("bins.csv: want bare numbers and the quoted regime: %q", line)
			}
		}
	}
	body := getText(t, ts.URL+"/compare/summary.csv?ids="+strings.Join(ids[:6], ","))
	check("compare summary.csv", body, 2, hostile[:6])
	// Numbers stay numbers: bare, and negative ones keep their sign.
	row := strings.Split(body, "\n")[1]
	if !regexp.MustCompile(`^\d+,\d+,"`).MatchString(row) {
		t.Errorf("case id and revision are not bare numbers: %q", row)
	}
}

func getText(t *testing.T, u string) string {
	t.Helper()
	resp, err := http.Get(u)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	data, _ := io.ReadAll(resp.Body)
	if resp.StatusCode != http.StatusOK {
		t.Fatalf("%s: status %d: %s", u, resp.StatusCode, data)
	}
	return string(data)
}

func TestCSVTextGuardsEveryPiece(t *testing.T) {
	for in, want := range map[string]string{
		"a;=1+1":         "a;'=1+1",
		"=SUM(A1)":       "'=SUM(A1)",
		"x|+cmd":         "x|'+cmd",
		"a, -1":          "a,' -1",
		"t\t=1":          "t\t'=1",
		"\t=1":           "'\t'=1",
		"Nozzle A - B":   "Nozzle A - B",
		"two\n@line":     "two\n'@line",
		"plain; text, 2": "plain; text, 2",
	} {
		if got := csvText(in); got != want {
			t.Errorf("csvText(%q) = %q, want %q", in, got, want)
		}
	}
}
