package workbook

import (
	"archive/zip"
	"bufio"
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode/utf16"
	"unicode/utf8"

	"steamcell/fn/point"
)

// csvPackage reads CSV text into a new package of one sheet named after
// the file, which the fill then treats like any workbook. Numbers become
// numbers; everything else stays text.
//
// The text may be UTF-8 (with or without a byte-order mark) or UTF-16
// with a byte-order mark; other text that is not UTF-8 is read as
// Latin-1, and the note says so. UTF-16 without a mark and UTF-32 are
// refused. Lines may end in LF, CRLF or CR alone. The separator is the one
// of ',', ';' and tab that the first line uses most outside quotes; with
// ';', a decimal comma ("41,37") is read as a number, as the locales that
// separate with ';' write them.
func csvPackage(data []byte, base string) ([]byte, string, error) {
	text, note, err := decodeText(data, base)
	if err != nil {
		return nil, "", err
	}
	text = normalizeLineEnds(text)
	sep := pickSeparator(text)
	r := csv.NewReader(strings.NewReader(text))
	r.Comma = sep
	r.FieldsPerRecord = -1
	r.LazyQuotes = true
	r.ReuseRecord = true

	var out bytes.Buffer
	b, err := newPackageBuilder(&out, sheetNameFor(base))
	if err != nil {
		return nil, "", err
	}
	vals := make([]any, 0, 16)
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf("%s is not readable CSV: %v", base, err)}
		}
		// The row is the line the record starts on, so that blank lines
		// (which the reader skips) stay blank rows.
		row, _ := r.FieldPos(0)
		if row > maxRows {
			return nil, "", &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
				"%s has more than %d lines, the most a sheet holds; split it", base, maxRows)}
		}
		if len(rec) > maxColumns {
			return nil, "", &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
				"line %d of %s has %d fields, more than the %d columns of a sheet", row, base, len(rec), maxColumns)}
		}
		vals = vals[:0]
		empty := true
		for _, s := range rec {
			if s != "" {
				empty = false
			}
			vals = append(vals, csvValue(s, sep))
		}
		if empty {
			continue
		}
		if err := b.row(row, vals); err != nil {
			return nil, "", err
		}
	}
	if err := b.close(); err != nil {
		return nil, "", err
	}
	return out.Bytes(), note, nil
}

// decodeText turns CSV bytes into text by the rules of csvPackage.
func decodeText(data []byte, base string) (string, string, error) {
	switch {
	case bytes.HasPrefix(data, []byte{0xFF, 0xFE, 0, 0}) || bytes.HasPrefix(data, []byte{0, 0, 0xFE, 0xFF}):
		return "", "", &Error{Kind: ErrNotWorkbook, Msg: base + " is UTF-32 text; save it as UTF-8 (or UTF-16) CSV and fill that"}
	case bytes.HasPrefix(data, []byte{0xFF, 0xFE}):
		return decodeUTF16(data[2:], false, base)
	case bytes.HasPrefix(data, []byte{0xFE, 0xFF}):
		return decodeUTF16(data[2:], true, base)
	}
	data = bytes.TrimPrefix(data, []byte("\xEF\xBB\xBF"))
	if bytes.IndexByte(data, 0) >= 0 {
		return "", "", &Error{Kind: ErrNotWorkbook, Msg: base + " holds NUL bytes: UTF-16 text without a byte-order mark, or not text at all; save it as UTF-8 CSV and fill that"}
	}
	if utf8.Valid(data) {
		return string(data), "", nil
	}
	out := make([]byte, 0, len(data)+len(data)/8)
	for _, c := range data {
		out = utf8.AppendRune(out, rune(c))
	}
	return string(out), base + " is not UTF-8; it was read as Latin-1 (ISO 8859-1)", nil
}

func decodeUTF16(b []byte, bigEndian bool, base string) (string, string, error) {
	if len(b)%2 != 0 {
		return "", "", &Error{Kind: ErrNotWorkbook, Msg: base + " is UTF-16 text cut off in the middle of a character; save it again"}
	}
	u := make([]uint16, len(b)/2)
	for i := range u {
		if bigEndian {
			u[i] = uint16(b[2*i])<<8 | uint16(b[2*i+1])
		} else {
			u[i] = uint16(b[2*i+1])<<8 | uint16(b[2*i])
		}
	}
	return string(utf16.Decode(u)), "", nil
}

// normalizeLineEnds makes every line end outside quotes an LF: CRLF and a
// CR alone (as some older programs write) alike.
func normalizeLineEnds(s string) string {
	if !strings.Contains(s, "\r") {
		return s
	}
	var b strings.Builder
	b.Grow(len(s))
	quoted := false
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '"':
			quoted = !quoted
		case c == '\r' && !quoted:
			if i+1 < len(s) && s[i+1] == '\n' {
				continue
			}
			c = '\n'
		}
		b.WriteByte(c)
	}
	return b.String()
}

// pickSeparator returns the separator the first non-blank line uses most
// outside quotes: ',', ';' or tab; ',' when it uses none.
func pickSeparator(text string) rune {
	line := text
	for {
		l, rest, found := strings.Cut(line, "\n")
		if strings.TrimSpace(l) != "" || !found {
			line = l
			break
		}
		line = rest
	}
	counts := map[rune]int{}
	quoted := false
	for _, r := range line {
		switch {
		case r == '"':
			quoted = !quoted
		case !quoted && (r == ',' || r == ';' || r == '\t'):
			counts[r]++
		}
	}
	sep := ','
	for _, r := range []rune{';', '\t'} {
		if counts[r] > counts[sep] {
			sep = r
		}
	}
	return sep
}

// csvValue turns a CSV field into a number when it is one as written
// ("41.37", "-5", "1e3"; "41,37" with ';' as separator), so the sheet
// holds numbers; anything else (a unit after the number, a time) stays
// text.
func csvValue(s string, sep rune) any {
	t := strings.TrimSpace(s)
	if t == "" {
		return nil
	}
	if sep == ';' && strings.Count(t, ",") == 1 && !strings.Contains(t, ".") {
		t = strings.Replace(t, ",", ".", 1)
	}
	if c := t[0]; c == '+' || c == '-' || c == '.' || c >= '0' && c <= '9' {
		if v, err := strconv.ParseFloat(t, 64); err == nil && !strings.ContainsAny(t, "xXpP_") &&
			!strings.EqualFold(t, "inf") && !strings.EqualFold(t, "+inf") && !strings.EqualFold(t, "-inf") {
			return v
		}
	}
	return s
}

// packageBuilder writes a package of one sheet, row by row: the smallest
// package the fill (and every office program) reads.
type packageBuilder struct {
	zw  *zip.Writer
	w   *bufio.Writer
	buf []byte
}

func newPackageBuilder(out io.Writer, sheet string) (*packageBuilder, error) {
	zw := zip.NewWriter(out)
	parts := []struct{ name, data string }{
		{"[Content_Types].xml", `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" +
			`<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>` +
			`<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="` + ctWorksheet + `"/><Override PartName="/xl/styles.xml" ContentType="` + ctStyles + `"/></Types>`},
		{"_rels/.rels", `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" +
			`<Relationships xmlns="` + nsPackageRels + `"><Relationship Id="rId1" Type="` + relOfficeDocument + `" Target="xl/workbook.xml"/></Relationships>`},
		{"xl/workbook.xml", `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" +
			`<workbook xmlns="` + nsMain + `" xmlns:r="` + nsRelationships + `"><bookViews><workbookView/></bookViews><sheets><sheet name="` + escapeAttr(sheet) + `" sheetId="1" r:id="rId1"/></sheets></workbook>`},
		{"xl/_rels/workbook.xml.rels", `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" +
			`<Relationships xmlns="` + nsPackageRels + `"><Relationship Id="rId1" Type="` + relWorksheet + `" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="` + relStyles + `" Target="styles.xml"/></Relationships>`},
		{"xl/styles.xml", minimalStyles},
	}
	for _, p := range parts {
		w, err := zw.Create(p.name)
		if err != nil {
			return nil, err
		}
		if _, err := io.WriteString(w, p.data); err != nil {
			return nil, err
		}
	}
	w, err := zw.Create("xl/worksheets/sheet1.xml")
	if err != nil {
		return nil, err
	}
	b := &packageBuilder{zw: zw, w: bufio.NewWriterSize(w, 64<<10)}
	b.w.WriteString(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" + `<worksheet xmlns="` + nsMain + `"><sheetData>`)
	return b, nil
}

// row writes row n (1-based, rising) of vals: nil, float64 or string.
func (b *packageBuilder) row(n int, vals []any) error {
	b.buf = append(b.buf[:0], `<row r="`...)
	b.buf = strconv.AppendInt(b.buf, int64(n), 10)
	b.buf = append(b.buf, `">`...)
	for i, v := range vals {
		switch v := v.(type) {
		case float64:
			b.buf = append(b.buf, `<c r="`...)
			b.buf = append(b.buf, cellName(i, n)...)
			b.buf = append(b.buf, `"><v>`...)
			b.buf = point.AppendNumber(b.buf, v)
			b.buf = append(b.buf, `</v></c>`...)
		case string:
			b.buf = append(b.buf, `<c r="`...)
			b.buf = append(b.buf, cellName(i, n)...)
			b.buf = append(b.buf, `" t="inlineStr"><is><t xml:space="preserve">`...)
			b.buf = appendEscaped(b.buf, v, false)
			b.buf = append(b.buf, `</t></is></c>`...)
		}
	}
	b.buf = append(b.buf, `</row>`...)
	_, err := b.w.Write(b.buf)
	return err
}

func (b *packageBuilder) close() error {
	b.w.WriteString(`</sheetData></worksheet>`)
	if err := b.w.Flush(); err != nil {
		return err
	}
	return b.zw.Close()
}
