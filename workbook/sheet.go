package workbook

import (
	"bufio"
	"context"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode/utf8"

	"steamcell/fn/point"
)

// A filled sheet is read twice, both times as a stream. The first pass
// finds the header, the input columns and where the results go, solves
// every row and keeps only what the parts before the rows need (the
// dimension, the column widths, which cells get comments) and the counts.
// The second pass copies the sheet token for token, appending the result
// cells to each row as it solves it again. Solving twice costs less than
// keeping the results: a row is solved in microseconds, and memory stays
// a few rows whatever the sheet's size.

// sheetRun is the fill of one sheet.
type sheetRun struct {
	*run
	entry     sheetEntry
	name      string
	part      string
	rels      []rel
	relsXML   []byte
	legacyRID string // the r:id of the sheet's <legacyDrawing>, if any
	notes     notes

	headerRow  int
	unitRow    int
	pairs      []pairSpec
	firstOut   int // 0-based column of the first result
	nOut       int
	usedCol    int // one past the last column holding content
	colsMax    int // one past the last hidden or styled column
	mergedMax  int // one past the last column of a merged range
	lastRow    int // last data row
	firstPoint int // first row of a test point (not an aggregate row); 0 when none
	lastPoint  int // last row of a test point
	maxRow     int // last row of the sheet
	minCol     int // first column of the dimension (0-based)
	minRow     int // first row of the dimension; 0 when it names none
	pending    []dataRow
	calc       map[[2]int]string // (row, col) → value calculated for a formula without a stored result
	widths     []float64         // per result column
	hasComment map[string]bool
	candidates []pendingComment // comments found in the first pass, at most 2×MaxComments
	comments   []pendingComment
	pairCounts [][3]int // ok, flagged, failed per pair
	omitted    int
	ss         *SheetSummary
	mainPrefix string
	relPrefix  string
	outs2      []outCell // the result columns, in order
	walkErr    error     // the first error of deciding the header
	ext        extras    // uncertainty, process and check columns
}

// outCell is a result column: its letter, the output (nil for the status)
// and the style of its numbers, set once the styles are appended.
type outCell struct {
	letter string
	out    *output
	style  int
}

// top rows are kept whole until the header is found.
type topRow struct {
	row   int
	cells []cellData
}

// pass1 reads the sheet once: see the comment at the top of the file.
func (s *sheetRun) pass1(ctx context.Context) error {
	rc, err := s.pkg.open(s.part)
	if err != nil {
		return err
	}
	defer rc.Close()
	w := &walker{s: s, ctx: ctx}
	if err := w.walk(rc, nil); err != nil {
		return err
	}
	if !w.decided {
		if len(w.top) == 0 {
			return &Error{Kind: ErrNoInputs, Sheet: s.name, Msg: fmt.Sprintf("sheet %q is empty.", s.name)}
		}
		if err := w.decide(); err != nil {
			return err
		}
		for _, tr := range w.top {
			w.rowDone(tr.row, tr.cells)
		}
	}
	return nil
}

// walker walks the XML of a sheet; with an output it also writes it.
type walker struct {
	s       *sheetRun
	ctx     context.Context
	out     *bufio.Writer
	decided bool
	top     []topRow
	cells   []cellData // the kept cells of the current row
	cp      cellParser
	rows    int // rows seen, for progress and cancellation

	// pass 2
	colsDone   bool
	legacyDone bool
	dr         dataRow
	isData     bool
	solved     bool
	vals       []any
	res        rowResult
	next       int // index into outs2 of the next result cell to write
	rowNum     int
	buf        []byte
}

// legacyAfter are the elements of a worksheet that come after
// <legacyDrawing> (ECMA-376 Part 1, 18.3.1.99, CT_Worksheet).
var legacyAfter = map[string]bool{
	"legacyDrawingHF": true, "drawingHF": true, "picture": true, "oleObjects": true, "controls": true,
	"webPublishItems": true, "tableParts": true, "extLst": true, "AlternateContent": true,
}

func (w *walker) emit(b []byte) {
	if w.out != nil {
		w.out.Write(b)
	}
}

// walk runs over the sheet XML from r, writing to out when it is not nil.
func (w *walker) walk(r io.Reader, out io.Writer) error {
	s := w.s
	if out != nil {
		w.out = bufio.NewWriterSize(out, 64<<10)
	}
	sc := newScanner(r)
	depth := 0
	inCols, inData, inMerge := false, false, false
	row, col := 0, -1
	var cellRaw []byte
	for {
		t, err := sc.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return wrapPartErr(s.pkg, s.part, err)
		}
		switch t.kind {
		case tokStart, tokEmpty:
			name := string(t.name())
			switch {
			case depth == 0:
				s.mainPrefix = t.prefix()
				s.relPrefix = nsPrefix(t.raw, "relationships")
			case depth == 1:
				if w.out != nil && s.notes.legacyRID != "" && !w.legacyDone && legacyAfter[name] {
					w.writeLegacy()
				}
				switch name {
				case "dimension":
					if w.out != nil {
						tag, rest, err := gather(sc, t)
						if err != nil {
							return wrapPartErr(s.pkg, s.part, err)
						}
						w.emit(setAttr(tag, "ref", s.dimension()))
						w.emit(rest)
						continue
					}
					if ref, ok := attr(t.raw, "ref"); ok {
						if c, r, ok := splitRef(strings.Split(ref, ":")[0]); ok {
							s.minCol, s.minRow = c, r
						}
					}
				case "cols":
					inCols = t.kind == tokStart
					if w.out != nil && t.kind == tokEmpty {
						w.emit(openOf(t.raw))
						w.writeCols()
						w.emit([]byte("</" + string(t.qname()) + ">"))
						continue
					}
				case "sheetData":
					if w.out != nil && !w.colsDone {
						w.emit([]byte("<" + s.mainPrefix + "cols>"))
						w.writeCols()
						w.emit([]byte("</" + s.mainPrefix + "cols>"))
					}
					inData = t.kind == tokStart
				case "mergeCells":
					inMerge = t.kind == tokStart
				case "legacyDrawing":
					w.legacyDone = true
					if id, ok := attr(t.raw, "r:id"); ok {
						s.legacyRID = id
					} else if s.relPrefix != "" {
						s.legacyRID, _ = attr(t.raw, s.relPrefix+"id")
					}
				}
			case depth == 2 && inCols && name == "col":
				tag, rest, err := gather(sc, t)
				if err != nil {
					return wrapPartErr(s.pkg, s.part, err)
				}
				if w.out != nil {
					w.col(tag, rest)
				} else {
					s.noteCol(tag)
				}
				continue
			case depth == 2 && inMerge && name == "mergeCell":
				if ref, ok := attr(t.raw, "ref"); ok {
					if c := rangeMaxCol(ref); c+1 > s.mergedMax {
						s.mergedMax = c + 1
					}
				}
			case depth == 2 && inData && name == "row":
				if v, ok := attr(t.raw, "r"); ok {
					n, err := strconv.Atoi(v)
					if err != nil || n < 1 || n > maxRows {
						return &Error{Kind: ErrTooLarge, Sheet: s.name, Msg: fmt.Sprintf("sheet %q has a row numbered %q; rows run from 1 to %d", s.name, v, maxRows)}
					}
					row = n
				} else {
					row++
				}
				col = -1
				w.cells = w.cells[:0]
				if err := w.rowStart(row); err != nil {
					return err
				}
				if w.out != nil {
					w.startRow(t, row)
					if t.kind == tokStart {
						depth++
					}
					continue
				}
				if t.kind == tokEmpty {
					w.rowDone(row, w.cells)
					if s.walkErr != nil {
						return s.walkErr
					}
				}
			case depth == 3 && inData && name == "c":
				cellRaw = append(cellRaw[:0], t.raw...)
				if t.kind == tokEmpty {
					// An empty cell (a style and no value, as layouts
					// repeat them by the thousand) needs no parser.
					c := cellData{col: col + 1}
					if ref, ok := attr(t.raw, "r"); ok {
						cc, _, ok := splitRef(ref)
						if !ok {
							return damaged(s.pkg.base, fmt.Errorf("sheet %q row %d: cell reference %q", s.name, row, ref))
						}
						c.col = cc
					}
					col = c.col
					if w.out != nil {
						w.cell(&c, cellRaw)
					}
					continue
				}
				if t.kind == tokStart {
					for d := 1; d > 0; {
						ct, err := sc.next()
						if err != nil {
							return wrapPartErr(s.pkg, s.part, fmt.Errorf("inside a cell of row %d: %w", row, err))
						}
						cellRaw = append(cellRaw, ct.raw...)
						switch ct.kind {
						case tokStart:
							d++
						case tokEnd:
							d--
						}
					}
				}
				c, err := w.cp.parse(cellRaw, col+1)
				if err != nil {
					return damaged(s.pkg.base, fmt.Errorf("sheet %q row %d: %w", s.name, row, err))
				}
				col = c.col
				if c.content && c.col+1 > s.usedCol && w.out == nil {
					s.usedCol = c.col + 1
				}
				if w.out != nil {
					w.cell(&c, cellRaw)
				}
				if w.keep(row, &c) {
					w.cells = append(w.cells, c)
				}
				continue
			}
			if t.kind == tokStart {
				depth++
			}
		case tokEnd:
			depth--
			name := string(t.name())
			switch {
			case depth == 1 && name == "cols":
				inCols = false
				if w.out != nil {
					w.writeCols()
				}
			case depth == 1 && name == "sheetData":
				inData = false
			case depth == 1 && name == "mergeCells":
				inMerge = false
			case depth == 2 && inData && name == "row":
				if w.out != nil {
					w.endRow()
				} else {
					w.rowDone(row, w.cells)
					if s.walkErr != nil {
						return s.walkErr
					}
				}
			case depth == 0 && w.out != nil && s.notes.legacyRID != "" && !w.legacyDone:
				w.writeLegacy()
			}
		}
		w.emit(t.raw)
	}
	if row > s.maxRow {
		s.maxRow = row
	}
	if w.out != nil {
		return w.out.Flush()
	}
	return nil
}

// nsPrefix returns the prefix ("r:") a tag binds to a namespace whose URI
// contains part, or "".
func nsPrefix(tag []byte, part string) string {
	for _, kv := range strings.Fields(string(tag)) {
		if strings.HasPrefix(kv, "xmlns:") && strings.Contains(kv, part) {
			if i := strings.IndexByte(kv, '='); i > 6 {
				return kv[6:i] + ":"
			}
		}
	}
	return ""
}

// chunkRows is how often, in rows, a pass checks for cancellation and
// reports progress.
const chunkRows = 4096

// maxRows is the last row a sheet may have.
const maxRows = 1 << 20

// keep reports whether a cell is kept for the row's reading: every cell
// of the top rows until the header is found, then the input cells.
func (w *walker) keep(row int, c *cellData) bool {
	if !w.decided {
		return true
	}
	if row <= w.s.lastHeaderRow() {
		return false
	}
	for _, p := range w.s.pairs {
		if c.col == p.in[0].idx || c.col == p.in[1].idx {
			return true
		}
	}
	return w.s.ext.keep[c.col]
}

// rowStart checks for cancellation and reports progress now and then.
func (w *walker) rowStart(row int) error {
	w.rows++
	if w.rows%chunkRows == 0 {
		if err := w.ctx.Err(); err != nil {
			return err
		}
		w.s.report(w.out != nil, w.rows)
	}
	return nil
}

// rowDone takes a row of the first pass.
func (w *walker) rowDone(row int, cells []cellData) {
	s := w.s
	if row > s.maxRow {
		s.maxRow = row
	}
	if !w.decided {
		w.top = append(w.top, topRow{row: row, cells: append([]cellData(nil), cells...)})
		if row < max(headerScanRows, s.opt.HeaderRow+1) {
			return
		}
		if w.err(w.decide()) {
			return
		}
		for _, tr := range w.top {
			w.rowDone(tr.row, tr.cells)
		}
		w.top = nil
		return
	}
	dr, ok := s.dataRowOf(row, cells)
	if !ok {
		return
	}
	if dr.needsCalc {
		s.pending = append(s.pending, dr)
		return
	}
	s.analyse(&dr)
}

// walkErr keeps the first error found while the header is decided; the
// walk stops at the next row.
func (w *walker) err(err error) bool {
	if err != nil && w.s.walkErr == nil {
		w.s.walkErr = err
	}
	return err != nil
}

// decide reads the header from the top rows.
func (w *walker) decide() error {
	s := w.s
	n := 0
	for _, tr := range w.top {
		n = max(n, tr.row)
	}
	top := make([][]string, n)
	for _, tr := range w.top {
		var vals []string
		for _, c := range tr.cells {
			for len(vals) <= c.col {
				vals = append(vals, "")
			}
			vals[c.col] = s.sst.value(&c)
		}
		top[tr.row-1] = vals
	}
	h, err := readHeader(s.name, maskResultHeaders(top, s.opt), s.opt)
	if err != nil {
		return err
	}
	s.headerRow, s.unitRow, s.pairs = h.row, h.unitRow, h.pairs
	s.setPairs()
	var hdr []string
	if h.row > 0 && h.row <= len(top) {
		hdr = top[h.row-1]
	}
	if err := s.planExtras(hdr); err != nil {
		return err
	}
	w.decided = true
	return nil
}

// dataRowOf reads the inputs of a row below the header, or false when it
// is no data row: no input, or the input headers repeated.
func (s *sheetRun) dataRowOf(row int, cells []cellData) (dataRow, bool) {
	if row <= s.lastHeaderRow() || len(cells) == 0 {
		return dataRow{}, false
	}
	dr := dataRow{row: row, vals: make([]string, 2*len(s.pairs))}
	any := false
	aggs, filled := 0, 0 // inputs that aggregate their column; inputs given
	for _, c := range cells {
		if s.ext.keep[c.col] {
			if dr.more == nil {
				dr.more = map[int]string{}
			}
			dr.more[c.col] = strings.TrimSpace(s.sst.value(&c))
			any = any || dr.more[c.col] != "" && s.isProcessInput(c.col)
		}
		for j, p := range s.pairs {
			for k, in := range p.in {
				if c.col != in.idx {
					continue
				}
				idx := 2*j + k
				v := strings.TrimSpace(s.sst.value(&c))
				if c.hasF {
					if dr.note == nil {
						dr.note = make([]byte, len(dr.vals))
					}
					dr.note[idx] = formulaStored
					if agg := aggregateOf(c.f, c.col); agg != "" {
						aggs++
						if !strings.Contains(dr.aggregate, agg) {
							dr.aggregate = joinWith(dr.aggregate, "/", agg)
						}
					}
					if c.v == "" {
						if cv, ok := s.calc[[2]int{row, c.col}]; ok {
							v = cv
							dr.note[idx] = formulaCalculated
							if cv == "" {
								v, dr.note[idx] = " ", formulaFailed
							}
						} else {
							dr.needsCalc = true
							v = " "
						}
					}
				}
				if v != "" {
					any = true
					filled++
				}
				dr.vals[idx] = v
			}
		}
	}
	if !any || s.repeatsHeader(dr.vals) {
		return dataRow{}, false
	}
	if aggs < filled {
		dr.aggregate = "" // a row of readings with one average among them is a test point
	}
	return dr, true
}

// analyse solves a row in the first pass and keeps what the parts before
// the rows need, the counts and the comments.
func (s *sheetRun) analyse(dr *dataRow) {
	vals := make([]any, s.nOut)
	res := s.solveRow(dr, vals)
	s.lastRow = max(s.lastRow, dr.row)
	if dr.aggregate == "" { // rows with formulas to calculate come later, out of order
		if s.firstPoint == 0 || dr.row < s.firstPoint {
			s.firstPoint = dr.row
		}
		s.lastPoint = max(s.lastPoint, dr.row)
	}
	s.count(s.ss, dr, &res, vals)
	s.countExtras(dr, &res, vals)
	for i, v := range vals {
		if w := s.cellWidth(i, v); w > s.widths[i] {
			s.widths[i] = w
		}
	}
	for _, c := range res.comments {
		if len(s.candidates) >= 2*MaxComments {
			s.omitted++
			continue
		}
		s.candidates = append(s.candidates, c)
	}
}

// cellWidth is the width a result needs, in characters.
func (s *sheetRun) cellWidth(i int, v any) float64 {
	switch v := v.(type) {
	case string:
		return float64(utf8.RuneCountInString(v)) + 2
	case float64:
		return float64(len(s.formatted(i, v))) + 2
	case int:
		return float64(len(strconv.Itoa(v))) + 2
	}
	return 0
}

// formatted is a number as its number format shows it.
func (s *sheetRun) formatted(i int, v float64) string {
	o := s.outs2[i].out
	d := s.digitsOf(o.sym)
	if o.sci {
		return strconv.FormatFloat(v, 'e', d, 64)
	}
	return strconv.FormatFloat(v, 'f', d, 64)
}

// noteCol takes a <col> of the first pass: a hidden or styled column
// keeps the results to its right.
func (s *sheetRun) noteCol(tag []byte) {
	hidden, _ := attr(tag, "hidden")
	style, _ := attr(tag, "style")
	if hidden == "1" || hidden == "true" || style != "" && style != "0" {
		if v, ok := attr(tag, "max"); ok {
			if n, err := strconv.Atoi(v); err == nil && n > s.colsMax {
				s.colsMax = n
			}
		}
	}
}

// dimension is the sheet's used range with the results.
func (s *sheetRun) dimension() string {
	last := max(s.maxRow, 1)
	first := max(min(s.minRow, s.headerRow), 1)
	if s.minRow == 0 || s.headerRow == 0 {
		first = max(s.minRow, 1)
	}
	return cellName(s.minCol, first) + ":" + cellName(s.firstOut+s.nOut-1, last)
}

// pass2 writes the sheet with its results to out.
func (s *sheetRun) pass2(ctx context.Context, out io.Writer) error {
	rc, err := s.pkg.open(s.part)
	if err != nil {
		return err
	}
	defer rc.Close()
	w := &walker{s: s, ctx: ctx, decided: true, vals: make([]any, s.nOut)}
	s.report(true, 0)
	if err := w.walk(rc, out); err != nil {
		return err
	}
	s.report(true, s.maxRow)
	return nil
}

// writeCols writes the <col> elements of the results, once.
func (w *walker) writeCols() {
	if w.colsDone {
		return
	}
	w.colsDone = true
	s := w.s
	for i := range s.outs2 {
		n := s.firstOut + i + 1
		width := min(max(s.widths[i], 8), 120)
		w.emit([]byte(fmt.Sprintf(`<%scol min="%d" max="%d" width="%.2f" customWidth="1"/>`, s.mainPrefix, n, n, width)))
	}
}

// col copies a <col> of the second pass (its start tag and the rest of
// the element), cut around the result columns where it spans them (an
// unstyled, visible range such as LibreOffice writes to the sheet's end).
func (w *walker) col(tag, rest []byte) {
	s := w.s
	lo, hi := s.firstOut+1, s.firstOut+s.nOut
	a, _ := attr(tag, "min")
	b, _ := attr(tag, "max")
	mn, err1 := strconv.Atoi(a)
	mx, err2 := strconv.Atoi(b)
	if err1 != nil || err2 != nil || mx < lo {
		w.emit(tag)
		w.emit(rest)
		return
	}
	if mn > hi {
		w.writeCols()
		w.emit(tag)
		w.emit(rest)
		return
	}
	if mn < lo {
		w.emit(setAttr(tag, "max", strconv.Itoa(lo-1)))
		w.emit(rest)
	}
	w.writeCols()
	if mx > hi {
		w.emit(setAttr(tag, "min", strconv.Itoa(hi+1)))
		w.emit(rest)
	}
}

// gather reads the rest of the element that t starts and returns its
// start tag and the bytes after it, end tag included ("" for an empty
// element).
func gather(sc *scanner, t token) (tag, rest []byte, err error) {
	tag = append([]byte(nil), t.raw...)
	if t.kind == tokEmpty {
		return tag, nil, nil
	}
	for d := 1; d > 0; {
		ct, err := sc.next()
		if err != nil {
			return nil, nil, err
		}
		rest = append(rest, ct.raw...)
		switch ct.kind {
		case tokStart:
			d++
		case tokEnd:
			d--
		}
	}
	return tag, rest, nil
}

// writeLegacy writes the <legacyDrawing> of new notes.
func (w *walker) writeLegacy() {
	w.legacyDone = true
	s := w.s
	p := s.relPrefix
	decl := ""
	if p == "" {
		p = "r:"
		decl = ` xmlns:r="` + nsRelationships + `"`
	}
	w.emit([]byte(fmt.Sprintf(`<%slegacyDrawing%s %sid="%s"/>`, s.mainPrefix, decl, p, s.notes.legacyRID)))
}

// startRow writes a row's start tag in the second pass, its spans
// widened to the results when the row gets any.
func (w *walker) startRow(t token, row int) {
	s := w.s
	w.rowNum = row
	w.next = 0
	w.solved = false
	w.isData = false
	tag := t.raw
	if !w.rowGetsCells(row) {
		w.emit(tag)
		return
	}
	if v, ok := attr(tag, "spans"); ok {
		lo := 1
		if a, _, ok := strings.Cut(v, ":"); ok {
			if n, err := strconv.Atoi(a); err == nil {
				lo = n
			}
		}
		tag = setAttr(tag, "spans", strconv.Itoa(lo)+":"+strconv.Itoa(s.firstOut+s.nOut))
	}
	if t.kind == tokEmpty {
		w.emit(openOf(tag))
		w.flushCells(len(s.outs2))
		w.emit([]byte("</" + string(t.qname()) + ">"))
		return
	}
	w.emit(tag)
}

// rowGetsCells reports whether the fill writes cells in a row: the header,
// the row of units, and rows that may hold data.
func (w *walker) rowGetsCells(row int) bool {
	s := w.s
	return row == s.headerRow && s.headerRow > 0 || row == s.unitRow && s.unitRow > 0 || row > s.lastHeaderRow() && row <= s.lastRow
}

// cell copies a cell of the second pass, first writing the result cells
// that stand left of it; an empty cell in a result column gives way.
func (w *walker) cell(c *cellData, raw []byte) {
	s := w.s
	if c.col >= s.firstOut && w.rowGetsCells(w.rowNum) {
		w.flushCells(c.col - s.firstOut)
		if c.col < s.firstOut+s.nOut && !c.content {
			return
		}
	}
	w.emit(raw)
}

// endRow writes the rest of the result cells before a row's end tag.
func (w *walker) endRow() {
	if w.rowGetsCells(w.rowNum) {
		w.flushCells(len(w.s.outs2))
	}
}

// flushCells writes the result cells of the current row up to index n.
func (w *walker) flushCells(n int) {
	s := w.s
	if n > len(s.outs2) {
		n = len(s.outs2)
	}
	if w.next >= n {
		return
	}
	row := w.rowNum
	switch {
	case row == s.headerRow:
		for ; w.next < n; w.next++ {
			w.writeText(w.next, s.outHeaderAt(w.next), s.styles.xf[styleHeader])
		}
		return
	case row == s.unitRow:
		for ; w.next < n; w.next++ {
			if u := s.outUnitAt(w.next); u != "" {
				w.writeText(w.next, u, s.styles.xf[styleUnit])
			}
		}
		return
	}
	if !w.solved {
		w.solved = true
		w.isData = false
		if dr, ok := s.dataRowOf(row, w.cells); ok {
			clear(w.vals)
			w.res = s.solveRow(&dr, w.vals)
			w.isData = true
			w.dr = dr
		}
	}
	if !w.isData {
		w.next = n
		return
	}
	for ; w.next < n; w.next++ {
		i := w.next
		switch v := w.vals[i].(type) {
		case string:
			style := s.styles.xf[styleText]
			if s.outs2[i].out == nil {
				style = s.statusStyle(&w.dr, &w.res, i)
			} else if st, ok := s.extraStyle(&w.res, i); ok {
				style = st
			}
			w.writeText(i, v, style)
		case float64:
			w.buf = append(w.buf[:0], `<`...)
			w.buf = append(w.buf, s.mainPrefix...)
			w.buf = append(w.buf, `c r="`...)
			w.buf = append(w.buf, s.outs2[i].letter...)
			w.buf = strconv.AppendInt(w.buf, int64(row), 10)
			w.buf = append(w.buf, `" s="`...)
			w.buf = strconv.AppendInt(w.buf, int64(s.outs2[i].style), 10)
			w.buf = append(w.buf, `"><`...)
			w.buf = append(w.buf, s.mainPrefix...)
			w.buf = append(w.buf, `v>`...)
			w.buf = point.AppendNumber(w.buf, v)
			w.buf = append(w.buf, `</`...)
			w.buf = append(w.buf, s.mainPrefix...)
			w.buf = append(w.buf, `v></`...)
			w.buf = append(w.buf, s.mainPrefix...)
			w.buf = append(w.buf, `c>`...)
			w.emit(w.buf)
		case int:
			w.buf = append(w.buf[:0], fmt.Sprintf(`<%sc r="%s%d" s="%d"><%sv>%d</%sv></%sc>`, s.mainPrefix, s.outs2[i].letter, row, s.styles.xf[styleText], s.mainPrefix, v, s.mainPrefix, s.mainPrefix)...)
			w.emit(w.buf)
		}
	}
}

// writeText writes a text cell as an inline string, so that the shared
// string table stays as it was.
func (w *walker) writeText(i int, text string, style int) {
	s := w.s
	space := ""
	if strings.TrimSpace(text) != text {
		space = ` xml:space="preserve"`
	}
	p := s.mainPrefix
	w.buf = append(w.buf[:0], fmt.Sprintf(`<%sc r="%s%d" s="%d" t="inlineStr"><%sis><%st%s>`, p, s.outs2[i].letter, w.rowNum, style, p, p, space)...)
	w.buf = appendEscaped(w.buf, text, false)
	w.buf = append(w.buf, fmt.Sprintf(`</%st></%sis></%sc>`, p, p, p)...)
	w.emit(w.buf)
}
