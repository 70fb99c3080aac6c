package sizedist

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"fogbench/calc/valid"
)

// Shape is the layout of an imported size table.
type Shape string

// The table layouts ImportCSV accepts.
const (
	// ShapeBins: one row per class with lower and upper edges (or one
	// edges column) and a percent or fraction per class.
	ShapeBins Shape = "bins"
	// ShapeCumulative: diameters with the cumulative percent undersize.
	ShapeCumulative Shape = "cumulative"
	// ShapeRaw: one column of individual drop diameters.
	ShapeRaw Shape = "raw"
)

// Import is the result of reading a measured size table.
type Import struct {
	Shape        Shape
	Separator    string // ",", ";", "\t", or "" for a single column
	DecimalComma bool   // numbers are written 12,5
	Unit         string // diameter unit as found: "µm", "mm", "m", "nm"
	Basis        Basis  // basis of the fractions (volume for raw lists and cumulative tables)
	Header       []string
	Rows         int        // data rows read
	Preview      [][]string // the first PreviewRows lines, header included, split into cells
	Warnings     []string
	Binned       *Binned
	// RawCount is the number of drops of a raw list, and Raw their exact
	// statistics (RawMeans); zero and nil for other shapes.
	RawCount int
	Raw      *Summary
}

// PreviewRows is how many lines Import.Preview keeps.
const PreviewRows = 10

// maxRawBins caps the classes made from a raw list.
const maxRawBins = 100

// unitFactors maps header unit spellings to metres.
var unitFactors = map[string]float64{
	"µm": 1e-6, "μm": 1e-6, "um": 1e-6, "micron": 1e-6, "microns": 1e-6,
	"micrometre": 1e-6, "micrometer": 1e-6, "micrometres": 1e-6, "micrometers": 1e-6,
	"mm": 1e-3, "m": 1, "nm": 1e-9,
}

// Diameters outside [minDiameter, maxDiameter] m are rejected on import as
// a wrong unit or a typo (project limits: no spray drop is below 1 nm or
// above 1 m).
const (
	minDiameter = 1e-9
	maxDiameter = 1.0
)

// checkDiameter rejects a diameter (m) outside the plausible range.
func checkDiameter(d, factor float64, l line, what string) error {
	if d < minDiameter || d > maxDiameter {
		return fileError("line %d: %s %s is outside 1 nm to 1 m; check the unit", l.no, what, fmtUnit(d, factor))
	}
	return nil
}

// unitNames gives the unit as reported in Import.Unit.
var unitNames = map[float64]string{1e-6: "µm", 1e-3: "mm", 1: "m", 1e-9: "nm"}

func fileError(format string, args ...any) *valid.FieldError {
	return &valid.FieldError{Field: "file", Message: fmt.Sprintf(format, args...)}
}

// ImportCSV reads a measured droplet-size table of at most maxBytes bytes.
// It detects the separator (tab, semicolon or comma), a decimal comma, a
// UTF-8 byte-order mark, a header line and the diameter unit written in the
// header (µm, um, micron, mm, m, nm; an unknown unit is an error; no unit
// means µm, with a warning). Lines starting with # are comments. Three
// layouts are accepted (docs/methods-sizedist.md shows examples):
//
//   - bins: lower and upper edge columns, or one edges column, with a percent
//     or fraction per class; header words say the basis (volume, mass,
//     number, count, surface; volume with a warning if none);
//   - cumulative: a diameter column and a cumulative percent undersize
//     column (header word cum, cumulative, undersize or passing);
//   - raw: one column of individual drop diameters, up to millions of rows.
//
// Every error is a *valid.FieldError with Field "file" whose message names
// the line; nothing is returned with an error.
func ImportCSV(r io.Reader, maxBytes int64) (*Import, error) {
	if maxBytes <= 0 {
		return nil, fileError("the size limit must be above zero bytes")
	}
	data, err := io.ReadAll(io.LimitReader(r, maxBytes+1))
	if err != nil {
		return nil, fileError("cannot read the file: %v", err)
	}
	if int64(len(data)) > maxBytes {
		return nil, fileError("the file is larger than the limit of %d bytes", maxBytes)
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	p := &parser{data: data}
	return p.run()
}

// line is one non-blank, non-comment line and its 1-based number.
type line struct {
	no   int
	text []byte
}

type parser struct {
	data  []byte
	pos   int // read position in data
	lineN int // number of the last line read
	imp   Import
	sep   byte
}

// next returns the next non-blank, non-comment line.
func (p *parser) next() (line, bool) {
	for p.pos < len(p.data) {
		end := bytes.IndexByte(p.data[p.pos:], '\n')
		var t []byte
		if end < 0 {
			t = p.data[p.pos:]
			p.pos = len(p.data)
		} else {
			t = p.data[p.pos : p.pos+end]
			p.pos += end + 1
		}
		p.lineN++
		t = bytes.TrimRight(t, "\r")
		// A lone CR as the line break (old spreadsheet exports) is not
		// supported; such a file reads as one long line and fails clearly.
		tt := bytes.TrimSpace(t)
		if len(tt) == 0 || tt[0] == '#' {
			continue
		}
		return line{no: p.lineN, text: t}, true
	}
	return line{}, false
}

// split cuts a line at the separator and trims spaces and quotes.
func (p *parser) split(t []byte) [][]byte {
	var cells [][]byte
	if p.sep == 0 {
		cells = [][]byte{t}
	} else {
		cells = bytes.Split(t, []byte{p.sep})
	}
	for i, c := range cells {
		cells[i] = trimCell(c)
	}
	// Trailing empty cells come from trailing separators.
	for len(cells) > 1 && len(cells[len(cells)-1]) == 0 {
		cells = cells[:len(cells)-1]
	}
	return cells
}

func trimCell(c []byte) []byte {
	c = bytes.TrimSpace(c)
	if len(c) >= 2 && c[0] == '"' && c[len(c)-1] == '"' {
		c = bytes.TrimSpace(c[1 : len(c)-1])
	}
	return c
}

// number parses one cell; ok is false for anything but a finite number.
func (p *parser) number(c []byte) (float64, bool) {
	var buf [64]byte
	if p.imp.DecimalComma {
		if len(c) > len(buf) {
			return 0, false
		}
		n := copy(buf[:], c)
		for i := range n {
			switch buf[i] {
			case ',':
				buf[i] = '.'
			case '.':
				return 0, false // a point in a decimal-comma file is a thousands mark or a typo
			}
		}
		c = buf[:n]
	}
	v, err := strconv.ParseFloat(string(c), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, false
	}
	return v, true
}

// sniffLines is how many lines the separator and header detection look at.
const sniffLines = 20

func (p *parser) run() (*Import, error) {
	var sample []line
	for len(sample) < sniffLines {
		l, ok := p.next()
		if !ok {
			break
		}
		sample = append(sample, l)
	}
	if len(sample) == 0 {
		return nil, fileError("the file is empty")
	}
	if err := p.detectSeparator(sample); err != nil {
		return nil, err
	}
	for i, l := range sample {
		if i == PreviewRows {
			break
		}
		cells := p.split(l.text)
		row := make([]string, len(cells))
		for j, c := range cells {
			row[j] = string(c)
		}
		p.imp.Preview = append(p.imp.Preview, row)
	}
	first := p.split(sample[0].text)
	hasHeader := false
	for _, c := range first {
		if _, ok := p.number(c); !ok && len(c) > 0 {
			if _, ok := parseWithComma(c); !ok {
				hasHeader = true
			}
		}
	}
	data := sample
	if hasHeader {
		for _, c := range first {
			p.imp.Header = append(p.imp.Header, string(c))
		}
		data = sample[1:]
	}
	p.detectDecimalComma(data)
	ncols := len(first)
	if len(p.imp.Header) > 0 {
		return p.byHeader(data)
	}
	switch ncols {
	case 1:
		return p.raw(data, 1e-6, true)
	case 2:
		return p.cumulative(data, 0, 1, 1e-6, true)
	case 3:
		return p.bins(data, binColumns{lower: 0, upper: 1, frac: 2, edges: -1}, 1e-6, BasisVolume, false, true)
	}
	return nil, fileError("line %d: %d columns and no header; without a header a file needs 1 column (drop diameters), 2 (diameter, cumulative %%) or 3 (lower edge, upper edge, %%)", sample[0].no, ncols)
}

// parseWithComma reports whether a cell is a decimal-comma number, so a
// first line like "12,5" is not taken as a header.
func parseWithComma(c []byte) (float64, bool) {
	if bytes.IndexByte(c, ',') < 0 || bytes.IndexByte(c, '.') >= 0 {
		return 0, false
	}
	v, err := strconv.ParseFloat(strings.ReplaceAll(string(c), ",", "."), 64)
	return v, err == nil && !math.IsNaN(v) && !math.IsInf(v, 0)
}

// detectSeparator takes the first of tab, semicolon and comma that occurs
// the same non-zero number of times on every sampled line. A comma that
// occurs at most once per data line but not in the header is a decimal
// comma in a single column.
func (p *parser) detectSeparator(sample []line) error {
	for _, s := range []byte{'\t', ';', ','} {
		n0 := bytes.Count(sample[0].text, []byte{s})
		if n0 == 0 {
			continue
		}
		same := true
		for _, l := range sample[1:] {
			if bytes.Count(l.text, []byte{s}) != n0 {
				same = false
				break
			}
		}
		if same {
			p.sep = s
			p.imp.Separator = string(s)
			return nil
		}
	}
	// No consistent separator: a single column, unless separators occur
	// inconsistently in a way a single column cannot explain.
	for _, l := range sample {
		if bytes.IndexByte(l.text, '\t') >= 0 || bytes.IndexByte(l.text, ';') >= 0 || bytes.Count(l.text, []byte{','}) > 1 {
			return fileError("line %d: cannot tell the column separator: the lines have different numbers of tabs, semicolons or commas", l.no)
		}
	}
	return nil
}

// detectDecimalComma decides from the sampled data lines whether numbers
// use a decimal comma (never when the comma separates columns).
func (p *parser) detectDecimalComma(data []line) {
	if p.sep == ',' {
		return
	}
	for _, l := range data {
		if bytes.IndexByte(l.text, ',') >= 0 {
			p.imp.DecimalComma = true
			return
		}
	}
}

// words splits a header cell into lower-case words of letters (µ and the
// Greek mu count as letters), with the text inside brackets returned apart
// as the unit.
func words(cell string) (ws []string, unit string, hasUnit bool) {
	if !utf8.ValidString(cell) {
		cell = latin1ToUTF8(cell) // "µm" written by a Latin-1 spreadsheet
	}
	cell = strings.ToLower(cell)
	for _, br := range [][2]string{{"(", ")"}, {"[", "]"}, {"{", "}"}} {
		if i := strings.Index(cell, br[0]); i >= 0 {
			if j := strings.Index(cell[i:], br[1]); j > 0 {
				unit, hasUnit = strings.TrimSpace(cell[i+1:i+j]), true
				cell = cell[:i] + " " + cell[i+j+1:]
				break
			}
		}
	}
	ws = strings.FieldsFunc(cell, func(r rune) bool { return !unicode.IsLetter(r) && r != '%' })
	return ws, unit, hasUnit
}

// latin1ToUTF8 reads each byte as a Latin-1 code point.
func latin1ToUTF8(s string) string {
	r := make([]rune, len(s))
	for i := range len(s) {
		r[i] = rune(s[i])
	}
	return string(r)
}

func hasWord(ws []string, any ...string) bool {
	for _, w := range ws {
		for _, a := range any {
			if w == a || (len(a) > 3 && strings.HasPrefix(w, a)) {
				return true
			}
		}
	}
	return false
}

// column roles found from header words.
const (
	roleNone = iota
	roleLower
	roleUpper
	roleEdge
	roleCumulative
	roleOversize
	roleFraction
	roleDiameter
)

type headerColumn struct {
	role       int
	factor     float64 // unit factor to m for diameter roles
	unitGiven  bool
	basis      Basis
	basisGiven bool
	counts     bool
	name       string
}

func classify(cell string) (headerColumn, error) {
	ws, unit, hasUnit := words(cell)
	h := headerColumn{name: cell, factor: 1e-6}
	switch {
	case hasWord(ws, "lower", "low", "from", "min", "start", "bottom"):
		h.role = roleLower
	case hasWord(ws, "upper", "high", "to", "max", "end", "top"):
		h.role = roleUpper
	case hasWord(ws, "edge", "edges", "bound", "boundary", "limit"):
		h.role = roleEdge
	case hasWord(ws, "oversize", "retained", "above"):
		h.role = roleOversize
	case hasWord(ws, "cum", "cumulative", "undersize", "passing", "below"):
		h.role = roleCumulative
	case hasWord(ws, "%", "percent", "fraction", "frac", "share", "freq", "frequency", "count", "counts", "number", "volume", "vol", "mass", "weight", "surface", "area", "pct"):
		h.role = roleFraction
	case hasWord(ws, "diameter", "diam", "dia", "d", "size", "x", "drop", "droplet", "class"):
		h.role = roleDiameter
	case unit == "%":
		h.role = roleFraction
	}
	switch {
	case hasWord(ws, "count", "counts", "number", "num", "n"):
		h.basis, h.basisGiven = BasisNumber, true
		h.counts = hasWord(ws, "count", "counts") && !hasWord(ws, "%", "percent", "fraction", "frac") && unit != "%"
	case hasWord(ws, "surface", "area"):
		h.basis, h.basisGiven = BasisSurface, true
	case hasWord(ws, "volume", "vol", "mass", "weight", "v"):
		h.basis, h.basisGiven = BasisVolume, true
	}
	if h.role == roleLower || h.role == roleUpper || h.role == roleEdge || h.role == roleDiameter {
		// A unit in brackets, or a last word naming one ("d_um", "size mm").
		if !hasUnit && len(ws) > 1 {
			if _, ok := unitFactors[ws[len(ws)-1]]; ok {
				unit, hasUnit = ws[len(ws)-1], true
			}
		}
		if hasUnit {
			f, ok := unitFactors[strings.TrimSpace(unit)]
			if !ok {
				return h, fileError("unknown diameter unit %q in header column %q; use µm, um, micron, mm or m", unit, cell)
			}
			h.factor, h.unitGiven = f, true
		}
	}
	return h, nil
}

func (p *parser) byHeader(data []line) (*Import, error) {
	cols := make([]headerColumn, len(p.imp.Header))
	find := map[int]int{}
	for i, cell := range p.imp.Header {
		h, err := classify(cell)
		if err != nil {
			return nil, err
		}
		cols[i] = h
		if _, dup := find[h.role]; !dup && h.role != roleNone {
			find[h.role] = i
		}
	}
	col := func(role int) (int, bool) { i, ok := find[role]; return i, ok }
	unitOf := func(i int) float64 {
		if !cols[i].unitGiven {
			p.imp.Warnings = append(p.imp.Warnings, fmt.Sprintf("column %q names no unit; diameters taken as µm", cols[i].name))
		}
		return cols[i].factor
	}
	if i, ok := col(roleOversize); ok {
		return nil, fileError("column %q holds cumulative oversize; give cumulative percent undersize (100 − oversize) instead", cols[i].name)
	}
	lo, okLo := col(roleLower)
	hi, okHi := col(roleUpper)
	fr, okFr := col(roleFraction)
	if okLo && okHi && okFr {
		if cols[lo].factor != cols[hi].factor {
			return nil, fileError("the lower and upper edge columns use different units")
		}
		unitOf(hi)
		return p.bins(data, binColumns{lower: lo, upper: hi, frac: fr, edges: -1}, cols[lo].factor, p.basisOf(cols[fr]), cols[fr].counts, false)
	}
	if e, ok := col(roleEdge); ok && okFr {
		return p.bins(data, binColumns{lower: -1, upper: -1, frac: fr, edges: e}, unitOf(e), p.basisOf(cols[fr]), cols[fr].counts, false)
	}
	if c, ok := col(roleCumulative); ok {
		d, okD := col(roleDiameter)
		if !okD {
			// "Upper size" or "size" columns with cumulative data.
			if okHi {
				d, okD = hi, true
			} else if e, ok := col(roleEdge); ok {
				d, okD = e, true
			}
		}
		if okD {
			if cols[c].basisGiven && cols[c].basis != BasisVolume {
				return nil, fileError("column %q: cumulative tables must be on a volume basis", cols[c].name)
			}
			return p.cumulative(data, d, c, unitOf(d), false)
		}
	}
	if len(cols) == 1 {
		if cols[0].role == roleFraction || cols[0].role == roleCumulative {
			return nil, fileError("the only column %q holds fractions, not diameters", cols[0].name)
		}
		return p.raw(data, unitOf(0), false)
	}
	return nil, fileError("cannot tell the layout from the header %q: give lower and upper edge columns (or an edges column) with a %% column, a diameter column with a cumulative undersize column, or a single column of drop diameters", strings.Join(p.imp.Header, p.imp.Separator))
}

func (p *parser) basisOf(h headerColumn) Basis {
	if !h.basisGiven {
		p.imp.Warnings = append(p.imp.Warnings, fmt.Sprintf("column %q does not say number or volume; taken as volume", h.name))
		return BasisVolume
	}
	return h.basis
}

// rows yields the sampled data lines and then the rest of the file.
func (p *parser) rows(data []line, fn func(l line) error) error {
	for _, l := range data {
		if err := fn(l); err != nil {
			return err
		}
	}
	for {
		l, ok := p.next()
		if !ok {
			return nil
		}
		if err := fn(l); err != nil {
			return err
		}
	}
}

// cell returns column i of a split line, or an error naming the line.
func (p *parser) cellNumber(cells [][]byte, i int, l line, what string) (float64, error) {
	if i >= len(cells) || len(cells[i]) == 0 {
		return 0, fileError("line %d: the %s is missing", l.no, what)
	}
	v, ok := p.number(cells[i])
	if !ok {
		return 0, fileError("line %d: %s %q is not a number", l.no, what, cells[i])
	}
	return v, nil
}

type binColumns struct{ lower, upper, frac, edges int }

func (p *parser) bins(data []line, c binColumns, factor float64, basis Basis, counts, guessed bool) (*Import, error) {
	p.imp.Shape, p.imp.Basis = ShapeBins, basis
	p.setUnit(factor)
	if guessed {
		p.imp.Warnings = append(p.imp.Warnings, "no header: columns read as lower edge, upper edge and volume % in µm")
	}
	var lows, highs, frac []float64
	var lines []int
	emptyFrac := -1
	err := p.rows(data, func(l line) error {
		cells := p.split(l.text)
		p.imp.Rows++
		if c.edges >= 0 {
			e, err := p.cellNumber(cells, c.edges, l, "edge")
			if err != nil {
				return err
			}
			if err := checkDiameter(e*factor, factor, l, "edge"); err != nil {
				return err
			}
			lows = append(lows, e*factor)
			lines = append(lines, l.no)
			if c.frac >= len(cells) || len(cells[c.frac]) == 0 {
				if emptyFrac >= 0 {
					return fileError("line %d: a second row without a fraction; an edges column needs exactly one (the first or the last row)", l.no)
				}
				emptyFrac = len(lows) - 1
				frac = append(frac, 0)
				return nil
			}
		} else {
			a, err := p.cellNumber(cells, c.lower, l, "lower edge")
			if err != nil {
				return err
			}
			b, err := p.cellNumber(cells, c.upper, l, "upper edge")
			if err != nil {
				return err
			}
			if err := checkDiameter(a*factor, factor, l, "lower edge"); err != nil {
				return err
			}
			if err := checkDiameter(b*factor, factor, l, "upper edge"); err != nil {
				return err
			}
			lows, highs, lines = append(lows, a*factor), append(highs, b*factor), append(lines, l.no)
		}
		f, err := p.cellNumber(cells, c.frac, l, "fraction")
		if err != nil {
			return err
		}
		if f < 0 {
			return fileError("line %d: fraction %s is negative", l.no, valid.FormatValue(f))
		}
		frac = append(frac, f)
		return nil
	})
	if err != nil {
		return nil, err
	}
	var edges []float64
	if c.edges >= 0 {
		switch {
		case len(lows) < 3:
			return nil, fileError("the file has %d edges; at least 3 (two classes) are needed", len(lows))
		case emptyFrac == 0:
			frac = frac[1:] // fractions belong to the upper edge of their class
		case emptyFrac == len(lows)-1:
			frac = frac[:len(frac)-1] // fractions belong to the lower edge
		default:
			return nil, fileError("an edges column needs n+1 edges and n fractions: leave the fraction of the first or the last row empty")
		}
		edges = lows
	} else {
		if len(lows) < 2 {
			return nil, fileError("the file has a single class; at least two are needed")
		}
		if lows[0] > lows[len(lows)-1] {
			reverse(lows)
			reverse(highs)
			reverse(frac)
			reverse(lines)
			p.imp.Warnings = append(p.imp.Warnings, "classes were listed from large to small and were reordered")
		}
		edges = append(edges, lows[0])
		for i := range lows {
			if !(highs[i] > lows[i]) {
				return nil, fileError("line %d: upper edge %s is not above lower edge %s", lines[i], fmtUnit(highs[i], factor), fmtUnit(lows[i], factor))
			}
			if i > 0 && math.Abs(lows[i]-highs[i-1]) > 1e-6*highs[i-1] {
				return nil, fileError("line %d: lower edge %s does not meet the previous upper edge %s; classes must be contiguous and ascending", lines[i], fmtUnit(lows[i], factor), fmtUnit(highs[i-1], factor))
			}
			edges = append(edges, highs[i])
		}
	}
	for i := 1; i < len(edges); i++ {
		if !(edges[i] > edges[i-1]) {
			return nil, fileError("edges are not monotonic: %s follows %s", fmtUnit(edges[i], factor), fmtUnit(edges[i-1], factor))
		}
	}
	if !(edges[0] > 0) {
		return nil, fileError("the smallest edge %s must be above zero", fmtUnit(edges[0], factor))
	}
	if counts {
		var s float64
		for _, f := range frac {
			s += f
		}
		if s > 0 {
			for i := range frac {
				frac[i] /= s
			}
		}
	}
	return p.finish(edges, frac, basis)
}

func (p *parser) cumulative(data []line, dcol, ccol int, factor float64, guessed bool) (*Import, error) {
	p.imp.Shape, p.imp.Basis = ShapeCumulative, BasisVolume
	p.setUnit(factor)
	if guessed {
		p.imp.Warnings = append(p.imp.Warnings, "no header: columns read as diameter (µm) and cumulative volume % undersize")
	}
	var d, cum []float64
	var lines []int
	err := p.rows(data, func(l line) error {
		cells := p.split(l.text)
		p.imp.Rows++
		x, err := p.cellNumber(cells, dcol, l, "diameter")
		if err != nil {
			return err
		}
		c, err := p.cellNumber(cells, ccol, l, "cumulative percentage")
		if err != nil {
			return err
		}
		if c < 0 {
			return fileError("line %d: cumulative percentage %s is negative", l.no, valid.FormatValue(c))
		}
		if err := checkDiameter(x*factor, factor, l, "diameter"); err != nil {
			return err
		}
		d, cum, lines = append(d, x*factor), append(cum, c), append(lines, l.no)
		return nil
	})
	if err != nil {
		return nil, err
	}
	if len(d) < 3 {
		return nil, fileError("the file has %d diameters; at least 3 (two classes) are needed", len(d))
	}
	if d[0] > d[len(d)-1] {
		reverse(d)
		reverse(cum)
		reverse(lines)
		p.imp.Warnings = append(p.imp.Warnings, "diameters were listed from large to small and were reordered")
	}
	if !(d[0] > 0) {
		return nil, fileError("line %d: diameter %s must be above zero", lines[0], fmtUnit(d[0], factor))
	}
	for i := 1; i < len(d); i++ {
		if !(d[i] > d[i-1]) {
			return nil, fileError("line %d: diameters are not monotonic: %s follows %s", lines[i], fmtUnit(d[i], factor), fmtUnit(d[i-1], factor))
		}
		if cum[i] < cum[i-1] {
			return nil, fileError("line %d: cumulative percentage falls from %s to %s; it must not decrease with diameter", lines[i], valid.FormatValue(cum[i-1]), valid.FormatValue(cum[i]))
		}
	}
	frac := make([]float64, len(d)-1)
	for i := range frac {
		frac[i] = cum[i+1] - cum[i]
	}
	if cum[0] > 0 {
		frac[0] += cum[0]
		p.imp.Warnings = append(p.imp.Warnings, fmt.Sprintf("%s of the volume lies below the smallest diameter; it was put into the first class", valid.FormatValue(cum[0])))
	}
	return p.finish(d, frac, BasisVolume)
}

func (p *parser) raw(data []line, factor float64, guessed bool) (*Import, error) {
	p.imp.Shape, p.imp.Basis = ShapeRaw, BasisVolume
	p.setUnit(factor)
	if guessed {
		p.imp.Warnings = append(p.imp.Warnings, "no header: the column is read as drop diameters in µm")
	}
	d := make([]float64, 0, len(p.data)/8)
	parse := func(l line) error {
		t := l.text
		if p.sep != 0 {
			if i := bytes.IndexByte(t, p.sep); i >= 0 {
				t = t[:i]
			}
		}
		t = trimCell(t)
		v, ok := p.number(t)
		if !ok {
			return fileError("line %d: %q is not a diameter", l.no, t)
		}
		if v <= 0 {
			return fileError("line %d: diameter %s must be above zero", l.no, valid.FormatValue(v))
		}
		if err := checkDiameter(v*factor, factor, l, "diameter"); err != nil {
			return err
		}
		d = append(d, v*factor)
		return nil
	}
	if err := p.rows(data, parse); err != nil {
		return nil, err
	}
	p.imp.Rows = len(d)
	if len(d) < 2 {
		return nil, fileError("the file lists %d drop diameters; at least 2 are needed", len(d))
	}
	bins := int(math.Round(2 * math.Cbrt(float64(len(d)))))
	bins = max(MinBins, min(maxRawBins, bins))
	b, err := FromDiameters(d, bins)
	if err != nil {
		return nil, fileError("%s", err.Error())
	}
	raw := RawMeans(d)
	p.imp.RawCount, p.imp.Raw, p.imp.Binned = len(d), &raw, b
	p.imp.Warnings = append(p.imp.Warnings, b.Warnings...)
	return &p.imp, nil
}

// finish turns edges (m) and class fractions into Binned, mapping field
// errors to the file.
func (p *parser) finish(edges, frac []float64, basis Basis) (*Import, error) {
	b, err := FromFractions(edges, frac, basis)
	if err != nil {
		var fe *valid.FieldError
		if errors.As(err, &fe) {
			return nil, fileError("%s", fe.Message)
		}
		return nil, fileError("%v", err)
	}
	p.imp.Binned = b
	p.imp.Warnings = append(p.imp.Warnings, b.Warnings...)
	return &p.imp, nil
}

func (p *parser) setUnit(factor float64) { p.imp.Unit = unitNames[factor] }

// fmtUnit prints a diameter in the file's unit.
func fmtUnit(d, factor float64) string {
	return valid.FormatValue(d/factor) + " " + unitNames[factor]
}

func reverse[T any](x []T) {
	for i, j := 0, len(x)-1; i < j; i, j = i+1, j-1 {
		x[i], x[j] = x[j], x[i]
	}
}
