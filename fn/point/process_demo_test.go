package point_test

import (
	"encoding/csv"
	"os"
	"testing"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// readDemo reads a demo CSV of the invented Kestrel Bay mill.
func readDemo(t *testing.T, name string) [][]string {
	t.Helper()
	f, err := os.Open("../../testdata/demo/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows
}

// TestDemoProcessRows runs the two demo tests row by row through
// ProcessColumns and ProcessRow, as the workbook does. The bounds are
// plausibility, not outside truth (the data are invented): an HP section
// efficiency between 0.7 and 0.85 with u near 0.004 from transmitters of
// 0.1 bar and thermocouples of 0.6 K; a heater TTD of a few kelvin and a
// DCA near 10 K, with u(DCA) = √(0.4² + 0.3²) = 0.5 K exactly, since
// DCA = t2 − t3.
func TestDemoProcessRows(t *testing.T) {
	set, _ := units.SetByName("si")
	opt := point.Options{Set: set}
	for _, tc := range []struct {
		file, kind, result string
		lo, hi, ulo, uhi   float64
	}{
		{"tg1_section_test.csv", "expansion", "efficiency", 0.7, 0.85, 0.003, 0.006},
		{"fwh3_heater_test.csv", "exchanger", "ttd", 2, 6, 0.2, 0.5},
		{"fwh3_heater_test.csv", "exchanger", "dca", 8, 12, 0.5 - 1e-12, 0.5 + 1e-12},
	} {
		rows := readDemo(t, tc.file)
		cols, err := point.ProcessColumns(rows[0])
		if err != nil {
			t.Fatal(err)
		}
		for _, row := range rows[1:] {
			ans, err := point.ProcessRow(tc.kind, cols, row, opt, point.UOptions{})
			if err != nil {
				t.Fatalf("%s %s: %v", tc.file, row[0], err)
			}
			r, err := ans.Result(tc.result)
			if err != nil {
				t.Fatal(err)
			}
			if r.Value < tc.lo || r.Value > tc.hi || r.U < tc.ulo || r.U > tc.uhi {
				t.Errorf("%s %s: %s = %g ± %g", tc.file, row[0], tc.result, r.Value, r.U)
			}
		}
	}
}

// TestProcessColumnsErrors: an uncertainty without its input, and an
// input named twice.
func TestProcessColumnsErrors(t *testing.T) {
	if _, err := point.ProcessColumns([]string{"p1 [bar]", "u(t1) [K]"}); err == nil {
		t.Error("u(t1) without t1: no error")
	}
	if _, err := point.ProcessColumns([]string{"p1 [bar]", "P1 (kPa)"}); err == nil {
		t.Error("p1 twice: no error")
	}
	cols, err := point.ProcessColumns([]string{"Point", "p1 [bar]", "u(p1) [kPa]", "m2"})
	if err != nil || cols[0].Input != "" || cols[1] != (point.ProcessColumn{Input: "p1", Unit: "bar"}) ||
		cols[2] != (point.ProcessColumn{Input: "p1", Unit: "kPa", Uncertainty: true}) || cols[3].Input != "m2" {
		t.Errorf("columns %+v, %v", cols, err)
	}
}
