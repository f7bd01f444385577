package diagram

import (
	"encoding/json"
	"math"
)

// jsonAxis, jsonLine, jsonPoint and jsonDiagram are the JSON form of a
// diagram: the same lines the pictures draw, in the axes' units, with the
// frame that places them on the picture.
type jsonAxis struct {
	Symbol string  `json:"symbol"`
	Label  string  `json:"label"`
	Unit   string  `json:"unit"`
	Log    bool    `json:"log"`
	Min    float64 `json:"min"`
	Max    float64 `json:"max"`
}

type jsonLine struct {
	Family string       `json:"family"`
	Label  string       `json:"label"`
	Points [][2]float64 `json:"points"`
}

type jsonPoint struct {
	Label  string             `json:"label,omitempty"`
	From   string             `json:"from,omitempty"`
	X      float64            `json:"x"`
	Y      float64            `json:"y"`
	Phase  string             `json:"phase"`
	Values map[string]float64 `json:"values"`
}

type jsonDiagram struct {
	Kind     string      `json:"kind"`
	Title    string      `json:"title"`
	UnitSet  string      `json:"unit_set"`
	X        jsonAxis    `json:"x"`
	Y        jsonAxis    `json:"y"`
	Frame    Frame       `json:"frame"`
	Critical [2]float64  `json:"critical"`
	Lines    []jsonLine  `json:"lines"`
	Points   []jsonPoint `json:"points"`
	Caution  string      `json:"caution,omitempty"`
}

// MarshalJSONWith writes the diagram as JSON: its axes (label, unit, log
// scale, range), the frame of the data area in the picture (fractions),
// every line as [x, y] pairs and the user's points with their p, t, h, s,
// v, in the axes' units; caution is added when not empty.
func (d *Diagram) MarshalJSONWith(caution string) ([]byte, error) {
	fr, err := d.Frame()
	if err != nil {
		return nil, err
	}
	xr, yr := d.Bounds()
	out := jsonDiagram{
		Kind: d.Kind.Name, Title: d.Kind.Title, UnitSet: d.Opt.Set.Name(),
		X:       jsonAxis{d.Kind.X.Symbol, d.AxisLabel(d.Kind.X), d.unit(d.Kind.X).Name, d.Kind.X.Log, xr.Min, xr.Max},
		Y:       jsonAxis{d.Kind.Y.Symbol, d.AxisLabel(d.Kind.Y), d.unit(d.Kind.Y).Name, d.Kind.Y.Log, yr.Min, yr.Max},
		Frame:   fr,
		Lines:   []jsonLine{},
		Points:  []jsonPoint{},
		Caution: caution,
	}
	cx, cy := d.XY(ptr(Critical()))
	out.Critical = [2]float64{cx, cy}
	for i := range d.Lines {
		l := &d.Lines[i]
		jl := jsonLine{Family: string(l.Family), Label: d.LineLabel(l), Points: [][2]float64{}}
		for _, xy := range d.lineXYs(l) {
			jl.Points = append(jl.Points, [2]float64{xy.X, xy.Y})
		}
		out.Lines = append(out.Lines, jl)
	}
	for i := range d.Points {
		m := &d.Points[i]
		x, y := d.MarkXY(m)
		s := ptrSample(&m.State)
		vals := map[string]float64{}
		for _, c := range []Coordinate{pressure, temperature, enthalpy, entropy, volume} {
			if v := d.Opt.Set.Unit(c.Dim).FromBase(c.of(s), d.Opt.Patm); !math.IsNaN(v) {
				vals[c.Symbol] = v
			}
		}
		if m.State.HasX {
			vals["x"] = m.State.X
		}
		out.Points = append(out.Points, jsonPoint{Label: m.Label, From: m.From, X: x, Y: y, Phase: m.State.Phase.String(), Values: vals})
	}
	return json.Marshal(out)
}
