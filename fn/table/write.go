package table

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"strconv"

	"github.com/xuri/excelize/v2"

	"steamcell/fn/point"
)

// Formats a table is written in.
const (
	CSV  = "csv"
	JSON = "json"
	XLSX = "xlsx"
)

// Formats lists them, for messages and choices.
var Formats = []string{CSV, JSON, XLSX}

// header returns the header cells: the columns, then phase and status.
func (t *Table) header() []string {
	h := make([]string, 0, len(t.Columns)+2)
	for _, c := range t.Columns {
		h = append(h, c.Header())
	}
	return append(h, "phase", "status")
}

// number writes v in the shortest form that reads back to the same
// float64, as every other answer does.
func number(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// WriteCSV writes the table as CSV: a header row ("p [kPa]", …, phase,
// status) and one row per state; a value the state does not have is an
// empty cell.
func (t *Table) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(t.header()); err != nil {
		return err
	}
	cells := make([]string, 0, len(t.Columns)+2)
	for _, r := range t.Rows {
		cells = cells[:0]
		for _, f := range r.Fields {
			if f.Defined {
				cells = append(cells, number(f.Value))
			} else {
				cells = append(cells, "")
			}
		}
		if err := cw.Write(append(cells, r.Phase, r.Status)); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

type jsonTable struct {
	Kind        string    `json:"kind"`
	Title       string    `json:"title"`
	UnitSet     string    `json:"unit_set"`
	Formulation string    `json:"formulation"`
	Columns     []jsonCol `json:"columns"`
	Rows        []jsonRow `json:"rows"`
	Caution     string    `json:"caution,omitempty"`
}

type jsonCol struct {
	Symbol string `json:"symbol"`
	Name   string `json:"name"`
	Unit   string `json:"unit"`
}

type jsonRow struct {
	Values []*float64 `json:"values"` // in column order; null where the state has no value
	Phase  string     `json:"phase"`
	Status string     `json:"status"`
}

// WriteJSON writes the table as one JSON object: kind, title, unit set,
// formulation, columns (symbol, name, unit), rows (values in column
// order, null where undefined; phase; status) and the caution.
func (t *Table) WriteJSON(w io.Writer, caution string) error {
	out := jsonTable{Kind: t.Kind, Title: t.Title, UnitSet: t.UnitSet, Formulation: point.Formulation,
		Columns: []jsonCol{}, Rows: make([]jsonRow, 0, len(t.Rows)), Caution: caution}
	for _, c := range t.Columns {
		out.Columns = append(out.Columns, jsonCol(c))
	}
	for _, r := range t.Rows {
		jr := jsonRow{Values: make([]*float64, len(r.Fields)), Phase: r.Phase, Status: r.Status}
		for i := range r.Fields {
			if r.Fields[i].Defined {
				jr.Values[i] = &r.Fields[i].Value
			}
		}
		out.Rows = append(out.Rows, jr)
	}
	enc := json.NewEncoder(w)
	return enc.Encode(out)
}

// WriteXLSX writes the table as an .xlsx workbook: a sheet "Table" with
// the header row and numbers as numbers, and a sheet "About" with the
// title, formulation, unit set and caution.
func (t *Table) WriteXLSX(w io.Writer, caution string) error {
	f := excelize.NewFile()
	defer f.Close()
	const sheet = "Table"
	if err := f.SetSheetName("Sheet1", sheet); err != nil {
		return err
	}
	sw, err := f.NewStreamWriter(sheet)
	if err != nil {
		return err
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	if err := sw.SetColWidth(1, len(t.Columns)+2, 13); err != nil {
		return err
	}
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return err
	}
	head := make([]any, 0, len(t.Columns)+2)
	for _, h := range t.header() {
		head = append(head, excelize.Cell{StyleID: bold, Value: h})
	}
	if err := sw.SetRow("A1", head, excelize.RowOpts{}); err != nil {
		return err
	}
	for i, r := range t.Rows {
		cells := make([]any, 0, len(r.Fields)+2)
		for _, fl := range r.Fields {
			if fl.Defined {
				cells = append(cells, fl.Value)
			} else {
				cells = append(cells, nil)
			}
		}
		cells = append(cells, r.Phase, r.Status)
		cell, _ := excelize.CoordinatesToCellName(1, i+2)
		if err := sw.SetRow(cell, cells); err != nil {
			return err
		}
	}
	if err := sw.Flush(); err != nil {
		return err
	}
	if _, err := f.NewSheet("About"); err != nil {
		return err
	}
	about := [][2]string{
		{"Table", t.Title},
		{"Formulation", point.Formulation},
		{"Unit set", t.UnitSet},
		{"Rows", strconv.Itoa(len(t.Rows))},
		{"Caution", caution},
	}
	for i, kv := range about {
		for j, v := range kv {
			cell, _ := excelize.CoordinatesToCellName(j+1, i+1)
			if err := f.SetCellStr("About", cell, v); err != nil {
				return err
			}
		}
	}
	if err := f.SetColWidth("About", "A", "A", 14); err != nil {
		return err
	}
	if err := f.SetColWidth("About", "B", "B", 100); err != nil {
		return err
	}
	if _, err := f.WriteTo(w); err != nil {
		return fmt.Errorf("write table workbook: %w", err)
	}
	return nil
}
