package point

import (
	"fmt"
	"strings"
	"unicode"

	"steamcell/fn"
	"steamcell/fn/units"
)

// HeaderMatch is what a column header says about its column: the input
// quantity and the unit of bare numbers below it.
type HeaderMatch struct {
	Symbol string      // p, t, h, s, v, rho, u, x
	Q      fn.Quantity // the quantity of Symbol
	Unit   string      // the unit as written ("barg", "°C", "-"); "" if the header gives none
}

// ParseHeader reads a column header such as "P [barg]", "Temperature (°F)",
// "Drum pressure [barg]", "T_steam (C)" or "h (kJ/kg)" and says which input
// quantity the column holds and in which unit. The rules, in order:
//
//  1. The unit is the last bracketed group, "[...]" or "(...)", when it
//     ends the header (nested brackets as in "kJ/(kg·K)" are kept); without
//     brackets it may follow a comma ("Pressure, barg") or be the last word
//     ("P barg", "T °C") when it is a unit of the quantity named before it.
//     Other bracketed groups are decorations ("T (steam) [°C]").
//  2. The rest is split into words at anything that is not a letter
//     ("T_steam" is "t steam", "P1" is "p"). Words that name a quantity
//     (pressure, press, temperature, temp, enthalpy, entropy, volume,
//     density, quality, dryness, "internal energy") are looked for first;
//     without one, a symbol (p, t, h, s, v, u, x, rho, ρ) counts when it is
//     the first or the last word ("T_steam", "Steam T"), so that a letter
//     inside a phrase is not taken for a quantity.
//  3. A header naming two different quantities, or holding a word that
//     makes it a different measurement (flow, time, drop, difference,
//     delta, rise, loss, ratio, rate, superheat, ...: "Pressure drop
//     [kPa]", "Volume flow"), is no match.
//  4. A unit, when given, must be a unit of the quantity ("Tank volume
//     [m³]" is no match); "" means bare numbers are in the caller's unit
//     set.
//
// ExplainHeader says why a header that names a quantity was not taken.
func ParseHeader(text string) (HeaderMatch, bool) {
	m, why := parseHeader(text)
	return m, why == "" && m.Q != 0
}

// ExplainHeader returns why header text, which names an input quantity, is
// not read as one ("\"barx\" is not a unit of pressure"), or "" when the
// header is read (ParseHeader matches) or names no quantity at all.
func ExplainHeader(text string) string {
	_, why := parseHeader(text)
	return why
}

// headerWords are the words that name a quantity wherever they stand.
var headerWords = map[string]fn.Quantity{
	"pressure": fn.Pressure, "press": fn.Pressure, "pres": fn.Pressure,
	"temperature": fn.Temperature, "temp": fn.Temperature,
	"enthalpy": fn.Enthalpy,
	"entropy":  fn.Entropy,
	"volume":   fn.Volume,
	"density":  fn.Density,
	"quality":  fn.Quality, "dryness": fn.Quality,
}

// headerSymbols are the symbols that name a quantity as the first or last
// word of a header.
var headerSymbols = map[string]fn.Quantity{
	"p": fn.Pressure, "t": fn.Temperature, "h": fn.Enthalpy, "s": fn.Entropy,
	"v": fn.Volume, "rho": fn.Density, "ρ": fn.Density, "u": fn.InternalEnergy, "x": fn.Quality,
}

// headerBlockers are words that turn a quantity into another measurement
// (a difference, a rate, a limit) or mark a column that is not a reading.
var headerBlockers = map[string]bool{
	"time": true, "date": true, "duration": true, "elapsed": true,
	"drop": true, "diff": true, "difference": true, "delta": true, "δ": true, "dp": true, "dt": true,
	"rise": true, "loss": true, "ratio": true, "rate": true, "change": true, "gradient": true,
	"error": true, "uncertainty": true, "deviation": true, "tolerance": true,
	"superheat": true, "subcooling": true, "subcool": true, "approach": true, "margin": true,
	"tag": true, "id": true,
}

// parseHeader returns the match and, for a header that names a quantity
// but is not taken, the reason.
func parseHeader(text string) (HeaderMatch, string) {
	text = strings.TrimSpace(text)
	label, unit, bracketed := splitHeaderUnit(text)
	q, sym, why := headerQuantity(label)
	if why != "" {
		return HeaderMatch{}, why
	}
	if q == 0 && !bracketed && unit == "" {
		// "P barg", "Pressure, barg": a unit after a comma or as the last word.
		if l, u, ok := splitTrailingUnit(label); ok {
			if q2, sym2, why2 := headerQuantity(l); q2 != 0 && why2 == "" && unitOf(u, q2) {
				return HeaderMatch{Symbol: sym2, Q: q2, Unit: u}, ""
			}
		}
	}
	if q == 0 {
		return HeaderMatch{}, ""
	}
	if unit == "" && !bracketed {
		if l, u, ok := splitTrailingUnit(label); ok && unitOf(u, q) {
			if q2, _, why2 := headerQuantity(l); q2 == q && why2 == "" {
				unit = u
			}
		}
	}
	if bracketed && !unitOf(unit, q) {
		return HeaderMatch{}, fmt.Sprintf("%s is not a unit of %s; write one of %s in brackets",
			quote(unit), q, strings.Join(unitNames(q), ", "))
	}
	return HeaderMatch{Symbol: sym, Q: q, Unit: unit}, ""
}

// splitHeaderUnit cuts a trailing bracketed group off text. bracketed
// reports whether there was one (its content may be empty).
func splitHeaderUnit(text string) (label, unit string, bracketed bool) {
	if text == "" {
		return "", "", false
	}
	last := text[len(text)-1]
	var open byte
	switch last {
	case ']':
		open = '['
	case ')':
		open = '('
	default:
		return text, "", false
	}
	depth := 0
	for i := len(text) - 1; i >= 0; i-- {
		switch text[i] {
		case last:
			depth++
		case open:
			depth--
			if depth == 0 {
				return strings.TrimSpace(text[:i]), strings.TrimSpace(text[i+1 : len(text)-1]), true
			}
		}
	}
	return text, "", false
}

// splitTrailingUnit splits "Pressure, barg" or "P barg" into label and a
// candidate unit.
func splitTrailingUnit(label string) (string, string, bool) {
	if i := strings.LastIndexByte(label, ','); i >= 0 {
		return strings.TrimSpace(label[:i]), strings.TrimSpace(label[i+1:]), true
	}
	i := strings.LastIndexFunc(label, unicode.IsSpace)
	if i < 0 {
		return "", "", false
	}
	return strings.TrimSpace(label[:i]), strings.TrimSpace(label[i+1:]), true
}

// headerQuantity finds the quantity a label names, by the rules of
// ParseHeader. why is set when the label names a quantity but cannot be
// taken.
func headerQuantity(label string) (q fn.Quantity, sym, why string) {
	words := strings.FieldsFunc(strings.ToLower(label), func(r rune) bool { return !unicode.IsLetter(r) })
	var found []fn.Quantity
	add := func(q fn.Quantity) {
		for _, f := range found {
			if f == q {
				return
			}
		}
		found = append(found, q)
	}
	blocker := ""
	volumeFlow := false // "Volume flow" is a flow; "Flow temperature" is a temperature
	for i, w := range words {
		if w == "flow" {
			volumeFlow = true
		}
		if headerBlockers[w] && blocker == "" {
			blocker = w
		}
		if q, ok := headerWords[w]; ok {
			add(q)
		}
		if w == "energy" && i > 0 && words[i-1] == "internal" {
			add(fn.InternalEnergy)
		}
	}
	if len(found) == 0 && len(words) > 0 {
		if q, ok := headerSymbols[words[0]]; ok {
			add(q)
		}
		if q, ok := headerSymbols[words[len(words)-1]]; ok {
			add(q)
		}
	}
	switch {
	case len(found) == 0:
		return 0, "", ""
	case blocker != "" || volumeFlow && found[0] == fn.Volume:
		// A pressure drop or a temperature rise is not a state: silently no
		// match, as for any other column of the sheet.
		return 0, "", ""
	case len(found) > 1:
		names := make([]string, len(found))
		for i, f := range found {
			names[i] = f.String()
		}
		return 0, "", fmt.Sprintf("%s names %s; name one quantity per column", quote(label), strings.Join(names, " and "))
	}
	return found[0], found[0].Symbol(), ""
}

// unitOf reports whether u is a unit of q ("" always is: bare numbers are
// in the caller's unit set).
func unitOf(u string, q fn.Quantity) bool {
	if u == "" {
		return true
	}
	_, err := units.Lookup(u, DimOf(q))
	return err == nil
}

func unitNames(q fn.Quantity) []string {
	var out []string
	for _, n := range units.ForQuantity(DimOf(q)) {
		if n == "" {
			n = "-"
		}
		out = append(out, n)
	}
	return out
}
