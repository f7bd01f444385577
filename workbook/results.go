package workbook

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/process"
	"steamcell/fn/units"
)

// Results beyond the state: the columns a fill adds right of the
// properties of every pair, in this order.
//
//   - Uncertainties (Options.U, and "u(p) [bar]" columns beside their
//     inputs): for each pair with an uncertain input, u(…) of every
//     numeric property added, the standard uncertainty by the law of
//     propagation of JCGM 100:2008 (point.SolveMeasured).
//   - A process (Options.Process): its status, then every result of the
//     kind and its u, from the numbered inputs of the row
//     (point.ProcessColumns).
//   - Check mode (Options.Check): for each property checked, the
//     deviation of the sheet's value from steamcell's, in the column's
//     unit and relative, then one status that flags the row beyond
//     Options.CheckTol (check.go).

// extraKind is what an extra result column holds.
type extraKind uint8

const (
	extraU          extraKind = iota // u of a pair's property
	extraProcStatus                  // the process's status
	extraProcValue                   // a process result
	extraProcU                       // a process result's u
	extraCheckDev                    // a checked column's deviation, in its unit
	extraCheckRel                    // the same, relative
	extraCheckStatus
)

// extraCol is an extra result column.
type extraCol struct {
	kind   extraKind
	header string
	unit   string
	pair   int    // the pair of a u or check column
	sym    string // the property of a u column; the result of a process column
	check  int    // index into extras.checks
	out    output
}

// extras is the plan of a sheet's extra columns.
type extras struct {
	cols  []extraCol
	start int          // index into outs2 of the first
	keep  map[int]bool // columns whose cells the extras read
	// uncs per input (2*pair+k): the column of its u cells (-1 for none),
	// the unit of that column, and the text of Options.U for it.
	uCol   []int
	uUnit  []string
	uList  []string
	uPairs []bool // pairs with an uncertain input
	proc   *procPlan
	checks []checkCol
	// states of the row being solved, per pair; nil where it failed.
	states []*fn.State
}

// procPlan is a sheet's process.
type procPlan struct {
	kind  process.Kind
	cols  []point.ProcessColumn
	units map[string]string // result → unit, from the first row solved
	// fromPairs: the header names no numbered inputs, so pair j gives
	// state j+1 ("Inlet pressure", "Extraction pressure": p1, p2).
	fromPairs bool
}

// DefaultCheckTol is Options.CheckTol when it is 0: a relative deviation
// of 0.1 %. Printed steam tables give h and s to four or five significant
// figures, and the older industrial formulations agree with IF97 to well
// within that over the usual plant range, so a deviation beyond it points
// at a misread, a wrong unit or an interpolation across a phase change
// (common practice, no source).
const DefaultCheckTol = 1e-3

// uncertaintyName reads a header of a column of uncertainties for the
// fill: "u(p) [bar]" names input p; a header whose name in parentheses is
// no input ("u(kJ/kg)", an internal energy) is no match.
func uncertaintyName(h string) (name, unit string, ok bool) {
	in, unit, ok := point.UncertaintyHeader(h)
	if !ok {
		return "", "", false
	}
	in = strings.ToLower(strings.TrimSpace(in))
	if _, known := point.InputQuantity(strings.TrimRight(in, "0123456789")); !known {
		return "", "", false
	}
	return in, unit, true
}

// maskResultHeaders returns the top rows with the headers the state
// reader must not take as inputs blanked: columns of uncertainties, and
// in check mode the columns to check.
func maskResultHeaders(top [][]string, opt Options) [][]string {
	checks := map[string]bool{}
	for _, c := range opt.Check {
		checks[strings.ToLower(strings.TrimSpace(c))] = true
	}
	out := make([][]string, len(top))
	for i, row := range top {
		out[i] = row
		for j, h := range row {
			_, _, isU := uncertaintyName(h)
			if !isU && len(checks) > 0 {
				sym, _, isC := checkHeader(h, opt.Point.Set)
				isU = isC && checks[sym]
			}
			if !isU {
				continue
			}
			if &out[i][0] == &row[0] {
				out[i] = append([]string(nil), row...)
			}
			out[i][j] = ""
		}
	}
	return out
}

// inputName is the name a u column or Options.U gives an input column:
// its header before any bracket, lower case ("p1", "drum pressure").
func inputName(header string) string {
	h := strings.TrimSpace(header)
	if j := strings.IndexAny(h, "[("); j > 0 {
		h = h[:j]
	}
	return strings.ToLower(strings.TrimSpace(h))
}

// planExtras finds the sheet's extra columns from its header row (as
// written, before masking) and adds them to the result columns.
func (s *sheetRun) planExtras(header []string) error {
	header = header[:statusCutoff(header)] // an earlier fill's results are no inputs
	e := &s.ext
	e.keep = map[int]bool{}
	n := 2 * len(s.pairs)
	e.uCol, e.uUnit, e.uList = make([]int, n), make([]string, n), make([]string, n)
	e.uPairs = make([]bool, len(s.pairs))
	e.states = make([]*fn.State, len(s.pairs))
	for i := range e.uCol {
		e.uCol[i] = -1
	}
	list := map[string]string{}
	if s.opt.U != "" {
		var err error
		if list, err = point.ParseUncertaintyList(s.opt.U); err != nil {
			return &Error{Kind: ErrBadOption, Msg: "uncertainties (--u): " + err.Error()}
		}
	}
	inputs := func(f func(idx int, c inputCol)) {
		for j, p := range s.pairs {
			for k, c := range p.in {
				f(2*j+k, c)
			}
		}
	}
	inputs(func(idx int, c inputCol) {
		if u, ok := list[inputName(c.header)]; ok {
			e.uList[idx] = u
		} else if u, ok := list[c.sym]; ok {
			e.uList[idx] = u
		}
	})
	for col, h := range header {
		name, unit, ok := uncertaintyName(h)
		if !ok {
			continue
		}
		// The input it belongs to: the nearest column of that name on its
		// left, else on its right.
		best, dist := -1, 0
		inputs(func(idx int, c inputCol) {
			if inputName(c.header) != name && c.sym != name {
				return
			}
			d := col - c.idx
			if d < 0 {
				d = 2*maxColumns - d
			}
			if best < 0 || d < dist {
				best, dist = idx, d
			}
		})
		if best < 0 {
			if s.opt.Process != "" {
				continue // an uncertainty of a process input without a state pair
			}
			return &Error{Kind: ErrAmbiguous, Sheet: s.name, Msg: fmt.Sprintf(
				"sheet %q: column %s, %q, is the uncertainty of %s, but no input column is named so; name the input's column %q or remove the column",
				s.name, colLetter(col), h, name, name)}
		}
		if e.uCol[best] < 0 {
			e.uCol[best], e.uUnit[best] = col, unit
			e.keep[col] = true
		}
	}
	for idx := range e.uCol {
		if e.uCol[idx] >= 0 || e.uList[idx] != "" {
			e.uPairs[idx/2] = true
		}
	}
	for j, p := range s.pairs {
		if !e.uPairs[j] {
			continue
		}
		for _, o := range s.outs {
			if o.code == "" {
				continue
			}
			uo := o
			uo.header = "u(" + displaySymbol(o.sym) + ") " + o.header[strings.IndexByte(o.header, '['):]
			if p.label != "" {
				uo.header = p.label + " " + uo.header
			}
			e.cols = append(e.cols, extraCol{kind: extraU, header: uo.header, unit: o.unit, pair: j, sym: o.sym, out: uo})
		}
	}
	if s.opt.Process != "" {
		if err := s.planProcess(header); err != nil {
			return err
		}
	}
	if len(s.opt.Check) > 0 {
		if err := s.planChecks(header); err != nil {
			return err
		}
	}
	if len(e.cols) == 0 {
		e.states = nil // nothing reads the states of a row
	}
	e.start = s.nOut
	s.nOut += len(e.cols)
	for i := range e.cols {
		c := &e.cols[i]
		s.outs2 = append(s.outs2, outCell{out: &c.out})
		s.widths = append(s.widths, 0)
		if c.out.code != "" {
			s.styles.addCode(c.out.code)
		}
	}
	return nil
}

// planProcess adds the process's columns: its status, then each result
// of the kind and its u.
func (s *sheetRun) planProcess(header []string) error {
	k, err := process.LookupKind(s.opt.Process)
	if err != nil {
		return &Error{Kind: ErrBadOption, Msg: "process (--process): " + err.Error()}
	}
	cols, err := point.ProcessColumns(header)
	if err != nil {
		return &Error{Kind: ErrAmbiguous, Sheet: s.name, Msg: fmt.Sprintf("sheet %q, row %d: %v", s.name, s.headerRow, err)}
	}
	pp := &procPlan{kind: k, cols: cols, units: map[string]string{}, fromPairs: true}
	s.ext.proc = pp
	s.ss.Process = &ProcessSummary{Kind: k.Name}
	for i, c := range cols {
		if c.Input != "" {
			s.ext.keep[i] = true
			pp.fromPairs = pp.fromPairs && c.Uncertainty
		}
	}
	s.ext.cols = append(s.ext.cols, extraCol{kind: extraProcStatus, header: k.Name + " " + statusSuffix, out: output{sym: "status"}})
	for _, r := range k.Results {
		code := "0.0000"
		s.ext.cols = append(s.ext.cols,
			extraCol{kind: extraProcValue, sym: r, out: output{sym: r, code: code}},
			extraCol{kind: extraProcU, sym: r, out: output{sym: r, code: code}})
	}
	return nil
}

// processHeader reads the top of a sheet in process mode: the header row
// is the first that names two process inputs ("p1 [bar]", "t1 [°C]"), or
// Options.HeaderRow; each state whose number has two inputs that fix it
// is a pair, labelled "state N", whose properties are written as for any
// pair.
func processHeader(sheet string, top [][]string, opt Options) (header, error) {
	row := opt.HeaderRow
	for i := 0; row == 0 && i < len(top); i++ {
		cols, err := point.ProcessColumns(top[i][:statusCutoff(top[i])])
		if err != nil {
			continue
		}
		n := 0
		for _, c := range cols {
			if c.Input != "" && !c.Uncertainty {
				n++
			}
		}
		if n >= 2 {
			row = i + 1
		}
	}
	if row == 0 || row > len(top) {
		return header{}, &Error{Kind: ErrNoInputs, Sheet: sheet, Msg: fmt.Sprintf(
			"sheet %q: no row in the top %d names the numbered inputs of a process (\"p1 [bar]\", \"t1 [°C]\", \"p2 [bar]\", …)", sheet, len(top))}
	}
	hdr := top[row-1][:statusCutoff(top[row-1])]
	cols, err := point.ProcessColumns(hdr)
	if err != nil {
		return header{}, &Error{Kind: ErrAmbiguous, Sheet: sheet, Msg: fmt.Sprintf("sheet %q, row %d: %v", sheet, row, err)}
	}
	byState := map[int][]inputCol{}
	var order []int
	for i, c := range cols {
		if c.Input == "" || c.Uncertainty {
			continue
		}
		sym, n, _ := process.ParseName(c.Input)
		q, ok := point.InputQuantity(sym)
		if !ok {
			continue // a flow
		}
		if _, seen := byState[n]; !seen {
			order = append(order, n)
		}
		byState[n] = append(byState[n], inputCol{idx: i, header: hdr[i], sym: sym, q: q, unit: c.Unit})
	}
	var pairs []pairSpec
	for _, n := range order {
		in := byState[n]
		if len(in) == 2 && supportedPair(in[0].q, in[1].q) {
			pairs = append(pairs, pairSpec{label: "state " + strconv.Itoa(n), in: [2]inputCol{in[0], in[1]}})
		}
	}
	return header{row: row, pairs: pairs}, nil
}

// solveExtras writes the extra cells of a row (out from the first extra
// column), after its pairs are solved; pairOut is the whole row.
func (s *sheetRun) solveExtras(dr *dataRow, pairOut []any, res *rowResult) {
	e := &s.ext
	if len(e.cols) == 0 {
		return
	}
	out := pairOut[e.start:]
	width := 1 + len(s.outs)
	var unc []map[string]float64
	for j := range s.pairs {
		unc = append(unc, nil)
		if !e.uPairs[j] || e.states[j] == nil {
			continue
		}
		m, warnings, err := s.measured(dr, j)
		if err != nil {
			warnings = []string{"no uncertainty: " + err.Error()}
		}
		if len(warnings) > 0 {
			// The uncertainty's own warnings (the phase in doubt within
			// the inputs' k = 2 interval, a nonlinear estimate) join the
			// pair's status.
			st, _ := pairOut[j*width].(string)
			if st == "ok" {
				st = "check: " + strings.Join(warnings, "; ")
			} else {
				st += "; " + strings.Join(warnings, "; ")
			}
			pairOut[j*width] = st
			res.outcome[j] = max(res.outcome[j], outcomeFlagged)
			res.comments = append(res.comments, pendingComment{pair: j, row: dr.row, text: "steamcell: " + strings.Join(warnings, " ")})
		}
		unc[j] = m
	}
	var pa *point.ProcessAnswer
	var perr error
	if e.proc != nil {
		a, err := s.runProcess(dr)
		pa, perr = &a, err
	}
	for i := range e.cols {
		c := &e.cols[i]
		switch c.kind {
		case extraU:
			if v, ok := unc[c.pair][c.sym]; ok {
				out[i] = v
			}
		case extraProcStatus:
			status, outcome := "ok", outcomeOK
			switch {
			case perr != nil:
				status, outcome = perr.Error(), outcomeFailed
			case len(pa.Warnings) > 0:
				status, outcome = "check: "+strings.Join(pa.Warnings, "; "), outcomeFlagged
			}
			out[i] = status
			res.setExtra(e.start+i, outcome)
		case extraProcValue, extraProcU:
			if perr != nil {
				continue
			}
			if r, err := pa.Result(c.sym); err == nil {
				if c.kind == extraProcValue {
					out[i] = r.Value
				} else {
					out[i] = r.U
				}
				if _, ok := e.proc.units[c.sym]; !ok {
					e.proc.units[c.sym] = r.Unit
				}
			}
		}
	}
	s.solveChecks(dr, out, res)
}

// setExtra records the outcome of an extra status cell.
func (r *rowResult) setExtra(i int, o uint8) {
	if r.extra == nil {
		r.extra = map[int]uint8{}
	}
	r.extra[i] = o
}

// givenOf is pair j's inputs of row dr, each with its uncertainty: from
// its u column, else from Options.U; false when neither gives one.
func (s *sheetRun) givenOf(dr *dataRow, j int) ([]point.Given, bool) {
	e := &s.ext
	p := &s.pairs[j]
	g := make([]point.Given, 2)
	any := false
	for k := range 2 {
		idx := 2*j + k
		g[k] = point.Given{Name: p.in[k].sym, Text: dr.vals[idx], Unit: p.in[k].unit}
		if c := e.uCol[idx]; c >= 0 {
			if v := strings.TrimSpace(dr.more[c]); v != "" {
				g[k] = point.WithUncertainty(g[k], v+e.uUnit[idx])
			}
		}
		g[k] = point.WithUncertainty(g[k], e.uList[idx])
		_, _, has := point.SplitUncertainty(g[k].Text)
		any = any || has
	}
	return g, any
}

// uncertainIn reports whether pair j of row dr has an uncertain input.
func (s *sheetRun) uncertainIn(dr *dataRow, j int) bool {
	if s.ext.uPairs == nil || !s.ext.uPairs[j] {
		return false
	}
	_, any := s.givenOf(dr, j)
	return any
}

// measured solves pair j of row dr with its uncertainties and returns the
// standard uncertainty of every property added, in the result's unit,
// and the uncertainty's warnings.
func (s *sheetRun) measured(dr *dataRow, j int) (map[string]float64, []string, error) {
	given, any := s.givenOf(dr, j)
	if !any {
		return nil, nil, nil
	}
	m, err := point.SolveMeasured(given, s.opt.Point, point.UOptions{})
	if err != nil {
		return nil, nil, err
	}
	var ans point.Answer
	s.rowPlan.Fill(&m.State.State, &ans)
	u := point.RenderUncertainty(&m, &ans, s.opt.Point, point.UOptions{})
	return u.U, u.Warnings, nil
}

// runProcess computes the sheet's process for row dr: each numbered input
// with the uncertainty of its u column, or of Options.U (by its name,
// "p1", or its symbol, "p").
func (s *sheetRun) runProcess(dr *dataRow) (point.ProcessAnswer, error) {
	pp := s.ext.proc
	if pp.fromPairs {
		var given []point.Given
		for j := range s.pairs {
			g, _ := s.givenOf(dr, j)
			for k := range g {
				if strings.TrimSpace(dr.vals[2*j+k]) == "" {
					continue
				}
				g[k].Name += strconv.Itoa(j + 1)
				given = append(given, g[k])
			}
		}
		return point.RunProcess(pp.kind.Name, given, s.opt.Point, point.UOptions{})
	}
	list := map[string]string{}
	if s.opt.U != "" {
		list, _ = point.ParseUncertaintyList(s.opt.U) // checked in planExtras
	}
	uncs := map[string]string{}
	for i, c := range pp.cols {
		if v := strings.TrimSpace(dr.more[i]); c.Uncertainty && v != "" {
			uncs[c.Input] = v + c.Unit
		}
	}
	var given []point.Given
	for i, c := range pp.cols {
		v := strings.TrimSpace(dr.more[i])
		if c.Input == "" || c.Uncertainty || v == "" {
			continue
		}
		g := point.WithUncertainty(point.Given{Name: c.Input, Text: v, Unit: c.Unit}, uncs[c.Input])
		if u, ok := list[c.Input]; ok {
			g = point.WithUncertainty(g, u)
		} else {
			sym, _, _ := process.ParseName(c.Input)
			g = point.WithUncertainty(g, list[sym])
		}
		given = append(given, g)
	}
	return point.RunProcess(pp.kind.Name, given, s.opt.Point, point.UOptions{})
}

// isProcessInput reports whether column col holds a process input, which
// makes a row a data row even where no state has both its inputs.
func (s *sheetRun) isProcessInput(col int) bool {
	pp := s.ext.proc
	return pp != nil && !pp.fromPairs && col < len(pp.cols) && pp.cols[col].Input != "" && !pp.cols[col].Uncertainty
}

// extraHeader is the header of result column i when it is an extra one.
func (s *sheetRun) extraHeader(i int) (string, bool) {
	c, ok := s.extraAt(i)
	if !ok {
		return "", false
	}
	switch c.kind {
	case extraProcValue, extraProcU:
		name := c.sym
		if c.kind == extraProcU {
			name = "u(" + c.sym + ")"
		}
		if u := s.ext.proc.units[c.sym]; u != "" {
			return name + " [" + u + "]", true
		}
		return name, true
	}
	return c.header, true
}

// extraUnit is the unit of result column i when it is an extra one.
func (s *sheetRun) extraUnit(i int) (string, bool) {
	c, ok := s.extraAt(i)
	if !ok {
		return "", false
	}
	if c.kind == extraProcValue || c.kind == extraProcU {
		return s.ext.proc.units[c.sym], true
	}
	return c.unit, true
}

func (s *sheetRun) extraAt(i int) (*extraCol, bool) {
	if len(s.ext.cols) == 0 || i < s.ext.start {
		return nil, false
	}
	return &s.ext.cols[i-s.ext.start], true
}

// extraStyle is the style of an extra status cell of the row.
func (s *sheetRun) extraStyle(res *rowResult, i int) (int, bool) {
	o, ok := res.extra[i]
	if !ok {
		return 0, false
	}
	switch o {
	case outcomeFailed:
		return s.styles.xf[styleFailed], true
	case outcomeFlagged:
		return s.styles.xf[styleCheck], true
	}
	return s.styles.xf[styleOK], true
}

// countExtras adds a row of the first pass to the sheet's process and
// check counts.
func (s *sheetRun) countExtras(dr *dataRow, res *rowResult, vals []any) {
	if dr.aggregate != "" {
		return
	}
	if ps := s.ss.Process; ps != nil {
		for i, c := range s.ext.cols {
			if c.kind != extraProcStatus {
				continue
			}
			switch res.extra[s.ext.start+i] {
			case outcomeOK:
				ps.OK++
			case outcomeFlagged:
				ps.Flagged++
			case outcomeFailed:
				ps.Failed++
			}
		}
	}
	s.countChecks(dr, res, vals)
}

// listExtras lists the flagged and failed process and check statuses of a
// row for the summary, as pair len(s.pairs)+i for result column i.
func (s *sheetRun) listExtras(dr *dataRow, res *rowResult, vals []any) {
	for i := s.ext.start; i < len(s.outs2); i++ {
		o, ok := res.extra[i]
		if !ok || o < outcomeFlagged {
			continue
		}
		if len(s.run.sum.Listed) >= MaxListed {
			s.run.sum.Unlisted++
			continue
		}
		status, _ := vals[i].(string)
		s.run.sum.Listed = append(s.run.sum.Listed, Listing{Sheet: s.name, Row: dr.row, pair: len(s.pairs) + i, sheet: s, Status: status, Failed: o == outcomeFailed})
	}
}

// listedCell is the status cell of a listed point: pair's status, or for
// pair len(s.pairs)+i, result column i.
func (s *sheetRun) listedCell(pair, row int) string {
	if pair >= len(s.pairs) {
		return cellName(s.firstOut+pair-len(s.pairs), row)
	}
	return cellName(s.firstOut+pair*(1+len(s.outs)), row)
}

// addCode plans one more number format, before the styles are applied.
func (t *styleTable) addCode(code string) {
	if _, ok := t.num[code]; !ok {
		t.num[code] = -1
		t.codes = append(t.codes, code)
	}
}

// unitScale is the size of one unit of u in base units: the factor of a
// difference, whatever the unit's zero.
func unitScale(u units.Unit, patm float64) float64 {
	return u.ToBase(1, patm) - u.ToBase(0, patm)
}

// finite reports whether v is a number to write.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
