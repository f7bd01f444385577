// Package workbook fills a workbook of test points with water and steam
// properties: it finds the two input columns of each sheet from the header
// row, solves every row with IAPWS-IF97 through package point (so that
// names and units mean what they mean in the state command and the
// server), and writes the results to the right of the data, with a status
// per row, comments on problem cells and a summary sheet. The steamcell
// fill command and the server's POST /workbook run the same code.
//
// # Finding the inputs
//
// The header row is the first of the top 100 rows of a sheet in which at
// least two cells are headers of inputs, as point.ParseHeader reads them
// ("Drum pressure [barg]", "T_steam (C)", "h (kJ/kg)"); title rows above
// it are ignored. Columns at or right of an earlier fill's status column
// ("Status (steamcell)") are never inputs, so a filled workbook can be
// filled again: the new results go further right.
//
// The units may stand in a row of their own under the header, as many
// test records print them ("Drum pressure" over "barg", "T" over "[°C]"):
// when the cells under the input columns read as units of their
// quantities (blanks allowed), that row gives the units, is not data, and
// gets the units of the results; a unit there that differs from one in the
// header above stops the fill (ErrAmbiguous). SheetSummary.UnitRow names
// the row.
//
// The input columns found are paired left to right: the 1st with the 2nd,
// the 3rd with the 4th, and so on, and every pair must be a pair the
// engine solves (p,T  p,h  p,s  h,s  p,x  T,x  p,v  T,v  T,h  T,s  u,v,
// with rho in place of v). Two columns give one state per row; four give
// two (a boiler test with steam p,T and feedwater p,T; a turbine stage with
// inlet and extraction p,T), each with its own result columns, labelled
// with the words the two headers share ("Feedwater h [kJ/kg]"). Any other
// count, or a pair the engine does not solve, stops the fill with a
// message listing the input headers and asking for a column map
// (Options.Map, --map "C=p:barg,D=t:C;E=p:barg,F=t:C"). The summary sheet
// says which columns were used.
//
// When every sheet is filled (Options.Sheet empty), hidden sheets and
// sheets with fewer than two input columns are left alone and listed in
// the summary; it is an error only when no sheet can be filled.
//
// # Results
//
// For each pair the fill writes a status column and the properties of
// Options.Add (default h, s, v, x, phase) with headers in the same style
// ("h [kJ/kg]") in the units of Options.Point.Set. The result columns
// start right of every value, formula and merged range of the sheet and
// of every hidden or styled column. Each result cell has a style of the
// fill's own: numbers at full precision with a number format of
// Options.Digits decimals (defaults per quantity), statuses colour-coded.
// A status is "ok", "ok" with a note on formula inputs, "check: …" for a
// point that was solved but needs a look (within Options.Margin of
// saturation, where a small error in p or T changes the phase; an engine
// warning), or the reason the point has no values ("not a number in C17",
// "out of range: T above 1073.15 K", "two inputs needed, found one: D17
// is blank"). A row whose inputs are all AVERAGE, SUM, MIN or MAX over
// their own columns is solved, marked as an aggregate row and not counted
// as a test point. Rows whose inputs are all blank are skipped and left
// blank. Problem cells get a comment (at most MaxComments per sheet; the
// status column lists all); the summary sheet lists the flagged and
// failed points with links (at most MaxListed).
//
// # Uncertainties, processes and check mode
//
// Three options add columns right of the properties of every pair
// (results.go, check.go). Options.U, or a "u(p) [bar]" column beside an
// input, gives inputs standard uncertainties, and each uncertain pair gets
// u(…) of every numeric property added (point.SolveMeasured). In process
// mode (Options.Process) the header row is read by
// point.ProcessColumns: each state number with two inputs that fix it is
// a pair, labelled "state N", and the process gets a status, its results
// and their u; a sheet without numbered headers gives its pairs, found as
// for any fill, as states 1, 2, … in order. Check mode (Options.Check) compares a sheet's own columns of
// those properties, which are then no inputs, with steamcell's values:
// a deviation in the column's unit, a relative one and a status, flagged
// beyond Options.CheckTol (DefaultCheckTol, 0.1 %), and the summary sheet
// counts them and gives each column's largest deviation.
//
// Input cells holding formulas are read through their stored results;
// where a formula has none, excelize calculates it. The status says so.
//
// # The chart
//
// A sheet of the fill's own, "steamcell chart", holds a native scatter
// chart of the filled points with the saturation line (chart.go): h–s
// when the results have h and s, else T–s when they have T and s. Each
// pair of each filled sheet is a series referencing its result columns
// over the rows of its test points, so the chart follows edits there; the
// saturation line stands in cells of the chart sheet, in the unit set of
// the results. Without s (or without h and T) there is no chart, and
// Summary.Notes says why.
//
// # Keeping the data safe
//
// The input is only read. The output is the input's package: every part is
// copied with its compressed bytes unchanged, except the filled sheets
// (streamed, cells appended to rows), their rels and notes (extended in
// place, or new), the styles (formats appended), the workbook part, its
// rels and the content types (the summary and chart sheets added), and
// the new parts: the summary sheet, the chart sheet with its drawing and
// chart. No drawing of the user's sheets is extended or renumbered. Every copied part is read to its end first, so a package
// whose entries lie about their sizes is refused as damaged. FillFile
// writes a new file: it refuses an output that is the input or that exists
// (unless Options.Force), writes to a temporary file in the output folder,
// renames it into place, and removes it on any error or cancellation.
//
// # Memory
//
// A filled sheet is read twice as a stream (see sheet.go); memory holds a
// row at a time, the parts loaded whole (the workbook part, the styles,
// existing notes) and the shared strings, which together must fit half of
// Options.Memory. A full 1,048,576-row sheet fills in a few tens of MiB.
package workbook
