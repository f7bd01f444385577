package fn

import (
	"errors"
	"fmt"
	"strconv"
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

// InputError reports an input the engine cannot use: which input, its value,
// the limit it breaks and that limit's value, all in base units.
type InputError struct {
	Input  string  // symbol of the input ("p", "t", "h", …), or a pair "h,s"
	Value  float64 // the value given, in Unit
	Limit  float64 // the value of the limit broken, in Unit; meaningful when HasLimit
	Unit   string  // base unit of Value and Limit
	Kind   error   // one of the Err… values above
	Detail string  // the limit in words, e.g. "T above 1073.15 K at p > 50 MPa"

	HasLimit bool
	Pair     bool // the error is about the two inputs together; Value is not used

	// Alternatives holds, for ErrTwoSolutions, the states that fit: their
	// pressures (MPa) for the (T,h) and (T,s) pairs, their temperatures (K)
	// for (p,v).
	Alternatives []float64
}

func (e *InputError) Error() string {
	msg := e.Input
	if !e.Pair {
		msg += " = " + strconv.FormatFloat(e.Value, 'g', 10, 64)
		if e.Unit != "" && e.Unit != "fraction" {
			msg += " " + e.Unit
		}
	}
	msg += ": " + e.Kind.Error()
	if e.Detail != "" {
		msg += ": " + e.Detail
	}
	return msg
}

// Unwrap returns the error kind, so that errors.Is(err, ErrOutOfRange) works.
func (e *InputError) Unwrap() error { return e.Kind }

func notFinite(q Quantity, v float64) *InputError {
	return &InputError{Input: q.Symbol(), Value: v, Unit: q.BaseUnit(), Kind: ErrNotFinite,
		Detail: "give a number"}
}

// outOfRange reports input q = v beyond limit; detail says which limit in
// words ("above 1073.15 K at p > 50 MPa").
func outOfRange(q Quantity, v, limit float64, format string, args ...any) *InputError {
	return &InputError{Input: q.Symbol(), Value: v, Limit: limit, HasLimit: true,
		Unit: q.BaseUnit(), Kind: ErrOutOfRange, Detail: fmt.Sprintf(format, args...)}
}

// pairError reports a problem with the pair a, b as a whole.
func pairError(a, b Input, kind error, format string, args ...any) *InputError {
	return &InputError{Input: a.Q.Symbol() + "," + b.Q.Symbol(), Pair: true,
		Kind: kind, Detail: fmt.Sprintf(format, args...)}
}
