// Command load measures the function server on this machine: requests per
// second and latency of GET /state/h at 64 concurrent connections, against
// a bare gin route that answers a constant, and the latency of /state/h at
// a paced 1,000 requests per second.
//
//	go run ./server/load                  # about 30 s
//	go run ./server/load -duration 3s     # shorter
//	go run ./server/load -batch 1000000 -bin old/steamcell,new/steamcell
//	                                      # one large POST /batch on each
//
// Both servers run as child processes of this program (it starts itself
// with -child), listening on 127.0.0.1 only; the steamcell server runs as
// `steamcell serve` does, request log included (sent to /dev/null). Every
// run is bounded in time and in requests, and stops by itself. Figures are
// for the run on this machine only; compare the ratio, not the absolute
// numbers, across machines.
package main

import (
	"bufio"
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"log/slog"
	"math"
	"net"
	"net/http"
	"os"
	"os/exec"
	"runtime"
	"slices"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"github.com/gin-gonic/gin"

	"steamcell/server"
)

func main() {
	var (
		child    = flag.String("child", "", "run as a child server: bare or steamcell (internal)")
		conns    = flag.Int("conns", 64, "concurrent connections of the throughput runs")
		duration = flag.Duration("duration", 5*time.Second, "length of each measured run")
		warmup   = flag.Duration("warmup", time.Second, "unmeasured run before each measured one")
		rounds   = flag.Int("rounds", 2, "throughput rounds per server, alternating")
		rate     = flag.Int("rate", 1000, "requests per second of the paced run")
		maxReq   = flag.Int("max-requests", 2_000_000, "most requests of any one run")
		batch    = flag.Int("batch", 0, "instead: time one POST /batch of this many rows (at most 1000000) on each server of -bin")
		bins     = flag.String("bin", "self", "with -batch: servers to compare, comma-separated; self, or paths of steamcell binaries")
		batchIn  = flag.String("batch-in", "csv", "with -batch: the body and answer, csv or json")
		procs    = flag.Int("procs", 0, "with -batch: GOMAXPROCS of the servers (1: one CPU and one batch worker); 0: the machine's")
	)
	flag.Parse()
	if *batch > 0 {
		if err := runBatch(*batch, strings.Split(*bins, ","), *rounds, *batchIn == "json", *procs); err != nil {
			fmt.Fprintln(os.Stderr, "load:", err)
			os.Exit(1)
		}
		return
	}
	if *child != "" {
		if err := runChild(*child); err != nil {
			fmt.Fprintln(os.Stderr, "load child:", err)
			os.Exit(1)
		}
		return
	}
	if err := run(*conns, *duration, *warmup, *rounds, *rate, *maxReq); err != nil {
		fmt.Fprintln(os.Stderr, "load:", err)
		os.Exit(1)
	}
}

// runChild serves one of the two servers on a free port of 127.0.0.1,
// prints its address, and stops when its standard input closes.
func runChild(kind string) error {
	gin.SetMode(gin.ReleaseMode)
	var h http.Handler
	switch kind {
	case "bare":
		r := gin.New()
		r.GET("/state/:property", func(c *gin.Context) {
			c.Data(http.StatusOK, "text/plain; charset=utf-8", []byte("1343.2723977650335"))
		})
		h = r
	case "steamcell":
		devnull, err := os.OpenFile(os.DevNull, os.O_WRONLY, 0)
		if err != nil {
			return err
		}
		defer devnull.Close()
		h = server.New(server.Config{Logger: slog.New(slog.NewTextHandler(devnull, nil)), Version: "load"})
	default:
		return fmt.Errorf("unknown child %q", kind)
	}
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		return err
	}
	hs := &http.Server{Handler: h, ReadHeaderTimeout: 10 * time.Second, IdleTimeout: time.Minute}
	if s, ok := h.(*server.Server); ok {
		hs = s.HTTPServer("")
	}
	go func() { _, _ = io.Copy(io.Discard, os.Stdin); _ = hs.Close() }()
	fmt.Printf("addr %s\n", ln.Addr())
	if err := hs.Serve(ln); !errors.Is(err, http.ErrServerClosed) {
		return err
	}
	return nil
}

// child is a running child server.
type child struct {
	base string
	pid  int
}

// cpu returns the CPU time the child has used so far (Linux; 0 elsewhere).
func (c child) cpu() time.Duration {
	b, err := os.ReadFile(fmt.Sprintf("/proc/%d/stat", c.pid))
	if err != nil {
		return 0
	}
	// Fields after the command name, which is in parentheses: utime and
	// stime are the 12th and 13th, in clock ticks (100 per second on Linux).
	f := strings.Fields(string(b[strings.LastIndexByte(string(b), ')')+1:]))
	if len(f) < 13 {
		return 0
	}
	var ut, st int64
	fmt.Sscan(f[11], &ut)
	fmt.Sscan(f[12], &st)
	return time.Duration(ut+st) * 10 * time.Millisecond
}

// startChild starts a child server and returns it and a stop function.
func startChild(kind string) (child, func(), error) {
	cmd := exec.Command(os.Args[0], "-child", kind)
	cmd.Env = childEnv()
	stdin, err := cmd.StdinPipe()
	if err != nil {
		return child{}, nil, err
	}
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		return child{}, nil, err
	}
	cmd.Stderr = os.Stderr
	if err := cmd.Start(); err != nil {
		return child{}, nil, err
	}
	stop := func() { stdin.Close(); _ = cmd.Wait() }
	line, err := bufio.NewReader(stdout).ReadString('\n')
	addr, ok := strings.CutPrefix(strings.TrimSpace(line), "addr ")
	if err != nil || !ok || !strings.HasPrefix(addr, "127.0.0.1:") {
		stop()
		return child{}, nil, fmt.Errorf("child %s did not start (%q, %v)", kind, line, err)
	}
	return child{"http://" + addr, cmd.Process.Pid}, stop, nil
}

// queries are the states asked for, in turn: a feedwater-heater line of
// plausible test points, so the engine does real work on each request.
var queries = func() []string {
	var q []string
	for i := range 32 {
		q = append(q, fmt.Sprintf("/state/h?p=%dkPa&t=%dC", 600+50*(i%8), 180+10*(i%16)))
	}
	return q
}()

// result is one run.
type result struct {
	requests, failed int
	elapsed          time.Duration
	lat              []time.Duration // sorted
}

func (r result) rps() float64 { return float64(r.requests) / r.elapsed.Seconds() }

func (r result) pct(p float64) time.Duration {
	if len(r.lat) == 0 {
		return 0
	}
	i := int(math.Ceil(p/100*float64(len(r.lat)))) - 1
	return r.lat[max(0, min(i, len(r.lat)-1))]
}

func newClient(conns int) *http.Client {
	return &http.Client{
		Timeout: 10 * time.Second,
		Transport: &http.Transport{
			MaxIdleConns: conns, MaxIdleConnsPerHost: conns, MaxConnsPerHost: conns,
			DisableCompression: true, IdleConnTimeout: time.Minute,
		},
	}
}

// do sends one request and reads the whole answer.
func do(c *http.Client, url string) bool {
	resp, err := c.Get(url)
	if err != nil {
		return false
	}
	_, err = io.Copy(io.Discard, resp.Body)
	resp.Body.Close()
	return err == nil && resp.StatusCode == http.StatusOK
}

// closedLoop runs conns workers that each send a request as soon as the
// previous one is answered, for d or maxReq requests.
func closedLoop(base string, conns int, d time.Duration, maxReq int) result {
	c := newClient(conns)
	defer c.CloseIdleConnections()
	var sent, failed atomic.Int64
	lats := make([][]time.Duration, conns)
	ctx, cancel := context.WithTimeout(context.Background(), d)
	defer cancel()
	var wg sync.WaitGroup
	start := time.Now()
	for w := range conns {
		wg.Go(func() {
			for i := w; ctx.Err() == nil; i += conns {
				if sent.Add(1) > int64(maxReq) {
					return
				}
				t0 := time.Now()
				if !do(c, base+queries[i%len(queries)]) {
					failed.Add(1)
				}
				lats[w] = append(lats[w], time.Since(t0))
			}
		})
	}
	wg.Wait()
	r := result{elapsed: time.Since(start), failed: int(failed.Load())}
	for _, l := range lats {
		r.lat = append(r.lat, l...)
	}
	r.requests = len(r.lat)
	slices.Sort(r.lat)
	return r
}

// paced sends rate requests per second for d, each at its scheduled time
// whatever happened to the earlier ones (an open loop), and measures each
// latency from the scheduled time, so that a stall counts against every
// request it delays. The second result has the latencies from the moment
// each request was actually sent (the service time alone).
func paced(base string, rate int, d time.Duration, maxReq int) (result, result) {
	n := min(int(d.Seconds()*float64(rate)), maxReq)
	c := newClient(64)
	defer c.CloseIdleConnections()
	interval := time.Second / time.Duration(rate)
	lat, svc := make([]time.Duration, n), make([]time.Duration, n)
	var failed atomic.Int64
	jobs := make(chan int, n)
	var wg sync.WaitGroup
	start := time.Now().Add(50 * time.Millisecond)
	for range 64 {
		wg.Go(func() {
			for i := range jobs {
				due := start.Add(time.Duration(i) * interval)
				sent := time.Now()
				if !do(c, base+queries[i%len(queries)]) {
					failed.Add(1)
				}
				lat[i], svc[i] = time.Since(due), time.Since(sent)
			}
		})
	}
	for i := range n {
		time.Sleep(time.Until(start.Add(time.Duration(i) * interval)))
		jobs <- i
	}
	close(jobs)
	wg.Wait()
	r := result{requests: n, failed: int(failed.Load()), elapsed: time.Since(start), lat: lat}
	rs := r
	rs.lat = svc
	slices.Sort(r.lat)
	slices.Sort(rs.lat)
	return r, rs
}

func run(conns int, d, warmup time.Duration, rounds, rate, maxReq int) error {
	bare, stopBare, err := startChild("bare")
	if err != nil {
		return err
	}
	defer stopBare()
	steam, stopSteam, err := startChild("steamcell")
	if err != nil {
		return err
	}
	defer stopSteam()
	for _, c := range []child{bare, steam} {
		if !do(http.DefaultClient, c.base+queries[0]) {
			return fmt.Errorf("%s%s does not answer 200", c.base, queries[0])
		}
	}
	servers := []struct {
		name string
		c    child
	}{{"bare gin route", bare}, {"steamcell /state/h", steam}}

	fmt.Printf("GET /state/h, %d connections, %s per run, %d rounds; GOMAXPROCS of each server: %d CPUs shared with this client\n",
		conns, d, rounds, runtime.GOMAXPROCS(0))
	all := map[string][]result{}
	cpuPer := map[string]time.Duration{}
	for round := range rounds {
		for _, s := range servers {
			closedLoop(s.c.base, conns, warmup, maxReq)
			cpu0 := s.c.cpu()
			r := closedLoop(s.c.base, conns, d, maxReq)
			cpu := s.c.cpu() - cpu0
			all[s.name] = append(all[s.name], r)
			cpuPer[s.name] += cpu / time.Duration(max(r.requests, 1)) / time.Duration(rounds)
			fmt.Printf("  round %d  %-20s %8.0f req/s  p50 %7.3f ms  p99 %7.3f ms  server CPU %5.1f µs/request  (%d requests, %d failed)\n",
				round+1, s.name, r.rps(), ms(r.pct(50)), ms(r.pct(99)), float64(cpu.Nanoseconds())/1000/float64(max(r.requests, 1)), r.requests, r.failed)
		}
		fmt.Printf("  round %d  ratio %.2f\n", round+1, all["steamcell /state/h"][round].rps()/all["bare gin route"][round].rps())
	}
	if rounds > 0 {
		mean := func(rs []result) float64 {
			var s float64
			for _, r := range rs {
				s += r.rps()
			}
			return s / float64(len(rs))
		}
		bareRPS, steamRPS := mean(all["bare gin route"]), mean(all["steamcell /state/h"])
		ratio := steamRPS / bareRPS
		fmt.Printf("throughput: steamcell %.0f req/s, bare %.0f req/s, ratio %.2f (target at least 0.70: %s)\n",
			steamRPS, bareRPS, ratio, verdict(ratio >= 0.7))
		fmt.Printf("server CPU per request: steamcell %.1f µs, bare %.1f µs (the client shares the CPUs; this is the servers' own cost)\n",
			float64(cpuPer["steamcell /state/h"].Nanoseconds())/1000, float64(cpuPer["bare gin route"].Nanoseconds())/1000)
	}

	fmt.Printf("paced: %d req/s for %s, latency from the scheduled send time\n", rate, d)
	for _, s := range servers {
		r, rs := paced(s.c.base, rate, d, maxReq)
		fmt.Printf("  %-20s p50 %7.3f ms  p99 %7.3f ms  max %7.3f ms  (%d requests, %d failed, %.0f req/s achieved)\n",
			s.name, ms(r.pct(50)), ms(r.pct(99)), ms(r.pct(100)), r.requests, r.failed, r.rps())
		fmt.Printf("  %-20s p50 %7.3f ms  p99 %7.3f ms  max %7.3f ms  (from the actual send)\n",
			"", ms(rs.pct(50)), ms(rs.pct(99)), ms(rs.pct(100)))
		if s.c == steam {
			fmt.Printf("p99 at %d req/s: %.3f ms (target under 2 ms: %s)\n", rate, ms(r.pct(99)), verdict(r.pct(99) < 2*time.Millisecond))
		}
	}
	return nil
}

func ms(d time.Duration) float64 { return float64(d.Microseconds()) / 1000 }

func verdict(ok bool) string {
	if ok {
		return "met"
	}
	return "NOT met"
}
