package main

import (
	"archive/zip"
	"bytes"
	"io"
	"mime"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// TestServeWorkbookPackages posts packages to POST /workbook with the
// real filler: an .xlsm comes back as an .xlsm with the macro-enabled
// media type and its VBA part, and a zip that lies about its sizes is
// 400 bad_workbook (issue 12: named .xlsx, and 500).
func TestServeWorkbookPackages(t *testing.T) {
	base := serveForTest(t)

	dir := t.TempDir()
	book := filepath.Join(dir, "tests.xlsx")
	writeTestBook(t, book)
	data, err := os.ReadFile(book)
	if err != nil {
		t.Fatal(err)
	}
	post := func(name string, body []byte) (*http.Response, []byte) {
		resp, err := http.Post(base+"/workbook?name="+name, "application/octet-stream", bytes.NewReader(body))
		if err != nil {
			t.Fatal(err)
		}
		b, _ := io.ReadAll(resp.Body)
		resp.Body.Close()
		return resp, b
	}

	xlsm := withPart(t, data, "xl/vbaProject.bin", append([]byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}, make([]byte, 56)...))
	resp, body := post("tests.xlsm", xlsm)
	_, params, _ := mime.ParseMediaType(resp.Header.Get("Content-Disposition"))
	if resp.StatusCode != 200 || resp.Header.Get("Content-Type") != "application/vnd.ms-excel.sheet.macroEnabled.12" || params["filename"] != "tests_filled.xlsm" {
		t.Errorf(".xlsm: %d %q %q, want 200, the macro-enabled type, tests_filled.xlsm", resp.StatusCode, resp.Header.Get("Content-Type"), params["filename"])
	}
	if zr, err := zip.NewReader(bytes.NewReader(body), int64(len(body))); err != nil || !hasPart(zr, "xl/vbaProject.bin") {
		t.Errorf(".xlsm answer lost its VBA part (%v)", err)
	}

	resp, body = post("tests.xlsx", data)
	if resp.StatusCode != 200 || resp.Header.Get("Content-Type") != "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet" {
		t.Errorf(".xlsx: %d %q", resp.StatusCode, resp.Header.Get("Content-Type"))
	}

	lying := lieAboutSize(t, data, "docProps/app.xml")
	resp, body = post("tests.xlsx", lying)
	if resp.StatusCode != 400 || !strings.Contains(string(body), "bad_workbook") || !strings.Contains(string(body), "damaged") {
		t.Errorf("a zip that lies about its sizes: %d %s, want 400 bad_workbook", resp.StatusCode, body)
	}
}

func hasPart(zr *zip.Reader, name string) bool {
	for _, f := range zr.File {
		if f.Name == name {
			return true
		}
	}
	return false
}

// withPart returns the package with one more part.
func withPart(t *testing.T, data []byte, name string, part []byte) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	for _, f := range zr.File {
		if err := zw.Copy(f); err != nil {
			t.Fatal(err)
		}
	}
	w, err := zw.Create(name)
	if err != nil {
		t.Fatal(err)
	}
	w.Write(part)
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// lieAboutSize returns the package with the entry name declaring a size
// smaller than its data.
func lieAboutSize(t *testing.T, data []byte, name string) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	for _, f := range zr.File {
		h := f.FileHeader
		if f.Name == name {
			h.UncompressedSize64 /= 2
		}
		r, err := f.OpenRaw()
		if err != nil {
			t.Fatal(err)
		}
		w, err := zw.CreateRaw(&h)
		if err != nil {
			t.Fatal(err)
		}
		io.Copy(w, r)
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// serveForTest runs steamcell serve on a free port of 127.0.0.1 until the
// test ends, and returns its base URL.
func serveForTest(t *testing.T) string {
	t.Helper()
	var out, errb lockedBuffer
	app := NewApp(strings.NewReader(""), &out, &errb)
	code := make(chan int, 1)
	go func() { code <- app.Run([]string{"serve", "--addr", "127.0.0.1:0"}) }()
	base := waitURL(t, &out)
	t.Cleanup(func() {
		app.Close()
		select {
		case <-code:
		case <-time.After(10 * time.Second):
			t.Error("serve did not stop after Close")
		}
	})
	return base
}
