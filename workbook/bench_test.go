package workbook_test

import (
	"bytes"
	"context"
	"io"
	"math/rand"
	"strconv"
	"sync"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"

	"steamcell/workbook"
)

// benchRows is the size of the benchmark workbook.
const benchRows = 100_000

var (
	benchOnce sync.Once
	benchData []byte
	benchErr  error
)

// benchWorkbook returns a generated test sheet: a title row, a header row
// and benchRows readings of drum pressure and steam temperature with a
// point name, a time and a flow (invented values, fixed seed).
func benchWorkbook(b *testing.B) []byte {
	b.Helper()
	benchOnce.Do(func() {
		f := excelize.NewFile()
		defer f.Close()
		sw, err := f.NewStreamWriter("Sheet1")
		if err != nil {
			benchErr = err
			return
		}
		rng := rand.New(rand.NewSource(97))
		rows := [][]any{{"Generated benchmark sheet"}, {"Point", "Time", "Drum pressure [barg]", "Steam temperature [°C]", "Steam flow [t/h]"}}
		for i, r := range rows {
			cell, _ := excelize.CoordinatesToCellName(1, i+1)
			if benchErr = sw.SetRow(cell, r); benchErr != nil {
				return
			}
		}
		for i := 0; i < benchRows; i++ {
			cell, _ := excelize.CoordinatesToCellName(1, i+3)
			row := []any{"P" + strconv.Itoa(i+1), "09:00", 1 + 59*rng.Float64(), 200 + 350*rng.Float64(), 30 + 10*rng.Float64()}
			if benchErr = sw.SetRow(cell, row); benchErr != nil {
				return
			}
		}
		if benchErr = sw.Flush(); benchErr != nil {
			return
		}
		var buf bytes.Buffer
		benchErr = f.Write(&buf)
		benchData = buf.Bytes()
	})
	if benchErr != nil {
		b.Fatal(benchErr)
	}
	return benchData
}

// benchAdd are the 8 results of the benchmark, all defined for a
// single-phase state, so every row writes 9 cells with the status.
var benchAdd = []string{"h", "s", "v", "rho", "cp", "w", "phase", "region"}

// BenchmarkFill100k fills 100,000 rows × 2 inputs with 8 results and a
// status. Compare it with BenchmarkPlainExcelize100k in the same run, or
// see BenchmarkRatio100k.
func BenchmarkFill100k(b *testing.B) {
	data := benchWorkbook(b)
	b.ResetTimer()
	for range b.N {
		benchFill(b, data)
	}
}

// BenchmarkPlainExcelize100k is the yardstick of BenchmarkFill100k: open
// the same workbook with excelize, read every row, write 9 cells per row
// and save, with nothing computed.
func BenchmarkPlainExcelize100k(b *testing.B) {
	data := benchWorkbook(b)
	b.ResetTimer()
	for range b.N {
		benchPlain(b, data)
	}
}

// BenchmarkRatio100k runs the fill and the yardstick alternately, so that
// a machine shared with other work slows both alike, and reports the ratio
// of their times (fill/plain) besides each time.
func BenchmarkRatio100k(b *testing.B) {
	data := benchWorkbook(b)
	var fill, plain time.Duration
	b.ResetTimer()
	for range b.N {
		t0 := time.Now()
		benchFill(b, data)
		t1 := time.Now()
		benchPlain(b, data)
		fill += t1.Sub(t0)
		plain += time.Since(t1)
	}
	b.ReportMetric(fill.Seconds()/float64(b.N), "fill-s/op")
	b.ReportMetric(plain.Seconds()/float64(b.N), "plain-s/op")
	b.ReportMetric(fill.Seconds()/plain.Seconds(), "fill/plain")
}

func benchFill(b *testing.B, data []byte) {
	opt := workbook.Options{Add: benchAdd, Version: "bench"}
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(data), "bench.xlsx", opt, io.Discard)
	if err != nil {
		b.Fatal(err)
	}
	if sum.Rows != benchRows {
		b.Fatalf("%d rows filled, want %d", sum.Rows, benchRows)
	}
}

func benchPlain(b *testing.B, data []byte) {
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		b.Fatal(err)
	}
	defer f.Close()
	rows, err := f.Rows("Sheet1")
	if err != nil {
		b.Fatal(err)
	}
	var inputs [][2]string
	for rows.Next() {
		cols, err := rows.Columns(excelize.Options{RawCellValue: true})
		if err != nil {
			b.Fatal(err)
		}
		if len(cols) >= 4 {
			inputs = append(inputs, [2]string{cols[2], cols[3]})
		}
	}
	if err := rows.Close(); err != nil {
		b.Fatal(err)
	}
	for i := range inputs {
		cell, _ := excelize.CoordinatesToCellName(6, i+2)
		row := []any{"ok", 3000.5, 6.5, 0.05, 20.5, 2.5, 600.5, "superheated vapour", 2}
		if err := f.SetSheetRow("Sheet1", cell, &row); err != nil {
			b.Fatal(err)
		}
	}
	if err := f.Write(io.Discard); err != nil {
		b.Fatal(err)
	}
}
