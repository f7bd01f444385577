package main

import (
	"encoding/json"
	"strings"
	"testing"
)

// TestProcessTable: the table names each result with its u, the states
// and the caution.
func TestProcessTable(t *testing.T) {
	code, out, errs := runApp(t, "process", "expansion", "p1=60bar±0.3bar", "t1=480C±1K", "p2=12bar±0.1bar", "t2=280C±1K", "--k", "2")
	if code != ExitOK {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	for _, want := range []string{"efficiency", "h2s", "work_s", "U (k = 2)", "2s", "standard uncertainty", "licensed engineer"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

// TestProcessJSONAndErrors: --json is one object; a bad kind or a missing
// input is a usage error (exit 2); a refused process is a failure (exit 1).
func TestProcessJSONAndErrors(t *testing.T) {
	code, out, errs := runApp(t, "process", "throttling", "p1=10bar±0.05bar", "p2=1bar", "t2=120C±0.5K", "--json")
	if code != ExitOK {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	if _, ok := m["u"].(map[string]any)["x1"]; !ok {
		t.Errorf("no u(x1): %s", out)
	}
	for _, tc := range []struct {
		args []string
		code int
	}{
		{[]string{"process", "turbine", "p1=1MPa"}, ExitUsage},
		{[]string{"process", "expansion", "p1=60bar", "t1=480C", "p2=12bar"}, ExitUsage},
		{[]string{"process", "expansion", "p1=60bar±", "t1=480C", "p2=12bar", "t2=280C"}, ExitUsage},
		{[]string{"process", "throttling", "p1=10bar", "p2=1bar", "t2=200C"}, ExitFailure},
		{[]string{"process", "expansion", "p1=60bar", "t1=480C", "p2=12bar", "t2=280C", "--convention", "gauss"}, ExitUsage},
	} {
		if code, _, _ := runApp(t, tc.args...); code != tc.code {
			t.Errorf("%q: exit %d, want %d", tc.args, code, tc.code)
		}
	}
}

// TestStateUncertaintyTable: ± on state inputs prints u beside each
// property.
func TestStateUncertaintyTable(t *testing.T) {
	code, out, errs := runApp(t, "state", "p=100bar±0.2bar", "t=500C±0.5K")
	if code != ExitOK {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	if !strings.Contains(out, "± 20") || !strings.Contains(out, "standard uncertainty") {
		t.Errorf("output:\n%s", out)
	}
}
