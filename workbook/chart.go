package workbook

import (
	"bytes"
	"fmt"
	"path"

	"steamcell/fn/diagram"
)

// The chart of the filled points is a sheet of the fill's own ("steamcell
// chart") with the saturation line as cells and a native spreadsheet
// chart (DrawingML, c:scatterChart, ECMA-376 Part 1, 21.2) whose series
// reference the result columns of the filled sheets by range: the chart
// follows edits to those cells, and the user restyles it in the
// spreadsheet program like any chart of their own. The sheet, its drawing
// and its chart are new parts under names nothing in the package has; no
// drawing of the user's sheets is read, extended or renumbered.

// chartName is the name of the chart sheet; a second fill adds
// "steamcell chart 2" and so on.
const chartName = "steamcell chart"

// chartKinds are the diagrams a chart may be, in order of preference: h–s
// when the results have h and s, else T–s. Their axes and titles come
// from the diagram catalogue.
var chartKinds = []string{"hs", "ts"}

// maxChartRows is the most rows a series of the chart spans: Excel 2007
// draws at most 32,000 points a series (from memory), and later programs
// draw far more but slowly. A sheet with more rows has no series.
const maxChartRows = 32000

// Relationship and content types of the chart parts (ECMA-376 Part 1,
// 15.2.12.1 and 15.2.7).
const (
	relDrawing = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/drawing"
	relChart   = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/chart"
	ctDrawing  = "application/vnd.openxmlformats-officedocument.drawing+xml"
	ctChart    = "application/vnd.openxmlformats-officedocument.drawingml.chart+xml"

	nsChart        = "http://schemas.openxmlformats.org/drawingml/2006/chart"
	nsDrawingML    = "http://schemas.openxmlformats.org/drawingml/2006/main"
	nsSheetDrawing = "http://schemas.openxmlformats.org/drawingml/2006/spreadsheetDrawing"
)

// chartPlan is the chart a fill adds: its kind, the result columns on its
// axes and a series per pair of input columns of each filled sheet.
type chartPlan struct {
	kind   diagram.Kind
	x, y   *output // the results on the axes
	series []chartSeries
}

// chartSeries is the points of one pair of a filled sheet.
type chartSeries struct {
	name        string // "Boiler 2 acceptance, Feedwater"
	sheet       string
	x, y        string // column letters
	first, last int    // rows
}

// ref is the reference of a column of the series' rows: 'Boiler 2'!$J$5:$J$35.
func (cs *chartSeries) ref(col string) string {
	return fmt.Sprintf("%s!$%s$%d:$%s$%d", quoteSheet(cs.sheet), col, cs.first, col, cs.last)
}

// planChart chooses the chart's kind and series. It reports false, with
// a note in the summary saying why, when there is no chart: the results
// lack the properties of every kind, or no sheet has a point to plot.
func (r *run) planChart() bool {
	c := &r.chart
	for _, name := range chartKinds {
		k, err := diagram.KindByName(name)
		if err != nil {
			panic(err) // chartKinds names kinds of the catalogue
		}
		if x, y := r.output(k.X.Symbol), r.output(k.Y.Symbol); x != nil && y != nil {
			c.kind, c.x, c.y = k, x, y
			break
		}
	}
	if c.x == nil {
		r.sum.Notes = append(r.sum.Notes, "no chart: it plots h against s, or T against s, and the results have neither pair; add them (--add h,s)")
		return false
	}
	for _, s := range r.sheets {
		for i, p := range s.ss.Pairs {
			name := s.name
			if p.Label != "" {
				name += ", " + p.Label
			}
			why := ""
			switch rows := s.lastPoint - s.firstPoint + 1; {
			case s.pairCounts[i][0]+s.pairCounts[i][1] == 0: // ok and flagged, counted to the last row calculated
				why = "not in the chart: no point solved"
			case rows > maxChartRows:
				why = fmt.Sprintf("not in the chart: %d rows, more than the %d a chart series spans", rows, maxChartRows)
			}
			if why != "" {
				if p.Label != "" {
					why = p.Label + " " + why
				}
				r.noteSheet(s.name, why)
				continue
			}
			c.series = append(c.series, chartSeries{name: name, sheet: s.name,
				x: columnOf(&s.ss.Pairs[i], c.x.sym), y: columnOf(&s.ss.Pairs[i], c.y.sym),
				first: s.firstPoint, last: s.lastPoint})
		}
	}
	if len(c.series) == 0 {
		r.sum.Notes = append(r.sum.Notes, "no chart: no sheet has points it can show; the notes of the sheets say why")
		return false
	}
	return true
}

// noteSheet adds a note to the summary of a sheet (the summary holds a
// copy of the sheet's, made after its first pass).
func (r *run) noteSheet(name, note string) {
	for i := range r.sum.Sheets {
		if r.sum.Sheets[i].Name == name {
			r.sum.Sheets[i].Note = joinNote(r.sum.Sheets[i].Note, note)
		}
	}
}

// output returns the result of property sym, or nil.
func (r *run) output(sym string) *output {
	for i := range r.outs {
		if r.outs[i].sym == sym {
			return &r.outs[i]
		}
	}
	return nil
}

// columnOf is the letter of the result column of sym of a pair.
func columnOf(p *Pair, sym string) string {
	for _, c := range p.Outputs {
		if c.Symbol == sym {
			return c.Letter
		}
	}
	panic("no result column of " + sym) // planChart chose sym from the results
}

// Where the chart stands on its sheet, 0-based rows and columns: over
// columns E to P from row 4, right of the list of series; the saturation
// line is below both.
const (
	chartAnchorTop = 3
	chartAnchorBot = 30
	chartAnchorL   = 4
	chartAnchorR   = 16
)

// putChart plans the chart sheet, its drawing and its chart as new parts
// and returns the relationship of the workbook to the sheet, its id
// unused by the workbook's rels and those added (wbAdd).
func (r *run) putChart(n *names, wbAdd []rel) rel {
	dir := path.Dir(r.pkg.wbPart)
	sheet := n.part(dir+"/worksheets/", "sheet", ".xml")
	drawing := n.part(dir+"/drawings/", "drawing", ".xml")
	chart := n.part(dir+"/charts/", "chart", ".xml")

	c := &r.chart
	w := &summaryWriter{st: r.styles, drawing: "rId1"}
	bold := r.styles.xf[styleTitle]
	w.row(bold, c.kind.Title+" chart of the filled points")
	w.row(0, "Each series reads the result columns of its sheet by reference, so the chart follows edits there. The saturation line below is from "+Formulation+", from 273.15 K up to the critical point and down again.")
	w.skip()
	w.row(bold, "Series", displaySymbol(c.x.sym)+" from", displaySymbol(c.y.sym)+" from")
	names := make([]string, len(c.series)+1) // the cells of the series' names, the saturation line first
	nameCell := func() string { return fmt.Sprintf("%s!$A$%d", quoteSheet(r.sum.Chart), w.n) }
	for i := range c.series {
		cs := &c.series[i]
		w.row(0, cs.name, cs.ref(cs.x), cs.ref(cs.y))
		names[i+1] = nameCell()
	}
	w.n = max(w.n, chartAnchorBot) + 1
	w.row(bold, "saturation line")
	names[0] = nameCell()
	nameRow := w.n
	w.row(bold, c.x.header, c.y.header)
	dome := diagram.DomeXY(c.kind, r.opt.Point)
	xs, ys := r.styles.num[c.x.code], r.styles.num[c.y.code]
	for _, xy := range dome {
		w.n++
		w.cells = append(w.cells, summaryCell{row: w.n, col: 0, num: xy[0], isNum: true, style: xs},
			summaryCell{row: w.n, col: 1, num: xy[1], isNum: true, style: ys})
	}
	domeSeries := chartSeries{sheet: r.sum.Chart, x: "A", y: "B", first: nameRow + 2, last: w.n}

	r.put(sheet, false, ctWorksheet, w.xml([]float64{40, 40, 40, 4}))
	r.put(relsPath(sheet), false, "", relsXML(rel{ID: "rId1", Type: relDrawing, Target: relTarget(sheet, drawing)}))
	r.put(drawing, false, ctDrawing, drawingXML())
	r.put(relsPath(drawing), false, "", relsXML(rel{ID: "rId1", Type: relChart, Target: relTarget(drawing, chart)}))
	r.put(chart, false, ctChart, r.chartXML(&domeSeries, names))
	return rel{ID: newRelID(r.pkg.wbRels, wbAdd), Type: relWorksheet, Target: relTarget(r.pkg.wbPart, sheet)}
}

// relsXML is a new rels part holding the one relationship.
func relsXML(rl rel) []byte {
	b, _ := addRels(nil, []rel{rl}) // a new part cannot fail
	return b
}

// drawingXML anchors the chart of the drawing's rId1 to the chart sheet.
func drawingXML() []byte {
	return []byte(fmt.Sprintf(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<xdr:wsDr xmlns:xdr="%s" xmlns:a="%s"><xdr:twoCellAnchor editAs="oneCell">`+
		`<xdr:from><xdr:col>%d</xdr:col><xdr:colOff>0</xdr:colOff><xdr:row>%d</xdr:row><xdr:rowOff>0</xdr:rowOff></xdr:from>`+
		`<xdr:to><xdr:col>%d</xdr:col><xdr:colOff>0</xdr:colOff><xdr:row>%d</xdr:row><xdr:rowOff>0</xdr:rowOff></xdr:to>`+
		`<xdr:graphicFrame macro=""><xdr:nvGraphicFramePr><xdr:cNvPr id="2" name="steamcell chart"/><xdr:cNvGraphicFramePr/></xdr:nvGraphicFramePr>`+
		`<xdr:xfrm><a:off x="0" y="0"/><a:ext cx="0" cy="0"/></xdr:xfrm>`+
		`<a:graphic><a:graphicData uri="%s"><c:chart xmlns:c="%s" xmlns:r="%s" r:id="rId1"/></a:graphicData></a:graphic>`+
		`</xdr:graphicFrame><xdr:clientData/></xdr:twoCellAnchor></xdr:wsDr>`,
		nsSheetDrawing, nsDrawingML, chartAnchorL, chartAnchorTop, chartAnchorR, chartAnchorBot, nsChart, nsChart, nsRelationships))
}

// Colours of the chart, RGB, a palette of our own: the saturation line
// in dark slate, the series in turn in hues that stay apart in print.
// Spreadsheet programs do not all vary the colours of scatter series by
// themselves.
const colorDome = "34495E"

var seriesColors = []string{"B03A2E", "1F6FB2", "2E8B57", "C77C02", "7D3C98", "138D90", "8B4513", "4D5656"}

// Axis ids of the chart: any two numbers, unique within the chart.
const axisX, axisY = 501, 502

// chartXML is the chart part: the saturation line (dome) as a line
// without markers, and each series of the plan as markers without a line,
// on value axes titled with their quantity and unit. names are the cells
// of the series' names, the saturation line's first.
func (r *run) chartXML(dome *chartSeries, names []string) []byte {
	c := &r.chart
	d := &diagram.Diagram{Kind: c.kind, Opt: r.opt.Point}
	var b bytes.Buffer
	b.WriteString(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n")
	fmt.Fprintf(&b, `<c:chartSpace xmlns:c="%s" xmlns:a="%s" xmlns:r="%s"><c:roundedCorners val="0"/><c:chart>`, nsChart, nsDrawingML, nsRelationships)
	b.WriteString(richTitle(c.kind.Title + ": filled points and saturation line"))
	b.WriteString(`<c:autoTitleDeleted val="0"/><c:plotArea><c:layout/><c:scatterChart><c:scatterStyle val="lineMarker"/><c:varyColors val="0"/>`)
	series := func(idx int, name string, cs *chartSeries, style string) {
		fmt.Fprintf(&b, `<c:ser><c:idx val="%d"/><c:order val="%d"/><c:tx><c:strRef><c:f>%s</c:f></c:strRef></c:tx>%s`, idx, idx, escapeText(name), style)
		fmt.Fprintf(&b, `<c:xVal><c:numRef><c:f>%s</c:f></c:numRef></c:xVal><c:yVal><c:numRef><c:f>%s</c:f></c:numRef></c:yVal><c:smooth val="0"/></c:ser>`,
			escapeText(cs.ref(cs.x)), escapeText(cs.ref(cs.y)))
	}
	series(0, names[0], dome, `<c:spPr><a:ln w="19050"><a:solidFill><a:srgbClr val="`+colorDome+`"/></a:solidFill></a:ln></c:spPr><c:marker><c:symbol val="none"/></c:marker>`)
	for i := range c.series {
		fill := `<a:solidFill><a:srgbClr val="` + seriesColors[i%len(seriesColors)] + `"/></a:solidFill>`
		series(i+1, names[i+1], &c.series[i], `<c:spPr><a:ln w="19050"><a:noFill/></a:ln></c:spPr><c:marker><c:symbol val="circle"/><c:size val="6"/><c:spPr>`+fill+`<a:ln>`+fill+`</a:ln></c:spPr></c:marker>`)
	}
	fmt.Fprintf(&b, `<c:axId val="%d"/><c:axId val="%d"/></c:scatterChart>`, axisX, axisY)
	b.WriteString(valueAxis(axisX, axisY, "b", d.AxisLabel(c.kind.X)))
	b.WriteString(valueAxis(axisY, axisX, "l", d.AxisLabel(c.kind.Y)))
	b.WriteString(`</c:plotArea><c:legend><c:legendPos val="b"/><c:overlay val="0"/></c:legend><c:plotVisOnly val="1"/><c:dispBlanksAs val="gap"/></c:chart></c:chartSpace>`)
	return b.Bytes()
}

// richTitle is a chart or axis title of plain text.
func richTitle(text string) string {
	return `<c:title><c:tx><c:rich><a:bodyPr/><a:lstStyle/><a:p><a:r><a:t>` + escapeText(text) + `</a:t></a:r></a:p></c:rich></c:tx><c:overlay val="0"/></c:title>`
}

// valueAxis is a value axis at pos ("b", "l") crossing the axis cross,
// with its labels at the low end so that they stay outside the plot.
func valueAxis(id, cross int, pos, title string) string {
	return fmt.Sprintf(`<c:valAx><c:axId val="%d"/><c:scaling><c:orientation val="minMax"/></c:scaling><c:delete val="0"/><c:axPos val="%s"/><c:majorGridlines/>%s`+
		`<c:numFmt formatCode="General" sourceLinked="0"/><c:majorTickMark val="out"/><c:minorTickMark val="none"/><c:tickLblPos val="low"/>`+
		`<c:crossAx val="%d"/><c:crosses val="autoZero"/><c:crossBetween val="midCat"/></c:valAx>`, id, pos, richTitle(title), cross)
}
