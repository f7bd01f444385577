package workbook_test

import (
	"archive/zip"
	"bytes"
	"context"
	"encoding/xml"
	"math"
	"path"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/fn/if97"
	"steamcell/fn/point"
	"steamcell/fn/units"
	"steamcell/workbook"
)

// chartDoc is what the tests read of a chart part.
type chartDoc struct {
	XMLName xml.Name `xml:"http://schemas.openxmlformats.org/drawingml/2006/chart chartSpace"`
	Scatter []struct {
		Series []chartSer `xml:"ser"`
	} `xml:"chart>plotArea>scatterChart"`
	Axes []struct {
		Pos struct {
			Val string `xml:"val,attr"`
		} `xml:"axPos"`
		Title []string `xml:"title>tx>rich>p>r>t"`
	} `xml:"chart>plotArea>valAx"`
}

// chartSer is a series as its formulas name it.
type chartSer struct {
	Name string `xml:"tx>strRef>f"`
	X    string `xml:"xVal>numRef>f"`
	Y    string `xml:"yVal>numRef>f"`
}

// chartOf follows the package from the sheet named sheet through its
// drawing to its chart, and returns the chart and the two part names.
func chartOf(t *testing.T, pkg []byte, sheet string) (doc chartDoc, drawing, chart string) {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(pkg), int64(len(pkg)))
	mustf(t, err, "read the package")
	wbRels := parseRelsOf(t, zr, "xl/_rels/workbook.xml.rels")
	m := regexp.MustCompile(`<sheet [^>]*name="` + regexp.QuoteMeta(sheet) + `"[^>]*r:id="([^"]+)"`).FindSubmatch(partBytes(t, zr, "xl/workbook.xml"))
	if m == nil {
		t.Fatalf("no sheet %q in the workbook part", sheet)
	}
	part := path.Join("xl", wbRels[string(m[1])])
	follow := func(from, kind string) string {
		for _, target := range parseRelsOf(t, zr, path.Dir(from)+"/_rels/"+path.Base(from)+".rels") {
			if p := path.Clean(path.Join(path.Dir(from), target)); strings.Contains(p, kind) {
				return p
			}
		}
		t.Fatalf("%s has no relationship to a %s", from, kind)
		return ""
	}
	drawing = follow(part, "drawings/drawing")
	chart = follow(drawing, "charts/chart")
	if err := xml.Unmarshal(partBytes(t, zr, chart), &doc); err != nil {
		t.Fatalf("chart %s is not a chart XML part: %v", chart, err)
	}
	if len(doc.Scatter) != 1 {
		t.Fatalf("chart %s has %d scatter charts, want 1", chart, len(doc.Scatter))
	}
	return doc, drawing, chart
}

// rangeRef is a reference to one column of rows: 'Sheet'!$J$5:$J$35.
type rangeRef struct {
	sheet, col  string
	first, last int
}

// refPattern reads a reference with its sheet name quoted or, as
// LibreOffice writes a name without spaces, bare.
var refPattern = regexp.MustCompile(`^(?:'((?:[^']|'')+)'|([^'!]+))!\$([A-Z]+)\$(\d+)(?::\$([A-Z]+)\$(\d+))?$`)

func parseRef(t *testing.T, f string) rangeRef {
	t.Helper()
	m := refPattern.FindStringSubmatch(f)
	if m == nil || m[5] != "" && m[5] != m[3] {
		t.Fatalf("reference %q is not one column of a sheet", f)
	}
	r := rangeRef{sheet: strings.ReplaceAll(m[1], "''", "'") + m[2], col: m[3]}
	r.first, _ = strconv.Atoi(m[4])
	r.last = r.first
	if m[6] != "" {
		r.last, _ = strconv.Atoi(m[6])
	}
	return r
}

// parseSeries reads the references of chart series.
func parseSeries(t *testing.T, ser []chartSer) [][3]rangeRef {
	t.Helper()
	out := make([][3]rangeRef, len(ser))
	for i, s := range ser {
		out[i] = [3]rangeRef{parseRef(t, s.Name), parseRef(t, s.X), parseRef(t, s.Y)}
	}
	return out
}

// column reads the numbers of a reference.
func column(t *testing.T, f *excelize.File, r rangeRef) []float64 {
	t.Helper()
	var out []float64
	for row := r.first; row <= r.last; row++ {
		s := raw(t, f, r.sheet, r.col+strconv.Itoa(row))
		if s == "" {
			continue
		}
		v, err := strconv.ParseFloat(s, 64)
		mustf(t, err, "%s!%s%d", r.sheet, r.col, row)
		out = append(out, v)
	}
	return out
}

// onDome finds the saturated state of entropy s (kJ/(kg·K)) on the
// liquid branch (s at most that of the critical point) or else the
// vapour branch, by bisection in T over fn.SaturationAtT, along which s
// rises (liquid) or falls (vapour) monotonically from 273.15 K to Tc.
func onDome(t *testing.T, s float64) (T, h float64) {
	t.Helper()
	crit, err := fn.SaturationAtT(if97.Tc)
	mustf(t, err, "saturation at Tc")
	liquid := s <= crit.Liquid.S
	side := func(sat fn.Saturation) if97.Props {
		if liquid {
			return sat.Liquid
		}
		return sat.Vapour
	}
	lo, hi := fn.TMin, if97.Tc
	for range 200 {
		mid := (lo + hi) / 2
		if mid == lo || mid == hi {
			break
		}
		sat, err := fn.SaturationAtT(mid)
		mustf(t, err, "saturation at %g K", mid)
		if (side(sat).S < s) == liquid {
			lo = mid
		} else {
			hi = mid
		}
	}
	// The end of the bracket nearer in s: hi is Tc itself for the
	// critical point, where h changes fastest with T.
	best, bestT := if97.Props{}, 0.0
	for _, T := range []float64{lo, hi} {
		sat, err := fn.SaturationAtT(T)
		mustf(t, err, "saturation at %g K", T)
		if p := side(sat); bestT == 0 || math.Abs(p.S-s) < math.Abs(best.S-s) {
			best, bestT = p, T
		}
	}
	return bestT, best.H
}

// TestChartSaturationReference ties fn.SaturationAtT, which the dome
// checks below rest on, to the saturation pressures of R7-97(2012)
// Table 35.
func TestChartSaturationReference(t *testing.T) {
	for _, tc := range []struct{ T, ps, half float64 }{
		// R7-97(2012) Table 35: T in K, ps in MPa, to 9 significant
		// digits; half a unit of the last is the tolerance.
		{300, 0.353658941e-2, 0.5e-11},
		{500, 0.263889776e1, 0.5e-8},
		{600, 0.123443146e2, 0.5e-7},
	} {
		sat, err := fn.SaturationAtT(tc.T)
		mustf(t, err, "saturation at %g K", tc.T)
		if !scalar.EqualWithinAbs(sat.P, tc.ps, tc.half) {
			t.Errorf("ps(T=%g K) = %.9g MPa, want %.9g (R7-97 Table 35)", tc.T, sat.P, tc.ps)
		}
	}
}

// demoSeries are the series of the demo's chart: each pair's s and h
// result columns (as TestDemo finds them) over the rows of its test
// points; the AVERAGE row 17 of TG-1 is not one.
var demoSeries = []struct{ name, x, y string }{
	{"Boiler 2 acceptance, Drum/Steam", "'Boiler 2 acceptance'!$J$5:$J$35", "'Boiler 2 acceptance'!$I$5:$I$35"},
	{"Boiler 2 acceptance, Feedwater", "'Boiler 2 acceptance'!$P$5:$P$35", "'Boiler 2 acceptance'!$O$5:$O$35"},
	{"TG-1 stage check, Inlet", "'TG-1 stage check'!$H$4:$H$15", "'TG-1 stage check'!$G$4:$G$15"},
	{"TG-1 stage check, Extraction", "'TG-1 stage check'!$N$4:$N$15", "'TG-1 stage check'!$M$4:$M$15"},
	{"Wet steam samples", "'Wet steam samples'!$G$2:$G$3", "'Wet steam samples'!$F$2:$F$3"},
	{"Process steam header", "'Process steam header'!$G$4:$G$9", "'Process steam header'!$F$4:$F$9"},
	{"Condensate return", "'Condensate return'!$G$5:$G$8", "'Condensate return'!$F$5:$F$8"},
}

// TestChartDemo fills the demo workbook and checks its chart: an h–s
// scatter chart on a sheet of its own, the saturation line from cells of
// that sheet, a series per pair referencing that pair's s and h columns,
// axis titles with units, and every part of the input not rewritten
// byte-identical.
func TestChartDemo(t *testing.T) {
	in := readFile(t, demoPath())
	var out bytes.Buffer
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(in), "kestrel_bay_tests.xlsx", opts(), &out)
	mustf(t, err, "fill the demo")
	if sum.Chart != "steamcell chart" {
		t.Fatalf("chart sheet %q, want %q (notes %q)", sum.Chart, "steamcell chart", sum.Notes)
	}
	var filled []string
	for _, s := range sum.Sheets {
		if s.Filled {
			filled = append(filled, s.Name)
		}
	}
	comparePackages(t, in, out.Bytes(), filled...)
	f, err := excelize.OpenReader(bytes.NewReader(out.Bytes()))
	mustf(t, err, "open the output")
	defer f.Close()
	if got := f.GetSheetList(); got[len(got)-1] != sum.Chart {
		t.Errorf("sheets %q, want the chart sheet last", got)
	}
	if want := "\nChart | Enthalpy–entropy of the filled points and the saturation line, on sheet \"steamcell chart\"\n"; !strings.Contains(summaryText(t, f, sum.SummarySheet), want) {
		t.Errorf("the summary sheet has no row %q", want)
	}

	doc, drawing, chart := chartOf(t, out.Bytes(), sum.Chart)
	zin, err := zip.NewReader(bytes.NewReader(in), int64(len(in)))
	mustf(t, err, "read the input")
	for _, p := range []string{drawing, chart} {
		for _, g := range zin.File {
			if strings.EqualFold(g.Name, p) {
				t.Errorf("the chart's part %s is a part of the input", p)
			}
		}
	}
	ser := doc.Scatter[0].Series
	if len(ser) != 1+len(demoSeries) {
		t.Fatalf("%d series, want the saturation line and %d", len(ser), len(demoSeries))
	}
	nameOf := func(ref string) string {
		r := parseRef(t, ref)
		return raw(t, f, r.sheet, r.col+strconv.Itoa(r.first))
	}
	for i, want := range demoSeries {
		got := ser[i+1]
		if n := nameOf(got.Name); n != want.name || got.X != want.x || got.Y != want.y {
			t.Errorf("series %d: %q x %s y %s, want %q x %s y %s", i+1, n, got.X, got.Y, want.name, want.x, want.y)
			continue
		}
		// The columns are the s and h results: their headers say so.
		for _, c := range []struct{ ref, unit string }{{got.X, " s [kJ/(kg·K)]"}, {got.Y, " h [kJ/kg]"}} {
			r := parseRef(t, c.ref)
			header := raw(t, f, r.sheet, r.col+strconv.Itoa(sheetHeader(t, sum, r.sheet)))
			if !strings.HasSuffix(" "+header, c.unit) {
				t.Errorf("series %d reads %s!%s, headed %q, want a column of%s", i+1, r.sheet, r.col, header, c.unit)
			}
		}
	}
	if n := nameOf(ser[0].Name); n != "saturation line" {
		t.Errorf("first series is %q, want the saturation line", n)
	}
	titles := ""
	for _, a := range doc.Axes {
		titles += a.Pos.Val + ": " + strings.Join(a.Title, "") + "; "
	}
	if want := "b: specific entropy s in kJ/(kg·K); l: specific enthalpy h in kJ/kg; "; titles != want {
		t.Errorf("axes %q, want %q", titles, want)
	}

	// The saturation line: cells of the chart sheet, every point a
	// saturated state, from the liquid at 273.15 K through the critical
	// point to the vapour at 273.15 K.
	xr, yr := parseRef(t, ser[0].X), parseRef(t, ser[0].Y)
	if xr.sheet != sum.Chart || yr.sheet != sum.Chart || xr.first != yr.first || xr.last != yr.last {
		t.Fatalf("saturation line from %s and %s, want two columns of the same rows of %q", ser[0].X, ser[0].Y, sum.Chart)
	}
	xs, hs := column(t, f, xr), column(t, f, yr)
	if len(xs) != xr.last-xr.first+1 || len(hs) != len(xs) || len(xs) < 100 {
		t.Fatalf("saturation line: %d s and %d h values in %d rows", len(xs), len(hs), xr.last-xr.first+1)
	}
	checkDomeHS(t, xs, hs)
}

// checkDomeHS checks (s, h) points in kJ/(kg·K) and kJ/kg against the
// saturation line.
func checkDomeHS(t *testing.T, xs, hs []float64) {
	t.Helper()
	cold, err := fn.SaturationAtT(fn.TMin)
	mustf(t, err, "saturation at 273.15 K")
	crit, err := fn.SaturationAtT(if97.Tc)
	mustf(t, err, "saturation at Tc")
	n := len(xs)
	for _, e := range []struct {
		what         string
		s, h, s0, h0 float64
	}{
		{"first point (liquid at 273.15 K)", xs[0], hs[0], cold.Liquid.S, cold.Liquid.H},
		{"last point (vapour at 273.15 K)", xs[n-1], hs[n-1], cold.Vapour.S, cold.Vapour.H},
	} {
		if !scalarEq(e.s, e.s0) || !scalarEq(e.h, e.h0) {
			t.Errorf("%s: (%.12g, %.12g), want (%.12g, %.12g)", e.what, e.s, e.h, e.s0, e.h0)
		}
	}
	top := false
	for i := range xs {
		if scalarEq(xs[i], crit.Liquid.S) && scalarEq(hs[i], crit.Liquid.H) {
			top = true
		}
		_, h := onDome(t, xs[i])
		if !scalar.EqualWithinAbsOrRel(hs[i], h, 1e-9, 1e-9) {
			t.Errorf("saturation line point %d: s %.12g kJ/(kg·K), h %.12g kJ/kg; the saturated state of that s has h %.12g", i, xs[i], hs[i], h)
		}
	}
	if !top {
		t.Errorf("the saturation line misses the critical point (s %.9g, h %.9g)", crit.Liquid.S, crit.Liquid.H)
	}
}

// sheetHeader is the header row of a filled sheet.
func sheetHeader(t *testing.T, sum workbook.Summary, sheet string) int {
	t.Helper()
	for _, s := range sum.Sheets {
		if s.Name == sheet {
			return s.HeaderRow
		}
	}
	t.Fatalf("no sheet %q in the summary", sheet)
	return 0
}

// TestChartTS: results with T and s but no h give a T–s chart, in the
// units of the set (here °F and Btu/(lb·°R)), whose saturation line lies
// on the saturation states; a sheet name with a quote and an ampersand is
// quoted in the references and escaped in the XML.
func TestChartTS(t *testing.T) {
	book := sheetOf(t,
		[]any{"Point", "Header pressure [barg]", "Header temperature [°C]"}, // invented Kestrel Bay readings
		[]any{"H1", 9.8, 212.0},
		[]any{"H2", 10.1, 214.5},
	)
	mustf(t, book.SetSheetName("Data", "Bay's header & mains"), "rename")
	data := save(t, book)
	o := opts()
	o.Add = []string{"t", "s"}
	us, err := units.SetByName("us")
	mustf(t, err, "unit set us")
	o.Point = point.Options{Set: us}
	var out bytes.Buffer
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(data), "header.xlsx", o, &out)
	mustf(t, err, "fill")
	doc, _, _ := chartOf(t, out.Bytes(), sum.Chart)
	ser := doc.Scatter[0].Series
	if len(ser) != 2 || ser[1].X != "'Bay''s header & mains'!$F$2:$F$3" || ser[1].Y != "'Bay''s header & mains'!$E$2:$E$3" {
		t.Fatalf("series %+v, want the saturation line and the sheet's s in F, T in E over rows 2 to 3", ser)
	}
	titles := ""
	for _, a := range doc.Axes {
		titles += a.Pos.Val + ": " + strings.Join(a.Title, "") + "; "
	}
	if want := "b: specific entropy s in Btu/(lb·°R); l: temperature t in °F; "; titles != want {
		t.Errorf("axes %q, want %q", titles, want)
	}
	f, err := excelize.OpenReader(bytes.NewReader(out.Bytes()))
	mustf(t, err, "open the output")
	defer f.Close()
	xs, ts := column(t, f, parseRef(t, ser[0].X)), column(t, f, parseRef(t, ser[0].Y))
	if len(xs) < 100 || len(xs) != len(ts) {
		t.Fatalf("saturation line: %d s and %d T values", len(xs), len(ts))
	}
	su, tu := us.Unit(units.SpecificEntropy), us.Unit(units.Temperature)
	for i := range xs {
		s := su.ToBase(xs[i], 0)
		T, _ := onDome(t, s)
		if got := tu.ToBase(ts[i], 0); !scalar.EqualWithinAbsOrRel(got, T, 1e-9, 1e-12) {
			t.Errorf("saturation line point %d: s %.12g Btu/(lb·°R) at %.12g K; the saturated state of that s is at %.12g K", i, xs[i], got, T)
		}
	}
}

// TestNoChart: without s among the results there is no chart, and the
// summary says why; nothing of a chart is written.
func TestNoChart(t *testing.T) {
	o := opts()
	o.Add = []string{"h", "v"}
	data := readFile(t, demoPath())
	var out bytes.Buffer
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(data), "kestrel_bay_tests.xlsx", o, &out)
	mustf(t, err, "fill")
	if sum.Chart != "" {
		t.Errorf("chart on %q, want none", sum.Chart)
	}
	if !strings.Contains(strings.Join(sum.Notes, "\n"), "no chart: it plots h against s, or T against s") {
		t.Errorf("notes %q, want one saying why there is no chart", sum.Notes)
	}
	zr, err := zip.NewReader(bytes.NewReader(out.Bytes()), int64(out.Len()))
	mustf(t, err, "read the output")
	for _, f := range zr.File {
		if strings.Contains(f.Name, "charts/") || strings.Contains(f.Name, "drawings/drawing") {
			t.Errorf("part %s written without a chart", f.Name)
		}
	}
	f, err := excelize.OpenReader(bytes.NewReader(out.Bytes()))
	mustf(t, err, "open the output")
	defer f.Close()
	if got := summaryText(t, f, sum.SummarySheet); !strings.Contains(got, "no chart: it plots h against s") {
		t.Errorf("the summary sheet does not say why there is no chart:\n%s", got)
	}
}

// TestChartRefill: a filled workbook filled again gets a second chart on
// a sheet of its own, referencing the new results; the first chart
// sheet is not taken for data.
func TestChartRefill(t *testing.T) {
	once, _ := fillBytes(t, readFile(t, demoPath()), "kestrel_bay_tests.xlsx", opts())
	data := save(t, once)
	var out bytes.Buffer
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(data), "kestrel_bay_tests_filled.xlsx", opts(), &out)
	mustf(t, err, "fill again")
	if sum.Chart != "steamcell chart 2" {
		t.Fatalf("second chart on %q, want %q", sum.Chart, "steamcell chart 2")
	}
	for _, s := range sum.Sheets {
		if strings.HasPrefix(s.Name, "steamcell") {
			t.Errorf("sheet %q of the first fill was taken for data", s.Name)
		}
	}
	doc, _, _ := chartOf(t, out.Bytes(), sum.Chart)
	got := doc.Scatter[0].Series[1]
	want := "'Boiler 2 acceptance'!$" + sum.Sheets[0].Pairs[0].Outputs[2].Letter + "$5:$"
	if !strings.HasPrefix(got.X, want) || got.X == demoSeries[0].x {
		t.Errorf("second chart's first series x %s, want the new s column (%s…)", got.X, want)
	}
}

// TestChartRows: a sheet of more rows than a chart series spans gets no
// series, and its note says so; with no other sheet there is no chart.
func TestChartRows(t *testing.T) {
	var in bytes.Buffer
	const rows = 32001 // one more than the chart's limit of 32,000 rows a series
	err := workbook.WriteSheetPackage(&in, "Log", func(add func(int, []any) error) error {
		if err := add(1, []any{"p [bar]", "T [°C]"}); err != nil {
			return err
		}
		for i := range rows {
			if err := add(i+2, []any{10.0, 200.0 + float64(i%100)}); err != nil { // invented superheated readings
				return err
			}
		}
		return nil
	})
	mustf(t, err, "build the workbook")
	var out bytes.Buffer
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(in.Bytes()), "log.xlsx", opts(), &out)
	mustf(t, err, "fill")
	if sum.Chart != "" {
		t.Errorf("chart on %q, want none", sum.Chart)
	}
	if note := sum.Sheets[0].Note; !strings.Contains(note, "not in the chart: 32001 rows, more than the 32000 a chart series spans") {
		t.Errorf("note of the sheet %q, want it to say why it is not in the chart", note)
	}
	if !strings.Contains(strings.Join(sum.Notes, "\n"), "no chart: no sheet has points it can show") {
		t.Errorf("notes %q, want one saying why there is no chart", sum.Notes)
	}
}

// TestChartFailedSheet: a sheet without a solved point has no series, and
// its note says so; the other sheets are charted.
func TestChartFailedSheet(t *testing.T) {
	book := sheetOf(t,
		[]any{"Point", "Drum pressure [barg]", "Steam temperature [°C]"}, // invented Kestrel Bay readings
		[]any{"K1", 41.37, 415.7},
	)
	_, err := book.NewSheet("Faulty")
	mustf(t, err, "new sheet")
	for i, r := range [][]any{{"Point", "Drum pressure [barg]", "Steam temperature [°C]"}, {"F1", 41.2, "TC fault"}} {
		cell, _ := excelize.CoordinatesToCellName(1, i+1)
		mustf(t, book.SetSheetRow("Faulty", cell, &r), "write Faulty")
	}
	var out bytes.Buffer
	sum, err := workbook.Fill(context.Background(), bytes.NewReader(save(t, book)), "two.xlsx", opts(), &out)
	mustf(t, err, "fill")
	doc, _, _ := chartOf(t, out.Bytes(), sum.Chart)
	if ser := doc.Scatter[0].Series; len(ser) != 2 || !strings.HasPrefix(ser[1].X, "'Data'!") {
		t.Errorf("series %q, want the saturation line and Data's points", ser)
	}
	if note := sum.Sheets[1].Note; sum.Sheets[1].Name != "Faulty" || !strings.Contains(note, "not in the chart: no point solved") {
		t.Errorf("sheet %q note %q, want it to say it is not in the chart", sum.Sheets[1].Name, note)
	}
}
