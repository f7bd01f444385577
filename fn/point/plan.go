package point

import (
	"math"
	"strconv"
	"unicode/utf8"

	"steamcell/fn"
	"steamcell/fn/units"
)

// Plan is how the answers of many points are written, decided once for all
// of them: which properties, in which units, with which labels. Fill then
// writes one solved state into an Answer, reusing the Answer's memory, with
// no map and no allocation for a state without warnings; the Answer's
// Append methods write it as CSV cells, as a JSON object, or a field as the
// number of a spreadsheet cell. Render is Fill with a plan of one, so that
// one answer and a batch of millions are written by the same rules.
//
// A Plan is only read once made: one Plan serves many goroutines, each
// with Answers of its own.
type Plan struct {
	opt      Options
	defaults bool // made from nil symbols: only the properties with a value
	cols     []column
	set      string
	inUnits  [fn.Quality + 1]units.Unit // each input quantity's unit in opt.Set
}

// column is one property of a plan, with its unit resolved.
type column struct {
	prop  *Property
	idx   int // index in the catalogue
	unit  units.Unit
	label string // the unit's label in answers (Property.Unit)
}

// NewPlan makes the plan of properties syms (checked by Symbols) in the
// units of opt. With syms nil, answers give the default properties that
// have a value for the state (DefaultSymbols).
func NewPlan(syms []string, opt Options) *Plan {
	pl := &Plan{opt: opt, defaults: syms == nil, set: opt.Set.Name()}
	if pl.defaults {
		syms = defaultSymbols
	}
	for q := fn.Pressure; q <= fn.Quality; q++ {
		pl.inUnits[q] = opt.Set.Unit(DimOf(q))
	}
	pl.cols = make([]column, 0, len(syms))
	for _, sym := range syms {
		i, ok := lookupIndex(sym)
		if !ok {
			continue
		}
		p := &catalogue[i]
		if p.get == nil { // phase and region: every answer has them apart
			continue
		}
		pl.cols = append(pl.cols, column{prop: p, idx: i, unit: opt.Set.Unit(p.Dim), label: p.Unit(opt.Set)})
	}
	return pl
}

// Fill writes state st into a: phase, region, the plan's properties in its
// units, and the warnings of the state and of its transport properties
// (when the plan has any). Properties with no value for this state are
// fields with Defined false, unless the plan gives the defaults, which
// leave them out. a keeps no reference to st.
func (pl *Plan) Fill(st *fn.State, a *Answer) { pl.fill(st, a, nil) }

// fill is Fill with the warnings' figures written in the units the inputs
// were typed in, when typed is not nil; the options of the notes are made
// only for a state with warnings.
func (pl *Plan) fill(st *fn.State, a *Answer, typed *typedInputs) {
	// Reset the flags of what view computes on first use, not the whole
	// of it: a value is read only where its flag says it is set.
	w := &a.w
	w.st, w.trDone, w.sigmaDone, w.satDone = st, false, false, false
	w.trOK, w.trLOK, w.trVOK, w.sigmaOK, w.tsatOK, w.psatOK = false, false, false, false, false, false
	w.trWarn, w.sigmaWarn = w.trWarn[:0], ""
	a.Phase, a.phase, a.Region, a.Set = st.Phase.String(), st.Phase, st.Region, pl.set
	a.Fields = a.Fields[:0]
	a.Warnings = a.Warnings[:0]
	if len(st.Warnings) > 0 {
		notes := pl.opt
		if typed != nil {
			notes = notes.withTyped(typed.in, values(typed.us))
		}
		for _, n := range st.Warnings {
			a.Warnings = append(a.Warnings, notes.note(n))
		}
	}
	a.plan, a.mask = pl, [len(a.mask)]uint64{}
	for i := range pl.cols {
		c := &pl.cols[i]
		v, ok := c.prop.get(w)
		defined := ok && !math.IsNaN(v) && !math.IsInf(v, 0)
		if defined && i < maxProps {
			a.mask[i/64] |= 1 << (i % 64)
		}
		if pl.defaults && !defined {
			continue
		}
		// The field is written in place: a Field is too large to copy.
		a.Fields = append(a.Fields, Field{})
		f := &a.Fields[len(a.Fields)-1]
		f.Symbol, f.Name, f.Unit, f.Defined, f.idx = c.prop.Symbol, c.prop.Name, c.label, defined, c.idx
		if defined {
			f.Value = c.prop.fromBase(v, &c.unit, pl.opt.Patm)
		}
	}
	a.Warnings = append(a.Warnings, w.trWarn...)
	if w.sigmaWarn != "" {
		a.Warnings = append(a.Warnings, w.sigmaWarn)
	}
	w.st = nil
}

// Row solves the point given (as Solve does, in the plan's options) and
// fills a with its answer: the one call per row of a batch, of a page's
// bulk request or of a workbook writer. The state is solved into a (State),
// so that a row costs no allocation and no copy of it. On an error a's
// fields are left as they were and its State is not meaningful.
func (pl *Plan) Row(given []Given, a *Answer) ([2]fn.Input, error) {
	var t typedInputs
	var err error
	t.in, t.us, err = solveInto(&a.st, given, &pl.opt)
	if err != nil {
		return t.in, err
	}
	pl.fill(&a.st, a, &t)
	return t.in, nil
}

// typedInputs are a point's inputs with the units they were typed in.
type typedInputs struct {
	in [2]fn.Input
	us [2]*units.Unit
}

// State returns the state that Row last solved for a.
func (a *Answer) State() *fn.State { return &a.st }

// lookupIndex returns the catalogue index of a symbol (case-insensitive).
func lookupIndex(sym string) (int, bool) {
	for i := range catalogue {
		if equalFold(catalogue[i].Symbol, sym) {
			return i, true
		}
	}
	return 0, false
}

// AppendCell writes field j as the text of a spreadsheet or CSV cell: its
// number, or nothing when it has no value for the state.
func (a *Answer) AppendCell(b []byte, j int) []byte {
	if f := &a.Fields[j]; f.Defined {
		return AppendNumber(b, f.Value)
	}
	return b
}

// AppendCSV writes the answer as CSV cells separated by delim: phase,
// region, each field (an empty cell where it has no value), and the
// warnings joined by "; ". It writes no line break, so that the cells can
// follow others on a row.
func (a *Answer) AppendCSV(b []byte, delim rune) []byte {
	b = AppendCSVCell(b, a.Phase, delim)
	b = utf8.AppendRune(b, delim)
	b = strconv.AppendInt(b, int64(a.Region), 10)
	for j := range a.Fields {
		b = utf8.AppendRune(b, delim)
		// A number holds no delimiter, quote or line break: no quoting.
		b = a.AppendCell(b, j)
	}
	b = utf8.AppendRune(b, delim)
	a.joined = a.joined[:0]
	for i, w := range a.Warnings {
		if i > 0 {
			a.joined = append(a.joined, "; "...)
		}
		a.joined = append(a.joined, w...)
	}
	return AppendCSVCell(b, a.joined, delim)
}

// AppendCSVCell writes one CSV cell, quoted as RFC 4180 and encoding/csv
// quote: a cell with the delimiter, a quote, a line break or a leading
// space is quoted, its quotes doubled.
func AppendCSVCell[T string | []byte](b []byte, c T, delim rune) []byte {
	if !csvNeedsQuotes(c, delim) {
		return append(b, c...)
	}
	b = append(b, '"')
	start := 0
	for i := 0; i < len(c); i++ {
		if c[i] == '"' {
			b = append(b, c[start:i+1]...)
			start = i
		}
	}
	b = append(b, c[start:]...)
	return append(b, '"')
}

func csvNeedsQuotes[T string | []byte](c T, delim rune) bool {
	if len(c) == 0 {
		return false
	}
	if c[0] == ' ' || c[0] == '\t' || len(c) == 2 && c[0] == '\\' && c[1] == '.' {
		return true
	}
	var d [utf8.UTFMax]byte
	n := utf8.EncodeRune(d[:], delim)
	for i := 0; i < len(c); i++ {
		switch c[i] {
		case '"', '\r', '\n':
			return true
		case d[0]:
			k := 1
			for k < n && i+k < len(c) && c[i+k] == d[k] {
				k++
			}
			if k == n {
				return true
			}
		}
	}
	return false
}
