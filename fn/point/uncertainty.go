package point

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/uncertain"
	"steamcell/fn/units"
)

// ErrUncertainty: the text after ± is not an uncertainty (not a number, a
// negative one, a unit of another quantity).
var ErrUncertainty = errors.New("bad uncertainty")

// UOptions are a request's choices about uncertainties.
type UOptions struct {
	// Convention says what the numbers after ± stand for.
	Convention uncertain.Convention
	// K is the coverage factor of the expanded uncertainty the answer
	// adds (JCGM 100:2008 6.2.1, U = k·u); 0 adds none.
	K float64
}

// plusMinus are the ways to write ±; "+-" and "+/-" for keyboards
// without it.
var plusMinus = []string{"±", "+/-", "+-"}

// SplitUncertainty splits an input's text at ±: "100bar±0.2bar" is
// ("100bar", "0.2bar", true); "+-" and "+/-" stand for ±. Text without ±
// is (text, "", false).
func SplitUncertainty(text string) (value, unc string, ok bool) {
	for _, pm := range plusMinus {
		if i := strings.Index(text, pm); i >= 0 {
			return strings.TrimSpace(text[:i]), strings.TrimSpace(text[i+len(pm):]), true
		}
	}
	return text, "", false
}

// ParseUncertainty reads the text after ± for an input of quantity d read
// as x (base units) in unit vu as typed (value, the number before ±, in
// that unit), and returns the standard uncertainty in base units under
// convention c. The text is a size with a unit of d ("0.2bar", "0.5K",
// "0.9F", a difference: no zero point, no atmosphere), a bare number in
// the value's unit, or a percentage of the value as typed ("0.25%": of
// 100 bar, of 6 barg, of 500 °C).
func ParseUncertainty(name, unc string, d units.Dim, value float64, vu units.Unit, opt Options, c uncertain.Convention) (float64, error) {
	bad := func(format string, args ...any) error {
		return &Error{Param: name, Kind: ErrUncertainty, Msg: fmt.Sprintf("%s: ", name) + fmt.Sprintf(format, args...)}
	}
	if unc == "" {
		return 0, bad("nothing after ±; write the uncertainty after it, e.g. %s=100bar±0.2bar or ±0.25%%", name)
	}
	var size float64
	if num, ok := strings.CutSuffix(unc, "%"); ok {
		r, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
		if err != nil || math.IsNaN(r) || math.IsInf(r, 0) {
			return 0, bad("%q is not a percentage", unc)
		}
		size = math.Abs(r/100*value) * unitScale(vu, opt.Patm)
		if r < 0 {
			return 0, bad("an uncertainty is not negative: %q", unc)
		}
	} else {
		num, unitText := splitLeadingNumber(unc)
		a, err := strconv.ParseFloat(num, 64)
		if err != nil || math.IsNaN(a) || math.IsInf(a, 0) {
			return 0, bad("%q is not an uncertainty; write a number with an optional unit, e.g. 0.2bar, 0.5K or 0.25%%", unc)
		}
		if a < 0 {
			return 0, bad("an uncertainty is not negative: %q", unc)
		}
		u := vu
		if unitText != "" {
			if u, err = units.Lookup(unitText, d); err != nil {
				return 0, bad("the uncertainty %q: %v", unc, err)
			}
		}
		size = a * unitScale(u, opt.Patm)
	}
	return c.ToStandard(size), nil
}

// splitLeadingNumber splits "0.2bar" into "0.2" and "bar": the longest
// leading run of characters a decimal number can hold.
func splitLeadingNumber(s string) (num, unit string) {
	i := 0
	for i < len(s) && strings.IndexByte("0123456789.+-eE", s[i]) >= 0 {
		// An e that starts a unit word ("e" is no unit; "eV" is not one of
		// ours) ends the number unless a digit or sign follows it.
		if (s[i] == 'e' || s[i] == 'E') && (i+1 >= len(s) || strings.IndexByte("0123456789+-", s[i+1]) < 0) {
			break
		}
		i++
	}
	return s[:i], strings.TrimSpace(s[i:])
}

// unitScale is the size of one unit u in base units (its zero point and
// any atmosphere left out): 1 for K and °C, 5/9 for °F, 0.1 for bar.
func unitScale(u units.Unit, patm float64) float64 {
	return u.ToBase(1, patm) - u.ToBase(0, patm)
}

// Measured is a state solved from inputs that may carry uncertainties.
type Measured struct {
	State  uncertain.State
	Budget *uncertain.Budget
	Inputs [2]fn.Input
	// Given reports whether any input carried an uncertainty.
	Given bool
}

// SolveMeasured reads two given inputs, each of which may carry "±u", and
// solves the state with the sensitivities of its properties. Without any
// ± it is Solve: State.State is the state, with no sensitivities and an
// empty budget (Given false).
func SolveMeasured(given []Given, opt Options, uo UOptions) (Measured, error) {
	plain := make([]Given, len(given))
	uncs := make([]string, len(given))
	has := make([]bool, len(given))
	any := false
	for i, g := range given {
		plain[i] = g
		plain[i].Text, uncs[i], has[i] = SplitUncertainty(g.Text)
		any = any || has[i]
	}
	st, in, err := Solve(plain, opt)
	if err != nil {
		return Measured{}, err
	}
	if !any {
		return Measured{State: uncertain.State{State: st}, Budget: &uncertain.Budget{}, Inputs: in}, nil
	}
	_, us, _ := read(plain, &opt)
	m := Measured{Budget: &uncertain.Budget{}, Inputs: in, Given: any}
	var ins [2]uncertain.Input
	for i, g := range plain {
		u := 0.0
		if has[i] {
			vu := values(us)[i]
			typed := vu.FromBase(in[i].Value, opt.Patm)
			if u, err = ParseUncertainty(g.Name, uncs[i], DimOf(in[i].Q), typed, vu, opt, uo.Convention); err != nil {
				return Measured{}, err
			}
		}
		q := in[i].Q
		ins[i] = uncertain.Input{Q: q, N: m.Budget.Input(q.Symbol(), in[i].Value, u)}
	}
	if m.State, err = uncertain.Linearise(st, ins[0], ins[1]); err != nil {
		return Measured{}, err
	}
	return m, nil
}

// Uncertainty is the uncertainty part of an answer, in the answer's units.
type Uncertainty struct {
	Convention uncertain.Convention
	K          float64            // coverage factor of Expanded; 0 when none was asked for
	U          map[string]float64 // symbol → standard uncertainty, in the unit of the value
	Order      []string           // the symbols of U in the answer's order
	Warnings   []string           // phase uncertain, linear estimate unreliable

	// marginChecked: the phase check ran on an uncertain distance from
	// the saturation line, which then replaces the fixed-margin warning.
	marginChecked bool
}

// Merge returns the warnings of an answer with those of its
// uncertainty. Where the phase check ran on the inputs' uncertainties,
// it replaces the state's fixed-margin warning ("within 0.5 K of
// saturation"), as the uncertainty says more precisely whether the phase
// is in doubt.
func (u *Uncertainty) Merge(warnings []string) []string {
	out := make([]string, 0, len(warnings)+len(u.Warnings))
	for _, w := range warnings {
		if u.marginChecked && isFixedMargin(w) {
			continue
		}
		out = append(out, w)
	}
	return append(out, u.Warnings...)
}

// isFixedMargin reports whether w is the engine's fixed-margin warning
// near saturation.
func isFixedMargin(w string) bool {
	return strings.HasPrefix(w, "within ") && strings.Contains(w, " K of saturation")
}

// analytic are the properties whose sensitivities come from the analytic
// Jacobian; the rest are differenced (uncertain.State.Numeric).
var analytic = map[string]func(*uncertain.State) uncertain.Number{
	"p":   func(s *uncertain.State) uncertain.Number { return s.P },
	"t":   func(s *uncertain.State) uncertain.Number { return s.T },
	"v":   func(s *uncertain.State) uncertain.Number { return s.V },
	"rho": func(s *uncertain.State) uncertain.Number { return s.Rho },
	"u":   func(s *uncertain.State) uncertain.Number { return s.U },
	"h":   func(s *uncertain.State) uncertain.Number { return s.H },
	"s":   func(s *uncertain.State) uncertain.Number { return s.S },
	"g":   func(s *uncertain.State) uncertain.Number { return s.G },
	"f":   func(s *uncertain.State) uncertain.Number { return s.F },
	"x":   func(s *uncertain.State) uncertain.Number { return s.X },
}

// RenderUncertainty gives every defined numeric field of ans its standard
// uncertainty in the field's unit, with the phase and linearity warnings.
func RenderUncertainty(m *Measured, ans *Answer, opt Options, uo UOptions) Uncertainty {
	out := Uncertainty{Convention: uo.Convention, K: uo.K, U: map[string]float64{}}
	s := &m.State
	var checked []uncertain.Number
	var checkedSyms []string
	for _, f := range ans.Fields {
		if !f.Defined {
			continue
		}
		p, _ := Lookup(f.Symbol)
		var n uncertain.Number
		if get, ok := analytic[p.Symbol]; ok && (p.Symbol != "x" || s.HasX) {
			n = get(s)
			checked = append(checked, n)
			checkedSyms = append(checkedSyms, p.Symbol)
		} else {
			var ok bool
			n, ok = s.Numeric(func(st *fn.State) (float64, bool) { return p.get(&view{st: st}) })
			if !ok {
				continue
			}
		}
		unit := opt.Set.Unit(p.Dim)
		out.U[p.Symbol] = m.Budget.U(n) / unitScale(unit, opt.Patm)
		out.Order = append(out.Order, p.Symbol)
	}
	r := uncertain.Phase(m.Budget, s)
	out.marginChecked = r.U > 0
	if r.Uncertain {
		out.Warnings = append(out.Warnings, r.Text)
	}
	lin := uncertain.Linearity(m.Budget, checked, func(x []float64) ([]float64, error) {
		st, err := fn.Solve(engineInput(m.Inputs[0].Q, x[0]), engineInput(m.Inputs[1].Q, x[1]))
		if err != nil {
			return nil, err
		}
		ls, err := uncertain.Linearise(st, uncertain.Input{Q: m.Inputs[0].Q, N: uncertain.Const(x[0])}, uncertain.Input{Q: m.Inputs[1].Q, N: uncertain.Const(x[1])})
		if err != nil {
			return nil, err
		}
		vals := make([]float64, len(checkedSyms))
		for i, sym := range checkedSyms {
			vals[i] = math.NaN()
			if sym != "x" || ls.HasX {
				vals[i] = analytic[sym](&ls).Value
			}
		}
		return vals, nil
	})
	var bad []string
	for i, r := range lin {
		if r > uncertain.LinearityLimit {
			bad = append(bad, checkedSyms[i])
		}
	}
	if len(bad) > 0 {
		out.Warnings = append(out.Warnings, uncertain.NonlinearText(bad))
	}
	return out
}

// engineInput is the engine's input for a budget value (ρ stays ρ).
func engineInput(q fn.Quantity, v float64) fn.Input { return fn.Input{Q: q, Value: v} }

// InternalEnergyKey is the key internal energy takes in a JSON answer that
// carries uncertainties: "u" is then the member of uncertainties.
const InternalEnergyKey = "e"

// AppendMeasuredJSON appends the answer with its uncertainties: the flat
// object of AppendJSON with the internal energy under "e" (its symbol u
// names the member of uncertainties), and the members
//
//	"u": {symbol: standard uncertainty in the value's unit}
//	"U": {symbol: expanded uncertainty k·u}          (when k was asked for)
//	"uncertainty": {"convention", "k", "method", "internal_energy_key"}
//
// The warnings of the uncertainty join the answer's (Merge).
func (a *Answer) AppendMeasuredJSON(b []byte, inputs []Input, caution string, unc *Uncertainty) []byte {
	c := *a
	c.Fields = append([]Field(nil), a.Fields...)
	c.plan = nil // the units block is written anew, not from the cache of a's keys
	for i := range c.Fields {
		if c.Fields[i].Symbol == "u" {
			c.Fields[i].Symbol = InternalEnergyKey
		}
	}
	c.Warnings = unc.Merge(a.Warnings)
	b = c.AppendJSON(b, inputs, caution)
	b = b[:len(b)-1] // reopen the object
	member := func(name string, scale float64) {
		b = append(b, `,"`+name+`":{`...)
		for i, sym := range unc.Order {
			if i > 0 {
				b = append(b, ',')
			}
			key := sym
			if key == "u" {
				key = InternalEnergyKey
			}
			b = AppendJSONString(b, key)
			b = append(b, ':')
			b = AppendNumber(b, scale*unc.U[sym])
		}
		b = append(b, '}')
	}
	member("u", 1)
	if unc.K > 0 {
		member("U", unc.K)
	}
	b = append(b, `,"uncertainty":{"convention":`...)
	b = AppendJSONString(b, unc.Convention.Name())
	b = append(b, `,"applied":`...)
	b = AppendJSONString(b, unc.Convention.String())
	if unc.K > 0 {
		b = append(b, `,"k":`...)
		b = AppendNumber(b, unc.K)
	}
	b = append(b, `,"method":`...)
	b = AppendJSONString(b, uncertain.Method)
	b = append(b, `,"internal_energy_key":`...)
	b = AppendJSONString(b, InternalEnergyKey)
	return append(b, "}}"...)
}

// UncertaintyHeader reads a column header that holds the uncertainty of
// an input column: "u(p) [bar]", "u(T1) (K)", "u(p2)", "u(h) [kJ/kg]".
// It returns the input's name as written inside the parentheses ("p",
// "T1") and the unit ("bar"; "" when the header gives none, meaning the
// unit of the input's own column). Other headers are no match.
func UncertaintyHeader(text string) (input, unit string, ok bool) {
	t := strings.TrimSpace(text)
	if len(t) < 4 || (t[0] != 'u' && t[0] != 'U') || t[1] != '(' {
		return "", "", false
	}
	end := strings.IndexByte(t, ')')
	if end < 0 {
		return "", "", false
	}
	input = strings.TrimSpace(t[2:end])
	rest := strings.TrimSpace(t[end+1:])
	if rest != "" {
		open, close := rest[0], byte(0)
		switch open {
		case '[':
			close = ']'
		case '(':
			close = ')'
		default:
			return "", "", false
		}
		if rest[len(rest)-1] != close {
			return "", "", false
		}
		unit = strings.TrimSpace(rest[1 : len(rest)-1])
	}
	sym := strings.ToLower(strings.TrimRight(input, "0123456789"))
	if _, known := InputQuantity(sym); !known && sym != "m" {
		return "", "", false
	}
	return input, unit, true
}
