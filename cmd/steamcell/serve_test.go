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
	"regexp"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
)

// lockedBuffer is a buffer the server's goroutines and the test share.
type lockedBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (l *lockedBuffer) Write(p []byte) (int, error) {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.Write(p)
}

func (l *lockedBuffer) String() string {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.String()
}

var listening = regexp.MustCompile(`listening on (http://\S+)`)

// waitURL waits for the server's "listening on" line in out.
func waitURL(t *testing.T, out *lockedBuffer) string {
	t.Helper()
	for range 500 {
		if m := listening.FindStringSubmatch(out.String()); m != nil {
			return m[1]
		}
		time.Sleep(10 * time.Millisecond)
	}
	t.Fatalf("the server did not start: %q", out.String())
	return ""
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

// TestServeSignal starts steamcell serve in a child process, sends it
// SIGTERM and checks that it stops cleanly with exit code 0.
func TestServeSignal(t *testing.T) {
	cmd := exec.Command(os.Args[0], "-test.run=^TestServeChildProcess$")
	cmd.Env = append(os.Environ(), "STEAMCELL_SERVE_CHILD=1")
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	var stderr lockedBuffer
	cmd.Stderr = &stderr
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
	var base string
	select {
	case base = <-urlc:
	case <-time.After(20 * time.Second):
		t.Fatalf("child did not start: %s", stderr.String())
	}
	if st, _ := fetch(t, base+"/state/region?p=6barg&t=330C", nil); st != 200 {
		t.Fatalf("child answered %d", st)
	}
	if err := cmd.Process.Signal(syscall.SIGTERM); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	select {
	case err := <-done:
		if err != nil {
			t.Errorf("child after SIGTERM: %v; stderr:\n%s", err, stderr.String())
		}
	case <-time.After(20 * time.Second):
		t.Fatal("child did not stop after SIGTERM")
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
