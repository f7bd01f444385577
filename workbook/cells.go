package workbook

import (
	"bufio"
	"bytes"
	"fmt"
	"regexp"
	"strconv"
	"strings"
)

// cellData is one cell of a sheet as read.
type cellData struct {
	col     int    // 0-based
	typ     string // the t attribute
	v       string // <v>, unescaped
	is      string // the text of <is>
	f       string // formula text; "" for a shared formula's follower
	hasF    bool
	content bool // holds a value, a formula or inline text
}

// cellParser reads cells; it keeps its scanner and buffer from cell to
// cell.
type cellParser struct {
	br bytes.Reader
	sc *scanner
}

// parse reads a whole <c> element (raw, from its start tag to its end
// tag, or one empty tag). col is the column it has when it names none: one
// after the cell before it.
func (cp *cellParser) parse(raw []byte, col int) (cellData, error) {
	c := cellData{col: col}
	cp.br.Reset(raw)
	if cp.sc == nil {
		cp.sc = &scanner{r: bufio.NewReaderSize(&cp.br, 4096)}
	} else {
		cp.sc.r.Reset(&cp.br)
	}
	sc := cp.sc
	first, err := sc.next()
	if err != nil {
		return c, err
	}
	if ref, ok := attr(first.raw, "r"); ok {
		cc, _, ok := splitRef(ref)
		if !ok {
			return c, fmt.Errorf("cell reference %q", ref)
		}
		c.col = cc
	}
	c.typ, _ = attr(first.raw, "t")
	if first.kind == tokEmpty {
		return c, nil
	}
	var in string // the child element whose text is read
	inPhonetic := false
	var text []byte
	for {
		t, err := sc.next()
		if err != nil {
			return c, nil // the end tag of the cell was the last token
		}
		switch t.kind {
		case tokStart:
			switch string(t.name()) {
			case "v", "f":
				in = string(t.name())
				text = text[:0]
				if in == "f" {
					c.hasF = true
				}
			case "t":
				if !inPhonetic {
					in = "t"
					text = text[:0]
				}
			case "rPh":
				inPhonetic = true
			case "is":
				c.content = true
			}
		case tokEmpty:
			switch string(t.name()) {
			case "f":
				c.hasF, c.content = true, true
			}
		case tokText:
			if in != "" {
				if bytes.HasPrefix(t.raw, []byte("<![CDATA[")) {
					text = append(text, t.raw[9:len(t.raw)-3]...)
				} else {
					text = append(text, unescape(t.raw)...)
				}
			}
		case tokEnd:
			switch string(t.name()) {
			case "v":
				c.v, c.content = string(text), true
			case "f":
				c.f, c.content = string(text), true
			case "t":
				if in == "t" {
					c.is += string(text)
				}
			case "rPh":
				inPhonetic = false
			}
			in = ""
		}
	}
}

// splitRef splits a cell reference "AB12" into a 0-based column and a row.
func splitRef(ref string) (col, row int, ok bool) {
	i := 0
	col = 0
	for i < len(ref) {
		c := ref[i] | 0x20
		if c < 'a' || c > 'z' {
			break
		}
		col = col*26 + int(c-'a'+1)
		i++
		if col > 16384 {
			return 0, 0, false
		}
	}
	if i == 0 {
		return 0, 0, false
	}
	row, err := strconv.Atoi(strings.TrimPrefix(ref[i:], "$"))
	if i == len(ref) {
		return col - 1, 0, true
	}
	return col - 1, row, err == nil && row > 0
}

// rangeMaxCol returns the last 0-based column of a range "A1:C5" (or a
// cell), or -1.
func rangeMaxCol(ref string) int {
	best := -1
	for _, part := range strings.Split(strings.ReplaceAll(ref, "$", ""), ":") {
		if c, _, ok := splitRef(part); ok && c > best {
			best = c
		}
	}
	return best
}

// aggregateRE matches a formula that is one aggregate over a range of one
// column: SUM(C3:C20), AVERAGE(C$3:C$20), _xlfn.MAX(C3:C20).
var aggregateRE = regexp.MustCompile(`(?i)^\s*=?\s*(?:_xlfn\.)?(AVERAGE|SUM|MIN|MAX)\(\s*\$?([A-Z]{1,3})\$?\d+\s*:\s*\$?([A-Z]{1,3})\$?\d+\s*\)\s*$`)

// aggregateOf returns the aggregate a formula in column col computes over
// that column ("AVERAGE"), or "".
func aggregateOf(formula string, col int) string {
	m := aggregateRE.FindStringSubmatch(formula)
	if m == nil || !strings.EqualFold(m[2], m[3]) || !strings.EqualFold(m[2], colLetter(col)) {
		return ""
	}
	return strings.ToUpper(m[1])
}

func joinWith(a, sep, b string) string {
	if a == "" {
		return b
	}
	return a + sep + b
}
