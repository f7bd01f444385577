package main

import (
	"os"
	"path/filepath"
	"slices"
	"testing"

	"github.com/xuri/excelize/v2"
)

// The committed demo workbook is what this generator writes: every sheet,
// cell value and formula the same (the demo's data come from the CSVs beside
// it, so an edit of either shows here).
func TestCommittedDemoMatchesGenerator(t *testing.T) {
	root := filepath.Join("..", "..", "..")
	wd, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	if err := os.Chdir(root); err != nil {
		t.Fatal(err)
	}
	defer os.Chdir(wd)
	fresh := filepath.Join(t.TempDir(), "demo.xlsx")
	if err := run(fresh); err != nil {
		t.Fatal(err)
	}
	a, err := excelize.OpenFile(filepath.Join(dir, "kestrel_bay_tests.xlsx"))
	if err != nil {
		t.Fatal(err)
	}
	defer a.Close()
	b, err := excelize.OpenFile(fresh)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	if !slices.Equal(a.GetSheetList(), b.GetSheetList()) {
		t.Fatalf("sheets %q, generator makes %q", a.GetSheetList(), b.GetSheetList())
	}
	for _, sh := range a.GetSheetList() {
		ra, _ := a.GetRows(sh)
		rb, _ := b.GetRows(sh)
		if len(ra) != len(rb) {
			t.Errorf("sheet %q: %d rows committed, %d generated", sh, len(ra), len(rb))
			continue
		}
		for i := range ra {
			if !slices.Equal(ra[i], rb[i]) {
				t.Errorf("sheet %q row %d: committed %q, generated %q", sh, i+1, ra[i], rb[i])
			}
		}
	}
}
