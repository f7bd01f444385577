// Command demogen writes testdata/demo/kestrel_bay_tests.xlsx, the demo
// workbook of the invented Kestrel Bay mill, from the demo CSV files beside
// it and a few readings of its own. Every value is invented. Run it from
// the module root:
//
//	go run ./workbook/internal/demogen
package main

import (
	"encoding/csv"
	"fmt"
	"log"
	"os"
	"path/filepath"
	"strconv"

	"github.com/xuri/excelize/v2"
)

const dir = "testdata/demo"

func main() {
	if err := run(filepath.Join(dir, "kestrel_bay_tests.xlsx")); err != nil {
		log.Fatal(err)
	}
}

// book wraps the workbook being built and keeps the first error.
type book struct {
	f      *excelize.File
	title  int
	header int
	number int
	err    error
}

func (b *book) do(err error) {
	if b.err == nil && err != nil {
		b.err = err
	}
}

func (b *book) row(sheet string, r int, vals ...any) {
	cell, _ := excelize.CoordinatesToCellName(1, r)
	b.do(b.f.SetSheetRow(sheet, cell, &vals))
}

func (b *book) style(sheet, from, to string, id int) { b.do(b.f.SetCellStyle(sheet, from, to, id)) }

func run(out string) error {
	f := excelize.NewFile()
	defer f.Close()
	b := &book{f: f}
	var err error
	if b.title, err = f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true, Size: 13}}); err != nil {
		return err
	}
	if b.header, err = f.NewStyle(&excelize.Style{
		Font:      &excelize.Font{Bold: true},
		Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"},
		Border:    []excelize.Border{{Type: "bottom", Color: "000000", Style: 1}},
	}); err != nil {
		return err
	}
	if b.number, err = f.NewStyle(&excelize.Style{NumFmt: 2}); err != nil { // 0.00
		return err
	}
	if err := boiler(b); err != nil {
		return err
	}
	if err := turbine(b); err != nil {
		return err
	}
	if err := wetSteam(b); err != nil {
		return err
	}
	steamHeader(b)
	condensateReturn(b)
	b.do(f.DeleteSheet("Sheet1"))
	f.SetActiveSheet(0)
	if b.err != nil {
		return b.err
	}
	return f.SaveAs(out)
}

func readCSV(name string) ([][]string, error) {
	fh, err := os.Open(filepath.Join(dir, name))
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	return csv.NewReader(fh).ReadAll()
}

// cells turns CSV fields into cell values: numbers where they parse.
func cells(rec []string) []any {
	out := make([]any, len(rec))
	for i, s := range rec {
		if v, err := strconv.ParseFloat(s, 64); err == nil {
			out[i] = v
		} else {
			out[i] = s
		}
	}
	return out
}

// boiler: a title block above the header, a blank row between the morning
// and afternoon blocks, and a thermocouple note typed in a number cell.
func boiler(b *book) error {
	const sh = "Boiler 2 acceptance"
	if _, err := b.f.NewSheet(sh); err != nil {
		return err
	}
	recs, err := readCSV("boiler2_acceptance.csv")
	if err != nil {
		return err
	}
	b.row(sh, 1, "Kestrel Bay mill: Boiler 2 acceptance test (invented data)")
	b.do(b.f.MergeCell(sh, "A1", "G1"))
	b.style(sh, "A1", "A1", b.title)
	b.row(sh, 2, "Readings every 10 minutes. Gauge pressures against the standard atmosphere.")
	b.row(sh, 4, cells(recs[0])...)
	b.style(sh, "A4", "G4", b.header)
	r := 5
	for i, rec := range recs[1:] {
		vals := cells(rec)
		if rec[0] == "B2-20" {
			vals[3] = "TC fault, see log"
		}
		b.row(sh, r, vals...)
		r++
		if i == 14 { // the lunch break: one blank row
			r++
		}
	}
	b.style(sh, "C5", fmt.Sprintf("G%d", r-1), b.number)
	b.do(b.f.SetColWidth(sh, "A", "B", 9))
	b.do(b.f.SetColWidth(sh, "C", "G", 14))
	b.do(b.f.SetRowHeight(sh, 4, 45))
	return nil
}

// turbine: mean readings below the data as formulas.
func turbine(b *book) error {
	const sh = "TG-1 stage check"
	if _, err := b.f.NewSheet(sh); err != nil {
		return err
	}
	recs, err := readCSV("turbine_stage_check.csv")
	if err != nil {
		return err
	}
	b.row(sh, 1, "TG-1 stage check: inlet and extraction (invented data)")
	b.style(sh, "A1", "A1", b.title)
	b.row(sh, 3, cells(recs[0])...)
	b.style(sh, "A3", "E3", b.header)
	r := 4
	for _, rec := range recs[1:] {
		b.row(sh, r, cells(rec)...)
		r++
	}
	last := r - 1
	r++ // a blank row before the means
	b.row(sh, r, "Mean")
	for _, col := range []string{"B", "C", "D", "E"} {
		b.do(b.f.SetCellFormula(sh, fmt.Sprintf("%s%d", col, r), fmt.Sprintf("AVERAGE(%s4:%s%d)", col, col, last)))
	}
	b.style(sh, "B4", fmt.Sprintf("E%d", r), b.number)
	b.do(b.f.SetColWidth(sh, "B", "E", 14))
	b.do(b.f.SetRowHeight(sh, 3, 45))
	return nil
}

// wetSteam: pressure in kPa and dryness in percent.
func wetSteam(b *book) error {
	const sh = "Wet steam samples"
	if _, err := b.f.NewSheet(sh); err != nil {
		return err
	}
	recs, err := readCSV("wet_steam_sample.csv")
	if err != nil {
		return err
	}
	for i, rec := range recs {
		b.row(sh, i+1, cells(rec)...)
	}
	b.style(sh, "A1", "D1", b.header)
	b.do(b.f.SetColWidth(sh, "B", "C", 14))
	b.do(b.f.SetColWidth(sh, "D", "D", 44))
	return nil
}

// steamHeader: saturated process steam, read close to its saturation
// temperature, one pressure typed with its own unit and one reading
// missing.
func steamHeader(b *book) {
	const sh = "Process steam header"
	if _, err := b.f.NewSheet(sh); err != nil {
		b.do(err)
		return
	}
	b.row(sh, 1, "Process steam header, paper machine 3 (invented data)")
	b.style(sh, "A1", "A1", b.title)
	b.row(sh, 3, "Time", "Header pressure [barg]", "Header temperature [°C]", "Note")
	b.style(sh, "A3", "D3", b.header)
	for i, vals := range [][]any{
		{"07:00", 10.20, 191.4},
		{"07:15", 10.35, 186.1, "close to saturation"},
		{"07:30", 10.05, 184.6, "close to saturation"},
		{"07:45", "152 psig", 193.0, "read on the local gauge in psi"},
		{"08:00", 9.80, nil, "thermometer removed for calibration"},
		{"08:15", 10.15, 190.2},
	} {
		b.row(sh, 4+i, vals...)
	}
	b.do(b.f.SetColWidth(sh, "B", "C", 14))
	b.do(b.f.SetColWidth(sh, "D", "D", 36))
	b.do(b.f.SetRowHeight(sh, 3, 45))
}

// condensateReturn: a plant log with the units in a row of their own under
// the names, absolute pressure in kPa; subcooled condensate.
func condensateReturn(b *book) {
	const sh = "Condensate return"
	if _, err := b.f.NewSheet(sh); err != nil {
		b.do(err)
		return
	}
	b.row(sh, 1, "Condensate return to the deaerator, shift log (invented data)")
	b.style(sh, "A1", "A1", b.title)
	b.row(sh, 3, "Time", "Return pressure", "Return temperature", "Operator")
	b.row(sh, 4, nil, "kPa", "°C", nil)
	b.style(sh, "A3", "D4", b.header)
	for i, vals := range [][]any{
		{"06:00", 412.0, 96.5, "RM"},
		{"10:00", 405.5, 98.1, "RM"},
		{"14:00", 418.0, 95.2, "JT"},
		{"18:00", 409.0, 97.4, "JT"},
	} {
		b.row(sh, 5+i, vals...)
	}
	b.do(b.f.SetColWidth(sh, "B", "C", 14))
}
