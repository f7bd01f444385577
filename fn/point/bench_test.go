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
		in, _ := Read(benchGiven, Options{})
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
