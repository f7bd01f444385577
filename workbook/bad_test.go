package workbook_test

import (
	"archive/zip"
	"bytes"
	"errors"
	"fmt"
	"io"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"steamcell/fn"
	"steamcell/workbook"
)

// goodWorkbook is a small valid workbook of p,T readings.
func goodWorkbook(t *testing.T) []byte {
	return save(t, sheetOf(t,
		[]any{"Point", "P [bar]", "T [°C]"},
		[]any{"A", 10.0, 300.0},
		[]any{"B", 20.0, 400.0},
	))
}

func zipOf(t *testing.T, files map[string][]byte) []byte {
	t.Helper()
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	for name, data := range files {
		w, err := zw.Create(name)
		mustf(t, err, "zip %s", name)
		_, err = w.Write(data)
		mustf(t, err, "zip %s", name)
	}
	mustf(t, zw.Close(), "close zip")
	return b.Bytes()
}

// TestNotAWorkbook: files that are not an .xlsx give a typed error that
// says what the file is and what to do.
func TestNotAWorkbook(t *testing.T) {
	good := goodWorkbook(t)
	enc := sheetOf(t, []any{"P [bar]", "T [°C]"}, []any{10.0, 300.0})
	var encBuf bytes.Buffer
	mustf(t, enc.Write(&encBuf, excelize.Options{Password: "kestrel"}), "encrypt")
	xls := append([]byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}, make([]byte, 2048)...)

	for _, tc := range []struct {
		name string
		data []byte
		kind error
		say  string
	}{
		{"empty.xlsx", nil, workbook.ErrNotWorkbook, "is empty"},
		{"old.xls", xls, workbook.ErrNotWorkbook, ".xls workbook"},
		{"old.xlsx", xls, workbook.ErrNotWorkbook, "save it as .xlsx"},
		{"locked.xlsx", encBuf.Bytes(), workbook.ErrPassword, "password"},
		{"renamed.xlsx", []byte("Point,P [bar],T [°C]\nA,10,300\n"), workbook.ErrNotWorkbook, "name it .csv"},
		{"cut.xlsx", good[:len(good)/2], workbook.ErrNotWorkbook, "damaged or cut short"},
		{"cut-end.xlsx", good[:len(good)-10], workbook.ErrNotWorkbook, "damaged or cut short"},
		{"other.xlsx", zipOf(t, map[string][]byte{"word/document.xml": []byte("<w/>")}), workbook.ErrNotWorkbook, "without a workbook"},
		{"picture.xlsx", []byte("\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR"), workbook.ErrNotWorkbook, "does not start like one"},
	} {
		err := fillErr(t, tc.data, tc.name, opts())
		if !errors.Is(err, tc.kind) || !strings.Contains(err.Error(), tc.say) {
			t.Errorf("%s: error %v, want kind %v saying %q", tc.name, err, tc.kind, tc.say)
		}
	}
}

// TestZipBomb: a package that unpacks to more than the limit is refused
// before it is unpacked.
func TestZipBomb(t *testing.T) {
	bomb := zipOf(t, map[string][]byte{
		"xl/workbook.xml":          []byte("<workbook/>"),
		"xl/worksheets/sheet1.xml": make([]byte, 64<<20), // 64 MiB of zeros pack to about 64 kB
	})
	if len(bomb) > 1<<20 {
		t.Fatalf("the test bomb is %d bytes; it should pack small", len(bomb))
	}
	o := opts()
	o.UnzipSizeLimit = 8 << 20
	err := fillErr(t, bomb, "bomb.xlsx", o)
	if !errors.Is(err, workbook.ErrTooLarge) || !strings.Contains(err.Error(), "unpacks to 64.0 MiB") {
		t.Errorf("error %v, want ErrTooLarge naming 64.0 MiB", err)
	}
}

// TestNoInputs: sheets without two input headers stop with the headers
// seen and how to name them.
func TestNoInputs(t *testing.T) {
	data := save(t, sheetOf(t,
		[]any{"Test log"},
		[]any{"Point", "Time", "Pressure (drum)", "Steam flow [t/h]", "Note"},
		[]any{"A", "09:00", 41.2, 36.0, "steady"},
	))
	err := fillErr(t, data, "log.xlsx", opts())
	for _, want := range []string{`sheet "Data"`, `Headers seen in row 2`, `A2 "Point"`, `C2 "Pressure (drum)" (no unit of pressure in its brackets ("drum")`, `"P [barg]"`, `--map "B=p:barg,C=t:C"`} {
		if !errors.Is(err, workbook.ErrNoInputs) || !strings.Contains(err.Error(), want) {
			t.Errorf("error %v; want ErrNoInputs containing %q", err, want)
		}
	}

	one := save(t, sheetOf(t, []any{"Point", "T [°C]"}, []any{"A", 100.0}))
	if err := fillErr(t, one, "one.xlsx", opts()); !errors.Is(err, workbook.ErrNoInputs) || !strings.Contains(err.Error(), `only one input column found (B1 "T [°C]")`) {
		t.Errorf("one input: %v", err)
	}

	empty := excelize.NewFile()
	o := opts()
	o.Sheet = "sheet1" // names match without regard to case
	if err := fillErr(t, save(t, empty), "empty.xlsx", o); !errors.Is(err, workbook.ErrNoInputs) || !strings.Contains(err.Error(), `sheet "Sheet1" is empty`) {
		t.Errorf("empty sheet: %v", err)
	}
	o.Sheet = "Nope"
	if err := fillErr(t, save(t, empty), "empty.xlsx", o); !errors.Is(err, workbook.ErrNoSheet) || !strings.Contains(err.Error(), `its sheets are "Sheet1"`) {
		t.Errorf("unknown sheet: %v", err)
	}
}

// TestAmbiguousAndMap: three input columns cannot be paired; a column map
// settles it.
func TestAmbiguousAndMap(t *testing.T) {
	data := save(t, sheetOf(t,
		[]any{"Point", "P [barg]", "T [°C]", "Tsat check", "h (kJ/kg)"},
		[]any{"A", 10.0, 300.0, "", 3000.0},
		[]any{"B", 12.0, 320.0, "", 3050.0},
	))
	err := fillErr(t, data, "three.xlsx", opts())
	for _, want := range []string{"row 1 has 3 input headers", `B1 "P [barg]" (p, barg)`, `E1 "h (kJ/kg)" (h, kJ/kg)`, `--map "B=p:barg,C=t:°C"`} {
		if !errors.Is(err, workbook.ErrAmbiguous) || !strings.Contains(err.Error(), want) {
			t.Errorf("error %v; want ErrAmbiguous containing %q", err, want)
		}
	}

	o := opts()
	o.Map = "B=p, E=h"
	f, sum := fillBytes(t, data, "three.xlsx", o)
	p := sum.Sheets[0].Pairs[0]
	if p.Inputs[0].Letter != "B" || p.Inputs[0].Unit != "barg" || p.Inputs[1].Letter != "E" || p.Inputs[1].Unit != "kJ/kg" || !p.Inputs[0].Mapped {
		t.Errorf("mapped pair %+v; want B as p in barg (from the header), E as h in kJ/kg", p)
	}
	if n := verifySheet(t, f, "Data", 2, 3, [2]in{{"B", fn.Pressure, "barg"}, {"E", fn.Enthalpy, "kJ/kg"}}, outCols{"F", "G", "H", "I", "J", "K"}); n != 2 {
		t.Errorf("%d rows verified, want 2", n)
	}

	// A map unit wins over the header's.
	o.Map = "B=p:psig,C=t:F"
	f, _ = fillBytes(t, data, "three.xlsx", o)
	verifyRow(t, f, "Data", 2, [2]string{"10 psig", "300 °F"}, [2]in{{"B", fn.Pressure, ""}, {"C", fn.Temperature, ""}}, outCols{"F", "G", "H", "I", "J", "K"})

	for _, bad := range []string{"B=p", "B=p,C=q", "B=p,B=t", "B p,C t", "1=p,C=t", "B=p:degC,C=t", "B=p,C=h:bar", "B=h,C=x", ";"} {
		o.Map = bad
		if err := fillErr(t, data, "three.xlsx", o); !errors.Is(err, workbook.ErrBadOption) {
			t.Errorf("map %q: %v, want ErrBadOption", bad, err)
		}
	}
	two := excelize.NewFile()
	_, _ = two.NewSheet("Other")
	o.Map = "B=p,C=t"
	if err := fillErr(t, save(t, two), "two.xlsx", o); !errors.Is(err, workbook.ErrBadOption) || !strings.Contains(err.Error(), "--sheet") {
		t.Errorf("map without sheet: %v", err)
	}
}

// TestRowProblems: each kind of bad row gets its status and a comment; the
// rows around it are filled.
func TestRowProblems(t *testing.T) {
	data := save(t, sheetOf(t,
		[]any{"Sample", "P [bar]", "T [°C]", "Remark"},
		[]any{"ok", 10.0, 300.0},
		[]any{"text", 10.0, "hot"},
		[]any{"comma", "1,013", 300.0},
		[]any{"one", nil, 300.0},
		[]any{},
		[]any{},
		[]any{"hot", 10.0, 900.0},    // fine: 900 °C at 1 MPa lies in region 5
		[]any{"above", 600.0, 850.0}, // 60 MPa and 850 °C: above 1073.15 K beyond 50 MPa
		[]any{"wrong unit", "300 °C", 300.0},
		[]any{"formula error", 10.0, "#DIV/0!"},
		[]any{"negative", -2.0, 300.0},
		[]any{"last", 5.0, 200.0},
	))
	f, sum := fillBytes(t, data, "rows.xlsx", opts())
	for i, tc := range []struct{ status, cell, comment string }{
		{"ok", "", ""},
		{"not a number in C3", "C3", `C3 holds "hot", not a number. Enter the reading as a number (the header gives the unit, °C)`},
		{`B4: p "1,013": `, "B4", "comma"},
		{"two inputs needed, found one: B5 is blank", "B5", "B5 is blank, but C5 holds \"300\""},
		{"", "", ""},
		{"", "", ""},
		{"ok", "", ""},
		{"out of range: p above 50 MPa", "B9", "Check the readings and their units"},
		{`B10: p "300 °C": `, "B10", "°C is a unit of temperature"},
		{"not a number in C11", "C11", `"#DIV/0!"`},
		{`B12: p "-2": `, "B12", "is not above 0"},
		{"ok", "", ""},
	} {
		row := itoa(i + 2)
		got := raw(t, f, "Data", "E"+row)
		if tc.status == "" && got != "" || !strings.HasPrefix(got, tc.status) {
			t.Errorf("E%s = %q, want a status starting %q", row, got, tc.status)
		}
		if tc.cell != "" {
			if c := commentOn(t, f, "Data", tc.cell); !strings.Contains(c, tc.comment) {
				t.Errorf("comment on %s = %q, want it to contain %q", tc.cell, c, tc.comment)
			}
		}
		if tc.status != "ok" && raw(t, f, "Data", "F"+row) != "" {
			t.Errorf("F%s holds a value for a row that failed or is blank", row)
		}
	}
	if got := raw(t, f, "Data", "E9"); !strings.Contains(got, "1073.15 K") {
		t.Errorf("E9 = %q, want the limit 1073.15 K named", got)
	}
	s := sum.Sheets[0]
	if s.Rows != 10 || s.OK != 3 || s.Failed != 7 || s.Blank != 2 || s.Comments != 7 {
		t.Errorf("sheet counts %+v; want 10 rows, 3 ok, 7 failed, 2 blank, 7 comments", s)
	}
	if n := verifySheet(t, f, "Data", 2, 13, [2]in{{"B", fn.Pressure, "bar"}, {"C", fn.Temperature, "°C"}}, outCols{"E", "F", "G", "H", "I", "J"}); n != 3 {
		t.Errorf("%d rows verified, want 3", n)
	}
}

// TestBadOptions: options that cannot work are refused before anything is
// read.
func TestBadOptions(t *testing.T) {
	data := goodWorkbook(t)
	for _, o := range []workbook.Options{
		{Add: []string{"h", "enthalpy_pt"}},
		{Add: []string{" ", ""}},
		{HeaderRow: -1},
		{HeaderRow: 2_000_000},
	} {
		if err := fillErr(t, data, "good.xlsx", o); !errors.Is(err, workbook.ErrBadOption) {
			t.Errorf("options %+v: %v, want ErrBadOption", o, err)
		}
	}
}

// lyingZip rewrites a package with the entry name declaring what lie
// does to its header (a size or a checksum), its bytes unchanged.
func lyingZip(t *testing.T, data []byte, name string, lie func(h *zip.FileHeader)) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	mustf(t, err, "read the package")
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	found := false
	for _, f := range zr.File {
		h := f.FileHeader
		if f.Name == name {
			lie(&h)
			found = true
		}
		r, err := f.OpenRaw()
		mustf(t, err, "open %s", f.Name)
		w, err := zw.CreateRaw(&h)
		mustf(t, err, "create %s", f.Name)
		_, err = io.Copy(w, r)
		mustf(t, err, "copy %s", f.Name)
	}
	mustf(t, zw.Close(), "close")
	if !found {
		t.Fatalf("no part %s", name)
	}
	return b.Bytes()
}

// TestLyingZip: a package whose entries declare sizes or checksums their
// data do not have is refused as damaged, whether the part is copied,
// streamed or rewritten, before anything is written (issue 12: 500 from
// /workbook).
func TestLyingZip(t *testing.T) {
	good := goodWorkbook(t)
	for _, tc := range []struct {
		part string
		lie  func(h *zip.FileHeader)
	}{
		{"docProps/app.xml", func(h *zip.FileHeader) { h.UncompressedSize64 -= 10 }},  // copied, says smaller
		{"docProps/app.xml", func(h *zip.FileHeader) { h.UncompressedSize64 += 100 }}, // copied, says larger
		{"xl/theme/theme1.xml", func(h *zip.FileHeader) { h.CRC32 ^= 1 }},             // copied, wrong checksum
		{"xl/worksheets/sheet1.xml", func(h *zip.FileHeader) { h.UncompressedSize64 /= 2 }},
		{"xl/styles.xml", func(h *zip.FileHeader) { h.CRC32 ^= 0xff }},
		{"xl/sharedStrings.xml", func(h *zip.FileHeader) { h.UncompressedSize64 = 3 }},
	} {
		data := lyingZip(t, good, tc.part, tc.lie)
		err := fillErr(t, data, "lying.xlsx", opts())
		if !errors.Is(err, workbook.ErrNotWorkbook) || !strings.Contains(err.Error(), "damaged") {
			t.Errorf("%s lies: error %v, want ErrNotWorkbook saying damaged", tc.part, err)
		}
	}
}

// TestManyParts: a package of more parts than the memory bound holds the
// directory of is refused before its directory is read.
func TestManyParts(t *testing.T) {
	parts := map[string][]byte{"xl/workbook.xml": []byte("<workbook/>")}
	for i := range 3000 {
		parts[fmt.Sprintf("customXml/item%d.xml", i)] = []byte("<n/>")
	}
	o := opts()
	o.Memory = 4 << 20 // half of it holds 2048 parts
	err := fillErr(t, zipOf(t, parts), "parts.xlsx", o)
	if !errors.Is(err, workbook.ErrTooLarge) || !strings.Contains(err.Error(), "3001 parts") {
		t.Errorf("error %v, want ErrTooLarge counting 3001 parts", err)
	}
}
