package server

import (
	"net/http"
	"strconv"
	"time"

	"github.com/gin-gonic/gin"
	"github.com/prometheus/client_golang/prometheus"
	"github.com/prometheus/client_golang/prometheus/collectors"
	"github.com/prometheus/client_golang/prometheus/promhttp"
)

// metrics are the Prometheus metrics of one Server, in a registry of its
// own so that servers in one process (tests) do not share counters.
type metrics struct {
	reg      *prometheus.Registry
	requests *prometheus.CounterVec   // route, method, status
	errors   *prometheus.CounterVec   // route, code
	latency  *prometheus.HistogramVec // route
	rows     *prometheus.CounterVec   // status: ok, failed
	inflight prometheus.Gauge
	handler  http.Handler // serves reg in the text format
}

func newMetrics() *metrics {
	m := &metrics{
		reg: prometheus.NewRegistry(),
		requests: prometheus.NewCounterVec(prometheus.CounterOpts{
			Name: "steamcell_http_requests_total",
			Help: "HTTP requests answered, by route, method and status.",
		}, []string{"route", "method", "status"}),
		errors: prometheus.NewCounterVec(prometheus.CounterOpts{
			Name: "steamcell_http_errors_total",
			Help: "HTTP requests answered with an error, by route and error code.",
		}, []string{"route", "code"}),
		latency: prometheus.NewHistogramVec(prometheus.HistogramOpts{
			Name:    "steamcell_http_request_duration_seconds",
			Help:    "Time from the start of a request to the end of its answer, by route.",
			Buckets: []float64{0.0001, 0.00025, 0.0005, 0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30, 60},
		}, []string{"route"}),
		rows: prometheus.NewCounterVec(prometheus.CounterOpts{
			Name: "steamcell_batch_rows_total",
			Help: "Rows answered by /batch, by status (ok or failed).",
		}, []string{"status"}),
		inflight: prometheus.NewGauge(prometheus.GaugeOpts{
			Name: "steamcell_http_requests_in_flight",
			Help: "Requests being answered now.",
		}),
	}
	m.reg.MustRegister(m.requests, m.errors, m.latency, m.rows, m.inflight,
		collectors.NewGoCollector(), collectors.NewProcessCollector(collectors.ProcessCollectorOpts{}))
	m.handler = promhttp.HandlerFor(m.reg, promhttp.HandlerOpts{})
	return m
}

// observe records one answered request.
func (m *metrics) observe(route, method string, status int, code string, d time.Duration) {
	switch method { // keep label values few whatever clients send
	case "GET", "POST", "HEAD", "OPTIONS":
	default:
		method = "other"
	}
	m.requests.WithLabelValues(route, method, statusLabel(status)).Inc()
	if code != "" {
		m.errors.WithLabelValues(route, code).Inc()
	}
	m.latency.WithLabelValues(route).Observe(d.Seconds())
}

// statusLabel is strconv.Itoa without an allocation for the usual
// statuses.
func statusLabel(status int) string {
	switch status {
	case 200:
		return "200"
	case 400:
		return "400"
	case 422:
		return "422"
	}
	return strconv.Itoa(status)
}

// getMetrics serves the metrics in the Prometheus text format.
//
// GET /metrics
func (s *Server) getMetrics(c *gin.Context) {
	s.metrics.handler.ServeHTTP(c.Writer, c.Request)
}
