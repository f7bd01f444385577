package workbook

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

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
	unit   string // the unit of bare numbers; "" for the unit set's
	mapped bool
	// setNote says, for a column whose header gives no unit, in which unit
	// its bare numbers are read ("p \"Pressure\": read as kPa, unit set
	// si"); "" otherwise.
	setNote string
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

// ReadColumns reads the input columns of a sheet from its header row and
// the row under it, with the column map mapText ("" for none) and the unit
// set of bare numbers, as a fill does (point.ReadTable, with columns at or
// right of an earlier fill's status column left out). It is the seam
// through which the command's tests check that a workbook reads its
// headers as /batch does.
func ReadColumns(header, below []string, mapText string, set units.Set) (point.Table, error) {
	var m point.Map
	if mapText != "" {
		var err error
		if m, err = parseMap("", mapText); err != nil {
			return point.Table{}, err
		}
	}
	return readTable("", 1, header, below, m, set)
}

// readTable reads the header row (row n of the sheet) and the row under it
// with point.ReadTable; a header that cannot be read stops the fill.
func readTable(sheet string, n int, header, below []string, m point.Map, set units.Set) (point.Table, error) {
	if m == nil {
		cut := statusCutoff(header)
		header = header[:cut]
		if len(below) > cut {
			below = below[:cut]
		}
	}
	t, err := point.ReadTable(header, below, m, set)
	if err != nil {
		msg := err.Error()
		if sheet != "" {
			msg = fmt.Sprintf("sheet %q, row %d: %s", sheet, n, msg)
		}
		return t, &Error{Kind: ErrAmbiguous, Sheet: sheet, Msg: msg}
	}
	return t, nil
}

// findColumns finds the header row of a sheet from its top rows (top[i] is
// row i+1; headerRow, when not 0, is the row Options.HeaderRow names), the
// row of units under it, and the input pairs. Without a map, the header
// row is the first that names two inputs (point.IsHeaderRow), and the
// columns found pair left to right.
func findColumns(sheet string, top [][]string, mapText string, headerRow int, set units.Set) (int, int, []pairSpec, error) {
	var m point.Map
	if mapText != "" {
		var err error
		if m, err = parseMap(sheet, mapText); err != nil {
			return 0, 0, nil, err
		}
		if headerRow == 0 {
			headerRow = mapHeaderRow(top, m)
		}
	} else if headerRow == 0 {
		for i, row := range top {
			if point.IsHeaderRow(row[:statusCutoff(row)]) {
				headerRow = i + 1
				break
			}
		}
		if headerRow == 0 {
			return 0, 0, nil, &Error{Kind: ErrNoInputs, Sheet: sheet, Msg: noInputsMessage(sheet, top, set)}
		}
	}
	row := func(n int) []string {
		if n >= 1 && n <= len(top) {
			return top[n-1]
		}
		return nil
	}
	var header, below []string
	if headerRow > 0 {
		header, below = row(headerRow), row(headerRow+1)
		if below == nil {
			below = []string{}
		}
	}
	t, err := readTable(sheet, headerRow, header, below, m, set)
	if err != nil {
		return 0, 0, nil, err
	}
	cols := make([]inputCol, len(t.Columns))
	for i, c := range t.Columns {
		cols[i] = inputCol{idx: c.Index, header: c.Header, sym: c.Symbol, q: c.Q, unit: c.Unit, mapped: c.Mapped}
		if c.From == point.FromSet {
			cols[i].setNote = c.Note()
		}
	}
	unitRow := 0
	if t.UnitRow {
		unitRow = headerRow + 1
	}
	if m != nil {
		pairs := make([]pairSpec, 0, len(cols)/2)
		for i := 0; i+1 < len(cols); i += 2 {
			pairs = append(pairs, pairSpec{in: [2]inputCol{cols[i], cols[i+1]}})
		}
		labelPairs(pairs)
		return headerRow, unitRow, pairs, nil
	}
	if len(cols) < 2 {
		return 0, 0, nil, &Error{Kind: ErrNoInputs, Sheet: sheet, Msg: fmt.Sprintf("sheet %q: row %d does not name two inputs. %s",
			sheet, headerRow, noInputsMessage(sheet, top, set))}
	}
	pairs, err := pairUp(sheet, headerRow, cols)
	return headerRow, unitRow, pairs, err
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
func noInputsMessage(sheet string, top [][]string, set units.Set) string {
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
		t, _ := point.ReadTable(row[:statusCutoff(row)], nil, nil, set)
		if found := t.Columns; len(found) == 1 {
			fmt.Fprintf(&b, "sheet %q: only one input column found (%s %q); a state needs two.", sheet, cellName(found[0].Index, best+1), found[0].Header)
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

// parseMap reads Options.Map with point.ParseMap and checks that each pair
// fixes a state.
func parseMap(sheet, text string) (point.Map, error) {
	m, err := point.ParseMap(text)
	if err != nil {
		return nil, &Error{Kind: ErrBadOption, Sheet: sheet, Msg: err.Error()}
	}
	for i := 0; i < len(m); i += 2 {
		if !supportedPair(m[i].Q, m[i+1].Q) {
			return nil, &Error{Kind: ErrBadOption, Sheet: sheet, Msg: fmt.Sprintf("column map %q: %s and %s do not fix a state; pairs are %s",
				text, m[i].Symbol, m[i+1].Symbol, pairList)}
		}
	}
	return m, nil
}

// mapHeaderRow finds the header row for mapped columns: the first top row
// where every mapped column holds text that is not a number; 0 if none.
func mapHeaderRow(top [][]string, m point.Map) int {
	for i, row := range top {
		ok := true
		for _, c := range m {
			s := ""
			if c.Index < len(row) {
				s = strings.TrimSpace(row[c.Index])
			}
			if _, err := strconv.ParseFloat(s, 64); s == "" || err == nil {
				ok = false
			}
		}
		if ok {
			return i + 1
		}
	}
	return 0
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
func decoration(header string) string { return point.HeaderLabel(header) }

// header is what the top of a sheet says: the header row, the row of
// units under it, and the input pairs with their units.
type header struct {
	row     int // 1-based; 0 when there is none (a column map without headers)
	unitRow int // 1-based; 0 when there is none
	pairs   []pairSpec
}

// readHeader interprets the top rows of a sheet (top[i] is row i+1, the
// cells as text) with the one table reader (point.ReadTable, through
// findColumns), by opt.Map and opt.HeaderRow where given.
func readHeader(sheet string, top [][]string, opt Options) (header, error) {
	if opt.Process != "" && opt.Map == "" {
		if h, err := processHeader(sheet, top, opt); !errors.Is(err, ErrNoInputs) {
			return h, err
		}
		// No numbered inputs: the pairs found as for any fill are the
		// process's states 1, 2, … (results.go).
	}
	row, unitRow, pairs, err := findColumns(sheet, top, opt.Map, opt.HeaderRow, opt.Point.Set)
	return header{row: row, unitRow: unitRow, pairs: pairs}, err
}
