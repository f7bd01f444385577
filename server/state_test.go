package server_test

import (
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn"
	"steamcell/fn/if97"
	"steamcell/server"
)

// TestStateVerificationTables asks /state for the verification points of
// IAPWS-IF97 in the engine's own units (units=base) and compares the
// served numbers with the published values, 9 significant digits, so
// relative 1e-8.
func TestStateVerificationTables(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	// IAPWS R7-97(2012): Table 5 (region 1), Table 15 (region 2), Table 42
	// (region 5) at given p and T; Table 33 (region 3) at given rho and T.
	for _, tc := range []struct {
		query                string
		v, h, u, s, cp, w, p float64 // p only for the (rho, T) points
	}{
		{"p=3MPa&t=300K", 0.100215168e-2, 0.115331273e3, 0.112324818e3, 0.392294792, 0.417301218e1, 0.150773921e4, 0},
		{"p=80MPa&t=300K", 0.971180894e-3, 0.184142828e3, 0.106448356e3, 0.368563852, 0.401008987e1, 0.163469054e4, 0},
		{"p=3MPa&t=500K", 0.120241800e-2, 0.975542239e3, 0.971934985e3, 0.258041912e1, 0.465580682e1, 0.124071337e4, 0},
		{"p=0.0035MPa&t=300K", 0.394913866e2, 0.254991145e4, 0.241169160e4, 0.852238967e1, 0.191300162e1, 0.427920172e3, 0},
		{"p=0.0035MPa&t=700K", 0.923015898e2, 0.333568375e4, 0.301262819e4, 0.101749996e2, 0.208141274e1, 0.644289068e3, 0},
		{"p=30MPa&t=700K", 0.542946619e-2, 0.263149474e4, 0.246861076e4, 0.517540298e1, 0.103505092e2, 0.480386523e3, 0},
		{"p=0.5MPa&t=1500K", 0.138455090e1, 0.521976855e4, 0.452749310e4, 0.965408875e1, 0.261609445e1, 0.917068690e3, 0},
		{"p=30MPa&t=2000K", 0.311385219e-1, 0.657122604e4, 0.563707038e4, 0.853640523e1, 0.288569882e1, 0.106736948e4, 0},
		{"rho=500kg/m3&t=650K", 1.0 / 500, 0.186343019e4, 0.181226279e4, 0.405427273e1, 0.138935717e2, 0.502005554e3, 0.255837018e2},
		{"rho=200kg/m3&t=650K", 1.0 / 200, 0.237512401e4, 0.226365868e4, 0.485438792e1, 0.446579342e2, 0.383444594e3, 0.222930643e2},
		{"rho=500kg/m3&t=750K", 1.0 / 500, 0.225868845e4, 0.210206932e4, 0.446971906e1, 0.634165359e1, 0.760696041e3, 0.783095639e2},
	} {
		w := get(srv, "/state?"+tc.query+"&units=base")
		if w.Code != 200 {
			t.Errorf("%s: status %d: %s", tc.query, w.Code, w.Body)
			continue
		}
		m := decode(t, w)
		for _, f := range []struct {
			sym  string
			want float64
		}{{"v", tc.v}, {"h", tc.h}, {"u", tc.u}, {"s", tc.s}, {"cp", tc.cp}, {"w", tc.w}, {"p", tc.p}} {
			if f.want == 0 {
				continue
			}
			if got := number(t, m, f.sym); !scalar.EqualWithinRel(got, f.want, 1e-8) {
				t.Errorf("/state?%s: %s = %.9g, want %.9g", tc.query, f.sym, got, f.want)
			}
		}
		if m["caution"] != server.Caution || m["formulation"] != "IAPWS-IF97" {
			t.Errorf("%s: caution %q, formulation %q", tc.query, m["caution"], m["formulation"])
		}
	}
}

// TestStateMatchesEngine checks that /state answers what fn.Solve answers
// for the inputs as the user meant them, in the units asked for. Unit
// factors: exact definitions, NIST SP 811 (2008) Appendix B (1 psi =
// 6894.757293168 Pa, 1 Btu_IT/lb = 2326 J/kg, 1 Btu_IT/(lb·°F) = 4186.8
// J/(kg·K), °F = 1.8 K − 459.67).
func TestStateMatchesEngine(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	const psi = 6894.757293168e-6 // MPa
	kelvin := func(c float64) float64 { return c + 273.15 }
	fahrenheit := func(T float64) float64 { return T*1.8 - 459.67 }
	for _, tc := range []struct {
		query string
		a, b  fn.Input
		// expected values from the engine's state, in the answer's units
		want func(st *fn.State) map[string]float64
	}{
		{"p=6barg&t=330C", fn.Input{Q: fn.Pressure, Value: 0.701325}, fn.Input{Q: fn.Temperature, Value: kelvin(330)},
			func(st *fn.State) map[string]float64 {
				return map[string]float64{"p": st.P * 1000, "t": st.T - 273.15, "h": st.H, "s": st.S, "v": st.V, "cp": st.Cp, "w": st.W}
			}},
		// A gauge reading against a site atmosphere of 95 kPa.
		{"p=6barg&t=330C&patm=95kPa", fn.Input{Q: fn.Pressure, Value: 0.695}, fn.Input{Q: fn.Temperature, Value: kelvin(330)},
			func(st *fn.State) map[string]float64 {
				return map[string]float64{"p": st.P * 1000, "h": st.H, "s": st.S}
			}},
		{"p=600kPa&t=330C&units=us", fn.Input{Q: fn.Pressure, Value: 0.6}, fn.Input{Q: fn.Temperature, Value: kelvin(330)},
			func(st *fn.State) map[string]float64 {
				return map[string]float64{"p": st.P / psi, "t": fahrenheit(st.T), "h": st.H / 2.326, "s": st.S / 4.1868}
			}},
		// unit_p sets the unit of bare pressures and of the answer.
		{"p=6&t=330C&unit_p=barg", fn.Input{Q: fn.Pressure, Value: 0.701325}, fn.Input{Q: fn.Temperature, Value: kelvin(330)},
			func(st *fn.State) map[string]float64 {
				return map[string]float64{"p": (st.P - 0.101325) * 10, "h": st.H}
			}},
		{"p=1MPa&x=0.9", fn.Input{Q: fn.Pressure, Value: 1}, fn.Input{Q: fn.Quality, Value: 0.9},
			func(st *fn.State) map[string]float64 {
				return map[string]float64{"x": st.X, "h": st.H, "hf": st.Liquid.H, "hg": st.Vapour.H, "sf": st.Liquid.S, "sg": st.Vapour.S}
			}},
		{"h=2800kJ/kg&s=6.5", fn.Input{Q: fn.Enthalpy, Value: 2800}, fn.Input{Q: fn.Entropy, Value: 6.5},
			func(st *fn.State) map[string]float64 {
				return map[string]float64{"p": st.P * 1000, "t": st.T - 273.15, "v": st.V}
			}},
		{"T=300C&pressure=87psig", fn.Input{Q: fn.Temperature, Value: kelvin(300)}, fn.Input{Q: fn.Pressure, Value: 87*psi + 0.101325},
			func(st *fn.State) map[string]float64 {
				return map[string]float64{"p": st.P * 1000, "h": st.H}
			}},
	} {
		st := solve(t, tc.a, tc.b)
		w := get(srv, "/state?"+tc.query)
		if w.Code != 200 {
			t.Errorf("%s: status %d: %s", tc.query, w.Code, w.Body)
			continue
		}
		m := decode(t, w)
		for sym, want := range tc.want(&st) {
			if got := number(t, m, sym); !same(got, want) {
				t.Errorf("/state?%s: %s = %.15g, want %.15g", tc.query, sym, got, want)
			}
		}
		if m["phase"] != st.Phase.String() || number(t, m, "region") != float64(st.Region) {
			t.Errorf("/state?%s: phase %v region %v, want %s %d", tc.query, m["phase"], m["region"], st.Phase, st.Region)
		}
	}
}

func TestStateAnswerShape(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	w := get(srv, "/state?p=6barg&t=330C&get=h,s")
	if ct := w.Header().Get("Content-Type"); !strings.HasPrefix(ct, "application/json") {
		t.Errorf("Content-Type %q", ct)
	}
	m := decode(t, w)
	for _, key := range []string{"inputs", "phase", "region", "h", "s", "units", "unit_set", "formulation", "warnings", "caution"} {
		if _, ok := m[key]; !ok {
			t.Errorf("get=h,s: answer lacks %q: %v", key, m)
		}
	}
	for _, key := range []string{"v", "cp", "x", "w"} {
		if _, ok := m[key]; ok {
			t.Errorf("get=h,s: answer has %q too", key)
		}
	}
	in := m["inputs"].(map[string]any)
	if len(in) != 2 || in["p"] == nil || in["t"] == nil {
		t.Errorf("inputs = %v, want p and t", in)
	}
	units := m["units"].(map[string]any)
	if units["h"] != "kJ/kg" || units["t"] != "°C" || units["p"] != "kPa" {
		t.Errorf("units = %v", units)
	}
	if w.Header().Get("Steamcell-Caution") != server.Caution {
		t.Errorf("Steamcell-Caution header = %q", w.Header().Get("Steamcell-Caution"))
	}

	// phase and region are always answered; asking for them alone gives
	// no property besides.
	m = decode(t, get(srv, "/state?p=6barg&t=330C&get=phase,Region"))
	if m["phase"] != "superheated vapour" || m["h"] != nil || m["p"] != nil {
		t.Errorf("get=phase,Region: %v", m)
	}

	// Within 0.5 K of saturation the answer warns.
	ts := if97.SatTemperature(1)
	w = get(srv, "/state?p=1MPa&t="+strconv.FormatFloat(ts+0.2, 'f', 6, 64)+"K")
	m = decode(t, w)
	ws, _ := m["warnings"].([]any)
	if len(ws) == 0 || !strings.Contains(ws[0].(string), "saturation") {
		t.Errorf("0.2 K above saturation: warnings = %v, want one about saturation", m["warnings"])
	}
}

func TestStateCSV(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	w := get(srv, "/state?p=6barg&t=330C&get=h,s,x&format=csv")
	if w.Code != 200 || !strings.HasPrefix(w.Header().Get("Content-Type"), "text/csv") {
		t.Fatalf("status %d, Content-Type %q", w.Code, w.Header().Get("Content-Type"))
	}
	lines := strings.Split(strings.TrimSuffix(w.Body.String(), "\n"), "\n")
	if len(lines) != 2 {
		t.Fatalf("format=csv gave %d lines, want 2:\n%s", len(lines), w.Body)
	}
	if lines[0] != "phase,region,h [kJ/kg],s [kJ/(kg·K)],x,warnings" {
		t.Errorf("header = %q", lines[0])
	}
	cells := strings.Split(lines[1], ",")
	st := solve(t, fn.Input{Q: fn.Pressure, Value: 0.701325}, fn.Input{Q: fn.Temperature, Value: 603.15})
	h, err := strconv.ParseFloat(cells[2], 64)
	if err != nil || !same(h, st.H) {
		t.Errorf("h cell %q, want %.15g", cells[2], st.H)
	}
	if cells[0] != "superheated vapour" || cells[1] != "2" || cells[4] != "" {
		t.Errorf("cells = %q (x of superheated vapour must be empty)", cells)
	}
}

// TestStateProperty checks the plain-text route a cell formula calls.
func TestStateProperty(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	st := solve(t, fn.Input{Q: fn.Pressure, Value: 0.6}, fn.Input{Q: fn.Temperature, Value: 603.15})
	for _, tc := range []struct {
		target string
		want   float64
	}{
		{"/state/h?p=600kPa&t=330C&units=us", st.H / 2.326}, // 1 Btu_IT/lb = 2.326 kJ/kg exactly (NIST SP 811)
		{"/state/h?p=600kPa&t=330C", st.H},
		{"/state/H?p=600kPa&t=330C&unit_h=Btu/lb", st.H / 2.326},
		{"/state/t?p=600kPa&h=" + strconv.FormatFloat(st.H, 'g', -1, 64), 330},
		{"/state/rho?p=600kPa&t=330C", st.Rho},
	} {
		w := get(srv, tc.target)
		if w.Code != 200 || w.Header().Get("Content-Type") != "text/plain; charset=utf-8" {
			t.Errorf("%s: status %d, Content-Type %q: %s", tc.target, w.Code, w.Header().Get("Content-Type"), w.Body)
			continue
		}
		got, err := strconv.ParseFloat(w.Body.String(), 64)
		if err != nil {
			t.Errorf("%s: body %q is not a bare number", tc.target, w.Body)
			continue
		}
		if !scalar.EqualWithinAbsOrRel(got, tc.want, 1e-9, 1e-12) {
			t.Errorf("%s = %.15g, want %.15g", tc.target, got, tc.want)
		}
	}
	// Warnings travel in a header, the body stays a number.
	ts := if97.SatTemperature(1)
	w := get(srv, "/state/h?p=1MPa&t="+strconv.FormatFloat(ts+0.2, 'f', 6, 64)+"K")
	if _, err := strconv.ParseFloat(w.Body.String(), 64); err != nil || !strings.Contains(w.Header().Get("Steamcell-Warning"), "saturation") {
		t.Errorf("near saturation: body %q, Steamcell-Warning %q", w.Body, w.Header().Get("Steamcell-Warning"))
	}
	for target, want := range map[string]string{
		"/state/phase?p=1MPa&x=0.5":    "saturated mixture",
		"/state/phase?p=6barg&t=20C":   "compressed liquid",
		"/state/region?p=6barg&t=330C": "2",
	} {
		if w := get(srv, target); w.Code != 200 || w.Body.String() != want {
			t.Errorf("%s = %d %q, want %q", target, w.Code, w.Body, want)
		}
	}
}

// TestSaturation compares /saturation with the saturation line of the
// engine and with the published saturation points.
func TestSaturation(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	// IAPWS R7-97(2012) Table 35 (ps at T) and Table 36 (Ts at p).
	for _, tc := range []struct {
		query string
		sym   string
		want  float64
	}{
		{"t=300K", "p", 0.353658941e-2},
		{"t=500K", "p", 0.263889776e1},
		{"t=600K", "p", 0.123443146e2},
		{"p=0.1MPa", "t", 0.372755919e3},
		{"p=1MPa", "t", 0.453035632e3},
		{"p=10MPa", "t", 0.584149488e3},
	} {
		w := get(srv, "/saturation?"+tc.query+"&units=base")
		if w.Code != 200 {
			t.Errorf("%s: status %d: %s", tc.query, w.Code, w.Body)
			continue
		}
		if got := number(t, decode(t, w), tc.sym); !scalar.EqualWithinRel(got, tc.want, 1e-8) {
			t.Errorf("/saturation?%s: %s = %.9g, want %.9g", tc.query, tc.sym, got, tc.want)
		}
	}

	sat, err := fn.SaturationAtP(1)
	if err != nil {
		t.Fatal(err)
	}
	w := get(srv, "/saturation?p=10bar")
	m := decode(t, w)
	for sym, want := range map[string]float64{
		"p": 1000, "t": sat.T - 273.15,
		"hf": sat.Liquid.H, "hg": sat.Vapour.H, "hfg": sat.Vapour.H - sat.Liquid.H,
		"sf": sat.Liquid.S, "sg": sat.Vapour.S, "sfg": sat.Vapour.S - sat.Liquid.S,
		"vf": sat.Liquid.V, "vg": sat.Vapour.V, "vfg": sat.Vapour.V - sat.Liquid.V,
		"ufg": sat.Vapour.U - sat.Liquid.U, "rhof": sat.Liquid.Rho,
	} {
		if got := number(t, m, sym); !same(got, want) {
			t.Errorf("/saturation?p=10bar: %s = %.15g, want %.15g", sym, got, want)
		}
	}
	if m["caution"] != server.Caution || m["phase"] != "saturation line" {
		t.Errorf("caution %v, phase %v", m["caution"], m["phase"])
	}

	// At a temperature, in US units, only what get= asks.
	sat, err = fn.SaturationAtT(373.15)
	if err != nil {
		t.Fatal(err)
	}
	m = decode(t, get(srv, "/saturation?t=212F&units=us&get=p,hfg,muf"))
	if got, want := number(t, m, "hfg"), (sat.Vapour.H-sat.Liquid.H)/2.326; !same(got, want) {
		t.Errorf("hfg at 212 °F = %.15g Btu/lb, want %.15g", got, want)
	}
	if _, ok := m["muf"]; !ok {
		t.Errorf("get=p,hfg,muf: no muf in %v", m)
	}
	if _, ok := m["hf"]; ok {
		t.Errorf("get=p,hfg,muf: hf should not be there")
	}

	w = get(srv, "/saturation?p=10bar&format=csv&get=t,hfg,phase")
	if lines := strings.Split(strings.TrimSpace(w.Body.String()), "\n"); len(lines) != 2 || lines[0] != "phase,region,t [°C],hfg [kJ/kg],warnings" {
		t.Errorf("format=csv: %q", w.Body)
	}
}
