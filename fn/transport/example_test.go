package transport_test

import (
	"fmt"

	"steamcell/fn/if97"
	"steamcell/fn/transport"
)

func ExampleForState() {
	st := if97.Region1(0.101325, 293.15) // liquid water, 20 °C, 1 atm
	r, err := transport.ForState(st)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("mu = %.4g mPa·s, k = %.4g W/(m·K), Pr = %.3g\n", r.Viscosity*1e3, r.Conductivity, r.Prandtl)
	// Output: mu = 1.002 mPa·s, k = 0.598 W/(m·K), Pr = 7.01
}

func ExampleSurfaceTension() {
	sigma, err := transport.SurfaceTension(373.15)
	fmt.Printf("%.2f mN/m %v\n", sigma*1e3, err)
	// Output: 58.91 mN/m <nil>
}
