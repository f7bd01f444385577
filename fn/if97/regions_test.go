package if97_test

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

// regTableRel is the tolerance for the computer-program verification tables
// of R7-97(2012): they print nine significant digits, so a correct result may
// differ from the printed one by up to half a unit in the ninth digit, 5e-9
// relative at worst.
const regTableRel = 1e-8

// regVerifyRow is one row of a verification table of R7-97(2012): the two
// inputs and the six properties printed for them. For the Gibbs regions x is
// the pressure and first the specific volume; for region 3 x is the density
// and first the pressure.
type regVerifyRow struct {
	x, T                  float64
	first, h, u, s, cp, w float64
}

// regCheckTable compares fn against rows within regTableRel. firstName names
// the property in regVerifyRow.first, "V" or "P", and xUnit the unit of x.
func regCheckTable(t *testing.T, name string, fn func(x, T float64) if97.Props, firstName, xUnit string, rows []regVerifyRow) {
	t.Helper()
	for _, tc := range rows {
		got := fn(tc.x, tc.T)
		first := got.V
		if firstName == "P" {
			first = got.P
		}
		for _, c := range []struct {
			prop      string
			got, want float64
		}{
			{firstName, first, tc.first},
			{"H", got.H, tc.h},
			{"U", got.U, tc.u},
			{"S", got.S, tc.s},
			{"Cp", got.Cp, tc.cp},
			{"W", got.W, tc.w},
		} {
			if !scalar.EqualWithinRel(c.got, c.want, regTableRel) {
				t.Errorf("%s(%g %s, T=%g K).%s = %.9g, want %.9g", name, tc.x, xUnit, tc.T, c.prop, c.got, c.want)
			}
		}
	}
}

// regSink keeps benchmark results alive.
var regSink if97.Props

// regLinspace returns n evenly spaced points from a to b, both included.
func regLinspace(a, b float64, n int) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = a + (b-a)*float64(i)/float64(n-1)
	}
	return x
}

// Thermodynamic identities (textbook relations, no source needed) check every
// Props field, so a wrong derivative in the relations of R7-97(2012) Tables
// 3, 12, 31 and 39 shows up even where the verification tables print no value
// (Cv, G, F, AlphaV, KappaT, Kappa).

// regFDStep is the relative step of the central differences; regFDRel is the
// tolerance, relative to the larger of the wanted value and the quantity's
// natural scale (R for entropy and heat capacities, 1/T for the expansion
// coefficient, which crosses zero near 277 K). The differences miss by at
// most 2.4e-7 at the points below (rounding, in κT of the liquid at 0.1 MPa);
// a wrong term of the relations misses by percents.
const (
	regFDStep = 1e-5
	regFDRel  = 1e-6
)

func regDiff(f func(float64) float64, x float64) float64 {
	h := regFDStep * x
	return (f(x+h) - f(x-h)) / (2 * h)
}

// regCheckAlgebra checks the fields that follow from the others by algebra
// alone: h = g + Ts, u = h − pv, f = g − pv, ρ = 1/v, cp − cv = Tvαv²/κT,
// w² = cp/(cv ρ κT) and κ = w²/(pv). The factor 10³ turns MPa·m³/kg into
// kJ/kg, 10⁶ into J/kg = m²/s².
func regCheckAlgebra(t *testing.T, name string, x, T float64, s if97.Props) {
	t.Helper()
	pv := s.P * s.V * 1e3
	w2 := 1e6 * s.Cp / (s.Cv * s.Rho * s.KappaT)
	for _, c := range []struct {
		prop      string
		got, want float64
	}{
		{"H", s.H, s.G + s.T*s.S},
		{"U", s.U, s.H - pv},
		{"F", s.F, s.G - pv},
		{"Rho", s.Rho, 1 / s.V},
		{"Cp-Cv", s.Cp - s.Cv, 1e3 * s.T * s.V * s.AlphaV * s.AlphaV / s.KappaT},
		{"W", s.W, math.Sqrt(w2)},
		{"Kappa", s.Kappa, w2 / (pv * 1e3)},
	} {
		if !scalar.EqualWithinRel(c.got, c.want, 1e-9) {
			t.Errorf("%s(%g, T=%g K): %s = %.12g, want %.12g from the other fields", name, x, T, c.prop, c.got, c.want)
		}
	}
}

// regGibbsPoints are states inside each Gibbs region of R7-97(2012) Fig. 1,
// p in MPa and T in K, spread over each region's corners and middle (common
// practice, no source).
var regGibbsPoints = []struct {
	name string
	fn   func(p, T float64) if97.Props
	pts  [][2]float64
}{
	{"Region1", if97.Region1, [][2]float64{{3, 300}, {80, 300}, {3, 500}, {0.1, 273.15}, {100, 273.15}, {100, 623.15}, {20, 620}, {50, 450}}},
	{"Region2", if97.Region2, [][2]float64{{0.0035, 300}, {0.0035, 700}, {30, 700}, {0.001, 273.15}, {10, 623.15}, {100, 1073.15}, {50, 900}, {1, 500}}},
	{"Region2Metastable", if97.Region2Metastable, [][2]float64{{1, 450}, {1, 440}, {1.5, 450}, {0.1, 368}, {10, 578}}},
	{"Region5", if97.Region5, [][2]float64{{0.5, 1500}, {30, 1500}, {30, 2000}, {0.001, 1073.15}, {50, 2273.15}, {50, 1073.15}}},
}

func TestRegionGibbsIdentities(t *testing.T) {
	for _, r := range regGibbsPoints {
		for _, pt := range r.pts {
			p, T := pt[0], pt[1]
			s := r.fn(p, T)
			regCheckAlgebra(t, r.name, p, T, s)
			atP := func(f func(if97.Props) float64) func(float64) float64 {
				return func(T float64) float64 { return f(r.fn(p, T)) }
			}
			atT := func(f func(if97.Props) float64) func(float64) float64 {
				return func(p float64) float64 { return f(r.fn(p, T)) }
			}
			g := func(s if97.Props) float64 { return s.G }
			v := func(s if97.Props) float64 { return s.V }
			entropy := func(s if97.Props) float64 { return s.S }
			for _, c := range []struct {
				prop             string
				got, want, scale float64
			}{
				{"V", s.V, regDiff(atT(g), p) / 1e3, 0}, // v = (∂g/∂p)_T
				{"S", s.S, -regDiff(atP(g), T), if97.R}, // s = −(∂g/∂T)_p
				{"Cp", s.Cp, T * regDiff(atP(entropy), T), if97.R},
				{"AlphaV", s.AlphaV, regDiff(atP(v), T) / s.V, 1 / T},
				{"KappaT", s.KappaT, -regDiff(atT(v), p) / s.V, 0},
			} {
				if !scalar.EqualWithinAbsOrRel(c.got, c.want, regFDRel*c.scale, regFDRel) {
					t.Errorf("%s(p=%g MPa, T=%g K).%s = %.9g, want %.9g from differences", r.name, p, T, c.prop, c.got, c.want)
				}
			}
		}
	}
}

func TestRegion3Identities(t *testing.T) {
	// ρ in kg/m³ and T in K: the points of Table 33, the critical isochore
	// off the critical point, and points spread over region 3.
	for _, pt := range [][2]float64{{500, 650}, {200, 650}, {500, 750}, {322, 660}, {700, 630}, {150, 800}, {600, 850}, {400, 700}} {
		rho, T := pt[0], pt[1]
		s := if97.Region3(rho, T)
		regCheckAlgebra(t, "Region3", rho, T, s)
		atRho := func(f func(if97.Props) float64) func(float64) float64 {
			return func(T float64) float64 { return f(if97.Region3(rho, T)) }
		}
		atT := func(f func(if97.Props) float64) func(float64) float64 {
			return func(rho float64) float64 { return f(if97.Region3(rho, T)) }
		}
		f := func(s if97.Props) float64 { return s.F }
		p := func(s if97.Props) float64 { return s.P }
		u := func(s if97.Props) float64 { return s.U }
		dpdrho := regDiff(atT(p), rho)
		for _, c := range []struct {
			prop             string
			got, want, scale float64
		}{
			{"P", s.P, rho * rho * regDiff(atT(f), rho) / 1e3, 0}, // p = ρ²(∂f/∂ρ)_T
			{"S", s.S, -regDiff(atRho(f), T), if97.R},             // s = −(∂f/∂T)_ρ
			{"Cv", s.Cv, regDiff(atRho(u), T), if97.R},            // cv = (∂u/∂T)_ρ
			{"KappaT", s.KappaT, 1 / (rho * dpdrho), 0},
			{"AlphaV", s.AlphaV, regDiff(atRho(p), T) / (rho * dpdrho), 1 / T},
		} {
			if !scalar.EqualWithinAbsOrRel(c.got, c.want, regFDRel*c.scale, regFDRel) {
				t.Errorf("Region3(ρ=%g kg/m³, T=%g K).%s = %.9g, want %.9g from differences", rho, T, c.prop, c.got, c.want)
			}
		}
	}
}

// Permissible inconsistencies of two basic equations on their common
// boundary, the requirements IF97 was fitted to (R7-97(2012) and the IF97
// paper by Wagner et al., 2000, from memory; surest for v, h, s and g):
// |Δv/v| ≤ 0.05 %, |Δh| ≤ 0.2 kJ/kg, |Δs| ≤ 0.2 J/(kg·K), |Δg| ≤ 0.2 kJ/kg,
// |Δcp/cp| ≤ 1 %, |Δw/w| ≤ 1 %. The equations as printed meet them with room
// (worst here, on B23: Δv/v 0.018 %, Δh 0.13 kJ/kg, Δs 0.18 J/(kg·K),
// Δcp/cp 0.35 %, Δw/w 0.40 %); a wrong coefficient breaks them.
const (
	regMaxDvRel  = 0.05e-2
	regMaxDh     = 0.2    // kJ/kg
	regMaxDs     = 0.2e-3 // kJ/(kg·K)
	regMaxDg     = 0.2    // kJ/kg
	regMaxDcpRel = 1e-2
	regMaxDwRel  = 1e-2
)

// regCheckConsistent compares the states of one (p, T) from two equations.
func regCheckConsistent(t *testing.T, where string, a, b if97.Props) {
	t.Helper()
	for _, c := range []struct {
		prop     string
		a, b     float64
		abs, rel float64
	}{
		{"v", a.V, b.V, 0, regMaxDvRel},
		{"h", a.H, b.H, regMaxDh, 0},
		{"s", a.S, b.S, regMaxDs, 0},
		{"g", a.G, b.G, regMaxDg, 0},
		{"cp", a.Cp, b.Cp, 0, regMaxDcpRel},
		{"w", a.W, b.W, 0, regMaxDwRel},
	} {
		ok := scalar.EqualWithinAbs(c.a, c.b, c.abs)
		if c.rel > 0 {
			ok = scalar.EqualWithinRel(c.a, c.b, c.rel)
		}
		if !ok {
			t.Errorf("%s at p=%g MPa, T=%g K: %s = %.9g and %.9g, differ by more than abs %g / rel %g", where, a.P, a.T, c.prop, c.a, c.b, c.abs, c.rel)
		}
	}
}

// regRegion3AtPT returns Region3 at the density where its pressure is p, by
// Newton's method from rho, using (∂p/∂ρ)_T = 1/(ρκT).
func regRegion3AtPT(t *testing.T, p, T, rho float64) if97.Props {
	t.Helper()
	for range 50 {
		s := if97.Region3(rho, T)
		if scalar.EqualWithinRel(s.P, p, 1e-12) {
			return s
		}
		rho -= (s.P - p) * s.Rho * s.KappaT
	}
	t.Fatalf("Region3 found no density for p=%g MPa, T=%g K", p, T)
	return if97.Props{}
}

// Regions 1 and 3 meet on the 623.15 K isotherm above the saturation
// pressure (R7-97(2012) Fig. 1).
func TestRegionBoundary1And3(t *testing.T) {
	const T = 623.15
	for _, p := range regLinspace(if97.SatPressure(T), 100, 200) {
		a := if97.Region1(p, T)
		regCheckConsistent(t, "Region1/Region3", a, regRegion3AtPT(t, p, T, a.Rho))
	}
}

// Regions 2 and 3 meet on the B23 line from 623.15 K to 863.15 K.
func TestRegionBoundary2And3(t *testing.T) {
	for _, T := range regLinspace(623.15, 863.15, 200) {
		p := if97.B23Pressure(T)
		a := if97.Region2(p, T)
		regCheckConsistent(t, "Region2/Region3", a, regRegion3AtPT(t, p, T, a.Rho))
	}
}

// Regions 2 and 5 meet on the 1073.15 K isotherm up to 50 MPa.
func TestRegionBoundary2And5(t *testing.T) {
	const T = 1073.15
	for _, p := range regLinspace(0.001, 50, 200) {
		regCheckConsistent(t, "Region2/Region5", if97.Region2(p, T), if97.Region5(p, T))
	}
}

// On the saturated-vapour line the metastable-vapour equation meets Region2;
// the same bounds apply (R7-97(2012) states the two are consistent there,
// from memory; worst here Δv/v 0.014 %, Δh 0.043 kJ/kg).
func TestRegion2MetastableMeetsRegion2(t *testing.T) {
	for _, p := range regLinspace(0.001, 10, 200) {
		T := if97.SatTemperature(p)
		regCheckConsistent(t, "Region2/Region2Metastable", if97.Region2(p, T), if97.Region2Metastable(p, T))
	}
}

// At saturation the liquid of region 1 and the vapour of region 2 have equal
// Gibbs free energy, within the permissible Δg above (worst here
// 0.012 kJ/kg).
func TestSatPhaseEquilibrium(t *testing.T) {
	for _, T := range regLinspace(273.15, 623.15, 200) {
		p := if97.SatPressure(T)
		liq, vap := if97.Region1(p, T), if97.Region2(p, T)
		if !scalar.EqualWithinAbs(liq.G, vap.G, regMaxDg) {
			t.Errorf("saturation at T=%g K, p=%g MPa: g' = %.9g, g'' = %.9g kJ/kg, want within %g", T, p, liq.G, vap.G, regMaxDg)
		}
	}
}

// The slope of the saturation-pressure equation and the phase properties of
// regions 1 and 2 obey Clausius–Clapeyron, dps/dT = (s” − s')/(v” − v')
// (textbook identity). IF97 meets it only within the consistency of its
// separate equations: the worst here is 1.6e-4 relative; the bound 5e-4 still
// catches a wrong slope or phase property, which misses by percents.
func TestSatClausiusClapeyron(t *testing.T) {
	const dT = 1e-4
	for _, T := range regLinspace(273.15, 623.15, 200) {
		p := if97.SatPressure(T)
		slope := (if97.SatPressure(T+dT) - if97.SatPressure(T-dT)) / (2 * dT)
		liq, vap := if97.Region1(p, T), if97.Region2(p, T)
		want := (vap.S - liq.S) / (vap.V - liq.V) / 1e3 // kPa/K to MPa/K
		if !scalar.EqualWithinRel(slope, want, 5e-4) {
			t.Errorf("dps/dT(T=%g K) = %.9g MPa/K, want %.9g from regions 1 and 2", T, slope, want)
		}
	}
}

// The raw equations check nothing: a NaN input must come out as NaN rather
// than as a finite number that looks valid, and an impossible p ≤ 0 (ρ ≤ 0)
// must not look valid either: G and S, which carry ln π (ln δ), are NaN or
// infinite then.
func TestRegionNaNAndNonPositive(t *testing.T) {
	nan := math.NaN()
	for _, tc := range []struct {
		name string
		fn   func(x, T float64) if97.Props
		x, T float64
	}{
		{"Region1", if97.Region1, nan, 300},
		{"Region1", if97.Region1, 3, nan},
		{"Region2", if97.Region2, nan, 700},
		{"Region2", if97.Region2, 1, nan},
		{"Region2", if97.Region2, 0, 700},
		{"Region2", if97.Region2, -1, 700},
		{"Region2Metastable", if97.Region2Metastable, nan, 450},
		{"Region2Metastable", if97.Region2Metastable, 0, 450},
		{"Region3", if97.Region3, nan, 650},
		{"Region3", if97.Region3, 500, nan},
		{"Region3", if97.Region3, 0, 650},
		{"Region5", if97.Region5, nan, 1500},
		{"Region5", if97.Region5, 0, 1500},
		{"Region5", if97.Region5, -1, 1500},
	} {
		s := tc.fn(tc.x, tc.T)
		for _, c := range []struct {
			prop string
			v    float64
		}{{"G", s.G}, {"S", s.S}} {
			if !math.IsNaN(c.v) && !math.IsInf(c.v, 0) {
				t.Errorf("%s(%g, T=%g K).%s = %g, want NaN or ±Inf", tc.name, tc.x, tc.T, c.prop, c.v)
			}
		}
	}
}

func TestRegionOf(t *testing.T) {
	// Points by R7-97(2012) Fig. 1 and the limits in its text: the
	// verification states of Tables 5, 15, 33 (as p, T) and 42, then the
	// edges of each region.
	psat := if97.SatPressure(500)
	pb23 := if97.B23Pressure(700)
	for _, tc := range []struct {
		p, T float64
		want int
	}{
		{3, 300, 1}, {80, 300, 1}, {3, 500, 1}, // Table 5
		{0.0035, 300, 2}, {0.0035, 700, 2}, {30, 700, 2}, // Table 15
		{25.5837018, 650, 3}, {22.2930643, 650, 3}, {78.3095639, 750, 3}, // Table 33
		{0.5, 1500, 5}, {30, 2000, 5}, // Table 42
		{psat, 500, 1},                     // on the saturation line: liquid by convention
		{psat * (1 - 1e-12), 500, 2},       // just below it: vapour
		{100, 273.15, 1}, {100, 623.15, 1}, // corners of region 1
		{0.0005, 273.15, 2},                // lowest temperature, below ps = 611 Pa
		{pb23, 700, 2},                     // on B23: region 2
		{pb23 * (1 + 1e-12), 700, 3},       // just above B23
		{100, 863.15, 2},                   // upper end of B23
		{100, 863.2, 2}, {100, 1073.15, 2}, // region 2 above B23's end
		{100, 700, 3},
		{50, 1073.16, 5}, {50, 2273.15, 5}, // region 5 corners
		{0, 300, 0}, {-1, 300, 0}, // p ≤ 0
		{100.001, 300, 0}, {100.001, 700, 0}, {100.001, 900, 0}, // above 100 MPa
		{50.001, 1500, 0}, {1, 2273.16, 0}, // outside region 5
		{1, 273.14, 0}, // below 273.15 K
		{math.NaN(), 300, 0}, {1, math.NaN(), 0},
		{math.Inf(1), 300, 0}, {1, math.Inf(1), 0},
	} {
		if got := if97.RegionOf(tc.p, tc.T); got != tc.want {
			t.Errorf("RegionOf(p=%g MPa, T=%g K) = %d, want %d", tc.p, tc.T, got, tc.want)
		}
	}
}

// The forward equations sit in hot loops of the backward iterations and the
// batch paths: they must not allocate.
func TestRegionNoAllocations(t *testing.T) {
	var sink if97.Props
	var x float64
	for _, tc := range []struct {
		name string
		fn   func()
	}{
		{"Region1", func() { sink = if97.Region1(3, 300) }},
		{"Region2", func() { sink = if97.Region2(1, 700) }},
		{"Region2Metastable", func() { sink = if97.Region2Metastable(1, 450) }},
		{"Region3", func() { sink = if97.Region3(500, 650) }},
		{"Region5", func() { sink = if97.Region5(30, 1500) }},
		{"SatPressure", func() { x = if97.SatPressure(500) }},
		{"SatTemperature", func() { x = if97.SatTemperature(1) }},
		{"RegionOf", func() { x = float64(if97.RegionOf(20, 700)) }},
	} {
		if n := testing.AllocsPerRun(100, tc.fn); n != 0 {
			t.Errorf("%s allocates %g times per call, want 0", tc.name, n)
		}
	}
	_, _ = sink, x
}
