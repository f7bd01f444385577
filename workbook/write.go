package workbook

import (
	"archive/zip"
	"bytes"
	"context"
	"fmt"
	"io"
	"path"
	"strconv"
	"strings"
)

// plan builds every part the fill rewrites or adds, after the first pass,
// and reads every part to be copied once to its end: a package whose
// entries lie about their sizes or checksums is refused before a byte is
// written.
func (r *run) plan(ctx context.Context) error {
	p := r.pkg
	n := p.names()
	r.rewritten = map[string][]byte{}
	r.streamed = map[string]*sheetRun{}
	idmap, err := p.highestIDMap()
	if err != nil {
		return err
	}
	for _, s := range r.sheets {
		r.streamed[strings.ToLower(s.part)] = s
		s.planNotes(n, &idmap)
		if len(s.comments) == 0 {
			continue
		}
		c, err := s.commentsXML()
		if err != nil {
			return damaged(p.base, fmt.Errorf("%s: %w", s.notes.commentsPart, err))
		}
		r.put(s.notes.commentsPart, s.notes.commentsOld != nil, ctComments, c)
		v, err := s.vmlXML()
		if err != nil {
			return damaged(p.base, fmt.Errorf("%s: %w", s.notes.vmlPart, err))
		}
		r.put(s.notes.vmlPart, s.notes.vmlOld != nil, ctVML, v)
		rels, err := addRels(s.relsXML, s.notes.addRels)
		if err != nil {
			return damaged(p.base, fmt.Errorf("%s: %w", relsPath(s.part), err))
		}
		r.put(relsPath(s.part), s.relsXML != nil, "", rels)
	}

	var wbAdd []rel
	styles := []byte(minimalStyles)
	if p.styPart != "" && p.file(p.styPart) != nil {
		if styles, err = p.read(p.styPart); err != nil {
			return err
		}
	}
	newStyles, err := r.styles.apply(styles)
	if err != nil {
		return damaged(p.base, fmt.Errorf("the style part: %w", err))
	}
	for _, s := range r.sheets {
		for i := range s.outs2 {
			if o := s.outs2[i].out; o != nil && o.code != "" {
				s.outs2[i].style = r.styles.num[o.code]
			}
		}
	}
	if p.styPart != "" && p.file(p.styPart) != nil {
		r.put(p.styPart, true, "", newStyles)
	} else {
		part := n.part(path.Dir(p.wbPart)+"/", "styles", ".xml")
		r.put(part, false, ctStyles, newStyles)
		wbAdd = append(wbAdd, rel{ID: newRelID(p.wbRels, wbAdd), Type: relStyles, Target: relTarget(p.wbPart, part)})
	}

	charted := r.planChart()
	if charted {
		r.sum.Chart = r.freeSheetName(chartName)
	}
	r.summaryPart = n.part(path.Dir(p.wbPart)+"/worksheets/", "sheet", ".xml")
	r.sum.SummarySheet = r.freeSheetName(summaryName)
	r.put(r.summaryPart, false, ctWorksheet, r.summaryXML())
	sheetRel := rel{ID: newRelID(p.wbRels, wbAdd), Type: relWorksheet, Target: relTarget(p.wbPart, r.summaryPart)}
	wbAdd = append(wbAdd, sheetRel)
	added := []newSheet{{r.sum.SummarySheet, sheetRel.ID}}
	if charted {
		chartRel := r.putChart(n, wbAdd)
		wbAdd = append(wbAdd, chartRel)
		added = append(added, newSheet{r.sum.Chart, chartRel.ID})
	}
	wbRels, err := addRels(p.relsXML, wbAdd)
	if err != nil {
		return damaged(p.base, fmt.Errorf("%s: %w", relsPath(p.wbPart), err))
	}
	r.put(relsPath(p.wbPart), p.relsXML != nil, "", wbRels)

	wb, err := r.addSheetEntries(added)
	if err != nil {
		return damaged(p.base, fmt.Errorf("%s: %w", p.wbPart, err))
	}
	r.put(p.wbPart, true, "", wb)

	ct, err := r.contentTypes()
	if err != nil {
		return damaged(p.base, fmt.Errorf("[Content_Types].xml: %w", err))
	}
	r.put("[Content_Types].xml", true, "", ct)

	for _, f := range p.zr.File {
		key := strings.ToLower(strings.TrimPrefix(f.Name, "/"))
		if r.rewritten[key] != nil || r.streamed[key] != nil || strings.HasSuffix(f.Name, "/") {
			continue
		}
		if err := ctx.Err(); err != nil {
			return err
		}
		if err := p.verify(f); err != nil {
			return err
		}
	}
	return nil
}

// put plans a part: rewritten in its place when old, added at the end
// otherwise (with its content type, unless ctype is "").
func (r *run) put(name string, old bool, ctype string, data []byte) {
	if old {
		r.rewritten[strings.ToLower(name)] = data
		return
	}
	r.newParts = append(r.newParts, newPart{name: name, ctype: ctype, data: data})
}

// freeSheetName is the name of a sheet the fill adds: base ("steamcell
// summary"), or base with " 2" and so on when a sheet has that name.
func (r *run) freeSheetName(base string) string {
	taken := map[string]bool{}
	for _, e := range r.pkg.sheets {
		taken[strings.ToLower(e.Name)] = true
	}
	name := base
	for i := 2; taken[name]; i++ {
		name = base + " " + strconv.Itoa(i)
	}
	return name
}

// newSheet is a sheet the fill adds: its name and the id of the
// workbook's relationship to it.
type newSheet struct{ name, rid string }

// addSheetEntries returns the workbook part with the sheets listed last.
func (r *run) addSheetEntries(sheets []newSheet) ([]byte, error) {
	doc := r.pkg.wbXML
	root, err := rootTag(doc)
	if err != nil {
		return nil, err
	}
	id := 0
	for _, e := range r.pkg.sheets {
		id = max(id, e.ID)
	}
	rp := nsPrefix(root.raw, "relationships")
	decl := ""
	if rp == "" {
		rp, decl = "r:", ` xmlns:r="`+nsRelationships+`"`
	}
	var b bytes.Buffer
	for i, s := range sheets {
		fmt.Fprintf(&b, `<%ssheet%s name="%s" sheetId="%d" %sid="%s"/>`, root.prefix(), decl, escapeAttr(s.name), id+1+i, rp, s.rid)
	}
	return insertBeforeEnd(doc, "sheets", b.Bytes())
}

// contentTypes returns the content types with an override for each new
// part that needs one.
func (r *run) contentTypes() ([]byte, error) {
	doc := r.pkg.ctypeXML
	hasVML := regexpDefaultVML(doc)
	var b bytes.Buffer
	for _, np := range r.newParts {
		if np.ctype == "" || np.ctype == ctVML && hasVML {
			continue
		}
		fmt.Fprintf(&b, `<Override PartName="/%s" ContentType="%s"/>`, escapeAttr(np.name), np.ctype)
	}
	return insertBeforeEnd(doc, "Types", b.Bytes())
}

// regexpDefaultVML reports whether the content types give .vml parts a
// type by their extension.
func regexpDefaultVML(doc []byte) bool {
	sc := newScanner(bytes.NewReader(doc))
	for {
		t, err := sc.next()
		if err != nil {
			return false
		}
		if (t.kind == tokEmpty || t.kind == tokStart) && t.is("Default") {
			if ext, _ := attr(t.raw, "Extension"); strings.EqualFold(ext, "vml") {
				return true
			}
		}
	}
}

// write writes the filled package to out: each part of the input in its
// order, copied as it is (its compressed bytes, unchanged) unless it is
// rewritten; the filled sheets streamed through their second pass; then
// the new parts.
func (r *run) write(ctx context.Context, out io.Writer) error {
	zw := zip.NewWriter(&ctxWriter{ctx: ctx, w: out})
	buf := make([]byte, 32<<10)
	for _, f := range r.pkg.zr.File {
		if err := ctx.Err(); err != nil {
			return err
		}
		key := strings.ToLower(strings.TrimPrefix(f.Name, "/"))
		if s := r.streamed[key]; s != nil {
			w, err := zw.CreateHeader(&zip.FileHeader{Name: f.Name, Method: zip.Deflate, Modified: f.Modified})
			if err != nil {
				return err
			}
			if err := s.pass2(ctx, w); err != nil {
				return err
			}
			continue
		}
		if data, ok := r.rewritten[key]; ok {
			if err := writePart(zw, f.Name, data, f); err != nil {
				return err
			}
			continue
		}
		if err := copyRaw(zw, f, buf); err != nil {
			return fmt.Errorf("copy %s: %w", f.Name, err)
		}
	}
	for _, np := range r.newParts {
		if err := writePart(zw, np.name, np.data, nil); err != nil {
			return err
		}
	}
	if err := zw.Close(); err != nil {
		return fmt.Errorf("write the filled workbook: %w", err)
	}
	return nil
}

// copyRaw copies an entry's compressed bytes and header unchanged, as
// (*zip.Writer).Copy does, through one buffer for all entries: Copy
// takes a new 32 KiB buffer per entry, which a package of 40,000 small
// parts turns into a gigabyte of garbage.
func copyRaw(zw *zip.Writer, f *zip.File, buf []byte) error {
	r, err := f.OpenRaw()
	if err != nil {
		return err
	}
	h := f.FileHeader
	w, err := zw.CreateRaw(&h)
	if err != nil {
		return err
	}
	_, err = io.CopyBuffer(w, r, buf)
	return err
}

func writePart(zw *zip.Writer, name string, data []byte, like *zip.File) error {
	h := &zip.FileHeader{Name: name, Method: zip.Deflate}
	if like != nil {
		h.Modified = like.Modified
	}
	w, err := zw.CreateHeader(h)
	if err != nil {
		return fmt.Errorf("write %s: %w", name, err)
	}
	if _, err := w.Write(data); err != nil {
		return fmt.Errorf("write %s: %w", name, err)
	}
	return nil
}

// ctxWriter stops writing once its context is done, so that an
// interruption stops a long copy at once.
type ctxWriter struct {
	ctx context.Context
	w   io.Writer
}

func (c *ctxWriter) Write(b []byte) (int, error) {
	if err := c.ctx.Err(); err != nil {
		return 0, err
	}
	return c.w.Write(b)
}
