//go:build unix

package server

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"steamcell/fn"
	"steamcell/fn/transport"
)

// The per-row cost of /batch against the engine's cost of the same states,
// measured side by side: each iteration solves the states alone, then sends
// them as one batch through the handler (request log and metrics included,
// no network), so that both see the same moment of a shared machine.

// speedRows is the rows of one batch: a few chunks, a body kept in memory.
const speedRows = 16384

// speedPoint is row i of the benchmark batches: 1 to 100 barg, 200 to
// 499 °C, compressed liquid and superheated vapour in regions 1 and 2, a
// few rows near saturation (with a warning).
func speedPoint(i int) (pBarg, tC int) { return 1 + i%100, 200 + i%300 }

// speedBody is the batch of n rows as CSV (units in the header) or as a
// JSON array (units in the values).
func speedBody(n int, json bool) []byte {
	rows := make([]int, n)
	for i := range rows {
		rows[i] = i
	}
	return speedBodyOf(rows, json)
}

// speedBodyOf is the batch of the given rows.
func speedBodyOf(rows []int, json bool) []byte {
	var b []byte
	if json {
		b = append(b, '[')
		for k, i := range rows {
			if k > 0 {
				b = append(b, ",\n"...)
			}
			p, t := speedPoint(i)
			b = fmt.Appendf(b, `{"id":%d,"p":"%d barg","t":"%d °C"}`, i+1, p, t)
		}
		return append(b, "]\n"...)
	}
	b = append(b, "id,p [barg],t [°C]\n"...)
	for _, i := range rows {
		p, t := speedPoint(i)
		b = fmt.Appendf(b, "%d,%d,%d\n", i+1, p, t)
	}
	return b
}

// speedInputs are the states of speedBody as the engine takes them.
func speedInputs(n int) [][2]fn.Input {
	in := make([][2]fn.Input, n)
	for i := range in {
		p, t := speedPoint(i)
		in[i] = [2]fn.Input{{Q: fn.Pressure, Value: float64(p)/10 + 0.101325}, {Q: fn.Temperature, Value: float64(t) + 273.15}}
	}
	return in
}

// processCPU is the CPU time this process has used, all threads.
func processCPU() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		panic(err)
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// discardWriter is a ResponseWriter that throws the answer away.
type discardWriter struct {
	h      http.Header
	status int
	n      int
}

func (w *discardWriter) Header() http.Header {
	if w.h == nil {
		w.h = http.Header{}
	}
	return w.h
}
func (w *discardWriter) WriteHeader(status int)      { w.status = status }
func (w *discardWriter) Write(p []byte) (int, error) { w.n += len(p); return len(p), nil }
func (w *discardWriter) Flush()                      {}

var speedCases = []struct {
	name, in, query string
}{
	{"csv", "csv", "?get=h,s,v"},
	{"csv-json", "csv", "?get=h,s,v&format=json"},
	{"json", "json", "?get=h,s,v"},
	{"json-csv", "json", "?get=h,s,v&format=csv"},
	{"csv-defaults", "csv", ""},
	{"json-defaults", "json", ""},
}

func speedRequest(body []byte, in, query string) *http.Request {
	req := httptest.NewRequest(http.MethodPost, "/batch"+query, bytes.NewReader(body))
	req.Header.Set("Content-Type", map[string]string{"csv": "text/csv", "json": "application/json"}[in])
	return req
}

var (
	speedSink     fn.State
	transportSink transport.Result
)

// BenchmarkBatchRatio reports, for each way in and out and with one and
// two workers: ns/row of the batch, ns/state of the engine alone, their
// ratio in wall time and in CPU time of the process (which a machine
// shared with other jobs disturbs less), and rows/s of the batch. For the
// default properties it also reports the ratio to the state with its
// transport properties (ratio-with-transport), the physics such an answer
// holds.
func BenchmarkBatchRatio(b *testing.B) {
	inputs := speedInputs(speedRows)
	for _, tc := range speedCases {
		body := speedBody(speedRows, tc.in == "json")
		for _, workers := range []int{1, 2} {
			b.Run(fmt.Sprintf("%s/workers=%d", tc.name, workers), func(b *testing.B) {
				s := New(Config{Workers: workers, Version: "bench", Logger: slog.New(slog.NewTextHandler(io.Discard, nil))})
				rec := httptest.NewRecorder()
				s.ServeHTTP(rec, speedRequest(body, tc.in, tc.query))
				if ok := strings.Count(rec.Body.String(), "ok"); rec.Code != 200 || ok < speedRows {
					b.Fatalf("status %d, %d rows ok of %d:\n%.500s", rec.Code, ok, speedRows, rec.Body.String())
				}
				var batch, engine, physics, batchCPU, engineCPU time.Duration
				defaults := !strings.Contains(tc.query, "get=")
				for b.Loop() {
					t0, c0 := time.Now(), processCPU()
					for i := range inputs {
						speedSink, _ = fn.Solve(inputs[i][0], inputs[i][1])
					}
					t1, c1 := time.Now(), processCPU()
					engine += t1.Sub(t0)
					engineCPU += c1 - c0
					if defaults {
						// The default answer also holds the transport
						// properties of the state, physics that costs
						// about as much again as the state.
						for i := range inputs {
							speedSink, _ = fn.Solve(inputs[i][0], inputs[i][1])
							transportSink, _ = transport.ForState(speedSink.Props)
						}
						physics += time.Since(t1)
						t1, c1 = time.Now(), processCPU()
					}
					s.ServeHTTP(&discardWriter{}, speedRequest(body, tc.in, tc.query))
					batch += time.Since(t1)
					batchCPU += processCPU() - c1
				}
				rows := float64(b.N * speedRows)
				b.ReportMetric(float64(batch.Nanoseconds())/rows, "ns/row")
				b.ReportMetric(float64(engine.Nanoseconds())/rows, "ns/state")
				b.ReportMetric(float64(batch)/float64(engine), "ratio")
				b.ReportMetric(float64(batchCPU)/float64(engineCPU), "cpu-ratio")
				b.ReportMetric(rows/batch.Seconds(), "rows/s")
				if defaults {
					b.ReportMetric(float64(batch)/float64(physics), "ratio-with-transport")
				}
			})
		}
	}
}

// TestBatchRowAllocations checks that a row costs no allocation once the
// buffers have grown: read, solve, write, for each way in and out. The rows
// are states without warnings, whose text the engine makes anew.
func TestBatchRowAllocations(t *testing.T) {
	var rows []int
	for i := 0; len(rows) < 3000; i++ {
		in := speedInputs(i + 1)[i]
		if st, err := fn.Solve(in[0], in[1]); err == nil && len(st.Warnings) == 0 {
			rows = append(rows, i)
		}
	}
	for _, tc := range []struct{ in, format string }{{"csv", "csv"}, {"csv", "json"}, {"json", "json"}, {"json", "csv"}} {
		t.Run(tc.in+"-"+tc.format, func(t *testing.T) {
			body := speedBodyOf(rows, tc.in == "json")
			lim := &rowLimit{r: bytes.NewReader(body), max: maxRowBytes}
			br := bufio.NewReaderSize(lim, 64<<10)
			out := &batchOut{syms: []string{"h", "s", "v"}, format: tc.format}
			var src rowSource
			if tc.in == "json" {
				js, err := newJSONSource(br, lim, siSet)
				if err != nil {
					t.Fatal(err)
				}
				src = js
			} else {
				cs, err := newCSVSource(br, lim, siSet)
				if err != nil {
					t.Fatal(err)
				}
				src, out.header, out.delim = cs, cs.header, cs.r.Comma
			}
			out.prepare()
			s := New(Config{Workers: 1, Version: "test"})
			var row batchRow
			var ra rowAnswer
			var answer []byte
			step := func() {
				row.n++
				if err := src.next(&row); err != nil {
					t.Fatalf("row %d: %v", row.n, err)
				}
				s.solveRow(out, &row, &ra)
				answer = s.writeRow(answer[:0], out, &row, &ra)
				if !row.ok {
					t.Fatalf("row %d: %s", row.n, answer)
				}
			}
			for range 200 {
				step()
			}
			if a := testing.AllocsPerRun(2000, step); a != 0 {
				t.Errorf("%.2f allocations per row, want 0", a)
			}
		})
	}
}

// BenchmarkBatchParts splits a row's cost, in chunks as streamBatch takes
// them with one worker: reading the row, solving it (its inputs read with
// their units, the state, the plan's fill) and writing its answer, each
// against the engine's cost of the same states in the same iteration.
func BenchmarkBatchParts(b *testing.B) {
	inputs := speedInputs(speedRows)
	for _, tc := range []struct{ in, format string }{{"csv", "csv"}, {"csv", "json"}, {"json", "json"}, {"json", "csv"}} {
		body := speedBody(speedRows, tc.in == "json")
		out := &batchOut{syms: []string{"h", "s", "v"}, format: tc.format}
		source := func() rowSource {
			lim := &rowLimit{r: bytes.NewReader(body), max: maxRowBytes}
			br := bufio.NewReaderSize(lim, 64<<10)
			if tc.in == "json" {
				js, err := newJSONSource(br, lim, siSet)
				if err != nil {
					b.Fatal(err)
				}
				return js
			}
			cs, err := newCSVSource(br, lim, siSet)
			if err != nil {
				b.Fatal(err)
			}
			out.header, out.delim = cs.header, cs.r.Comma
			return cs
		}
		source()
		out.prepare()
		s := New(Config{Workers: 1, Version: "bench"})
		rows := make([]batchRow, chunkRows)
		var answers [blockRows]rowAnswer
		b.Run(tc.in+"-"+tc.format, func(b *testing.B) {
			var engine, read, solve, write time.Duration
			var buf []byte
			for b.Loop() {
				t0 := time.Now()
				for i := range inputs {
					speedSink, _ = fn.Solve(inputs[i][0], inputs[i][1])
				}
				engine += time.Since(t0)
				src := source()
				for k := 0; k < speedRows; k += chunkRows {
					t0 := time.Now()
					for i := range rows {
						rows[i].n = k + i + 1
						if err := src.next(&rows[i]); err != nil {
							b.Fatal(err)
						}
					}
					read += time.Since(t0)
					for j := 0; j < len(rows); j += blockRows {
						block := rows[j : j+blockRows]
						t1 := time.Now()
						for i := range block {
							s.solveRow(out, &block[i], &answers[i])
						}
						t2 := time.Now()
						buf = buf[:0]
						for i := range block {
							buf = s.writeRow(buf, out, &block[i], &answers[i])
						}
						solve, write = solve+t2.Sub(t1), write+time.Since(t2)
					}
				}
			}
			n := float64(b.N * speedRows)
			b.ReportMetric(float64(engine.Nanoseconds())/n, "ns/state")
			b.ReportMetric(float64(read.Nanoseconds())/n, "ns/read")
			b.ReportMetric(float64(solve.Nanoseconds())/n, "ns/solve")
			b.ReportMetric(float64(write.Nanoseconds())/n, "ns/write")
			b.ReportMetric(float64(read+solve+write)/float64(engine), "ratio")
		})
	}
}

// BenchmarkHandOver measures what a second worker gains on the states of
// a chunk's halves, by the size of a half: on the 2-CPU development
// machine a half of 128 rows lost (waking the other CPU cost more than its
// work), which is why two workers take chunks of chunkRowsTwo rows.
func BenchmarkHandOver(b *testing.B) {
	inputs := speedInputs(speedRows)
	var sinks [2]struct {
		st fn.State
		_  [64]byte // apart, not on one cache line
	}
	for _, half := range []int{blockRows, chunkRowsTwo / 2} {
		for _, workers := range []int{1, 2} {
			b.Run(fmt.Sprintf("half=%d/workers=%d", half, workers), func(b *testing.B) {
				solve := func(w, from, to int) {
					for i := from; i < to; i++ {
						sinks[w].st, _ = fn.Solve(inputs[i][0], inputs[i][1])
					}
				}
				for b.Loop() {
					for k := 0; k+2*half <= len(inputs); k += 2 * half {
						if workers == 1 {
							solve(0, k, k+2*half)
							continue
						}
						var wg sync.WaitGroup
						wg.Go(func() { solve(1, k+half, k+2*half) })
						solve(0, k, k+half)
						wg.Wait()
					}
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*speedRows), "ns/state")
			})
		}
	}
}
