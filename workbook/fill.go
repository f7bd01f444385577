package workbook

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"time"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Fill reads a workbook from in, fills it as the package doc describes and
// writes the result to out. name is the file name as the user knows it: a
// name ending in .csv (or .txt) is read as CSV text and written as .xlsx;
// anything else must be an .xlsx or .xlsm package, written as the same
// package with the results added. The name is written in the summary. in
// is read in place when it is an io.ReaderAt and an io.Seeker (a file, a
// bytes.Reader); otherwise it is read into memory first. When Fill returns
// an error, out may have received part of a package (after an
// interruption or a failed write only): discard it.
func Fill(ctx context.Context, in io.Reader, name string, opt Options, out io.Writer) (Summary, error) {
	ra, size, err := readerAt(in)
	if err != nil {
		return Summary{}, fmt.Errorf("read %s: %w", filepath.Base(name), err)
	}
	r, err := prepare(ctx, ra, size, name, opt, nil)
	if err != nil {
		return r.summary(), err
	}
	if err := r.write(ctx, out); err != nil {
		return r.sum, err
	}
	return r.sum, nil
}

// readerAt returns in as an io.ReaderAt and its size.
func readerAt(in io.Reader) (io.ReaderAt, int64, error) {
	if ra, ok := in.(io.ReaderAt); ok {
		if sk, ok := in.(io.Seeker); ok {
			size, err := sk.Seek(0, io.SeekEnd)
			if err == nil {
				return ra, size, nil
			}
		}
	}
	data, err := io.ReadAll(in)
	if err != nil {
		return nil, 0, err
	}
	return bytes.NewReader(data), int64(len(data)), nil
}

// FillFile fills the workbook at inPath and writes it to outPath ("" means
// DefaultOutput(inPath)). It never writes to inPath: it refuses an
// outPath that is the input, or that exists unless opt.Force, and it
// writes a temporary file in the output folder that it renames into place
// and removes on any error or cancellation. progress, when not nil, is
// told what is being done (see Progress).
func FillFile(ctx context.Context, inPath, outPath string, opt Options, progress Progress) (Summary, error) {
	if outPath == "" {
		outPath = DefaultOutput(inPath)
	}
	if err := checkPaths(inPath, outPath, opt.Force); err != nil {
		return Summary{}, err
	}
	f, err := os.Open(inPath)
	if err != nil {
		return Summary{}, fmt.Errorf("read the input: %w", err)
	}
	defer f.Close()
	info, err := f.Stat()
	if err != nil {
		return Summary{}, fmt.Errorf("read the input: %w", err)
	}
	r, err := prepare(ctx, f, info.Size(), inPath, opt, progress)
	if err != nil {
		return r.summary(), err
	}
	if err := writeFile(ctx, r, outPath, opt.Force); err != nil {
		return r.sum, err
	}
	return r.sum, nil
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

// writeFile writes the filled package to a temporary file beside path
// and moves it into place: by a hard link when it must not replace an
// existing file (so that a file appearing meanwhile is not lost), by a
// rename otherwise. The temporary file is removed whatever happens,
// cancellation included.
func writeFile(ctx context.Context, r *run, path string, force bool) error {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return fmt.Errorf("create a temporary file beside the output: %w", err)
	}
	tmpName := tmp.Name()
	defer os.Remove(tmpName) // after a rename, there is nothing left to remove
	if err := r.write(ctx, tmp); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Sync(); err != nil {
		tmp.Close()
		return fmt.Errorf("write %s: %w", tmpName, err)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("write %s: %w", tmpName, err)
	}
	if r.progress != nil {
		r.progress("saving "+filepath.Base(path), 0, -1)
	}
	if err := ctx.Err(); err != nil {
		return err
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

// prepare opens the input and runs the first pass over every sheet to
// fill: after it, every part to write is planned and every part to copy
// has been read once to its end. A run is returned with the error, for
// the summary of what was done.
func prepare(ctx context.Context, ra io.ReaderAt, size int64, name string, opt Options, progress Progress) (*run, error) {
	r, err := newRun(filepath.Base(name), opt, progress)
	if err != nil {
		return nil, err
	}
	ra, size, note, err := openInput(ra, size, name, r.unzipLimit, r.memory)
	if err != nil {
		return r, err
	}
	if note != "" {
		r.sum.Notes = append(r.sum.Notes, note)
	}
	r.input, r.inputSize = ra, size
	if r.pkg, err = openPkg(ra, size, r.fileName, r.unzipLimit, r.memory/2); err != nil {
		return r, err
	}
	if r.sst, err = r.pkg.loadSharedStrings(); err != nil {
		return r, err
	}
	if err := r.fill(ctx); err != nil {
		return r, err
	}
	return r, r.plan(ctx)
}

func (r *run) summary() Summary {
	if r == nil {
		return Summary{}
	}
	return r.sum
}

// output is a result column written for each pair.
type output struct {
	sym    string // property symbol, or "phase" or "region"
	header string // "h [kJ/kg]"
	unit   string
	sci    bool   // shown in scientific notation
	code   string // number format; "" for text
}

// run is one fill of one workbook.
type run struct {
	fileName   string
	opt        Options
	margin     float64 // K; 0 is off
	syms       []string
	outs       []output
	rowPlan    *point.Plan  // how a row's answer is written (made once)
	ans        point.Answer // the answer of the row being solved, reused
	progress   Progress
	sum        Summary
	unzipLimit int64
	memory     int64

	input     io.ReaderAt
	inputSize int64
	pkg       *pkg
	sst       *sharedStrings
	styles    *styleTable
	sheets    []*sheetRun // the sheets filled
	newParts  []newPart
	calcFile  *excelize.File
	calcTried bool

	// planned parts
	rewritten   map[string][]byte // by lower-case part name
	streamed    map[string]*sheetRun
	summaryPart string
	chart       chartPlan
}

// newPart is a part the fill adds.
type newPart struct {
	name  string
	ctype string // "" for a relationships part
	data  []byte
}

func newRun(fileName string, opt Options, progress Progress) (*run, error) {
	r := &run{fileName: fileName, opt: opt, progress: progress}
	switch {
	case opt.Margin == 0:
		r.margin = DefaultMargin
	case opt.Margin > 0:
		r.margin = opt.Margin
	}
	if r.opt.Date.IsZero() {
		r.opt.Date = time.Now()
	}
	r.unzipLimit = opt.UnzipSizeLimit
	if r.unzipLimit <= 0 {
		r.unzipLimit = DefaultUnzipSizeLimit
	}
	r.memory = opt.Memory
	if r.memory <= 0 {
		r.memory = DefaultMemory
	}
	if p := opt.Point.Patm; p != 0 && (p < units.MinPatm || p > units.MaxPatm) {
		return nil, &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("atmospheric pressure %g MPa is outside %g…%g MPa, the range of sites on Earth", p, units.MinPatm, units.MaxPatm)}
	}
	if opt.HeaderRow < 0 || opt.HeaderRow > maxRows {
		return nil, &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("header row %d is not a row of a sheet", opt.HeaderRow)}
	}
	for sym, d := range opt.Digits {
		if d < 0 || d > 15 {
			return nil, &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("digits %d for %q: give 0 to 15 decimals", d, sym)}
		}
	}
	var err error
	r.outs, r.syms, err = outputs(opt.Add, opt.Point, r.digitsOf)
	if err != nil {
		return nil, err
	}
	r.rowPlan = point.NewPlan(r.syms, opt.Point)
	return r, nil
}

// Default decimals of results by quantity, chosen for plant readings in
// the si set: enough to show the change a test resolves, no more (common
// practice, no source). Quantities not listed are shown in scientific
// notation with sciDigits decimals.
var defaultDigits = map[units.Dim]int{
	units.Pressure:        4,
	units.Temperature:     2,
	units.SpecificEnergy:  2,
	units.SpecificEntropy: 4,
	units.SpecificVolume:  6,
	units.Density:         3,
	units.Speed:           1,
	units.Quality:         4,
	units.Dimensionless:   4,
}

const sciDigits = 4

// digitsOf returns the decimals shown for a property: Options.Digits for
// it, or for every property (key ""), or the default of its quantity.
func (r *run) digitsOf(sym string) int {
	if d, ok := r.opt.Digits[sym]; ok {
		return d
	}
	if d, ok := r.opt.Digits[""]; ok {
		return d
	}
	p, _ := point.Lookup(sym)
	if d, ok := defaultDigits[p.Dim]; ok {
		return d
	}
	return sciDigits
}

// outputs reads the list of properties to write.
func outputs(add []string, po point.Options, digits func(string) int) ([]output, []string, error) {
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
				outs = append(outs, output{sym: sym, header: "Phase"})
			case "region":
				outs = append(outs, output{sym: sym, header: "IF97 region"})
			default:
				p, _ := point.Lookup(sym)
				u := p.Unit(po.Set) // K of difference for superheat in a °C set
				label := u
				if label == "" {
					label = "-"
				}
				_, fixed := defaultDigits[p.Dim]
				o := output{sym: sym, header: displaySymbol(sym) + " [" + label + "]", unit: u, sci: !fixed}
				d := digits(sym)
				o.code = "0"
				if d > 0 {
					o.code += "." + strings.Repeat("0", d)
				}
				if o.sci {
					o.code += "E+00"
				}
				outs = append(outs, o)
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

// fill runs the first pass over the sheets to fill.
func (r *run) fill(ctx context.Context) error {
	var list []string
	for _, e := range r.pkg.sheets {
		list = append(list, e.Name)
	}
	var targets []sheetEntry
	if r.opt.Sheet != "" {
		found := -1
		for i, e := range r.pkg.sheets {
			if e.Name == r.opt.Sheet {
				found = i
			}
		}
		if found < 0 {
			for i, e := range r.pkg.sheets {
				if strings.EqualFold(e.Name, r.opt.Sheet) {
					found = i
				}
			}
		}
		if found < 0 {
			return &Error{Kind: ErrNoSheet, Msg: fmt.Sprintf("%s has no sheet %q; its sheets are %s", r.fileName, r.opt.Sheet, quoteList(list))}
		}
		if r.pkg.sheets[found].part == "" {
			return &Error{Kind: ErrNoSheet, Msg: fmt.Sprintf("%s: %q is not a sheet of cells (a chart sheet?); its sheets are %s", r.fileName, r.opt.Sheet, quoteList(list))}
		}
		targets = []sheetEntry{r.pkg.sheets[found]}
	} else {
		if r.opt.Map != "" && len(list) > 1 {
			return &Error{Kind: ErrBadOption, Msg: fmt.Sprintf("a column map applies to one sheet; name it with --sheet (sheets: %s)", quoteList(list))}
		}
		targets = r.pkg.sheets
	}
	var skipped []string
	for _, e := range targets {
		if err := ctx.Err(); err != nil {
			return err
		}
		ss := SheetSummary{Name: e.Name}
		if r.opt.Sheet == "" {
			if isOwnSheet(e.Name) || e.part == "" {
				continue
			}
			if e.State == "hidden" || e.State == "veryHidden" {
				ss.Note = "hidden sheet, not filled; name it with --sheet to fill it"
				r.sum.Sheets = append(r.sum.Sheets, ss)
				continue
			}
		}
		s := &sheetRun{run: r, entry: e, name: e.Name, part: e.part, ss: &ss}
		err := s.first(ctx)
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
		r.sheets = append(r.sheets, s)
	}
	for _, s := range r.sum.Sheets {
		if s.Filled {
			r.sum.Rows += s.Rows
			r.sum.OK += s.OK
			r.sum.Flagged += s.Flagged
			r.sum.Failed += s.Failed
			r.sum.Blank += s.Blank
			r.sum.Aggregate += s.Aggregate
		}
	}
	if len(r.sheets) == 0 {
		msg := fmt.Sprintf("%s: no sheet has two input columns.", r.fileName)
		if len(skipped) > 0 {
			msg += " " + strings.Join(skipped, " ")
		} else {
			msg += " Its sheets are hidden or empty; name one with --sheet."
		}
		return &Error{Kind: ErrNoInputs, Msg: msg}
	}
	return nil
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
	row       int
	vals      []string       // the inputs, two per pair, trimmed
	note      []byte         // per input: 0, formulaStored or formulaCalculated; nil when none
	aggregate string         // "AVERAGE of C3:C20" when the inputs aggregate their columns
	needsCalc bool           // a formula input has no stored result
	more      map[int]string // cells of the extra results' columns, by column
}

const (
	formulaStored     = 1 + iota // a formula whose stored result is used
	formulaCalculated            // a formula without a stored result, calculated
	formulaFailed                // a formula without a stored result that could not be calculated
)

// first runs the first pass over one sheet and places its results.
func (s *sheetRun) first(ctx context.Context) error {
	var err error
	if s.rels, err = s.pkg.rels(s.part); err != nil {
		return damaged(s.pkg.base, fmt.Errorf("%s: %w", relsPath(s.part), err))
	}
	if s.relsXML, err = s.pkg.readIfThere(relsPath(s.part)); err != nil {
		return err
	}
	s.styles = s.run.styleTable()
	s.calc = map[[2]int]string{}
	if s.progress != nil {
		s.progress("reading "+s.name, 0, -1)
	}
	if err := s.pass1(ctx); err != nil {
		return err
	}
	if err := s.placeOutputs(); err != nil {
		return err
	}
	if err := s.calculate(); err != nil {
		return err
	}
	if err := s.readNotes(); err != nil {
		return err
	}
	s.pickComments()
	ss := s.ss
	ss.HeaderRow, ss.UnitRow = s.headerRow, s.unitRow
	if s.unitRow > 0 {
		ss.Note = joinNote(ss.Note, fmt.Sprintf("units read from row %d, under the header", s.unitRow))
	}
	for _, pr := range s.pairs { // headers without a unit: say which unit was used
		for _, c := range pr.in {
			if c.setNote != "" {
				ss.Note = joinNote(ss.Note, c.setNote)
			}
		}
	}
	ss.Comments = len(s.comments)
	if s.omitted > 0 {
		ss.Note = joinNote(ss.Note, fmt.Sprintf("comments on the first %d problems only (%d more); the status column lists every problem", MaxComments, s.omitted))
	}
	ss.Blank = s.lastRow - s.lastHeaderRow() - ss.Rows - ss.Aggregate
	if ss.Rows+ss.Aggregate == 0 {
		ss.Blank = 0
		ss.Note = joinNote(ss.Note, "no data rows below the header")
	}
	ss.Filled = true
	return nil
}

// styleTable returns the run's table of styles, made once.
func (r *run) styleTable() *styleTable {
	if r.styles == nil {
		var codes []string
		for _, o := range r.outs {
			if o.code != "" {
				codes = append(codes, o.code)
			}
		}
		r.styles = newStyleTable(codes)
	}
	return r.styles
}

// lastHeaderRow is the last row of the header: the row of units under it
// where there is one.
func (s *sheetRun) lastHeaderRow() int { return max(s.headerRow, s.unitRow) }

// repeatsHeader reports whether the inputs of a row are the input headers
// again, as sheets laid out for printing repeat them; such a row is no
// data.
func (s *sheetRun) repeatsHeader(vals []string) bool {
	if len(s.pairs) == 0 {
		return false
	}
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

// placeOutputs puts the result columns right of everything the sheet
// holds (values, formulas, merged ranges) and of every hidden or styled
// column, and names them.
func (s *sheetRun) placeOutputs() error {
	s.firstOut = max(s.usedCol, s.colsMax, s.mergedMax)
	for _, p := range s.pairs {
		for _, c := range p.in {
			s.firstOut = max(s.firstOut, c.idx+1)
		}
	}
	if s.firstOut+s.nOut > maxColumns {
		return &Error{Kind: ErrNoRoom, Sheet: s.name, Msg: fmt.Sprintf(
			"sheet %q uses columns up to %s (values, merged cells, hidden or formatted columns); the %d result columns do not fit before the last column, %s. Move or delete the columns at the far right",
			s.name, colLetter(s.firstOut-1), s.nOut, colLetter(maxColumns-1))}
	}
	ss := s.ss
	ss.Pairs = make([]Pair, len(s.pairs))
	width := 1 + len(s.outs)
	for i, p := range s.pairs {
		pr := &ss.Pairs[i]
		pr.Label = p.label
		for j, c := range p.in {
			pr.Inputs[j] = Column{Letter: c.letter(), Header: c.header, Symbol: c.sym, Unit: c.unit, Mapped: c.mapped}
		}
		base := s.firstOut + i*width
		pr.Outputs = append(pr.Outputs, Column{Letter: colLetter(base), Header: s.statusHeader(p), Symbol: "status"})
		for k, o := range s.outs {
			pr.Outputs = append(pr.Outputs, Column{Letter: colLetter(base + 1 + k), Header: s.outHeader(p, o), Symbol: o.sym, Unit: o.unit})
		}
		pr.OK, pr.Flagged, pr.Failed = s.pairCounts[i][0], s.pairCounts[i][1], s.pairCounts[i][2]
	}
	for i := range s.outs2 {
		s.outs2[i].letter = colLetter(s.firstOut + i)
		h := s.outHeaderAt(i)
		// A header wraps at its spaces; its longest word must fit.
		longest := 0
		for _, w := range strings.Fields(h) {
			longest = max(longest, utf8.RuneCountInString(w))
		}
		s.widths[i] = max(s.widths[i], float64(min(utf8.RuneCountInString(h), max(longest, 14)))+2)
	}
	return nil
}

// maxColumns is the number of columns of a sheet.
const maxColumns = 16384

// setPairs fixes the pairs of a sheet and the result columns they get.
func (s *sheetRun) setPairs() {
	width := 1 + len(s.outs)
	s.nOut = len(s.pairs) * width
	s.outs2 = make([]outCell, s.nOut)
	s.widths = make([]float64, s.nOut)
	s.pairCounts = make([][3]int, len(s.pairs))
	for i := range s.pairs {
		for k := range s.outs {
			o := &s.outs[k]
			c := &s.outs2[i*width+1+k]
			c.out = o
		}
	}
}

// calculate finds the values of input formulas without a stored result
// with excelize's calculation engine, then solves their rows. It loads
// the workbook into excelize's model, which takes several times the size
// of the XML, so only a workbook that unpacks to a 32nd of the memory
// budget is calculated; in a larger one such rows say that the formula
// has no stored result.
func (s *sheetRun) calculate() error {
	if len(s.pending) == 0 {
		return nil
	}
	f := s.run.calculator()
	for i := range s.pending {
		dr := &s.pending[i]
		for j, p := range s.pairs {
			for k, c := range p.in {
				idx := 2*j + k
				if dr.note == nil || dr.note[idx] != formulaStored || dr.vals[idx] != " " {
					continue
				}
				v := ""
				if f != nil {
					cv, err := f.CalcCellValue(s.name, cellName(c.idx, dr.row), excelize.Options{RawCellValue: true})
					if err == nil {
						v = strings.TrimSpace(cv)
					}
				}
				s.calc[[2]int{dr.row, c.idx}] = v
				if v == "" {
					dr.note[idx] = formulaFailed
				} else {
					dr.vals[idx], dr.note[idx] = v, formulaCalculated
				}
			}
		}
		dr.needsCalc = false
		s.analyse(dr)
	}
	s.pending = nil
	return nil
}

// calculator opens the input with excelize for formula calculation, once;
// nil when it is too large or cannot be opened.
func (r *run) calculator() *excelize.File {
	if r.calcTried {
		return r.calcFile
	}
	r.calcTried = true
	var total uint64
	for _, f := range r.pkg.zr.File {
		total += f.UncompressedSize64
	}
	if total > uint64(r.memory/32) {
		return nil
	}
	// Every part is kept in memory (no temporary files), within the
	// limit checked above.
	f, err := excelize.OpenReader(io.NewSectionReader(r.input, 0, r.inputSize),
		excelize.Options{UnzipSizeLimit: int64(total) + 1, UnzipXMLSizeLimit: int64(total) + 1})
	if err != nil {
		return nil
	}
	r.calcFile = f
	return f
}

// pickComments places the comments found in the first pass: on their
// cell, or on the status cell when the cell has a comment already.
func (s *sheetRun) pickComments() {
	width := 1 + len(s.outs)
	var kept []pendingComment
	for _, c := range s.candidates {
		cell := c.cell
		if cell == "" || s.hasComment[cell] {
			cell = cellName(s.firstOut+c.pair*width, c.row)
			if s.hasComment[cell] {
				continue
			}
		}
		if len(kept) >= MaxComments {
			s.omitted++
			continue
		}
		s.hasComment[cell] = true
		c.cell = cell
		kept = append(kept, c)
	}
	s.comments = kept
	s.candidates = nil
}

func joinNote(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}

// report tells the progress of a pass.
func (s *sheetRun) report(writing bool, rows int) {
	if s.progress == nil {
		return
	}
	if writing {
		s.progress("filling "+s.name, rows, s.maxRow)
		return
	}
	s.progress("reading "+s.name, rows, -1)
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

// outHeaderAt is the header of result column i.
func (s *sheetRun) outHeaderAt(i int) string {
	if h, ok := s.extraHeader(i); ok {
		return h
	}
	width := 1 + len(s.outs)
	return s.ss.Pairs[i/width].Outputs[i%width].Header
}

// outUnitAt is the unit of result column i, for a row of units.
func (s *sheetRun) outUnitAt(i int) string {
	if u, ok := s.extraUnit(i); ok {
		return u
	}
	width := 1 + len(s.outs)
	return s.ss.Pairs[i/width].Outputs[i%width].Unit
}

// statusStyle is the style of the status cell of result column i.
func (s *sheetRun) statusStyle(dr *dataRow, res *rowResult, i int) int {
	pair := i / (1 + len(s.outs))
	switch res.outcome[pair] {
	case outcomeFailed:
		return s.styles.xf[styleFailed]
	case outcomeFlagged:
		if dr.aggregate != "" {
			return s.styles.xf[styleAggregate]
		}
		return s.styles.xf[styleCheck]
	}
	if dr.aggregate != "" {
		return s.styles.xf[styleAggregate]
	}
	return s.styles.xf[styleOK]
}

// count adds a row's outcome to the sheet's counts, and lists a flagged
// or failed row for the summary.
func (s *sheetRun) count(ss *SheetSummary, dr *dataRow, res *rowResult, vals []any) {
	worst := outcomeOK
	for i, o := range res.outcome[:len(s.pairs)] {
		if dr.aggregate == "" {
			switch o {
			case outcomeOK:
				s.pairCounts[i][0]++
			case outcomeFlagged:
				s.pairCounts[i][1]++
			case outcomeFailed:
				s.pairCounts[i][2]++
			}
		}
		if o > worst {
			worst = o
		}
	}
	for _, o := range res.extra { // a process or check status
		worst = max(worst, o)
	}
	if dr.aggregate != "" {
		ss.Aggregate++
	} else {
		ss.Rows++
		switch worst {
		case outcomeOK, outcomeBlank:
			ss.OK++
		case outcomeFlagged:
			ss.Flagged++
		case outcomeFailed:
			ss.Failed++
		}
	}
	if worst < outcomeFlagged {
		return
	}
	width := 1 + len(s.outs)
	for i, o := range res.outcome[:len(s.pairs)] {
		if o < outcomeFlagged {
			continue
		}
		if len(s.run.sum.Listed) >= MaxListed {
			s.run.sum.Unlisted++
			continue
		}
		status, _ := vals[i*width].(string)
		s.run.sum.Listed = append(s.run.sum.Listed, Listing{Sheet: s.name, Row: dr.row, pair: i, sheet: s, Status: status, Failed: o == outcomeFailed})
	}
	s.listExtras(dr, res, vals)
}
