package point

import (
	"encoding/json"
	"strconv"

	"steamcell/fn"
)

// Input is an input as understood, for echoing back: its symbol and its
// value in the answer's units.
type Input struct {
	Symbol string
	Value  float64
	Unit   string
}

// Inputs writes the engine inputs in the units of opt.Set.
func Inputs(in [2]fn.Input, opt Options) []Input {
	out := make([]Input, 0, 2)
	for _, i := range in {
		d := DimOf(i.Q)
		u := opt.Set.Unit(d)
		out = append(out, Input{Symbol: i.Q.Symbol(), Value: u.FromBase(i.Value, opt.Patm), Unit: u.Name})
	}
	return out
}

// AppendJSON appends the answer as one flat JSON object: "inputs" (when
// given), "phase", "region", each defined property by its symbol, "units"
// (symbol → unit label), "unit_set", "formulation", "warnings" and, when
// not empty, "undefined" (properties asked for that have no value here)
// and "caution".
func (a *Answer) AppendJSON(b []byte, inputs []Input, caution string) []byte {
	b = append(b, '{')
	if len(inputs) > 0 {
		b = append(b, `"inputs":{`...)
		for i, in := range inputs {
			if i > 0 {
				b = append(b, ',')
			}
			b = appendString(b, in.Symbol)
			b = append(b, ':')
			b = appendNumber(b, in.Value)
		}
		b = append(b, "},"...)
	}
	b = append(b, `"phase":`...)
	b = appendString(b, a.Phase)
	b = append(b, `,"region":`...)
	b = strconv.AppendInt(b, int64(a.Region), 10)
	var undefined []string
	for _, f := range a.Fields {
		if !f.Defined {
			undefined = append(undefined, f.Symbol)
			continue
		}
		b = append(b, ',')
		b = appendString(b, f.Symbol)
		b = append(b, ':')
		b = appendNumber(b, f.Value)
	}
	b = append(b, `,"units":{`...)
	first := true
	add := func(sym, unit string) {
		if !first {
			b = append(b, ',')
		}
		first = false
		b = appendString(b, sym)
		b = append(b, ':')
		b = appendString(b, unit)
	}
	seen := map[string]bool{}
	for _, in := range inputs {
		if !seen[in.Symbol] {
			seen[in.Symbol] = true
			add(in.Symbol, in.Unit)
		}
	}
	for _, f := range a.Fields {
		if f.Defined && !seen[f.Symbol] {
			seen[f.Symbol] = true
			add(f.Symbol, f.Unit)
		}
	}
	b = append(b, `},"unit_set":`...)
	b = appendString(b, a.Set)
	b = append(b, `,"formulation":`...)
	b = appendString(b, Formulation)
	b = append(b, `,"warnings":`...)
	b = appendStrings(b, a.Warnings)
	if len(undefined) > 0 {
		b = append(b, `,"undefined":`...)
		b = appendStrings(b, undefined)
	}
	if caution != "" {
		b = append(b, `,"caution":`...)
		b = appendString(b, caution)
	}
	return append(b, '}')
}

func appendStrings(b []byte, ss []string) []byte {
	b = append(b, '[')
	for i, s := range ss {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendString(b, s)
	}
	return append(b, ']')
}

// appendNumber writes v in the shortest form that reads back to the same
// float64.
func appendNumber(b []byte, v float64) []byte {
	return strconv.AppendFloat(b, v, 'g', -1, 64)
}

// appendString writes s as a JSON string (json.Marshal escapes as JSON
// requires; strconv.Quote's \x escapes are not JSON).
func appendString(b []byte, s string) []byte {
	q, _ := json.Marshal(s)
	return append(b, q...)
}
