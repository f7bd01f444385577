package units

import (
	"errors"
	"strconv"
	"strings"
)

// Kinds of input error. Every error returned by this package is an
// *InputError whose Unwrap gives one of these, so callers can test the kind
// with errors.Is and map it to a response (all are the user's input, none is
// an internal fault).
var (
	// ErrEmpty: the text holds no value at all.
	ErrEmpty = errors.New("empty value")
	// ErrSyntax: the text does not start with a number as this package
	// reads numbers (see the package doc).
	ErrSyntax = errors.New("not a number")
	// ErrAmbiguousNumber: the number contains a comma, a digit-group
	// separator or a space, which could be read more than one way.
	ErrAmbiguousNumber = errors.New("ambiguous number")
	// ErrNotFinite: NaN, infinity, or a number too large for float64,
	// either as typed or after conversion to base units.
	ErrNotFinite = errors.New("number not finite")
	// ErrUnknownUnit: the unit is not one this package accepts for the
	// quantity, nor for any other quantity.
	ErrUnknownUnit = errors.New("unknown unit")
	// ErrWrongDimension: the unit is known, but for another quantity
	// ("300 °C" given for a pressure).
	ErrWrongDimension = errors.New("unit of the wrong quantity")
	// ErrNegativeAbsolute: a temperature at or below absolute zero.
	ErrNegativeAbsolute = errors.New("temperature not above absolute zero")
	// ErrPressureNotPositive: an absolute pressure at or below zero, typed
	// as such or reached from a gauge or vacuum reading.
	ErrPressureNotPositive = errors.New("absolute pressure not above zero")
	// ErrQualityRange: a vapour quality outside 0..1 (0 % to 100 %), which
	// includes a bare number such as 85 that might have meant percent.
	ErrQualityRange = errors.New("quality outside 0..1")
	// ErrUnitConflict: the text carries a unit and a unit was also given
	// separately (column header, query parameter), and one is gauge while
	// the other is absolute.
	ErrUnitConflict = errors.New("conflicting units")
	// ErrBadPatm: the atmospheric pressure for gauge readings is outside
	// the range any site on Earth has (see Options.Patm).
	ErrBadPatm = errors.New("atmospheric pressure out of range")
	// ErrUnknownSet: no unit set of that name.
	ErrUnknownSet = errors.New("unknown unit set")
)

// InputError describes a value or unit that could not be read. It names the
// input as the caller calls it, the text as given, the quantity wanted, the
// kind of error and, in words, what was wrong and what would be accepted.
type InputError struct {
	Name   string // input name as the caller calls it ("p", "T", "patm"); may be empty
	Text   string // the text as given
	Dim    Dim    // the quantity the input needs; 0 when none applies (unit sets)
	Err    error  // kind: one of the Err... values of this package
	Detail string // what was wrong, in words
}

// Error returns the input name, the quoted text and the detail, for example
//
//	p "300C": C is a unit of temperature; p needs a unit of pressure: Pa, kPa, ...
func (e *InputError) Error() string {
	var b strings.Builder
	if e.Name != "" {
		b.WriteString(e.Name)
		b.WriteByte(' ')
	}
	b.WriteString(strconv.Quote(e.Text))
	b.WriteString(": ")
	if e.Detail != "" {
		b.WriteString(e.Detail)
	} else if e.Err != nil {
		b.WriteString(e.Err.Error())
	}
	return b.String()
}

// Unwrap returns the kind of error, one of the Err... values.
func (e *InputError) Unwrap() error { return e.Err }

// inputName returns the name used inside a detail message.
func inputName(name string) string {
	if name == "" {
		return "this input"
	}
	return name
}
