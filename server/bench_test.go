package server_test

import (
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"testing"

	"github.com/gin-gonic/gin"

	"steamcell/server"
)

// BenchmarkStateProperty measures the handler of GET /state/h in process
// (no network), request log and metrics included, against a bare gin
// route that answers a constant; compare the two in one run.
func BenchmarkStateProperty(b *testing.B) {
	// The request log is formatted as in service and thrown away.
	srv, _ := newServer(b, server.Config{Logger: slog.New(slog.NewTextHandler(io.Discard, nil))})
	bare := bareRoute()
	for _, bc := range []struct {
		name string
		h    http.Handler
	}{{"bare", bare}, {"steamcell", srv}} {
		b.Run(bc.name, func(b *testing.B) {
			req := httptest.NewRequest(http.MethodGet, "/state/h?p=600kPa&t=330C&units=us", nil)
			b.ReportAllocs()
			for b.Loop() {
				w := httptest.NewRecorder()
				bc.h.ServeHTTP(w, req)
				if w.Code != 200 {
					b.Fatal(w.Code, w.Body)
				}
			}
		})
	}
}

// BenchmarkStatePropertyHTTP is BenchmarkStateProperty through real
// loopback connections (client and server in this process).
func BenchmarkStatePropertyHTTP(b *testing.B) {
	srv, _ := newServer(b, server.Config{Logger: slog.New(slog.NewTextHandler(io.Discard, nil))})
	bare := bareRoute()
	for _, bc := range []struct {
		name string
		h    http.Handler
	}{{"bare", bare}, {"steamcell", srv}} {
		b.Run(bc.name, func(b *testing.B) {
			ts := httptest.NewServer(bc.h)
			defer ts.Close()
			client := &http.Client{Transport: &http.Transport{MaxIdleConnsPerHost: 64}}
			url := ts.URL + "/state/h?p=600kPa&t=330C&units=us"
			b.SetParallelism(8)
			b.RunParallel(func(pb *testing.PB) {
				for pb.Next() {
					resp, err := client.Get(url)
					if err != nil {
						b.Fatal(err)
					}
					_, _ = io.Copy(io.Discard, resp.Body)
					resp.Body.Close()
					if resp.StatusCode != 200 {
						b.Fatal(resp.StatusCode)
					}
				}
			})
		})
	}
}

// bareRoute is the comparison of the benchmarks: a gin route that answers
// a constant number as text/plain, as GET /state/h would.
func bareRoute() *gin.Engine {
	bare := gin.New()
	bare.GET("/state/:property", func(c *gin.Context) {
		c.Data(http.StatusOK, "text/plain; charset=utf-8", []byte("1343.2723977650335"))
	})
	return bare
}
