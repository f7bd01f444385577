package process

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/if97"
	"steamcell/fn/uncertain"
	"steamcell/fn/units"
)

// Kinds of process error; test for them with errors.Is.
var (
	// ErrKind: a process kind that does not exist.
	ErrKind = errors.New("unknown process")
	// ErrInput: an input that is missing, unknown, repeated or not allowed
	// for this kind.
	ErrInput = errors.New("bad process input")
	// ErrRefused: the inputs are well formed but the process cannot give
	// its results from them (a throttling calorimeter whose upstream steam
	// is not wet, an expansion whose end pressure is above its start).
	ErrRefused = errors.New("process refused")
)

// Error is the problem with a request that the caller must change
// (fn.ParamError: which parameter, what kind, what to change).
type Error = fn.ParamError

func errorf(kind error, param, format string, args ...any) *Error {
	return fn.ParamErrorf(kind, param, format, args...)
}

// Value is one raw input: its name ("p1", "m2"), its value in base units
// and its standard uncertainty (0 when none was given).
type Value struct {
	Name string
	X, U float64
}

// Result is one result of a process with its standard uncertainty.
type Result struct {
	Name string // "efficiency", "h2s", "ttd", …
	Desc string // the definition in words, with its sign convention
	Dim  units.Dim
	// Difference marks a temperature difference (K), converted to other
	// units by scale only.
	Difference bool
	// Flow marks a mass flow or flow ratio in the caller's own flow unit.
	Flow  bool
	Value float64
	U     float64 // standard uncertainty, same unit
	// Contributions are the raw inputs' shares of U.
	Contributions []uncertain.Contribution
	// Unreliable: over the inputs' k = 2 interval the result departs from
	// its linear estimate (uncertain.Linearity).
	Unreliable bool

	n uncertain.Number
}

// StateOut is one numbered state of the process with its uncertainties.
type StateOut struct {
	Label  string // "1", "2", "2s"
	Phase  string
	Region int
	Fields []Result // p, t, h, s, v and x (on the saturation line)
}

// Answer is a process calculation's results.
type Answer struct {
	Kind     string
	Results  []Result
	States   []StateOut
	Warnings []string
	Budget   *uncertain.Budget
}

// Result returns the result of name n.
func (a *Answer) Result(n string) (Result, bool) {
	for _, r := range a.Results {
		if strings.EqualFold(r.Name, n) {
			return r, true
		}
	}
	return Result{}, false
}

// Kind describes one kind of process.
type Kind struct {
	Name    string
	Summary string
	// Inputs names the inputs in words: "p1 and one of t1, h1, s1, x1 …".
	Inputs string
	// Results are the names of the results it can give.
	Results []string
	run     func(c *calc) error
}

// kinds is the catalogue of processes, in the order the help lists them.
var kinds = []Kind{
	{"expansion", "turbine section: isentropic efficiency (h1 − h2)/(h1 − h2s), work per kg", "state 1 (inlet) and state 2 (outlet) by any pair each, e.g. p1 t1 p2 t2", []string{"efficiency", "h2s", "work", "work_s"}, expansion},
	{"compression", "pump or compressor: isentropic efficiency (h2s − h1)/(h2 − h1), work per kg (negative: work done on the fluid)", "state 1 (inlet) and state 2 (outlet), e.g. p1 t1 p2 t2", []string{"efficiency", "h2s", "work", "work_s"}, compression},
	{"throttling", "throttling calorimeter: the upstream quality from the downstream state at the same enthalpy", "p1 (upstream) and state 2 (downstream, superheated), e.g. p1 p2 t2", []string{"h1", "x1", "t1"}, throttling},
	{"mixing", "mixing point or desuperheater spray: the outlet of two inlets with flows m1, m2; or, given t3, the flow m2 that reaches it", "states 1 and 2 with m1 and m2 (outlet p3, default p1); or states 1, 2, m1 and t3", []string{"h3", "t3", "x3", "m3", "m2"}, mixing},
	{"exchanger", "closed feedwater heater: duty and extraction flow per kg of feedwater, TTD and DCA", "extraction steam 1 (p1 is the shell pressure), drain 2 (t2; p2 default p1), feedwater in 3 (p3 t3) and out 4 (t4; p4 default p3)", []string{"duty", "extraction", "ttd", "dca", "tsat"}, exchanger},
}

// Kinds returns the process kinds.
func Kinds() []Kind { return append([]Kind(nil), kinds...) }

// KindNames returns the names of the process kinds.
func KindNames() []string {
	out := make([]string, len(kinds))
	for i, k := range kinds {
		out[i] = k.Name
	}
	return out
}

// LookupKind returns the kind of a name (case-insensitive).
func LookupKind(name string) (Kind, error) {
	for _, k := range kinds {
		if strings.EqualFold(k.Name, strings.TrimSpace(name)) {
			return k, nil
		}
	}
	return Kind{}, errorf(ErrKind, "kind", "%q is not a process; processes are %s", name, strings.Join(KindNames(), ", "))
}

// ParseName splits an input name into its property symbol and state
// number: "p1" is (p, 1), "m2" is (m, 2), "pshell" is not an input.
func ParseName(name string) (sym string, n int, ok bool) {
	name = strings.ToLower(strings.TrimSpace(name))
	i := strings.IndexFunc(name, func(r rune) bool { return r >= '0' && r <= '9' })
	if i <= 0 {
		return "", 0, false
	}
	n, err := strconv.Atoi(name[i:])
	if err != nil || n < 1 || n > 9 {
		return "", 0, false
	}
	sym = name[:i]
	if sym == "m" {
		return sym, n, true
	}
	if _, ok := fn.QuantityBySymbol(sym); !ok {
		return "", 0, false
	}
	return sym, n, true
}

// Run computes the process kind from the raw inputs in. Errors are *Error
// (ErrKind, ErrInput, ErrRefused) or those of the engine for a state that
// does not exist.
func Run(kind string, in []Value) (Answer, error) {
	k, err := LookupKind(kind)
	if err != nil {
		return Answer{}, err
	}
	c, err := runOnce(k, in, true)
	if err != nil {
		return Answer{}, err
	}
	ans := Answer{Kind: k.Name, Results: c.results, States: c.states, Warnings: c.warnings, Budget: c.b}
	ys := make([]uncertain.Number, len(ans.Results))
	for i := range ans.Results {
		ys[i] = ans.Results[i].n
	}
	// The covariance of the results, J Σ Jᵀ with J their Jacobian with
	// respect to the raw readings: its diagonal gives each u.
	cov := c.b.CovarianceMatrix(ys)
	for i := range ans.Results {
		r := &ans.Results[i]
		r.Value, r.U = r.n.Value, math.Sqrt(cov.At(i, i))
		r.Contributions = c.b.Contributions(r.n)
	}
	lin := uncertain.Linearity(c.b, ys, func(x []float64) ([]float64, error) {
		moved := make([]Value, len(in))
		for i := range in {
			moved[i] = Value{Name: c.b.Name(i), X: x[i]}
		}
		cc, err := runOnce(k, moved, false)
		if err != nil {
			return nil, err
		}
		out := make([]float64, len(ans.Results))
		for j, r := range ans.Results {
			out[j] = math.NaN()
			for _, got := range cc.results {
				if got.Name == r.Name {
					out[j] = got.n.Value
				}
			}
		}
		return out, nil
	})
	var bad []string
	for i := range ans.Results {
		if lin[i] > uncertain.LinearityLimit {
			ans.Results[i].Unreliable = true
			bad = append(bad, ans.Results[i].Name)
		}
	}
	if len(bad) > 0 {
		ans.Warnings = append(ans.Warnings, uncertain.NonlinearText(bad))
	}
	return ans, nil
}

// runOnce builds the budget from in and runs the kind. full adds the end
// states' uncertainties and the phase checks.
func runOnce(k Kind, in []Value, full bool) (*calc, error) {
	c := &calc{b: &uncertain.Budget{}, in: map[string]uncertain.Number{}, used: map[string]bool{}, full: full}
	names := make([]string, 0, len(in))
	for _, v := range in {
		key := strings.ToLower(strings.TrimSpace(v.Name))
		if _, _, ok := ParseName(key); !ok {
			return nil, errorf(ErrInput, v.Name, "%q is not a process input; name a property symbol and a state number (p1, t1, h2, x2) or a flow (m1, m2)", v.Name)
		}
		if _, dup := c.in[key]; dup {
			return nil, errorf(ErrInput, v.Name, "%s is given twice; give each input once", key)
		}
		if v.U < 0 || math.IsNaN(v.U) || math.IsInf(v.U, 0) {
			return nil, errorf(ErrInput, v.Name, "the uncertainty of %s must be a finite number ≥ 0", key)
		}
		c.in[key] = c.b.Input(key, v.X, v.U)
		names = append(names, key)
	}
	if err := k.run(c); err != nil {
		return nil, err
	}
	var unused []string
	for _, n := range names {
		if !c.used[n] {
			unused = append(unused, n)
		}
	}
	if len(unused) > 0 {
		sort.Strings(unused)
		return nil, errorf(ErrInput, unused[0], "%s: not used by %s (inputs: %s); remove %s so that no reading is silently ignored", strings.Join(unused, ", "), k.Name, k.Inputs, strings.Join(unused, ", "))
	}
	return c, nil
}

// calc is one run of a process.
type calc struct {
	b        *uncertain.Budget
	in       map[string]uncertain.Number
	used     map[string]bool
	full     bool
	results  []Result
	states   []StateOut
	warnings []string
}

// has reports whether input name was given.
func (c *calc) has(name string) bool { _, ok := c.in[name]; return ok }

// get returns input name, marking it used.
func (c *calc) get(name string) (uncertain.Number, error) {
	n, ok := c.in[name]
	if !ok {
		return uncertain.Number{}, errorf(ErrInput, name, "%s is missing", name)
	}
	c.used[name] = true
	return n, nil
}

// state solves numbered state n from the two inputs named with n. When
// only one is given and fallback names another input (p2 from p1), the
// missing quantity is taken from it, so that the two states share one
// reading, correlated as they should be.
func (c *calc) state(n int, fallback map[string]string) (uncertain.State, error) {
	var ins []uncertain.Input
	var names []string
	suffix := strconv.Itoa(n)
	for _, sym := range []string{"p", "t", "h", "s", "v", "rho", "u", "x"} {
		name := sym + suffix
		if c.has(name) {
			q, _ := fn.QuantityBySymbol(sym)
			v, _ := c.get(name)
			ins = append(ins, uncertain.Input{Q: q, N: v})
			names = append(names, name)
		}
	}
	if len(ins) == 1 {
		for want, from := range fallback {
			if want != names[0] && c.has(from) {
				q, _ := fn.QuantityBySymbol(strings.TrimSuffix(want, suffix))
				v, _ := c.get(from)
				ins = append(ins, uncertain.Input{Q: q, N: v})
				names = append(names, from)
				break
			}
		}
	}
	if len(ins) != 2 {
		have := "none"
		if len(names) > 0 {
			have = strings.Join(names, ", ")
		}
		return uncertain.State{}, errorf(ErrInput, "p"+suffix, "state %d needs two inputs that fix it, e.g. p%s and t%s (or h%s, s%s, x%s); got %s", n, suffix, suffix, suffix, suffix, suffix, have)
	}
	s, err := uncertain.Solve(ins[0], ins[1])
	if err != nil {
		return s, fmt.Errorf("state %d (%s): %w", n, strings.Join(names, ", "), err)
	}
	return s, nil
}

// result adds a result.
func (c *calc) result(name, desc string, dim units.Dim, n uncertain.Number) {
	c.results = append(c.results, Result{Name: name, Desc: desc, Dim: dim, n: n})
}

func (c *calc) difference(name, desc string, n uncertain.Number) {
	c.results = append(c.results, Result{Name: name, Desc: desc, Dim: units.Temperature, Difference: true, n: n})
}

func (c *calc) flow(name, desc string, n uncertain.Number) {
	c.results = append(c.results, Result{Name: name, Desc: desc, Dim: units.Dimensionless, Flow: true, n: n})
}

// addState records an end state with its uncertainties and warns when its
// phase is uncertain.
func (c *calc) addState(label string, s *uncertain.State) {
	if !c.full {
		return
	}
	out := StateOut{Label: label, Phase: s.Phase.String(), Region: s.Region}
	add := func(sym string, d units.Dim, n uncertain.Number) {
		out.Fields = append(out.Fields, Result{Name: sym, Dim: d, Value: n.Value, U: c.b.U(n), n: n})
	}
	add("p", units.Pressure, s.P)
	add("t", units.Temperature, s.T)
	add("h", units.SpecificEnergy, s.H)
	add("s", units.SpecificEntropy, s.S)
	add("v", units.SpecificVolume, s.V)
	if s.HasX {
		add("x", units.Quality, s.X)
	}
	c.states = append(c.states, out)
	if r := uncertain.Phase(c.b, s); r.Uncertain {
		c.warnings = append(c.warnings, "state "+label+": "+r.Text)
	}
	for _, w := range s.Warnings {
		// fmt.Sprint reads a warning as text whether it is a string or
		// a note with a String method.
		c.warnings = append(c.warnings, "state "+label+": "+fmt.Sprint(w))
	}
}

// isentropic returns the state at pressure p with the entropy of s.
func isentropic(p uncertain.Number, s uncertain.Number) (uncertain.State, error) {
	st, err := uncertain.Solve(uncertain.Input{Q: fn.Pressure, N: p}, uncertain.Input{Q: fn.Entropy, N: s})
	if err != nil {
		return st, fmt.Errorf("isentropic end state: %w", err)
	}
	return st, nil
}

// Definitions of the results, as answers and the README give them.
const (
	descEfficiencyExp = "isentropic efficiency (h1 − h2)/(h1 − h2s), a fraction"
	descEfficiencyCmp = "isentropic efficiency (h2s − h1)/(h2 − h1), a fraction"
	descH2s           = "enthalpy of the isentropic end state at p2 and s1"
	descWork          = "work per unit mass, h1 − h2: positive when the fluid does work (expansion), negative when work is done on it (compression)"
	descWorkS         = "isentropic work per unit mass, h1 − h2s, same sign convention as work"
)

func expansion(c *calc) error   { return turbo(c, true) }
func compression(c *calc) error { return turbo(c, false) }

// turbo computes an expansion (expand) or a compression between states 1
// and 2: h2s = h(p2, s1); work = h1 − h2; work_s = h1 − h2s; the efficiency
// is work/work_s for an expansion and work_s/work for a compression.
func turbo(c *calc, expand bool) error {
	s1, err := c.state(1, nil)
	if err != nil {
		return err
	}
	s2, err := c.state(2, nil)
	if err != nil {
		return err
	}
	if expand && s2.P.Value >= s1.P.Value {
		return errorf(ErrRefused, "p2", "an expansion ends at a lower pressure, and p2 is not below p1; for a pump or compressor use compression")
	}
	if !expand && s2.P.Value <= s1.P.Value {
		return errorf(ErrRefused, "p2", "a compression ends at a higher pressure, and p2 is not above p1; for a turbine section use expansion")
	}
	s2s, err := isentropic(s2.P, s1.S)
	if err != nil {
		return err
	}
	work := s1.H.Sub(s2.H)
	workS := s1.H.Sub(s2s.H)
	var eff uncertain.Number
	if expand {
		eff = work.Div(workS)
		c.result("efficiency", descEfficiencyExp, units.Dimensionless, eff)
	} else {
		if work.Value == 0 {
			return errorf(ErrRefused, "h2", "h2 equals h1: no work was done, so no efficiency")
		}
		eff = workS.Div(work)
		c.result("efficiency", descEfficiencyCmp, units.Dimensionless, eff)
	}
	c.result("h2s", descH2s, units.SpecificEnergy, s2s.H)
	c.result("work", descWork, units.SpecificEnergy, work)
	c.result("work_s", descWorkS, units.SpecificEnergy, workS)
	if eff.Value > 1 || eff.Value <= 0 {
		c.warnings = append(c.warnings, fmt.Sprintf("the efficiency %.4g lies outside 0…1: the end state breaks the second law for an adiabatic machine; check the readings (a wet end state needs its quality, not p and T)", eff.Value))
	}
	c.addState("1", &s1)
	c.addState("2", &s2)
	c.addState("2s", &s2s)
	return nil
}

// throttling is a throttling calorimeter: the wet steam at p1 is
// throttled to state 2, superheated, at the same enthalpy (an adiabatic
// throttle does no work: h1 = h2), so x1 = x(p1, h2).
func throttling(c *calc) error {
	p1, err := c.get("p1")
	if err != nil {
		return errorf(ErrInput, "p1", "throttling needs p1, the upstream pressure, and the downstream state 2 (e.g. p2 and t2)")
	}
	for _, sym := range []string{"t1", "h1", "s1", "x1", "v1", "rho1", "u1"} {
		if c.has(sym) {
			return errorf(ErrInput, sym, "%s is what throttling computes; give only p1 upstream", sym)
		}
	}
	s2, err := c.state(2, nil)
	if err != nil {
		return err
	}
	if s2.HasX || s2.Phase != fn.SuperheatedVapour {
		return errorf(ErrRefused, "t2", "the downstream state is %s: a throttling calorimeter needs it superheated, so that p2 and t2 fix its enthalpy; throttle to a lower pressure", s2.Phase)
	}
	if p1.Value <= s2.P.Value {
		return errorf(ErrRefused, "p1", "p1 is not above p2: a throttle lowers the pressure")
	}
	s1, err := uncertain.Solve(uncertain.Input{Q: fn.Pressure, N: p1}, uncertain.Input{Q: fn.Enthalpy, N: s2.H})
	if err != nil {
		return fmt.Errorf("upstream state: %w", err)
	}
	if !s1.HasX || s1.X.Value >= 1 {
		return errorf(ErrRefused, "p1", "the upstream state at p1 with h1 = h2 is %s, not wet: a throttling calorimeter gives the quality only of wet steam (x < 1); at this p1 it tells only that the steam was dry", s1.Phase)
	}
	c.result("h1", "upstream enthalpy, equal to h2 across an adiabatic throttle", units.SpecificEnergy, s1.H)
	c.result("x1", "upstream quality (dryness fraction) at p1 and h1", units.Quality, s1.X)
	c.result("t1", "upstream temperature, the saturation temperature at p1", units.Temperature, s1.T)
	c.addState("1", &s1)
	c.addState("2", &s2)
	return nil
}

// mixing is an adiabatic mixing point with no work: m3 = m1 + m2 and
// m3·h3 = m1·h1 + m2·h2. Given t3 (or h3) in place of m2, it solves the
// energy balance for m2 = m1 (h1 − h3)/(h3 − h2), the spray flow that
// brings the outlet to t3.
func mixing(c *calc) error {
	s1, err := c.state(1, nil)
	if err != nil {
		return err
	}
	s2, err := c.state(2, nil)
	if err != nil {
		return err
	}
	m1, err := c.get("m1")
	if err != nil {
		return errorf(ErrInput, "m1", "mixing needs m1, the flow of inlet 1")
	}
	if m1.Value <= 0 {
		return errorf(ErrInput, "m1", "m1 must be above 0")
	}
	if c.has("m2") {
		m2, _ := c.get("m2")
		if m2.Value < 0 {
			return errorf(ErrInput, "m2", "m2 must not be negative")
		}
		if c.has("t3") || c.has("h3") {
			return errorf(ErrInput, "t3", "give either m2 (to find the outlet) or the outlet t3 or h3 (to find m2), not both")
		}
		m3 := m1.Add(m2)
		h3 := m1.Mul(s1.H).Add(m2.Mul(s2.H)).Div(m3)
		p3, err := c.outletPressure()
		if err != nil {
			return err
		}
		s3, err := uncertain.Solve(uncertain.Input{Q: fn.Pressure, N: p3}, uncertain.Input{Q: fn.Enthalpy, N: h3})
		if err != nil {
			return fmt.Errorf("outlet state 3: %w", err)
		}
		c.result("h3", "outlet enthalpy (m1 h1 + m2 h2)/(m1 + m2)", units.SpecificEnergy, h3)
		c.result("t3", "outlet temperature at p3 and h3", units.Temperature, s3.T)
		if s3.HasX {
			c.result("x3", "outlet quality", units.Quality, s3.X)
		}
		c.flow("m3", "outlet flow m1 + m2, in the unit of m1", m3)
		c.addState("1", &s1)
		c.addState("2", &s2)
		c.addState("3", &s3)
		return nil
	}
	if !c.has("t3") && !c.has("h3") {
		return errorf(ErrInput, "m2", "mixing needs m2 (to find the outlet) or the outlet t3 or h3 (to find the spray flow m2)")
	}
	s3, err := c.state(3, map[string]string{"p3": "p1"})
	if err != nil {
		return err
	}
	lo, hi := math.Min(s1.H.Value, s2.H.Value), math.Max(s1.H.Value, s2.H.Value)
	if s3.H.Value <= lo || s3.H.Value >= hi {
		return errorf(ErrRefused, "t3", "the outlet enthalpy h3 does not lie between the inlets' h1 and h2: no flow of inlet 2 reaches it")
	}
	m2 := m1.Mul(s1.H.Sub(s3.H)).Div(s3.H.Sub(s2.H))
	c.flow("m2", "flow of inlet 2 that brings the outlet to state 3: m1 (h1 − h3)/(h3 − h2), in the unit of m1", m2)
	c.flow("m3", "outlet flow m1 + m2", m1.Add(m2))
	c.result("h3", "outlet enthalpy at p3 and t3", units.SpecificEnergy, s3.H)
	c.addState("1", &s1)
	c.addState("2", &s2)
	c.addState("3", &s3)
	return nil
}

// outletPressure returns p3, or p1 when p3 is not given.
func (c *calc) outletPressure() (uncertain.Number, error) {
	if c.has("p3") {
		return c.get("p3")
	}
	return c.get("p1")
}

// exchanger is a closed feedwater heater without drains cascaded in:
// extraction steam 1 condenses in the shell at p1 and leaves as drain 2;
// feedwater is heated from 3 to 4. Per kg of feedwater, the duty is
// h4 − h3 and the extraction flow is (h4 − h3)/(h1 − h2) by the energy
// balance with no heat lost to the surroundings. TTD = Ts(p1) − t4 and
// DCA = t2 − t3 (common practice, no source).
func exchanger(c *calc) error {
	s1, err := c.state(1, nil)
	if err != nil {
		return err
	}
	s2, err := c.state(2, map[string]string{"p2": "p1"})
	if err != nil {
		return err
	}
	s3, err := c.state(3, nil)
	if err != nil {
		return err
	}
	s4, err := c.state(4, map[string]string{"p4": "p3"})
	if err != nil {
		return err
	}
	shell := s1.P.Value
	if shell >= if97.Pc || shell < fn.PMinSat {
		return errorf(ErrRefused, "p1", "the shell pressure p1 has no saturation temperature (it is at or above the critical pressure, or below the triple point); a closed heater condenses its steam below the critical pressure")
	}
	ts := if97.SatTemperature(shell)
	tsat := s1.P.Apply(ts, 1/if97.SatPressureSlope(ts))
	duty := s4.H.Sub(s3.H)
	drop := s1.H.Sub(s2.H)
	if drop.Value <= 0 {
		return errorf(ErrRefused, "t2", "the drain enthalpy h2 is not below the steam's h1: the steam gave no heat")
	}
	if duty.Value <= 0 {
		return errorf(ErrRefused, "t4", "the feedwater outlet enthalpy h4 is not above the inlet's h3: the feedwater took no heat")
	}
	c.result("duty", "heat to the feedwater per unit mass of feedwater, h4 − h3", units.SpecificEnergy, duty)
	c.result("extraction", "extraction steam per unit mass of feedwater, (h4 − h3)/(h1 − h2)", units.Dimensionless, duty.Div(drop))
	c.difference("ttd", "terminal temperature difference Ts(p1) − t4: positive when the feedwater leaves below the shell's saturation temperature", tsat.Sub(s4.T))
	c.difference("dca", "drain cooler approach t2 − t3", s2.T.Sub(s3.T))
	c.result("tsat", "saturation temperature at the shell pressure p1", units.Temperature, tsat)
	c.addState("1", &s1)
	c.addState("2", &s2)
	c.addState("3", &s3)
	c.addState("4", &s4)
	return nil
}
