package uncertain

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Convention says what a number written after ± stands for.
type Convention int

// The conventions a request may state. The default is Standard.
const (
	// Standard: the number is a standard uncertainty u, k = 1 (JCGM
	// 100:2008 section 2.3.1).
	Standard Convention = iota
	// Expanded: the number is an expanded uncertainty U at coverage factor
	// k = 2 (JCGM 100:2008 section 2.3.5, 6.2.1), so u = U/2.
	Expanded
	// Rectangular: the number is the half-width a of a rectangular
	// distribution, as in an instrument's stated accuracy limits, so
	// u = a/√3 (JCGM 100:2008 section 4.3.7, Eq. 7).
	Rectangular
)

// ErrConvention: a convention name that is none of the known ones.
var ErrConvention = errors.New("unknown uncertainty convention")

// ParseConvention reads a request's convention: "k1", "std" or "standard"
// (the default, also for ""), "k2" or "expanded", "rect" or "rectangular".
func ParseConvention(s string) (Convention, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "k1", "k=1", "1", "std", "standard":
		return Standard, nil
	case "k2", "k=2", "2", "expanded":
		return Expanded, nil
	case "rect", "rectangular", "uniform":
		return Rectangular, nil
	}
	return Standard, fmt.Errorf("%w: %q; use k1 (standard uncertainty), k2 (expanded, k = 2) or rect (half-width of a rectangular distribution)", ErrConvention, s)
}

// ToStandard converts a stated number to a standard uncertainty.
func (c Convention) ToStandard(a float64) float64 {
	switch c {
	case Expanded:
		return a / 2
	case Rectangular:
		return a / math.Sqrt(3)
	}
	return a
}

// String says in words what the convention takes a stated number for, as
// answers report it.
func (c Convention) String() string {
	switch c {
	case Expanded:
		return "each ± is an expanded uncertainty at k = 2; u = U/2 (JCGM 100:2008 6.2.1)"
	case Rectangular:
		return "each ± is the half-width a of a rectangular distribution; u = a/√3 (JCGM 100:2008 4.3.7)"
	}
	return "each ± is a standard uncertainty, k = 1 (JCGM 100:2008 2.3.1)"
}

// Name is the short name of the convention, as a request gives it.
func (c Convention) Name() string {
	switch c {
	case Expanded:
		return "k2"
	case Rectangular:
		return "rect"
	}
	return "k1"
}

// Method describes the propagation every answer uses.
const Method = "law of propagation of uncertainty, JCGM 100:2008 Eq. (10), first order, inputs uncorrelated; sensitivities from the IF97 derivatives"
