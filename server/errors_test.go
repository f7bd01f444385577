package server_test

import (
	"context"
	"encoding/json"
	"errors"
	"io"
	"math/rand/v2"
	"net/http"
	"net/http/httptest"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"

	"steamcell/fn/if97"
	"steamcell/server"
)

// errorBody is the error answer: RFC 9457 problem details (section 3.1
// for the standard members) with our code and param.
type errorBody struct {
	Type     string `json:"type"`
	Title    string `json:"title"`
	Status   int    `json:"status"`
	Detail   string `json:"detail"`
	Instance string `json:"instance"`
	Code     string `json:"code"`
	Param    string `json:"param"`
}

// checkJSONError checks that an answer is problem details (RFC 9457) with
// the status and code, that its members agree (status as sent, type made
// of the code) and that its detail is a safe, non-empty line.
func checkJSONError(t *testing.T, what string, status int, body []byte, ctype string, wantStatus int, wantCode, wantParam string) {
	t.Helper()
	if status != wantStatus {
		t.Errorf("%s: status %d, want %d: %s", what, status, wantStatus, body)
	}
	if !strings.HasPrefix(ctype, "application/problem+json") {
		t.Errorf("%s: Content-Type %q, want application/problem+json", what, ctype)
	}
	var e errorBody
	if err := json.Unmarshal(body, &e); err != nil {
		t.Errorf("%s: error answer is not JSON: %v: %s", what, err, body)
		return
	}
	if e.Code != wantCode {
		t.Errorf("%s: code %q, want %q (%s)", what, e.Code, wantCode, e.Detail)
	}
	if wantParam != "" && e.Param != wantParam {
		t.Errorf("%s: param %q, want %q", what, e.Param, wantParam)
	}
	if e.Status != status || e.Type != "urn:steamcell:problem:"+e.Code || e.Title == "" || !strings.HasPrefix(e.Instance, "/") {
		t.Errorf("%s: problem members type %q, title %q, status %d, instance %q; want the code's type, a title, status %d and the request", what, e.Type, e.Title, e.Status, e.Instance, status)
	}
	checkMessage(t, what, e.Detail)
}

// checkMessage checks that a message is one line of valid UTF-8 with no
// trace of Go internals.
func checkMessage(t *testing.T, what, msg string) {
	t.Helper()
	if msg == "" || !utf8.ValidString(msg) || strings.ContainsAny(msg, "\n\r") {
		t.Errorf("%s: message %q is not one line of UTF-8 text", what, msg)
	}
	for _, leak := range []string{"goroutine", "runtime error", ".go:", "panic", "*errors."} {
		if strings.Contains(msg, leak) {
			t.Errorf("%s: message %q shows %q", what, msg, leak)
		}
	}
}

// TestErrorClasses sends one request per kind of error and checks the
// status, the code and the parameter named.
func TestErrorClasses(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	// p and T exactly on the saturation line: ps(373.15 K) from the engine,
	// written so that it reads back to the same float64.
	onSat := "p=" + strconv.FormatFloat(if97.SatPressure(373.15), 'g', -1, 64) + "MPa&t=373.15K"
	for _, tc := range []struct {
		target string
		status int
		code   string
		param  string
	}{
		// 400: the request must be rewritten.
		{"/state?p=6bargg&t=330C", 400, "unknown_unit", "p"},
		{"/state?p=abc&t=330C", 400, "not_a_number", "p"},
		{"/state?p=1,5bar&t=330C", 400, "ambiguous_number", "p"},
		{"/state?p=NaN&t=330C", 400, "not_finite", "p"},
		{"/state?p=1e999&t=330C", 400, "not_finite", "p"},
		{"/state?p=300C&t=330C", 400, "wrong_unit_quantity", "p"},
		{"/state?p=1bar&t=-300C", 400, "not_above_absolute_zero", "t"},
		{"/state?p=1bar&x=85", 400, "quality_range", "x"},
		{"/state?p=&t=330C", 400, "empty_value", "p"},
		{"/state?p=6barg&t=330C&patm=5bar", 400, "bad_patm", "patm"},
		{"/state?p=6barg&t=330C&units=imperial", 400, "unknown_unit_set", "units"},
		{"/state?p=6barg&t=330C&unit_p=furlong", 400, "unknown_unit", "unit_p"},
		{"/state?p=6barg", 400, "input_count", ""},
		{"/state?p=6barg&t=330C&h=3000", 400, "input_count", ""},
		{"/state?p=6barg&pressure=7barg", 400, "repeated_input", "pressure"},
		{"/state?p=6barg&t=330C&get=enthalpyy", 400, "unknown_property", "enthalpyy"},
		{"/state?v=0.1&rho=3", 400, "unsupported_pair", "v,rho"},
		{"/state?h=3000&x=0.5", 400, "unsupported_pair", "h,x"},
		{"/state?p=6barg&t=330C&colour=red", 400, "unknown_parameter", "colour"},
		{"/state?p=6barg&t=330C&unit_zz=kPa", 400, "unknown_parameter", "unit_zz"},
		{"/state?p=6barg&t=330C&p=7barg", 400, "repeated_parameter", "p"},
		{"/state?p=6barg&t=330C&unit_h=kJ/kg&unit_u=Btu/lb", 400, "repeated_parameter", "unit_u"},
		{"/state?p=%zz&t=330C", 400, "malformed_query", "p"},
		{"/state?p=6barg&t=330C&format=xml", 400, "malformed_query", "format"},
		{"/saturation?h=3000", 400, "unknown_input", "h"},
		{"/saturation?p=1MPa&t=100C", 400, "input_count", ""},
		{"/saturation?p=1MPa&get=h", 400, "unknown_property", "h"},
		{"/batch", 405, "method_not_allowed", ""},
		{"/nowhere", 404, "no_route", ""},
		{"/state/", 404, "no_route", ""},

		// 422: well formed, outside what IAPWS-IF97 covers or defines.
		{"/state?p=200MPa&t=300C", 422, "out_of_range", "p"},
		{"/state?p=60MPa&t=1200C", 422, "out_of_range", "p"},
		{"/state?p=25MPa&x=0.5", 422, "above_critical", "p"},
		{"/saturation?t=700K", 422, "above_critical", "t"},
		{"/state?p=100kPa&v=0.0010001", 422, "two_solutions", "p,v"},
		{"/state?" + onSat, 422, "on_saturation", "p,t"},
		{"/state?h=3000&s=2", 422, "out_of_range", "h,s"},
	} {
		w := get(srv, tc.target)
		checkJSONError(t, tc.target, w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), tc.status, tc.code, tc.param)
	}
	// A bad get= on /workbook is the property error (issue 11: it was
	// bad_workbook); phase and region are properties of the filler.
	wb, _ := newServer(t, server.Config{Workbook: failingFiller{"copy"}})
	w := send(wb, http.MethodPost, "/workbook?name=a.xlsx&get=h,enthalpyy", "PK", nil)
	checkJSONError(t, "/workbook get=enthalpyy", w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 400, "unknown_property", "enthalpyy")
	if w := send(wb, http.MethodPost, "/workbook?name=a.xlsx&get=h,phase,region,all", "PK", nil); w.Code != 200 {
		t.Errorf("/workbook get=h,phase,region,all: %d %s", w.Code, w.Body)
	}
}

// TestStatePropertyErrors: the plain-text route answers errors as one line
// of text, so that a cell shows an error and never a wrong number.
func TestStatePropertyErrors(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	for _, tc := range []struct {
		target string
		status int
		code   string
	}{
		{"/state/h?p=6bargg&t=330C", 400, "unknown_unit"},
		{"/state/enthalpyy?p=6barg&t=330C", 400, "unknown_property"},
		{"/state/all?p=6barg&t=330C", 400, "unknown_property"},
		{"/state/h,s?p=6barg&t=330C", 400, "unknown_property"},
		{"/state/h?p=6barg", 400, "input_count"},
		{"/state/h?p=6barg&t=330C&get=s", 400, "unknown_parameter"},
		{"/state/h?p=6barg&t=330C&format=csv", 400, "unknown_parameter"},
		{"/state/cp?p=1MPa&x=0.5", 422, "undefined_for_state"},
		{"/state/x?p=1MPa&t=300C", 422, "undefined_for_state"},
		{"/state/h?p=200MPa&t=300C", 422, "out_of_range"},
	} {
		w := get(srv, tc.target)
		body := w.Body.String()
		if w.Code != tc.status || w.Header().Get("Content-Type") != "text/plain; charset=utf-8" {
			t.Errorf("%s: %d %q, want %d text/plain", tc.target, w.Code, w.Header().Get("Content-Type"), tc.status)
		}
		if !strings.HasPrefix(body, tc.code+": ") || strings.Count(body, "\n") != 1 || !strings.HasSuffix(body, "\n") {
			t.Errorf("%s: body %q, want one line starting %q", tc.target, body, tc.code+": ")
		}
		checkMessage(t, tc.target, strings.TrimSuffix(body, "\n"))
		if _, err := strconv.ParseFloat(strings.TrimSpace(body), 64); err == nil {
			t.Errorf("%s: error body %q reads as a number", tc.target, body)
		}
	}
}

// TestHostileQueries sends what no honest client sends and checks that
// every answer is a 4xx with a JSON error, never a 500.
func TestHostileQueries(t *testing.T) {
	srv, logs := newServer(t, server.Config{})
	long := "p=6barg&t=330C&" + strings.Repeat("a", 10<<10)
	manyP := strings.Repeat("p=1bar&", 100)
	for _, tc := range []struct {
		name   string
		target string
		status int
		code   string
	}{
		{"10 kB query", "/state?" + long, 414, "query_too_long"},
		{"10 kB query, one value", "/state?p=" + strings.Repeat("9", 10<<10) + "&t=1", 414, "query_too_long"},
		{"long value", "/state?t=1&p=" + strings.Repeat("9", 300), 400, "malformed_query"},
		{"repeated 100 times", "/state?" + manyP, 400, "repeated_parameter"},
		{"three inputs", "/state?p=1bar&t=300C&h=3000", 400, "input_count"},
		{"unknown parameters", "/state?p=1bar&t=300C&a=1&b=2", 400, "unknown_parameter"},
		{"many parameters", "/state?" + manyParams(40), 400, "malformed_query"},
		{"invalid UTF-8 value", "/state?p=%ff%fe&t=300C", 400, "malformed_query"},
		{"invalid UTF-8 name", "/state?%c3%28=1&t=300C", 400, "malformed_query"},
		{"raw invalid UTF-8", "/state?p=\xff&t=300C", 400, "malformed_query"},
		{"NUL byte", "/state?p=1%00bar&t=300C", 400, ""},
		{"control characters", "/state?p=1bar%0d%0aX:1&t=300C", 400, ""},
		{"bad escape", "/state?p=%&t=300C", 400, "malformed_query"},
		{"only separators", "/state?&&&&", 400, "input_count"},
		{"empty name", "/state?=1&t=300C", 400, "unknown_parameter"},
		{"huge exponent", "/state?p=1e308MPa&t=300C", 422, "out_of_range"},
		{"negative zero", "/state?p=-0MPa&t=300C", 400, "pressure_not_positive"},
	} {
		w := get(srv, tc.target)
		var e errorBody
		if err := json.Unmarshal(w.Body.Bytes(), &e); err != nil || w.Code != tc.status || (tc.code != "" && e.Code != tc.code) {
			t.Errorf("%s: %d %s, want %d %s", tc.name, w.Code, clip(w.Body.String()), tc.status, tc.code)
		}
		checkMessage(t, tc.name, e.Detail)
		if len(e.Detail) > 1000 {
			t.Errorf("%s: message of %d bytes", tc.name, len(e.Detail))
		}
	}
	if strings.Contains(logs.String(), `"level":"ERROR"`) {
		t.Errorf("hostile queries logged internal errors:\n%s", logs)
	}

	// Paths and headers through a real connection, where net/http decodes
	// the path before the router sees it.
	ts := httptest.NewServer(srv)
	defer ts.Close()
	for _, tc := range []struct {
		path   string
		status int
	}{
		{"/state/%ff?p=1bar&t=20C", 400},
		{"/state/%00?p=1bar&t=20C", 400},
		{"/state/" + strings.Repeat("h", 5000) + "?p=1bar&t=20C", 400},
		{"/state/h/extra?p=1bar&t=20C", 404},
		{"/%2e%2e/etc/passwd", 404},
		{"/state?" + strings.Repeat("x", 12<<10), 414},
		{"/state?" + strings.Repeat("x", 40<<10), 414},
	} {
		resp, err := http.Get(ts.URL + tc.path)
		if err != nil {
			t.Errorf("%s: %v", clip(tc.path), err)
			continue
		}
		body, _ := io.ReadAll(resp.Body)
		resp.Body.Close()
		if resp.StatusCode != tc.status {
			t.Errorf("%s: status %d, want %d: %s", clip(tc.path), resp.StatusCode, tc.status, clip(string(body)))
		}
		checkMessage(t, clip(tc.path), strings.TrimSpace(string(body)))
	}

	// Random queries built from pieces of good and bad ones (fixed seed):
	// whatever the mix, the answer is 200 or a 4xx JSON error.
	pieces := []string{"p=6barg", "t=330C", "h=2800", "s=6.5", "x=0.5", "x=2", "v=0.2", "rho=1000", "u=2500",
		"units=us", "units=zz", "patm=95kPa", "patm=1MPa", "get=h,s", "get=all", "get=zz", "format=csv",
		"unit_p=psig", "unit_h=furlong", "key=k", "%ff", "%", "p=%e2%82", "t=1e400", "t=-1K", "&", "=", "T=100C", "P=1MPa"}
	rng := rand.New(rand.NewPCG(1, 2))
	for range 2000 {
		n := 1 + rng.IntN(5)
		parts := make([]string, n)
		for i := range parts {
			parts[i] = pieces[rng.IntN(len(pieces))]
		}
		path := []string{"/state", "/state/h", "/saturation"}[rng.IntN(3)]
		target := path + "?" + strings.Join(parts, "&")
		w := get(srv, target)
		if w.Code >= 500 || (w.Code != 200 && w.Code < 400) {
			t.Fatalf("%s: status %d: %s", target, w.Code, w.Body)
		}
		if w.Code != 200 && path != "/state/h" {
			var e errorBody
			if err := json.Unmarshal(w.Body.Bytes(), &e); err != nil || e.Code == "" {
				t.Fatalf("%s: error answer %q is not the JSON error", target, w.Body)
			}
		}
	}
}

func manyParams(n int) string {
	var b strings.Builder
	for i := range n {
		b.WriteString("unit_p" + strconv.Itoa(i) + "=kPa&")
	}
	return b.String()
}

func clip(s string) string {
	if len(s) > 200 {
		return s[:200] + "…"
	}
	return s
}

// failingFiller is a workbook filler that fails in the ways a filler can.
type failingFiller struct{ mode string }

func (f failingFiller) Fill(_ context.Context, in io.Reader, _ string, _ server.WorkbookOptions, out io.Writer) (any, error) {
	switch f.mode {
	case "internal":
		return nil, errors.New("open /var/secret/thing.xlsx: permission denied")
	case "panic":
		panic("index out of range [3] with length 3")
	case "user":
		return nil, server.InputProblem(errors.New("the file is not an .xlsx workbook"))
	}
	_, err := io.Copy(out, in)
	return map[string]any{"rows": 1, "note": "Température"}, err
}

// TestInternalErrors: a fault inside the server is logged, answered 500
// "internal error", and its text is not shown.
func TestInternalErrors(t *testing.T) {
	for _, mode := range []string{"internal", "panic"} {
		srv, logs := newServer(t, server.Config{Workbook: failingFiller{mode}})
		w := send(srv, http.MethodPost, "/workbook?name=a.xlsx", "PK...", nil)
		checkJSONError(t, mode, w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 500, "internal", "")
		var e errorBody
		_ = json.Unmarshal(w.Body.Bytes(), &e)
		if e.Detail != "internal error" {
			t.Errorf("%s: message %q, want \"internal error\"", mode, e.Detail)
		}
		if strings.Contains(w.Body.String(), "secret") || strings.Contains(w.Body.String(), "index out of range") {
			t.Errorf("%s: answer shows the fault: %s", mode, w.Body)
		}
		if !strings.Contains(logs.String(), `"level":"ERROR"`) {
			t.Errorf("%s: fault not logged:\n%s", mode, logs)
		}
	}
}
