package workbook

import "testing"

// The brackets around a cell of a row of units come off; brackets inside a
// unit stay (the unit spellings of fn/units: kJ/(kg·K)).
func TestUnitText(t *testing.T) {
	for in, want := range map[string]string{
		"barg": "barg", " [barg] ": "barg", "(°C)": "°C", "[ kJ/kg ]": "kJ/kg",
		"kJ/(kg·K)": "kJ/(kg·K)", "(kJ/(kg·K))": "kJ/(kg·K)", "(kJ)/(kg·K)": "(kJ)/(kg·K)",
		"": "", "()": "", "[": "[", "(": "(",
	} {
		if got := unitText(in); got != want {
			t.Errorf("unitText(%q) = %q, want %q", in, got, want)
		}
	}
}
