package point

import "testing"

// The brackets around a cell of a row of units come off; brackets inside a
// unit stay (the unit spellings of fn/units: kJ/(kg·K)).
func TestUnitCell(t *testing.T) {
	for in, want := range map[string]string{
		"barg": "barg", " [barg] ": "barg", "(°C)": "°C", "[ kJ/kg ]": "kJ/kg",
		"kJ/(kg·K)": "kJ/(kg·K)", "(kJ/(kg·K))": "kJ/(kg·K)", "(kJ)/(kg·K)": "(kJ)/(kg·K)",
		"": "", "()": "", "[": "[", "(": "(",
	} {
		if got := unitCell(in); got != want {
			t.Errorf("unitCell(%q) = %q, want %q", in, got, want)
		}
	}
}
