package workbook_test

import (
	"bytes"
	"context"
	"encoding/csv"
	"errors"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/point"
	"steamcell/fn/units"
	"steamcell/workbook"
)

// columnsOf maps the headers of row 1 of a sheet to their column letters.
func columnsOf(t *testing.T, f *excelize.File, sheet string) map[string]string {
	t.Helper()
	rows, err := f.GetRows(sheet)
	if err != nil || len(rows) == 0 {
		t.Fatalf("read %s: %v", sheet, err)
	}
	out := map[string]string{}
	for i, h := range rows[0] {
		if _, dup := out[h]; !dup {
			out[h], _ = excelize.ColumnNumberToName(i + 1)
		}
	}
	return out
}

// TestProcessDemo fills the two process tests of the invented Kestrel Bay
// mill with Options.Process and checks every result cell and its u
// against point.ProcessRow on the same row of the CSV: the same numbers,
// to the last bit (the workbook writes the shortest decimal that reads
// back to the same float64).
func TestProcessDemo(t *testing.T) {
	set, _ := units.SetByName("si")
	for _, tc := range []struct{ file, kind, result string }{
		{"tg1_section_test.csv", "expansion", "efficiency"},
		{"fwh3_heater_test.csv", "exchanger", "extraction"},
	} {
		path := filepath.Join("..", "testdata", "demo", tc.file)
		data := readFile(t, path)
		rows, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		opt := opts()
		opt.Process = tc.kind
		f, sum := fillBytes(t, data, tc.file, opt)
		sheet := sum.Sheets[0].Name
		if p := sum.Sheets[0].Process; p == nil || p.OK != len(rows)-1 || p.Kind != tc.kind {
			t.Errorf("%s: process summary %+v, want %d rows ok", tc.file, p, len(rows)-1)
		}
		cols, err := point.ProcessColumns(rows[0])
		if err != nil {
			t.Fatal(err)
		}
		letters := columnsOf(t, f, sheet)
		if c := letters[tc.kind+" status (steamcell)"]; c == "" {
			t.Fatalf("%s: no process status column; headers %v", tc.file, letters)
		}
		// The fill's own styles: a number format of its own on every
		// result, a colour-coded status.
		for _, h := range []string{tc.result, "u(" + tc.result + ")", "state 1 u(h) [kJ/kg]", tc.kind + " status (steamcell)"} {
			cell := letters[h] + "2"
			idx, err := f.GetCellStyle(sheet, cell)
			if err != nil || idx == 0 {
				t.Errorf("%s: %s (%s) has style %d (%v), want one of the fill's", tc.file, cell, h, idx, err)
				continue
			}
			st, err := f.GetStyle(idx)
			if err != nil {
				t.Fatal(err)
			}
			if strings.HasSuffix(h, "(steamcell)") {
				if len(st.Fill.Color) == 0 {
					t.Errorf("%s: status %s has no fill colour", tc.file, cell)
				}
			} else if st.CustomNumFmt == nil || !strings.HasPrefix(*st.CustomNumFmt, "0.0") {
				t.Errorf("%s: %s (%s) has number format %v, want the fill's", tc.file, cell, h, st.CustomNumFmt)
			}
		}
		compared := 0
		for r, row := range rows[1:] {
			want, err := point.ProcessRow(tc.kind, cols, row, point.Options{Set: set}, point.UOptions{})
			if err != nil {
				t.Fatalf("%s %s: %v", tc.file, row[0], err)
			}
			hs, cs := want.Header(), want.Cells()
			for i, h := range hs[:len(hs)-1] { // the last is the warnings
				col := letters[h]
				if col == "" {
					t.Errorf("%s: no column %q", tc.file, h)
					continue
				}
				w, _ := strconv.ParseFloat(cs[i], 64)
				got := num(t, f, sheet, col+strconv.Itoa(r+2))
				if !scalar.EqualWithinAbsOrRel(got, w, 0, relTol) {
					t.Errorf("%s %s: %s = %.17g, ProcessRow gives %.17g", tc.file, row[0], h, got, w)
				}
				compared++
			}
		}
		if compared < 8*(len(rows)-1) {
			t.Errorf("%s: %d cells compared, want a result and its u for each of 4 results per row", tc.file, compared)
		}
	}
}

// TestUncertaintyColumns: a "u(p) [bar]" column beside p gives each row
// its own u(h), the same as point.SolveMeasured with that uncertainty; a
// larger u(p) gives a larger u(h); Options.U gives a whole column the
// same. With T the only uncertain input, h depends on T alone at fixed p,
// so u(h) = cp·u(T) (JCGM 100:2008 5.1.2, Eq. 10, with the sensitivity
// (∂h/∂T)p = cp by the definition of cp).
func TestUncertaintyColumns(t *testing.T) {
	set, _ := units.SetByName("si")
	rows := [][]any{
		{"Point", "p [bar]", "u(p) [bar]", "T [°C]"},
		{"K1", 40.0, 0.2, 400.0},
		{"K2", 40.0, 1.0, 400.0},
		{"K3", 40.0, nil, 400.0},
	}
	f, _ := fillBytes(t, save(t, sheetOf(t, rows...)), "u.xlsx", opts())
	letters := columnsOf(t, f, "Data")
	uh := letters["u(h) [kJ/kg]"]
	if uh == "" {
		t.Fatalf("no u(h) column; headers %v", letters)
	}
	for i, up := range []string{"0.2bar", "1bar"} {
		m, err := point.SolveMeasured([]point.Given{point.WithUncertainty(point.Given{Name: "p", Text: "40", Unit: "bar"}, up), {Name: "t", Text: "400", Unit: "°C"}}, point.Options{Set: set}, point.UOptions{})
		if err != nil {
			t.Fatal(err)
		}
		ans := point.Render(&m.State.State, []string{"h", "s", "v", "x"}, point.Options{Set: set})
		want := point.RenderUncertainty(&m, &ans, point.Options{Set: set}, point.UOptions{}).U["h"]
		got := num(t, f, "Data", uh+strconv.Itoa(i+2))
		if !scalar.EqualWithinAbsOrRel(got, want, 0, relTol) || got <= 0 {
			t.Errorf("row %d, u(p) = %s: u(h) = %g, SolveMeasured gives %g", i+2, up, got, want)
		}
	}
	if a, b := num(t, f, "Data", uh+"2"), num(t, f, "Data", uh+"3"); !(b > 4*a) {
		t.Errorf("u(h) with u(p) = 1 bar is %g, with 0.2 bar %g: want about five times as much", b, a)
	}
	if v := raw(t, f, "Data", uh+"4"); v != "" {
		t.Errorf("row 4 has no u(p) but u(h) = %q", v)
	}

	// One value for the whole T column, and cp to check against.
	opt := opts()
	opt.U = "t=0.5K"
	opt.Add = []string{"h", "cp"}
	plain := [][]any{{"Point", "p [bar]", "T [°C]"}, {"K1", 40.0, 400.0}, {"K2", 5.0, 250.0}}
	f, _ = fillBytes(t, save(t, sheetOf(t, plain...)), "ut.xlsx", opt)
	letters = columnsOf(t, f, "Data")
	for r := 2; r <= 3; r++ {
		cp := num(t, f, "Data", letters["cp [kJ/(kg·K)]"]+strconv.Itoa(r))
		got := num(t, f, "Data", letters["u(h) [kJ/kg]"]+strconv.Itoa(r))
		if !scalar.EqualWithinAbsOrRel(got, 0.5*cp, 0, 1e-9) {
			t.Errorf("row %d: u(h) = %.9g with u(T) = 0.5 K, want cp·0.5 = %.9g", r, got, 0.5*cp)
		}
	}

	// An uncertainty that is no size is checked where it meets its value:
	// the row keeps its values and says why it has no u.
	opt.U = "p=lots"
	f, sum := fillBytes(t, save(t, sheetOf(t, plain...)), "bad.xlsx", opt)
	if st := raw(t, f, "Data", "D2"); !strings.HasPrefix(st, "check: no uncertainty") || sum.Flagged != 2 || raw(t, f, "Data", "E2") == "" {
		t.Errorf("--u p=lots: status %q, %d rows flagged, h %q", st, sum.Flagged, raw(t, f, "Data", "E2"))
	}
	opt.U = "q=1"
	if err := fillErr(t, save(t, sheetOf(t, plain...)), "bad.xlsx", opt); !errors.Is(err, workbook.ErrBadOption) {
		t.Errorf("--u q=1: %v, want ErrBadOption", err)
	}
}

// checkRecord is an old record to audit: the verification states of
// IAPWS R7-97(2012), Table 5 (region 1) and Table 15 (region 2), with h
// and s as the release prints them, and one h altered by +2.5 kJ/kg.
var checkRecord = [][]any{
	{"Point", "T [K]", "p [MPa]", "h [kJ/kg]", "s [kJ/(kg·K)]"},
	{"R1-a", 300.0, 3.0, 115.331273, 0.392294792},
	{"R1-b", 300.0, 80.0, 184.142828 + 2.5, 0.368563852},
	{"R1-c", 500.0, 3.0, 975.542239, 2.58041912},
	{"R2-a", 300.0, 0.0035, 2549.91145, 8.52238967},
	{"R2-b", 700.0, 0.0035, 3335.68375, 10.1749996},
	{"R2-c", 700.0, 30.0, 2631.49474, 5.17540298},
}

// TestCheckMode audits checkRecord: the altered row is flagged with a
// deviation of 2.5 kJ/kg to the rounding of the printed values (nine
// significant figures), the others agree within that rounding, h and s are
// not taken as a second pair of inputs, and the summary counts the
// flagged row and names its deviation.
func TestCheckMode(t *testing.T) {
	opt := opts()
	opt.Check = []string{"h", "s"}
	f, sum := fillBytes(t, save(t, sheetOf(t, checkRecord...)), "audit.xlsx", opt)
	ss := sum.Sheets[0]
	if len(ss.Pairs) != 1 || ss.Pairs[0].Inputs[0].Symbol != "t" {
		t.Fatalf("pairs %+v, want T,p only", ss.Pairs)
	}
	letters := columnsOf(t, f, "Data")
	dh, rel, st := letters["Δh [kJ/kg]"], letters["Δh relative"], letters["Check status (steamcell)"]
	ds := letters["Δs [kJ/(kg·K)]"]
	if dh == "" || rel == "" || st == "" || ds == "" {
		t.Fatalf("check columns missing; headers %v", letters)
	}
	for r := 2; r <= len(checkRecord); r++ {
		row := strconv.Itoa(r)
		d, d2 := num(t, f, "Data", dh+row), num(t, f, "Data", ds+row)
		status := raw(t, f, "Data", st+row)
		want := 0.0
		if r == 3 {
			want = 2.5
		}
		// Half a unit in the last printed digit of h, and of s.
		if math.Abs(d-want) > 5e-6 || math.Abs(d2) > 5e-8 {
			t.Errorf("row %d: Δh = %.9g, want %g; Δs = %.3g, want 0 to rounding", r, d, want, d2)
		}
		if flagged := strings.HasPrefix(status, "beyond"); flagged != (r == 3) {
			t.Errorf("row %d: status %q", r, status)
		}
		if r == 3 {
			if got := num(t, f, "Data", rel+row); !scalar.EqualWithinAbsOrRel(got, 2.5/184.142828, 0, 1e-6) {
				t.Errorf("row 3: relative deviation %g, want %g", got, 2.5/184.142828)
			}
		}
	}
	c := ss.Check
	if c == nil || c.Rows != 6 || c.Flagged != 1 || c.Tol != workbook.DefaultCheckTol || len(c.Columns) != 2 {
		t.Fatalf("check summary %+v", c)
	}
	if h := c.Columns[0]; h.Symbol != "h" || h.LargestRow != 3 || math.Abs(h.Largest-2.5) > 5e-6 {
		t.Errorf("largest deviation of h: %+v, want 2.5 in row 3", h)
	}
	// Flagged: row 3 by the check, and row 5 (R2-a, 300 K at 3.5 kPa) by
	// the 1 K margin, 0.18 K above saturation.
	if sum.Flagged != 2 || len(sum.Listed) != 2 || sum.Listed[0].Row != 3 || !strings.HasPrefix(sum.Listed[0].Status, "beyond 0.1 %: h +1.36 %") {
		t.Errorf("summary: %d rows flagged, listed %+v; want rows 3 (its check status) and 5", sum.Flagged, sum.Listed)
	}
	text := summaryText(t, f, sum.SummarySheet)
	for _, want := range []string{"Check against steamcell", "Rows beyond tolerance", "0.1 % of steamcell's value"} {
		if !strings.Contains(text, want) {
			t.Errorf("summary lacks %q", want)
		}
	}

	// A tighter tolerance flags what rounding leaves; a column that is not
	// there is an error.
	opt.CheckTol = 1e-12
	_, sum = fillBytes(t, save(t, sheetOf(t, checkRecord...)), "audit.xlsx", opt)
	if n := sum.Sheets[0].Check.Flagged; n < 2 {
		t.Errorf("tolerance 1e-12: %d rows flagged, want more than the altered one", n)
	}
	opt.Check = []string{"v"}
	if err := fillErr(t, save(t, sheetOf(t, checkRecord...)), "audit.xlsx", opt); !errors.Is(err, workbook.ErrNoInputs) {
		t.Errorf("check v without a v column: %v", err)
	}
}

// TestParseCheckTol reads the tolerance as the command and the server
// take it.
func TestParseCheckTol(t *testing.T) {
	for _, tc := range []struct {
		text string
		want float64
		ok   bool
	}{{"", 0, true}, {"0.1%", 0.001, true}, {"0.002", 0.002, true}, {"0", 0, false}, {"-1%", 0, false}, {"100%", 0, false}, {"lots", 0, false}} {
		got, err := workbook.ParseCheckTol(tc.text)
		if (err == nil) != tc.ok || tc.ok && !scalar.EqualWithinAbsOrRel(got, tc.want, 0, 1e-15) {
			t.Errorf("ParseCheckTol(%q) = %g, %v", tc.text, got, err)
		}
	}
}

// TestResultsFidelity: with uncertainties, a process and check mode, the
// parts a fill does not own still come out byte-identical, and those it
// rewrites keep everything of the input.
func TestResultsFidelity(t *testing.T) {
	opt := opts()
	opt.U = "p=0.2bar,t=0.5K"
	in := buildRich(t)
	var out bytes.Buffer
	if _, err := workbook.Fill(context.Background(), bytes.NewReader(in), "rich.xlsm", opt, &out); err != nil {
		t.Fatal(err)
	}
	comparePackages(t, in, out.Bytes(), "Readings")

	f := excelize.NewFile()
	mustf(t, f.SetSheetName("Sheet1", "Readings"), "rename")
	for i, r := range [][]any{
		{"Point", "p1 [bar]", "u(p1) [bar]", "t1 [°C]", "p2 [bar]", "t2 [°C]"},
		{"S1", 40.85, 0.1, 407.1, 6.21, 212.4},
		{"S2", 40.62, 0.1, 406.4, 6.18, 212.9},
	} {
		cell, _ := excelize.CoordinatesToCellName(1, i+1)
		mustf(t, f.SetSheetRow("Readings", cell, &r), "write")
	}
	mustf(t, f.AddPictureFromBytes("Readings", "B6", &excelize.Picture{Extension: ".png", File: pngBytes(t)}), "picture")
	_, err := f.NewSheet("Notes")
	mustf(t, err, "sheet")
	mustf(t, f.SetCellValue("Notes", "A1", "shift log"), "note")
	in = save(t, f)
	opt = opts()
	opt.Process, opt.U = "expansion", "t=0.6K"
	out.Reset()
	if _, err := workbook.Fill(context.Background(), bytes.NewReader(in), "stage.xlsx", opt, &out); err != nil {
		t.Fatal(err)
	}
	comparePackages(t, in, out.Bytes(), "Readings")
}

// TestResultsRefill: a sheet filled with a process and uncertainties can
// be filled again, the earlier results (their u(…) headers included) being
// no inputs; a u column whose input has no column is refused.
func TestResultsRefill(t *testing.T) {
	data := readFile(t, filepath.Join("..", "testdata", "demo", "tg1_section_test.csv"))
	opt := opts()
	opt.Process = "expansion"
	var once bytes.Buffer
	if _, err := workbook.Fill(context.Background(), bytes.NewReader(data), "tg1.csv", opt, &once); err != nil {
		t.Fatal(err)
	}
	f, sum := fillBytes(t, once.Bytes(), "tg1_filled.xlsx", opt)
	letters := columnsOf(t, f, sum.Sheets[0].Name)
	if p := sum.Sheets[0].Process; p == nil || p.OK != 4 || len(sum.Sheets[0].Pairs) != 2 {
		t.Errorf("refill: process %+v, pairs %d", p, len(sum.Sheets[0].Pairs))
	}
	if letters["efficiency"] == "" {
		t.Errorf("refill: no efficiency column")
	}

	bad := [][]any{{"p [bar]", "T [°C]", "u(h) [kJ/kg]"}, {40.0, 400.0, 1.0}}
	if err := fillErr(t, save(t, sheetOf(t, bad...)), "bad.xlsx", opts()); !errors.Is(err, workbook.ErrAmbiguous) || !strings.Contains(err.Error(), "u(h)") {
		t.Errorf("u(h) without an h column: %v, want ErrAmbiguous naming the column", err)
	}
}

// TestUncertaintyReplacesMargin: with uncertainties given, the k = 2
// interval of the inputs decides whether the phase is in doubt, in place
// of the fixed margin. At 10 bar, Ts = 453.035632 K = 179.885632 °C
// (IAPWS R7-97(2012), Table 35), so 180.7 °C is 0.814 K above it: flagged
// by the 1 K margin without u; ok with u(T) = 0.05 K (the interval reaches
// 0.1 K); flagged as phase uncertain with u(T) = 1 K.
func TestUncertaintyReplacesMargin(t *testing.T) {
	rows := [][]any{
		{"p [bar]", "T [°C]", "u(T) [K]"},
		{10.0, 180.7, nil},
		{10.0, 180.7, 0.05},
		{10.0, 180.7, 1.0},
	}
	f, _ := fillBytes(t, save(t, sheetOf(t, rows...)), "margin.xlsx", opts())
	for r, want := range map[int]string{2: "check: 0.81 K above saturation", 3: "ok", 4: "check: "} {
		got := raw(t, f, "Data", "D"+strconv.Itoa(r))
		if !strings.HasPrefix(got, want) || r == 4 && !strings.Contains(got, "phase") {
			t.Errorf("row %d: status %q, want %q…", r, got, want)
		}
	}
}

// TestProcessFromPairs: on the demo workbook's TG-1 sheet, whose headers
// are words ("Inlet pressure [bar]"), the inlet and extraction pairs are
// states 1 and 2 of the expansion, the same as point.RunProcess with p1,
// t1, p2, t2 and the uncertainties of Options.U; the mean row of formulas
// is an aggregate, filled as well.
func TestProcessFromPairs(t *testing.T) {
	set, _ := units.SetByName("si")
	opt := opts()
	opt.Sheet, opt.Process, opt.U = "TG-1 stage check", "expansion", "p=0.1bar,t=0.6K"
	f, sum := fillBytes(t, readFile(t, demoPath()), "kestrel_bay_tests.xlsx", opt)
	const sheet = "TG-1 stage check"
	if p := sum.Sheets[0].Process; p == nil || p.OK != 12 {
		t.Fatalf("process summary %+v, want 12 rows ok", p)
	}
	rows, _ := f.GetRows(sheet)
	hdr := 3 // the header row, under a title
	col := map[string]string{}
	for i, h := range rows[hdr-1] {
		col[h], _ = excelize.ColumnNumberToName(i + 1)
	}
	compared := 0
	for r := hdr + 1; r <= hdr+12; r++ {
		row := strconv.Itoa(r)
		var given []point.Given
		for _, in := range []struct{ name, col, unit, u string }{
			{"p1", "B", "bar", "0.1bar"}, {"t1", "C", "°C", "0.6K"}, {"p2", "D", "bar", "0.1bar"}, {"t2", "E", "°C", "0.6K"},
		} {
			given = append(given, point.WithUncertainty(point.Given{Name: in.name, Text: raw(t, f, sheet, in.col+row), Unit: in.unit}, in.u))
		}
		want, err := point.RunProcess("expansion", given, point.Options{Set: set}, point.UOptions{})
		if err != nil {
			t.Fatalf("row %d: %v", r, err)
		}
		for _, name := range []string{"efficiency", "work"} {
			w, _ := want.Result(name)
			for h, v := range map[string]float64{w.Name: w.Value, "u(" + w.Name + ")": w.U} {
				if w.Unit != "" {
					h += " [" + w.Unit + "]"
				}
				if got := num(t, f, sheet, col[h]+row); !scalar.EqualWithinAbsOrRel(got, v, 0, relTol) {
					t.Errorf("row %d: %s = %.17g, RunProcess gives %.17g", r, h, got, v)
				}
				compared++
			}
		}
	}
	if compared != 48 {
		t.Errorf("%d cells compared, want 48", compared)
	}
}
