package point

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/fn/units"
)

// update rewrites the lists made from the catalogue (README symbol table,
// doc.go) instead of checking them: go test ./fn/point -run Catalogue -update
var update = flag.Bool("update", false, "rewrite the README symbol table and doc.go from the catalogue")

// Every entry is complete, and its symbol is unique and lower case (the
// symbols of the trade: p, t, h, s, x; f and g for the saturated phases).
func TestCatalogueEntries(t *testing.T) {
	seen := map[string]bool{}
	for _, p := range catalogue {
		switch {
		case seen[p.Symbol] || p.Symbol != strings.ToLower(p.Symbol) || strings.Contains(p.Symbol, "_"):
			t.Errorf("%s: symbol repeated, not lower case, or joined with _", p.Symbol)
		case p.Name == "" || p.Doc == "" || strings.ContainsAny(p.Doc, "\n|") || p.Applies == 0:
			t.Errorf("%s: name %q, doc %q, applies %v: each must be set, the doc one line", p.Symbol, p.Name, p.Doc, p.Applies)
		case p.Always != (p.get == nil):
			t.Errorf("%s: a property is either in every answer (phase, region) or read from the state", p.Symbol)
		case p.Kind == Text && p.Dim != 0:
			t.Errorf("%s: text has no unit", p.Symbol)
		}
		seen[p.Symbol] = true
	}
}

// Where an entry says it applies is where it has a value: one state of each
// kind, from IAPWS R7-97(2012) tables 5, 15 and 35 (their inputs; the
// values are not needed here).
func TestCatalogueApplies(t *testing.T) {
	single, _ := fn.FromPT(3, 300)      // R7-97 table 5: region 1
	vapour, _ := fn.FromPT(0.0035, 300) // R7-97 table 15: region 2
	mixture, _ := fn.FromPX(1, 0.5)     // on the line of R7-97 table 35
	critical, _ := fn.FromPT(25, 650)   // above pc, where tsat, superheat and subcooling have no value
	for _, p := range catalogue {
		if p.get == nil {
			continue
		}
		for _, tc := range []struct {
			name  string
			st    *fn.State
			where Applies
			below bool // below pc
		}{{"liquid", &single, SinglePhase, true}, {"vapour", &vapour, SinglePhase, true}, {"mixture", &mixture, Mixture | SaturatedPhases, true}, {"above pc", &critical, SinglePhase, false}} {
			v, ok := p.get(&view{st: tc.st})
			want := p.Applies&tc.where != 0
			if !tc.below && (p.Symbol == "tsat" || p.Symbol == "superheat" || p.Symbol == "subcooling" || p.Symbol == "sigma" || p.Symbol == "psat") {
				want = false // these stop at the critical point
			}
			if p.Applies == SaturatedPhases && tc.where&SinglePhase != 0 {
				want = false // the saturated phases of a single-phase state are not given
			}
			if ok != want {
				t.Errorf("%s of the %s: defined %v (%g), but it applies to %v", p.Symbol, tc.name, ok, v, p.Applies)
			}
		}
	}
}

// Superheat and subcooling against the saturation temperatures of IAPWS
// R7-97(2012) table 35 (Tsat(1 MPa) = 453.035632 K, Tsat(10 MPa) =
// 584.149488 K, 9 digits); in °F-based sets a degree of difference is
// 1/1.8 K (NIST SP 811 (2008) B.8), with no offset.
func TestSuperheatSubcooling(t *testing.T) {
	us, _ := units.SetByName("us")
	rankine, _ := us.Override(units.Temperature, "R")
	kelvin, _ := units.Set{}.Override(units.Temperature, "K")
	steam, _ := fn.FromPT(1, 573.15)
	water, _ := fn.FromPT(10, 300)
	for _, tc := range []struct {
		st        *fn.State
		set       units.Set
		sym, unit string
		want      float64
	}{
		{&steam, units.Set{}, "superheat", "K", 573.15 - 453.035632},
		{&steam, units.Set{}, "subcooling", "K", 453.035632 - 573.15},
		{&steam, kelvin, "superheat", "K", 573.15 - 453.035632},
		{&steam, us, "superheat", "°F", 1.8 * (573.15 - 453.035632)},
		{&steam, rankine, "superheat", "°F", 1.8 * (573.15 - 453.035632)},
		{&water, units.Set{}, "subcooling", "K", 584.149488 - 300},
		{&water, us, "subcooling", "°F", 1.8 * (584.149488 - 300)},
	} {
		a := Render(tc.st, []string{tc.sym}, Options{Set: tc.set})
		f, err := a.Value(tc.sym)
		if err != nil || f.Unit != tc.unit || !scalar.EqualWithinAbs(f.Value, tc.want, 2e-6) {
			t.Errorf("%s at %g MPa, %g K in %s: %g %s (%v), want %.7g %s", tc.sym, tc.st.P, tc.st.T, tc.set.Name(), f.Value, f.Unit, err, tc.want, tc.unit)
		}
	}
	mixture, _ := fn.FromPX(1, 0.5)
	a := Render(&mixture, []string{"superheat", "subcooling"}, Options{})
	for _, sym := range []string{"superheat", "subcooling"} {
		if _, err := a.Value(sym); err == nil {
			t.Errorf("%s of a mixture has a value", sym)
		}
	}
}

// docBlock is the property list of doc.go, made from the catalogue.
func docBlock() string {
	var b strings.Builder
	b.WriteString("// Property symbols (the keys of JSON answers, the names in get= lists and\n")
	b.WriteString("// workbook columns), from the catalogue in props.go; kind and where each\n")
	b.WriteString("// applies (single phase, saturated phases, mixture) follow the meaning:\n")
	b.WriteString("//\n")
	for _, p := range catalogue {
		fmt.Fprintf(&b, "//\t%-10s %s (%s; %s)\n", p.Symbol, p.Doc, p.Kind, p.Applies)
	}
	return b.String()
}

// readmeTable is the README symbol table, made from the catalogue.
func readmeTable() string {
	var b strings.Builder
	b.WriteString("| symbol | meaning | unit in si | kind | applies to |\n| --- | --- | --- | --- | --- |\n")
	for _, p := range catalogue {
		u := p.Unit(units.Set{})
		if u == "" {
			u = "—"
		}
		fmt.Fprintf(&b, "| `%s` | %s | %s | %s | %s |\n", p.Symbol, p.Doc, u, p.Kind, p.Applies)
	}
	return b.String()
}

// replaceBetween returns text with the part after the line starting with
// begin and before the line starting with end replaced by body.
func replaceBetween(t *testing.T, file, text, begin, end, body string) string {
	i := strings.Index(text, begin)
	if i < 0 {
		t.Fatalf("%s has no line %q", file, begin)
	}
	i += strings.IndexByte(text[i:], '\n') + 1
	j := strings.Index(text[i:], end)
	if j < 0 {
		t.Fatalf("%s has no line %q after %q", file, end, begin)
	}
	return text[:i] + body + text[i+j:]
}

// TestCatalogueDocs checks that the README symbol table and the list of
// doc.go are those the catalogue makes; -update rewrites them.
func TestCatalogueDocs(t *testing.T) {
	for _, f := range []struct {
		path, begin, end, body string
	}{
		{"doc.go", "// means the same everywhere.", "// The f and g suffixes", "//\n" + docBlock() + "//\n"},
		{"../../README.md", "<!-- symbol table: made from fn/point/props.go", "<!-- end of symbol table -->", readmeTable()},
	} {
		old, err := os.ReadFile(f.path)
		if err != nil {
			t.Fatal(err)
		}
		want := replaceBetween(t, f.path, string(old), f.begin, f.end, f.body)
		if *update {
			if err := os.WriteFile(f.path, []byte(want), 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		if want != string(old) {
			t.Errorf("%s does not list the catalogue; run go test ./fn/point -run Catalogue -update", f.path)
		}
	}
}

// TestCatalogueOpenAPI checks the lists of server/openapi.json: the enum of
// /state/{property} is every symbol, and the get= description names every
// property that is a field.
func TestCatalogueOpenAPI(t *testing.T) {
	b, err := os.ReadFile("../../server/openapi.json")
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Components struct {
			Parameters map[string]struct {
				Description string
				Schema      struct{ Enum []string }
			}
		}
	}
	if err := json.NewDecoder(bytes.NewReader(b)).Decode(&doc); err != nil {
		t.Fatal(err)
	}
	if got := doc.Components.Parameters["property"].Schema.Enum; !slices.Equal(got, allSymbols()) {
		t.Errorf("openapi.json: enum of property %q, want the catalogue's %q", got, allSymbols())
	}
	desc := doc.Components.Parameters["get"].Description
	_, list, _ := strings.Cut(desc, "Symbols: ")
	list = strings.TrimSuffix(list, ".")
	if got := strings.Split(list, ", "); !slices.Equal(got, fieldSymbols()) {
		t.Errorf("openapi.json: get= lists %q, want the catalogue's %q", got, fieldSymbols())
	}
}
