package server_test

import (
	"encoding/json"
	"net/http"
	"strings"
	"testing"

	"steamcell/server"
)

func TestDiagramRoutes(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	for _, tc := range []struct {
		method, target, body string
		status               int
		ctype, has           string
	}{
		{"GET", "/diagram/ts.svg?pt=p=10bar,t=400C,label=1", "", 200, "image/svg+xml", "<svg"},
		{"GET", "/diagram/ph.png?regions=1&isobars=1bar,10bar&isotherms=200C", "", 200, "image/png", "\x89PNG"},
		{"GET", "/diagram/tv.json?pt=p=1bar,x=0.5&units=us", "", 200, "application/json", `"unit":"ft³/lb"`},
		{"POST", "/diagram/hs.svg", `[{"p":"40bar","t":"400C","label":"1"},{"p":"1bar","s":6.77,"label":"2s","from":"1"}]`, 200, "image/svg+xml", "2s"},
		{"GET", "/diagram/xy.svg", "", 404, "", "kinds are ts, hs, ph, tv, pt"},
		{"GET", "/diagram/ts.gif", "", 404, "", "svg, .png or .json"},
		{"GET", "/diagram/ts.svg?pt=p=1bar", "", 400, "", "two inputs"},
		{"GET", "/diagram/ts.svg?pt=p=1bar,t=5000C", "", 422, "", "point 1"},
		{"GET", "/diagram/ts.svg?pt=p=1bar,t=200C,from=9", "", 400, "", "not the label"},
		{"GET", "/diagram/ts.svg?xmin=5", "", 400, "", "both ends"},
		{"GET", "/diagram/ts.svg?x=1.5", "", 400, "", "fraction"},
		{"GET", "/diagram/ts.svg?regions=maybe", "", 400, "", "regions=1"},
		{"GET", "/diagram/ts.svg?t=300C", "", 400, "", "does not take"},
		{"POST", "/diagram/ts.svg", `{"p":1}`, 400, "", "JSON array"},
	} {
		w := send(srv, tc.method, tc.target, tc.body, nil)
		if w.Code != tc.status || !strings.Contains(w.Header().Get("Content-Type"), tc.ctype) || !strings.Contains(w.Body.String(), tc.has) {
			t.Errorf("%s %s: %d %s %.200q, want %d %s with %q", tc.method, tc.target, w.Code, w.Header().Get("Content-Type"), w.Body.String(), tc.status, tc.ctype, tc.has)
		}
	}
}

func TestTableRoute(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	for _, tc := range []struct {
		target string
		status int
		ctype  string
		has    string
	}{
		{"/table?from=1bar&to=20bar&step=1bar&format=csv&units=bar", 200, "text/csv", "\n20,212.38"},
		{"/table?from=100C&to=200C&step=5C", 200, "application/json", `"saturation by temperature"`},
		{"/table?p=10bar&from=200C&to=500C&step=50C&get=h,s&format=xlsx", 200, "spreadsheetml", "PK"},
		{"/table?from=1bar&to=20bar&step=0.0001bar", 400, "", "limit is 5000"},
		{"/table?from=1&to=2&step=1", 400, "", "pressure unit"},
		{"/table?from=1bar&to=2bar&step=1bar&format=pdf", 400, "", "csv, json, xlsx"},
		{"/table?from=1bar&to=2bar&step=1bar&get=zz", 400, "", "not a property"},
		{"/table?from=1bar&to=2bar&step=1bar&t=3", 400, "", "does not take"},
	} {
		w := get(srv, tc.target)
		if w.Code != tc.status || !strings.Contains(w.Header().Get("Content-Type"), tc.ctype) || !strings.Contains(w.Body.String(), tc.has) {
			t.Errorf("%s: %d %s %.300q, want %d %s with %q", tc.target, w.Code, w.Header().Get("Content-Type"), w.Body.String(), tc.status, tc.ctype, tc.has)
		}
	}
	// Per-row status: 240 bar is above the critical pressure.
	w := get(srv, "/table?from=200bar&to=240bar&step=20bar&units=bar")
	var tb struct{ Rows []struct{ Status string } }
	if err := json.Unmarshal(w.Body.Bytes(), &tb); err != nil || len(tb.Rows) != 3 || tb.Rows[0].Status != "ok" || !strings.Contains(tb.Rows[2].Status, "critical") {
		t.Errorf("200 to 240 bar: %s", w.Body.String())
	}
}

func TestPage(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	w := get(srv, "/")
	if w.Code != http.StatusOK || !strings.Contains(w.Header().Get("Content-Type"), "text/html") {
		t.Fatalf("GET /: %d %s", w.Code, w.Header().Get("Content-Type"))
	}
	body := w.Body.String()
	// Every kind and unit set is offered, and nothing is loaded from
	// elsewhere.
	for _, want := range []string{`value="ts"`, `value="pt"`, "<option>us</option>", `src="/web/page.js"`, "Engineering estimate from IAPWS-IF97"} {
		if !strings.Contains(body, want) {
			t.Errorf("page lacks %q", want)
		}
	}
	if strings.Contains(body, "http://") || strings.Contains(body, "https://") {
		t.Error("page refers to another site")
	}
	for _, a := range []string{"/web/page.js", "/web/page.css"} {
		if w := get(srv, a); w.Code != 200 || w.Body.Len() < 100 {
			t.Errorf("GET %s: %d, %d bytes", a, w.Code, w.Body.Len())
		}
	}
}
