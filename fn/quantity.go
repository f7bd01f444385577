package fn

import (
	"fmt"
	"strings"
)

// Quantity names a property that can be given as an input.
type Quantity int

// The quantities accepted as inputs, with their symbols.
const (
	Pressure       Quantity = iota + 1 // p, MPa
	Temperature                        // t, K
	Enthalpy                           // h, kJ/kg
	Entropy                            // s, kJ/(kg·K)
	Volume                             // v, specific volume, m³/kg
	Density                            // rho, kg/m³
	InternalEnergy                     // u, kJ/kg
	Quality                            // x, vapour mass fraction 0…1
)

var quantityInfo = [...]struct{ symbol, name, unit string }{
	Pressure:       {"p", "pressure", "MPa"},
	Temperature:    {"t", "temperature", "K"},
	Enthalpy:       {"h", "specific enthalpy", "kJ/kg"},
	Entropy:        {"s", "specific entropy", "kJ/(kg·K)"},
	Volume:         {"v", "specific volume", "m³/kg"},
	Density:        {"rho", "density", "kg/m³"},
	InternalEnergy: {"u", "specific internal energy", "kJ/kg"},
	Quality:        {"x", "quality", "fraction"},
}

func (q Quantity) valid() bool { return q >= Pressure && q <= Quality }

// Symbol is the short lower-case name of q used in commands, URLs and JSON:
// p, t, h, s, v, rho, u, x.
func (q Quantity) Symbol() string {
	if !q.valid() {
		return fmt.Sprintf("Quantity(%d)", int(q))
	}
	return quantityInfo[q].symbol
}

// String is the name of q in words.
func (q Quantity) String() string {
	if !q.valid() {
		return fmt.Sprintf("Quantity(%d)", int(q))
	}
	return quantityInfo[q].name
}

// BaseUnit is the unit of q inside the engine.
func (q Quantity) BaseUnit() string {
	if !q.valid() {
		return ""
	}
	return quantityInfo[q].unit
}

// QuantityBySymbol returns the quantity of a symbol (case-insensitive; "T"
// and "t" are both temperature).
func QuantityBySymbol(sym string) (Quantity, bool) {
	sym = strings.ToLower(strings.TrimSpace(sym))
	for q := Pressure; q <= Quality; q++ {
		if quantityInfo[q].symbol == sym {
			return q, true
		}
	}
	return 0, false
}

// Input is one known property of a state, in base units.
type Input struct {
	Q     Quantity
	Value float64
}
