package server

import (
	"strconv"
	"sync"

	"github.com/gin-gonic/gin"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// bufPool holds answer buffers, so that a busy /state does not allocate
// one per request.
var bufPool = sync.Pool{New: func() any { b := make([]byte, 0, 2048); return &b }}

func getBuf() *[]byte { return bufPool.Get().(*[]byte) }

func putBuf(b *[]byte) {
	if cap(*b) <= 64<<10 {
		*b = (*b)[:0]
		bufPool.Put(b)
	}
}

// Header values shared by every answer that sends them; a literal slice
// has no spare capacity, so a later Header().Add copies rather than
// changes it.
var (
	cautionHeader = []string{Caution}
	jsonType      = []string{"application/json; charset=utf-8"}
	textType      = []string{"text/plain; charset=utf-8"}
	csvType       = []string{"text/csv; charset=utf-8"}
)

// writeBody sends a whole answer with its status and media type; net/http
// adds the Content-Length.
func writeBody(c *gin.Context, status int, ctype []string, body []byte) {
	c.Writer.Header()["Content-Type"] = ctype
	// Stated, so that a HEAD answer gives the GET's length for any size
	// (net/http counts a body itself only when it fits one small write).
	c.Writer.Header()["Content-Length"] = []string{strconv.Itoa(len(body))}
	c.Writer.WriteHeader(status)
	_, _ = c.Writer.Write(body)
}

// appendJSONString writes s as a JSON string; invalid UTF-8 becomes U+FFFD.
func appendJSONString(b []byte, s string) []byte { return point.AppendJSONString(b, s) }

// appendNumber writes v in the shortest form that reads back to the same
// float64 ("2797.6", "1.5e-05"), which spreadsheets read as a number.
func appendNumber(b []byte, v float64) []byte { return point.AppendNumber(b, v) }

// fieldHeader returns the CSV header cell of property sym in set: "h [kJ/kg]",
// or "x" for a pure number, the form workbook column headers take.
func fieldHeader(sym string, set units.Set) string {
	p, _ := point.Lookup(sym)
	if u := p.Unit(set); u != "" {
		return p.Symbol + " [" + u + "]"
	}
	return p.Symbol
}

// answerHeader appends the CSV header cells of answers with properties
// syms: phase, region, the properties, warnings.
func answerHeader(dst []string, syms []string, set units.Set) []string {
	dst = append(dst, "phase", "region")
	for _, sym := range syms {
		dst = append(dst, fieldHeader(sym, set))
	}
	return append(dst, "warnings")
}

// emptyAnswerCells appends empty cells in place of an answer (a row that
// failed).
func emptyAnswerCells(dst []string, syms []string) []string {
	for range len(syms) + 3 {
		dst = append(dst, "")
	}
	return dst
}

// appendAnswerCSV writes one answer as a header line and a value line.
func appendAnswerCSV(b []byte, a *point.Answer, syms []string, set units.Set) []byte {
	b = appendCSVRow(b, answerHeader(nil, syms, set), ',')
	return append(a.AppendCSV(b, ','), '\n')
}
