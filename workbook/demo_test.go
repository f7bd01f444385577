package workbook_test

import (
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"steamcell/fn"
	"steamcell/fn/units"
	"steamcell/workbook"
)

// TestDemo fills the demo workbook of the invented Kestrel Bay mill and
// checks every filled value against the engine, the awkward cells, the
// comments and the summary.
func TestDemo(t *testing.T) {
	data := readFile(t, demoPath())
	f, sum := fillBytes(t, data, "kestrel_bay_tests.xlsx", opts())

	// Boiler 2: title block above the header in row 4; steam p,T and
	// feedwater p,T make two points per row; a blank row after the 15th
	// reading; a note typed into D25.
	const boiler = "Boiler 2 acceptance"
	steam := [2]in{{"C", fn.Pressure, "barg"}, {"D", fn.Temperature, "°C"}}
	feed := [2]in{{"E", fn.Pressure, "barg"}, {"F", fn.Temperature, "°C"}}
	if n := verifySheet(t, f, boiler, 5, 35, steam, outCols{"H", "I", "J", "K", "L", "M"}); n != 29 {
		t.Errorf("%s: %d steam points verified, want 29", boiler, n)
	}
	if n := verifySheet(t, f, boiler, 5, 35, feed, outCols{"N", "O", "P", "Q", "R", "S"}); n != 30 {
		t.Errorf("%s: %d feedwater points verified, want 30", boiler, n)
	}
	for cell, want := range map[string]string{
		"H4":  "Drum/Steam status (steamcell)",
		"I4":  "Drum/Steam h [kJ/kg]",
		"J4":  "Drum/Steam s [kJ/(kg·K)]",
		"K4":  "Drum/Steam v [m³/kg]",
		"L4":  "Drum/Steam x [-]",
		"M4":  "Drum/Steam phase",
		"N4":  "Feedwater status (steamcell)",
		"O4":  "Feedwater h [kJ/kg]",
		"H25": "not a number in D25",
		"N25": "ok",
		"H20": "",
		"N20": "",
	} {
		if got := raw(t, f, boiler, cell); got != want {
			t.Errorf("%s!%s = %q, want %q", boiler, cell, got, want)
		}
	}
	if c := commentOn(t, f, boiler, "D25"); !strings.Contains(c, `"TC fault, see log", not a number`) {
		t.Errorf("comment on D25 = %q, want one saying the text is not a number", c)
	}
	if s, _ := f.GetCellStyle(boiler, "H4"); s == 0 {
		t.Errorf("result header H4 has the default style, want the style of the input headers")
	}

	// TG-1: inlet and extraction pairs; a mean row of formulas without
	// stored results, calculated by excelize.
	const tg = "TG-1 stage check"
	inlet := [2]in{{"B", fn.Pressure, "bar"}, {"C", fn.Temperature, "°C"}}
	extraction := [2]in{{"D", fn.Pressure, "bar"}, {"E", fn.Temperature, "°C"}}
	if n := verifySheet(t, f, tg, 4, 15, inlet, outCols{"F", "G", "H", "I", "J", "K"}); n != 12 {
		t.Errorf("%s: %d inlet points verified, want 12", tg, n)
	}
	if n := verifySheet(t, f, tg, 4, 15, extraction, outCols{"L", "M", "N", "O", "P", "Q"}); n != 12 {
		t.Errorf("%s: %d extraction points verified, want 12", tg, n)
	}
	// Row 17 averages the columns: it is solved but is no test point
	// (issue 12: it was counted as one).
	if got, want := raw(t, f, tg, "F17"), "aggregate row (AVERAGE of the column), not a test point: ok (B17: formula calculated by steamcell; C17: formula calculated by steamcell)"; got != want {
		t.Errorf("%s!F17 = %q, want %q", tg, got, want)
	}
	var mean [2]string
	for i, c := range []string{"B17", "C17"} {
		v, err := f.CalcCellValue(tg, c, excelize.Options{RawCellValue: true})
		mustf(t, err, "calculate %s", c)
		mean[i] = v
	}
	verifyRow(t, f, tg, 17, mean, inlet, outCols{"F", "G", "H", "I", "J", "K"})

	// Wet steam: kPa and dryness in percent.
	const wet = "Wet steam samples"
	if n := verifySheet(t, f, wet, 2, 3, [2]in{{"B", fn.Pressure, "kPa"}, {"C", fn.Quality, "%"}}, outCols{"E", "F", "G", "H", "I", "J"}); n != 2 {
		t.Errorf("%s: %d points verified, want 2", wet, n)
	}

	// Process steam header: two readings within 1 K of saturation, one
	// pressure typed with its own unit, one temperature missing.
	const hdr = "Process steam header"
	if n := verifySheet(t, f, hdr, 4, 9, [2]in{{"B", fn.Pressure, "barg"}, {"C", fn.Temperature, "°C"}}, outCols{"E", "F", "G", "H", "I", "J"}); n != 5 {
		t.Errorf("%s: %d points verified, want 5", hdr, n)
	}
	for cell, want := range map[string]string{
		"E4": "ok",
		"E5": "check: 0.58 K above saturation, phase uncertain",
		"E6": "check: 0.28 K above saturation, phase uncertain",
		"E7": "ok",
		"E8": "two inputs needed, found one: C8 is blank",
	} {
		if got := raw(t, f, hdr, cell); got != want {
			t.Errorf("%s!%s = %q, want %q", hdr, cell, got, want)
		}
	}
	if c := commentOn(t, f, hdr, "E5"); !strings.Contains(c, "saturation temperature at this pressure (185.52 °C)") || !strings.Contains(c, "latent heat") {
		t.Errorf("comment on E5 = %q, want the saturation temperature and the latent heat", c)
	}
	if c := commentOn(t, f, hdr, "C8"); !strings.Contains(c, "C8 is blank") {
		t.Errorf("comment on C8 = %q, want it to say C8 is blank", c)
	}

	// Condensate return: the units in a row of their own under the names,
	// absolute kPa; subcooled condensate.
	const cond = "Condensate return"
	if n := verifySheet(t, f, cond, 5, 8, [2]in{{"B", fn.Pressure, "kPa"}, {"C", fn.Temperature, "°C"}}, outCols{"E", "F", "G", "H", "I", "J"}); n != 4 {
		t.Errorf("%s: %d points verified, want 4", cond, n)
	}
	for cell, want := range map[string]string{"F3": "h [kJ/kg]", "F4": "kJ/kg", "J8": "compressed liquid"} {
		if got := raw(t, f, cond, cell); got != want {
			t.Errorf("%s!%s = %q, want %q", cond, cell, got, want)
		}
	}

	// Counts and the summary sheet.
	if sum.Rows != 54 || sum.OK != 50 || sum.Flagged != 2 || sum.Failed != 2 || sum.Blank != 2 || sum.Aggregate != 1 {
		t.Errorf("summary rows %d ok %d flagged %d failed %d blank %d aggregate %d, want 54 50 2 2 2 1",
			sum.Rows, sum.OK, sum.Flagged, sum.Failed, sum.Blank, sum.Aggregate)
	}
	if sum.SummarySheet != "steamcell summary" {
		t.Errorf("summary sheet %q", sum.SummarySheet)
	}
	// The flagged and failed points link to their status cells.
	rows, err := f.GetRows(sum.SummarySheet)
	mustf(t, err, "read the summary")
	linked := 0
	for i, r := range rows {
		if len(r) > 1 && r[0] == "Boiler 2 acceptance, row 25" {
			cell, _ := excelize.CoordinatesToCellName(2, i+1)
			ok, target, err := f.GetCellHyperLink(sum.SummarySheet, cell)
			if err != nil || !ok || target != "'Boiler 2 acceptance'!H25" {
				t.Errorf("summary %s links to %q (%v, %v), want 'Boiler 2 acceptance'!H25", cell, target, ok, err)
			}
			linked++
		}
	}
	if linked != 1 {
		t.Errorf("summary lists the failed point of Boiler 2 %d times, want once", linked)
	}
	text := summaryText(t, f, sum.SummarySheet)
	for _, want := range append([]string{
		"Input file | kestrel_bay_tests.xlsx",
		"Filled on | 2031-03-14 09:26 UTC",
		"Program | steamcell 9.9.9-test",
		"Formulation | IAPWS-IF97 (IAPWS R7-97(2012))",
		"Unit set of results | si: h in kJ/kg, s in kJ/(kg·K), v in m³/kg",
		"Atmosphere for gauge units | 101.325 kPa",
		"Rows with inputs | 54",
		"Aggregate rows (solved, not test points) | 1",
		"Boiler 2 acceptance, row 25 | Boiler 2 acceptance!H25 | not a number in D25",
		"flagged (check) | 2",
		"failed (no values) | 2",
		`Boiler 2 acceptance | Feedwater | E "Feedwater pressure [barg]" as p in barg | F "Feedwater temperature [°C]" as T in °C | N:S | 30 | 0 | 0`,
		`Process steam header | yes | 3 | 6 | 3 | 2 | 1 | 0 | 3`,
		`Condensate return | yes | 3 | 4 | 4 | 0 | 0 | 0 | 0 | units read from row 4, under the header`,
	}, workbook.Cautions...) {
		if !strings.Contains(text, want) {
			t.Errorf("summary lacks %q; it reads:\n%s", want, text)
		}
	}
	for _, c := range []string{"engineering calculation", "does not replace pressure-equipment and boiler design codes, inspection rules or a licensed engineer's review", "can kill or maim", "local codes and licensed practice"} {
		if !strings.Contains(text, c) {
			t.Errorf("summary cautions lack %q", c)
		}
	}
}

// TestDemoUnits fills the demo in US units: the written values are the
// engine's converted to Btu/lb, and the margin flag speaks °F.
func TestDemoUnits(t *testing.T) {
	set, err := units.SetByName("us")
	mustf(t, err, "unit set")
	opt := opts()
	opt.Point.Set = set
	opt.Sheet = "Process steam header"
	opt.Add = []string{"h", "t", "region"}
	f, _ := fillBytes(t, readFile(t, demoPath()), "kestrel_bay_tests.xlsx", opt)
	const sh = "Process steam header"
	for cell, want := range map[string]string{"E3": "Status (steamcell)", "F3": "h [Btu/lb]", "G3": "T [°F]", "H3": "IF97 region",
		"E5": "check: 1.1 °F above saturation, phase uncertain", "H4": "2"} {
		if got := raw(t, f, sh, cell); got != want {
			t.Errorf("%s = %q, want %q", cell, got, want)
		}
	}
	st := expect(t, [2]string{"10.20", "191.4"}, [2]in{{"B", fn.Pressure, "barg"}, {"C", fn.Temperature, "°C"}}, units.Set{})
	hu := set.Unit(units.SpecificEnergy)
	tu := set.Unit(units.Temperature)
	if got, want := num(t, f, sh, "F4"), hu.FromBase(st.H, 0); !scalarEq(got, want) {
		t.Errorf("F4 h = %.17g Btu/lb, want %.17g", got, want)
	}
	if got, want := num(t, f, sh, "G4"), tu.FromBase(st.T, 0); !scalarEq(got, want) {
		t.Errorf("G4 T = %.17g °F, want %.17g", got, want)
	}
	if names := f.GetSheetList(); len(names) != 6 {
		t.Errorf("sheets %q, want the five of the demo and the summary", names)
	}
}
