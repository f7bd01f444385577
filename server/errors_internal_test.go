package server

import (
	"errors"
	"fmt"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/gin-gonic/gin"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// TestErrorTable checks the one mapping from error kind to status against
// the rule of the API: 400 for a malformed request, 422 for a well-formed
// one outside what IAPWS-IF97 covers or defines, 500 only for faults.
func TestErrorTable(t *testing.T) {
	// The rule, kind by kind (issue 5 of the project; codes are ours).
	for _, tc := range []struct {
		err    error
		status int
		code   string
	}{
		{&units.InputError{Name: "p", Err: units.ErrEmpty}, 400, "empty_value"},
		{&units.InputError{Name: "p", Err: units.ErrSyntax}, 400, "not_a_number"},
		{&units.InputError{Name: "p", Err: units.ErrAmbiguousNumber}, 400, "ambiguous_number"},
		{&units.InputError{Name: "p", Err: units.ErrNotFinite}, 400, "not_finite"},
		{&units.InputError{Name: "p", Err: units.ErrUnknownUnit}, 400, "unknown_unit"},
		{&units.InputError{Name: "p", Err: units.ErrWrongDimension}, 400, "wrong_unit_quantity"},
		{&units.InputError{Name: "t", Err: units.ErrNegativeAbsolute}, 400, "not_above_absolute_zero"},
		{&units.InputError{Name: "p", Err: units.ErrPressureNotPositive}, 400, "pressure_not_positive"},
		{&units.InputError{Name: "x", Err: units.ErrQualityRange}, 400, "quality_range"},
		{&units.InputError{Name: "p", Err: units.ErrUnitConflict}, 400, "unit_conflict"},
		{&units.InputError{Name: "patm", Err: units.ErrBadPatm}, 400, "bad_patm"},
		{&units.InputError{Name: "units", Err: units.ErrUnknownSet}, 400, "unknown_unit_set"},
		{&point.Error{Kind: point.ErrInputCount, Msg: "m"}, 400, "input_count"},
		{&point.Error{Kind: point.ErrUnknownInput, Msg: "m"}, 400, "unknown_input"},
		{&point.Error{Kind: point.ErrUnknownProperty, Msg: "m"}, 400, "unknown_property"},
		{&point.Error{Kind: point.ErrUndefined, Msg: "m"}, 422, "undefined_for_state"},
		{&fn.InputError{Input: "p", Kind: fn.ErrNotFinite}, 400, "not_finite"},
		{&fn.InputError{Input: "p,p", Kind: fn.ErrPair}, 400, "unsupported_pair"},
		{&fn.InputError{Input: "p", Kind: fn.ErrOutOfRange}, 422, "out_of_range"},
		{&fn.InputError{Input: "p", Kind: fn.ErrAboveCritical}, 422, "above_critical"},
		{&fn.InputError{Input: "h,s", Kind: fn.ErrNoSolution}, 422, "no_solution"},
		{&fn.InputError{Input: "t,h", Kind: fn.ErrTwoSolutions}, 422, "two_solutions"},
		{&fn.InputError{Input: "p,t", Kind: fn.ErrOnSaturation}, 422, "on_saturation"},
		{errorf(ErrBadQuery, "p", "m"), 400, "malformed_query"},
		{errorf(ErrQueryTooLong, "", "m"), 414, "query_too_long"},
		{errorf(ErrUnknownParameter, "q", "m"), 400, "unknown_parameter"},
		{errorf(ErrRepeatedParameter, "p", "m"), 400, "repeated_parameter"},
		{errorf(ErrBadBody, "", "m"), 400, "malformed_body"},
		{errorf(ErrBodyTooLarge, "", "m"), 413, "body_too_large"},
		{errorf(ErrMediaType, "", "m"), 415, "unsupported_media_type"},
		{InputProblem(errors.New("not a workbook")), 400, "bad_workbook"},
		{errorf(ErrUnauthorized, "key", "m"), 401, "unauthorized"},
		{errorf(ErrNoRoute, "", "m"), 404, "no_route"},
		{errorf(ErrMethod, "", "m"), 405, "method_not_allowed"},
		{errorf(ErrNotImplemented, "", "m"), 501, "not_implemented"},
		// Wrapped errors keep their kind.
		{fmt.Errorf("row 3: %w", &fn.InputError{Input: "t", Kind: fn.ErrOutOfRange}), 422, "out_of_range"},
		// Anything else is a fault.
		{errors.New("open /etc/x: permission denied"), 500, "internal"},
		{fmt.Errorf("panic: %v", "boom"), 500, "internal"},
	} {
		p := classify(tc.err)
		if p.Status != tc.status || p.Code != tc.code {
			t.Errorf("classify(%v) = %d %s, want %d %s", tc.err, p.Status, p.Code, tc.status, tc.code)
		}
		if tc.status == 500 && p.Msg != "internal error" {
			t.Errorf("classify(%v) shows %q", tc.err, p.Msg)
		}
	}

	// Every kind of the table is distinct and has a code.
	seen := map[error]bool{}
	for _, c := range errorTable {
		if seen[c.kind] || c.code == "" || c.status < 400 {
			t.Errorf("table row %v: duplicate kind, empty code or status %d", c.kind, c.status)
		}
		seen[c.kind] = true
	}
}

func TestParseQuery(t *testing.T) {
	ps, err := parseQuery("T=330C&p=6+barg&&unit_p=barg&key=a%26b")
	if err != nil {
		t.Fatal(err)
	}
	want := []param{{"T", "t", "330C"}, {"p", "p", "6 barg"}, {"unit_p", "unit_p", "barg"}, {"key", "key", "a&b"}}
	if len(ps) != len(want) {
		t.Fatalf("parseQuery = %v, want %v", ps, want)
	}
	for i := range want {
		if ps[i] != want[i] {
			t.Errorf("param %d = %v, want %v", i, ps[i], want[i])
		}
	}
	for _, raw := range []string{"p=1&P=2", "t=%zz", "t=%ff", "t=" + string(make([]byte, 300))} {
		if _, err := parseQuery(raw); err == nil {
			t.Errorf("parseQuery(%q) = nil error", raw)
		}
	}
}

func TestRedactQuery(t *testing.T) {
	for raw, want := range map[string]string{
		"p=1&key=s3cret":            "p=1&key=REDACTED",
		"KEY=s3cret&t=1":            "KEY=REDACTED&t=1",
		"k%65y=s3cret":              "k%65y=REDACTED",
		"p=1&t=2":                   "p=1&t=2",
		"%6b%65%79=s3cret":          "%6b%65%79=REDACTED",
		"key%zz=s3cret&key=s3cret2": "REDACTED&key=REDACTED",
	} {
		if got := redactQuery(raw); got != want {
			t.Errorf("redactQuery(%q) = %q, want %q", raw, got, want)
		}
	}
}

// TestInternalErrorLogged: an error of a kind the table does not know (a
// solver that did not converge, say, which is our fault and not the
// user's) is answered 500 "internal error" and logged with the request's
// inputs, the key redacted (issue 11).
func TestInternalErrorLogged(t *testing.T) {
	var logs strings.Builder
	s := New(Config{Logger: slog.New(slog.NewJSONHandler(&logs, nil))})
	w := httptest.NewRecorder()
	c, _ := gin.CreateTestContext(w)
	c.Request = httptest.NewRequest(http.MethodGet, "/state?p=33.99MPa&h=1599.59&key=s3cret", nil)
	errSolver := errors.New("solver did not converge")
	s.fail(c, fmt.Errorf("(p,h) at 33.99 MPa: %w", errSolver))
	if w.Code != 500 || !strings.Contains(w.Body.String(), `"detail":"internal error"`) || strings.Contains(w.Body.String(), "converge") {
		t.Errorf("answer %d %s, want 500 internal error without the fault's text", w.Code, w.Body)
	}
	for _, want := range []string{`"level":"ERROR"`, "p=33.99MPa&h=1599.59", "key=REDACTED", "did not converge"} {
		if !strings.Contains(logs.String(), want) {
			t.Errorf("log lacks %q:\n%s", want, logs.String())
		}
	}
	if strings.Contains(logs.String(), "s3cret") {
		t.Errorf("the key reached the log:\n%s", logs.String())
	}
}

// TestREADMEErrorCodes: the README's table of statuses and codes lists
// every code of errorTable under its status, and no code that is not there
// (the table is the one source; the README is a view of it).
func TestREADMEErrorCodes(t *testing.T) {
	b, err := os.ReadFile("../README.md")
	if err != nil {
		t.Fatal(err)
	}
	listed := map[string]string{} // code -> the statuses of its README row
	for _, line := range strings.Split(string(b), "\n") {
		cells := strings.Split(line, "|")
		if len(cells) < 4 || !regexp.MustCompile(`^ ?\d{3}(, \d{3})* ?$`).MatchString(cells[1]) {
			continue
		}
		for _, m := range regexp.MustCompile("`([a-z_]+)`").FindAllStringSubmatch(cells[2], -1) {
			listed[m[1]] = strings.TrimSpace(cells[1])
		}
	}
	want := map[string]bool{internalCode: true}
	for _, c := range errorTable {
		want[c.code] = true
		statuses, ok := listed[c.code]
		if !ok {
			t.Errorf("README: code %s (status %d) is not in the table of errors", c.code, c.status)
		} else if !strings.Contains(statuses, strconv.Itoa(c.status)) {
			t.Errorf("README: code %s is listed under %s, errorTable answers it with %d", c.code, statuses, c.status)
		}
	}
	for code := range listed {
		if !want[code] {
			t.Errorf("README lists code %s, which errorTable does not have", code)
		}
	}
}
