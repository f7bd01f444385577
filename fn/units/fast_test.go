package units

import (
	"math"
	"runtime"
	"testing"
)

// FuzzParseFast checks that the quick path of Parse reads every text it
// takes exactly as the full rules do: same value to the bit, same unit, and
// only text the full rules accept.
func FuzzParseFast(f *testing.F) {
	for _, s := range []string{
		"6 barg", "330 °C", "330°C", "0.6 MPa", "0.6 mPa", "0.6 Mbar", "600kPa", "87 psig", "2800 kJ/kg",
		"85 %", "0.85", "85", "-40 °F", "+6 bar", "1.2e3 kPa", "5e-4 1/K", "2.1e-4 1/K", "1 µPa·s", "1 μPa s",
		"330 ℃", "300 \u212a", "6 bar ", "6 bar\n", "6 bar\u00a0", "6\u00a0bar", "6 bar\u3000", " 6 bar", "\t6\tbar",
		"6 kg/cm2 g", "1.5 Btu/(lb·°F)", "1 lbm/ft3", "3 ft2/hr", "330 deg C", "330 degrees F", "1 cSt",
		"1.013.250", "1'013", "1_000", "1,5 bar", "6 bar,", "6 e", "5e", "5e+", "1e22", "1e23", "1e-22", "1e-23",
		"9007199254740993", "123456789012345678", "0.000000000000000000001", "-0", "-0 °C", "0 %", "100 %",
		"100.0000000001 %", "1e308 1/Pa", "1.7e308 kPa", "6 -", "0.5 -", "6 ()", "6 MPa(g)", "6 1/MPa", "6 MW/(m·K)",
		"6 mW/(m·K)", "6 mPa·s", "6 MPa·s", "6 Mm²/s", "6 mm²/s", "1 1/mPa", "1 mPa⁻¹",
	} {
		f.Add(s)
	}
	us, _ := SetByName("us")
	optsets := []Options{
		{Name: "in"},
		{Name: "in", Set: us},
		{Name: "in", Patm: 0.0899},
		{Name: "in", Patm: 5},
		{Name: "in", Unit: "barg"},
	}
	f.Fuzz(func(t *testing.T, text string) {
		for d := Dim(0); d <= Dimensionless+1; d++ {
			for i := range optsets {
				opt := &optsets[i]
				v, u, ok := parseFast(text, d, opt)
				if !ok {
					continue
				}
				w, uw, err := parseFull(text, d, opt)
				if err != nil {
					t.Fatalf("parseFast(%q, %s, %+v) = %g %s, but the full rules refuse it: %v", text, d, *opt, v, u.Name, err)
				}
				if math.Float64bits(v) != math.Float64bits(w) || u != uw {
					t.Fatalf("parseFast(%q, %s, %+v) = %g %q, the full rules %g %q", text, d, *opt, v, u.Name, w, uw.Name)
				}
			}
		}
	})
}

// BenchmarkParseForms measures Parse on other common forms, quick and
// not, beside BenchmarkParse.
func BenchmarkParseForms(b *testing.B) {
	for _, tc := range []struct {
		text string
		d    Dim
		opt  Options
	}{
		{"600 kPa", Pressure, Options{}},
		{"0.6 MPa", Pressure, Options{}},
		{"2800 kJ/kg", SpecificEnergy, Options{}},
		{"6.5 kJ/(kg·K)", SpecificEntropy, Options{}},
		{"85 %", Quality, Options{}},
		{"626", Temperature, Options{Unit: "°F"}},
		{"6\u00a0bar", Pressure, Options{}},           // full rules: a no-break space
		{"1.2e-3 1/K", InverseTemperature, Options{}}, // full rules: unit starts with a digit
	} {
		b.Run(tc.text, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Parse(tc.text, tc.d, tc.opt); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// findRecent gives what find gives, whether the text is the one it
// remembers or not, for accepted, refused and trap spellings in any order,
// and from many goroutines at once (run with -race to check the sharing).
func TestFindRecentMatchesFind(t *testing.T) {
	texts := []string{"barg", "barg", "kPa", "mPa", "mPa", "MPa", "psig", "psig ", "bar(g)", "°C", "°C", "degC", "K", "", "-", "()", "x"}
	check := func(t *testing.T, text string, d Dim) {
		k, _, ok := find(text, d)
		k2, ok2 := findRecent(text, d)
		if ok != ok2 || ok && k != k2 {
			t.Errorf("%s %q: find gives (%d, %v), findRecent (%d, %v)", d, text, k, ok, k2, ok2)
		}
	}
	for range 3 {
		for _, text := range texts {
			for d := Pressure; d <= Dimensionless; d++ {
				check(t, text, d)
			}
		}
	}
	done := make(chan bool)
	for g := range 4 {
		go func() {
			for i := range 2000 {
				check(t, texts[(i*(g+1))%len(texts)], Pressure)
			}
			done <- true
		}()
	}
	for range 4 {
		<-done
	}
}

// TestRecentUnitsAlternate: two columns of one quantity in two units, read
// row by row (A, B, A, B, …), are both remembered, and reading them then
// allocates nothing. The cache used to make an entry only for a text that
// missed twice in a row, which alternating units never do.
func TestRecentUnitsAlternate(t *testing.T) {
	reset := func() {
		for j := range recentUnits[Pressure] {
			recentUnits[Pressure][j].Store(nil)
		}
		for j := range recentMiss[Pressure] {
			recentMiss[Pressure][j].Store(0)
		}
	}
	slotsUsed := func() (n int) {
		for j := range recentUnits[Pressure] {
			if recentUnits[Pressure][j].Load() != nil {
				n++
			}
		}
		return n
	}
	reset()
	rows := []string{"6 barg", "600 kPag"}
	parse := func() {
		for _, text := range rows {
			if _, err := Parse(text, Pressure, Options{}); err != nil {
				t.Fatal(err)
			}
		}
	}
	remembered := func(unit string) bool {
		for j := range recentUnits[Pressure] {
			if r := recentUnits[Pressure][j].Load(); r != nil && r.text == unit {
				return true
			}
		}
		return false
	}
	parse()
	parse()
	for _, unit := range []string{"barg", "kPag"} {
		if !remembered(unit) {
			t.Errorf("unit %q not remembered after two rows of %q", unit, rows)
		}
	}
	if n := testing.AllocsPerRun(1000, parse); n != 0 {
		t.Errorf("reading two alternating units allocates %g times a row pair, want 0", n)
	}
	// Six units in turn overflow the cache; their misses must not make
	// entries that push each other out on every round, whether the slots
	// are empty or full with four of them. Bound: the aging frees the
	// slots once per recentAging refused entries, and at most recentSlots
	// entries (two allocations each) are made each time.
	four := func() { // fills the slots with four of the six
		reset()
		for _, pair := range [][]string{{"1 bar", "1 psia"}, {"1 kPa", "1 MPa"}} {
			rows = pair
			parse()
			parse()
		}
	}
	for i, six := range [][]string{
		{"1 bar", "1 psia", "1 mbar", "1 kPa", "1 MPa", "1 atm"},
		{"1 bar", "1 psia", "1 mbar", "1 kPa", "1 MPa", "1 atm"},
	} {
		if i == 0 {
			reset()
		} else {
			four()
			if n := slotsUsed(); n != recentSlots {
				t.Fatalf("%d slots filled, want %d", n, recentSlots)
			}
		}
		rows = six
		const rounds = 640
		var before, after runtime.MemStats
		runtime.ReadMemStats(&before)
		for range rounds {
			parse()
		}
		runtime.ReadMemStats(&after)
		limit := uint64(2 * recentSlots * (2*rounds/recentAging + 1))
		t.Logf("six rotating units, %d slots full at the end: %d allocations in %d rounds (limit %d)", slotsUsed(), after.Mallocs-before.Mallocs, rounds, limit)
		if n := after.Mallocs - before.Mallocs; n > limit {
			t.Errorf("reading six rotating units %q %d times allocates %d times, want at most %d", six, rounds, n, limit)
		}
	}
	// Units no longer read make room: with the slots full of four other
	// units, two alternating units are remembered once the marks age.
	four()
	rows = []string{"6 barg", "600 kPag"}
	for range recentAging + 1 {
		parse()
	}
	for _, unit := range []string{"barg", "kPag"} {
		if !remembered(unit) {
			t.Errorf("unit %q not remembered after %d rows with the slots full of units no longer read", unit, recentAging+1)
		}
	}
	if n := testing.AllocsPerRun(1000, parse); n != 0 {
		t.Errorf("two alternating units after four others allocate %g times a row pair, want 0", n)
	}
}
