package server_test

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"net"
	"net/http"
	"runtime"
	"strings"
	"sync"
	"testing"
	"time"

	"steamcell/server"
)

func TestToken(t *testing.T) {
	srv, logs := newServer(t, server.Config{Token: "s3cret-token"})
	for _, tc := range []struct {
		name   string
		target string
		header map[string]string
		status int
	}{
		{"no token", "/state?p=1bar&t=20C", nil, 401},
		{"wrong bearer", "/state?p=1bar&t=20C", map[string]string{"Authorization": "Bearer nope"}, 401},
		{"bearer", "/state?p=1bar&t=20C", map[string]string{"Authorization": "Bearer s3cret-token"}, 200},
		{"bearer, other case", "/state?p=1bar&t=20C", map[string]string{"Authorization": "bearer s3cret-token"}, 200},
		{"basic", "/state?p=1bar&t=20C", map[string]string{"Authorization": "Basic czNjcmV0LXRva2Vu"}, 401},
		{"key=", "/state/h?p=1bar&t=20C&key=s3cret-token", nil, 200},
		{"escaped key=", "/state/h?p=1bar&t=20C&%6Bey=s3cret%2Dtoken", nil, 200},
		{"wrong key=", "/state/h?p=1bar&t=20C&key=s3cret", nil, 401},
		{"healthz is open", "/healthz", nil, 200},
		{"metrics want it", "/metrics", nil, 401},
		{"openapi wants it", "/openapi.json", nil, 401},
		{"batch wants it", "/batch", nil, 401},
	} {
		method := http.MethodGet
		if tc.target == "/batch" {
			method = http.MethodPost
		}
		w := send(srv, method, tc.target, "", tc.header)
		if w.Code != tc.status {
			t.Errorf("%s: status %d, want %d: %s", tc.name, w.Code, tc.status, w.Body)
		}
		if w.Code == 401 {
			if w.Header().Get("WWW-Authenticate") == "" {
				t.Errorf("%s: 401 without WWW-Authenticate", tc.name)
			}
			if strings.HasPrefix(tc.target, "/state/") && !strings.HasPrefix(w.Body.String(), "unauthorized: ") {
				t.Errorf("%s: body %q, want a text line", tc.name, w.Body)
			}
		}
	}
	if strings.Contains(logs.String(), "s3cret") {
		t.Errorf("the token reached the log:\n%s", logs)
	}
	if !strings.Contains(logs.String(), "key=REDACTED") {
		t.Errorf("the log does not show the redacted key:\n%s", logs)
	}
}

func TestCORS(t *testing.T) {
	preflight := map[string]string{"Origin": "https://plant.example", "Access-Control-Request-Method": "GET"}
	// Off by default: no CORS header, no preflight answer.
	srv, _ := newServer(t, server.Config{})
	w := send(srv, http.MethodGet, "/state?p=1bar&t=20C", "", map[string]string{"Origin": "https://plant.example"})
	if h := w.Header().Get("Access-Control-Allow-Origin"); h != "" {
		t.Errorf("CORS off: Access-Control-Allow-Origin %q", h)
	}
	// OPTIONS is answered (Allow), but with no CORS header a browser
	// refuses the cross-origin call.
	if w := send(srv, http.MethodOptions, "/state", "", preflight); w.Header().Get("Access-Control-Allow-Origin") != "" ||
		w.Header().Get("Access-Control-Allow-Methods") != "" {
		t.Errorf("CORS off: preflight answered %d %v", w.Code, w.Header())
	}
	// On for one origin.
	srv, _ = newServer(t, server.Config{CORSOrigins: []string{"https://plant.example"}})
	w = send(srv, http.MethodOptions, "/state", "", preflight)
	if w.Code != 204 || w.Header().Get("Access-Control-Allow-Origin") != "https://plant.example" ||
		!strings.Contains(w.Header().Get("Access-Control-Allow-Headers"), "Authorization") {
		t.Errorf("preflight: %d %v", w.Code, w.Header())
	}
	w = send(srv, http.MethodGet, "/state?p=1bar&t=20C", "", map[string]string{"Origin": "https://other.example"})
	if w.Header().Get("Access-Control-Allow-Origin") != "" {
		t.Errorf("other origin allowed: %v", w.Header())
	}
}

func TestHealthOpenAPIMetrics(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	w := get(srv, "/healthz")
	m := decode(t, w)
	if w.Code != 200 || m["status"] != "ok" || m["version"] != "test" || m["caution"] != server.Caution {
		t.Errorf("/healthz: %d %v", w.Code, m)
	}
	w = get(srv, "/openapi.json")
	if w.Code != 200 || !json.Valid(w.Body.Bytes()) || !strings.Contains(w.Body.String(), `"openapi": "3.1.0"`) {
		t.Errorf("/openapi.json: %d %s", w.Code, clip(w.Body.String()))
	}

	get(srv, "/state/h?p=1bar&t=20C")
	get(srv, "/state/h?p=1bar&t=20C")
	get(srv, "/state?p=1bargg&t=20C")
	get(srv, "/no/such/route/a")
	get(srv, "/no/such/route/b")
	w = get(srv, "/metrics")
	body := w.Body.String()
	if w.Code != 200 || !strings.HasPrefix(w.Header().Get("Content-Type"), "text/plain") {
		t.Fatalf("/metrics: %d %q", w.Code, w.Header().Get("Content-Type"))
	}
	for _, want := range []string{
		`steamcell_http_requests_total{method="GET",route="/state/{property}",status="200"} 2`,
		`steamcell_http_errors_total{code="unknown_unit",route="/state"} 1`,
		`steamcell_http_requests_total{method="GET",route="unmatched",status="404"} 2`,
		`steamcell_http_request_duration_seconds_bucket{route="/state/{property}",le="+Inf"} 2`,
		`steamcell_http_request_duration_seconds_count{route="/state"} 1`,
		"go_goroutines",
	} {
		if !strings.Contains(body, want) {
			t.Errorf("/metrics lacks %s", want)
		}
	}
}

// TestRequestLog: one structured line per request, with route, status and
// the error code.
func TestRequestLog(t *testing.T) {
	srv, logs := newServer(t, server.Config{})
	get(srv, "/state/h?p=1bar&t=20C")
	get(srv, "/state?p=1bar&t=5000C")
	lines := strings.Split(strings.TrimSpace(logs.String()), "\n")
	if len(lines) != 2 {
		t.Fatalf("%d log lines, want 2:\n%s", len(lines), logs)
	}
	var rec struct {
		Msg, Method, Route, Path, Query, Error string
		Status                                 int
		Ms                                     float64
	}
	if err := json.Unmarshal([]byte(lines[1]), &rec); err != nil {
		t.Fatal(err)
	}
	if rec.Msg != "request" || rec.Route != "/state" || rec.Status != 422 || rec.Error != "out_of_range" || rec.Query != "p=1bar&t=5000C" {
		t.Errorf("log line %s", lines[1])
	}
}

func TestWorkbookRoute(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	w := send(srv, http.MethodPost, "/workbook", "PK", nil)
	checkJSONError(t, "no filler", w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 501, "not_implemented", "")

	srv, _ = newServer(t, server.Config{Workbook: failingFiller{"copy"}, MaxWorkbookBytes: 1000})
	w = send(srv, http.MethodPost, "/workbook?name=C:%5Ctests%5Cdrum.xlsx&units=us&get=h,s", "PK-file", nil)
	if w.Code != 200 || w.Body.String() != "PK-file" {
		t.Errorf("fill: %d %q", w.Code, w.Body)
	}
	if cd := w.Header().Get("Content-Disposition"); cd != `attachment; filename=drum_filled.xlsx` {
		t.Errorf("Content-Disposition %q", cd)
	}
	var sum map[string]any
	if err := json.Unmarshal([]byte(w.Header().Get("Steamcell-Summary")), &sum); err != nil || sum["note"] != "Température" {
		t.Errorf("Steamcell-Summary %q: %v", w.Header().Get("Steamcell-Summary"), err)
	}
	w = send(srv, http.MethodPost, "/workbook", strings.Repeat("x", 2000), nil)
	checkJSONError(t, "too large", w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 413, "body_too_large", "")
	w = send(srv, http.MethodPost, "/workbook", "", nil)
	checkJSONError(t, "empty", w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 400, "malformed_body", "")

	srv, _ = newServer(t, server.Config{Workbook: failingFiller{"user"}})
	w = send(srv, http.MethodPost, "/workbook", "not a workbook", nil)
	checkJSONError(t, "user's file", w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 400, "bad_workbook", "")
}

// TestGracefulShutdown: Shutdown waits for a batch in progress, which
// finishes with every row answered.
func TestGracefulShutdown(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	hs := srv.HTTPServer("127.0.0.1:0")
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	active := make(chan struct{}, 1)
	hs.ConnState = func(_ net.Conn, st http.ConnState) {
		if st == http.StateActive { // the server has read a request's first bytes
			select {
			case active <- struct{}{}:
			default:
			}
		}
	}
	served := make(chan error, 1)
	go func() { served <- hs.Serve(ln) }()

	pr, pw := io.Pipe()
	type result struct {
		body string
		err  error
	}
	done := make(chan result, 1)
	go func() {
		resp, err := http.Post("http://"+ln.Addr().String()+"/batch?get=h", "text/csv", pr)
		if err != nil {
			done <- result{err: err}
			return
		}
		defer resp.Body.Close()
		b, err := io.ReadAll(resp.Body)
		done <- result{string(b), err}
	}()
	if _, err := io.WriteString(pw, "p [bar],t [°C]\n1,20\n"); err != nil {
		t.Fatal(err)
	}
	<-active // the request is in the server, its body still coming

	closed := make(chan struct{})
	hs.RegisterOnShutdown(func() { close(closed) }) // run once the listeners are closed
	shut := make(chan error, 1)
	go func() { shut <- hs.Shutdown(context.Background()) }()
	<-closed
	select {
	case err := <-shut:
		t.Fatalf("Shutdown returned (%v) with a request in progress", err)
	default:
	}
	// New connections are refused meanwhile.
	if c, err := net.DialTimeout("tcp", ln.Addr().String(), time.Second); err == nil {
		c.Close()
		t.Errorf("a new connection was accepted during shutdown")
	}
	if _, err := io.WriteString(pw, "1,30\n1,40\n"); err != nil {
		t.Fatal(err)
	}
	pw.Close()
	r := <-done
	if r.err != nil || strings.Count(r.body, ",ok,") != 3 {
		t.Errorf("batch during shutdown: %v %q", r.err, r.body)
	}
	if err := <-shut; err != nil {
		t.Errorf("Shutdown: %v", err)
	}
	if err := <-served; err != http.ErrServerClosed {
		t.Errorf("Serve: %v", err)
	}
}

// TestHTTPServerLimits: the http.Server of the handler carries the
// timeouts and the header limit.
func TestHTTPServerLimits(t *testing.T) {
	srv, _ := newServer(t, server.Config{MaxHeaderBytes: 8 << 10})
	hs := srv.HTTPServer("127.0.0.1:0")
	if hs.ReadTimeout != server.DefaultReadTimeout || hs.WriteTimeout != server.DefaultWriteTimeout ||
		hs.IdleTimeout != server.DefaultIdleTimeout || hs.ReadHeaderTimeout <= 0 || hs.MaxHeaderBytes != 8<<10 {
		t.Errorf("http.Server limits: %+v", hs)
	}
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	go hs.Serve(ln)
	defer hs.Close()
	resp, err := http.Get("http://" + ln.Addr().String() + "/state?" + strings.Repeat("x", 40<<10))
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != http.StatusRequestHeaderFieldsTooLarge {
		t.Errorf("40 kB request line: status %d, want 431", resp.StatusCode)
	}
}

// countingFiller records how many fills run at once.
type countingFiller struct {
	mu        sync.Mutex
	now, most int
	hold      chan struct{}
}

func (f *countingFiller) Fill(_ context.Context, in io.Reader, _ string, _ server.WorkbookOptions, out io.Writer) (any, error) {
	f.mu.Lock()
	f.now++
	f.most = max(f.most, f.now)
	f.mu.Unlock()
	<-f.hold
	f.mu.Lock()
	f.now--
	f.mu.Unlock()
	_, err := io.Copy(out, in)
	return nil, err
}

// TestWorkbookOneAtATime: fills, which hold a sheet in memory, run one at a
// time; the others wait their turn and are answered.
func TestWorkbookOneAtATime(t *testing.T) {
	f := &countingFiller{hold: make(chan struct{})}
	srv, _ := newServer(t, server.Config{Workbook: f})
	var wg sync.WaitGroup
	codes := make([]int, 3)
	for i := range codes {
		wg.Go(func() { codes[i] = send(srv, http.MethodPost, "/workbook", "PK", nil).Code })
	}
	waitInFlight(t, srv, len(codes)) // all three are in the server before the first is let go
	for range codes {
		f.hold <- struct{}{}
	}
	wg.Wait()
	if f.most != 1 || codes[0] != 200 || codes[1] != 200 || codes[2] != 200 {
		t.Errorf("fills at once: %d (want 1), statuses %v", f.most, codes)
	}
}

// waitInFlight waits until the server reports n requests in flight besides
// the /metrics request that asks (its gauge steamcell_http_requests_in_flight).
func waitInFlight(t *testing.T, srv http.Handler, n int) {
	t.Helper()
	want := fmt.Sprintf("steamcell_http_requests_in_flight %d\n", n+1)
	for range 100000 {
		if strings.Contains(get(srv, "/metrics").Body.String(), want) {
			return
		}
		runtime.Gosched()
	}
	t.Fatalf("the server never had %d requests in flight", n)
}
