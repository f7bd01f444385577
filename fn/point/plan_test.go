package point

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"steamcell/fn"
	"steamcell/fn/units"
)

// The plan must write exactly what the renderer wrote before it. The
// reference below is that renderer as it was (Render with its map, the
// CSV cells of the server, AppendJSON with json.Marshal), kept here only
// to compare with, cell by cell.

func refRender(st *fn.State, syms []string, opt Options) refAnswer {
	w := &view{st: st}
	defaults := syms == nil
	if defaults {
		syms = defaultSymbols
	}
	a := refAnswer{Phase: st.Phase.String(), Region: st.Region, Set: opt.Set.Name()}
	for _, n := range st.Warnings {
		a.Warnings = append(a.Warnings, opt.note(n))
	}
	for _, sym := range syms {
		p, _ := Lookup(sym)
		if p.get == nil {
			continue
		}
		v, ok := p.get(w)
		u := opt.Set.Unit(p.Dim)
		f := Field{Symbol: p.Symbol, Name: p.Name, Unit: p.Unit(opt.Set), Defined: ok && !math.IsNaN(v) && !math.IsInf(v, 0)}
		if defaults && !f.Defined {
			continue
		}
		if f.Defined {
			f.Value = p.fromBase(v, &u, opt.Patm)
		}
		a.Fields = append(a.Fields, f)
	}
	a.Warnings = append(a.Warnings, w.trWarn...)
	if w.sigmaWarn != "" {
		a.Warnings = append(a.Warnings, w.sigmaWarn)
	}
	return a
}

type refAnswer struct {
	Phase    string
	Region   int
	Fields   []Field
	Warnings []string
	Set      string
}

// refCSV is the server's answerCells and appendCSVRow as they were.
func refCSV(a *refAnswer, delim rune) string {
	cells := []string{a.Phase, strconv.Itoa(a.Region)}
	for _, f := range a.Fields {
		if f.Defined {
			cells = append(cells, strconv.FormatFloat(f.Value, 'g', -1, 64))
		} else {
			cells = append(cells, "")
		}
	}
	cells = append(cells, strings.Join(a.Warnings, "; "))
	var b []byte
	for i, c := range cells {
		if i > 0 {
			b = utf8.AppendRune(b, delim)
		}
		if !refNeedsQuotes(c, delim) {
			b = append(b, c...)
			continue
		}
		b = append(b, '"')
		b = append(b, strings.ReplaceAll(c, `"`, `""`)...)
		b = append(b, '"')
	}
	return string(b)
}

func refNeedsQuotes(c string, delim rune) bool {
	if c == "" {
		return false
	}
	if c[0] == ' ' || c[0] == '\t' || c == `\.` {
		return true
	}
	return strings.ContainsRune(c, delim) || strings.ContainsAny(c, "\"\r\n")
}

// refJSON is AppendJSON as it was.
func refJSON(a *refAnswer, inputs []Input, caution string) string {
	str := func(b []byte, s string) []byte { q, _ := json.Marshal(s); return append(b, q...) }
	strs := func(b []byte, ss []string) []byte {
		b = append(b, '[')
		for i, s := range ss {
			if i > 0 {
				b = append(b, ',')
			}
			b = str(b, s)
		}
		return append(b, ']')
	}
	num := func(b []byte, v float64) []byte { return strconv.AppendFloat(b, v, 'g', -1, 64) }
	b := []byte{'{'}
	if len(inputs) > 0 {
		b = append(b, `"inputs":{`...)
		for i, in := range inputs {
			if i > 0 {
				b = append(b, ',')
			}
			b = str(b, in.Symbol)
			b = append(b, ':')
			b = num(b, in.Value)
		}
		b = append(b, "},"...)
	}
	b = append(b, `"phase":`...)
	b = str(b, a.Phase)
	b = append(b, `,"region":`...)
	b = strconv.AppendInt(b, int64(a.Region), 10)
	var undefined []string
	for _, f := range a.Fields {
		if !f.Defined {
			undefined = append(undefined, f.Symbol)
			continue
		}
		b = append(b, ',')
		b = str(b, f.Symbol)
		b = append(b, ':')
		b = num(b, f.Value)
	}
	b = append(b, `,"units":{`...)
	first := true
	add := func(sym, unit string) {
		if !first {
			b = append(b, ',')
		}
		first = false
		b = str(b, sym)
		b = append(b, ':')
		b = str(b, unit)
	}
	seen := map[string]bool{}
	for _, in := range inputs {
		if !seen[in.Symbol] {
			seen[in.Symbol] = true
			add(in.Symbol, in.Unit)
		}
	}
	for _, f := range a.Fields {
		if f.Defined && !seen[f.Symbol] {
			seen[f.Symbol] = true
			add(f.Symbol, f.Unit)
		}
	}
	b = append(b, `},"unit_set":`...)
	b = str(b, a.Set)
	b = append(b, `,"formulation":`...)
	b = str(b, Formulation)
	b = append(b, `,"warnings":`...)
	b = strs(b, a.Warnings)
	if len(undefined) > 0 {
		b = append(b, `,"undefined":`...)
		b = strs(b, undefined)
	}
	if caution != "" {
		b = append(b, `,"caution":`...)
		b = str(b, caution)
	}
	return string(append(b, '}'))
}

// planCorpus is states of every phase and region, with and without
// warnings (near saturation, near the critical point, transport and
// surface tension outside their ranges): the inputs a batch gives the
// engine, in base units. Which state is which is the engine's business;
// planCorpusCovers checks that all are there.
func planCorpus(t *testing.T) []struct {
	st fn.State
	in [2]fn.Input
} {
	t.Helper()
	var out []struct {
		st fn.State
		in [2]fn.Input
	}
	add := func(a, b fn.Input) {
		if st, err := fn.Solve(a, b); err == nil {
			out = append(out, struct {
				st fn.State
				in [2]fn.Input
			}{st, [2]fn.Input{a, b}})
		}
	}
	for _, p := range []float64{0.000612, 0.1, 1, 10, 16.5, 20, 22.064, 25, 50, 100} {
		for _, T := range []float64{273.15, 280, 373.2, 450, 623.15, 647.1, 650, 700, 863.15, 1073.15, 1500, 2273.15} {
			add(fn.Input{Q: fn.Pressure, Value: p}, fn.Input{Q: fn.Temperature, Value: T})
			if T < 647.096 {
				add(fn.Input{Q: fn.Temperature, Value: T}, fn.Input{Q: fn.Quality, Value: 0.37})
			}
		}
		for _, x := range []float64{0, 1e-9, 0.25, 0.999, 1} {
			add(fn.Input{Q: fn.Pressure, Value: p}, fn.Input{Q: fn.Quality, Value: x})
		}
	}
	// Near saturation at 1 MPa (Ts = 453.03 K, IAPWS R7-97 Table 35).
	add(fn.Input{Q: fn.Pressure, Value: 1}, fn.Input{Q: fn.Temperature, Value: 453.2})
	add(fn.Input{Q: fn.Enthalpy, Value: 2800}, fn.Input{Q: fn.Entropy, Value: 6.5})
	return out
}

// optionSets is every unit set, and one with a gauge pressure at an
// atmosphere other than the standard one.
func optionSets(t *testing.T) []Options {
	t.Helper()
	var out []Options
	for _, name := range units.SetNames() {
		s, err := units.SetByName(name)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, Options{Set: s})
	}
	g, err := out[0].Set.Override(units.Pressure, "barg")
	if err != nil {
		t.Fatal(err)
	}
	return append(out, Options{Set: g, Patm: 0.095})
}

// symbolLists are the property lists a request gives: none (the default),
// the defaults by name, all, a few, repeated and mixed-case symbols, and
// every property alone.
func symbolLists() [][]string {
	// The first six are tried in every unit set.
	lists := [][]string{nil, DefaultSymbols(), allSymbols(), {"h", "s", "v"},
		{"x", "h", "h", "cp", "mu", "sigma", "tsat", "psat"}, {"H", "Rho", "p", "T"}}
	for _, p := range catalogue {
		lists = append(lists, []string{p.Symbol})
	}
	return lists
}

// TestPlanMatchesRenderer compares the plan's answers with the renderer
// as it was, cell by cell: every state of the corpus, every unit set,
// every property list, CSV with each delimiter and JSON with and without
// inputs and caution. One Answer is filled again and again, as a batch
// fills it.
func TestPlanMatchesRenderer(t *testing.T) {
	corpus := planCorpus(t)
	planCorpusCovers(t, corpus)
	var a Answer
	var b []byte
	checked := 0
	for k, opt := range optionSets(t) {
		for i, syms := range symbolLists() {
			if k > 0 && i >= 6 {
				break // each property alone, in one unit set: "all" has every unit
			}
			pl := NewPlan(syms, opt)
			for _, c := range corpus {
				ref := refRender(&c.st, syms, opt)
				pl.Fill(&c.st, &a)
				for _, delim := range []rune{',', ';', '\t'} {
					got, want := string(a.AppendCSV(b[:0], delim)), refCSV(&ref, delim)
					if got != want {
						t.Fatalf("%s, %s, get=%v, CSV %q:\n got %s\nwant %s", c.st.Phase, opt.Set.Name(), syms, delim, got, want)
					}
					// The same cells as encoding/csv reads them back.
					cells, err := csv.NewReader(strings.NewReader(got + "\n")).Read()
					if delim == ',' && (err != nil || len(cells) != len(ref.Fields)+3) {
						t.Fatalf("CSV %s reads back as %q, %v", got, cells, err)
					}
				}
				in := Inputs(c.in, opt)
				for _, caution := range []string{"", "Mind the <steam> & \"hot\" water"} {
					if got, want := string(a.AppendJSON(b[:0], in, caution)), refJSON(&ref, in, caution); got != want {
						t.Fatalf("%s, %s, get=%v, JSON:\n got %s\nwant %s", c.st.Phase, opt.Set.Name(), syms, got, want)
					}
				}
				if got, want := string(a.AppendJSON(b[:0], nil, "")), refJSON(&ref, nil, ""); got != want {
					t.Fatalf("JSON without inputs:\n got %s\nwant %s", got, want)
				}
				r := Render(&c.st, syms, opt)
				if len(r.Fields) != len(ref.Fields) || r.Phase != ref.Phase || r.Region != ref.Region || strings.Join(r.Warnings, "|") != strings.Join(ref.Warnings, "|") {
					t.Fatalf("Render differs: %+v, want %+v", r, ref)
				}
				for j, f := range r.Fields {
					f.idx = 0
					if f != ref.Fields[j] && !(math.IsNaN(f.Value) && math.IsNaN(ref.Fields[j].Value)) {
						t.Fatalf("Render field %d: %+v, want %+v", j, f, ref.Fields[j])
					}
				}
				checked++
			}
		}
	}
	t.Logf("%d answers of %d states compared", checked, len(corpus))
}

// planCorpusCovers checks that the corpus holds every phase, every region,
// states with warnings of each kind and properties with no value.
func planCorpusCovers(t *testing.T, corpus []struct {
	st fn.State
	in [2]fn.Input
}) {
	t.Helper()
	phases, regions := map[string]bool{}, map[int]bool{}
	var warned, transportWarned, sigmaWarned bool
	for _, c := range corpus {
		phases[c.st.Phase.String()] = true
		regions[c.st.Region] = true
		warned = warned || len(c.st.Warnings) > 0
		var a Answer
		NewPlan(allSymbols(), Options{}).Fill(&c.st, &a)
		transportWarned = transportWarned || len(a.w.trWarn) > 0
		sigmaWarned = sigmaWarned || a.w.sigmaWarn != ""
	}
	var have []string
	for p := range phases {
		have = append(have, p)
	}
	sort.Strings(have)
	// The six phases of a solved state (fn/phase.go) and regions 1 to 5.
	if len(phases) != 6 || len(regions) != 5 || !warned || !transportWarned || !sigmaWarned {
		t.Fatalf("corpus covers phases %v, regions %v, warnings %v/%v/%v", have, regions, warned, transportWarned, sigmaWarned)
	}
}

// TestCatalogueFitsJSONSet: AppendJSON marks the symbols it has written in
// a set of maxProps bits.
func TestCatalogueFitsJSONSet(t *testing.T) {
	if len(catalogue) > maxProps {
		t.Fatalf("%d properties, AppendJSON's set holds %d: raise maxProps", len(catalogue), maxProps)
	}
}

// TestAppendJSONString compares with json.Marshal: HTML characters, control
// characters, U+2028 and U+2029, invalid UTF-8, units and plain text.
func TestAppendJSONString(t *testing.T) {
	for _, s := range []string{"", "ok", "kJ/(kg·K)", "m³/kg", "µPa·s", "°C", `a "quoted" \ back`,
		"<b>&amp;</b>", "tab\tnew\nline\r\b\f\x00\x1f\x7f", "\u2028\u2029", "bad \xff\xfe utf8 \xe2\x82", "😀 é", "\xed\xa0\x80"} {
		want, _ := json.Marshal(s)
		if got := AppendJSONString(nil, s); string(got) != string(want) {
			t.Errorf("AppendJSONString(%q) = %s, want %s", s, got, want)
		}
		if got := AppendJSONString(nil, []byte(s)); string(got) != string(want) {
			t.Errorf("AppendJSONString([]byte %q) = %s, want %s", s, got, want)
		}
	}
}

// FuzzAppendJSONString: any text, as json.Marshal writes it.
func FuzzAppendJSONString(f *testing.F) {
	f.Add("<a href=\"x\">\u2028\xff</a>")
	f.Fuzz(func(t *testing.T, s string) {
		want, _ := json.Marshal(s)
		if got := AppendJSONString(nil, s); string(got) != string(want) {
			t.Errorf("AppendJSONString(%q) = %s, want %s", s, got, want)
		}
	})
}

// TestAppendCSVCell compares with the quoting as it was, and checks that
// encoding/csv reads each cell back unchanged.
func TestAppendCSVCell(t *testing.T) {
	for _, c := range []string{"", "ok", " lead", "\tlead", `\.`, `\.x`, `a "q"`, `""`, "a,b", "a;b", "a\tb", "line\nbreak", "cr\r", "é,ü", "within 0.5 K of saturation; a small error"} {
		for _, delim := range []rune{',', ';', '\t', '§'} {
			got := string(AppendCSVCell(nil, c, delim))
			if c != "" {
				r := csv.NewReader(strings.NewReader(got + "\n"))
				r.Comma = delim
				if rec, err := r.Read(); err != nil || len(rec) != 1 || rec[0] != c {
					t.Errorf("AppendCSVCell(%q, %q) = %s reads back as %q, %v", c, delim, got, rec, err)
				}
			}
			if !refNeedsQuotes(c, delim) && got != c || refNeedsQuotes(c, delim) && got != `"`+strings.ReplaceAll(c, `"`, `""`)+`"` {
				t.Errorf("AppendCSVCell(%q, %q) = %s", c, delim, got)
			}
		}
	}
}

// TestPlanAllocations: filling a reused Answer and writing it costs no
// allocation for a state without warnings.
func TestPlanAllocations(t *testing.T) {
	st, err := fn.FromPT(0.701325, 603.15)
	if err != nil || len(st.Warnings) > 0 {
		t.Fatal(err, st.Warnings)
	}
	in := [2]fn.Input{{Q: fn.Pressure, Value: 0.701325}, {Q: fn.Temperature, Value: 603.15}}
	for _, syms := range [][]string{nil, {"h", "s", "v"}, allSymbols()} {
		pl := NewPlan(syms, Options{})
		var a Answer
		var b []byte
		var inputs []Input
		run := func() {
			pl.Fill(&st, &a)
			inputs = AppendInputs(inputs[:0], in, Options{})
			b = a.AppendCSV(b[:0], ',')
			b = a.AppendJSON(b, inputs, "")
			for j := range a.Fields {
				b = a.AppendCell(b, j)
			}
		}
		run()
		if n := testing.AllocsPerRun(200, run); n != 0 {
			t.Errorf("get=%v: %.1f allocations per answer, want 0", syms, n)
		}
	}
}

var planSink fn.State

// BenchmarkWorkbookRow is the solve-and-write loop of a workbook fill, one
// row at a time as a streaming writer calls it: the two input cells read
// as text in the units of their headers, the state solved, the plan
// applied and the cells of fill's default columns (h, s, v, x, phase)
// appended to a row buffer. Each iteration also solves the same states
// with the engine alone, so that the ratio comes from one moment of the
// machine.
func BenchmarkWorkbookRow(b *testing.B) {
	const rows = 1024
	type row struct {
		given [2]Given
		in    [2]fn.Input
	}
	rs := make([]row, rows)
	for i := range rs {
		p, T := 1+i%100, 200+i%300 // barg, °C: liquid and vapour, regions 1 and 2
		rs[i].given = [2]Given{{Name: "p", Text: strconv.Itoa(p), Unit: "barg"}, {Name: "t", Text: strconv.Itoa(T), Unit: "°C"}}
		rs[i].in = [2]fn.Input{{Q: fn.Pressure, Value: float64(p)/10 + 0.101325}, {Q: fn.Temperature, Value: float64(T) + 273.15}}
	}
	pl := NewPlan([]string{"h", "s", "v", "x"}, Options{})
	var a Answer
	var cells []byte
	var engine, loop int64
	for b.Loop() {
		t0 := nanotime()
		for i := range rs {
			planSink, _ = fn.Solve(rs[i].in[0], rs[i].in[1])
		}
		t1 := nanotime()
		for i := range rs {
			if _, err := pl.Row(rs[i].given[:], &a); err != nil {
				b.Fatal(err)
			}
			cells = append(cells[:0], "ok"...)
			for j := range a.Fields {
				cells = a.AppendCell(cells, j)
			}
			cells = append(cells, a.Phase...)
		}
		engine, loop = engine+t1-t0, loop+nanotime()-t1
	}
	n := float64(b.N * rows)
	b.ReportMetric(float64(loop)/n, "ns/row")
	b.ReportMetric(float64(engine)/n, "ns/state")
	b.ReportMetric(float64(loop)/float64(engine), "ratio")
}

func nanotime() int64 { return time.Now().UnixNano() }
