package if97_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

// bw3CheckTable1 compares the one-argument function fn with each printed
// value of a verification table at bw3TableRel.
func bw3CheckTable1(t *testing.T, name string, fn func(s float64) float64, rows [][2]float64) {
	t.Helper()
	for _, tc := range rows {
		s, want := tc[0], tc[1]
		if got := fn(s); !scalar.EqualWithinRel(got, want, bw3TableRel) {
			t.Errorf("%s(s=%g kJ/(kg K)) = %.9e, want %.9e", name, s, got, want)
		}
	}
}

func TestBackward3HSSatLiquidEnthalpy1(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of h′1(s), Eq. 3.
	bw3CheckTable1(t, "SatLiquidEnthalpy1FromS", if97.SatLiquidEnthalpy1FromS, [][2]float64{
		{1, 3.085509647e2},
		{2, 7.006304472e2},
		{3, 1.198359754e3},
	})
}

func TestBackward3HSSatLiquidEnthalpy3(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of h′3(s), Eq. 4.
	bw3CheckTable1(t, "SatLiquidEnthalpy3FromS", if97.SatLiquidEnthalpy3FromS, [][2]float64{
		{3.8, 1.685025565e3},
		{4.0, 1.816891476e3},
		{4.2, 1.949352563e3},
	})
}

func TestBackward3HSSatVapourEnthalpy2ab4(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of h″2ab(s), Eq. 5.
	bw3CheckTable1(t, "SatVapourEnthalpy2ab4FromS", if97.SatVapourEnthalpy2ab4FromS, [][2]float64{
		{7, 2.723729985e3},
		{8, 2.599047210e3},
		{9, 2.511861477e3},
	})
}

func TestBackward3HSSatVapourEnthalpy2c3b(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of h″2c3b(s), Eq. 6.
	bw3CheckTable1(t, "SatVapourEnthalpy2c3bFromS", if97.SatVapourEnthalpy2c3bFromS, [][2]float64{
		{5.5, 2.687693850e3},
		{5.0, 2.451623609e3},
		{4.5, 2.144360448e3},
	})
}

func TestBackward3HSB13Enthalpy(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of hB13(s), Eq. 7.
	bw3CheckTable1(t, "B13Enthalpy", if97.B13Enthalpy, [][2]float64{
		{3.7, 1.632525047e3},
		{3.6, 1.593027214e3},
		{3.5, 1.566104611e3},
	})
}

func TestBackward3HSB23T(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of TB23(h,s), Eq. 8.
	bw3CheckTable(t, "B23TFromHS(h=%g kJ/kg, s=%g kJ/(kg K))", if97.B23TFromHS, []bw3Row{
		{2600, 5.10, 7.135259364e2},
		{2700, 5.15, 7.685345532e2},
		{2800, 5.20, 8.176202120e2},
	})
}

func TestBackward3HSRegion3P(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of p3(h,s), Eqs. 1 and 2:
	// the first three rows lie in 3a, the last three in 3b.
	bw3CheckTable(t, "Region3PFromHS(h=%g kJ/kg, s=%g kJ/(kg K))", if97.Region3PFromHS, []bw3Row{
		{1700, 3.8, 2.555703246e1},
		{2000, 4.2, 4.540873468e1},
		{2100, 4.3, 6.078123340e1},
		{2600, 5.1, 3.434999263e1},
		{2400, 4.7, 6.363924887e1},
		{2700, 5.0, 8.839043281e1},
	})
}

func TestBackward3HSSatT(t *testing.T) {
	// IAPWS SR4-04(2014), verification table of Tsat(h,s), Eq. 9.
	bw3CheckTable(t, "SatTFromHS(h=%g kJ/kg, s=%g kJ/(kg K))", if97.SatTFromHS, []bw3Row{
		{1800, 5.3, 3.468475498e2},
		{2400, 6.0, 4.251373305e2},
		{2500, 5.5, 5.225579013e2},
	})
}

func TestBackward3HSGridP(t *testing.T) {
	// Forward against backward: p from Eqs. 1 and 2 at (h, s) of the basic
	// equation must match its p within the permissible inconsistency of
	// SR4-04(2014), |Δp/p| = 0.01 % (as recalled).
	const tolP = 1e-4
	var maxP [2]bw3Max
	fails := 0
	for _, st := range bw3Region3Grid(bw3GridStates) {
		sub := 0
		if st.S > 4.41202148223476 {
			sub = 1
		}
		got := if97.Region3PFromHS(st.H, st.S)
		maxP[sub].add(math.Abs(got-st.P)/st.P, st.P, st.T)
		if !scalar.EqualWithinRel(got, st.P, tolP) && fails < 10 {
			fails++
			t.Errorf("Region3PFromHS(h=%.9g kJ/kg, s=%.9g kJ/(kg K)) = %.9g MPa, want %.9g (T=%.6g K)",
				st.H, st.S, got, st.P, st.T)
		}
	}
	for sub, name := range []string{"3a", "3b"} {
		t.Logf("%s: max |Δp/p| = %.5f %% (p=%.4g MPa, T=%.5g K)", name, 100*maxP[sub].dev, maxP[sub].p, maxP[sub].T)
	}
}

func TestBackward3HSGridSatT(t *testing.T) {
	// Forward against backward: wet-steam states (h, s) built from the
	// saturated liquid (region 1) and vapour (region 2) at T and
	// psat(T), 273.15 K ≤ T ≤ 623.15 K, quality 0 to 1, kept where
	// s ≥ s″(623.15 K) = 5.210887825 kJ/(kg·K). Eq. 9 must return T within
	// the permissible inconsistency of SR4-04(2014), |ΔT| = 25 mK (as
	// recalled).
	const tolT = 0.025
	rng := rand.New(rand.NewPCG(4, 4))
	var m bw3Max
	fails := 0
	for n := 0; n < bw3GridStates; {
		T := 273.15 + 350*rng.Float64()
		x := rng.Float64()
		p := if97.SatPressure(T)
		liq, vap := if97.Region1(p, T), if97.Region2(p, T)
		h := liq.H + x*(vap.H-liq.H)
		s := liq.S + x*(vap.S-liq.S)
		if s < 5.210887825 {
			continue
		}
		n++
		got := if97.SatTFromHS(h, s)
		m.add(math.Abs(got-T), p, T)
		if !scalar.EqualWithinAbs(got, T, tolT) && fails < 10 {
			fails++
			t.Errorf("SatTFromHS(h=%.9g kJ/kg, s=%.9g kJ/(kg K)) = %.9g K, want %.9g (x=%.4f)", h, s, got, T, x)
		}
	}
	t.Logf("max |ΔT| = %.2f mK (p=%.4g MPa, T=%.5g K)", 1e3*m.dev, m.p, m.T)
}

func BenchmarkBackward3HSRegion3P(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.Region3PFromHS(2000, 4.2)
	}
}

func BenchmarkBackward3HSSatLiquidEnthalpy1(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.SatLiquidEnthalpy1FromS(2)
	}
}

func BenchmarkBackward3HSSatLiquidEnthalpy3(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.SatLiquidEnthalpy3FromS(4)
	}
}

func BenchmarkBackward3HSSatVapourEnthalpy2ab4(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.SatVapourEnthalpy2ab4FromS(8)
	}
}

func BenchmarkBackward3HSSatVapourEnthalpy2c3b(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.SatVapourEnthalpy2c3bFromS(5)
	}
}

func BenchmarkBackward3HSB13Enthalpy(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.B13Enthalpy(3.6)
	}
}

func BenchmarkBackward3HSB23T(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.B23TFromHS(2700, 5.15)
	}
}

func BenchmarkBackward3HSSatT(b *testing.B) {
	for b.Loop() {
		bw3Sink = if97.SatTFromHS(2400, 6)
	}
}

func TestBackward3NaNPropagates(t *testing.T) {
	// A NaN input must come out as NaN, not as a number from a branch
	// default (common practice, no source).
	nan := math.NaN()
	for name, got := range map[string]float64{
		"B3abEnthalpy":               if97.B3abEnthalpy(nan),
		"Region3TFromPH":             if97.Region3TFromPH(50, nan),
		"Region3VFromPH":             if97.Region3VFromPH(nan, 2000),
		"Region3TFromPS":             if97.Region3TFromPS(50, nan),
		"Region3VFromPS":             if97.Region3VFromPS(nan, 4.5),
		"Region3SatPressureFromH":    if97.Region3SatPressureFromH(nan),
		"Region3SatPressureFromS":    if97.Region3SatPressureFromS(nan),
		"Region3PFromHS":             if97.Region3PFromHS(2000, nan),
		"SatLiquidEnthalpy1FromS":    if97.SatLiquidEnthalpy1FromS(nan),
		"SatLiquidEnthalpy3FromS":    if97.SatLiquidEnthalpy3FromS(nan),
		"SatVapourEnthalpy2ab4FromS": if97.SatVapourEnthalpy2ab4FromS(nan),
		"SatVapourEnthalpy2c3bFromS": if97.SatVapourEnthalpy2c3bFromS(nan),
		"B13Enthalpy":                if97.B13Enthalpy(nan),
		"B23TFromHS":                 if97.B23TFromHS(nan, 5.1),
		"SatTFromHS":                 if97.SatTFromHS(2400, nan),
	} {
		if !math.IsNaN(got) {
			t.Errorf("%s with a NaN input = %g, want NaN", name, got)
		}
	}
}
