package diagram

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Limits of one picture: past these it stops being legible.
const (
	MaxPoints = 100 // user's points
	MaxLines  = 16  // isobars, isotherms or lines of quality, each
)

// Default background lines, chosen to span the diagrams' ranges with one
// line per decade of pressure and one per 100 K.
var (
	defaultIsobars   = []float64{0.001, 0.01, 0.1, 1, 10, 100}
	defaultIsotherms = []float64{373.15, 473.15, 573.15, 673.15, 773.15, 873.15, 973.15}
	defaultQualities = []float64{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9}
)

// Options are what a diagram is asked to show besides the user's points.
type Options struct {
	Point point.Options // unit set and atmospheric pressure of the axes and of the points

	// Background lines in base units (MPa, K, fraction). nil: the
	// defaults; an empty, non-nil slice: none.
	Isobars, Isotherms, Qualities []float64
	Regions                       bool // draw the boundaries between IF97 regions

	// Ranges of the axes in base units; a zero range ([0, 0]) is the
	// kind's default, widened to hold the user's points.
	XRange, YRange [2]float64
}

// Spec is a user's point as given: two inputs with units, an optional label
// and the label of the point it is reached from, which draws a process
// line from there to here.
type Spec struct {
	Given []point.Given
	Label string
	From  string
}

// ParseSpec reads a point written as name=value items separated by commas
// ("p=10bar,t=400C,label=1" or "p=1bar,s=6.6,label=2s,from=1"): two
// inputs, and optionally label= and from=.
func ParseSpec(text string) (Spec, error) {
	var sp Spec
	for item := range strings.SplitSeq(text, ",") {
		item = strings.TrimSpace(item)
		if item == "" {
			continue
		}
		name, value, ok := strings.Cut(item, "=")
		if !ok {
			return sp, &Error{Param: "pt", Kind: ErrBadPoint,
				Msg: fmt.Sprintf("%q is not name=value; write a point as p=10bar,t=400C,label=1", clip(item))}
		}
		name = strings.TrimSpace(name)
		switch strings.ToLower(name) {
		case "label":
			sp.Label = strings.TrimSpace(value)
		case "from":
			sp.From = strings.TrimSpace(value)
		default:
			sp.Given = append(sp.Given, point.Given{Name: name, Text: strings.TrimSpace(value)})
		}
	}
	return sp, nil
}

func clip(s string) string {
	if len(s) > 40 {
		return s[:40] + "…"
	}
	return s
}

// Mark is a user's point solved.
type Mark struct {
	Label, From string
	State       fn.State
}

// Range is the span of one axis in base units.
type Range struct{ Min, Max float64 }

// Diagram is one diagram computed: its kind, its axes' ranges, its lines
// and the user's points, all in base units.
type Diagram struct {
	Kind   Kind
	Opt    point.Options
	X, Y   Range
	Lines  []Line
	Points []Mark
}

// Build computes the diagram of kind k with the user's points.
func Build(k Kind, specs []Spec, opt Options) (*Diagram, error) {
	if len(specs) > MaxPoints {
		return nil, &Error{Param: "pt", Kind: ErrTooMany,
			Msg: fmt.Sprintf("%d points; one diagram shows at most %d", len(specs), MaxPoints)}
	}
	d := &Diagram{Kind: k, Opt: opt.Point}
	labels := map[string]bool{}
	for i, sp := range specs {
		st, _, err := point.Solve(sp.Given, opt.Point)
		if err != nil {
			return nil, fmt.Errorf("point %d%s: %w", i+1, labelNote(sp.Label), err)
		}
		if sp.From != "" && !labels[sp.From] {
			return nil, &Error{Param: "pt", Kind: ErrBadPoint,
				Msg: fmt.Sprintf("point %d%s comes from %q, which is not the label of a point given before it", i+1, labelNote(sp.Label), sp.From)}
		}
		if sp.Label != "" {
			labels[sp.Label] = true
		}
		d.Points = append(d.Points, Mark{Label: sp.Label, From: sp.From, State: st})
	}
	for _, fam := range []struct {
		name   string
		given  []float64
		def    []float64
		line   func(float64) Line
		needed bool
	}{
		{"isobars", opt.Isobars, defaultIsobars, IsobarLine, true},
		{"isotherms", opt.Isotherms, defaultIsotherms, IsothermLine, true},
		{"qualities", opt.Qualities, defaultQualities, QualityLine, k.Quality},
	} {
		vals := fam.given
		if vals == nil {
			vals = fam.def
		}
		if len(vals) > MaxLines {
			return nil, &Error{Param: fam.name, Kind: ErrTooMany,
				Msg: fmt.Sprintf("%d %s; one diagram shows at most %d", len(vals), fam.name, MaxLines)}
		}
		if !fam.needed {
			continue
		}
		for _, v := range vals {
			d.Lines = append(d.Lines, fam.line(v))
		}
	}
	if opt.Regions {
		d.Lines = append(d.Lines, Boundaries()...)
	}
	liq, vap := Dome()
	d.Lines = append(d.Lines, liq, vap)
	var err error
	if d.X, err = d.axisRange(k.X, opt.XRange, "x"); err != nil {
		return nil, err
	}
	if d.Y, err = d.axisRange(k.Y, opt.YRange, "y"); err != nil {
		return nil, err
	}
	return d, nil
}

func labelNote(label string) string {
	if label == "" {
		return ""
	}
	return " (" + label + ")"
}

// axisRange returns the range of axis a: the one asked for, or the
// default widened to hold every point with a margin.
func (d *Diagram) axisRange(a Axis, asked [2]float64, param string) (Range, error) {
	if asked != [2]float64{} {
		r := Range{asked[0], asked[1]}
		switch {
		case !(r.Max > r.Min):
			return r, &Error{Param: param, Kind: ErrBadRange, Msg: fmt.Sprintf("the %s axis range is empty or reversed: give the lower end first", param)}
		case a.Log && d.display(a, r.Min) <= 0:
			return r, &Error{Param: param, Kind: ErrBadRange, Msg: fmt.Sprintf("the %s axis is logarithmic: its range must be above zero in the axis unit", param)}
		}
		return r, nil
	}
	r := Range{a.Min, a.Max}
	for i := range d.Points {
		v := a.of(ptrSample(&d.Points[i].State))
		if a.Log {
			r.Min, r.Max = math.Min(r.Min, v/1.5), math.Max(r.Max, v*1.5)
		} else {
			pad := 0.03 * (a.Max - a.Min)
			r.Min, r.Max = math.Min(r.Min, v-pad), math.Max(r.Max, v+pad)
		}
	}
	if a.Log && d.display(a, r.Min) <= 0 {
		return r, &Error{Param: param, Kind: ErrBadRange,
			Msg: fmt.Sprintf("the %s axis (%s) is logarithmic and needs an absolute unit; %s is a gauge unit", param, a.Name, d.unit(a).Name)}
	}
	return r, nil
}

func ptrSample(st *fn.State) *Sample { s := sampleOf(st); return &s }

// unit returns the unit of axis a in the diagram's unit set.
func (d *Diagram) unit(a Axis) units.Unit { return d.Opt.Set.Unit(a.Dim) }

// display converts v (base units) to the unit of axis a.
func (d *Diagram) display(a Axis, v float64) float64 { return d.unit(a).FromBase(v, d.Opt.Patm) }

// XY returns the coordinates of sample s on the diagram, in the axes'
// units.
func (d *Diagram) XY(s *Sample) (x, y float64) {
	return d.display(d.Kind.X, d.Kind.X.of(s)), d.display(d.Kind.Y, d.Kind.Y.of(s))
}

// MarkXY returns the coordinates of a user's point.
func (d *Diagram) MarkXY(m *Mark) (x, y float64) { return d.XY(ptrSample(&m.State)) }

// Bounds returns the axes' ranges in their units.
func (d *Diagram) Bounds() (x, y Range) {
	return Range{d.display(d.Kind.X, d.X.Min), d.display(d.Kind.X, d.X.Max)},
		Range{d.display(d.Kind.Y, d.Y.Min), d.display(d.Kind.Y, d.Y.Max)}
}

// AxisLabel returns the label of axis a with its unit: "specific entropy s
// in kJ/(kg·K)".
func (d *Diagram) AxisLabel(a Axis) string {
	l := a.Name + " " + a.Symbol
	if u := d.unit(a).Name; u != "" {
		l += " in " + u
	}
	if a.Log {
		l += " (log scale)"
	}
	return l
}

// LineLabel names a line in the diagram's units: "10 bar", "300 °C",
// "x = 0.5".
func (d *Diagram) LineLabel(l *Line) string {
	switch l.Family {
	case Isobar:
		return d.quantityText(units.Pressure, l.Value)
	case Isotherm:
		return d.quantityText(units.Temperature, l.Value)
	case Quality:
		return "x = " + strconv.FormatFloat(l.Value, 'g', 3, 64)
	}
	return l.Label
}

func (d *Diagram) quantityText(dim units.Dim, v float64) string {
	u := d.Opt.Set.Unit(dim)
	v = u.FromBase(v, d.Opt.Patm)
	if a := math.Abs(v); a >= 1e-4 && a < 1e7 {
		// Four significant figures written plainly: 100000 kPa, not 1e+05.
		v, _ = strconv.ParseFloat(strconv.FormatFloat(v, 'g', 4, 64), 64)
	}
	return number(v) + " " + u.Name
}

// ReadValues reads a list of values of quantity dim written with units
// ("1bar, 10bar, 100bar"; bare numbers in the set's unit) into base units;
// "none" is an empty list.
func ReadValues(text, param string, dim units.Dim, opt point.Options) ([]float64, error) {
	out := []float64{}
	if strings.EqualFold(strings.TrimSpace(text), "none") {
		return out, nil
	}
	for item := range strings.SplitSeq(text, ",") {
		if item = strings.TrimSpace(item); item == "" {
			continue
		}
		v, err := units.Parse(item, dim, units.Options{Name: param, Set: opt.Set, Patm: opt.Patm})
		if err != nil {
			return nil, err
		}
		out = append(out, v)
		if len(out) > MaxLines {
			return nil, &Error{Param: param, Kind: ErrTooMany, Msg: fmt.Sprintf("more than %d values in %s; one diagram shows at most %d lines of each kind", MaxLines, param, MaxLines)}
		}
	}
	return out, nil
}

// ReadQualities reads a list of qualities (fractions strictly between 0
// and 1, or "none").
func ReadQualities(text string) ([]float64, error) {
	out := []float64{}
	if strings.EqualFold(strings.TrimSpace(text), "none") {
		return out, nil
	}
	for item := range strings.SplitSeq(text, ",") {
		if item = strings.TrimSpace(item); item == "" {
			continue
		}
		v, err := units.Parse(item, units.Quality, units.Options{Name: "x"})
		if err != nil {
			return nil, err
		}
		if v <= 0 || v >= 1 {
			return nil, &Error{Param: "x", Kind: ErrBadRange, Msg: fmt.Sprintf("quality %s: a line of constant quality lies strictly between 0 and 1 (0 and 1 are the dome itself)", clip(item))}
		}
		out = append(out, v)
		if len(out) > MaxLines {
			return nil, &Error{Param: "x", Kind: ErrTooMany, Msg: fmt.Sprintf("more than %d qualities; one diagram shows at most %d", MaxLines, MaxLines)}
		}
	}
	return out, nil
}

// ReadRange reads the range of axis a from its two ends as given (with
// units, or bare numbers in the set's unit of the axis) into base units.
// Both empty is the default range.
func ReadRange(lo, hi string, a Axis, param string, opt point.Options) ([2]float64, error) {
	if lo == "" && hi == "" {
		return [2]float64{}, nil
	}
	if lo == "" || hi == "" {
		return [2]float64{}, &Error{Param: param, Kind: ErrBadRange,
			Msg: fmt.Sprintf("give both ends of the %s axis (%smin and %smax), or neither", param, param, param)}
	}
	var r [2]float64
	for i, text := range []string{lo, hi} {
		v, err := units.Parse(text, a.Dim, units.Options{Name: param + [2]string{"min", "max"}[i], Set: opt.Set, Patm: opt.Patm})
		if err != nil {
			return r, err
		}
		r[i] = v
	}
	return r, nil
}

// DomeXY returns the saturation dome of kind k in the units of opt as one
// line of (x, y) pairs: the saturated liquid from 273.15 K up to the
// critical point and the saturated vapour back down. It is the data a
// chart drawn by another program (a spreadsheet's own chart) needs.
func DomeXY(k Kind, opt point.Options) [][2]float64 {
	d := &Diagram{Kind: k, Opt: opt}
	liq, vap := Dome()
	out := make([][2]float64, 0, len(liq.Samples)+len(vap.Samples))
	for _, l := range []Line{liq, vap} {
		for _, xy := range d.lineXYs(&l) {
			out = append(out, [2]float64{xy.X, xy.Y})
		}
	}
	return out
}
