package server_test

import (
	"encoding/json"
	"net/url"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/server"
)

// TestStateUncertainty: /state with ± inputs answers "u" for the numeric
// properties in the value's units, "U" with k=2, the convention applied;
// "+-" in a raw query is ±; a bad uncertainty is a 400.
func TestStateUncertainty(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	w := get(srv, "/state?p="+url.QueryEscape("100bar±0.2bar")+"&t=500C+-0.5K&k=2")
	if w.Code != 200 {
		t.Fatalf("status %d: %s", w.Code, w.Body)
	}
	var a map[string]any
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil {
		t.Fatal(err)
	}
	u := a["u"].(map[string]any)
	// si: kPa and °C; u(p) = 0.2 bar = 20 kPa.
	if got := u["p"].(float64); !scalar.EqualWithinRel(got, 20, 1e-12) {
		t.Errorf("u(p) = %g kPa, want 20", got)
	}
	if got := a["U"].(map[string]any)["t"].(float64); !scalar.EqualWithinRel(got, 1, 1e-12) {
		t.Errorf("U(t) = %g, want 1", got)
	}
	if _, ok := a["e"].(float64); !ok {
		t.Errorf("no internal energy under e: %s", w.Body)
	}
	w = get(srv, "/state?p=100bar%C2%B10.4bar&t=500C%C2%B11K&convention=k2&format=csv")
	if w.Code != 200 || !strings.Contains(w.Body.String(), "u(h) [kJ/kg]") {
		t.Errorf("csv: %d %s", w.Code, w.Body)
	}
	for _, q := range []string{"p=100bar%C2%B1&t=500C", "p=100bar%C2%B1-1bar&t=500C", "p=1MPa&t=500C&convention=gauss", "p=1MPa&t=500C&k=0"} {
		if w := get(srv, "/state?"+q); w.Code != 400 || !strings.Contains(w.Body.String(), "bad_uncertainty") {
			t.Errorf("%s: %d %s", q, w.Code, w.Body)
		}
	}
}

// TestProcessRoutes: the JSON, CSV and plain-text forms of a process,
// and its errors.
func TestProcessRoutes(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	q := "p1=" + url.QueryEscape("60bar±0.3bar") + "&t1=480C%C2%B11K&p2=12bar%C2%B10.1bar&t2=280C%C2%B11K"
	w := get(srv, "/process/expansion?"+q+"&k=2")
	if w.Code != 200 {
		t.Fatalf("status %d: %s", w.Code, w.Body)
	}
	var a map[string]any
	if err := json.Unmarshal(w.Body.Bytes(), &a); err != nil {
		t.Fatal(err)
	}
	eff := a["results"].(map[string]any)["efficiency"].(float64)
	ueff := a["u"].(map[string]any)["efficiency"].(float64)
	w = get(srv, "/process/expansion/efficiency?"+q)
	if got, _ := strconv.ParseFloat(w.Body.String(), 64); w.Code != 200 || got != eff {
		t.Errorf("/efficiency: %d %s, want %g", w.Code, w.Body, eff)
	}
	w = get(srv, "/process/expansion/u(efficiency)?"+q)
	if got, _ := strconv.ParseFloat(w.Body.String(), 64); w.Code != 200 || got != ueff {
		t.Errorf("/u(efficiency): %d %s, want %g", w.Code, w.Body, ueff)
	}
	w = get(srv, "/process/expansion?"+q+"&format=csv&units=us")
	if w.Code != 200 || !strings.HasPrefix(w.Body.String(), "efficiency,u(efficiency),h2s [Btu/lb]") {
		t.Errorf("csv: %d %s", w.Code, w.Body)
	}
	for _, tc := range []struct {
		target, code string
		status       int
	}{
		{"/process/turbine?p1=1MPa", "unknown_process", 404},
		{"/process/expansion?p1=6MPa&t1=480C&p2=1.2MPa", "process_input", 400},
		{"/process/throttling?p1=1MPa&p2=0.1MPa&t2=200C", "process_refused", 422},
		{"/process/expansion?p1=6MPa&t1=480C&p2=1.2MPa&t2=280C&get=h", "unknown_parameter", 400},
		{"/process/expansion/speed?p1=6MPa&t1=480C&p2=1.2MPa&t2=280C", "unknown_property", 400},
		{"/process/expansion/U(efficiency)?p1=6MPa&t1=480C&p2=1.2MPa&t2=280C", "malformed_query", 400},
	} {
		w := get(srv, tc.target)
		if w.Code != tc.status || !strings.Contains(w.Body.String(), tc.code) {
			t.Errorf("%s: %d %s, want %d %s", tc.target, w.Code, w.Body, tc.status, tc.code)
		}
	}
}

// TestReadmeProcessRequests sends every request the README's section on
// results shows (the http block and the inline GET /state with +-) and
// checks the answers: 200, and the cell answers equal the efficiency and
// its u the section's table shows (0.774418 ± 0.00424268, to its six
// figures).
func TestReadmeProcessRequests(t *testing.T) {
	b, err := os.ReadFile("../README.md")
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	sec := text[strings.Index(text, "<!-- results:begin"):strings.Index(text, "<!-- results:end -->")]
	srv, _ := newServer(t, server.Config{})
	var targets []string
	for _, line := range strings.Split(sec, "\n") {
		line = strings.Trim(strings.TrimSpace(line), "`:")
		if i := strings.Index(line, "GET /"); i >= 0 {
			target := strings.TrimRight(strings.Fields(line[i+4:])[0], "`.")
			if strings.Contains(target, "…") {
				continue // a pattern (GET /process/KIND?…), not an example
			}
			targets = append(targets, target)
		}
	}
	if len(targets) != 4 {
		t.Fatalf("found %d requests in the README section, want 4: %q", len(targets), targets)
	}
	want := map[string]float64{"efficiency": 0.774418, "u(efficiency)": 0.00424268}
	for _, target := range targets {
		w := get(srv, target)
		if w.Code != 200 {
			t.Errorf("%s: %d %s", target, w.Code, w.Body)
			continue
		}
		for name, v := range want {
			if strings.HasPrefix(target, "/process/expansion/"+name+"?") {
				got, _ := strconv.ParseFloat(w.Body.String(), 64)
				if !scalar.EqualWithinRel(got, v, 1e-5) {
					t.Errorf("%s = %g, README shows %g", target, got, v)
				}
			}
		}
	}
}

// TestStatePropertyUncertainty: /state/u(h) and /state/U(h) answer the
// uncertainty of one property as a bare number; /state/h with ± inputs
// answers the value.
func TestStatePropertyUncertainty(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	q := "?p=100bar%C2%B10.2bar&t=500C%C2%B10.5K&k=2"
	var full map[string]any
	if err := json.Unmarshal(get(srv, "/state"+q).Body.Bytes(), &full); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		prop string
		want float64
	}{
		{"h", full["h"].(float64)},
		{"u(h)", full["u"].(map[string]any)["h"].(float64)},
		{"U(h)", full["U"].(map[string]any)["h"].(float64)},
		{"u(cp)", full["u"].(map[string]any)["cp"].(float64)},
	} {
		w := get(srv, "/state/"+tc.prop+q)
		got, err := strconv.ParseFloat(w.Body.String(), 64)
		if w.Code != 200 || err != nil || got != tc.want {
			t.Errorf("/state/%s: %d %s, want %g", tc.prop, w.Code, w.Body, tc.want)
		}
	}
	for _, target := range []string{"/state/u(h)?p=100bar&t=500C", "/state/U(h)?p=100bar%C2%B10.2bar&t=500C"} {
		if w := get(srv, target); w.Code != 400 {
			t.Errorf("%s: %d %s, want 400", target, w.Code, w.Body)
		}
	}
}
