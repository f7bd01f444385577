package server_test

import (
	"encoding/json"
	"slices"
	"sort"
	"testing"

	"steamcell/fn/point"
	"steamcell/server"
)

// The properties of /saturation are those of the catalogue
// (fn/point/props.go) that apply to the saturated phases but not to a
// mixture as a whole, with the saturation pressure and temperature.
func TestSaturationListIsTheCatalogues(t *testing.T) {
	all, err := point.Symbols([]string{"all"})
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"p", "t"}
	for _, sym := range all {
		p, _ := point.Lookup(sym)
		if p.Applies&point.SaturatedPhases != 0 && p.Applies&point.Mixture == 0 {
			want = append(want, sym)
		}
	}
	srv, _ := newServer(t, server.Config{})
	w := get(srv, "/saturation?p=1MPa&get=all")
	var m map[string]any
	if err := json.Unmarshal(w.Body.Bytes(), &m); err != nil || w.Code != 200 {
		t.Fatalf("/saturation?p=1MPa&get=all: %d %s", w.Code, w.Body)
	}
	var got []string
	for k := range m {
		switch k {
		case "inputs", "phase", "region", "units", "unit_set", "formulation", "warnings", "undefined", "caution":
		default:
			got = append(got, k)
		}
	}
	sort.Strings(got)
	sort.Strings(want)
	if !slices.Equal(got, want) {
		t.Errorf("/saturation answers %q, the catalogue's saturated phases are %q", got, want)
	}
}

// A temperature difference is headed in K or °F of difference, never in
// °C: superheat at 1 MPa, 300 °C is 120.114 K (Tsat(1 MPa) = 453.035632 K,
// IAPWS R7-97(2012) table 35), 216.206 °F of difference.
func TestSuperheatHeader(t *testing.T) {
	srv, _ := newServer(t, server.Config{})
	for units, want := range map[string]string{"si": "superheat [K]", "us": "superheat [°F]"} {
		w := get(srv, "/state?p=1MPa&t=300C&get=superheat&format=csv&units="+units)
		if rec := readCSV(t, w.Body.String(), ','); w.Code != 200 || !slices.Contains(rec[0], want) {
			t.Errorf("units=%s: %d %q, want a column %q", units, w.Code, w.Body, want)
		}
	}
}
