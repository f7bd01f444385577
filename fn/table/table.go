package table

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/if97"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Limits of one table.
const (
	MaxRows      = 5000 // rows of one table: far more than a printed table, few enough to answer at once
	MaxPressures = 20   // pressures of one superheat table
)

// Kinds of table error besides those of fn/units and fn/point, passed on.
var (
	// ErrTooManyRows: the range and step give more rows than MaxRows.
	ErrTooManyRows = errors.New("too many rows")
	// ErrBadRange: a range or step missing, not positive, or of the wrong
	// quantity.
	ErrBadRange = errors.New("bad table range")
)

// Error is the problem with a request that the caller must change
// (fn.ParamError: which parameter, what kind, what to change).
type Error = fn.ParamError

func errorf(kind error, param, format string, args ...any) *Error {
	return fn.ParamErrorf(kind, param, format, args...)
}

// Spec is a table as asked for, every value as text with its unit (bare
// numbers in the unit set of the options).
type Spec struct {
	From, To, Step string   // the range of the varied quantity
	P              string   // superheat table: pressures, comma-separated; "" for a saturation table
	Get            []string // properties; nil: those of the kind of table
}

// Kinds of table.
const (
	SaturationByP = "saturation by pressure"
	SaturationByT = "saturation by temperature"
	Superheat     = "superheat"
)

// Properties of each kind of table when get= asks for none: the
// saturated liquid (f), vapour (g) and their differences (fg), or the
// single-phase state.
var (
	saturationDefault = []string{"vf", "vg", "uf", "ug", "hf", "hfg", "hg", "sf", "sfg", "sg"}
	superheatDefault  = []string{"v", "u", "h", "s"}
)

// Table is a steam table in the user's units.
type Table struct {
	Kind    string
	Title   string // "Saturation by pressure, 1 bar to 20 bar"
	Columns []Column
	Rows    []Row
	UnitSet string
}

// Column is one column: a property, its name in words and its unit label
// ("" for a pure number).
type Column struct{ Symbol, Name, Unit string }

// Header returns the column's header cell: "h [kJ/kg]", or "x" for a pure
// number, the form the workbook and /batch headers take.
func (c Column) Header() string {
	if c.Unit == "" {
		return c.Symbol
	}
	return c.Symbol + " [" + c.Unit + "]"
}

// Row is one row: the state's phase, its values in column order, and its
// status: "ok", or why the row has no values.
type Row struct {
	Phase  string
	Fields []point.Field
	Status string
}

// StatusOK is the status of a computed row.
const StatusOK = "ok"

// Build computes the table spec asks for.
func Build(spec Spec, opt point.Options) (*Table, error) {
	if spec.From == "" || spec.To == "" || spec.Step == "" {
		return nil, errorf(ErrBadRange, "from", "give the range as from, to and step with units: from=1bar&to=20bar&step=1bar (by pressure), from=100C&to=200C&step=5C (by temperature), or p=10bar&from=200C&to=500C&step=50C (superheat)")
	}
	if spec.P != "" {
		return buildSuperheat(spec, opt)
	}
	dim, err := rangeDim(spec.From)
	if err != nil {
		return nil, err
	}
	vals, err := grid(spec, dim, opt)
	if err != nil {
		return nil, err
	}
	t := &Table{Kind: SaturationByP, UnitSet: opt.Set.Name()}
	lead := []string{"p", "t"}
	if dim == units.Temperature {
		t.Kind, lead = SaturationByT, []string{"t", "p"}
	}
	syms, err := columns(lead, spec.Get, saturationDefault)
	if err != nil {
		return nil, err
	}
	t.setColumns(syms, opt)
	t.Title = fmt.Sprintf("%s, %s to %s in steps of %s", capital(t.Kind), spec.From, spec.To, spec.Step)
	for _, v := range vals {
		var st fn.State
		if dim == units.Pressure {
			st, err = fn.FromPX(v, 0)
		} else {
			st, err = fn.FromTX(v, 0)
		}
		t.addRow(&st, err, syms, opt, "saturation line")
	}
	return t, nil
}

// buildSuperheat computes a superheat table: for each pressure, the
// saturated vapour at Ts (below the critical pressure), then the states
// at each temperature of the range.
func buildSuperheat(spec Spec, opt point.Options) (*Table, error) {
	var ps []float64
	for item := range strings.SplitSeq(spec.P, ",") {
		if item = strings.TrimSpace(item); item == "" {
			continue
		}
		p, err := units.Parse(item, units.Pressure, units.Options{Name: "p", Set: opt.Set, Patm: opt.Patm})
		if err != nil {
			return nil, err
		}
		ps = append(ps, p)
	}
	if len(ps) == 0 || len(ps) > MaxPressures {
		return nil, errorf(ErrBadRange, "p", "a superheat table takes 1 to %d pressures, comma-separated (p=1bar,10bar,40bar); got %d", MaxPressures, len(ps))
	}
	if dim, err := rangeDim(spec.From); err == nil && dim != units.Temperature {
		return nil, errorf(ErrBadRange, "from", "a superheat table runs over temperature at the pressures of p=; give from, to and step as temperatures (from=200C&to=500C&step=50C)")
	}
	temps, err := gridCount(spec, units.Temperature, opt, len(ps))
	if err != nil {
		return nil, err
	}
	syms, err := columns([]string{"p", "t"}, spec.Get, superheatDefault)
	if err != nil {
		return nil, err
	}
	t := &Table{Kind: Superheat, UnitSet: opt.Set.Name()}
	t.setColumns(syms, opt)
	t.Title = fmt.Sprintf("Superheated vapour at %s, %s to %s in steps of %s", spec.P, spec.From, spec.To, spec.Step)
	for _, p := range ps {
		if p < if97.Pc && p >= fn.PMinSat {
			st, err := fn.FromPX(p, 1)
			t.addRow(&st, err, syms, opt, "")
		}
		for _, T := range temps {
			st, err := fn.FromPT(p, T)
			t.addRow(&st, err, syms, opt, "")
		}
	}
	return t, nil
}

// columns returns the table's properties: the leading ones, then those
// asked for (or the default), each once.
func columns(lead, get, def []string) ([]string, error) {
	syms := def
	if get != nil {
		var err error
		if syms, err = point.Symbols(get); err != nil {
			return nil, err
		}
	}
	out := slices.Clone(lead)
	for _, s := range syms {
		if !slices.Contains(out, s) {
			out = append(out, s)
		}
	}
	return out, nil
}

func (t *Table) setColumns(syms []string, opt point.Options) {
	for _, s := range syms {
		p, _ := point.Lookup(s)
		t.Columns = append(t.Columns, Column{Symbol: p.Symbol, Name: p.Name, Unit: opt.Set.Unit(p.Dim).Name})
	}
}

// addRow renders one state through point.Render, or keeps the row's
// place with the error as its status.
func (t *Table) addRow(st *fn.State, err error, syms []string, opt point.Options, phase string) {
	if err != nil {
		t.Rows = append(t.Rows, Row{Fields: make([]point.Field, len(syms)), Status: err.Error()})
		return
	}
	ans := point.Render(st, syms, opt)
	if phase == "" {
		phase = ans.Phase
	}
	t.Rows = append(t.Rows, Row{Phase: phase, Fields: ans.Fields, Status: StatusOK})
}

// rangeDim tells a pressure range from a temperature range by the unit
// of its first end.
func rangeDim(from string) (units.Dim, error) {
	for _, d := range []units.Dim{units.Pressure, units.Temperature} {
		if _, u, err := units.ParseUnit(from, d, units.Options{Name: "from"}); err == nil && hasUnit(from, u) {
			return d, nil
		}
	}
	return 0, errorf(ErrBadRange, "from", "from=%s: give the first end of the range with a pressure unit (from=1bar: a table by pressure) or a temperature unit (from=100C: by temperature)", clip(from))
}

// hasUnit reports whether text names its unit (a bare number takes the
// set's unit, which cannot tell the quantity).
func hasUnit(text string, u units.Unit) bool {
	_, err := strconv.ParseFloat(strings.TrimSpace(text), 64)
	return err != nil && u.Name != ""
}

func clip(s string) string {
	if len(s) > 40 {
		return s[:40] + "…"
	}
	return s
}

func capital(s string) string { return strings.ToUpper(s[:1]) + s[1:] }

// grid returns the values of the range in base units.
func grid(spec Spec, d units.Dim, opt point.Options) ([]float64, error) {
	return gridCount(spec, d, opt, 1)
}

// gridCount returns the values from, from+step, … up to to (or down to
// it, when to is below from) in base units, refusing more than MaxRows
// rows when each value gives per rows. The values are stepped in the unit
// of from and rounded to 12 significant figures, so that 1 bar in steps
// of 0.1 bar gives 1.3 bar, not 1.3000000000000003.
func gridCount(spec Spec, d units.Dim, opt point.Options, per int) ([]float64, error) {
	uo := func(name string) units.Options { return units.Options{Name: name, Set: opt.Set, Patm: opt.Patm} }
	from, fu, err := units.ParseUnit(spec.From, d, uo("from"))
	if err != nil {
		return nil, err
	}
	to, err := units.Parse(spec.To, d, uo("to"))
	if err != nil {
		return nil, err
	}
	stepV, su, err := units.ParseUnit(spec.Step, d, uo("step"))
	if errors.Is(err, units.ErrNegativeAbsolute) || errors.Is(err, units.ErrPressureNotPositive) {
		err = errorf(ErrBadRange, "step", "step=%s: the step must be above zero (a falling table runs from the high end: from=20bar&to=1bar&step=1bar)", clip(spec.Step))
	}
	if err != nil {
		return nil, err
	}
	// The step is a difference: its unit's zero point (°C, barg) drops
	// out. In the unit of from it is:
	stepBase := stepV - su.ToBase(0, opt.Patm)
	step := fu.FromBase(fu.ToBase(0, opt.Patm)+stepBase, opt.Patm)
	if !(stepBase > 0) || math.IsInf(step, 0) {
		return nil, errorf(ErrBadRange, "step", "step=%s: the step must be above zero (a falling table runs from the high end: from=20bar&to=1bar&step=1bar)", clip(spec.Step))
	}
	v0 := fu.FromBase(from, opt.Patm)
	v1 := fu.FromBase(to, opt.Patm)
	if v1 < v0 {
		step = -step
	}
	span := (v1 - v0) / step
	n := int(math.Floor(span+1e-9)) + 1
	if span+1 > float64(MaxRows) || n*per > MaxRows {
		return nil, errorf(ErrTooManyRows, "step", "the table would have %.0f rows; the limit is %d: take a larger step or a shorter range", math.Floor(span+1e-9)*float64(per)+float64(per), MaxRows)
	}
	out := make([]float64, n)
	for i := range out {
		v, _ := strconv.ParseFloat(strconv.FormatFloat(v0+float64(i)*step, 'g', 12, 64), 64)
		out[i] = fu.ToBase(v, opt.Patm)
	}
	return out, nil
}
