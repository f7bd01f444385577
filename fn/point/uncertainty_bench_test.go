package point_test

import (
	"testing"

	"steamcell/fn/point"
)

// Benchmarks of a state with uncertainties against the plain state, for
// the ratio the report gives: the linear propagation, the phase check and
// the linearity check (four more solves) over all default properties.
func BenchmarkStatePlain(b *testing.B) {
	given := []point.Given{{Name: "p", Text: "100bar"}, {Name: "t", Text: "500C"}}
	for b.Loop() {
		st, _, err := point.Solve(given, point.Options{})
		if err != nil {
			b.Fatal(err)
		}
		_ = point.Render(&st, nil, point.Options{})
	}
}

func BenchmarkStateMeasured(b *testing.B) {
	given := []point.Given{{Name: "p", Text: "100bar±0.2bar"}, {Name: "t", Text: "500C±0.5K"}}
	for b.Loop() {
		m, err := point.SolveMeasured(given, point.Options{}, point.UOptions{})
		if err != nil {
			b.Fatal(err)
		}
		ans := point.Render(&m.State.State, nil, point.Options{})
		_ = point.RenderUncertainty(&m, &ans, point.Options{}, point.UOptions{})
	}
}

func BenchmarkProcessExpansion(b *testing.B) {
	given := []point.Given{{Name: "p1", Text: "60bar±0.3bar"}, {Name: "t1", Text: "480C±1K"},
		{Name: "p2", Text: "12bar±0.1bar"}, {Name: "t2", Text: "280C±1K"}}
	for b.Loop() {
		if _, err := point.RunProcess("expansion", given, point.Options{}, point.UOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
