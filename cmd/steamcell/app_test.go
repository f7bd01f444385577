package main

import (
	"bytes"
	"strings"
	"testing"
)

func runApp(t *testing.T, args ...string) (code int, stdout, stderr string) {
	t.Helper()
	var out, errb bytes.Buffer
	app := NewApp(strings.NewReader(""), &out, &errb)
	defer app.Close()
	code = app.Run(args)
	return code, out.String(), errb.String()
}

func TestVersion(t *testing.T) {
	code, out, _ := runApp(t, "version")
	if code != ExitOK {
		t.Fatalf("version exit code = %d, want %d", code, ExitOK)
	}
	if !strings.Contains(out, Version) || !strings.Contains(out, "IAPWS-IF97") {
		t.Errorf("version output %q lacks the version or the formulation", out)
	}
	// The stamp of a release build (-X main.Version=… -X main.Commit=…).
	defer func(v, c string) { Version, Commit = v, c }(Version, Commit)
	Version, Commit = "1.4.0", "0123abc"
	if _, out, _ := runApp(t, "version"); !strings.HasPrefix(out, "steamcell 1.4.0\ncommit: 0123abc\n") {
		t.Errorf("stamped version output %q", out)
	}
}

func TestExitCodes(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want int
	}{
		{[]string{"--help"}, ExitOK},
		{[]string{"version", "--help"}, ExitOK},
		{[]string{}, ExitOK}, // bare command prints help
		{[]string{"--no-such-flag"}, ExitUsage},
		{[]string{"version", "--no-such-flag"}, ExitUsage},
		{[]string{"no-such-command"}, ExitUsage},
		{[]string{"version", "extra"}, ExitUsage},
	} {
		code, _, stderr := runApp(t, tc.args...)
		if code != tc.want {
			t.Errorf("steamcell %q: exit code %d, want %d (stderr %q)", tc.args, code, tc.want, stderr)
		}
	}
}
