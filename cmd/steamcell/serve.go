package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"log/slog"
	"net"
	"net/http"
	"os"
	"os/signal"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"time"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"steamcell/fn/units"
	"steamcell/server"
	"steamcell/workbook"
)

func init() { verbs = append(verbs, (*App).serveCommand, (*App).probeCommand) }

func (a *App) serveCommand() *cobra.Command {
	var (
		addr, token, tokenFile       string
		unitSet, logFormat           string
		corsOrigins                  []string
		maxRows, maxBulk             int
		maxBody                      = byteSize(server.DefaultMaxBodyBytes)
		maxWorkbook                  = byteSize(server.DefaultMaxWorkbookBytes)
		maxHeader                    = byteSize(server.DefaultMaxHeaderBytes)
		workbookMemory               = byteSize(512 << 20)
		readTimeout, writeTimeout    time.Duration
		idleTimeout, shutdownTimeout time.Duration
		drainDelay                   time.Duration
	)
	cmd := &cobra.Command{
		Use:   "serve",
		Short: "Serve water and steam properties over HTTP to spreadsheets, scripts and plant tools",
		Long: `serve starts the function server. A spreadsheet formula, a script or a plant
tool asks it for one value, one state, the saturation line or a batch of
points:

  GET  /state?p=6barg&t=330C              every property, JSON (format=csv)
  GET  /state/h?p=600kPa&t=330C&units=us  one number as plain text, for a cell
  GET  /saturation?p=10bar                saturation line at p (or t=)
  POST /batch                             CSV or JSON rows, answered in order
  POST /workbook?name=tests.xlsx          the body filled as "steamcell fill" does
  GET  /openapi.json  /healthz  /readyz  /metrics

It listens on 127.0.0.1 (this computer only) unless --addr says otherwise.
With a token every route but /healthz and /readyz wants
"Authorization: Bearer TOKEN" or the query parameter key=TOKEN; the
parameter exists for spreadsheet formulas, which cannot send headers, and
puts the token into every formula that uses it. Give the token as
STEAMCELL_TOKEN or in a file (--token-file, e.g. a mounted secret) rather
than with --token, which shows it in the process list.

Every flag can also be set by an environment variable: STEAMCELL_ and the
flag's name in capitals, - as _ (--max-body: STEAMCELL_MAX_BODY). A flag on
the command line wins over the environment.

SIGINT or SIGTERM stops the server: /readyz answers 503 at once, requests
are still taken for --drain-delay, then batches being streamed end with a
"stopped:" row and the server exits when the requests in progress finish
(at most --shutdown-timeout).`,
		Example: `  steamcell serve
  STEAMCELL_TOKEN=s3cret steamcell serve --addr 0.0.0.0:8097
  steamcell serve --units us --cors-origin https://plant.example`,
		PreRunE: func(cmd *cobra.Command, _ []string) error {
			return flagsFromEnv(cmd.Flags(), func(*pflag.Flag) bool { return true })
		},
		RunE: func(cmd *cobra.Command, _ []string) error {
			if tokenFile != "" {
				if token != "" {
					return usageError{errors.New("give the token once: --token (STEAMCELL_TOKEN) or --token-file (STEAMCELL_TOKEN_FILE)")}
				}
				var err error
				if token, err = readTokenFile(tokenFile); err != nil {
					return err
				}
			}
			set, err := units.SetByName(unitSet)
			if err != nil {
				return usageError{err}
			}
			var handler slog.Handler
			switch logFormat {
			case "text":
				handler = slog.NewTextHandler(a.err, nil)
			case "json":
				handler = slog.NewJSONHandler(a.err, nil)
			default:
				return usageError{fmt.Errorf("--log-format %q: use text or json", logFormat)}
			}
			log := slog.New(handler)
			srv := server.New(server.Config{
				Units:            set,
				Token:            token,
				CORSOrigins:      corsOrigins,
				MaxRows:          maxRows,
				MaxBodyBytes:     int64(maxBody),
				MaxWorkbookBytes: int64(maxWorkbook),
				MaxHeaderBytes:   int(maxHeader),
				ReadTimeout:      readTimeout,
				WriteTimeout:     writeTimeout,
				IdleTimeout:      idleTimeout,
				Logger:           log,
				MaxBulk:          maxBulk,
				Version:          Version,
				Workbook:         workbookFiller{memory: int64(workbookMemory)},
			})
			return a.serve(cmd.OutOrStdout(), srv, srv.HTTPServer(addr), log, token != "", stopTimes{drainDelay, shutdownTimeout})
		},
	}
	f := cmd.Flags()
	f.StringVar(&addr, "addr", server.DefaultAddr, "address to listen on; 127.0.0.1 keeps the server to this computer")
	f.StringVar(&token, "token", "", "token every route but /healthz and /readyz wants (none: no token); better as STEAMCELL_TOKEN or --token-file")
	f.StringVar(&tokenFile, "token-file", "", "file holding the token, e.g. a mounted secret; surrounding blank space is ignored")
	f.StringSliceVar(&corsOrigins, "cors-origin", nil, "origin allowed to call from a browser page, e.g. https://plant.example, or * (repeatable; default: none)")
	f.StringVar(&unitSet, "units", "si", "unit set of requests without units=: "+strings.Join(units.SetNames(), ", "))
	f.IntVar(&maxRows, "max-rows", server.DefaultMaxRows, "most rows in one /batch request")
	f.IntVar(&maxBulk, "max-bulk", server.DefaultMaxBulk, "most /batch and /workbook requests at once; more are answered 503 with Retry-After")
	f.Var(&maxBody, "max-body", "largest /batch body (e.g. 256MiB)")
	f.Var(&maxWorkbook, "max-workbook", "largest /workbook upload")
	f.Var(&maxHeader, "max-header", "largest request line and headers")
	f.Var(&workbookMemory, "workbook-memory", "memory one /workbook fill may take; bounds the parts it loads whole (rows are streamed)")
	f.DurationVar(&readTimeout, "read-timeout", server.DefaultReadTimeout, "longest wait for a request (a batch body: between chunks)")
	f.DurationVar(&writeTimeout, "write-timeout", server.DefaultWriteTimeout, "longest wait to write an answer (a batch answer: between chunks)")
	f.DurationVar(&idleTimeout, "idle-timeout", server.DefaultIdleTimeout, "how long an idle keep-alive connection stays open")
	f.DurationVar(&drainDelay, "drain-delay", 0, "at shutdown, how long /readyz answers 503 while requests are still taken, so a load balancer can stop sending them")
	f.DurationVar(&shutdownTimeout, "shutdown-timeout", 30*time.Second, "longest wait for requests in progress at shutdown")
	f.StringVar(&logFormat, "log-format", "text", "request log on standard error: text or json")
	return cmd
}

// stopTimes are the phases of a shutdown.
type stopTimes struct {
	drain    time.Duration // not ready but still taking requests
	shutdown time.Duration // longest wait for the requests in progress
}

// serve runs hs (the http.Server of srv) until SIGINT, SIGTERM or
// App.Close, then drains and shuts it down, letting requests in progress
// finish.
func (a *App) serve(out io.Writer, srv *server.Server, hs *http.Server, log *slog.Logger, hasToken bool, times stopTimes) error {
	ln, err := net.Listen("tcp", hs.Addr)
	if err != nil {
		return fmt.Errorf("listen on %s: %w", hs.Addr, err)
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	closed := &stopper{done: make(chan struct{})}
	a.closers = append(a.closers, closed)

	if host, _, err := net.SplitHostPort(ln.Addr().String()); err == nil && !hasToken {
		if ip := net.ParseIP(host); ip == nil || !ip.IsLoopback() {
			log.Warn("listening beyond this computer without a token: anyone who can reach the address can use the server; set --token or STEAMCELL_TOKEN", slog.String("addr", ln.Addr().String()))
		}
	}
	fmt.Fprintf(out, "steamcell serve: listening on http://%s (IAPWS-IF97; Ctrl-C to stop)\n", ln.Addr())

	errc := make(chan error, 1)
	go func() { errc <- hs.Serve(ln) }()
	select {
	case err := <-errc:
		return fmt.Errorf("serve: %w", err)
	case <-ctx.Done():
	case <-closed.done:
	}
	srv.Drain()
	if times.drain > 0 {
		again, cancelAgain := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
		defer cancelAgain()
		stop()
		log.Info("draining: /readyz answers 503, requests are still taken", slog.Duration("delay", times.drain))
		drained := time.NewTimer(times.drain)
		defer drained.Stop()
		select {
		case <-drained.C:
		case <-again.Done(): // a second signal: no more waiting
		case err := <-errc:
			return fmt.Errorf("serve: %w", err)
		}
	}
	log.Info("shutting down: finishing requests in progress", slog.Duration("timeout", times.shutdown))
	srv.StopStreams()
	sctx, cancel := context.WithTimeout(context.Background(), times.shutdown)
	defer cancel()
	if err := hs.Shutdown(sctx); err != nil {
		_ = hs.Close()
		return fmt.Errorf("shutdown: requests still in progress after %s: %w", times.shutdown, err)
	}
	if err := <-errc; !errors.Is(err, http.ErrServerClosed) {
		return fmt.Errorf("serve: %w", err)
	}
	log.Info("stopped")
	return nil
}

// workbookFiller fills uploads of POST /workbook with package workbook.
type workbookFiller struct {
	memory int64 // what one fill may hold in memory, from --workbook-memory
}

func (w workbookFiller) Fill(ctx context.Context, in io.Reader, name string, opts server.WorkbookOptions, out io.Writer) (any, error) {
	tol, err := workbook.ParseCheckTol(opts.CheckTol)
	if err != nil {
		return nil, server.InputProblem(err)
	}
	sum, err := workbook.Fill(ctx, in, name, workbook.Options{Add: opts.Symbols, Point: opts.Point, Version: Version, Memory: w.memory,
		U: opts.U, Process: opts.Process, Check: opts.Check, CheckTol: tol}, out)
	var we *workbook.Error
	if errors.As(err, &we) {
		return nil, server.InputProblem(err)
	}
	if err != nil {
		return nil, err
	}
	return briefSummary(sum), nil
}

// briefSummary is the summary of a fill as the Steamcell-Summary header
// carries it: counts and notes, without the column lists (the filled
// workbook's summary sheet has those).
func briefSummary(sum workbook.Summary) map[string]any {
	sheets := make([]map[string]any, 0, len(sum.Sheets))
	for _, sh := range sum.Sheets {
		m := map[string]any{"name": sh.Name, "filled": sh.Filled, "rows": sh.Rows, "ok": sh.OK,
			"flagged": sh.Flagged, "failed": sh.Failed}
		if sh.Note != "" {
			m["note"] = sh.Note
		}
		sheets = append(sheets, m)
	}
	return map[string]any{"rows": sum.Rows, "ok": sum.OK, "flagged": sum.Flagged, "failed": sum.Failed,
		"blank": sum.Blank, "summary_sheet": sum.SummarySheet, "sheets": sheets, "notes": sum.Notes}
}

// stopper is registered with App.Close to stop a running server.
type stopper struct {
	once sync.Once
	done chan struct{}
}

func (s *stopper) Close() error {
	s.once.Do(func() { close(s.done) })
	return nil
}

// byteSize is a flag value of bytes: a count with an optional unit, 16KiB,
// 256MiB, 1GiB, 10MB.
type byteSize int64

var byteUnits = []struct {
	suffix string
	mul    int64
}{
	{"kib", 1 << 10}, {"mib", 1 << 20}, {"gib", 1 << 30},
	{"kb", 1000}, {"mb", 1000 * 1000}, {"gb", 1000 * 1000 * 1000},
	{"k", 1 << 10}, {"m", 1 << 20}, {"g", 1 << 30},
	{"b", 1},
}

func (b *byteSize) Set(s string) error {
	t := strings.ToLower(strings.TrimSpace(s))
	mul := int64(1)
	for _, u := range byteUnits {
		if strings.HasSuffix(t, u.suffix) {
			t, mul = strings.TrimSpace(strings.TrimSuffix(t, u.suffix)), u.mul
			break
		}
	}
	n, err := strconv.ParseInt(t, 10, 64)
	if err != nil || n <= 0 || n > (1<<62)/mul {
		return fmt.Errorf("%q is not a size; write e.g. 16KiB, 256MiB or 1GiB", s)
	}
	*b = byteSize(n * mul)
	return nil
}

func (b *byteSize) String() string {
	n := int64(*b)
	for _, u := range []struct {
		name string
		mul  int64
	}{{"GiB", 1 << 30}, {"MiB", 1 << 20}, {"KiB", 1 << 10}} {
		if n >= u.mul && n%u.mul == 0 {
			return strconv.FormatInt(n/u.mul, 10) + u.name
		}
	}
	return strconv.FormatInt(n, 10)
}

func (b *byteSize) Type() string { return "size" }

// envName is the environment variable of a flag: STEAMCELL_ and the name
// in capitals, - as _.
func envName(flag string) string {
	return "STEAMCELL_" + strings.ToUpper(strings.ReplaceAll(flag, "-", "_"))
}

// flagsFromEnv sets each flag that keep selects and the command line left
// alone from its environment variable, when that is set and not empty (a
// flag on the command line wins). A value the flag refuses is a usage
// error that names the variable.
func flagsFromEnv(fs *pflag.FlagSet, keep func(*pflag.Flag) bool) error {
	var errs []error
	fs.VisitAll(func(f *pflag.Flag) {
		if f.Changed || f.Name == "help" || !keep(f) {
			return
		}
		v := os.Getenv(envName(f.Name))
		if v == "" {
			return
		}
		if err := fs.Set(f.Name, v); err != nil {
			errs = append(errs, fmt.Errorf("environment variable %s: %w", envName(f.Name), err))
		}
	})
	if err := errors.Join(errs...); err != nil {
		return usageError{err}
	}
	return nil
}

// readTokenFile reads the token from a file such as a mounted Kubernetes
// secret. An empty file is an error, not "no token": a secret left empty
// must not open the server to everyone.
func readTokenFile(path string) (string, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return "", fmt.Errorf("token file: %w", err)
	}
	tok := strings.TrimSpace(string(b))
	if tok == "" {
		return "", fmt.Errorf("token file %s is empty; put the token in it (or in its secret), or run without --token-file", path)
	}
	return tok, nil
}

// probeCommand asks a running server whether it is up, for the health
// check of a container image that has no shell or curl.
func (a *App) probeCommand() *cobra.Command {
	var (
		addr, path string
		timeout    time.Duration
	)
	cmd := &cobra.Command{
		Use:   "probe",
		Short: "Ask a running steamcell server whether it is up (exit 0) or not (exit 1)",
		Long: `probe sends GET /healthz (or --path) to the server at --addr, the same
address serve takes (and from STEAMCELL_ADDR too), and exits 0 when it
answers 200. An address on every interface (0.0.0.0, [::]) is asked on
this computer's loopback. It is the health check of the container image,
which has no shell or curl.`,
		Example: `  steamcell probe
  steamcell probe --addr 127.0.0.1:8097 --path /readyz`,
		PreRunE: func(cmd *cobra.Command, _ []string) error {
			return flagsFromEnv(cmd.Flags(), func(f *pflag.Flag) bool { return f.Name == "addr" })
		},
		RunE: func(cmd *cobra.Command, _ []string) error {
			target, err := probeURL(addr, path)
			if err != nil {
				return usageError{err}
			}
			client := &http.Client{Timeout: timeout}
			resp, err := client.Get(target)
			if err != nil {
				return fmt.Errorf("probe %s: %w", target, err)
			}
			defer resp.Body.Close()
			if resp.StatusCode != http.StatusOK {
				return fmt.Errorf("probe %s: %s", target, resp.Status)
			}
			_, err = fmt.Fprintf(cmd.OutOrStdout(), "%s: %s\n", target, resp.Status)
			return err
		},
	}
	f := cmd.Flags()
	f.StringVar(&addr, "addr", server.DefaultAddr, "address the server listens on")
	f.StringVar(&path, "path", "/healthz", "route to ask: /healthz (alive) or /readyz (taking requests)")
	f.DurationVar(&timeout, "timeout", 3*time.Second, "longest wait for the answer")
	return cmd
}

// probeURL is the URL of path on the server listening on addr.
func probeURL(addr, path string) (string, error) {
	host, port, err := net.SplitHostPort(addr)
	if err != nil {
		return "", fmt.Errorf("--addr %q: %w", addr, err)
	}
	if ip := net.ParseIP(host); host == "" || ip != nil && ip.IsUnspecified() {
		host = "127.0.0.1"
	}
	if !strings.HasPrefix(path, "/") {
		return "", fmt.Errorf("--path %q: a route starts with /", path)
	}
	return "http://" + net.JoinHostPort(host, port) + path, nil
}
