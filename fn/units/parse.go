package units

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Limits of Options.Patm, MPa. Wider than any site on Earth (the summit of
// Everest is near 0.034 MPa, the shore of the Dead Sea near 0.107 MPa:
// common practice, no source), narrow enough to catch a value given in kPa,
// bar or psi instead of MPa.
const (
	MinPatm = 0.01
	MaxPatm = 0.2
)

// Options says how Parse reads a value. The zero Options reads bare numbers
// in the "si" set and gauge pressures against the standard atmosphere.
type Options struct {
	// Name of the input as the caller calls it ("p", "T"), put in errors.
	Name string
	// Unit given apart from the text: a column header, a query parameter.
	// It applies when the text has no unit. When the text has one too,
	// the text's unit wins, but both must belong to the quantity and a
	// gauge unit cannot meet an absolute one (ErrUnitConflict).
	Unit string
	// Set gives the unit of a bare number when Unit is empty; the zero Set
	// is "si".
	Set Set
	// Patm is the atmospheric pressure that gauge readings are relative
	// to, MPa; 0 means StandardAtmosphere. Otherwise it must lie within
	// MinPatm..MaxPatm.
	Patm float64
}

// Parse reads a value of quantity d from text as people type it ("6 barg",
// "330 °C", "0.85") and returns it in the base unit of d (MPa, K, kJ/kg, ...;
// see Dim). The package doc gives the rules for numbers, units, gauge
// pressure and quality. Every error is an *InputError naming opt.Name.
func Parse(text string, d Dim, opt Options) (float64, error) {
	v, _, err := parse(text, d, &opt)
	return v, err
}

// ParseUnit is Parse that also returns the unit the value was read in,
// so callers can echo how they understood the input.
func ParseUnit(text string, d Dim, opt Options) (float64, Unit, error) {
	v, u, err := parse(text, d, &opt)
	if err != nil {
		return 0, Unit{}, err
	}
	return v, *u, nil
}

// ParseUnitRef is ParseUnit for a caller that reads many values with one
// Options (a batch's rows): opt is not copied, and the unit returned is
// the package's own, shared and not to be changed.
func ParseUnitRef(text string, d Dim, opt *Options) (float64, *Unit, error) {
	return parse(text, d, opt)
}

// parse is ParseUnit returning the unit as a pointer into the registry.
// The common shapes of text take parseFast; the rest, and every error,
// parseFull.
func parse(text string, d Dim, opt *Options) (float64, *Unit, error) {
	if v, u, ok := parseFast(text, d, opt); ok {
		return v, u, nil
	}
	return parseFull(text, d, opt)
}

// parseFull reads text by every rule of the package doc.
func parseFull(text string, d Dim, opt *Options) (float64, *Unit, error) {
	if !d.valid() {
		return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrUnknownUnit, Detail: "no quantity given to read the value as"}
	}
	num, unitText, detail, kind := splitNumber(text)
	if kind != nil {
		return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: kind, Detail: detail}
	}
	v, err := strconv.ParseFloat(num, 64)
	if err != nil {
		if errors.Is(err, strconv.ErrRange) && math.IsInf(v, 0) {
			return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrNotFinite,
				Detail: fmt.Sprintf("%s is beyond the largest number (about 1.8e308)", num)}
		}
		if !errors.Is(err, strconv.ErrRange) { // underflow to zero is fine
			return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrSyntax,
				Detail: fmt.Sprintf("%q is not a number", num)}
		}
	}

	units := registry[d].units
	var u *Unit
	switch {
	case unitText != "":
		i, trap, ok := find(unitText, d)
		if !ok {
			return 0, nil, unitError(opt.Name, text, unitText, trap, d)
		}
		u = &units[i]
		if opt.Unit != "" {
			sep, err := separateUnit(opt, d)
			if err != nil {
				return 0, nil, err
			}
			if sep.Gauge != u.Gauge {
				return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrUnitConflict,
					Detail: fmt.Sprintf("the text says %s (%s) but the unit given separately is %s (%s); make them agree",
						u.Name, gaugeWord(u), sep.Name, gaugeWord(sep))}
			}
		}
	case opt.Unit != "":
		var err error
		if u, err = separateUnit(opt, d); err != nil {
			return 0, nil, err
		}
	default:
		u = &units[opt.Set.index(d)]
	}

	if u.vacuum() && v < 0 {
		return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrAmbiguousNumber,
			Detail: fmt.Sprintf("a vacuum reading counts down from the atmosphere and is not negative; for %g above the atmosphere write a gauge unit, e.g. %g kPag", -v, -v)}
	}
	patm := opt.Patm
	if patm != 0 && !(patm >= MinPatm && patm <= MaxPatm) {
		return 0, nil, &InputError{Name: "patm", Text: strconv.FormatFloat(patm, 'g', -1, 64), Dim: Pressure, Err: ErrBadPatm,
			Detail: fmt.Sprintf("atmospheric pressure must be given in MPa, between %g and %g MPa", MinPatm, MaxPatm)}
	}
	b := u.ToBase(v, patm)
	if math.IsInf(b, 0) || math.IsNaN(b) {
		return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrNotFinite,
			Detail: fmt.Sprintf("%s %s is beyond the largest number in %s", num, u.Name, d.Base().Name)}
	}
	if b == 0 {
		b = 0 // no negative zero
	}
	switch d {
	case Pressure:
		if b <= 0 {
			return 0, nil, pressureError(opt, text, v, u, patm, b)
		}
	case Temperature:
		if b <= 0 {
			return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrNegativeAbsolute,
				Detail: fmt.Sprintf("%g %s is %.6g K, at or below absolute zero", v, u.Name, b)}
		}
	case Quality:
		if b < 0 || b > 1 {
			detail := "quality must be between 0 % and 100 %"
			if u.Name == "" {
				detail = fmt.Sprintf("quality must be a fraction from 0 to 1, or give %% (\"%g %%\")", v)
			}
			return 0, nil, &InputError{Name: opt.Name, Text: text, Dim: d, Err: ErrQualityRange, Detail: detail}
		}
	}
	return b, u, nil
}

// separateUnit resolves opt.Unit for d.
func separateUnit(opt *Options, d Dim) (*Unit, error) {
	t := strings.TrimSpace(opt.Unit)
	i, trap, ok := find(t, d)
	if !ok {
		e := unitError(opt.Name, opt.Unit, t, trap, d)
		e.Detail = "unit given separately: " + e.Detail
		return nil, e
	}
	return &registry[d].units[i], nil
}

func gaugeWord(u *Unit) string {
	if u.vacuum() {
		return "vacuum"
	}
	if u.Gauge {
		return "gauge"
	}
	return "absolute"
}

func pressureError(opt *Options, text string, v float64, u *Unit, patm, b float64) *InputError {
	e := &InputError{Name: opt.Name, Text: text, Dim: Pressure, Err: ErrPressureNotPositive}
	if u.Gauge {
		if patm == 0 {
			patm = StandardAtmosphere
		}
		e.Detail = fmt.Sprintf("%g %s with atmospheric pressure %g MPa is an absolute pressure of %.6g MPa; it must be above 0",
			v, u.Name, patm, b)
	} else {
		e.Detail = fmt.Sprintf("%g %s is not above 0; %s is absolute (for a gauge reading write kPag, barg, psig, ...)",
			v, u.Name, u.Name)
	}
	return e
}

// splitNumber splits text into an ASCII number that strconv.ParseFloat
// accepts and the unit text after it, or reports why the text does not start
// with a number as the package doc defines it. It allocates only when the
// number holds a Unicode minus sign.
func splitNumber(text string) (num, unitText, detail string, kind error) {
	t := strings.TrimSpace(text)
	if t == "" {
		return "", "", "no value given", ErrEmpty
	}
	if strings.IndexByte(t, ',') >= 0 {
		return "", "", "a comma is not read in numbers (thousands separator or decimal comma?): remove thousands separators and write decimals with a point, e.g. 1013.25",
			ErrAmbiguousNumber
	}
	i := 0
	unicodeMinus := false
	switch {
	case t[0] == '+' || t[0] == '-':
		i = 1
	case strings.HasPrefix(t, "−"):
		i = len("−")
		unicodeMinus = true
	}
	if i > 0 && i < len(t) {
		if r, _ := utf8.DecodeRuneInString(t[i:]); unicode.IsSpace(r) {
			return "", "", "space inside the number: write the sign and digits together", ErrAmbiguousNumber
		}
	}
	start := i
	digits := 0
	for i < len(t) && isDigit(t[i]) {
		i++
		digits++
	}
	if i < len(t) && t[i] == '.' {
		i++
		for i < len(t) && isDigit(t[i]) {
			i++
			digits++
		}
	}
	if digits == 0 {
		rest := strings.ToLower(t[start:])
		switch {
		case strings.HasPrefix(rest, "nan"), strings.HasPrefix(rest, "inf"), strings.HasPrefix(rest, "∞"):
			return "", "", "not a finite number", ErrNotFinite
		case i-start > 0 || start == len(t):
			return "", "", "no digits in the number", ErrSyntax
		}
		return "", "", "expected a number first, such as 6, -0.5 or 1.2e3", ErrSyntax
	}
	// Exponent: e or E, a sign, digits. Without digits the e starts the unit.
	if i < len(t) && (t[i] == 'e' || t[i] == 'E') {
		j := i + 1
		if j < len(t) && (t[j] == '+' || t[j] == '-') {
			j++
		} else if strings.HasPrefix(t[j:], "−") {
			j += len("−")
			unicodeMinus = true
		}
		if j < len(t) && isDigit(t[j]) {
			for j < len(t) && isDigit(t[j]) {
				j++
			}
			i = j
		}
	}
	num = t[:i]
	rest := t[i:]
	if rest != "" {
		// Digit grouping: 1.013.250, 1'013, 1_000, 1’013.
		r, size := utf8.DecodeRuneInString(rest)
		if (r == '.' || r == '\'' || r == '’' || r == '_') && size < len(rest) && isDigit(rest[size]) {
			return "", "", fmt.Sprintf("%q after %s looks like a digit-group separator: write the number without separators, with '.' for decimals only", r, num),
				ErrAmbiguousNumber
		}
	}
	u := strings.TrimLeftFunc(rest, unicode.IsSpace)
	// After a space, a digit continues the number ("1 013.25"), unless it
	// starts an inverse unit ("2.1e-4 1/K").
	if len(u) < len(rest) && u != "" && (isDigit(u[0]) || (u[0] == '.' && len(u) > 1 && isDigit(u[1]))) &&
		!strings.HasPrefix(u, "1/") {
		return "", "", "space inside the number: write digits without spaces (no thousands separators)", ErrAmbiguousNumber
	}
	if unicodeMinus {
		num = strings.ReplaceAll(num, "−", "-")
	}
	return num, u, "", nil
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }
