package fn

import (
	"testing"
)

// Benchmarks, one per input pair, over a fixed set of states spread across
// the regions (the same draw as the round-trip test). The README's
// performance section reports each as a ratio to BenchmarkPairPT measured
// in the same run.

var benchStates []State

func benchSet(b *testing.B) []State {
	if benchStates == nil {
		benchStates = randomStates(b, 512, 3)
	}
	return benchStates
}

var sink State

func benchPair(b *testing.B, in func(s *State) (Input, Input)) {
	states := benchSet(b)
	inputs := make([][2]Input, len(states))
	for i := range states {
		inputs[i][0], inputs[i][1] = in(&states[i])
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		x := &inputs[i%len(inputs)]
		st, _ := Solve(x[0], x[1])
		sink = st
	}
}

func BenchmarkPairPT(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Temperature, s.T} })
}
func BenchmarkPairPH(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Enthalpy, s.H} })
}
func BenchmarkPairPS(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Entropy, s.S} })
}
func BenchmarkPairHS(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Enthalpy, s.H}, Input{Entropy, s.S} })
}
func BenchmarkPairPV(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Volume, s.V} })
}
func BenchmarkPairTV(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Temperature, s.T}, Input{Volume, s.V} })
}
func BenchmarkPairTH(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Temperature, s.T}, Input{Enthalpy, s.H} })
}
func BenchmarkPairTS(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Temperature, s.T}, Input{Entropy, s.S} })
}
func BenchmarkPairUV(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{InternalEnergy, s.U}, Input{Volume, s.V} })
}
func BenchmarkPairPX(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Quality, 0.9} })
}
func BenchmarkPairTX(b *testing.B) {
	benchPair(b, func(s *State) (Input, Input) { return Input{Temperature, s.T}, Input{Quality, 0.9} })
}
