package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"strconv"
	"strings"
	"syscall"
	"time"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"steamcell/fn/point"
	"steamcell/fn/process"
	"steamcell/fn/units"
	"steamcell/workbook"
)

func init() { verbs = append(verbs, (*App).fillCommand) }

func (a *App) fillCommand() *cobra.Command {
	var (
		output      string
		sheet       string
		colMap      string
		headerRow   int
		add         string
		unitSet     string
		patmText    string
		margin      float64
		force       bool
		unzipLimit  int64
		digits      string
		uList       string
		processKind string
		check       string
		checkTol    string
	)
	cmd := &cobra.Command{
		Use:   "fill IN.xlsx",
		Short: "Fill a workbook of test points with water and steam properties",
		Long: `fill reads a workbook (.xlsx, or .csv) of test points, one per row, finds the
two input columns of each sheet by their headers, e.g. "Drum pressure [barg]"
and "Steam temperature [°C]", and writes to the right of the data a status
column and the properties asked for, e.g. "h [kJ/kg]". A "steamcell summary"
sheet lists the columns used, the rows ok, flagged and failed, the units,
the formulation and the cautions. The input file is never changed.

Headers name a quantity by symbol or word (p, T, h, s, v, rho, u, x; pressure,
temperature, enthalpy, entropy, specific volume, density, internal energy,
quality, dryness) with the unit in brackets or parentheses. Title rows above
the header row are fine. Four input columns make two points per row, paired
left to right (steam p,T then feedwater p,T). When the columns are not clear,
give them with --map "C=p:barg,D=t:C" (pairs separated by ';').

Points within --margin of saturation are flagged: there a small error in p or
T changes the phase.

A "u(p) [bar]" column beside "p [bar]", or --u p=0.2bar,t=0.5K for whole
columns, gives inputs standard uncertainties, and the results their u(…).
--process expansion (compression, throttling, mixing, exchanger) adds a process
and its u from the numbered inputs of each row (p1, t1, p2, t2 …). --check h,s
compares the sheet's own h and s columns with steamcell and flags rows beyond
--check-tol (default 0.1 %).`,
		Example: `  steamcell fill tests.xlsx
  steamcell fill tests.xlsx -o tests_out.xlsx --add h,s,v,x,cp,phase,region --units bar
  steamcell fill log.csv --sheet log --map "B=p:psig,C=t:F" --units us
  steamcell fill tg1_section_test.csv --process expansion --u t=0.6K
  steamcell fill old_record.xlsx --check h,s --check-tol 0.05%`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) != 1 {
				return usageError{fmt.Errorf("fill needs one input workbook, got %d arguments", len(args))}
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			po, err := pointOptions(unitSet, patmText)
			if err != nil {
				return usageError{err}
			}
			if margin < 0 {
				return usageError{fmt.Errorf("--margin %g: give a distance in K, 0 to turn the flag off", margin)}
			}
			if unzipLimit <= 0 {
				return usageError{fmt.Errorf("--unzip-limit %d: give a size in MiB above 0", unzipLimit)}
			}
			opt := workbook.Options{
				Sheet:          sheet,
				Map:            colMap,
				HeaderRow:      headerRow,
				Point:          po,
				Margin:         margin,
				Version:        Version,
				Force:          force,
				UnzipSizeLimit: unzipLimit << 20,
			}
			if margin == 0 {
				opt.Margin = -1 // off
			}
			if add != "" {
				opt.Add = strings.Split(add, ",")
			}
			if opt.Digits, err = parseDigits(digits); err != nil {
				return usageError{err}
			}
			opt.U, opt.Process = uList, processKind
			if check != "" {
				opt.Check = strings.Split(check, ",")
			}
			if opt.CheckTol, err = workbook.ParseCheckTol(checkTol); err != nil {
				return usageError{err}
			}
			if output == "" {
				output = workbook.DefaultOutput(args[0])
			}
			// Either signal cancels the fill at its next check, in any phase;
			// FillFile then removes its temporary file.
			ctx, stop := signal.NotifyContext(cmd.Context(), os.Interrupt, syscall.SIGTERM)
			defer stop()
			bar := a.progressBar()
			progress := bar.update
			if fillProgressHook != nil {
				progress = func(stage string, done, total int) {
					bar.update(stage, done, total)
					fillProgressHook(ctx, stage)
				}
			}
			sum, err := workbook.FillFile(ctx, args[0], output, opt, progress)
			bar.finish()
			if err != nil {
				if errors.Is(err, workbook.ErrBadOption) || errors.Is(err, workbook.ErrSamePath) {
					return usageError{err}
				}
				if errors.Is(err, context.Canceled) {
					return fmt.Errorf("fill interrupted; %s was not written", output)
				}
				return err
			}
			return writeFillReport(cmd.OutOrStdout(), output, &sum)
		},
	}
	f := cmd.Flags()
	f.StringVarP(&output, "output", "o", "", "output workbook (default: IN_filled.xlsx beside the input)")
	f.StringVar(&sheet, "sheet", "", "fill only this sheet (default: every visible sheet)")
	f.StringVar(&colMap, "map", "", `input columns by hand, e.g. "C=p:barg,D=t:C"; pairs separated by ';'`)
	f.IntVar(&headerRow, "header-row", 0, "row of the headers (default: found in the top 100 rows)")
	f.StringVar(&add, "add", "", "properties to write, e.g. h,s,v,x,cp,rho,phase,region, or all (default h,s,v,x,phase)")
	f.StringVar(&unitSet, "units", "si", "unit set of the results and of numbers without a unit: "+strings.Join(units.SetNames(), ", "))
	f.StringVar(&patmText, "patm", "", "atmospheric pressure for gauge units, with unit (default 101.325 kPa)")
	f.Float64Var(&margin, "margin", workbook.DefaultMargin, "flag single-phase points this close to saturation, K; 0 turns the flag off")
	f.BoolVar(&force, "force", false, "replace the output file if it exists")
	f.Int64Var(&unzipLimit, "unzip-limit", workbook.DefaultUnzipSizeLimit>>20, "refuse an input that unpacks to more than this, MiB")
	f.StringVar(&uList, "u", "", `uncertainty of whole input columns, e.g. "p=0.2bar,t=0.5K" (k = 1); a "u(p) [bar]" column gives it per row`)
	f.StringVar(&processKind, "process", "", "add a process from the numbered inputs of each row (p1 t1 p2 t2 …): "+strings.Join(process.KindNames(), ", "))
	f.StringVar(&check, "check", "", `compare the sheet's own columns of these properties with steamcell, e.g. "h,s"`)
	f.StringVar(&checkTol, "check-tol", "", "relative tolerance of --check, e.g. 0.05% (default 0.1%)")
	f.StringVar(&digits, "digits", "", `decimals shown for results: "3" for all, or "h=1,s=5" by property (the full value is stored)`)
	return cmd
}

// fillProgressHook, when set (by the signal tests), is told every stage
// of a fill besides the progress bar, from the fill's goroutine, with the
// context a signal cancels.
var fillProgressHook func(ctx context.Context, stage string)

// parseDigits reads --digits: a number of decimals for every property,
// or symbol=decimals pairs separated by commas; "" means the defaults.
func parseDigits(text string) (map[string]int, error) {
	if strings.TrimSpace(text) == "" {
		return nil, nil
	}
	out := map[string]int{}
	for _, item := range strings.Split(text, ",") {
		sym, val, named := strings.Cut(strings.TrimSpace(item), "=")
		if !named {
			sym, val = "", sym
		}
		d, err := strconv.Atoi(strings.TrimSpace(val))
		if err != nil {
			return nil, fmt.Errorf("--digits %q: %q is not a number of decimals; write e.g. 3 or h=1,s=5", text, val)
		}
		sym = strings.TrimSpace(sym)
		if sym != "" {
			syms, err := point.Symbols([]string{sym})
			if err != nil {
				return nil, fmt.Errorf("--digits %q: %v", text, err)
			}
			sym = syms[0]
		}
		out[sym] = d
	}
	return out, nil
}

// fillBar is the progress bar of a fill: on the error stream when it is a
// terminal, nothing otherwise.
type fillBar struct{ bar *progressbar.ProgressBar }

func (a *App) progressBar() *fillBar {
	f, ok := a.err.(*os.File)
	if !ok || !term.IsTerminal(int(f.Fd())) {
		return &fillBar{}
	}
	return &fillBar{bar: progressbar.NewOptions(-1,
		progressbar.OptionSetWriter(f),
		progressbar.OptionSetDescription("reading"),
		progressbar.OptionShowCount(),
		progressbar.OptionThrottle(100*time.Millisecond),
		progressbar.OptionClearOnFinish(),
	)}
}

func (b *fillBar) update(stage string, done, total int) {
	if b.bar == nil {
		return
	}
	if int64(total) != b.bar.GetMax64() {
		b.bar.ChangeMax(total)
	}
	b.bar.Describe(stage)
	_ = b.bar.Set(done)
}

func (b *fillBar) finish() {
	if b.bar != nil {
		_ = b.bar.Finish()
	}
}

// writeFillReport prints what the fill did, a line per sheet.
func writeFillReport(w io.Writer, output string, sum *workbook.Summary) error {
	for _, s := range sum.Sheets {
		if !s.Filled {
			fmt.Fprintf(w, "sheet %q: %s\n", s.Name, s.Note)
			continue
		}
		var cols []string
		for _, p := range s.Pairs {
			c := p.Inputs[0].Letter + "," + p.Inputs[1].Letter
			if p.Label != "" {
				c = p.Label + " " + c
			}
			cols = append(cols, c)
		}
		agg := ""
		if s.Aggregate > 0 {
			agg = fmt.Sprintf(", %d aggregate (not test points)", s.Aggregate)
		}
		fmt.Fprintf(w, "sheet %q: inputs %s, header row %d: %d rows, %d ok, %d flagged, %d failed, %d blank skipped%s\n",
			s.Name, strings.Join(cols, "; "), s.HeaderRow, s.Rows, s.OK, s.Flagged, s.Failed, s.Blank, agg)
		if s.Note != "" {
			fmt.Fprintf(w, "  note: %s\n", s.Note)
		}
		if p := s.Process; p != nil {
			fmt.Fprintf(w, "  %s: %d ok, %d flagged, %d failed\n", p.Kind, p.OK, p.Flagged, p.Failed)
		}
		if c := s.Check; c != nil {
			fmt.Fprintf(w, "  check: %d rows compared, %d beyond %.3g %%\n", c.Rows, c.Flagged, 100*c.Tol)
			for _, col := range c.Columns {
				fmt.Fprintf(w, "    %s %q: largest deviation %+.6g %s (%+.3g %%) in row %d\n", col.Letter, col.Header, col.Largest, col.Unit, 100*col.LargestRel, col.LargestRow)
			}
		}
	}
	for _, n := range sum.Notes {
		fmt.Fprintf(w, "note: %s\n", n)
	}
	_, err := fmt.Fprintf(w, "wrote %s (summary on sheet %q)\n%s\n", output, sum.SummarySheet, caution)
	return err
}
