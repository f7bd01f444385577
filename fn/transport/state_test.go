package transport

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

func TestForStateTables4(t *testing.T) {
	// IAPWS R12-08 Table 4 (μ, μPa·s) and IAPWS R15-11 Table 4 (λ,
	// mW/(m·K); 0 where the table has no λ), the points that are IF97
	// single-phase states: the state is found at the table's (T, ρ) and
	// passed through ForState. There μ̄2 − 1 < 1e-9 and λ̄2 = 0 with IF97
	// derivatives, so the tables' values (enhancement excluded) must come
	// back to half a unit of their last digit.
	for _, tc := range []struct {
		T, rho, p0 float64
		region     func(p, T float64) if97.Props
		mu, lambda float64
	}{
		{298.15, 998, 2, if97.Region1, 889.735100, 607.712868},
		{433.15, 1, 0.2, if97.Region2, 14.538324, 0},
		{873.15, 1, 0.4, if97.Region2, 32.619287, 0},
		{873.15, 100, 33, if97.Region2, 35.802262, 0},
		{1173.15, 1, 0.5, if97.Region5, 44.217245, 0},
	} {
		st := tpStateAtDensity(t, tc.region, tc.T, tc.rho, tc.p0)
		r, err := ForState(st)
		if err != nil {
			t.Errorf("ForState(p=%g MPa, T=%g K): %v", st.P, st.T, err)
			continue
		}
		tpCheck(t, fmt.Sprintf("ForState(p=%.6g MPa, T=%g K, rho=%g).Viscosity in μPa·s", st.P, tc.T, tc.rho), r.Viscosity*1e6, tc.mu, 0.5e-6, 0)
		if tc.lambda != 0 {
			tpCheck(t, fmt.Sprintf("ForState(p=%.6g MPa, T=%g K, rho=%g).Conductivity in mW/(m·K)", st.P, tc.T, tc.rho), r.Conductivity*1e3, tc.lambda, 0.5e-6, 0)
		}
	}
}

// table5 holds IAPWS R12-08 Table 5 (μ, μPa·s) and IAPWS R15-11 Table 5
// (λ, mW/(m·K)) at T = 647.35 K, computed there with IAPWS-95 derivatives;
// 0 where a table has no entry at that density.
var table5 = []struct{ rho, mu, lambda float64 }{
	{1, 0, 51.9298924},
	{122, 25.520677, 130.922885},
	{222, 31.337589, 367.787459},
	{272, 36.228143, 757.959776},
	{322, 42.961579, 1443.75556},
	{372, 45.688204, 650.319402},
	{422, 49.436256, 448.883487},
	{750, 0, 600.961346},
}

// table5State returns the IF97 state at T = 647.35 K and density rho: from
// region 2 at 1 kg/m³, else from the equation of region 3 (which IF97 uses
// near the critical point; at 122 kg/m³ and 750 kg/m³ the state lies just
// outside region 3 and the equation is extended).
func table5State(t *testing.T, rho float64) if97.Props {
	if rho < 10 {
		return tpStateAtDensity(t, if97.Region2, 647.35, rho, 0.3)
	}
	return if97.Region3(rho, 647.35)
}

// checkTable5 compares ForState with table5 at the given densities. The
// tables use IAPWS-95 derivatives, ForState IF97's; away from the critical
// density IF97 gives the enhancement within 1 % of IAPWS-95's, so the
// tolerance is 1 % of the enhancement's share of the table's value (the
// share from the table value and our μ̄0 μ̄1, λ̄0 λ̄1, verified by Tables 4)
// plus 1e-7.
func checkTable5(t *testing.T, densities ...float64) {
	for _, tc := range table5 {
		wanted := false
		for _, d := range densities {
			wanted = wanted || d == tc.rho
		}
		if !wanted {
			continue
		}
		st := table5State(t, tc.rho)
		r, err := ForState(st)
		if err != nil {
			t.Fatalf("ForState(rho=%g kg/m³, T=647.35 K): %v", tc.rho, err)
		}
		if tc.mu != 0 {
			mu01, _ := ViscosityNoEnhancement(tc.rho, st.T)
			tol := 0.01*(1-mu01*1e6/tc.mu) + 1e-7
			tpCheck(t, fmt.Sprintf("ForState(rho=%g kg/m³, T=647.35 K).Viscosity in μPa·s", tc.rho), r.Viscosity*1e6, tc.mu, 0, tol)
		}
		if tc.lambda != 0 {
			l01, _ := ConductivityNoEnhancement(tc.rho, st.T)
			tol := 0.01*(1-l01*1e3/tc.lambda) + 1e-7
			tpCheck(t, fmt.Sprintf("ForState(rho=%g kg/m³, T=647.35 K).Conductivity in mW/(m·K)", tc.rho), r.Conductivity*1e3, tc.lambda, 0, tol)
		}
	}
}

func TestForStateTables5(t *testing.T) {
	// IAPWS R12-08 Table 5 and IAPWS R15-11 Table 5, the points away from
	// the critical density (see checkTable5 for the tolerance).
	checkTable5(t, 1, 122, 422, 750)
}

// TestForStateTables5NearCriticalDensity shows, rather than skips, how far
// the industrial route departs from IAPWS R12-08 Table 5 and R15-11 Table 5
// at 647.35 K between 222 and 372 kg/m³. The tables use the derivatives of
// IAPWS-95, which this project does not implement; with those of IF97
// region 3 (the releases' industrial route) λ comes out 0.44 %, 9.9 %,
// 18.8 % and 5.3 % low and μ up to 1.5 % low (measured). The test holds
// each departure to its measured size within 0.2 percentage points and to
// its sign, so that a change of either route shows; the enhancement
// equations themselves agree with the tables at 322 kg/m³ when given the
// tables' own derivatives (TestEnhancementsAgreeAcrossTables5).
func TestForStateTables5NearCriticalDensity(t *testing.T) {
	for _, tc := range []struct{ rho, dMu, dLambda float64 }{ // measured departure, relative
		{222, 0.0001, -0.0044},
		{272, -0.0040, -0.0994},
		{322, -0.0151, -0.1878},
		{372, -0.0060, -0.0528},
	} {
		var want struct{ mu, lambda float64 }
		for _, row := range table5 {
			if row.rho == tc.rho {
				want.mu, want.lambda = row.mu, row.lambda
			}
		}
		st := table5State(t, tc.rho)
		r, err := ForState(st)
		if err != nil {
			t.Fatalf("ForState(rho=%g kg/m³, T=647.35 K): %v", tc.rho, err)
		}
		dMu, dLambda := r.Viscosity*1e6/want.mu-1, r.Conductivity*1e3/want.lambda-1
		if !scalar.EqualWithinAbs(dMu, tc.dMu, 0.002) || !scalar.EqualWithinAbs(dLambda, tc.dLambda, 0.002) {
			t.Errorf("rho=%g kg/m³: μ departs %.4f, λ %.4f from R12-08/R15-11 Table 5; measured %.4f, %.4f with IF97 derivatives",
				tc.rho, dMu, dLambda, tc.dMu, tc.dLambda)
		}
	}
}

func TestForStateLiquidAt20C(t *testing.T) {
	// Handbook values, from memory, for liquid water at 20 °C, 0.101325 MPa:
	// ν = 1.0034 mm²/s (the value viscometer calibration works from), Pr =
	// 7.0; tolerance half a unit of the last digit.
	st := if97.Region1(0.101325, 293.15)
	r, err := ForState(st)
	if err != nil {
		t.Fatal(err)
	}
	tpCheck(t, "ν(20 °C, 1 atm) in mm²/s", r.KinematicViscosity*1e6, 1.0034, 0.5e-4, 0)
	tpCheck(t, "Pr(20 °C, 1 atm)", r.Prandtl, 7.0, 0.05, 0)
	// Definitions (no source needed): ν = μ/ρ, a = λ/(ρ cp), Pr = ν/a.
	tpCheck(t, "ν·ρ/μ", r.KinematicViscosity*st.Rho/r.Viscosity, 1, 0, 1e-15)
	tpCheck(t, "a·ρ·cp/λ", r.ThermalDiffusivity*st.Rho*st.Cp*1e3/r.Conductivity, 1, 0, 1e-15)
	tpCheck(t, "Pr·a/ν", r.Prandtl*r.ThermalDiffusivity/r.KinematicViscosity, 1, 0, 1e-14)
	if len(r.Warnings) != 0 {
		t.Errorf("ForState(20 °C, 1 atm).Warnings = %v, want none", r.Warnings)
	}
}

func TestForStateWarnings(t *testing.T) {
	for _, tc := range []struct {
		name  string
		st    if97.Props
		props []Property
	}{
		{"liquid 20 °C", if97.Region1(0.101325, 293.15), nil},
		{"steam 1000 K, 50 MPa", if97.Region2(50, 1000), nil},
		{"region 5 above 1173.15 K", if97.Region5(10, 1500), []Property{PropertyViscosity, PropertyConductivity}},
		{"vapour below the triple point", if97.Region2(0.0005, 273.155), []Property{PropertyViscosity, PropertyConductivity}},
	} {
		r, err := ForState(tc.st)
		if err != nil {
			t.Errorf("%s: ForState: %v", tc.name, err)
			continue
		}
		var got []Property
		for _, w := range r.Warnings {
			got = append(got, w.Property)
		}
		if fmt.Sprint(got) != fmt.Sprint(tc.props) {
			t.Errorf("%s (p=%g MPa, T=%g K): warnings for %v, want %v", tc.name, tc.st.P, tc.st.T, got, tc.props)
		}
		if !(r.Viscosity > 0 && r.Conductivity > 0) {
			t.Errorf("%s: μ = %g, λ = %g; want values even when extrapolated", tc.name, r.Viscosity, r.Conductivity)
		}
	}
}

func TestForStateInputErrors(t *testing.T) {
	good := if97.Region1(0.101325, 293.15)
	for _, tc := range []struct {
		which Input
		set   func(*if97.Props)
	}{
		{InputP, func(s *if97.Props) { s.P = 0 }},
		{InputT, func(s *if97.Props) { s.T = math.NaN() }},
		{InputRho, func(s *if97.Props) { s.Rho = -1 }},
		{InputCp, func(s *if97.Props) { s.Cp = math.Inf(1) }},
		{InputCv, func(s *if97.Props) { s.Cv = 0 }},
		{InputKappaT, func(s *if97.Props) { s.KappaT = -1e-3 }},
	} {
		st := good
		tc.set(&st)
		_, err := ForState(st)
		var ie *InputError
		if !errors.As(err, &ie) || ie.Input != tc.which || !errors.Is(err, ErrNonPhysical) {
			t.Errorf("ForState(%+v): err = %v, want *InputError on %v", st, err, tc.which)
		}
	}
}

func BenchmarkForState(b *testing.B) {
	st := if97.Region3(322, 647.35)
	for b.Loop() {
		_, _ = ForState(st)
	}
}
