package server

import (
	"bufio"
	"io"
	"strconv"
	"strings"
)

// csvCell is one cell of a CSV export. Text is always quoted and guarded
// against spreadsheet formulas (csvText); a number is written bare so a
// spreadsheet reads it as a number (a leading minus sign of a number is
// not a formula).
type csvCell struct {
	s    string
	text bool
}

func textCell(s string) csvCell { return csvCell{s: s, text: true} }

func textCells(ss []string) []csvCell {
	out := make([]csvCell, len(ss))
	for i, s := range ss {
		out[i] = textCell(s)
	}
	return out
}

// csvNum writes a number at full precision.
func csvNum(v float64) csvCell { return csvCell{s: strconv.FormatFloat(v, 'g', -1, 64)} }

func csvInt(v int64) csvCell { return csvCell{s: strconv.FormatInt(v, 10)} }

// csvOpt writes *p·scale, or an empty cell when the value is absent.
func csvOpt(p *float64, scale float64) csvCell {
	if p == nil {
		return csvCell{}
	}
	return csvNum(*p * scale)
}

// csvSeparators are the characters a spreadsheet may split a line on when
// it guesses the format (comma, semicolon, tab, pipe) or a cell on when it
// ignores the quotes (line breaks).
const csvSeparators = ",;\t|\r\n"

// csvFormulaStarts are the characters that make a spreadsheet read a cell
// as a formula (OWASP, "CSV Injection").
const csvFormulaStarts = "=+-@\t\r"

// csvText guards a text cell against spreadsheet formulas: every piece of
// it between separators (csvSeparators) whose first character after any
// spaces starts a formula gets an apostrophe in front, so "a;=1+1" becomes
// "a;'=1+1" and stays text in a spreadsheet that splits on semicolons.
func csvText(s string) string {
	var b strings.Builder
	pieceStart := true
	for i := 0; i < len(s); i++ {
		c := s[i]
		if pieceStart {
			rest := strings.TrimLeft(s[i:], " ")
			if rest != "" && strings.IndexByte(csvFormulaStarts, rest[0]) >= 0 {
				b.WriteByte('\'')
			}
			pieceStart = false
		}
		b.WriteByte(c)
		if strings.IndexByte(csvSeparators, c) >= 0 {
			pieceStart = true
		}
	}
	return b.String()
}

// writeCSVRows writes RFC 4180 CSV: comma-separated, text cells quoted
// with inner quotes doubled, lines ended by "\n".
func writeCSVRows(w io.Writer, rows ...[]csvCell) error {
	bw := bufio.NewWriter(w)
	for _, row := range rows {
		for i, c := range row {
			if i > 0 {
				bw.WriteByte(',')
			}
			if !c.text {
				bw.WriteString(c.s)
				continue
			}
			bw.WriteByte('"')
			bw.WriteString(strings.ReplaceAll(csvText(c.s), `"`, `""`))
			bw.WriteByte('"')
		}
		bw.WriteByte('\n')
	}
	return bw.Flush()
}
