package server_test

import (
	"bufio"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math/rand/v2"
	"net/http"
	"net/http/httptest"
	"runtime"
	"runtime/debug"
	"runtime/metrics"
	"strconv"
	"strings"
	"sync/atomic"
	"testing"
	"time"

	"steamcell/fn"
	"steamcell/server"
)

// batchAnswer is the JSON answer of /batch.
type batchAnswer struct {
	Formulation string           `json:"formulation"`
	UnitSet     string           `json:"unit_set"`
	Caution     string           `json:"caution"`
	Rows        []map[string]any `json:"rows"`
	Total       int              `json:"rows_total"`
	OK          int              `json:"rows_ok"`
	Failed      int              `json:"rows_failed"`
	Complete    bool             `json:"complete"`
	Stopped     *struct {
		Code    string `json:"code"`
		Message string `json:"message"`
	} `json:"stopped"`
}

func postBatch(h http.Handler, query, ctype, body string) *httptest.ResponseRecorder {
	hdr := map[string]string{}
	if ctype != "" {
		hdr["Content-Type"] = ctype
	}
	return send(h, http.MethodPost, "/batch"+query, body, hdr)
}

func readCSV(t *testing.T, body string, delim rune) [][]string {
	t.Helper()
	r := csv.NewReader(strings.NewReader(body))
	r.Comma = delim
	r.FieldsPerRecord = -1
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatalf("answer is not CSV: %v\n%s", err, body)
	}
	return recs
}

func TestBatchCSV(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	body := "Tag,Drum pressure [barg],T (°C),note\n" +
		"FW-1,6,330,first\n" +
		"FW-2,6 bar,330,gauge header but absolute cell\n" +
		"FW-3,6,abc,\n" +
		"FW-4,6,20,\"cold, liquid\"\n"
	w := postBatch(srv, "?get=h,s,x", "text/csv", body)
	if w.Code != 200 || !strings.HasPrefix(w.Header().Get("Content-Type"), "text/csv") {
		t.Fatalf("status %d %q: %s", w.Code, w.Header().Get("Content-Type"), w.Body)
	}
	recs := readCSV(t, w.Body.String(), ',')
	wantHeader := []string{"Tag", "Drum pressure [barg]", "T (°C)", "note", "status", "phase", "region", "h [kJ/kg]", "s [kJ/(kg·K)]", "x", "warnings"}
	if fmt.Sprint(recs[0]) != fmt.Sprint(wantHeader) {
		t.Errorf("header %q, want %q", recs[0], wantHeader)
	}
	if len(recs) != 5 {
		t.Fatalf("%d lines, want a header and 4 rows:\n%s", len(recs), w.Body)
	}
	for i, tc := range []struct {
		tag, status string
		t           float64 // °C; 0 for a failed row
	}{
		{"FW-1", "ok", 330},
		{"FW-2", "make them agree", 0},
		{"FW-3", "number", 0},
		{"FW-4", "ok", 20},
	} {
		rec := recs[i+1]
		if rec[0] != tc.tag || len(rec) != len(wantHeader) {
			t.Errorf("row %d: %q", i+1, rec)
			continue
		}
		if tc.status == "ok" {
			if rec[4] != "ok" {
				t.Errorf("row %d: status %q", i+1, rec[4])
				continue
			}
			st := solve(t, fn.Input{Q: fn.Pressure, Value: 0.701325}, fn.Input{Q: fn.Temperature, Value: tc.t + 273.15})
			h, _ := strconv.ParseFloat(rec[7], 64)
			if !same(h, st.H) || rec[5] != st.Phase.String() {
				t.Errorf("row %d: h %s phase %s, want %.15g %s", i+1, rec[7], rec[5], st.H, st.Phase)
			}
		} else if !strings.Contains(rec[4], tc.status) || rec[7] != "" {
			t.Errorf("row %d: status %q, want a reason mentioning %q and no values", i+1, rec[4], tc.status)
		}
	}
	if recs[4][3] != "cold, liquid" {
		t.Errorf("passed-through cell %q", recs[4][3])
	}
}

func TestBatchJSON(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	body := `[{"tag":"FW-1","p":"6 barg","t":"330C"},
	 {"tag":"FW-2","P [MPa]":1,"x":0.9,"meta":{"by":"ops"}},
	 {"p":"6 barg"},
	 7,
	 {"p":"1MPa","t":null}]`
	w := postBatch(srv, "?get=h", "application/json", body)
	if w.Code != 200 {
		t.Fatalf("status %d: %s", w.Code, w.Body)
	}
	var a batchAnswer
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil {
		t.Fatalf("answer is not JSON: %v\n%s", err, w.Body)
	}
	if a.Caution != server.Caution || a.Formulation != "IAPWS-IF97" || !a.Complete || a.Total != 5 || a.OK != 2 || a.Failed != 3 {
		t.Errorf("answer: caution %q, complete %v, total %d ok %d failed %d", a.Caution, a.Complete, a.Total, a.OK, a.Failed)
	}
	st1 := solve(t, fn.Input{Q: fn.Pressure, Value: 0.701325}, fn.Input{Q: fn.Temperature, Value: 603.15})
	st2 := solve(t, fn.Input{Q: fn.Pressure, Value: 1}, fn.Input{Q: fn.Quality, Value: 0.9})
	for i, tc := range []struct {
		status string
		h      float64
		code   string
	}{{"ok", st1.H, ""}, {"ok", st2.H, ""}, {"", 0, "input_count"}, {"", 0, "malformed_body"}, {"", 0, "empty_value"}} {
		row := a.Rows[i]
		if row["row"] != float64(i+1) {
			t.Errorf("row %d numbered %v", i+1, row["row"])
		}
		if tc.status == "ok" {
			if row["status"] != "ok" || !same(row["h"].(float64), tc.h) {
				t.Errorf("row %d: %v, want ok with h %.15g", i+1, row, tc.h)
			}
			continue
		}
		e, _ := row["error"].(map[string]any)
		if e == nil || e["code"] != tc.code || row["status"] != e["message"] {
			t.Errorf("row %d: %v, want error %s", i+1, row, tc.code)
		}
	}
	given := a.Rows[1]["given"].(map[string]any)
	if given["tag"] != "FW-2" || given["meta"] == nil {
		t.Errorf("row 2 given = %v, want the object as sent", given)
	}
}

// TestBatchOrder sends more rows than one chunk, on two workers, and checks
// that every answer row is that of its input row.
func TestBatchOrder(t *testing.T) {
	srv, _ := newServer(t, server.Config{Workers: 2})
	const n = 5000 // more than two chunks of 2048 rows
	var b strings.Builder
	b.WriteString("n;p [MPa];t [°C]\n")
	for i := range n {
		fmt.Fprintf(&b, "%d;1;%g\n", i, 20+float64(i)*0.25)
	}
	for _, format := range []string{"csv", "json"} {
		w := postBatch(srv, "?get=t,h&format="+format, "text/csv", b.String())
		if w.Code != 200 {
			t.Fatalf("%s: status %d", format, w.Code)
		}
		var ts, hs []float64
		if format == "csv" {
			recs := readCSV(t, w.Body.String(), ';')
			if len(recs) != n+1 {
				t.Fatalf("csv: %d lines, want %d", len(recs), n+1)
			}
			for i, rec := range recs[1:] {
				if rec[0] != strconv.Itoa(i) || rec[3] != "ok" {
					t.Fatalf("csv row %d: %q", i, rec)
				}
				tv, _ := strconv.ParseFloat(rec[6], 64)
				hv, _ := strconv.ParseFloat(rec[7], 64)
				ts, hs = append(ts, tv), append(hs, hv)
			}
		} else {
			var a batchAnswer
			if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil || len(a.Rows) != n {
				t.Fatalf("json: %v, %d rows", err, len(a.Rows))
			}
			for _, r := range a.Rows {
				ts, hs = append(ts, r["t"].(float64)), append(hs, r["h"].(float64))
			}
		}
		for i := range n {
			tC := 20 + float64(i)*0.25
			st := solve(t, fn.Input{Q: fn.Pressure, Value: 1}, fn.Input{Q: fn.Temperature, Value: tC + 273.15})
			if !same(ts[i], tC) || !same(hs[i], st.H) {
				t.Fatalf("%s row %d: t %g h %.15g, want t %g h %.15g", format, i, ts[i], hs[i], tC, st.H)
			}
		}
	}
}

func TestBatchBodies(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	// A spreadsheet's "CSV UTF-8" with a byte order mark and semicolons,
	// sent without a Content-Type (sniffed).
	w := postBatch(srv, "?get=h", "", "\ufeffp [bar];t [°C]\r\n10;200\r\n")
	recs := readCSV(t, w.Body.String(), ';')
	if w.Code != 200 || len(recs) != 2 || recs[0][0] != "p [bar]" || recs[1][2] != "ok" {
		t.Errorf("BOM and semicolons: %d %q", w.Code, recs)
	}
	// Tabs.
	w = postBatch(srv, "?get=h", "text/tab-separated-values", "p [bar]\tt [°C]\n10\t200\n")
	if recs := readCSV(t, w.Body.String(), '\t'); w.Code != 200 || len(recs) != 2 || recs[1][2] != "ok" {
		t.Errorf("tabs: %d %q", w.Code, recs)
	}
	// A JSON body sniffed from its first character.
	w = postBatch(srv, "?get=h", "application/x-www-form-urlencoded", ` [{"p":"10bar","t":"200C"}]`)
	var a batchAnswer
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil || a.OK != 1 {
		t.Errorf("sniffed JSON: %d %s", w.Code, w.Body)
	}

	for _, tc := range []struct {
		name, ctype, body string
		status            int
		code              string
	}{
		{"empty CSV", "text/csv", "", 400, "malformed_body"},
		{"empty JSON", "application/json", "", 400, "malformed_body"},
		{"one input column", "text/csv", "tag,p [bar]\na,1\n", 400, "input_count"},
		{"three input columns", "text/csv", "p [bar],t [°C],h [kJ/kg]\n1,2,3\n", 400, "input_count"},
		{"two pressure columns", "text/csv", "P1 [bar],P2 [bar],t [°C]\n1,2,3\n", 400, "repeated_input"},
		{"unit of another quantity", "text/csv", "p [°C],t [°C]\n1,2\n", 400, "malformed_body"},
		{"invalid UTF-8 header", "text/csv", "p [bar],\xff\xfe\nt\n", 400, "malformed_body"},
		{"JSON object, not array", "application/json", `{"p":"1bar","t":"20C"}`, 400, "malformed_body"},
		{"JSON string", "application/json", `"p=1bar"`, 400, "malformed_body"},
		{"XML", "application/xml", "<p>1</p>", 415, "unsupported_media_type"},
		{"multipart", "multipart/form-data; boundary=x", "--x--", 415, "unsupported_media_type"},
	} {
		w := postBatch(srv, "", tc.ctype, tc.body)
		checkJSONError(t, tc.name, w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), tc.status, tc.code, "")
	}
	for _, q := range []string{"?p=1bar", "?format=xml", "?get=zz", "?units=zz"} {
		w := postBatch(srv, q, "text/csv", "p [bar],t [°C]\n1,20\n")
		if w.Code != 400 {
			t.Errorf("/batch%s: status %d, want 400", q, w.Code)
		}
	}
}

// TestBatchRowProblems: a bad row gets its reason, the rows after it go on.
func TestBatchRowProblems(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	body := "p [bar],t [°C]\n" +
		"1,20\n" +
		"1,20,extra\n" +
		"1,\"20\n" + // an open quote runs to the end of the body
		"1,30\n"
	w := postBatch(srv, "?get=h", "text/csv", body)
	recs := readCSV(t, w.Body.String(), ',')
	if w.Code != 200 || len(recs) < 3 || recs[1][2] != "ok" || len(recs[2]) != len(recs[0]) || !strings.Contains(recs[2][2], "cells") {
		t.Errorf("row problems: %d %q", w.Code, recs)
	}
	last := recs[len(recs)-1]
	if strings.Contains(last[2], "ok") {
		t.Errorf("the open quote should swallow the rest: last row %q", last)
	}

	// Invalid UTF-8 in a value and in a passed-through cell.
	w = postBatch(srv, "?get=h&format=json", "text/csv", "tag,p [bar],t [°C]\n\xff,1,20\nb,1\xff,20\n")
	var a batchAnswer
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil || a.OK != 1 || a.Failed != 1 {
		t.Errorf("invalid UTF-8: %v %s", err, w.Body)
	}
}

func TestBatchLimits(t *testing.T) {
	srv, _ := newServer(t, server.Config{MaxRows: 5, MaxBodyBytes: 4096})
	rows := func(n int) string {
		var b strings.Builder
		b.WriteString("p [bar],t [°C]\n")
		for range n {
			b.WriteString("1,20\n")
		}
		return b.String()
	}
	// Exactly the limit: complete.
	w := postBatch(srv, "?get=h", "text/csv", rows(5))
	if recs := readCSV(t, w.Body.String(), ','); len(recs) != 6 || recs[5][2] != "ok" {
		t.Errorf("5 rows at a limit of 5: %q", recs)
	}
	// Over it: the rows up to the limit, then a row saying why it stopped.
	w = postBatch(srv, "?get=h", "text/csv", rows(7))
	recs := readCSV(t, w.Body.String(), ',')
	if len(recs) != 7 || !strings.HasPrefix(recs[6][2], "stopped: more than 5 rows") {
		t.Errorf("7 rows at a limit of 5: %q", recs)
	}
	w = postBatch(srv, "?get=h&format=json", "text/csv", rows(7))
	var a batchAnswer
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil || a.Complete || a.Stopped == nil || a.Stopped.Code != "too_many_rows" || a.Total != 5 {
		t.Errorf("7 rows at a limit of 5, JSON: %v %s", err, w.Body)
	}
	// A body over the byte limit is refused before any answer.
	w = postBatch(srv, "", "text/csv", rows(1000))
	checkJSONError(t, "body over the limit", w.Code, w.Body.Bytes(), w.Header().Get("Content-Type"), 413, "body_too_large", "")

	// A JSON body cut short: the rows read are answered, then the reason.
	srv, _ = newServer(t, server.Config{})
	w = postBatch(srv, "?get=h", "application/json", `[{"p":"1bar","t":"20C"},{"p":"1bar","t":"30C"},{"p":"1b`)
	a = batchAnswer{}
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil || a.Complete || a.Total != 2 || a.Stopped == nil || a.Stopped.Code != "malformed_body" {
		t.Errorf("cut JSON: %v %s", err, w.Body)
	}
	// A row longer than the row limit stops the batch.
	w = postBatch(srv, "?get=h", "text/csv", "tag,p [bar],t [°C]\nx,1,20\n"+strings.Repeat("y", 3<<20)+",1,20\n")
	recs = readCSV(t, w.Body.String(), ',')
	if len(recs) != 3 || recs[1][3] != "ok" || !strings.HasPrefix(recs[2][3], "stopped: a row is longer") {
		t.Errorf("row over the limit: %d lines, last %q", len(recs), clip(fmt.Sprint(recs[len(recs)-1])))
	}
}

// TestBatchHostileBodies sends bodies spliced from good and bad pieces
// (fixed seed): never a 500, and a 200 answer is always well-formed CSV or
// JSON.
func TestBatchHostileBodies(t *testing.T) {
	srv, logs := newServer(t, server.Config{MaxBodyBytes: 64 << 10})
	pieces := []string{"p [barg],t [°C]\n", "tag;p [bar];T (°C)\n", "1,20\n", "6,330\n", "\"1\",\"2\"\n", "\"", "\xff\xfe", "\x00",
		",,,,\n", "\r\n", "[", "]", "{", "}", `{"p":"1bar","t":"20C"}`, `{"p":[1]}`, ",", `"p":1`, "null", "1e999", "\ufeff",
		"h [kJ/kg],s [kJ/(kg·K)]\n", "2800,6.5\n", strings.Repeat("9", 100)}
	rng := rand.New(rand.NewPCG(3, 4))
	for i := range 400 {
		var b strings.Builder
		for range 1 + rng.IntN(12) {
			b.WriteString(pieces[rng.IntN(len(pieces))])
		}
		ctype := []string{"", "text/csv", "application/json"}[rng.IntN(3)]
		w := postBatch(srv, "?get=h", ctype, b.String())
		switch w.Code {
		case 200:
			if strings.HasPrefix(w.Header().Get("Content-Type"), "application/json") {
				if !json.Valid(w.Body.Bytes()) {
					t.Fatalf("body %d %q: answer is not JSON: %s", i, b.String(), w.Body)
				}
			} else {
				body := w.Body.String()
				at := strings.Index(body, "status")
				if at < 1 {
					t.Fatalf("body %d %q: no status column in %q", i, b.String(), body)
				}
				r := csv.NewReader(strings.NewReader(body))
				r.Comma, r.FieldsPerRecord = rune(body[at-1]), 0
				if _, err := r.ReadAll(); err != nil {
					t.Fatalf("body %d %q: answer is not CSV of one width: %v\n%s", i, b.String(), err, w.Body)
				}
			}
		case 400, 413, 415:
			var e errorBody
			if err := json.Unmarshal(w.Body.Bytes(), &e); err != nil || e.Code == "" {
				t.Fatalf("body %d %q: error answer %s", i, b.String(), w.Body)
			}
		default:
			t.Fatalf("body %d %q: status %d: %s", i, b.String(), w.Code, w.Body)
		}
	}
	if strings.Contains(logs.String(), `"level":"ERROR"`) {
		t.Errorf("hostile bodies logged internal errors")
	}
}

// rowsReader generates a CSV body of n rows without holding it.
type rowsReader struct {
	n, i int
	buf  []byte
}

func (r *rowsReader) Read(p []byte) (int, error) {
	for len(r.buf) < len(p) && r.i <= r.n {
		if r.i == 0 {
			r.buf = append(r.buf, "id,p [barg],t [°C]\n"...)
		} else {
			r.buf = fmt.Appendf(r.buf, "%d,%d,%d\n", r.i, 1+r.i%100, 200+r.i%300)
		}
		r.i++
	}
	if len(r.buf) == 0 {
		return 0, io.EOF
	}
	n := copy(p, r.buf)
	r.buf = r.buf[:copy(r.buf, r.buf[n:])]
	return n, nil
}

// heapPeak samples the bytes of live and not yet swept heap objects until
// stop is closed.
func heapPeak(stop <-chan struct{}) <-chan uint64 {
	out := make(chan uint64, 1)
	go func() {
		s := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}}
		var peak uint64
		tick := time.NewTicker(2 * time.Millisecond)
		defer tick.Stop()
		for {
			metrics.Read(s)
			peak = max(peak, s[0].Value.Uint64())
			select {
			case <-stop:
				out <- peak
				return
			case <-tick.C:
			}
		}
	}()
	return out
}

// TestBatchMemory streams rows through a real connection and checks that
// the heap grows by far less than the size of the answer: the server holds
// a chunk, not the batch. The bound is a quarter of the answer (at most
// 32 MiB), so that a server that kept the answer fails in the short mode
// as in the default one. The collector runs at GOGC=25 meanwhile, so that
// the sampled heap is the live one and not the garbage a default collector
// lets grow to twice it.
func TestBatchMemory(t *testing.T) {
	n := 200_000
	if testing.Short() {
		n = 100_000
	}
	srv, _ := newServer(t, server.Config{})
	ts := httptest.NewServer(srv)
	defer ts.Close()
	defer debug.SetGCPercent(debug.SetGCPercent(25))
	runtime.GC()
	base := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}}
	metrics.Read(base)
	stop := make(chan struct{})
	peakc := heapPeak(stop)

	start := time.Now()
	resp, err := http.Post(ts.URL+"/batch", "text/csv", &rowsReader{n: n})
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	var lines, okRows, answerBytes int64
	sc := bufio.NewScanner(resp.Body)
	for sc.Scan() {
		line := sc.Bytes()
		answerBytes += int64(len(line)) + 1
		lines++
		if lines > 1 && strings.Contains(string(line), ",ok,") {
			okRows++
		}
	}
	close(stop)
	peak := <-peakc
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	elapsed := time.Since(start)
	if lines != int64(n)+1 || okRows != int64(n) {
		t.Fatalf("%d lines, %d ok, want %d rows", lines, okRows, n)
	}
	grown := int64(peak) - int64(base[0].Value.Uint64())
	limit := min(answerBytes/4, 32<<20)
	t.Logf("%d rows, answer %.1f MB, heap %.1f MiB before, peak %.1f MiB (test and server together; grown %.1f MiB, bound %.1f MiB), %.0f rows/s",
		n, float64(answerBytes)/1e6, float64(base[0].Value.Uint64())/(1<<20), float64(peak)/(1<<20), float64(grown)/(1<<20), float64(limit)/(1<<20), float64(n)/elapsed.Seconds())
	if grown > limit {
		t.Errorf("heap grew by %d bytes for an answer of %d bytes; want under %d", grown, answerBytes, limit)
	}
}

// BenchmarkBatch measures rows per second of a CSV batch, default
// properties, through a real connection.
func BenchmarkBatch(b *testing.B) {
	for _, workers := range []int{1, 2} {
		b.Run(fmt.Sprintf("workers=%d", workers), func(b *testing.B) {
			srv, _ := newServer(b, server.Config{Workers: workers})
			ts := httptest.NewServer(srv)
			defer ts.Close()
			const rows = 20_000
			var total atomic.Int64
			b.ResetTimer()
			for range b.N {
				resp, err := http.Post(ts.URL+"/batch", "text/csv", &rowsReader{n: rows})
				if err != nil {
					b.Fatal(err)
				}
				nb, _ := io.Copy(io.Discard, resp.Body)
				resp.Body.Close()
				total.Add(nb)
			}
			b.ReportMetric(float64(rows*b.N)/b.Elapsed().Seconds(), "rows/s")
			b.SetBytes(total.Load() / int64(b.N))
		})
	}
}

// TestBatchMemoryReused: a batch answers the same whatever the batches
// before it left in the memory that batches hand on to each other (the
// chunk's rows, their answers, the body's buffer): each batch of a mixed
// sequence, sent back to back, against its answer on memory made anew
// (the pools are emptied by two collections). The batches change their
// way in and out, their columns, their keys midway, their row sizes and
// their number of rows, so that a row's kept inputs, keys or text from
// an earlier batch would show.
func TestBatchMemoryReused(t *testing.T) {
	var long, mixed strings.Builder
	long.WriteString("[")
	for i := range 5000 {
		if i > 0 {
			long.WriteString(",")
		}
		fmt.Fprintf(&long, `{"tag":"KB-%d %s","p":"%d barg","t":"%d °C"}`, i, strings.Repeat("x", i%97), 1+i%90, 180+i%250)
	}
	long.WriteString("]")
	mixed.WriteString("[")
	for i := range 300 {
		if i > 0 {
			mixed.WriteString(",")
		}
		if i < 150 {
			fmt.Fprintf(&mixed, `{"p":"%d bar","h":"%d kJ/kg"}`, 2+i%40, 400+i*9)
		} else {
			fmt.Fprintf(&mixed, `{"T":%d,"x":0.%d}`, 100+i%200, 1+i%9)
		}
	}
	mixed.WriteString("]")
	var csvHS strings.Builder
	csvHS.WriteString("h [kJ/kg];s [kJ/(kg·K)];note\n")
	for i := range 700 {
		fmt.Fprintf(&csvHS, "%d;%g;\"row %d, as logged\"\n", 2700+i%300, 6.5+float64(i%50)/50, i)
	}
	var big strings.Builder // beyond the megabyte a body is kept in memory for
	big.WriteString("tag,p [kPa],t [°C]\n")
	for i := 0; big.Len() <= 1<<20+1000; i++ {
		fmt.Fprintf(&big, "TG-%d,%d,%d\n", i, 150+i%900, 130+i%300)
	}
	batches := []struct{ query, ctype, body string }{
		{"", "application/json", long.String()},
		{"?get=h", "text/csv", big.String()},
		{"?get=t,x,h", "application/json", mixed.String()},
		{"?get=p,t&format=csv", "text/csv", csvHS.String()},
		{"?format=json", "text/csv", "p [MPa],t [K]\n1,400\n0.5,600\n"},
		{"?get=h,s,v", "application/json", long.String()},
	}
	answer := func(srv http.Handler, i int) string {
		b := batches[i]
		w := postBatch(srv, b.query, b.ctype, b.body)
		if w.Code != 200 {
			t.Fatalf("batch %d: status %d: %.300s", i, w.Code, w.Body.String())
		}
		return w.Body.String()
	}
	srv, _ := newServer(t, server.Config{Workers: 2})
	fresh := make([]string, len(batches))
	for i := range batches {
		runtime.GC()
		runtime.GC()
		fresh[i] = answer(srv, i)
	}
	for round := range 2 {
		for i := range batches {
			if got := answer(srv, i); got != fresh[i] {
				k := 0
				for k < min(len(got), len(fresh[i])) && got[k] == fresh[i][k] {
					k++
				}
				t.Fatalf("round %d, batch %d differs from its answer on fresh memory at byte %d:\n got …%.200s\nwant …%.200s", round, i, k, got[max(k-80, 0):], fresh[i][max(k-80, 0):])
			}
		}
	}
	if !strings.Contains(fresh[0], `"rows_ok":5000,`) || !strings.Contains(fresh[2], `"rows_ok":300,`) || strings.Count(fresh[1], ",ok,") < 60000 {
		t.Errorf("the batches are not all answered: %.200s … %.200s", fresh[0][len(fresh[0])-200:], fresh[2][len(fresh[2])-200:])
	}
}
