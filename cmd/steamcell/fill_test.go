package main

import (
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// writeTestBook writes a small workbook of p,T readings for the fill
// command.
func writeTestBook(t testing.TB, path string) {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	for i, row := range [][]any{
		{"Boiler test (invented)"},
		{"Point", "Drum pressure [barg]", "Steam temperature [°C]"},
		{"A", 41.37, 415.7},
		{"B", 41.28, "broken"},
	} {
		cell, _ := excelize.CoordinatesToCellName(1, i+1)
		if err := f.SetSheetRow("Sheet1", cell, &row); err != nil {
			t.Fatal(err)
		}
	}
	if err := f.SaveAs(path); err != nil {
		t.Fatal(err)
	}
}

func TestFill(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "test.xlsx")
	writeTestBook(t, in)
	out := filepath.Join(dir, "test_filled.xlsx")

	code, stdout, stderr := runApp(t, "fill", in, "--add", "h,s,phase", "--units", "bar")
	if code != ExitOK {
		t.Fatalf("fill: exit %d, stderr %q", code, stderr)
	}
	if stderr != "" {
		t.Errorf("fill wrote %q to a stderr that is no terminal; want no progress bar", stderr)
	}
	for _, want := range []string{`sheet "Sheet1": inputs B,C, header row 2: 2 rows, 1 ok, 0 flagged, 1 failed`, "wrote " + out, "steamcell summary"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("fill output %q lacks %q", stdout, want)
		}
	}
	f, err := excelize.OpenFile(out)
	if err != nil {
		t.Fatalf("open the output: %v", err)
	}
	defer f.Close()
	for cell, want := range map[string]string{"D2": "Status (steamcell)", "E2": "h [kJ/kg]", "G2": "Phase", "D3": "ok", "D4": "not a number in C4", "G3": "superheated vapour"} {
		if got, _ := f.GetCellValue("Sheet1", cell); got != want {
			t.Errorf("%s = %q, want %q", cell, got, want)
		}
	}
	rows, _ := f.GetRows("steamcell summary")
	found := false
	for _, r := range rows {
		if len(r) > 1 && r[0] == "Program" && r[1] == "steamcell "+Version {
			found = true
		}
	}
	if !found {
		t.Errorf("summary lacks the program version %s: %q", Version, rows)
	}

	// A second run refuses to replace the output; --force replaces it.
	if code, _, stderr := runApp(t, "fill", in); code != ExitFailure || !strings.Contains(stderr, "exists") {
		t.Errorf("second fill: exit %d, stderr %q; want %d and a message that the output exists", code, stderr, ExitFailure)
	}
	if code, _, stderr := runApp(t, "fill", in, "--force"); code != ExitOK {
		t.Errorf("fill --force: exit %d, stderr %q", code, stderr)
	}
}

func TestFillExitCodes(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "test.xlsx")
	writeTestBook(t, in)
	text := filepath.Join(dir, "notes.xlsx")
	if err := os.WriteFile(text, []byte("Point,P [bar],T [C]\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	o := func(name string) string { return filepath.Join(dir, name) }
	for _, tc := range []struct {
		args []string
		want int
		say  string
	}{
		{[]string{"fill"}, ExitUsage, "one input workbook"},
		{[]string{"fill", in, in}, ExitUsage, "one input workbook"},
		{[]string{"fill", in, "-o", in}, ExitUsage, "is the input"},
		{[]string{"fill", in, "-o", o("a.xlsx"), "--add", "h,enthalpy_pt"}, ExitUsage, "not a property"},
		{[]string{"fill", in, "-o", o("b.xlsx"), "--units", "imperial"}, ExitUsage, "imperial"},
		{[]string{"fill", in, "-o", o("c.xlsx"), "--margin", "-1"}, ExitUsage, "--margin"},
		{[]string{"fill", in, "-o", o("d.xlsx"), "--map", "B=p"}, ExitUsage, "two per pair"},
		{[]string{"fill", in, "-o", o("e.csv")}, ExitUsage, "must end in .xlsx"},
		{[]string{"fill", in, "-o", o("f.xlsx"), "--unzip-limit", "0"}, ExitUsage, "--unzip-limit"},
		{[]string{"fill", o("missing.xlsx")}, ExitFailure, "no such file"},
		{[]string{"fill", text}, ExitFailure, "name it .csv"},
		{[]string{"fill", in, "-o", o("g.xlsx"), "--sheet", "Nope"}, ExitFailure, `no sheet "Nope"`},
		{[]string{"fill", in, "-o", o("h.xlsx"), "--margin", "0", "--patm", "95kPa"}, ExitOK, "wrote"},
	} {
		code, stdout, stderr := runApp(t, tc.args...)
		if code != tc.want || !strings.Contains(stdout+stderr, tc.say) {
			t.Errorf("steamcell %q: exit %d, output %q %q; want %d saying %q", tc.args, code, stdout, stderr, tc.want, tc.say)
		}
	}
}

// TestParseDigits: --digits takes decimals for all properties or by
// symbol, and refuses what is neither.
func TestParseDigits(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want map[string]int
		bad  bool
	}{
		{"", nil, false},
		{"3", map[string]int{"": 3}, false},
		{"h=1, s=5", map[string]int{"h": 1, "s": 5}, false},
		{"T=2,4", map[string]int{"t": 2, "": 4}, false},
		{"h=x", nil, true},
		{"zz=2", nil, true},
	} {
		got, err := parseDigits(tc.in)
		if (err != nil) != tc.bad || !tc.bad && !reflect.DeepEqual(got, tc.want) {
			t.Errorf("parseDigits(%q) = %v, %v; want %v (error %v)", tc.in, got, err, tc.want, tc.bad)
		}
	}
}
