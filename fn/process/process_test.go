package process_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"

	"steamcell/fn"
	"steamcell/fn/process"
)

func run(t *testing.T, kind string, in ...process.Value) process.Answer {
	t.Helper()
	a, err := process.Run(kind, in)
	if err != nil {
		t.Fatalf("%s %v: %v", kind, in, err)
	}
	return a
}

func res(t *testing.T, a process.Answer, name string) process.Result {
	t.Helper()
	r, ok := a.Result(name)
	if !ok {
		t.Fatalf("%s: no result %s", a.Kind, name)
	}
	return r
}

func near(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, tol, tol) {
		t.Errorf("%s = %.12g, want %.12g (tolerance %g)", what, got, want, tol)
	}
}

// TestIsentropicEndIsEfficiencyOne: with state 2 the isentropic end state
// itself (h2 = h(p2, s1)), the efficiency is 1 and work = work_s, to
// rounding, for expansion (wet and dry end) and compression (identity).
func TestIsentropicEndIsEfficiencyOne(t *testing.T) {
	for _, tc := range []struct {
		kind       string
		p1, t1, p2 float64
	}{
		{"expansion", 10, 773.15, 0.01},  // main steam to condenser: wet end
		{"expansion", 4, 673.15, 0.5},    // back-pressure section: dry end
		{"compression", 0.01, 318.15, 5}, // condensate pump
		{"compression", 0.1, 400, 0.5},   // vapour compressor
	} {
		st1, err := fn.FromPT(tc.p1, tc.t1)
		if err != nil {
			t.Fatal(err)
		}
		st2, err := fn.FromPS(tc.p2, st1.S)
		if err != nil {
			t.Fatal(err)
		}
		a := run(t, tc.kind, process.Value{Name: "p1", X: tc.p1, U: 0.01}, process.Value{Name: "t1", X: tc.t1, U: 0.5},
			process.Value{Name: "p2", X: tc.p2, U: 0.001}, process.Value{Name: "h2", X: st2.H, U: 1})
		near(t, tc.kind+" efficiency", res(t, a, "efficiency").Value, 1, 1e-9)
		near(t, tc.kind+" work − work_s", res(t, a, "work").Value-res(t, a, "work_s").Value, 0, 1e-9)
		near(t, tc.kind+" h2s", res(t, a, "h2s").Value, st2.H, 1e-9)
	}
}

// TestExpansionHandbook: a worked number from handbook steam-table values,
// from memory: 10 MPa, 500 °C has h = 3373.7 kJ/kg and s = 6.5966
// kJ/(kg·K); expanded isentropically to 10 kPa (sf = 0.6493, sfg = 7.5009,
// hf = 191.83, hfg = 2392.8) it has x2s = 0.7929 and h2s = 2089 kJ/kg. An
// actual end at x2 = 0.90 (h2 = 191.83 + 0.9·2392.8 = 2345.4) gives an
// efficiency (3373.7 − 2345.4)/(3373.7 − 2089.1) = 0.800.
func TestExpansionHandbook(t *testing.T) {
	a := run(t, "expansion", process.Value{Name: "p1", X: 10}, process.Value{Name: "t1", X: 773.15},
		process.Value{Name: "p2", X: 0.01}, process.Value{Name: "x2", X: 0.9})
	near(t, "h2s", res(t, a, "h2s").Value, 2089.1, 1e-3)
	near(t, "work_s", res(t, a, "work_s").Value, 3373.7-2089.1, 2e-3)
	near(t, "efficiency", res(t, a, "efficiency").Value, 0.800, 3e-3)
	if len(a.States) != 3 || a.States[2].Label != "2s" {
		t.Fatalf("states %+v", a.States)
	}
}

// TestThrottlingHandbook: a throttling calorimeter, handbook steam-table
// values from memory: downstream 0.1 MPa, 120 °C has h = 2716.6 kJ/kg; at
// 1 MPa hf = 762.81 and hfg = 2015.3 kJ/kg, so x1 = 0.9695.
func TestThrottlingHandbook(t *testing.T) {
	a := run(t, "throttling", process.Value{Name: "p1", X: 1, U: 0.005},
		process.Value{Name: "p2", X: 0.1, U: 0.001}, process.Value{Name: "t2", X: 393.15, U: 0.3})
	near(t, "h1", res(t, a, "h1").Value, 2716.6, 2e-4)
	near(t, "x1", res(t, a, "x1").Value, 0.9695, 5e-4)
	// Identity: the upstream state at (p1, x1) has h2.
	st, err := fn.FromPX(1, res(t, a, "x1").Value)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "h(p1, x1) − h2", st.H-res(t, a, "h1").Value, 0, 1e-9)
	if u := res(t, a, "x1").U; !(u > 0 && u < 0.01) {
		t.Errorf("u(x1) = %g", u)
	}
}

// TestThrottlingRefused: dry or superheated upstream steam, and a wet
// downstream state, are refused with the reason.
func TestThrottlingRefused(t *testing.T) {
	for _, in := range [][]process.Value{
		{{Name: "p1", X: 1}, {Name: "p2", X: 0.1}, {Name: "t2", X: 473.15}}, // h2 2875: superheated at 1 MPa
		{{Name: "p1", X: 1}, {Name: "p2", X: 0.1}, {Name: "x2", X: 0.98}},   // wet downstream
	} {
		_, err := process.Run("throttling", in)
		if !errors.Is(err, process.ErrRefused) {
			t.Errorf("throttling %v: err %v, want ErrRefused", in, err)
		}
	}
}

// TestMixingBalance: the outlet closes the energy balance to rounding, and
// the spray flow for the outlet found is the m2 given.
func TestMixingBalance(t *testing.T) {
	in := []process.Value{
		{Name: "p1", X: 10, U: 0.05}, {Name: "t1", X: 823.15, U: 1}, {Name: "m1", X: 100, U: 0.5},
		{Name: "p2", X: 14, U: 0.05}, {Name: "t2", X: 433.15, U: 0.5}, {Name: "m2", X: 4, U: 0.1},
	}
	a := run(t, "mixing", in...)
	h1, _ := fn.FromPT(10, 823.15)
	h2, _ := fn.FromPT(14, 433.15)
	h3 := res(t, a, "h3").Value
	near(t, "m3 h3 − m1 h1 − m2 h2", 104*h3-100*h1.H-4*h2.H, 0, 1e-9)
	t3 := res(t, a, "t3").Value
	b := run(t, "mixing", in[0], in[1], in[2], in[3], in[4], process.Value{Name: "t3", X: t3, U: 1})
	near(t, "spray m2", res(t, b, "m2").Value, 4, 1e-9)
	if u := res(t, b, "m2").U; !(u > 0) {
		t.Errorf("u(m2) = %g", u)
	}
}

// TestExchangerBalance: the extraction flow closes the heater's energy
// balance, TTD and DCA follow their definitions, and a drain given
// without p2 takes the shell pressure p1 (one reading for both states).
func TestExchangerBalance(t *testing.T) {
	a := run(t, "exchanger",
		process.Value{Name: "p1", X: 1.2, U: 0.006}, process.Value{Name: "t1", X: 573.15, U: 1},
		process.Value{Name: "t2", X: 438.15, U: 0.5},
		process.Value{Name: "p3", X: 8, U: 0.04}, process.Value{Name: "t3", X: 430.15, U: 0.5},
		process.Value{Name: "t4", X: 457.15, U: 0.5})
	s1, _ := fn.FromPT(1.2, 573.15)
	s2, _ := fn.FromPT(1.2, 438.15)
	s3, _ := fn.FromPT(8, 430.15)
	s4, _ := fn.FromPT(8, 457.15)
	near(t, "duty", res(t, a, "duty").Value, s4.H-s3.H, 1e-12)
	near(t, "extraction·(h1 − h2) − duty", res(t, a, "extraction").Value*(s1.H-s2.H)-(s4.H-s3.H), 0, 1e-9)
	ts, _ := fn.SaturationAtP(1.2)
	near(t, "ttd", res(t, a, "ttd").Value, ts.T-457.15, 1e-12)
	near(t, "dca", res(t, a, "dca").Value, 438.15-430.15, 1e-12)
	// u(dca) comes from t2 and t3 alone: √(0.5² + 0.5²).
	near(t, "u(dca)", res(t, a, "dca").U, math.Sqrt(0.5), 1e-12)
}

// TestEfficiencyMonteCarlo: the efficiency's u from its four measurements
// through the full Jacobian agrees with a Monte Carlo propagation (JCGM
// 101:2008, distuv, fixed seed) within four standard errors, and differs
// from treating h1, h2 and h2s as independent (which ignores that p2 and
// the inlet readings enter both h2 and h2s). The test section is our own.
func TestEfficiencyMonteCarlo(t *testing.T) {
	in := []process.Value{
		{Name: "p1", X: 6, U: 0.03}, {Name: "t1", X: 753.15, U: 1},
		{Name: "p2", X: 1.2, U: 0.01}, {Name: "t2", X: 553.15, U: 1},
	}
	a := run(t, "expansion", in...)
	eff := res(t, a, "efficiency")
	src := rand.NewPCG(7, 13)
	dists := make([]distuv.Normal, len(in))
	for i, v := range in {
		dists[i] = distuv.Normal{Mu: v.X, Sigma: v.U, Src: src}
	}
	const draws = 10000
	var ys []float64
	for range draws {
		moved := make([]process.Value, len(in))
		for i, v := range in {
			moved[i] = process.Value{Name: v.Name, X: dists[i].Rand()}
		}
		b, err := process.Run("expansion", moved)
		if err != nil {
			t.Fatal(err)
		}
		r, _ := b.Result("efficiency")
		ys = append(ys, r.Value)
	}
	_, sd := stat.MeanStdDev(ys, nil)
	se := sd / math.Sqrt(2*(draws-1))
	t.Logf("efficiency %.5f: GUM u %.5g, Monte Carlo sd %.5g ± %.2g", eff.Value, eff.U, sd, se)
	if math.Abs(sd-eff.U) > 4*se {
		t.Errorf("u(efficiency) = %.6g, Monte Carlo %.6g ± %.2g", eff.U, sd, se)
	}
	// The naive sum over h1, h2, h2s as if independent.
	h1, h2, h2s := a.States[0].Fields[2], a.States[1].Fields[2], res(t, a, "h2s")
	w, ws := h1.Value-h2.Value, h1.Value-h2s.Value
	naive := math.Sqrt(math.Pow((1/ws-w/(ws*ws))*h1.U, 2) + math.Pow(h2.U/ws, 2) + math.Pow(w/(ws*ws)*h2s.U, 2))
	t.Logf("naive u treating h1, h2, h2s as independent: %.5g", naive)
	if math.Abs(naive-sd) < 4*se {
		t.Errorf("the naive u %.6g agrees with the Monte Carlo %.6g: the case does not show the correlation", naive, sd)
	}
	if len(res(t, a, "efficiency").Contributions) != 4 {
		t.Errorf("contributions %+v, want four", res(t, a, "efficiency").Contributions)
	}
}

// TestInputErrors: missing, unknown, repeated and unused inputs.
func TestInputErrors(t *testing.T) {
	for _, tc := range []struct {
		kind string
		in   []process.Value
		want error
	}{
		{"turbine", nil, process.ErrKind},
		{"expansion", []process.Value{{Name: "p1", X: 10}, {Name: "t1", X: 773}, {Name: "p2", X: 1}}, process.ErrInput},
		{"expansion", []process.Value{{Name: "p1", X: 10}, {Name: "t1", X: 773}, {Name: "p2", X: 1}, {Name: "t2", X: 600}, {Name: "t3", X: 500}}, process.ErrInput},
		{"expansion", []process.Value{{Name: "p1", X: 10}, {Name: "P1", X: 10}}, process.ErrInput},
		{"expansion", []process.Value{{Name: "q1", X: 10}}, process.ErrInput},
		{"expansion", []process.Value{{Name: "p1", X: 1}, {Name: "t1", X: 773}, {Name: "p2", X: 10}, {Name: "t2", X: 900}}, process.ErrRefused},
		{"compression", []process.Value{{Name: "p1", X: 10}, {Name: "t1", X: 373}, {Name: "p2", X: 1}, {Name: "t2", X: 373}}, process.ErrRefused},
		{"mixing", []process.Value{{Name: "p1", X: 10}, {Name: "t1", X: 773}, {Name: "p2", X: 12}, {Name: "t2", X: 400}, {Name: "m1", X: 1}}, process.ErrInput},
		{"mixing", []process.Value{{Name: "p1", X: 10}, {Name: "t1", X: 773}, {Name: "p2", X: 12}, {Name: "t2", X: 400}, {Name: "m1", X: 1}, {Name: "t3", X: 900}}, process.ErrRefused},
	} {
		_, err := process.Run(tc.kind, tc.in)
		if !errors.Is(err, tc.want) {
			t.Errorf("%s %v: err %v, want %v", tc.kind, tc.in, err, tc.want)
		}
	}
}

// TestProcessMonteCarlo: the u of the throttling calorimeter's quality,
// the heater's extraction flow and TTD, the spray flow and a pump's
// efficiency agree with a Monte Carlo propagation (JCGM 101:2008, distuv,
// fixed seed) within four standard errors of its standard deviation. The
// readings are our own.
func TestProcessMonteCarlo(t *testing.T) {
	for i, tc := range []struct {
		kind, result string
		in           []process.Value
	}{
		{"throttling", "x1", []process.Value{{Name: "p1", X: 1, U: 0.005}, {Name: "p2", X: 0.1, U: 0.001}, {Name: "t2", X: 393.15, U: 0.5}}},
		{"exchanger", "extraction", []process.Value{{Name: "p1", X: 0.602, U: 0.003}, {Name: "t1", X: 484.75, U: 0.6}, {Name: "t2", X: 423.45, U: 0.4},
			{Name: "p3", X: 6.15, U: 0.03}, {Name: "t3", X: 413.25, U: 0.3}, {Name: "t4", X: 428.15, U: 0.3}}},
		{"exchanger", "ttd", []process.Value{{Name: "p1", X: 0.602, U: 0.003}, {Name: "t1", X: 484.75, U: 0.6}, {Name: "t2", X: 423.45, U: 0.4},
			{Name: "p3", X: 6.15, U: 0.03}, {Name: "t3", X: 413.25, U: 0.3}, {Name: "t4", X: 428.15, U: 0.3}}},
		{"mixing", "m2", []process.Value{{Name: "p1", X: 4.085, U: 0.01}, {Name: "t1", X: 680.25, U: 0.6}, {Name: "m1", X: 38.5, U: 0.4},
			{Name: "p2", X: 5.5, U: 0.03}, {Name: "t2", X: 413.15, U: 0.5}, {Name: "t3", X: 653.15, U: 1}}},
		{"compression", "efficiency", []process.Value{{Name: "p1", X: 0.1, U: 0.001}, {Name: "t1", X: 400, U: 0.3},
			{Name: "p2", X: 0.5, U: 0.003}, {Name: "t2", X: 620, U: 0.3}}},
	} {
		a := run(t, tc.kind, tc.in...)
		r := res(t, a, tc.result)
		src := rand.NewPCG(uint64(i+1), 17)
		const draws = 5000
		ys := make([]float64, 0, draws)
		dists := make([]distuv.Normal, len(tc.in))
		for k, v := range tc.in {
			dists[k] = distuv.Normal{Mu: v.X, Sigma: v.U, Src: src}
		}
		for range draws {
			moved := make([]process.Value, len(tc.in))
			for k, v := range tc.in {
				moved[k] = process.Value{Name: v.Name, X: dists[k].Rand()}
			}
			b, err := process.Run(tc.kind, moved)
			if err != nil {
				t.Fatalf("%s: a draw: %v", tc.kind, err)
			}
			got, _ := b.Result(tc.result)
			ys = append(ys, got.Value)
		}
		_, sd := stat.MeanStdDev(ys, nil)
		se := sd / math.Sqrt(2*(draws-1))
		t.Logf("%-11s %-10s %.6g: GUM u %.5g, Monte Carlo sd %.5g (%+.2f %%, %+.1f SE)", tc.kind, tc.result, r.Value, r.U, sd, 100*(sd-r.U)/r.U, (sd-r.U)/se)
		if math.Abs(sd-r.U) > 4*se || r.Unreliable {
			t.Errorf("%s %s: GUM u %.6g, Monte Carlo %.6g ± %.2g (unreliable flag %v)", tc.kind, tc.result, r.U, sd, se, r.Unreliable)
		}
	}
}
