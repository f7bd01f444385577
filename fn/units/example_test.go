package units_test

import (
	"fmt"

	"steamcell/fn/units"
)

func ExampleParse() {
	p, _ := units.Parse("6 barg", units.Pressure, units.Options{Name: "p"})
	T, _ := units.Parse("626 °F", units.Temperature, units.Options{Name: "T"})
	x, _ := units.Parse("85 %", units.Quality, units.Options{Name: "x"})
	fmt.Printf("p = %.6g MPa, T = %.5g K, x = %g\n", p, T, x)
	// Output: p = 0.701325 MPa, T = 603.15 K, x = 0.85
}

func ExampleParse_errors() {
	for _, in := range []struct {
		name, text string
		dim        units.Dim
	}{
		{"p", "300C", units.Pressure}, // a temperature given for a pressure
		{"p", "1,013.25 kPa", units.Pressure},
		{"x", "85", units.Quality},
		{"p", "0.6 mPa", units.Pressure},
	} {
		_, err := units.Parse(in.text, in.dim, units.Options{Name: in.name})
		fmt.Println(err)
	}
	// Output:
	// p "300C": °C is a unit of temperature; p needs a unit of pressure: MPa, MPag, Pa, kPa, kPag, bar, barg, mbar, mbarg, psia, psig, atm, kgf/cm², kgf/cm²g, mmHg, inHg, torr, ata, mmH2Oa, mmH2Og, inH2Oa, inH2Og, inHg vac, mmHg vac, kPa vac
	// p "1,013.25 kPa": a comma is not read in numbers (thousands separator or decimal comma?): remove thousands separators and write decimals with a point, e.g. 1013.25
	// x "85": quality must be a fraction from 0 to 1, or give % ("85 %")
	// p "0.6 mPa": mPa is the millipascal; for megapascal write MPa; p needs a unit of pressure: MPa, MPag, Pa, kPa, kPag, bar, barg, mbar, mbarg, psia, psig, atm, kgf/cm², kgf/cm²g, mmHg, inHg, torr, ata, mmH2Oa, mmH2Og, inH2Oa, inH2Og, inHg vac, mmHg vac, kPa vac
}

func ExampleOptions() {
	// A column headed "barg" on a site at about 1000 m.
	opt := units.Options{Name: "p", Unit: "barg", Patm: 0.0899}
	p, _ := units.Parse("6", units.Pressure, opt)
	fmt.Printf("%.4f MPa\n", p)
	// Output: 0.6899 MPa
}

func ExampleUnit_FromBase() {
	psig, _ := units.Lookup("psi(g)", units.Pressure)
	degF, _ := units.Lookup("degF", units.Temperature)
	fmt.Printf("%.2f %s\n", psig.FromBase(0.701325, 0), psig.Name)
	fmt.Printf("%.2f %s\n", degF.FromBase(603.15, 0), degF.Name)
	// Output:
	// 87.02 psig
	// 626.00 °F
}

func ExampleSetByName() {
	us, _ := units.SetByName("us")
	us, _ = us.Override(units.Pressure, "psig")
	h := 2800.0 // kJ/kg
	p := 0.701325
	for _, v := range []struct {
		d units.Dim
		b float64
	}{{units.Pressure, p}, {units.SpecificEnergy, h}} {
		u := us.Unit(v.d)
		fmt.Printf("%.1f %s\n", u.FromBase(v.b, 0), u.Name)
	}
	// Output:
	// 87.0 psig
	// 1203.8 Btu/lb
}
