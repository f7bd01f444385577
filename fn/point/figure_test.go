package point

import (
	"testing"

	"steamcell/fn"
	"steamcell/fn/units"
)

func unit(t *testing.T, name string, d units.Dim) units.Unit {
	t.Helper()
	u, err := units.Lookup(name, d)
	if err != nil {
		t.Fatal(err)
	}
	return u
}

// Figures of messages in the user's units. Saturation temperature at 1 MPa
// 453.035632 K from IAPWS R7-97(2012) table 35; unit factors by NIST SP
// 811 (2008) B.8 (1 bar = 0.1 MPa, standard atmosphere 0.101325 MPa,
// T/K = t/°C + 273.15, 1 K = 1.8 °F of difference); 1 lb/ft³ =
// 16.01846 kg/m³ (B.8), so 950 kg/m³ is 59.3066 lb/ft³.
func TestFigureText(t *testing.T) {
	si := Options{}
	bar, _ := units.SetByName("bar")
	us, _ := units.SetByName("us")
	typedBargC := si.withTyped([2]fn.Input{{Q: fn.Pressure}, {Q: fn.Temperature}},
		[2]units.Unit{unit(t, "barg", units.Pressure), unit(t, "°C", units.Temperature)})
	typedK := Options{Set: bar}.withTyped([2]fn.Input{{Q: fn.Pressure}, {Q: fn.Temperature}},
		[2]units.Unit{unit(t, "bar", units.Pressure), unit(t, "K", units.Temperature)})
	typedPercent := si.withTyped([2]fn.Input{{Q: fn.Pressure}, {Q: fn.Quality}},
		[2]units.Unit{unit(t, "MPa", units.Pressure), unit(t, "%", units.Quality)})
	typedR := Options{Set: us}.withTyped([2]fn.Input{{Q: fn.Pressure}, {Q: fn.Temperature}},
		[2]units.Unit{unit(t, "psia", units.Pressure), unit(t, "R", units.Temperature)})
	for _, tc := range []struct {
		o    Options
		q    fn.Quantity
		v    float64
		diff bool
		want string
	}{
		{si, fn.Temperature, 453.035632, false, "179.886 °C"},
		{si, fn.Pressure, 0.701325, false, "701.325 kPa"},
		{Options{Set: bar}, fn.Pressure, 1, false, "10 bar"},
		{typedBargC, fn.Pressure, 0.701325, false, "6 barg"},
		{typedBargC, fn.Temperature, 453.035632, false, "179.886 °C"},
		{typedK, fn.Temperature, 453.035632, false, "453.036 K"},
		{typedK, fn.Pressure, 1, false, "10 bar"},
		{si, fn.Temperature, 0.5, true, "0.5 K"},
		{Options{Set: us}, fn.Temperature, 0.5, true, "0.9 °F"},
		{typedR, fn.Temperature, 0.5, true, "0.9 °F"},
		{typedR, fn.Temperature, 453.035632, false, "815.464 °R"},
		{typedBargC, fn.Pressure, 0.1, true, "1 bar"},
		{si, fn.Quality, 0.5, false, "0.5"},
		{typedPercent, fn.Quality, 0.5, false, "50 %"},
		{si, fn.Density, 950, false, "950 kg/m³"},
		{Options{Set: us}, fn.Density, 950, false, "59.3066 lb/ft³"},
		{si, fn.Enthalpy, 3880.15, false, "3880.15 kJ/kg"},
	} {
		if got := tc.o.figureText(tc.q, tc.v, tc.diff); got != tc.want {
			t.Errorf("figureText(%s, %g, diff %v) in %s = %q, want %q", tc.q, tc.v, tc.diff, tc.o.Set.Name(), got, tc.want)
		}
	}
}

func TestRenderNote(t *testing.T) {
	o := Options{}.withTyped([2]fn.Input{{Q: fn.Pressure}, {Q: fn.Temperature}},
		[2]units.Unit{unit(t, "bar", units.Pressure), unit(t, "°C", units.Temperature)})
	figs := []fn.Figure{{Q: fn.Temperature, V: 0.3, Diff: true}, {Q: fn.Temperature, V: 453.035632}, {Q: fn.Pressure, V: 1}}
	for text, want := range map[string]string{
		"within {0} of saturation (Ts = {1} at {2})": "within 0.3 K of saturation (Ts = 179.886 °C at 10 bar)",
		"no figures":     "no figures",
		"{3} and {x} {":  "{3} and {x} {",
		"{1}{1}":         "179.886 °C179.886 °C",
		"ends with {0}":  "ends with 0.3 K",
		"{0} starts it}": "0.3 K starts it}",
	} {
		if got := o.note(fn.Note{Text: text, Figures: figs}); got != want {
			t.Errorf("renderNote(%q) = %q, want %q", text, got, want)
		}
	}
}

func TestFormatFigure(t *testing.T) {
	for v, want := range map[float64]string{
		0: "0", 22064: "22064", 0.611657: "0.611657", 123456.7: "123457", 1234567.8: "1234568",
		-0.00001: "-1e-05", 1e9: "1e+09", 273.15: "273.15", -0.0000004: "-4e-07", 0.1 + 0.2: "0.3", -1e-7 / 1e3: "-1e-10",
	} {
		if got := formatFigure(v); got != want {
			t.Errorf("formatFigure(%g) = %q, want %q", v, got, want)
		}
	}
}
