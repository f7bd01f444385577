package point

import (
	"testing"

	"steamcell/fn"
	"steamcell/fn/transport"
	"steamcell/fn/units"
)

// Benchmarks for the costs the README reports as ratios in one run: reading
// a point's two inputs against solving the state, and a state with its
// transport properties against one without.

var (
	sinkState fn.State
	sinkF     float64
)

// The Kestrel Bay demo's drum: 6 barg, 330 °C (superheated, region 2).
var benchGiven = []Given{{Name: "p", Text: "6 barg"}, {Name: "t", Text: "330 °C"}}

func BenchmarkReadInputs(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		in, _, _ := read(benchGiven, &Options{})
		sinkF = in[0].Value
	}
}

func BenchmarkParseTwoValues(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		p, _ := units.Parse("6 barg", units.Pressure, units.Options{})
		t, _ := units.Parse("330 °C", units.Temperature, units.Options{})
		sinkF = p + t
	}
}

// The same with two units per quantity in turn (two columns of pressure,
// one in barg and one in psig, read row by row): both stay remembered.
func BenchmarkParseTwoValuesTwoUnits(b *testing.B) {
	b.ReportAllocs()
	ps := [2]string{"6 barg", "87 psig"}
	ts := [2]string{"330 °C", "626 °F"}
	for i := 0; i < b.N; i++ {
		p, _ := units.Parse(ps[i&1], units.Pressure, units.Options{})
		t, _ := units.Parse(ts[i&1], units.Temperature, units.Options{})
		sinkF = p + t
	}
}

// The worst case: more units per quantity in turn than are remembered, so
// that every unit is looked up afresh.
func BenchmarkParseTwoValuesUnitsRotate(b *testing.B) {
	b.ReportAllocs()
	ps := [...]string{"6 barg", "87 psig", "700 kPa", "0.7 MPa", "7 bar", "101 psia"}
	ts := [...]string{"330 °C", "626 °F", "603.15 K", "1085 R", "330 degC", "626 degF"}
	for i := 0; i < b.N; i++ {
		p, _ := units.Parse(ps[i%len(ps)], units.Pressure, units.Options{})
		t, _ := units.Parse(ts[i%len(ts)], units.Temperature, units.Options{})
		sinkF = p + t
	}
}

func BenchmarkStateWithoutTransport(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		st, _ := fn.FromPT(0.701325, 603.15)
		sinkState = st
	}
}

func BenchmarkStateWithTransport(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		st, _ := fn.FromPT(0.701325, 603.15)
		r, _ := transport.ForState(st.Props)
		sinkState = st
		sinkF = r.Viscosity
	}
}

// A liquid state (feedwater, 47.5 barg, 128 °C) with and without transport.
func BenchmarkLiquidWithoutTransport(b *testing.B) {
	for i := 0; i < b.N; i++ {
		st, _ := fn.FromPT(4.851325, 401.15)
		sinkState = st
	}
}

func BenchmarkLiquidWithTransport(b *testing.B) {
	for i := 0; i < b.N; i++ {
		st, _ := fn.FromPT(4.851325, 401.15)
		r, _ := transport.ForState(st.Props)
		sinkState = st
		sinkF = r.Viscosity
	}
}
