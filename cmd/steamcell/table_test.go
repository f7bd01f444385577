package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

func TestTableCommand(t *testing.T) {
	var out, errw bytes.Buffer
	a := NewApp(strings.NewReader(""), &out, &errw)
	if code := a.Run([]string{"table", "--from", "1MPa", "--to", "10MPa", "--step", "9MPa", "--units", "base", "--get", "hf"}); code != ExitOK {
		t.Fatalf("exit %d: %s", code, errw.String())
	}
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	// Ts(1 MPa) = 453.035632 K, R7-97(2012) Table 36.
	if len(lines) != 3 || lines[0] != "p [MPa],t [K],hf [kJ/kg],phase,status" || !strings.HasPrefix(lines[1], "1,453.03563") {
		t.Errorf("table:\n%s", out.String())
	}
	errw.Reset()
	if code := a.Run([]string{"table", "--from", "1bar", "--to", "2bar", "--step", "0bar"}); code != ExitUsage || !strings.Contains(errw.String(), "above zero") {
		t.Errorf("step 0: exit %d: %s", code, errw.String())
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "sh.xlsx")
	if code := a.Run([]string{"table", "--p", "10bar,40bar", "--from", "200C", "--to", "500C", "--step", "50C", "-o", path}); code != ExitOK {
		t.Fatalf("xlsx: exit %d: %s", code, errw.String())
	}
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, _ := f.GetRows("Table")
	// Two pressures, each a saturated-vapour row and 7 temperatures.
	if len(rows) != 1+2*8 {
		t.Errorf("%d rows, want 17", len(rows))
	}
}
