package server

import (
	"io"
	"log/slog"
	"net/http"
	"runtime"
	"time"

	"github.com/gin-gonic/gin"

	"steamcell/fn/units"
	"steamcell/server/web"
)

func init() {
	// Release mode: no debug route listing or warnings on the log.
	gin.SetMode(gin.ReleaseMode)
}

// Caution is carried by every JSON answer (and sent as the
// Steamcell-Caution header of every answer).
const Caution = "Engineering estimate from IAPWS-IF97; not a substitute for pressure-equipment codes or a licensed engineer's review."

// Defaults of Config's limits.
const (
	DefaultAddr             = "127.0.0.1:8097"
	DefaultMaxRows          = 1_000_000
	DefaultMaxBodyBytes     = 256 << 20
	DefaultMaxWorkbookBytes = 32 << 20
	DefaultMaxHeaderBytes   = 16 << 10
	DefaultReadTimeout      = 60 * time.Second
	DefaultWriteTimeout     = 60 * time.Second
	DefaultIdleTimeout      = 120 * time.Second
)

// Config is how a Server is set up. The zero Config is a working server
// with the defaults above, no token, no CORS and no workbook route.
type Config struct {
	Units       units.Set // unit set of requests without units=; the zero Set is "si"
	Token       string    // when set, every route but /healthz wants it (bearer or key=)
	CORSOrigins []string  // origins allowed to call from a browser; "*" for any; none: CORS off

	MaxRows          int   // rows of one /batch request
	MaxBodyBytes     int64 // body of one /batch request
	MaxWorkbookBytes int64 // body of one /workbook request
	MaxHeaderBytes   int   // request line and headers

	// Timeouts of the connection. A /batch answer moves its read and write
	// deadlines on as it streams, so a long batch is cut only when the
	// client stops reading or sending for this long.
	ReadTimeout, WriteTimeout, IdleTimeout time.Duration

	Workers  int          // workers of /batch, 1 or 2; 0: 2 when there are 2 CPUs
	Logger   *slog.Logger // request log; nil: none
	Workbook WorkbookFiller
	// Fills is how many /workbook fills run at once (a fill holds its
	// sheet in memory); others wait their turn. 0 means 1.
	Fills   int
	Version string
}

// Server is the HTTP function server. Build it with New; it is an
// http.Handler.
type Server struct {
	cfg     Config
	log     *slog.Logger
	engine  *gin.Engine
	metrics *metrics
	token   []byte
	fills   chan struct{} // one token per /workbook fill running
}

// New returns a server set up by cfg.
func New(cfg Config) *Server {
	orDefault(&cfg.MaxRows, DefaultMaxRows)
	orDefault(&cfg.MaxBodyBytes, DefaultMaxBodyBytes)
	orDefault(&cfg.MaxWorkbookBytes, DefaultMaxWorkbookBytes)
	orDefault(&cfg.MaxHeaderBytes, DefaultMaxHeaderBytes)
	orDefault(&cfg.ReadTimeout, DefaultReadTimeout)
	orDefault(&cfg.WriteTimeout, DefaultWriteTimeout)
	orDefault(&cfg.IdleTimeout, DefaultIdleTimeout)
	orDefault(&cfg.Fills, 1)
	if cfg.Workers <= 0 || cfg.Workers > 2 {
		cfg.Workers = min(2, runtime.GOMAXPROCS(0))
	}
	log := cfg.Logger
	if log == nil {
		log = slog.New(slog.NewTextHandler(io.Discard, nil))
	}
	s := &Server{cfg: cfg, log: log, metrics: newMetrics(), fills: make(chan struct{}, cfg.Fills)}
	if cfg.Token != "" {
		s.token = []byte(cfg.Token)
	}
	s.engine = s.routes()
	return s
}

// orDefault sets *v to d where the configuration leaves it zero or
// negative.
func orDefault[T int | int64 | time.Duration](v *T, d T) {
	if *v <= 0 {
		*v = d
	}
}

// routes builds the router.
func (s *Server) routes() *gin.Engine {
	r := gin.New()
	r.RedirectTrailingSlash = false
	r.RedirectFixedPath = false
	r.HandleMethodNotAllowed = true
	r.ContextWithFallback = true
	r.Use(s.logRequests, s.recoverPanics, s.cors, s.authorize)

	r.GET("/state", s.getState)
	r.GET("/state/:property", s.getStateProperty)
	r.GET("/saturation", s.getSaturation)
	r.POST("/batch", s.postBatch)
	r.POST("/workbook", s.postWorkbook)
	r.GET("/openapi.json", s.getOpenAPI)
	r.GET("/healthz", s.getHealth)
	r.GET("/metrics", s.getMetrics)

	// The page, its diagrams and steam tables.
	r.GET("/diagram/:file", s.getDiagram)
	r.POST("/diagram/:file", s.getDiagram)
	r.GET("/table", s.getTable)
	if page, assets, err := web.Handler(Caution, s.cfg.Version); err == nil {
		r.GET("/", gin.WrapH(page))
		r.GET("/web/*file", gin.WrapH(assets))
	} else {
		s.log.Error("page not built", slog.String("error", err.Error()))
	}

	r.NoRoute(s.noRoute)
	r.NoMethod(s.noMethod)
	return r
}

// ServeHTTP serves a request.
func (s *Server) ServeHTTP(w http.ResponseWriter, r *http.Request) { s.engine.ServeHTTP(w, r) }

// HTTPServer returns an http.Server for the handler on addr with the
// configured timeouts and header limit.
func (s *Server) HTTPServer(addr string) *http.Server {
	return &http.Server{
		Addr:              addr,
		Handler:           s,
		ReadHeaderTimeout: min(s.cfg.ReadTimeout, 10*time.Second),
		ReadTimeout:       s.cfg.ReadTimeout,
		WriteTimeout:      s.cfg.WriteTimeout,
		IdleTimeout:       s.cfg.IdleTimeout,
		MaxHeaderBytes:    s.cfg.MaxHeaderBytes,
		ErrorLog:          slog.NewLogLogger(s.log.Handler(), slog.LevelWarn),
	}
}

// routeNames are the routes as metrics and logs name them.
var routeNames = map[string]string{
	"/state":           "/state",
	"/state/:property": "/state/{property}",
	"/saturation":      "/saturation",
	"/batch":           "/batch",
	"/workbook":        "/workbook",
	"/openapi.json":    "/openapi.json",
	"/healthz":         "/healthz",
	"/metrics":         "/metrics",
	"/diagram/:file":   "/diagram/{file}",
	"/table":           "/table",
	"/":                "/",
	"/web/*file":       "/web/{file}",
}

// routeOf names the route of a request; "unmatched" for no route, so that
// metrics labels stay few whatever paths clients send.
func routeOf(c *gin.Context) string {
	if n, ok := routeNames[c.FullPath()]; ok {
		return n
	}
	return "unmatched"
}

// noRoute answers a path that is no route.
func (s *Server) noRoute(c *gin.Context) {
	s.fail(c, errorf(ErrNoRoute, "", "no route %s; routes are GET /state, GET /state/{property}, GET /saturation, POST /batch, POST /workbook, GET /openapi.json, GET /healthz, GET /metrics, GET / (the page), GET /diagram/{kind}.svg, GET /table", clean(c.Request.URL.Path, 80)))
}

// noMethod answers a route asked with the wrong method.
func (s *Server) noMethod(c *gin.Context) {
	s.fail(c, errorf(ErrMethod, "", "%s does not take %s", clean(c.Request.URL.Path, 80), clean(c.Request.Method, 10)))
}
