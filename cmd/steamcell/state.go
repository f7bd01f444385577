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
	"steamcell/fn/units"
)

func init() { verbs = append(verbs, (*App).stateCommand) }

// caution is printed under every state.
const caution = "Engineering values from IAPWS-IF97. Not a substitute for pressure-equipment codes, inspection rules or a licensed engineer's review."

func (a *App) stateCommand() *cobra.Command {
	var (
		asJSON   bool
		unitSet  string
		patmText string
		get      string
		uflags   uncertaintyFlags
	)
	cmd := &cobra.Command{
		Use:   "state NAME=VALUE NAME=VALUE",
		Short: "Print every property of one state of water or steam",
		Long: `state prints the properties of the state fixed by two inputs, each given as
name=value with an optional unit. Inputs: p, t, h, s, v, rho, u, x.
Pairs: p,t  p,h  p,s  h,s  p,x  t,x  p,v  t,v  t,h  t,s  u,v (rho for v).

Bare numbers are read in the unit set of --units (default si: kPa, °C,
kJ/kg, kJ/(kg·K), m³/kg); gauge pressures ("6barg", "87 psig") use --patm.
An input may carry its uncertainty after ± (or +-): p=100bar±0.2bar
t=500C±0.5K; every property then gets its standard uncertainty u.`,
		Example: `  steamcell state p=6barg t=330C
  steamcell state p=1MPa x=0.9 --units us
  steamcell state h=2800kJ/kg s=6.5 --json
  steamcell state p=3MPa t=300K --get h,s,cp,mu
  steamcell state p=100bar±0.2bar t=500C±0.5K --k 2`,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) != 2 {
				return usageError{fmt.Errorf("state needs two inputs as name=value (e.g. p=6barg t=330C), got %d", len(args))}
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			opt, err := pointOptions(unitSet, patmText)
			if err != nil {
				return usageError{err}
			}
			var given []point.Given
			for _, arg := range args {
				name, text, ok := strings.Cut(arg, "=")
				if !ok {
					return usageError{fmt.Errorf("%q is not name=value (e.g. p=6barg)", arg)}
				}
				given = append(given, point.Given{Name: name, Text: text})
			}
			var want []string
			if get != "" {
				want = strings.Split(get, ",")
			}
			syms, err := point.Symbols(want)
			if err != nil {
				return usageError{err}
			}
			uo, err := uflags.options()
			if err != nil {
				return usageError{err}
			}
			opt = opt.Typed(given) // figures of warnings in the units typed
			m, err := point.SolveMeasured(given, opt, uo)
			st, in := m.State.State, m.Inputs
			if err != nil {
				var pe *point.Error
				var ue *units.InputError
				if errors.As(err, &pe) || errors.As(err, &ue) {
					return usageError{err}
				}
				return err
			}
			ans := point.Render(&st, syms, opt)
			out := cmd.OutOrStdout()
			if m.Given {
				unc := point.RenderUncertainty(&m, &ans, opt, uo)
				if asJSON {
					_, err = out.Write(append(ans.AppendMeasuredJSON(nil, point.Inputs(in, opt), caution, &unc), '\n'))
					return err
				}
				return writeMeasuredTable(out, &st, &ans, &unc)
			}
			if asJSON {
				b := ans.AppendJSON(nil, point.Inputs(in, opt), caution)
				_, err = out.Write(append(b, '\n'))
				return err
			}
			return writeStateTable(out, &st, &ans)
		},
	}
	f := cmd.Flags()
	f.BoolVar(&asJSON, "json", false, "print one flat JSON object")
	f.StringVar(&unitSet, "units", "si", "unit set for bare numbers and output: "+strings.Join(units.SetNames(), ", "))
	f.StringVar(&patmText, "patm", "", "atmospheric pressure for gauge units, with unit (default 101.325 kPa)")
	f.StringVar(&get, "get", "", "comma-separated properties to print (default: thermodynamic ones; 'all' adds transport)")
	uflags.add(cmd)
	return cmd
}

// pointOptions reads the unit set and atmospheric pressure flags.
func pointOptions(unitSet, patmText string) (point.Options, error) {
	set, err := units.SetByName(unitSet)
	if err != nil {
		return point.Options{}, err
	}
	opt := point.Options{Set: set}
	if patmText != "" {
		patm, err := units.Parse(patmText, units.Pressure, units.Options{Name: "patm", Set: set})
		if err != nil {
			return point.Options{}, err
		}
		if patm < units.MinPatm || patm > units.MaxPatm {
			return point.Options{}, fmt.Errorf("--patm %s is outside %g…%g MPa, the range of sites on Earth", patmText, units.MinPatm, units.MaxPatm)
		}
		opt.Patm = patm
	}
	return opt, nil
}

// writeStateTable prints the answer as an aligned table.
func writeStateTable(out io.Writer, st *fn.State, ans *point.Answer) error {
	tw := tabwriter.NewWriter(out, 2, 4, 2, ' ', 0)
	fmt.Fprintf(tw, "phase\t%s\t\t(IF97 region %d)\n", ans.Phase, ans.Region)
	for _, f := range ans.Fields {
		if !f.Defined {
			continue
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\n", f.Symbol, strconv.FormatFloat(f.Value, 'g', 7, 64), f.Unit, f.Name)
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	for _, w := range ans.Warnings {
		fmt.Fprintf(out, "warning: %s\n", w)
	}
	_, err := fmt.Fprintf(out, "formulation: IAPWS-IF97, unit set %s\n%s\n", ans.Set, caution)
	return err
}
