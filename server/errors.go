package server

import (
	"errors"
	"log/slog"
	"net/http"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/gin-gonic/gin"

	"steamcell/fn"
	"steamcell/fn/diagram"
	"steamcell/fn/point"
	"steamcell/fn/process"
	"steamcell/fn/table"
	"steamcell/fn/uncertain"
	"steamcell/fn/units"
)

// Kinds of request error found by the server itself (the engine's kinds
// come from fn, fn/units and fn/point); test for them with errors.Is.
var (
	// ErrBadQuery: the query string is not valid URL encoding or UTF-8.
	ErrBadQuery = errors.New("malformed query")
	// ErrQueryTooLong: the query string is longer than any state needs.
	ErrQueryTooLong = errors.New("query too long")
	// ErrUnknownParameter: a query parameter this route does not take.
	ErrUnknownParameter = errors.New("unknown parameter")
	// ErrRepeatedParameter: a query parameter given more than once.
	ErrRepeatedParameter = errors.New("repeated parameter")
	// ErrBadBody: a request body that cannot be read as CSV or JSON.
	ErrBadBody = errors.New("malformed body")
	// ErrBodyTooLarge: a request body over the server's limit.
	ErrBodyTooLarge = errors.New("body too large")
	// ErrMediaType: a body of a type the route does not read.
	ErrMediaType = errors.New("unsupported media type")
	// ErrUnauthorized: the server wants a token and got none or a wrong one.
	ErrUnauthorized = errors.New("unauthorized")
	// ErrNoRoute: no route has this path.
	ErrNoRoute = errors.New("no such route")
	// ErrMethod: the route exists but not for this method.
	ErrMethod = errors.New("method not allowed")
	// ErrNotImplemented: a route this server was started without (POST
	// /workbook when no workbook filler is wired in).
	ErrNotImplemented = errors.New("not implemented")
	// ErrBadWorkbook: the workbook filler refused the file as the user's
	// mistake (not a workbook, no input columns); see InputProblem.
	ErrBadWorkbook = errors.New("workbook not usable")
)

// Error is the problem with a request that the caller must change
// (fn.ParamError: which parameter, what kind, what to change).
type Error = fn.ParamError

func errorf(kind error, param, format string, args ...any) *Error {
	return fn.ParamErrorf(kind, param, format, args...)
}

// InputProblem marks err as caused by the request's content (a file that is
// no workbook, a sheet without input columns), so that it is answered with
// 400 and its message rather than as an internal error. A workbook filler
// wraps the errors it finds in the user's file with it.
func InputProblem(err error) error {
	if err == nil {
		return nil
	}
	return &Error{Kind: ErrBadWorkbook, Msg: err.Error()}
}

// errorClass is one row of the table from error kind to answer.
type errorClass struct {
	kind   error
	status int
	code   string
}

// errorTable maps every kind of error a request can cause to its HTTP
// status and the stable code put in the answer. 400: the request is
// malformed and must be rewritten; 422: it is well formed but asks for a
// state outside what IAPWS-IF97 covers or defines. The first match wins.
// Anything not in the table is an internal fault (500, "internal error").
var errorTable = []errorClass{
	// The query and the body.
	{ErrBadQuery, http.StatusBadRequest, "malformed_query"},
	{ErrQueryTooLong, http.StatusRequestURITooLong, "query_too_long"},
	{ErrUnknownParameter, http.StatusBadRequest, "unknown_parameter"},
	{ErrRepeatedParameter, http.StatusBadRequest, "repeated_parameter"},
	{ErrBadBody, http.StatusBadRequest, "malformed_body"},
	{ErrBodyTooLarge, http.StatusRequestEntityTooLarge, "body_too_large"},
	{ErrMediaType, http.StatusUnsupportedMediaType, "unsupported_media_type"},
	{ErrBadWorkbook, http.StatusBadRequest, "bad_workbook"},
	{ErrUnauthorized, http.StatusUnauthorized, "unauthorized"},
	{ErrNoRoute, http.StatusNotFound, "no_route"},
	{ErrMethod, http.StatusMethodNotAllowed, "method_not_allowed"},
	{ErrNotImplemented, http.StatusNotImplemented, "not_implemented"},
	{ErrBusy, http.StatusServiceUnavailable, "busy"},

	// Reading a point (fn/point).
	{point.ErrInputCount, http.StatusBadRequest, "input_count"},
	{point.ErrRepeatedInput, http.StatusBadRequest, "repeated_input"},
	{point.ErrUnknownInput, http.StatusBadRequest, "unknown_input"},
	{point.ErrUnknownProperty, http.StatusBadRequest, "unknown_property"},
	{point.ErrUndefined, http.StatusUnprocessableEntity, "undefined_for_state"},

	// Reading values with units (fn/units).
	{units.ErrEmpty, http.StatusBadRequest, "empty_value"},
	{units.ErrSyntax, http.StatusBadRequest, "not_a_number"},
	{units.ErrAmbiguousNumber, http.StatusBadRequest, "ambiguous_number"},
	{units.ErrNotFinite, http.StatusBadRequest, "not_finite"},
	{units.ErrUnknownUnit, http.StatusBadRequest, "unknown_unit"},
	{units.ErrWrongDimension, http.StatusBadRequest, "wrong_unit_quantity"},
	{units.ErrNegativeAbsolute, http.StatusBadRequest, "not_above_absolute_zero"},
	{units.ErrPressureNotPositive, http.StatusBadRequest, "pressure_not_positive"},
	{units.ErrQualityRange, http.StatusBadRequest, "quality_range"},
	{units.ErrUnitConflict, http.StatusBadRequest, "unit_conflict"},
	{units.ErrBadPatm, http.StatusBadRequest, "bad_patm"},
	{units.ErrUnknownSet, http.StatusBadRequest, "unknown_unit_set"},

	// Solving the state (fn).
	{fn.ErrNotFinite, http.StatusBadRequest, "not_finite"},
	{fn.ErrPair, http.StatusBadRequest, "unsupported_pair"},
	{fn.ErrOutOfRange, http.StatusUnprocessableEntity, "out_of_range"},
	{fn.ErrAboveCritical, http.StatusUnprocessableEntity, "above_critical"},
	{fn.ErrNoSolution, http.StatusUnprocessableEntity, "no_solution"},
	{fn.ErrTwoSolutions, http.StatusUnprocessableEntity, "two_solutions"},
	{fn.ErrOnSaturation, http.StatusUnprocessableEntity, "on_saturation"},

	// Uncertainties and processes (fn/point, fn/uncertain, fn/process).
	{point.ErrUncertainty, http.StatusBadRequest, "bad_uncertainty"},
	{uncertain.ErrDegenerate, http.StatusUnprocessableEntity, "degenerate_inputs"},
	{process.ErrKind, http.StatusNotFound, "unknown_process"},
	{process.ErrInput, http.StatusBadRequest, "process_input"},
	{process.ErrRefused, http.StatusUnprocessableEntity, "process_refused"},

	// Diagrams and steam tables as asked for (fn/diagram, fn/table).
	{diagram.ErrTooMany, http.StatusBadRequest, "too_many_points"},
	{diagram.ErrBadPoint, http.StatusBadRequest, "bad_point"},
	{diagram.ErrBadRange, http.StatusBadRequest, "bad_axis_range"},
	{table.ErrTooManyRows, http.StatusBadRequest, "too_many_rows"},
	{table.ErrBadRange, http.StatusBadRequest, "bad_table_range"},
}

// internalCode is the code of every error not in errorTable.
const internalCode = "internal"

// problemTypePrefix makes a problem type URI (RFC 9457, 3.1.1) of a code:
// the URN names the kind of problem for good, whatever host serves it.
const problemTypePrefix = "urn:steamcell:problem:"

// problem is an error as the user sees it: the members of an RFC 9457
// problem details object, with our stable code and the parameter concerned.
type problem struct {
	Status int
	Code   string
	Title  string // short summary of the kind, the same for every occurrence
	Param  string
	Msg    string // the detail: this occurrence, and what to change
}

// classify is the one place that turns an error into a status, a code, the
// parameter concerned and a message. Errors outside errorTable are internal
// faults: their text is not shown (the caller logs it).
func classify(err error) problem {
	for _, c := range errorTable {
		if errors.Is(err, c.kind) {
			return problem{Status: c.status, Code: c.code, Title: c.kind.Error(), Param: paramOf(err), Msg: message(err)}
		}
	}
	return problem{Status: http.StatusInternalServerError, Code: internalCode, Title: "internal error", Msg: "internal error"}
}

// paramOf returns the input or parameter an error is about.
func paramOf(err error) string {
	var pe *fn.ParamError // the server's, fn/point's, fn/process's, fn/table's, fn/diagram's
	var ue *units.InputError
	var fe *fn.InputError
	switch {
	case errors.As(err, &pe):
		return clean(pe.Param, 64)
	case errors.As(err, &ue):
		return clean(ue.Name, 64)
	case errors.As(err, &fe):
		return clean(fe.Input, 64)
	}
	return ""
}

// message returns the error's text, made safe for one line of an answer.
func message(err error) string {
	return clean(err.Error(), 600)
}

// clean makes s one line of valid UTF-8 text of at most max bytes: invalid
// bytes become '?', control characters a space.
func clean(s string, max int) string {
	s = strings.ToValidUTF8(s, "?")
	s = strings.Map(func(r rune) rune {
		if unicode.IsControl(r) {
			return ' '
		}
		return r
	}, s)
	if len(s) > max {
		cut := max
		for cut > 0 && !utf8.RuneStart(s[cut]) {
			cut--
		}
		s = s[:cut] + "…"
	}
	return s
}

// fail answers a JSON route with the error as RFC 9457 problem details
// (application/problem+json) and stops the handler chain.
func (s *Server) fail(c *gin.Context, err error) {
	p := s.note(c, err)
	c.Header("Cache-Control", "no-store")
	c.Data(p.Status, problemType, appendProblem(make([]byte, 0, 512), &p, instance(c)))
	c.Abort()
}

// problemType is the media type of a problem details answer (RFC 9457, 3).
const problemType = "application/problem+json; charset=utf-8"

// appendProblem writes p as an RFC 9457 problem details object: the
// standard members type, title, status, detail and instance (section 3.1),
// then ours, code (stable, the last part of type) and param (the input or
// parameter concerned, when there is one).
func appendProblem(b []byte, p *problem, instance string) []byte {
	b = append(b, `{"type":`...)
	b = appendJSONString(b, problemTypePrefix+p.Code)
	b = append(b, `,"title":`...)
	b = appendJSONString(b, p.Title)
	b = append(b, `,"status":`...)
	b = strconv.AppendInt(b, int64(p.Status), 10)
	b = append(b, `,"detail":`...)
	b = appendJSONString(b, p.Msg)
	if instance != "" {
		b = append(b, `,"instance":`...)
		b = appendJSONString(b, instance)
	}
	b = append(b, `,"code":`...)
	b = appendJSONString(b, p.Code)
	if p.Param != "" {
		b = append(b, `,"param":`...)
		b = appendJSONString(b, p.Param)
	}
	return append(b, "}\n"...)
}

// instance names the occurrence of a problem (RFC 9457, 3.1.5): the
// request's path and query, with any key= redacted, as a relative URI
// reference.
func instance(c *gin.Context) string {
	u := c.Request.URL.EscapedPath()
	if q := c.Request.URL.RawQuery; q != "" {
		u += "?" + redactQuery(q)
	}
	return clean(u, 400)
}

// failText answers a plain-text route with a one-line reason.
func (s *Server) failText(c *gin.Context, err error) {
	p := s.note(c, err)
	c.Header("Cache-Control", "no-store")
	c.Data(p.Status, "text/plain; charset=utf-8", []byte(p.Code+": "+p.Msg+"\n"))
	c.Abort()
}

// note classifies err, logs internal faults with the request's inputs (the
// query, key= redacted), records the code for the request log and the
// metrics, and returns the problem.
func (s *Server) note(c *gin.Context, err error) problem {
	p := classify(err)
	if p.Status == http.StatusUnauthorized {
		c.Header("WWW-Authenticate", `Bearer realm="steamcell"`)
	}
	if p.Code == internalCode {
		s.log.LogAttrs(c.Request.Context(), slog.LevelError, "internal error",
			slog.String("route", routeOf(c)), slog.String("method", clean(c.Request.Method, 10)),
			slog.String("query", clean(redactQuery(c.Request.URL.RawQuery), 600)),
			slog.String("error", err.Error()))
	}
	c.Set(ctxErrorCode, p.Code)
	return p
}
