package transport

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"steamcell/fn/if97"
)

func TestViscosityNoEnhancementTable4(t *testing.T) {
	// IAPWS R12-08, Table 4: sample points for computer-program verification
	// of Eq. (10) with μ̄2 = 1; μ in μPa·s to six decimals. Tolerance: half a
	// unit of the last printed digit.
	for _, tc := range []struct{ T, rho, want float64 }{
		{298.15, 998, 889.735100},
		{298.15, 1200, 1437.649467},
		{373.15, 1000, 307.883622},
		{433.15, 1, 14.538324},
		{433.15, 1000, 217.685358},
		{873.15, 1, 32.619287},
		{873.15, 100, 35.802262},
		{873.15, 600, 77.430195},
		{1173.15, 1, 44.217245},
		{1173.15, 100, 47.640433},
		{1173.15, 400, 64.154608},
	} {
		mu, err := ViscosityNoEnhancement(tc.rho, tc.T)
		if err != nil {
			t.Errorf("ViscosityNoEnhancement(rho=%g, T=%g): %v", tc.rho, tc.T, err)
			continue
		}
		tpCheck(t, fmt.Sprintf("μ(rho=%g kg/m³, T=%g K) in μPa·s", tc.rho, tc.T), mu*1e6, tc.want, 0.5e-6, 0)
	}
}

func TestViscosityTable5FarFromCriticalDensity(t *testing.T) {
	// IAPWS R12-08, Table 5: μ at T = 647.35 K with μ̄2 from IAPWS-95
	// derivatives. At ρ = 122 kg/m³ μ̄2 − 1 is about 3e-6, so IF97 region 3
	// derivatives in place of IAPWS-95 ones change μ by far less than 1e-7;
	// this pins μ̄0 μ̄1 next to the critical point. The other points of the
	// table are in TestEnhancementsAgreeAcrossTables5 and state_test.go.
	const T = 647.35
	for _, tc := range []struct{ rho, want float64 }{
		{122, 25.520677},
	} {
		st := if97.Region3(tc.rho, T)
		nc := NearCritical{DrhoDp: st.Rho * st.KappaT, DrhoDpTR: DrhoDpAtTR(tc.rho), Cp: st.Cp, Cv: st.Cv}
		mu, err := Viscosity(tc.rho, T, nc)
		if err != nil {
			t.Fatal(err)
		}
		tpCheck(t, fmt.Sprintf("μ(rho=%g kg/m³, T=%g K) in μPa·s", tc.rho, T), mu*1e6, tc.want, 0, 1e-7)
	}
}

func TestViscosityYBranchesMeet(t *testing.T) {
	// IAPWS R12-08 switches from the series Eq. (15) to the closed form
	// Eq. (16) at ξ = 0.3817016416 nm, the ξ where the two forms cross: a
	// wrong constant in either (765/504, the powers of q_D ξ, 1/q_C, 1/q_D,
	// the terms of Eq. 16) moves the crossing away from that ξ.
	xs := viscosityXiSwitch
	tpCheck(t, fmt.Sprintf("Y(ξ=%v nm), Eq. (16) vs Eq. (15)", xs), viscosityYClosed(xs), viscosityYSeries(xs), 0, 1e-9)
	below := viscosityYClosed(0.99*xs) - viscosityYSeries(0.99*xs)
	above := viscosityYClosed(1.01*xs) - viscosityYSeries(1.01*xs)
	if below*above >= 0 {
		t.Errorf("Eq. (16) − Eq. (15) = %g at 0.99 ξs and %g at 1.01 ξs: the forms do not cross at ξs = %v nm", below, above, xs)
	}
	// And viscosityY takes each form on its side.
	if viscosityY(xs) != viscosityYSeries(xs) || viscosityY(1.01*xs) != viscosityYClosed(1.01*xs) {
		t.Errorf("viscosityY does not switch forms at ξ = %v nm", xs)
	}
}

func TestViscosityEnhancementGrowsWithXi(t *testing.T) {
	// μ̄2 = exp(x_μ Y) must rise monotonically from 1 as the correlation
	// length grows (R12-08, Eq. 13; a physical requirement).
	prev := viscosityCritical(0)
	if prev != 1 {
		t.Fatalf("μ̄2(ξ=0) = %g, want 1", prev)
	}
	for xi := 0.01; xi < 100; xi *= 1.1 {
		m := viscosityCritical(xi)
		if !(m > prev) {
			t.Fatalf("μ̄2(ξ=%g nm) = %.12g not above μ̄2 at the previous ξ, %.12g", xi, m, prev)
		}
		prev = m
	}
}

func TestViscosityEnhancementRegion(t *testing.T) {
	// IAPWS R12-08, section on industrial use (from memory): μ̄2 exceeds
	// 1.02 only in 645.91 K < T < 650.77 K, 245.8 kg/m³ < ρ < 405.3 kg/m³.
	// Checked with IF97 region 3 derivatives on supercritical isotherms
	// (single-phase everywhere) up to 700 K.
	for T := 647.1; T < 700; T += 0.25 {
		for rho := 50.0; rho <= 700; rho += 2 {
			inside := T > 645.91 && T < 650.77 && rho > 245.8 && rho < 405.3
			if inside {
				continue
			}
			st := if97.Region3(rho, T)
			nc := NearCritical{DrhoDp: st.Rho * st.KappaT, DrhoDpTR: DrhoDpAtTR(rho)}
			if m := viscosityCritical(nc.xi(T/tStar, rho/rhoStar)); m > 1.02 {
				t.Errorf("μ̄2(rho=%g kg/m³, T=%g K) = %.6g, want ≤ 1.02 outside the near-critical region", rho, T, m)
			}
		}
	}
}

func TestViscosityNoEnhancementWhereDeltaChiNegative(t *testing.T) {
	// R12-08 (with Eq. 21): where Δχ̄ ≤ 0 there is no enhancement, μ̄2 = 1.
	// Liquid at 298.15 K, 998 kg/m³: (∂ρ/∂p)_T ≈ 0.45 kg/(m³·MPa) is far
	// below its background value, so Viscosity must equal the plain value.
	nc := NearCritical{DrhoDp: 0.45, DrhoDpTR: DrhoDpAtTR(998)}
	got, err := Viscosity(998, 298.15, nc)
	if err != nil {
		t.Fatal(err)
	}
	want, _ := ViscosityNoEnhancement(998, 298.15)
	tpCheck(t, "μ(998 kg/m³, 298.15 K) with Δχ̄ < 0", got, want, 0, 1e-15)
}

func TestViscosityHandbook(t *testing.T) {
	// Handbook value, from memory: liquid water at 20 °C and 0.101325 MPa,
	// μ = 1.0016 mPa·s (five digits; tolerance half a unit of the last).
	st := if97.Region1(0.101325, 293.15)
	mu, err := ViscosityNoEnhancement(st.Rho, st.T)
	if err != nil {
		t.Fatal(err)
	}
	tpCheck(t, "μ(20 °C, 1 atm) in mPa·s", mu*1e3, 1.0016, 0.5e-4, 0)
}

func TestViscosityInputErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, tc := range []struct {
		rho, T float64
		which  Input
	}{
		{998, 0, InputT},
		{998, -1, InputT},
		{998, nan, InputT},
		{998, inf, InputT},
		{-1, 300, InputRho},
		{nan, 300, InputRho},
		{inf, 300, InputRho},
	} {
		for name, f := range map[string]func(rho, T float64) (float64, error){
			"ViscosityNoEnhancement": ViscosityNoEnhancement,
			"Viscosity": func(rho, T float64) (float64, error) {
				return Viscosity(rho, T, NearCritical{})
			},
		} {
			v, err := f(tc.rho, tc.T)
			var ie *InputError
			if !errors.As(err, &ie) || ie.Input != tc.which || !errors.Is(err, ErrNonPhysical) || !math.IsNaN(v) {
				t.Errorf("%s(rho=%g, T=%g) = %g, %v; want NaN and *InputError on %v", name, tc.rho, tc.T, v, err, tc.which)
			}
		}
	}
	if _, err := Viscosity(322, 650, NearCritical{DrhoDp: nan}); !errors.Is(err, ErrNonPhysical) {
		t.Errorf("Viscosity with NaN (∂ρ/∂p)_T: err = %v, want ErrNonPhysical", err)
	}
	// ρ = 0 is the dilute-gas limit, a valid input.
	if _, err := ViscosityNoEnhancement(0, 300); err != nil {
		t.Errorf("ViscosityNoEnhancement(rho=0, T=300): %v", err)
	}
}

func BenchmarkViscosityNoEnhancement(b *testing.B) {
	for b.Loop() {
		_, _ = ViscosityNoEnhancement(998, 298.15)
	}
}

func BenchmarkViscosity(b *testing.B) {
	nc := NearCritical{DrhoDp: 1000, DrhoDpTR: DrhoDpAtTR(322)}
	for b.Loop() {
		_, _ = Viscosity(322, 647.35, nc)
	}
}
