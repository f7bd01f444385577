package server

import (
	"bytes"
	"net/http"
	"net/url"
	"strings"

	"github.com/gin-gonic/gin"

	"steamcell/fn/table"
)

// getTable answers a steam table: a saturation table by pressure
// (from=1bar&to=20bar&step=1bar) or by temperature (from=100C&to=200C&
// step=5C), or a superheat table (p=10bar,40bar&from=200C&to=500C&
// step=50C), with the properties of get=, as JSON (format=csv or xlsx for
// the others).
//
// GET /table
func (s *Server) getTable(c *gin.Context) {
	spec, format, rest, err := readTableQuery(c.Request.URL.RawQuery)
	if err != nil {
		s.fail(c, err)
		return
	}
	req, err := s.readRequest(rest, takesGet)
	if err != nil {
		s.fail(c, err)
		return
	}
	spec.Get = req.syms
	t, err := table.Build(spec, req.opt)
	if err != nil {
		s.fail(c, err)
		return
	}
	var b bytes.Buffer
	var ctype string
	switch format {
	case table.CSV:
		ctype, err = "text/csv; charset=utf-8", t.WriteCSV(&b)
	case table.XLSX:
		ctype, err = xlsxType, t.WriteXLSX(&b, Caution)
		c.Header("Content-Disposition", `attachment; filename="steam_table.xlsx"`)
	default:
		ctype, err = "application/json; charset=utf-8", t.WriteJSON(&b, Caution)
	}
	if err != nil {
		s.fail(c, err)
		return
	}
	writeBody(c, http.StatusOK, []string{ctype}, b.Bytes())
}

// readTableQuery takes the table's own parameters (from, to, step, p,
// format) out of a raw query and returns the rest, the options every
// route reads, to be read as for any route.
func readTableQuery(raw string) (table.Spec, string, string, error) {
	var spec table.Spec
	format := table.JSON
	params, err := parseQuery(raw)
	if err != nil {
		return spec, "", "", err
	}
	var rest []string
	for _, p := range params {
		switch p.key {
		case "from":
			spec.From = p.value
		case "to":
			spec.To = p.value
		case "step":
			spec.Step = p.value
		case "p":
			spec.P = p.value
		case "format":
			format = strings.ToLower(p.value)
			if format != table.CSV && format != table.JSON && format != table.XLSX {
				return spec, "", "", errorf(ErrBadQuery, "format", "format=%s is not a format of /table; use %s", clean(p.value, 20), strings.Join(table.Formats, ", "))
			}
		default:
			rest = append(rest, url.QueryEscape(p.name)+"="+url.QueryEscape(p.value))
		}
	}
	return spec, format, strings.Join(rest, "&"), nil
}
