package table_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"errors"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/point"
	"steamcell/fn/table"
	"steamcell/fn/units"
)

func opts(t *testing.T, set string) point.Options {
	t.Helper()
	s, err := units.SetByName(set)
	if err != nil {
		t.Fatal(err)
	}
	return point.Options{Set: s}
}

// value returns the value of column sym in row i.
func value(t *testing.T, tb *table.Table, i int, sym string) float64 {
	t.Helper()
	for j, c := range tb.Columns {
		if c.Symbol == sym {
			f := tb.Rows[i].Fields[j]
			if !f.Defined {
				t.Fatalf("row %d: %s undefined (status %s)", i, sym, tb.Rows[i].Status)
			}
			return f.Value
		}
	}
	t.Fatalf("no column %s", sym)
	return 0
}

// Tolerance of the IAPWS checks: the releases print nine significant
// figures.
const rel = 1e-8

func TestSaturationByTemperature(t *testing.T) {
	tb, err := table.Build(table.Spec{From: "300K", To: "600K", Step: "100K"}, opts(t, "base"))
	if err != nil {
		t.Fatal(err)
	}
	if tb.Kind != table.SaturationByT || len(tb.Rows) != 4 || tb.Columns[0].Symbol != "t" || tb.Columns[1].Symbol != "p" {
		t.Fatalf("table %q with %d rows, columns %v", tb.Kind, len(tb.Rows), tb.Columns)
	}
	// R7-97(2012) Table 35: saturation pressure at 300, 500, 600 K.
	for _, tc := range []struct {
		row  int
		T, p float64
	}{{0, 300, 0.353658941e-2}, {2, 500, 0.263889776e1}, {3, 600, 0.123443146e2}} {
		if got := value(t, tb, tc.row, "t"); got != tc.T {
			t.Errorf("row %d: T %g, want %g", tc.row, got, tc.T)
		}
		if got := value(t, tb, tc.row, "p"); !scalar.EqualWithinRel(got, tc.p, rel) {
			t.Errorf("ps(%g K) = %.9g MPa, want %.9g (R7-97 Table 35)", tc.T, got, tc.p)
		}
	}
}

func TestSaturationByPressure(t *testing.T) {
	// R7-97(2012) Table 36: saturation temperature at 0.1, 1, 10 MPa.
	for _, tc := range []struct {
		spec table.Spec
		want []float64
	}{
		{table.Spec{From: "1MPa", To: "10MPa", Step: "9MPa"}, []float64{0.453035632e3, 0.584149488e3}},
		{table.Spec{From: "0.1MPa", To: "0.1MPa", Step: "1MPa"}, []float64{0.372755919e3}},
	} {
		tb, err := table.Build(tc.spec, opts(t, "base"))
		if err != nil {
			t.Fatal(err)
		}
		if tb.Kind != table.SaturationByP || len(tb.Rows) != len(tc.want) {
			t.Fatalf("%+v: %q with %d rows", tc.spec, tb.Kind, len(tb.Rows))
		}
		for i, want := range tc.want {
			if got := value(t, tb, i, "t"); !scalar.EqualWithinRel(got, want, rel) {
				t.Errorf("%+v row %d: Ts %.9g K, want %.9g (R7-97 Table 36)", tc.spec, i, got, want)
			}
		}
	}
	// In the user's units: 1 bar to 20 bar in steps of 1 bar in the bar
	// set is 20 rows at exactly 1, 2, … 20 bar; the latent heat at 1 bar
	// is 2257.5 kJ/kg (handbook steam table, from memory: 2258).
	tb, err := table.Build(table.Spec{From: "1bar", To: "20bar", Step: "1bar"}, opts(t, "bar"))
	if err != nil {
		t.Fatal(err)
	}
	if len(tb.Rows) != 20 || tb.Columns[0].Header() != "p [bar]" {
		t.Fatalf("%d rows, first column %q", len(tb.Rows), tb.Columns[0].Header())
	}
	for i := range tb.Rows {
		if got := value(t, tb, i, "p"); got != float64(i+1) {
			t.Errorf("row %d: p = %v bar, want %d", i, got, i+1)
		}
	}
	if hfg := value(t, tb, 0, "hfg"); !scalar.EqualWithinAbs(hfg, 2258, 1) {
		t.Errorf("hfg at 1 bar = %g kJ/kg, want 2258 ± 1", hfg)
	}
	// Steps in another unit than from's, and falling: 2 bar to 1 bar in
	// steps of 50 kPa.
	tb, err = table.Build(table.Spec{From: "2bar", To: "1bar", Step: "50kPa"}, opts(t, "bar"))
	if err != nil {
		t.Fatal(err)
	}
	if len(tb.Rows) != 3 || value(t, tb, 1, "p") != 1.5 || value(t, tb, 2, "p") != 1 {
		t.Errorf("2 bar to 1 bar by 50 kPa: %d rows", len(tb.Rows))
	}
	// By temperature in °C, with a step in °C that is a difference.
	tb, err = table.Build(table.Spec{From: "100C", To: "200C", Step: "5C"}, opts(t, "si"))
	if err != nil {
		t.Fatal(err)
	}
	if len(tb.Rows) != 21 || value(t, tb, 20, "t") != 200 {
		t.Errorf("100 °C to 200 °C by 5 °C: %d rows", len(tb.Rows))
	}
}

func TestSuperheat(t *testing.T) {
	tb, err := table.Build(table.Spec{P: "0.0035MPa, 30MPa", From: "300K", To: "700K", Step: "400K", Get: []string{"v", "h", "s"}}, opts(t, "base"))
	if err != nil {
		t.Fatal(err)
	}
	// 3.5 kPa: saturated vapour, 300 K, 700 K; 30 MPa (above pc, so no
	// saturated row): 300 K, 700 K.
	if tb.Kind != table.Superheat || len(tb.Rows) != 5 {
		t.Fatalf("%q with %d rows", tb.Kind, len(tb.Rows))
	}
	if tb.Rows[0].Phase != "saturated vapour" {
		t.Errorf("first row %q, want the saturated vapour", tb.Rows[0].Phase)
	}
	// R7-97(2012) Table 15, region 2.
	for _, tc := range []struct {
		row           int
		v, h, s, T, p float64
	}{
		{1, 0.394913866e2, 0.254991145e4, 0.852238967e1, 300, 0.0035},
		{2, 0.923015898e2, 0.333568375e4, 0.101749996e2, 700, 0.0035},
		{4, 0.542946619e-2, 0.263149474e4, 0.517540298e1, 700, 30},
	} {
		for _, c := range []struct {
			sym  string
			want float64
		}{{"v", tc.v}, {"h", tc.h}, {"s", tc.s}, {"t", tc.T}, {"p", tc.p}} {
			if got := value(t, tb, tc.row, c.sym); !scalar.EqualWithinRel(got, c.want, rel) {
				t.Errorf("p=%g MPa T=%g K: %s = %.9g, want %.9g (R7-97 Table 15)", tc.p, tc.T, c.sym, got, c.want)
			}
		}
	}
}

func TestRowStatus(t *testing.T) {
	// 240 bar is above the critical pressure: the row keeps its place with
	// the reason.
	tb, err := table.Build(table.Spec{From: "200bar", To: "240bar", Step: "20bar"}, opts(t, "bar"))
	if err != nil {
		t.Fatal(err)
	}
	if len(tb.Rows) != 3 || tb.Rows[1].Status != table.StatusOK || !strings.Contains(tb.Rows[2].Status, "critical") {
		t.Fatalf("rows %+v", tb.Rows)
	}
}

func TestErrors(t *testing.T) {
	for _, tc := range []struct {
		spec table.Spec
		kind error
	}{
		{table.Spec{From: "1bar", To: "20bar"}, table.ErrBadRange},
		{table.Spec{From: "1", To: "20", Step: "1"}, table.ErrBadRange},
		{table.Spec{From: "1bar", To: "20bar", Step: "0bar"}, table.ErrBadRange},
		{table.Spec{From: "1bar", To: "20bar", Step: "-1bar"}, table.ErrBadRange},
		{table.Spec{From: "1kPa", To: "20MPa", Step: "1Pa"}, table.ErrTooManyRows},
		{table.Spec{P: "10bar,20bar", From: "0C", To: "800C", Step: "0.1C"}, table.ErrTooManyRows},
		{table.Spec{P: "10bar", From: "1bar", To: "2bar", Step: "1bar"}, table.ErrBadRange},
		{table.Spec{From: "1bar", To: "100C", Step: "1bar"}, units.ErrWrongDimension},
		{table.Spec{From: "1bar", To: "2bar", Step: "1bar", Get: []string{"zz"}}, point.ErrUnknownProperty},
	} {
		_, err := table.Build(tc.spec, opts(t, "si"))
		if !errors.Is(err, tc.kind) {
			t.Errorf("%+v: %v, want %v", tc.spec, err, tc.kind)
		}
	}
}

func TestWriters(t *testing.T) {
	tb, err := table.Build(table.Spec{From: "1bar", To: "3bar", Step: "1bar", Get: []string{"hf", "cp"}}, opts(t, "si"))
	if err != nil {
		t.Fatal(err)
	}
	var c bytes.Buffer
	if err := tb.WriteCSV(&c); err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(&c).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if strings.Join(recs[0], "|") != "p [kPa]|t [°C]|hf [kJ/kg]|cp [kJ/(kg·K)]|phase|status" || len(recs) != 4 || recs[1][0] != "100" || recs[1][5] != "ok" {
		t.Errorf("CSV %q", recs)
	}
	var j bytes.Buffer
	if err := tb.WriteJSON(&j, "caution"); err != nil {
		t.Fatal(err)
	}
	var got struct {
		Columns []struct{ Symbol, Unit string }
		Rows    []struct {
			Values []*float64
			Status string
		}
		Caution string
	}
	if err := json.Unmarshal(j.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	if len(got.Rows) != 3 || *got.Rows[2].Values[0] != 300 || got.Columns[2].Unit != "kJ/kg" || got.Caution != "caution" {
		t.Errorf("JSON %s", j.Bytes())
	}
	var x bytes.Buffer
	if err := tb.WriteXLSX(&x, "caution"); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&x)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows("Table")
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 4 || rows[0][2] != "hf [kJ/kg]" || rows[3][0] != "300" {
		t.Errorf("xlsx rows %q", rows)
	}
	if v, _ := f.GetCellValue("About", "B5"); v != "caution" {
		t.Errorf("About!B5 = %q", v)
	}
}
