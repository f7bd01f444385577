package workbook

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"steamcell/fn"
	"steamcell/fn/if97"
	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Outcomes of a point, in rising order of concern.
const (
	outcomeBlank uint8 = iota
	outcomeOK
	outcomeFlagged
	outcomeFailed
)

// rowResult is what solving one row gave, besides the values written.
type rowResult struct {
	outcome  []uint8 // per pair
	comments []pendingComment
	extra    map[int]uint8 // outcome of an extra status cell, by result column
}

// pendingComment is a comment to add: on cell, or on the status cell of
// its pair and row when cell is "" or already has one. The status cell is
// named once the result columns are placed, after the first pass.
type pendingComment struct {
	cell string
	pair int
	row  int
	text string
}

// solveRow solves every pair of row dr and puts the status and results in
// out (1 + len(s.outs) cells per pair).
func (s *sheetRun) solveRow(dr *dataRow, out []any) rowResult {
	res := rowResult{outcome: make([]uint8, len(s.pairs))}
	width := 1 + len(s.outs)
	for i := range s.pairs {
		res.outcome[i] = s.solvePair(dr, i, out[i*width:(i+1)*width], &res)
		if s.ext.states != nil {
			s.ext.states[i] = nil
			if res.outcome[i] == outcomeOK || res.outcome[i] == outcomeFlagged {
				st := *s.ans.State()
				s.ext.states[i] = &st
			}
		}
	}
	s.solveExtras(dr, out, &res)
	return res
}

// solvePair solves pair i of row dr.
func (s *sheetRun) solvePair(dr *dataRow, i int, out []any, res *rowResult) uint8 {
	p := &s.pairs[i]
	a, b := dr.vals[2*i], dr.vals[2*i+1]
	cells := [2]string{cellName(p.in[0].idx, dr.row), cellName(p.in[1].idx, dr.row)}
	if a == "" && b == "" {
		return outcomeBlank
	}
	fail := func(status, cell, comment string) uint8 {
		out[0] = s.aggregateStatus(dr, status)
		res.comments = append(res.comments, pendingComment{cell: cell, pair: i, row: dr.row, text: "steamcell: " + comment})
		return outcomeFailed
	}
	var note []string
	for k := range 2 {
		if dr.note == nil {
			break
		}
		switch dr.note[2*i+k] {
		case formulaFailed:
			return fail(fmt.Sprintf("%s: formula without a stored result", cells[k]), cells[k], fmt.Sprintf(
				"%s holds a formula with no stored result, and steamcell could not calculate it. Open the workbook in a spreadsheet program, let it calculate, save it, and fill it again.", cells[k]))
		case formulaStored:
			note = append(note, cells[k]+": stored formula result")
		case formulaCalculated:
			note = append(note, cells[k]+": formula calculated by steamcell")
		}
	}
	for k, v := range [2]string{a, b} {
		if v == "" {
			other := cells[1-k]
			return fail(fmt.Sprintf("two inputs needed, found one: %s is blank", cells[k]), cells[k], fmt.Sprintf(
				"%s is blank, but %s holds %s. A state needs both inputs (%s and %s): fill in %s, or clear the row to skip it.",
				cells[k], other, strconv.Quote(dr.vals[2*i+1-k]), displaySymbol(p.in[0].sym), displaySymbol(p.in[1].sym), cells[k]))
		}
	}
	given := []point.Given{
		{Name: p.in[0].sym, Text: a, Unit: p.in[0].unit},
		{Name: p.in[1].sym, Text: b, Unit: p.in[1].unit},
	}
	// The one row path of every bulk caller (point.Plan.Row), with an
	// answer reused from row to row.
	if _, err := s.rowPlan.Row(given, &s.ans); err != nil {
		status, cell, comment := s.explain(err, p, cells, [2]string{a, b})
		return fail(status, cell, comment)
	}
	ans, st := &s.ans, s.ans.State()
	k := 0
	for j, o := range s.outs {
		switch o.sym {
		case "phase":
			out[1+j] = ans.Phase
		case "region":
			out[1+j] = ans.Region
		default:
			if k < len(ans.Fields) && ans.Fields[k].Defined {
				out[1+j] = ans.Fields[k].Value
			}
			k++
		}
	}
	status, comment := "", ""
	if s.uncertainIn(dr, i) {
		// The inputs' uncertainties say whether the phase is in doubt
		// (solveExtras); they replace the fixed margin.
		status, comment = s.checkWith(0, st, dropSaturationWarning(ans.Warnings))
	} else {
		status, comment = s.check(st, ans.Warnings)
	}
	if comment != "" {
		res.comments = append(res.comments, pendingComment{pair: i, row: dr.row, text: "steamcell: " + comment})
	}
	outcome := outcomeFlagged
	if status == "" {
		status, outcome = "ok", outcomeOK
	}
	if len(note) > 0 {
		status += " (" + strings.Join(note, "; ") + ")"
	}
	out[0] = s.aggregateStatus(dr, status)
	return outcome
}

// aggregateStatus marks the status of a row whose inputs are aggregates
// over their columns (an average row under the readings): it is solved,
// but it is not a test point.
func (s *sheetRun) aggregateStatus(dr *dataRow, status string) string {
	if dr.aggregate == "" {
		return status
	}
	return "aggregate row (" + dr.aggregate + " of the column), not a test point: " + status
}

// check returns a "check: …" status and a comment for a solved point that
// needs a look: near saturation, or with a warning of the engine. Both are
// "" when the point is fine.
func (s *sheetRun) check(st *fn.State, warnings []string) (status, comment string) {
	return s.checkWith(s.margin, st, warnings)
}

// checkWith is check with a margin of its own, K; 0 is off.
func (s *sheetRun) checkWith(margin float64, st *fn.State, warnings []string) (status, comment string) {
	set := s.opt.Point.Set
	var notes []string
	if margin > 0 && !st.HasX && st.P >= fn.PMinSat && st.P < if97.Pc {
		ts := if97.SatTemperature(st.P)
		if d := st.T - ts; math.Abs(d) < margin {
			side := "above"
			if d < 0 {
				side = "below"
			}
			dt := tempDiff(math.Abs(d), set)
			status = fmt.Sprintf("check: %s %s saturation, phase uncertain", dt, side)
			tu := set.Unit(units.Temperature)
			eu := set.Unit(units.SpecificEnergy)
			msg := fmt.Sprintf("T is %s %s the saturation temperature at this pressure (%.2f %s), within the margin of %s. "+
				"A measurement error that small puts the point in the other phase",
				dt, side, tu.FromBase(ts, s.opt.Point.Patm), tu.Name, tempDiff(margin, set))
			if liq, err := fn.FromPX(st.P, 0); err == nil {
				if vap, err := fn.FromPX(st.P, 1); err == nil {
					msg += fmt.Sprintf(", where h differs by up to the latent heat (%.0f %s here)", eu.FromBase(vap.H-liq.H, 0), eu.Name)
				}
			}
			msg += ". Confirm the phase (sight glass, trend, heat balance) before using these values."
			notes = append(notes, msg)
			// The engine's own nearness warning says less; drop it.
			warnings = dropSaturationWarning(warnings)
		}
	}
	for _, w := range warnings {
		if status == "" {
			status = "check: " + w
		}
		notes = append(notes, w)
	}
	return status, strings.Join(notes, " ")
}

// dropSaturationWarning removes the engine's nearness-to-saturation
// warning, which the margin flag replaces.
func dropSaturationWarning(ws []string) []string {
	var out []string
	for _, w := range ws {
		if !strings.Contains(w, "of saturation") {
			out = append(out, w)
		}
	}
	return out
}

// tempDiff writes a temperature difference in kelvin in the units of set:
// K for K and °C, °F for °F and °R.
func tempDiff(dK float64, set units.Set) string {
	switch set.Unit(units.Temperature).Name {
	case "°F", "°R":
		return fmt.Sprintf("%.2g °F", dK*1.8)
	}
	return fmt.Sprintf("%.2g K", dK)
}

// explain turns a solve error into a status, the cell to comment on ("" for
// the status cell) and the comment.
func (s *sheetRun) explain(err error, p *pairSpec, cells, texts [2]string) (status, cell, comment string) {
	inputs := fmt.Sprintf("Inputs: %s = %s%s, %s = %s%s.", cells[0], texts[0], unitNote(p.in[0].unit), cells[1], texts[1], unitNote(p.in[1].unit))
	var ue *units.InputError
	var fe *fn.InputError
	var pe *point.Error
	switch {
	case errors.As(err, &ue):
		k := 0
		if strings.EqualFold(ue.Name, p.in[1].sym) {
			k = 1
		}
		c := cells[k]
		if errors.Is(err, units.ErrSyntax) || errors.Is(err, units.ErrEmpty) || !startsLikeNumber(ue.Text) {
			return "not a number in " + c, c, fmt.Sprintf(
				"%s holds %s, not a number. Enter the reading as a number%s, or clear the row to skip it.",
				c, strconv.Quote(ue.Text), unitHint(p.in[k].unit, s.opt.Point.Set, p.in[k].q))
		}
		return c + ": " + ue.Error(), c, fmt.Sprintf("%s: %s. %s", c, ue.Error(), inputs)
	case errors.As(err, &fe):
		status = fnKind(fe.Kind)
		if d := fe.Detail.String(); d != "" {
			status += ": " + d
		}
		if !fe.Pair {
			for k := range 2 {
				if p.in[k].sym == fe.Input {
					cell = cells[k]
				}
			}
		}
		return status, cell, fmt.Sprintf("%s. %s Check the readings and their units.", fe.Error(), inputs)
	case errors.As(err, &pe):
		return pe.Msg, "", pe.Msg + ". " + inputs
	}
	return "error: " + err.Error(), "", err.Error() + ". " + inputs
}

func unitNote(u string) string {
	if u == "" {
		return ""
	}
	return " (header unit " + u + ")"
}

// unitHint says in which unit a bare number in the column is read.
func unitHint(u string, set units.Set, q fn.Quantity) string {
	if u != "" {
		return " (the header gives the unit, " + u + ")"
	}
	name := set.Unit(point.DimOf(q)).Name
	if name == "" {
		return ""
	}
	return " (with no unit in the header, in " + name + ")"
}

// fnKind is the short name of an engine error kind for a status.
func fnKind(kind error) string {
	switch kind {
	case fn.ErrNotFinite:
		return "not a finite number"
	case fn.ErrOutOfRange:
		return "out of range"
	case fn.ErrAboveCritical:
		return "above the critical point"
	case fn.ErrNoSolution:
		return "no solution"
	case fn.ErrTwoSolutions:
		return "two solutions"
	case fn.ErrOnSaturation:
		return "on the saturation line"
	case fn.ErrPair:
		return "unsupported pair"
	}
	if kind != nil {
		return kind.Error()
	}
	return "error"
}

// startsLikeNumber reports whether text begins as a number does, so that
// "TC fault, see log" is called not a number rather than a number with a
// comma.
func startsLikeNumber(text string) bool {
	text = strings.TrimSpace(text)
	if text == "" {
		return false
	}
	if strings.HasPrefix(text, "−") {
		return true
	}
	c := text[0]
	return c == '+' || c == '-' || c == '.' || c >= '0' && c <= '9'
}
