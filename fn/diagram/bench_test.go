package diagram_test

import (
	"io"
	"testing"

	"steamcell/fn/diagram"
)

// BenchmarkBuild computes every line of a T–s diagram (the dome, six
// isobars, seven isotherms, nine lines of quality, the boundaries).
func BenchmarkBuild(b *testing.B) {
	k, _ := diagram.KindByName("ts")
	for b.Loop() {
		if _, err := diagram.Build(k, nil, diagram.Options{Regions: true}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRender draws a built diagram, as SVG and as PNG.
func BenchmarkRender(b *testing.B) {
	k, _ := diagram.KindByName("ts")
	d, err := diagram.Build(k, nil, diagram.Options{Regions: true})
	if err != nil {
		b.Fatal(err)
	}
	for _, f := range []string{diagram.SVG, diagram.PNG} {
		b.Run(f, func(b *testing.B) {
			for b.Loop() {
				if err := d.Render(io.Discard, f); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
