package workbook

import (
	"archive/zip"
	"bytes"
	"encoding/binary"
	"encoding/xml"
	"fmt"
	"io"
	"path"
	"strconv"
	"strings"
)

// Relationship types the writer follows or writes. Strict packages use
// the purl.oclc.org forms; relType compares the last path element only.
const (
	relOfficeDocument = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument"
	relWorksheet      = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet"
	relStyles         = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/styles"
	relSharedStrings  = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings"
	relComments       = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/comments"
	relVML            = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/vmlDrawing"
	nsRelationships   = "http://schemas.openxmlformats.org/officeDocument/2006/relationships"
	nsMain            = "http://schemas.openxmlformats.org/spreadsheetml/2006/main"
	nsPackageRels     = "http://schemas.openxmlformats.org/package/2006/relationships"

	ctWorksheet = "application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"
	ctComments  = "application/vnd.openxmlformats-officedocument.spreadsheetml.comments+xml"
	ctVML       = "application/vnd.openxmlformats-officedocument.vmlDrawing"
	ctStyles    = "application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"
)

// relType returns the last element of a relationship type, so that
// transitional and strict packages compare alike.
func relType(t string) string { return path.Base(t) }

// rel is one relationship of a part.
type rel struct {
	ID, Type, Target, Mode string
}

// pkg is an input package, read part by part; nothing is loaded whole
// but the small parts the writer changes.
type pkg struct {
	zr       *zip.Reader
	base     string               // file name, for messages
	parts    map[string]*zip.File // by lower-case name
	budget   int64                // bytes the parts loaded whole may take
	loaded   int64
	wbPart   string // "xl/workbook.xml"
	wbRels   []rel
	sheets   []sheetEntry
	wbXML    []byte
	relsXML  []byte
	sstPart  string // "" when there is none
	styPart  string
	ctypeXML []byte
}

// sheetEntry is a sheet as the workbook part lists it.
type sheetEntry struct {
	Name, State, RID string
	ID               int    // sheetId
	part             string // the worksheet part; "" for a chartsheet or a dangling one
}

// damaged is the error for a package that cannot be read as it claims.
func damaged(base string, err error) error {
	return &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
		"%s is not a complete .xlsx workbook (damaged or cut short: %v); open it in a spreadsheet program and save it again", base, err)}
}

// openPkg reads the directory of a package and the parts that describe
// it.
func openPkg(ra io.ReaderAt, size int64, base string, unzipLimit, budget int64) (*pkg, error) {
	if n, ok := zipEntries(ra, size); ok && n*partMemory > uint64(budget) {
		return nil, &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
			"%s has %d parts; this fill may hold the directory of %d (about %d bytes of memory each); split the workbook",
			base, n, uint64(budget)/partMemory, partMemory)}
	}
	zr, err := zip.NewReader(ra, size)
	if err != nil {
		return nil, damaged(base, err)
	}
	p := &pkg{zr: zr, base: base, parts: make(map[string]*zip.File, len(zr.File)), budget: budget}
	var total uint64
	for _, f := range zr.File {
		total += f.UncompressedSize64
		key := strings.ToLower(strings.TrimPrefix(f.Name, "/"))
		if _, dup := p.parts[key]; dup {
			return nil, damaged(base, fmt.Errorf("the part %s is there twice", f.Name))
		}
		p.parts[key] = f
	}
	if total > uint64(unzipLimit) {
		return nil, &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
			"%s unpacks to %s, more than the limit of %s; split the workbook, or raise the limit if you trust the file",
			base, byteSize(total), byteSize(uint64(unzipLimit)))}
	}
	rootRels, err := p.rels("")
	if err != nil {
		return nil, err
	}
	for _, r := range rootRels {
		if relType(r.Type) == relType(relOfficeDocument) {
			p.wbPart = resolve("", r.Target)
		}
	}
	if p.wbPart == "" {
		p.wbPart = "xl/workbook.xml"
	}
	if p.file(p.wbPart) == nil {
		return nil, &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
			"%s is a zip file without a workbook inside (xl/workbook.xml); give an .xlsx file", base)}
	}
	if p.ctypeXML, err = p.read("[Content_Types].xml"); err != nil {
		return nil, err
	}
	if p.wbXML, err = p.read(p.wbPart); err != nil {
		return nil, err
	}
	if p.wbRels, err = p.rels(p.wbPart); err != nil {
		return nil, err
	}
	p.relsXML, _ = p.readIfThere(relsPath(p.wbPart))
	byID := map[string]rel{}
	for _, r := range p.wbRels {
		byID[r.ID] = r
		switch relType(r.Type) {
		case relType(relSharedStrings):
			p.sstPart = resolve(p.wbPart, r.Target)
		case relType(relStyles):
			p.styPart = resolve(p.wbPart, r.Target)
		}
	}
	if p.sheets, err = listSheets(p.wbXML); err != nil {
		return nil, damaged(base, fmt.Errorf("%s: %w", p.wbPart, err))
	}
	for i := range p.sheets {
		r, ok := byID[p.sheets[i].RID]
		if ok && relType(r.Type) == relType(relWorksheet) && p.file(resolve(p.wbPart, r.Target)) != nil {
			p.sheets[i].part = resolve(p.wbPart, r.Target)
		}
	}
	return p, nil
}

// file returns the zip entry of a part, or nil.
func (p *pkg) file(name string) *zip.File { return p.parts[strings.ToLower(name)] }

// open opens a part for streaming; read errors come out as damaged.
func (p *pkg) open(name string) (io.ReadCloser, error) {
	f := p.file(name)
	if f == nil {
		return nil, damaged(p.base, fmt.Errorf("the part %s is missing", name))
	}
	rc, err := f.Open()
	if err != nil {
		return nil, damaged(p.base, fmt.Errorf("%s: %w", name, err))
	}
	return &partReader{rc: rc, p: p, name: name}, nil
}

// partReader turns the errors of reading a zip entry (a size or checksum
// that lies, a cut-off stream) into the damaged-workbook error.
type partReader struct {
	rc   io.ReadCloser
	p    *pkg
	name string
}

func (r *partReader) Read(b []byte) (int, error) {
	n, err := r.rc.Read(b)
	if err != nil && err != io.EOF {
		err = damaged(r.p.base, fmt.Errorf("%s: %w", r.name, err))
	}
	return n, err
}

func (r *partReader) Close() error { return r.rc.Close() }

// read loads a part whole, within the memory budget.
func (p *pkg) read(name string) ([]byte, error) {
	f := p.file(name)
	if f == nil {
		return nil, damaged(p.base, fmt.Errorf("the part %s is missing", name))
	}
	if p.loaded+int64(f.UncompressedSize64) > p.budget {
		return nil, &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
			"%s: the part %s unpacks to %s, more than this fill may hold in memory (%s); split the workbook",
			p.base, name, byteSize(f.UncompressedSize64), byteSize(uint64(p.budget)))}
	}
	rc, err := p.open(name)
	if err != nil {
		return nil, err
	}
	defer rc.Close()
	b, err := io.ReadAll(io.LimitReader(rc, int64(f.UncompressedSize64)+1))
	if err != nil {
		return nil, err
	}
	p.loaded += int64(len(b))
	return b, nil
}

// readIfThere loads a part that may be missing: nil, nil then.
func (p *pkg) readIfThere(name string) ([]byte, error) {
	if p.file(name) == nil {
		return nil, nil
	}
	return p.read(name)
}

// relsPath is the relationships part of a part ("" for the package).
func relsPath(part string) string {
	dir, file := path.Split(part)
	return dir + "_rels/" + file + ".rels"
}

// resolve turns a relationship target into a part name.
func resolve(source, target string) string {
	if strings.HasPrefix(target, "/") {
		return path.Clean(target[1:])
	}
	return path.Clean(path.Join(path.Dir(source), target))
}

// relTarget is the target of a new relationship from source to part.
func relTarget(source, part string) string {
	from := strings.Split(path.Dir(source), "/")
	to := strings.Split(part, "/")
	if path.Dir(source) == "." {
		from = nil
	}
	i := 0
	for i < len(from) && i < len(to)-1 && from[i] == to[i] {
		i++
	}
	return strings.Repeat("../", len(from)-i) + strings.Join(to[i:], "/")
}

// rels reads the relationships of a part; none when it has no rels part.
func (p *pkg) rels(part string) ([]rel, error) {
	b, err := p.readIfThere(relsPath(part))
	if err != nil || b == nil {
		return nil, err
	}
	return parseRels(b)
}

func parseRels(b []byte) ([]rel, error) {
	var doc struct {
		Rels []struct {
			ID     string `xml:"Id,attr"`
			Type   string `xml:"Type,attr"`
			Target string `xml:"Target,attr"`
			Mode   string `xml:"TargetMode,attr"`
		} `xml:"Relationship"`
	}
	if err := xml.Unmarshal(b, &doc); err != nil {
		return nil, err
	}
	out := make([]rel, len(doc.Rels))
	for i, r := range doc.Rels {
		out[i] = rel{ID: r.ID, Type: r.Type, Target: r.Target, Mode: r.Mode}
	}
	return out, nil
}

// listSheets reads the sheets of a workbook part.
func listSheets(wb []byte) ([]sheetEntry, error) {
	d := xml.NewDecoder(bytes.NewReader(wb))
	var out []sheetEntry
	for {
		t, err := d.Token()
		if err == io.EOF {
			return out, nil
		}
		if err != nil {
			return nil, err
		}
		se, ok := t.(xml.StartElement)
		if !ok || se.Name.Local != "sheet" {
			continue
		}
		var s sheetEntry
		for _, a := range se.Attr {
			switch {
			case a.Name.Local == "name" && a.Name.Space == "":
				s.Name = a.Value
			case a.Name.Local == "state" && a.Name.Space == "":
				s.State = a.Value
			case a.Name.Local == "sheetId" && a.Name.Space == "":
				s.ID, _ = strconv.Atoi(a.Value)
			case a.Name.Local == "id" && strings.Contains(a.Name.Space, "relationships"):
				s.RID = a.Value
			}
		}
		out = append(out, s)
	}
}

// verify reads a part to its end, so that a part copied as it is has the
// size and checksum its entry declares: a package whose sizes lie is
// refused, not passed on.
func (p *pkg) verify(f *zip.File) error {
	rc, err := p.open(f.Name)
	if err != nil {
		return err
	}
	defer rc.Close()
	_, err = io.Copy(io.Discard, rc)
	return err
}

// names hands out part names and relationship ids that collide with
// nothing in the package.
type names struct {
	taken map[string]bool
}

func (p *pkg) names() *names {
	n := &names{taken: map[string]bool{}}
	for k := range p.parts {
		n.taken[k] = true
	}
	return n
}

// part returns dir/stem{N}ext for the smallest N ≥ 1 not taken, whose
// rels part is not taken either (a stray rels part would otherwise be
// written twice, or given to a new part that has rels of its own).
func (n *names) part(dir, stem, ext string) string {
	for i := 1; ; i++ {
		name := dir + stem + strconv.Itoa(i) + ext
		key, rels := strings.ToLower(name), strings.ToLower(relsPath(name))
		if !n.taken[key] && !n.taken[rels] {
			n.taken[key], n.taken[rels] = true, true
			return name
		}
	}
}

// newRelID returns an id not used by rels (nor by ids handed out before).
func newRelID(rels []rel, extra []rel) string {
	used := map[string]bool{}
	for _, r := range rels {
		used[r.ID] = true
	}
	for _, r := range extra {
		used[r.ID] = true
	}
	for i := len(rels) + len(extra) + 1; ; i++ {
		id := "rId" + strconv.Itoa(i)
		if !used[id] {
			return id
		}
	}
}

// addRels returns a rels part with the relationships added before its
// end, or a new rels part when old is nil.
func addRels(old []byte, add []rel) ([]byte, error) {
	var b bytes.Buffer
	for _, r := range add {
		fmt.Fprintf(&b, `<Relationship Id="%s" Type="%s" Target="%s"/>`, escapeAttr(r.ID), escapeAttr(r.Type), escapeAttr(r.Target))
	}
	if old == nil {
		return []byte(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" + `<Relationships xmlns="` + nsPackageRels + `">` + b.String() + `</Relationships>`), nil
	}
	return insertBeforeEnd(old, "Relationships", b.Bytes())
}

// insertBeforeEnd inserts ins before the end tag of the root element,
// whose local name is root. A root written as an empty element is opened.
func insertBeforeEnd(doc []byte, root string, ins []byte) ([]byte, error) {
	i := lastTagIndex(doc, root)
	if i >= 0 {
		out := make([]byte, 0, len(doc)+len(ins))
		out = append(out, doc[:i]...)
		out = append(out, ins...)
		return append(out, doc[i:]...), nil
	}
	sc := newScanner(bytes.NewReader(doc))
	off := 0
	for {
		t, err := sc.next()
		if err != nil {
			return nil, fmt.Errorf("no end of <%s>", root)
		}
		off += len(t.raw)
		if t.kind == tokEmpty && t.is(root) {
			open := openOf(t.raw)
			out := append([]byte(nil), doc[:off-len(t.raw)]...)
			out = append(out, open...)
			out = append(out, ins...)
			out = append(out, "</"+string(t.qname())+">"...)
			return append(out, doc[off:]...), nil
		}
	}
}

// lastTagIndex finds the last end tag </root> or </prefix:root> in doc.
func lastTagIndex(doc []byte, root string) int {
	for end := len(doc); ; {
		i := bytes.LastIndex(doc[:end], []byte("</"))
		if i < 0 {
			return -1
		}
		j := i + 2
		for j < len(doc) && doc[j] != '>' && !isSpace(doc[j]) {
			j++
		}
		name := doc[i+2 : j]
		if k := bytes.IndexByte(name, ':'); k >= 0 {
			name = name[k+1:]
		}
		if string(name) == root {
			return i
		}
		end = i
	}
}

// partMemory is what a part of the package costs in memory while a fill
// runs, bytes, rounded up from the server benchmark (40,000 parts, about
// 0.6 KiB each): its entry in the zip directory read, in the maps of
// names, and in the directory written.
const partMemory = 1 << 10

// zipEntries reads the number of entries a zip file declares from its
// end-of-central-directory record (and the zip64 record when there is
// one), before the directory itself is read into memory. ok is false
// when the record is not found; zip.NewReader then says what is wrong.
func zipEntries(ra io.ReaderAt, size int64) (n uint64, ok bool) {
	const eocdLen = 22
	tail := min(size, eocdLen+65535)
	buf := make([]byte, tail)
	if _, err := ra.ReadAt(buf, size-tail); err != nil && err != io.EOF {
		return 0, false
	}
	i := bytes.LastIndex(buf, []byte("PK\x05\x06"))
	if i < 0 || len(buf)-i < eocdLen {
		return 0, false
	}
	n = uint64(binary.LittleEndian.Uint16(buf[i+10:]))
	if n != 0xFFFF || i < 20 || !bytes.Equal(buf[i-20:i-16], []byte("PK\x06\x07")) {
		return n, true
	}
	off := int64(binary.LittleEndian.Uint64(buf[i-20+8:]))
	rec := make([]byte, 56)
	if off < 0 || off+56 > size {
		return 0, false
	}
	if _, err := ra.ReadAt(rec, off); err != nil || !bytes.Equal(rec[:4], []byte("PK\x06\x06")) {
		return 0, false
	}
	return binary.LittleEndian.Uint64(rec[32:]), true
}
