package units_test

import (
	"errors"
	"math"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/units"
)

// FuzzParse reads arbitrary text as every quantity, with and without a
// unit set, a separate unit and a site atmosphere. It must never panic;
// a success must be finite and physical (absolute pressure and
// temperature above zero, quality within 0..1) and must read back the same
// when written in its unit; a failure must be an *InputError of a known
// kind. The seed corpus is the list of typed values plus the
// refused forms.
func FuzzParse(f *testing.F) {
	for _, s := range []string{
		"600kPa", "6 bar", "6 barg", "87 psig", "0.6 MPa", "330C", "330 °C", "626 °F", "603.15 K",
		"1100 R", "2800 kJ/kg", "1204 Btu/lb", "0.25 m3/kg", "4 ft³/lb", "85 %", "0.85",
		"KPA", "600 kpa", "6 Bar", "0.6 mPa", "0.6 mpa", "300 k", "330 deg C", "330 degC", "1 µPa·s", "1 μPa·s",
		"6 bar(g)", "6 bar g", "500 kPa(g)", "87 psi(a)", "10 kgf/cm²g", "6.5 kJ/kg-K", "1.5 Btu/(lb·°F)",
		"", " ", "NaN", "Inf", "-Inf", "1e999", "-1e999", "1e-999", "1,013.25", "1.013,25", "1013,25",
		"1 013.25", "1.013.250", "+6 bar", "1.2e3", "1.2E+3", "−40 °C", "1.2e−3 MPa", "-2 barg", "85",
		"-273.15 °C", "2.1e-4 1/K", "0x10", "1_000", "- 5", "5e", "5e+", ".", "-", "∞", "1e308 1/Pa",
		"\u00a0", "6\u202fbar", "١٢", "\xff\xfe", "6 \xffbar",
	} {
		f.Add(s)
	}
	us, _ := units.SetByName("us")
	optsets := []units.Options{
		{Name: "in"},
		{Name: "in", Set: us},
		{Name: "in", Patm: 0.0899},
		{Name: "in", Unit: "%"},
		{Name: "in", Unit: "barg"},
	}
	kinds := []error{units.ErrEmpty, units.ErrSyntax, units.ErrAmbiguousNumber, units.ErrNotFinite,
		units.ErrUnknownUnit, units.ErrWrongDimension, units.ErrNegativeAbsolute, units.ErrPressureNotPositive, units.ErrQualityRange,
		units.ErrUnitConflict, units.ErrBadPatm}
	f.Fuzz(func(t *testing.T, text string) {
		for _, d := range units.Dims() {
			for _, opt := range optsets {
				b, u, err := units.ParseUnit(text, d, opt)
				if err != nil {
					var ie *units.InputError
					if !errors.As(err, &ie) || ie.Err == nil {
						t.Fatalf("ParseUnit(%q, %s): error %T %v, want *InputError", text, d, err, err)
					}
					known := false
					for _, k := range kinds {
						known = known || errors.Is(err, k)
					}
					if !known {
						t.Fatalf("ParseUnit(%q, %s): error of unknown kind: %v", text, d, err)
					}
					_ = err.Error()
					continue
				}
				if math.IsNaN(b) || math.IsInf(b, 0) {
					t.Fatalf("ParseUnit(%q, %s) = %g without error", text, d, b)
				}
				if u.Dim != d {
					t.Fatalf("ParseUnit(%q, %s) read it in %q of %s", text, d, u.Name, u.Dim)
				}
				switch {
				case (d == units.Pressure || d == units.Temperature) && !(b > 0),
					d == units.Quality && !(b >= 0 && b <= 1):
					t.Fatalf("ParseUnit(%q, %s) = %g, not physical", text, d, b)
				}
				// Write the value in its unit and read it again. Units with
				// an offset lose digits near it (see TestRoundTrip), and a
				// value that close to a limit may then fall past it.
				v := u.FromBase(b, opt.Patm)
				again := strconv.FormatFloat(v, 'g', -1, 64) + " " + u.Name
				reopt := units.Options{Name: opt.Name, Patm: opt.Patm}
				b2, err := units.Parse(again, d, reopt)
				offset := math.Abs(u.ToBase(0, opt.Patm))
				if err != nil {
					if (errors.Is(err, units.ErrNegativeAbsolute) || errors.Is(err, units.ErrPressureNotPositive)) && b <= 1e-12*offset {
						continue
					}
					t.Fatalf("ParseUnit(%q, %s) = %g, written as %q: %v", text, d, b, again, err)
				}
				if !scalar.EqualWithinAbsOrRel(b2, b, 1e-12*offset, 1e-12) {
					t.Fatalf("ParseUnit(%q, %s) = %.17g, written as %q reads %.17g", text, d, b, again, b2)
				}
			}
		}
	})
}
