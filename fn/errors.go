package fn

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
)

// Kinds of input error; test for them with errors.Is.
var (
	// ErrNotFinite: an input is NaN or infinite.
	ErrNotFinite = errors.New("not a finite number")
	// ErrOutOfRange: the state lies outside the range of validity of
	// IAPWS-IF97, or an input is outside its physical range (x outside 0…1,
	// a negative volume).
	ErrOutOfRange = errors.New("outside the range of validity")
	// ErrAboveCritical: a quality was given at or above the critical point,
	// where liquid and vapour are no longer distinct.
	ErrAboveCritical = errors.New("no saturation above the critical point")
	// ErrNoSolution: no state of water has these two values.
	ErrNoSolution = errors.New("no state has these values")
	// ErrTwoSolutions: two different states have these two values.
	ErrTwoSolutions = errors.New("two states have these values")
	// ErrOnSaturation: p and T lie on the saturation line, where they do not
	// fix the state; a third property (x, h, s) is needed.
	ErrOnSaturation = errors.New("p and T lie on the saturation line")
	// ErrPair: the two inputs do not make a supported pair (the same quantity
	// twice, v and rho together, an unknown quantity).
	ErrPair = errors.New("unsupported pair of inputs")
)

// ErrSolver is the kind of a *SolverError: a solve that did not converge
// for inputs that have a state. It is our fault, never the user's, and is
// no input error.
var ErrSolver = errors.New("the solver did not converge")

// InputError reports an input the engine cannot use: which input, its value,
// the limit it breaks and that limit's value, all in base units.
type InputError struct {
	Input string   // symbol of the input ("p", "t", "h", "rho", …), or a pair "h,s"
	Q     Quantity // the quantity the user gave (Density for rho); 0 for a pair
	Value float64  // the value given, in Q's base unit
	Limit float64  // the value of the limit broken, in Q's base unit; meaningful when HasLimit
	Kind  error    // one of the Err… values above
	// Detail is the limit in words, e.g. "T above {0} at p above {1}".
	Detail Note

	HasLimit bool
	Pair     bool // the error is about the two inputs together; Value is not used

	// Alternatives holds, for ErrTwoSolutions, the states that fit: their
	// pressures for the (T,h) and (T,s) pairs, their temperatures for (p,v)
	// and (p,rho).
	Alternatives []Figure
}

// Error renders the error in base units.
func (e *InputError) Error() string {
	msg := e.Input
	if !e.Pair {
		msg += " = " + strconv.FormatFloat(e.Value, 'g', 10, 64)
		if u := e.Q.BaseUnit(); u != "" && u != "fraction" {
			msg += " " + u
		}
	}
	msg += ": " + e.Kind.Error()
	if d := e.Detail.String(); d != "" {
		msg += ": " + d
	}
	return msg
}

// Unwrap returns the error kind, so that errors.Is(err, ErrOutOfRange) works.
func (e *InputError) Unwrap() error { return e.Kind }

// SolverError reports a solve that did not converge: the inputs as given
// and the step that failed. Its kind is ErrSolver.
type SolverError struct {
	Inputs [2]Input // as given to Solve, in base units
	Step   string   // the solve that failed, e.g. "region 3 at fixed p"
}

func (e *SolverError) Error() string {
	var in []string
	for _, i := range e.Inputs {
		if i.Q.valid() {
			in = append(in, fig(i.Q, i.Value).symbolText())
		}
	}
	return ErrSolver.Error() + " (" + e.Step + ") for " + strings.Join(in, ", ") + "; please report these inputs"
}

// Unwrap returns ErrSolver.
func (e *SolverError) Unwrap() error { return ErrSolver }

// symbolText writes "h = 1599.59 kJ/kg" to full precision.
func (f Figure) symbolText() string {
	s := f.Q.Symbol() + " = " + strconv.FormatFloat(f.V, 'g', -1, 64)
	if u := f.Q.BaseUnit(); u != "" && u != "fraction" {
		s += " " + u
	}
	return s
}

// solverFailed is the error of a solve that did not converge at step;
// Solve fills in the inputs.
func solverFailed(step string) error { return &SolverError{Step: step} }

func notFinite(q Quantity, v float64) *InputError {
	return &InputError{Input: q.Symbol(), Q: q, Value: v, Kind: ErrNotFinite, Detail: note("give a number")}
}

// outOfRange reports input q = v beyond limit; text and figs say which
// limit in words ("above {0} at p above {1}").
func outOfRange(q Quantity, v, limit float64, text string, figs ...Figure) *InputError {
	return &InputError{Input: q.Symbol(), Q: q, Value: v, Limit: limit, HasLimit: true,
		Kind: ErrOutOfRange, Detail: note(text, figs...)}
}

// pairError reports a problem with the pair a, b as a whole.
func pairError(a, b Input, kind error, text string, figs ...Figure) *InputError {
	return &InputError{Input: a.Q.Symbol() + "," + b.Q.Symbol(), Pair: true,
		Kind: kind, Detail: note(text, figs...)}
}

// Text writes e as Error does, with its value and the figures of its
// detail written by format: the caller's units in place of base units.
func (e *InputError) Text(format func(Figure) string) string {
	msg := e.Input
	if !e.Pair {
		msg += " = " + format(Figure{Q: e.Q, V: e.Value})
	}
	msg += ": " + e.Kind.Error()
	if d := e.Detail.Render(format); d != "" {
		msg += ": " + d
	}
	return msg
}

// ParamError is a request the caller must change, found outside the
// equations (a point, a process, a table or a diagram as asked for, a
// query): which parameter, what kind (an errors.Is sentinel of the package
// that found it) and a message saying what to change. The packages that
// report such errors name it Error.
type ParamError struct {
	Param string // the parameter or input concerned; may be empty
	Kind  error
	Msg   string
}

func (e *ParamError) Error() string { return e.Msg }

// Unwrap returns the kind.
func (e *ParamError) Unwrap() error { return e.Kind }

// ParamErrorf is the ParamError of kind about param, its message formatted.
func ParamErrorf(kind error, param, format string, args ...any) *ParamError {
	return &ParamError{Param: param, Kind: kind, Msg: fmt.Sprintf(format, args...)}
}
