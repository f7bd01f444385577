package point

import (
	"math"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/units"
)

// figure is a value the engine puts in a message or a warning: a value of
// quantity Q in base units, or a difference of it (Diff: no offset, no
// atmosphere). Its fields are those of fn.Figure, which replaces it when
// the engine's notes arrive (type figure = fn.Figure).
type figure struct {
	Q    fn.Quantity
	V    float64
	Diff bool
}

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

// renderNote writes a note of the engine: text with placeholders {0},
// {1}, … for its figures, each written by figureText. A placeholder
// without its figure is left as it stands.
func (o Options) renderNote(text string, figs []figure) string {
	if !strings.Contains(text, "{") {
		return text
	}
	var b strings.Builder
	for {
		i := strings.IndexByte(text, '{')
		if i < 0 {
			break
		}
		j := strings.IndexByte(text[i:], '}')
		if j < 0 {
			break
		}
		n, err := strconv.Atoi(text[i+1 : i+j])
		b.WriteString(text[:i])
		if err != nil || n < 0 || n >= len(figs) {
			b.WriteString(text[i : i+j+1])
		} else {
			f := figs[n]
			b.WriteString(o.figureText(f.Q, f.V, f.Diff))
		}
		text = text[i+j+1:]
	}
	b.WriteString(text)
	return b.String()
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
