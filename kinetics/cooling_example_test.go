package kinetics_test

import (
	"fmt"

	"undercool/cnt"
	"undercool/kinetics"
)

// A metal-like material of our own (invented, not a real material): the
// critical cooling rate from one integral, the q⁻⁴ law, a CCT point and the
// onset of nucleation in a 1 mm³ sample.
func ExampleCooling() {
	md, err := kinetics.NewModel(kinetics.Material{
		Name: "example", Driving: cnt.Linear{Te: 1200, DH: 13000},
		Vm: 8e-6, Gamma: 0.12, Mobility: kinetics.Arrhenius{D0: 1e-5, Q: 200e3},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	c, err := md.LinearCooling(0) // to where the rest of the path is negligible
	if err != nil {
		fmt.Println(err)
		return
	}
	qc := c.CriticalRate(1e-6)
	fmt.Printf("critical rate for X = 1e-6: %.4g K/s\n", qc)
	fmt.Printf("fraction at 10 times that rate: %.3g\n", c.Fraction(10*qc))
	p := c.Reach(1, 1e-6)
	fmt.Printf("at 1 K/s, X = 1e-6 at %.1f K after %.1f s\n", p.Temp, p.Time)
	o := c.Onset(1e-9, 1)
	fmt.Printf("first nucleus in 1 mm3 at 1 K/s: %.1f K\n", o.Temp)
	// Output:
	// critical rate for X = 1e-6: 2.073e+04 K/s
	// fraction at 10 times that rate: 1e-10
	// at 1 K/s, X = 1e-6 at 1060.0 K after 140.0 s
	// first nucleus in 1 mm3 at 1 K/s: 1064.0 K
}
