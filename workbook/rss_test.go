package workbook_test

import (
	"bufio"
	"context"
	"fmt"
	"math/rand"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"steamcell/workbook"
)

// BenchmarkFullSheetRSS fills a full sheet, 1,048,576 rows (a header and
// 1,048,575 readings of 2 inputs, as the ratio benchmark's sheet), with
// the 8 results of benchAdd, in a child process, and reports the child's
// peak resident memory, wall time and CPU time (on a shared machine the
// CPU time says more). It measures; it asserts nothing about
// either. Run it alone:
//
//	go test -run X -bench FullSheetRSS -benchtime 1x ./workbook/
func BenchmarkFullSheetRSS(b *testing.B) { benchRSS(b, 1<<20) }

// BenchmarkRSS100k is the same for the 100,000-row sheet.
func BenchmarkRSS100k(b *testing.B) { benchRSS(b, benchRows+2) }

func benchRSS(b *testing.B, rows int) {
	in := filepath.Join(b.TempDir(), "big.xlsx")
	f, err := os.Create(in)
	if err != nil {
		b.Fatal(err)
	}
	w := bufio.NewWriter(f)
	rng := rand.New(rand.NewSource(97))
	err = workbook.WriteSheetPackage(w, "Sheet1", func(add func(int, []any) error) error {
		if err := add(1, []any{"Point", "Time", "Drum pressure [barg]", "Steam temperature [°C]", "Steam flow [t/h]"}); err != nil {
			return err
		}
		for n := 2; n <= rows; n++ {
			if err := add(n, []any{fmt.Sprintf("P%d", n-1), "09:00", 1 + 59*rng.Float64(), 200 + 350*rng.Float64(), 30 + 10*rng.Float64()}); err != nil {
				return err
			}
		}
		return nil
	})
	if err == nil {
		err = w.Flush()
	}
	if err == nil {
		err = f.Close()
	}
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	var peak int64
	var took, cpu time.Duration
	for range b.N {
		out := filepath.Join(b.TempDir(), "out.xlsx")
		cmd := exec.Command(os.Args[0], "-test.run=^TestFillChild$")
		cmd.Env = append(os.Environ(), "STEAMCELL_RSS_IN="+in, "STEAMCELL_RSS_OUT="+out)
		cmd.Stderr = os.Stderr
		t0 := time.Now()
		msg, err := cmd.Output()
		if err != nil {
			b.Fatalf("child: %v\n%s", err, msg)
		}
		took += time.Since(t0)
		var rows int
		var hwm int64
		if _, err := fmt.Sscanf(string(msg), "%d rows, peak %d kB", &rows, &hwm); err != nil {
			b.Fatalf("child said %q: %v", msg, err)
		}
		peak = max(peak, hwm<<10)
		cpu += cmd.ProcessState.UserTime() + cmd.ProcessState.SystemTime()
	}
	b.ReportMetric(float64(peak)/(1<<20), "peak-MiB")
	b.ReportMetric(took.Seconds()/float64(b.N), "fill-s")
	b.ReportMetric(cpu.Seconds()/float64(b.N), "cpu-s")
}

// TestFillChild is the child of the RSS benchmarks: it fills one file and
// exits. Run on its own it does nothing.
func TestFillChild(t *testing.T) {
	in := os.Getenv("STEAMCELL_RSS_IN")
	if in == "" {
		t.Skip("the child process of the RSS benchmarks")
	}
	sum, err := workbook.FillFile(context.Background(), in, os.Getenv("STEAMCELL_RSS_OUT"), workbook.Options{Add: benchAdd, Version: "bench"}, nil)
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	fmt.Printf("%d rows, peak %d kB\n", sum.Rows, peakKB())
	os.Exit(0)
}

// peakKB returns the peak resident memory of this process (VmHWM), kB.
// The child reads its own: the rusage of a child on Linux also counts the
// memory of the parent it was started from, which a benchmark parent
// holding a workbook would inflate.
func peakKB() int64 {
	b, _ := os.ReadFile("/proc/self/status")
	for _, line := range strings.Split(string(b), "\n") {
		if v, ok := strings.CutPrefix(line, "VmHWM:"); ok {
			n, _ := strconv.ParseInt(strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(v), "kB")), 10, 64)
			return n
		}
	}
	return -1
}
