package units

import (
	"encoding/binary"
	"fmt"
	"strings"
	"unicode/utf8"
)

// StandardAtmosphere is the standard atmosphere in MPa, the reference of gauge
// pressures unless a site value is given. Exact by definition (NIST SP 811
// (2008), B.8: standard atmosphere = 101 325 Pa).
const StandardAtmosphere = standardAtmospherePa / 1e6

// Unit is one unit of one quantity. A value v in the unit is
// (v + shift) × mul / div in the quantity's base unit, plus the atmospheric
// pressure for a gauge unit. Decimal sub-multiples divide by an exact power
// of ten, so "600 kPa" gives 0.6 MPa exactly rounded. Get a Unit from Lookup, Dim.Base or Set.Unit; the
// zero Unit converts nothing and must not be used.
type Unit struct {
	Name  string // label as printed: "kPa", "barg", "°C", "kJ/(kg·K)"; "" for a pure number
	Dim   Dim    // quantity measured
	Gauge bool   // a pressure relative to the atmosphere; ToBase adds patm

	mul   float64 // base units per unit = mul/div
	div   float64
	shift float64 // added before scaling: the unit's zero point (temperatures)
}

// ToBase converts v from u to the base unit of u.Dim. patm is the
// atmospheric pressure in MPa that a gauge unit is relative to; 0 means
// StandardAtmosphere, and it is ignored by all other units. ToBase does not
// check its result; Parse does.
func (u Unit) ToBase(v, patm float64) float64 {
	// Multiplying or dividing by 1 changes no float64, so it is skipped.
	b := v + u.shift
	if u.mul != 1 {
		b *= u.mul
	}
	if u.div != 1 {
		b /= u.div
	}
	if u.Gauge {
		if patm == 0 {
			patm = StandardAtmosphere
		}
		b += patm
	}
	return b
}

// FromBase converts b from the base unit of u.Dim to u, the inverse of
// ToBase with the same patm (MPa; 0 means StandardAtmosphere).
func (u Unit) FromBase(b, patm float64) float64 {
	if u.Gauge {
		if patm == 0 {
			patm = StandardAtmosphere
		}
		b -= patm
	}
	return b*u.div/u.mul - u.shift
}

// vacuum reports whether u is a vacuum reading, counted down from the
// atmosphere (its slope is negative).
func (u Unit) vacuum() bool { return u.mul < 0 }

// String returns u.Name.
func (u Unit) String() string { return u.Name }

// Exact definitions the factors below are built from. Go evaluates the
// constant expressions exactly, so each factor is rounded once.
const (
	poundKg              = 0.45359237    // avoirdupois pound, kg (exact; NIST SP 811 (2008), B.8)
	inchM                = 0.0254        // inch, m (exact)
	footM                = 0.3048        // foot, m (exact)
	btuJ                 = 1055.05585262 // British thermal unit (International Table), J (exact)
	calorieJ             = 4.1868        // calorie (International Table), J (exact)
	gravityMS2           = 9.80665       // standard acceleration of gravity, m/s² (exact); 1 kgf = 9.80665 N
	mmHgPa               = 133.322387415 // millimetre of mercury, conventional, Pa (exact: 13.5951 g/cm³ × g_n × 1 mm)
	mmH2OPa              = gravityMS2    // millimetre of water, conventional, Pa (exact: 1 g/cm³ × g_n × 1 mm)
	hourS                = 3600          // hour, s
	rankinePerK          = 1.8           // size of a kelvin in degrees Rankine or Fahrenheit (exact)
	zeroCelsiusK         = 273.15        // 0 °C in K (exact)
	zeroFahrR            = 459.67        // 0 °F in °R (exact)
	standardAtmospherePa = 101325        // standard atmosphere, Pa (exact)
)

// Factors derived from the definitions above.
const (
	psiPa       = poundKg * gravityMS2 / (inchM * inchM) // pound-force per square inch, Pa
	torrPa      = standardAtmospherePa / 760.0           // torr, Pa (exact: 1/760 of the standard atmosphere)
	ataPa       = gravityMS2 * 1e4                       // technical atmosphere (1 kgf/cm²), Pa
	btuPerLbJkg = btuJ / poundKg                         // Btu/lb, J/kg (= 2326 exactly)
)

// unitSpec is one row of the unit table: a unit and the spellings it is
// known by besides its name.
type unitSpec struct {
	name      string
	mul, div  float64 // base units per unit = mul/div; 0 means 1
	shift     float64
	gauge     bool
	spellings []string
	// refuse, when set, makes the spellings known only to be refused
	// with this message: text that could mean two units.
	refuse string
}

// refused returns a row of spellings that are refused with detail.
func refused(detail string, spellings ...string) unitSpec {
	return unitSpec{refuse: detail, spellings: spellings}
}

// vacuum returns a vacuum reading of a unit of mul/div MPa: a value
// counted down from the atmosphere, so p = patm − v·mul/div. It is a
// gauge unit with a negative slope, so that it is relative to
// Options.Patm like any gauge reading.
func vacuum(name string, mul, div float64, spellings ...string) unitSpec {
	return unitSpec{name: name, mul: -mul, div: div, gauge: true, spellings: spellings}
}

// pressureFamily returns an absolute pressure unit and, if gaugeName is not
// empty, its gauge form. The roots (default: the name) are its spellings;
// with a gauge form each root s also reads as absolute with s+"a" and
// s+"abs", and as gauge with s+"g", s+"gauge" and s+"gage" ("bar(g)" and
// "bar g" fold to "barg").
func pressureFamily(name, gaugeName string, mul, div float64, roots ...string) []unitSpec {
	if len(roots) == 0 {
		roots = []string{name}
	}
	abs := unitSpec{name: name, mul: mul, div: div, spellings: roots}
	if gaugeName == "" {
		return []unitSpec{abs}
	}
	g := unitSpec{name: gaugeName, mul: mul, div: div, gauge: true}
	for _, s := range roots {
		abs.spellings = append(abs.spellings, s+"a", s+"abs")
		g.spellings = append(g.spellings, s+"g", s+"gauge", s+"gage")
	}
	return []unitSpec{abs, g}
}

// markedFamily is pressureFamily for a unit that must carry its mark: the
// roots alone are not spellings (see the refused rows of unitTable), only
// the roots with "a", "abs", "g", "gauge" or "gage".
func markedFamily(name, gaugeName string, mul, div float64, roots ...string) []unitSpec {
	f := pressureFamily(name, gaugeName, mul, div, roots...)
	f[0].spellings = f[0].spellings[len(roots):]
	return f
}

func join(groups ...[]unitSpec) []unitSpec {
	var all []unitSpec
	for _, g := range groups {
		all = append(all, g...)
	}
	return all
}

// unitTable lists the units of each quantity, base unit first. Scales are
// base units per unit, from the exact definitions above; NIST SP 811 (2008),
// Appendix B, confirms each in units_nist_test.go.
var unitTable = [numDims][]unitSpec{
	Pressure: join( // base MPa
		pressureFamily("MPa", "MPag", 1, 1),
		pressureFamily("Pa", "", 1, 1e6, "Pa", "N/m²"),
		pressureFamily("kPa", "kPag", 1, 1e3),
		pressureFamily("bar", "barg", 1, 10),
		pressureFamily("mbar", "mbarg", 1, 1e4),
		pressureFamily("psia", "psig", psiPa, 1e6, "psi", "lbf/in²"),
		pressureFamily("atm", "", standardAtmospherePa, 1e6),
		pressureFamily("kgf/cm²", "kgf/cm²g", gravityMS2*1e4, 1e6, "kgf/cm²", "kg/cm²"),
		pressureFamily("mmHg", "", mmHgPa, 1e6),
		pressureFamily("inHg", "", mmHgPa*25.4, 1e6), // conventional: 25.4 mm of conventional mercury
		pressureFamily("torr", "", torrPa, 1e6),
		pressureFamily("ata", "", ataPa, 1e6, "ata", "at abs"),
		// Water columns: the trade reads them as gauge (draft, level,
		// filter loss) or as absolute; unmarked they are refused.
		markedFamily("mmH2Oa", "mmH2Og", mmH2OPa, 1e6, "mmH2O", "mmWC"),
		markedFamily("inH2Oa", "inH2Og", mmH2OPa*25.4, 1e6, "inH2O", "inWC"),
		[]unitSpec{
			vacuum("inHg vac", mmHgPa*25.4, 1e6, "inHg vacuum", "inHgV"),
			vacuum("mmHg vac", mmHgPa, 1e6, "mmHg vacuum"),
			vacuum("kPa vac", 1, 1e3, "kPa vacuum"),
			refused("a water column needs its mark: write mmH2Og (gauge, against patm) or mmH2Oa (absolute)", "mmH2O", "mmWC", "mm w.c."),
			refused("a water column needs its mark: write inH2Og (gauge, against patm) or inH2Oa (absolute)", "inH2O", "inWC", "in w.c.", "\"WC", "\"H2O"),
			refused("at alone may be gauge or absolute: write ata for the technical atmosphere absolute, or kgf/cm²g for gauge", "at", "atu"),
			refused("vac needs a unit: write inHg vac, mmHg vac or kPa vac, or give the absolute pressure", "vac", "vacuum"),
		},
	),
	Temperature: { // base K
		{name: "K", spellings: []string{"kelvin"}},
		{name: "°C", shift: zeroCelsiusK, spellings: []string{"C", "℃", "celsius"}},
		{name: "°F", div: rankinePerK, shift: zeroFahrR, spellings: []string{"F", "℉", "fahrenheit"}},
		{name: "°R", div: rankinePerK, spellings: []string{"R", "rankine"}},
	},
	SpecificEnergy: { // base kJ/kg
		{name: "kJ/kg", spellings: []string{"J/g"}},
		{name: "J/kg", div: 1e3},
		{name: "MJ/kg", mul: 1e3, spellings: []string{"kJ/g"}},
		{name: "Btu/lb", mul: btuPerLbJkg, div: 1e3},
		{name: "kcal/kg", mul: calorieJ, spellings: []string{"cal/g"}},
	},
	SpecificEntropy: { // base kJ/(kg·K); per kelvin = per degree Celsius for a difference
		{name: "kJ/(kg·K)", spellings: []string{"kJ/kg/K", "kJ/(kg·°C)", "kJ/kg/°C", "J/(g·K)", "J/g/K", "J/(g·°C)", "J/g/°C"}},
		{name: "J/(kg·K)", div: 1e3, spellings: []string{"J/kg/K", "J/(kg·°C)", "J/kg/°C"}},
		// A degree Rankine and a degree Fahrenheit are the same size, so per
		// °R and per °F are the same unit; both names are kept for printing.
		{name: "Btu/(lb·°R)", mul: btuPerLbJkg * rankinePerK, div: 1e3, spellings: []string{"Btu/lb/°R"}},
		{name: "Btu/(lb·°F)", mul: btuPerLbJkg * rankinePerK, div: 1e3, spellings: []string{"Btu/lb/°F"}},
		{name: "kcal/(kg·K)", mul: calorieJ, spellings: []string{"kcal/kg/K", "kcal/(kg·°C)", "kcal/kg/°C", "cal/(g·K)", "cal/(g·°C)", "cal/g/K", "cal/g/°C"}},
	},
	SpecificVolume: { // base m³/kg
		{name: "m³/kg"},
		{name: "L/kg", div: 1e3, spellings: []string{"dm³/kg"}},
		{name: "cm³/g", div: 1e3, spellings: []string{"mL/g"}},
		{name: "ft³/lb", mul: footM * footM * footM / poundKg},
	},
	Density: { // base kg/m³
		{name: "kg/m³", spellings: []string{"g/L"}},
		{name: "g/cm³", mul: 1e3, spellings: []string{"g/mL", "kg/L", "kg/dm³"}},
		{name: "lb/ft³", mul: poundKg / (footM * footM * footM)},
	},
	Speed: { // base m/s
		{name: "m/s"},
		{name: "ft/s", mul: footM},
	},
	DynamicViscosity: { // base Pa·s
		{name: "Pa·s", spellings: []string{"kg/(m·s)", "N·s/m²"}},
		{name: "mPa·s", div: 1e3},
		{name: "µPa·s", div: 1e6},
		{name: "cP", div: 1e3, spellings: []string{"cps", "centipoise"}},
		{name: "lb/(ft·h)", mul: poundKg / (footM * hourS), spellings: []string{"lb/ft/h"}},
		{name: "lb/(ft·s)", mul: poundKg / footM, spellings: []string{"lb/ft/s"}},
	},
	ThermalConductivity: { // base W/(m·K)
		{name: "W/(m·K)", spellings: []string{"W/m/K", "W/(m·°C)", "W/m/°C"}},
		{name: "mW/(m·K)", div: 1e3, spellings: []string{"mW/m/K", "mW/(m·°C)", "mW/m/°C"}},
		{name: "Btu/(h·ft·°F)", mul: btuJ * rankinePerK / (hourS * footM), spellings: []string{
			"Btu/(h·ft·°R)", "Btu/h/ft/°F", "Btu/(ft·h·°F)"}},
	},
	SurfaceTension: { // base N/m
		{name: "N/m"},
		{name: "mN/m", div: 1e3},
		{name: "dyn/cm", div: 1e3},
	},
	Quality: { // base: mass fraction 0..1
		{name: "", spellings: []string{"-", "fraction"}},
		{name: "%", div: 100, spellings: []string{"percent"}},
	},
	KinematicViscosity: { // base m²/s
		{name: "m²/s"},
		{name: "mm²/s", div: 1e6},
		{name: "cSt", div: 1e6, spellings: []string{"centistokes"}},
		{name: "cm²/s", div: 1e4},
		{name: "ft²/s", mul: footM * footM},
		{name: "ft²/h", mul: footM * footM, div: hourS},
	},
	ThermalDiffusivity: { // base m²/s
		{name: "m²/s"},
		{name: "mm²/s", div: 1e6},
		{name: "cm²/s", div: 1e4},
		{name: "ft²/s", mul: footM * footM},
		{name: "ft²/h", mul: footM * footM, div: hourS},
	},
	InverseTemperature: { // base 1/K; per kelvin = per degree Celsius for a difference
		{name: "1/K", spellings: []string{"K⁻¹", "K^-1"}},
		{name: "1/°C", spellings: []string{"°C⁻¹", "°C^-1"}},
		{name: "1/°F", mul: rankinePerK, spellings: []string{"°F⁻¹", "°F^-1"}},
		{name: "1/°R", mul: rankinePerK, spellings: []string{"°R⁻¹", "°R^-1"}},
	},
	InversePressure: { // base 1/MPa
		{name: "1/MPa", spellings: []string{"MPa⁻¹", "MPa^-1"}},
		{name: "1/kPa", mul: 1e3, spellings: []string{"kPa⁻¹", "kPa^-1"}},
		{name: "1/Pa", mul: 1e6, spellings: []string{"Pa⁻¹", "Pa^-1"}},
		{name: "1/bar", mul: 10, spellings: []string{"bar⁻¹", "bar^-1"}},
		{name: "1/psi", mul: 1e6, div: psiPa, spellings: []string{"psi⁻¹", "psi^-1"}},
	},
	Dimensionless: {
		{name: "", spellings: []string{"-"}},
	},
}

// caseTrap is a spelling in exact SI case whose prefix names another unit
// than the one its case-folded form matches. Such text is refused rather
// than read either way.
type caseTrap struct {
	prefix string // compared with the unit text as typed, case-sensitive
	detail string
}

var caseTraps = [numDims][]caseTrap{
	Pressure: {
		{"mPa", "mPa is the millipascal; for megapascal write MPa"},
		{"Mbar", "Mbar is the megabar; for millibar write mbar"},
	},
	SpecificEnergy: {
		{"mJ", "mJ/kg is the millijoule per kilogram; for megajoule write MJ/kg"},
	},
	DynamicViscosity: {
		{"MPa", "MPa·s is the megapascal second; for millipascal second write mPa·s"},
	},
	ThermalConductivity: {
		{"MW", "MW/(m·K) is megawatt per metre kelvin; for milliwatt write mW/(m·K)"},
	},
	SurfaceTension: {
		{"MN", "MN/m is meganewton per metre; for millinewton write mN/m"},
	},
	KinematicViscosity: {
		{"Mm", "Mm²/s is square megametre per second; for square millimetre write mm²/s"},
	},
	ThermalDiffusivity: {
		{"Mm", "Mm²/s is square megametre per second; for square millimetre write mm²/s"},
	},
	InversePressure: {
		{"1/mPa", "1/mPa is per millipascal; for per megapascal write 1/MPa"},
		{"mPa", "mPa⁻¹ is per millipascal; for per megapascal write 1/MPa"},
	},
}

// trapStart holds, as a set of bytes, the first bytes of the case traps of
// each quantity: text starting with any other byte springs no trap.
var trapStart = func() (s [numDims][4]uint64) {
	for d, traps := range caseTraps {
		for _, t := range traps {
			c := t.prefix[0]
			s[d][c>>6] |= 1 << (c & 63)
		}
	}
	return s
}()

type dimUnits struct {
	units   []Unit
	keys    keyTable          // folded spelling -> index in units
	names   []string          // canonical names, for messages
	refused map[string]string // folded spelling -> why it is refused
}

// registry holds the units of each quantity, built once from unitTable.
var registry = buildRegistry()

func buildRegistry() [numDims]dimUnits {
	var reg [numDims]dimUnits
	var buf [maxKey]byte
	for d := Pressure; d <= Dimensionless; d++ {
		r := &reg[d]
		byKey := make(map[string]uint8)
		r.refused = make(map[string]string)
		for _, s := range unitTable[d] {
			if s.refuse == "" {
				continue
			}
			for _, sp := range s.spellings {
				n, _, ok := foldKey(&buf, sp)
				if !ok {
					panic(fmt.Sprintf("units: refused spelling %q of %s cannot be folded", sp, d))
				}
				r.refused[string(buf[:n])] = s.refuse
			}
		}
		for _, s := range unitTable[d] {
			if s.refuse != "" {
				continue
			}
			i := len(r.units)
			u := Unit{Name: s.name, Dim: d, Gauge: s.gauge, mul: s.mul, div: s.div, shift: s.shift}
			if u.mul == 0 {
				u.mul = 1
			}
			if u.div == 0 {
				u.div = 1
			}
			r.units = append(r.units, u)
			r.names = append(r.names, s.name)
			for _, sp := range append([]string{s.name}, s.spellings...) {
				n, _, ok := foldKey(&buf, sp)
				if !ok {
					panic(fmt.Sprintf("units: spelling %q of %s cannot be folded", sp, d))
				}
				k := string(buf[:n])
				if strings.ContainsFunc(k, func(r rune) bool { return r < ' ' || r == ',' }) {
					// parseFast relies on no spelling matching text
					// with a comma or a control character.
					panic(fmt.Sprintf("units: spelling %q of %s folds to a comma or control character", sp, d))
				}
				if j, dup := byKey[k]; dup && int(j) != i {
					panic(fmt.Sprintf("units: %s spelling %q of %q folds like one of %q", d, sp, s.name, r.units[j].Name))
				}
				if _, dup := r.refused[k]; dup {
					panic(fmt.Sprintf("units: %s spelling %q of %q is also refused", d, sp, s.name))
				}
				byKey[k] = uint8(i)
			}
		}
		r.keys = newKeyTable(byKey)
	}
	return reg
}

// keyTable is a fixed open-addressing hash table from folded spellings to
// unit indexes, built once and only read after. A slot holds the first and
// the last eight bytes of its key, which are the whole key up to 16 bytes,
// so most lookups compare two words and no string.
type keyTable struct {
	slots []keySlot // len is a power of two, at least twice the keys
	shift uint      // 64 - log2(len(slots))
}

type keySlot struct {
	lo, hi uint64 // the key's first and last eight bytes (see keyWords)
	n      uint8  // length of the key
	idx    uint8  // 1 + index in units; 0: empty slot
	key    string
}

func newKeyTable(m map[string]uint8) keyTable {
	bits := uint(3)
	for 1<<bits < 2*len(m) {
		bits++
	}
	t := keyTable{slots: make([]keySlot, 1<<bits), shift: 64 - bits}
	var buf [maxKey]byte
	for k, i := range m {
		n := copy(buf[:], k)
		lo, hi := keyWords(&buf, n)
		j := t.home(lo, hi)
		for t.slots[j].idx != 0 {
			j = (j + 1) & (len(t.slots) - 1)
		}
		t.slots[j] = keySlot{lo: lo, hi: hi, n: uint8(n), idx: i + 1, key: k}
	}
	return t
}

// keyWords returns the first eight bytes of the key buf[:n] and, if it is
// longer, its last eight, little-endian; bytes past n count as zero.
func keyWords(buf *[maxKey]byte, n int) (lo, hi uint64) {
	lo = binary.LittleEndian.Uint64(buf[:8])
	if n < 8 {
		lo &= 1<<(8*uint(n)) - 1
	}
	return lo, keyHi(buf, n)
}

// keyHi returns the last eight bytes of the key buf[:n] if it is longer
// than eight bytes, else 0.
func keyHi(buf *[maxKey]byte, n int) uint64 {
	if n <= 8 {
		return 0
	}
	return binary.LittleEndian.Uint64(buf[n-8 : n])
}

// home returns the slot a key starts its search at.
func (t *keyTable) home(lo, hi uint64) int {
	const m = 0x9e3779b97f4a7c15 // 2^64 / golden ratio
	return int((lo ^ hi<<7 ^ hi>>57) * m >> t.shift)
}

// get returns the unit index stored for the folded spelling buf[:n], whose
// first eight bytes (keyWords) are lo.
func (t *keyTable) get(buf *[maxKey]byte, n int, lo uint64) (int, bool) {
	hi := keyHi(buf, n)
	for j := t.home(lo, hi); ; j = (j + 1) & (len(t.slots) - 1) {
		s := &t.slots[j]
		if s.idx == 0 {
			return 0, false
		}
		if s.lo == lo && s.hi == hi && int(s.n) == n && (n <= 16 || s.key == string(buf[:n])) {
			return int(s.idx) - 1, true
		}
	}
}

// maxKey bounds the length of a folded unit spelling; longer text is no unit.
const maxKey = 48

// skipByte marks in asciiFold the ASCII characters that folding drops.
const skipByte = 0xff

// asciiFold gives the folded form of each ASCII character: letters in
// lower case, skipByte for spaces, product signs, hyphens, brackets and '^',
// and the character itself otherwise.
var asciiFold = func() (t [utf8.RuneSelf]byte) {
	for c := range t {
		t[c] = byte(c)
	}
	for c := 'A'; c <= 'Z'; c++ {
		t[c] = byte(c) + 'a' - 'A'
	}
	for _, c := range " \t.*-^()[]{}" {
		t[c] = skipByte
	}
	return t
}()

// foldKey writes into buf the form of unit text s that spellings are
// compared in, and returns its length and its first eight bytes as
// keyWords gives them; ok is false if s cannot be a unit.
// Folding drops spaces, product signs (· ⋅ ∙ * . ×), hyphens and minus
// signs, brackets, '^' and degree signs; turns superscript digits into
// digits and µ/μ into u; lower-cases letters; drops the words "deg",
// "degree", "degrees"; and reads "lbm" as "lb", "hr" as "h", "sec" as "s".
// So "kJ/(kg·K)", "kJ/kg-K", "KJ/KG K" and "kJ/kg.K" all fold to "kj/kgk".
func foldKey(buf *[maxKey]byte, s string) (n int, lo uint64, ok bool) {
	var seen uint64 // bit c&63 set for each folded byte c
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			i++
			if c = asciiFold[c]; c == skipByte {
				continue
			}
		} else {
			r, size := utf8.DecodeRuneInString(s[i:])
			i += size
			switch r {
			case '\u00a0', '\u2009', '\u202f', '\u2002', '\u2003', '\u2007', // spaces
				'·', '⋅', '∙', '•', '×', // product signs
				'−', '‐', '‑', '⁻', // minus signs and hyphens
				'°', 'º', '˚': // degree, masculine ordinal, ring: all typed for degree
				continue
			case '³':
				c = '3'
			case '²':
				c = '2'
			case '¹':
				c = '1'
			case 'µ', 'μ':
				c = 'u'
			case '℃':
				c = 'c'
			case '℉':
				c = 'f'
			case '\u212a': // kelvin sign
				c = 'k'
			case '∕': // division slash
				c = '/'
			default:
				return 0, 0, false
			}
		}
		if n == maxKey {
			return 0, 0, false
		}
		lo |= uint64(c) << (8 * uint(n)) // 0 from the ninth byte on
		seen |= 1 << (c & 63)
		buf[n] = c
		n++
	}
	// The words below can only be there if all the letters of one of
	// "deg", "lbm", "hr" and "sec" are; most units lack them all.
	if seen&wordsDeg != wordsDeg && seen&wordsLbm != wordsLbm &&
		seen&wordsHr != wordsHr && seen&wordsSec != wordsSec {
		return n, lo, true
	}
	b := buf[:n]
	b = cutWord(b, "degrees", "")
	b = cutWord(b, "degree", "")
	b = cutWord(b, "deg", "")
	b = cutWord(b, "lbm", "lb")
	b = cutWord(b, "hr", "h")
	b = cutWord(b, "sec", "s")
	lo, _ = keyWords(buf, len(b))
	return len(b), lo, true
}

// Sets of letters, as foldKey's seen holds them, of the words it rewrites.
const (
	wordsDeg = 1<<('d'&63) | 1<<('e'&63) | 1<<('g'&63)
	wordsLbm = 1<<('l'&63) | 1<<('b'&63) | 1<<('m'&63)
	wordsHr  = 1<<('h'&63) | 1<<('r'&63)
	wordsSec = 1<<('s'&63) | 1<<('e'&63) | 1<<('c'&63)
)

// cutWord replaces in place every old in b by new, which is not longer.
func cutWord(b []byte, old, new string) []byte {
	for i := 0; i+len(old) <= len(b); {
		if string(b[i:i+len(old)]) != old {
			i++
			continue
		}
		copy(b[i:], new)
		b = append(b[:i+len(new)], b[i+len(old):]...)
		i += len(new)
	}
	return b
}

// find returns the index in registry[d].units of the unit of d that text
// names. trap is set when the text folds to a unit of d but its exact case
// names another prefix.
func find(text string, d Dim) (i int, trap string, ok bool) {
	var buf [maxKey]byte
	n, lo, ok := foldKey(&buf, text)
	if !ok || (n == 0 && text != "" && text != "-") {
		// Text of separators only ("()", ".") names nothing; "-" is
		// the dash tables print for a pure number.
		return 0, "", false
	}
	i, ok = registry[d].keys.get(&buf, n, lo)
	if !ok {
		return 0, registry[d].refused[string(buf[:n])], false
	}
	if text == "" {
		return i, "", true
	}
	if c := text[0]; trapStart[d][c>>6]&(1<<(c&63)) != 0 {
		for _, t := range caseTraps[d] {
			if strings.HasPrefix(text, t.prefix) {
				return 0, t.detail, false
			}
		}
	}
	return i, "", true
}

// Lookup returns the unit of quantity d named by name, in any spelling the
// package doc lists. The error is an *InputError of kind ErrEmpty,
// ErrUnknownUnit or ErrWrongDimension whose message lists the units d
// accepts. For Quality and Dimensionless, "" names the pure number.
func Lookup(name string, d Dim) (Unit, error) {
	if !d.valid() {
		return Unit{}, &InputError{Text: name, Dim: d, Err: ErrUnknownUnit, Detail: "no quantity given to look the unit up in"}
	}
	text := strings.TrimSpace(name)
	i, trap, ok := find(text, d)
	if ok {
		return registry[d].units[i], nil
	}
	return Unit{}, unitError("", name, text, trap, d)
}

// ForQuantity returns the names of the units accepted for d, base unit
// first, as they are printed ("" is the pure number of Quality and
// Dimensionless). Other spellings of the same units are also accepted;
// see the package doc.
func ForQuantity(d Dim) []string {
	if !d.valid() {
		return nil
	}
	return append([]string(nil), registry[d].names...)
}

// unitList renders the accepted units of d for a message.
func unitList(d Dim) string {
	names := registry[d].names
	parts := make([]string, len(names))
	for i, n := range names {
		if n == "" {
			n = "none (a fraction)"
			if d == Dimensionless {
				n = "none"
			}
		}
		parts[i] = n
	}
	return strings.Join(parts, ", ")
}

// unitError builds the error for unit text that d does not accept: a case
// trap, a unit of another quantity, an empty unit, or an unknown one. name is
// the input's name and text the whole input as given.
func unitError(name, text, unitText, trap string, d Dim) *InputError {
	e := &InputError{Name: name, Text: text, Dim: d}
	who := inputName(name)
	switch {
	case trap != "":
		e.Err = ErrUnknownUnit
		e.Detail = fmt.Sprintf("%s; %s needs a unit of %s: %s", trap, who, d, unitList(d))
	case unitText == "":
		e.Err = ErrEmpty
		e.Detail = fmt.Sprintf("no unit given; %s needs a unit of %s: %s", who, d, unitList(d))
	default:
		var others []string
		var canon string
		for o := Pressure; o <= Dimensionless; o++ {
			if o == d {
				continue
			}
			if i, _, ok := find(unitText, o); ok && registry[o].units[i].Name != "" {
				others = append(others, o.String())
				canon = registry[o].units[i].Name
			}
		}
		if len(others) > 0 {
			e.Err = ErrWrongDimension
			e.Detail = fmt.Sprintf("%s is a unit of %s; %s needs a unit of %s: %s",
				canon, strings.Join(others, " or "), who, d, unitList(d))
			return e
		}
		e.Err = ErrUnknownUnit
		e.Detail = fmt.Sprintf("unknown unit %q; %s needs a unit of %s: %s", unitText, who, d, unitList(d))
	}
	return e
}
