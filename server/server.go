package server

import (
	"errors"
	"io"
	"log/slog"
	"net/http"
	"runtime"
	"slices"
	"strings"
	"sync"
	"sync/atomic"
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
	DefaultMaxBulk          = 8
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

	// MaxBulk is how many /batch and /workbook requests run at once
	// (waiting fills included); more are answered 503 with Retry-After.
	// 0 means DefaultMaxBulk.
	MaxBulk int
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

	bulk     chan struct{} // one token per /batch or /workbook request running
	draining atomic.Bool   // set by Drain: /readyz answers 503
	stopping chan struct{} // closed by StopStreams
	stopOnce sync.Once
	allow    map[string]string // route -> the methods it answers, for Allow
	page     http.Handler      // the browser page (server/web)
	assets   http.Handler      // its scripts and styles
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
	orDefault(&cfg.MaxBulk, DefaultMaxBulk)
	if cfg.Workers <= 0 || cfg.Workers > 2 {
		cfg.Workers = min(2, runtime.GOMAXPROCS(0))
	}
	log := cfg.Logger
	if log == nil {
		log = slog.New(slog.NewTextHandler(io.Discard, nil))
	}
	s := &Server{cfg: cfg, log: log, metrics: newMetrics(), fills: make(chan struct{}, cfg.Fills),
		bulk: make(chan struct{}, cfg.MaxBulk), stopping: make(chan struct{})}
	if cfg.Token != "" {
		s.token = []byte(cfg.Token)
	}
	if page, assets, err := web.Handler(Caution, cfg.Version); err == nil {
		s.page, s.assets = page, assets
	} else {
		log.Error("page not built", slog.String("error", err.Error()))
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
	r.Use(s.logRequests, s.recoverPanics, s.allowed, s.cors, s.authorize)

	for _, rt := range s.table() {
		s.handle(r, rt.method, rt.path, rt.handlers...)
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

// route is one row of the server's route table.
type route struct {
	method   string
	path     string // in gin's syntax: "/state/:property"
	handlers []gin.HandlerFunc
	form     answerForm
}

// answerForm is how a route answers, errors included.
type answerForm int

const (
	jsonForm answerForm = iota // JSON (or CSV, a file), errors as problem details
	textForm                   // one line of text for a cell, errors as "code: detail"
	pageForm                   // the browser page, not described in openapi.json
)

// table is the one list of the server's routes: the router, the names of
// metrics and logs, and the no-route message are made from it.
func (s *Server) table() []route {
	h := func(hs ...gin.HandlerFunc) []gin.HandlerFunc { return hs }
	return []route{
		{"GET", "/state", h(s.getState), jsonForm},
		{"GET", "/state/status", h(s.getStateStatus), textForm},
		{"GET", "/state/:property", h(s.getStateProperty), textForm},
		{"GET", "/saturation", h(s.getSaturation), jsonForm},
		{"GET", "/saturation/:property", h(s.getSaturationProperty), textForm},
		{"GET", "/process/:kind", h(s.getProcess), jsonForm},
		{"GET", "/process/:kind/:result", h(s.getProcessResult), textForm},
		{"POST", "/batch", h(s.limitBulk, s.postBatch), jsonForm},
		{"POST", "/workbook", h(s.limitBulk, s.postWorkbook), jsonForm},
		{"GET", "/openapi.json", h(s.getOpenAPI), jsonForm},
		{"GET", "/healthz", h(s.getHealth), jsonForm},
		{"GET", "/readyz", h(s.getReady), jsonForm},
		{"GET", "/metrics", h(s.getMetrics), jsonForm},
		{"GET", "/diagram/:file", h(s.getDiagram), jsonForm},
		{"POST", "/diagram/:file", h(s.getDiagram), jsonForm},
		{"GET", "/table", h(s.getTable), jsonForm},
		{"GET", "/", h(s.getPage), pageForm},
		{"GET", "/web/*file", h(s.getAsset), pageForm},
	}
}

// getPage serves the page (server/web), its assets getAsset.
//
// GET /
func (s *Server) getPage(c *gin.Context) { s.servePage(c, s.page) }

// GET /web/{file}
func (s *Server) getAsset(c *gin.Context) { s.servePage(c, s.assets) }

func (s *Server) servePage(c *gin.Context, h http.Handler) {
	if h == nil {
		s.fail(c, errors.New("the page was not built"))
		return
	}
	h.ServeHTTP(c.Writer, c.Request)
}

// routeNames are the routes as metrics and logs name them ("/state/:property"
// as "/state/{property}", the form of openapi.json), and routeList the list
// of routes for the no-route message, both made from the route table.
var (
	routeNames = map[string]string{}
	routeList  string
	apiPaths   []string
	textRoutes = map[string]bool{} // routes that answer a cell in text
)

func init() {
	var l []string
	for _, rt := range (&Server{}).table() {
		routeNames[rt.path] = openAPIPath(rt.path)
		l = append(l, rt.method+" "+openAPIPath(rt.path))
		if rt.form != pageForm {
			apiPaths = append(apiPaths, openAPIPath(rt.path))
		}
		if rt.form == textForm {
			textRoutes[rt.path] = true
		}
	}
	slices.Sort(apiPaths)
	apiPaths = slices.Compact(apiPaths)
	routeList = strings.Join(l, ", ")
}

// openAPIPath writes a gin path in the form of OpenAPI: ":name" as "{name}".
func openAPIPath(path string) string {
	parts := strings.Split(path, "/")
	for i, p := range parts {
		if strings.HasPrefix(p, ":") || strings.HasPrefix(p, "*") {
			parts[i] = "{" + p[1:] + "}"
		}
	}
	return strings.Join(parts, "/")
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
	s.fail(c, errorf(ErrNoRoute, "", "no route %s; routes are %s", clean(c.Request.URL.Path, 80), routeList))
}

// noMethod answers a route asked with the wrong method.
func (s *Server) noMethod(c *gin.Context) {
	s.fail(c, errorf(ErrMethod, "", "%s does not take %s", clean(c.Request.URL.Path, 80), clean(c.Request.Method, 10)))
}

// RoutePaths lists the paths of the route table that openapi.json
// describes (all but the page's), as it writes them, sorted, each once.
func RoutePaths() []string { return slices.Clone(apiPaths) }
