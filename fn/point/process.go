package point

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/process"
	"steamcell/fn/uncertain"
	"steamcell/fn/units"
)

// WithUncertainty returns g with the uncertainty text unc ("0.2bar",
// "0.25%") appended after ±, unless g already carries one or unc is
// empty: how a column of uncertainties (header "u(p) [bar]") or one value
// for a whole column joins its input.
func WithUncertainty(g Given, unc string) Given {
	if strings.TrimSpace(unc) == "" {
		return g
	}
	if _, _, has := SplitUncertainty(g.Text); has {
		return g
	}
	g.Text = strings.TrimSpace(g.Text) + "±" + strings.TrimSpace(unc)
	return g
}

// ReadProcess reads the named inputs of a process ("p1", "t1", "m2"),
// each a value with an optional unit and an optional ±uncertainty, into
// base units with standard uncertainties. Flows (m1, m2) are numbers in
// one unit of the caller's choice, given without a unit.
func ReadProcess(given []Given, opt Options, uo UOptions) ([]process.Value, error) {
	out := make([]process.Value, 0, len(given))
	for _, g := range given {
		sym, _, ok := process.ParseName(g.Name)
		if !ok {
			return nil, &Error{Param: g.Name, Kind: ErrUnknownInput, Msg: fmt.Sprintf(
				"%s is not a process input; name a property symbol and a state number (p1, t1, h2, x2) or a flow (m1, m2)", quote(g.Name))}
		}
		text, unc, has := SplitUncertainty(g.Text)
		var x float64
		var vu units.Unit
		if sym == "m" {
			var err error
			x, err = strconv.ParseFloat(strings.TrimSpace(text), 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, &units.InputError{Name: g.Name, Text: text, Dim: units.Dimensionless, Err: units.ErrSyntax,
					Detail: "a flow is a plain number in one unit of your choice (kg/s, t/h) for all flows; give it without a unit"}
			}
			vu = units.Dimensionless.Base()
		} else {
			q, _ := fn.QuantityBySymbol(sym)
			var err error
			x, vu, err = units.ParseUnit(text, DimOf(q), units.Options{Name: g.Name, Unit: g.Unit, Set: opt.Set, Patm: opt.Patm})
			if err != nil {
				return nil, err
			}
		}
		u := 0.0
		if has {
			var err error
			d := vu.Dim
			if u, err = ParseUncertainty(g.Name, unc, d, vu.FromBase(x, opt.Patm), vu, opt, uo.Convention); err != nil {
				return nil, err
			}
		}
		out = append(out, process.Value{Name: g.Name, X: x, U: u})
	}
	return out, nil
}

// ProcessField is one result or state property in the user's units.
type ProcessField struct {
	Name, Desc, Unit string
	Value, U         float64
	Unreliable       bool
	Contributions    []uncertain.Contribution // in the field's unit
}

// ProcessState is one numbered state in the user's units.
type ProcessState struct {
	Label, Phase string
	Region       int
	Fields       []ProcessField
}

// ProcessAnswer is a process's answer in the user's units.
type ProcessAnswer struct {
	Kind     string
	Results  []ProcessField
	States   []ProcessState
	Warnings []string
	Set      string
	UOpt     UOptions
	Measured bool // some input carried an uncertainty
}

// RunProcess reads the named inputs of one request or one workbook row
// and computes the process kind, the answer in the units of opt. It is
// the one entry point the command, the server and the workbook share.
func RunProcess(kind string, given []Given, opt Options, uo UOptions) (ProcessAnswer, error) {
	in, err := ReadProcess(given, opt, uo)
	if err != nil {
		return ProcessAnswer{}, err
	}
	a, err := process.Run(kind, in)
	if err != nil {
		return ProcessAnswer{}, err
	}
	return RenderProcess(&a, opt, uo), nil
}

// differenceLabel is the unit label of a temperature difference in u.
func differenceLabel(u units.Unit) string {
	if u.Name == "°C" {
		return "K"
	}
	return u.Name
}

// convert writes a result in the user's units.
func convert(r *process.Result, opt Options) ProcessField {
	f := ProcessField{Name: r.Name, Desc: r.Desc, Unreliable: r.Unreliable}
	if r.Flow {
		f.Value, f.U, f.Unit = r.Value, r.U, ""
		f.Contributions = r.Contributions
		return f
	}
	u := opt.Set.Unit(r.Dim)
	scale := unitScale(u, opt.Patm)
	f.Unit = u.Name
	if r.Difference {
		f.Value, f.Unit = r.Value/scale, differenceLabel(u)
	} else {
		f.Value = u.FromBase(r.Value, opt.Patm)
	}
	f.U = r.U / scale
	for _, c := range r.Contributions {
		c.U /= scale
		f.Contributions = append(f.Contributions, c)
	}
	return f
}

// RenderProcess writes a process answer in the units of opt.
func RenderProcess(a *process.Answer, opt Options, uo UOptions) ProcessAnswer {
	out := ProcessAnswer{Kind: a.Kind, Warnings: a.Warnings, Set: opt.Set.Name(), UOpt: uo}
	for i := range a.Budget.Len() {
		if a.Budget.StdU(i) > 0 {
			out.Measured = true
		}
	}
	for i := range a.Results {
		out.Results = append(out.Results, convert(&a.Results[i], opt))
	}
	for _, s := range a.States {
		ps := ProcessState{Label: s.Label, Phase: s.Phase, Region: s.Region}
		for i := range s.Fields {
			ps.Fields = append(ps.Fields, convert(&s.Fields[i], opt))
		}
		out.States = append(out.States, ps)
	}
	return out
}

// Result returns the result of name n.
func (p *ProcessAnswer) Result(n string) (ProcessField, error) {
	for _, r := range p.Results {
		if strings.EqualFold(r.Name, n) {
			return r, nil
		}
	}
	var names []string
	for _, r := range p.Results {
		names = append(names, r.Name)
	}
	return ProcessField{}, &Error{Param: n, Kind: ErrUnknownProperty, Msg: fmt.Sprintf(
		"%s is not a result of %s; its results are %s", quote(n), p.Kind, strings.Join(names, ", "))}
}

// cellHeader is the header of a result column: "h2s [kJ/kg]", "efficiency".
func cellHeader(name, unit string) string {
	if unit == "" {
		return name
	}
	return name + " [" + unit + "]"
}

// Header returns the CSV or workbook header cells of the answer: each
// result, then its u ("u(h2s) [kJ/kg]", the form of an input's uncertainty column)
// and, when k was asked for, its expanded uncertainty ("U(h2s) [kJ/kg]"),
// then the warnings.
func (p *ProcessAnswer) Header() []string {
	var h []string
	for _, r := range p.Results {
		h = append(h, cellHeader(r.Name, r.Unit), cellHeader("u("+r.Name+")", r.Unit))
		if p.UOpt.K > 0 {
			h = append(h, cellHeader("U("+r.Name+")", r.Unit))
		}
	}
	return append(h, "warnings")
}

// Cells returns the cells of the answer in the order of Header.
func (p *ProcessAnswer) Cells() []string {
	var c []string
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	for _, r := range p.Results {
		c = append(c, g(r.Value), g(r.U))
		if p.UOpt.K > 0 {
			c = append(c, g(p.UOpt.K*r.U))
		}
	}
	return append(c, strings.Join(p.Warnings, "; "))
}

// AppendJSON appends the answer as one JSON object:
//
//	"process", "results" {name: value}, "u" {name: standard uncertainty},
//	"U" {name: k·u} (when k was asked for), "units" {name: unit},
//	"definitions" {name: words}, "budget" {name: {input: |c|·u}},
//	"states" [{"state", "phase", "region", p, t, h, s, v, x, "u": {…}}],
//	"uncertainty" {convention, applied, k, method}, "unit_set",
//	"formulation", "warnings", "caution".
func (p *ProcessAnswer) AppendJSON(b []byte, caution string) []byte {
	b = append(b, `{"process":`...)
	b = AppendJSONString(b, p.Kind)
	obj := func(name string, fields []ProcessField, val func(ProcessField) []byte) {
		b = append(b, `,"`+name+`":{`...)
		for i, f := range fields {
			if i > 0 {
				b = append(b, ',')
			}
			b = AppendJSONString(b, f.Name)
			b = append(b, ':')
			b = append(b, val(f)...)
		}
		b = append(b, '}')
	}
	num := func(v float64) []byte { return AppendNumber(nil, v) }
	obj("results", p.Results, func(f ProcessField) []byte { return num(f.Value) })
	obj("u", p.Results, func(f ProcessField) []byte { return num(f.U) })
	if p.UOpt.K > 0 {
		obj("U", p.Results, func(f ProcessField) []byte { return num(p.UOpt.K * f.U) })
	}
	obj("units", p.Results, func(f ProcessField) []byte { return AppendJSONString(nil, f.Unit) })
	obj("definitions", p.Results, func(f ProcessField) []byte { return AppendJSONString(nil, f.Desc) })
	obj("budget", p.Results, func(f ProcessField) []byte {
		o := []byte{'{'}
		for i, c := range f.Contributions {
			if i > 0 {
				o = append(o, ',')
			}
			o = AppendJSONString(o, c.Name)
			o = append(o, ':')
			o = AppendNumber(o, c.U)
		}
		return append(o, '}')
	})
	b = append(b, `,"states":[`...)
	for i, s := range p.States {
		if i > 0 {
			b = append(b, ',')
		}
		b = append(b, `{"state":`...)
		b = AppendJSONString(b, s.Label)
		b = append(b, `,"phase":`...)
		b = AppendJSONString(b, s.Phase)
		b = append(b, `,"region":`...)
		b = strconv.AppendInt(b, int64(s.Region), 10)
		for _, f := range s.Fields {
			b = append(b, ',')
			b = AppendJSONString(b, f.Name)
			b = append(b, ':')
			b = AppendNumber(b, f.Value)
		}
		obj("u", s.Fields, func(f ProcessField) []byte { return num(f.U) })
		obj("units", s.Fields, func(f ProcessField) []byte { return AppendJSONString(nil, f.Unit) })
		b = append(b, '}')
	}
	b = append(b, `],"uncertainty":{"convention":`...)
	b = AppendJSONString(b, p.UOpt.Convention.Name())
	b = append(b, `,"applied":`...)
	b = AppendJSONString(b, p.UOpt.Convention.String())
	if p.UOpt.K > 0 {
		b = append(b, `,"k":`...)
		b = AppendNumber(b, p.UOpt.K)
	}
	b = append(b, `,"method":`...)
	b = AppendJSONString(b, uncertain.Method+"; results through the full Jacobian over the raw inputs")
	b = append(b, `},"unit_set":`...)
	b = AppendJSONString(b, p.Set)
	b = append(b, `,"formulation":`...)
	b = AppendJSONString(b, Formulation)
	b = append(b, `,"warnings":`...)
	b = appendJSONStrings(b, p.Warnings)
	if caution != "" {
		b = append(b, `,"caution":`...)
		b = AppendJSONString(b, caution)
	}
	return append(b, '}')
}

// ParseK reads the coverage factor of a request's k= option: a number
// above 0 and at most 10 ("2", "k2").
func ParseK(text string) (float64, error) {
	t := strings.TrimPrefix(strings.ToLower(strings.TrimSpace(text)), "k")
	t = strings.TrimPrefix(t, "=")
	k, err := strconv.ParseFloat(t, 64)
	if err != nil || !(k > 0 && k <= 10) {
		return 0, &Error{Param: "k", Kind: ErrUncertainty, Msg: fmt.Sprintf("k=%s is not a coverage factor; give a number above 0 up to 10, usually k=2", text)}
	}
	return k, nil
}

// ParseConvention reads a request's convention= option (see
// uncertain.ParseConvention) as a point error.
func ParseConvention(text string) (uncertain.Convention, error) {
	c, err := uncertain.ParseConvention(text)
	if errors.Is(err, uncertain.ErrConvention) {
		return c, &Error{Param: "convention", Kind: ErrUncertainty, Msg: err.Error()}
	}
	return c, err
}

// ProcessColumn is what a column header of a process table says: the
// input it holds ("p1") and the unit of its bare numbers, and whether it
// holds that input's uncertainty instead of its value.
type ProcessColumn struct {
	Input       string // "p1", "t2", "m1"; "" for a column that is no input (a tag, a time)
	Unit        string
	Uncertainty bool
}

// ProcessColumns reads the header row of a process table: "p1 [bar]",
// "t1 (°C)", "m2", and beside them "u(p1) [bar]" (UncertaintyHeader).
// Columns that name no process input are passed over (Input ""). An input
// named twice, or an uncertainty column whose input has no column, is an
// error.
func ProcessColumns(headers []string) ([]ProcessColumn, error) {
	cols := make([]ProcessColumn, len(headers))
	seen := map[string]bool{}
	for i, h := range headers {
		if in, unit, ok := UncertaintyHeader(h); ok {
			cols[i] = ProcessColumn{Input: strings.ToLower(in), Unit: unit, Uncertainty: true}
			continue
		}
		name, unit := strings.TrimSpace(h), ""
		if j := strings.IndexAny(name, "[("); j > 0 {
			close := map[byte]byte{'[': ']', '(': ')'}[name[j]]
			if k := strings.LastIndexByte(name, close); k > j {
				unit = strings.TrimSpace(name[j+1 : k])
			}
			name = strings.TrimSpace(name[:j])
		}
		if _, _, ok := process.ParseName(name); !ok {
			continue
		}
		name = strings.ToLower(name)
		if seen[name] {
			return nil, &Error{Param: h, Kind: ErrInputCount, Msg: fmt.Sprintf("%s has two columns; give each input one", name)}
		}
		seen[name] = true
		cols[i] = ProcessColumn{Input: name, Unit: unit}
	}
	for i, c := range cols {
		if c.Uncertainty && !seen[c.Input] {
			return nil, &Error{Param: headers[i], Kind: ErrUncertainty, Msg: fmt.Sprintf("%s is the uncertainty of %s, which has no column", quote(headers[i]), c.Input)}
		}
	}
	return cols, nil
}

// ProcessRow computes process kind for one row of cells under the
// columns of ProcessColumns, and returns the answer (Header and Cells give
// the result columns). Empty cells are inputs not given; an uncertainty
// cell applies to its input's value in the row, in the uncertainty
// column's unit or, without one, in the input's. A value cell may carry
// its own ± too, which wins.
func ProcessRow(kind string, cols []ProcessColumn, cells []string, opt Options, uo UOptions) (ProcessAnswer, error) {
	var given []Given
	uncs := map[string]string{}
	for i, c := range cols {
		if c.Input == "" || i >= len(cells) || strings.TrimSpace(cells[i]) == "" {
			continue
		}
		if c.Uncertainty {
			uncs[c.Input] = strings.TrimSpace(cells[i]) + c.Unit
			continue
		}
		given = append(given, Given{Name: c.Input, Text: cells[i], Unit: c.Unit})
	}
	for i, g := range given {
		unc, ok := uncs[g.Name]
		if !ok {
			continue
		}
		given[i] = WithUncertainty(given[i], unc)
	}
	return RunProcess(kind, given, opt, uo)
}

// ParseUncertaintyList reads one uncertainty for each of several whole
// columns, as a --u flag gives them: "p=0.2bar,t=0.5K" or "p1=0.1bar,
// t1=0.6K,p2=0.5%". It returns each input name (lower case) with its
// uncertainty text, for WithUncertainty. Each text is checked when it
// meets its value; here only the form is.
func ParseUncertaintyList(list string) (map[string]string, error) {
	out := map[string]string{}
	for item := range strings.SplitSeq(list, ",") {
		item = strings.TrimSpace(item)
		if item == "" {
			continue
		}
		name, unc, ok := strings.Cut(item, "=")
		name, unc = strings.ToLower(strings.TrimSpace(name)), strings.TrimSpace(unc)
		sym := strings.TrimRight(name, "0123456789")
		_, known := InputQuantity(sym)
		if !ok || unc == "" || !(known || sym == "m") {
			return nil, &Error{Param: name, Kind: ErrUncertainty, Msg: fmt.Sprintf(
				"%s is not name=uncertainty; write e.g. p=0.2bar,t=0.5K", quote(item))}
		}
		if _, dup := out[name]; dup {
			return nil, &Error{Param: name, Kind: ErrUncertainty, Msg: fmt.Sprintf("the uncertainty of %s is given twice", name)}
		}
		out[name] = unc
	}
	return out, nil
}

// appendJSONStrings writes ss as a JSON array of strings.
func appendJSONStrings(b []byte, ss []string) []byte {
	b = append(b, '[')
	for i, s := range ss {
		if i > 0 {
			b = append(b, ',')
		}
		b = AppendJSONString(b, s)
	}
	return append(b, ']')
}
