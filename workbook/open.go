package workbook

import (
	"archive/zip"
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// oleMagic starts an OLE2 compound file: an .xls workbook, or an .xlsx
// encrypted with a password.
var oleMagic = []byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}

// encryptedPackage is the name of the stream of an encrypted workbook, as
// the compound file directory stores it (UTF-16LE).
var encryptedPackage = utf16le("EncryptedPackage")

func utf16le(s string) []byte {
	b := make([]byte, 0, 2*len(s))
	for _, r := range s {
		b = append(b, byte(r), 0)
	}
	return b
}

// isCSVName reports whether name is read as CSV text.
func isCSVName(name string) bool {
	ext := strings.ToLower(filepath.Ext(name))
	return ext == ".csv" || ext == ".txt"
}

// open reads a workbook (or CSV text) held in data. name is the file name,
// for the format and for messages.
func open(data []byte, name string, unzipLimit int64) (*excelize.File, string, error) {
	base := filepath.Base(name)
	if len(data) == 0 {
		return nil, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf("%s is empty", base)}
	}
	switch {
	case bytes.HasPrefix(data, []byte("PK\x03\x04")):
		return openXLSX(data, base, unzipLimit)
	case bytes.HasPrefix(data, oleMagic):
		if bytes.Contains(data, encryptedPackage) {
			return nil, "", &Error{Kind: ErrPassword, Msg: fmt.Sprintf(
				"%s is protected with a password; open it, save a copy without the password, and fill the copy", base)}
		}
		return nil, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
			"%s is an .xls workbook (the older binary format); open it and save it as .xlsx, then fill that", base)}
	case isCSVName(name):
		f, note, err := openCSV(data, base)
		return f, note, err
	case looksLikeText(data):
		return nil, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
			"%s holds text, not an .xlsx workbook (a CSV file renamed?); if it is CSV, name it .csv to fill it", base)}
	}
	return nil, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
		"%s is not an .xlsx workbook (it does not start like one); give an .xlsx or a .csv file", base)}
}

// openXLSX opens a zip package with excelize, after checking what it
// unpacks to: the sizes checked are those the zip declares, and Go's zip
// reader refuses an entry that unpacks to more than it declares.
func openXLSX(data []byte, base string, unzipLimit int64) (*excelize.File, string, error) {
	damaged := func(err error) error {
		return &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
			"%s is not a complete .xlsx workbook (damaged or cut short: %v); open it in a spreadsheet program and save it again", base, err)}
	}
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		return nil, "", damaged(err)
	}
	var total uint64
	hasWorkbook := false
	for _, zf := range zr.File {
		total += zf.UncompressedSize64
		if strings.EqualFold(zf.Name, "xl/workbook.xml") {
			hasWorkbook = true
		}
	}
	if total > uint64(unzipLimit) {
		return nil, "", &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
			"%s unpacks to %s, more than the limit of %s; split the workbook, or raise the limit if you trust the file",
			base, byteSize(total), byteSize(uint64(unzipLimit)))}
	}
	if !hasWorkbook {
		return nil, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
			"%s is a zip file without a workbook inside (xl/workbook.xml); give an .xlsx file", base)}
	}
	xmlLimit := int64(excelize.StreamChunkSize)
	if xmlLimit > unzipLimit {
		xmlLimit = unzipLimit
	}
	f, err := excelize.OpenReader(bytes.NewReader(data), excelize.Options{UnzipSizeLimit: unzipLimit, UnzipXMLSizeLimit: xmlLimit})
	if err != nil {
		if f != nil {
			f.Close()
		}
		// excelize's own size check, known by its message only; the check
		// above refuses the same packages first.
		if strings.HasPrefix(err.Error(), "unzip size exceeds") {
			return nil, "", &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf("%s: %v", base, err)}
		}
		return nil, "", damaged(err)
	}
	return f, "", nil
}

// looksLikeText reports whether the start of data is text: no control
// bytes other than tab, CR and LF.
func looksLikeText(data []byte) bool {
	n := min(len(data), 4096)
	for _, c := range data[:n] {
		if c < 0x20 && c != '\t' && c != '\r' && c != '\n' {
			return false
		}
	}
	return true
}

// openCSV reads CSV text into a new workbook of one sheet named after the
// file. Numbers become numbers; everything else stays text. The separator
// is the one of ',', ';' and tab that the first line uses most.
func openCSV(data []byte, base string) (*excelize.File, string, error) {
	note := ""
	data = bytes.TrimPrefix(data, []byte("\xEF\xBB\xBF"))
	if !utf8.Valid(data) {
		data = latin1ToUTF8(data)
		note = base + " is not UTF-8; it was read as Latin-1 (ISO 8859-1)"
	}
	first, _, _ := bytes.Cut(data, []byte("\n"))
	sep := ','
	if n := bytes.Count(first, []byte(";")); n > bytes.Count(first, []byte(",")) {
		sep = ';'
	}
	if n := bytes.Count(first, []byte("\t")); n > bytes.Count(first, []byte(string(sep))) {
		sep = '\t'
	}
	r := csv.NewReader(bytes.NewReader(data))
	r.Comma = sep
	r.FieldsPerRecord = -1
	r.LazyQuotes = true
	r.ReuseRecord = true

	f := excelize.NewFile()
	sheet := sheetNameFor(base)
	if err := f.SetSheetName("Sheet1", sheet); err != nil {
		f.Close()
		return nil, "", fmt.Errorf("name the sheet of %s: %w", base, err)
	}
	row := 0
	var vals []any
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			f.Close()
			return nil, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf("%s is not readable CSV: %v", base, err)}
		}
		// The row is the line the record starts on, so that blank lines
		// (which the reader skips) stay blank rows.
		row, _ = r.FieldPos(0)
		if row > excelize.TotalRows {
			f.Close()
			return nil, "", &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
				"%s has more than %d lines, the most a sheet holds; split it", base, excelize.TotalRows)}
		}
		if len(rec) > excelize.MaxColumns {
			f.Close()
			return nil, "", &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf(
				"line %d of %s has %d fields, more than the %d columns of a sheet", row, base, len(rec), excelize.MaxColumns)}
		}
		vals = vals[:0]
		empty := true
		for _, s := range rec {
			if s != "" {
				empty = false
			}
			vals = append(vals, csvValue(s))
		}
		if empty {
			continue
		}
		cell, _ := excelize.CoordinatesToCellName(1, row)
		if err := f.SetSheetRow(sheet, cell, &vals); err != nil {
			f.Close()
			return nil, "", fmt.Errorf("copy line %d of %s: %w", row, base, err)
		}
	}
	return f, note, nil
}

// csvValue turns a CSV field into a number when it is one as written
// ("41.37", "-5", "1e3"), so the sheet holds numbers; anything else (a unit
// after the number, a comma, a time) stays text.
func csvValue(s string) any {
	t := strings.TrimSpace(s)
	if t == "" {
		return nil
	}
	if c := t[0]; c == '+' || c == '-' || c == '.' || c >= '0' && c <= '9' {
		if v, err := strconv.ParseFloat(t, 64); err == nil && !strings.ContainsAny(t, "xXpP_") &&
			!strings.EqualFold(t, "inf") && !strings.EqualFold(t, "+inf") && !strings.EqualFold(t, "-inf") {
			return v
		}
	}
	return s
}

func latin1ToUTF8(b []byte) []byte {
	out := make([]byte, 0, len(b)+len(b)/8)
	for _, c := range b {
		out = utf8.AppendRune(out, rune(c))
	}
	return out
}

// sheetNameFor makes a sheet name from a file name: without the
// extension, without the characters a sheet name may not hold, at most 31
// characters.
func sheetNameFor(base string) string {
	name := strings.TrimSuffix(base, filepath.Ext(base))
	name = strings.Map(func(r rune) rune {
		if strings.ContainsRune(`[]:*?/\`, r) {
			return '_'
		}
		return r
	}, name)
	name = strings.Trim(name, "' ")
	if utf8.RuneCountInString(name) > 31 {
		name = string([]rune(name)[:31])
	}
	if name == "" {
		name = "Data"
	}
	return name
}

func byteSize(n uint64) string {
	switch {
	case n >= 1<<30:
		return fmt.Sprintf("%.1f GiB", float64(n)/(1<<30))
	case n >= 1<<20:
		return fmt.Sprintf("%.1f MiB", float64(n)/(1<<20))
	}
	return fmt.Sprintf("%d bytes", n)
}
