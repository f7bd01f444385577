package diagram

import (
	"math"
	"strconv"

	"gonum.org/v1/plot"
)

// linearTicks marks a linear axis every 1, 2 or 5 times a power of ten,
// with about eight labelled ticks and four minor ticks between two
// labelled ones (gonum's default labels only three or four).
func linearTicks(min, max float64) []plot.Tick {
	span := max - min
	if !(span > 0) {
		return nil
	}
	raw := span / 8
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step := mag
	for _, m := range []float64{1, 2, 5, 10} {
		if m*mag >= raw {
			step = m * mag
			break
		}
	}
	minor := step / 5
	var ticks []plot.Tick
	for i := math.Ceil(min / minor); i*minor <= max+minor*1e-9; i++ {
		v := i * minor
		t := plot.Tick{Value: v}
		if k := math.Round(v / step); math.Abs(v/step-k) < 1e-9 {
			t.Value = k * step
			t.Label = number(t.Value)
		}
		ticks = append(ticks, t)
	}
	return ticks
}

// logTicks marks a log axis at each power of ten, labelled, and at 2 to 9
// times it, unlabelled.
func logTicks(min, max float64) []plot.Tick {
	if !(min > 0 && max > min) {
		return nil
	}
	var ticks []plot.Tick
	for e := math.Floor(math.Log10(min)); e <= math.Ceil(math.Log10(max)); e++ {
		dec := math.Pow(10, e)
		for m := 1.0; m < 10; m++ {
			v := m * dec
			if v < min*(1-1e-12) || v > max*(1+1e-12) {
				continue
			}
			t := plot.Tick{Value: v}
			if m == 1 {
				t.Label = number(v)
			}
			ticks = append(ticks, t)
		}
	}
	return ticks
}

// number writes a tick or line value plainly ("0.001", "100000") where
// that is short, and in exponent form beyond.
func number(v float64) string {
	if a := math.Abs(v); v != 0 && (a < 1e-4 || a >= 1e7) {
		return strconv.FormatFloat(v, 'g', 4, 64)
	}
	return strconv.FormatFloat(v, 'f', -1, 64)
}
