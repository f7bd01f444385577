package workbook

import (
	"bytes"
	"fmt"
	"io"
	"regexp"
	"strconv"
	"strings"
)

// noteAuthor is the author of the comments the fill adds.
const noteAuthor = "steamcell"

// notes are the comment parts of one sheet: the legacy comments part (the
// text) and the VML drawing (the boxes), each extended in place when the
// sheet has one and new otherwise, never shared with another sheet.
type notes struct {
	commentsPart string
	commentsOld  []byte // nil: a new part
	vmlPart      string
	vmlOld       []byte // nil: a new part
	legacyRID    string // rel id of a <legacyDrawing> to add to the sheet; "" when it has one
	addRels      []rel  // relationships to add to the sheet
	idmap        int    // the idmap block of a new VML part
}

// readNotes finds the comment parts of a sheet and the cells that carry
// a comment already.
func (s *sheetRun) readNotes() error {
	s.hasComment = map[string]bool{}
	for _, r := range s.rels {
		if r.Mode == "External" {
			continue
		}
		switch relType(r.Type) {
		case relType(relComments):
			s.notes.commentsPart = resolve(s.part, r.Target)
		case relType(relVML):
			if r.ID == s.legacyRID || s.legacyRID == "" {
				s.notes.vmlPart = resolve(s.part, r.Target)
			}
		}
	}
	if s.notes.commentsPart != "" {
		b, err := s.pkg.read(s.notes.commentsPart)
		if err != nil {
			return err
		}
		s.notes.commentsOld = b
		for _, m := range commentRefRE.FindAllSubmatch(b, -1) {
			s.hasComment[strings.ToUpper(string(m[1]))] = true
		}
	}
	if s.notes.vmlPart != "" {
		b, err := s.pkg.read(s.notes.vmlPart)
		if err != nil {
			return err
		}
		s.notes.vmlOld = b
	}
	return nil
}

var (
	commentRefRE = regexp.MustCompile(`<(?:\w+:)?comment\s[^>]*\bref="([^"]+)"`)
	shapeIDRE    = regexp.MustCompile(`_x0000_s(\d+)`)
	idmapRE      = regexp.MustCompile(`<o:idmap[^>]*\bdata="([^"]*)"`)
	shapetypeRE  = regexp.MustCompile(`<v:shapetype\b[^>]*>`)
)

// planNotes decides the parts of the new comments of a sheet, after its
// first pass, when the comments are known.
func (s *sheetRun) planNotes(n *names, idmaps *int) {
	if len(s.comments) == 0 {
		return
	}
	rels := append([]rel(nil), s.rels...)
	if s.notes.commentsOld == nil {
		s.notes.commentsPart = n.part("xl/", "comments", ".xml")
		r := rel{ID: newRelID(rels, nil), Type: relComments, Target: relTarget(s.part, s.notes.commentsPart)}
		rels = append(rels, r)
		s.notes.addRels = append(s.notes.addRels, r)
	}
	if s.notes.vmlOld == nil {
		s.notes.vmlPart = n.part("xl/drawings/", "vmlDrawing", ".vml")
		r := rel{ID: newRelID(rels, nil), Type: relVML, Target: relTarget(s.part, s.notes.vmlPart)}
		s.notes.addRels = append(s.notes.addRels, r)
		s.notes.legacyRID = r.ID
		*idmaps++
		s.notes.idmap = *idmaps
	}
}

// commentsXML returns the comments part with the new comments.
func (s *sheetRun) commentsXML() ([]byte, error) {
	var list bytes.Buffer
	doc := s.notes.commentsOld
	prefix := ""
	author := 0
	if doc != nil {
		root, err := rootTag(doc)
		if err != nil {
			return nil, err
		}
		prefix = root.prefix()
		author = -1
		names := regexp.MustCompile(`<(?:\w+:)?author>([^<]*)</(?:\w+:)?author>|<(?:\w+:)?author/>`).FindAllSubmatch(doc, -1)
		for i, m := range names {
			if unescape(m[1]) == noteAuthor {
				author = i
			}
		}
		if author < 0 {
			author = len(names)
			if doc, err = insertBeforeEnd(doc, "authors", []byte("<"+prefix+"author>"+noteAuthor+"</"+prefix+"author>")); err != nil {
				return nil, err
			}
		}
	}
	for _, c := range s.comments {
		fmt.Fprintf(&list, `<%scomment ref="%s" authorId="%d"><%stext><%sr><%st xml:space="preserve">%s</%st></%sr></%stext></%scomment>`,
			prefix, c.cell, author, prefix, prefix, prefix, escapeText(c.text), prefix, prefix, prefix, prefix)
	}
	if doc == nil {
		return []byte(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" +
			`<comments xmlns="` + nsMain + `"><authors><author>` + noteAuthor + `</author></authors><commentList>` + list.String() + `</commentList></comments>`), nil
	}
	if lastTagIndex(doc, "commentList") < 0 && !bytes.Contains(doc, []byte("commentList")) {
		return insertBeforeEnd(doc, "comments", []byte("<"+prefix+"commentList>"+list.String()+"</"+prefix+"commentList>"))
	}
	return insertBeforeEnd(doc, "commentList", list.Bytes())
}

const (
	nsVML    = "urn:schemas-microsoft-com:vml"
	nsOffice = "urn:schemas-microsoft-com:office:office"
	nsExcel  = "urn:schemas-microsoft-com:office:excel"
)

// vmlXML returns the VML drawing with a box for each new comment. Shape
// ids continue after the highest of the part; ids that are not numbered
// the usual way (LibreOffice writes "shape_0") are left alone.
func (s *sheetRun) vmlXML() ([]byte, error) {
	doc := s.notes.vmlOld
	next := s.notes.idmap*1024 + 1
	typeID := "_x0000_t202"
	declare := ""
	if doc != nil {
		for _, m := range shapeIDRE.FindAllSubmatch(doc, -1) {
			if v, err := strconv.Atoi(string(m[1])); err == nil && v >= next {
				next = v + 1
			}
		}
		typeID = ""
		for _, m := range shapetypeRE.FindAll(doc, -1) {
			if spt, _ := attr(m, "o:spt"); spt == "202" {
				typeID, _ = attr(m, "id")
				break
			}
		}
		root, err := rootTag(doc)
		if err != nil {
			return nil, err
		}
		if v, _ := attr(root.raw, "xmlns:v"); v != nsVML {
			declare = ` xmlns:v="` + nsVML + `"`
		}
		if o, _ := attr(root.raw, "xmlns:o"); o != nsOffice {
			declare += ` xmlns:o="` + nsOffice + `"`
		}
		if x, _ := attr(root.raw, "xmlns:x"); x != nsExcel {
			declare += ` xmlns:x="` + nsExcel + `"`
		}
	}
	var b bytes.Buffer
	if typeID == "" {
		typeID = "steamcell_note"
		for bytes.Contains(doc, []byte(`"`+typeID+`"`)) {
			typeID += "_"
		}
		fmt.Fprintf(&b, `<v:shapetype%s id="%s" coordsize="21600,21600" o:spt="202" path="m,l,21600r21600,l21600,xe"><v:stroke joinstyle="miter"/><v:path gradientshapeok="t" o:connecttype="rect"/></v:shapetype>`, declare, typeID)
	}
	for i, c := range s.comments {
		col, row, _ := splitRef(c.cell)
		fmt.Fprintf(&b, `<v:shape%s id="_x0000_s%d" type="#%s" style="position:absolute;margin-left:60pt;margin-top:2pt;width:240pt;height:84pt;z-index:%d;visibility:hidden" fillcolor="#fff8dc" o:insetmode="auto">`+
			`<v:fill color2="#fff8dc"/><v:shadow on="t" color="black" obscured="t"/><v:path o:connecttype="none"/><v:textbox style="mso-direction-alt:auto"><div style="text-align:left"></div></v:textbox>`+
			`<x:ClientData ObjectType="Note"><x:MoveWithCells/><x:SizeWithCells/><x:Anchor>%d, 15, %d, 2, %d, 15, %d, 16</x:Anchor><x:AutoFill>False</x:AutoFill><x:Row>%d</x:Row><x:Column>%d</x:Column></x:ClientData></v:shape>`,
			declare, next+i, typeID, i+1, col+1, max(row-2, 0), col+5, row+4, row-1, col)
	}
	if doc == nil {
		return []byte(`<xml xmlns:v="` + nsVML + `" xmlns:o="` + nsOffice + `" xmlns:x="` + nsExcel + `">` +
			`<o:shapelayout v:ext="edit"><o:idmap v:ext="edit" data="` + strconv.Itoa(s.notes.idmap) + `"/></o:shapelayout>` +
			b.String() + `</xml>`), nil
	}
	return insertBeforeEnd(doc, "xml", b.Bytes())
}

// rootTag returns the start tag of a document's root element.
func rootTag(doc []byte) (token, error) {
	sc := newScanner(bytes.NewReader(doc))
	for {
		t, err := sc.next()
		if err == io.EOF {
			return token{}, fmt.Errorf("%w: no root element", errXMLToken)
		}
		if err != nil {
			return token{}, err
		}
		if t.kind == tokStart || t.kind == tokEmpty {
			t.raw = append([]byte(nil), t.raw...)
			return t, nil
		}
	}
}

// highestIDMap returns the highest idmap block of the VML parts of the
// package, so that new VML parts take blocks of their own.
func (p *pkg) highestIDMap() (int, error) {
	best := 0
	for name := range p.parts {
		if !strings.HasSuffix(name, ".vml") {
			continue
		}
		b, err := p.read(name)
		if err != nil {
			return 0, err
		}
		p.loaded -= int64(len(b)) // read, scanned and dropped
		for _, m := range idmapRE.FindAllSubmatch(b, -1) {
			for _, f := range strings.FieldsFunc(string(m[1]), func(r rune) bool { return r == ',' || r == ' ' }) {
				lo := f
				if i := strings.IndexByte(f, '-'); i >= 0 {
					lo = f[i+1:]
				}
				if v, err := strconv.Atoi(lo); err == nil && v > best {
					best = v
				}
			}
		}
	}
	return best, nil
}
