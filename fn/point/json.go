package point

import (
	"strconv"
	"unicode/utf8"

	"steamcell/fn"
	"steamcell/fn/units"
)

// Input is an input as understood, for echoing back: its symbol and its
// value in the answer's units.
type Input struct {
	Symbol string
	Value  float64
	Unit   string

	q fn.Quantity // the quantity, when AppendInputs made it: its key is in inputKeys
}

// Inputs writes the engine inputs in the units of opt.Set.
func Inputs(in [2]fn.Input, opt Options) []Input {
	return AppendInputs(make([]Input, 0, 2), in, opt)
}

// AppendInputs is Inputs appending to dst, for a batch that reuses it.
func AppendInputs(dst []Input, in [2]fn.Input, opt Options) []Input {
	for _, i := range in {
		u := opt.Set.Unit(DimOf(i.Q))
		dst = append(dst, inputIn(i, &u, opt.Patm))
	}
	return dst
}

// AppendInputs is the package's AppendInputs in the plan's options, with
// the units looked up once for all rows.
func (pl *Plan) AppendInputs(dst []Input, in [2]fn.Input) []Input {
	for _, i := range in {
		if i.Q < 1 || int(i.Q) >= len(pl.inUnits) {
			return AppendInputs(dst, in, pl.opt) // not an input quantity
		}
	}
	for _, i := range in {
		dst = append(dst, inputIn(i, &pl.inUnits[i.Q], pl.opt.Patm))
	}
	return dst
}

// inputIn is input i written in unit u.
func inputIn(i fn.Input, u *units.Unit, patm float64) Input {
	return Input{Symbol: i.Q.Symbol(), Value: u.FromBase(i.Value, patm), Unit: u.Name, q: i.Q}
}

// AppendJSON appends the answer as one flat JSON object: "inputs" (when
// given), "phase", "region", each defined property by its symbol, "units"
// (symbol → unit label), "unit_set", "formulation", "warnings" and, when
// not empty, "undefined" (properties asked for that have no value here)
// and "caution".
func (a *Answer) AppendJSON(b []byte, inputs []Input, caution string) []byte {
	return a.AppendJSONFields(append(b, '{'), inputs, caution)
}

// AppendJSONFields appends what AppendJSON writes after the opening
// brace, for an object that has fields of its own before them (a row of a
// batch).
func (a *Answer) AppendJSONFields(b []byte, inputs []Input, caution string) []byte {
	if len(inputs) > 0 {
		b = append(b, `"inputs":{`...)
		for i, in := range inputs {
			if i > 0 {
				b = append(b, ',')
			}
			if int(in.q) < len(inputKeys) && in.q > 0 && in.q.Symbol() == in.Symbol {
				b = append(b, inputKeys[in.q]...)
			} else {
				b = AppendJSONString(b, in.Symbol)
				b = append(b, ':')
			}
			b = AppendNumber(b, in.Value)
		}
		b = append(b, "},"...)
	}
	if int(a.phase) < len(phaseKeys) && a.phase > 0 && a.phase.String() == a.Phase {
		b = append(b, phaseKeys[a.phase]...)
	} else {
		b = append(b, `"phase":`...)
		b = AppendJSONString(b, a.Phase)
	}
	b = append(b, `,"region":`...)
	b = strconv.AppendInt(b, int64(a.Region), 10)
	undefined := false
	for j := range a.Fields {
		f := &a.Fields[j] // not copied: a Field is large
		if !f.Defined {
			undefined = true
			continue
		}
		if f.idx < len(fieldKeys) && catalogue[f.idx].Symbol == f.Symbol {
			b = append(b, fieldKeys[f.idx]...)
		} else {
			b = append(b, ',')
			b = AppendJSONString(b, f.Symbol)
			b = append(b, ':')
		}
		b = AppendNumber(b, f.Value)
	}
	b = a.appendUnits(b, inputs)
	b = append(b, `,"warnings":[`...)
	for i, w := range a.Warnings {
		if i > 0 {
			b = append(b, ',')
		}
		b = AppendJSONString(b, w)
	}
	b = append(b, ']')
	if undefined {
		b = append(b, `,"undefined":[`...)
		first := true
		for _, f := range a.Fields {
			if !f.Defined {
				if !first {
					b = append(b, ',')
				}
				first = false
				b = AppendJSONString(b, f.Symbol)
			}
		}
		b = append(b, ']')
	}
	if caution != "" {
		b = append(b, `,"caution":`...)
		b = AppendJSONString(b, caution)
	}
	return append(b, '}')
}

// fieldKeys holds the key of each catalogue entry as AppendJSON writes
// it after the previous field: `,"h":`.
var fieldKeys = func() [][]byte {
	keys := make([][]byte, len(catalogue))
	for i, p := range catalogue {
		keys[i] = append(AppendJSONString([]byte{','}, p.Symbol), ':')
	}
	return keys
}()

// inputKeys holds the key of each input quantity as AppendJSON writes it
// in "inputs": `"p":`.
var inputKeys = func() [][]byte {
	keys := make([][]byte, fn.Quality+1)
	for q := fn.Pressure; q <= fn.Quality; q++ {
		keys[q] = append(AppendJSONString(nil, q.Symbol()), ':')
	}
	return keys
}()

// phaseKeys holds the phase of an answer as AppendJSON writes it:
// `"phase":"superheated vapour"`.
var phaseKeys = func() [][]byte {
	keys := make([][]byte, fn.MetastableVapour+1)
	for ph := fn.CompressedLiquid; ph <= fn.MetastableVapour; ph++ {
		keys[ph] = AppendJSONString([]byte(`"phase":`), ph.String())
	}
	return keys
}()

// appendUnits writes "units" (each symbol once: an input first, then a
// field by its place in the catalogue, as get=h,h asks twice for one
// property), "unit_set" and "formulation". They change only with the
// inputs and with which fields have a value, so an Answer that a Plan
// fills keeps the last of them written and copies it.
func (a *Answer) appendUnits(b []byte, inputs []Input) []byte {
	c := &a.units
	key := unitsKey{plan: a.plan, mask: a.mask, set: a.Set, n: len(inputs)}
	for i := range min(len(inputs), len(key.in)) {
		key.in[i] = [2]string{inputs[i].Symbol, inputs[i].Unit}
	}
	cacheable := a.plan != nil && len(a.plan.cols) <= maxProps && len(inputs) <= len(key.in)
	if cacheable && c.ok && c.key == key {
		return append(b, c.b...)
	}
	start := len(b)
	b = append(b, `,"units":{`...)
	first := true
	add := func(sym, unit string) {
		if !first {
			b = append(b, ',')
		}
		first = false
		b = AppendJSONString(b, sym)
		b = append(b, ':')
		b = AppendJSONString(b, unit)
	}
	var seen [(maxProps + 63) / 64]uint64
	for i, in := range inputs {
		if !inputBefore(inputs[:i], in.Symbol) {
			add(in.Symbol, in.Unit)
		}
	}
	for _, f := range a.Fields {
		word, bit := f.idx/64, uint64(1)<<(f.idx%64)
		if !f.Defined || seen[word]&bit != 0 || inputBefore(inputs, f.Symbol) {
			continue
		}
		seen[word] |= bit
		add(f.Symbol, f.Unit)
	}
	b = append(b, `},"unit_set":`...)
	b = AppendJSONString(b, a.Set)
	b = append(b, `,"formulation":`...)
	b = AppendJSONString(b, Formulation)
	if cacheable {
		c.key, c.ok = key, true
		c.b = append(c.b[:0], b[start:]...)
	}
	return b
}

// unitsKey is what the "units" of an answer depend on.
type unitsKey struct {
	plan *Plan
	mask [maxProps / 64]uint64 // which columns of the plan have a value
	set  string
	n    int
	in   [2][2]string // symbol and unit of each input
}

// unitsCache is the last "units" an Answer wrote, and its key.
type unitsCache struct {
	key unitsKey
	ok  bool
	b   []byte
}

// maxProps bounds the catalogue, for the set of symbols AppendJSON has
// written; a test checks that the catalogue fits.
const maxProps = 128

func inputBefore(inputs []Input, sym string) bool {
	for _, in := range inputs {
		if in.Symbol == sym {
			return true
		}
	}
	return false
}

// AppendJSONString writes s as a JSON string exactly as json.Marshal does
// (HTML characters, U+2028 and U+2029 escaped, invalid UTF-8 as U+FFFD),
// without its allocation.
func AppendJSONString[T string | []byte](b []byte, s T) []byte {
	const hex = "0123456789abcdef"
	b = append(b, '"')
	start := 0
	for i := 0; i < len(s); {
		if c := s[i]; c < utf8.RuneSelf {
			if c >= 0x20 && c != '"' && c != '\\' && c != '<' && c != '>' && c != '&' {
				i++
				continue
			}
			b = append(b, s[start:i]...)
			switch c {
			case '\\', '"':
				b = append(b, '\\', c)
			case '\b':
				b = append(b, '\\', 'b')
			case '\f':
				b = append(b, '\\', 'f')
			case '\n':
				b = append(b, '\\', 'n')
			case '\r':
				b = append(b, '\\', 'r')
			case '\t':
				b = append(b, '\\', 't')
			default:
				b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&0xF])
			}
			i++
			start = i
			continue
		}
		r, size := decodeRune(s[i:])
		if r == utf8.RuneError && size == 1 {
			b = append(b, s[start:i]...)
			b = append(b, `\ufffd`...)
			i += size
			start = i
			continue
		}
		if r == '\u2028' || r == '\u2029' {
			b = append(b, s[start:i]...)
			b = append(b, '\\', 'u', '2', '0', '2', hex[r&0xF])
			i += size
			start = i
			continue
		}
		i += size
	}
	b = append(b, s[start:]...)
	return append(b, '"')
}

// decodeRune is utf8.DecodeRune for either kind of text.
func decodeRune[T string | []byte](s T) (rune, int) {
	var buf [utf8.UTFMax]byte
	n := copy(buf[:], s[:min(len(s), utf8.UTFMax)])
	return utf8.DecodeRune(buf[:n])
}
