package server

import (
	"fmt"
	"net/http"
	"net/url"
	"strings"

	"github.com/gin-gonic/gin"

	"steamcell/fn/point"
	"steamcell/fn/process"
)

// uncertaintyQuery is what a query says about uncertainties, with the
// rest of the query for readRequest.
type uncertaintyQuery struct {
	rest   string // the query without the parameters below
	uo     point.UOptions
	inputs []point.Given // process inputs (p1, t1, m2, …), when asked for
}

// plusMinusEscapes are the spellings of "+-" and "+/-" in a raw query,
// where "+" would decode to a space; they are read as ± (U+00B1).
var plusMinusEscapes = strings.NewReplacer("+-", "%C2%B1", "+/-", "%C2%B1", "+%2F-", "%C2%B1", "+%2f-", "%C2%B1")

// readUncertainty takes convention= and k= (and, with processInputs, the
// numbered process inputs) out of a raw query, reading "+-" as ±.
func readUncertainty(raw string, processInputs bool) (uncertaintyQuery, error) {
	var q uncertaintyQuery
	params, err := parseQuery(plusMinusEscapes.Replace(raw))
	if err != nil {
		return q, err
	}
	var rest []string
	for _, p := range params {
		switch {
		case p.key == "convention":
			if q.uo.Convention, err = point.ParseConvention(p.value); err != nil {
				return q, err
			}
		case p.key == "k":
			if q.uo.K, err = point.ParseK(p.value); err != nil {
				return q, err
			}
		case processInputs && isProcessInput(p.key):
			q.inputs = append(q.inputs, point.Given{Name: p.name, Text: p.value})
		default:
			rest = append(rest, url.QueryEscape(p.name)+"="+url.QueryEscape(p.value))
		}
	}
	q.rest = strings.Join(rest, "&")
	return q, nil
}

// mayCarryUncertainty reports whether a raw query may hold a ± or an
// uncertainty option, so that /state reads it twice only then.
func mayCarryUncertainty(raw string) bool {
	l := strings.ToLower(raw)
	return strings.Contains(l, "%c2%b1") || strings.Contains(raw, "±") || strings.Contains(raw, "+-") ||
		strings.Contains(raw, "+/-") || strings.Contains(l, "+%2f-") || strings.Contains(l, "convention=") ||
		strings.HasPrefix(l, "k=") || strings.Contains(l, "&k=")
}

func isProcessInput(key string) bool {
	_, _, ok := process.ParseName(key)
	return ok
}

// getProcess answers the results of a process between numbered states,
// each with its standard uncertainty (and U = k·u with k=), as one JSON
// object, or with format=csv as a header line and a value line.
//
// GET /process/{kind}
func (s *Server) getProcess(c *gin.Context) {
	ans, format, err := s.runProcess(c)
	if err != nil {
		s.fail(c, err)
		return
	}
	if format == "csv" {
		b := appendCSVRow(nil, ans.Header(), ',')
		writeBody(c, http.StatusOK, csvType, appendCSVRow(b, ans.Cells(), ','))
		return
	}
	writeBody(c, http.StatusOK, jsonType, append(ans.AppendJSON(nil, Caution), '\n'))
}

// getProcessResult answers one result of a process as a bare number in
// text/plain, for a spreadsheet cell: /process/expansion/efficiency, or
// its standard uncertainty as /process/expansion/u(efficiency) and, with
// k=, its expanded uncertainty as U(efficiency).
//
// GET /process/{kind}/{result}
func (s *Server) getProcessResult(c *gin.Context) {
	ans, _, err := s.runProcess(c)
	if err != nil {
		s.failText(c, err)
		return
	}
	name := c.Param("result")
	which, inner := uncertaintyOf(name)
	if inner != "" {
		name = inner
	}
	r, err := ans.Result(name)
	if err != nil {
		s.failText(c, err)
		return
	}
	if which == "U" && ans.UOpt.K == 0 {
		s.failText(c, errorf(ErrBadQuery, "k", "U(%s) is the expanded uncertainty: give its coverage factor, e.g. k=2", clean(name, 40)))
		return
	}
	if len(ans.Warnings) > 0 {
		c.Header("Steamcell-Warning", headerText(strings.Join(ans.Warnings, "; ")))
	}
	v := r.Value
	switch which {
	case "u":
		v = r.U
	case "U":
		v = ans.UOpt.K * r.U
	}
	writeBody(c, http.StatusOK, textType, appendNumber(nil, v))
}

// runProcess reads a process request, runs it and returns the answer and
// the format asked for.
func (s *Server) runProcess(c *gin.Context) (point.ProcessAnswer, string, error) {
	kind := c.Param("kind")
	if _, err := process.LookupKind(kind); err != nil {
		return point.ProcessAnswer{}, "", err
	}
	uq, err := readUncertainty(c.Request.URL.RawQuery, true)
	if err != nil {
		return point.ProcessAnswer{}, "", err
	}
	req, err := s.readRequest(uq.rest, takesFormat)
	if err != nil {
		return point.ProcessAnswer{}, "", err
	}
	ans, err := point.RunProcess(kind, uq.inputs, req.opt, uq.uo)
	return ans, req.format, err
}

// writeMeasured renders a state whose inputs carried uncertainties: JSON
// with the "u" (and "U") members, or CSV with a u(SYM) column after the
// answer's columns for each property that has one.
func (s *Server) writeMeasured(c *gin.Context, m *point.Measured, ans *point.Answer, syms []string, req request, uo point.UOptions) {
	unc := point.RenderUncertainty(m, ans, req.opt, uo)
	if req.format == "csv" {
		ans.Warnings = unc.Merge(ans.Warnings)
		head := answerHeader(nil, syms, req.opt.Set)
		for _, sym := range unc.Order {
			head = append(head, "u("+sym+")"+unitSuffix(fieldHeader(sym, req.opt.Set), sym))
		}
		b := appendCSVRow(nil, head, ',')
		b = ans.AppendCSV(b, ',')
		for _, sym := range unc.Order {
			b = appendNumber(append(b, ','), unc.U[sym])
		}
		writeBody(c, http.StatusOK, csvType, append(b, '\n'))
		return
	}
	b := ans.AppendMeasuredJSON(nil, point.Inputs(m.Inputs, req.opt), Caution, &unc)
	writeBody(c, http.StatusOK, jsonType, append(b, '\n'))
}

// unitSuffix is the " [unit]" part of a field header "h [kJ/kg]".
func unitSuffix(header, sym string) string { return strings.TrimPrefix(header, sym) }

// uncertaintyOf splits "u(h)" into ("u", "h") and "U(h)" into ("U", "h");
// any other name gives ("", "").
func uncertaintyOf(name string) (which, inner string) {
	if len(name) > 3 && (name[0] == 'u' || name[0] == 'U') && name[1] == '(' && name[len(name)-1] == ')' {
		return name[:1], name[2 : len(name)-1]
	}
	return "", ""
}

// getStateMeasured answers /state/{property} when the inputs carry ± or
// the property is u(SYM) or U(SYM): the value, its standard uncertainty
// or k·u, as a bare number.
func (s *Server) getStateMeasured(c *gin.Context, prop string) {
	uq, err := readUncertainty(c.Request.URL.RawQuery, false)
	if err != nil {
		s.failText(c, err)
		return
	}
	req, err := s.readRequest(uq.rest, takesInputs)
	if err != nil {
		s.failText(c, err)
		return
	}
	which, sym := uncertaintyOf(prop)
	if sym == "" {
		sym = prop
	}
	syms, err := point.Symbols([]string{sym})
	if err != nil || len(syms) != 1 {
		if err == nil {
			err = &point.Error{Param: clean(prop, 40), Kind: point.ErrUnknownProperty, Msg: "/state/{property} answers one property, e.g. /state/h or /state/u(h)"}
		}
		s.failText(c, err)
		return
	}
	if which == "U" && uq.uo.K == 0 {
		s.failText(c, errorf(ErrBadQuery, "k", "U(%s) is the expanded uncertainty: give its coverage factor, e.g. k=2", clean(sym, 40)))
		return
	}
	m, err := point.SolveMeasured(req.given, req.opt, uq.uo)
	if err != nil {
		s.failText(c, err)
		return
	}
	ans := point.Render(&m.State.State, syms, req.opt)
	f, err := ans.Value(syms[0])
	if err != nil {
		s.failText(c, err)
		return
	}
	v := f.Value
	var unc point.Uncertainty
	if m.Given {
		unc = point.RenderUncertainty(&m, &ans, req.opt, uq.uo)
	}
	if which != "" {
		u, ok := unc.U[syms[0]]
		if !ok {
			s.failText(c, &point.Error{Param: clean(prop, 40), Kind: point.ErrUncertainty,
				Msg: fmt.Sprintf("%s has no uncertainty here: give the inputs theirs after ±, e.g. p=100bar±0.2bar", clean(prop, 40))})
			return
		}
		v = u
		if which == "U" {
			v = uq.uo.K * u
		}
	}
	if w := unc.Merge(ans.Warnings); len(w) > 0 {
		c.Header("Steamcell-Warning", headerText(strings.Join(w, "; ")))
	}
	writeBody(c, http.StatusOK, textType, appendNumber(nil, v))
}
