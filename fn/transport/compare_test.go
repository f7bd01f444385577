package transport

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"steamcell/fn/if97"
)

// tpCheck reports a failure unless got equals want within the absolute
// tolerance abs or the relative tolerance rel (either may be 0). what names
// the quantity and its inputs for the message.
func tpCheck(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, abs, rel) {
		t.Errorf("%s = %.10g, want %.10g (abs tol %g, rel tol %g)", what, got, want, abs, rel)
	}
}

// tpStateAtDensity returns the IF97 state of the region equation region at
// temperature T in K whose density is rho in kg/m³, by Newton's method on
// the pressure from the start p0 in MPa ((∂ρ/∂p)_T = ρ κ_T).
func tpStateAtDensity(t *testing.T, region func(p, T float64) if97.Props, T, rho, p0 float64) if97.Props {
	t.Helper()
	p := p0
	for range 100 {
		st := region(p, T)
		dp := (st.Rho - rho) / (st.Rho * st.KappaT)
		p -= dp
		if scalar.EqualWithinRel(st.Rho, rho, 1e-14) {
			return region(p, T)
		}
	}
	t.Fatalf("no IF97 state with rho = %g kg/m³ at T = %g K from p0 = %g MPa", rho, T, p0)
	return if97.Props{}
}
