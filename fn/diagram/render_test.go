package diagram_test

import (
	"bytes"
	"encoding/json"
	"errors"
	"image/png"
	"math"
	"strings"
	"testing"

	"steamcell/fn/diagram"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

func specs(t *testing.T, texts ...string) []diagram.Spec {
	t.Helper()
	var out []diagram.Spec
	for _, s := range texts {
		sp, err := diagram.ParseSpec(s)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, sp)
	}
	return out
}

// at returns the position in pixels of (x, y) in a picture of w × h
// pixels, from the frame and the axes' ranges.
func at(fr diagram.Frame, xr, yr diagram.Range, logX, logY bool, x, y float64, w, h int) (int, int) {
	frac := func(v float64, r diagram.Range, log bool) float64 {
		if log {
			return (math.Log10(v) - math.Log10(r.Min)) / (math.Log10(r.Max) - math.Log10(r.Min))
		}
		return (v - r.Min) / (r.Max - r.Min)
	}
	px := (fr.Left + (fr.Right-fr.Left)*frac(x, xr, logX)) * float64(w)
	py := (fr.Bottom - (fr.Bottom-fr.Top)*frac(y, yr, logY)) * float64(h)
	return int(px), int(py)
}

// TestPointWhereItsValuesPutIt renders each kind as PNG and finds the
// colour of the user's points at the pixel their values map to, and not
// at a pixel of the frame where there is no point.
func TestPointWhereItsValuesPutIt(t *testing.T) {
	for _, k := range diagram.Kinds() {
		d, err := diagram.Build(k, specs(t, "p=10bar,t=400C,label=1"), diagram.Options{})
		if err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := d.Render(&buf, diagram.PNG); err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(&buf)
		if err != nil {
			t.Fatal(err)
		}
		fr, err := d.Frame()
		if err != nil {
			t.Fatal(err)
		}
		if !(0 < fr.Left && fr.Left < fr.Right && fr.Right <= 1 && 0 < fr.Top && fr.Top < fr.Bottom && fr.Bottom < 1) {
			t.Fatalf("%s: frame %+v", k.Name, fr)
		}
		xr, yr := d.Bounds()
		x, y := d.MarkXY(&d.Points[0])
		b := img.Bounds()
		px, py := at(fr, xr, yr, k.X.Log, k.Y.Log, x, y, b.Dx(), b.Dy())
		if got := img.At(px, py); !sameColour(got, diagram.MarkColour) {
			t.Errorf("%s: pixel (%d, %d) for the point (%g, %g) is %v, want the point's colour", k.Name, px, py, x, y, got)
		}
		// The frame's top-left corner holds no point.
		cx, cy := at(fr, xr, yr, k.X.Log, k.Y.Log, xr.Min, yr.Max, b.Dx(), b.Dy())
		if sameColour(img.At(cx+3, cy+3), diagram.MarkColour) {
			t.Errorf("%s: the corner of the frame has the point's colour", k.Name)
		}
	}
}

func sameColour(c interface{ RGBA() (r, g, b, a uint32) }, want interface{ RGBA() (r, g, b, a uint32) }) bool {
	r1, g1, b1, _ := c.RGBA()
	r2, g2, b2, _ := want.RGBA()
	return r1>>8 == r2>>8 && g1>>8 == g2>>8 && b1>>8 == b2>>8
}

// TestRenderSVGAndJSON checks that the SVG draws the axes' labels with
// their units and the JSON form carries the lines and the point.
func TestRenderSVGAndJSON(t *testing.T) {
	k, err := diagram.KindByName("HS")
	if err != nil {
		t.Fatal(err)
	}
	set, _ := units.SetByName("us")
	d, err := diagram.Build(k, specs(t, "p=150psia,t=600F,label=1", "p=5psia,x=0.9,label=2,from=1"),
		diagram.Options{Point: point.Options{Set: set}, Regions: true})
	if err != nil {
		t.Fatal(err)
	}
	var svg bytes.Buffer
	if err := d.Render(&svg, diagram.SVG); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"<svg", "Btu/(lb·°R)", "Btu/lb", "critical point", "regions 2 and 3"} {
		if !strings.Contains(svg.String(), want) {
			t.Errorf("SVG lacks %q", want)
		}
	}
	b, err := d.MarshalJSONWith("caution")
	if err != nil {
		t.Fatal(err)
	}
	var got struct {
		X      struct{ Unit string }
		Lines  []struct{ Family string }
		Points []struct {
			Label, From string
			X, Y        float64
			Values      map[string]float64
		}
	}
	if err := json.Unmarshal(b, &got); err != nil {
		t.Fatal(err)
	}
	if got.X.Unit != "Btu/(lb·°R)" || len(got.Points) != 2 || got.Points[1].From != "1" {
		t.Fatalf("JSON: %s", b)
	}
	// 150 psia, 600 °F is given back in the unit set's units (us).
	if p := got.Points[0].Values["p"]; math.Abs(p-150) > 1e-9 {
		t.Errorf("point 1 p = %g psia, want 150", p)
	}
	families := map[string]bool{}
	for _, l := range got.Lines {
		families[l.Family] = true
	}
	for _, f := range []diagram.Family{diagram.Liquid, diagram.Vapour, diagram.Isobar, diagram.Isotherm, diagram.Quality, diagram.Boundary} {
		if !families[string(f)] {
			t.Errorf("JSON has no %s line", f)
		}
	}
}

// TestBuildErrors checks each kind of bad request.
func TestBuildErrors(t *testing.T) {
	k, _ := diagram.KindByName("ph")
	if _, err := diagram.KindByName("xy"); !errors.Is(err, diagram.ErrUnknownKind) {
		t.Errorf("kind xy: %v", err)
	}
	if _, err := diagram.Build(k, specs(t, "p=1bar,t=200C,from=9"), diagram.Options{}); !errors.Is(err, diagram.ErrBadPoint) {
		t.Errorf("from an unknown label: %v", err)
	}
	if _, err := diagram.ParseSpec("p 1bar"); !errors.Is(err, diagram.ErrBadPoint) {
		t.Errorf("no name=value: %v", err)
	}
	if _, err := diagram.Build(k, specs(t, "p=1bar"), diagram.Options{}); !errors.Is(err, point.ErrInputCount) {
		t.Errorf("one input: %v", err)
	}
	many := make([]diagram.Spec, diagram.MaxPoints+1)
	if _, err := diagram.Build(k, many, diagram.Options{}); !errors.Is(err, diagram.ErrTooMany) {
		t.Errorf("too many points: %v", err)
	}
	set, _ := units.SetByName("si")
	set, _ = set.Override(units.Pressure, "barg")
	if _, err := diagram.Build(k, nil, diagram.Options{Point: point.Options{Set: set}}); !errors.Is(err, diagram.ErrBadRange) {
		t.Errorf("log axis in barg: %v", err)
	}
	if _, err := diagram.Build(k, nil, diagram.Options{XRange: [2]float64{3000, 1000}}); !errors.Is(err, diagram.ErrBadRange) {
		t.Errorf("reversed range: %v", err)
	}
	if _, err := diagram.ReadQualities("0.5, 1"); !errors.Is(err, diagram.ErrBadRange) {
		t.Errorf("quality 1: %v", err)
	}
}

// TestDomeXY checks the dome handed to other charts: it rises from the
// triple point to the critical point and falls back, in the set's units;
// on T–s in si the top is 373.946 °C, R7-97(2012) Eq. 3.
func TestDomeXY(t *testing.T) {
	k, _ := diagram.KindByName("ts")
	xy := diagram.DomeXY(k, point.Options{})
	top := 0.0
	for _, p := range xy {
		top = math.Max(top, p[1])
	}
	if math.Abs(top-373.946) > 1e-9 || math.Abs(xy[0][1]) > 1e-9 || math.Abs(xy[len(xy)-1][1]) > 1e-9 {
		t.Errorf("dome from %g °C up to %g °C down to %g °C, want 0, 373.946, 0", xy[0][1], top, xy[len(xy)-1][1])
	}
}
