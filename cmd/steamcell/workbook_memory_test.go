package main

import (
	"archive/zip"
	"bufio"
	"bytes"
	"fmt"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// memoryBound is the --workbook-memory of the server memory benchmark.
const memoryBound = 64 << 20

// BenchmarkServeWorkbookMemory posts uploads that made the old writer
// take many times --workbook-memory (issue 12: 4.5 GB with a 1.9 MB upload
// of many parts, 2.2 GB with rows of empty styled cells, under 512 MiB) to
// a server run in a child process with --workbook-memory 64MiB, and
// reports the child's peak resident memory as a ratio to the bound. It
// measures; it asserts nothing. Run it alone:
//
//	go test -run X -bench ServeWorkbookMemory -benchtime 1x ./cmd/steamcell/
func BenchmarkServeWorkbookMemory(b *testing.B) {
	dir := b.TempDir()
	book := filepath.Join(dir, "tests.xlsx")
	writeTestBook(b, book)
	base, err := os.ReadFile(book)
	if err != nil {
		b.Fatal(err)
	}
	uploads := []struct {
		name string
		data []byte
	}{
		{"many-parts", manyParts(b, base, 30000)}, // the most the bound admits: 32 MiB / 1 KiB
		{"empty-styled-cells", styledCells(b, 100000, 200)},
	}
	for _, u := range uploads {
		b.Run(u.name, func(b *testing.B) {
			var peak int64
			for range b.N {
				peak = max(peak, serveOnce(b, u.data))
			}
			b.ReportMetric(float64(len(u.data))/(1<<20), "upload-MiB")
			b.ReportMetric(float64(peak)/(1<<20), "peak-MiB")
			b.ReportMetric(float64(peak)/memoryBound, "peak/bound")
		})
	}
}

// serveOnce starts a server child, posts data to /workbook, stops the
// child and returns its peak resident memory in bytes.
func serveOnce(b *testing.B, data []byte) int64 {
	cmd := exec.Command(os.Args[0], "-test.run=^TestWorkbookServeChild$")
	cmd.Env = append(os.Environ(), "STEAMCELL_MEMORY_CHILD=1")
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		b.Fatal(err)
	}
	cmd.Stderr = os.Stderr
	if err := cmd.Start(); err != nil {
		b.Fatal(err)
	}
	defer cmd.Process.Kill()
	urlc := make(chan string, 1)
	peakc := make(chan int64, 1)
	go func() {
		sc := bufio.NewScanner(stdout)
		for sc.Scan() {
			if m := listening.FindStringSubmatch(sc.Text()); m != nil {
				urlc <- m[1]
			}
			var kb int64
			if _, err := fmt.Sscanf(sc.Text(), "peak %d kB", &kb); err == nil {
				peakc <- kb << 10
			}
		}
	}()
	var url string
	select {
	case url = <-urlc:
	case <-time.After(30 * time.Second):
		b.Fatal("the server child did not start")
	}
	resp, err := http.Post(url+"/workbook?name=up.xlsx", "application/octet-stream", bytes.NewReader(data))
	if err != nil {
		b.Fatal(err)
	}
	var sink bytes.Buffer
	sink.ReadFrom(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != 200 && resp.StatusCode != 400 {
		b.Fatalf("status %d: %.300s", resp.StatusCode, sink.String())
	}
	cmd.Process.Signal(syscall.SIGTERM)
	select {
	case peak := <-peakc:
		cmd.Wait()
		return peak
	case <-time.After(60 * time.Second):
		b.Fatal("the server child did not report its peak memory")
	}
	return 0
}

// TestWorkbookServeChild is the server child of the memory benchmark. Run
// on its own it does nothing.
func TestWorkbookServeChild(t *testing.T) {
	if os.Getenv("STEAMCELL_MEMORY_CHILD") != "1" {
		t.Skip("the child process of BenchmarkServeWorkbookMemory")
	}
	app := NewApp(strings.NewReader(""), os.Stdout, os.Stderr)
	code := app.Run([]string{"serve", "--addr", "127.0.0.1:0", "--workbook-memory", fmt.Sprint(memoryBound>>20) + "MiB", "--max-workbook", "256MiB", "--write-timeout", "20m", "--log-format", "json"})
	app.Close()
	// The child reads its own peak (VmHWM): a child's rusage on Linux also
	// counts the memory of the parent it was started from.
	status, _ := os.ReadFile("/proc/self/status")
	for _, line := range strings.Split(string(status), "\n") {
		if v, ok := strings.CutPrefix(line, "VmHWM:"); ok {
			fmt.Printf("peak %s\n", strings.TrimSpace(v))
		}
	}
	os.Exit(code)
}

// manyParts returns the package base with n small parts more.
func manyParts(b *testing.B, base []byte, n int) []byte {
	zr, err := zip.NewReader(bytes.NewReader(base), int64(len(base)))
	if err != nil {
		b.Fatal(err)
	}
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, f := range zr.File {
		zw.Copy(f)
	}
	for i := range n {
		w, _ := zw.Create(fmt.Sprintf("customXml/item%d.xml", i+1))
		fmt.Fprintf(w, `<?xml version="1.0"?><note n="%d">Kestrel Bay shift data (invented)</note>`, i)
	}
	zw.Close()
	return buf.Bytes()
}

// styledCells returns a package of one sheet of rows readings, each row
// followed by width empty cells that carry a style.
func styledCells(b *testing.B, rows, width int) []byte {
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	put := func(name, s string) {
		w, _ := zw.Create(name)
		w.Write([]byte(s))
	}
	put("[Content_Types].xml", `<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/></Types>`)
	put("_rels/.rels", `<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`)
	put("xl/workbook.xml", `<?xml version="1.0" encoding="UTF-8"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets><sheet name="Log" sheetId="1" r:id="rId1"/></sheets></workbook>`)
	put("xl/_rels/workbook.xml.rels", `<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/></Relationships>`)
	w, _ := zw.Create("xl/worksheets/sheet1.xml")
	bw := bufio.NewWriter(w)
	bw.WriteString(`<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>P [barg]</t></is></c><c r="B1" t="inlineStr"><is><t>T [°C]</t></is></c></row>`)
	for r := 2; r <= rows; r++ {
		fmt.Fprintf(bw, `<row r="%d"><c r="A%d"><v>%g</v></c><c r="B%d"><v>%g</v></c>`, r, r, 10+float64(r%40), r, 250+float64(r%200))
		for c := 3; c < 3+width; c++ {
			fmt.Fprintf(bw, `<c r="%s%d" s="0"/>`, colName(c), r)
		}
		bw.WriteString(`</row>`)
	}
	bw.WriteString(`</sheetData></worksheet>`)
	bw.Flush()
	zw.Close()
	return buf.Bytes()
}

func colName(c int) string {
	s := ""
	for c > 0 {
		c--
		s = string(rune('A'+c%26)) + s
		c /= 26
	}
	return s
}
