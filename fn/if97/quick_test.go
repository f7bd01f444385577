package if97

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// The quick subsets agree with the full property sets (identity check: the
// same equations, summed in a different order, so to rounding: 1e-12),
// over each region's range.
func TestQuickSubsetsMatchFullProps(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for i := 0; i < 2000; i++ {
		T := 273.15 + rng.Float64()*350
		p := SatPressure(T) + rng.Float64()*(100-SatPressure(T))
		h, s, cp, _ := Region1HSCp(p, T)
		f := Region1(p, T)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinAbsOrRel(s, f.S, 1e-15, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region1HSCp(%g, %g) = %g, %g, %g; Region1 gives %g, %g, %g", p, T, h, s, cp, f.H, f.S, f.Cp)
		}
		T5 := 1073.15 + rng.Float64()*1200
		p5 := 1e-3 + rng.Float64()*50
		h, s, cp, _ = Region5HSCp(p5, T5)
		f = Region5(p5, T5)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinRel(s, f.S, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region5HSCp(%g, %g) = %g, %g, %g; Region5 gives %g, %g, %g", p5, T5, h, s, cp, f.H, f.S, f.Cp)
		}
		T2 := 273.15 + rng.Float64()*800
		p2 := 1e-3 + rng.Float64()*10
		h, s, cp, _ = Region2HSCp(p2, T2)
		f = Region2(p2, T2)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinRel(s, f.S, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region2HSCp(%g, %g) = %g, %g, %g; Region2 gives %g, %g, %g", p2, T2, h, s, cp, f.H, f.S, f.Cp)
		}
	}
}

// dcp/dT from the quick subsets agrees with a central difference of cp
// (identity check: 1e-6 relative, the difference's own error).
func TestQuickDcpMatchesDifference(t *testing.T) {
	for _, c := range []struct {
		f    func(p, T float64) (h, s, cp, dcp float64)
		p, T float64
	}{{Region1HSCp, 10, 450}, {Region2HSCp, 1, 600}, {Region2HSCp, 15, 620}, {Region5HSCp, 20, 1500}} {
		_, _, _, dcp := c.f(c.p, c.T)
		const dT = 1e-3
		_, _, cp1, _ := c.f(c.p, c.T+dT)
		_, _, cp0, _ := c.f(c.p, c.T-dT)
		if want := (cp1 - cp0) / (2 * dT); !scalar.EqualWithinAbsOrRel(dcp, want, 1e-9, 1e-6) {
			t.Errorf("dcp/dT at p=%g, T=%g: %g, difference gives %g", c.p, c.T, dcp, want)
		}
	}
}

func BenchmarkRegion1HSCp(b *testing.B) {
	for i := 0; i < b.N; i++ {
		quickSink, _, _, _ = Region1HSCp(3, 300)
	}
}

func BenchmarkRegion2HSCp(b *testing.B) {
	for i := 0; i < b.N; i++ {
		quickSink, _, _, _ = Region2HSCp(0.0035, 300)
	}
}

var quickSink float64

// regPolySum and regPolySumB divide the summed exponent factors by powers
// of a and b; regPolySumZero and regPolySumBZero sum the derivatives term by
// term. Identity check (the same sums in another order, so to rounding:
// 1e-13 of the sum of the terms' magnitudes, which is what rounding scales
// with when terms cancel): both ways agree for every table of the forward
// equations, and close to b = 0 the factored sums approach the b = 0 values.
func TestFactoredSumsMatchTermByTerm(t *testing.T) {
	tables := []struct {
		name string
		rows []term
	}{
		{"region 1", r1Coef[:]}, {"region 2 residual", r2ResidualCoef[:]}, {"region 2 ideal", r2IdealCoef[:]},
		{"region 3", r3Coef[:]}, {"region 5 residual", r5ResidualCoef[:]}, {"region 5 ideal", r5IdealCoef[:]},
	}
	// magnitudes returns the sums of the terms' magnitudes, term by term,
	// for f and each derivative (what the rounding of each sum scales with).
	magnitudes := func(rows []term, a, b float64) regDerivs {
		var m regDerivs
		for _, r := range rows {
			a0, a1, a2 := regPowDerivs(a, r.I)
			b0, b1, b2 := regPowDerivs(b, r.J)
			n := math.Abs(r.n)
			m.f += n * math.Abs(a0*b0)
			m.fa += n * math.Abs(a1*b0)
			m.faa += n * math.Abs(a2*b0)
			m.fb += n * math.Abs(a0*b1)
			m.fbb += n * math.Abs(a0*b2)
			m.fab += n * math.Abs(a1*b1)
		}
		return m
	}
	rng := rand.New(rand.NewPCG(21, 22))
	for _, tb := range tables {
		name, rows := tb.name, tb.rows
		for i := 0; i < 200; i++ {
			a, b := 0.2+rng.Float64()*4, 0.2+rng.Float64()*2
			f, z, m := regPolySum(rows, a, b), regPolySumZero(rows, a, b), magnitudes(rows, a, b)
			g, gb, gbb, _ := regPolySumB(rows, a, b)
			for _, c := range []struct {
				what           string
				got, want, mag float64
			}{
				{"f", f.f, z.f, m.f}, {"fa", f.fa, z.fa, m.fa}, {"faa", f.faa, z.faa, m.faa},
				{"fb", f.fb, z.fb, m.fb}, {"fbb", f.fbb, z.fbb, m.fbb}, {"fab", f.fab, z.fab, m.fab},
				{"B f", g, z.f, m.f}, {"B fb", gb, z.fb, m.fb}, {"B fbb", gbb, z.fbb, m.fbb},
			} {
				if math.Abs(c.got-c.want) > 1e-13*c.mag+1e-300 {
					t.Fatalf("%s at a=%g, b=%g: %s factored %g, term by term %g (magnitude %g)", name, a, b, c.what, c.got, c.want, c.mag)
				}
			}
		}
		// The zero branches and the limit b → 0, for the tables without
		// negative powers of b (in use: region 2's residual part at 1080 K).
		if slices.ContainsFunc(rows, func(r term) bool { return r.J < 0 }) {
			continue
		}
		a := 0.7
		f0, fb0, fbb0, fbbb0 := regPolySumB(rows, a, 0)
		f1, fb1, fbb1, fbbb1 := regPolySumB(rows, a, 1e-9)
		d0, d1 := regPolySum(rows, a, 0), regPolySum(rows, a, 1e-9)
		close := func(x, y float64) bool { return scalar.EqualWithinAbsOrRel(x, y, 1e-6, 1e-6) }
		if !close(f0, f1) || !close(fb0, fb1) || !close(fbb0, fbb1) || !close(fbbb0, fbbb1) || !close(d0.fb, d1.fb) || !close(d0.fbb, d1.fbb) || !close(d0.fab, d1.fab) {
			t.Errorf("%s: at b = 0 (%g %g %g %g, %+v) and b = 1e-9 (%g %g %g %g, %+v) differ", name, f0, fb0, fbb0, fbbb0, d0, f1, fb1, fbb1, fbbb1, d1)
		}
	}
}
