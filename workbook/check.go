package workbook

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Check mode audits values a sheet already holds (an old test record,
// values read from printed tables or from an older formulation): for each
// property of Options.Check, the column of that property beside a pair's
// inputs is compared row by row with steamcell's value for the pair's
// state.

// checkCol is a column of values to check.
type checkCol struct {
	sym    string
	idx    int // 0-based column
	header string
	unit   string // the unit of its bare numbers; "" for the unit set's
	dev    string // the unit of its deviations ("K" for a °C column)
	pair   int
	sum    *CheckColumn
}

// ProcessSummary tells what the process of Options.Process gave on a
// sheet.
type ProcessSummary struct {
	Kind                string
	OK, Flagged, Failed int
}

// CheckSummary tells what check mode found on a sheet.
type CheckSummary struct {
	Tol     float64 // relative
	Rows    int     // rows with a value compared
	Flagged int     // rows with a deviation beyond Tol
	Columns []CheckColumn
}

// CheckColumn is one checked column: its largest deviation, sheet value
// minus steamcell's, in the column's unit and relative, and the row where
// it is.
type CheckColumn struct {
	Letter, Header, Symbol, Unit string
	Largest, LargestRel          float64
	LargestRow                   int
}

// checkHeader reads the header of a column that may hold a property to
// check ("h [kJ/kg]", "Enthalpy (Btu/lb)") with the one table reader:
// its symbol and the unit given ("" for none).
func checkHeader(h string, set units.Set) (sym, unit string, ok bool) {
	if strings.TrimSpace(h) == "" {
		return "", "", false
	}
	if _, _, isU := uncertaintyName(h); isU {
		return "", "", false
	}
	t, err := point.ReadTable([]string{h}, nil, nil, set)
	if err != nil || len(t.Columns) != 1 {
		return "", "", false
	}
	c := t.Columns[0]
	if c.From == point.FromSet {
		return c.Symbol, "", true
	}
	return c.Symbol, c.Unit, true
}

// checkTol is the relative tolerance of check mode.
func (r *run) checkTol() float64 {
	if r.opt.CheckTol > 0 {
		return r.opt.CheckTol
	}
	return DefaultCheckTol
}

// planChecks finds the columns of Options.Check in the header row and adds
// a deviation and a relative deviation for each, then one status.
func (s *sheetRun) planChecks(header []string) error {
	set := s.opt.Point.Set
	inputs := map[int]bool{}
	for _, p := range s.pairs {
		inputs[p.in[0].idx], inputs[p.in[1].idx] = true, true
	}
	cs := &CheckSummary{Tol: s.checkTol()}
	s.ss.Check = cs
	for _, want := range s.opt.Check {
		want = strings.ToLower(strings.TrimSpace(want))
		if want == "" {
			continue
		}
		q, ok := point.InputQuantity(want)
		if !ok {
			return &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("check (--check): %q is not a property steamcell can check; give some of %s", want, strings.Join(point.InputNames(), ", "))}
		}
		found := false
		for col, h := range header[:statusCutoff(header)] {
			sym, unit, ok := checkHeader(h, set)
			if !ok || sym != want || inputs[col] {
				continue
			}
			found = true
			pair := 0
			label := point.HeaderLabel(h)
			for j, p := range s.pairs {
				if p.label != "" && strings.EqualFold(p.label, label) {
					pair = j
				}
			}
			vu := set.Unit(point.DimOf(q))
			if unit != "" {
				if u, err := units.Lookup(unit, point.DimOf(q)); err == nil {
					vu = u
				}
			}
			dev := vu.Name
			switch dev {
			case "°C", "K":
				dev = "K"
			case "°F", "°R":
				dev = "°F"
			}
			cc := checkCol{sym: want, idx: col, header: h, unit: unit, dev: dev, pair: pair}
			cs.Columns = append(cs.Columns, CheckColumn{Letter: colLetter(col), Header: h, Symbol: want, Unit: dev})
			s.ext.checks = append(s.ext.checks, cc)
			s.ext.keep[col] = true
			k := len(s.ext.checks) - 1
			code := "0"
			if d := s.digitsOf(want) + 1; d > 0 {
				code += "." + strings.Repeat("0", d)
			}
			name := "Δ" + displaySymbol(want)
			if len(s.pairs) > 1 {
				name = s.pairs[pair].label + " " + name
			}
			s.ext.cols = append(s.ext.cols,
				extraCol{kind: extraCheckDev, header: name + " [" + dev + "]", unit: dev, check: k, out: output{sym: want, code: code}},
				extraCol{kind: extraCheckRel, header: name + " relative", check: k, out: output{sym: "", code: "0.000%"}})
		}
		if !found {
			return &Error{Kind: ErrNoInputs, Sheet: s.name, Msg: fmt.Sprintf(
				"sheet %q: check %s: no column of %s in row %d besides the inputs; name its header with the symbol and unit, e.g. %q",
				s.name, want, want, s.headerRow, displaySymbol(want)+" ["+set.Unit(point.DimOf(q)).Name+"]")}
		}
	}
	for i := range s.ext.checks {
		s.ext.checks[i].sum = &cs.Columns[i]
	}
	s.ext.cols = append(s.ext.cols, extraCol{kind: extraCheckStatus, header: "Check " + statusSuffix, out: output{sym: "status"}})
	return nil
}

// baseSet is the engine's own units, in which check mode compares.
var baseSet, _ = units.SetByName("base")

// solveChecks writes the check cells of a row: out starts at the first
// extra column.
func (s *sheetRun) solveChecks(dr *dataRow, out []any, res *rowResult) {
	e := &s.ext
	if len(e.checks) == 0 {
		return
	}
	tol := s.checkTol()
	devs := make([]float64, len(e.checks))
	rels := make([]float64, len(e.checks))
	var beyond, problems []string
	compared := false
	for k := range e.checks {
		c := &e.checks[k]
		devs[k], rels[k] = math.NaN(), math.NaN()
		text := strings.TrimSpace(dr.more[c.idx])
		st := e.states[c.pair]
		if text == "" || st == nil {
			continue
		}
		p, _ := point.Lookup(c.sym)
		x, vu, err := units.ParseUnit(text, p.Dim, units.Options{Name: c.sym, Unit: c.unit, Set: s.opt.Point.Set, Patm: s.opt.Point.Patm})
		if err != nil {
			problems = append(problems, fmt.Sprintf("%s: %s is not a value of %s", cellName(c.idx, dr.row), strconv.Quote(text), c.sym))
			continue
		}
		f := point.Render(st, []string{c.sym}, point.Options{Set: baseSet}).Fields[0]
		if !f.Defined {
			problems = append(problems, fmt.Sprintf("%s: steamcell has no %s for this state (%s)", cellName(c.idx, dr.row), c.sym, "single phase"))
			continue
		}
		compared = true
		devs[k] = (x - f.Value) / unitScale(vu, s.opt.Point.Patm)
		if f.Value != 0 {
			rels[k] = (x - f.Value) / math.Abs(f.Value)
		}
		if !(math.Abs(rels[k]) <= tol) {
			beyond = append(beyond, fmt.Sprintf("%s %+.3g %%", displaySymbol(c.sym), 100*rels[k]))
		}
	}
	status, outcome := "", outcomeOK
	switch {
	case len(beyond) > 0:
		status, outcome = fmt.Sprintf("beyond %.3g %%: %s", 100*tol, strings.Join(beyond, ", ")), outcomeFlagged
	case compared:
		status = fmt.Sprintf("ok: within %.3g %%", 100*tol)
	}
	if len(problems) > 0 {
		status = joinNote(status, strings.Join(problems, "; "))
		if outcome == outcomeOK {
			outcome = outcomeFlagged
		}
	}
	for i, c := range e.cols {
		switch c.kind {
		case extraCheckDev:
			if finite(devs[c.check]) {
				out[i] = devs[c.check]
			}
		case extraCheckRel:
			if finite(rels[c.check]) {
				out[i] = rels[c.check]
			}
		case extraCheckStatus:
			if status != "" {
				out[i] = status
				res.setExtra(e.start+i, outcome)
			}
		}
	}
}

// countChecks adds a row of the first pass to the check summary.
func (s *sheetRun) countChecks(dr *dataRow, res *rowResult, vals []any) {
	cs := s.ss.Check
	if cs == nil {
		return
	}
	e := &s.ext
	for i, c := range e.cols {
		switch c.kind {
		case extraCheckStatus:
			if o, ok := res.extra[e.start+i]; ok {
				cs.Rows++
				if o == outcomeFlagged {
					cs.Flagged++
				}
			}
		case extraCheckRel:
			r, ok := vals[e.start+i].(float64)
			sum := e.checks[c.check].sum
			if ok && math.Abs(r) > math.Abs(sum.LargestRel) {
				sum.LargestRel, sum.LargestRow = r, dr.row
				sum.Largest, _ = vals[e.start+i-1].(float64)
			}
		}
	}
}

// resultsSummary writes the process and check parts of the summary sheet.
func (r *run) resultsSummary(w *summaryWriter, bold int) {
	var procs, checks bool
	for _, s := range r.sum.Sheets {
		procs = procs || s.Process != nil
		checks = checks || s.Check != nil
	}
	if r.opt.U != "" {
		w.row(0, "Uncertainties given for whole columns", r.opt.U)
	}
	if procs {
		w.row(bold, "Process", "Kind", "OK", "Flagged", "Failed")
		for _, s := range r.sum.Sheets {
			if p := s.Process; p != nil {
				w.row(0, s.Name, p.Kind, p.OK, p.Flagged, p.Failed)
			}
		}
		w.skip()
	}
	if r.opt.U != "" || procs {
		w.row(0, "Uncertainty", "u(…) columns are standard uncertainties (k = 1) by the law of propagation of JCGM 100:2008, from the u(…) columns of the inputs and the uncertainties given for whole columns; a result's u takes every input it depends on, correlations included.")
		w.skip()
	}
	if checks {
		w.row(bold, "Check against steamcell", "Column", "Rows compared", "Rows beyond tolerance", "Largest deviation", "Unit", "Relative", "At row")
		for _, s := range r.sum.Sheets {
			c := s.Check
			if c == nil {
				continue
			}
			for i, col := range c.Columns {
				rows, flagged := "", ""
				if i == 0 {
					rows, flagged = strconv.Itoa(c.Rows), strconv.Itoa(c.Flagged)
				}
				w.row(0, s.Name, col.Letter+" "+col.Header, rows, flagged, fmt.Sprintf("%+.6g", col.Largest), col.Unit, fmt.Sprintf("%+.4g %%", 100*col.LargestRel), col.LargestRow)
			}
		}
		w.row(0, "Tolerance", fmt.Sprintf("%.3g %% of steamcell's value; deviations are the sheet's value minus steamcell's (IAPWS-IF97)", 100*r.checkTol()))
		w.skip()
	}
}

// ParseCheckTol reads a relative tolerance of check mode as the command
// and the server take it: "0.1%" or "0.001"; "" is DefaultCheckTol (0).
func ParseCheckTol(text string) (float64, error) {
	t := strings.TrimSpace(text)
	if t == "" {
		return 0, nil
	}
	scale := 1.0
	if num, ok := strings.CutSuffix(t, "%"); ok {
		t, scale = strings.TrimSpace(num), 0.01
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || !(v > 0) || math.IsInf(v, 0) || v*scale >= 1 {
		return 0, &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("check tolerance %q: give a relative tolerance above 0 and below 1, e.g. 0.1%% or 0.001", text)}
	}
	return v * scale, nil
}
