package workbook

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"time"

	"github.com/xuri/excelize/v2"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Fill reads a workbook from in, fills it as the package doc describes and
// writes the result to out as .xlsx. name is the file name as the user
// knows it: a name ending in .csv (or .txt) is read as CSV text, anything
// else must be an .xlsx workbook; the name is written in the summary.
// Nothing is written to out when Fill returns an error.
func Fill(ctx context.Context, in io.Reader, name string, opt Options, out io.Writer) (Summary, error) {
	data, err := io.ReadAll(in)
	if err != nil {
		return Summary{}, fmt.Errorf("read %s: %w", filepath.Base(name), err)
	}
	f, sum, err := fillData(ctx, data, name, opt, nil)
	if err != nil {
		return sum, err
	}
	defer f.Close()
	if err := f.Write(out); err != nil {
		return sum, fmt.Errorf("write the filled workbook: %w", err)
	}
	return sum, nil
}

// FillFile fills the workbook at inPath and writes it to outPath ("" means
// DefaultOutput(inPath)). It never writes to inPath: it refuses an
// outPath that is the input, or that exists unless opt.Force, and it
// writes a temporary file in the output folder that it renames into place.
// progress, when not nil, is told what is being done (see Progress).
func FillFile(ctx context.Context, inPath, outPath string, opt Options, progress Progress) (Summary, error) {
	if outPath == "" {
		outPath = DefaultOutput(inPath)
	}
	if err := checkPaths(inPath, outPath, opt.Force); err != nil {
		return Summary{}, err
	}
	data, err := os.ReadFile(inPath)
	if err != nil {
		return Summary{}, fmt.Errorf("read the input: %w", err)
	}
	f, sum, err := fillData(ctx, data, inPath, opt, progress)
	if err != nil {
		return sum, err
	}
	defer f.Close()
	if progress != nil {
		progress("saving "+filepath.Base(outPath), 0, -1)
	}
	if err := writeFile(f, outPath, opt.Force); err != nil {
		return sum, err
	}
	return sum, nil
}

// Progress is told the stage of a fill ("reading Boiler 2", "filling
// Boiler 2", "saving out.xlsx"), the rows done in it and their total, or -1
// when the total is not known yet. It is called from the goroutine of the
// fill, a few times a second at most for a large sheet.
type Progress func(stage string, done, total int)

// DefaultOutput is the output path of an input path: beside it, with
// "_filled" added to the name, as .xlsx (.xlsm for .xlsm).
func DefaultOutput(inPath string) string {
	ext := filepath.Ext(inPath)
	base := strings.TrimSuffix(inPath, ext)
	if strings.EqualFold(ext, ".xlsm") {
		return base + "_filled.xlsm"
	}
	return base + "_filled.xlsx"
}

// checkPaths refuses an output that is the input, an output of the wrong
// type, and an existing output without force.
func checkPaths(inPath, outPath string, force bool) error {
	inAbs, err1 := filepath.Abs(inPath)
	outAbs, err2 := filepath.Abs(outPath)
	if err1 == nil && err2 == nil && inAbs == outAbs {
		return &Error{Kind: ErrSamePath, Msg: fmt.Sprintf("the output %s is the input; give another output file (-o)", outPath)}
	}
	inInfo, err := os.Stat(inPath)
	if err != nil {
		return fmt.Errorf("read the input: %w", err)
	}
	if inInfo.IsDir() {
		return &Error{Kind: ErrNotWorkbook, Msg: fmt.Sprintf("%s is a folder, not a workbook", inPath)}
	}
	wantExt := ".xlsx"
	if strings.EqualFold(filepath.Ext(inPath), ".xlsm") {
		wantExt = ".xlsm"
	}
	if !strings.EqualFold(filepath.Ext(outPath), wantExt) {
		return &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("the output %s must end in %s: it is written as %s", outPath, wantExt, wantExt)}
	}
	outInfo, err := os.Stat(outPath)
	switch {
	case err == nil && os.SameFile(inInfo, outInfo):
		return &Error{Kind: ErrSamePath, Msg: fmt.Sprintf("the output %s is the input; give another output file (-o)", outPath)}
	case err == nil && outInfo.IsDir():
		return &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("the output %s is a folder; give a file name", outPath)}
	case err == nil && !force:
		return &Error{Kind: ErrOutputExists, Msg: fmt.Sprintf("%s exists; give another output file (-o), or --force to replace it", outPath)}
	case err != nil && !errors.Is(err, os.ErrNotExist):
		return fmt.Errorf("check the output: %w", err)
	}
	return nil
}

// writeFile writes f to a temporary file beside path and moves it into
// place: by a hard link when it must not replace an existing file (so that
// a file appearing meanwhile is not lost), by a rename otherwise.
func writeFile(f *excelize.File, path string, force bool) error {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return fmt.Errorf("create a temporary file beside the output: %w", err)
	}
	tmpName := tmp.Name()
	defer os.Remove(tmpName) // after a rename, there is nothing left to remove
	if err := f.Write(tmp); err != nil {
		tmp.Close()
		return fmt.Errorf("write %s: %w", tmpName, err)
	}
	if err := tmp.Sync(); err != nil {
		tmp.Close()
		return fmt.Errorf("write %s: %w", tmpName, err)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("write %s: %w", tmpName, err)
	}
	if err := os.Chmod(tmpName, 0o644); err != nil {
		return fmt.Errorf("set the mode of %s: %w", tmpName, err)
	}
	if !force {
		err := os.Link(tmpName, path)
		if err == nil {
			return nil
		}
		if errors.Is(err, os.ErrExist) {
			return &Error{Kind: ErrOutputExists, Msg: fmt.Sprintf("%s exists; give another output file (-o), or --force to replace it", path)}
		}
		// The file system has no hard links: check, then rename.
		if _, err := os.Lstat(path); err == nil {
			return &Error{Kind: ErrOutputExists, Msg: fmt.Sprintf("%s exists; give another output file (-o), or --force to replace it", path)}
		}
	}
	if err := os.Rename(tmpName, path); err != nil {
		return fmt.Errorf("move the output into place: %w", err)
	}
	return nil
}

// fillData opens data and fills it. On success the caller closes f.
func fillData(ctx context.Context, data []byte, name string, opt Options, progress Progress) (*excelize.File, Summary, error) {
	limit := opt.UnzipSizeLimit
	if limit <= 0 {
		limit = DefaultUnzipSizeLimit
	}
	f, note, err := open(data, name, limit)
	if err != nil {
		return nil, Summary{}, err
	}
	run, err := newRun(f, filepath.Base(name), opt, progress)
	if err != nil {
		f.Close()
		return nil, Summary{}, err
	}
	if note != "" {
		run.sum.Notes = append(run.sum.Notes, note)
	}
	if err := run.fill(ctx); err != nil {
		f.Close()
		return nil, run.sum, err
	}
	return f, run.sum, nil
}

// output is a result column written for each pair.
type output struct {
	sym    string // property symbol, or "phase" or "region"
	header string // "h [kJ/kg]"
	unit   string
	width  float64
}

// run is one fill of one workbook.
type run struct {
	f        *excelize.File
	fileName string
	opt      Options
	margin   float64 // K; 0 is off
	syms     []string
	outs     []output
	progress Progress
	sum      Summary
}

func newRun(f *excelize.File, fileName string, opt Options, progress Progress) (*run, error) {
	r := &run{f: f, fileName: fileName, opt: opt, progress: progress}
	switch {
	case opt.Margin == 0:
		r.margin = DefaultMargin
	case opt.Margin > 0:
		r.margin = opt.Margin
	}
	if r.opt.Date.IsZero() {
		r.opt.Date = time.Now()
	}
	if p := opt.Point.Patm; p != 0 && (p < units.MinPatm || p > units.MaxPatm) {
		return nil, &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("atmospheric pressure %g MPa is outside %g…%g MPa, the range of sites on Earth", p, units.MinPatm, units.MaxPatm)}
	}
	if opt.HeaderRow < 0 || opt.HeaderRow > excelize.TotalRows {
		return nil, &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("header row %d is not a row of a sheet", opt.HeaderRow)}
	}
	var err error
	r.outs, r.syms, err = outputs(opt.Add, opt.Point)
	if err != nil {
		return nil, err
	}
	return r, nil
}

// outputs reads the list of properties to write.
func outputs(add []string, po point.Options) ([]output, []string, error) {
	if len(add) == 0 {
		add = DefaultAdd
	}
	var outs []output
	var syms []string
	seen := map[string]bool{}
	for _, item := range add {
		item = strings.TrimSpace(item)
		var list []string
		switch strings.ToLower(item) {
		case "":
			continue
		case "phase", "region":
			list = []string{strings.ToLower(item)}
		default:
			s, err := point.Symbols([]string{item})
			if err != nil {
				return nil, nil, &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("properties to add (--add): %v; or phase, region", err)}
			}
			list = s
		}
		for _, sym := range list {
			if seen[sym] {
				continue
			}
			seen[sym] = true
			switch sym {
			case "phase":
				outs = append(outs, output{sym: sym, header: "Phase", width: 20})
			case "region":
				outs = append(outs, output{sym: sym, header: "IF97 region", width: 12})
			default:
				p, _ := point.Lookup(sym)
				u := p.Unit(po.Set)
				label := u
				if label == "" {
					label = "-"
				}
				outs = append(outs, output{sym: sym, header: displaySymbol(sym) + " [" + label + "]", unit: u, width: 13})
				syms = append(syms, sym)
			}
		}
	}
	if len(outs) == 0 {
		return nil, nil, &Error{Kind: ErrBadOption, Msg: "properties to add (--add): none named; e.g. h,s,v,x,phase"}
	}
	return outs, syms, nil
}

// displaySymbol is a property symbol as a header shows it: temperatures
// with a capital T, as the trade writes them.
func displaySymbol(sym string) string {
	switch sym {
	case "t":
		return "T"
	case "tsat":
		return "Tsat"
	}
	return sym
}

// fill fills the sheets and adds the summary sheet.
func (r *run) fill(ctx context.Context) error {
	list := r.f.GetSheetList()
	var targets []string
	if r.opt.Sheet != "" {
		name := ""
		for _, s := range list {
			if s == r.opt.Sheet {
				name = s
			}
		}
		if name == "" {
			for _, s := range list {
				if strings.EqualFold(s, r.opt.Sheet) {
					name = s
				}
			}
		}
		if name == "" {
			return &Error{Kind: ErrNoSheet, Msg: fmt.Sprintf("%s has no sheet %q; its sheets are %s", r.fileName, r.opt.Sheet, quoteList(list))}
		}
		targets = []string{name}
	} else {
		if r.opt.Map != "" && len(list) > 1 {
			return &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("a column map applies to one sheet; name it with --sheet (sheets: %s)", quoteList(list))}
		}
		targets = list
	}
	var skipped []string
	for _, name := range targets {
		if err := ctx.Err(); err != nil {
			return err
		}
		ss := SheetSummary{Name: name}
		if r.opt.Sheet == "" {
			if isSummarySheet(name) {
				continue
			}
			if visible, err := r.f.GetSheetVisible(name); err == nil && !visible {
				ss.Note = "hidden sheet, not filled; name it with --sheet to fill it"
				r.sum.Sheets = append(r.sum.Sheets, ss)
				continue
			}
		}
		err := r.fillSheet(ctx, &ss)
		var we *Error
		if err != nil && r.opt.Sheet == "" && errors.As(err, &we) && errors.Is(err, ErrNoInputs) {
			ss.Note = "not filled: " + we.Msg
			skipped = append(skipped, we.Msg)
			r.sum.Sheets = append(r.sum.Sheets, ss)
			continue
		}
		if err != nil {
			return err
		}
		r.sum.Sheets = append(r.sum.Sheets, ss)
	}
	filled := 0
	for _, s := range r.sum.Sheets {
		if s.Filled {
			filled++
			r.sum.Rows += s.Rows
			r.sum.OK += s.OK
			r.sum.Flagged += s.Flagged
			r.sum.Failed += s.Failed
			r.sum.Blank += s.Blank
		}
	}
	if filled == 0 {
		msg := fmt.Sprintf("%s: no sheet has two input columns.", r.fileName)
		if len(skipped) > 0 {
			msg += " " + strings.Join(skipped, " ")
		} else {
			msg += " Its sheets are hidden or empty; name one with --sheet."
		}
		return &Error{Kind: ErrNoInputs, Msg: msg}
	}
	return r.writeSummary()
}

func quoteList(list []string) string {
	q := make([]string, len(list))
	for i, s := range list {
		q[i] = fmt.Sprintf("%q", s)
	}
	return strings.Join(q, ", ")
}

// dataRow is a row below the header with at least one input.
type dataRow struct {
	row  int
	vals []string // the inputs, two per pair, trimmed
	note []byte   // per input: 0, formulaStored or formulaCalculated; nil when none
}

const (
	formulaStored     = 1 + iota // a formula whose stored result is used
	formulaCalculated            // a formula without a stored result, calculated
	formulaFailed                // a formula without a stored result that could not be calculated
)

// sheetRun is the fill of one sheet.
type sheetRun struct {
	*run
	name      string
	headerRow int
	unitRow   int // the row of units under the header, or 0
	pairs     []pairSpec
	rows      []dataRow
	maxCol    int // columns used by the data: results start at this index
	lastRow   int // last row with an input
	nRows     int // rows of the sheet, as streamed
	done      int // rows filled
	total     int // rows to fill
}

// fillSheet reads the inputs of one sheet, solves them and writes the
// results.
func (r *run) fillSheet(ctx context.Context, ss *SheetSummary) error {
	s := &sheetRun{run: r, name: ss.Name}
	if err := s.read(); err != nil {
		return err
	}
	if s.opt.MaxCells > 0 {
		cells := int64(s.nRows) * int64(s.maxCol+len(s.pairs)*(1+len(s.outs)))
		if cells > s.opt.MaxCells {
			return &Error{Kind: ErrTooLarge, Sheet: s.name, Msg: fmt.Sprintf(
				"sheet %q has %d rows and would have %d columns: %d cells, more than the limit of %d (about %s of memory); split the sheet",
				s.name, s.nRows, s.maxCol+len(s.pairs)*(1+len(s.outs)), cells, s.opt.MaxCells, byteSize(uint64(s.opt.MaxCells)*CellMemory))}
		}
	}
	if s.progress != nil {
		s.progress("loading "+s.name, 0, -1)
	}
	if err := s.resolveFormulas(); err != nil {
		return err
	}
	if err := s.placeOutputs(); err != nil {
		return err
	}
	return s.solveAndWrite(ctx, ss)
}

// read streams the rows of the sheet: the top rows whole, to find the
// header; below it only the input cells.
func (s *sheetRun) read() error {
	rows, err := s.f.Rows(s.name)
	if err != nil {
		return fmt.Errorf("read sheet %q: %w", s.name, err)
	}
	defer rows.Close()
	var top [][]string
	decided := false
	n := 0
	for rows.Next() {
		n++
		if n%chunkRows == 0 && s.progress != nil {
			s.progress("reading "+s.name, n, -1)
		}
		cols, err := rows.Columns(excelize.Options{RawCellValue: true})
		if err != nil {
			return fmt.Errorf("read row %d of sheet %q: %w", n, s.name, err)
		}
		if len(cols) > s.maxCol {
			s.maxCol = len(cols)
		}
		if !decided {
			top = append(top, cols)
			if n < max(headerScanRows, s.opt.HeaderRow+1) { // a row of units may follow the header
				continue
			}
			if err := s.decide(top); err != nil {
				return err
			}
			decided = true
			for i, c := range top {
				s.take(i+1, c)
			}
			top = nil
			continue
		}
		s.take(n, cols)
	}
	s.nRows = n
	if err := rows.Error(); err != nil {
		if errors.Is(err, excelize.ErrMaxRows) {
			return &Error{Kind: ErrTooLarge, Sheet: s.name, Msg: fmt.Sprintf("sheet %q has a row beyond %d, the last row a sheet may have", s.name, excelize.TotalRows)}
		}
		return fmt.Errorf("read sheet %q: %w", s.name, err)
	}
	if !decided {
		if n == 0 {
			return &Error{Kind: ErrNoInputs, Sheet: s.name, Msg: fmt.Sprintf("sheet %q is empty.", s.name)}
		}
		if err := s.decide(top); err != nil {
			return err
		}
		for i, c := range top {
			s.take(i+1, c)
		}
	}
	return nil
}

// decide finds the header row and the input pairs from the top rows.
func (s *sheetRun) decide(top [][]string) error {
	var err error
	s.headerRow, s.unitRow, s.pairs, err = findColumns(s.name, top, s.opt.Map, s.opt.HeaderRow, s.opt.Point.Set)
	return err
}

// lastHeaderRow is the last row of the header: the row of units under it
// where there is one.
func (s *sheetRun) lastHeaderRow() int { return max(s.headerRow, s.unitRow) }

// take keeps row n when it lies below the header and has a cell in an
// input column: a value, or a formula whose result is not stored (the
// stream shows it as ""). Rows without inputs are dropped by
// resolveFormulas.
func (s *sheetRun) take(n int, cols []string) {
	if n <= s.lastHeaderRow() {
		return
	}
	var vals []string
	idx := 0
	for _, p := range s.pairs {
		for _, c := range p.in {
			if c.idx < len(cols) {
				if vals == nil {
					vals = make([]string, 2*len(s.pairs))
				}
				vals[idx] = strings.TrimSpace(cols[c.idx])
			}
			idx++
		}
	}
	if vals == nil || s.repeatsHeader(vals) {
		return
	}
	s.rows = append(s.rows, dataRow{row: n, vals: vals})
}

// repeatsHeader reports whether the inputs of a row are the input headers
// again, as sheets laid out for printing repeat them; such a row is no
// data.
func (s *sheetRun) repeatsHeader(vals []string) bool {
	idx := 0
	for _, p := range s.pairs {
		for _, c := range p.in {
			if c.header == "" || vals[idx] != c.header {
				return false
			}
			idx++
		}
	}
	return true
}

// resolveFormulas finds the input cells that hold formulas: their stored
// results are used; where a formula has none, excelize calculates it.
func (s *sheetRun) resolveFormulas() error {
	for i := range s.rows {
		dr := &s.rows[i]
		for j, p := range s.pairs {
			for k, c := range p.in {
				cell := cellName(c.idx, dr.row)
				fx, err := s.f.GetCellFormula(s.name, cell)
				if err != nil {
					return fmt.Errorf("read the formula of %s on sheet %q: %w", cell, s.name, err)
				}
				if fx == "" {
					continue
				}
				if dr.note == nil {
					dr.note = make([]byte, len(dr.vals))
				}
				idx := 2*j + k
				dr.note[idx] = formulaStored
				if dr.vals[idx] == "" {
					v, err := s.f.CalcCellValue(s.name, cell, excelize.Options{RawCellValue: true})
					dr.vals[idx] = strings.TrimSpace(v)
					dr.note[idx] = formulaCalculated
					if err != nil || dr.vals[idx] == "" {
						// Kept as a row, reported as a formula without a value.
						dr.vals[idx] = " "
						dr.note[idx] = formulaFailed
					}
				}
			}
		}
	}
	kept := s.rows[:0]
	for _, dr := range s.rows {
		for _, v := range dr.vals {
			if v != "" {
				kept = append(kept, dr)
				s.lastRow = dr.row
				break
			}
		}
	}
	s.rows = kept
	return nil
}

// placeOutputs puts the result columns right of everything the sheet
// holds: values, formulas and merged ranges.
func (s *sheetRun) placeOutputs() error {
	merged, err := s.f.GetMergeCells(s.name, true)
	if err != nil {
		return fmt.Errorf("read the merged cells of sheet %q: %w", s.name, err)
	}
	for _, m := range merged {
		col, _, err := excelize.CellNameToCoordinates(m.GetEndAxis())
		if err == nil && col > s.maxCol {
			s.maxCol = col
		}
	}
	for _, p := range s.pairs {
		for _, c := range p.in {
			if c.idx+1 > s.maxCol {
				s.maxCol = c.idx + 1
			}
		}
	}
	need := len(s.pairs) * (1 + len(s.outs))
	if s.maxCol+need > excelize.MaxColumns {
		return &Error{Kind: ErrNoRoom, Sheet: s.name, Msg: fmt.Sprintf(
			"sheet %q uses columns up to %s; the %d result columns do not fit before the last column, %s. Move or delete the columns at the far right",
			s.name, colLetter(s.maxCol-1), need, colLetter(excelize.MaxColumns-1))}
	}
	return nil
}

// chunkRows is how many rows are solved before they are written.
const chunkRows = 4096

// solveAndWrite solves the rows in chunks, in parallel, and writes each
// chunk in row order.
func (s *sheetRun) solveAndWrite(ctx context.Context, ss *SheetSummary) error {
	width := 1 + len(s.outs)
	nOut := len(s.pairs) * width
	ss.HeaderRow = s.headerRow
	ss.UnitRow = s.unitRow
	if s.unitRow > 0 {
		ss.Note = joinNote(ss.Note, fmt.Sprintf("units read from row %d, under the header", s.unitRow))
	}
	for _, p := range s.pairs {
		for _, c := range p.in {
			if c.setNote != "" {
				ss.Note = joinNote(ss.Note, c.setNote)
			}
		}
	}
	ss.Pairs = make([]Pair, len(s.pairs))
	for i, p := range s.pairs {
		pr := &ss.Pairs[i]
		pr.Label = p.label
		for j, c := range p.in {
			pr.Inputs[j] = Column{Letter: c.letter(), Header: c.header, Symbol: c.sym, Unit: c.unit, Mapped: c.mapped}
		}
		base := s.maxCol + i*width
		pr.Outputs = append(pr.Outputs, Column{Letter: colLetter(base), Header: s.statusHeader(p), Symbol: "status"})
		for k, o := range s.outs {
			pr.Outputs = append(pr.Outputs, Column{Letter: colLetter(base + 1 + k), Header: s.outHeader(p, o), Symbol: o.sym, Unit: o.unit})
		}
	}
	if err := s.writeHeaders(ss); err != nil {
		return err
	}
	existing, err := s.f.GetComments(s.name)
	if err != nil {
		return fmt.Errorf("read the comments of sheet %q: %w", s.name, err)
	}
	hasComment := make(map[string]bool, len(existing))
	for _, c := range existing {
		hasComment[c.Cell] = true
	}
	s.total = len(s.rows)
	s.report()

	letters := make([]string, nOut)
	for i := range letters {
		letters[i] = colLetter(s.maxCol + i)
	}
	workers := runtime.GOMAXPROCS(0)
	vals := make([]any, chunkRows*nOut)
	results := make([]rowResult, chunkRows)
	var comments []pendingComment
	omitted := 0
	for start := 0; start < len(s.rows); start += chunkRows {
		if err := ctx.Err(); err != nil {
			return err
		}
		end := min(start+chunkRows, len(s.rows))
		n := end - start
		clear(vals[:n*nOut])
		var wg sync.WaitGroup
		per := (n + workers - 1) / workers
		for w := 0; w < n; w += per {
			wg.Add(1)
			go func(lo, hi int) {
				defer wg.Done()
				for i := lo; i < hi; i++ {
					results[i] = s.solveRow(&s.rows[start+i], vals[i*nOut:(i+1)*nOut])
				}
			}(w, min(w+per, n))
		}
		wg.Wait()
		for i := 0; i < n; i++ {
			dr := &s.rows[start+i]
			if err := s.writeRow(dr.row, letters, vals[i*nOut:(i+1)*nOut]); err != nil {
				return fmt.Errorf("write row %d of sheet %q: %w", dr.row, s.name, err)
			}
			res := &results[i]
			s.count(ss, res)
			for _, c := range res.comments {
				if hasComment[c.cell] {
					c.cell = c.fallback
					if hasComment[c.cell] {
						continue
					}
				}
				if len(comments) >= MaxComments {
					omitted++
					continue
				}
				hasComment[c.cell] = true
				comments = append(comments, c)
			}
		}
		s.done += n
		s.report()
	}
	for _, c := range comments {
		if err := s.f.AddComment(s.name, excelize.Comment{Author: "steamcell", Cell: c.cell, Text: c.text, Width: 320, Height: 110}); err != nil {
			return fmt.Errorf("add a comment to %s on sheet %q: %w", c.cell, s.name, err)
		}
	}
	ss.Comments = len(comments)
	if omitted > 0 {
		ss.Note = fmt.Sprintf("comments on the first %d problems only (%d more); the status column lists every problem", MaxComments, omitted)
	}
	ss.Blank = s.lastRow - s.lastHeaderRow() - len(s.rows)
	if len(s.rows) == 0 {
		ss.Blank = 0
		ss.Note = joinNote(ss.Note, "no data rows below the header")
	}
	ss.Filled = true
	return nil
}

// writeRow writes the results of one row; blank results write no cell.
// Numbers are written in full: excelize's automatic precision would cut
// them to 15 significant digits.
func (s *sheetRun) writeRow(row int, letters []string, vals []any) error {
	r := strconv.Itoa(row)
	for i, v := range vals {
		var err error
		switch v := v.(type) {
		case nil:
			continue
		case float64:
			err = s.f.SetCellFloat(s.name, letters[i]+r, v, decimals(v), 64)
		case string:
			err = s.f.SetCellStr(s.name, letters[i]+r, v)
		case int:
			err = s.f.SetCellInt(s.name, letters[i]+r, int64(v))
		default:
			err = s.f.SetCellValue(s.name, letters[i]+r, v)
		}
		if err != nil {
			return err
		}
	}
	return nil
}

// decimals returns the number of decimals of the shortest decimal form of
// v that reads back as v.
func decimals(v float64) int {
	str := strconv.FormatFloat(v, 'f', -1, 64)
	if i := strings.IndexByte(str, '.'); i >= 0 {
		return len(str) - i - 1
	}
	return 0
}

func joinNote(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}

func (s *sheetRun) report() {
	if s.progress != nil {
		s.progress("filling "+s.name, s.done, s.total)
	}
}

func (s *sheetRun) statusHeader(p pairSpec) string {
	if p.label == "" {
		return "Status (steamcell)"
	}
	return p.label + " status (steamcell)"
}

func (s *sheetRun) outHeader(p pairSpec, o output) string {
	switch {
	case p.label == "":
		return o.header
	case o.sym == "phase":
		return p.label + " phase"
	}
	return p.label + " " + o.header
}

// writeHeaders writes the result headers in the header row, in the style
// of the first input header, and sets the widths of the result columns.
func (s *sheetRun) writeHeaders(ss *SheetSummary) error {
	width := 1 + len(s.outs)
	for i := range ss.Pairs {
		base := s.maxCol + i*width
		if err := s.f.SetColWidth(s.name, colLetter(base), colLetter(base), 30); err != nil {
			return fmt.Errorf("set the width of column %s on sheet %q: %w", colLetter(base), s.name, err)
		}
		for k, o := range s.outs {
			if err := s.f.SetColWidth(s.name, colLetter(base+1+k), colLetter(base+1+k), o.width); err != nil {
				return fmt.Errorf("set the width of column %s on sheet %q: %w", colLetter(base+1+k), s.name, err)
			}
		}
	}
	if s.headerRow == 0 {
		return nil
	}
	headers := make([]any, 0, len(ss.Pairs)*width)
	for _, p := range ss.Pairs {
		for _, c := range p.Outputs {
			headers = append(headers, c.Header)
		}
	}
	first := cellName(s.maxCol, s.headerRow)
	if err := s.f.SetSheetRow(s.name, first, &headers); err != nil {
		return fmt.Errorf("write the result headers on sheet %q: %w", s.name, err)
	}
	style, err := s.f.GetCellStyle(s.name, cellName(s.pairs[0].in[0].idx, s.headerRow))
	if err == nil && style != 0 {
		last := cellName(s.maxCol+len(headers)-1, s.headerRow)
		if err := s.f.SetCellStyle(s.name, first, last, style); err != nil {
			return fmt.Errorf("style the result headers on sheet %q: %w", s.name, err)
		}
	}
	if s.unitRow == 0 {
		return nil
	}
	// A sheet with a row of units under its header gets the units of the
	// results there too, in the style of the first input's unit cell.
	unitCells := make([]any, 0, len(headers))
	for _, p := range ss.Pairs {
		for _, c := range p.Outputs {
			unitCells = append(unitCells, c.Unit)
		}
	}
	first = cellName(s.maxCol, s.unitRow)
	if err := s.f.SetSheetRow(s.name, first, &unitCells); err != nil {
		return fmt.Errorf("write the result units on sheet %q: %w", s.name, err)
	}
	style, err = s.f.GetCellStyle(s.name, cellName(s.pairs[0].in[0].idx, s.unitRow))
	if err == nil && style != 0 {
		last := cellName(s.maxCol+len(unitCells)-1, s.unitRow)
		if err := s.f.SetCellStyle(s.name, first, last, style); err != nil {
			return fmt.Errorf("style the result units on sheet %q: %w", s.name, err)
		}
	}
	return nil
}

// count adds a row's outcome to the sheet's counts.
func (s *sheetRun) count(ss *SheetSummary, res *rowResult) {
	ss.Rows++
	worst := outcomeOK
	for i, o := range res.outcome[:len(s.pairs)] {
		p := &ss.Pairs[i]
		switch o {
		case outcomeOK:
			p.OK++
		case outcomeFlagged:
			p.Flagged++
		case outcomeFailed:
			p.Failed++
		}
		if o > worst {
			worst = o
		}
	}
	switch worst {
	case outcomeOK, outcomeBlank:
		ss.OK++
	case outcomeFlagged:
		ss.Flagged++
	case outcomeFailed:
		ss.Failed++
	}
}
