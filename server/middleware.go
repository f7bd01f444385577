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
// metrics. The key= parameter is redacted from the logged query; the
// Authorization header is never logged.
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
		slog.String("path", clean(c.Request.URL.Path, 200)),
	)
	if q := c.Request.URL.RawQuery; q != "" {
		attrs = append(attrs, slog.String("query", clean(redactQuery(q), 300)))
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

// redactQuery replaces the value of every key= parameter.
func redactQuery(raw string) string {
	if !strings.Contains(raw, "%") && !containsFold(raw, "key") {
		return raw
	}
	parts := strings.Split(raw, "&")
	for i, p := range parts {
		k, _, _ := strings.Cut(p, "=")
		if name, err := url.QueryUnescape(k); err == nil && strings.EqualFold(strings.TrimSpace(name), "key") {
			parts[i] = k + "=REDACTED"
		} else if err != nil && strings.Contains(strings.ToLower(k), "key") {
			parts[i] = "REDACTED"
		}
	}
	return strings.Join(parts, "&")
}

// containsFold reports whether s contains the ASCII word sub in any case.
func containsFold(s, sub string) bool {
	for i := 0; i+len(sub) <= len(s); i++ {
		if strings.EqualFold(s[i:i+len(sub)], sub) {
			return true
		}
	}
	return false
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
		c.Header("Access-Control-Allow-Methods", "GET, POST")
		c.Header("Access-Control-Allow-Headers", "Authorization, Content-Type")
		c.Header("Access-Control-Max-Age", "600")
		c.AbortWithStatus(http.StatusNoContent)
	}
}

// authorize checks the token when the server has one. It is accepted as
// "Authorization: Bearer TOKEN" or as the query parameter key=TOKEN, for
// spreadsheet formulas that cannot set headers. /healthz is open.
func (s *Server) authorize(c *gin.Context) {
	if s.token == nil || c.FullPath() == "/healthz" {
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
	if c.FullPath() == "/state/:property" {
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
