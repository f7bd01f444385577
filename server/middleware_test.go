package server_test

import (
	"bufio"
	"context"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"net/http"
	"net/http/httptest"
	"net/url"
	"strings"
	"testing"

	"steamcell/server"
)

// TestReadyz: ready once built, open without a token like /healthz, and
// 503 after Drain while the other routes still answer.
func TestReadyz(t *testing.T) {
	srv, _ := newServer(t, server.Config{Token: "s3cret-token"})
	if w := get(srv, "/readyz"); w.Code != 200 || !strings.Contains(w.Body.String(), `"ready"`) {
		t.Errorf("/readyz before Drain: %d %s", w.Code, w.Body)
	}
	srv.Drain()
	if w := get(srv, "/readyz"); w.Code != http.StatusServiceUnavailable || !strings.Contains(w.Body.String(), `"draining"`) {
		t.Errorf("/readyz after Drain: %d %s, want 503 draining", w.Code, w.Body)
	}
	if w := get(srv, "/healthz"); w.Code != 200 {
		t.Errorf("/healthz after Drain: %d, want 200 (the process is alive)", w.Code)
	}
	if w := get(srv, "/state?p=1bar&t=20C&key=s3cret-token"); w.Code != 200 {
		t.Errorf("/state after Drain: %d, want 200 (requests are still served)", w.Code)
	}
}

// gateFiller is a workbook filler that says when a fill has started and
// waits for the test to let it finish.
type gateFiller struct {
	started chan struct{}
	release chan struct{}
}

func (f gateFiller) Fill(_ context.Context, in io.Reader, _ string, _ server.WorkbookOptions, out io.Writer) (any, error) {
	f.started <- struct{}{}
	<-f.release
	_, err := io.Copy(out, in)
	return nil, err
}

// TestBulkLimit: with MaxBulk requests of /batch and /workbook running,
// the next is answered 503 with Retry-After at once; single states are not
// limited; a freed place is taken again.
func TestBulkLimit(t *testing.T) {
	f := gateFiller{started: make(chan struct{}), release: make(chan struct{})}
	srv, _ := newServer(t, server.Config{Workbook: f, MaxBulk: 1})
	first := make(chan int, 1)
	go func() { first <- send(srv, http.MethodPost, "/workbook", "PK", nil).Code }()
	<-f.started

	const batch = "p [bar],t [°C]\n1,20\n"
	csvType := map[string]string{"Content-Type": "text/csv"}
	for _, tc := range []struct{ method, target, body string }{
		{http.MethodPost, "/batch", batch},
		{http.MethodPost, "/workbook", "PK"},
	} {
		w := send(srv, tc.method, tc.target, tc.body, csvType)
		if w.Code != http.StatusServiceUnavailable {
			t.Errorf("%s %s while full: status %d, want 503", tc.method, tc.target, w.Code)
		}
		if ra := w.Header().Get("Retry-After"); ra == "" || strings.Trim(ra, "0123456789") != "" {
			t.Errorf("%s %s while full: Retry-After %q, want delay-seconds (RFC 9110 section 10.2.3)", tc.method, tc.target, ra)
		}
	}
	if w := get(srv, "/state?p=1bar&t=20C"); w.Code != 200 {
		t.Errorf("/state while full: %d, want 200", w.Code)
	}
	close(f.release)
	if code := <-first; code != 200 {
		t.Errorf("the running fill: %d, want 200", code)
	}
	if w := send(srv, http.MethodPost, "/batch", batch, csvType); w.Code != 200 {
		t.Errorf("/batch after the fill: %d, want 200: %s", w.Code, w.Body)
	}
}

// pipeWriter is a ResponseWriter whose body goes into a pipe, so that the
// handler waits on the reader as it would on a slow client.
type pipeWriter struct {
	h    http.Header
	code int
	w    *io.PipeWriter
}

func (p *pipeWriter) Header() http.Header         { return p.h }
func (p *pipeWriter) WriteHeader(code int)        { p.code = code }
func (p *pipeWriter) Write(b []byte) (int, error) { return p.w.Write(b) }
func (p *pipeWriter) Flush()                      {}

// TestBatchStoppedByShutdown: a batch being streamed when StopStreams is
// called ends after its chunk with a last row that says so (CSV), or with
// "complete": false and the reason (JSON), and never mid-row.
func TestBatchStoppedByShutdown(t *testing.T) {
	var body strings.Builder
	body.WriteString("tag,p [bar],t [°C]\n")
	const rows = 10000 // several chunks of the stream (2048 rows a chunk with two workers)
	for i := range rows {
		fmt.Fprintf(&body, "FW-%d,1,%d\n", i, 20+i%60)
	}
	jsonBody := "[" + strings.TrimSuffix(strings.Repeat(`{"p":"1bar","t":"20C"},`, rows), ",") + "]"

	for _, tc := range []struct{ ctype, body string }{{"text/csv", body.String()}, {"application/json", jsonBody}} {
		srv, _ := newServer(t, server.Config{})
		pr, pw := io.Pipe()
		rw := &pipeWriter{h: http.Header{}, w: pw}
		req := httptest.NewRequest(http.MethodPost, "/batch?get=h", strings.NewReader(tc.body))
		req.Header.Set("Content-Type", tc.ctype)
		go func() {
			srv.ServeHTTP(rw, req)
			pw.Close()
		}()
		// A small read buffer: having read the first answer line, the
		// handler is still writing its first chunk when the stop comes.
		br := bufio.NewReaderSize(pr, 16)
		head, err := br.ReadString('\n')
		if err != nil {
			t.Fatal(err)
		}
		srv.StopStreams()
		rest, err := io.ReadAll(br)
		if err != nil {
			t.Fatal(err)
		}
		answer := head + string(rest)
		if tc.ctype == "text/csv" {
			recs, err := csv.NewReader(strings.NewReader(answer)).ReadAll()
			if err != nil {
				t.Fatalf("CSV answer: %v", err)
			}
			last := recs[len(recs)-1]
			if len(recs) < 3 || len(recs) > rows || !strings.HasPrefix(last[3], "stopped: the server is shutting down") {
				t.Errorf("CSV batch stopped by shutdown: %d records, last %q", len(recs), last)
			}
			for _, r := range recs[1 : len(recs)-1] {
				if r[3] != "ok" {
					t.Errorf("row before the stop: %q", r)
				}
			}
			continue
		}
		var a struct {
			Rows     []json.RawMessage `json:"rows"`
			Total    int               `json:"rows_total"`
			Complete bool              `json:"complete"`
			Stopped  *struct{ Code string }
		}
		if err := json.Unmarshal([]byte(answer), &a); err != nil {
			t.Fatalf("JSON answer: %v", err)
		}
		if a.Complete || a.Stopped == nil || a.Stopped.Code != "shutting_down" || a.Total == 0 || a.Total >= rows || len(a.Rows) != a.Total {
			t.Errorf("JSON batch stopped by shutdown: complete %v, stopped %+v, %d of %d rows", a.Complete, a.Stopped, a.Total, len(a.Rows))
		}
	}
}

// TestLogRedaction: the token never reaches the log in clear, however the
// client spells the parameter or wherever it puts the token (issue 16:
// api_key=, ;key= and the path leaked before).
func TestLogRedaction(t *testing.T) {
	const token = "Kestrel-s3cret+/=x"
	q := url.QueryEscape(token)
	for _, target := range []string{
		"/state?p=1bar&t=20C&key=" + q,
		"/state?p=1bar&t=20C&KEY=" + q,
		"/state?p=1bar&t=20C&k%65y=" + q,
		"/state?p=1bar&t=20C&api_key=" + q,
		"/state?p=1bar&t=20C&apiKey=" + q,
		"/state?p=1bar&t=20C&x-api-key=" + q,
		"/state?p=1bar&t=20C&access_token=" + q,
		"/state?p=1bar&t=20C&token=" + q,
		"/state?p=1bar;key=" + q,
		"/state?p=1bar&t=20C;api_key=" + q,
		"/state?key=%4Bestrel-s3cret%2B%2F%3Dx&p=1bar",
		"/state?p=1bar&t=20C&" + q,
		"/state?p=" + q,
		"/state?p=1bar&key%zz=" + q,
		"/state?p=%zz&note=" + q,
		"/state/h;key=" + q + "?p=1bar&t=20C",
		"/state/" + url.PathEscape(token) + "?p=1bar&t=20C",
		"/key=" + url.PathEscape(token),
		"/" + url.PathEscape(token) + "/state",
	} {
		for _, cfgToken := range []string{token, ""} {
			srv, logs := newServer(t, server.Config{Token: cfgToken})
			req := httptest.NewRequest(http.MethodGet, "http://steamcell.test"+target, nil)
			srv.ServeHTTP(httptest.NewRecorder(), req)
			log := logs.String()
			if !strings.Contains(log, `"msg":"request"`) {
				t.Fatalf("%s: no request logged: %s", target, log)
			}
			decoded, _ := url.QueryUnescape(log)
			if cfgToken == "" && !strings.Contains(strings.ToLower(target), "key") && !strings.Contains(target, "token=") {
				// Without a token of its own the server cannot know a bare
				// value is one; parameters named as secrets are still hidden.
				continue
			}
			for _, form := range []string{token, q, url.PathEscape(token), "s3cret"} {
				if strings.Contains(log, form) || strings.Contains(decoded, form) {
					t.Errorf("%s (server token %q): the log shows %q:\n%s", target, cfgToken, form, log)
				}
			}
		}
	}
	// What is not a secret stays readable.
	srv, logs := newServer(t, server.Config{Token: token})
	srv.ServeHTTP(httptest.NewRecorder(), httptest.NewRequest(http.MethodGet, "/state/h;unit=bar?p=1bar&t=20C;x=1", nil))
	if log := logs.String(); !strings.Contains(log, "p=1bar&t=20C;x=1") || !strings.Contains(log, "/state/h;unit=bar") {
		t.Errorf("plain parameters were redacted:\n%s", log)
	}
}
