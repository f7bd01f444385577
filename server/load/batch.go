package main

import (
	"bufio"
	"bytes"
	"cmp"
	"context"
	"fmt"
	"net"
	"net/http"
	"os"
	"os/exec"
	"strconv"
	"strings"
	"time"
)

// runBatch measures one POST /batch of n (p,T) rows asking for h, s and v,
// the same body on each server of bins in turn, rounds times: wall time
// from the first byte sent to the last byte read, and the CPU time the
// server used meanwhile. "self" is this program's own steamcell child;
// anything else is the path of a steamcell binary, started as
// `BIN serve --addr 127.0.0.1:PORT`. Comparing two builds in one run
// gives their ratio at the same moment of the machine.
func runBatch(n int, bins []string, rounds int, json bool, procs int) error {
	if procs > 0 {
		serverProcs = strconv.Itoa(procs)
	}
	body, kind := batchBody(n, json)
	fmt.Printf("POST /batch?get=h,s,v of %d rows (%.1f MB of %s), %d rounds, GOMAXPROCS of the servers %s\n",
		n, float64(len(body))/1e6, kind, rounds, cmp.Or(serverProcs, "as the machine's"))
	wall := make([][]time.Duration, len(bins))
	cpu := make([][]time.Duration, len(bins))
	for r := range rounds {
		for i, bin := range bins {
			w, c, size, err := batchRound(bin, body, n, json)
			if err != nil {
				return fmt.Errorf("%s: %w", bin, err)
			}
			wall[i], cpu[i] = append(wall[i], w), append(cpu[i], c)
			fmt.Printf("round %d %-28s wall %6.2f s  server CPU %6.2f s (%.2f µs/row)  %8.0f rows/s  answer %.0f MB\n",
				r+1, bin, w.Seconds(), c.Seconds(), float64(c.Microseconds())/float64(n), float64(n)/w.Seconds(), float64(size)/1e6)
		}
	}
	for i := 1; i < len(bins); i++ {
		fmt.Printf("%s against %s, medians: wall %.2f×, server CPU %.2f×\n", bins[i], bins[0],
			median(wall[i]).Seconds()/median(wall[0]).Seconds(), median(cpu[i]).Seconds()/median(cpu[0]).Seconds())
	}
	return nil
}

func median(d []time.Duration) time.Duration {
	s := append([]time.Duration(nil), d...)
	for i := range s {
		for j := i + 1; j < len(s); j++ {
			if s[j] < s[i] {
				s[i], s[j] = s[j], s[i]
			}
		}
	}
	return s[len(s)/2]
}

// batchBody is n rows of plant readings: 1 to 100 barg, 200 to 499 °C,
// as CSV with the units in the header or as a JSON array with the units
// in the values.
func batchBody(n int, json bool) ([]byte, string) {
	if json {
		b := []byte("[")
		for i := 1; i <= n; i++ {
			if i > 1 {
				b = append(b, ",\n"...)
			}
			b = fmt.Appendf(b, `{"id":%d,"p":"%d barg","t":"%d °C"}`, i, 1+i%100, 200+i%300)
		}
		return append(b, "]\n"...), "JSON"
	}
	b := []byte("id,p [barg],t [°C]\n")
	for i := 1; i <= n; i++ {
		b = fmt.Appendf(b, "%d,%d,%d\n", i, 1+i%100, 200+i%300)
	}
	return b, "CSV"
}

// serverProcs is GOMAXPROCS of the servers started, "" for the machine's.
var serverProcs string

// childEnv is the environment of a server started for a batch.
func childEnv() []string {
	env := os.Environ()
	if serverProcs != "" {
		env = append(env, "GOMAXPROCS="+serverProcs)
	}
	return env
}

// batchRound starts the server, sends the batch once, checks that every
// row came back ok, and stops the server.
func batchRound(bin string, body []byte, n int, json bool) (wall, cpu time.Duration, size int64, err error) {
	var c child
	var stop func()
	if bin == "self" {
		c, stop, err = startChild("steamcell")
	} else {
		c, stop, err = startBinary(bin)
	}
	if err != nil {
		return 0, 0, 0, err
	}
	defer stop()
	client := &http.Client{Timeout: 10 * time.Minute}
	cpu0, t0 := c.cpu(), time.Now()
	ctype, okMark, lead := "text/csv", []byte(",ok,"), 1 // the header line
	if json {
		ctype, okMark, lead = "application/json", []byte(`"status":"ok"`), 2 // the opening and closing lines
	}
	resp, err := client.Post(c.base+"/batch?get=h,s,v", ctype, bytes.NewReader(body))
	if err != nil {
		return 0, 0, 0, err
	}
	defer resp.Body.Close()
	sc := bufio.NewScanner(resp.Body)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	lines, ok := 0, 0
	for sc.Scan() {
		size += int64(len(sc.Bytes())) + 1
		lines++
		if bytes.Contains(sc.Bytes(), okMark) {
			ok++
		}
	}
	wall, cpu = time.Since(t0), c.cpu()-cpu0
	if err := sc.Err(); err != nil {
		return 0, 0, 0, err
	}
	if resp.StatusCode != http.StatusOK || lines != n+lead || ok != n {
		return 0, 0, 0, fmt.Errorf("status %d, %d lines, %d ok, want %d rows", resp.StatusCode, lines, ok, n)
	}
	return wall, cpu, size, nil
}

// startBinary starts `bin serve` on a free port of 127.0.0.1 and waits
// until it answers /healthz.
func startBinary(bin string) (child, func(), error) {
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		return child{}, nil, err
	}
	addr := ln.Addr().String()
	ln.Close()
	ctx, cancel := context.WithCancel(context.Background())
	cmd := exec.CommandContext(ctx, bin, "serve", "--addr", addr)
	cmd.Env = childEnv()
	if err := cmd.Start(); err != nil {
		cancel()
		return child{}, nil, err
	}
	stop := func() { cancel(); _ = cmd.Wait() }
	base := "http://" + addr
	for range 100 {
		if resp, err := http.Get(base + "/healthz"); err == nil {
			resp.Body.Close()
			return child{base, cmd.Process.Pid}, stop, nil
		}
		time.Sleep(50 * time.Millisecond)
	}
	stop()
	return child{}, nil, fmt.Errorf("%s did not answer on %s", bin, strings.TrimPrefix(base, "http://"))
}
