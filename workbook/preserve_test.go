package workbook_test

import (
	"context"
	"crypto/sha256"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"steamcell/workbook"
)

// richWorkbook builds a workbook with everything a fill must keep: several
// sheets (one hidden), values, formulas, styles, merged ranges, comments
// (one on an input cell of a row that fails), defined names, column widths
// and row heights.
func richWorkbook(t *testing.T) *excelize.File {
	t.Helper()
	f := excelize.NewFile()
	const sh = "Readings"
	mustf(t, f.SetSheetName("Sheet1", sh), "rename")
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true, Color: "1F3864"}, Border: []excelize.Border{{Type: "bottom", Color: "000000", Style: 2}}})
	mustf(t, err, "style")
	two, err := f.NewStyle(&excelize.Style{NumFmt: 2})
	mustf(t, err, "style")
	set := func(cell string, v any) { mustf(t, f.SetCellValue(sh, cell, v), "set %s", cell) }
	set("A1", "Unit 4 feed heater test")
	mustf(t, f.MergeCell(sh, "A1", "E1"), "merge")
	mustf(t, f.SetCellStyle(sh, "A1", "A1", bold), "style A1")
	set("A2", "Operator: invented")
	for i, h := range []string{"Point", "P [bar]", "T [°C]", "Flow [t/h]", "Twice B"} {
		cell, _ := excelize.CoordinatesToCellName(i+1, 3)
		set(cell, h)
	}
	mustf(t, f.SetCellStyle(sh, "A3", "E3", bold), "style header")
	rows := [][]any{
		{"R1", 5.0, 250.0, 12.5},
		{"R2", 10.0, 300.0, 13.0},
		{"R3", 20.0, "n/a", 13.2}, // fails: its input cell C6 carries a user comment
		{"R4", 40.0, 420.0, 14.1},
	}
	for i, r := range rows {
		cell, _ := excelize.CoordinatesToCellName(1, 4+i)
		mustf(t, f.SetSheetRow(sh, cell, &r), "row")
		mustf(t, f.SetCellFormula(sh, "E"+itoa(4+i), "B"+itoa(4+i)+"*2"), "formula")
	}
	mustf(t, f.SetCellStyle(sh, "B4", "D7", two), "number style")
	mustf(t, f.MergeCell(sh, "A9", "D9"), "merge")
	set("A9", "Checked by: invented")
	mustf(t, f.AddComment(sh, excelize.Comment{Author: "QA", Cell: "A1", Text: "Title agreed with the client"}), "comment")
	mustf(t, f.AddComment(sh, excelize.Comment{Author: "QA", Cell: "C6", Text: "Thermocouple lost; see log"}), "comment")
	mustf(t, f.SetColWidth(sh, "A", "A", 11.5), "width")
	mustf(t, f.SetColWidth(sh, "B", "D", 15.25), "width")
	mustf(t, f.SetRowHeight(sh, 3, 31), "height")
	mustf(t, f.SetDefinedName(&excelize.DefinedName{Name: "Pressures", RefersTo: sh + "!$B$4:$B$7"}), "name")
	mustf(t, f.SetDefinedName(&excelize.DefinedName{Name: "Flows", RefersTo: sh + "!$D$4:$D$7", Scope: sh}), "name")

	_, err = f.NewSheet("Calibration")
	mustf(t, err, "sheet")
	mustf(t, f.SetSheetRow("Calibration", "A1", &[]any{"P [bar]", "T [°C]"}), "row")
	mustf(t, f.SetSheetRow("Calibration", "A2", &[]any{1.0, 100.0}), "row")
	mustf(t, f.SetSheetVisible("Calibration", false), "hide")

	_, err = f.NewSheet("Notes")
	mustf(t, err, "sheet")
	mustf(t, f.SetCellValue("Notes", "A1", "Nothing to compute here."), "note")
	mustf(t, f.SetCellFormula("Notes", "B2", "SUM(Readings!D4:D7)"), "formula")
	return f
}

func itoa(i int) string { return strconv.Itoa(i) }

// TestPreserve fills a workbook and checks that every original sheet,
// value, formula, style, merged range, comment, defined name, column width,
// row height and visibility is as it was.
func TestPreserve(t *testing.T) {
	orig := richWorkbook(t)
	data := save(t, orig)
	before, err := excelize.OpenReader(strings.NewReader(string(data)))
	mustf(t, err, "reopen the original")
	defer before.Close()
	after, sum := fillBytes(t, data, "rich.xlsx", opts())

	wantSheets := append(before.GetSheetList(), "steamcell summary", "steamcell chart")
	if got := after.GetSheetList(); !reflect.DeepEqual(got, wantSheets) {
		t.Fatalf("sheets %q, want %q", got, wantSheets)
	}
	if a, b := before.GetActiveSheetIndex(), after.GetActiveSheetIndex(); a != b {
		t.Errorf("active sheet %d, want %d", b, a)
	}
	for _, sh := range before.GetSheetList() {
		v1, _ := before.GetSheetVisible(sh)
		v2, _ := after.GetSheetVisible(sh)
		if v1 != v2 {
			t.Errorf("sheet %q visible %v, want %v", sh, v2, v1)
		}
		// Results start in column F of Readings; compare every cell left of
		// it, and every cell of the other sheets, over a margin around the
		// data.
		cols := 8
		if sh == "Readings" {
			cols = 5
		}
		for r := 1; r <= 12; r++ {
			for c := 1; c <= cols; c++ {
				cell, _ := excelize.CoordinatesToCellName(c, r)
				if a, b := raw(t, before, sh, cell), raw(t, after, sh, cell); a != b {
					t.Errorf("%s!%s = %q, want %q", sh, cell, b, a)
				}
				f1, _ := before.GetCellFormula(sh, cell)
				f2, _ := after.GetCellFormula(sh, cell)
				if f1 != f2 {
					t.Errorf("%s!%s formula %q, want %q", sh, cell, f2, f1)
				}
				s1, _ := before.GetCellStyle(sh, cell)
				s2, _ := after.GetCellStyle(sh, cell)
				if !sameStyle(t, before, after, s1, s2) {
					t.Errorf("%s!%s style %d, want the style of %d", sh, cell, s2, s1)
				}
			}
			h1, _ := before.GetRowHeight(sh, r)
			h2, _ := after.GetRowHeight(sh, r)
			if h1 != h2 {
				t.Errorf("%s row %d height %g, want %g", sh, r, h2, h1)
			}
		}
		for c := 1; c <= cols; c++ {
			col, _ := excelize.ColumnNumberToName(c)
			w1, _ := before.GetColWidth(sh, col)
			w2, _ := after.GetColWidth(sh, col)
			if w1 != w2 {
				t.Errorf("%s column %s width %g, want %g", sh, col, w2, w1)
			}
		}
		m1, _ := before.GetMergeCells(sh)
		m2, _ := after.GetMergeCells(sh)
		if !reflect.DeepEqual(m1, m2) {
			t.Errorf("%s merged %v, want %v", sh, m2, m1)
		}
		c1, _ := before.GetComments(sh)
		for _, c := range c1 {
			if got := commentOn(t, after, sh, c.Cell); got != c.Text {
				t.Errorf("%s!%s comment %q, want %q", sh, c.Cell, got, c.Text)
			}
		}
	}
	if d1, d2 := before.GetDefinedName(), after.GetDefinedName(); !reflect.DeepEqual(d1, d2) {
		t.Errorf("defined names %+v, want %+v", d2, d1)
	}

	// The failing row's own comment stays; steamcell's goes on its status
	// cell instead.
	if got := raw(t, after, "Readings", "F6"); got != "not a number in C6" {
		t.Errorf("Readings!F6 = %q, want %q", got, "not a number in C6")
	}
	if c := commentOn(t, after, "Readings", "F6"); !strings.Contains(c, `C6 holds "n/a", not a number`) {
		t.Errorf("comment on F6 = %q", c)
	}
	if len(sum.Sheets) != 3 || !sum.Sheets[0].Filled || sum.Sheets[1].Filled || sum.Sheets[2].Filled {
		t.Errorf("sheets filled: %+v; want Readings only", sum.Sheets)
	}
	if !strings.Contains(sum.Sheets[1].Note, "hidden") {
		t.Errorf("Calibration note %q, want it to say the sheet is hidden", sum.Sheets[1].Note)
	}
}

// sameStyle compares two styles by what they show, since a style's index
// is an index into the workbook's table.
func sameStyle(t *testing.T, a, b *excelize.File, ia, ib int) bool {
	t.Helper()
	sa, err1 := a.GetStyle(ia)
	sb, err2 := b.GetStyle(ib)
	if err1 != nil || err2 != nil {
		return ia == ib
	}
	return reflect.DeepEqual(sa, sb)
}

func sum256(t *testing.T, path string) [32]byte {
	t.Helper()
	return sha256.Sum256(readFile(t, path))
}

// TestFillFileSafety checks that the input is never written and the output
// is never clobbered by accident.
func TestFillFileSafety(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "tests.xlsx")
	mustf(t, os.WriteFile(in, save(t, richWorkbook(t)), 0o644), "write input")
	info, _ := os.Stat(in)
	hash := sum256(t, in)
	ctx := context.Background()

	for _, out := range []string{in, filepath.Join(dir, ".", "tests.xlsx")} {
		if _, err := workbook.FillFile(ctx, in, out, opts(), nil); !errors.Is(err, workbook.ErrSamePath) {
			t.Errorf("FillFile(%s → %s) = %v, want ErrSamePath", in, out, err)
		}
	}
	link := filepath.Join(dir, "link.xlsx")
	if err := os.Link(in, link); err == nil {
		o := opts()
		o.Force = true
		if _, err := workbook.FillFile(ctx, in, link, o, nil); !errors.Is(err, workbook.ErrSamePath) {
			t.Errorf("FillFile onto a hard link of the input = %v, want ErrSamePath", err)
		}
		os.Remove(link)
	}

	out := workbook.DefaultOutput(in)
	if want := filepath.Join(dir, "tests_filled.xlsx"); out != want {
		t.Errorf("DefaultOutput = %s, want %s", out, want)
	}
	var stages []string
	progress := func(stage string, done, total int) {
		stages = append(stages, fmt.Sprintf("%s %d/%d", stage, done, total))
	}
	if _, err := workbook.FillFile(ctx, in, "", opts(), progress); err != nil {
		t.Fatalf("FillFile: %v", err)
	}
	if want := []string{"reading Readings 0/-1", "reading Notes 0/-1", "filling Readings 0/9", "filling Readings 9/9", "saving tests_filled.xlsx 0/-1"}; !reflect.DeepEqual(stages, want) {
		t.Errorf("progress %q, want %q", stages, want)
	}
	first := sum256(t, out)
	if _, err := workbook.FillFile(ctx, in, out, opts(), nil); !errors.Is(err, workbook.ErrOutputExists) {
		t.Errorf("second FillFile = %v, want ErrOutputExists", err)
	}
	if sum256(t, out) != first {
		t.Errorf("a refused fill changed the existing output")
	}
	o := opts()
	o.Force = true
	o.Add = []string{"h"}
	if _, err := workbook.FillFile(ctx, in, out, o, nil); err != nil {
		t.Errorf("FillFile with Force: %v", err)
	}
	if sum256(t, out) == first {
		t.Errorf("FillFile with Force left the old output")
	}
	if _, err := workbook.FillFile(ctx, in, filepath.Join(dir, "out.xls"), opts(), nil); !errors.Is(err, workbook.ErrBadOption) {
		t.Errorf("output .xls = %v, want ErrBadOption", err)
	}
	cancelled, cancel := context.WithCancel(ctx)
	cancel()
	if _, err := workbook.FillFile(cancelled, in, filepath.Join(dir, "c.xlsx"), opts(), nil); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled FillFile = %v, want context.Canceled", err)
	}

	if sum256(t, in) != hash {
		t.Errorf("the input changed")
	}
	if after, _ := os.Stat(in); !after.ModTime().Equal(info.ModTime()) {
		t.Errorf("the input's time changed")
	}
	entries, _ := os.ReadDir(dir)
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	if want := []string{"tests.xlsx", "tests_filled.xlsx"}; !reflect.DeepEqual(names, want) {
		t.Errorf("folder holds %q, want %q (no temporary files left)", names, want)
	}
}
