package workbook

import (
	"errors"
	"time"

	"steamcell/fn/point"
)

// Defaults of Options.
const (
	// DefaultMargin is the distance from saturation, K, within which a
	// point is flagged.
	DefaultMargin = 1.0
	// DefaultUnzipSizeLimit is the most an input workbook may unpack to,
	// bytes: far above any sheet of test points, far below what would
	// exhaust a machine.
	DefaultUnzipSizeLimit = 2 << 30
	// MaxComments is the most problem comments added to one sheet; the
	// status column lists every problem.
	MaxComments = 1000
	// headerScanRows is how many rows from the top are searched for the
	// header row.
	headerScanRows = 100
)

// DefaultAdd are the properties written when Options.Add is empty.
var DefaultAdd = []string{"h", "s", "v", "x", "phase"}

// Options are the choices of one fill. The zero Options fills every
// visible sheet with the default properties in the si unit set.
type Options struct {
	// Sheet names the one sheet to fill; "" fills every visible sheet.
	Sheet string
	// Map assigns the input columns by hand: "B=p:barg,C=t:C", several
	// pairs separated by ';'. The unit after ':' may be left out, then it
	// comes from the header or the unit set. It needs Sheet when the
	// workbook has more than one sheet.
	Map string
	// HeaderRow is the 1-based row of the headers; 0 finds it.
	HeaderRow int
	// Add lists the properties to write: symbols of point.Symbols, "all",
	// "phase" and "region". Empty means DefaultAdd.
	Add []string
	// Point gives the unit set of bare numbers and results and the
	// atmospheric pressure of gauge units.
	Point point.Options
	// Margin, K, flags single-phase points this close to saturation; 0
	// means DefaultMargin and a negative value turns the flag off.
	Margin float64
	// Version is the program version written in the summary.
	Version string
	// Date is written in the summary; the zero time means now.
	Date time.Time
	// Force lets FillFile replace an existing output file.
	Force bool
	// UnzipSizeLimit is the most the input may unpack to, bytes; 0 means
	// DefaultUnzipSizeLimit.
	UnzipSizeLimit int64
	// Memory bounds what the fill holds in memory, bytes: the parts it
	// loads whole (the workbook part, the styles, the shared strings,
	// existing notes) may take half of it, and a workbook whose formulas
	// need calculating is loaded into excelize only within a 32nd. 0
	// means DefaultMemory. The rows are streamed, so the size of a sheet
	// does not count.
	Memory int64
	// Digits sets the decimals shown for results, by property symbol; the
	// key "" sets every property not named. The value stored is always
	// the full float64.
	Digits map[string]int
	// U gives one uncertainty for every input of a name, as --u does:
	// "p=0.2bar,t=0.5K" (point.ParseUncertaintyList); a "u(p) [bar]"
	// column beside an input gives it per row instead. Results then get
	// u(…) columns (results.go).
	U string
	// Process names a process kind (expansion, compression, throttling,
	// mixing, exchanger) computed from the numbered inputs of each row
	// (p1, t1, p2, t2 …).
	Process string
	// Check lists properties whose columns the sheet holds already, to
	// compare with steamcell's (check.go); CheckTol is the relative
	// tolerance beyond which a row is flagged, 0 for DefaultCheckTol.
	Check    []string
	CheckTol float64
}

// DefaultMemory is Options.Memory when it is 0.
const DefaultMemory = 1 << 30

// MaxListed is the most flagged and failed rows the summary sheet lists
// with links; the status columns show every one.
const MaxListed = 1000

// Summary tells what a fill did.
type Summary struct {
	Sheets       []SheetSummary
	SummarySheet string // name of the summary sheet added
	Chart        string // name of the sheet with the chart of the points; "" when there is none (Notes say why)
	Rows         int    // data rows with at least one input, all sheets
	OK           int    // rows whose every point is ok
	Flagged      int    // rows solved with a "check:" status, none failed
	Failed       int    // rows with a point that has no values
	Blank        int    // rows without inputs, skipped
	Aggregate    int    // rows of aggregate formulas (an average row), solved but not test points
	Notes        []string
	Listed       []Listing // flagged and failed points, at most MaxListed
	Unlisted     int       // flagged and failed points beyond MaxListed
}

// Listing is a flagged or failed point, as the summary sheet lists it.
type Listing struct {
	Sheet  string
	Row    int
	Status string
	Failed bool
	pair   int
	sheet  *sheetRun
}

// SheetSummary tells what a fill did on one sheet.
type SheetSummary struct {
	Name      string
	Filled    bool
	Note      string // why the sheet was not filled, or what to know
	HeaderRow int    // 1-based; 0 when there is none
	UnitRow   int    // 1-based row of units under the header; 0 when there is none
	Pairs     []Pair
	Rows      int
	OK        int
	Flagged   int
	Failed    int
	Blank     int
	Aggregate int             // aggregate rows, not counted in Rows
	Comments  int             // problem comments added
	Process   *ProcessSummary // with Options.Process
	Check     *CheckSummary   // with Options.Check
}

// Pair is one pair of input columns and the columns written for it.
type Pair struct {
	Label   string // words the two headers share, for result headers; "" for a sheet with one pair
	Inputs  [2]Column
	Outputs []Column // the status column first
	OK      int
	Flagged int
	Failed  int
}

// Column is a column of a sheet.
type Column struct {
	Letter string // "C"
	Header string // the header as written
	Symbol string // input symbol (p, t, …) or output property (h, phase, status)
	Unit   string // the unit of its numbers; "" when none
	Mapped bool   // given by Options.Map
}

// Kinds of error; test for them with errors.Is. Every error of Fill and
// FillFile that is about the input or the options is an *Error of one of
// these kinds; others are faults of the system (disk, memory).
var (
	ErrNotWorkbook  = errors.New("not a workbook steamcell can read")
	ErrPassword     = errors.New("workbook is password-protected")
	ErrTooLarge     = errors.New("workbook too large")
	ErrNoSheet      = errors.New("no such sheet")
	ErrNoInputs     = errors.New("no input columns found")
	ErrAmbiguous    = errors.New("input columns not clear")
	ErrBadOption    = errors.New("bad option")
	ErrNoRoom       = errors.New("no free column to the right of the data")
	ErrOutputExists = errors.New("output file exists")
	ErrSamePath     = errors.New("output is the input")
)

// Error is a problem with the input workbook or the options.
type Error struct {
	Kind  error
	Sheet string // the sheet concerned; may be empty
	Msg   string // a sentence saying what is wrong and what to do
}

func (e *Error) Error() string { return e.Msg }

// Unwrap returns the kind.
func (e *Error) Unwrap() error { return e.Kind }
