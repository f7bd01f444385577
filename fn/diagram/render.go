package diagram

import (
	"fmt"
	"image/color"
	"io"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/recorder"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Size of every picture, in points (1/72 inch): wide enough for a report
// page, and the PNG's resolution.
const (
	Width  = 640 * vg.Inch / 72
	Height = 440 * vg.Inch / 72
	PNGDPI = 150
)

// Colours of the diagrams, our own: a dark dome that stands out from
// thin coloured background lines, and the user's points in a strong
// colour no background line uses.
var (
	domeColour     = color.RGBA{0x17, 0x32, 0x4d, 0xff}
	isobarColour   = color.RGBA{0x1b, 0x7f, 0x79, 0xff}
	isothermColour = color.RGBA{0xc0, 0x62, 0x2f, 0xff}
	qualityColour  = color.RGBA{0x8a, 0x8f, 0x99, 0xff}
	boundaryColour = color.RGBA{0x7b, 0x4f, 0xa0, 0xff}
	gridColour     = color.RGBA{0xe6, 0xe9, 0xee, 0xff}

	// MarkColour is the fill of the user's points, which the browser test
	// looks for where a point's values put it.
	MarkColour = color.RGBA{0xd4, 0x14, 0x5a, 0xff}
)

// sans is the font variant of every text: Liberation Sans, embedded in
// gonum/plot, so the pictures need no font on the machine.
const sans font.Variant = "Sans"

// Formats of Render.
const (
	SVG = "svg"
	PNG = "png"
)

// Render draws the diagram as format (SVG or PNG) to w.
func (d *Diagram) Render(w io.Writer, format string) error {
	p, err := d.plot()
	if err != nil {
		return err
	}
	var c vg.CanvasWriterTo
	switch format {
	case SVG:
		c = vgsvg.New(Width, Height)
	case PNG:
		c = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(Width, Height), vgimg.UseDPI(PNGDPI), vgimg.UseBackgroundColor(color.White))}
	default:
		return fmt.Errorf("diagram: unknown format %q", format)
	}
	p.Draw(draw.New(c))
	_, err = c.WriteTo(w)
	return err
}

// Frame is where the data area lies in the picture, as fractions of its
// width (Left, Right) and height from the top (Top, Bottom): the same for
// the SVG and the PNG at any size they are shown at.
type Frame struct{ Left, Right, Top, Bottom float64 }

// Frame returns the data area of the rendered picture.
func (d *Diagram) Frame() (Frame, error) {
	p, err := d.plot()
	if err != nil {
		return Frame{}, err
	}
	dc := p.DataCanvas(draw.NewCanvas(&recorder.Canvas{}, Width, Height))
	return Frame{
		Left: float64(dc.Min.X / Width), Right: float64(dc.Max.X / Width),
		Top: 1 - float64(dc.Max.Y/Height), Bottom: 1 - float64(dc.Min.Y/Height),
	}, nil
}

// plot builds the gonum plot of the diagram.
func (d *Diagram) plot() (*plot.Plot, error) {
	p := plot.New()
	p.Title.Text = d.Kind.Title + " diagram of water (IAPWS-IF97)"
	p.Title.TextStyle.Font.Size = 13
	p.X.Label.Text, p.Y.Label.Text = d.AxisLabel(d.Kind.X), d.AxisLabel(d.Kind.Y)
	// No padding: the data area is exactly the axes' ranges, so that
	// Frame maps values to the picture.
	p.X.Padding, p.Y.Padding = 0, 0
	p.Title.TextStyle.Font.Variant = sans
	for i, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.TextStyle.Font.Size, ax.Label.TextStyle.Font.Variant = 11, sans
		ax.Tick.Label.Font.Size, ax.Tick.Label.Font.Variant = 9, sans
		ax.Tick.Marker = plot.TickerFunc(linearTicks)
		if []Axis{d.Kind.X, d.Kind.Y}[i].Log {
			ax.Scale, ax.Tick.Marker = plot.LogScale{}, plot.TickerFunc(logTicks)
			// gonum reserves room for a centred axis label at the linear
			// middle of the range, far off centre on a log scale; a label
			// at the end of the axis keeps the frame where it belongs.
			ax.Label.Position = []float64{draw.PosRight, draw.PosTop}[i]
		}
	}
	grid := plotter.NewGrid()
	grid.Vertical.Color, grid.Horizontal.Color = gridColour, gridColour
	p.Add(grid)

	var labels plotter.XYLabels
	var labelStyles []color.Color
	for i := range d.Lines {
		l := &d.Lines[i]
		xys := d.lineXYs(l)
		if len(xys) < 2 {
			continue
		}
		pl, err := plotter.NewLine(xys)
		if err != nil {
			return nil, err
		}
		pl.LineStyle = lineStyle(l.Family)
		p.Add(lineOnly{pl})
		if at, ok := d.labelAt(l, xys); ok && l.Family != Liquid && l.Family != Vapour {
			labels.XYs = append(labels.XYs, at)
			labels.Labels = append(labels.Labels, d.LineLabel(l))
			labelStyles = append(labelStyles, pl.LineStyle.Color)
		}
	}
	cx, cy := d.XY(ptr(Critical()))
	if d.inside(cx, cy) {
		cp, err := plotter.NewScatter(plotter.XYs{{X: cx, Y: cy}})
		if err != nil {
			return nil, err
		}
		cp.GlyphStyle = draw.GlyphStyle{Color: domeColour, Radius: vg.Points(3.5), Shape: draw.BoxGlyph{}}
		p.Add(cp)
		labels.XYs = append(labels.XYs, plotter.XY{X: cx, Y: cy})
		labels.Labels = append(labels.Labels, "critical point")
		labelStyles = append(labelStyles, domeColour)
	}
	if err := d.addMarks(p, &labels, &labelStyles); err != nil {
		return nil, err
	}
	if len(labels.Labels) > 0 {
		lb, err := plotter.NewLabels(labels)
		if err != nil {
			return nil, err
		}
		for i := range lb.TextStyle {
			lb.TextStyle[i].Color = labelStyles[i]
			lb.TextStyle[i].Font.Size, lb.TextStyle[i].Font.Variant = 8, sans
		}
		lb.Offset = vg.Point{X: vg.Points(4), Y: vg.Points(2)}
		p.Add(insideLabels{lb})
	}
	// After Add, which widens the axes to the data: the picture shows
	// exactly the diagram's ranges.
	xr, yr := d.Bounds()
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = xr.Min, xr.Max, yr.Min, yr.Max
	return p, nil
}

func ptr(s Sample) *Sample { return &s }

// lineOnly is a line that only draws: its vertices claim no room around
// the frame (gonum pads for them, which shifts the frame off the axes'
// ranges on a log axis), and the axes' ranges are set, not read from it.
type lineOnly struct{ l *plotter.Line }

// Plot draws the line.
func (o lineOnly) Plot(c draw.Canvas, p *plot.Plot) { o.l.Plot(c, p) }

// insideLabels are labels placed inside the frame (labelAt keeps them off
// its edges), which therefore claim no room around it: gonum's padding
// for glyphs near the edges would shift the frame off the axes' ranges.
type insideLabels struct{ *plotter.Labels }

// GlyphBoxes returns none; see insideLabels.
func (insideLabels) GlyphBoxes(*plot.Plot) []plot.GlyphBox { return nil }

// addMarks draws the user's process lines, then their points on top with
// their labels.
func (d *Diagram) addMarks(p *plot.Plot, labels *plotter.XYLabels, styles *[]color.Color) error {
	if len(d.Points) == 0 {
		return nil
	}
	byLabel := map[string]int{}
	for i, m := range d.Points {
		if m.From != "" {
			j := byLabel[m.From]
			x0, y0 := d.MarkXY(&d.Points[j])
			x1, y1 := d.MarkXY(&d.Points[i])
			seg, err := plotter.NewLine(plotter.XYs{{X: x0, Y: y0}, {X: x1, Y: y1}})
			if err != nil {
				return err
			}
			seg.LineStyle = draw.LineStyle{Color: MarkColour, Width: vg.Points(1.4)}
			p.Add(seg)
		}
		if m.Label != "" {
			byLabel[m.Label] = i
		}
	}
	var xys plotter.XYs
	for i := range d.Points {
		m := &d.Points[i]
		x, y := d.MarkXY(m)
		if !d.inside(x, y) {
			continue
		}
		xys = append(xys, plotter.XY{X: x, Y: y})
		if m.Label != "" {
			labels.XYs = append(labels.XYs, plotter.XY{X: x, Y: y})
			labels.Labels = append(labels.Labels, m.Label)
			*styles = append(*styles, MarkColour)
		}
	}
	if len(xys) == 0 {
		return nil
	}
	sc, err := plotter.NewScatter(xys)
	if err != nil {
		return err
	}
	sc.GlyphStyle = draw.GlyphStyle{Color: MarkColour, Radius: vg.Points(3.5), Shape: draw.CircleGlyph{}}
	p.Add(sc)
	return nil
}

// lineStyle is the look of each family of line.
func lineStyle(f Family) draw.LineStyle {
	switch f {
	case Liquid, Vapour:
		return draw.LineStyle{Color: domeColour, Width: vg.Points(1.8)}
	case Isobar:
		return draw.LineStyle{Color: isobarColour, Width: vg.Points(0.8)}
	case Isotherm:
		return draw.LineStyle{Color: isothermColour, Width: vg.Points(0.8)}
	case Quality:
		return draw.LineStyle{Color: qualityColour, Width: vg.Points(0.6), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
	case Boundary:
		return draw.LineStyle{Color: boundaryColour, Width: vg.Points(1), Dashes: []vg.Length{vg.Points(1), vg.Points(2)}}
	}
	return draw.LineStyle{Color: MarkColour, Width: vg.Points(1.4)}
}

// lineXYs returns the line's samples in the axes' units, without those a
// logarithmic axis cannot show.
func (d *Diagram) lineXYs(l *Line) plotter.XYs {
	xys := make(plotter.XYs, 0, len(l.Samples))
	for i := range l.Samples {
		x, y := d.XY(&l.Samples[i])
		if d.Kind.X.Log && x <= 0 || d.Kind.Y.Log && y <= 0 || math.IsNaN(x) || math.IsNaN(y) {
			continue
		}
		xys = append(xys, plotter.XY{X: x, Y: y})
	}
	return xys
}

// labelAt returns where a line's label goes: the end of the line that is
// inside the frame and away from the dome (the high-temperature end of an
// isobar, the low-pressure end of an isotherm, the cold end of a line of
// quality).
func (d *Diagram) labelAt(l *Line, xys plotter.XYs) (plotter.XY, bool) {
	fromEnd := l.Family == Isobar || l.Family == Boundary
	for k := range xys {
		i := k
		if fromEnd {
			i = len(xys) - 1 - k
		}
		if d.insideBy(xys[i].X, xys[i].Y, labelInset) {
			return xys[i], true
		}
	}
	return plotter.XY{}, false
}

// labelInset keeps line labels this fraction of the frame inside its
// edges, where they would run into the axes and each other; three times
// as far from the right edge, as a label runs to the right of its point.
const labelInset = 0.04

// inside reports whether (x, y) in the axes' units is within the frame.
func (d *Diagram) inside(x, y float64) bool { return d.insideBy(x, y, 0) }

// insideBy reports whether (x, y) is within the frame shrunk by the
// fraction f of each axis (on a log axis, of its decades).
func (d *Diagram) insideBy(x, y, f float64) bool {
	xr, yr := d.Bounds()
	return within(x, xr, d.Kind.X.Log, f, 3*f) && within(y, yr, d.Kind.Y.Log, f, f)
}

// within reports whether v lies in r less the fractions lo and hi of it
// at its ends.
func within(v float64, r Range, log bool, lo, hi float64) bool {
	if log {
		if v <= 0 {
			return false
		}
		v, r = math.Log10(v), Range{math.Log10(r.Min), math.Log10(r.Max)}
	}
	span := r.Max - r.Min
	return v >= r.Min+lo*span && v <= r.Max-hi*span
}
