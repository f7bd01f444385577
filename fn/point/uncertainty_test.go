package point_test

import (
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/point"
	"steamcell/fn/uncertain"
	"steamcell/fn/units"
)

// TestInlineUncertainty reads ± in every form the README shows. The
// expected standard uncertainties follow from the unit factors of NIST SP
// 811 (2008) Appendix B (1 bar = 0.1 MPa, 1 °F of difference = 5/9 K)
// and the conventions of JCGM 100:2008 (u = U/2 at k = 2, u = a/√3).
func TestInlineUncertainty(t *testing.T) {
	for _, tc := range []struct {
		p, t   string
		conv   uncertain.Convention
		up, ut float64 // MPa, K
	}{
		{"100bar±0.2bar", "500C±0.5K", uncertain.Standard, 0.02, 0.5},
		{"100bar+-0.2bar", "500C+/-0.5", uncertain.Standard, 0.02, 0.5},
		{"100bar±0.25%", "500C±0.1%", uncertain.Standard, 0.025, 0.5},
		{"100 bar ± 20 kPa", "932F±0.9F", uncertain.Standard, 0.02, 0.5},
		{"6barg±0.1", "200C±1", uncertain.Standard, 0.01, 1},
		{"100bar±0.4bar", "500C±1K", uncertain.Expanded, 0.02, 0.5},
		{"100bar±0.2bar", "500C±0.5K", uncertain.Rectangular, 0.02 / math.Sqrt(3), 0.5 / math.Sqrt(3)},
	} {
		m, err := point.SolveMeasured([]point.Given{{Name: "p", Text: tc.p}, {Name: "t", Text: tc.t}}, point.Options{}, point.UOptions{Convention: tc.conv})
		if err != nil {
			t.Fatalf("p=%s t=%s: %v", tc.p, tc.t, err)
		}
		if !m.Given {
			t.Errorf("p=%s t=%s: no uncertainty seen", tc.p, tc.t)
		}
		if got := m.Budget.StdU(0); !scalar.EqualWithinRel(got, tc.up, 1e-12) {
			t.Errorf("p=%s (%v): u(p) = %.12g MPa, want %.12g", tc.p, tc.conv.Name(), got, tc.up)
		}
		if got := m.Budget.StdU(1); !scalar.EqualWithinRel(got, tc.ut, 1e-12) {
			t.Errorf("t=%s (%v): u(T) = %.12g K, want %.12g", tc.t, tc.conv.Name(), got, tc.ut)
		}
	}
}

// TestInlineUncertaintyErrors: every bad uncertainty is refused with
// ErrUncertainty or the units error of its unit.
func TestInlineUncertaintyErrors(t *testing.T) {
	for _, text := range []string{"100bar±", "100bar±-0.2bar", "100bar±abc", "100bar±0.2K", "100bar±x%", "100bar±-1%"} {
		_, err := point.SolveMeasured([]point.Given{{Name: "p", Text: text}, {Name: "t", Text: "500C"}}, point.Options{}, point.UOptions{})
		if !errors.Is(err, point.ErrUncertainty) && !errors.Is(err, units.ErrWrongDimension) && !errors.Is(err, units.ErrUnknownUnit) {
			t.Errorf("p=%s: err %v, want ErrUncertainty", text, err)
		}
		if err == nil {
			t.Errorf("p=%s: no error", text)
		}
	}
}

// TestMeasuredJSON: the answer is valid JSON, carries "u" for every
// numeric property in the value's units, "U" at k = 2, the convention
// applied, and internal energy under "e".
func TestMeasuredJSON(t *testing.T) {
	set, _ := units.SetByName("si") // kPa, °C
	opt := point.Options{Set: set}
	uo := point.UOptions{K: 2}
	m, err := point.SolveMeasured([]point.Given{{Name: "p", Text: "100bar±0.2bar"}, {Name: "t", Text: "500C±0.5K"}}, opt, uo)
	if err != nil {
		t.Fatal(err)
	}
	ans := point.Render(&m.State.State, point.DefaultSymbols(), opt)
	unc := point.RenderUncertainty(&m, &ans, opt, uo)
	b := ans.AppendMeasuredJSON(nil, point.Inputs(m.Inputs, opt), "caution", &unc)
	var got map[string]any
	if err := json.Unmarshal(b, &got); err != nil {
		t.Fatalf("%v: %s", err, b)
	}
	u, ok := got["u"].(map[string]any)
	if !ok {
		t.Fatalf("no u member: %s", b)
	}
	for _, sym := range []string{"p", "t", "h", "s", "v", "rho", "e", "g", "f", "cp", "cv", "w", "kappa", "alphav", "kappat"} {
		if _, ok := u[sym]; !ok {
			t.Errorf("u has no %s: %s", sym, b)
		}
		if _, ok := got[sym].(float64); !ok {
			t.Errorf("answer has no value %s", sym)
		}
	}
	// u(p) = 0.2 bar = 20 kPa, in the si set's kPa; u(t) = 0.5 (°C size).
	if v := u["p"].(float64); !scalar.EqualWithinRel(v, 20, 1e-12) {
		t.Errorf("u(p) = %g kPa, want 20", v)
	}
	if v := u["t"].(float64); !scalar.EqualWithinRel(v, 0.5, 1e-12) {
		t.Errorf("u(t) = %g, want 0.5", v)
	}
	// u(h) from cp and (∂h/∂p)T: about cp·0.5 K for superheated steam.
	cp := got["cp"].(float64)
	if v := u["h"].(float64); !(v > 0.5*cp && v < 0.5*cp*1.5) {
		t.Errorf("u(h) = %g kJ/kg with cp = %g", v, cp)
	}
	U := got["U"].(map[string]any)
	if !scalar.EqualWithinRel(U["h"].(float64), 2*u["h"].(float64), 1e-12) {
		t.Errorf("U(h) = %v, want 2 u(h)", U["h"])
	}
	if c := got["uncertainty"].(map[string]any)["convention"]; c != "k1" {
		t.Errorf("convention %v", c)
	}
}

// TestPhaseUncertainWarning: a state within its k = 2 interval of the
// saturation line says the phase is uncertain.
func TestPhaseUncertainWarning(t *testing.T) {
	opt := point.Options{}
	m, err := point.SolveMeasured([]point.Given{{Name: "p", Text: "10bar±0.1bar"}, {Name: "t", Text: "180.2C±0.5K"}}, opt, point.UOptions{})
	if err != nil {
		t.Fatal(err)
	}
	ans := point.Render(&m.State.State, nil, opt)
	unc := point.RenderUncertainty(&m, &ans, opt, point.UOptions{})
	if len(unc.Warnings) == 0 {
		t.Fatalf("no warning at 0.3 K above Ts with u(T) = 0.5 K")
	}
	found := false
	for _, w := range unc.Warnings {
		if len(w) > 16 && w[:16] == "phase uncertain:" {
			found = true
		}
	}
	if !found {
		t.Errorf("warnings %q do not say the phase is uncertain", unc.Warnings)
	}
	// The uncertain margin replaces the engine's fixed one.
	if len(ans.Warnings) == 0 {
		t.Fatal("the engine gave no fixed-margin warning at 0.3 K from saturation; the test needs one")
	}
	for _, w := range unc.Merge(ans.Warnings) {
		if strings.HasPrefix(w, "within ") {
			t.Errorf("the fixed-margin warning %q is kept beside the uncertain one", w)
		}
	}
}

// TestUncertaintyHeader reads uncertainty column headers.
func TestUncertaintyHeader(t *testing.T) {
	for _, tc := range []struct {
		text, input, unit string
		ok                bool
	}{
		{"u(p) [bar]", "p", "bar", true},
		{"u(T1) (K)", "T1", "K", true},
		{"U(p2)", "p2", "", true},
		{"u(h) [kJ/kg]", "h", "kJ/kg", true},
		{"u(m1)", "m1", "", true},
		{"u(pressure) [kPa]", "pressure", "kPa", true},
		{"u [kJ/kg]", "", "", false},
		{"u(q) [bar]", "", "", false},
		{"p [bar]", "", "", false},
		{"u(p) bar", "", "", false},
	} {
		in, unit, ok := point.UncertaintyHeader(tc.text)
		if ok != tc.ok || in != tc.input || unit != tc.unit {
			t.Errorf("UncertaintyHeader(%q) = %q, %q, %v; want %q, %q, %v", tc.text, in, unit, ok, tc.input, tc.unit, tc.ok)
		}
	}
}

// TestRunProcess: a row of named inputs with uncertainties gives the
// result fields and their u in the user's units, and the header cells
// name them in the form of the uncertainty columns of inputs.
func TestRunProcess(t *testing.T) {
	set, _ := units.SetByName("si")
	p, err := point.RunProcess("expansion", []point.Given{
		{Name: "p1", Text: "60bar±0.3bar"}, {Name: "t1", Text: "480C±1K"},
		{Name: "p2", Text: "12bar±0.1bar"}, {Name: "t2", Text: "280C±1K"},
	}, point.Options{Set: set}, point.UOptions{K: 2})
	if err != nil {
		t.Fatal(err)
	}
	eff, err := p.Result("efficiency")
	if err != nil {
		t.Fatal(err)
	}
	if !(eff.Value > 0.7 && eff.Value < 0.95 && eff.U > 0.001 && eff.U < 0.05) {
		t.Errorf("efficiency %g ± %g", eff.Value, eff.U)
	}
	h := p.Header()
	if h[0] != "efficiency" || h[1] != "u(efficiency)" || h[2] != "U(efficiency)" || h[4] != "u(h2s) [kJ/kg]" {
		t.Errorf("header %q", h)
	}
	if len(p.Cells()) != len(h) {
		t.Errorf("%d cells for %d headers", len(p.Cells()), len(h))
	}
	var got map[string]any
	if err := json.Unmarshal(p.AppendJSON(nil, "c"), &got); err != nil {
		t.Fatal(err)
	}
}

// TestParseUncertaintyList reads the one-value-per-column form.
func TestParseUncertaintyList(t *testing.T) {
	m, err := point.ParseUncertaintyList("p=0.2bar, T=0.5K,p2=0.5%")
	if err != nil || len(m) != 3 || m["p"] != "0.2bar" || m["t"] != "0.5K" || m["p2"] != "0.5%" {
		t.Errorf("got %v, %v", m, err)
	}
	g := point.WithUncertainty(point.Given{Name: "p", Text: "6barg"}, m["p"])
	if g.Text != "6barg±0.2bar" {
		t.Errorf("WithUncertainty: %q", g.Text)
	}
	for _, bad := range []string{"p", "p=", "q=1", "p=1,p=2"} {
		if _, err := point.ParseUncertaintyList(bad); !errors.Is(err, point.ErrUncertainty) {
			t.Errorf("%q: err %v", bad, err)
		}
	}
}
