package point

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"

	"steamcell/fn"
	"steamcell/fn/units"
)

// Kinds of point error (besides the *units.InputError and *fn.InputError
// that Read and Solve pass on).
var (
	// ErrInputCount: not exactly two inputs.
	ErrInputCount = errors.New("two inputs needed")
	// ErrUnknownInput: an input name that is no property one can give.
	ErrUnknownInput = errors.New("unknown input")
	// ErrUnknownProperty: an output property that does not exist.
	ErrUnknownProperty = errors.New("unknown property")
	// ErrUndefined: a property asked for by name has no value for this
	// state (cp of a saturated mixture, x of superheated vapour).
	ErrUndefined = errors.New("not defined for this state")
	// ErrRepeatedInput: one property given twice ("p" and "pressure", two
	// columns of pressure in a batch).
	ErrRepeatedInput = errors.New("input given twice")
	// ErrHeader: a table header that cannot be read without guessing
	// ("P [kPa] gauge", "Pressure (drum)" with no unit anywhere).
	ErrHeader = errors.New("header cannot be read")
	// ErrMap: a column map that cannot be read.
	ErrMap = errors.New("bad column map")
)

// Error is the problem with a request that the caller must change
// (fn.ParamError: which parameter, what kind, what to change).
type Error = fn.ParamError

// inputNames maps the names a user may give an input by (lower case) to the
// quantity.
var inputNames = map[string]fn.Quantity{
	"p": fn.Pressure, "pressure": fn.Pressure,
	"t": fn.Temperature, "temp": fn.Temperature, "temperature": fn.Temperature,
	"h": fn.Enthalpy, "enthalpy": fn.Enthalpy,
	"s": fn.Entropy, "entropy": fn.Entropy,
	"v": fn.Volume, "specific volume": fn.Volume, "volume": fn.Volume,
	"rho": fn.Density, "ρ": fn.Density, "density": fn.Density,
	"u": fn.InternalEnergy, "internal energy": fn.InternalEnergy,
	"x": fn.Quality, "quality": fn.Quality, "dryness": fn.Quality, "dryness fraction": fn.Quality,
}

// InputQuantity returns the quantity an input name stands for ("p", "T",
// "pressure", "quality", …; case-insensitive).
func InputQuantity(name string) (fn.Quantity, bool) {
	q, ok := inputNames[strings.ToLower(strings.TrimSpace(name))]
	return q, ok
}

// InputNames returns the short input names: p, t, h, s, v, rho, u, x.
func InputNames() []string { return []string{"p", "t", "h", "s", "v", "rho", "u", "x"} }

// DimOf returns the units quantity of an input quantity.
func DimOf(q fn.Quantity) units.Dim {
	switch q {
	case fn.Pressure:
		return units.Pressure
	case fn.Temperature:
		return units.Temperature
	case fn.Enthalpy, fn.InternalEnergy:
		return units.SpecificEnergy
	case fn.Entropy:
		return units.SpecificEntropy
	case fn.Volume:
		return units.SpecificVolume
	case fn.Density:
		return units.Density
	case fn.Quality:
		return units.Quality
	}
	return 0
}

// Given is one input as a user gave it.
type Given struct {
	Name string // as typed: "p", "T", "pressure"
	Text string // the value with an optional unit: "6 barg", "330C", "0.9"
	Unit string // a unit given apart from the text (a column header, unit_p=); may be empty

	q fn.Quantity // what Name names, when a column plan has read it already (Column.Given)
}

// Options are the user's choices that apply to a whole point.
type Options struct {
	Set  units.Set // units of bare numbers and of the answer; the zero Set is "si"
	Patm float64   // atmospheric pressure for gauge units, MPa; 0 is the standard atmosphere

	typed [2]units.Unit // the units the inputs were typed in, for the figures of messages (withTyped)
}

// read turns exactly two given inputs into the engine's inputs, with the
// unit each was read in (the units package's own, not to be changed).
func read(given []Given, opt *Options) ([2]fn.Input, [2]*units.Unit, error) {
	var out [2]fn.Input
	var us [2]*units.Unit
	if len(given) != 2 {
		var names []string
		for _, g := range given {
			names = append(names, g.Name)
		}
		msg := fmt.Sprintf("give exactly two inputs out of %s; got %d", strings.Join(InputNames(), ", "), len(given))
		if len(names) > 0 {
			msg += " (" + strings.Join(names, ", ") + ")"
		}
		return out, us, &Error{Kind: ErrInputCount, Msg: msg}
	}
	uo := units.Options{Set: opt.Set, Patm: opt.Patm}
	for i := range given {
		g := &given[i]
		q, ok := g.q, g.q != 0
		if !ok {
			q, ok = InputQuantity(g.Name)
		}
		if !ok {
			return out, us, &Error{Param: g.Name, Kind: ErrUnknownInput,
				Msg: fmt.Sprintf("%s is not an input; inputs are %s", quote(g.Name), strings.Join(InputNames(), ", "))}
		}
		uo.Name, uo.Unit = g.Name, g.Unit
		v, u, err := units.ParseUnitRef(g.Text, DimOf(q), &uo)
		if err != nil {
			return out, us, err
		}
		out[i], us[i] = fn.Input{Q: q, Value: v}, u
	}
	if out[0].Q == out[1].Q {
		return out, us, &Error{Param: given[1].Name, Kind: ErrRepeatedInput,
			Msg: fmt.Sprintf("%s and %s are the same property; give two different ones", given[0].Name, given[1].Name)}
	}
	return out, us, nil
}

// Solve reads two given inputs and solves the state. An error of the
// engine about an input is told in the units the inputs were typed in.
func Solve(given []Given, opt Options) (fn.State, [2]fn.Input, error) {
	st, in, _, err := solve(given, opt)
	return st, in, err
}

// Typed returns opt with the units the given inputs are typed in, so that
// an answer's warnings (Render) give their figures in them: Ts in °C when
// T came in °C, p in bar when p came in bar. Inputs that cannot be read
// leave opt as it is.
func (opt Options) Typed(given []Given) Options {
	in, us, err := read(given, &opt)
	if err != nil {
		return opt
	}
	return opt.withTyped(in, values(us))
}

// solve is Solve, also giving the units the inputs were typed in.
func solve(given []Given, opt Options) (fn.State, [2]fn.Input, [2]*units.Unit, error) {
	var st fn.State
	in, us, err := solveInto(&st, given, &opt)
	return st, in, us, err
}

// solveInto is solve writing the state into st, for a caller that keeps
// one State from point to point (Plan.Row).
func solveInto(st *fn.State, given []Given, opt *Options) ([2]fn.Input, [2]*units.Unit, error) {
	in, us, err := read(given, opt)
	if err != nil {
		return in, us, err
	}
	*st, err = fn.Solve(in[0], in[1])
	if err == nil {
		return in, us, nil // before errors.As, whose target costs an allocation
	}
	var ie *fn.InputError
	if errors.As(err, &ie) {
		err = userError(ie, given, in, opt.withTyped(in, values(us)))
	}
	return in, us, err
}

// inUserUnits is an input error of the engine told in the user's units; it
// unwraps to the engine's error and so to its kind.
type inUserUnits struct {
	msg string
	err *fn.InputError
}

func (e *inUserUnits) Error() string { return e.msg }
func (e *inUserUnits) Unwrap() error { return e.err }

// userError tells ie in the units of fo (the point's, with the units its
// inputs were typed in), and echoes the input as the user gave it.
func userError(ie *fn.InputError, given []Given, in [2]fn.Input, fo Options) error {
	msg := ie.Text(func(f fn.Figure) string { return fo.figureText(f.Q, f.V, f.Diff) })
	if !ie.Pair {
		for i, g := range given {
			if in[i].Q == ie.Q {
				msg += " (given as " + g.Name + "=" + strings.TrimSpace(g.Text+" "+g.Unit) + ")"
				break
			}
		}
	}
	return &inUserUnits{msg: msg, err: ie}
}

// quote quotes a name for a message, keeping invalid UTF-8 and control
// characters out of it.
func quote(s string) string {
	if len(s) > 40 {
		s = s[:40] + "…"
	}
	if !utf8.ValidString(s) {
		s = strings.ToValidUTF8(s, "?")
	}
	return strconv.Quote(s)
}

// Field is one property of an answer, in the user's units.
type Field struct {
	Symbol  string
	Name    string
	Value   float64 // in Unit; meaningful when Defined
	Unit    string  // label of the unit; "" for a pure number
	Defined bool

	idx int // index in the catalogue
}

// Answer is a solved state written in the user's units. An Answer that
// Plan.Fill writes again and again reuses its memory.
type Answer struct {
	Phase    string
	Region   int
	Fields   []Field
	Warnings []string
	Set      string // name of the unit set

	st     fn.State // the state Plan.Row solved
	w      view     // the state being written, with its transport properties
	joined []byte   // scratch for the warnings of a CSV cell

	phase fn.Phase              // the phase Phase names, when a plan filled the answer
	plan  *Plan                 // the plan that filled the answer
	mask  [maxProps / 64]uint64 // which columns of plan have a value
	units unitsCache            // the last "units" written
}

// Formulation is the name of the formulation every answer comes from.
const Formulation = "IAPWS-IF97"

// Symbols checks a list of property symbols (e.g. from get=h,s) and returns
// them in canonical form; "all" stands for every property. phase and
// region, which every answer has apart from its fields, are accepted and
// left out. An empty list gives nil, which Render reads as the default
// properties; a list of phase or region alone gives an empty list.
func Symbols(list []string) ([]string, error) {
	out := make([]string, 0, len(list))
	named := false
	for _, s := range list {
		s = strings.TrimSpace(s)
		if s == "" {
			continue
		}
		named = true
		if strings.EqualFold(s, "all") {
			out = append(out, fieldSymbols()...)
			continue
		}
		p, ok := Lookup(s)
		if !ok {
			return nil, &Error{Param: s, Kind: ErrUnknownProperty,
				Msg: fmt.Sprintf("%s is not a property; properties are %s", quote(s), strings.Join(allSymbols(), ", "))}
		}
		if !p.Always {
			out = append(out, p.Symbol)
		}
	}
	if !named {
		return nil, nil
	}
	return out, nil
}

// allSymbols lists every symbol of the catalogue, phase and region first.
func allSymbols() []string {
	var s []string
	for _, p := range catalogue {
		s = append(s, p.Symbol)
	}
	return s
}

// fieldSymbols lists the symbols of the properties that are fields of an
// answer: all but phase and region.
func fieldSymbols() []string {
	var s []string
	for _, p := range catalogue {
		if !p.Always {
			s = append(s, p.Symbol)
		}
	}
	return s
}

// Render writes state st as the properties syms (checked by Symbols) in the
// units of opt.Set. Properties asked for that have no value for this state
// are returned with Defined false. With syms nil, Render gives the default
// properties that have a value here (DefaultSymbols). Warnings of the state
// and of its transport properties (when asked for) are passed on. Render
// is Fill with a plan of one; many points are written faster with one Plan.
func Render(st *fn.State, syms []string, opt Options) Answer {
	var a Answer
	NewPlan(syms, opt).Fill(st, &a)
	return a
}

// Value returns the field of symbol sym, or an error saying why it has no
// value for this state.
func (a *Answer) Value(sym string) (Field, error) {
	for _, f := range a.Fields {
		if f.Symbol == sym {
			if !f.Defined {
				return f, &Error{Param: sym, Kind: ErrUndefined,
					Msg: fmt.Sprintf("%s (%s) is not defined for this state (%s)", sym, f.Name, a.Phase)}
			}
			return f, nil
		}
	}
	return Field{}, &Error{Param: sym, Kind: ErrUnknownProperty, Msg: fmt.Sprintf("%s was not computed", quote(sym))}
}

func equalFold(a, b string) bool { return strings.EqualFold(a, b) }
