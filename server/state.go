package server

import (
	"net/http"
	"strconv"
	"strings"

	"github.com/gin-gonic/gin"

	"steamcell/fn"
	"steamcell/fn/point"
)

// getState answers one state fixed by two inputs: every property (or
// those of get=) as one flat JSON object, or with format=csv as a header
// line and a value line.
//
// GET /state
func (s *Server) getState(c *gin.Context) {
	raw := c.Request.URL.RawQuery
	var uq uncertaintyQuery
	if mayCarryUncertainty(raw) {
		var err error
		if uq, err = readUncertainty(raw, false); err != nil {
			s.fail(c, err)
			return
		}
		raw = uq.rest
	}
	req, err := s.readRequest(raw, takesInputs|takesGet|takesFormat)
	if err != nil {
		s.fail(c, err)
		return
	}
	m, err := point.SolveMeasured(req.given, req.opt, uq.uo)
	if err != nil {
		s.fail(c, err)
		return
	}
	st, in := &m.State.State, m.Inputs
	syms := req.syms
	if syms == nil {
		syms = point.DefaultSymbols()
	}
	ans := point.Render(st, syms, req.opt)
	if m.Given {
		s.writeMeasured(c, &m, &ans, syms, req, uq.uo)
		return
	}
	if req.format == "csv" {
		writeBody(c, http.StatusOK, csvType, appendAnswerCSV(nil, &ans, syms, req.opt.Set))
		return
	}
	buf := getBuf()
	defer putBuf(buf)
	*buf = ans.AppendJSON(*buf, point.Inputs(in, req.opt), Caution)
	*buf = append(*buf, '\n')
	writeBody(c, http.StatusOK, jsonType, *buf)
}

// getStateProperty answers one property of one state as a bare number in
// text/plain (in the units of units= and unit_…=), so that a spreadsheet
// formula can use the body as a value. "phase" and "region" answer the
// phase in words and the IF97 region. Errors are one line of text with a
// non-200 status, which spreadsheets show as an error in the cell. With ±
// on the inputs, u(SYM) answers a property's standard uncertainty and
// U(SYM) (with k=) its expanded uncertainty.
//
// GET /state/{property}
func (s *Server) getStateProperty(c *gin.Context) {
	prop := c.Param("property")
	if _, inner := uncertaintyOf(prop); inner != "" || mayCarryUncertainty(c.Request.URL.RawQuery) {
		s.getStateMeasured(c, prop)
		return
	}
	req, err := s.readRequest(c.Request.URL.RawQuery, takesInputs)
	if err != nil {
		s.failText(c, err)
		return
	}
	var syms []string
	word := strings.ToLower(prop)
	if word != "phase" && word != "region" {
		if strings.EqualFold(prop, "all") || strings.Contains(prop, ",") {
			s.failText(c, &point.Error{Param: clean(prop, 40), Kind: point.ErrUnknownProperty,
				Msg: "/state/{property} answers one property, e.g. /state/h; use /state?get=h,s for several"})
			return
		}
		if syms, err = point.Symbols([]string{prop}); err != nil {
			s.failText(c, err)
			return
		}
	}
	st, _, err := point.Solve(req.given, req.opt)
	if err != nil {
		s.failText(c, err)
		return
	}
	ans := point.Render(&st, syms, req.opt)
	if len(ans.Warnings) > 0 {
		c.Header("Steamcell-Warning", headerText(strings.Join(ans.Warnings, "; ")))
	}
	buf := getBuf()
	defer putBuf(buf)
	switch word {
	case "phase":
		*buf = append(*buf, ans.Phase...)
	case "region":
		*buf = strconv.AppendInt(*buf, int64(ans.Region), 10)
	default:
		f, err := ans.Value(syms[0])
		if err != nil {
			s.failText(c, err)
			return
		}
		*buf = appendNumber(*buf, f.Value)
	}
	writeBody(c, http.StatusOK, textType, *buf)
}

// getStateStatus answers, as one line of text with status 200, whether
// the inputs fix a state and how safely: "ok"; "check: " and the warnings
// (within 0.5 K of saturation, say, where a small error in p or T changes
// the phase); or "error: " and the reason the state cannot be given. A
// cell beside a /state/{property} cell, which shows only #VALUE! for a
// refusal, can so show why. Only a fault of the server is answered with an
// error status (500).
//
// GET /state/status
func (s *Server) getStateStatus(c *gin.Context) {
	req, err := s.readRequest(c.Request.URL.RawQuery, takesInputs)
	var st fn.State
	if err == nil {
		st, _, err = point.Solve(req.given, req.opt)
	}
	buf := getBuf()
	defer putBuf(buf)
	switch {
	case err != nil:
		p := classify(err)
		if p.Code == internalCode {
			s.failText(c, err)
			return
		}
		*buf = append(append(*buf, "error: "...), p.Msg...)
	default:
		ans := point.Render(&st, []string{}, req.opt)
		if len(ans.Warnings) == 0 {
			*buf = append(*buf, "ok"...)
			break
		}
		w := strings.Join(ans.Warnings, "; ")
		c.Header("Steamcell-Warning", headerText(w))
		*buf = append(append(*buf, "check: "...), clean(w, 600)...)
	}
	c.Header("Cache-Control", "no-store")
	writeBody(c, http.StatusOK, textType, *buf)
}

// headerText makes s a header value: printable ASCII, non-ASCII letters
// replaced ("°" by "deg"), at most 500 bytes.
func headerText(s string) string {
	s = strings.ReplaceAll(s, "°", "deg ")
	b := make([]byte, 0, len(s))
	for i := 0; i < len(s) && len(b) < 500; i++ {
		ch := s[i]
		switch {
		case ch >= 0x20 && ch < 0x7f:
			b = append(b, ch)
		case ch >= 0x80 && (ch&0xc0) == 0x80:
			// continuation byte of a replaced rune
		default:
			b = append(b, '?')
		}
	}
	return string(b)
}
