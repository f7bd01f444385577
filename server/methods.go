package server

import (
	"net/http"
	"strings"

	"github.com/gin-gonic/gin"
)

// Spreadsheet web functions probe a URL before they fetch it: LibreOffice
// Calc's WEBSERVICE sends OPTIONS and HEAD, then GET (twice). Every route
// answers both, so that a probe is neither refused nor counted as an
// error in /metrics.

// handle registers h for method on path, with HEAD beside every GET (the
// same handler: net/http drops the body of a HEAD answer and keeps its
// headers, Content-Length included) and OPTIONS beside every route. The
// methods a path answers are kept for the Allow header.
func (s *Server) handle(r *gin.Engine, method, path string, h ...gin.HandlerFunc) {
	if s.allow == nil {
		s.allow = map[string]string{}
	}
	methods := []string{method}
	r.Handle(method, path, h...)
	if method == http.MethodGet {
		r.HEAD(path, h...)
		methods = append(methods, http.MethodHead)
	}
	if before, ok := s.allow[path]; ok { // a second method on the path (GET and POST)
		s.allow[path] = strings.Join(methods, ", ") + ", " + before
		return
	}
	r.OPTIONS(path, s.options)
	s.allow[path] = strings.Join(append(methods, http.MethodOptions), ", ")
}

// allowed sets the Allow header of an OPTIONS request to a route (RFC
// 9110, 9.3.7 and 10.2.1). It runs before the CORS middleware, so that a
// CORS preflight, which that middleware answers, carries it too.
func (s *Server) allowed(c *gin.Context) {
	if c.Request.Method == http.MethodOptions {
		if a, ok := s.allow[c.FullPath()]; ok {
			c.Header("Allow", a)
		}
	}
}

// options answers an OPTIONS request that is no CORS preflight: the Allow
// header (set by allowed) and no body.
//
// OPTIONS on every route
func (s *Server) options(c *gin.Context) {
	c.Header("Cache-Control", "max-age=600")
	c.Status(http.StatusNoContent)
}
