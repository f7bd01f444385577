package server_test

import (
	"bytes"
	"context"
	"encoding/json"
	"net/http/httptest"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"steamcell/fn"
	"steamcell/fn/units"
	"steamcell/server"
)

// sheetBlock is one "spreadsheet" block of the README: cells and what is
// typed into them, in one locale.
type sheetBlock struct {
	locale string         // "en-US" unless the block's info string names another
	cells  map[string]any // cell name -> number, or text ("=…" a formula)
}

// readmeSheets returns the ```spreadsheet blocks of the README, whose
// lines are a cell name and what the user types into it.
func readmeSheets(t *testing.T) []sheetBlock {
	t.Helper()
	data, err := os.ReadFile("../README.md")
	if err != nil {
		t.Fatal(err)
	}
	var out []sheetBlock
	var cur *sheetBlock
	line := regexp.MustCompile(`^([A-Z]+[0-9]+)\s+(.+)$`)
	for i, l := range strings.Split(string(data), "\n") {
		switch {
		case cur == nil && strings.HasPrefix(l, "```spreadsheet"):
			cur = &sheetBlock{locale: "en-US", cells: map[string]any{}}
			if loc := strings.TrimSpace(strings.TrimPrefix(l, "```spreadsheet")); loc != "" {
				cur.locale = loc
			}
		case cur != nil && strings.TrimSpace(l) == "```":
			out = append(out, *cur)
			cur = nil
		case cur != nil:
			m := line.FindStringSubmatch(l)
			if m == nil {
				t.Fatalf("README line %d: %q is not a cell and its content", i+1, l)
			}
			if v, err := strconv.ParseFloat(m[2], 64); err == nil {
				cur.cells[m[1]] = v
			} else {
				cur.cells[m[1]] = m[2]
			}
		}
	}
	return out
}

// calcCell is a cell as LibreOffice shows it.
type calcCell struct {
	Text  string  `json:"text"`
	Value float64 `json:"value"`
	Error int     `json:"error"`
}

type calcResult struct {
	Version  string              `json:"version"`
	Seconds  float64             `json:"seconds"`
	Cells    map[string]calcCell `json:"cells"`
	Reopened []struct {
		File    string `json:"file"`
		Setting struct {
			Links   int      `json:"links"`
			Trusted []string `json:"trusted"`
		} `json:"setting"`
		Cells map[string]calcCell `json:"cells"`
	} `json:"reopened"`
}

// runCalc runs a job through server/testdata/calc.py in LibreOffice Calc
// under the locale (LC_ALL).
func runCalc(t *testing.T, locale string, job map[string]any) calcResult {
	t.Helper()
	in, _ := json.Marshal(job)
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, unoPython, "testdata/calc.py")
	cmd.Env = append(os.Environ(), "LC_ALL="+strings.ReplaceAll(locale, "-", "_")+".UTF-8", "HOME="+t.TempDir())
	cmd.Stdin = bytes.NewReader(in)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("LibreOffice (%s): %v\n%s", locale, err, stderr.String())
	}
	var r calcResult
	if err := json.Unmarshal(out, &r); err != nil {
		t.Fatalf("LibreOffice (%s) answered %q: %v\n%s", locale, out, err, stderr.String())
	}
	return r
}

// unoPython is the Python that Debian's python3-uno installs into.
const unoPython = "/usr/bin/python3"

// TestLibreOfficeFormulas enters every WEBSERVICE formula of the README,
// as a user types it and with its inputs in cells, in real LibreOffice
// Calc (headless, over UNO), in each locale the README gives them for,
// and checks every result against the engine. It then checks that
// /metrics counts no error for the recalculation (Calc probes with
// OPTIONS and HEAD before its GETs; issue 15), that a saved .ods reopened
// shows Err:540 unless both settings the README names are set, and that
// a saved .xlsx reopens with the values saved in it.
//
// It needs soffice and python3-uno (apt-get install libreoffice-calc-nogui
// python3-uno; .ci/run installs them) and fails without them.
func TestLibreOfficeFormulas(t *testing.T) {
	if _, err := exec.LookPath("soffice"); err != nil {
		t.Fatalf("LibreOffice is missing (soffice not on PATH): install libreoffice-calc-nogui and python3-uno: %v", err)
	}
	if out, err := exec.Command(unoPython, "-c", "import uno").CombinedOutput(); err != nil {
		t.Fatalf("python3-uno is missing (%s cannot import uno): %v\n%s", unoPython, err, out)
	}
	srv, _ := newServer(t, server.Config{})
	ts := httptest.NewServer(srv)
	defer ts.Close()

	want := readmeCellWants(t)
	sheets := readmeSheets(t)
	locales := map[string]bool{}
	for _, sh := range sheets {
		locales[sh.locale] = true
		dir := t.TempDir()
		cells := map[string]any{}
		formulas := 0
		for name, v := range sh.cells {
			if f, ok := v.(string); ok && strings.Contains(f, "WEBSERVICE(") {
				v = strings.ReplaceAll(f, "http://127.0.0.1:8097", ts.URL)
				formulas++
				if want[name] == nil {
					t.Errorf("%s %s: the README formula %s has no engine value to check it against", sh.locale, name, f)
				}
			}
			cells[name] = v
		}
		trusted := []string{"file://" + dir + "/"}
		r := runCalc(t, sh.locale, map[string]any{
			"cells": cells,
			"save":  map[string]string{filepath.Join(dir, "sheet.ods"): "calc8", filepath.Join(dir, "sheet.xlsx"): "Calc MS Excel 2007 XML"},
			"reopen": []map[string]any{
				{"links": 0, "trusted": trusted},    // both settings: the values
				{"links": 0, "trusted": []string{}}, // always, but not a trusted location
				{"links": 2, "trusted": trusted},    // trusted, but links on request
			},
		})
		t.Logf("LibreOffice %s, %s: %d formulas recalculated in %.2f s", r.Version, sh.locale, formulas, r.Seconds)
		for name, v := range sh.cells {
			if f, ok := v.(string); !ok || !strings.Contains(f, "WEBSERVICE(") {
				continue
			}
			if check := want[name]; check != nil {
				if msg := check(r.Cells[name]); msg != "" {
					t.Errorf("%s %s %s: %s", sh.locale, name, v, msg)
				}
			}
		}
		for _, re := range r.Reopened {
			both := re.Setting.Links == 0 && len(re.Setting.Trusted) > 0
			for name, v := range sh.cells {
				if f, ok := v.(string); !ok || !strings.Contains(f, "WEBSERVICE(") {
					continue
				}
				c := re.Cells[name]
				switch {
				case strings.HasSuffix(re.File, ".xlsx"):
					// Calc opens an .xlsx with the values saved in it,
					// fetched again under no setting.
					if c.Error != 0 || c.Text != r.Cells[name].Text {
						t.Errorf("%s reopened with links %d, trusted %v: %s = %+v, want the saved %q", filepath.Base(re.File), re.Setting.Links, re.Setting.Trusted, name, c, r.Cells[name].Text)
					}
				case both && c != r.Cells[name]:
					t.Errorf("%s reopened with both settings: %s = %+v, recalculated %+v", filepath.Base(re.File), name, c, r.Cells[name])
				case !both && c.Error != 540:
					t.Errorf("%s reopened with links %d, trusted %v: %s = %+v, want Err:540", filepath.Base(re.File), re.Setting.Links, re.Setting.Trusted, name, c)
				}
			}
		}
	}
	for _, loc := range []string{"en-US", "de-DE"} {
		if !locales[loc] {
			t.Errorf("the README gives no spreadsheet block for %s", loc)
		}
	}
	metrics := get(srv, "/metrics").Body.String()
	if strings.Contains(metrics, "steamcell_http_errors_total{") {
		t.Errorf("/metrics counts errors after the LibreOffice recalculation:\n%s", grepLines(metrics, "steamcell_http_errors_total"))
	}
	t.Logf("requests:\n%s", grepLines(metrics, "steamcell_http_requests_total{"))
}

// readmeCellWants gives, for each formula cell of the README's sheets,
// the check of what Calc shows against the engine. The inputs are those
// of the README: A2 6 barg, B2 330 °C; A3 28 inHg of vacuum, B3 quality
// 0.92; C4 has its inputs in the URL.
func readmeCellWants(t *testing.T) map[string]func(calcCell) string {
	t.Helper()
	parse := func(text string, d units.Dim) float64 {
		v, err := units.Parse(text, d, units.Options{})
		if err != nil {
			t.Fatal(err)
		}
		return v
	}
	in := func(q fn.Quantity, text string) fn.Input { return fn.Input{Q: q, Value: parse(text, point2dim(q))} }
	drum := solve(t, in(fn.Pressure, "6 barg"), in(fn.Temperature, "330 C"))
	condenser := solve(t, in(fn.Pressure, "28 inHg vac"), in(fn.Quality, "0.92"))
	c4 := solve(t, in(fn.Pressure, "600 kPa"), in(fn.Temperature, "330 C"))
	sat, err := fn.SaturationAtP(drum.P)
	if err != nil {
		t.Fatal(err)
	}
	unit := func(name string, d units.Dim) units.Unit {
		u, err := units.Lookup(name, d)
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	number := func(want float64) func(calcCell) string {
		return func(c calcCell) string {
			if c.Error != 0 || !same(c.Value, want) {
				return "Calc shows " + c.Text + " (error " + strconv.Itoa(c.Error) + "), the engine " + strconv.FormatFloat(want, 'g', -1, 64)
			}
			return ""
		}
	}
	text := func(want string) func(calcCell) string {
		return func(c calcCell) string {
			if c.Error != 0 || c.Text != want {
				return "Calc shows " + strconv.Quote(c.Text) + " (error " + strconv.Itoa(c.Error) + "), want " + strconv.Quote(want)
			}
			return ""
		}
	}
	status := func(st fn.State) string {
		if len(st.Warnings) > 0 {
			t.Fatalf("the README's states are away from saturation, but %v warns", st)
		}
		return "ok"
	}
	return map[string]func(calcCell) string{
		"C2": number(drum.H),
		"D2": number(unit("Btu/(lb·°R)", units.SpecificEntropy).FromBase(drum.S, 0)),
		"E2": text(status(drum)),
		"F2": text(drum.Phase.String()),
		"G2": number(unit("°C", units.Temperature).FromBase(sat.T, 0)),
		"C3": number(condenser.H),
		"E3": text(status(condenser)),
		"C4": number(unit("Btu/lb", units.SpecificEnergy).FromBase(c4.H, 0)),
	}
}

// point2dim is the quantity of units that an input quantity is read in.
func point2dim(q fn.Quantity) units.Dim {
	switch q {
	case fn.Pressure:
		return units.Pressure
	case fn.Temperature:
		return units.Temperature
	}
	return units.Quality
}
