package main

import (
	"encoding/json"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
)

func TestStateTable(t *testing.T) {
	code, out, errs := runApp(t, "state", "p=6barg", "t=330C")
	if code != ExitOK {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	for _, want := range []string{"superheated vapour", "IF97 region 2", "kJ/kg", "IAPWS-IF97", "licensed engineer"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

// The JSON answer matches the engine: 6 barg = 0.701325 MPa absolute with
// the standard atmosphere (NIST SP 811 (2008) B.8: 1 bar = 1e5 Pa exactly,
// 1 atm = 101 325 Pa exactly); 330 °C = 603.15 K.
func TestStateJSON(t *testing.T) {
	code, out, errs := runApp(t, "state", "p=6barg", "t=330C", "--json", "--units", "si-mpa")
	if code != ExitOK {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	want, _ := fn.FromPT(0.701325, 603.15)
	if h, _ := m["h"].(float64); !scalar.EqualWithinRel(h, want.H, 1e-12) {
		t.Errorf("h = %v, want %v", m["h"], want.H)
	}
	if p, _ := m["p"].(float64); !scalar.EqualWithinRel(p, 0.701325, 1e-12) {
		t.Errorf("p = %v MPa, want 0.701325", m["p"])
	}
	for _, k := range []string{"phase", "region", "units", "formulation", "warnings", "caution"} {
		if _, ok := m[k]; !ok {
			t.Errorf("JSON lacks %q", k)
		}
	}
}

func TestStateErrors(t *testing.T) {
	for _, tc := range []struct {
		args []string
		code int
		msg  string
	}{
		{[]string{"state", "p=6barg"}, ExitUsage, "two inputs"},
		{[]string{"state", "p=6barg", "t=330C", "h=3000"}, ExitUsage, "two inputs"},
		{[]string{"state", "p6barg", "t=330C"}, ExitUsage, "name=value"},
		{[]string{"state", "p=300C", "t=330C"}, ExitUsage, "pressure"},
		{[]string{"state", "p=1,5bar", "t=330C"}, ExitUsage, "comma"},
		{[]string{"state", "p=6barg", "t=330C", "--units", "cgs"}, ExitUsage, "unit set"},
		{[]string{"state", "p=200MPa", "t=330C"}, ExitFailure, "100 MPa"},
		{[]string{"state", "p=30MPa", "x=0.5"}, ExitFailure, "critical"},
		{[]string{"state", "p=1MPa", "t=300C", "--get", "nonsense"}, ExitUsage, "not a property"},
	} {
		code, _, errs := runApp(t, tc.args...)
		if code != tc.code || !strings.Contains(strings.ToLower(errs), strings.ToLower(tc.msg)) {
			t.Errorf("steamcell %q: exit %d, stderr %q; want exit %d mentioning %q", tc.args, code, errs, tc.code, tc.msg)
		}
	}
}
