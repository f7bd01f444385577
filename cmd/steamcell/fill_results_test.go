package main

import (
	"bytes"
	"encoding/json"
	"io"
	"net/http"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestReadmeFillResults runs every fill command of the README's section on
// uncertainties, processes and check mode on the Kestrel Bay demo (input
// paths from the repository root, outputs in a temporary folder), compares
// its report with the text block under it, and reads the cells the
// "cells" block lists ("header, row N: value") from the output, rounded as
// shown.
func TestReadmeFillResults(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	start := strings.Index(text, "<!-- fill-results:begin")
	end := strings.Index(text, "<!-- fill-results:end -->")
	if start < 0 || end < start {
		t.Fatal("README has no fill-results section markers")
	}
	dir := t.TempDir()
	blocks := strings.Split(text[start:end], "```")
	ran := 0
	for i := 1; i+4 < len(blocks); i += 2 {
		if !strings.HasPrefix(blocks[i], "sh\n") {
			continue
		}
		line := strings.TrimSpace(strings.TrimPrefix(blocks[i], "sh\n"))
		want, cells := blocks[i+2], blocks[i+4]
		if !strings.HasPrefix(want, "text\n") || !strings.HasPrefix(cells, "cells\n") {
			t.Fatalf("README: %q needs a text block and a cells block after it", line)
		}
		args := strings.Fields(line)[1:]
		var out string
		for k, a := range args {
			switch {
			case strings.HasPrefix(a, "testdata/"):
				args[k] = "../../" + a
			case strings.HasPrefix(a, "/tmp/"):
				out = filepath.Join(dir, filepath.Base(a))
				args[k] = out
			}
		}
		code, stdout, errs := runApp(t, args...)
		if code != ExitOK {
			t.Errorf("%s: exit %d: %s", line, code, errs)
			continue
		}
		if got, w := trimLines(strings.ReplaceAll(stdout, dir+"/", "/tmp/")), trimLines(strings.TrimPrefix(want, "text\n")); got != w {
			t.Errorf("%s: output\n%s\nREADME shows\n%s", line, got, w)
		}
		f, err := excelize.OpenFile(out)
		if err != nil {
			t.Fatal(err)
		}
		sheet := f.GetSheetList()[0]
		rows, _ := f.GetRows(sheet)
		for _, c := range strings.Split(strings.TrimSpace(strings.TrimPrefix(cells, "cells\n")), "\n") {
			head, value, ok := strings.Cut(c, ": ")
			header, rowText, ok2 := strings.Cut(head, ", row ")
			row, err := strconv.Atoi(rowText)
			if !ok || !ok2 || err != nil {
				t.Fatalf("README cells line %q is not \"header, row N: value\"", c)
			}
			col := -1
			for j, h := range rows[0] {
				if h == header {
					col = j
					break
				}
			}
			if col < 0 {
				t.Errorf("%s: no column %q", line, header)
				continue
			}
			ref, _ := excelize.CoordinatesToCellName(col+1, row)
			got, _ := f.GetCellValue(sheet, ref, excelize.Options{RawCellValue: true})
			if v, err := strconv.ParseFloat(got, 64); err == nil {
				decimals := 0
				if _, frac, ok := strings.Cut(value, "."); ok {
					decimals = len(frac)
				}
				got = strconv.FormatFloat(v, 'f', decimals, 64)
			}
			if got != value {
				t.Errorf("%s: %s = %q, README shows %q", line, ref, got, value)
			}
		}
		f.Close()
		ran++
	}
	if ran < 5 {
		t.Errorf("ran %d README examples, want the 5 the section shows", ran)
	}
}

// TestServeWorkbookResults: POST /workbook takes u=, process=, check= and
// check_tol=, as fill takes its flags; a bad tolerance or process is a
// 400, not a fill.
func TestServeWorkbookResults(t *testing.T) {
	base := serveForTest(t)
	post := func(file, query string) (*http.Response, []byte) {
		body, err := os.ReadFile("../../testdata/demo/" + file)
		if err != nil {
			t.Fatal(err)
		}
		resp, err := http.Post(base+"/workbook?name="+file+"&"+query, "text/csv", bytes.NewReader(body))
		if err != nil {
			t.Fatal(err)
		}
		b, _ := io.ReadAll(resp.Body)
		resp.Body.Close()
		return resp, b
	}
	resp, body := post("tg1_section_test.csv", "process=expansion&u=t=0.6K")
	if resp.StatusCode != 200 {
		t.Fatalf("process=expansion: %d %s", resp.StatusCode, body)
	}
	f, err := excelize.OpenReader(bytes.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	rows, _ := f.GetRows("tg1_section_test")
	if !strings.Contains(strings.Join(rows[0], "|"), "|u(efficiency)|") {
		t.Errorf("process=expansion: headers %q lack u(efficiency)", rows[0])
	}
	f.Close()

	resp, body = post("tg1_commissioning_record.csv", "check=h,s&check_tol=0.05%25")
	var sum map[string]any
	if resp.StatusCode != 200 || json.Unmarshal([]byte(resp.Header.Get("Steamcell-Summary")), &sum) != nil {
		t.Fatalf("check=h,s: %d %s", resp.StatusCode, body)
	}
	f, err = excelize.OpenReader(bytes.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	if v, _ := f.GetCellValue("tg1_commissioning_record", "P4"); !strings.HasPrefix(v, "beyond 0.05 %") {
		t.Errorf("check=h,s&check_tol=0.05%%: P4 = %q", v)
	}
	f.Close()

	for _, q := range []string{"check=h&check_tol=lots", "process=boiling", "check=h&check=s"} {
		if resp, body := post("tg1_commissioning_record.csv", q); resp.StatusCode != 400 {
			t.Errorf("%s: %d %s, want 400", q, resp.StatusCode, body)
		}
	}
}
