package server

import (
	"crypto/subtle"
	"errors"
	"fmt"
	"log/slog"
	"net/http"
	"net/url"
	"runtime/debug"
	"slices"
	"strings"
	"time"

	"github.com/gin-gonic/gin"
)

// ctxErrorCode is the gin context key under which note records the error
// code of a failed request, for the request log and the metrics.
const ctxErrorCode = "steamcell.error"

// logRequests writes one structured log line per request and records its
// metrics. Secrets are redacted from the logged path and query (see
// redactPath and redactLogged); the Authorization header is never logged.
func (s *Server) logRequests(c *gin.Context) {
	start := time.Now()
	c.Writer.Header()["Steamcell-Caution"] = cautionHeader
	s.metrics.inflight.Inc()
	defer s.metrics.inflight.Dec()
	c.Next()
	elapsed := time.Since(start)
	route := routeOf(c)
	status := c.Writer.Status()
	code := c.GetString(ctxErrorCode)
	s.metrics.observe(route, c.Request.Method, status, code, elapsed)

	attrs := make([]slog.Attr, 0, 10)
	attrs = append(attrs,
		slog.String("method", clean(c.Request.Method, 10)),
		slog.String("route", route),
		slog.String("path", clean(redactPath(c.Request.URL.Path, s.cfg.Token), 200)),
	)
	if q := c.Request.URL.RawQuery; q != "" {
		attrs = append(attrs, slog.String("query", clean(redactLogged(q, s.cfg.Token), 300)))
	}
	attrs = append(attrs,
		slog.Int("status", status),
		slog.Int("bytes", max(c.Writer.Size(), 0)),
		slog.Float64("ms", float64(elapsed.Microseconds())/1000),
		slog.String("remote", c.Request.RemoteAddr),
	)
	if code != "" {
		attrs = append(attrs, slog.String("error", code))
	}
	level := slog.LevelInfo
	if code == internalCode {
		level = slog.LevelError
	}
	s.log.LogAttrs(c.Request.Context(), level, "request", attrs...)
}

// redactQuery replaces the value of every parameter of a raw query whose
// name says it carries a secret (key, api_key, access_token, …), with the
// parameters split at & and at ; (which some clients use).
func redactQuery(raw string) string { return redactParams(raw, "&;", url.QueryUnescape, "") }

// redactPath hides what a path may carry of a secret: parameters of a
// segment (/state/h;key=…, /key=…) named like a secret, and the token itself.
func redactPath(path, token string) string {
	return redactParams(redactToken(path, token), "/;", func(s string) (string, error) { return s, nil }, token)
}

// redactLogged is the query as logged: redactQuery, and the token hidden
// wherever it stands, in clear or percent-encoded.
func redactLogged(raw, token string) string {
	return redactParams(redactToken(raw, token), "&;", url.QueryUnescape, token)
}

// secretWords are the parts of a parameter name that say it holds a
// secret, in lower case.
var secretWords = []string{"key", "token", "secret", "passw", "auth", "credential"}

func secretName(name string) bool {
	n := strings.ToLower(name)
	for _, w := range secretWords {
		if strings.Contains(n, w) {
			return true
		}
	}
	return false
}

// redactToken replaces the token and its usual percent-encodings in s.
func redactToken(s, token string) string {
	if token == "" {
		return s
	}
	for _, form := range []string{token, url.QueryEscape(token), url.PathEscape(token)} {
		s = strings.ReplaceAll(s, form, "REDACTED")
	}
	return s
}

// redactParams applies redactParam to each part of s between separators,
// keeping the separators.
func redactParams(s, seps string, unescape func(string) (string, error), token string) string {
	if token == "" && !strings.Contains(s, "%") && !secretName(s) {
		return s
	}
	var b strings.Builder
	for s != "" {
		part, sep := s, ""
		if i := strings.IndexAny(s, seps); i >= 0 {
			part, sep, s = s[:i], s[i:i+1], s[i+1:]
		} else {
			s = ""
		}
		b.WriteString(redactParam(part, unescape, token))
		b.WriteString(sep)
	}
	return b.String()
}

// redactParam redacts one name=value part: the value when the name says it
// is a secret or when it holds the token; the whole part when the name
// holds the token, or when the part cannot be decoded and may be either.
func redactParam(part string, unescape func(string) (string, error), token string) string {
	k, v, hasValue := strings.Cut(part, "=")
	name, nerr := unescape(k)
	value, verr := unescape(v)
	switch {
	case nerr != nil && (token != "" || secretName(k)):
		return "REDACTED"
	case nerr != nil:
		return part
	case token != "" && strings.Contains(name, token):
		return "REDACTED"
	case hasValue && (secretName(name) || token != "" && (verr != nil || strings.Contains(value, token))):
		return k + "=REDACTED"
	}
	return part
}

// recoverPanics turns a panic in a handler into a logged internal error and
// a 500 answer without the panic's text.
func (s *Server) recoverPanics(c *gin.Context) {
	defer func() {
		r := recover()
		if r == nil {
			return
		}
		if err, ok := r.(error); ok && errors.Is(err, http.ErrAbortHandler) {
			panic(r)
		}
		s.log.LogAttrs(c.Request.Context(), slog.LevelError, "panic",
			slog.String("route", routeOf(c)), slog.Any("panic", r), slog.String("stack", string(debug.Stack())))
		if c.Writer.Written() {
			c.Abort()
			return
		}
		s.fail(c, fmt.Errorf("panic: %v", r))
	}()
	c.Next()
}

// cors allows the configured origins to call from a browser and answers
// their preflight requests. With no origin configured it does nothing, so
// browsers keep other sites' pages from calling the server.
func (s *Server) cors(c *gin.Context) {
	if len(s.cfg.CORSOrigins) == 0 {
		return
	}
	origin := c.GetHeader("Origin")
	if origin == "" {
		return
	}
	c.Writer.Header().Add("Vary", "Origin")
	anyOrigin := slices.Contains(s.cfg.CORSOrigins, "*")
	if !anyOrigin && !slices.Contains(s.cfg.CORSOrigins, origin) {
		return
	}
	if anyOrigin {
		c.Header("Access-Control-Allow-Origin", "*")
	} else {
		c.Header("Access-Control-Allow-Origin", origin)
	}
	c.Header("Access-Control-Expose-Headers", "Steamcell-Caution, Steamcell-Summary")
	if c.Request.Method == http.MethodOptions && c.GetHeader("Access-Control-Request-Method") != "" {
		c.Header("Access-Control-Allow-Methods", "GET, HEAD, POST, OPTIONS")
		c.Header("Access-Control-Allow-Headers", "Authorization, Content-Type")
		c.Header("Access-Control-Max-Age", "600")
		c.AbortWithStatus(http.StatusNoContent)
	}
}

// authorize checks the token when the server has one. It is accepted as
// "Authorization: Bearer TOKEN" or as the query parameter key=TOKEN, for
// spreadsheet formulas that cannot set headers. /healthz and /readyz are
// open, for probes.
func (s *Server) authorize(c *gin.Context) {
	if s.token == nil || c.FullPath() == "/healthz" || c.FullPath() == "/readyz" {
		return
	}
	got, ok := bearer(c.GetHeader("Authorization"))
	if !ok {
		got = queryKey(c.Request.URL.RawQuery)
	}
	if subtle.ConstantTimeCompare([]byte(got), s.token) == 1 {
		return
	}
	err := errorf(ErrUnauthorized, "key", "this server wants a token: send the header Authorization: Bearer TOKEN or add key=TOKEN to the query")
	if got != "" {
		err = errorf(ErrUnauthorized, "key", "the token does not match; check key= or the Authorization header")
	}
	if textRoutes[c.FullPath()] {
		s.failText(c, err)
		return
	}
	s.fail(c, err)
}

// bearer returns the token of an Authorization header "Bearer TOKEN".
func bearer(h string) (string, bool) {
	scheme, tok, ok := strings.Cut(strings.TrimSpace(h), " ")
	if !ok || !strings.EqualFold(scheme, "Bearer") {
		return "", false
	}
	return strings.TrimSpace(tok), true
}

// queryKey returns the value of the first key= parameter of a raw query.
func queryKey(raw string) string {
	for part := range strings.SplitSeq(raw, "&") {
		k, v, _ := strings.Cut(part, "=")
		if name, err := url.QueryUnescape(k); err == nil && strings.EqualFold(strings.TrimSpace(name), "key") {
			if val, err := url.QueryUnescape(v); err == nil {
				return val
			}
		}
	}
	return ""
}

// ErrBusy: the server already runs as many /batch and /workbook requests
// as Config.MaxBulk allows; the answer says when to try again.
var ErrBusy = errors.New("server busy")

// retryAfter is the Retry-After of a busy answer, in seconds: about the
// time a typical batch or workbook fill takes, so a client that waits it
// finds a free place without hammering the server.
const retryAfter = "5"

// limitBulk admits a /batch or /workbook request while fewer than
// Config.MaxBulk run; beyond that it answers 503 with Retry-After at once,
// so that a load balancer or the client can go elsewhere rather than queue
// bodies of up to --max-body each.
func (s *Server) limitBulk(c *gin.Context) {
	select {
	case s.bulk <- struct{}{}:
		defer func() { <-s.bulk }()
		c.Next()
	default:
		c.Header("Retry-After", retryAfter)
		s.fail(c, errorf(ErrBusy, "", "this server is already answering %d batch and workbook requests, its limit; try again in %s s", cap(s.bulk), retryAfter))
	}
}

// Drain marks the server as going away: GET /readyz answers 503 from now
// on, so that a load balancer stops sending it new requests. Requests are
// still served.
func (s *Server) Drain() { s.draining.Store(true) }

// StopStreams ends the answers being streamed: each /batch stops after the
// chunk it is writing, with a last row that says it stopped and why.
// Call it when the shutdown proper begins, after Drain.
func (s *Server) StopStreams() { s.stopOnce.Do(func() { close(s.stopping) }) }

// stopped reports whether StopStreams has been called.
func (s *Server) stopped() bool {
	select {
	case <-s.stopping:
		return true
	default:
		return false
	}
}

// getReady answers whether the server takes new requests: 200 once it is
// up, 503 after Drain. Like /healthz it needs no token, for probes.
//
// GET /readyz
func (s *Server) getReady(c *gin.Context) {
	c.Header("Cache-Control", "no-store")
	if s.draining.Load() {
		c.Data(http.StatusServiceUnavailable, "application/json; charset=utf-8", []byte(`{"status":"draining"}`+"\n"))
		return
	}
	c.Data(http.StatusOK, "application/json; charset=utf-8", []byte(`{"status":"ready"}`+"\n"))
}
