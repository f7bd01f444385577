package workbook

import (
	"bytes"
	"context"
	"errors"
	"strings"
	"testing"

	"steamcell/fn/point"
	"steamcell/fn/units"
)

// Columns at or right of an earlier fill's status column are no inputs, so
// a filled sheet can be filled again; a refused header stops the fill.
func TestReadColumns(t *testing.T) {
	header := []string{"P [barg]", "T [°C]", "Status (steamcell)", "p [kPa]", "t [°C]"}
	tab, err := ReadColumns(header, nil, "", units.Set{})
	if err != nil || len(tab.Columns) != 2 || tab.Columns[1].Index != 1 {
		t.Errorf("ReadColumns(%q) = %+v, %v; want the two columns left of the status", header, tab, err)
	}
	_, err = ReadColumns([]string{"P [kPa] gauge", "T [°C]"}, nil, "", units.Set{})
	if !errors.Is(err, ErrAmbiguous) {
		t.Errorf("refused header: %v, want ErrAmbiguous", err)
	}
	if _, err := ReadColumns(header, nil, "A=h,B=x", units.Set{}); !errors.Is(err, ErrBadOption) {
		t.Errorf("map of h and x: %v, want ErrBadOption", err)
	}
	tab, err = ReadColumns(header, nil, "D=p,E=t", units.Set{})
	if err != nil || tab.Columns[0].From != point.FromHeader || tab.Columns[0].Unit != "kPa" {
		t.Errorf("mapped columns right of the status: %+v, %v", tab, err)
	}
}

// A column read in the unit set says so in the summary.
func TestSetUnitNamedInSummary(t *testing.T) {
	var out bytes.Buffer
	sum, err := Fill(context.Background(), strings.NewReader("Tag,Pressure,T [°C]\nA,700,330\n"), "points.csv", Options{}, &out)
	if err != nil {
		t.Fatal(err)
	}
	if note := sum.Sheets[0].Note; !strings.Contains(note, `p "Pressure": read as kPa, unit set si`) {
		t.Errorf("note %q, want it to name kPa and the unit set", note)
	}
}
