package units

import (
	"math"
	"strings"
	"sync/atomic"
)

// parseFast reads the common shapes of a value quickly: optional spaces, an
// ASCII number ("6", "-0.5", "1.2e3") that float64 holds after one rounding,
// and then either nothing or optional spaces and a unit that starts with a
// letter, '%', '°', 'µ' or a letterlike symbol such as '℃'. It returns ok only
// for text that parse reads without error, and then the same value and
// unit; anything else, every error included, it leaves to parseFull, which
// then reads the text from the start.
func parseFast(text string, d Dim, opt *Options) (float64, *Unit, bool) {
	if !d.valid() || (opt.Patm != 0 && !(opt.Patm >= MinPatm && opt.Patm <= MaxPatm)) {
		return 0, nil, false
	}
	i := 0
	for i < len(text) && (text[i] == ' ' || text[i] == '\t') {
		i++
	}
	neg := false
	if i < len(text) && (text[i] == '-' || text[i] == '+') {
		neg = text[i] == '-'
		i++
	}
	// Digits, while they fit an exact float64 after one scaling by a
	// power of ten. Both are exact, so the one rounding gives what
	// strconv.ParseFloat gives.
	var mant uint64
	exp10, digits := 0, 0
	for ; i < len(text) && isDigit(text[i]); i++ {
		if mant >= 1e15 {
			return 0, nil, false
		}
		mant = mant*10 + uint64(text[i]-'0')
		digits++
	}
	if i < len(text) && text[i] == '.' {
		for i++; i < len(text) && isDigit(text[i]); i++ {
			if mant >= 1e15 {
				return 0, nil, false
			}
			mant = mant*10 + uint64(text[i]-'0')
			exp10--
			digits++
		}
	}
	if digits == 0 {
		return 0, nil, false
	}
	if i < len(text) && (text[i] == 'e' || text[i] == 'E') {
		i++
		expNeg := false
		if i < len(text) && (text[i] == '-' || text[i] == '+') {
			expNeg = text[i] == '-'
			i++
		}
		if i == len(text) || !isDigit(text[i]) {
			return 0, nil, false
		}
		e := 0
		for ; i < len(text) && isDigit(text[i]); i++ {
			if e >= 1000 {
				return 0, nil, false
			}
			e = e*10 + int(text[i]-'0')
		}
		if expNeg {
			e = -e
		}
		exp10 += e
	}
	if mant >= 1<<53 || exp10 < -22 || exp10 > 22 {
		return 0, nil, false
	}
	v := float64(mant)
	if neg {
		v = -v
	}
	if exp10 > 0 {
		v *= pow10[exp10]
	} else if exp10 < 0 {
		v /= pow10[-exp10]
	}

	for i < len(text) && (text[i] == ' ' || text[i] == '\t') {
		i++
	}
	reg := &registry[d]
	var sep *Unit // the unit given separately
	if opt.Unit != "" {
		k, ok := findRecent(strings.TrimSpace(opt.Unit), d)
		if !ok {
			return 0, nil, false
		}
		sep = &reg.units[k]
	}
	var u *Unit
	switch {
	case i < len(text):
		// The unit must start with a character that neither continues
		// the number nor is a space, so the rules on digit groups and
		// spaces inside numbers have nothing to refuse.
		switch c := text[i]; {
		case 'a' <= c|0x20 && c|0x20 <= 'z', c == '%':
		case strings.HasPrefix(text[i:], "°"), strings.HasPrefix(text[i:], "µ"), strings.HasPrefix(text[i:], "μ"):
		case c == 0xe2 && i+1 < len(text) && text[i+1] == 0x84: // U+2100..U+213F: ℃ ℉ K (kelvin sign)
		default:
			return 0, nil, false
		}
		// Spaces after the unit, which parseFull trims, fold away or
		// leave a byte that no spelling holds, so they change no match.
		k, ok := findRecent(text[i:], d)
		if !ok {
			return 0, nil, false
		}
		u = &reg.units[k]
		if sep != nil && sep.Gauge != u.Gauge {
			return 0, nil, false
		}
		if u.vacuum() && v < 0 {
			return 0, nil, false
		}
	case sep != nil:
		u = sep
	default:
		u = &reg.units[opt.Set.index(d)]
	}

	// Each test below fails for NaN and the infinities too.
	b := u.ToBase(v, opt.Patm)
	switch d {
	case Pressure, Temperature:
		if !(b > 0 && b <= math.MaxFloat64) {
			return 0, nil, false
		}
	case Quality:
		if !(b >= 0 && b <= 1) {
			return 0, nil, false
		}
	default:
		if !(math.Abs(b) <= math.MaxFloat64) {
			return 0, nil, false
		}
	}
	if b == 0 {
		b = 0 // no negative zero
	}
	return b, u, true
}

// pow10 holds the powers of ten that float64 holds exactly.
var pow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// recentUnits remembers, per quantity, the last few unit texts parseFast
// found and their indexes: each column of a sheet or a batch gives the same
// unit on every row, and comparing the text is cheaper than folding and
// looking it up again. An entry's text and index are never changed, so
// concurrent readers see one whole entry or another; its used mark is a
// hint only.
type recentUnit struct {
	text string // a copy, so the caller's (maybe large) string is not kept alive
	k    int
	used atomic.Bool // hit since the marks were last cleared
}

// recentSlots is how many unit texts per quantity are remembered: enough
// for the columns of one quantity that a sheet gives in different units.
const recentSlots = 4

// recentMisses is how many missed texts per quantity are remembered (see
// recentMiss).
const recentMisses = 2

// recentAging is how many refused entries (no slot free or unused) clear
// the used marks, so that units no longer read make room in the end.
const recentAging = 64

var (
	recentUnits [numDims][recentSlots]atomic.Pointer[recentUnit]
	// recentMiss holds hashes of the last two texts per quantity that
	// missed. An entry is made (one allocation) only when a text misses
	// again while its hash is still here, and only into a slot that is
	// free or whose entry was not hit since the marks were cleared. So
	// two columns in two units (A, B, A, B, …) are both remembered from
	// their second row on, while units that rotate through more texts
	// than there are slots (six columns in six units) cannot push each
	// other out on every row: they make at most a few entries each time
	// the marks are cleared, once per recentAging refusals.
	recentMiss     [numDims][recentMisses]atomic.Uint64
	recentMissNext [numDims]atomic.Uint32 // picks the hash the next miss replaces, in turn
	recentRefused  [numDims]atomic.Uint32 // entries refused, for the aging
)

// findRecent is find for parseFast, through recentUnits. Only texts that
// find accepts are remembered, so a hit gives what find would.
func findRecent(text string, d Dim) (int, bool) {
	slots := &recentUnits[d]
	for j := range slots {
		if r := slots[j].Load(); r != nil && r.text == text {
			if !r.used.Load() {
				r.used.Store(true)
			}
			return r.k, true
		}
	}
	k, _, ok := find(text, d)
	if !ok || len(text) > maxKey {
		return k, ok
	}
	h := textHash(text)
	misses := &recentMiss[d]
	for j := range misses {
		if misses[j].Load() != h {
			continue
		}
		for v := range slots {
			if r := slots[v].Load(); r == nil || !r.used.Load() {
				misses[j].Store(0)
				e := &recentUnit{text: strings.Clone(text), k: k}
				e.used.Store(true)
				slots[v].Store(e)
				return k, ok
			}
		}
		if recentRefused[d].Add(1)%recentAging == 0 {
			for v := range slots {
				if r := slots[v].Load(); r != nil {
					r.used.Store(false)
				}
			}
		}
		return k, ok
	}
	misses[recentMissNext[d].Add(1)%recentMisses].Store(h)
	return k, ok
}

// textHash is the 64-bit FNV-1a hash of s (a hint only: a collision costs
// one needless entry, never a wrong unit).
func textHash(s string) uint64 {
	h := uint64(14695981039346656037)
	for i := 0; i < len(s); i++ {
		h ^= uint64(s[i])
		h *= 1099511628211
	}
	return h
}
