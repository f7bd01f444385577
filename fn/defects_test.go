package fn

import (
	"errors"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

// The engine's defects of issue 11, one row each, with what broke. Each
// row is an identity check (no source): a state that exists must be
// answered, reproduce its inputs (inputTol) and read alike from every pair.
func TestIssue11Defects(t *testing.T) {
	for _, tc := range []struct {
		name string
		a, b Input
	}{
		// Refused as "did not converge": the bracketed fallback evaluated
		// region 3 at T_B23(p), which rounding put on the region-2 side,
		// and h lies between region 1's and region 3's values at 623.15 K.
		{"p,h at 33.99 MPa", Input{Pressure, 33.99}, Input{Enthalpy, 1599.59}},
		{"p,s at 33.99 MPa", Input{Pressure, 33.99}, Input{Entropy, 3.618889}},
	} {
		st, err := Solve(tc.a, tc.b)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		checkAnswer(t, tc.name, tc.a, tc.b, &st)
		if !scalar.EqualWithinAbs(st.T, T13, 0.01) {
			t.Errorf("%s: T = %.9g K, want within 0.01 K of 623.15 K", tc.name, st.T)
		}
	}

	// Region 3 at T_B23(p) itself: the fallback could not evaluate it.
	for _, p := range []float64{17, 22.064, 33.99, 50, 99.99} {
		if _, ok := region3Density(p, if97.B23Temperature(p)); !ok {
			t.Errorf("region 3 at p = %g MPa on the B23 line: no density", p)
		}
	}

	// (T,s) with s within 1e-14 relative below s'(T) was refused as "s
	// below 0.1137581" (the isotherm's lowest value) though the state is
	// the saturated liquid.
	for _, T := range []float64{282.3, 300, 373.15, 500, 623.15, 640} {
		sat, err := SaturationAtT(T)
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range []float64{1, 1 - 1e-15, 1 - 1e-14, 1 - 3e-14} {
			in := Input{Entropy, sat.Liquid.S * f}
			st, err := Solve(Input{Temperature, T}, in)
			if err != nil || !scalar.EqualWithinRel(st.P, sat.P, 1e-6) {
				t.Errorf("(T = %g K, s = s'·%v): p %g, %v; want the saturated liquid at %g MPa", T, f, st.P, err, sat.P)
			}
		}
	}

	// (p,T) at 22.0110537 MPa, 646.898 K was "compressed liquid"; the
	// same state from six other pairs "saturated mixture, x = 0.0007".
	want, err := FromPT(22.0110537, 646.898)
	if err != nil {
		t.Fatal(err)
	}
	for _, pc := range scanPairs {
		a, b := pc.in(&want)
		got, err := Solve(a, b)
		if err != nil || got.Phase != want.Phase || got.Region != want.Region || got.HasX {
			t.Errorf("%s of (22.0110537 MPa, 646.898 K): %v in region %d, %v; want %v in region %d", pc.name, got.Phase, got.Region, err, want.Phase, want.Region)
		}
	}

	// An error on rho was reported as v in m³/kg.
	_, err = Solve(Input{Temperature, 300}, Input{Density, 2000})
	var ie *InputError
	if !errors.As(err, &ie) || ie.Input != "rho" || ie.Q != Density || ie.Value != 2000 || !(ie.Limit > 1000 && ie.Limit < 1100) ||
		ie.Detail.Figures[0].Q != Density || !strings.HasPrefix(ie.Detail.Text, "rho above") {
		t.Errorf("(T = 300 K, rho = 2000 kg/m³): %#v; want an error on rho, its limit a density near 1045 kg/m³", err)
	}
	_, err = Solve(Input{Pressure, 1}, Input{Density, 1e-9})
	if !errors.As(err, &ie) || ie.Input != "rho" || ie.Q != Density || ie.Value != 1e-9 {
		t.Errorf("(p = 1 MPa, rho = 1e-9 kg/m³): %v; want an error on rho", err)
	}

	// Our own solver failures reached the user as "no state has these
	// values", the user's fault: ErrSolver is a kind of its own, its text
	// carries the inputs.
	se := error(&SolverError{Inputs: [2]Input{{Pressure, 33.99}, {Enthalpy, 1599.59}}, Step: "a step"})
	if !errors.Is(se, ErrSolver) || errors.Is(se, ErrNoSolution) || !strings.Contains(se.Error(), "p = 33.99 MPa, h = 1599.59 kJ/kg") {
		t.Errorf("SolverError: %v", se)
	}

	// Two-solution messages and warnings were text in K and MPa: their
	// numbers are Figures now, for the caller to render in the user's
	// units.
	_, err = Solve(Input{Pressure, 0.1}, Input{Volume, 1.00015e-3})
	if !errors.As(err, &ie) || !errors.Is(err, ErrTwoSolutions) || len(ie.Alternatives) != 2 ||
		ie.Alternatives[0].Q != Temperature || ie.Alternatives[1].Q != Temperature {
		t.Errorf("(p = 0.1 MPa, v = 1.00015e-3 m³/kg): %v; want two solutions named as temperatures", err)
	} else if got := ie.Detail.Render(func(f Figure) string { return "<" + f.Q.Symbol() + ">" }); strings.Count(got, "<t>") != 2 {
		t.Errorf("two-solution message %q: want its temperatures as figures", got)
	}
	st, err := FromPT(1, if97.SatTemperature(1)+0.1)
	if err != nil || len(st.Warnings) == 0 || len(st.Warnings[0].Figures) != 2 || !st.Warnings[0].Figures[0].Diff ||
		st.Warnings[0].Figures[1].Q != Temperature {
		t.Errorf("warning near saturation: %+v, %v; want a ΔT figure and a Ts figure", st.Warnings, err)
	}
}

// ρc splits each isotherm's branches from 623.15 K to Tc (onBranch): it
// lies where the isotherm is mechanically unstable, (∂p/∂ρ)_T < 0, i.e.
// κT < 0. Identity check on the region-3 equation, no source.
func TestCriticalDensitySplitsBranches(t *testing.T) {
	for T := T13; T < if97.Tc-1e-6; T += 0.05 {
		if k := if97.Region3(if97.Rhoc, T).KappaT; !(k < 0) {
			t.Fatalf("κT(ρc, T = %.6f K) = %g, want < 0", T, k)
		}
	}
	for _, d := range []float64{1e-3, 1e-4, 1e-5, 1e-6} {
		if k := if97.Region3(if97.Rhoc, if97.Tc-d).KappaT; !(k < 0) {
			t.Errorf("κT(ρc, Tc − %g K) = %g, want < 0", d, k)
		}
	}
}

// Note renders its figures where the text says; String in base units.
func TestNoteRender(t *testing.T) {
	n := note("T above {0} at p above {1}; {2} off; {9} stays", fig(Temperature, 1073.15), fig(Pressure, 50), Figure{Q: Temperature, V: 0.5, Diff: true})
	if got, want := n.String(), "T above 1073.15 K at p above 50 MPa; 0.5 K off; {9} stays"; got != want {
		t.Errorf("String() = %q, want %q", got, want)
	}
	c := n.Render(func(f Figure) string {
		if f.Q == Temperature && !f.Diff {
			return "800 °C"
		}
		return f.BaseText()
	})
	if want := "T above 800 °C at p above 50 MPa; 0.5 K off; {9} stays"; c != want {
		t.Errorf("Render = %q, want %q", c, want)
	}
}
