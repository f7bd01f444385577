package workbook

import (
	"bytes"
	"fmt"
	"io"
	"sort"
	"strconv"
	"strings"
)

// The fill's own cell styles. They are appended to the workbook's style
// part; the styles already there are not changed, and no result takes a
// style (or a number format) from the user's layout.
type styleKey int

const (
	styleHeader styleKey = iota
	styleUnit
	styleOK
	styleCheck
	styleFailed
	styleAggregate
	styleText
	styleTitle
	styleLink
	nStyleKeys
)

// Fills of the styles, ARGB. Our own palette: pale tints that keep black
// text readable and print as light greys.
const (
	fillHeader    = "FFE4E8EE"
	fillOK        = "FFE0F0E3"
	fillCheck     = "FFFCE8BF"
	fillFailed    = "FFF6D3D0"
	fillAggregate = "FFDCE3F2"
	colorLink     = "FF1F5FA8"
)

// styleTable is the cell formats the fill adds: an index into cellXfs for
// each key and for each number format.
type styleTable struct {
	xf    [nStyleKeys]int
	num   map[string]int // number format code → xf index
	codes []string       // the codes, in order
}

// newStyleTable plans the styles for the number formats codes.
func newStyleTable(codes []string) *styleTable {
	t := &styleTable{num: map[string]int{}}
	for _, c := range codes {
		if _, ok := t.num[c]; !ok {
			t.num[c] = -1
			t.codes = append(t.codes, c)
		}
	}
	return t
}

// minimalStyles is the style part of a package that has none: the parts a
// style part must hold, so that the fill's styles can be appended.
const minimalStyles = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<styleSheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts><fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills><borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders><cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs><cellXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/></cellXfs><cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>`

// section is a child of the style sheet root: where it starts and where
// its end tag is, and its children.
type section struct {
	start, end int // offset of the start tag; of the end tag (-1 for an empty element)
	startLen   int
	children   int
	first      []byte // the first child, whole, for fonts
}

// apply appends the table's styles to a style part and returns the new
// part. The indexes of t are set.
func (t *styleTable) apply(doc []byte) ([]byte, error) {
	secs := map[string]*section{}
	var rootStart, rootLen int
	prefix := ""
	sc := newScanner(bytes.NewReader(doc))
	off, depth := 0, 0
	var cur *section
	maxNumFmt := 163
	var firstFont []byte
	grab := false
	for {
		tok, err := sc.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		n := len(tok.raw)
		switch tok.kind {
		case tokStart, tokEmpty:
			if depth == 0 && tok.kind == tokStart {
				rootStart, rootLen, prefix = off, n, tok.prefix()
			}
			if depth == 1 {
				s := &section{start: off, startLen: n, end: -1}
				secs[string(tok.name())] = s
				cur = s
			}
			if depth == 2 && cur != nil {
				cur.children++
				if tok.is("numFmt") {
					if id, ok := attr(tok.raw, "numFmtId"); ok {
						if v, err := strconv.Atoi(id); err == nil && v > maxNumFmt {
							maxNumFmt = v
						}
					}
				}
				if tok.is("font") && cur.children == 1 && secs["fonts"] == cur {
					grab = tok.kind == tokStart
					firstFont = append([]byte(nil), tok.raw...)
				}
			} else if grab {
				firstFont = append(firstFont, tok.raw...)
			}
			if tok.kind == tokStart {
				depth++
			}
		case tokEnd:
			depth--
			if grab {
				firstFont = append(firstFont, tok.raw...)
				if depth == 2 {
					grab = false
				}
			}
			if depth == 1 && cur != nil {
				cur.end = off
				cur = nil
			}
		default:
			if grab {
				firstFont = append(firstFont, tok.raw...)
			}
		}
		off += n
	}
	for _, name := range []string{"fonts", "fills", "cellXfs"} {
		if secs[name] == nil {
			return nil, fmt.Errorf("the style part has no <%s>", name)
		}
	}
	type edit struct {
		at, del int
		ins     []byte
	}
	var edits []edit
	// appendTo adds children to a section and sets its count.
	appendTo := func(name string, kids []string) int {
		s := secs[name]
		first := s.children
		var b strings.Builder
		for _, k := range kids {
			b.WriteString(k)
		}
		tag := doc[s.start : s.start+s.startLen]
		if s.end < 0 {
			tag = openOf(tag)
			edits = append(edits, edit{at: s.start, del: s.startLen, ins: append(setAttr(tag, "count", strconv.Itoa(first+len(kids))), b.String()+"</"+prefix+name+">"...)})
			return first
		}
		edits = append(edits, edit{at: s.start, del: s.startLen, ins: setAttr(tag, "count", strconv.Itoa(first+len(kids)))})
		edits = append(edits, edit{at: s.end, ins: []byte(b.String())})
		return first
	}
	p := prefix
	// Number formats.
	numIDs := make([]int, len(t.codes))
	var fmts []string
	for i, c := range t.codes {
		numIDs[i] = maxNumFmt + 1 + i
		fmts = append(fmts, fmt.Sprintf(`<%snumFmt numFmtId="%d" formatCode="%s"/>`, p, numIDs[i], escapeAttr(c)))
	}
	if len(fmts) > 0 {
		if secs["numFmts"] != nil {
			appendTo("numFmts", fmts)
		} else {
			edits = append(edits, edit{at: rootStart + rootLen, ins: []byte(fmt.Sprintf(`<%snumFmts count="%d">%s</%snumFmts>`, p, len(fmts), strings.Join(fmts, ""), p))})
		}
	}
	// Fonts: bold and link, made from the workbook's first font so that
	// they keep its face and size.
	base := firstFont
	if len(base) == 0 || bytes.HasSuffix(base, []byte("/>")) && bytes.Count(base, []byte("<")) == 1 {
		base = []byte("<" + p + "font></" + p + "font>")
	}
	bold := fontWith(base, "<"+p+"b/>")
	link := fontWith(stripColor(base, p), "<"+p+"u/><"+p+`color rgb="`+colorLink+`"/>`)
	fontBold := appendTo("fonts", []string{bold, link})
	fontLink := fontBold + 1
	// Fills.
	fill := func(rgb string) string {
		return fmt.Sprintf(`<%sfill><%spatternFill patternType="solid"><%sfgColor rgb="%s"/><%sbgColor indexed="64"/></%spatternFill></%sfill>`, p, p, p, rgb, p, p, p)
	}
	fills := []string{fillHeader, fillOK, fillCheck, fillFailed, fillAggregate}
	var fillXML []string
	for _, c := range fills {
		fillXML = append(fillXML, fill(c))
	}
	fill0 := appendTo("fills", fillXML)
	// A border of nothing, when the part has none.
	border := 0
	if secs["borders"] == nil {
		edits = append(edits, edit{at: secs["fills"].end + len("</"+p+"fills>"), ins: []byte("<" + p + `borders count="1"><` + p + "border/></" + p + "borders>")})
		if secs["fills"].end < 0 {
			return nil, fmt.Errorf("the style part has an empty <fills>")
		}
	} else if secs["borders"].children == 0 {
		border = appendTo("borders", []string{"<" + p + "border/>"})
	}
	xfID := ""
	if s := secs["cellStyleXfs"]; s != nil && s.children > 0 {
		xfID = ` xfId="0"`
	}
	xf := func(num, font, fill int, align string) string {
		s := fmt.Sprintf(`<%sxf numFmtId="%d" fontId="%d" fillId="%d" borderId="%d"%s applyNumberFormat="1" applyFont="1" applyFill="1" applyBorder="1" applyAlignment="1" applyProtection="1">`,
			p, num, font, fill, border, xfID)
		return s + align + "<" + p + `protection locked="1" hidden="0"/></` + p + "xf>"
	}
	left := "<" + p + `alignment horizontal="left" vertical="bottom" wrapText="0"/>`
	right := "<" + p + `alignment horizontal="right" vertical="bottom" wrapText="0"/>`
	var xfs []string
	keys := [nStyleKeys]string{
		styleHeader:    xf(49, fontBold, fill0, "<"+p+`alignment horizontal="left" vertical="bottom" wrapText="1"/>`),
		styleUnit:      xf(49, 0, fill0, left),
		styleOK:        xf(49, 0, fill0+1, left),
		styleCheck:     xf(49, 0, fill0+2, left),
		styleFailed:    xf(49, 0, fill0+3, left),
		styleAggregate: xf(49, 0, fill0+4, left),
		styleText:      xf(49, 0, 0, left),
		styleTitle:     xf(49, fontBold, 0, left),
		styleLink:      xf(49, fontLink, 0, left),
	}
	xfs = append(xfs, keys[:]...)
	for i := range t.codes {
		xfs = append(xfs, xf(numIDs[i], 0, 0, right))
	}
	firstXF := appendTo("cellXfs", xfs)
	for k := range t.xf {
		t.xf[k] = firstXF + k
	}
	for i, c := range t.codes {
		t.num[c] = firstXF + int(nStyleKeys) + i
	}
	sort.SliceStable(edits, func(i, j int) bool { return edits[i].at < edits[j].at })
	out := make([]byte, 0, len(doc)+4096)
	last := 0
	for _, e := range edits {
		out = append(out, doc[last:e.at]...)
		out = append(out, e.ins...)
		last = e.at + e.del
	}
	return append(out, doc[last:]...), nil
}

// fontWith returns a font element with ins added as its first children.
func fontWith(font []byte, ins string) string {
	if bytes.HasSuffix(font, []byte("/>")) {
		open := openOf(font)
		name := token{kind: tokStart, raw: open}.qname()
		return string(open) + ins + "</" + string(name) + ">"
	}
	i := bytes.IndexByte(font, '>')
	return string(font[:i+1]) + ins + string(font[i+1:])
}

// stripColor removes the colour of a font, which the link font sets.
func stripColor(font []byte, p string) []byte {
	i := bytes.Index(font, []byte("<"+p+"color"))
	if i < 0 {
		return font
	}
	j := bytes.Index(font[i:], []byte("/>"))
	if j < 0 {
		return font
	}
	return append(append([]byte(nil), font[:i]...), font[i+j+2:]...)
}
