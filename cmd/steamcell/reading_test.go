package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"errors"
	"net/http"
	"net/http/httptest"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/point/tabletest"
	"steamcell/fn/units"
	"steamcell/server"
	"steamcell/workbook"
)

// reading is what one path made of a table: the inputs in base units, or
// the message that refused it.
type reading struct {
	in      []fn.Input
	refused string
}

// TestOneReadingEveryPath runs the shared header table through the three
// paths a table takes: /batch with a CSV body, /batch with JSON keys, and
// the workbook fill's reading of a sheet's header (workbook.ReadColumns).
// Each must read the same inputs, or refuse the same header. JSON objects
// have no row under their keys, so cases with a row of units take the
// other two paths only.
func TestOneReadingEveryPath(t *testing.T) {
	srv := server.New(server.Config{Version: "test"})
	for _, tc := range tabletest.Cases {
		paths := map[string]reading{
			"batch CSV": batchCSV(t, srv, tc),
			"workbook":  workbookReading(t, tc),
		}
		if !tc.HasUnitRow() {
			paths["batch JSON"] = batchJSON(t, srv, tc)
		}
		for path, r := range paths {
			if tc.Want == nil {
				if !strings.Contains(r.refused, tc.Refused) {
					t.Errorf("%s, %s: %q read as %v (%q); want it refused with %s", tc.Name, path, tc.Header, r.in, r.refused, tc.Refused)
				}
				continue
			}
			if r.refused != "" || len(r.in) != len(tc.Want) {
				t.Errorf("%s, %s: %q read as %v, refused %q; want %v", tc.Name, path, tc.Header, r.in, r.refused, tc.Want)
				continue
			}
			for i, w := range tc.Want {
				if r.in[i].Q != w.Q || !scalar.EqualWithinRel(r.in[i].Value, w.Value, 1e-12) {
					t.Errorf("%s, %s: input %d read as %s = %.15g, want %s = %.15g", tc.Name, path, i, r.in[i].Q.Symbol(), r.in[i].Value, w.Q.Symbol(), w.Value)
				}
			}
		}
	}
}

func csvLine(cells []string) string {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	_ = w.Write(cells)
	w.Flush()
	return b.String()
}

func batchCSV(t *testing.T, srv http.Handler, tc tabletest.Case) reading {
	body := csvLine(tc.Header)
	if tc.Units != nil {
		body += csvLine(tc.Units)
	}
	body += csvLine(tc.Row)
	return postBatch(t, srv, "text/csv", body, tc)
}

func batchJSON(t *testing.T, srv http.Handler, tc tabletest.Case) reading {
	var b []byte
	b = append(b, '{')
	for i, h := range tc.Header {
		if i > 0 {
			b = append(b, ',')
		}
		k, _ := json.Marshal(h)
		v, _ := json.Marshal(tc.Row[i])
		b = append(append(append(b, k...), ':'), v...)
	}
	return postBatch(t, srv, "application/json", "["+string(b)+"}]", tc)
}

// postBatch sends a batch of one row and reads the inputs as the answer
// echoes them (in the units it names), or the reason it refused them.
func postBatch(t *testing.T, srv http.Handler, ctype, body string, tc tabletest.Case) reading {
	t.Helper()
	req := httptest.NewRequest(http.MethodPost, "/batch?get=h&format=json", strings.NewReader(body))
	req.Header.Set("Content-Type", ctype)
	w := httptest.NewRecorder()
	srv.ServeHTTP(w, req)
	var a struct {
		Detail string // of a refusal, as RFC 9457 problem details
		Rows   []struct {
			Status string
			Inputs map[string]float64
			Units  map[string]string
		}
	}
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil {
		t.Fatalf("%s: answer is not JSON: %v\n%s", tc.Name, err, w.Body)
	}
	switch {
	case w.Code != http.StatusOK:
		return reading{refused: a.Detail}
	case len(a.Rows) != 1:
		t.Fatalf("%s: %d rows in %s", tc.Name, len(a.Rows), w.Body)
	case a.Rows[0].Status != "ok":
		return reading{refused: a.Rows[0].Status}
	}
	var r reading
	for _, want := range tc.Want {
		sym := want.Q.Symbol()
		u, err := units.Lookup(a.Rows[0].Units[sym], point.DimOf(want.Q))
		if err != nil {
			t.Fatalf("%s: unit of %s: %v", tc.Name, sym, err)
		}
		r.in = append(r.in, fn.Input{Q: want.Q, Value: u.ToBase(a.Rows[0].Inputs[sym], 0)})
	}
	if strings.Contains(body, "\n") { // a CSV body: the answer says how its columns were read
		for i, from := range tc.From {
			if from == point.FromSet && !strings.Contains(w.Header().Get("Steamcell-Columns"), "read as") {
				t.Errorf("%s: Steamcell-Columns %q does not say how column %d is read", tc.Name, w.Header().Get("Steamcell-Columns"), i)
			}
		}
	}
	return r
}

// workbookReading reads the case as a sheet: the header row, and under it
// the row of units or the row of data.
func workbookReading(t *testing.T, tc tabletest.Case) reading {
	below := tc.Units
	if below == nil {
		below = tc.Row
	}
	tab, err := workbook.ReadColumns(tc.Header, below, "", units.Set{})
	if err != nil {
		if !errors.Is(err, workbook.ErrAmbiguous) {
			t.Errorf("%s: workbook error %v, want one of kind ErrAmbiguous", tc.Name, err)
		}
		return reading{refused: err.Error()}
	}
	var given []point.Given
	for _, c := range tab.Columns {
		given = append(given, c.Given(tc.Row[c.Index]))
	}
	_, in, err := point.Solve(given, point.Options{})
	if err != nil {
		return reading{refused: err.Error()}
	}
	return reading{in: in[:]}
}
