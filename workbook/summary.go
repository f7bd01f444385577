package workbook

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"

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

// isOwnSheet reports whether a sheet is one a fill added (its summary or
// its chart), which a later fill of every sheet leaves alone.
func isOwnSheet(name string) bool {
	l := strings.ToLower(name)
	return strings.HasPrefix(l, summaryName) || strings.HasPrefix(l, chartName)
}

// summaryXML is the summary sheet, a part of its own written here: text
// as inline strings (the shared strings stay as they were), the fill's
// own styles, and links to the flagged and failed rows.
func (r *run) summaryXML() []byte {
	w := &summaryWriter{st: r.styles}
	bold := r.styles.xf[styleTitle]
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
	w.row(0, "Aggregate rows (solved, not test points)", r.sum.Aggregate)
	if r.sum.Chart != "" {
		w.row(0, "Chart", fmt.Sprintf("%s of the filled points and the saturation line, on sheet %q", r.chart.kind.Title, r.sum.Chart))
	}
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
	r.resultsSummary(w, bold)

	w.row(bold, "Points to look at", "Status cell", "Status")
	if len(r.sum.Listed) == 0 {
		w.row(0, "none: every point is ok")
	}
	for _, l := range r.sum.Listed {
		cell := l.sheet.listedCell(l.pair, l.Row)
		style := r.styles.xf[styleCheck]
		if l.Failed {
			style = r.styles.xf[styleFailed]
		}
		w.n++
		w.cells = append(w.cells, summaryCell{row: w.n, col: 0, text: fmt.Sprintf("%s, row %d", l.Sheet, l.Row), style: 0})
		w.cells = append(w.cells, summaryCell{row: w.n, col: 1, text: l.Sheet + "!" + cell, style: r.styles.xf[styleLink], link: quoteSheet(l.Sheet) + "!" + cell})
		w.cells = append(w.cells, summaryCell{row: w.n, col: 2, text: l.Status, style: style})
	}
	if r.sum.Unlisted > 0 {
		w.row(0, fmt.Sprintf("and %d more; the status columns show every one", r.sum.Unlisted))
	}
	w.skip()

	w.row(bold, "Status column")
	w.row(r.styles.xf[styleOK], "ok", "solved; a note in brackets when an input is a formula (its stored result is used, or steamcell calculated it)")
	w.row(r.styles.xf[styleCheck], "check: ...", "solved, but look before use: near saturation the phase is uncertain; or a warning of the formulation")
	w.row(r.styles.xf[styleAggregate], "aggregate row (...)", "a row whose inputs are AVERAGE, SUM, MIN or MAX of their columns: solved, but not counted as a test point")
	w.row(r.styles.xf[styleFailed], "anything else", "the reason the row has no values; the problem cell carries a comment")
	w.skip()

	w.row(bold, "Cautions")
	for _, c := range Cautions {
		w.row(0, c)
	}
	return w.xml([]float64{34, 26, 44, 44, 16, 10, 10, 12, 12, 44})
}

// quoteSheet quotes a sheet name for a reference: 'Boiler 2'!A1.
func quoteSheet(name string) string {
	return "'" + strings.ReplaceAll(name, "'", "''") + "'"
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

// summaryWriter collects the cells of the summary sheet, row under row.
type summaryWriter struct {
	st      *styleTable
	n       int
	cells   []summaryCell
	drawing string // the r:id of the sheet's drawing; "" for none
}

type summaryCell struct {
	row, col int
	text     string
	num      float64
	isNum    bool
	style    int
	link     string // a place in the workbook ('Sheet'!F6); "" for none
}

func (w *summaryWriter) skip() { w.n++ }

// row writes vals (strings and ints) in a new row; style 0 is the
// summary's text style, which the first column of a titled row shares.
func (w *summaryWriter) row(style int, vals ...any) {
	w.n++
	for i, v := range vals {
		c := summaryCell{row: w.n, col: i, style: style}
		if style == 0 || style != w.st.xf[styleTitle] && i > 0 {
			c.style = w.st.xf[styleText]
		}
		switch v := v.(type) {
		case string:
			c.text = v
		case int:
			c.num, c.isNum = float64(v), true
		}
		w.cells = append(w.cells, c)
	}
}

func (w *summaryWriter) xml(widths []float64) []byte {
	var b bytes.Buffer
	b.WriteString(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n")
	b.WriteString(`<worksheet xmlns="` + nsMain + `" xmlns:r="` + nsRelationships + `"><cols>`)
	for i, wd := range widths {
		fmt.Fprintf(&b, `<col min="%d" max="%d" width="%.1f" customWidth="1"/>`, i+1, i+1, wd)
	}
	b.WriteString(`</cols><sheetData>`)
	row := 0
	for _, c := range w.cells {
		if c.row != row {
			if row != 0 {
				b.WriteString(`</row>`)
			}
			row = c.row
			fmt.Fprintf(&b, `<row r="%d">`, row)
		}
		ref := cellName(c.col, c.row)
		if c.isNum {
			fmt.Fprintf(&b, `<c r="%s" s="%d"><v>%s</v></c>`, ref, c.style, strconv.FormatFloat(c.num, 'g', -1, 64))
			continue
		}
		if c.text == "" {
			continue
		}
		fmt.Fprintf(&b, `<c r="%s" s="%d" t="inlineStr"><is><t xml:space="preserve">%s</t></is></c>`, ref, c.style, escapeText(c.text))
	}
	if row != 0 {
		b.WriteString(`</row>`)
	}
	b.WriteString(`</sheetData>`)
	first := true
	for _, c := range w.cells {
		if c.link == "" {
			continue
		}
		if first {
			b.WriteString(`<hyperlinks>`)
			first = false
		}
		fmt.Fprintf(&b, `<hyperlink ref="%s" location="%s" display="%s"/>`, cellName(c.col, c.row), escapeAttr(c.link), escapeAttr(c.text))
	}
	if !first {
		b.WriteString(`</hyperlinks>`)
	}
	if w.drawing != "" {
		fmt.Fprintf(&b, `<drawing r:id="%s"/>`, escapeAttr(w.drawing))
	}
	b.WriteString(`</worksheet>`)
	return b.Bytes()
}
