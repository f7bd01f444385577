package main

import (
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"steamcell/fn"
	"steamcell/fn/point"
	"steamcell/fn/process"
	"steamcell/fn/units"
)

func init() { verbs = append(verbs, (*App).processCommand) }

func (a *App) processCommand() *cobra.Command {
	var (
		asJSON   bool
		unitSet  string
		patmText string
		uflags   uncertaintyFlags
	)
	var kindHelp strings.Builder
	for _, kd := range process.Kinds() {
		fmt.Fprintf(&kindHelp, "  %-12s %s\n  %-12s inputs: %s\n", kd.Name, kd.Summary, "", kd.Inputs)
	}
	cmd := &cobra.Command{
		Use:   "process KIND NAME=VALUE…",
		Short: "Results of a process between measured states, each with its uncertainty",
		Long: `process computes the results of a test between numbered states: p1 t1 for
state 1, p2 t2 (or p2 x2, p2 h2) for state 2, and so on. Any input may carry
its uncertainty after ± (or +-): p1=60bar±0.3bar t1=480C±1K, or relative,
p1=60bar±0.5%. The number after ± is a standard uncertainty unless
--convention says otherwise. Every result carries its standard uncertainty,
propagated through the whole calculation (JCGM 100:2008).

Kinds:
` + kindHelp.String(),
		Example: `  steamcell process expansion p1=60bar±0.3bar t1=480C±1K p2=12bar±0.1bar t2=280C±1K
  steamcell process throttling p1=10bar p2=1bar t2=120C --json
  steamcell process exchanger p1=12bar t1=300C t2=165C p3=80bar t3=157C t4=184C --k 2`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) < 1 {
				return usageError{fmt.Errorf("process needs a kind (%s) and its inputs as name=value", strings.Join(process.KindNames(), ", "))}
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			opt, err := pointOptions(unitSet, patmText)
			if err != nil {
				return usageError{err}
			}
			uo, err := uflags.options()
			if err != nil {
				return usageError{err}
			}
			if _, err := process.LookupKind(args[0]); err != nil {
				return usageError{err}
			}
			var given []point.Given
			for _, arg := range args[1:] {
				name, text, ok := strings.Cut(arg, "=")
				if !ok {
					return usageError{fmt.Errorf("%q is not name=value (e.g. p1=60bar)", arg)}
				}
				given = append(given, point.Given{Name: name, Text: text})
			}
			ans, err := point.RunProcess(args[0], given, opt, uo)
			if err != nil {
				var pe *point.Error
				var ue *units.InputError
				// A refusal is the command's answer (exit 1); a point or a
				// process input that cannot be read is a usage error.
				if !errors.Is(err, process.ErrRefused) && (errors.As(err, &pe) || errors.As(err, &ue) || errors.Is(err, process.ErrInput)) {
					return usageError{err}
				}
				return err
			}
			out := cmd.OutOrStdout()
			if asJSON {
				_, err := out.Write(append(ans.AppendJSON(nil, caution), '\n'))
				return err
			}
			return writeProcessTable(out, &ans)
		},
	}
	f := cmd.Flags()
	f.BoolVar(&asJSON, "json", false, "print one JSON object")
	f.StringVar(&unitSet, "units", "si", "unit set for bare numbers and output: "+strings.Join(units.SetNames(), ", "))
	f.StringVar(&patmText, "patm", "", "atmospheric pressure for gauge units, with unit (default 101.325 kPa)")
	uflags.add(cmd)
	return cmd
}

// writeProcessTable prints the results, the states and the warnings as
// aligned tables.
func writeProcessTable(out io.Writer, ans *point.ProcessAnswer) error {
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
	tw := tabwriter.NewWriter(out, 2, 4, 2, ' ', 0)
	head := "result\tvalue\tu"
	if ans.UOpt.K > 0 {
		head += "\tU (k = " + g(ans.UOpt.K) + ")"
	}
	fmt.Fprintln(tw, head+"\tunit\tdefinition")
	for _, r := range ans.Results {
		line := r.Name + "\t" + g(r.Value) + "\t" + g(r.U)
		if ans.UOpt.K > 0 {
			line += "\t" + g(ans.UOpt.K*r.U)
		}
		fmt.Fprintln(tw, line+"\t"+r.Unit+"\t"+r.Desc)
	}
	fmt.Fprintln(tw)
	fmt.Fprintln(tw, "state\tphase\tp\tt\th\ts\tx")
	for _, s := range ans.States {
		cells := []string{s.Label, s.Phase, "", "", "", "", ""}
		for _, f := range s.Fields {
			i := map[string]int{"p": 2, "t": 3, "h": 4, "s": 5, "x": 6}[f.Name]
			if i > 0 {
				cells[i] = g(f.Value) + " ± " + g(f.U) + " " + f.Unit
			}
		}
		fmt.Fprintln(tw, strings.Join(cells, "\t"))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	for _, w := range ans.Warnings {
		fmt.Fprintf(out, "warning: %s\n", w)
	}
	_, err := fmt.Fprintf(out, "uncertainty: %s\nformulation: IAPWS-IF97, unit set %s\n%s\n", ans.UOpt.Convention, ans.Set, caution)
	return err
}

// uncertaintyFlags are the --convention and --k flags of state and
// process.
type uncertaintyFlags struct {
	convention string
	k          float64
}

func (u *uncertaintyFlags) add(cmd *cobra.Command) {
	f := cmd.Flags()
	f.StringVar(&u.convention, "convention", "k1", "what each number after ± is: k1 (standard uncertainty), k2 (expanded, k = 2), rect (half-width of a rectangular distribution)")
	f.Float64Var(&u.k, "k", 0, "also print the expanded uncertainty U = k·u (usually 2)")
}

func (u *uncertaintyFlags) options() (point.UOptions, error) {
	uo := point.UOptions{K: u.k}
	var err error
	if uo.Convention, err = point.ParseConvention(u.convention); err != nil {
		return uo, err
	}
	if u.k < 0 || u.k > 10 {
		return uo, fmt.Errorf("--k %g is not a coverage factor; give a number above 0 up to 10, usually 2", u.k)
	}
	return uo, nil
}

// writeMeasuredTable prints a state whose inputs carried uncertainties,
// each property with its u (and U).
func writeMeasuredTable(out io.Writer, st *fn.State, ans *point.Answer, unc *point.Uncertainty) error {
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', 7, 64) }
	tw := tabwriter.NewWriter(out, 2, 4, 2, ' ', 0)
	fmt.Fprintf(tw, "phase\t%s\t\t\t(IF97 region %d)\n", ans.Phase, ans.Region)
	for _, f := range ans.Fields {
		if !f.Defined {
			continue
		}
		u := ""
		if v, ok := unc.U[f.Symbol]; ok {
			u = "± " + strconv.FormatFloat(v, 'g', 3, 64)
			if unc.K > 0 {
				u += " (U = " + strconv.FormatFloat(unc.K*v, 'g', 3, 64) + ")"
			}
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", f.Symbol, g(f.Value), u, f.Unit, f.Name)
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	for _, w := range unc.Merge(ans.Warnings) {
		fmt.Fprintf(out, "warning: %s\n", w)
	}
	_, err := fmt.Fprintf(out, "uncertainty: %s\nformulation: IAPWS-IF97, unit set %s\n%s\n", unc.Convention, ans.Set, caution)
	return err
}
