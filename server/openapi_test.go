package server_test

import (
	"bytes"
	"context"
	"io"
	"net/http/httptest"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/getkin/kin-openapi/openapi3"
	"github.com/getkin/kin-openapi/openapi3filter"
	"github.com/getkin/kin-openapi/routers/legacy"

	"steamcell/fn/process"
	"steamcell/fn/units"
	"steamcell/server"
)

// loadSpec loads and validates the served OpenAPI document with
// kin-openapi, which reads OpenAPI 3.0, 3.1 and 3.2 and validates 3.1
// schemas as JSON Schema 2020-12.
func loadSpec(t *testing.T) *openapi3.T {
	t.Helper()
	loader := openapi3.NewLoader()
	doc, err := loader.LoadFromData(server.OpenAPI())
	if err != nil {
		t.Fatalf("load OpenAPI: %v", err)
	}
	if err := doc.Validate(context.Background(), openapi3.EnableExamplesValidation()); err != nil {
		t.Fatalf("OpenAPI document is not valid: %v", err)
	}
	return doc
}

func TestOpenAPIDocument(t *testing.T) {
	doc := loadSpec(t)
	if !doc.IsOpenAPI31OrLater() || doc.OpenAPI != "3.1.0" {
		t.Errorf("openapi = %q, want 3.1.0", doc.OpenAPI)
	}
	var paths []string
	for p := range doc.Paths.Map() {
		paths = append(paths, p)
	}
	sort.Strings(paths)
	want := server.RoutePaths()
	if !slices.Equal(paths, want) {
		t.Errorf("paths %q, want the server's routes %q", paths, want)
	}
	// Every documented path is a route of the server (no 404).
	srv, _ := newServer(t, server.Config{})
	for _, p := range paths {
		for method := range doc.Paths.Value(p).Operations() {
			w := send(srv, method, pathExample.Replace(p), "", nil)
			if w.Code == 404 || w.Code == 405 {
				t.Errorf("%s %s is documented but answers %d", method, p, w.Code)
			}
		}
	}
	// The unit sets offered are those of the engine.
	enum := doc.Components.Parameters["units"].Value.Schema.Value.Enum
	var names []string
	for _, e := range enum {
		names = append(names, e.(string))
	}
	if !slices.Equal(names, units.SetNames()) {
		t.Errorf("units enum %q, want %q", names, units.SetNames())
	}
	// The process kinds offered are those of the engine.
	names = nil
	for _, e := range doc.Components.Parameters["kind"].Value.Schema.Value.Enum {
		names = append(names, e.(string))
	}
	if !slices.Equal(names, process.KindNames()) {
		t.Errorf("kind enum %q, want %q", names, process.KindNames())
	}
}

// TestOpenAPIResponses checks real answers of every route against the
// document.
func TestOpenAPIResponses(t *testing.T) {
	doc := loadSpec(t)
	router, err := legacy.NewRouter(doc)
	if err != nil {
		t.Fatal(err)
	}
	const xlsx = "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
	openapi3filter.RegisterBodyDecoder(xlsx, openapi3filter.FileBodyDecoder)
	srv, _ := newServer(t, server.Config{Workbook: failingFiller{"copy"}})
	for _, tc := range []struct {
		method, target, ctype, body string
		status                      int
	}{
		{"GET", "/state?p=6barg&t=330C", "", "", 200},
		{"GET", "/state?p=1MPa&x=0.5&get=all", "", "", 200},
		{"GET", "/state?p=6barg&t=330C&format=csv", "", "", 200},
		{"GET", "/state?p=6bargg&t=330C", "", "", 400},
		{"GET", "/state?p=200MPa&t=330C", "", "", 422},
		{"GET", "/state/h?p=6barg&t=330C&units=us", "", "", 200},
		{"GET", "/state/h?p=6barg", "", "", 400},
		{"GET", "/state/cp?p=1MPa&x=0.5", "", "", 422},
		{"GET", "/state?p=100bar%C2%B10.2bar&t=500C%C2%B10.5K&k=2", "", "", 200},
		{"GET", "/process/expansion?p1=60bar%C2%B10.3bar&t1=480C%C2%B11K&p2=12bar%C2%B10.1bar&t2=280C%C2%B11K&k=2", "", "", 200},
		{"GET", "/process/expansion?p1=60bar&t1=480C&p2=12bar&t2=280C&format=csv", "", "", 200},
		{"GET", "/process/exchanger?p1=12bar&t1=300C&t2=165C&p3=80bar&t3=157C&t4=184C", "", "", 200},
		{"GET", "/process/expansion/u(efficiency)?p1=60bar%C2%B10.3bar&t1=480C&p2=12bar&t2=280C", "", "", 200},
		{"GET", "/process/turbine?p1=1MPa", "", "", 404},
		{"GET", "/process/throttling?p1=1MPa&p2=0.1MPa&t2=200C", "", "", 422},
		{"GET", "/process/expansion?p1=6MPa", "", "", 400},
		{"GET", "/saturation?p=10bar", "", "", 200},
		{"GET", "/saturation/t?p=10bar", "", "", 200},
		{"GET", "/saturation/hfg?t=400C", "", "", 422},
		{"GET", "/state/status?p=6barg&t=330C", "", "", 200},
		{"GET", "/state/status?p=1bar&t=99.8C", "", "", 200},
		{"GET", "/state/status?p=6bargg&t=330C", "", "", 200},
		{"GET", "/saturation?t=400C", "", "", 422},
		{"POST", "/batch?get=h", "text/csv", "tag,p [bar],t [°C]\na,1,20\nb,1,x\n", 200},
		{"POST", "/batch?get=h", "application/json", `[{"p":"1bar","t":"20C"},{"p":1}]`, 200},
		{"POST", "/batch", "application/xml", "<x/>", 415},
		{"POST", "/workbook?name=a.xlsx", xlsx, "PK", 200},
		{"GET", "/openapi.json", "", "", 200},
		{"GET", "/healthz", "", "", 200},
		{"GET", "/readyz", "", "", 200},
		{"GET", "/metrics", "", "", 200},
	} {
		var hdr map[string]string
		if tc.ctype != "" {
			hdr = map[string]string{"Content-Type": tc.ctype}
		}
		w := send(srv, tc.method, tc.target, tc.body, hdr)
		if w.Code != tc.status {
			t.Errorf("%s %s: status %d, want %d: %s", tc.method, tc.target, w.Code, tc.status, clip(w.Body.String()))
			continue
		}
		req := httptest.NewRequest(tc.method, "http://127.0.0.1:8097"+tc.target, strings.NewReader(tc.body))
		if tc.ctype != "" {
			req.Header.Set("Content-Type", tc.ctype)
		}
		route, params, err := router.FindRoute(req)
		if err != nil {
			t.Errorf("%s %s: not in the document: %v", tc.method, tc.target, err)
			continue
		}
		in := &openapi3filter.ResponseValidationInput{
			RequestValidationInput: &openapi3filter.RequestValidationInput{Request: req, PathParams: params, Route: route,
				Options: &openapi3filter.Options{IncludeResponseStatus: true}},
			Status: w.Code,
			Header: w.Header(),
			Body:   io.NopCloser(bytes.NewReader(w.Body.Bytes())),
		}
		in.RequestValidationInput.Options.WithCustomSchemaErrorFunc(func(err *openapi3.SchemaError) string { return err.Error() })
		if err := openapi3filter.ValidateResponse(context.Background(), in); err != nil {
			t.Errorf("%s %s: answer does not match the document: %v", tc.method, tc.target, err)
		}
	}
}
