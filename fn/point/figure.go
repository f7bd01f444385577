package point

import (
	"math"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/units"
)

// withTyped returns o with the units the inputs were typed in, so that
// figures of those quantities are written in them: Tsat in °C when T came
// in °C, p in bar when p came in bar.
func (o Options) withTyped(in [2]fn.Input, us [2]units.Unit) Options {
	for i := range in {
		if us[i].Dim != 0 {
			o.typed[i] = us[i]
		}
	}
	return o
}

// values copies the units read refers to, for withTyped: a zero Unit
// where there is none.
func values(us [2]*units.Unit) (v [2]units.Unit) {
	for i, u := range us {
		if u != nil {
			v[i] = *u
		}
	}
	return v
}

// unitFor returns the unit figures of quantity q are written in: the unit
// an input of q was typed in, else the unit set's.
func (o Options) unitFor(q fn.Quantity) units.Unit {
	d := DimOf(q)
	for _, u := range o.typed {
		if u.Dim == d && u.Dim != 0 {
			return u
		}
	}
	return o.Set.Unit(d)
}

// figureText writes a value of quantity q, given in base units, in the
// point's units with its unit: "179.88 °C", "9.5 bar", "0.5" for a
// quality. A difference (diff) is written without the unit's offset: a
// temperature difference in K, or in °F where temperatures are °F or °R
// (1 K = 1.8 °F of difference, NIST SP 811 (2008) B.8), a pressure
// difference in the absolute unit of a gauge scale (bar for barg).
func (o Options) figureText(q fn.Quantity, v float64, diff bool) string {
	u := o.unitFor(q)
	label := u.Name
	switch {
	case diff && q == fn.Temperature:
		var f float64
		f, label = diffScale(u)
		v *= f
	case diff:
		// The offset and a gauge unit's atmosphere cancel in the difference.
		v = u.FromBase(v, o.Patm) - u.FromBase(0, o.Patm)
		if u.Gauge {
			label = absoluteOf(u)
		}
	default:
		v = u.FromBase(v, o.Patm)
	}
	s := formatFigure(v)
	if label == "" {
		return s
	}
	return s + " " + label
}

// note writes a note of the engine (text with placeholders {0}, {1}, …
// for its figures), each figure written by figureText: in the units the
// inputs were typed in, else in the unit set's.
func (o Options) note(n fn.Note) string {
	if len(n.Figures) == 0 {
		return n.Text
	}
	return n.Render(func(f fn.Figure) string { return o.figureText(f.Q, f.V, f.Diff) })
}

// formatFigure writes v to six significant digits, without trailing zeros
// ("179.88", "22064", "0.611657"); very small and very large values in
// exponent form.
func formatFigure(v float64) string {
	a := math.Abs(v)
	switch {
	case a == 0:
		return "0"
	case a < 1e-4 || a >= 1e9:
		return strconv.FormatFloat(v, 'g', 6, 64)
	}
	d := max(0, 5-int(math.Floor(math.Log10(a))))
	s := strconv.FormatFloat(v, 'f', d, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	if s == "-0" {
		s = "0"
	}
	return s
}
