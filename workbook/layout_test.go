package workbook_test

import (
	"archive/zip"
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"math/rand"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"unicode/utf16"

	"github.com/xuri/excelize/v2"

	"steamcell/fn"
	"steamcell/workbook"
)

// TestCSV: CSV input is read (semicolons, Latin-1, numbers as numbers) and
// written as .xlsx.
func TestCSV(t *testing.T) {
	csv := "Point;Pressure [psig];Temperature [\xb0F];Note\r\n" +
		"P1;150;420;first\r\n" +
		"P2;152.5;\"430\";\r\n" +
		"\r\n" +
		"P3;;410;no gauge\r\n"
	f, sum := fillBytes(t, []byte(csv), "log.csv", opts())
	if got := f.GetSheetList(); len(got) != 3 || got[0] != "log" || got[2] != sum.Chart {
		t.Fatalf("sheets %q, want log, the summary and the chart", got)
	}
	if n := verifySheet(t, f, "log", 2, 5, [2]in{{"B", fn.Pressure, "psig"}, {"C", fn.Temperature, "°F"}}, outCols{"E", "F", "G", "H", "I", "J"}); n != 2 {
		t.Errorf("%d rows verified, want 2", n)
	}
	if got := raw(t, f, "log", "E5"); got != "two inputs needed, found one: B5 is blank" {
		t.Errorf("E5 = %q", got)
	}
	if typ, _ := f.GetCellType("log", "B2"); typ != excelize.CellTypeNumber && typ != excelize.CellTypeUnset {
		t.Errorf("B2 has type %v, want a number", typ)
	}
	if len(sum.Notes) != 1 || !strings.Contains(sum.Notes[0], "Latin-1") {
		t.Errorf("notes %q, want one about Latin-1", sum.Notes)
	}
	if sum.Blank != 1 {
		t.Errorf("blank rows %d, want 1", sum.Blank)
	}
}

// TestFormulaInputs: an input formula with a stored result is read through
// that result (even where calculating would give another), and the status
// says so.
func TestFormulaInputs(t *testing.T) {
	f := sheetOf(t, []any{"P [bar]", "T [°C]"}, []any{nil, 300.0}, []any{nil, 310.0})
	mustf(t, f.SetCellFormula("Data", "A2", "1+1"), "formula")
	mustf(t, f.SetCellFormula("Data", "A3", "2+3"), "formula")
	data := withStoredResult(t, save(t, f), "A2", "1+1", "10")
	out, _ := fillBytes(t, data, "formulas.xlsx", opts())
	ins := [2]in{{"A", fn.Pressure, "bar"}, {"B", fn.Temperature, "°C"}}
	oc := outCols{"C", "D", "E", "F", "G", "H"}
	if got, want := raw(t, out, "Data", "C2"), "ok (A2: stored formula result)"; got != want {
		t.Errorf("C2 = %q, want %q", got, want)
	}
	verifyRow(t, out, "Data", 2, [2]string{"10", "300"}, ins, oc)
	if got, want := raw(t, out, "Data", "C3"), "ok (A3: formula calculated by steamcell)"; got != want {
		t.Errorf("C3 = %q, want %q", got, want)
	}
	verifyRow(t, out, "Data", 3, [2]string{"5", "310"}, ins, oc)
	if fx, _ := out.GetCellFormula("Data", "A2"); fx != "1+1" {
		t.Errorf("A2 formula %q, want it kept", fx)
	}
}

// withStoredResult rewrites the sheet XML of a workbook so that the formula
// of cell holds a stored result, as a spreadsheet program saves it
// (excelize writes formulas without results).
func withStoredResult(t *testing.T, data []byte, cell, formula, result string) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	mustf(t, err, "read zip")
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	found := false
	for _, zf := range zr.File {
		r, err := zf.Open()
		mustf(t, err, "open %s", zf.Name)
		content, err := io.ReadAll(r)
		mustf(t, err, "read %s", zf.Name)
		if zf.Name == "xl/worksheets/sheet1.xml" {
			re := regexp.MustCompile(fmt.Sprintf(`<c r="%s"[^>]*><f>%s</f></c>`, cell, regexp.QuoteMeta(formula)))
			found = re.Match(content)
			content = re.ReplaceAll(content, []byte(fmt.Sprintf(`<c r="%s"><f>%s</f><v>%s</v></c>`, cell, formula, result)))
		}
		w, err := zw.Create(zf.Name)
		mustf(t, err, "zip %s", zf.Name)
		_, err = w.Write(content)
		mustf(t, err, "zip %s", zf.Name)
	}
	mustf(t, zw.Close(), "close zip")
	if !found {
		t.Fatalf("formula cell %s not found in the sheet XML", cell)
	}
	return b.Bytes()
}

// TestFillTwice: a filled workbook filled again keeps the first results
// and puts the new ones further right; the first results are not taken for
// inputs.
func TestFillTwice(t *testing.T) {
	once, _ := fillBytes(t, goodWorkbook(t), "good.xlsx", opts())
	o := opts()
	o.Add = []string{"t", "p", "h"} // headers that would read as inputs
	twice, sum := fillBytes(t, save(t, once), "good_filled.xlsx", o)
	if got := sum.Sheets[0].Pairs[0].Outputs[0].Letter; got != "J" {
		t.Errorf("second results start in %s, want J", got)
	}
	for cell, want := range map[string]string{"D1": "Status (steamcell)", "E1": "h [kJ/kg]", "J1": "Status (steamcell)", "K1": "T [°C]", "L1": "p [kPa]", "M1": "h [kJ/kg]", "K2": "300", "L2": "1000"} {
		if got := raw(t, twice, "Data", cell); got != want {
			t.Errorf("%s = %q, want %q", cell, got, want)
		}
	}
	// The second fill writes no s, so it adds no chart.
	if got := twice.GetSheetList(); len(got) != 4 || got[3] != "steamcell summary 2" || sum.Chart != "" {
		t.Errorf("sheets %q (chart %q), want a second summary and no second chart", got, sum.Chart)
	}
	// A third fill still finds the same inputs: columns right of a status
	// column are never inputs.
	_, sum = fillBytes(t, save(t, twice), "again.xlsx", o)
	if got := sum.Sheets[0].Pairs[0].Inputs; got[0].Letter != "B" || got[1].Letter != "C" {
		t.Errorf("third fill inputs %+v, want B and C", got)
	}
}

// TestHiddenSheet: hidden sheets are skipped unless named.
func TestHiddenSheet(t *testing.T) {
	f := sheetOf(t, []any{"Note"}, []any{"see the hidden sheet"})
	_, err := f.NewSheet("Raw")
	mustf(t, err, "sheet")
	mustf(t, f.SetSheetRow("Raw", "A1", &[]any{"P [bar]", "T [°C]"}), "row")
	mustf(t, f.SetSheetRow("Raw", "A2", &[]any{10.0, 300.0}), "row")
	mustf(t, f.SetSheetVisible("Raw", false), "hide")
	data := save(t, f)
	if err := fillErr(t, data, "hidden.xlsx", opts()); !errors.Is(err, workbook.ErrNoInputs) {
		t.Errorf("all sheets: %v, want ErrNoInputs (the only sheet with inputs is hidden)", err)
	}
	o := opts()
	o.Sheet = "Raw"
	out, _ := fillBytes(t, data, "hidden.xlsx", o)
	if n := verifySheet(t, out, "Raw", 2, 2, [2]in{{"A", fn.Pressure, "bar"}, {"B", fn.Temperature, "°C"}}, outCols{"C", "D", "E", "F", "G", "H"}); n != 1 {
		t.Errorf("%d rows verified, want 1", n)
	}
	if v, _ := out.GetSheetVisible("Raw"); v {
		t.Errorf("the filled hidden sheet became visible")
	}
}

// TestChunks fills more rows than one chunk, in parallel, and checks every
// row landed in its place.
func TestChunks(t *testing.T) {
	const n = 9000 // over two chunks of 4096
	f := excelize.NewFile()
	sw, err := f.NewStreamWriter("Sheet1")
	mustf(t, err, "stream")
	mustf(t, sw.SetRow("A1", []any{"P [MPa]", "T [K]"}), "header")
	rng := rand.New(rand.NewSource(6)) // fixed seed
	for r := 2; r <= n+1; r++ {
		cell, _ := excelize.CoordinatesToCellName(1, r)
		// Region 1, 2 and 3 states: 0.1 to 40 MPa, 300 to 900 K.
		mustf(t, sw.SetRow(cell, []any{0.1 + 39.9*rng.Float64(), 300 + 600*rng.Float64()}), "row")
	}
	mustf(t, sw.Flush(), "flush")
	out, sum := fillBytes(t, save(t, f), "many.xlsx", opts())
	if sum.Rows != n {
		t.Errorf("%d rows, want %d", sum.Rows, n)
	}
	ins := [2]in{{"A", fn.Pressure, "MPa"}, {"B", fn.Temperature, "K"}}
	got := verifySheet(t, out, "Sheet1", 2, n+1, ins, outCols{"C", "D", "E", "F", "G", "H"})
	if got != sum.OK+sum.Flagged {
		t.Errorf("%d rows verified, want %d solved", got, sum.OK+sum.Flagged)
	}
	if sum.Failed != 0 {
		t.Errorf("%d rows failed, want none", sum.Failed)
	}
}

// TestSheetLimits: a row at the last row of a sheet is filled; a sheet
// with data in its last column has no room for results.
func TestSheetLimits(t *testing.T) {
	f := excelize.NewFile()
	sw, err := f.NewStreamWriter("Sheet1")
	mustf(t, err, "stream")
	mustf(t, sw.SetRow("A1", []any{"P [bar]", "T [°C]"}), "header")
	mustf(t, sw.SetRow("A2", []any{10.0, 300.0}), "row")
	last := fmt.Sprintf("A%d", excelize.TotalRows)
	mustf(t, sw.SetRow(last, []any{20.0, 400.0}), "last row")
	mustf(t, sw.Flush(), "flush")
	out, sum := fillBytes(t, save(t, f), "tall.xlsx", opts())
	ins := [2]in{{"A", fn.Pressure, "bar"}, {"B", fn.Temperature, "°C"}}
	oc := outCols{"C", "D", "E", "F", "G", "H"}
	verifyRow(t, out, "Sheet1", excelize.TotalRows, [2]string{"20", "400"}, ins, oc)
	if sum.Rows != 2 || sum.OK != 2 {
		t.Errorf("rows %d ok %d, want 2 and 2", sum.Rows, sum.OK)
	}

	wide := sheetOf(t, []any{"P [bar]", "T [°C]"}, []any{10.0, 300.0})
	mustf(t, wide.SetCellValue("Data", "XFA1", "far right"), "far cell")
	if err := fillErr(t, save(t, wide), "wide.xlsx", opts()); !errors.Is(err, workbook.ErrNoRoom) || !strings.Contains(err.Error(), "XFA") {
		t.Errorf("wide sheet: %v, want ErrNoRoom naming XFA", err)
	}
}

// TestMemory: a workbook whose parts loaded whole, or whose directory,
// exceed half the memory bound is refused before anything is written;
// the rows do not count.
func TestMemory(t *testing.T) {
	o := opts()
	o.Memory = 2 << 10 // half of it holds the directory of one part
	err := fillErr(t, goodWorkbook(t), "good.xlsx", o)
	if !errors.Is(err, workbook.ErrTooLarge) || !strings.Contains(err.Error(), "parts") {
		t.Errorf("error %v, want ErrTooLarge counting the parts", err)
	}
	// 300 notes of 200 characters: 60 kB of shared strings.
	rows := [][]any{{"Point", "P [bar]", "T [°C]", "Note"}}
	for i := range 300 {
		rows = append(rows, []any{"A", 10.0, 300.0, fmt.Sprintf("%03d %s", i, strings.Repeat("steady ", 28))})
	}
	data := save(t, sheetOf(t, rows...))
	o.Memory = 96 << 10
	err = fillErr(t, data, "notes.xlsx", o)
	if !errors.Is(err, workbook.ErrTooLarge) || !strings.Contains(err.Error(), "in memory") {
		t.Errorf("error %v, want ErrTooLarge saying what memory holds", err)
	}
	o.Memory = 1 << 20
	if _, sum := fillBytes(t, data, "notes.xlsx", o); sum.Rows != 300 {
		t.Errorf("%d rows filled under 1 MiB, want 300", sum.Rows)
	}
}

// TestHeaderRow: a header row below the rows searched is named with
// HeaderRow; a header repeated lower down (as printed sheets repeat it) is
// no data.
func TestHeaderRow(t *testing.T) {
	rows := make([][]any, 0, 130)
	for i := 0; i < 119; i++ {
		rows = append(rows, []any{fmt.Sprintf("preamble line %d", i+1)})
	}
	rows = append(rows,
		[]any{"P [bar]", "T [°C]"}, // row 120
		[]any{10.0, 300.0},
		[]any{"P [bar]", "T [°C]"}, // repeated
		[]any{20.0, 400.0},
	)
	data := save(t, sheetOf(t, rows...))
	if err := fillErr(t, data, "deep.xlsx", opts()); !errors.Is(err, workbook.ErrNoInputs) {
		t.Errorf("header in row 120 without HeaderRow: %v, want ErrNoInputs", err)
	}
	o := opts()
	o.HeaderRow = 120
	f, sum := fillBytes(t, data, "deep.xlsx", o)
	if s := sum.Sheets[0]; s.HeaderRow != 120 || s.Rows != 2 || s.OK != 2 || s.Blank != 1 {
		t.Errorf("sheet %+v; want header row 120, 2 rows ok, the repeated header skipped", s)
	}
	if got := raw(t, f, "Data", "C122"); got != "" {
		t.Errorf("C122 = %q beside the repeated header, want blank", got)
	}
	o.Point.Patm = 1.01325 // bar given as MPa
	if err := fillErr(t, data, "deep.xlsx", o); !errors.Is(err, workbook.ErrBadOption) {
		t.Errorf("patm 1.01325 MPa: %v, want ErrBadOption", err)
	}
}

// TestUnitRow: a row of units under a header of names ("Pressure" over
// "barg") gives the input columns their units, is not read as data, and
// gets the units of the results; the results are those of the same values
// with the units in the headers. A unit under a header that names another
// unit stops the fill.
func TestUnitRow(t *testing.T) {
	data := save(t, sheetOf(t,
		[]any{"Boiler test 7"},
		[]any{"Point", "Drum pressure", "Steam temperature", "Note"},
		[]any{nil, "barg", "[°C]", nil},
		[]any{"P1", 6.0, 330.0, "steady"},
		[]any{"P2", 10.5, 400.0, nil},
	))
	f, sum := fillBytes(t, data, "units-row.xlsx", opts())
	s := sum.Sheets[0]
	if s.HeaderRow != 2 || s.UnitRow != 3 || s.Rows != 2 || s.OK != 2 || s.Blank != 0 {
		t.Errorf("sheet %+v; want header row 2, units in row 3, 2 rows ok", s)
	}
	ins := [2]in{{"B", fn.Pressure, "barg"}, {"C", fn.Temperature, "°C"}}
	if n := verifySheet(t, f, "Data", 4, 5, ins, outCols{"E", "F", "G", "H", "I", "J"}); n != 2 {
		t.Errorf("%d rows verified, want 2", n)
	}
	for cell, want := range map[string]string{"F2": "h [kJ/kg]", "F3": "kJ/kg", "G3": "kJ/(kg·K)", "E3": "", "J3": ""} {
		if got := raw(t, f, "Data", cell); got != want {
			t.Errorf("%s = %q, want %q", cell, got, want)
		}
	}
	if got := raw(t, f, "Data", "E3"); got != "" {
		t.Errorf("status beside the row of units: %q, want none", got)
	}
	if !strings.Contains(summaryText(t, f, sum.SummarySheet), "units read from row 3") {
		t.Errorf("the summary does not say where the units came from")
	}

	clash := save(t, sheetOf(t,
		[]any{"Pressure [bar]", "Temperature"},
		[]any{"kPa", "°C"},
		[]any{6.0, 330.0},
	))
	if err := fillErr(t, clash, "clash.xlsx", opts()); !errors.Is(err, workbook.ErrAmbiguous) || !strings.Contains(err.Error(), "kPa") {
		t.Errorf("bar in the header, kPa under it: %v, want ErrAmbiguous naming both", err)
	}
}

// TestUnitRowWithMap: with a column map, a row of units under the header
// row is skipped too, and fills in the units the map leaves out.
func TestUnitRowWithMap(t *testing.T) {
	data := save(t, sheetOf(t,
		[]any{"Tag", "Reading 1", "Reading 2"},
		[]any{nil, "barg", "°C"},
		[]any{"P1", 6.0, 330.0},
	))
	o := opts()
	o.Map = "B=p,C=t:C"
	f, sum := fillBytes(t, data, "mapped.xlsx", o)
	if s := sum.Sheets[0]; s.HeaderRow != 1 || s.UnitRow != 2 || s.Rows != 1 || s.OK != 1 {
		t.Errorf("sheet %+v; want header row 1, units in row 2, 1 row ok", s)
	}
	verifyRow(t, f, "Data", 3, [2]string{"6", "330"}, [2]in{{"B", fn.Pressure, "barg"}, {"C", fn.Temperature, "°C"}}, outCols{"D", "E", "F", "G", "H", "I"})
}

// utf16Of encodes s as UTF-16 with a byte-order mark.
func utf16Of(s string, bigEndian bool) []byte {
	b := []byte{0xFF, 0xFE}
	if bigEndian {
		b = []byte{0xFE, 0xFF}
	}
	for _, u := range utf16.Encode([]rune(s)) {
		if bigEndian {
			b = append(b, byte(u>>8), byte(u))
		} else {
			b = append(b, byte(u), byte(u>>8))
		}
	}
	return b
}

// TestCSVEncodings: every line end, encoding and separator a plant logger
// or an office program writes is read into the same three points, or is
// refused with a message (issue 12: CR-only line ends gave "0 rows" and
// exit 0; UTF-16 failed every row with exit 0).
func TestCSVEncodings(t *testing.T) {
	rows := func(sep, nl string) string {
		return strings.Join([]string{
			"Point" + sep + "Drum pressure [barg]" + sep + "Steam temperature [°C]",
			"K1" + sep + "41.37" + sep + "415.7",
			"K2" + sep + "12.5" + sep + "260",
			"K3" + sep + "6" + sep + "330", ""}, nl)
	}
	ins := [2]in{{"B", fn.Pressure, "barg"}, {"C", fn.Temperature, "°C"}}
	for _, tc := range []struct {
		name string
		data []byte
	}{
		{"LF, comma", []byte(rows(",", "\n"))},
		{"CRLF, comma", []byte(rows(",", "\r\n"))},
		{"CR only, comma", []byte(rows(",", "\r"))},
		{"UTF-8 BOM, semicolon", append([]byte("\xEF\xBB\xBF"), rows(";", "\r\n")...)},
		{"tab", []byte(rows("\t", "\n"))},
		{"UTF-16LE BOM, tab", utf16Of(rows("\t", "\r\n"), false)},
		{"UTF-16BE BOM, comma, CR only", utf16Of(rows(",", "\r"), true)},
		{"semicolon, decimal commas", []byte(strings.ReplaceAll(strings.ReplaceAll(rows(";", "\n"), "41.37", "41,37"), "12.5", "12,5"))},
	} {
		f, sum := fillBytes(t, tc.data, "log.csv", opts())
		if sum.Rows != 3 || sum.OK != 3 {
			t.Errorf("%s: %d rows, %d ok, want 3 and 3", tc.name, sum.Rows, sum.OK)
			continue
		}
		if n := verifySheet(t, f, "log", 2, 4, ins, outCols{"D", "E", "F", "G", "H", "I"}); n != 3 {
			t.Errorf("%s: %d rows verified, want 3", tc.name, n)
		}
	}
	for _, tc := range []struct {
		name string
		data []byte
		say  string
	}{
		{"UTF-16 without a mark", utf16Of(rows(",", "\n"), false)[2:], "UTF-16 text without a byte-order mark"},
		{"UTF-32", append([]byte{0xFF, 0xFE, 0, 0}, 'P', 0, 0, 0), "UTF-32"},
		{"UTF-16 cut in a character", append(utf16Of(rows(",", "\n"), false), 'x'), "cut off"},
	} {
		err := fillErr(t, tc.data, "log.csv", opts())
		if !errors.Is(err, workbook.ErrNotWorkbook) || !strings.Contains(err.Error(), tc.say) {
			t.Errorf("%s: %v, want ErrNotWorkbook saying %q", tc.name, err, tc.say)
		}
	}
}

// TestDigits: the number formats of the results follow Options.Digits,
// by property and for all, and the stored values keep every digit.
func TestDigits(t *testing.T) {
	o := opts()
	o.Digits = map[string]int{"h": 1, "": 3}
	f, _ := fillBytes(t, goodWorkbook(t), "good.xlsx", o)
	code := func(cell string) string {
		id, err := f.GetCellStyle("Data", cell)
		mustf(t, err, "style of %s", cell)
		st, err := f.GetStyle(id)
		mustf(t, err, "style %d", id)
		if st.CustomNumFmt == nil {
			return ""
		}
		return *st.CustomNumFmt
	}
	header := func(col string) string { return raw(t, f, "Data", col+"1") }
	for _, col := range []string{"E", "F", "G"} {
		want := "0.000"
		if strings.HasPrefix(header(col), "h ") {
			want = "0.0"
		}
		if got := code(col + "2"); got != want {
			t.Errorf("%s (%s) number format %q, want %q", col, header(col), got, want)
		}
	}
	if v := raw(t, f, "Data", "E2"); len(v) < 10 {
		t.Errorf("E2 stores %q, want the full value", v)
	}
	o.Digits = map[string]int{"h": 16}
	if err := fillErr(t, goodWorkbook(t), "good.xlsx", o); !errors.Is(err, workbook.ErrBadOption) {
		t.Errorf("16 digits: %v, want ErrBadOption", err)
	}
}

// TestEmptyStyledCells: empty cells that carry a style (a layout's grid)
// in the result columns give way to the results, which keep the row's
// cells in column order and take the fill's own styles.
func TestEmptyStyledCells(t *testing.T) {
	f := sheetOf(t, []any{"P [bar]", "T [°C]"}, []any{10.0, 300.0}, []any{20.0, 400.0})
	pct, err := f.NewStyle(&excelize.Style{NumFmt: 10})
	mustf(t, err, "style")
	mustf(t, f.SetCellStyle("Data", "C2", "K3", pct), "style the empty cells")
	out, sum := fillBytes(t, save(t, f), "grid.xlsx", opts())
	if sum.OK != 2 {
		t.Fatalf("%d ok, want 2", sum.OK)
	}
	if n := verifySheet(t, out, "Data", 2, 3, [2]in{{"A", fn.Pressure, "bar"}, {"B", fn.Temperature, "°C"}}, outCols{"C", "D", "E", "F", "G", "H"}); n != 2 {
		t.Errorf("%d rows verified, want 2", n)
	}
	id, _ := out.GetCellStyle("Data", "D2")
	st, err := out.GetStyle(id)
	mustf(t, err, "style of D2")
	if st.NumFmt == 10 || st.CustomNumFmt == nil {
		t.Errorf("D2 (h) has the grid's percent format, want the fill's own")
	}
	if id, _ := out.GetCellStyle("Data", "K2"); id != pct {
		t.Errorf("K2, past the results, has style %d, want the grid's %d", id, pct)
	}
}

// TestPrefixedSheet: a sheet written with a prefix on the main namespace
// (<x:row>, as some generators write it) gets result cells with the same
// prefix.
func TestPrefixedSheet(t *testing.T) {
	data := patchPackage(t, goodWorkbook(t), func(p map[string][]byte) {
		sh := "xl/worksheets/sheet1.xml"
		b := regexp.MustCompile(`<(/?)([A-Za-z])`).ReplaceAll(p[sh], []byte("<${1}x:$2"))
		b = replaceOnce(t, b, `xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"`, `xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"`)
		p[sh] = b
	})
	var out bytes.Buffer
	if _, err := workbook.Fill(context.Background(), bytes.NewReader(data), "x.xlsx", opts(), &out); err != nil {
		t.Fatal(err)
	}
	zr, err := zip.NewReader(bytes.NewReader(out.Bytes()), int64(out.Len()))
	mustf(t, err, "read the output")
	sheet := partBytes(t, zr, "xl/worksheets/sheet1.xml")
	if _, err := parseTree(sheet); err != nil {
		t.Fatalf("the filled sheet is not XML: %v", err)
	}
	if !bytes.Contains(sheet, []byte(`<x:c r="D2" s=`)) || bytes.Contains(sheet, []byte("<c ")) {
		t.Errorf("result cells without the sheet's prefix: %.600s", sheet[bytes.Index(sheet, []byte("sheetData")):])
	}
}

// TestAggregateRows: a row whose inputs all aggregate their own columns
// is solved and marked, and not counted; a formula of another kind, or an
// aggregate beside a reading, is a test point.
func TestAggregateRows(t *testing.T) {
	f := sheetOf(t, []any{"P [bar]", "T [°C]"}, []any{10.0, 300.0}, []any{20.0, 400.0})
	for cell, fx := range map[string]string{
		"A4": "MIN(A2:A3)", "B4": "MAX(B2:B3)", // aggregate row
		"A5": "SUM(A2:A3)", "B5": "_xlfn.AVERAGE(B$2:B$3)", // aggregate row
		"A6": "A2*2", "B6": "AVERAGE(B2:B3)", // not: A6 is no aggregate
		"A7": "AVERAGE(B2:B3)", // not: A7 averages another column, and B7 is a reading
	} {
		mustf(t, f.SetCellFormula("Data", cell, fx), "formula %s", cell)
	}
	mustf(t, f.SetCellValue("Data", "B7", 350.0), "set B7")
	out, sum := fillBytes(t, save(t, f), "agg.xlsx", opts())
	if sum.Aggregate != 2 || sum.Rows != 4 {
		t.Errorf("%d aggregate rows, %d test points; want 2 and 4", sum.Aggregate, sum.Rows)
	}
	for row, want := range map[int]bool{4: true, 5: true, 6: false, 7: false} {
		status := raw(t, out, "Data", "C"+strconv.Itoa(row))
		if got := strings.HasPrefix(status, "aggregate row ("); got != want {
			t.Errorf("row %d status %q; aggregate %v, want %v", row, status, got, want)
		}
	}
	if got := raw(t, out, "Data", "C4"); !strings.Contains(got, "MIN/MAX of the column") {
		t.Errorf("C4 = %q, want the aggregates named", got)
	}
}
