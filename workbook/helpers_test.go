package workbook_test

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/units"
	"steamcell/workbook"
)

// relTol is the tolerance of a written value against the engine: values
// are written as the shortest decimal that reads back to the same float64,
// so they agree to the last bit; 1e-15 allows for nothing more.
const relTol = 1e-15

// testDate fixes the date of the summary.
var testDate = time.Date(2031, 3, 14, 9, 26, 0, 0, time.UTC)

func opts() workbook.Options {
	return workbook.Options{Version: "9.9.9-test", Date: testDate}
}

// fillBytes fills a workbook held in memory and opens the result.
func fillBytes(t *testing.T, data []byte, name string, opt workbook.Options) (*excelize.File, workbook.Summary) {
	t.Helper()
	var out bytes.Buffer
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(data), name, opt, &out)
	if err != nil {
		t.Fatalf("Fill(%s): %v", name, err)
	}
	f, err := excelize.OpenReader(&out)
	if err != nil {
		t.Fatalf("open the filled %s: %v", name, err)
	}
	t.Cleanup(func() { f.Close() })
	return f, sum
}

// fillErr fills and returns the error, which the test expects.
func fillErr(t *testing.T, data []byte, name string, opt workbook.Options) error {
	t.Helper()
	var out bytes.Buffer
	_, err := workbook.Fill(context.Background(), bytes.NewReader(data), name, opt, &out)
	if err == nil {
		t.Fatalf("Fill(%s) succeeded, want an error", name)
	}
	if out.Len() != 0 {
		t.Errorf("Fill(%s) failed but wrote %d bytes", name, out.Len())
	}
	return err
}

// save writes a workbook built by a test to bytes.
func save(t *testing.T, f *excelize.File) []byte {
	t.Helper()
	b, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// sheetOf builds a workbook of one sheet "Data" from rows starting at A1.
func sheetOf(t *testing.T, rows ...[]any) *excelize.File {
	t.Helper()
	f := excelize.NewFile()
	if err := f.SetSheetName("Sheet1", "Data"); err != nil {
		t.Fatal(err)
	}
	for i, r := range rows {
		cell, _ := excelize.CoordinatesToCellName(1, i+1)
		if err := f.SetSheetRow("Data", cell, &r); err != nil {
			t.Fatal(err)
		}
	}
	return f
}

func raw(t *testing.T, f *excelize.File, sheet, cell string) string {
	t.Helper()
	v, err := f.GetCellValue(sheet, cell, excelize.Options{RawCellValue: true})
	if err != nil {
		t.Fatalf("read %s!%s: %v", sheet, cell, err)
	}
	return v
}

func num(t *testing.T, f *excelize.File, sheet, cell string) float64 {
	t.Helper()
	s := raw(t, f, sheet, cell)
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("%s!%s = %q, want a number", sheet, cell, s)
	}
	return v
}

// in is an input column as a test knows it.
type in struct {
	col  string
	q    fn.Quantity
	unit string
}

// expect solves the inputs of a row directly with package units and the
// engine, independent of the fill.
func expect(t *testing.T, texts [2]string, ins [2]in, set units.Set) fn.State {
	t.Helper()
	var inputs [2]fn.Input
	for i := range 2 {
		v, err := units.Parse(texts[i], point.DimOf(ins[i].q), units.Options{Unit: ins[i].unit, Set: set})
		if err != nil {
			t.Fatalf("parse %q as %s: %v", texts[i], ins[i].q, err)
		}
		inputs[i] = fn.Input{Q: ins[i].q, Value: v}
	}
	st, err := fn.Solve(inputs[0], inputs[1])
	if err != nil {
		t.Fatalf("solve %v: %v", inputs, err)
	}
	return st
}

// outCols are the result columns of a pair with the default --add:
// status, h, s, v, x, phase.
type outCols struct{ status, h, s, v, x, phase string }

// verifyRow checks the results of one solved row against the engine (si
// units: h, s, v are in base units).
func verifyRow(t *testing.T, f *excelize.File, sheet string, row int, texts [2]string, ins [2]in, oc outCols) {
	t.Helper()
	st := expect(t, texts, ins, units.Set{})
	r := strconv.Itoa(row)
	for _, c := range []struct {
		name string
		col  string
		want float64
	}{{"h", oc.h, st.H}, {"s", oc.s, st.S}, {"v", oc.v, st.V}} {
		got := num(t, f, sheet, c.col+r)
		if !scalar.EqualWithinAbsOrRel(got, c.want, 0, relTol) {
			t.Errorf("%s!%s%s: %s(%s, %s) = %.17g, want %.17g", sheet, c.col, r, c.name, texts[0], texts[1], got, c.want)
		}
	}
	if st.HasX {
		if got := num(t, f, sheet, oc.x+r); !scalar.EqualWithinAbsOrRel(got, st.X, 0, relTol) {
			t.Errorf("%s!%s%s: x = %.17g, want %.17g", sheet, oc.x, r, got, st.X)
		}
	} else if got := raw(t, f, sheet, oc.x+r); got != "" {
		t.Errorf("%s!%s%s: x = %q for %s, want blank", sheet, oc.x, r, got, st.Phase)
	}
	if got := raw(t, f, sheet, oc.phase+r); got != st.Phase.String() {
		t.Errorf("%s!%s%s: phase %q, want %q", sheet, oc.phase, r, got, st.Phase)
	}
}

// verifySheet checks every row of a filled sheet from first to last whose
// status says it was solved, and returns how many it checked.
func verifySheet(t *testing.T, f *excelize.File, sheet string, first, last int, ins [2]in, oc outCols) int {
	t.Helper()
	n := 0
	for row := first; row <= last; row++ {
		r := strconv.Itoa(row)
		status := raw(t, f, sheet, oc.status+r)
		if status != "ok" && !strings.HasPrefix(status, "ok (") && !strings.HasPrefix(status, "check:") {
			continue
		}
		texts := [2]string{raw(t, f, sheet, ins[0].col+r), raw(t, f, sheet, ins[1].col+r)}
		verifyRow(t, f, sheet, row, texts, ins, oc)
		n++
	}
	return n
}

// summaryText returns every cell of the summary sheet, a row a line, cells
// separated by " | ".
func summaryText(t *testing.T, f *excelize.File, sheet string) string {
	t.Helper()
	rows, err := f.GetRows(sheet)
	if err != nil {
		t.Fatalf("read %s: %v", sheet, err)
	}
	var b strings.Builder
	for _, r := range rows {
		b.WriteString(strings.Join(r, " | "))
		b.WriteByte('\n')
	}
	return b.String()
}

// commentOn returns the text of the comment on cell, or "".
func commentOn(t *testing.T, f *excelize.File, sheet, cell string) string {
	t.Helper()
	cs, err := f.GetComments(sheet)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range cs {
		if c.Cell == cell {
			if c.Text != "" {
				return c.Text
			}
			var b strings.Builder
			for _, p := range c.Paragraph {
				b.WriteString(p.Text)
			}
			return b.String()
		}
	}
	return ""
}

func demoPath() string { return filepath.Join("..", "testdata", "demo", "kestrel_bay_tests.xlsx") }

func readFile(t *testing.T, path string) []byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func mustf(t *testing.T, err error, format string, args ...any) {
	t.Helper()
	if err != nil {
		t.Fatalf("%s: %v", fmt.Sprintf(format, args...), err)
	}
}

func scalarEq(got, want float64) bool { return scalar.EqualWithinAbsOrRel(got, want, 0, relTol) }
