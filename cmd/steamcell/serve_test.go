package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"io"
	"net"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"github.com/spf13/pflag"
	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
)

// lockedBuffer is a buffer the server's goroutines and the test share.
type lockedBuffer struct {
	mu    sync.Mutex
	b     bytes.Buffer
	wrote chan struct{} // has a value after a write, for waitURL; made on first use
}

func (l *lockedBuffer) Write(p []byte) (int, error) {
	l.mu.Lock()
	defer l.mu.Unlock()
	n, err := l.b.Write(p)
	select {
	case l.signal() <- struct{}{}:
	default: // a write is already signalled
	}
	return n, err
}

// signal is the channel a write signals on (l.mu held).
func (l *lockedBuffer) signal() chan struct{} {
	if l.wrote == nil {
		l.wrote = make(chan struct{}, 1)
	}
	return l.wrote
}

func (l *lockedBuffer) String() string {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.String()
}

var listening = regexp.MustCompile(`listening on (http://\S+)`)

// waitURL waits for the server's "listening on" line in out, woken by
// each write to out, for at most 10 s.
func waitURL(t *testing.T, out *lockedBuffer) string {
	t.Helper()
	out.mu.Lock()
	wrote := out.signal()
	out.mu.Unlock()
	deadline := time.After(10 * time.Second)
	for {
		if m := listening.FindStringSubmatch(out.String()); m != nil {
			return m[1]
		}
		select {
		case <-wrote:
		case <-deadline:
			t.Fatalf("the server did not start: %q", out.String())
			return ""
		}
	}
}

func fetch(t *testing.T, url string, header map[string]string) (int, string) {
	t.Helper()
	req, err := http.NewRequest(http.MethodGet, url, nil)
	if err != nil {
		t.Fatal(err)
	}
	for k, v := range header {
		req.Header.Set(k, v)
	}
	resp, err := http.DefaultClient.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	b, _ := io.ReadAll(resp.Body)
	return resp.StatusCode, string(b)
}

// TestServe runs the serve command in this process, asks it for a value,
// and stops it with App.Close.
func TestServe(t *testing.T) {
	t.Setenv("STEAMCELL_TOKEN", "t0ken")
	var out, errb lockedBuffer
	app := NewApp(strings.NewReader(""), &out, &errb)
	code := make(chan int, 1)
	go func() { code <- app.Run([]string{"serve", "--addr", "127.0.0.1:0", "--log-format", "json"}) }()
	base := waitURL(t, &out)

	if st, body := fetch(t, base+"/healthz", nil); st != 200 || !strings.Contains(body, `"status":"ok"`) {
		t.Errorf("/healthz: %d %s", st, body)
	}
	if st, _ := fetch(t, base+"/state/h?p=600kPa&t=330C", nil); st != 401 {
		t.Errorf("without the token from STEAMCELL_TOKEN: status %d, want 401", st)
	}
	st, body := fetch(t, base+"/state/h?p=600kPa&t=330C&units=us&key=t0ken", nil)
	want, err := fn.Solve(fn.Input{Q: fn.Pressure, Value: 0.6}, fn.Input{Q: fn.Temperature, Value: 603.15})
	if err != nil {
		t.Fatal(err)
	}
	got, perr := strconv.ParseFloat(body, 64)
	// 1 Btu_IT/lb = 2.326 kJ/kg exactly (NIST SP 811, 2008).
	if st != 200 || perr != nil || !scalar.EqualWithinAbsOrRel(got, want.H/2.326, 1e-9, 1e-12) {
		t.Errorf("/state/h in us units: %d %q, want %.15g", st, body, want.H/2.326)
	}

	// The demo workbook through POST /workbook, filled by package workbook.
	xlsx, err := os.ReadFile("../../testdata/demo/kestrel_bay_tests.xlsx")
	if err != nil {
		t.Fatal(err)
	}
	req, _ := http.NewRequest(http.MethodPost, base+"/workbook?name=kestrel_bay_tests.xlsx&get=h,s,phase", bytes.NewReader(xlsx))
	req.Header.Set("Authorization", "Bearer t0ken")
	resp, err := http.DefaultClient.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	filled, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	var sum struct {
		Rows int `json:"rows"`
		OK   int `json:"ok"`
	}
	if resp.StatusCode != 200 || !bytes.HasPrefix(filled, []byte("PK")) ||
		json.Unmarshal([]byte(resp.Header.Get("Steamcell-Summary")), &sum) != nil || sum.Rows == 0 || sum.OK == 0 {
		t.Errorf("/workbook: %d, %d bytes, summary %q", resp.StatusCode, len(filled), resp.Header.Get("Steamcell-Summary"))
	}
	// A file that is no workbook is the user's mistake: 400, not 500.
	req, _ = http.NewRequest(http.MethodPost, base+"/workbook?name=notes.xlsx&key=t0ken", strings.NewReader("just some text"))
	resp, err = http.DefaultClient.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != 400 {
		t.Errorf("/workbook with a text file: status %d, want 400", resp.StatusCode)
	}

	// The demo wet-steam samples through POST /batch: "Exhaust pressure
	// [kPa]" and "Dryness fraction [%]" are the inputs, the rest passes.
	csvBody, err := os.ReadFile("../../testdata/demo/wet_steam_sample.csv")
	if err != nil {
		t.Fatal(err)
	}
	req, _ = http.NewRequest(http.MethodPost, base+"/batch?get=t,h&key=t0ken", bytes.NewReader(csvBody))
	req.Header.Set("Content-Type", "text/csv")
	resp, err = http.DefaultClient.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	answer, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != 200 || strings.Count(string(answer), ",ok,") != 2 || !strings.HasPrefix(string(answer), "Sample,Exhaust pressure [kPa],Dryness fraction [%],Note,status,") {
		t.Errorf("/batch of the demo samples: %d\n%s", resp.StatusCode, answer)
	}

	if err := app.Close(); err != nil {
		t.Fatal(err)
	}
	select {
	case c := <-code:
		if c != ExitOK {
			t.Errorf("serve exit code %d after Close, stderr:\n%s", c, errb.String())
		}
	case <-time.After(10 * time.Second):
		t.Fatal("serve did not stop after Close")
	}
	logs := errb.String()
	if !strings.Contains(logs, `"route":"/state/{property}"`) || !strings.Contains(logs, `"msg":"stopped"`) {
		t.Errorf("log lacks the request line or the stop:\n%s", logs)
	}
	if strings.Contains(logs, "t0ken") {
		t.Errorf("the token reached the log:\n%s", logs)
	}
}

func TestServeUsage(t *testing.T) {
	for _, args := range [][]string{
		{"serve", "--units", "imperial"},
		{"serve", "--max-body", "12XB"},
		{"serve", "--max-rows", "many"},
		{"serve", "--log-format", "xml"},
		{"serve", "extra"},
	} {
		code, _, stderr := runApp(t, args...)
		if code != ExitUsage {
			t.Errorf("steamcell %q: exit %d, want %d (%s)", args, code, ExitUsage, stderr)
		}
	}
	// An address in use is a failure to run, not a usage error.
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	defer ln.Close()
	code, _, stderr := runApp(t, "serve", "--addr", ln.Addr().String())
	if code != ExitFailure || !strings.Contains(stderr, "listen on") {
		t.Errorf("address in use: exit %d, stderr %q", code, stderr)
	}
}

func TestByteSize(t *testing.T) {
	for in, want := range map[string]int64{"16KiB": 16 << 10, "256MiB": 256 << 20, "1GiB": 1 << 30, "10MB": 10_000_000, "4096": 4096, "2k": 2048} {
		var b byteSize
		if err := b.Set(in); err != nil || int64(b) != want {
			t.Errorf("Set(%q) = %d, %v; want %d", in, b, err, want)
		}
	}
	for _, in := range []string{"", "-1", "1.5MiB", "MiB", "1TB", "99999999999GiB"} {
		var b byteSize
		if err := b.Set(in); err == nil {
			t.Errorf("Set(%q) = %d, want an error", in, b)
		}
	}
}

// TestServeSignal starts steamcell serve in a child process, with a drain
// delay from the environment, sends it SIGTERM and checks that /readyz
// then answers 503 while requests are still served; a second SIGTERM ends
// the drain and the child stops cleanly with exit code 0.
func TestServeSignal(t *testing.T) {
	cmd := exec.Command(os.Args[0], "-test.run=^TestServeChildProcess$")
	cmd.Env = append(os.Environ(), "STEAMCELL_SERVE_CHILD=1", "STEAMCELL_DRAIN_DELAY=10m")
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	stderrPipe, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	defer cmd.Process.Kill()
	urlc := make(chan string, 1)
	go func() {
		sc := bufio.NewScanner(stdout)
		for sc.Scan() {
			if m := listening.FindStringSubmatch(sc.Text()); m != nil {
				urlc <- m[1]
			}
		}
	}()
	var stderr lockedBuffer
	draining, logDone := make(chan struct{}), make(chan struct{})
	go func() {
		defer close(logDone)
		sc := bufio.NewScanner(stderrPipe)
		seen := false
		for sc.Scan() {
			stderr.Write(append(sc.Bytes(), '\n'))
			if !seen && strings.Contains(sc.Text(), "draining") {
				seen = true
				close(draining)
			}
		}
	}()
	var base string
	select {
	case base = <-urlc:
	case <-time.After(20 * time.Second):
		t.Fatalf("child did not start: %s", stderr.String())
	}
	if st, _ := fetch(t, base+"/state/region?p=6barg&t=330C", nil); st != 200 {
		t.Fatalf("child answered %d", st)
	}
	if st, _ := fetch(t, base+"/readyz", nil); st != 200 {
		t.Errorf("/readyz before SIGTERM: %d, want 200", st)
	}
	if err := cmd.Process.Signal(syscall.SIGTERM); err != nil {
		t.Fatal(err)
	}
	select {
	case <-draining:
	case <-time.After(20 * time.Second):
		t.Fatalf("child logged no drain after SIGTERM:\n%s", stderr.String())
	}
	if st, _ := fetch(t, base+"/readyz", nil); st != http.StatusServiceUnavailable {
		t.Errorf("/readyz while draining: %d, want 503", st)
	}
	if st, _ := fetch(t, base+"/state/region?p=6barg&t=330C", nil); st != 200 {
		t.Errorf("/state while draining: %d, want 200", st)
	}
	if err := cmd.Process.Signal(syscall.SIGTERM); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() { <-logDone; done <- cmd.Wait() }()
	select {
	case err := <-done:
		if err != nil {
			t.Errorf("child after SIGTERM: %v; stderr:\n%s", err, stderr.String())
		}
	case <-time.After(20 * time.Second):
		t.Fatal("child did not stop after the second SIGTERM")
	}
	if !strings.Contains(stderr.String(), "msg=stopped") {
		t.Errorf("child log lacks the stop:\n%s", stderr.String())
	}
}

// TestServeChildProcess is the child of TestServeSignal: it runs the serve
// command until a signal stops it. Run on its own it does nothing.
func TestServeChildProcess(t *testing.T) {
	if os.Getenv("STEAMCELL_SERVE_CHILD") != "1" {
		t.Skip("the child process of TestServeSignal")
	}
	app := NewApp(strings.NewReader(""), os.Stdout, os.Stderr)
	code := app.Run([]string{"serve", "--addr", "127.0.0.1:0"})
	app.Close()
	os.Exit(code)
}

// TestServeEnvironment: flags come from STEAMCELL_ variables, the command
// line wins over them, a bad value names its variable, and the token can
// come from a file.
func TestServeEnvironment(t *testing.T) {
	dir := t.TempDir()
	tokenFile := filepath.Join(dir, "token")
	if err := os.WriteFile(tokenFile, []byte("f1le-t0ken\n"), 0o600); err != nil {
		t.Fatal(err)
	}
	t.Setenv("STEAMCELL_UNITS", "us")
	t.Setenv("STEAMCELL_ADDR", "127.0.0.1:1") // the command line's --addr wins
	t.Setenv("STEAMCELL_TOKEN_FILE", tokenFile)
	var out, errb lockedBuffer
	app := NewApp(strings.NewReader(""), &out, &errb)
	code := make(chan int, 1)
	go func() { code <- app.Run([]string{"serve", "--addr", "127.0.0.1:0"}) }()
	base := waitURL(t, &out)
	if st, _ := fetch(t, base+"/state/h?p=600kPa&t=330C", nil); st != 401 {
		t.Errorf("without the token of the file: %d, want 401", st)
	}
	st, body := fetch(t, base+"/state/h?p=600kPa&t=330C&key=f1le-t0ken", nil)
	want, err := fn.Solve(fn.Input{Q: fn.Pressure, Value: 0.6}, fn.Input{Q: fn.Temperature, Value: 603.15})
	if err != nil {
		t.Fatal(err)
	}
	got, perr := strconv.ParseFloat(body, 64)
	// STEAMCELL_UNITS=us: 1 Btu_IT/lb = 2.326 kJ/kg exactly (NIST SP 811, 2008).
	if st != 200 || perr != nil || !scalar.EqualWithinAbsOrRel(got, want.H/2.326, 1e-9, 1e-12) {
		t.Errorf("/state/h with STEAMCELL_UNITS=us: %d %q, want %.15g", st, body, want.H/2.326)
	}
	app.Close()
	if c := <-code; c != ExitOK {
		t.Errorf("serve exit %d; stderr %s", c, errb.String())
	}

	t.Setenv("STEAMCELL_TOKEN_FILE", "")
	t.Setenv("STEAMCELL_MAX_BODY", "12XB")
	if code, _, stderr := runApp(t, "serve", "--addr", "127.0.0.1:0"); code != ExitUsage || !strings.Contains(stderr, "STEAMCELL_MAX_BODY") {
		t.Errorf("STEAMCELL_MAX_BODY=12XB: exit %d, stderr %q; want a usage error naming the variable", code, stderr)
	}
	t.Setenv("STEAMCELL_MAX_BODY", "")
	empty := filepath.Join(dir, "empty")
	if err := os.WriteFile(empty, nil, 0o600); err != nil {
		t.Fatal(err)
	}
	if code, _, stderr := runApp(t, "serve", "--addr", "127.0.0.1:0", "--token-file", empty); code != ExitFailure || !strings.Contains(stderr, "empty") {
		t.Errorf("empty token file: exit %d, stderr %q; want a failure, not a server open to all", code, stderr)
	}
	if code, _, _ := runApp(t, "serve", "--token", "a", "--token-file", tokenFile); code != ExitUsage {
		t.Errorf("--token and --token-file: exit %d, want %d", code, ExitUsage)
	}
}

// TestServeFlagTable: the README's table of flags and environment
// variables lists every flag of serve, its variable and its default, and
// nothing else.
func TestServeFlagTable(t *testing.T) {
	readme, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	row := regexp.MustCompile("^\\| `--([a-z-]+)` \\| `(STEAMCELL_[A-Z_]+)` \\| ([^|]+) \\|")
	inTable := map[string]bool{}
	for line := range strings.SplitSeq(string(readme), "\n") {
		m := row.FindStringSubmatch(line)
		if m == nil {
			continue
		}
		name, env, def := m[1], m[2], strings.Trim(strings.TrimSpace(m[3]), "`")
		inTable[name] = true
		f := NewApp(nil, io.Discard, io.Discard).serveCommand().Flags().Lookup(name)
		if f == nil {
			t.Errorf("README lists --%s, which serve does not have", name)
			continue
		}
		if env != envName(name) {
			t.Errorf("README: --%s is set by %s, want %s", name, env, envName(name))
		}
		want := f.DefValue
		if want == "" || want == "[]" {
			want = "none"
		}
		if def != want {
			t.Errorf("README: --%s defaults to %q, the flag to %q", name, def, want)
		}
	}
	NewApp(nil, io.Discard, io.Discard).serveCommand().Flags().VisitAll(func(f *pflag.Flag) {
		if !inTable[f.Name] {
			t.Errorf("README's table of flags lacks --%s (%s)", f.Name, envName(f.Name))
		}
	})
}

// TestProbe: probe exits 0 for a server that is up, 1 for none, and asks
// an address on every interface on the loopback.
func TestProbe(t *testing.T) {
	var out, errb lockedBuffer
	app := NewApp(strings.NewReader(""), &out, &errb)
	code := make(chan int, 1)
	go func() { code <- app.Run([]string{"serve", "--addr", "127.0.0.1:0"}) }()
	base := waitURL(t, &out)
	addr := strings.TrimPrefix(base, "http://")
	_, port, _ := net.SplitHostPort(addr)
	if c, stdout, stderr := runApp(t, "probe", "--addr", addr); c != ExitOK || !strings.Contains(stdout, "200") {
		t.Errorf("probe of a running server: exit %d, %q %q", c, stdout, stderr)
	}
	t.Setenv("STEAMCELL_ADDR", "0.0.0.0:"+port)
	if c, _, stderr := runApp(t, "probe", "--path", "/readyz"); c != ExitOK {
		t.Errorf("probe of STEAMCELL_ADDR=0.0.0.0:%s /readyz: exit %d, %q", port, c, stderr)
	}
	if c, _, _ := runApp(t, "probe", "--path", "/nowhere"); c != ExitFailure {
		t.Errorf("probe of a path that is no route: exit %d, want %d", c, ExitFailure)
	}
	app.Close()
	<-code
	if c, _, _ := runApp(t, "probe", "--addr", addr); c != ExitFailure {
		t.Errorf("probe of a stopped server: exit %d, want %d", c, ExitFailure)
	}
	if c, _, _ := runApp(t, "probe", "--addr", "nowhere"); c != ExitUsage {
		t.Errorf("probe --addr nowhere: exit %d, want %d", c, ExitUsage)
	}
}
