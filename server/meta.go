package server

import (
	_ "embed"
	"net/http"

	"github.com/gin-gonic/gin"

	"steamcell/fn/point"
)

// openAPI is the OpenAPI 3.1 description of the routes.
//
//go:embed openapi.json
var openAPI []byte

// OpenAPI returns the OpenAPI 3.1 description the server serves.
func OpenAPI() []byte { return append([]byte(nil), openAPI...) }

// getOpenAPI serves the OpenAPI 3.1 description of the routes.
//
// GET /openapi.json
func (s *Server) getOpenAPI(c *gin.Context) {
	c.Data(http.StatusOK, "application/json; charset=utf-8", openAPI)
}

// getHealth answers that the server is up; it needs no token.
//
// GET /healthz
func (s *Server) getHealth(c *gin.Context) {
	b := append([]byte(`{"status":"ok","version":`), appendJSONString(nil, s.cfg.Version)...)
	b = append(b, `,"formulation":"`+point.Formulation+`","caution":`...)
	b = appendJSONString(b, Caution)
	b = append(b, "}\n"...)
	c.Header("Cache-Control", "no-store")
	c.Data(http.StatusOK, "application/json; charset=utf-8", b)
}
