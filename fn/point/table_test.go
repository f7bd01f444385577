package point_test

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/point"
	"steamcell/fn/point/tabletest"
	"steamcell/fn/units"
)

// TestReadTableCases reads the shared header table (package tabletest) with
// ReadTable itself; the command's tests run the same table through /batch
// and the workbook.
func TestReadTableCases(t *testing.T) {
	for _, tc := range tabletest.Cases {
		tab, err := point.ReadTable(tc.Header, tc.Units, nil, units.Set{})
		if tc.Want == nil {
			if !errors.Is(err, point.ErrHeader) || !strings.Contains(err.Error(), tc.Refused) {
				t.Errorf("%s: ReadTable(%q) error %v; want an ErrHeader that says %s", tc.Name, tc.Header, err, tc.Refused)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: ReadTable(%q): %v", tc.Name, tc.Header, err)
			continue
		}
		if tab.UnitRow != tc.HasUnitRow() || len(tab.Columns) != len(tc.Want) {
			t.Errorf("%s: %+v; want %d columns, row of units %v", tc.Name, tab, len(tc.Want), tc.HasUnitRow())
			continue
		}
		var given []point.Given
		for i, c := range tab.Columns {
			if c.Q != tc.Want[i].Q || c.From != tc.From[i] {
				t.Errorf("%s: column %d is %s from %d; want %s from %d", tc.Name, i, c.Symbol, c.From, tc.Want[i].Q.Symbol(), tc.From[i])
			}
			given = append(given, c.Given(tc.Row[c.Index]))
		}
		_, in, err := point.Solve(given, point.Options{})
		if err != nil {
			t.Errorf("%s: Solve(%v): %v", tc.Name, given, err)
			continue
		}
		for i := range in {
			if !scalar.EqualWithinRel(in[i].Value, tc.Want[i].Value, 1e-14) {
				t.Errorf("%s: %s read as %.15g, want %.15g", tc.Name, in[i].Q.Symbol(), in[i].Value, tc.Want[i].Value)
			}
		}
	}
}

// The bug of issue 11 as the user met it: 6 under "Pressure [barg] PT-101"
// with 330 °C. 3122.2 kJ/kg is IF97 region 2 at 0.701325 MPa, 603.15 K to
// the 0.1 kJ/kg the issue gives; the misread (6 kPa absolute) gave 3137.1.
func TestBargBeforeTag(t *testing.T) {
	tab, err := point.ReadTable([]string{"Pressure [barg] PT-101", "T [°C]"}, nil, nil, units.Set{})
	if err != nil {
		t.Fatal(err)
	}
	st, _, err := point.Solve([]point.Given{tab.Columns[0].Given("6"), tab.Columns[1].Given("330")}, point.Options{})
	if err != nil || !scalar.EqualWithinAbs(st.H, 3122.2, 0.05) {
		t.Errorf("h = %.2f kJ/kg (%v), want 3122.2", st.H, err)
	}
}

func TestReadHeaderOne(t *testing.T) {
	// Headers as people write them on test sheets; common practice, no
	// source. sym "" means the header is no input; unit is the unit as
	// written, "" for one read in the unit set.
	for _, tc := range []struct {
		text, sym, unit string
	}{
		{"P [barg]", "p", "barg"},
		{"p", "p", ""},
		{"Pressure", "p", ""},
		{"Temperature (°F)", "t", "°F"},
		{"h (kJ/kg)", "h", "kJ/kg"},
		{"Drum pressure [barg]", "p", "barg"},
		{"T_steam (C)", "t", "C"},
		{"Steam T [°C]", "t", "°C"},
		{"  TEMP [K] ", "t", "K"},
		{"Temp. (degF)", "t", "degF"},
		{"P1 [psig]", "p", "psig"},
		{"s [kJ/(kg·K)]", "s", "kJ/(kg·K)"},
		{"s (kJ/(kg K))", "s", "kJ/(kg K)"},
		{"Specific enthalpy [Btu/lb]", "h", "Btu/lb"},
		{"v [m³/kg]", "v", "m³/kg"},
		{"Specific volume (ft3/lb)", "v", "ft3/lb"},
		{"rho [kg/m3]", "rho", "kg/m3"},
		{"ρ", "rho", ""},
		{"Density (lb/ft³)", "rho", "lb/ft³"},
		{"x [-]", "x", "-"},
		{"Quality [%]", "x", "%"},
		{"Dryness fraction", "x", ""},
		{"Dryness fraction [%]", "x", "%"},
		{"u [kJ/kg]", "u", "kJ/kg"},
		{"Internal energy (kJ/kg)", "u", "kJ/kg"},
		{"T (steam) [°C]", "t", "°C"},
		{"Pressure, barg", "p", "barg"},
		{"P barg", "p", "barg"},
		{"Steam T °C", "t", "°C"},
		{"Flow temperature [°C]", "t", "°C"},
		{"Pressure [barg] PT-101", "p", "barg"},
		{"T [K] inlet", "t", "K"},
		{"Drum pressure [bar] avg", "p", "bar"},
		{"[TI-2301] Steam temperature (°C)", "t", "°C"},
		{"Pressure [bar(g)]", "p", "bar(g)"},
		{"Pressure [bar gauge]", "p", "bar gauge"},
		{"p/bar", "p", "bar"},
		{"T/°C", "t", "°C"},
		{"h/kJ/kg", "h", "kJ/kg"},
		{"h/(kJ/kg)", "h", "kJ/kg"},
		{"Pressure/barg", "p", "barg"},
		{"Pressure (abs) [bar]", "p", "bar"},

		// Not inputs.
		{"Point", "", ""},
		{"Time [s]", "", ""},
		{"Time s", "", ""},
		{"Steam flow [t/h]", "", ""},
		{"Test no.", "", ""},
		{"", "", ""},
		{"Pressure drop [kPa]", "", ""},
		{"Temperature rise [K]", "", ""},
		{"ΔT [K]", "", ""},
		{"dp [kPa]", "", ""},
		{"Volume flow [m³/h]", "", ""},
		{"Superheat temperature [K]", "", ""},
		{"Differential pressure [kPa]", "", ""},
		{"Unit 3 steam", "", ""},
		{"Pressure tag", "", ""},
		{"PT-101 [barg]", "", ""},
		{"Steam flow t/h", "", ""},
		{"Flow h", "", ""},
	} {
		tab, err := point.ReadTable([]string{tc.text}, nil, nil, units.Set{})
		switch {
		case err != nil:
			t.Errorf("ReadTable(%q): %v", tc.text, err)
		case tc.sym == "" && len(tab.Columns) != 0:
			t.Errorf("ReadTable(%q) = %+v; want no input", tc.text, tab.Columns)
		case tc.sym != "" && (len(tab.Columns) != 1 || tab.Columns[0].Symbol != tc.sym || tab.Columns[0].Unit != tc.unit):
			t.Errorf("ReadTable(%q) = %+v; want %s in %q", tc.text, tab.Columns, tc.sym, tc.unit)
		}
	}
}

func TestReadHeaderRefused(t *testing.T) {
	// Headers that name an input but cannot be read without a guess; the
	// message says what to write. Common practice, no source.
	for _, tc := range []struct{ text, says string }{
		{"P [kPa] gauge", `"P [kPag]"`},
		{"P [psia] g", `"P [psig]"`},
		{"P (g) [bar]", `"P [barg]"`},
		{"T [°C] abs", `"T [K]"`},
		{"P [barg] absolute", `"P [bar]"`},
		{"P [psig] abs", `"P [psia]"`},
		{"Pressure gauge", `"Pressure [kPag]"`},
		{"T abs", `"T [K]"`},
		{"P [barx]", `"barx"`},
		{"Pressure (drum)", "no unit of pressure in its brackets"},
		{"P [°C]", "not of pressure"},
		{"Pressure or temperature [bar]", "pressure and temperature"},
		{"p s", "name one quantity per column"},
		{"T kelvin [°C]", "two units"},
		{"Vacuum pressure [kPa]", "vacuum"},
	} {
		_, err := point.ReadTable([]string{"Tag", tc.text}, nil, nil, units.Set{})
		if !errors.Is(err, point.ErrHeader) || !strings.Contains(err.Error(), tc.says) || !strings.Contains(err.Error(), `headers seen: "Tag"`) {
			t.Errorf("ReadTable(%q) error %v; want ErrHeader saying %s and listing the headers", tc.text, err, tc.says)
		}
		if why := point.ExplainHeader(tc.text); why == "" {
			t.Errorf("ExplainHeader(%q) = \"\"; want the reason", tc.text)
		}
	}
	// A header that is read, or names nothing, needs no explanation.
	for _, text := range []string{"P [barg]", "Steam flow [t/h]", "Note", "Pressure"} {
		if why := point.ExplainHeader(text); why != "" {
			t.Errorf("ExplainHeader(%q) = %q, want \"\"", text, why)
		}
	}
}

// A unit set that reads pressures as gauge takes a header that says gauge;
// one that reads them as absolute refuses it.
func TestQualifierAgainstTheSet(t *testing.T) {
	si := units.Set{}
	gauge, err := si.Override(units.Pressure, "barg")
	if err != nil {
		t.Fatal(err)
	}
	if _, err := point.ReadTable([]string{"P gauge", "T"}, nil, nil, gauge); err != nil {
		t.Errorf("gauge set: %v", err)
	}
	if _, err := point.ReadTable([]string{"P gauge", "T"}, nil, nil, si); !errors.Is(err, point.ErrHeader) {
		t.Errorf("si set: %v, want ErrHeader", err)
	}
}

func TestColumnNote(t *testing.T) {
	us, _ := units.SetByName("us")
	tab, err := point.ReadTable([]string{"Pressure", "T [°C]", "Dryness"}, nil, nil, us)
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []string{
		`p "Pressure": read as psia, unit set us`,
		`t "T [°C]": °C, from the header`,
		`x "Dryness": read as a fraction, unit set us`,
	} {
		if got := tab.Columns[i].Note(); got != want {
			t.Errorf("Note() = %q, want %q", got, want)
		}
	}
}

func TestReadTableMap(t *testing.T) {
	m, err := point.ParseMap("C=p:barg, D=t ; E=p,F=t:C")
	if err != nil {
		t.Fatal(err)
	}
	header := []string{"Tag", "Note", "P [kPa] gauge", "Steam T [°F]", "Feed P [bar]", "Feed T"}
	tab, err := point.ReadTable(header, nil, m, units.Set{})
	if err != nil {
		t.Fatal(err)
	}
	want := []struct {
		idx  int
		unit string
		from point.UnitSource
	}{{2, "barg", point.FromMap}, {3, "°F", point.FromHeader}, {4, "bar", point.FromHeader}, {5, "C", point.FromMap}}
	for i, w := range want {
		c := tab.Columns[i]
		if c.Index != w.idx || c.Unit != w.unit || c.From != w.from || !c.Mapped {
			t.Errorf("column %d: %+v; want index %d, %q from %d", i, c, w.idx, w.unit, w.from)
		}
	}
	// A mapped column without a unit takes that of a header of its
	// quantity, and is refused with it.
	m, _ = point.ParseMap("A=p,B=t")
	if _, err := point.ReadTable([]string{"P [kPa] gauge", "T"}, nil, m, units.Set{}); !errors.Is(err, point.ErrHeader) {
		t.Errorf("mapped column under a refused header: %v", err)
	}
	for _, bad := range []string{"", "C=p", "C=p,D=t,E=h", "C=q,D=t", "C=p:degC,D=t", "1=p,D=t", "C=p,C=t", "C p,D=t", "XFE=p,A=t"} {
		if _, err := point.ParseMap(bad); !errors.Is(err, point.ErrMap) {
			t.Errorf("ParseMap(%q) error %v, want ErrMap", bad, err)
		}
	}
}

func TestIsHeaderRow(t *testing.T) {
	for _, tc := range []struct {
		row  []string
		want bool
	}{
		{[]string{"Boiler 2 acceptance test, 12 March"}, false},
		{[]string{"Test", "Drum pressure [barg]", "Steam temperature [°C]"}, true},
		{[]string{"Pressure (drum)", "T abs"}, true}, // refused by ReadTable, but the header
		{[]string{"Pressure drop [kPa]", "T [°C]"}, false},
		{nil, false},
	} {
		if got := point.IsHeaderRow(tc.row); got != tc.want {
			t.Errorf("IsHeaderRow(%q) = %v, want %v", tc.row, got, tc.want)
		}
	}
}

func ExampleReadTable() {
	tab, _ := point.ReadTable([]string{"Tag", "Drum pressure [barg] PT-101", "Steam temperature"}, nil, nil, units.Set{})
	for _, c := range tab.Columns {
		fmt.Println(c.Note())
	}
	_, err := point.ReadTable([]string{"P [kPa] gauge", "T [°C]"}, nil, nil, units.Set{})
	fmt.Println(err)
	// Output:
	// p "Drum pressure [barg] PT-101": barg, from the header
	// t "Steam temperature": read as °C, unit set si
	// header "P [kPa] gauge": "gauge" says gauge, but the header's unit kPa, an absolute unit; write "P [kPag]"; headers seen: "P [kPa] gauge", "T [°C]"
}
