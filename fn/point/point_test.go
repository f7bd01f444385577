package point

import (
	"encoding/json"
	"errors"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/fn/units"
)

func TestReadAndSolve(t *testing.T) {
	// 6 barg with the standard atmosphere is 0.701325 MPa (exact by the
	// definitions 1 bar = 0.1 MPa and 1 atm = 0.101325 MPa, NIST SP 811
	// (2008) B.8); 330 °C is 603.15 K exactly.
	st, in, err := Solve([]Given{{Name: "p", Text: "6 barg"}, {Name: "T", Text: "330C"}}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinRel(in[0].Value, 0.701325, 1e-15) || !scalar.EqualWithinRel(in[1].Value, 603.15, 1e-15) {
		t.Errorf("inputs read as %v", in)
	}
	want, _ := fn.FromPT(0.701325, 603.15)
	if !scalar.EqualWithinRel(st.H, want.H, 1e-15) {
		t.Errorf("h = %g, want %g", st.H, want.H)
	}
	// A unit given apart from the text, as from a column header.
	_, in, err = Solve([]Given{{Name: "pressure", Text: "6", Unit: "barg"}, {Name: "temperature", Text: "603.15", Unit: "K"}}, Options{})
	if err != nil || !scalar.EqualWithinRel(in[0].Value, 0.701325, 1e-15) {
		t.Errorf("separate units: %v, %v", in, err)
	}
}

func TestReadErrors(t *testing.T) {
	for _, tc := range []struct {
		given []Given
		kind  error
	}{
		{[]Given{{Name: "p", Text: "1 MPa"}}, ErrInputCount},
		{[]Given{{Name: "p", Text: "1 MPa"}, {Name: "t", Text: "300 K"}, {Name: "h", Text: "100"}}, ErrInputCount},
		{[]Given{{Name: "p", Text: "1 MPa"}, {Name: "pressure", Text: "2 MPa"}}, ErrRepeatedInput},
		{[]Given{{Name: "p", Text: "1 MPa"}, {Name: "zz", Text: "2"}}, ErrUnknownInput},
		{[]Given{{Name: "p", Text: "300 C"}, {Name: "t", Text: "300 C"}}, units.ErrWrongDimension},
		{[]Given{{Name: "p", Text: "1,5 bar"}, {Name: "t", Text: "300 C"}}, units.ErrAmbiguousNumber},
		{[]Given{{Name: "p", Text: ""}, {Name: "t", Text: "300 C"}}, units.ErrEmpty},
		{[]Given{{Name: "p", Text: "1 MPa"}, {Name: "x", Text: "85"}}, units.ErrQualityRange},
	} {
		_, _, err := read(tc.given, &Options{})
		if !errors.Is(err, tc.kind) {
			t.Errorf("read(%v) error %v, want kind %v", tc.given, err, tc.kind)
		}
	}
}

// An out-of-range input is echoed as given, and the whole message, the
// limit too, is in the unit it was given in. Limits from IAPWS R7-97(2012) section 4 (p ≤ 100 MPa,
// T ≤ 2273.15 K); units by NIST SP 811 (2008) B.8 (1 bar = 0.1 MPa,
// K = °C + 273.15 exactly).
func TestOutOfRangeEchoesTheUsersUnit(t *testing.T) {
	for _, tc := range []struct {
		given []Given
		want  string
	}{
		{[]Given{{Name: "p", Text: "1200 bar"}, {Name: "t", Text: "300 C"}}, "p = 1200 bar: outside the range of validity: p above 1000 bar (given as p=1200 bar)"},
		{[]Given{{Name: "p", Text: "1 MPa"}, {Name: "t", Text: "3300", Unit: "°C"}}, "t = 3300 °C: outside the range of validity: T above 2000 °C (given as t=3300 °C)"},
		{[]Given{{Name: "p", Text: "120 MPa"}, {Name: "t", Text: "600 K"}}, "(given as p=120 MPa)"},
		// 100 MPa less the standard atmosphere (0.101325 MPa) is 998.98675 bar.
		{[]Given{{Name: "p", Text: "1100 barg"}, {Name: "t", Text: "300 C"}}, "p = 1100 barg: outside the range of validity: p above 998.987 barg (given as p=1100 barg)"},
	} {
		_, _, err := Solve(tc.given, Options{})
		if !errors.Is(err, fn.ErrOutOfRange) || !strings.HasSuffix(err.Error(), tc.want) {
			t.Errorf("Solve(%v) error %v, want one of kind %v ending %q", tc.given, err, fn.ErrOutOfRange, tc.want)
		}
	}
}

func TestSymbols(t *testing.T) {
	if s, err := Symbols(nil); err != nil || s != nil {
		t.Errorf("Symbols(nil) = %v, %v", s, err)
	}
	if s, err := Symbols([]string{"H", " s", "mu"}); err != nil || s[0] != "h" || s[1] != "s" || s[2] != "mu" {
		t.Errorf("Symbols(H, s, mu) = %v, %v", s, err)
	}
	if _, err := Symbols([]string{"enthalpy_pt"}); !errors.Is(err, ErrUnknownProperty) {
		t.Errorf("unknown symbol: %v", err)
	}
}

// Render converts to the set's units: 1 MPa, 300 °C superheated steam in
// the us set. Conversion factors: NIST SP 811 (2008) B.8 (psi, Btu/lb);
// °F from K exactly.
func TestRenderUnits(t *testing.T) {
	st, err := fn.FromPT(1, 573.15)
	if err != nil {
		t.Fatal(err)
	}
	us, _ := units.SetByName("us")
	a := Render(&st, []string{"p", "t", "h", "x", "cp"}, Options{Set: us})
	p, _ := a.Value("p")
	tt, _ := a.Value("t")
	h, _ := a.Value("h")
	if !scalar.EqualWithinRel(p.Value, 1e6/6.894757293168361e3, 1e-12) || p.Unit != "psia" {
		t.Errorf("p = %g %s, want 145.0377 psia", p.Value, p.Unit)
	}
	if !scalar.EqualWithinAbs(tt.Value, 572, 1e-9) {
		t.Errorf("t = %g, want 572 °F", tt.Value)
	}
	if !scalar.EqualWithinRel(h.Value, st.H/2.326, 1e-12) {
		t.Errorf("h = %g Btu/lb, want %g", h.Value, st.H/2.326)
	}
	if _, err := a.Value("x"); !errors.Is(err, ErrUndefined) {
		t.Errorf("x of superheated vapour: %v, want ErrUndefined", err)
	}
}

// The JSON answer is valid JSON with the documented keys, and a saturated
// mixture has x and the f/g values but no cp.
func TestAnswerJSON(t *testing.T) {
	st, err := fn.FromPX(0.5, 0.9)
	if err != nil {
		t.Fatal(err)
	}
	syms, _ := Symbols(nil)
	a := Render(&st, syms, Options{})
	in := Inputs([2]fn.Input{{Q: fn.Pressure, Value: 0.5}, {Q: fn.Quality, Value: 0.9}}, Options{})
	b := a.AppendJSON(nil, in, "caution text")
	var m map[string]any
	if err := json.Unmarshal(b, &m); err != nil {
		t.Fatalf("invalid JSON %s: %v", b, err)
	}
	for _, k := range []string{"inputs", "phase", "region", "p", "t", "h", "x", "hf", "hg", "units", "formulation", "warnings", "caution"} {
		if _, ok := m[k]; !ok {
			t.Errorf("JSON lacks %q: %s", k, b)
		}
	}
	if _, ok := m["cp"]; ok {
		t.Errorf("JSON of a mixture has cp: %s", b)
	}
	if m["phase"] != "saturated mixture" || m["formulation"] != "IAPWS-IF97" {
		t.Errorf("phase %v, formulation %v", m["phase"], m["formulation"])
	}
	// 0.5 MPa is 500 kPa in the si set.
	if p := m["p"].(float64); !scalar.EqualWithinRel(p, 500, 1e-12) {
		t.Errorf("p = %g kPa, want 500", p)
	}
}
