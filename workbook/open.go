package workbook

import (
	"bytes"
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"unicode/utf8"
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

// openInput looks at the start of the input and returns the package to
// fill: the input itself when it is a zip package, a package made from
// the text when it is CSV. note says how CSV text was read, when that is
// worth saying. limit bounds what the input unpacks to, memory what the
// fill may hold.
func openInput(ra io.ReaderAt, size int64, name string, limit, memory int64) (io.ReaderAt, int64, string, error) {
	base := filepath.Base(name)
	if size == 0 {
		return nil, 0, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf("%s is empty", base)}
	}
	head := make([]byte, min(size, 4096))
	if _, err := ra.ReadAt(head, 0); err != nil && err != io.EOF {
		return nil, 0, "", fmt.Errorf("read %s: %w", base, err)
	}
	switch {
	case bytes.HasPrefix(head, []byte("PK\x03\x04")):
		return ra, size, "", nil
	case bytes.HasPrefix(head, oleMagic):
		data := make([]byte, min(size, 1<<20))
		_, _ = ra.ReadAt(data, 0)
		if bytes.Contains(data, encryptedPackage) {
			return nil, 0, "", &Error{Kind: ErrPassword, Msg: fmt.Sprintf(
				"%s is protected with a password; open it, save a copy without the password, and fill the copy", base)}
		}
		return nil, 0, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
			"%s is an .xls workbook (the older binary format); open it and save it as .xlsx, then fill that", base)}
	case isCSVName(name):
		// CSV text is decoded and made into a package in memory, a few
		// copies of it at once: an eighth of the memory bound.
		if textLimit := min(limit, memory/8); size > textLimit {
			return nil, 0, "", &Error{Kind: ErrTooLarge, Msg: fmt.Sprintf("%s is %s, more than the limit of %s for CSV text; split it", base, byteSize(uint64(size)), byteSize(uint64(textLimit)))}
		}
		data := make([]byte, size)
		if _, err := ra.ReadAt(data, 0); err != nil && err != io.EOF {
			return nil, 0, "", fmt.Errorf("read %s: %w", base, err)
		}
		pkgData, note, err := csvPackage(data, base)
		if err != nil {
			return nil, 0, "", err
		}
		return bytes.NewReader(pkgData), int64(len(pkgData)), note, nil
	case looksLikeText(head):
		return nil, 0, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
			"%s holds text, not an .xlsx workbook (a CSV file renamed?); if it is CSV, name it .csv to fill it", base)}
	}
	return nil, 0, "", &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf(
		"%s is not an .xlsx workbook (it does not start like one); give an .xlsx or a .csv file", base)}
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
