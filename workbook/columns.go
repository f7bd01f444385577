package workbook

import (
	"fmt"
	"strconv"
	"strings"
	"unicode"

	"github.com/xuri/excelize/v2"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// statusSuffix ends the header of every status column a fill writes; it
// marks where an earlier fill's results begin.
const statusSuffix = "status (steamcell)"

// inputCol is an input column of a sheet.
type inputCol struct {
	idx    int // 0-based
	header string
	sym    string
	q      fn.Quantity
	unit   string
	mapped bool
}

func (c inputCol) letter() string { return colLetter(c.idx) }

// pairSpec is a pair of input columns that fixes one state per row.
type pairSpec struct {
	label string
	in    [2]inputCol
}

func colLetter(idx int) string {
	s, _ := excelize.ColumnNumberToName(idx + 1)
	return s
}

func cellName(idx, row int) string {
	s, _ := excelize.CoordinatesToCellName(idx+1, row)
	return s
}

// supportedPair reports whether the engine solves a state from quantities
// a and b: the pairs of fn.Solve, with density in place of volume.
func supportedPair(a, b fn.Quantity) bool {
	norm := func(q fn.Quantity) fn.Quantity {
		if q == fn.Density {
			return fn.Volume
		}
		return q
	}
	a, b = norm(a), norm(b)
	if a > b {
		a, b = b, a
	}
	switch a {
	case fn.Pressure:
		return b == fn.Temperature || b == fn.Enthalpy || b == fn.Entropy || b == fn.Volume || b == fn.Quality
	case fn.Temperature:
		return b == fn.Quality || b == fn.Volume || b == fn.Enthalpy || b == fn.Entropy
	case fn.Enthalpy:
		return b == fn.Entropy
	case fn.Volume:
		return b == fn.InternalEnergy
	}
	return false
}

const pairList = "p,T  p,h  p,s  h,s  p,x  T,x  p,v  T,v  T,h  T,s  u,v (rho in place of v)"

// statusCutoff returns the index of the first status column of an earlier
// fill in a header row, or len(row).
func statusCutoff(row []string) int {
	for i, s := range row {
		if strings.HasSuffix(strings.ToLower(strings.TrimSpace(s)), statusSuffix) {
			return i
		}
	}
	return len(row)
}

// headerInputs returns the input columns a row names.
func headerInputs(row []string) []inputCol {
	var out []inputCol
	for i, s := range row[:statusCutoff(row)] {
		if m, ok := point.ParseHeader(s); ok {
			out = append(out, inputCol{idx: i, header: strings.TrimSpace(s), sym: m.Symbol, q: m.Q, unit: m.Unit})
		}
	}
	return out
}

// findHeader finds the header row among the top rows (top[i] is row i+1):
// the first with at least two input headers. It returns 0 when there is
// none.
func findHeader(top [][]string) (int, []inputCol) {
	for i, row := range top {
		if c := headerInputs(row); len(c) >= 2 {
			return i + 1, c
		}
	}
	return 0, nil
}

// unitsBelow reads the row under the header (row header+1, top[header]) as
// a row of units when the cells under the input columns read as units of
// their quantities ("Pressure" over "barg", "T" over "[°C]"): it gives
// those columns their units and returns the row. Cells under input columns
// may be blank (the header's unit, or the unit set, holds); any other text
// under an input column means the row is no row of units, and 0 is
// returned. A unit under a header that names another unit is an error:
// the sheet says two things.
func unitsBelow(sheet string, top [][]string, header int, cols []inputCol) (int, error) {
	if header <= 0 || header >= len(top) {
		return 0, nil
	}
	below := top[header]
	cell := func(i int) string {
		if i < len(below) {
			return unitText(below[i])
		}
		return ""
	}
	found := false
	for _, c := range cols {
		t := cell(c.idx)
		if t == "" {
			continue
		}
		if _, err := units.Lookup(t, point.DimOf(c.q)); err != nil {
			return 0, nil
		}
		found = true
	}
	if !found {
		return 0, nil
	}
	for i := range cols {
		c := &cols[i]
		t := cell(c.idx)
		switch {
		case t == "":
		case c.unit == "":
			c.unit = t
		default:
			hu, err1 := units.Lookup(c.unit, point.DimOf(c.q))
			bu, err2 := units.Lookup(t, point.DimOf(c.q))
			if err1 != nil || err2 != nil || hu.Name != bu.Name {
				return 0, &Error{Kind: ErrAmbiguous, Sheet: sheet, Msg: fmt.Sprintf(
					"sheet %q: the header %s%d %q gives the unit %s, the row of units under it %s; remove one",
					sheet, c.letter(), header, c.header, c.unit, t)}
			}
		}
	}
	return header + 1, nil
}

// unitText returns the text of a cell of a row of units without the
// brackets that often enclose it ("[barg]", "(°C)"), trimmed.
func unitText(s string) string {
	s = strings.TrimSpace(s)
	if len(s) >= 2 && (s[0] == '[' && s[len(s)-1] == ']' || s[0] == '(' && s[len(s)-1] == ')' && enclosed(s)) {
		s = strings.TrimSpace(s[1 : len(s)-1])
	}
	return s
}

// enclosed reports whether the '(' that starts s is closed by its last
// byte, not earlier ("(kg·K)" yes, "(kJ)/(kg·K)" no).
func enclosed(s string) bool {
	depth := 0
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '(':
			depth++
		case ')':
			depth--
			if depth == 0 && i < len(s)-1 {
				return false
			}
		}
	}
	return depth == 0
}

// pairUp pairs input columns left to right by the rule of the package doc.
func pairUp(sheet string, row int, cols []inputCol) ([]pairSpec, error) {
	ok := len(cols) >= 2 && len(cols)%2 == 0
	for i := 0; ok && i < len(cols); i += 2 {
		ok = supportedPair(cols[i].q, cols[i+1].q)
	}
	if !ok {
		return nil, &Error{Kind: ErrAmbiguous, Sheet: sheet, Msg: ambiguousMessage(sheet, row, cols)}
	}
	pairs := make([]pairSpec, 0, len(cols)/2)
	for i := 0; i < len(cols); i += 2 {
		pairs = append(pairs, pairSpec{in: [2]inputCol{cols[i], cols[i+1]}})
	}
	labelPairs(pairs)
	return pairs, nil
}

func ambiguousMessage(sheet string, row int, cols []inputCol) string {
	var b strings.Builder
	fmt.Fprintf(&b, "sheet %q: cannot tell which input columns go together: row %d has %d input headers:", sheet, row, len(cols))
	for _, c := range cols {
		u := c.unit
		if u == "" {
			u = "no unit"
		}
		fmt.Fprintf(&b, " %s %q (%s, %s);", cellName(c.idx, row), c.header, c.sym, u)
	}
	s := strings.TrimSuffix(b.String(), ";") + "."
	s += " steamcell pairs them left to right (1st with 2nd, 3rd with 4th, ...), and each pair must be one of " + pairList + "."
	s += " Give the columns with a map, e.g. --map " + strconv.Quote(exampleMap(cols)) + " (pairs separated by ';'), or rename the headers."
	return s
}

func exampleMap(cols []inputCol) string {
	var parts []string
	for i, c := range cols {
		if i == 2 {
			break
		}
		s := c.letter() + "=" + c.sym
		if c.unit != "" {
			s += ":" + c.unit
		}
		parts = append(parts, s)
	}
	if len(parts) < 2 {
		return "B=p:barg,C=t:C"
	}
	return strings.Join(parts, ",")
}

// noInputsMessage says why no input columns were found on a sheet and how
// to name them.
func noInputsMessage(sheet string, top [][]string) string {
	best, bestN := -1, 0
	for i, row := range top {
		n := 0
		for _, s := range row {
			if s = strings.TrimSpace(s); s != "" {
				if _, err := strconv.ParseFloat(s, 64); err != nil {
					n++
				}
			}
		}
		if n > bestN {
			best, bestN = i, n
		}
	}
	var b strings.Builder
	if best < 0 {
		fmt.Fprintf(&b, "sheet %q has no headers in its first %d rows.", sheet, headerScanRows)
	} else {
		row := top[best]
		found := headerInputs(row)
		if len(found) == 1 {
			fmt.Fprintf(&b, "sheet %q: only one input column found (%s %q); a state needs two.", sheet, cellName(found[0].idx, best+1), found[0].header)
		} else {
			fmt.Fprintf(&b, "sheet %q: no two columns name an input.", sheet)
		}
		fmt.Fprintf(&b, " Headers seen in row %d:", best+1)
		shown := 0
		for i, s := range row {
			s = strings.TrimSpace(s)
			if s == "" {
				continue
			}
			if shown == 20 {
				b.WriteString(" ...")
				break
			}
			shown++
			fmt.Fprintf(&b, " %s %q", cellName(i, best+1), s)
			if why := point.ExplainHeader(s); why != "" {
				fmt.Fprintf(&b, " (%s)", why)
			}
			b.WriteByte(';')
		}
	}
	s := strings.TrimSuffix(b.String(), ";")
	s += ` Name each input column by its quantity and unit, e.g. "P [barg]", "Steam temperature [°C]", "h (kJ/kg)"` +
		" (quantities: p, T, h, s, v, rho, u, x or pressure, temperature, enthalpy, entropy, specific volume, density, internal energy, quality)," +
		` or give the columns with a map, e.g. --map "B=p:barg,C=t:C".`
	return s
}

// parseMap reads Options.Map. header is the header row (may be nil) for
// units the map leaves out.
func parseMap(sheet, text string) ([]pairSpec, error) {
	bad := func(format string, args ...any) error {
		return &Error{Kind: ErrBadOption, Sheet: sheet, Msg: "column map " + strconv.Quote(text) + ": " + fmt.Sprintf(format, args...)}
	}
	var pairs []pairSpec
	used := map[int]bool{}
	for _, group := range strings.Split(text, ";") {
		if strings.TrimSpace(group) == "" {
			continue
		}
		items := strings.Split(group, ",")
		if len(items) != 2 {
			return nil, bad("%q has %d columns; give two per pair, e.g. B=p:barg,C=t:C", strings.TrimSpace(group), len(items))
		}
		var p pairSpec
		for i, item := range items {
			col, rest, ok := strings.Cut(strings.TrimSpace(item), "=")
			if !ok {
				return nil, bad("%q is not COLUMN=INPUT[:UNIT], e.g. C=t:C", strings.TrimSpace(item))
			}
			n, err := excelize.ColumnNameToNumber(strings.TrimSpace(col))
			if err != nil {
				return nil, bad("%q is not a column letter", strings.TrimSpace(col))
			}
			name, unit, _ := strings.Cut(rest, ":")
			name, unit = strings.TrimSpace(name), strings.TrimSpace(unit)
			q, ok := point.InputQuantity(name)
			if !ok {
				return nil, bad("%q is not an input; inputs are %s", name, strings.Join(point.InputNames(), ", "))
			}
			if unit != "" {
				if _, err := units.Lookup(unit, point.DimOf(q)); err != nil {
					return nil, bad("column %s: %v", strings.ToUpper(col), err)
				}
			}
			if used[n-1] {
				return nil, bad("column %s is given twice", strings.ToUpper(col))
			}
			used[n-1] = true
			p.in[i] = inputCol{idx: n - 1, sym: q.Symbol(), q: q, unit: unit, mapped: true}
		}
		if !supportedPair(p.in[0].q, p.in[1].q) {
			return nil, bad("%s and %s do not fix a state; pairs are %s", p.in[0].sym, p.in[1].sym, pairList)
		}
		pairs = append(pairs, p)
	}
	if len(pairs) == 0 {
		return nil, bad("no columns given; write e.g. B=p:barg,C=t:C")
	}
	return pairs, nil
}

// mapHeaderRow finds the header row for mapped columns: the first top row
// where every mapped column holds text that is not a number; 0 if none.
func mapHeaderRow(top [][]string, pairs []pairSpec) int {
	for i, row := range top {
		ok := true
		for _, p := range pairs {
			for _, c := range p.in {
				s := ""
				if c.idx < len(row) {
					s = strings.TrimSpace(row[c.idx])
				}
				if _, err := strconv.ParseFloat(s, 64); s == "" || err == nil {
					ok = false
				}
			}
		}
		if ok {
			return i + 1
		}
	}
	return 0
}

// completeMapped fills in the headers of mapped columns and, where the map
// gives no unit, the unit of a header that names the same quantity.
func completeMapped(pairs []pairSpec, header []string) {
	for i := range pairs {
		for j := range pairs[i].in {
			c := &pairs[i].in[j]
			if c.idx < len(header) {
				c.header = strings.TrimSpace(header[c.idx])
			}
			if c.unit == "" {
				if m, ok := point.ParseHeader(c.header); ok && m.Q == c.q {
					c.unit = m.Unit
				}
			}
		}
	}
	labelPairs(pairs)
}

// labelPairs names each pair, when there are several, by the words its two
// headers share besides the quantity ("Feedwater" for "Feedwater pressure
// [barg]" and "Feedwater temperature [°C]"), or their words joined
// ("Drum/Steam"), or the column letters.
func labelPairs(pairs []pairSpec) {
	if len(pairs) < 2 {
		return
	}
	for i := range pairs {
		a, b := decoration(pairs[i].in[0].header), decoration(pairs[i].in[1].header)
		switch {
		case a != "" && strings.EqualFold(a, b):
			pairs[i].label = a
		case a != "" && b != "":
			pairs[i].label = a + "/" + b
		case a+b != "":
			pairs[i].label = a + b
		default:
			pairs[i].label = pairs[i].in[0].letter() + "+" + pairs[i].in[1].letter()
		}
	}
}

// decoration returns the words of a header besides its quantity and unit:
// "Drum" for "Drum pressure [barg]", "steam" for "T_steam (C)".
func decoration(header string) string {
	label := stripUnit(strings.TrimSpace(header))
	words := strings.FieldsFunc(label, func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) })
	var keep []string
	for _, w := range words {
		lw := strings.ToLower(w)
		if _, ok := point.InputQuantity(lw); ok {
			continue
		}
		switch lw {
		case "press", "pres", "specific", "internal", "energy", "fraction":
			continue
		}
		keep = append(keep, w)
	}
	return strings.Join(keep, " ")
}

// stripUnit cuts a trailing bracketed group (the unit) off a header.
func stripUnit(s string) string {
	if s == "" {
		return s
	}
	closing := s[len(s)-1]
	var opening byte
	switch closing {
	case ']':
		opening = '['
	case ')':
		opening = '('
	default:
		return s
	}
	depth := 0
	for i := len(s) - 1; i >= 0; i-- {
		switch s[i] {
		case closing:
			depth++
		case opening:
			depth--
			if depth == 0 {
				return strings.TrimSpace(s[:i])
			}
		}
	}
	return s
}

// header is what the top of a sheet says: the header row, the row of
// units under it, and the input pairs with their units.
type header struct {
	row     int // 1-based; 0 when there is none (a column map without headers)
	unitRow int // 1-based; 0 when there is none
	pairs   []pairSpec
}

// readHeader interprets the top rows of a sheet (top[i] is row i+1, the
// cells as text) by the rules of the package doc, or by opt.Map and
// opt.HeaderRow. It is the one place the header rules are applied.
func readHeader(sheet string, top [][]string, opt Options) (header, error) {
	var h header
	if opt.Map != "" {
		pairs, err := parseMap(sheet, opt.Map)
		if err != nil {
			return h, err
		}
		h.row = opt.HeaderRow
		if h.row == 0 {
			h.row = mapHeaderRow(top, pairs)
		}
		var row []string
		if h.row > 0 && h.row <= len(top) {
			row = top[h.row-1]
		}
		completeMapped(pairs, row)
		var cols []inputCol
		for _, p := range pairs {
			cols = append(cols, p.in[:]...)
		}
		if h.unitRow, err = unitsBelow(sheet, top, h.row, cols); err != nil {
			return h, err
		}
		for i := range pairs {
			copy(pairs[i].in[:], cols[2*i:2*i+2])
		}
		h.pairs = pairs
		return h, nil
	}
	var cols []inputCol
	if opt.HeaderRow > 0 {
		h.row = opt.HeaderRow
		if h.row <= len(top) {
			cols = headerInputs(top[h.row-1])
		}
		if len(cols) < 2 {
			return h, &Error{Kind: ErrNoInputs, Sheet: sheet, Msg: fmt.Sprintf("sheet %q: row %d does not name two inputs. %s",
				sheet, h.row, noInputsMessage(sheet, top))}
		}
	} else {
		h.row, cols = findHeader(top)
		if h.row == 0 {
			return h, &Error{Kind: ErrNoInputs, Sheet: sheet, Msg: noInputsMessage(sheet, top)}
		}
	}
	var err error
	if h.unitRow, err = unitsBelow(sheet, top, h.row, cols); err != nil {
		return h, err
	}
	h.pairs, err = pairUp(sheet, h.row, cols)
	return h, err
}
