package main

import (
	"errors"
	"fmt"
	"io"
	"runtime"

	"github.com/spf13/cobra"
)

// Exit codes of the steamcell command.
const (
	ExitOK      = 0 // the command did what was asked
	ExitFailure = 1 // the command ran but failed (bad data, I/O, server error)
	ExitUsage   = 2 // the command line itself is wrong
)

// Version and Commit stamp the program; release builds
// (server/deploy/release.sh) set them with
// -ldflags "-X main.Version=… -X main.Commit=…".
var (
	Version = "0.1.0-dev"
	Commit  = "unknown"
)

// verbs are the commands besides version; each verb's file adds itself in
// an init function, so that a verb is registered exactly when it exists.
var verbs []func(*App) *cobra.Command

// usageError marks an error in the command line (unknown flag, missing
// argument) so that Run can exit with ExitUsage.
type usageError struct{ err error }

func (e usageError) Error() string { return e.err.Error() }
func (e usageError) Unwrap() error { return e.err }

// App holds the wiring of the steamcell command: its streams and its command
// tree. Tests build one with buffers in place of the terminal.
type App struct {
	in       io.Reader
	out, err io.Writer
	closers  []io.Closer
}

// NewApp returns an App that reads from in and writes to out and errw.
func NewApp(in io.Reader, out, errw io.Writer) *App {
	return &App{in: in, out: out, err: errw}
}

// Run executes the command line args (without the program name) and returns
// the process exit code.
func (a *App) Run(args []string) int {
	root := a.rootCommand()
	root.SetArgs(args)
	err := root.Execute()
	if err == nil {
		return ExitOK
	}
	fmt.Fprintln(a.err, "steamcell:", err)
	var ue usageError
	if errors.As(err, &ue) {
		fmt.Fprintln(a.err, "Run 'steamcell --help' for usage.")
		return ExitUsage
	}
	return ExitFailure
}

// Close releases what the commands opened (servers, files).
func (a *App) Close() error {
	var errs []error
	for i := len(a.closers) - 1; i >= 0; i-- {
		errs = append(errs, a.closers[i].Close())
	}
	a.closers = nil
	return errors.Join(errs...)
}

func (a *App) rootCommand() *cobra.Command {
	root := &cobra.Command{
		Use:   "steamcell",
		Short: "Water and steam properties from IAPWS-IF97 for spreadsheets and test records",
		Long: `steamcell computes properties of water and steam from the IAPWS Industrial
Formulation 1997 (IAPWS-IF97) and serves them to spreadsheets, scripts and
plant tools, one state at a time or a whole workbook of test points.

Values are for engineering calculation. They do not replace pressure-equipment
and boiler design codes, inspection rules or a licensed engineer's review.`,
		SilenceUsage:  true,
		SilenceErrors: true,
		Args:          noArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			return cmd.Help()
		},
	}
	root.CompletionOptions.DisableDefaultCmd = true
	root.SetIn(a.in)
	root.SetOut(a.out)
	root.SetErr(a.err)
	root.SetFlagErrorFunc(func(_ *cobra.Command, err error) error { return usageError{err} })
	root.AddCommand(a.versionCommand())
	for _, verb := range verbs {
		root.AddCommand(verb(a))
	}
	for _, c := range root.Commands() {
		if c.Args == nil {
			c.Args = noArgs
		}
	}
	return root
}

// noArgs rejects positional arguments as a usage error; it also catches
// unknown subcommands, which cobra reports through Args on the root.
func noArgs(cmd *cobra.Command, args []string) error {
	if len(args) > 0 {
		if cmd.HasSubCommands() {
			return usageError{fmt.Errorf("unknown command %q for %q", args[0], cmd.CommandPath())}
		}
		return usageError{fmt.Errorf("%s takes no arguments, got %q", cmd.CommandPath(), args)}
	}
	return nil
}

func (a *App) versionCommand() *cobra.Command {
	return &cobra.Command{
		Use:   "version",
		Short: "Print the program version and the formulations it implements",
		RunE: func(cmd *cobra.Command, _ []string) error {
			_, err := fmt.Fprintf(cmd.OutOrStdout(), "steamcell %s\ncommit: %s\nbuilt with: %s %s/%s\nformulation: IAPWS-IF97 (R7-97(2012))\n",
				Version, Commit, runtime.Version(), runtime.GOOS, runtime.GOARCH)
			return err
		},
	}
}
