package workbook

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Cautions is the text the summary sheet carries, one sentence a line.
var Cautions = []string{
	"Values are for engineering calculation.",
	"steamcell does not replace pressure-equipment and boiler design codes, inspection rules or a licensed engineer's review.",
	"Steam and pressurised hot water can kill or maim.",
	"Follow local codes and licensed practice.",
}

// Formulation names the formulation of every value, as the summary writes
// it.
const Formulation = point.Formulation + " (IAPWS R7-97(2012))"

// summaryName is the name of the summary sheet; a second fill adds
// "steamcell summary 2" and so on.
const summaryName = "steamcell summary"

func isSummarySheet(name string) bool {
	return strings.HasPrefix(strings.ToLower(name), summaryName)
}

// writeSummary adds the summary sheet.
func (r *run) writeSummary() error {
	name := summaryName
	for n := 2; ; n++ {
		if idx, _ := r.f.GetSheetIndex(name); idx < 0 {
			break
		}
		name = summaryName + " " + strconv.Itoa(n)
	}
	if _, err := r.f.NewSheet(name); err != nil {
		return fmt.Errorf("add the summary sheet: %w", err)
	}
	r.sum.SummarySheet = name
	bold, err := r.f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return fmt.Errorf("add a style for the summary sheet: %w", err)
	}
	w := &sheetWriter{f: r.f, sheet: name}
	set := r.opt.Point.Set
	patm := r.opt.Point.Patm
	if patm == 0 {
		patm = units.StandardAtmosphere
	}
	pu := set.Unit(units.Pressure)
	if strings.HasSuffix(pu.Name, "g") { // a gauge unit would show the atmosphere as 0
		pu, _ = units.Lookup(strings.TrimSuffix(pu.Name, "g"), units.Pressure)
	}
	version := r.opt.Version
	if version == "" {
		version = "(version not given)"
	}
	margin := "off"
	if r.margin > 0 {
		margin = tempDiff(r.margin, set) + `: single-phase points closer to saturation are flagged "check"`
	}

	w.row(bold, "steamcell fill summary")
	w.skip()
	w.row(0, "Input file", r.fileName)
	w.row(0, "Filled on", r.opt.Date.Format("2006-01-02 15:04 MST"))
	w.row(0, "Program", "steamcell "+version)
	w.row(0, "Formulation", Formulation)
	w.row(0, "Unit set of results", set.Name()+": "+r.unitList())
	w.row(0, "Numbers without a unit", "read in the unit of the column header or of the row of units under it; without one there, in the unit set")
	w.row(0, "Atmosphere for gauge units", fmt.Sprintf("%.6g %s", pu.FromBase(patm, 0), pu.Name))
	w.row(0, "Saturation margin", margin)
	w.row(0, "Rows with inputs", r.sum.Rows)
	w.row(0, "  ok", r.sum.OK)
	w.row(0, "  flagged (check)", r.sum.Flagged)
	w.row(0, "  failed (no values)", r.sum.Failed)
	w.row(0, "Blank rows skipped", r.sum.Blank)
	for _, n := range r.sum.Notes {
		w.row(0, "Note", n)
	}
	w.skip()

	w.row(bold, "Sheets", "Filled", "Header row", "Rows with inputs", "OK", "Flagged", "Failed", "Blank rows skipped", "Comments added", "Note")
	for _, s := range r.sum.Sheets {
		filled := "no"
		if s.Filled {
			filled = "yes"
		}
		w.row(0, s.Name, filled, s.HeaderRow, s.Rows, s.OK, s.Flagged, s.Failed, s.Blank, s.Comments, s.Note)
	}
	w.skip()

	w.row(bold, "Input columns used", "Point", "First input", "Second input", "Results in", "OK", "Flagged", "Failed")
	for _, s := range r.sum.Sheets {
		for _, p := range s.Pairs {
			label := p.Label
			if label == "" {
				label = "(one per row)"
			}
			results := p.Outputs[0].Letter + ":" + p.Outputs[len(p.Outputs)-1].Letter
			w.row(0, s.Name, label, describeInput(p.Inputs[0]), describeInput(p.Inputs[1]), results, p.OK, p.Flagged, p.Failed)
		}
	}
	w.row(0, "Rule", `Input columns are found in the header row by their headers ("Drum pressure [barg]") and paired left to right (1st with 2nd, 3rd with 4th); a column map (--map) overrides.`)
	w.skip()

	w.row(bold, "Status column")
	w.row(0, "ok", "solved; a note in brackets when an input is a formula (its stored result is used, or steamcell calculated it)")
	w.row(0, "check: ...", "solved, but look before use: near saturation the phase is uncertain; or a warning of the formulation")
	w.row(0, "anything else", "the reason the row has no values; the problem cell carries a comment")
	w.skip()

	w.row(bold, "Cautions")
	for _, c := range Cautions {
		w.row(0, c)
	}
	if w.err != nil {
		return fmt.Errorf("write the summary sheet: %w", w.err)
	}
	for col, width := range map[string]float64{"A": 30, "B": 22, "C": 40, "D": 40, "E": 16, "F": 10, "G": 10, "H": 10, "I": 10, "J": 40} {
		if err := r.f.SetColWidth(name, col, col, width); err != nil {
			return fmt.Errorf("set the widths of the summary sheet: %w", err)
		}
	}
	return nil
}

// unitList lists the units of the results written.
func (r *run) unitList() string {
	var parts []string
	for _, o := range r.outs {
		if o.unit != "" {
			parts = append(parts, displaySymbol(o.sym)+" in "+o.unit)
		}
	}
	if len(parts) == 0 {
		return "no dimensioned results"
	}
	return strings.Join(parts, ", ")
}

func describeInput(c Column) string {
	u := c.Unit
	if u == "" {
		u = "the unit set's unit"
	}
	s := fmt.Sprintf("%s %q as %s in %s", c.Letter, c.Header, displaySymbol(c.Symbol), u)
	if c.Mapped {
		s += " (from the column map)"
	}
	return s
}

// sheetWriter writes rows one under another and keeps the first error.
type sheetWriter struct {
	f     *excelize.File
	sheet string
	n     int
	err   error
}

func (w *sheetWriter) skip() { w.n++ }

func (w *sheetWriter) row(style int, vals ...any) {
	w.n++
	if w.err != nil {
		return
	}
	cell, _ := excelize.CoordinatesToCellName(1, w.n)
	if w.err = w.f.SetSheetRow(w.sheet, cell, &vals); w.err != nil {
		return
	}
	if style != 0 {
		last, _ := excelize.CoordinatesToCellName(len(vals), w.n)
		w.err = w.f.SetCellStyle(w.sheet, cell, last, style)
	}
}
