package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"steamcell/fn/point"
	"steamcell/fn/table"
	"steamcell/fn/units"
)

func init() { verbs = append(verbs, (*App).tableCommand) }

func (a *App) tableCommand() *cobra.Command {
	var (
		from, to, step, p string
		unitSet, patmText string
		get, format, out  string
	)
	cmd := &cobra.Command{
		Use:   "table --from VALUE --to VALUE --step VALUE [--p PRESSURES]",
		Short: "Print a steam table: saturation by pressure or temperature, or superheated vapour",
		Long: `table computes a steam table over a range with a step. The unit of --from
chooses the table: a pressure (1bar) gives a saturation table by pressure, a
temperature (100C) one by temperature. With --p (one or more pressures,
comma-separated) it is a superheat table over the temperatures of the range.

The table is CSV on standard output unless --format or the extension of -o
says json or xlsx.`,
		Example: `  steamcell table --from 1bar --to 20bar --step 1bar
  steamcell table --from 100C --to 200C --step 5C --get hf,hg,sf,sg --units us
  steamcell table --p 10bar,40bar --from 200C --to 500C --step 50C -o superheat.xlsx`,
		RunE: func(cmd *cobra.Command, _ []string) error {
			opt, err := pointOptions(unitSet, patmText)
			if err != nil {
				return usageError{err}
			}
			if format == "" {
				format = strings.TrimPrefix(strings.ToLower(filepath.Ext(out)), ".")
				if format == "" {
					format = table.CSV
				}
			}
			if format != table.CSV && format != table.JSON && format != table.XLSX {
				return usageError{fmt.Errorf("--format %s: use %s", format, strings.Join(table.Formats, ", "))}
			}
			spec := table.Spec{From: from, To: to, Step: step, P: p}
			if get != "" {
				spec.Get = strings.Split(get, ",")
			}
			t, err := table.Build(spec, opt)
			if err != nil {
				var te *table.Error
				var pe *point.Error
				var ue *units.InputError
				if errors.As(err, &te) || errors.As(err, &pe) || errors.As(err, &ue) {
					return usageError{err}
				}
				return err
			}
			var w io.Writer = cmd.OutOrStdout()
			if out != "" && out != "-" {
				f, err := os.Create(out)
				if err != nil {
					return err
				}
				defer f.Close()
				w = f
			}
			switch format {
			case table.JSON:
				err = t.WriteJSON(w, caution)
			case table.XLSX:
				err = t.WriteXLSX(w, caution)
			default:
				err = t.WriteCSV(w)
			}
			if err != nil {
				return err
			}
			if f, ok := w.(*os.File); ok {
				return f.Close()
			}
			return nil
		},
	}
	f := cmd.Flags()
	f.StringVar(&from, "from", "", "first value of the range, with its unit (1bar, 100C)")
	f.StringVar(&to, "to", "", "last value of the range")
	f.StringVar(&step, "step", "", "step of the range (a difference: 5C is 5 K)")
	f.StringVar(&p, "p", "", "pressures of a superheat table, comma-separated (10bar,40bar)")
	f.StringVar(&get, "get", "", "comma-separated properties (default: those of the kind of table)")
	f.StringVar(&unitSet, "units", "si", "unit set for bare numbers and output: "+strings.Join(units.SetNames(), ", "))
	f.StringVar(&patmText, "patm", "", "atmospheric pressure for gauge units, with unit (default 101.325 kPa)")
	f.StringVar(&format, "format", "", "csv, json or xlsx (default: from the extension of -o, else csv)")
	f.StringVarP(&out, "output", "o", "", "file to write (default: standard output)")
	return cmd
}
