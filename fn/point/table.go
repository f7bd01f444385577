package point

import (
	"fmt"
	"strings"
	"unicode"

	"steamcell/fn"
	"steamcell/fn/units"
)

// UnitSource says where the unit of an input column comes from.
type UnitSource uint8

// Where a column's unit comes from, in the order they are consulted.
const (
	FromMap     UnitSource = iota + 1 // the column map (--map "C=p:barg")
	FromHeader                        // the header ("Drum pressure [barg]")
	FromUnitRow                       // the row of units under the header ("barg")
	FromSet                           // nowhere: bare numbers are in the unit set
)

// Column is one input column of a table as ReadTable reads it.
type Column struct {
	Index   int         // 0-based position in the header row
	Header  string      // the header as written, trimmed; "" for a mapped column without one
	Symbol  string      // p, t, h, s, v, rho, u, x
	Q       fn.Quantity // the quantity of Symbol
	Unit    string      // the unit of bare numbers as written ("barg", "°C"); "" when From is FromSet
	From    UnitSource  // how Unit was decided
	Set     string      // with FromSet: the name of the unit set, e.g. "si"
	SetUnit string      // with FromSet: the set's unit bare numbers are read in ("kPa"; "" for a fraction)
	Mapped  bool        // the column comes from the column map
}

// Given returns a cell of the column as an input to Solve.
func (c Column) Given(text string) Given {
	return Given{Name: c.Symbol, Text: text, Unit: c.Unit, q: c.Q}
}

// Note says how the column's numbers are read, for an answer or a summary:
// `p "Pressure": read as kPa, unit set si` or `p "P [barg]": barg, from
// the header`.
func (c Column) Note() string {
	head := c.Symbol
	if c.Header != "" {
		head += " " + quote(c.Header)
	}
	switch c.From {
	case FromMap:
		return head + ": " + unitWords(c.Unit) + ", from the column map"
	case FromHeader:
		return head + ": " + unitWords(c.Unit) + ", from the header"
	case FromUnitRow:
		return head + ": " + unitWords(c.Unit) + ", from the row of units under the header"
	}
	return head + ": read as " + unitWords(c.SetUnit) + ", unit set " + c.Set
}

// unitWords names a unit in a note; a quality without one is a fraction.
func unitWords(u string) string {
	if u == "" || u == "-" {
		return "a fraction"
	}
	return u
}

// Table is what a header row (with its row of units and the column map)
// says about the input columns below it.
type Table struct {
	Columns []Column // left to right, or in the order of the map
	UnitRow bool     // the row under the header is a row of units, not data
}

// MapColumn is one column of a column map.
type MapColumn struct {
	Index  int         // 0-based column
	Symbol string      // the input's symbol
	Q      fn.Quantity // its quantity
	Unit   string      // the unit as written; "" when the map gives none
}

// Map says which columns hold which inputs, two per point, as the column
// map of fill (--map "C=p:barg,D=t:C;E=p:barg,F=t:C") gives it: entries 2k
// and 2k+1 fix one state. A nil Map means the headers say.
type Map []MapColumn

// ParseMap reads a column map: pairs separated by ';', in each two items
// COLUMN=INPUT[:UNIT] separated by ',', where COLUMN is a letter column
// name (A, B, …, AA, …), INPUT an input name and UNIT a unit of it.
func ParseMap(text string) (Map, error) {
	bad := func(format string, args ...any) error {
		return &Error{Kind: ErrMap, Msg: "column map " + quote(text) + ": " + fmt.Sprintf(format, args...)}
	}
	var m Map
	used := map[int]bool{}
	for _, group := range strings.Split(text, ";") {
		if strings.TrimSpace(group) == "" {
			continue
		}
		items := strings.Split(group, ",")
		if len(items) != 2 {
			return nil, bad("%s has %d columns; give two per pair, e.g. B=p:barg,C=t:C", quote(strings.TrimSpace(group)), len(items))
		}
		for _, item := range items {
			col, rest, ok := strings.Cut(strings.TrimSpace(item), "=")
			if !ok {
				return nil, bad("%s is not COLUMN=INPUT[:UNIT], e.g. C=t:C", quote(strings.TrimSpace(item)))
			}
			col = strings.ToUpper(strings.TrimSpace(col))
			idx, ok := columnIndex(col)
			if !ok {
				return nil, bad("%s is not a column letter", quote(col))
			}
			name, unit, _ := strings.Cut(rest, ":")
			name, unit = strings.TrimSpace(name), strings.TrimSpace(unit)
			q, ok := InputQuantity(name)
			if !ok {
				return nil, bad("%s is not an input; inputs are %s", quote(name), strings.Join(InputNames(), ", "))
			}
			if unit != "" {
				if _, err := units.Lookup(unit, DimOf(q)); err != nil {
					return nil, bad("column %s: %v", col, err)
				}
			}
			if used[idx] {
				return nil, bad("column %s is given twice", col)
			}
			used[idx] = true
			m = append(m, MapColumn{Index: idx, Symbol: q.Symbol(), Q: q, Unit: unit})
		}
	}
	if len(m) == 0 {
		return nil, bad("no columns given; write e.g. B=p:barg,C=t:C")
	}
	return m, nil
}

// columnIndex reads a spreadsheet column name ("A" is 0, "AA" 26) up to
// XFD, the last column a sheet may have.
func columnIndex(s string) (int, bool) {
	if s == "" || len(s) > 3 {
		return 0, false
	}
	n := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c < 'A' || c > 'Z' {
			return 0, false
		}
		n = n*26 + int(c-'A'+1)
	}
	const lastColumn = 16384 // XFD
	return n - 1, n <= lastColumn
}

// ReadTable reads the input columns of a table: the cells of its header
// row, the row under it (nil when there is none; it is a row of units
// when the cells under the input columns are units of their quantities,
// blanks allowed), and the column map (nil: the headers say). set is the
// unit set bare numbers are read in. The rules for a header are those of
// the package documentation (section "Headers"); a header that breaks one
// stops the table with an *Error of kind ErrHeader that lists the headers
// seen. ReadTable does not count the columns: a batch wants two, a
// workbook two per point.
func ReadTable(header, unitRow []string, m Map, set units.Set) (Table, error) {
	var drafts []draft
	if m == nil {
		for i, h := range header {
			d := readHeader(h)
			if d.q == 0 {
				continue
			}
			d.col.Index = i
			drafts = append(drafts, d)
		}
	} else {
		for _, mc := range m {
			h := ""
			if mc.Index < len(header) {
				h = header[mc.Index]
			}
			d := readHeader(h)
			if mc.Unit != "" || d.q != mc.Q {
				// The map decides; a header about something else says
				// nothing about the unit.
				d = draft{}
			}
			d.col.Index, d.col.Header, d.col.Symbol, d.col.Q, d.col.Mapped = mc.Index, strings.TrimSpace(h), mc.Symbol, mc.Q, true
			d.q = mc.Q
			if mc.Unit != "" {
				d.col.Unit, d.col.From = mc.Unit, FromMap
			}
			drafts = append(drafts, d)
		}
	}
	for _, d := range drafts {
		if d.fatal != "" {
			return Table{}, headerError(header, d.col.Header, d.fatal)
		}
	}
	t := Table{}
	if below, ok := unitsBelow(drafts, unitRow); ok {
		t.UnitRow = true
		for i := range drafts {
			d := &drafts[i]
			u := below[i]
			switch {
			case u == "":
			case d.col.From == 0:
				d.col.Unit, d.col.From = u, FromUnitRow
			case !sameUnit(d.col.Unit, u, d.q):
				return Table{}, headerError(header, d.col.Header, fmt.Sprintf(
					"the header gives the unit %s, the row of units under it %s; remove one", d.col.Unit, u))
			}
		}
	}
	for i := range drafts {
		d := &drafts[i]
		if d.col.From == 0 {
			if d.brackets != "" {
				return Table{}, headerError(header, d.col.Header, fmt.Sprintf(
					"no unit of %s in its brackets (%s); write one of %s in brackets, e.g. %s",
					d.q, d.brackets, strings.Join(unitNames(d.q), ", "), quote(withUnit(d.col.Header, exampleUnit(d.q)))))
			}
			u := set.Unit(DimOf(d.q))
			d.col.From, d.col.Set, d.col.SetUnit = FromSet, set.Name(), u.Name
		}
		if why := d.qualifierProblem(set); why != "" {
			return Table{}, headerError(header, d.col.Header, why)
		}
		t.Columns = append(t.Columns, d.col)
	}
	return t, nil
}

// IsHeaderRow reports whether a row is a table's header: at least two of
// its cells name an input quantity (whether or not they can be read), so
// that a title row above the table is passed over.
func IsHeaderRow(row []string) bool {
	n := 0
	for _, h := range row {
		if readHeader(h).q != 0 {
			n++
		}
	}
	return n >= 2
}

// ExplainHeader returns why a header that names an input quantity cannot be
// read ("\"barx\" is not a unit of pressure"), or "" when it can be, or
// when it names no input at all. Brackets without a unit count as a
// reason: only a row of units or a column map can make up for them.
func ExplainHeader(text string) string {
	d := readHeader(text)
	switch {
	case d.q == 0:
		return ""
	case d.fatal != "":
		return d.fatal
	case d.col.From == 0 && d.brackets != "":
		return fmt.Sprintf("no unit of %s in its brackets (%s)", d.q, d.brackets)
	}
	return d.qualifierProblem(units.Set{})
}

func headerError(header []string, h, why string) error {
	seen := make([]string, 0, len(header))
	for _, c := range header {
		if c = strings.TrimSpace(c); c != "" {
			seen = append(seen, quote(c))
		}
		if len(seen) == 20 {
			seen = append(seen, "…")
			break
		}
	}
	msg := "header " + quote(strings.TrimSpace(h)) + ": " + why
	if len(seen) > 0 {
		msg += "; headers seen: " + strings.Join(seen, ", ")
	}
	return &Error{Param: strings.TrimSpace(h), Kind: ErrHeader, Msg: msg}
}

// unitsBelow returns the units under the input columns when row is a row
// of units: every cell under an input column is blank or a unit of its
// quantity, and one at least is not blank.
func unitsBelow(drafts []draft, row []string) ([]string, bool) {
	if row == nil || len(drafts) == 0 {
		return nil, false
	}
	out := make([]string, len(drafts))
	found := false
	for i, d := range drafts {
		if d.col.Index >= len(row) {
			continue
		}
		u := unitCell(row[d.col.Index])
		if u == "" {
			continue
		}
		if _, err := units.Lookup(u, DimOf(d.q)); err != nil {
			return nil, false
		}
		out[i], found = u, true
	}
	return out, found
}

// unitCell returns the text of a cell of a row of units without the
// brackets that often enclose it ("[barg]", "(°C)"), trimmed; brackets
// inside a unit stay ("kJ/(kg·K)").
func unitCell(s string) string {
	s = strings.TrimSpace(s)
	if len(s) >= 2 {
		if g := groups(s); len(g) == 1 && g[0].start == 0 && g[0].end == len(s) {
			return g[0].content
		}
	}
	return s
}

func sameUnit(a, b string, q fn.Quantity) bool {
	ua, err1 := units.Lookup(a, DimOf(q))
	ub, err2 := units.Lookup(b, DimOf(q))
	return err1 == nil && err2 == nil && ua.Name == ub.Name && ua.Gauge == ub.Gauge
}

// draft is a header as read on its own, before the row of units and the
// unit set are consulted.
type draft struct {
	col      Column
	q        fn.Quantity
	fatal    string   // why the header cannot be read whatever the rest says
	brackets string   // the bracket contents that are neither a unit nor a tag, quoted
	quals    []string // qualifier words outside the unit ("gauge", "abs")
}

// group is one bracketed part of a header: text[start:end] with its
// brackets, content without them.
type group struct {
	start, end int
	content    string
}

// groups returns the top-level bracketed groups of s, "[...]" or "(...)";
// brackets nest ("(kJ/(kg·K))"). An unclosed bracket opens no group.
func groups(s string) []group {
	var out []group
	for i := 0; i < len(s); i++ {
		if s[i] != '[' && s[i] != '(' {
			continue
		}
		depth := 0
		for j := i; j < len(s); j++ {
			switch s[j] {
			case '[', '(':
				depth++
			case ']', ')':
				depth--
			}
			if depth == 0 {
				if closes(s[i], s[j]) {
					out = append(out, group{start: i, end: j + 1, content: strings.TrimSpace(s[i+1 : j])})
					i = j
				}
				break
			}
		}
	}
	return out
}

func closes(open, close byte) bool {
	return open == '[' && close == ']' || open == '(' && close == ')'
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
	"drop": true, "diff": true, "difference": true, "differential": true, "delta": true, "δ": true, "dp": true, "dt": true,
	"rise": true, "loss": true, "ratio": true, "rate": true, "change": true, "gradient": true,
	"error": true, "uncertainty": true, "deviation": true, "tolerance": true,
	"superheat": true, "subcooling": true, "subcool": true, "approach": true, "margin": true,
	"tag": true, "id": true,
}

// Qualifier words: they say whether a pressure is gauge or absolute, or a
// temperature absolute. Outside the unit they either repeat what the unit
// says or contradict it, and a header that contradicts its unit is refused.
var (
	gaugeWords    = map[string]bool{"gauge": true, "gage": true, "g": true}
	absoluteWords = map[string]bool{"abs": true, "absolute": true, "a": true}
	vacuumWords   = map[string]bool{"vacuum": true, "vac": true}
)

// readHeader reads one header on its own by the rules of the package
// documentation.
func readHeader(text string) draft {
	text = strings.TrimSpace(text)
	d := draft{col: Column{Header: text}}
	gs := groups(text)
	outside := []byte(text)
	for _, g := range gs {
		for i := g.start; i < g.end; i++ {
			outside[i] = ' '
		}
	}
	q, sym, why := headerQuantity(string(outside))
	if q == 0 {
		// "Steam T °C": the symbol is the last word but for a unit.
		label := strings.TrimRightFunc(string(outside), unicode.IsSpace)
		if i := strings.LastIndexFunc(label, unicode.IsSpace); i > 0 {
			if q, sym, why = headerQuantity(label[:i]); q != 0 && !unitOf(strings.TrimSpace(label[i:]), q) {
				q = 0
			}
		}
	}
	if q == 0 {
		return d
	}
	d.q, d.col.Q, d.col.Symbol = q, q, sym
	if why != "" {
		d.fatal = why
		return d
	}
	dim := DimOf(q)
	var unit string
	setUnit := func(u string) bool {
		if unit != "" && !sameUnit(unit, u, q) {
			d.fatal = fmt.Sprintf("it gives two units, %s and %s; keep one", unit, u)
			return false
		}
		if unit == "" {
			unit = u
		}
		return true
	}
	var odd []string
	qualText := string(outside)
	for _, g := range gs {
		switch {
		case g.content != "" && unitOf(g.content, q):
			if !setUnit(g.content) {
				return d
			}
		case g.content != "" && otherQuantity(g.content, q) != 0:
			d.fatal = fmt.Sprintf("%s is a unit of %s, not of %s; write one of %s in brackets",
				quote(g.content), otherQuantity(g.content, q), q, strings.Join(unitNames(q), ", "))
			return d
		case isTag(g.content):
			// An instrument tag ("[PT-101]") is passed over.
		default:
			odd = append(odd, quote(g.content))
			qualText += " " + g.content
		}
	}
	// Without brackets a unit may stand as a word: "P barg", "Pressure,
	// barg", "Steam T °C". A single letter counts only as the last word
	// ("T C"), so that a label such as "Line K" is not a kelvin.
	tokens := strings.FieldsFunc(string(outside), func(r rune) bool { return unicode.IsSpace(r) || r == ',' })
	for i, tok := range tokens {
		switch {
		case (i == len(tokens)-1 || len([]rune(tok)) > 1) && unitOf(tok, q) && !isQuantityWord(tok):
			if !setUnit(tok) {
				return d
			}
		case strings.Contains(tok, "/"):
			// The quantity over its unit (ISO 80000-1, 7.1): "p/bar",
			// "T/°C", "h/kJ/kg"; the unit may be bracketed, "h/(kJ/kg)".
			name, u, _ := strings.Cut(tok, "/")
			if qn, _, _ := headerQuantity(name); qn == q && u != "" && unitOf(u, q) {
				if !setUnit(u) {
					return d
				}
			}
		}
	}
	if unit != "" {
		d.col.Unit, d.col.From = unit, FromHeader
	}
	d.brackets = strings.Join(odd, ", ")
	for _, w := range strings.FieldsFunc(strings.ToLower(qualText), func(r rune) bool { return !unicode.IsLetter(r) }) {
		if (dim == units.Pressure && (gaugeWords[w] || absoluteWords[w] || vacuumWords[w])) ||
			(dim == units.Temperature && (w == "abs" || w == "absolute")) {
			d.quals = append(d.quals, w)
		}
	}
	return d
}

// qualifierProblem returns why the qualifier words of a header contradict
// the unit its numbers are read in, with the header as it should be
// written; "" when they agree or there are none.
func (d *draft) qualifierProblem(set units.Set) string {
	if len(d.quals) == 0 {
		return ""
	}
	var u units.Unit
	from := "the header's unit " + d.col.Unit
	switch {
	case d.col.From == FromSet || d.col.From == 0:
		u = set.Unit(DimOf(d.q))
		from = "the unit set " + set.Name() + " reads bare numbers in " + unitWords(u.Name)
	default:
		var err error
		if u, err = units.Lookup(d.col.Unit, DimOf(d.q)); err != nil {
			return ""
		}
		if d.col.From == FromUnitRow {
			from = "the row of units gives " + d.col.Unit
		}
	}
	h := d.col.Header
	for _, w := range d.quals {
		switch {
		case vacuumWords[w]:
			return fmt.Sprintf("%s marks a vacuum reading, which steamcell does not read; give the absolute pressure, e.g. %s",
				quote(w), quote(withUnit(dropWord(h, w), "kPa")))
		case d.q == fn.Pressure && gaugeWords[w] && !u.Gauge:
			g := gaugeOf(u)
			return fmt.Sprintf("%s says gauge, but %s, an absolute unit; write %s", quote(w), from, quote(withUnit(dropWord(h, w), g)))
		case d.q == fn.Pressure && absoluteWords[w] && u.Gauge:
			return fmt.Sprintf("%s says absolute, but %s, a gauge unit; write %s for an absolute reading or %s for a gauge one",
				quote(w), from, quote(withUnit(dropWord(h, w), absoluteOf(u))), quote(withUnit(dropWord(h, w), u.Name)))
		case d.q == fn.Temperature && (u.Name == "°C" || u.Name == "°F"):
			return fmt.Sprintf("%s says absolute, but %s, which is not an absolute scale; write %s for kelvin or %s",
				quote(w), from, quote(withUnit(dropWord(h, w), "K")), quote(withUnit(dropWord(h, w), u.Name)))
		}
	}
	return ""
}

// gaugeOf returns the gauge unit of the scale of absolute unit u ("kPa" →
// "kPag", "psia" → "psig").
func gaugeOf(u units.Unit) string {
	base := strings.TrimSuffix(u.Name, "a")
	for _, n := range []string{u.Name + "g", base + "g"} {
		if g, err := units.Lookup(n, units.Pressure); err == nil && g.Gauge {
			return g.Name
		}
	}
	return "kPag"
}

// absoluteOf returns the absolute unit of the scale of gauge unit u
// ("barg" → "bar", "psig" → "psia").
func absoluteOf(u units.Unit) string {
	base := strings.TrimSuffix(u.Name, "g")
	for _, n := range []string{base + "a", base} {
		if a, err := units.Lookup(n, units.Pressure); err == nil && !a.Gauge {
			return a.Name
		}
	}
	return "kPa"
}

// dropWord removes the word w (any case) from header h, with the brackets
// around it when it stood alone in them ("P (g) [bar]" → "P [bar]").
func dropWord(h, w string) string {
	for _, g := range groups(h) {
		if strings.EqualFold(g.content, w) {
			return strings.Join(strings.Fields(h[:g.start]+" "+h[g.end:]), " ")
		}
	}
	words := strings.FieldsFunc(h, func(r rune) bool { return unicode.IsSpace(r) })
	out := words[:0]
	for _, x := range words {
		if !strings.EqualFold(strings.Trim(x, "_-.,;:"), w) {
			out = append(out, x)
		}
	}
	return strings.Join(out, " ")
}

// withUnit writes header h with unit u in brackets in place of the unit it
// has, or after the quantity when it has none.
func withUnit(h, u string) string {
	for _, g := range groups(h) {
		if g.content == "" || looksLikeUnit(g.content) {
			return h[:g.start] + "[" + u + "]" + h[g.end:]
		}
	}
	if words := strings.Fields(h); len(words) > 1 {
		for i, w := range words {
			if looksLikeUnit(strings.Trim(w, ",")) && !isQuantityWord(w) {
				words[i] = "[" + u + "]"
				return strings.Join(words, " ")
			}
		}
	}
	if h == "" {
		return "[" + u + "]"
	}
	return h + " [" + u + "]"
}

// looksLikeUnit reports whether s is a unit of any input quantity.
func looksLikeUnit(s string) bool {
	for _, q := range inputQuantities {
		if _, err := units.Lookup(s, DimOf(q)); err == nil {
			return true
		}
	}
	return false
}

var inputQuantities = []fn.Quantity{fn.Pressure, fn.Temperature, fn.Enthalpy, fn.Entropy,
	fn.Volume, fn.Density, fn.InternalEnergy, fn.Quality}

// otherQuantity returns the input quantity other than q that s is a unit
// of, or 0.
func otherQuantity(s string, q fn.Quantity) fn.Quantity {
	for _, o := range inputQuantities {
		if o == q || DimOf(o) == DimOf(q) {
			continue
		}
		if _, err := units.Lookup(s, DimOf(o)); err == nil {
			return o
		}
	}
	return 0
}

// isTag reports whether s looks like an instrument or line tag: letters,
// then digits, with an optional separator ("PT-101", "TI2301", "FT 12A",
// "B-3"), or a bare number ("1").
func isTag(s string) bool {
	i := 0
	for i < len(s) && (s[i] >= 'A' && s[i] <= 'Z' || s[i] >= 'a' && s[i] <= 'z') {
		i++
	}
	if i > 6 {
		return false
	}
	if i > 0 && i < len(s) && strings.IndexByte("-_ .", s[i]) >= 0 {
		i++
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
		digits++
	}
	if digits == 0 {
		return false
	}
	for ; i < len(s); i++ {
		c := s[i]
		if !(c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' || c >= '0' && c <= '9' || c == '-' || c == '_' || c == '.' || c == '/') {
			return false
		}
	}
	return true
}

// isQuantityWord reports whether tok is a word of a quantity's name, and
// so no unit where it stands ("fraction" of "dryness fraction" is one).
func isQuantityWord(tok string) bool {
	tok = strings.ToLower(tok)
	_, ok := headerWords[tok]
	return ok || tok == "fraction" // "dryness fraction"
}

// exampleUnit is the unit an error message suggests for q.
func exampleUnit(q fn.Quantity) string {
	switch q {
	case fn.Pressure:
		return "barg"
	case fn.Temperature:
		return "°C"
	case fn.Quality:
		return "%"
	}
	return units.Set{}.Unit(DimOf(q)).Name
}

// headerQuantity finds the quantity the words of a header (outside its
// brackets) name. why is set when they name one that cannot be taken.
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
	blocker := false
	volumeFlow := false // "Volume flow" is a flow; "Flow temperature" is a temperature
	for i, w := range words {
		if w == "flow" {
			volumeFlow = true
		}
		if headerBlockers[w] {
			blocker = true
		}
		if q, ok := headerWords[w]; ok {
			add(q)
		}
		if w == "energy" && i > 0 && words[i-1] == "internal" {
			add(fn.InternalEnergy)
		}
	}
	bySymbol := len(found) == 0
	if bySymbol && len(words) > 0 {
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
	case blocker || volumeFlow && (found[0] == fn.Volume || bySymbol):
		// A pressure drop or a temperature rise is not a state: no input,
		// as for any other column of the sheet. A flow named with a symbol
		// is a flow too: the h of "Steam flow t/h" is the hour.
		return 0, "", ""
	case len(found) > 1:
		names := make([]string, len(found))
		for i, f := range found {
			names[i] = f.String()
		}
		return found[0], found[0].Symbol(), fmt.Sprintf("it names %s; name one quantity per column", strings.Join(names, " and "))
	}
	return found[0], found[0].Symbol(), ""
}

// unitOf reports whether u is a unit of q.
func unitOf(u string, q fn.Quantity) bool {
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

// HeaderLabel returns the words of a header besides its quantity, its unit
// and their qualifiers, for naming a column or a pair of columns: "Drum"
// for "Drum pressure [barg]", "steam" for "T_steam (C)", "Feed PT 101" for
// "Feed pressure [barg] PT-101".
func HeaderLabel(header string) string {
	header = strings.TrimSpace(header)
	b := []byte(header)
	for _, g := range groups(header) {
		if g.content == "" || looksLikeUnit(g.content) {
			for i := g.start; i < g.end; i++ {
				b[i] = ' '
			}
		}
	}
	var keep []string
	for _, tok := range strings.Fields(string(b)) {
		if looksLikeUnit(strings.Trim(tok, ",")) && !isQuantityWord(tok) && len([]rune(tok)) > 1 {
			continue
		}
		for _, w := range strings.FieldsFunc(tok, func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) }) {
			lw := strings.ToLower(w)
			if _, ok := InputQuantity(lw); ok || gaugeWords[lw] || absoluteWords[lw] {
				continue
			}
			switch lw {
			case "press", "pres", "specific", "internal", "energy", "fraction":
				continue
			}
			keep = append(keep, w)
		}
	}
	return strings.Join(keep, " ")
}
