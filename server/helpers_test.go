package server_test

import (
	"bytes"
	"encoding/json"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"strings"
	"sync"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/server"
)

// newServer returns a server with cfg whose request log goes to the
// returned buffer.
func newServer(t testing.TB, cfg server.Config) (*server.Server, *syncBuffer) {
	t.Helper()
	logs := &syncBuffer{}
	if cfg.Logger == nil {
		cfg.Logger = slog.New(slog.NewJSONHandler(logs, nil))
	}
	if cfg.Version == "" {
		cfg.Version = "test"
	}
	return server.New(cfg), logs
}

// syncBuffer is a bytes.Buffer safe for the server's goroutines.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

// get sends a GET of target (path and raw query) to h.
func get(h http.Handler, target string) *httptest.ResponseRecorder {
	return send(h, http.MethodGet, target, "", nil)
}

// send sends a request with an optional body and headers.
func send(h http.Handler, method, target, body string, header map[string]string) *httptest.ResponseRecorder {
	var r io.Reader
	if body != "" {
		r = strings.NewReader(body)
	}
	req := httptest.NewRequest(method, "http://steamcell.test/", r)
	// Set the target raw, so that tests can send what a hostile client
	// would (invalid escapes, invalid UTF-8) without NewRequest refusing it.
	path, query, _ := strings.Cut(target, "?")
	req.URL.Path, req.URL.RawPath, req.URL.RawQuery = path, "", query
	req.RequestURI = target
	for k, v := range header {
		req.Header.Set(k, v)
	}
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	return w
}

// decode reads a JSON object answer.
func decode(t *testing.T, w *httptest.ResponseRecorder) map[string]any {
	t.Helper()
	var m map[string]any
	if err := json.Unmarshal(w.Body.Bytes(), &m); err != nil {
		t.Fatalf("answer is not a JSON object: %v\n%s", err, w.Body.String())
	}
	return m
}

// number returns the number under key of a decoded answer.
func number(t *testing.T, m map[string]any, key string) float64 {
	t.Helper()
	v, ok := m[key].(float64)
	if !ok {
		t.Fatalf("answer has no number %q: %v", key, m)
	}
	return v
}

// solve is fn.Solve of two base-unit inputs, failing the test on error.
func solve(t *testing.T, a, b fn.Input) fn.State {
	t.Helper()
	st, err := fn.Solve(a, b)
	if err != nil {
		t.Fatalf("fn.Solve(%v, %v): %v", a, b, err)
	}
	return st
}

// same compares a served value with the engine's: the server only
// converts units, so they agree to rounding.
func same(got, want float64) bool { return scalar.EqualWithinAbsOrRel(got, want, 1e-12, 1e-12) }
