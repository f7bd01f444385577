package main

import (
	"bufio"
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// signalRows is the size of the workbook the signal tests fill: several
// chunks of rows, so that each pass checks for cancellation after the
// point where the child pauses.
const signalRows = 9000

// TestFillSignals interrupts steamcell fill, run in a child process, in
// each phase (reading the sheet, writing the filled package, moving it
// into place) with SIGINT and SIGTERM. The child announces the phase and
// waits there until the signal has cancelled its fill, so the signal
// lands in that phase, with no sleeps. Every interrupted fill must
// exit non-zero and leave no output and no temporary file, neither beside
// the output nor in TMPDIR (issue 12: SIGTERM during the save left a
// hidden temporary file, SIGINT was ignored while saving).
func TestFillSignals(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "big.xlsx")
	writeBigBook(t, in, signalRows)
	for _, phase := range []string{"reading", "filling", "saving"} {
		for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
			t.Run(phase+"/"+sig.String(), func(t *testing.T) {
				outDir := t.TempDir()
				tmpDir := t.TempDir()
				out := filepath.Join(outDir, "out.xlsx")
				cmd := exec.Command(os.Args[0], "-test.run=^TestFillChildProcess$")
				cmd.Env = append(os.Environ(), "STEAMCELL_FILL_CHILD=1", "STEAMCELL_FILL_PAUSE="+phase,
					"STEAMCELL_FILL_IN="+in, "STEAMCELL_FILL_OUT="+out, "TMPDIR="+tmpDir)
				stdout, err := cmd.StdoutPipe()
				if err != nil {
					t.Fatal(err)
				}
				var stderr lockedBuffer
				cmd.Stderr = &stderr
				if err := cmd.Start(); err != nil {
					t.Fatal(err)
				}
				defer cmd.Process.Kill()
				paused := make(chan string, 1)
				go func() {
					sc := bufio.NewScanner(stdout)
					for sc.Scan() {
						if stage, ok := strings.CutPrefix(sc.Text(), "paused "); ok {
							paused <- stage
						}
					}
					close(paused)
				}()
				select {
				case stage, ok := <-paused:
					if !ok {
						t.Fatalf("child ended before %s; stderr:\n%s", phase, stderr.String())
					}
					if !strings.HasPrefix(stage, phase) {
						t.Fatalf("child paused in %q, want %s", stage, phase)
					}
				case <-time.After(60 * time.Second):
					t.Fatalf("child did not reach %s; stderr:\n%s", phase, stderr.String())
				}
				if err := cmd.Process.Signal(sig); err != nil {
					t.Fatal(err)
				}
				err = cmd.Wait()
				var ee *exec.ExitError
				if err == nil || !asExit(err, &ee) || ee.ExitCode() == 0 {
					t.Errorf("child after %v in %s: %v, want a non-zero exit; stderr:\n%s", sig, phase, err, stderr.String())
				}
				if !strings.Contains(stderr.String(), "interrupted") {
					t.Errorf("stderr %q does not say the fill was interrupted", stderr.String())
				}
				for _, d := range []string{outDir, tmpDir} {
					entries, _ := os.ReadDir(d)
					for _, e := range entries {
						t.Errorf("left behind after %v in %s: %s", sig, phase, filepath.Join(d, e.Name()))
					}
				}
			})
		}
	}
}

func asExit(err error, ee **exec.ExitError) bool {
	e, ok := err.(*exec.ExitError)
	*ee = e
	return ok
}

// TestFillChildProcess is the child of TestFillSignals: it runs the fill
// command, pausing at the first progress report of the phase named in
// STEAMCELL_FILL_PAUSE until the signal has cancelled the fill. Run on
// its own it does nothing.
func TestFillChildProcess(t *testing.T) {
	if os.Getenv("STEAMCELL_FILL_CHILD") != "1" {
		t.Skip("the child process of TestFillSignals")
	}
	pause := os.Getenv("STEAMCELL_FILL_PAUSE")
	done := false
	fillProgressHook = func(ctx context.Context, stage string) {
		if done || !strings.HasPrefix(stage, pause) {
			return
		}
		done = true
		fmt.Println("paused " + stage)
		<-ctx.Done()
	}
	app := NewApp(strings.NewReader(""), os.Stdout, os.Stderr)
	code := app.Run([]string{"fill", os.Getenv("STEAMCELL_FILL_IN"), "-o", os.Getenv("STEAMCELL_FILL_OUT")})
	app.Close()
	os.Exit(code)
}

// writeBigBook writes a workbook of n p,T readings.
func writeBigBook(t *testing.T, path string, n int) {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	sw, err := f.NewStreamWriter("Sheet1")
	if err != nil {
		t.Fatal(err)
	}
	if err := sw.SetRow("A1", []any{"Point", "Drum pressure [barg]", "Steam temperature [°C]"}); err != nil {
		t.Fatal(err)
	}
	for i := range n {
		cell, _ := excelize.CoordinatesToCellName(1, i+2)
		if err := sw.SetRow(cell, []any{i + 1, 10 + float64(i%40), 250 + float64(i%200)}); err != nil {
			t.Fatal(err)
		}
	}
	if err := sw.Flush(); err != nil {
		t.Fatal(err)
	}
	if err := f.SaveAs(path); err != nil {
		t.Fatal(err)
	}
}
