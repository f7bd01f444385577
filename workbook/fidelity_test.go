package workbook_test

import (
	"archive/zip"
	"bytes"
	"context"
	"encoding/xml"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"io"
	"os"
	"os/exec"
	"path"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"steamcell/fn"
	"steamcell/fn/units"
	"steamcell/workbook"
)

// The fidelity corpus: workbooks built here, with excelize and with
// package parts written by hand where excelize cannot make them, each
// holding features a fill must keep. Every case is filled; then
//
//   - every part of the input that the writer does not own comes out
//     byte-identical (its compressed bytes, its checksum);
//   - every part it rewrites keeps every element and attribute of the
//     input, compared as XML trees (the input tree must embed in the
//     output tree, in order; only the attributes listed in mayChange may
//     take new values);
//   - LibreOffice Calc, run headless, converts every output, and the
//     results read back from its conversion.
//
// Each case names the defect of issue 12 it guards against.

// corpusCase is one workbook of the corpus.
type corpusCase struct {
	name  string // file name
	why   string
	build func(t *testing.T) []byte
	check func(t *testing.T, in, out []byte) // more checks; may be nil
}

// corpusReadings are the test points of every case: a good point, a
// reading that is no number (so the fill adds a note) and another good
// point. Invented demo values.
var corpusReadings = [][]any{
	{"Point", "Drum pressure [barg]", "Steam temperature [°C]"},
	{"K1", 41.37, 415.7},
	{"K2", 41.28, "broken"},
	{"K3", 12.5, 260.0},
}

// readingsSheet writes corpusReadings to a sheet from A1.
func readingsSheet(t *testing.T, f *excelize.File, sheet string) {
	t.Helper()
	for i, r := range corpusReadings {
		cell, _ := excelize.CoordinatesToCellName(1, i+1)
		mustf(t, f.SetSheetRow(sheet, cell, &r), "write %s", sheet)
	}
}

func corpus() []corpusCase {
	return []corpusCase{
		{name: "form-control.xlsx", why: "a button on an earlier sheet, no notes on the test sheet: both sheets ended up on one drawing, the button on the test sheet",
			build: buildFormControl, check: checkOwnDrawings},
		{name: "excel-notes.xlsx", why: "comments1.xml paired with vmlDrawing2.vml, and threaded comments: new notes went to a part no sheet references",
			build: buildExcelNotes, check: checkNotes},
		{name: "libreoffice-notes.xlsx", why: `a note whose VML shape is "shape_0": strconv.Atoi failed, exit 1, 500`,
			build: buildLibreOfficeNotes, check: checkNotes},
		{name: "protection-views.xlsx", why: "default sheet protection, a custom view without gridlines, fileSharing and oleSize: all were dropped or reset",
			build: buildProtectionViews},
		{name: "rich.xlsm", why: "charts, images, tables, pivots, conditional formats, validation, sparklines, external links and VBA",
			build: buildRich},
		{name: "layout.xlsx", why: "pre-formatted and hidden columns right of the data: results showed as dates and percentages, or were hidden",
			build: buildLayout, check: checkLayout},
	}
}

// TestFidelityCorpus runs the corpus; see the comment at the top.
func TestFidelityCorpus(t *testing.T) {
	soffice, err := exec.LookPath("soffice")
	if err != nil {
		t.Fatalf("LibreOffice (soffice) is needed to check that an office program opens the output: %v; install it (apt-get install -y libreoffice-calc-nogui, as .ci/run does)", err)
	}
	dir := t.TempDir()
	var outs []string
	cases := corpus()
	charts := map[string][]chartSer{} // the series of each output's chart, by case
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			in := c.build(t)
			var out bytes.Buffer
			sum, err := workbook.Fill(context.Background(), bytes.NewReader(in), c.name, opts(), &out)
			if err != nil {
				t.Fatalf("fill (%s): %v", c.why, err)
			}
			comparePackages(t, in, out.Bytes(), "Readings")
			charts[c.name] = checkChartParts(t, in, out.Bytes(), sum)
			if c.check != nil {
				c.check(t, in, out.Bytes())
			}
			p := filepath.Join(dir, c.name)
			mustf(t, os.WriteFile(p, out.Bytes(), 0o644), "write %s", p)
			outs = append(outs, p)
		})
	}
	// One LibreOffice run converts every output, with a profile of its
	// own so that parallel runs do not collide.
	conv := filepath.Join(dir, "converted")
	profile := "file://" + filepath.Join(dir, "lo-profile")
	args := append([]string{"-env:UserInstallation=" + profile, "--headless", "--norestore", "--convert-to", "xlsx", "--outdir", conv}, outs...)
	cmd := exec.Command(soffice, args...)
	cmd.Env = append(os.Environ(), "HOME="+dir)
	msg, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("soffice: %v\n%s", err, msg)
	}
	for _, c := range cases {
		t.Run("libreoffice/"+c.name, func(t *testing.T) {
			base := strings.TrimSuffix(c.name, filepath.Ext(c.name)) + ".xlsx"
			f, err := excelize.OpenFile(filepath.Join(conv, base))
			if err != nil {
				t.Fatalf("LibreOffice did not convert %s: %v\n%s", c.name, err, msg)
			}
			defer f.Close()
			checkReadBack(t, f)
			converted, err := os.ReadFile(filepath.Join(conv, base))
			mustf(t, err, "read the conversion")
			doc, _, _ := chartOf(t, converted, "steamcell chart")
			if got, want := doc.Scatter[0].Series, charts[c.name]; !slices.Equal(parseSeries(t, got), parseSeries(t, want)) {
				t.Errorf("LibreOffice's chart has the series %q, want %q", got, want)
			}
		})
	}
}

// checkChartParts checks the chart of a filled corpus workbook: its
// drawing and chart are parts the input does not have, only the chart
// sheet uses that drawing, no sheet of the input has a drawing it did not
// have, and the series of the readings are their s and h columns. It
// returns the chart's series.
func checkChartParts(t *testing.T, in, out []byte, sum workbook.Summary) []chartSer {
	t.Helper()
	if sum.Chart == "" {
		t.Fatalf("no chart (notes %q)", sum.Notes)
	}
	doc, drawing, chartPart := chartOf(t, out, sum.Chart)
	zin, err := zip.NewReader(bytes.NewReader(in), int64(len(in)))
	mustf(t, err, "read the input")
	zout, err := zip.NewReader(bytes.NewReader(out), int64(len(out)))
	mustf(t, err, "read the output")
	drawingsOf := func(zr *zip.Reader) map[string][]string { // drawing part → the rels parts that use it
		users := map[string][]string{}
		for _, f := range zr.File {
			if !strings.HasPrefix(f.Name, "xl/worksheets/_rels/") {
				continue
			}
			for _, target := range parseRelsOf(t, zr, f.Name) {
				if p := path.Clean(path.Join("xl/worksheets", target)); strings.HasPrefix(p, "xl/drawings/drawing") {
					users[p] = append(users[p], f.Name)
				}
			}
		}
		return users
	}
	before, after := drawingsOf(zin), drawingsOf(zout)
	for _, f := range zin.File {
		if strings.EqualFold(f.Name, drawing) || strings.EqualFold(f.Name, chartPart) {
			t.Errorf("the chart's part %s is a part of the input", f.Name)
		}
	}
	if u := after[drawing]; len(u) != 1 {
		t.Errorf("the chart's drawing %s is used by %q, want the chart sheet alone", drawing, u)
	}
	for p, u := range after {
		if p != drawing && !slices.Equal(u, before[p]) {
			t.Errorf("drawing %s is used by %q, in the input by %q", p, u, before[p])
		}
	}
	letter := map[string]string{}
	for _, sh := range sum.Sheets {
		if sh.Name == "Readings" && sh.Filled {
			for _, c := range sh.Pairs[0].Outputs {
				letter[c.Symbol] = c.Letter
			}
		}
	}
	ser := doc.Scatter[0].Series
	x, y := "'Readings'!$"+letter["s"]+"$2:$"+letter["s"]+"$4", "'Readings'!$"+letter["h"]+"$2:$"+letter["h"]+"$4"
	if len(ser) != 2 || ser[1].X != x || ser[1].Y != y {
		t.Errorf("chart series %q, want the saturation line and Readings x %s, y %s", ser, x, y)
	}
	return ser
}

// checkReadBack finds the results on the readings sheet of a workbook
// LibreOffice wrote and checks them against the engine.
func checkReadBack(t *testing.T, f *excelize.File) {
	t.Helper()
	rows, err := f.GetRows("Readings", excelize.Options{RawCellValue: true})
	if err != nil || len(rows) < 4 {
		t.Fatalf("Readings: %v (%d rows)", err, len(rows))
	}
	status, hcol := -1, -1
	for i, h := range rows[0] {
		switch h {
		case "Status (steamcell)":
			status = i
		case "h [kJ/kg]":
			hcol = i
		}
	}
	if status < 0 || hcol < 0 {
		t.Fatalf("no result headers in row 1: %q", rows[0])
	}
	cell := func(r, c int) string {
		if c < len(rows[r]) {
			return rows[r][c]
		}
		return ""
	}
	if got := cell(1, status); got != "ok" {
		t.Errorf("status of row 2 = %q, want ok", got)
	}
	if got := cell(2, status); got != "not a number in C3" {
		t.Errorf("status of row 3 = %q, want %q", got, "not a number in C3")
	}
	st := expect(t, [2]string{"41.37", "415.7"}, [2]in{{"B", fn.Pressure, "barg"}, {"C", fn.Temperature, "°C"}}, units.Set{})
	got, err := strconv.ParseFloat(cell(1, hcol), 64)
	if err != nil || !scalarEq(got, st.H) {
		t.Errorf("h of row 2 as LibreOffice read it = %q, want %.17g", cell(1, hcol), st.H)
	}
	if idx, _ := f.GetSheetIndex("steamcell summary"); idx < 0 {
		t.Errorf("LibreOffice sees no summary sheet; sheets %q", f.GetSheetList())
	}
}

// mayChange are the attributes a rewritten part may give a new value:
// counts of lists the writer appends to, the used range, row spans, and
// the bounds of a column range cut around the result columns.
var mayChange = map[string]bool{"count": true, "dimension.ref": true, "row.spans": true, "col.min": true, "col.max": true}

// ownedParts are the parts a fill may rewrite: the package's content
// types, the workbook part and its rels, the styles, and for each filled
// sheet (named in filled) its part, its rels and its note parts.
func ownedParts(t *testing.T, out *zip.Reader, filled []string) map[string]bool {
	t.Helper()
	owned := map[string]bool{"[Content_Types].xml": true, "xl/workbook.xml": true, "xl/_rels/workbook.xml.rels": true, "xl/styles.xml": true}
	f, err := excelize.OpenReader(readerOf(out))
	mustf(t, err, "open the output")
	defer f.Close()
	rels := parseRelsOf(t, out, "xl/_rels/workbook.xml.rels")
	wb := partBytes(t, out, "xl/workbook.xml")
	for _, m := range regexp.MustCompile(`<sheet [^>]*name="([^"]+)"[^>]*r:id="([^"]+)"`).FindAllSubmatch(wb, -1) {
		if !slices.Contains(filled, string(m[1])) {
			continue
		}
		part := path.Join("xl", rels[string(m[2])])
		owned[part] = true
		rp := path.Dir(part) + "/_rels/" + path.Base(part) + ".rels"
		owned[rp] = true
		for _, target := range parseRelsOf(t, out, rp) {
			if strings.Contains(target, "comments") || strings.HasSuffix(target, ".vml") {
				owned[path.Clean(path.Join(path.Dir(part), target))] = true
			}
		}
	}
	return owned
}

func readerOf(zr *zip.Reader) io.Reader {
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	for _, f := range zr.File {
		zw.Copy(f)
	}
	zw.Close()
	return &b
}

func parseRelsOf(t *testing.T, zr *zip.Reader, name string) map[string]string {
	t.Helper()
	out := map[string]string{}
	b := partBytes(t, zr, name)
	for _, m := range regexp.MustCompile(`<Relationship [^>]*Id="([^"]+)"[^>]*Target="([^"]+)"`).FindAllSubmatch(b, -1) {
		out[string(m[1])] = string(m[2])
	}
	return out
}

func partBytes(t *testing.T, zr *zip.Reader, name string) []byte {
	t.Helper()
	for _, f := range zr.File {
		if f.Name == name {
			rc, err := f.Open()
			mustf(t, err, "open %s", name)
			defer rc.Close()
			b, err := io.ReadAll(rc)
			mustf(t, err, "read %s", name)
			return b
		}
	}
	return nil
}

// comparePackages checks the parts of in against out, of which the
// sheets filled are named: see the comment at the top.
func comparePackages(t *testing.T, in, out []byte, filled ...string) {
	t.Helper()
	zin, err := zip.NewReader(bytes.NewReader(in), int64(len(in)))
	mustf(t, err, "read the input package")
	zout, err := zip.NewReader(bytes.NewReader(out), int64(len(out)))
	mustf(t, err, "read the output package")
	owned := ownedParts(t, zout, filled)
	byName := map[string]*zip.File{}
	for _, f := range zout.File {
		byName[f.Name] = f
	}
	for _, f := range zin.File {
		g := byName[f.Name]
		if g == nil {
			t.Errorf("part %s is missing from the output", f.Name)
			continue
		}
		if owned[f.Name] {
			a, b := partBytes(t, zin, f.Name), partBytes(t, zout, f.Name)
			ta, err1 := parseTree(a)
			tb, err2 := parseTree(b)
			if err1 != nil || err2 != nil {
				t.Errorf("part %s: not XML: %v, %v", f.Name, err1, err2)
				continue
			}
			if err := embeds(ta, tb, "/"+ta.name.Local); err != nil {
				t.Errorf("rewritten part %s lost something of the input: %v", f.Name, err)
			}
			continue
		}
		if f.CRC32 != g.CRC32 || f.CompressedSize64 != g.CompressedSize64 || !bytes.Equal(rawBytes(t, f), rawBytes(t, g)) {
			t.Errorf("part %s is not byte-identical (the writer does not own it)", f.Name)
		}
	}
}

func rawBytes(t *testing.T, f *zip.File) []byte {
	t.Helper()
	r, err := f.OpenRaw()
	mustf(t, err, "open %s raw", f.Name)
	b, err := io.ReadAll(r)
	mustf(t, err, "read %s raw", f.Name)
	return b
}

// xnode is an element of an XML tree.
type xnode struct {
	name  xml.Name
	attrs []xml.Attr
	kids  []*xnode
	text  string
}

func parseTree(b []byte) (*xnode, error) {
	d := xml.NewDecoder(bytes.NewReader(b))
	var stack []*xnode
	var root *xnode
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return root, nil
		}
		if err != nil {
			return nil, err
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			n := &xnode{name: tok.Name, attrs: append([]xml.Attr(nil), tok.Attr...)}
			if len(stack) > 0 {
				p := stack[len(stack)-1]
				p.kids = append(p.kids, n)
			} else {
				root = n
			}
			stack = append(stack, n)
		case xml.EndElement:
			stack = stack[:len(stack)-1]
		case xml.CharData:
			if len(stack) > 0 {
				stack[len(stack)-1].text += strings.TrimSpace(string(tok))
			}
		}
	}
}

// embeds reports where a's tree is not found in b's: same names, every
// attribute of a in b with the same value (or one of mayChange), the same
// text, and a's children in b's in order.
func embeds(a, b *xnode, where string) error {
	if a.name != b.name {
		return fmt.Errorf("%s: element %s, want %s", where, b.name.Local, a.name.Local)
	}
	for _, at := range a.attrs {
		found := false
		for _, bt := range b.attrs {
			if bt.Name == at.Name {
				found = true
				if bt.Value != at.Value && !mayChange[at.Name.Local] && !mayChange[a.name.Local+"."+at.Name.Local] {
					return fmt.Errorf("%s: attribute %s = %q, want %q", where, at.Name.Local, bt.Value, at.Value)
				}
			}
		}
		if !found {
			return fmt.Errorf("%s: attribute %s=%q is gone", where, at.Name.Local, at.Value)
		}
	}
	if a.text != b.text {
		return fmt.Errorf("%s: text %q, want %q", where, b.text, a.text)
	}
	j := 0
	for i, k := range a.kids {
		var last error
		for ; j < len(b.kids); j++ {
			if last = embeds(k, b.kids[j], fmt.Sprintf("%s/%s[%d]", where, k.name.Local, i)); last == nil {
				break
			}
		}
		if j == len(b.kids) {
			if last == nil {
				last = fmt.Errorf("%s: element %s is gone", where, k.name.Local)
			}
			return last
		}
		j++
	}
	return nil
}

// patchPackage rewrites the parts of a package: edit gets every part by
// name and may change, add or delete parts; the order of the parts is
// kept, new parts go last.
func patchPackage(t *testing.T, data []byte, edit func(parts map[string][]byte)) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	mustf(t, err, "read the package")
	parts := map[string][]byte{}
	var order []string
	for _, f := range zr.File {
		parts[f.Name] = partBytes(t, zr, f.Name)
		order = append(order, f.Name)
	}
	edit(parts)
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	seen := map[string]bool{}
	write := func(name string) {
		w, err := zw.Create(name)
		mustf(t, err, "create %s", name)
		_, err = w.Write(parts[name])
		mustf(t, err, "write %s", name)
		seen[name] = true
	}
	for _, name := range order {
		if _, ok := parts[name]; ok {
			write(name)
		}
	}
	var added []string
	for name := range parts {
		if !seen[name] {
			added = append(added, name)
		}
	}
	sort.Strings(added)
	for _, name := range added {
		write(name)
	}
	mustf(t, zw.Close(), "close the package")
	return b.Bytes()
}

// replaceOnce replaces old by new in s and fails the test when old is not
// there, so that a patch cannot silently do nothing.
func replaceOnce(t *testing.T, s []byte, old, new string) []byte {
	t.Helper()
	if !bytes.Contains(s, []byte(old)) {
		t.Fatalf("patch: %q not found in %.300s", old, s)
	}
	return bytes.Replace(s, []byte(old), []byte(new), 1)
}

// sheetPart is the part of a sheet in a package built by excelize.
func sheetPart(t *testing.T, f *excelize.File, sheet string) string {
	t.Helper()
	idx, err := f.GetSheetIndex(sheet)
	mustf(t, err, "index of %s", sheet)
	return "xl/worksheets/sheet" + strconv.Itoa(idx+1) + ".xml"
}

func buildFormControl(t *testing.T) []byte {
	f := excelize.NewFile()
	defer f.Close()
	mustf(t, f.SetSheetName("Sheet1", "Panel"), "rename")
	mustf(t, f.SetCellValue("Panel", "A1", "Kestrel Bay boiler 2 panel (invented)"), "title")
	mustf(t, f.AddFormControl("Panel", excelize.FormControl{Cell: "B3", Type: excelize.FormControlButton, Text: "Recalculate", Macro: "Recalc"}), "button")
	_, err := f.NewSheet("Readings")
	mustf(t, err, "new sheet")
	readingsSheet(t, f, "Readings")
	return save(t, f)
}

// checkOwnDrawings: no drawing part is the target of two sheets, and the
// button stays on its own sheet's drawing only.
func checkOwnDrawings(t *testing.T, _, out []byte) {
	zr, err := zip.NewReader(bytes.NewReader(out), int64(len(out)))
	mustf(t, err, "read the output")
	users := map[string][]string{}
	for _, f := range zr.File {
		if !strings.HasPrefix(f.Name, "xl/worksheets/_rels/") {
			continue
		}
		for _, target := range parseRelsOf(t, zr, f.Name) {
			if strings.HasSuffix(target, ".vml") || strings.Contains(target, "drawing") || strings.Contains(target, "comments") {
				p := path.Clean(path.Join("xl/worksheets", target))
				users[p] = append(users[p], f.Name)
			}
		}
	}
	for p, u := range users {
		if len(u) > 1 {
			t.Errorf("%s is shared by %q", p, u)
		}
		if strings.Contains(string(partBytes(t, zr, p)), "Recalculate") && strings.Contains(strings.Join(u, ""), "sheet2") {
			t.Errorf("the button's drawing %s belongs to the readings sheet", p)
		}
	}
}

func buildExcelNotes(t *testing.T) []byte {
	f := excelize.NewFile()
	defer f.Close()
	mustf(t, f.SetSheetName("Sheet1", "Readings"), "rename")
	readingsSheet(t, f, "Readings")
	mustf(t, f.AddComment("Readings", excelize.Comment{Author: "Shift lead", Cell: "A2", Text: "Reading after the soot blow."}), "comment")
	data := save(t, f)
	// Number the parts the way Excel often does: comments1.xml with
	// vmlDrawing2.vml; and add a threaded comment on A2 with its person.
	return patchPackage(t, data, func(p map[string][]byte) {
		rels := "xl/worksheets/_rels/sheet1.xml.rels"
		var vml string
		for name := range p {
			if strings.HasSuffix(name, ".vml") {
				vml = name
			}
		}
		p["xl/drawings/vmlDrawing2.vml"] = p[vml]
		delete(p, vml)
		p[rels] = replaceOnce(t, p[rels], path.Base(vml), "vmlDrawing2.vml")
		if _, ok := p["xl/comments1.xml"]; !ok {
			for name := range p {
				if strings.HasPrefix(name, "xl/comments") {
					p["xl/comments1.xml"] = p[name]
					delete(p, name)
					p[rels] = replaceOnce(t, p[rels], path.Base(name), "comments1.xml")
					p["[Content_Types].xml"] = replaceOnce(t, p["[Content_Types].xml"], "/"+name, "/xl/comments1.xml")
				}
			}
		}
		p["xl/threadedComments/threadedComment1.xml"] = []byte(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<ThreadedComments xmlns="http://schemas.microsoft.com/office/spreadsheetml/2018/threadedcomments" xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><threadedComment ref="A2" dT="2031-03-14T09:00:00.00" personId="{6A1B3C5D-0000-4000-8000-00000000A001}" id="{6A1B3C5D-0000-4000-8000-00000000C001}"><text>Reading after the soot blow.</text></threadedComment></ThreadedComments>`)
		p["xl/persons/person.xml"] = []byte(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<personList xmlns="http://schemas.microsoft.com/office/spreadsheetml/2018/threadedcomments" xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><person displayName="Shift lead" id="{6A1B3C5D-0000-4000-8000-00000000A001}" userId="shift.lead" providerId="None"/></personList>`)
		p[rels] = replaceOnce(t, p[rels], "</Relationships>", `<Relationship Id="rIdT1" Type="http://schemas.microsoft.com/office/2017/10/relationships/threadedComment" Target="../threadedComments/threadedComment1.xml"/></Relationships>`)
		p["xl/_rels/workbook.xml.rels"] = replaceOnce(t, p["xl/_rels/workbook.xml.rels"], "</Relationships>", `<Relationship Id="rIdP1" Type="http://schemas.microsoft.com/office/2017/10/relationships/person" Target="persons/person.xml"/></Relationships>`)
		p["[Content_Types].xml"] = replaceOnce(t, p["[Content_Types].xml"], "</Types>", `<Override PartName="/xl/threadedComments/threadedComment1.xml" ContentType="application/vnd.ms-excel.threadedcomments+xml"/><Override PartName="/xl/persons/person.xml" ContentType="application/vnd.ms-excel.person+xml"/></Types>`)
	})
}

func buildLibreOfficeNotes(t *testing.T) []byte {
	f := excelize.NewFile()
	defer f.Close()
	mustf(t, f.SetSheetName("Sheet1", "Readings"), "rename")
	readingsSheet(t, f, "Readings")
	mustf(t, f.AddComment("Readings", excelize.Comment{Author: "Shift lead", Cell: "A2", Text: "Reading after the soot blow."}), "comment")
	// LibreOffice names its note shapes shape_0, shape_1, ...
	return patchPackage(t, save(t, f), func(p map[string][]byte) {
		for name, b := range p {
			if strings.HasSuffix(name, ".vml") {
				p[name] = regexp.MustCompile(`id="_x0000_s\d+"`).ReplaceAll(b, []byte(`id="shape_0"`))
				if bytes.Equal(p[name], b) {
					t.Fatalf("no numbered shape in %s", name)
				}
			}
		}
	})
}

// checkNotes: the input's note is kept, the new note is on the cell that
// is no number, and both are in the comments part the sheet references.
func checkNotes(t *testing.T, _, out []byte) {
	f, err := excelize.OpenReader(bytes.NewReader(out))
	mustf(t, err, "open the output")
	defer f.Close()
	if got := commentOn(t, f, "Readings", "A2"); got != "Reading after the soot blow." {
		t.Errorf("the input's note on A2 = %q", got)
	}
	if got := commentOn(t, f, "Readings", "C3"); !strings.Contains(got, `C3 holds "broken", not a number`) {
		t.Errorf("the new note on C3 = %q", got)
	}
	zr, _ := zip.NewReader(bytes.NewReader(out), int64(len(out)))
	for _, target := range parseRelsOf(t, zr, "xl/worksheets/_rels/sheet1.xml.rels") {
		if strings.Contains(target, "comments") {
			if b := partBytes(t, zr, path.Clean(path.Join("xl/worksheets", target))); !bytes.Contains(b, []byte("C3 holds")) {
				t.Errorf("the comments part the sheet references, %s, lacks the new note", target)
			}
		}
	}
}

func buildProtectionViews(t *testing.T) []byte {
	f := excelize.NewFile()
	defer f.Close()
	mustf(t, f.SetSheetName("Sheet1", "Readings"), "rename")
	readingsSheet(t, f, "Readings")
	data := save(t, f)
	return patchPackage(t, data, func(p map[string][]byte) {
		sh := "xl/worksheets/sheet1.xml"
		// Excel's default protection: the sheet, objects and scenarios;
		// and a custom view that hides the gridlines.
		p[sh] = replaceOnce(t, p[sh], "</sheetData>", `</sheetData><sheetProtection sheet="1" objects="1" scenarios="1"/><customSheetViews><customSheetView guid="{0B7E4F2A-3C1D-4E5F-8A9B-0C1D2E3F4A5B}" showGridLines="0"><selection activeCell="B2" sqref="B2"/><pageMargins left="0.7" right="0.7" top="0.75" bottom="0.75" header="0.3" footer="0.3"/></customSheetView></customSheetViews>`)
		wb := "xl/workbook.xml"
		p[wb] = regexp.MustCompile(`(<workbook [^>]*>)`).ReplaceAll(p[wb], []byte(`$1<fileSharing readOnlyRecommended="1"/>`))
		if !bytes.Contains(p[wb], []byte("fileSharing")) {
			t.Fatal("no fileSharing added")
		}
		p[wb] = replaceOnce(t, p[wb], "</workbook>", `<oleSize ref="A1:H20"/><customWorkbookViews><customWorkbookView name="Check view" guid="{0B7E4F2A-3C1D-4E5F-8A9B-0C1D2E3F4A5B}" windowWidth="1200" windowHeight="800" activeSheetId="1" showFormulaBar="0"/></customWorkbookViews></workbook>`)
	})
}

// pngBytes is a small image for the picture of the rich case.
func pngBytes(t *testing.T) []byte {
	img := image.NewRGBA(image.Rect(0, 0, 8, 8))
	for i := range 8 {
		img.Set(i, i, color.RGBA{R: 30, G: 90, B: 160, A: 255})
	}
	var b bytes.Buffer
	mustf(t, png.Encode(&b, img), "encode png")
	return b.Bytes()
}

func buildRich(t *testing.T) []byte {
	f := excelize.NewFile()
	defer f.Close()
	mustf(t, f.SetSheetName("Sheet1", "Readings"), "rename")
	readingsSheet(t, f, "Readings")
	mustf(t, f.AddTable("Readings", &excelize.Table{Range: "A1:C4", Name: "Readings1"}), "table")
	red, err := f.NewConditionalStyle(&excelize.Style{Font: &excelize.Font{Color: "9A0511"}})
	mustf(t, err, "conditional style")
	mustf(t, f.SetConditionalFormat("Readings", "B2:B4", []excelize.ConditionalFormatOptions{{Type: "cell", Criteria: ">", Format: &red, Value: "40"}}), "conditional format")
	dv := excelize.NewDataValidation(true)
	dv.SetSqref("B2:B100")
	mustf(t, dv.SetRange(0, 200, excelize.DataValidationTypeDecimal, excelize.DataValidationOperatorBetween), "validation range")
	mustf(t, f.AddDataValidation("Readings", dv), "validation")
	mustf(t, f.AddSparkline("Readings", &excelize.SparklineOptions{Location: []string{"D6"}, Range: []string{"Readings!B2:B4"}}), "sparkline")
	mustf(t, f.AddChart("Readings", "E8", &excelize.Chart{Type: excelize.Line, Series: []excelize.ChartSeries{{Name: "Readings!$B$1", Categories: "Readings!$A$2:$A$4", Values: "Readings!$B$2:$B$4"}}}), "chart")
	mustf(t, f.AddPictureFromBytes("Readings", "H2", &excelize.Picture{Extension: ".png", File: pngBytes(t)}), "picture")
	_, err = f.NewSheet("Pivot")
	mustf(t, err, "pivot sheet")
	mustf(t, f.AddPivotTable(&excelize.PivotTableOptions{DataRange: "Readings!A1:C4", PivotTableRange: "Pivot!A1:C6",
		Rows: []excelize.PivotTableField{{Data: "Point"}}, Data: []excelize.PivotTableField{{Data: "Drum pressure [barg]", Subtotal: "Sum"}}}), "pivot")
	// The sheet ends with an external link to another workbook's cell,
	// and the workbook carries a VBA project: parts excelize does not
	// write.
	mustf(t, f.SetCellFormula("Readings", "A6", "[1]Log!A1"), "external formula")
	data := save(t, f)
	return patchPackage(t, data, func(p map[string][]byte) {
		p["xl/externalLinks/externalLink1.xml"] = []byte(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<externalLink xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><externalBook r:id="rId1"><sheetNames><sheetName val="Log"/></sheetNames><sheetDataSet><sheetData sheetId="0"><row r="1"><cell r="A1" t="str"><v>shift log</v></cell></row></sheetData></sheetDataSet></externalBook></externalLink>`)
		p["xl/externalLinks/_rels/externalLink1.xml.rels"] = []byte(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/externalLinkPath" Target="shift_log.xlsx" TargetMode="External"/></Relationships>`)
		// A stand-in VBA project: an OLE header and nothing runnable.
		p["xl/vbaProject.bin"] = append([]byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}, make([]byte, 504)...)
		p["xl/_rels/workbook.xml.rels"] = replaceOnce(t, p["xl/_rels/workbook.xml.rels"], "</Relationships>",
			`<Relationship Id="rIdX1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/externalLink" Target="externalLinks/externalLink1.xml"/><Relationship Id="rIdV1" Type="http://schemas.microsoft.com/office/2006/relationships/vbaProject" Target="vbaProject.bin"/></Relationships>`)
		wb := "xl/workbook.xml"
		p[wb] = replaceOnce(t, p[wb], "</sheets>", `</sheets><externalReferences><externalReference r:id="rIdX1"/></externalReferences>`)
		ct := "[Content_Types].xml"
		p[ct] = replaceOnce(t, p[ct], "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml", "application/vnd.ms-excel.sheet.macroEnabled.main+xml")
		p[ct] = replaceOnce(t, p[ct], "</Types>", `<Default Extension="bin" ContentType="application/vnd.ms-office.vbaProject"/><Override PartName="/xl/externalLinks/externalLink1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.externalLink+xml"/></Types>`)
	})
}

func buildLayout(t *testing.T) []byte {
	f := excelize.NewFile()
	defer f.Close()
	mustf(t, f.SetSheetName("Sheet1", "Readings"), "rename")
	readingsSheet(t, f, "Readings")
	date, err := f.NewStyle(&excelize.Style{NumFmt: 14})
	mustf(t, err, "date style")
	pct, err := f.NewStyle(&excelize.Style{NumFmt: 10})
	mustf(t, err, "percent style")
	// D:E carry a date format, F a percent format, G is hidden: the results
	// go from H. Cells of D2:F4 are pre-formatted and empty.
	mustf(t, f.SetColStyle("Readings", "D:E", date), "col style")
	mustf(t, f.SetColStyle("Readings", "F", pct), "col style")
	mustf(t, f.SetColVisible("Readings", "G", false), "hide G")
	mustf(t, f.SetCellStyle("Readings", "D2", "F4", date), "cell style")
	data := save(t, f)
	// LibreOffice writes a column range to the end of its sheet with the
	// default style; the results are cut out of it.
	return patchPackage(t, data, func(p map[string][]byte) {
		sh := "xl/worksheets/sheet1.xml"
		p[sh] = replaceOnce(t, p[sh], "</cols>", `<col min="8" max="1024" width="11.52" customWidth="1" style="0" hidden="0"/></cols>`)
	})
}

// checkLayout: results start in H, right of the styled and hidden
// columns, in visible columns with the fill's own number formats.
func checkLayout(t *testing.T, _, out []byte) {
	f, err := excelize.OpenReader(bytes.NewReader(out))
	mustf(t, err, "open the output")
	defer f.Close()
	if got := raw(t, f, "Readings", "H1"); got != "Status (steamcell)" {
		t.Fatalf("H1 = %q, want the status header (results right of D:G)", got)
	}
	for _, col := range []string{"H", "I", "J", "K", "L", "M"} {
		if v, _ := f.GetColVisible("Readings", col); !v {
			t.Errorf("result column %s is hidden", col)
		}
	}
	if v, _ := f.GetColVisible("Readings", "G"); v {
		t.Errorf("column G was hidden and is visible now")
	}
	id, err := f.GetCellStyle("Readings", "I2")
	mustf(t, err, "style of I2")
	st, err := f.GetStyle(id)
	mustf(t, err, "style %d", id)
	if st.CustomNumFmt == nil || *st.CustomNumFmt != "0.00" {
		t.Errorf("h in I2 has number format %v/%d, want the fill's own 0.00", st.CustomNumFmt, st.NumFmt)
	}
	if got, _ := f.GetCellValue("Readings", "I2"); !regexp.MustCompile(`^\d+\.\d\d$`).MatchString(got) {
		t.Errorf("I2 shows %q, want h with two decimals", got)
	}
	// Statuses are colour-coded: ok and failed in fills of their own.
	fillOf := func(cell string) string {
		id, err := f.GetCellStyle("Readings", cell)
		mustf(t, err, "style of %s", cell)
		st, err := f.GetStyle(id)
		mustf(t, err, "style %d", id)
		if len(st.Fill.Color) == 0 {
			return ""
		}
		return st.Fill.Color[0]
	}
	if ok, failed := fillOf("H2"), fillOf("H3"); ok == "" || failed == "" || ok == failed {
		t.Errorf("status fills: ok %q, failed %q; want two colours", ok, failed)
	}
	w, _ := f.GetColWidth("Readings", "H")
	if w < float64(len("not a number in C3")) {
		t.Errorf("status column width %g cuts off %q", w, "not a number in C3")
	}
	if w, _ := f.GetColWidth("Readings", "N"); w != 11.52 {
		t.Errorf("column N (past the results) width %g, want the input's 11.52", w)
	}
}

// TestEmbeds checks the tree comparison of the corpus itself: it must
// report a lost attribute, a changed value, a lost element and lost text,
// and accept what a fill does (cells appended, counts changed).
func TestEmbeds(t *testing.T) {
	orig := `<a x="1" count="2"><b r="1">t</b><c/></a>`
	for _, tc := range []struct {
		out string
		ok  bool
	}{
		{`<a x="1" count="3"><b r="1">t</b><n/><c/><n/></a>`, true}, // appended children, a count
		{`<a count="2"><b r="1">t</b><c/></a>`, false},              // attribute lost
		{`<a x="2" count="2"><b r="1">t</b><c/></a>`, false},        // value changed
		{`<a x="1" count="2"><b r="1">t</b></a>`, false},            // element lost
		{`<a x="1" count="2"><b r="1"></b><c/></a>`, false},         // text lost
		{`<a x="1" count="2"><c/><b r="1">t</b></a>`, false},        // order changed
	} {
		a, err1 := parseTree([]byte(orig))
		b, err2 := parseTree([]byte(tc.out))
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if err := embeds(a, b, "/a"); (err == nil) != tc.ok {
			t.Errorf("embeds(%s, %s) = %v, want ok=%v", orig, tc.out, err, tc.ok)
		}
	}
}
