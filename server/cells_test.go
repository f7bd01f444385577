package server_test

import (
	"io"
	"net/http"
	"net/http/httptest"
	"slices"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/server"
)

// pathExample fills the path parameters of openapi.json with a value each.
var pathExample = strings.NewReplacer("{property}", "h", "{kind}", "expansion", "{result}", "efficiency", "{file}", "hs.svg")

// documentedPaths are the paths of server/openapi.json with a value for
// each path parameter, and the methods documented for each.
func documentedPaths(t *testing.T) map[string][]string {
	t.Helper()
	out := map[string][]string{}
	for p, item := range loadSpec(t).Paths.Map() {
		for method := range item.Operations() {
			out[pathExample.Replace(p)] = append(out[pathExample.Replace(p)], method)
		}
	}
	return out
}

// TestHeadAndOptions: every route answers OPTIONS with Allow, every GET
// route HEAD with the GET's headers and no body, through a real
// connection (where net/http drops the body of a HEAD answer), and
// neither counts as an error in /metrics. LibreOffice Calc's WEBSERVICE
// sends OPTIONS and HEAD before its GETs (issue 15: both were 405 and
// counted as errors).
func TestHeadAndOptions(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	ts := httptest.NewServer(srv)
	defer ts.Close()
	query := "?p=6barg&t=330C"
	for path, methods := range documentedPaths(t) {
		slices.Sort(methods)
		method := methods[0] // GET before POST
		target := ts.URL + path
		if strings.HasPrefix(path, "/state") {
			target += query
		} else if strings.HasPrefix(path, "/saturation") {
			target += "?p=10bar"
		} else if path == "/table" {
			target += "?from=1bar&to=3bar&step=1bar"
		} else if strings.HasPrefix(path, "/process") {
			target += "?p1=60bar&t1=480C&p2=12bar&t2=280C"
		}
		req, _ := http.NewRequest(http.MethodOptions, target, nil)
		resp, err := http.DefaultClient.Do(req)
		if err != nil {
			t.Fatal(err)
		}
		resp.Body.Close()
		var allow []string
		for _, m := range methods {
			allow = append(allow, m)
			if m == "GET" {
				allow = append(allow, "HEAD")
			}
		}
		slices.Sort(allow)
		wantAllow := strings.Join(append(allow, "OPTIONS"), ", ")
		gotAllow := strings.Split(resp.Header.Get("Allow"), ", ")
		slices.Sort(gotAllow[:max(0, len(gotAllow)-1)]) // the order of the methods before OPTIONS is free
		if resp.StatusCode != http.StatusNoContent || strings.Join(gotAllow, ", ") != wantAllow {
			t.Errorf("OPTIONS %s: %d, Allow %q; want 204, Allow %q", path, resp.StatusCode, resp.Header.Get("Allow"), wantAllow)
		}
		if method != "GET" || path == "/saturation/h" {
			continue // /saturation/h is no property of the line; /metrics changes between calls
		}
		getResp, err := http.Get(target)
		if err != nil {
			t.Fatal(err)
		}
		body, _ := io.ReadAll(getResp.Body)
		getResp.Body.Close()
		headResp, err := http.Head(target)
		if err != nil {
			t.Fatal(err)
		}
		headBody, _ := io.ReadAll(headResp.Body)
		headResp.Body.Close()
		if headResp.StatusCode != getResp.StatusCode || len(headBody) != 0 ||
			headResp.Header.Get("Content-Type") != getResp.Header.Get("Content-Type") {
			t.Errorf("HEAD %s: %d %q, %d body bytes; GET gave %d %q", path, headResp.StatusCode,
				headResp.Header.Get("Content-Type"), len(headBody), getResp.StatusCode, getResp.Header.Get("Content-Type"))
		}
		if path != "/metrics" && headResp.ContentLength != int64(len(body)) {
			t.Errorf("HEAD %s: Content-Length %d, the GET body has %d bytes", path, headResp.ContentLength, len(body))
		}
	}
	metrics := get(srv, "/metrics").Body.String()
	if strings.Contains(metrics, "steamcell_http_errors_total{") {
		t.Errorf("HEAD and OPTIONS counted as errors:\n%s", grepLines(metrics, "steamcell_http_errors_total"))
	}
	for _, m := range []string{`method="HEAD",route="/state/{property}",status="200"`, `method="OPTIONS",route="/state/{property}",status="204"`} {
		if !strings.Contains(metrics, m) {
			t.Errorf("metrics lack requests %s:\n%s", m, grepLines(metrics, "steamcell_http_requests_total"))
		}
	}
}

// TestPreflight: with an allowed origin, a CORS preflight gets the CORS
// headers and Allow; without one, OPTIONS still gets Allow, and no CORS
// header.
func TestPreflight(t *testing.T) {
	preflight := map[string]string{"Origin": "https://plant.example", "Access-Control-Request-Method": "GET"}
	srv, _ := newServer(t, server.Config{CORSOrigins: []string{"https://plant.example"}})
	w := send(srv, http.MethodOptions, "/state/h?p=1bar&t=20C", "", preflight)
	if w.Code != 204 || w.Header().Get("Access-Control-Allow-Origin") != "https://plant.example" || w.Header().Get("Allow") != "GET, HEAD, OPTIONS" {
		t.Errorf("preflight with CORS on: %d %v", w.Code, w.Header())
	}
	srv, _ = newServer(t, server.Config{})
	w = send(srv, http.MethodOptions, "/state/h?p=1bar&t=20C", "", preflight)
	if w.Code != 204 || w.Header().Get("Access-Control-Allow-Origin") != "" || w.Header().Get("Allow") != "GET, HEAD, OPTIONS" {
		t.Errorf("preflight with CORS off: %d %v", w.Code, w.Header())
	}
	// A method no route takes is still refused, with the problem shape.
	w = send(srv, http.MethodDelete, "/state", "", nil)
	checkJSONError(t, "DELETE /state", w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 405, "method_not_allowed", "")
}

// TestStateStatus: the status route answers 200 and one line: ok, check:
// with the warning, or error: with the reason (issue 15: a refused cell
// shows only #VALUE!). Saturation temperature at 0.1 MPa: 372.755919 K
// (IAPWS R7-97(2012), Table 35), so 99.8 °C at 1 bar is within 0.5 K.
func TestStateStatus(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	for _, tc := range []struct {
		query   string
		want    string // prefix of the body
		warning bool   // a Steamcell-Warning header is sent
	}{
		{"p=6barg&t=330C", "ok", false},
		{"p=1bar&t=99.8C", "check: within 0.5 K of saturation", true},
		{"p=6barg&t=abc", `error: t "abc"`, false},
		{"p=6barg", "error: ", false},
		{"p=200MPa&t=300C", "error: p = 200 MPa", false},
		{"p=6barg&t=330C&colour=red", "error: colour is not a parameter", false},
	} {
		w := get(srv, "/state/status?"+tc.query)
		body := w.Body.String()
		if w.Code != 200 || !strings.HasPrefix(body, tc.want) || strings.Contains(body, "\n") ||
			(w.Header().Get("Steamcell-Warning") != "") != tc.warning {
			t.Errorf("/state/status?%s: %d %q (warning %q), want 200 %q…", tc.query, w.Code, body, w.Header().Get("Steamcell-Warning"), tc.want)
		}
		if tc.want == "ok" && body != "ok" {
			t.Errorf("/state/status?%s = %q, want ok", tc.query, body)
		}
	}
	// The value cell beside it keeps its warning header.
	if w := get(srv, "/state/h?p=1bar&t=99.8C"); w.Code != 200 || !strings.Contains(w.Header().Get("Steamcell-Warning"), "saturation") {
		t.Errorf("/state/h near saturation: %d, warning %q", w.Code, w.Header().Get("Steamcell-Warning"))
	}
}

// TestSaturationProperty: one property of the saturation line as a bare
// number. Checks from IAPWS R7-97(2012), Table 35 (Ts at 0.1, 1 and 10 MPa)
// and Table 33 (ps at 300, 500 and 600 K), to the 9 digits printed.
func TestSaturationProperty(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	for _, tc := range []struct {
		target string
		want   float64
	}{
		{"/saturation/t?p=0.1MPa&units=base", 372.755919},
		{"/saturation/t?p=1MPa&units=base", 453.035632},
		{"/saturation/t?p=10MPa&units=base", 584.149488},
		{"/saturation/p?t=300K&units=base", 0.353658941e-2},
		{"/saturation/p?t=500K&units=base", 0.263889776e1},
		{"/saturation/p?t=600K&units=base", 0.123443146e2},
	} {
		w := get(srv, tc.target)
		got, err := strconv.ParseFloat(w.Body.String(), 64)
		if w.Code != 200 || w.Header().Get("Content-Type") != "text/plain; charset=utf-8" || err != nil ||
			!scalar.EqualWithinRel(got, tc.want, 5e-9) {
			t.Errorf("%s: %d %q, want %.9g", tc.target, w.Code, w.Body.String(), tc.want)
		}
	}
	// Other properties agree with the engine's saturation state.
	sat, err := fn.SaturationAtT(453.15)
	if err != nil {
		t.Fatal(err)
	}
	for sym, want := range map[string]float64{"hf": sat.Liquid.H, "hg": sat.Vapour.H, "hfg": sat.Vapour.H - sat.Liquid.H, "vg": sat.Vapour.V} {
		w := get(srv, "/saturation/"+sym+"?t=180C")
		got, err := strconv.ParseFloat(w.Body.String(), 64)
		if w.Code != 200 || err != nil || !same(got, want) {
			t.Errorf("/saturation/%s?t=180C: %d %q, want %.15g", sym, w.Code, w.Body.String(), want)
		}
	}
	for _, tc := range []struct {
		target string
		status int
		code   string
	}{
		{"/saturation/h?p=10bar", 400, "unknown_property"},
		{"/saturation/all?p=10bar", 400, "unknown_property"},
		{"/saturation/hfg?p=10bar&t=180C", 400, "input_count"},
		{"/saturation/hfg?h=2000", 400, "unknown_input"},
		{"/saturation/hfg?t=400C", 422, "above_critical"},
	} {
		w := get(srv, tc.target)
		if w.Code != tc.status || !strings.HasPrefix(w.Body.String(), tc.code+": ") {
			t.Errorf("%s: %d %q, want %d %s", tc.target, w.Code, w.Body.String(), tc.status, tc.code)
		}
	}
}

// TestSaturationDefects are the rows of issue 11 on /saturation: get=phase
// wrote 3 header columns over 29 cells, and t=374C complained about x,
// which was never given.
func TestSaturationDefects(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	for _, get := range []string{"phase", "region", "phase,region", "hf,phase"} {
		w := send(srv, http.MethodGet, "/saturation?p=1bar&format=csv&get="+get, "", nil)
		lines := strings.Split(strings.TrimSpace(w.Body.String()), "\n")
		if w.Code != 200 || len(lines) != 2 || strings.Count(lines[0], ",") != strings.Count(lines[1], ",") {
			t.Errorf("get=%s: %d, header and cells differ:\n%s", get, w.Code, w.Body)
		}
	}
	for _, target := range []string{"/saturation?t=374C", "/saturation?p=23MPa", "/saturation?p=22.064MPa", "/saturation?t=647.096K", "/saturation/hf?t=374C"} {
		w := get(srv, target)
		body := w.Body.String()
		if w.Code != 422 || strings.Contains(body, "x ") || strings.Contains(body, "quality") || !strings.Contains(body, "critical") {
			t.Errorf("%s: %d %s, want 422 about the critical point, not about x", target, w.Code, body)
		}
	}
}

// grepLines returns the lines of s that contain sub.
func grepLines(s, sub string) string {
	var out []string
	for line := range strings.SplitSeq(s, "\n") {
		if strings.Contains(line, sub) {
			out = append(out, line)
		}
	}
	return strings.Join(out, "\n")
}

// BenchmarkCalcProbe measures what LibreOffice Calc sends for one
// WEBSERVICE cell (OPTIONS, HEAD, GET), against one GET of the same URL;
// compare the two in one run. A repeated GET costs what the first did.
func BenchmarkCalcProbe(b *testing.B) {
	srv, _ := newServer(b, server.Config{})
	target := "/state/h?p=6barg&t=330C"
	for _, bc := range []struct {
		name    string
		methods []string
	}{{"GET", []string{"GET"}}, {"OPTIONS+HEAD+GET", []string{"OPTIONS", "HEAD", "GET"}}, {"GET+GET", []string{"GET", "GET"}}} {
		b.Run(bc.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				for _, m := range bc.methods {
					if w := send(srv, m, target, "", nil); w.Code >= 300 {
						b.Fatal(m, w.Code)
					}
				}
			}
		})
	}
}

// A refused token on a cell route is one line of text, as the route's other
// errors are, so that the cell shows why (review of issue 15: only
// /state/{property} answered it as text).
func TestUnauthorizedCellRoutesAnswerText(t *testing.T) {
	srv, _ := newServer(t, server.Config{Token: "s3cret-token"})
	for _, target := range []string{
		"/state/h?p=6barg&t=330C", "/state/status?p=6barg&t=330C",
		"/saturation/t?p=10bar", "/process/expansion/efficiency?p1=60bar&t1=480C&p2=12bar&t2=280C",
	} {
		w := get(srv, target)
		if w.Code != http.StatusUnauthorized || !strings.HasPrefix(w.Header().Get("Content-Type"), "text/plain") ||
			!strings.HasPrefix(w.Body.String(), "unauthorized: ") {
			t.Errorf("GET %s without the token: %d %q %q, want 401 text \"unauthorized: …\"", target, w.Code, w.Header().Get("Content-Type"), w.Body)
		}
	}
	if w := get(srv, "/state?p=6barg&t=330C"); !strings.HasPrefix(w.Header().Get("Content-Type"), "application/problem+json") {
		t.Errorf("GET /state without the token: %q, want problem details", w.Header().Get("Content-Type"))
	}
}
